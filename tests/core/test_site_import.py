"""The site from a DXF drawing (layers mapped to kinds) or a table of points, placed in
the site frame by its origin and north."""

from __future__ import annotations

import math
from pathlib import Path

import pytest
import shapely

from core.errors import DrawingError, InputError
from core.io.dxf_geometry import Drawing
from core.io.dxf_site import import_site
from core.io.site_import import ImportedSite, SiteFrame, guess_kind, unique_names, with_site
from core.io.site_points import import_site_points
from core.mechanics.site import feature_geometry
from core.model.plan import Project, Site, SiteFeature
from tests import dxf_drawings as dd


def _site_drawing(path: Path) -> Path:
    """An invented basin, drawn in millimetres, 1000 mm to the drawing's +y north-up."""
    doc = dd.new_doc(dd.MM, ("QUAY", "DOLPHINS", "VESSELS", "LIMITS", "TEXT"))
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 0), (150_000, 0), (150_000, -20_000)], dxfattribs={"layer": "QUAY"})
    for cx in (170_000, 190_000):
        msp.add_circle((cx, 0), 2_000, dxfattribs={"layer": "DOLPHINS"})
    msp.add_line(
        (190_000, 10_000), (200_000, 10_000), dxfattribs={"layer": "DOLPHINS"}
    )  # a stray line
    msp.add_lwpolyline(
        [(20_000, 30_000), (110_000, 30_000), (110_000, 46_000), (20_000, 46_000)],
        close=True,
        dxfattribs={"layer": "VESSELS"},
    )
    msp.add_line((0, 250_000), (300_000, 250_000), dxfattribs={"layer": "LIMITS"})
    msp.add_text("MARROW BASIN", dxfattribs={"layer": "TEXT"})
    doc.saveas(path)
    return path


MAPPING = {"QUAY": "quay", "DOLPHINS": "dolphin", "VESSELS": "vessel", "LIMITS": "limit"}


def test_layers_become_features_of_their_kinds(tmp_path: Path) -> None:
    d = Drawing.open(_site_drawing(tmp_path / "basin.dxf"))
    got = import_site(d, MAPPING, "mm")
    assert got.counts() == {"quay": 1, "dolphin": 2, "vessel": 1, "limit": 1}
    assert got.words() == "1 quay line, 2 dolphins, 1 other vessel, 1 limit"
    quay = next(f for f in got.features if f.kind == "quay")
    assert not quay.closed and quay.points == ((0.0, 0.0), (150.0, 0.0), (150.0, -20.0))
    vessel = next(f for f in got.features if f.kind == "vessel")
    assert vessel.closed and shapely.Polygon(vessel.points).area == pytest.approx(90 * 16)
    e = 0.01
    for dolphin in (f for f in got.features if f.kind == "dolphin"):
        # circle pi r^2 (handbook), inscribed within the chord error
        area = shapely.Polygon(dolphin.points).area
        assert 0 < math.pi * 4 - area <= 2 * math.pi * 2 * e
    assert [n.code for n in got.notices] == ["open_lines_left_out"]
    assert {f.name for f in got.features} >= {"QUAY 1", "DOLPHINS 1", "DOLPHINS 2", "VESSELS 1"}
    # the features work with the clearance code as any other
    assert feature_geometry(vessel).area == pytest.approx(90 * 16)


def test_origin_and_north(tmp_path: Path) -> None:
    d = Drawing.open(_site_drawing(tmp_path / "basin.dxf"))
    # true north lies along the drawing's +x (a bearing of 090 from the drawing's +y), and
    # the site's origin is the quay's far corner
    frame = SiteFrame(origin=(150_000.0, 0.0), north_deg=90.0)
    got = import_site(d, {"QUAY": "quay"}, "mm", frame)
    pts = got.features[0].points
    # drawing (0, 0) is 150 m towards the drawing's -x, which is south: site (0, -150)
    assert pts[0] == pytest.approx((0.0, -150.0))
    assert pts[1] == pytest.approx((0.0, 0.0))
    # with north to the sheet's right, east (a quarter turn clockwise) is down the sheet:
    # the quay's leg 20 m towards the drawing's -y runs east
    assert pts[2] == pytest.approx((20.0, 0.0))


def test_frame_rotation_keeps_lengths() -> None:
    frame = SiteFrame(origin=(5.0, 7.0), north_deg=33.0)
    pts = frame.to_site([(5.0, 7.0), (8.0, 11.0)], 1.0)
    assert pts[0] == (0.0, 0.0)
    assert math.hypot(*pts[1]) == pytest.approx(5.0)
    # a drawing vector at bearing 33 (clockwise from drawing +y) points true north
    north = frame.to_site(
        [(5.0 + math.sin(math.radians(33)), 7.0 + math.cos(math.radians(33)))], 1.0
    )[0]
    assert north == pytest.approx((0.0, 1.0))


