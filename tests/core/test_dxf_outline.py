"""Hull outlines from DXF drawings made here with ezdxf: areas and centroids against the
handbook formulas and shapely, the axes and reference point, and clear refusals."""

from __future__ import annotations

import math
from pathlib import Path

import ezdxf
import numpy as np
import pytest
import shapely

from core.errors import DrawingError, InputError
from core.io.dxf_geometry import Drawing, arc_segments, bulge_points, join_runs
from core.io.dxf_outline import import_outline, layer_summaries, likely_layer
from core.io.outline_import import OutlinePlacement, new_plan
from core.model.hull import HullGeometry
from tests import dxf_drawings as dd


def _shapely_check(got) -> None:  # type: ignore[no-untyped-def]
    """Area and centroid equal shapely's for the very points kept (shapely as reference)."""
    poly = shapely.Polygon(got.outline)
    assert got.area_m2 == pytest.approx(poly.area, rel=1e-12)
    assert got.centroid_m[0] == pytest.approx(poly.centroid.x, rel=1e-9, abs=1e-9)
    assert got.centroid_m[1] == pytest.approx(poly.centroid.y, rel=1e-9, abs=1e-9)


def test_box_barge_polyline(tmp_path: Path) -> None:
    d = Drawing.open(dd.box_barge(tmp_path / "box.dxf", 60.0, 18.0))
    assert d.units == "m" and d.layers() == ("HULL",)
    got = import_outline(d, "HULL", "m")
    # rectangle b x h: area b h, centroid at its middle (handbook, from memory)
    assert got.area_m2 == pytest.approx(60.0 * 18.0, rel=1e-12)
    assert got.centroid_m == pytest.approx((30.0, 0.0), abs=1e-12)
    assert (got.length_m, got.beam_m) == pytest.approx((60.0, 18.0))
    assert got.points_kept == 4 and got.notices == ()
    _shapely_check(got)
    assert min(x for x, _ in got.outline) == 0.0  # the aft end is the reference point


def test_ship_in_mm_with_x_running_aft(tmp_path: Path) -> None:
    ship = dd.ship_mm_x_aft(tmp_path / "ship.dxf")
    d = Drawing.open(ship.path)
    assert d.units == "mm"
    chord = 0.01  # m
    got = import_outline(d, "hull", "mm", OutlinePlacement(bow="-x"), chord_error_m=chord)
    area_mm2, xc_mm = dd.ship_area_and_centroid_x(ship)
    area = area_mm2 * 1e-6
    perimeter = shapely.Polygon(got.outline).length
    # the flattened outline lies inside the arcs by at most the chord error
    assert 0 < area - got.area_m2 <= perimeter * chord
    # hull x runs forward from the aft end (the transom at drawing x = x_aft)
    assert got.centroid_m[0] == pytest.approx((ship.x_aft - xc_mm) / 1000.0, abs=chord)
    assert got.centroid_m[1] == pytest.approx(0.0, abs=1e-9)
    assert got.length_m == pytest.approx(ship.x_aft / 1000.0)
    assert got.beam_m == pytest.approx(2 * ship.r / 1000.0)
    _shapely_check(got)
    # the bow (the round end) is forward: at the largest x there is a single vertex on
    # the centreline; the transom is flat at x = 0
    pts = np.asarray(got.outline)
    fwd = pts[np.isclose(pts[:, 0], pts[:, 0].max())]
    assert len(fwd) == 1 and abs(fwd[0, 1]) < 1e-9
    assert np.isclose(pts[:, 0], 0.0).sum() == 2
    assert got.reference_in_drawing == pytest.approx((ship.x_aft, 0.0))
    # against shapely from the drawn geometry itself, sampled far finer than the chord error
    fine = shapely.union_all(
        [
            shapely.box(ship.r, -ship.r, ship.x_aft - ship.q, ship.r),
            shapely.box(ship.x_aft - ship.q, -(ship.r - ship.q), ship.x_aft, ship.r - ship.q),
            shapely.Point(ship.r, 0).buffer(ship.r, quad_segs=4096),
            shapely.Point(ship.x_aft - ship.q, ship.r - ship.q).buffer(ship.q, quad_segs=4096),
            shapely.Point(ship.x_aft - ship.q, -(ship.r - ship.q)).buffer(ship.q, quad_segs=4096),
        ]
    ).intersection(shapely.box(0, -ship.r, ship.x_aft, ship.r))
    assert got.area_m2 == pytest.approx(fine.area * 1e-6, abs=perimeter * chord)
    assert fine.area * 1e-6 == pytest.approx(area, rel=1e-6)  # the formula and shapely agree


