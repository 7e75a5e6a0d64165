"""A lashed group is one rigid body: the union outline, the area-weighted centroid and the
displacement-weighted centre of gravity, against hand formulas; tugs on either hull act on it."""

from __future__ import annotations

import math
from dataclasses import replace

import pytest
import shapely

from core.io.projectfile import load
from core.io.report import report_json, report_text
from core.mechanics.balance import analyse
from core.mechanics.bodies import body_of
from core.mechanics.site import placed_bodies
from core.model.plan import BodyPose, GroupMember, Project, Stage
from core.units import DisplayUnits
from tests.conftest import SAMPLES
from tests.core.plan_builders import TF, box_hull, line, twin_group_project

# Hand layout (see twin_group_project): A is 60 x 18 m at the group origin, x 0..60, y -9..9;
# B is 50 x 14 m turned end for end at (55, -16): x 5..55, y -23..-9, touching A's starboard side.
AREA_A, AREA_B = 60 * 18, 50 * 14
CENT_A, CENT_B = (30.0, 0.0), (55 - 25.0, -16.0)  # B's own centroid (25, 0) turned by 180 deg
COG_A, COG_B = (28.0, 0.5), (55 - 24.0, -16.0)  # B's given CoG (24, 0) turned by 180 deg
DISP_A, DISP_B = 3.0e6, 1.5e6


def test_union_outline():
    body = body_of(twin_group_project(), "Pair")
    assert body.is_group and body.polygon.geom_type == "Polygon"  # touching hulls: one outline
    assert body.polygon.area == pytest.approx(AREA_A + AREA_B)
    assert body.polygon.bounds == pytest.approx((0.0, -23.0, 60.0, 9.0))
    expect = shapely.union_all([shapely.box(0, -9, 60, 9), shapely.box(5, -23, 55, -9)])
    assert body.polygon.symmetric_difference(expect).area == pytest.approx(0.0, abs=1e-9)
    assert (body.length, body.beam) == pytest.approx((60.0, 32.0))


def test_centroid_is_area_weighted():
    body = body_of(twin_group_project(), "Pair")
    # x_c = sum(A_i x_i) / sum(A_i) (first moment of area, any statics text)
    xc = (AREA_A * CENT_A[0] + AREA_B * CENT_B[0]) / (AREA_A + AREA_B)
    yc = (AREA_A * CENT_A[1] + AREA_B * CENT_B[1]) / (AREA_A + AREA_B)
    assert body.centroid == pytest.approx((xc, yc))
    assert yc == pytest.approx(-700 * 16 / 1780)  # = -6.292 m
    # and it agrees with shapely's centroid of the union
    c = body.polygon.centroid
    assert body.centroid == pytest.approx((c.x, c.y))


def test_centre_of_gravity_is_displacement_weighted():
    body = body_of(twin_group_project(), "Pair")
    # x_G = sum(m_i x_Gi) / sum(m_i) (centre of mass of a system of bodies)
    w = DISP_A + DISP_B
    expect = (
        (DISP_A * COG_A[0] + DISP_B * COG_B[0]) / w,
        (DISP_A * COG_A[1] + DISP_B * COG_B[1]) / w,
    )
    assert body.centre_of_gravity == pytest.approx(expect)
    assert body.centre_of_gravity != pytest.approx(body.centroid)


def test_a_tug_on_either_hull_acts_on_the_group():
    p = twin_group_project()
    # Gannet pulls 30 t dead abeam to starboard (bearing 090) from B's "bow" line point, which
    # lies at B's hull (50, 0), group (5, -16); B is turned, so its lead of 090 relative to B
    # is 270 relative to the group: the force points to port of the group, +y.
    stage = Stage("s", placements=(line("Gannet", "B", "bow", 0.6, 90.0),))
    b = analyse(p, stage)
    assert b.body == "Pair"
    f = 0.6 * 50 * TF
    assert b.net_force == pytest.approx((0.0, f), abs=1e-6)
    body = body_of(p, "Pair")
    cx, _cy = body.centroid
    # M = (r - c) x F, z component: (x - cx) Fy - (y - cy) Fx
    assert b.moment_centroid_nm == pytest.approx((5.0 - cx) * f)
    assert (
        b.moment_centroid_nm < 0
    )  # pulling the group's after end to port swings the bow to starboard
    # and the same pull from hull A's stern centre (group (0, 0)), lead 270 relative to A
    stage_a = Stage("s", placements=(line("Gannet", "A", "stern", 0.6, 270.0),))
    ba = analyse(p, stage_a)
    assert ba.net_force == pytest.approx((0.0, f), abs=1e-6)
    assert ba.moment_centroid_nm == pytest.approx((0.0 - cx) * f)


def test_the_group_is_placed_as_one_body():
    p = twin_group_project()
    stage = Stage("s", poses=(BodyPose("Pair", 500.0, 200.0, 180.0),))
    (pb,) = placed_bodies(p, stage)
    # Heading 180: group +x points south, +y (port) points east.
    assert pb.polygon.bounds == pytest.approx((500 - 23, 200 - 60, 500 + 9, 200.0))
    assert pb.polygon.area == pytest.approx(AREA_A + AREA_B)
    assert math.isclose(pb.placing.angle_rad, -math.pi / 2)


def test_a_group_s_centreline_is_named_as_the_hull_whose_frame_it_is():
    # The group's frame is A's (lashing makes it the first hull's): y = 0 is A's centreline,
    # 16 m to port of B's. The same pull from A's stern centre, group (0, 0), dead abeam to
    # port: its line of action x = 0 crosses y = 0 at x = 0 (hand calculation).
    p = twin_group_project()
    stage = Stage("s", placements=(line("Gannet", "A", "stern", 0.6, 270.0),))
    b = analyse(p, stage)
    assert b.crossing_words(DisplayUnits()) == "crosses A's centreline at x = 0.0 m"
    assert b.reference_point == "A's reference point"
    # listed second, A is still the hull whose frame the group's is
    g = p.groups[0]
    swapped = replace(p, groups=(replace(g, members=g.members[::-1]),))
    assert body_of(swapped, "Pair").centreline_words == "A's centreline"
    # a frame that is no member's is said as the group's own
    off = (GroupMember("A", 1.0, 0.0), GroupMember("B", 55.0, -16.0, math.pi))
    alone = replace(p, groups=(replace(g, members=off),))
    assert body_of(alone, "Pair").centreline_words == "the Pair frame's x axis"
    # a single hull's needs no name
    solo = body_of(Project(hulls=(box_hull("Solo", 60.0, 18.0),)), "Solo")
    assert (solo.centreline_words, solo.reference_words) == (
        "the centreline",
        "the hull's reference point",
    )


def test_the_report_names_the_hull_whose_centreline_and_frame_a_group_uses():
    # The bundled Lark pair: Lark 42 lashed 22 m to starboard of Lark 41, whose frame the
    # pair's is; stage 3's 12 t ahead through the pair's centroid runs 11.0 m (half of the
    # 22 m) to starboard of Lark 41's centreline (hand calculation).
    p = load(SAMPLES / "twin_barge_move.towboard")
    text = report_text(p)
    assert "(for the lashed group Lark pair, Lark 41's), x forward" in text
    stage3 = text.split("Stage 3:")[1].split("Stage 4:")[0]
    assert "nearly parallel to Lark 41's centreline, 11.0 m to starboard of it" in stage3
    assert "the centreline" not in text.split("Stage 1:")[1]
    assert (
        report_json(p)["stages"][2]["balance"]["equivalent"]["centreline"] == "Lark 41's centreline"
    )
