"""Hold limits sweep: 360 wind directions, all tugs and each tug lost.

1. 12 tugs with working sectors (ASD capability, lines 90 deg, pushes +-60 deg, push-pull
   all round): the program's sweep (building the problem included) against a plain loop
   of scipy.optimize.linprog (HiGHS) solves of the same linear programmes on the same
   polygons (maximise s: sum of lambda_j w_j = start + s ray, each tug's lambdas adding up
   to at most one), 360 x 13 = 4680 of them; the answers must agree within 1e-6
   relative (the polygons are the same, so only the solvers' tolerances differ); target:
   the program at least 20x quicker.
2. The same for 12 tugs with every lead as set.
3. Large fleets, leads as set, each tug lost: 25 to 200 tugs, the time and its growth
   exponent (target: under 1 s at 200 tugs, growing no faster than tugs^2).

No linear programme is solved by the program's sweep (half-spaces of the fleet's set and
walks over its faces, core.solve.holdlimits), so there is no own-simplex / HiGHS pairing
here; benchmarks/solve.py pairs them where they are used.

Run from the repository root with the project's venv:

    .venv/bin/python benchmarks/hold_limits.py [--quick]

(--quick solves the loop for all tugs and three tugs lost, and times those alone.)
"""

from __future__ import annotations

import math
import sys
import time
from pathlib import Path

import numpy as np
from scipy.optimize import linprog

ROOT = Path(__file__).resolve().parents[1]
sys.path[:0] = [str(ROOT), str(ROOT / "benchmarks")]

from tug_fleet import fleet_project  # noqa: E402

from core.solve.holdlimits import (  # noqa: E402
    HoldLimitsProblem,
    hold_limits,
    hold_limits_problem,
)

KNOT = 1852.0 / 3600.0


def linprog_loop(problem: HoldLimitsProblem, lost: list[int | None]) -> np.ndarray:
    """V_max (len(lost), D) by one linprog per direction and case, on the problem's own
    polygons (the origin left out: it is the slack of each tug's row), with the goal's
    tolerance as three more unknowns, what is missing, each within +-tolerance (in the
    scaled rows' units: a coefficient under 1e-9 would be dropped by HiGHS)."""
    cols, owner = [], []
    for i, poly in enumerate(problem.shapes.polygons):
        far = poly[np.hypot(poly[:, 0], poly[:, 1]) > 0] if len(poly) else poly
        if len(far):
            cols.append(problem.shapes.wrench(i, far))
            owner.append(np.full(len(far), i))
    w, own = np.hstack(cols), np.concatenate(owner)
    sc = np.array([1.0, 1.0, 1.0 / problem.length_m]) / np.abs(w[:2]).max()
    start = problem.start * sc
    tol = np.zeros(3) if problem.tolerance is None else np.asarray(problem.tolerance) * sc
    out = np.zeros((len(lost), problem.wind_unit.shape[1]))
    for row, k in enumerate(lost):
        keep = own != k
        ww, oo = w[:, keep] * sc[:, None], own[keep]
        tugs = np.unique(oo)
        m = ww.shape[1]
        a_ub = np.zeros((len(tugs), m + 4))
        a_ub[np.searchsorted(tugs, oo), np.arange(m)] = 1.0
        c = np.zeros(m + 4)
        c[m] = -1.0
        bounds = [(0, None)] * (m + 1) + [(-t, t) for t in tol]
        for d in range(problem.wind_unit.shape[1]):
            ray = -problem.wind_unit[:, d] * sc
            r = linprog(
                c,
                A_ub=a_ub,
                b_ub=np.ones(len(tugs)),
                A_eq=np.c_[ww, -ray, np.eye(3)],
                b_eq=start,
                bounds=bounds,
                method="highs",
            )
            out[row, d] = math.sqrt(max(r.x[m], 0.0)) if r.status == 0 else 0.0
    return out


def median_time(fn, repeat: int) -> float:  # type: ignore[no-untyped-def]
    fn()
    runs = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        runs.append(time.perf_counter() - t0)
    return float(np.median(runs))


def compare(label: str, sectors: bool, quick: bool) -> None:
    project = fleet_project(12, sectors=sectors)
    stage = project.stages[0]

    def ours():  # type: ignore[no-untyped-def]
        return hold_limits(hold_limits_problem(project, stage))

    t_ours = median_time(ours, 3 if quick else 5)
    result = ours()
    problem = result.problem
    n = len(problem.tugs)
    lost: list[int | None] = [None, *range(n if not quick else 3)]
    t0 = time.perf_counter()
    plain = linprog_loop(problem, lost)
    t_plain = time.perf_counter() - t0
    # all tugs, and (with every tug swept by linprog) the worst one lost: the least row
    ours_rows, ref = result.all_tugs_ms[None], plain[:1]
    if len(lost) == n + 1:
        ours_rows = np.vstack([ours_rows, result.worst_lost_ms])
        ref = np.vstack([ref, plain[1:].min(axis=0)])
    rel = float((np.abs(ours_rows - ref) / np.maximum(np.abs(ref), 1e-3)).max())
    t_ours_part = t_ours * len(lost) / (n + 1)  # the program sweeps every case at once
    nv = sum(len(p) for p in problem.shapes.polygons)
    print(f"{label}: 12 tugs, {nv} polygon vertices, 360 directions")
    print(
        f"  program, problem + all tugs + each tug lost ({(n + 1) * 360} cases): "
        f"{t_ours * 1e3:.0f} ms (median)"
    )
    print(
        f"  linprog loop, {len(lost) * 360} LPs: {t_plain * 1e3:.0f} ms; "
        f"ratio {t_plain / t_ours_part:.0f}x (the program's time pro rata)"
    )
    print(
        f"  largest relative difference {rel:.1e}: {'within' if rel <= 1e-6 else 'NOT within'} 1e-6"
    )
    lo_dir, lo_v = result.lowest()
    wl_dir, wl_v = result.lowest(result.worst_lost_ms)
    print(
        f"  lowest limit: all tugs {lo_v / KNOT:.1f} kn from {lo_dir:03.0f}; "
        f"worst tug lost {wl_v / KNOT:.1f} kn from {wl_dir:03.0f}"
    )


def growth(quick: bool) -> None:
    sizes = [25, 50, 100] if quick else [25, 50, 100, 200]
    times = []
    for n in sizes:
        project = fleet_project(n)
        stage = project.stages[0]
        t = median_time(lambda: hold_limits(hold_limits_problem(project, stage)), 2)  # noqa: B023
        times.append(t)
        print(f"  {n:>4} tugs, leads as set, each tug lost: {t * 1e3:8.0f} ms")
    k = np.polyfit(np.log(sizes), np.log(times), 1)[0]
    print(f"  growth exponent (log-log fit): {k:.2f} (target at most 2)")


def main() -> None:
    quick = "--quick" in sys.argv
    compare("working sectors", True, quick)
    compare("leads as set", False, quick)
    print("large fleets:")
    growth(quick)


if __name__ == "__main__":
    main()
