"""Solve pulls and the hold limits keep every fitting within its rating.

The barge is 80 m x 20 m (tests.core.plan_builders.box_hull); a 4 m freeboard and a 4 m
towing point make a level line (tension = pull); a 12 m freeboard, a 3 m towing point
and 12 m of line a 3-4-5 line at 36.87 deg (tension = pull / 0.8; geometry).
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest

from core.analysis.stage import stage_result
from core.model.conditions import Conditions
from core.model.goals import Goal
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from core.solve.holdlimits import hold_limits, hold_limits_problem
from core.solve.pulls import pulls_problem, solve_pulls
from tests.core.plan_builders import TF, box_hull

KNOT = 1852 / 3600  # m/s (NIST SP 811)
FITTING_CODES = {"fitting_over_rating", "fitting_total_over_rating"}


def _plan(
    tugs: dict[str, tuple[str, float]],
    goal: Goal,
    ratings_t: dict[str, float],
    *,
    steep: bool = False,
    conditions: Conditions | None = None,
) -> Project:
    """45 t tugs, each on a line from ``tugs[name] = (point, relative bearing)``."""
    hull = box_hull("Barge", 80.0, 20.0, freeboard_m=12.0 if steep else 4.0, draught_m=3.0)
    for point, tow in ratings_t.items():
        hull = hull.with_fitting(replace(hull.fitting(point), tow_n=tow * TF))
    height = 3.0 if steep else 4.0
    stage = Stage(
        "Tow",
        "transit",
        poses=(BodyPose("Barge", 0.0, 0.0, 0.0),),
        placements=tuple(
            Placement(t, "Barge", point, 0.0, -math.radians(b), 12.0 if steep else 50.0)
            for t, (point, b) in tugs.items()
        ),
        goal=goal,
        conditions=conditions or Conditions(),
    )
    fleet = tuple(Tug(t, 45 * TF, towing_point_height_m=height) for t in tugs)
    return Project(name="Ratings", hulls=(hull,), tugs=fleet, stages=(stage,))


def test_one_tug_on_a_low_rated_bitt_cannot_be_solved_past_its_tow() -> None:
    # A 45 t tug on a 20 t TOW bitt, 30 t wanted ahead on a level line: the line may carry
    # 20 t, so the goal is 10 t short (hand calculation), and nothing says Solve meets it.
    p = _plan({"A": ("bow", 0.0)}, Goal("force", fx_n=30 * TF), {"bow": 20.0})
    r = stage_result(p, 0)
    body = r.main
    assert body is not None and body.solved is not None
    assert not body.solved.feasible
    assert body.solved.pulls_n == pytest.approx([20 * TF])
    assert body.solved.shortfall[0] == pytest.approx(10 * TF)
    assert r.verdict.status == "no-go"
    texts = [x.text for x in r.verdict.reasons]
    assert any("cannot be met with every tug: needs 10.0 t more ahead" in t for t in texts)
    assert not any("Solve pulls would meet it" in t for t in texts)


def test_a_steep_line_is_held_to_rating_times_cos() -> None:
    # 3-4-5 line on a 35 t TOW bitt: the pull may be at most 35 x 0.8 = 28 t (tension 35 t).
    p = _plan({"A": ("bow", 0.0)}, Goal("force", fx_n=30 * TF), {"bow": 35.0}, steep=True)
    solved = solve_pulls(pulls_problem(p, p.stages[0]))
    assert not solved.feasible
    assert solved.pulls_n == pytest.approx([28 * TF])


def test_two_tugs_on_one_bitt_are_held_to_its_rating_together() -> None:
    # Two 45 t tugs on the 50 t TOW bow bitt, 80 t wanted ahead: each alone is within the
    # TOW, together they may put 50 t on it, so the goal is 30 t short (hand calculation).
    p = _plan({"A": ("bow", 0.0), "B": ("bow", 0.0)}, Goal("force", fx_n=80 * TF), {"bow": 50.0})
    solved = solve_pulls(pulls_problem(p, p.stages[0]))
    assert not solved.feasible
    assert float(solved.pulls_n.sum()) == pytest.approx(50 * TF)
    assert solved.shortfall[0] == pytest.approx(30 * TF)


@pytest.mark.parametrize(
    ("tugs", "goal", "ratings", "steep"),
    [
        ({"A": ("bow", 0.0), "B": ("bow", 0.0)}, Goal("force", fx_n=45 * TF), {"bow": 50.0}, False),
        (
            {"A": ("bow", 340.0), "B": ("bow", 20.0)},
            Goal("force", fx_n=30 * TF),
            {"bow": 50.0},
            True,
        ),
        ({"A": ("bow", 0.0)}, Goal("force", fx_n=25 * TF), {"bow": 35.0}, True),
        # Spread evenly, A would pull 40 / 3 = 13.3 t on its 10 t bitt; A and B at 10 t
        # each (no yaw), C at 20 t meet it within every rating (hand calculation).
        (
            {"A": ("port bow", 0.0), "B": ("stbd bow", 0.0), "C": ("bow", 0.0)},
            Goal("force", fx_n=40 * TF),
            {"port bow": 10.0},
            False,
        ),
        # Spread evenly, A and B would put 20 + 20 = 40 t on the 30 t bow bitt; 30 t there
        # and 30 t from C at the stern meet it within every rating (hand calculation).
        (
            {"A": ("bow", 0.0), "B": ("bow", 0.0), "C": ("stern", 0.0)},
            Goal("force", fx_n=60 * TF),
            {"bow": 30.0},
            False,
        ),
        (
            {"A": ("port bow", 270.0), "B": ("port bow", 300.0), "C": ("port quarter", 270.0)},
            Goal("walk", fy_n=50 * TF),
            {"port bow": 30.0, "port quarter": 60.0},
            False,
        ),
    ],
)
def test_a_solve_that_meets_the_goal_leaves_no_fitting_over_its_rating(
    tugs: dict[str, tuple[str, float]], goal: Goal, ratings: dict[str, float], steep: bool
) -> None:
    p = _plan(tugs, goal, ratings, steep=steep)
    solved = stage_result(p, 0).main.solved  # type: ignore[union-attr]
    assert solved is not None and solved.feasible
    after = stage_result(p.with_stage(solved.applied_to(p.stages[0]), 0), 0)
    codes = {x.code for x in after.verdict.reasons}
    assert not codes & FITTING_CODES
    assert "goal_cannot_be_met" not in codes and "pulls_miss_goal" not in codes


def test_the_hold_limits_hold_less_on_a_low_rated_fitting() -> None:
    # Two 45 t tugs square to port at the port bow and quarter, 40 m either side of the
    # centroid, hold a wind from the west on the beam (its load at mid-length): with the
    # bow bitt rated 100 t they give 45 + 45 = 90 t; rated 10 t, the bow tug gives 10 t and
    # the quarter tug no more, to keep the yaw moment nil: 20 t. The load grows with the
    # square of the speed, so the limit falls by sqrt(20 / 90) (hand calculation).
    wind = Conditions(wind_speed_ms=20 * KNOT, wind_from_deg=270.0)
    tugs = {"A": ("port bow", 270.0), "B": ("port quarter", 270.0)}

    def limit(rating_t: float) -> np.ndarray:
        p = _plan(tugs, Goal("hold"), {"port bow": rating_t}, conditions=wind)
        return hold_limits(hold_limits_problem(p, p.stages[0])).all_tugs_ms

    low, high = limit(10.0), limit(100.0)
    assert np.all(low <= high * (1 + 1e-9))
    assert low[270] == pytest.approx(high[270] * math.sqrt(20 / 90), rel=1e-3)