def test_refusals_name_the_layer(tmp_path: Path) -> None:
    d = Drawing.open(_site_drawing(tmp_path / "basin.dxf"))
    with pytest.raises(DrawingError, match="layer TEXT: holds no lines or shapes for a quay"):
        import_site(d, {"TEXT": "quay"}, "mm")
    with pytest.raises(DrawingError, match="layer QUAY: holds no closed shapes for a dolphin"):
        import_site(d, {"QUAY": "dolphin"}, "mm")
    with pytest.raises(DrawingError, match="no layer is chosen"):
        import_site(d, {}, "mm")
    with pytest.raises(InputError, match="layer QUAY: kind: 'jetty' is not one of"):
        import_site(d, {"QUAY": "jetty"}, "mm")


def test_guessing_kinds_from_layer_names() -> None:
    assert guess_kind("S-QUAY-FACE") == "quay"
    assert guess_kind("Dolphins") == "dolphin"
    assert guess_kind("MOORED_SHIPS") == "vessel"
    assert guess_kind("fairway edge") == "limit"
    assert guess_kind("TITLE") is None


def test_table_of_points() -> None:
    text = (
        "feature,kind,x,y\n"
        "North quay,quay,512000,6523000\n"
        "North quay,quay,512180,6523000\n"
        "D1,dolphin,512200,6522990\n"
        "D1,dolphin,512204,6522990\n"
        "D1,dolphin,512204,6522994\n"
        "D1,dolphin,512200,6522994\n"
        "Basin,limit,511900,6522800\n"
        "Basin,limit,512400,6522800\n"
        "Basin,limit,512400,6523100\n"
        "Basin,limit,511900,6523100\n"
        "Basin,limit,511900,6522800\n"
    )
    got = import_site_points(text, "survey.csv", "m", SiteFrame(origin=(512000.0, 6523000.0)))
    names = [(f.name, f.kind, f.closed) for f in got.features]
    assert names == [
        ("North quay", "quay", False),
        ("D1", "dolphin", True),
        ("Basin", "limit", True),
    ]
    assert got.features[0].points == ((0.0, 0.0), (180.0, 0.0))
    assert shapely.Polygon(got.features[1].points).area == pytest.approx(16.0)
    assert len(got.features[2].points) == 4  # the closing repeat dropped


def test_table_of_points_in_feet_with_a_closed_column() -> None:
    text = "name;kind;x;y;closed\nPier;quay;0;0;yes\nPier;quay;100;0;yes\nPier;quay;100;40;yes\n"
    got = import_site_points(text, "pier.csv", "ft")
    assert got.features[0].closed
    assert got.features[0].points[1] == pytest.approx((30.48, 0.0))  # 1 ft = 0.3048 m (NIST SP 811)


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ("", "p.csv: holds no points"),
        ("name,x,y\nA,0,0\n", "p.csv: line 1: the first row must name the columns; missing: kind"),
        ("feature,kind,x,y\nA,jetty,0,0\n", "p.csv: line 2: kind 'jetty' is not one of"),
        ("feature,kind,x,y\nA,quay,0,zero\n", "p.csv: line 2: is not a feature, kind, x and y"),
        ("feature,kind,x,y\n,quay,0,0\n", "p.csv: line 2: the feature has no name"),
        ("feature,kind,x,y\nA,quay,0,inf\n", "p.csv: line 2: x and y must be finite"),
        ("feature,kind,x,y\nA,quay,0,0\nA,limit,1,0\n", "p.csv: line 3: A changes kind to limit"),
        (
            "feature,kind,x,y\nA,quay,0,0\nA,quay,1,0\nB,quay,0,1\nB,quay,1,1\nA,quay,2,0\n",
            "p.csv: line 6: A appears again after other features",
        ),
        ("feature,kind,x,y\nA,quay,0,0\n", "p.csv: line 2: site A: points: 1 must be two or more"),
        (
            "feature,kind,x,y,closed\nA,quay,0,0,perhaps\n",
            "p.csv: line 2: closed must be yes or no",
        ),
    ],
)
def test_bad_tables_of_points(text: str, message: str) -> None:
    with pytest.raises(DrawingError) as e:
        import_site_points(text, "p.csv")
    assert str(e.value).startswith(message)


def test_joining_the_plan_site() -> None:
    old = SiteFeature("QUAY 1", "quay", ((0.0, 0.0), (10.0, 0.0)))
    project = Project(site=Site("Marrow Basin", (old,)))
    new = ImportedSite("b.dxf", (SiteFeature("QUAY 1", "quay", ((0.0, 5.0), (10.0, 5.0))),))
    added = with_site(project, new, "add")
    assert [f.name for f in added.site.features] == ["QUAY 1", "QUAY 1 (2)"]
    assert added.site.name == "Marrow Basin"
    replaced = with_site(project, new, "replace")
    assert [f.points for f in replaced.site.features] == [((0.0, 5.0), (10.0, 5.0))]
    assert project.site.features == (old,)  # values: the old project is as it was
    with pytest.raises(InputError):
        with_site(project, new, "merge")  # type: ignore[arg-type]
    assert [f.name for f in unique_names([old, old], ["QUAY 1"])] == ["QUAY 1 (2)", "QUAY 1 (3)"]
