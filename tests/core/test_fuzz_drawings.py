"""Hostile drawings and tables to import: hypothesis damages valid DXF files written by ezdxf
(tags, bytes, ``$INSUNITS``) or builds hostile ones (zero-radius arcs, degenerate splines,
self-crossing outlines, blocks inserting themselves, far coordinates), and damages tables of
offsets and site points (tests/fuzz/drawing_mutations.py). Every one is refused by the
project's own error family with one line, or imported with finite numbers into a plan that
reports, saves and loads back (tests/fuzz/drawing_checks.py). benchmarks/fuzz_drawings.py
runs 10,000 and more. Below, the faults the fuzzing found, each pinned by a small drawing.
"""

from __future__ import annotations

import logging
import tempfile
from pathlib import Path

import ezdxf
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from core.errors import DrawingError
from core.io.dxf_geometry import MAX_CURVE_POINTS, MAX_ENTITIES, Drawing
from core.io.dxf_outline import import_outline, layer_summaries
from core.io.dxf_site import import_site
from core.io.offsets import import_offsets
from core.io.site_points import import_site_points
from tests.fuzz.drawing_checks import drawing_outcome, table_outcome
from tests.fuzz.drawing_mutations import (
    HOSTILE,
    base_drawings,
    mutate_bytes,
    mutate_table,
    mutate_tags,
    table_case,
)


class _Draw:
    """hypothesis's data as the random source the mutations take."""

    def __init__(self, data: st.DataObject) -> None:
        self.data = data

    def random(self) -> float:
        return self.data.draw(st.floats(0, 1, exclude_max=True))

    def randrange(self, n: int) -> int:
        return self.data.draw(st.integers(0, n - 1))


FUZZ = settings(
    max_examples=60,
    deadline=None,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large],
)


@FUZZ
@given(st.sampled_from(sorted(base_drawings())), st.integers(1, 4), st.data())
def test_a_drawing_with_damaged_tags_is_refused_cleanly_or_carried_through(
    name: str, count: int, data: st.DataObject
) -> None:
    text = mutate_tags(base_drawings()[name], _Draw(data), count)
    with tempfile.TemporaryDirectory() as tmp:
        drawing_outcome(text.encode(), Path(tmp))


@FUZZ
@given(st.sampled_from(sorted(base_drawings())), st.integers(1, 4), st.data())
def test_a_drawing_with_damaged_bytes_is_refused_cleanly_or_carried_through(
    name: str, count: int, data: st.DataObject
) -> None:
    raw = mutate_bytes(base_drawings()[name].encode(), _Draw(data), count)
    with tempfile.TemporaryDirectory() as tmp:
        drawing_outcome(raw, Path(tmp))


@FUZZ
@given(st.sampled_from(sorted(HOSTILE)), st.booleans(), st.data())
def test_a_drawing_built_hostile_is_refused_cleanly_or_carried_through(
    name: str, damage: bool, data: st.DataObject
) -> None:
    import io

    rnd = _Draw(data)
    out = io.StringIO()
    HOSTILE[name](rnd).write(out)
    text = mutate_tags(out.getvalue(), rnd) if damage else out.getvalue()
    with tempfile.TemporaryDirectory() as tmp:
        drawing_outcome(text.encode(), Path(tmp))


@settings(FUZZ, max_examples=120)
@given(st.data())
def test_a_damaged_table_is_refused_cleanly_or_carried_through(data: st.DataObject) -> None:
    what, _how, raw = table_case(_Draw(data))
    with tempfile.TemporaryDirectory() as tmp:
        table_outcome(what, raw, Path(tmp))