def test_chord_error_bounds_every_chord(tmp_path: Path) -> None:
    ship = dd.ship_mm_x_aft(tmp_path / "ship.dxf")
    d = Drawing.open(ship.path)
    for chord in (0.5, 0.05, 0.005):
        got = import_outline(d, "HULL", "mm", OutlinePlacement(bow="-x"), chord_error_m=chord)
        # every vertex is on the drawn curves; the middle of every chord within the chord
        # error of them: the distance from the bow circle's centre (hull x = 80 m) to a
        # bow chord's middle is at least r - chord
        pts = np.asarray(got.outline)
        mids = (pts + np.roll(pts, -1, axis=0)) / 2
        bow = mids[mids[:, 0] > 80.0 + 1e-6]
        dist = np.hypot(bow[:, 0] - 80.0, bow[:, 1])
        assert dist.min() >= 10.0 - chord - 1e-9
        assert dist.max() <= 10.0 + 1e-9


def test_finer_chord_error_means_more_vertices(tmp_path: Path) -> None:
    d = Drawing.open(dd.ship_mm_x_aft(tmp_path / "ship.dxf").path)
    coarse = import_outline(d, "HULL", "mm", chord_error_m=0.1)
    fine = import_outline(d, "HULL", "mm", chord_error_m=0.001)
    assert fine.points_kept > coarse.points_kept
    exact = dd.ship_area_and_centroid_x(dd.Ship(Path("-")))[0] * 1e-6
    assert abs(exact - fine.area_m2) < abs(exact - coarse.area_m2)


def test_x_aft_puts_the_drawing_plus_y_to_starboard(tmp_path: Path) -> None:
    """A plan seen from above with the bow to the left has starboard up the sheet."""
    doc = dd.new_doc()
    # a 50 x 10 box with a 4 x 2 notch cut into the drawing's +y side near x = 10
    pts = [(0, -5), (50, -5), (50, 5), (12, 5), (12, 3), (8, 3), (8, 5), (0, 5)]
    doc.modelspace().add_lwpolyline(pts, close=True, dxfattribs={"layer": "HULL"})
    doc.saveas(tmp_path / "notch.dxf")
    d = Drawing.open(tmp_path / "notch.dxf")
    for bow, notch_side in (("+x", 1.0), ("-x", -1.0)):
        got = import_outline(d, "HULL", "m", OutlinePlacement(bow=bow))
        assert got.area_m2 == pytest.approx(50 * 10 - 4 * 2)
        # rectangle minus rectangle: the centroid moves away from the notch (handbook)
        cy = -(4 * 2) * 4.0 / (50 * 10 - 8) * notch_side
        assert got.centroid_m[1] == pytest.approx(cy)
        assert any(o.code == "outline_asymmetric" for o in got.notices) is False
        # seen from below, port and starboard swap
        under = import_outline(d, "HULL", "m", OutlinePlacement(bow=bow, from_below=True))
        assert under.centroid_m[1] == pytest.approx(-cy)


@pytest.mark.parametrize(
    ("reference", "point", "origin_at"),
    [
        ("aft", (0.0, 0.0), (0.0, 0.0)),
        ("forward", (0.0, 0.0), (60.0, 0.0)),
        ("middle", (0.0, 0.0), (30.0, 0.0)),
        ("point", (20.0, 0.0), (20.0, 0.0)),
    ],
)
def test_reference_point(tmp_path: Path, reference: str, point: tuple, origin_at: tuple) -> None:  # type: ignore[type-arg]
    d = Drawing.open(dd.box_barge(tmp_path / "box.dxf"))
    got = import_outline(d, "HULL", "m", OutlinePlacement(reference=reference, point=point))  # type: ignore[arg-type]
    assert got.reference_in_drawing == pytest.approx(origin_at)
    assert got.centroid_m[0] == pytest.approx(30.0 - origin_at[0])


def test_reference_off_the_centreline_is_noticed(tmp_path: Path) -> None:
    doc = dd.new_doc()
    doc.modelspace().add_lwpolyline(
        [(0, 0), (40, 0), (40, 12), (0, 12)], close=True, dxfattribs={"layer": "HULL"}
    )
    doc.saveas(tmp_path / "off.dxf")
    d = Drawing.open(tmp_path / "off.dxf")
    got = import_outline(d, "HULL", "m", OutlinePlacement(reference="origin"))
    assert got.centroid_m == pytest.approx((20.0, 6.0))
    assert [n.code for n in got.notices] == ["outline_asymmetric"]
    assert import_outline(d, "HULL", "m").notices == ()  # aft end on the centreline


