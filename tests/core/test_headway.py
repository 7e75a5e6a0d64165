"""A tug's usable pull with way on: the headway table, its use by the solver for a
transit at its planned speed through the water, and its place in the file."""

from __future__ import annotations

import json
import math
from dataclasses import replace
from pathlib import Path

import jsonschema
import numpy as np
import pytest

from core.analysis.stage import stage_result
from core.errors import InputError, ProjectFileError
from core.io.projectfile import dumps, loads
from core.mechanics.balance import tug_layout
from core.mechanics.bodies import body_of
from core.model.goals import Goal
from core.model.headway import PLACEHOLDER_ROWS_KN, HeadwayTable, headway_of
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from core.solve.pulls import pulls_problem, solve_pulls
from tests.core.plan_builders import TF, box_hull

KNOT = 1852 / 3600  # m/s, the international knot (exact)
ROOT = Path(__file__).resolve().parents[2]
SCHEMA = json.loads((ROOT / "docs" / "towboard.schema.json").read_text())

OWN = headway_of([0.0, 3.0, 6.0], [1.0, 0.8, 0.5], placeholder=False)


def test_share_is_linear_between_rows_and_held_beyond() -> None:
    # By hand: 1.5 kn is halfway from 0 (1.0) to 3 kn (0.8): 0.9; 4.5 kn halfway to 6 kn: 0.65.
    assert OWN.share_at(1.5 * KNOT) == pytest.approx(0.9)
    assert OWN.share_at(4.5 * KNOT) == pytest.approx(0.65)
    assert OWN.share_at(10 * KNOT) == pytest.approx(0.5)
    assert OWN.share_at(0.0) == 1.0
    # Sternway reads the same table by its speed.
    assert OWN.share_at(-1.5 * KNOT) == pytest.approx(0.9)


def test_a_tug_starts_with_placeholder_rows() -> None:
    t = Tug("Gannet", 40 * TF)
    assert t.headway is not None and t.headway.placeholder
    assert np.array(t.headway.rows_kn) == pytest.approx(np.array(PLACEHOLDER_ROWS_KN))
    assert t.headway_share(0.0) == 1.0


@pytest.mark.parametrize(
    ("speeds", "shares", "said"),
    [
        ([0.0, 2.0, 1.0], [1.0, 0.9, 0.8], "must be in increasing order"),
        ([0.0, 2.0], [1.0, 1.2], "share of bollard pull: 1.2 must be at most 1"),
        ([0.0, 30.0], [1.0, 0.5], "speed through the water"),
        ([], [], "must have 1 to 50 rows"),
        ([0.0, 1.0], [1.0], "needs one share per speed"),
    ],
)
def test_bad_tables_are_refused(speeds: list[float], shares: list[float], said: str) -> None:
    with pytest.raises(InputError, match="headway table") as e:
        HeadwayTable(tuple(v * KNOT for v in speeds), tuple(shares))
    assert said in str(e.value)


def test_a_speed_is_for_a_transit_only() -> None:
    assert Goal("transit", fx_n=10 * TF, speed_ms=3 * KNOT).speed_ms == pytest.approx(3 * KNOT)
    with pytest.raises(InputError, match="speed through the water"):
        Goal("hold", speed_ms=1.0)
    with pytest.raises(InputError, match="speed through the water"):
        Goal("transit", fx_n=1.0, speed_ms=25 * KNOT)


# -- the solver reads the table at the transit's speed -------------------------------------


def _plan(goal: Goal | None, headway: HeadwayTable | None = OWN) -> Project:
    hull = box_hull("Barge", 80.0, 20.0, freeboard_m=4.0, draught_m=3.0)
    tugs = (Tug("Gannet", 30 * TF, headway=headway), Tug("Puffin", 30 * TF, headway=headway))
    stage = Stage(
        "Tow out",
        "transit",
        poses=(BodyPose("Barge", 0.0, 0.0, 0.0),),
        placements=(
            Placement("Gannet", "Barge", "bow", 0.5, 0.0, 60.0),
            Placement("Puffin", "Barge", "stern", 0.0, math.pi, 40.0, astern=False),
        ),
        goal=goal,
    )
    return Project(name="Tow", hulls=(hull,), tugs=tugs, stages=(stage,))


def test_usable_pull_falls_with_the_transit_speed() -> None:
    rest = _plan(Goal("transit", fx_n=20 * TF))
    moving = _plan(Goal("transit", fx_n=20 * TF, speed_ms=4.5 * KNOT))
    body = body_of(rest, "Barge")
    u0 = tug_layout(rest, rest.stages[0], body).usable_n
    u1 = tug_layout(moving, moving.stages[0], body).usable_n
    # 4.5 kn: share 0.65 by the table (by hand, above); the rest of the usable pull as before.
    assert u1 == pytest.approx(0.65 * u0, rel=1e-12)
    layout = tug_layout(moving, moving.stages[0], body)
    assert layout.headway_share == pytest.approx([0.65, 0.65])
    assert layout.speed_through_water_ms == pytest.approx(4.5 * KNOT)


def test_other_goals_use_the_pull_at_rest() -> None:
    p = _plan(Goal("hold"))
    layout = tug_layout(p, p.stages[0], body_of(p, "Barge"))
    assert layout.headway_share == pytest.approx([1.0, 1.0])