def test_the_valid_drawings_and_tables_are_carried_through(tmp_path: Path) -> None:
    """The starting points themselves import: the fuzzing damages working files."""
    from tests.fuzz.drawing_mutations import OFFSETS, POINTS

    outcomes = {n: drawing_outcome(t.encode(), tmp_path) for n, t in base_drawings().items()}
    assert outcomes == {
        "hull_polyline": ("accepted", "refused"),  # NOTES holds only a text: no feature
        "loose_lines": ("accepted", "accepted"),
        "curves": ("accepted", "accepted"),
        "blocks": ("accepted", "accepted"),
        "site": ("accepted", "refused"),  # TEXT holds only a text: no feature
    }
    for t in OFFSETS.values():
        assert table_outcome("offsets", t.encode(), tmp_path) == "accepted"
    for t in POINTS.values():
        assert table_outcome("points", t.encode(), tmp_path) == "accepted"
    # a mutated table still parses as a table (common practice, no source)
    import random

    assert mutate_table(OFFSETS["plain"], random.Random(1)).count("\n") >= 5


# -- faults the fuzzing found ------------------------------------------------------------------


def _box_with(path: Path, add) -> Path:  # type: ignore[no-untyped-def]
    """A 20 m x 8 m box on layer HULL, metres, and whatever ``add`` draws into model space."""
    doc = ezdxf.new(units=6)
    doc.layers.add("HULL")
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 0), (20, 0), (20, 8), (0, 8)], close=True, dxfattribs={"layer": "HULL"})
    add(doc, msp)
    doc.saveas(path)
    return path


def _replace_once(path: Path, old: str, new: str) -> Path:
    text = path.read_text()
    assert old in text
    path.write_text(text.replace(old, new, 1))
    return path


def test_a_line_with_a_nan_end_is_refused_naming_layer_and_handle(tmp_path: Path) -> None:
    """Was: the NaN reached shapely, which refused the loop with a GEOSException ("Points of
    LinearRing do not form a closed linestring") from layer_summaries, and the site import
    with a RuntimeWarning from simplify."""
    path = _box_with(
        tmp_path / "nan.dxf",
        lambda doc, msp: msp.add_line((0, 0), (0, 123.25), dxfattribs={"layer": "HULL"}),
    )
    _replace_once(path, "\n123.25\n", "\nnan\n")
    d = Drawing.open(path)
    handle = next(e.dxf.handle for e in d._doc.modelspace() if e.dxftype() == "LINE")
    with pytest.raises(DrawingError) as got:
        layer_summaries(d, "m")
    assert str(got.value) == (
        f"nan.dxf: layer HULL: the LINE (handle {handle}) has a point that is not a finite number"
    )
    assert got.value.layer == "HULL"
    with pytest.raises(DrawingError, match="layer HULL: the LINE .* not a finite number"):
        import_site(d, {"HULL": "vessel"}, "m")


def test_a_polyline_far_beyond_any_site_is_refused(tmp_path: Path) -> None:
    """Was: corners at 1e300 m made shapely's area inf, and the summary printed 'inf m²'."""

    def add(doc, msp) -> None:  # type: ignore[no-untyped-def]
        doc.layers.add("FAR")
        big = 1e300
        msp.add_lwpolyline(
            [(0, 0), (big, 0), (big, big), (0, big)], close=True, dxfattribs={"layer": "FAR"}
        )

    d = Drawing.open(_box_with(tmp_path / "far.dxf", add))
    with pytest.raises(
        DrawingError,
        match=r"far.dxf: layer FAR: the LWPOLYLINE \(handle \w+\) has a point farther than 1e\+12 drawing units from the origin",
    ):
        layer_summaries(d, "m")
    assert import_outline(d, "HULL", "m").area_m2 == pytest.approx(20 * 8)  # 20 m x 8 m


def test_a_spline_with_a_nan_control_point_is_refused_not_recursed_without_end(
    tmp_path: Path,
) -> None:
    """Was: ezdxf's adaptive flattening compares the chord's distance with NaN, never finds
    it small enough, and recursed until RecursionError (a traceback from the CLI)."""

    def add(doc, msp) -> None:  # type: ignore[no-untyped-def]
        s = msp.add_spline(dxfattribs={"layer": "HULL"})
        s.set_open_uniform([(0, 0, 0), (5, 777.5, 0), (10, 0, 0), (15, 5, 0)], degree=3)

    path = _replace_once(_box_with(tmp_path / "spline.dxf", add), "\n777.5\n", "\nnan\n")
    d = Drawing.open(path)
    with pytest.raises(
        DrawingError,
        match=r"layer HULL: the SPLINE \(handle \w+\) cannot be drawn: its defining points are degenerate",
    ):
        import_outline(d, "HULL", "m")