def test_loose_lines_with_small_gaps_join(tmp_path: Path) -> None:
    d = Drawing.open(dd.loose_lines_box(tmp_path / "lines.dxf", 48.0, 14.0, gap=0.002))
    got = import_outline(d, "HULL", "m")  # join tolerance 5 mm
    assert got.area_m2 == pytest.approx(48.0 * 14.0, rel=1e-9)
    assert got.centroid_m == pytest.approx((24.0, 0.0), abs=1e-9)
    assert got.points_read > 4 and got.points_kept == 4  # collinear joints simplified away
    _shapely_check(got)


def test_broken_chain_names_the_layer_and_the_gap(tmp_path: Path) -> None:
    d = Drawing.open(dd.broken_chain(tmp_path / "broken.dxf", gap=0.5))
    with pytest.raises(DrawingError, match=r"layer HULL: the lines do not close") as e:
        import_outline(d, "HULL", "m")
    assert e.value.layer == "HULL"
    assert "0.5 m apart, at (0, -6) and (0, -5.5)" in str(e.value)
    # a join tolerance wider than the gap closes it
    assert import_outline(d, "HULL", "m", tolerance_m=0.6).area_m2 == pytest.approx(40 * 12)


def test_layer_without_an_outline(tmp_path: Path) -> None:
    d = Drawing.open(dd.no_outline(tmp_path / "none.dxf"))
    with pytest.raises(DrawingError, match="layer NOTES: has no closed outline"):
        import_outline(d, "NOTES", "m")
    with pytest.raises(DrawingError, match="layer HULL: the lines do not close"):
        import_outline(d, "HULL", "m")
    assert likely_layer(layer_summaries(d, "m")) is None
    with pytest.raises(DrawingError, match="no layer 'DECK'.*layers: HULL, NOTES"):
        import_outline(d, "DECK", "m")


def test_layer_summaries_for_the_layer_list(tmp_path: Path) -> None:
    doc = dd.new_doc(M := dd.M, ("HULL", "DECKHOUSE", "TEXT"))
    msp = doc.modelspace()
    msp.add_lwpolyline(
        [(0, -9), (80, -9), (80, 9), (0, 9)], close=True, dxfattribs={"layer": "HULL"}
    )
    msp.add_lwpolyline(
        [(5, -4), (15, -4), (15, 4), (5, 4)], close=True, dxfattribs={"layer": "DECKHOUSE"}
    )
    msp.add_text("GA", dxfattribs={"layer": "TEXT"})
    doc.saveas(tmp_path / "ga.dxf")
    d = Drawing.open(tmp_path / "ga.dxf")
    assert M == 6 and d.insunits == 6
    rows = {s.layer: s for s in layer_summaries(d, "m")}
    assert rows["HULL"].largest_area_m2 == pytest.approx(80 * 18)
    assert rows["HULL"].words() == "HULL: closed outline 80.0 m × 18.0 m, 1440.0 m²"
    assert rows["TEXT"].words() == "TEXT: no outline (1 TEXT)"
    assert likely_layer(tuple(rows.values())) == "HULL"


def test_several_loops_take_the_largest_and_say_so(tmp_path: Path) -> None:
    doc = dd.new_doc()
    msp = doc.modelspace()
    msp.add_lwpolyline(
        [(0, -9), (80, -9), (80, 9), (0, 9)], close=True, dxfattribs={"layer": "HULL"}
    )
    msp.add_circle((40, 0), 2.0, dxfattribs={"layer": "HULL"})  # a hatch cover drawn on it too
    doc.saveas(tmp_path / "two.dxf")
    got = import_outline(Drawing.open(tmp_path / "two.dxf"), "HULL", "m")
    assert got.area_m2 == pytest.approx(80 * 18)
    assert [n.code for n in got.notices] == ["other_loops"]


