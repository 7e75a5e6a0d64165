"""A stage's balance: each tug's force and share, warnings, the equivalent force on the hull.

Expected values are hand calculations from the statics of equivalent systems (any
statics text): R = sum F, M = sum r x F, line of action at offset M / |R|.
"""

from __future__ import annotations

import math

import pytest

from core.frames import bearing_to_angle
from core.mechanics.balance import Load, analyse
from core.model.hull import Fitting, Hull
from core.model.outlines import box_outline
from core.model.plan import GroupMember, LashedGroup, Project, Stage
from core.model.tugs import Placement, Tug

TF = 9806.65  # N per tonne-force


def _project(placements: tuple[Placement, ...], *, swl: float | None = None) -> Project:
    hull = Hull(
        "Barge",
        box_outline(60, 20),  # centroid (30, 0)
        fittings=(
            Fitting("Bow", "line", 60, 0, swl_n=swl),
            Fitting("Stern", "line", 0, 0),
            Fitting("Stbd pad", "push", 45, -10),
            Fitting("Port quarter", "line", 5, 10),
        ),
    )
    tugs = (Tug("A", 50 * TF, 40 * TF), Tug("B", 30 * TF), Tug("C", 20 * TF))
    return Project(hulls=(hull,), tugs=tugs, stages=(Stage("S", placements=placements),))


def test_bow_tug_pulling_to_port_walks_and_swings_bow_to_port() -> None:
    # 50 t at 50 % = 25 t from the bow, line leading to port beam (bearing 270).
    p = _project((Placement("A", "Barge", "Bow", 0.5, bearing_to_angle(270), 40),))
    b = analyse(p, p.stages[0])
    f = 25 * TF
    assert b.net_force == pytest.approx((0.0, f), abs=1e-6)
    assert b.moment_centroid_nm == pytest.approx(30 * f)  # arm 30 m forward of the centroid
    assert b.net_bearing_deg == pytest.approx(270.0)
    assert b.centreline_x == pytest.approx(60.0)  # the line of action runs through the bow
    assert b.equivalent.offset_m == pytest.approx(30.0)
    share = b.shares[0]
    assert share.pull_n == pytest.approx(f)
    assert share.share_of_rated == pytest.approx(0.5)
    assert share.position == pytest.approx((60.0, 40.0))


def test_push_acts_along_the_inward_normal_and_at_an_angle() -> None:
    p = _project((Placement("B", "Barge", "Stbd pad", 1.0, 0.0),))
    b = analyse(p, p.stages[0])
    assert b.net_force == pytest.approx((0.0, 30 * TF), abs=1e-6)  # pushes to port
    assert b.chord is not None  # the line x = 45 enters at the starboard side, leaves at port
    assert [*b.chord[0], *b.chord[1]] == pytest.approx([45.0, -10.0, 45.0, 10.0])
    assert b.moment_centroid_nm == pytest.approx(15 * 30 * TF)
    assert b.shares[0].mode == "push"
    # 30 deg counter-clockwise off the normal: the push leans forward.
    p2 = _project((Placement("B", "Barge", "Stbd pad", 1.0, math.radians(30)),))
    b2 = analyse(p2, p2.stages[0])
    assert b2.net_force == pytest.approx(
        (-30 * TF * math.sin(math.radians(30)), 30 * TF * math.cos(math.radians(30)))
    )


def test_equal_opposite_tugs_fore_and_aft_make_a_couple() -> None:
    p = _project(
        (
            Placement("A", "Barge", "Bow", 0.6, bearing_to_angle(270)),
            Placement("B", "Barge", "Stern", 1.0, bearing_to_angle(90)),
        )
    )
    b = analyse(p, p.stages[0])
    assert b.equivalent.kind == "couple"
    assert b.centreline_x is None and b.chord is None
    assert b.moment_centroid_nm == pytest.approx(30 * 30 * TF * 2)
    assert b.moment_cog_nm == pytest.approx(b.moment_centroid_nm)


def test_astern_uses_the_astern_pull() -> None:
    p = _project((Placement("A", "Barge", "Stern", 1.0, bearing_to_angle(180), astern=True),))
    s = analyse(p, p.stages[0]).shares[0]
    assert s.rated_n == pytest.approx(40 * TF)
    assert s.pull_n == pytest.approx(40 * TF)


