"""Hold limits sweep: 12 tugs, 360 wind directions, all tugs and each tug lost.

Compares, in one run, the program's ray-zonotope method with a straightforward loop
of scipy.optimize.linprog (HiGHS) solves of the same linear programmes
(maximise s: B f + s tau_wind = -tau_current, 0 <= f <= usable), checks that the
answers agree within 1e-6 relative, and prints both times and the ratios, for the
all-tugs curve alone (360 solves) and for all 13 curves (all tugs and each tug
lost, 4680 solves; the loop takes some seconds).

Run: /tmp/venv/bin/python benchmarks/hold_limits.py [--quick]
(--quick skips the 4680-solve loop.)
"""

from __future__ import annotations

import sys
import time
from pathlib import Path

import numpy as np
from scipy.optimize import linprog

sys.path.insert(0, str(Path(__file__).resolve().parent))

from tug_fleet import fleet_project

from core.solve.holdlimits import hold_limits, hold_limits_problem

KNOT = 1852.0 / 3600.0


def linprog_limits(gens: np.ndarray, fixed: np.ndarray, wind: np.ndarray) -> np.ndarray:
    """V_max per direction by one linprog per direction (the plain method).

    Variables: g (n) the pulls as fractions of usable, s the wind load factor.
    """
    n = gens.shape[1]
    out = np.zeros(wind.shape[1])
    c = np.zeros(n + 1)
    c[-1] = -1.0
    bounds = [(0.0, 1.0)] * n + [(0.0, None)]
    for k in range(wind.shape[1]):
        a = np.hstack([gens, wind[:, k : k + 1]])
        r = linprog(c, A_eq=a, b_eq=-fixed, bounds=bounds, method="highs")
        out[k] = np.sqrt(max(r.x[-1], 0.0)) if r.status == 0 else 0.0
    return out


def _median_time(fn, repeat: int) -> float:
    fn()
    runs = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        runs.append(time.perf_counter() - t0)
    return float(np.median(runs))


def _rel(a: np.ndarray, b: np.ndarray) -> float:
    return float((np.abs(a - b) / np.maximum(np.abs(b), 1e-12)).max())


def main() -> None:
    quick = "--quick" in sys.argv
    project = fleet_project(12)
    problem = hold_limits_problem(project, project.stages[0])
    # The same LPs in the same scaled rows: forces / u, moment / (u L).
    u = float(np.abs(problem.generators[:2]).max())
    sc = np.array([1.0, 1.0, 1.0 / problem.length_m]) / u
    gens = problem.generators * sc[:, None]
    fixed, wind = problem.fixed * sc, problem.wind_unit * sc[:, None]
    n, d = gens.shape[1], wind.shape[1]

    t_ours_one = _median_time(lambda: hold_limits(problem, with_lost=False), 50)
    t_ours_all = _median_time(lambda: hold_limits(problem), 20)
    result = hold_limits(problem)

    t0 = time.perf_counter()
    plain = linprog_limits(gens, fixed, wind)
    t_plain_one = time.perf_counter() - t0
    rel_all = _rel(result.all_tugs_ms, plain)

    print(f"tugs: {n}, directions: {d}")
    print(
        f"all-tugs curve ({d} LPs):  zonotope {t_ours_one * 1e3:.2f} ms (median of 50), "
        f"linprog loop {t_plain_one * 1e3:.0f} ms, ratio {t_plain_one / t_ours_one:.0f}x"
    )
    rel_lost = float("nan")
    if not quick:
        t0 = time.perf_counter()
        lost = np.array([linprog_limits(np.delete(gens, i, axis=1), fixed, wind) for i in range(n)])
        t_plain_all = time.perf_counter() - t0 + t_plain_one
        rel_lost = _rel(result.lost_ms, lost)
        print(
            f"all {n + 1} curves ({(n + 1) * d} LPs): zonotope {t_ours_all * 1e3:.2f} ms (median of 20), "
            f"linprog loop {t_plain_all * 1e3:.0f} ms, ratio {t_plain_all / t_ours_all:.0f}x"
        )
    else:
        print(f"all {n + 1} curves: zonotope {t_ours_all * 1e3:.2f} ms (linprog loop skipped)")
    print(f"largest relative difference: all tugs {rel_all:.1e}, each tug lost {rel_lost:.1e}")
    lo_dir, lo_v = result.lowest()
    wl_dir, wl_v = result.lowest(result.worst_lost_ms)
    print(
        f"lowest limit: all tugs {lo_v / KNOT:.1f} kn from {lo_dir:03.0f} true; "
        f"worst tug lost {wl_v / KNOT:.1f} kn from {wl_dir:03.0f} true"
    )
    ok = rel_all <= 1e-6 and (quick or rel_lost <= 1e-6)
    print("agreement within 1e-6 relative:", "yes" if ok else "NO")
    if not ok:
        sys.exit(1)


if __name__ == "__main__":
    main()