def test_bulges_and_circle(tmp_path: Path) -> None:
    """LWPOLYLINE bulges: a rectangle with a semicircular bow (bulge tan(180/4) = 1)."""
    doc = dd.new_doc()
    msp = doc.modelspace()
    # aft at x = 0, sides to x = 50, bow semicircle of radius 8 from (50, -8) to (50, 8)
    msp.add_lwpolyline(
        [(0, -8, 0), (50, -8, 1.0), (50, 8, 0), (0, 8, 0)],
        format="xyb",
        close=True,
        dxfattribs={"layer": "HULL"},
    )
    msp.add_circle((0, 0), 5.0, dxfattribs={"layer": "DOLPHIN"})
    doc.saveas(tmp_path / "bulge.dxf")
    d = Drawing.open(tmp_path / "bulge.dxf")
    e = 0.01
    got = import_outline(d, "HULL", "m", chord_error_m=e)
    a_rect, a_semi = 50 * 16, math.pi * 64 / 2
    area = a_rect + a_semi  # rectangle plus semicircle (handbook, from memory)
    xc = (a_rect * 25 + a_semi * (50 + 4 * 8 / (3 * math.pi))) / area
    per = shapely.Polygon(got.outline).length
    assert 0 < area - got.area_m2 <= per * e
    assert got.centroid_m[0] == pytest.approx(xc, abs=e)
    assert max(x for x, _ in got.outline) == pytest.approx(58.0)
    circle = import_outline(d, "DOLPHIN", "m", chord_error_m=e)
    assert 0 < math.pi * 25 - circle.area_m2 <= 2 * math.pi * 5 * e  # circle pi r^2


def test_arc_seen_from_below_in_its_own_coordinates(tmp_path: Path) -> None:
    """An ARC with extrusion (0, 0, -1) lies mirrored in the plan (DXF arbitrary axis
    algorithm: OCS x is world -x)."""
    doc = dd.new_doc()
    msp = doc.modelspace()
    msp.add_line((0, -6), (0, 6), dxfattribs={"layer": "HULL"})
    msp.add_arc((0, 0), 6, 90, 270, dxfattribs={"layer": "HULL", "extrusion": (0, 0, -1)})
    doc.saveas(tmp_path / "d.dxf")
    got = import_outline(
        Drawing.open(tmp_path / "d.dxf"), "HULL", "m", OutlinePlacement(reference="origin")
    )
    # a semicircle to the world's +x: centroid 4 r / (3 pi) from the diameter (handbook)
    assert got.centroid_m[0] == pytest.approx(4 * 6 / (3 * math.pi), abs=0.01)
    assert got.area_m2 == pytest.approx(math.pi * 36 / 2, abs=0.01 * (6 * math.pi + 12))


def test_ellipse_and_spline(tmp_path: Path) -> None:
    doc = dd.new_doc(dd.M, ("HULL", "SPLINE"))
    msp = doc.modelspace()
    msp.add_ellipse((20, 0), major_axis=(20, 0), ratio=0.3, dxfattribs={"layer": "HULL"})
    fit = [(0, 0), (10, -5), (30, -6), (45, 0), (30, 6), (10, 5), (0, 0)]
    spline = msp.add_spline(fit, dxfattribs={"layer": "SPLINE"})
    doc.saveas(tmp_path / "curves.dxf")
    d = Drawing.open(tmp_path / "curves.dxf")
    e = 0.01
    got = import_outline(d, "HULL", "m", chord_error_m=e)
    # ellipse area pi a b (handbook, from memory); inscribed within the chord error
    assert 0 < math.pi * 20 * 6 - got.area_m2 <= 2 * math.pi * 20 * e
    assert got.centroid_m[0] == pytest.approx(20.0, abs=1e-6)
    sp = import_outline(d, "SPLINE", "m", OutlinePlacement(reference="origin"), chord_error_m=e)
    ref = shapely.Polygon([(v.x, v.y) for v in spline.construction_tool().flattening(1e-5)])
    assert sp.area_m2 == pytest.approx(ref.area, abs=ref.length * e)  # ezdxf as reference


def test_outline_inside_a_block(tmp_path: Path) -> None:
    doc = dd.new_doc()
    block = doc.blocks.new("BOX")
    block.add_lwpolyline([(0, -3), (20, -3), (20, 3), (0, 3)], close=True)  # on layer 0
    doc.modelspace().add_blockref(
        "BOX", (100, 50), dxfattribs={"layer": "HULL", "xscale": 2, "yscale": 2, "rotation": 30}
    )
    doc.saveas(tmp_path / "block.dxf")
    d = Drawing.open(tmp_path / "block.dxf")
    assert d.layers() == ("HULL",)  # layer 0 inside the block takes the insert's layer
    got = import_outline(d, "HULL", "m")
    assert got.area_m2 == pytest.approx(4 * 20 * 6)  # scaled twice each way


