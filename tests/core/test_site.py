"""Placing bodies in the site by their pose, and site features from simple parameters."""

from __future__ import annotations

import math

import pytest
import shapely

from core.errors import InputError
from core.mechanics.site import (
    Placing,
    basin,
    body_pose,
    channel,
    dolphin,
    feature_geometry,
    moored_vessel,
    placed_bodies,
    quay,
)
from core.model.plan import BodyPose, Stage
from tests.core.plan_builders import twin_group_project, two_tug_plan


@pytest.mark.parametrize(
    ("heading", "ahead", "port"),
    [
        # True heading h: the bow points h deg clockwise from north; port is 90 deg to its left.
        (0.0, (0.0, 1.0), (-1.0, 0.0)),  # bow north, port west
        (90.0, (1.0, 0.0), (0.0, 1.0)),  # bow east, port north
        (180.0, (0.0, -1.0), (1.0, 0.0)),  # bow south, port east
        (270.0, (-1.0, 0.0), (0.0, -1.0)),  # bow west, port south
        (45.0, (math.sqrt(0.5), math.sqrt(0.5)), (-math.sqrt(0.5), math.sqrt(0.5))),
    ],
)
def test_heading_points_the_bow_and_port_side(heading, ahead, port):
    pl = Placing.of(BodyPose("B", 100.0, -50.0, heading))
    assert pl.direction((1.0, 0.0)) == pytest.approx(ahead, abs=1e-12)
    assert pl.direction((0.0, 1.0)) == pytest.approx(port, abs=1e-12)
    bow = pl.point((80.0, 10.0))  # the bow's port corner of an 80 m barge, 20 m beam
    expect = (100 + 80 * ahead[0] + 10 * port[0], -50 + 80 * ahead[1] + 10 * port[1])
    assert bow == pytest.approx(expect, abs=1e-9)
    assert pl.to_body(bow) == pytest.approx((80.0, 10.0), abs=1e-9)


def test_placed_body_outline_is_the_hull_rotated_and_moved():
    p = two_tug_plan()
    (pb,) = placed_bodies(p, p.stages[2])  # heading 000 at (0, 40)
    # Bow north, port west: x = -hull y, y = 40 + hull x (hand transform).
    assert pb.polygon.bounds == pytest.approx((-10.0, 40.0, 10.0, 120.0))
    assert pb.polygon.area == pytest.approx(1600.0)


def test_group_pose_given_for_a_member_hull():
    p = twin_group_project()
    # Pose given for member B (turned end for end in the group at (55, -16)): B's bow points
    # east, so the group's +x points west, and the group origin lies 55 m east, 16 m south...
    stage = Stage("s", poses=(BodyPose("B", 0.0, 0.0, 90.0),))
    pose = body_pose(p, stage, "Pair")
    assert pose.heading_deg == pytest.approx(270.0)
    # group frame (55, -16) must land on B's site origin (0, 0)
    assert Placing.of(pose).point((55.0, -16.0)) == pytest.approx((0.0, 0.0), abs=1e-9)
    (pb,) = placed_bodies(p, stage)
    assert pb.name == "Pair"


def test_quay_and_channel():
    q = quay("North quay", (0, 10), (100, 10))
    assert q.kind == "quay" and not q.closed and q.points == ((0.0, 10.0), (100.0, 10.0))
    left, right = channel("Fairway", (0, 0), (0, 500), 120)
    # Looking north from the start, left is west.
    assert left.points == ((-60.0, 0.0), (-60.0, 500.0))
    assert right.points == ((60.0, 0.0), (60.0, 500.0))
    assert left.kind == right.kind == "limit"
    with pytest.raises(InputError, match="must differ from the start"):
        quay("Q", (1, 1), (1, 1))
    with pytest.raises(InputError, match="width: 0.0 must be a positive length"):
        channel("F", (0, 0), (0, 1), 0)


def test_round_dolphin_is_circumscribed_and_square_dolphin_is_exact():
    d = dolphin("D1", (50, 50), 6.0)
    poly = shapely.Polygon(d.points)
    # Every flat of the 24-gon touches the 3 m circle: the inscribed radius is 3 m.
    centre = shapely.Point(50, 50)
    assert poly.exterior.distance(centre) == pytest.approx(3.0)
    # Area of a regular n-gon with apothem a: n a^2 tan(pi/n) (plane geometry).
    assert poly.area == pytest.approx(24 * 9 * math.tan(math.pi / 24))
    sq = dolphin("D2", (0, 0), 4.0, "square")
    assert shapely.Polygon(sq.points).bounds == (-2.0, -2.0, 2.0, 2.0)
    with pytest.raises(InputError, match="must be 'round' or 'square'"):
        dolphin("D3", (0, 0), 4.0, "oval")
    with pytest.raises(InputError, match="size: -1.0 must be a positive length"):
        dolphin("D3", (0, 0), -1.0)


def test_moored_vessel_rectangle_and_bow():
    v = moored_vessel("Maren Tide", (100, 0), 90.0, 120.0, 20.0)
    assert shapely.Polygon(v.points).bounds == pytest.approx((40.0, -10.0, 160.0, 10.0))
    pointed = moored_vessel("Maren Tide", (0, 0), 0.0, 100.0, 16.0, bow_m=12.0)
    pts = shapely.Polygon(pointed.points)
    assert max(pointed.points, key=lambda p: p[1]) == pytest.approx((0.0, 50.0))  # bow north
    assert pts.area == pytest.approx(100 * 16 - 12 * 16 / 2)  # less two triangles of the bow
    with pytest.raises(InputError, match="bow length"):
        moored_vessel("V", (0, 0), 0.0, 10.0, 4.0, bow_m=10.0)


def test_basin_limit_is_measured_to_its_boundary():
    b = basin("Inner basin", [(0, 0), (300, 0), (300, 200), (0, 200)])
    assert b.closed and b.kind == "limit"
    g = feature_geometry(b)
    assert g.geom_type == "LinearRing"
    assert feature_geometry(dolphin("D", (0, 0), 2)).geom_type == "Polygon"
    assert feature_geometry(quay("Q", (0, 0), (1, 0))).geom_type == "LineString"
    with pytest.raises(InputError, match="corner 1"):
        basin("Bad", [(0, 0), (math.nan, 0), (1, 1)])


def test_a_body_with_no_pose_lies_as_the_stage_says():
    p = two_tug_plan()
    stage = Stage("s")
    assert body_pose(p, stage, "Barge") == stage.pose_of("Barge")
    assert body_pose(p, stage, "Barge").heading_deg == 90.0  # bow east, as the board draws it