def test_the_solver_asks_more_of_each_tug_with_way_on() -> None:
    # The same 18 t ahead from the bow tug alone (the stern tug leads astern): at rest it
    # uses 18/30 of its usable pull, at 4.5 kn 18/(30 x 0.65) of it; at 7 kn 18/15 > 1.
    def solved(speed_kn: float):  # type: ignore[no-untyped-def]
        p = _plan(Goal("transit", fx_n=18 * TF, speed_ms=speed_kn * KNOT))
        return solve_pulls(pulls_problem(p, p.stages[0]))

    rest, moving, fast = solved(0.0), solved(4.5), solved(7.0)
    assert rest.feasible and moving.feasible
    assert rest.pulls_n[0] == pytest.approx(18 * TF, rel=1e-6)
    assert moving.pulls_n[0] == pytest.approx(18 * TF, rel=1e-6)
    assert moving.settings[0] == pytest.approx(18 / (30 * 0.65), rel=1e-6)
    assert rest.settings[0] == pytest.approx(18 / 30, rel=1e-6)
    assert not fast.feasible


def test_the_stage_result_and_verdict_follow_the_speed() -> None:
    slow = stage_result(_plan(Goal("transit", fx_n=20 * TF, speed_ms=1.0 * KNOT)), 0)
    fast = stage_result(_plan(Goal("transit", fx_n=20 * TF, speed_ms=7.0 * KNOT)), 0)
    assert slow.main is not None and fast.main is not None
    assert fast.main.layout.usable_n == pytest.approx(
        slow.main.layout.usable_n * 0.5 / np.interp(1.0, [0, 3, 6], [1.0, 0.8, 0.5])
    )
    assert any(r.code == "goal_cannot_be_met" for r in fast.verdict.reasons)
    assert not any(r.code == "goal_cannot_be_met" for r in slow.verdict.reasons)


# -- the file ----------------------------------------------------------------------------


def test_headway_and_speed_round_trip() -> None:
    p = _plan(Goal("transit", fx_n=20 * TF, speed_ms=3.5 * KNOT))
    p = p.with_tug(replace(p.tug("Puffin"), headway=None), old_name="Puffin")
    text = dumps(p)
    jsonschema.validate(json.loads(text), SCHEMA)
    again = loads(text)
    assert again.tug("Gannet").headway == OWN
    assert again.tug("Puffin").headway is not None and again.tug("Puffin").headway.placeholder
    assert again.stages[0].goal == p.stages[0].goal
    assert dumps(again) == text


def test_files_without_them_get_placeholders_and_rest() -> None:
    data = json.loads(dumps(_plan(Goal("transit", fx_n=20 * TF, speed_ms=3.5 * KNOT))))
    for t in data["tugs"]:
        del t["headway"]
    del data["stages"][0]["goal"]["speed_through_water_kn"]
    p = loads(json.dumps(data))
    assert p.tug("Gannet").headway is not None and p.tug("Gannet").headway.placeholder
    assert p.stages[0].goal is not None and p.stages[0].goal.speed_ms == 0.0


def test_bad_rows_name_their_path() -> None:
    data = json.loads(dumps(_plan(Goal("transit", fx_n=20 * TF, speed_ms=3.5 * KNOT))))
    data["tugs"][0]["headway"]["speed_kn_and_share"][1] = [3.0, 1.5]
    data["tugs"][1]["headway"]["speed_kn_and_share"] = [[0, 1.0], [4, 0.8], [2, 0.5]]
    data["stages"][0]["goal"]["speed_through_water_kn"] = -2
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data), "plan.towboard")
    problems = [str(x) for x in e.value.problems]
    assert problems[:2] == [
        "tugs[0].headway.speed_kn_and_share[1][1]: 1.5 must be at most 1",
        "tugs[1].headway.speed_kn_and_share: the speeds must be in increasing order",
    ]
    assert "stages[0].goal.speed_through_water_kn: -2.0 kn must not be negative" in problems


@pytest.mark.parametrize(
    ("rows", "message"),
    [
        ([], "speed_kn_and_share: must be a list of 1 to 50 [speed_kn, share] rows"),
        ([[0, 1.0], [4]], "speed_kn_and_share[1]: [4] is not a row [speed_kn, share]"),
        ([[0, 1.0], "fast"], "speed_kn_and_share[1]: 'fast' is not a row [speed_kn, share]"),
        ([[0, "x"]], "speed_kn_and_share[0][1]: 'x' is not a number"),
        ([[25, 1.0]], "speed_kn_and_share[0][0]: 25.0 kn must be at most 20 kn"),
    ],
)
def test_bad_headway_rows_are_said_as_rows(rows: list[object], message: str) -> None:
    # The capability's [bearing, share] pairs are read by the same reader (test_capability).
    data = json.loads(dumps(_plan(Goal("transit", fx_n=20 * TF, speed_ms=3.5 * KNOT))))
    data["tugs"][0]["headway"]["speed_kn_and_share"] = rows
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data), "plan.towboard")
    assert f"tugs[0].headway.{message}" in [str(x) for x in e.value.problems]
