"""A small dense linear-programme solver for the pull allocation.

Solves   minimise c.x   subject to   A x = b,   0 <= x <= upper

with a bounded-variable revised simplex method in two phases (artificial variables
first, then the real costs). The allocation problems have three to a few dozen rows
and a few hundred columns at most, where the set-up cost of a general solver
dominates; this one does a handful of small numpy operations per pivot. Dantzig's
rule picks the entering column; after many pivots it switches to Bland's rule,
which cannot cycle. ``scipy.optimize.linprog`` (HiGHS) is its reference in the tests.

The caller scales the rows so that the entries are of order one.

``BACKEND`` picks the solver: "own" (this one) or "highs" (scipy's HiGHS through
``scipy.optimize.linprog``). benchmarks/solve.py times both, paired, on the program's
own problems: for the few rows and few columns the solves ask (the faces of the
fleet's set, the coarse closest state), this one is quicker, so it is the default.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

import numpy as np

#: "not_finite": the data, or the arithmetic on them, holds a NaN or an infinity (a row
#: scaled by the inverse of a denormal pull is one): no answer, rather than a wrong one.
LpStatus = Literal["optimal", "infeasible", "unbounded", "iteration_limit", "not_finite"]
Backend = Literal["own", "highs"]

#: Which solver solve_lp uses (see the module's docstring).
BACKEND: Backend = "own"

_TOL = 1e-9  # optimality and feasibility tolerance, on scaled rows
_PIVOT = 1e-11  # smallest pivot element accepted in the ratio test


@dataclass(frozen=True, slots=True, eq=False)
class LpResult:
    """Outcome of :func:`solve_lp`: status, x (n,) and the objective c.x."""

    status: LpStatus
    x: np.ndarray
    objective: float
    iterations: int

    @property
    def ok(self) -> bool:
        return self.status == "optimal"


class _Tableau:
    """Revised-simplex state over the columns [A | I] (structural, then artificial)."""

    def __init__(self, a: np.ndarray, b: np.ndarray, upper: np.ndarray) -> None:
        m, n = a.shape
        sign = np.where(b < 0, -1.0, 1.0)
        self.m, self.n = m, n
        self.a = np.hstack([a * sign[:, None], np.eye(m)])  # (m, n + m)
        self.b = b * sign
        self.upper = np.concatenate([upper, np.full(m, np.inf)])
        self.x = np.concatenate([np.zeros(n), self.b])
        self.basis = np.arange(n, n + m)
        self.at_upper = np.zeros(n + m, dtype=bool)
        self.is_basic = np.zeros(n + m, dtype=bool)
        self.is_basic[self.basis] = True
        self.iterations = 0

    def _refactor(self) -> np.ndarray:
        """Inverse of the basis and the basic values computed afresh."""
        binv = np.linalg.inv(self.a[:, self.basis])
        xn = np.where(self.is_basic, 0.0, self.x)
        self.x[self.basis] = binv @ (self.b - self.a @ xn)
        return binv

    def run(self, cost: np.ndarray, max_iter: int) -> LpStatus:
        # Data of very unequal sizes (1e-300 beside 1e300) can overflow on the way: the
        # NaN that follows ends the run as "not_finite", so numpy need not warn of it.
        with np.errstate(over="ignore", invalid="ignore"):
            return self._pivots(cost, max_iter)

    def _pivots(self, cost: np.ndarray, max_iter: int) -> LpStatus:
        a, x, upper = self.a, self.x, self.upper
        bland_after = 10 * (self.m + 2)
        try:
            binv = self._refactor()
        except np.linalg.LinAlgError:
            return "iteration_limit"
        since = 0
        for it in range(max_iter):
            self.iterations += 1
            if since >= 20:  # product-form updates drift: start again from the basis
                try:
                    binv = self._refactor()
                except np.linalg.LinAlgError:
                    return "iteration_limit"
                since = 0
            d = cost - (cost[self.basis] @ binv) @ a  # reduced costs
            score = np.where(self.at_upper, d, -d)
            score[self.is_basic | ((upper <= 0) & ~self.at_upper)] = 0.0
            best = score.max()  # NaN if any reduced cost is NaN
            if best <= _TOL:
                return "optimal"
            if not best > _TOL:  # a NaN would pass as neither, and no column enters
                return "not_finite"
            j = int(np.flatnonzero(score > _TOL)[0]) if it >= bland_after else int(score.argmax())
            sgn = -1.0 if self.at_upper[j] else 1.0
            alpha = binv @ a[:, j]
            delta = -sgn * alpha  # change of the basic values per unit step
            xb, ub = x[self.basis], upper[self.basis]
            with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
                steps = np.where(
                    delta < -_PIVOT,
                    np.maximum(xb, 0.0) / -delta,
                    np.where(delta > _PIVOT, np.maximum(ub - xb, 0.0) / delta, np.inf),
                )
            k = int(steps.argmin())
            step = steps[k]
            flip = upper[j]
            if flip <= step:
                if not np.isfinite(flip):
                    return "unbounded"
                x[j] = 0.0 if self.at_upper[j] else flip
                self.at_upper[j] = not self.at_upper[j]
                x[self.basis] = xb + delta * flip
                continue
            if not np.isfinite(step):
                return "unbounded"
            leaving = int(self.basis[k])
            hit_upper = bool(delta[k] > 0)
            x[self.basis] = xb + delta * step
            x[j] += sgn * step
            x[leaving] = upper[leaving] if hit_upper else 0.0
            self.at_upper[leaving] = hit_upper
            self.is_basic[leaving] = False
            self.basis[k] = j
            self.is_basic[j] = True
            self.at_upper[j] = False
            pivot_row = binv[k] / alpha[k]
            binv -= np.outer(alpha, pivot_row)
            binv[k] = pivot_row
            since += 1
        return "iteration_limit"


def solve_lp(
    c: np.ndarray,
    a_eq: np.ndarray,
    b_eq: np.ndarray,
    upper: np.ndarray,
    *,
    max_iter: int | None = None,
) -> LpResult:
    """Minimise c.x subject to a_eq x = b_eq and 0 <= x <= upper (upper may hold inf).

    c, upper: (n,); a_eq: (m, n); b_eq: (m,). Never raises on an infeasible or
    unbounded problem, nor on data that are not finite (NaN, or infinity outside
    ``upper``); the status says so.
    """
    c = np.asarray(c, dtype=float)
    a = np.asarray(a_eq, dtype=float)
    b = np.asarray(b_eq, dtype=float)
    up = np.asarray(upper, dtype=float)
    if not (np.isfinite(c).all() and np.isfinite(a).all() and np.isfinite(b).all()) or (
        np.isnan(up).any()
    ):
        return LpResult("not_finite", np.zeros(len(c)), float("nan"), 0)
    if BACKEND == "highs":
        return _highs(c, a, b, up)
    m, n = a.shape
    limit = max_iter if max_iter is not None else 50 * (m + n) + 100
    t = _Tableau(a, b, up)
    if np.any(b != 0):  # with b = 0, x = 0 is feasible already
        status = t.run(np.concatenate([np.zeros(n), np.ones(m)]), limit)
        if status != "optimal":
            return LpResult(status, t.x[:n].copy(), float("nan"), t.iterations)
    infeas = float(t.x[n:].sum())
    if infeas > _TOL * max(1.0, float(np.abs(b).max(initial=0.0))) * 10:
        return LpResult("infeasible", t.x[:n].copy(), float("nan"), t.iterations)
    t.upper[n:] = 0.0  # artificials stay at zero from here on
    status = t.run(np.concatenate([c, np.zeros(m)]), limit)
    x = np.clip(t.x[:n], 0.0, up)
    return LpResult(status, x, float(c @ x), t.iterations)


def _highs(c: np.ndarray, a: np.ndarray, b: np.ndarray, up: np.ndarray) -> LpResult:
    """The same programme through scipy's HiGHS."""
    from scipy.optimize import linprog  # only when asked for: scipy is slow to import

    bounds = [(0.0, float(u) if np.isfinite(u) else None) for u in up]
    r = linprog(c, A_eq=a, b_eq=b, bounds=bounds, method="highs")
    statuses: dict[int, LpStatus] = {
        0: "optimal",
        1: "iteration_limit",
        2: "infeasible",
        3: "unbounded",
    }
    status = statuses.get(int(r.status), "iteration_limit")
    x = np.asarray(r.x, dtype=float) if r.x is not None else np.zeros(len(c))
    obj = float(r.fun) if status == "optimal" else float("nan")
    return LpResult(status, x, obj, int(getattr(r, "nit", 0)))