def test_a_curve_far_larger_than_its_chord_error_is_refused_not_flattened_without_bound(
    tmp_path: Path,
) -> None:
    """Was: a circle of radius 1e11 m at a chord error of 9 mm asked for
    2 pi / (2 acos(1 - 0.009 / 1e11)) = 2 pi / 8.5e-7 = 7.4e6 points (the sagitta rule),
    (85 s here before the outline was refused for its vertices), an ellipse by ezdxf's
    recursion as many; a larger radius, without bound."""

    def add(doc, msp) -> None:  # type: ignore[no-untyped-def]
        doc.layers.add("BIG")
        msp.add_circle((0, 0), 1e11, dxfattribs={"layer": "BIG"})
        doc.layers.add("OVAL")
        msp.add_ellipse((0, 0), major_axis=(1e11, 0), ratio=0.5, dxfattribs={"layer": "OVAL"})

    d = Drawing.open(_box_with(tmp_path / "big.dxf", add))
    with pytest.raises(DrawingError) as got:
        import_outline(d, "BIG", "m")
    assert f"more than {MAX_CURVE_POINTS} points to draw within the chord error" in str(got.value)
    assert "layer BIG: the CIRCLE" in str(got.value)
    with pytest.raises(
        DrawingError, match=r"layer OVAL: the ELLIPSE \(handle \w+\) would take more than"
    ):
        import_outline(d, "OVAL", "m")


def test_blocks_inserted_within_each_other_many_times_are_refused_before_opening_up(
    tmp_path: Path,
) -> None:
    """Was: ten inserts a block, eight blocks deep, made 10^8 entities opened up one by one
    by ezdxf (a quarter of a millisecond each: most of a day). Counted from the block
    definitions first, the file is refused at once."""
    doc = ezdxf.new(units=6)
    doc.blocks.new("L0").add_line((0, 0), (1, 0))
    for k in range(1, 9):
        b = doc.blocks.new(f"L{k}")
        for i in range(10):
            b.add_blockref(f"L{k - 1}", (2 * i, 0))
    doc.modelspace().add_blockref("L8", (0, 0))
    doc.saveas(tmp_path / "bomb.dxf")
    with pytest.raises(DrawingError) as got:
        Drawing.open(tmp_path / "bomb.dxf")
    assert str(got.value) == (
        f"bomb.dxf: holds more than {MAX_ENTITIES} entities in model space with its blocks "
        "opened up (blocks inserted many times within each other); not read"
    )


def test_an_array_insert_of_a_million_by_a_million_is_refused_before_opening_up(
    tmp_path: Path,
) -> None:
    """A MINSERT of 10^6 x 10^6 copies of a one-line block is 10^12 entities opened up:
    counted from its rows and columns, refused at once with the array named; with its
    spacings 0 every copy lies on the first, one copy (ezdxf's multi_insert would still
    walk all 10^12 places)."""
    doc = ezdxf.new(units=6)
    doc.layers.add("HULL")
    doc.blocks.new("GRID").add_line((0, 0), (1, 0))
    ref = doc.modelspace().add_blockref("GRID", (0, 0), dxfattribs={"layer": "HULL"})
    ref.grid(size=(10**6, 10**6), spacing=(2, 2))
    doc.saveas(tmp_path / "array.dxf")
    with pytest.raises(DrawingError) as got:
        Drawing.open(tmp_path / "array.dxf")
    assert str(got.value) == (
        f"array.dxf: holds more than {MAX_ENTITIES} entities in model space with its blocks "
        "opened up (blocks inserted many times within each other or in arrays; the largest: "
        "block 'GRID', 1000000 x 1000000 copies); not read"
    )
    ref.dxf.row_spacing = ref.dxf.column_spacing = 0
    doc.saveas(tmp_path / "stacked.dxf")
    assert Drawing.open(tmp_path / "stacked.dxf").counts("HULL") == {"LINE": 1}


