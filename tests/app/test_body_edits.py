"""Moving, turning, lashing and unlashing bodies (app.edits.bodies), checked with shapely."""

from __future__ import annotations

import pytest
import shapely
from hypothesis import given, settings
from hypothesis import strategies as st
from shapely import affinity

from app.edits import bodies as edits
from core.errors import InputError
from core.mechanics.bodies import body_of
from core.mechanics.site import body_pose, place_body
from core.model.hull import Hull
from core.model.plan import BodyPose, Project, Stage


def _project() -> Project:
    a = Hull("Alpha", ((0.0, -9.0), (60.0, -9.0), (70.0, 0.0), (60.0, 9.0), (0.0, 9.0)))
    b = Hull("Bravo", ((0.0, -6.0), (40.0, -6.0), (40.0, 6.0), (0.0, 6.0)))
    s1 = Stage(
        "One", poses=(BodyPose("Alpha", 10.0, 20.0, 90.0), BodyPose("Bravo", 15.0, 0.0, 90.0))
    )
    s2 = Stage("Two", poses=(BodyPose("Alpha", -30.0, 80.0, 30.0),))
    return Project(hulls=(a, b), stages=(s1, s2))


def _site_polygon(project: Project, stage: Stage, body: str) -> shapely.Polygon:
    return place_body(body_of(project, body), body_pose(project, stage, body)).polygon


@settings(max_examples=60, deadline=None)
@given(
    heading=st.floats(0.0, 359.9),
    px=st.floats(-50.0, 50.0),
    py=st.floats(-50.0, 50.0),
)
def test_turning_about_a_point_is_shapelys_rotation_about_it(heading, px, py) -> None:  # type: ignore[no-untyped-def]
    p = _project()
    stage = p.stages[0]
    before = _site_polygon(p, stage, "Alpha")
    old = body_pose(p, stage, "Alpha").heading_deg
    turned = edits.turned_body(p, stage, "Alpha", heading, (px, py))
    after = _site_polygon(p, turned, "Alpha")
    # a true heading grows clockwise; shapely's angle counter-clockwise (shapely.affinity)
    expected = affinity.rotate(before, -(heading - old), origin=(px, py))
    assert after.symmetric_difference(expected).area == pytest.approx(0.0, abs=1e-3)


def test_turning_without_a_pivot_keeps_the_centroid() -> None:
    p = _project()
    stage = p.stages[0]
    c0 = _site_polygon(p, stage, "Alpha").centroid
    turned = edits.turned_body(p, stage, "Alpha", 200.0)
    c1 = _site_polygon(p, turned, "Alpha").centroid
    assert (c1.x, c1.y) == pytest.approx((c0.x, c0.y), abs=1e-6)
    assert body_pose(p, turned, "Alpha").heading_deg == 200.0


def test_moving_keeps_the_heading_and_adds_a_missing_pose() -> None:
    p = _project()
    s2 = edits.moved_body(p, p.stages[1], "Bravo", (5.0, -7.0))
    assert s2.poses[-1] == BodyPose("Bravo", 5.0, -7.0, 90.0)  # Bravo had no pose: bow east
    s1 = edits.shifted_body(p, p.stages[0], "Alpha", 1.5, -2.0)
    assert s1.poses[0] == BodyPose("Alpha", 11.5, 18.0, 90.0)
    assert s1.poses[1] == p.stages[0].poses[1]


def test_lash_keeps_each_hull_where_it_lay_and_unlash_gives_them_back() -> None:
    p = _project()
    stage0 = p.stages[0]
    before = {h: _site_polygon(p, stage0, h) for h in ("Alpha", "Bravo")}
    lashed = edits.lashed(p, 0, ("Alpha", "Bravo"), "Pair")
    assert lashed.body_names() == ("Pair",)
    group = _site_polygon(lashed, lashed.stages[0], "Pair")
    union = shapely.union_all(list(before.values()))
    assert group.symmetric_difference(union).area == pytest.approx(0.0, abs=1e-6)
    # in the other stage the pair lies where Alpha lay
    a2 = _site_polygon(p, p.stages[1], "Alpha")
    placed = body_of(lashed, "Pair")
    assert placed.member("Bravo").y == pytest.approx(-20.0)  # 20 m to starboard of Alpha
    assert _site_polygon(lashed, lashed.stages[1], "Pair").contains(a2.buffer(-1e-6))
    back = edits.unlashed(lashed, "Pair")
    assert back.groups == ()
    for h in ("Alpha", "Bravo"):
        poly = _site_polygon(back, back.stages[0], h)
        assert poly.symmetric_difference(before[h]).area == pytest.approx(0.0, abs=1e-6)


def test_lash_refuses_what_cannot_be_lashed() -> None:
    p = _project()
    with pytest.raises(InputError, match="two or more"):
        edits.lashed(p, 0, ("Alpha",), "Pair")
    with pytest.raises(InputError, match="used twice"):
        edits.lashed(p, 0, ("Alpha", "Bravo"), "Alpha")
    pair = edits.lashed(p, 0, ("Alpha", "Bravo"), "Pair")
    c = Hull("Charlie", ((0.0, -5.0), (30.0, -5.0), (30.0, 5.0), (0.0, 5.0)))
    with pytest.raises(InputError, match="already lashed in Pair"):
        edits.lashed(pair.with_hull(c), 0, ("Charlie", "Alpha"), "Trio")
    with pytest.raises(InputError, match="does not exist"):
        edits.unlashed(p, "Nothing")


def test_a_group_name_is_free() -> None:
    p = edits.lashed(_project(), 0, ("Alpha", "Bravo"), "Alpha + Bravo")
    p = edits.unlashed(p, "Alpha + Bravo")
    assert edits.group_name(p, ("Alpha", "Bravo")) == "Alpha + Bravo"
    p2 = edits.lashed(p, 0, ("Alpha", "Bravo"), "Alpha + Bravo")
    c = Hull("Charlie", ((0.0, -5.0), (30.0, -5.0), (30.0, 5.0), (0.0, 5.0)))
    assert edits.group_name(p2.with_hull(c), ("Alpha", "Bravo")) == "Alpha + Bravo (2)"