def test_moment_about_the_centre_of_gravity_and_any_point() -> None:
    p = _project((Placement("A", "Barge", "Bow", 0.5, bearing_to_angle(270), 40),))
    hull = p.hulls[0]
    from dataclasses import replace

    p = p.with_hull(replace(hull, cog=(26.0, 2.0)))
    b = analyse(p, p.stages[0])
    f = 25 * TF
    assert b.centre_of_gravity == (26.0, 2.0)
    assert b.moment_cog_nm == pytest.approx((60 - 26) * f)
    assert b.moment_about((0.0, 0.0)) == pytest.approx(60 * f)


def test_other_loads_join_the_balance() -> None:
    p = _project((Placement("A", "Barge", "Bow", 0.5, bearing_to_angle(270), 40),))
    wind = Load("wind", (30.0, 0.0), (0.0, -25 * TF))
    b = analyse(p, p.stages[0], loads=(wind,))
    assert b.equivalent.kind == "couple"
    assert b.moment_centroid_nm == pytest.approx(30 * 25 * TF)


def test_warnings_are_data() -> None:
    p = _project(
        (
            Placement("A", "Barge", "Bow", 1.0, bearing_to_angle(0)),
            Placement("B", "Barge", "Bow", 0.2, bearing_to_angle(10)),
            Placement("C", "Barge", "Stbd pad", 0.5, math.radians(95)),
        ),
        swl=40 * TF,
    )
    notices = analyse(p, p.stages[0]).notices
    codes = {(n.code, n.subject) for n in notices}
    assert ("shared_point", "Bow") in codes
    assert ("push_outward", "C") in codes


def test_within_ratings_no_warnings() -> None:
    p = _project((Placement("A", "Barge", "Bow", 0.7, bearing_to_angle(0)),), swl=40 * TF)
    assert analyse(p, p.stages[0]).notices == ()


def test_lashed_group_is_one_body() -> None:
    a = Hull(
        "A", box_outline(60, 20), displacement_kg=3000e3, fittings=(Fitting("Bow", "line", 60, 0),)
    )
    b = Hull(
        "B", box_outline(40, 10), displacement_kg=1000e3, fittings=(Fitting("Bow", "line", 40, 0),)
    )
    group = LashedGroup("Pair", (GroupMember("A"), GroupMember("B", 0.0, -15.0)))
    tugs = (Tug("T1", 40 * TF), Tug("T2", 40 * TF))
    stage = Stage(
        "S",
        placements=(
            Placement("T1", "A", "Bow", 0.5, 0.0),
            Placement("T2", "B", "Bow", 0.5, 0.0),
        ),
    )
    p = Project(hulls=(a, b), groups=(group,), tugs=tugs, stages=(stage,))
    bal = analyse(p, stage)
    assert bal.body == "Pair"
    # Area-weighted centroid: (1200*(30,0) + 400*(20,-15)) / 1600 (hand calculation).
    assert bal.centroid == pytest.approx((27.5, -3.75))
    # Displacement-weighted centre of gravity: (3*(30,0) + 1*(20,-15)) / 4.
    assert bal.centre_of_gravity == pytest.approx((27.5, -3.75))
    f = 20 * TF
    # Both pull ahead: moment about the centroid = -(0 - cy) f - (-15 - cy) f.
    assert bal.moment_centroid_nm == pytest.approx(-(0 + 3.75) * f - (-15 + 3.75) * f)
    assert len(bal.shares) == 2


def test_line_of_action_enters_and_leaves_the_outline_where_shapely_says() -> None:
    import shapely

    p = _project(
        (
            Placement("A", "Barge", "Bow", 0.5, bearing_to_angle(300), 40),
            Placement("B", "Barge", "Stbd pad", 0.4, 0.0),
        )
    )
    b = analyse(p, p.stages[0])
    eq = b.equivalent
    assert eq.point is not None and eq.direction is not None and b.chord is not None
    (px, py), (dx, dy) = eq.point, eq.direction
    line = shapely.LineString([(px - 1e3 * dx, py - 1e3 * dy), (px + 1e3 * dx, py + 1e3 * dy)])
    cut = shapely.Polygon(p.hulls[0].outline).intersection(line)
    ends = sorted(cut.coords, key=lambda c: (c[0] - px) * dx + (c[1] - py) * dy)
    assert [*b.chord[0], *b.chord[1]] == pytest.approx([*ends[0], *ends[-1]])
