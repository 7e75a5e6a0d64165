"""A stage whose tugs hold less than its own wind limit from some direction is a caution.

REVIEW.md F8: the deck barge's hold (stage 3) read GO with a 20 kn wind limit while the
tugs hold 2.9 kn from the north. The independent reference for the limits here is
scipy's linprog (HiGHS) on the stage's own tug polygons (tests/core/test_hold_band.py).
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest

from core.analysis.stage import stage_result
from core.analysis.wind_limit import held_arcs
from core.io.projectfile import load
from core.model.plan import Project
from core.solve.holdlimits import hold_limits_problem
from tests.core.test_hold_band import _linprog_band

ROOT = Path(__file__).resolve().parents[2]
KN = 1852.0 / 3600.0  # m/s per knot (by definition)
CODE = "wind_limit_not_held_all_round"


def _deck_barge(max_wind_kn: float | None = 20.0) -> Project:
    p = load(ROOT / "sample_projects" / "deck_barge_unberth.towboard")
    s = p.stages[2]
    limits = replace(s.limits, max_wind_ms=None if max_wind_kn is None else max_wind_kn * KN)
    return replace(p, stages=(*p.stages[:2], replace(s, limits=limits), *p.stages[3:]))


def _linprog_kn(project: Project, from_deg: float, exact: bool = False) -> float:
    problem = hold_limits_problem(project, project.stages[2], directions_deg=np.array([from_deg]))
    if exact:
        problem = replace(problem, tolerance=None)
    band = _linprog_band(problem, 0)
    assert band is not None and band[0] == pytest.approx(0.0, abs=1e-6)  # held from calm
    return band[1] / KN


def test_the_deck_barge_hold_is_a_caution_naming_the_lowest_limit_and_the_arc() -> None:
    project = _deck_barge()
    v = stage_result(project, 2).verdict
    assert v.status == "caution"  # a caution, not a no-go
    (r,) = [r for r in v.reasons if r.code == CODE]
    assert r.status == "caution"
    # The lowest: 3.2 kn from 007 true (linprog below agrees, with the goal's tolerance:
    # REVIEW.md F8's own LP, met exactly, gave 2.9 kn; the tolerance, half a percent of
    # the 0.7 t the hold asks as planned, is much beside the 0.04 t that 3 kn brings).
    assert "from 007° true they hold 3.2 kn" in r.text
    assert _linprog_kn(project, 7.0) == pytest.approx(3.2, abs=0.05)
    assert _linprog_kn(project, 7.0, exact=True) == pytest.approx(2.9, abs=0.05)
    # The stage's 20 kn is held only from 110 round to 281 true: linprog says the limit
    # crosses 20 kn between 109 and 110 and between 281 and 282.
    assert "20.0 kn only from 110° to 281° true (clockwise)" in r.text
    assert _linprog_kn(project, 109.0) < 20.0 <= _linprog_kn(project, 110.0)
    assert _linprog_kn(project, 282.0) < 20.0 <= _linprog_kn(project, 281.0)


@pytest.mark.parametrize("max_wind_kn", [None, 2.5])
def test_no_caution_without_a_limit_or_with_one_held_from_everywhere(
    max_wind_kn: float | None,
) -> None:
    # 2.5 kn is under the lowest limit, 3.2 kn (above): held from every direction (the
    # planned 12 kn is then over the stage's limit: no-go for that reason alone).
    v = stage_result(_deck_barge(max_wind_kn), 2).verdict
    assert CODE not in [r.code for r in v.reasons]
    assert v.status == ("go" if max_wind_kn is None else "no-go")


def test_held_arcs_join_across_north() -> None:
    # by hand: held at 350..359 and 0..10, and at 90..100: two runs, the first across north
    d = np.arange(360.0)
    held = (d >= 350) | (d <= 10) | ((d >= 90) & (d <= 100))
    assert sorted(held_arcs(d, held)) == [(90.0, 100.0), (350.0, 10.0)]
    assert held_arcs(d, np.zeros(360, bool)) == []
    assert held_arcs(d, np.ones(360, bool)) == [(0.0, 359.0)]
