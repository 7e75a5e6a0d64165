"""The hold limits judge "met" as the tug lost check does: within the goal's tolerance.

The review of the twin barge sample (stage 4, a walk of 12 t to port) found the tug lost
check saying the goal holds with Rowan lost while the hold limits said that with Rowan
lost it fails even in calm: the stage's 0.1 kn current puts 0.01 t ahead on the pair that
no tug left can answer exactly, far inside the check's tolerance (half a percent of the
12 t asked, core.solve.pulls.tolerance_of). The sweep now adds that tolerance as a box to
the fleet's set. The independent reference is scipy's linprog (HiGHS) on the stage's own
tug polygons with the box as three bounded unknowns (tests/core/test_hold_band.py).
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.model.plan import Project
from core.solve.holdlimits import hold_limits, hold_limits_problem, limit_at
from core.solve.pulls import goal_tolerance, pulls_problem
from tests.core.test_hold_band import _linprog_band

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = sorted((ROOT / "sample_projects").glob("*.towboard"))


def _twin() -> Project:
    return load(ROOT / "sample_projects" / "twin_barge_move.towboard")


def test_the_twin_barge_berth_holds_with_rowan_lost_in_both_checks() -> None:
    r = stage_result(_twin(), 3)
    (b,) = [b for b in r.bodies if b.tug_lost is not None]
    check, lim = b.tug_lost, b.hold_limits
    assert check is not None and lim is not None
    assert all(case.holds for case in check.cases)  # the tug lost check: holds
    # the hold limits agree: no loss fails in calm, and from the planned direction the
    # worst tug lost holds more than the planned wind
    assert lim.calm_fails == ()
    c = r.stage.conditions
    assert limit_at(lim, c.wind_from_deg, lim.worst_lost_ms) >= c.wind_speed_ms
    # The current alone is what the exact sweep could not answer: with Rowan lost and no
    # tolerance, calm fails (the fault the review found).
    problem = hold_limits_problem(r.project, r.stage)
    exact = hold_limits(replace(problem, tolerance=None).without("Rowan"), with_lost=False)
    assert not exact.holds_current
    kept = hold_limits(problem.without("Rowan"), with_lost=False)
    assert kept.holds_current


def _stages() -> list[object]:
    out = []
    for path in SAMPLES:
        project = load(path)
        out += [
            pytest.param(project, i, id=f"{path.stem}-{i + 1}") for i in range(len(project.stages))
        ]
    return out


@pytest.mark.parametrize(("project", "index"), _stages())
def test_the_sweep_and_the_check_use_one_tolerance(project: Project, index: int) -> None:
    stage = project.stages[index]
    if stage.goal is None or not stage.placements:
        pytest.skip("no goal: nothing to solve")
    problem = hold_limits_problem(project, stage)
    check = goal_tolerance(pulls_problem(project, stage))
    assert problem.tolerance is not None
    assert problem.tolerance == pytest.approx(check, rel=1e-6)


@pytest.mark.parametrize(("project", "index"), _stages())
def test_the_sweep_with_its_tolerance_agrees_with_linprog(project: Project, index: int) -> None:
    stage = project.stages[index]
    if not stage.placements:
        pytest.skip("no tugs")
    dirs = np.array([0.0, 95.0, 200.0, 290.0])
    problem = hold_limits_problem(project, stage, directions_deg=dirs)
    lost = problem.tugs[0]
    for p in (problem, problem.without(lost)):
        lim = hold_limits(p, with_lost=False)
        for j in range(len(dirs)):
            band = _linprog_band(p, j)
            if band is None or band[0] > 1e-6:  # not held from calm: the limit is 0
                assert lim.all_tugs_ms[j] == 0.0
                continue
            top = min(band[1], 1e3)  # a ray that never leaves: both far above any limit
            assert min(lim.all_tugs_ms[j], 1e3) == pytest.approx(top, rel=1e-3, abs=1e-6)