def test_an_array_insert_is_read_as_every_copy(tmp_path: Path) -> None:
    # A MINSERT of a 2 m x 1 m fender block, 2 rows 6 m apart by 3 columns 10 m apart,
    # turned 90 degrees: copy (row r, column c) sits at the insert point plus the grid
    # offset (10 c, 6 r) turned 90 degrees, (-6 r, 10 c) (the DXF reference: the array
    # is laid out in the insert's own axes, turned with it; its spacing not scaled).
    doc = dd.new_doc(layers=("FENDERS",))
    doc.blocks.new("FENDER").add_lwpolyline([(0, 0), (2, 0), (2, 1), (0, 1)], close=True)
    ref = doc.modelspace().add_blockref(
        "FENDER", (100, 50), dxfattribs={"layer": "FENDERS", "rotation": 90}
    )
    ref.grid(size=(2, 3), spacing=(6, 10))
    doc.saveas(tmp_path / "array.dxf")
    d = Drawing.open(tmp_path / "array.dxf")
    assert d.counts("FENDERS") == {"LWPOLYLINE": 6}
    loops = d.shapes("FENDERS", chord_error=0.01, tolerance=0.001).loops
    # the box turned 90 degrees has corners (0, 0), (0, 2), (-1, 2), (-1, 0): its lowest
    # (x, then y), (-1, 0), lands at the insert point plus each copy's offset
    corners = sorted((round(x, 9), round(y, 9)) for x, y in (min(loop) for loop in loops))
    assert corners == sorted((100.0 - 6 * r - 1, 50.0 + 10 * c) for r in range(2) for c in range(3))
    # ... and an array whose spacing is 0 along a way places one copy that way
    ref.dxf.row_spacing = 0
    doc.saveas(tmp_path / "stacked.dxf")
    assert Drawing.open(tmp_path / "stacked.dxf").counts("FENDERS") == {"LWPOLYLINE": 3}


def test_self_crossing_outline_names_the_point(tmp_path: Path) -> None:
    doc = dd.new_doc()
    doc.modelspace().add_lwpolyline(
        [(0, 0), (40, 10), (40, 0), (0, 10)], close=True, dxfattribs={"layer": "HULL"}
    )
    doc.saveas(tmp_path / "bowtie.dxf")
    with pytest.raises(
        DrawingError, match=r"layer HULL: the outline crosses itself near \(20, 5\) m"
    ):
        import_outline(Drawing.open(tmp_path / "bowtie.dxf"), "HULL", "m")


def test_units_from_the_header_and_when_it_says_none(tmp_path: Path) -> None:
    path = dd.box_barge(tmp_path / "nounits.dxf", 60_000, 18_000, insunits=0)
    d = Drawing.open(path)
    assert d.units is None and d.insunits == 0
    right = import_outline(d, "HULL", "mm")
    assert right.area_m2 == pytest.approx(1080.0) and right.notices == ()
    wrong = import_outline(d, "HULL", "m")  # a 60 km hull: the units are wrong
    assert [n.code for n in wrong.notices] == ["outline_size"]
    assert "check the drawing's units (m)" in wrong.notices[0].message
    with pytest.raises(InputError, match="drawing units: 'yd' is not one of mm, cm, m, in, ft"):
        import_outline(d, "HULL", "yd")


def test_files_that_are_not_drawings(tmp_path: Path) -> None:
    (tmp_path / "a.dxf").write_text("this is not a drawing\n")
    with pytest.raises(DrawingError, match="a.dxf: is not a readable DXF drawing"):
        Drawing.open(tmp_path / "a.dxf")
    (tmp_path / "b.dxf").write_bytes(b"AC1032\x00\x00binary")
    with pytest.raises(DrawingError, match="b.dxf: is a DWG file; save it as DXF"):
        Drawing.open(tmp_path / "b.dxf")
    with pytest.raises(DrawingError, match="missing.dxf: cannot be read"):
        Drawing.open(tmp_path / "missing.dxf")


def test_a_damaged_file_is_mended(tmp_path: Path) -> None:
    """A file cut off before its EOF marker: ezdxf's recovering reader reads it."""
    path = dd.box_barge(tmp_path / "cut.dxf")
    text = path.read_text()
    assert text.endswith("  0\nEOF\n")
    path.write_text(text[: -len("  0\nEOF\n")])
    with pytest.raises(ezdxf.DXFStructureError):
        ezdxf.readfile(path)  # the plain reader refuses it
    got = import_outline(Drawing.open(path), "HULL", "m")
    assert got.area_m2 == pytest.approx(60 * 18)