def test_a_spline_ezdxf_cannot_make_a_curve_of_is_not_read(tmp_path: Path) -> None:
    """Was: a spline of one fit point repeated ended in ezdxf's IndexError (not among the
    errors caught), a traceback; now it is left out and said so."""

    def add(doc, msp) -> None:  # type: ignore[no-untyped-def]
        msp.add_spline(dxfattribs={"layer": "HULL"}).fit_points = [(3, 4, 0)] * 3

    got = import_outline(Drawing.open(_box_with(tmp_path / "fit.dxf", add)), "HULL", "m")
    assert [n.message for n in got.notices if n.code == "not_read"] == [
        "Not read on layer HULL: 1 SPLINE."
    ]


def test_a_mended_file_says_so_and_ezdxf_prints_nothing(
    tmp_path: Path, caplog: pytest.LogCaptureFixture, capsys: pytest.CaptureFixture[str]
) -> None:
    """Was: ezdxf's recovering reader mended '--1' into -1.0 silently for the import and
    logged each repair to stderr ('recovered invalid floating point value ...'), lines
    around the CLI's one line. Now nothing is logged and the importers give a caution."""

    def add(doc, msp) -> None:  # type: ignore[no-untyped-def]
        doc.layers.add("QUAY")
        msp.add_line((0, 30), (55.5, 30), dxfattribs={"layer": "QUAY"})

    path = _replace_once(_box_with(tmp_path / "mend.dxf", add), "\n55.5\n", "\n--55.5\n")
    with caplog.at_level(logging.DEBUG):
        d = Drawing.open(path)
        got = import_outline(d, "HULL", "m")
        site = import_site(d, {"QUAY": "quay"}, "m")
    assert caplog.records == [] and capsys.readouterr().err == ""
    assert site.features[0].points == ((0.0, 30.0), (-55.5, 30.0))  # ezdxf's mending
    for notices in (got.notices, site.notices):
        (n,) = [n for n in notices if n.code == "drawing_repaired"]
        assert n.level == "caution"
        # ezdxf reports the point's other values too, read again after the bad one
        assert n.message.startswith(
            "mend.dxf is damaged and was read by mending it (3 repairs reported; the first: "
            'recovered invalid floating point value "--55.5" near line '
        )


@pytest.mark.parametrize(
    ("text", "importer", "message"),
    [
        (
            "name" + ",-inf" * 3000 + "\n0,0\n",
            "offsets",
            "f.csv: line 1: the first row names no x and half-breadth columns (it has "
            "'name,-inf,-inf,-inf,-inf,-inf,-inf,-inf,-inf,-inf,-inf,-inf,'... (15004 characters))",
        ),
        (
            "x,hb\n0,0\n" + "9" * 10_000 + "x,1\n",
            "offsets",
            "f.csv: line 3: is not an x and a half-breadth: '"
            + "9" * 60
            + "'... (10003 characters)",
        ),
        (
            "feature,kind,x,y\nA,quay,0," + "z" * 10_000 + "\n",
            "points",
            "f.csv: line 2: is not a feature, kind, x and y: 'A,quay,0,"
            + "z" * 51
            + "'... (10009 characters)",
        ),
    ],
)
def test_a_huge_row_is_quoted_short(text: str, importer: str, message: str) -> None:
    """Was: the whole row went into the one line (tens of kilobytes), and a header's cells
    unquoted ('it has , , , -inf')."""
    with pytest.raises(DrawingError) as got:
        if importer == "offsets":
            import_offsets(text, "f.csv")
        else:
            import_site_points(text, "f.csv")
    assert str(got.value) == message


