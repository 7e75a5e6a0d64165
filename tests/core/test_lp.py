"""The small simplex solver against scipy.optimize.linprog (HiGHS) as the reference."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.optimize import linprog

from core.solve.lp import solve_lp

STATUS = {0: "optimal", 2: "infeasible", 3: "unbounded"}


def _reference(c, a, b, up):  # type: ignore[no-untyped-def]
    bounds = [(0.0, None if np.isinf(u) else float(u)) for u in up]
    return linprog(c, A_eq=a, b_eq=b, bounds=bounds, method="highs")


@st.composite
def problems(draw: st.DrawFn) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    m = draw(st.integers(1, 4))
    n = draw(st.integers(1, 12))
    seed = draw(st.integers(0, 2**32 - 1))
    rng = np.random.default_rng(seed)
    a = rng.normal(size=(m, n))
    if draw(st.booleans()):  # integer entries give degenerate vertices
        a = np.round(a * 2)
    feasible = draw(st.booleans())  # else b is random and may be out of reach
    b = a @ rng.uniform(0, 1, n) if feasible else rng.normal(size=m) * 3
    up = np.where(rng.random(n) < 0.25, np.inf, rng.uniform(0.2, 2.0, n))
    c = rng.normal(size=n)
    if draw(st.booleans()):
        c = np.round(c)
    return c, a, b, up


@settings(max_examples=300, deadline=None)
@given(problems())
def test_agrees_with_linprog(p: tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]) -> None:
    c, a, b, up = p
    ours = solve_lp(c, a, b, up)
    ref = _reference(c, a, b, up)
    assert ours.status == STATUS[ref.status]
    if ref.status == 0:
        assert ours.objective == pytest.approx(ref.fun, rel=1e-7, abs=1e-7)
        assert np.abs(a @ ours.x - b).max() <= 1e-7
        assert np.all(ours.x >= 0) and np.all(ours.x <= up)


def test_zero_right_hand_side_starts_feasible() -> None:
    # min -x1 subject to x1 - x2 = 0, x <= 1: optimum x1 = x2 = 1.
    r = solve_lp(np.array([-1.0, 0.0]), np.array([[1.0, -1.0]]), np.zeros(1), np.ones(2))
    assert r.ok and list(r.x) == pytest.approx([1.0, 1.0])


def test_infeasible_and_unbounded_are_statuses_not_errors() -> None:
    # x1 + x2 = 5 with both at most 1: infeasible.
    r = solve_lp(np.zeros(2), np.array([[1.0, 1.0]]), np.array([5.0]), np.ones(2))
    assert r.status == "infeasible" and not r.ok
    # min -x1 with x1 - x2 = 0 and no upper bounds: unbounded.
    r = solve_lp(np.array([-1.0, 0.0]), np.array([[1.0, -1.0]]), np.zeros(1), np.full(2, np.inf))
    assert r.status == "unbounded"


def test_rows_scaled_by_a_denormal_pull_are_a_status_not_an_index_error() -> None:
    # What core.solve.pulls handed over for a fleet of 5e-324 N tugs: one column, rows
    # scaled by 1 / 5e-324 (infinity), so 0 x inf is NaN. It raised IndexError once.
    r = solve_lp(
        np.array([1.0]),
        np.array([[np.nan], [np.inf], [np.inf]]),
        np.array([-np.inf, np.inf, np.inf]),
        np.array([1e-12]),
    )
    assert r.status == "not_finite" and not r.ok
    assert r.x.shape == (1,)


def test_arithmetic_that_overflows_is_a_status_not_an_index_error() -> None:
    # Finite data whose reduced costs overflow to NaN on the way (found by a random
    # search over entries of 1e-300, 1 and 1e300); the pivot choice once found no
    # column to enter and indexed an empty array.
    r = solve_lp(
        np.array([-4e-300, 3.0]),
        np.array([[-3.0, 6e300], [-1e300, 5.0]]),
        np.array([-2e-300, -1.0]),
        np.array([1e-300, np.inf]),
    )
    assert r.status == "not_finite" and not r.ok