def test_new_plan_holds_the_hull(tmp_path: Path) -> None:
    got = import_outline(Drawing.open(dd.box_barge(tmp_path / "box.dxf")), "HULL", "m")
    plan = new_plan(got, "Barge Hesper")
    assert plan.hulls[0].name == "Barge Hesper" and len(plan.stages) == 1
    assert HullGeometry(plan.hulls[0].outline).area == pytest.approx(got.area_m2)


# -- the pieces ---------------------------------------------------------------------------


def test_arc_segments_keep_the_sagitta() -> None:
    # sagitta of a chord over the angle a: r (1 - cos(a / 2)) (circle geometry)
    for r, sweep, e in ((10.0, math.pi, 0.01), (3.0, math.pi / 2, 0.001), (100.0, 0.3, 0.05)):
        n = arc_segments(r, sweep, e)
        assert r * (1 - math.cos(sweep / n / 2)) <= e
        assert (
            n == 1
            or r * (1 - math.cos(sweep / (n - 1) / 2)) > e
            or n <= math.ceil(sweep / (math.pi / 2))
        )


def test_bulge_runs_counter_clockwise_when_positive() -> None:
    pts = bulge_points((0.0, 0.0), (2.0, 0.0), 1.0, 0.001)
    mid = pts[len(pts) // 2 - 1]
    assert mid[1] < 0  # counter-clockwise from (0, 0) round (1, 0) to (2, 0) passes below
    assert pts[-1] == (2.0, 0.0)
    assert all(math.hypot(x - 1.0, y) == pytest.approx(1.0) for x, y in pts)


def test_join_runs_reports_branches() -> None:
    runs = [[(0.0, 0.0), (1.0, 0.0)], [(1.0, 0.0), (1.0, 1.0)], [(1.0, 0.0), (2.0, 0.0)]]
    loops, chains, branches = join_runs(runs, 1e-6)
    assert loops == [] and len(chains) == 2 and branches == [(1.0, 0.0)]


def test_bad_tolerances(tmp_path: Path) -> None:
    d = Drawing.open(dd.box_barge(tmp_path / "box.dxf"))
    with pytest.raises(DrawingError, match="chord error"):
        d.shapes("HULL", 0.0, 0.001)
    with pytest.raises(DrawingError, match="join tolerance"):
        d.shapes("HULL", 0.01, -1.0)
    with pytest.raises(InputError, match="bow direction"):
        OutlinePlacement(bow="up")  # type: ignore[arg-type]


def test_ezdxf_reads_back_what_it_wrote(tmp_path: Path) -> None:
    """The test drawings are what they say (ezdxf as its own reference)."""
    ship = dd.ship_mm_x_aft(tmp_path / "ship.dxf")
    doc = ezdxf.readfile(ship.path)
    kinds = sorted(e.dxftype() for e in doc.modelspace())
    assert kinds == ["ARC", "ARC", "ARC", "LINE", "LINE", "LINE"]
    assert doc.header["$INSUNITS"] == dd.MM


def test_old_style_polylines(tmp_path: Path) -> None:
    """POLYLINE entities: a 2-D one with a bulge and a 3-D one (DXF R12 style)."""
    doc = dd.new_doc(dd.M, ("HULL", "DECK3D"))
    msp = doc.modelspace()
    p2 = msp.add_polyline2d(
        [(0, -8, 0, 0, 0), (50, -8, 0, 0, 1.0), (50, 8, 0, 0, 0), (0, 8, 0, 0, 0)],
        format="xyseb",
        close=True,
        dxfattribs={"layer": "HULL"},
    )
    assert p2.is_2d_polyline
    msp.add_polyline3d(
        [(0, 0, 5), (30, 0, 5), (30, 10, 6), (0, 10, 6)], close=True, dxfattribs={"layer": "DECK3D"}
    )
    doc.saveas(tmp_path / "r12.dxf")
    d = Drawing.open(tmp_path / "r12.dxf")
    e = 0.01
    got = import_outline(d, "HULL", "m", chord_error_m=e)
    area = 50 * 16 + math.pi * 64 / 2  # rectangle plus semicircle (handbook, from memory)
    assert 0 < area - got.area_m2 <= shapely.Polygon(got.outline).length * e
    flat = import_outline(d, "DECK3D", "m")
    assert flat.area_m2 == pytest.approx(300.0)  # the plan view of the 3-D polyline