def test_subnormal_offsets_are_read_as_zero() -> None:
    """Was: a half-breadth of 5e-324 made shapely divide by zero simplifying the outline (a
    RuntimeWarning; an error under the suite's warnings as errors). Read as zero, the hull
    is pinched to nothing at x = 5 and refused there (and "0", never "-0")."""
    with pytest.raises(DrawingError) as got:
        import_offsets("x,hb\n0,0\n5,5e-324\n10,5\n40,5\n55,0\n", "t.csv")
    assert str(got.value) == "t.csv: the outline crosses itself near (5, 0) m"
    # at the ends a zero is what the table means: area by the trapezoidal rule, doubled:
    # 2 * (10 * (0 + 5) / 2 + 10 * 5 + 10 * (5 + 0) / 2) = 200 m²
    got_area = import_offsets("x,hb\n0,5e-324\n10,5\n20,5\n30,-0.0\n", "t.csv").area_m2
    assert got_area == pytest.approx(200.0)


def test_a_drawing_of_subnormal_size_has_no_area(tmp_path: Path) -> None:
    """Was: a square of side 5e-324 reached shapely's simplify (a divide-by-zero warning)."""

    def add(doc, msp) -> None:  # type: ignore[no-untyped-def]
        doc.layers.add("DOT")
        t = 5e-324
        msp.add_lwpolyline(
            [(0, 0), (t, 0), (t, t), (0, t)], close=True, dxfattribs={"layer": "DOT"}
        )

    d = Drawing.open(_box_with(tmp_path / "dot.dxf", add))
    with pytest.raises(
        DrawingError, match="dot.dxf: layer DOT: holds no closed shapes for a vessel"
    ):
        import_site(d, {"DOT": "vessel"}, "m")
    points = import_site_points("feature,kind,x,y\nQ,quay,5e-324,0\nQ,quay,10,-5e-324\n", "p.csv")
    assert points.features[0].points == ((0.0, 0.0), (10.0, 0.0))


def test_table_values_beyond_any_drawing_are_refused_naming_the_line() -> None:
    """Was: a half-breadth of 1e308 overflowed in shapely's validity check (a RuntimeWarning;
    found by benchmarks/fuzz_drawings.py, seed 7), and without warnings as errors shapely
    did not come back (over 40 s); a site point of -1e300 was refused naming the feature's
    first line, not its own."""
    with pytest.raises(DrawingError) as got:
        import_offsets("station,y\n0,3\n12.5,3\n25,1e308\n", "t.csv")
    assert str(got.value) == "t.csv: line 4: x and half-breadth must be at most 1e+12 from zero"
    with pytest.raises(DrawingError) as got:
        import_site_points("feature,kind,x,y\nQ,quay,0,0\nQ,quay,-1e300,0\n", "p.csv")
    assert str(got.value) == "p.csv: line 3: x and y must be at most 1e+12 from zero"


def test_an_entity_whose_type_name_is_damaged_is_not_read(tmp_path: Path) -> None:
    """Was: ezdxf keeps an entity of a type it does not know without a layer, and asking
    for it raised DXFAttributeError (a traceback; found by benchmarks/fuzz_drawings.py,
    seed 7); the bad byte came through as a lone surrogate, which no terminal prints."""
    text = base_drawings()["site"].encode()
    i = text.index(b"ENTITIES")
    i = text.index(b"\nLWPOLYLINE\n", i)
    path = tmp_path / "name.dxf"
    path.write_bytes(text[:i] + b"\nLW\xffOLYLINE\n" + text[i + 12 :])
    d = Drawing.open(path)
    assert d.counts("0") == {"LW\ufffdOLYLINE": 1}
    (zero,) = [s for s in layer_summaries(d, "mm") if s.layer == "0"]
    assert zero.words() == "0: no outline (1 LW\ufffdOLYLINE)"
    assert "QUAY" not in d.layers()  # the quay was that polyline
    assert import_site(d, {"VESSELS": "vessel"}, "mm").counts() == {"vessel": 1}
