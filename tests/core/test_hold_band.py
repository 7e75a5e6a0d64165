"""A hold limit is held from calm up: where the goal is met only in a band of winds that
does not start at calm, no wind is held and the limit is 0.

The winds s (s ~ V^2) at which the goal is met along one direction form an interval (a
convex set cut by a ray); "held up to V" is honest only when s = 0 lies in it. The
independent reference is scipy's linprog (HiGHS) on the stage's own tug polygons: the
least and the largest s with the goal met, each tug's wrench a convex share of its
polygon's vertices. The review's hand check (REVIEW.md F1, its own LP written without the
project's code) gave the deck barge's bands.
"""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest
from scipy.optimize import linprog

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.model.plan import Project
from core.solve.holdlimits import (
    HoldLimitsProblem,
    hold_limits,
    hold_limits_problem,
    limit_at,
)

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = sorted((ROOT / "sample_projects").glob("*.towboard"))
KN = 1852.0 / 3600.0  # m/s per knot (by definition)


def _with_wind(project: Project, index: int, from_deg: float, speed_kn: float) -> Project:
    stage = project.stages[index]
    c = replace(stage.conditions, wind_from_deg=from_deg, wind_speed_ms=speed_kn * KN)
    stages = list(project.stages)
    stages[index] = replace(stage, conditions=c)
    return replace(project, stages=tuple(stages))


def _linprog_band(problem: HoldLimitsProblem, j: int) -> tuple[float, float] | None:
    """(least, largest) speed m/s with the goal met for the flow from direction j, by
    linprog; None when it is met at no speed.

    Unknowns: each vertex's share l (K,) and the load factor s; sum_v l_iv w_iv + s u = start,
    each tug's shares at most 1 together (its polygon holds the origin), l, s >= 0. With
    the problem's goal tolerance (3,), what is missing e (3,) may be up to it each way:
    sum_v l_iv w_iv + s u + e = start, |e| <= tolerance (the tug lost check's "met").
    """
    verts, tug = problem.shapes.vertices()  # (3, K), (K,)
    k, n = verts.shape[1], problem.shapes.n
    sc = np.array([1.0, 1.0, 1.0 / problem.length_m]) / np.abs(verts).max()
    tol = np.zeros(3) if problem.tolerance is None else np.asarray(problem.tolerance)
    # e in the scaled rows' units (a column sc_i itself may lie under HiGHS's smallest
    # matrix value, 1e-9, and be dropped)
    a_eq = np.c_[np.c_[verts, problem.wind_unit[:, j]] * sc[:, None], np.eye(3)]
    a_ub = np.zeros((n, k + 4))
    a_ub[tug, np.arange(k)] = 1.0
    bounds = [(0, None)] * (k + 1) + [(-t * c, t * c) for t, c in zip(tol, sc, strict=True)]
    out = []
    for sign in (1.0, -1.0):
        r = linprog(
            np.r_[np.zeros(k), sign, np.zeros(3)],
            A_ub=a_ub,
            b_ub=np.ones(n),
            A_eq=a_eq,
            b_eq=problem.start * sc,
            bounds=bounds,
            method="highs",
        )
        if r.status == 2:
            return None
        assert r.status == 0, r.message
        out.append(math.sqrt(max(r.x[k], 0.0)))
    return out[0], out[1]


def _deck_barge() -> Project:
    return load(ROOT / "sample_projects" / "deck_barge_unberth.towboard")


