"""The ray's exit from a large fleet's zonotope, walked (core.solve.reach.SegmentsReach),
checked against scipy's HiGHS and against the exit among the zonotope's facets."""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.optimize import linprog

import core.solve.pulls as pulls_module
from core.model.goals import Goal
from core.solve.polytope import zonotope_normals
from core.solve.pulls import WALK_FROM_COLUMNS, pulls_problem, solve_pulls
from core.solve.reach import SegmentsReach
from tests.core.test_solve import LEAD, TIGHT, _independent_b, _linprog_allocation, _plan


def _linprog_reach(gen: np.ndarray, target: np.ndarray) -> float:
    """Largest s with s * target = gen @ g, 0 <= g <= 1, by HiGHS (scipy)."""
    k = gen.shape[1]
    r = linprog(
        np.r_[np.zeros(k), -1.0],
        A_eq=np.c_[gen, -target],
        b_eq=np.zeros(3),
        bounds=[(0, 1)] * k + [(0, None)],
        method="highs",
        options=TIGHT,
    )
    assert r.status == 0
    return float(r.x[-1])


def _facets_reach(gen: np.ndarray, target: np.ndarray) -> float:
    """The same from the zonotope's facets: min over normals n pointing along the target
    of (sum of the positive n . g) / (n . target) (support function of a zonotope)."""
    normals = zonotope_normals(gen)
    proj = normals @ gen
    along = normals @ target
    out = along > 1e-12 * np.linalg.norm(target)
    return float((np.maximum(proj, 0.0).sum(axis=1)[out] / along[out]).min())


def _side_tugs(rng: np.random.Generator, k: int) -> np.ndarray:
    """(3, k) tugs along a barge's sides and ends: leads ahead, astern or abeam, a few
    degrees off, arms up to half the length (moments per half length): many columns
    nearly parallel, as a real fleet has."""
    ang = rng.choice([0.0, math.pi / 2, math.pi, -math.pi / 2], size=k)
    ang = ang + rng.normal(0.0, 0.05, k)
    x = rng.uniform(-1.0, 1.0, k)
    f = rng.uniform(0.2, 1.0, k)
    return np.vstack([f * np.cos(ang), f * np.sin(ang), f * x * np.sin(ang)])


@settings(max_examples=80, deadline=None)
@given(st.integers(3, 90), st.integers(0, 2**32 - 1), st.booleans())
def test_the_walked_exit_is_the_highs_reach(k: int, seed: int, sides: bool) -> None:
    rng = np.random.default_rng(seed)
    gen = _side_tugs(rng, k) if sides else rng.normal(size=(3, k))
    target = rng.normal(size=3) * rng.uniform(0.05, 3.0)
    got = SegmentsReach(gen).exit((float(target[0]), float(target[1]), float(target[2])))
    expected = _linprog_reach(gen, target)
    if got is None:  # only where the ray does not enter the set at all
        assert expected <= 1e-9
        return
    s, normal = got
    assert max(s, 0.0) == pytest.approx(expected, rel=1e-7, abs=1e-9)
    assert max(s, 0.0) == pytest.approx(_facets_reach(gen, target), rel=1e-9, abs=1e-12)
    if expected > 1e-6:
        # the normal is the exit face's: the exit point s * target lies on the set's
        # supporting plane in that direction (support function of a zonotope)
        n = np.asarray(normal)
        support = np.maximum(n @ gen, 0.0).sum()
        assert float(n @ target) * s == pytest.approx(support, rel=1e-9, abs=1e-12)


@settings(max_examples=25, deadline=None)
@given(
    st.lists(LEAD, min_size=WALK_FROM_COLUMNS, max_size=WALK_FROM_COLUMNS + 24),
    st.floats(20, 80),
    st.floats(-1500, 1500),
    st.floats(-1500, 1500),
    st.floats(-40000, 40000),
)
def test_a_large_fleet_solves_as_highs_does(
    leads_deg: list[float], bp_t: float, fx_t: float, fy_t: float, m_tm: float
) -> None:
    # The solve's laws (least largest setting, then least total pull) by two HiGHS
    # programmes written out independently (tests.core.test_solve), for a fleet large
    # enough that the solve walks to the exit instead of searching the facets.
    goal = Goal("force", fx_t * 1e3, fy_t * 1e3, m_tm * 1e4)
    bps = [bp_t + 2.5 * (i % 5) for i in range(len(leads_deg))]
    project, stage = _plan(leads_deg, bps, goal=goal)
    problem = pulls_problem(project, stage)
    assert problem.columns.shape[1] >= WALK_FROM_COLUMNS
    result = solve_pulls(problem)
    u = np.array([bp * 9806.65 for bp in bps])
    t, total = _linprog_allocation(_independent_b(stage), u, np.array(goal.target()))
    if math.isinf(t) or t > 1 + 1e-7 or t < 1e-6:
        return  # out of reach, or nothing asked: test_solve covers those laws
    assert result.feasible
    assert result.largest_setting == pytest.approx(t, rel=1e-6, abs=1e-8)
    if not math.isnan(total):
        assert result.total_pull_n == pytest.approx(total, rel=1e-5, abs=1e-2)


def test_both_roads_give_the_same_pulls(monkeypatch: pytest.MonkeyPatch) -> None:
    leads = [(i * 37.5) % 360 for i in range(64)]
    project, stage = _plan(
        leads, [30 + i % 7 for i in range(64)], goal=Goal("force", 4e5, -9e5, 2.5e7)
    )
    walked = solve_pulls(pulls_problem(project, stage))
    monkeypatch.setattr(pulls_module, "WALK_FROM_COLUMNS", 10**9)
    searched = solve_pulls(pulls_problem(project, stage))
    assert walked.feasible and searched.feasible
    got = walked.pulls_n
    want = searched.pulls_n
    assert np.allclose(got, want, rtol=1e-7, atol=1.0)  # 1 N in pulls of 30 t
