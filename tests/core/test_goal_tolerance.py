"""A goal missed by a hair is met, and a shortfall never reads as nothing.

The barge is 80 m x 20 m (tests.core.plan_builders.box_hull), two 30 t tugs on level
lines square to port at the port bow and quarter; a walk of 10 t to port.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.model.conditions import Conditions
from core.model.goals import Goal
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from core.solve.pulls import GOAL_TOL, shortfall_words
from core.units import DisplayUnits
from tests.conftest import SAMPLES
from tests.core.plan_builders import TF, box_hull

KNOT = 1852 / 3600  # m/s (NIST SP 811)


def _walk(current_kn: float) -> Project:
    hull = box_hull("Barge", 80.0, 20.0, freeboard_m=4.0, draught_m=3.0)
    stage = Stage(
        "Walk",
        "unberth",
        poses=(BodyPose("Barge", 0.0, 0.0, 0.0),),
        placements=(
            Placement("A", "Barge", "port bow", 0.0, math.pi / 2, 50.0),
            Placement("B", "Barge", "port quarter", 0.0, math.pi / 2, 50.0),
        ),
        goal=Goal("walk", fy_n=10 * TF),
        conditions=Conditions(current_speed_ms=current_kn * KNOT, current_towards_deg=180.0),
    )
    tugs = tuple(Tug(t, 30 * TF, towing_point_height_m=4.0) for t in "AB")
    return Project(name="Walk", hulls=(hull,), tugs=tugs, stages=(stage,))


def test_a_shortfall_of_a_few_newtons_is_within_the_tolerance() -> None:
    # A 0.1 kn current from ahead pushes the barge astern by some 50 N; the tugs lead
    # square to port and cannot pull ahead. 50 N is 0.05 % of the 10 t the walk asks of
    # them, well within the half-percent tolerance (common practice, no source): met.
    body = stage_result(_walk(0.1), 0).main
    assert body is not None and body.solved is not None
    (load,) = body.loads
    assert 0 < -load.force[0] < 100.0  # N, astern
    assert -load.force[0] < GOAL_TOL * 10 * TF
    assert body.solved.feasible
    assert not np.any(body.solved.shortfall)
    assert all(r.code != "goal_cannot_be_met" for r in stage_result(_walk(0.1), 0).verdict.reasons)


def test_a_stronger_current_is_a_shortfall_in_the_units_shown() -> None:
    # 3 kn: 30^2 = 900 times the load at 0.1 kn, some 4.4 t astern, past the tolerance.
    r = stage_result(_walk(3.0), 0)
    assert r.main is not None and r.main.solved is not None
    assert not r.main.solved.feasible
    (why,) = [x for x in r.verdict.reasons if x.code == "goal_cannot_be_met"]
    assert "more ahead" in why.text and "needs 0.0 t" not in why.text


def test_a_small_shortfall_is_said_in_the_display_unit_with_its_first_digit() -> None:
    # In a plan whose forces are in t, a shortfall is said in t: 43.6 N / 9806.65 = 0.0044 t,
    # 390 N = 0.0398 t, 300 N·m = 0.0306 t·m (hand calculation), to their first
    # significant digit rather than "0.0 t" or a switch to newtons.
    u = DisplayUnits()
    assert (
        shortfall_words(np.array([43.6, 0.0, 0.0]), u)
        == "needs 0.004 t more ahead, with the yaw moment met"
    )
    assert (
        shortfall_words(np.array([0.0, -390.0, 0.0]), u)
        == "needs 0.04 t more to starboard, with the yaw moment met"
    )
    assert (
        shortfall_words(np.array([0.0, -2.0 * TF, 0.0]), u)
        == "needs 2.0 t more to starboard, with the yaw moment met"
    )
    assert shortfall_words(np.array([0.0, 0.0, 300.0]), u) == (
        "needs 0.03 t·m more swinging the bow to port, with the force met"
    )


# -- one tolerance for "met" and for the words ------------------------------------------


def test_a_hold_is_met_exactly_when_the_words_say_it_holds() -> None:
    # One rule (core.mechanics.forces.negligible) decides both: a hold whose pulls as set
    # meet the goal is never said to walk or swing, and one that walks or swings misses it.
    seen = 0
    for path in sorted(SAMPLES.glob("*.towboard")):
        project = load(path)
        for i, stage in enumerate(project.stages):
            if stage.goal is None or stage.goal.kind != "hold":
                continue
            body = stage_result(project, i).main
            assert body is not None
            b = body.balance
            still = b.walking.startswith("no net force") and b.turning.startswith("no swing")
            assert body.goal_met_as_set == still, (path.name, stage.name, b.walking, b.turning)
            seen += 1
    assert seen >= 2


def test_the_deck_barge_hold_as_set_is_met_and_said_not_to_move() -> None:
    # Deck barge stage 3 as set: net (351.2, -827.4) N = 898.8 N and -30 193 N·m (hand
    # check in the review). The stage deals in 6 782 N of pulls and 7 070 N of wind and
    # current: half a percent is 0.005 x 13 852 = 69.3 N, below the rule's 1 000 N floor
    # (finer than a tug master sets a pull), so 1 000 N, and x 84 m = 84 000 N·m. Both
    # residuals are within it: the hold is met as set, and the words say it does not move.
    # Before, the same stage read GO beside "walks to starboard ... swings bow to
    # starboard" (the words' tolerance was another).
    r = stage_result(load(SAMPLES / "deck_barge_unberth.towboard"), 2)
    body = r.main
    assert body is not None and body.solved is not None
    tol_f, tol_m = body.goal_tolerance
    assert tol_f == pytest.approx(1000.0)
    assert tol_m == pytest.approx(84000.0)
    assert body.goal_tolerance == body.balance.tolerance
    assert body.goal_met_as_set is True
    assert body.balance.walking.startswith("no net force")
    assert body.balance.turning.startswith("no swing")
    assert "pulls_miss_goal" not in [x.code for x in r.verdict.reasons]