@pytest.mark.parametrize(
    ("stage", "from_deg", "band_kn"),
    [
        # REVIEW.md F1 (its own LP): stage 1 (walk) wind from 000, Gannet lost: met only
        # between 40.6 and 41.2 kn; stage 4 (transit) from 090: between 114.5 and 116.0 kn.
        (0, 0.0, (40.6, 41.2)),
        (3, 90.0, (114.5, 116.0)),
    ],
)
def test_a_band_that_does_not_start_at_calm_holds_no_wind(
    stage: int, from_deg: float, band_kn: tuple[float, float]
) -> None:
    project = _with_wind(_deck_barge(), stage, from_deg, 20.0)
    s = project.stages[stage]
    dirs = np.array([from_deg])
    # the review's LP had no tolerance: the bands are the exact ones
    problem = replace(hold_limits_problem(project, s, directions_deg=dirs), tolerance=None)
    without = problem.without("Gannet")
    band = _linprog_band(without, 0)
    assert band is not None
    lo, hi = band
    # linprog against the review's own LP: the same band to the review's 0.1 kn.
    assert lo / KN == pytest.approx(band_kn[0], abs=0.15)
    assert hi / KN == pytest.approx(band_kn[1], abs=0.15)
    # The sweep with Gannet lost holds no wind from calm: 0, not the top of the band.
    alone = hold_limits(without, with_lost=False)
    assert not alone.holds_current
    assert alone.all_tugs_ms[0] == 0.0
    assert alone.all_tugs_min_ms is not None and alone.all_tugs_max_ms is not None
    assert alone.all_tugs_min_ms[0] == pytest.approx(lo, rel=1e-3)
    assert alone.all_tugs_max_ms[0] == pytest.approx(hi, rel=1e-3)
    # The worst one lost: 0, naming a tug whose loss fails in calm, and saying so.
    lim = hold_limits(problem)
    assert lim.worst_lost_ms[0] == 0.0
    assert "Gannet" in lim.calm_fails
    assert lim.worst_lost_tug[0] in lim.calm_fails
    assert "lost the tugs cannot meet the goal" in lim.calm_words()
    # With every tug the goal is met from calm: the all-tugs figure is linprog's top.
    all_band = _linprog_band(problem, 0)
    assert all_band is not None and all_band[0] == pytest.approx(0.0, abs=1e-6)
    assert lim.all_tugs_ms[0] == pytest.approx(all_band[1], rel=1e-3)


def test_a_band_that_starts_at_calm_keeps_its_top() -> None:
    # REVIEW.md F1: stage 1 from 000, Tern lost: met from 0 to 40.6 kn (linprog agrees).
    project = _with_wind(_deck_barge(), 0, 0.0, 20.0)
    problem = hold_limits_problem(project, project.stages[0], directions_deg=np.array([0.0]))
    problem = replace(problem, tolerance=None)  # the review's LP had none
    without = problem.without("Tern")
    band = _linprog_band(without, 0)
    assert band is not None and band[0] == pytest.approx(0.0, abs=1e-6)
    alone = hold_limits(without, with_lost=False)
    assert alone.holds_current
    assert alone.all_tugs_ms[0] == pytest.approx(band[1], rel=1e-3)
    assert alone.all_tugs_ms[0] / KN == pytest.approx(40.6, abs=0.15)


def _cases() -> list[object]:
    out = []
    for path in SAMPLES:
        project = load(path)
        out += [
            pytest.param(path.stem, project, i, id=f"{path.stem}-{i + 1}")
            for i in range(len(project.stages))
        ]
    # the review's variant (REVIEW.md F1): the deck barge's stage 1 with 20 kn from 000
    variant = _with_wind(_deck_barge(), 0, 0.0, 20.0)
    out.append(pytest.param("deck barge, 20 kn from 000", variant, 0, id="deck_barge-1-000-20kn"))
    return out


@pytest.mark.parametrize(("name", "project", "index"), _cases())
def test_the_tug_lost_check_and_the_limit_never_disagree(
    name: str, project: Project, index: int
) -> None:
    # Where the tug lost check says the goal fails at the planned wind with a tug lost,
    # the limit with the worst tug lost from the planned direction is below the planned
    # wind (logic: the winds held from calm form an interval from 0; a wind outside it
    # is above its top); where it holds with every loss, and so does calm, the limit is
    # at least the planned wind. Both judge "met" by one tolerance
    # (tests/core/test_hold_tolerance.py).
    r = stage_result(project, index)
    c = r.stage.conditions
    for b in r.bodies:
        lim, check = b.hold_limits, b.tug_lost
        if lim is None or check is None or not lim.with_lost:
            continue
        failing = [case.tug for case in check.cases if not case.holds]
        if len(check.cases) < 2:
            continue
        lost = limit_at(lim, c.wind_from_deg, lim.worst_lost_ms)
        if failing:
            assert lost < c.wind_speed_ms, (name, index, failing, lost)
        elif not lim.calm_fails:
            # and the other way: held with every loss at the planned wind and in calm,
            # so held from calm up to the planned wind (an interval from 0)
            assert lost >= c.wind_speed_ms * (1 - 1e-6), (name, index, lost)
