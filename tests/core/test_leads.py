"""A towline led over the hull: measured in plan, said as a no-go for its tug.

A line may lie over the hull by half its hull's breadth and 2 m more (a centre bitt's
line crossing the bow's shoulder to the near side); more, or a tug at the end of its
line over the hull, is a no-go.

Hand geometry on a 60 m x 20 m box barge (x 0..60 forward, y -10..10 to port). A line's
part over the hull is the length of the fitting-to-tug segment inside the outline less the
fitting's shortest way out to the edge. The outline is taken EDGE_M (5 cm) in, which the
hand figures below allow for. A hull's fittings lie on its outline (a point given inside
is put on the nearest edge); a point inside the outline (a deck point of a lashed group,
inside the pair's joint outline) is measured with the geometry alone.
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest
import shapely
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.optimize import brentq

from core.analysis.verdict import NO_GO_CODES
from core.frames import bearing_to_angle
from core.mechanics.balance import analyse
from core.mechanics.leads import (
    CLEAR_STEP_DEG,
    EDGE_M,
    OVER_HULL_TOL_M,
    clear_arc,
    ends_on_hull,
    is_clear,
    over_hull_allowance_m,
    over_hull_m,
)
from core.model.goals import Goal
from core.model.hull import Fitting, Hull
from core.model.outlines import box_outline
from core.model.plan import Project, Stage
from core.model.tugs import Placement, Tug
from core.solve.pulls import pulls_problem, solve_pulls

TF = 9806.65  # N per tonne-force
BOX = shapely.Polygon(box_outline(60, 20))
SQ2 = math.sqrt(2)
COS10, SIN10 = math.cos(math.radians(10)), math.sin(math.radians(10))


def _project(*placements: Placement) -> Project:
    hull = Hull(
        "Barge",
        box_outline(60, 20),
        fittings=(
            Fitting("Bow", "line", 60, 0),
            Fitting("Port quarter", "line", 5, 10),
        ),
    )
    tugs = (Tug("A", 50 * TF), Tug("B", 30 * TF))
    return Project(hulls=(hull,), tugs=tugs, stages=(Stage("S", placements=placements),))


def _over(point: str, bearing: float, length: float) -> list[str]:
    p = _project(Placement("A", "Barge", point, 0.5, bearing_to_angle(bearing), length))
    return [n.message for n in analyse(p, p.stages[0]).notices if n.code == "line_over_hull"]


@pytest.mark.parametrize(
    ("point", "end", "expected"),
    [
        ((60, 0), (100, 0), 0.0),  # the bow bitt's line led ahead: clear
        ((60, 0), (20, 0), 40.0),  # led aft along the deck: all 40 m over it
        ((60, 0), (-20, 0), 60.0),  # longer than the hull: out over the stern
        ((5, 10), (5, 50), 0.0),  # the port quarter's line to port
        ((5, 10), (5, -30), 20.0),  # to starboard: across the 20 m beam
        ((30, 8), (30, 40), 0.0),  # a point 2 m in from the port side, to port: its way out
        # 45 degrees forward of the beam: w / cos 45 inside, less the way out w (w = 2 m
        # less the edge allowance)
        ((30, 8), (30 + 30 / SQ2, 8 + 30 / SQ2), (2 - EDGE_M) * (SQ2 - 1)),
        # 10 degrees off ahead: w / sin 10 inside, less w
        ((30, 8), (30 + 25 * COS10, 8 + 25 * SIN10), (2 - EDGE_M) * (1 / SIN10 - 1)),
    ],
)
def test_over_the_hull_by_hand(point, end, expected) -> None:  # type: ignore[no-untyped-def]
    got = over_hull_m(BOX, np.array([point]), np.array([end]))[0]
    assert got == pytest.approx(expected, abs=2 * EDGE_M + 1e-6)


def test_a_bow_line_led_aft_over_the_deck_is_a_no_go() -> None:
    said = _over("Bow", 180, 40)  # the tug 20 m aft of the stem, on the deck
    assert said == [
        "A: at the end of its line from Bow the tug lies over the hull; lead it out over the side"
    ]
    said = _over("Bow", 180, 80)  # out past the stern: 60 m along the deck
    assert said and "A: the towline from Bow runs 59.9 m over the hull" in said[0]
    assert "line_over_hull" in NO_GO_CODES
    assert not _over("Bow", 0, 40)  # ahead: clear
    assert not _over("Bow", 300, 40)  # 60 degrees off ahead to port: clear of the bow


def test_a_side_fitting_may_lead_out_over_its_own_side_only() -> None:
    assert not _over("Port quarter", 270, 30)  # to port
    assert not _over("Port quarter", 355, 30)  # 5 degrees off ahead, still outboard
    said = _over("Port quarter", 90, 40)  # to starboard: 20 m across the 20 m beam
    assert said and "runs 19.9 m over the hull" in said[0]  # 20 m less the edges' 5 cm
    # 5 degrees inboard of ahead from the edge: 55 m along the deck to the bow
    assert _over("Port quarter", 5, 60)
    # and the allowance: half the 20 m breadth and 2 m more
    assert over_hull_allowance_m(20.0) == pytest.approx(10.0 + OVER_HULL_TOL_M) == 12.0


def test_a_centre_line_crossing_the_bows_shoulder_to_the_near_side_is_allowed() -> None:
    """A bow centre bitt on a chamfered bow (84 x 24 m, corners cut 9 m forward to 3 m in),
    its tug on the starboard beam a little abaft it: the line crosses the shoulder, about
    9.6 m over the deck, within half the 24 m breadth and 2 m."""
    outline = ((0, -9), (5, -12), (75, -12), (84, -9), (84, 9), (75, 12), (5, 12), (0, 9))
    hull = Hull("Deck barge", outline, fittings=(Fitting("Bow centre bitt", "line", 84, 0),))
    p = Project(
        hulls=(hull,),
        tugs=(Tug("A", 50 * TF),),
        stages=(
            Stage(
                "S",
                placements=(
                    Placement(
                        "A", "Deck barge", "Bow centre bitt", 0.5, math.radians(-102.2), 45.0
                    ),
                ),
            ),
        ),
    )
    b = analyse(p, p.stages[0])
    assert not [n for n in b.notices if n.code == "line_over_hull"]
    a = math.radians(-102.2)
    end = np.array([(84 + 45 * math.cos(a), 45 * math.sin(a))])
    over = over_hull_m(shapely.Polygon(outline), np.array([(84.0, 0.0)]), end)[0]
    assert 9.0 < over < over_hull_allowance_m(24.0)


def test_a_tug_ends_on_the_hull_or_clear_of_it() -> None:
    ends = np.array([(30.0, 0.0), (30.0, 10.02), (30.0, 10.5), (-1.0, 0.0)])
    assert ends_on_hull(BOX, ends).tolist() == [True, False, False, False]  # 10.02: on the edge


def test_lines_far_apart_are_measured_each_on_its_own() -> None:
    pts = np.array([(60, 0), (5, 10), (30, 8)], dtype=float)
    ends = np.array([(20, 0), (5, 50), (30, -40)], dtype=float)
    got = over_hull_m(BOX, pts, ends)
    # the third from 2 m in from the port side across to starboard: 18 m inside, less 2
    assert got == pytest.approx([40.0, 0.0, 16.0], abs=2 * EDGE_M + 1e-6)
    assert over_hull_m(BOX, np.zeros((0, 2)), np.zeros((0, 2))).shape == (0,)


# -- the solve takes only leads clear of the hull ------------------------------------------


def test_the_clear_part_of_a_bow_bitts_whole_circle_by_hand() -> None:
    # A 40 m line from the stem of the 60 x 20 m box: led ahead of the beam it is clear;
    # led aft at theta off ahead it crosses the deck for (10 - EDGE_M) / sin(theta) to
    # leave by a side, allowed up to 12 m (half the breadth and 2 m): clear while
    # over = (10 - e) / sin(theta) - e / |cos(theta)| (e = EDGE_M: the hull taken e in,
    # the stem's e counted as its way out), clear while that is at most 12 m.
    arc = clear_arc(BOX, (60.0, 0.0), 0.0, 40.0, 12.0, (-math.pi, math.pi))
    assert arc is not None
    edge = math.degrees(
        brentq(
            lambda t: (10 - EDGE_M) / math.sin(t) - EDGE_M / abs(math.cos(t)) - 12.0,
            math.radians(95),
            math.radians(175),
        )
    )
    lo, hi = (math.degrees(a) for a in arc)
    assert edge - CLEAR_STEP_DEG <= hi <= edge  # the last clear lead tried
    assert lo == pytest.approx(-hi)
    # ... and a narrow sector wholly clear is kept as it is; one wholly over, none
    assert clear_arc(BOX, (60.0, 0.0), 0.0, 40.0, 12.0, (-0.3, 0.4)) == (-0.3, 0.4)
    assert clear_arc(BOX, (60.0, 0.0), 0.0, 40.0, 12.0, (3.0, 3.2)) is None


def test_a_sector_clear_in_two_runs_keeps_the_longer() -> None:
    # The port quarter (5, 10) on a 30 m line, sector from 60 degrees off ahead to port
    # round through astern (lead angle 60..300 degrees counter-clockwise): to port and
    # astern clear; round to the starboard quarter over the deck. Runs: 60..~186
    # (clear, port side and aft) and a short one past the starboard quarter: the first.
    arc = clear_arc(BOX, (5.0, 10.0), 0.0, 30.0, 12.0, (math.radians(60), math.radians(300)))
    assert arc is not None
    lo, hi = (math.degrees(a) for a in arc)
    assert lo == pytest.approx(60.0)
    # Every lead kept is clear, by the measure the verdict uses.
    leads = np.radians(np.linspace(lo, hi, 50))
    ends = np.column_stack([5 + 30 * np.cos(leads), 10 + 30 * np.sin(leads)])
    assert is_clear(BOX, np.tile((5.0, 10.0), (50, 1)), ends, 12.0).all()


def _sector_plan(goal: Goal, bow_sector: tuple[float, float] = (-math.pi, math.pi)) -> Project:
    p = _project(
        Placement("A", "Barge", "Bow", 0.5, 0.0, 40.0, lead_sector_rad=bow_sector),
        Placement("B", "Barge", "Port quarter", 0.5, math.pi / 2, 30.0,
                  lead_sector_rad=(-math.pi, math.pi)),
    )  # fmt: skip
    return replace(p, stages=(replace(p.stages[0], goal=goal),))


@settings(max_examples=40, deadline=None)
@given(st.floats(-60, 60), st.floats(-60, 60), st.floats(-1500, 1500))
def test_no_solve_proposes_a_lead_over_the_hull(fx_t: float, fy_t: float, m_tm: float) -> None:
    # Before the sectors were cut, a goal astern had the bow tug solved to lead aft
    # along the deck, which the verdict then called a no-go.
    project = _sector_plan(Goal("force", fx_t * TF, fy_t * TF, m_tm * TF))
    stage = project.stages[0]
    solved = solve_pulls(pulls_problem(project, stage)).applied_to(stage)
    notices = analyse(replace(project, stages=(solved,)), solved).notices
    assert not [n.message for n in notices if n.code == "line_over_hull"]


def test_a_goal_astern_leads_the_bow_tug_clear() -> None:
    project = _sector_plan(Goal("force", -30 * TF, 0.0, 0.0))
    stage = project.stages[0]
    result = solve_pulls(pulls_problem(project, stage))
    # Its clear arc (+-124 degrees, above) is wider than half a turn: the half turn about
    # its middle is kept, leads forward of the beam, so it cannot help pull astern.
    assert abs(math.degrees(result.leads_rad[0])) <= 90.0 + 1e-6
    assert not result.feasible or result.pulls_n[0] <= 1e-6 * TF


def test_a_sector_wholly_over_the_hull_leaves_the_tug_out_and_says_so() -> None:
    project = _sector_plan(Goal("force", -30 * TF, 0.0, 0.0), bow_sector=(3.0, 3.2))
    problem = pulls_problem(project, project.stages[0])
    said = [n.message for n in problem.notices if n.code == "no_clear_lead"]
    assert said == [
        "A: no lead in its working sector from Bow runs clear of the hull; the solve leaves it out"
    ]
    assert solve_pulls(problem).pulls_n[0] == 0.0


def test_used_arc_is_the_part_the_tugs_polygon_is_made_of() -> None:
    # The bow tug's whole circle is clear from about -124 to +124 degrees (above), wider
    # than half a turn: the half turn about its middle, -90..90, is what the solve takes.
    from core.mechanics.balance import tug_layout
    from core.mechanics.bodies import stage_body
    from core.mechanics.tugsets import tug_sets, used_arc

    project = _sector_plan(Goal("hold"))
    stage = project.stages[0]
    body = stage_body(project, stage)
    layout = tug_layout(project, stage, body)
    lo, hi = used_arc(layout, 0)  # type: ignore[misc]
    assert math.remainder(lo + math.pi / 2, 2 * math.pi) == pytest.approx(0.0, abs=1e-9)
    assert hi - lo == pytest.approx(math.pi)
    # every vertex of its polygon lies along a lead of that arc, and the ends are among them
    sets = tug_sets(layout, body.centroid)
    leads = sets.vertex_lead[sets.vertex_tug == 0]
    off = np.mod(leads - lo, 2 * math.pi)
    assert np.all(off <= hi - lo + 1e-9)
    assert off.min() == pytest.approx(0.0, abs=1e-9)
    assert off.max() == pytest.approx(hi - lo)
    # a sector wholly over the hull: none
    over = replace(stage, placements=(stage.placements[0].with_sector((3.0, 3.2)),))
    assert used_arc(tug_layout(project, over, body), 0) is None
