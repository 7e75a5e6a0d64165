"""Clearances against hand-computed cases and against shapely set up independently here."""

from __future__ import annotations

import math
from dataclasses import replace

import pytest
import shapely
import shapely.affinity
from hypothesis import given, settings
from hypothesis import strategies as st

from core.mechanics.clearance import (
    clearance_notices,
    least_per_body,
    stage_clearances,
    stage_margin,
)
from core.mechanics.site import basin, dolphin, moored_vessel, quay
from core.model.plan import BodyPose, Site, Stage, StageLimits
from core.units import DisplayUnits
from tests.core.plan_builders import box_hull, two_tug_plan


def one_barge(heading: float, x: float = 0.0, y: float = 0.0, features=(), margin=10.0, limit=None):
    p = two_tug_plan()
    stage = Stage(
        "S",
        poses=(BodyPose("Barge", x, y, heading),),
        limits=StageLimits(min_clearance_m=limit),
    )
    return replace(
        p, site=Site("Test basin", tuple(features)), stages=(stage,), clearance_margin_m=margin
    )


def by_other(cs):
    return {c.other: c for c in cs}


def test_hand_case_quay_dolphin_and_basin():
    # 80 x 20 m barge, bow east (heading 090) with its reference point at (0, 0): it covers
    # x 0..80, y -10..10 in the site (port side north).
    feats = (
        quay("North quay", (-50, 25), (150, 25)),  # 15 m north of the port side
        dolphin("East dolphin", (120, 0), 4.0),  # 24-gon about a 2 m circle
        basin("Basin", [(-100, -60), (200, -60), (200, 60), (-100, 60)]),
    )
    p = one_barge(90.0, features=feats)
    cs = by_other(stage_clearances(p, p.stages[0]))
    q = cs["North quay"]
    assert q.distance_m == pytest.approx(15.0)
    assert q.at_body[1] == pytest.approx(10.0) and q.at_other[1] == pytest.approx(25.0)
    assert 0.0 <= q.at_body[0] <= 80.0 and q.at_other[0] == pytest.approx(q.at_body[0])
    # The 24-gon has a vertex pointing west at radius 2 / cos(pi/24) (circumscribed polygon).
    d = cs["East dolphin"]
    assert d.distance_m == pytest.approx(120 - 2 / math.cos(math.pi / 24) - 80)
    assert d.at_body == pytest.approx((80.0, 0.0), abs=1e-9)
    b = cs["Basin"]  # nearest edge of the basin: its south and north sides, 50 m away
    assert b.distance_m == pytest.approx(50.0) and not b.outside_limit
    assert not any(c.below_margin for c in cs.values())


def test_margin_from_the_stage_limit_or_else_the_plan():
    feats = (quay("North quay", (-50, 25), (150, 25)),)
    p = one_barge(90.0, features=feats, margin=20.0)
    assert stage_margin(p, p.stages[0]) == 20.0
    cs = stage_clearances(p, p.stages[0])
    (n,) = clearance_notices(cs, DisplayUnits())
    assert n.code == "low_clearance"
    assert n.message == "Barge is 15.0 m from North quay (quay), below the 20.0 m clearance margin"
    p2 = one_barge(90.0, features=feats, margin=20.0, limit=12.0)  # the stage's own minimum wins
    assert stage_margin(p2, p2.stages[0]) == 12.0
    assert clearance_notices(stage_clearances(p2, p2.stages[0]), DisplayUnits()) == ()
    ft = clearance_notices(cs, DisplayUnits(length="ft"))[0].message
    assert "49.2 ft" in ft  # 15 m / 0.3048 (NIST SP 811: 1 ft = 0.3048 m exactly)


def test_touching_overlapping_and_outside_a_basin():
    feats = (
        moored_vessel("Maren Tide", (40, 20), 90.0, 100.0, 24.0),  # overlaps the barge by 2 m
        basin("Small basin", [(-5, -5), (60, -5), (60, 5), (-5, 5)]),
    )
    p = one_barge(90.0, features=feats)
    cs = by_other(stage_clearances(p, p.stages[0]))
    assert cs["Maren Tide"].touching and cs["Maren Tide"].below_margin
    assert cs["Small basin"].outside_limit
    msgs = [n.message for n in clearance_notices(tuple(cs.values()), DisplayUnits())]
    assert "Barge touches or overlaps Maren Tide (vessel)" in msgs
    assert "Barge lies partly outside the limit Small basin" in msgs


