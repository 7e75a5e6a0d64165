"""Moving, turning, lashing and unlashing bodies (app.edits.bodies), checked with shapely."""

from __future__ import annotations

import math
from dataclasses import replace

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


def _member_polygon(project: Project, stage: Stage, group: str, hull: str) -> shapely.Polygon:
    """Hull ``hull`` of lashed ``group`` in the site: its outline through its offset, then
    the group's pose (two rigid motions, by hand with shapely's affinity)."""
    m = body_of(project, group).member(hull)
    pose = body_pose(project, stage, group)
    poly = shapely.Polygon(m.hull.outline)
    poly = affinity.rotate(poly, m.heading_rad, origin=(0, 0), use_radians=True)
    poly = affinity.translate(poly, m.x, m.y)
    poly = affinity.rotate(poly, 90.0 - pose.heading_deg, origin=(0, 0))  # bow: CCW from east
    return affinity.translate(poly, pose.x, pose.y)


def test_relash_moves_a_member_by_its_change_of_offset_and_keeps_the_frame() -> None:
    p = edits.lashed(_project(), 0, ("Alpha", "Bravo"), "Pair")
    # Bravo lay at (5, -20) in Alpha's frame: stage One poses Alpha at (10, 20) heading
    # 090 (bow east) and Bravo at (15, 0): 5 m ahead, 20 m to starboard (hand sum)
    assert body_of(p, "Pair").member("Bravo").y == pytest.approx(-20.0)
    alpha = {s.name: _member_polygon(p, s, "Pair", "Alpha") for s in p.stages}
    bravo = {s.name: _member_polygon(p, s, "Pair", "Bravo") for s in p.stages}
    new = edits.relashed(p, "Pair", {"Bravo": (5.0, -22.0, 0.0)})
    assert body_of(new, "Pair").member("Bravo").y == -22.0
    for s in new.stages:  # the frame's owner stays where it lay
        got = _member_polygon(new, s, "Pair", "Alpha")
        assert got.symmetric_difference(alpha[s.name]).area == pytest.approx(0.0, abs=1e-6)
    # stage One: the bow points east (090), so port is north: 2 m more to starboard of
    # Alpha is 2 m south (hand)
    moved = affinity.translate(bravo["One"], 0.0, -2.0)
    got = _member_polygon(new, new.stages[0], "Pair", "Bravo")
    assert got.symmetric_difference(moved).area == pytest.approx(0.0, abs=1e-6)
    # and the group's outline is the two hulls where they now lie
    union = shapely.union_all([alpha["One"], moved])
    got = _site_polygon(new, new.stages[0], "Pair")
    assert got.symmetric_difference(union).area == pytest.approx(0.0, abs=1e-6)


def test_relash_keeps_a_stage_posed_through_a_member_posed_so() -> None:
    p = edits.lashed(_project(), 0, ("Alpha", "Bravo"), "Pair")
    # a file may pose the group through its second hull (the form is kept by posed)
    pose = body_pose(p, p.stages[0], "Pair")
    via = edits.posed(p, replace(p.stages[0], poses=(BodyPose("Bravo", 0.0, 0.0, 0.0),)), pose)
    p = p.with_stage(via, 0)
    assert [x.body for x in p.stages[0].poses] == ["Bravo"]
    alpha = _member_polygon(p, p.stages[0], "Pair", "Alpha")
    new = edits.relashed(p, "Pair", {"Bravo": (0.0, -30.0, math.radians(10.0))})
    assert [x.body for x in new.stages[0].poses] == ["Bravo"]  # still posed through Bravo
    got = _member_polygon(new, new.stages[0], "Pair", "Alpha")
    assert got.symmetric_difference(alpha).area == pytest.approx(0.0, abs=1e-6)


def test_relash_refuses_the_frames_owner_and_what_is_not_a_member() -> None:
    p = edits.lashed(_project(), 0, ("Alpha", "Bravo"), "Pair")
    with pytest.raises(InputError, match="owns the group's frame"):
        edits.relashed(p, "Pair", {"Alpha": (1.0, 0.0, 0.0)})
    with pytest.raises(InputError, match="not one of its hulls"):
        edits.relashed(p, "Pair", {"Charlie": (1.0, 0.0, 0.0)})
    with pytest.raises(InputError, match="does not exist"):
        edits.relashed(p, "Trio", {})
    assert edits.relashed(p, "Pair", {"Alpha": (0.0, 0.0, 0.0)}) is p