def test_body_to_body_and_least_per_body():
    p = two_tug_plan()
    other = box_hull("Lighter", 40.0, 12.0)
    stage = Stage(
        "S",
        poses=(BodyPose("Barge", 0.0, 0.0, 90.0), BodyPose("Lighter", 100.0, 0.0, 90.0)),
    )
    p = replace(
        p, hulls=(*p.hulls, other), stages=(stage,), site=Site("", (quay("Q", (0, 40), (200, 40)),))
    )
    cs = stage_clearances(p, stage)
    pair = next(c for c in cs if c.other_kind == "body")
    assert (pair.body, pair.other) == ("Barge", "Lighter")
    assert pair.distance_m == pytest.approx(20.0)  # barge ends at x 80, lighter starts at 100
    least = least_per_body(cs)
    assert (
        least["Barge"].other == "Lighter" and least["Lighter"].other == "Lighter"
    )  # pair counts for both
    assert least["Barge"].distance_m == pytest.approx(20.0)


def independent_polygon(length, beam, x, y, heading_deg):
    """The barge outline placed with shapely.affinity, not with Towboard's transform."""
    box = shapely.box(0, -beam / 2, length, beam / 2)
    # True heading h points the bow at the site angle 90 - h degrees (CONVENTIONS.md).
    turned = shapely.affinity.rotate(box, 90.0 - heading_deg, origin=(0, 0))
    return shapely.affinity.translate(turned, x, y)


@settings(max_examples=60, deadline=None)
@given(
    heading=st.floats(0, 360),
    x=st.floats(-150, 150),
    y=st.floats(-150, 150),
)
def test_clearances_agree_with_independent_shapely(heading, x, y):
    feats = (
        quay("Quay", (-300, 200), (300, 210)),
        dolphin("Dolphin", (180, -40), 5.0, "square"),
        moored_vessel("Vessel", (-200, -150), 30.0, 90.0, 18.0),
    )
    p = one_barge(heading, x, y, feats)
    ours = by_other(stage_clearances(p, p.stages[0]))
    body = independent_polygon(80.0, 20.0, x, y, heading)
    refs = {
        "Quay": shapely.LineString([(-300, 200), (300, 210)]),
        "Dolphin": shapely.box(177.5, -42.5, 182.5, -37.5),
        "Vessel": shapely.affinity.rotate(
            shapely.box(-245, -159, -155, -141), 60.0, origin=(-200, -150)
        ),
    }
    for name, geom in refs.items():
        c = ours[name]
        assert c.distance_m == pytest.approx(body.distance(geom), abs=1e-7)
        # the reported points lie on their shapes and are that distance apart
        assert math.dist(c.at_body, c.at_other) == pytest.approx(c.distance_m, abs=1e-7)
        assert body.distance(shapely.Point(c.at_body)) < 1e-7
        assert geom.distance(shapely.Point(c.at_other)) < 1e-7


def test_notable_clearances_are_those_below_margin_and_each_bodys_least():
    from core.mechanics.clearance import notable_clearances

    feats = (
        quay("North quay", (-50, 25), (150, 25)),  # 15 m
        quay("South quay", (-50, -16), (150, -16)),  # 6 m
        dolphin("Dolphin", (120, 0), 4.0),  # 38 m
    )
    p = one_barge(90.0, features=feats, margin=20.0)
    cs = notable_clearances(stage_clearances(p, p.stages[0]))
    assert sorted(c.other for c in cs) == ["North quay", "South quay"]  # both under 20 m
    p = one_barge(90.0, features=feats, margin=5.0)
    cs = notable_clearances(stage_clearances(p, p.stages[0]))
    assert [c.other for c in cs] == ["South quay"]  # none under 5 m: the least only


def test_a_gap_just_under_the_margin_reads_under_it():
    # The barge 19.96 m from the quay against a 20 m margin: to the tenth both read
    # "20.0 m" and the caution said "is 20.0 m from North quay, below the 20.0 m margin".
    feats = (quay("North quay", (-50, 25), (150, 25)),)
    p = one_barge(90.0, y=-4.96, features=feats, margin=20.0)  # 15 m off at y = 0
    (n,) = clearance_notices(stage_clearances(p, p.stages[0]), DisplayUnits())
    assert n.message == (
        "Barge is 19.96 m from North quay (quay), below the 20.00 m clearance margin"
    )
