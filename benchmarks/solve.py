"""Solve pulls for 12 tugs, with and without working sectors, and the tug lost check.

Every figure is a median (and 99th percentile) of many runs; the program's own simplex
and scipy's HiGHS (core.solve.lp.BACKEND) are timed paired, run for run alternately, on
the same problems, building the problem included ("problem + solve") and not. The
target for one 12-tug solve with sectors is a median under 2 ms. The baseline in the
same run is the 12-tug solve with every lead as set.

Run from the repository root with the project's venv:

    .venv/bin/python benchmarks/solve.py
"""

from __future__ import annotations

import sys
import time
from collections.abc import Callable
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
sys.path[:0] = [str(ROOT), str(ROOT / "benchmarks")]

from tug_fleet import fleet_project  # noqa: E402

from core.solve import lp  # noqa: E402
from core.solve.pulls import pulls_problem, solve_pulls, tug_lost_check  # noqa: E402


def paired(fns: dict[str, Callable[[], object]], repeat: int) -> dict[str, np.ndarray]:
    """Times (s) of each function, run in turn, ``repeat`` rounds (after one warm-up)."""
    for fn in fns.values():
        fn()
    out: dict[str, list[float]] = {k: [] for k in fns}
    for _ in range(repeat):
        for k, fn in fns.items():
            t0 = time.perf_counter()
            fn()
            out[k].append(time.perf_counter() - t0)
    return {k: np.array(v) for k, v in out.items()}


def with_backend(name: lp.Backend, fn: Callable[[], object]) -> Callable[[], object]:
    def run() -> object:
        old = lp.BACKEND
        lp.BACKEND = name
        try:
            return fn()
        finally:
            lp.BACKEND = old

    return run


def line(label: str, t: np.ndarray, base: float | None = None) -> str:
    med, p99 = float(np.median(t)) * 1e3, float(np.percentile(t, 99)) * 1e3
    ratio = f", {med / base:5.2f}x the baseline" if base else ""
    return f"  {label:<44} median {med:7.3f} ms  p99 {p99:7.3f} ms{ratio}"


def main() -> None:
    quick = "--quick" in sys.argv
    repeat = 60 if quick else 300
    fixed = fleet_project(12)
    sector = fleet_project(12, sectors=True)
    fs, ss = fixed.stages[0], sector.stages[0]
    fp, sp = pulls_problem(fixed, fs), pulls_problem(sector, ss)
    r = solve_pulls(sp)
    print(
        f"12 tugs with working sectors ({sp.columns.shape[1]} polygon vertices): goal met "
        f"{r.feasible}, largest use {r.largest_setting * 100:.1f} %"
    )
    t = paired(
        {
            "fixed": lambda: solve_pulls(fp),
            "own": with_backend("own", lambda: solve_pulls(sp)),
            "highs": with_backend("highs", lambda: solve_pulls(sp)),
            "own+": with_backend("own", lambda: solve_pulls(pulls_problem(sector, ss))),
            "highs+": with_backend("highs", lambda: solve_pulls(pulls_problem(sector, ss))),
        },
        repeat,
    )
    base = float(np.median(t["fixed"])) * 1e3
    print("one solve (baseline: 12 tugs, leads as set, own simplex):")
    print(line("baseline", t["fixed"]))
    print(line("sectors, own simplex", t["own"], base))
    print(line("sectors, HiGHS", t["highs"], base))
    print(line("sectors, problem + solve, own simplex", t["own+"], base))
    print(line("sectors, problem + solve, HiGHS", t["highs+"], base))
    print(
        f"  HiGHS / own (paired medians): solve {np.median(t['highs'] / t['own']):.2f}, "
        f"problem + solve {np.median(t['highs+'] / t['own+']):.2f}"
    )
    target = float(np.median(t["own"])) * 1e3
    print(f"  target: one 12-tug solve with sectors under 2 ms median: {target:.2f} ms")

    t = paired(
        {
            "fixed": lambda: tug_lost_check(fp),
            "own": with_backend("own", lambda: tug_lost_check(sp)),
            "highs": with_backend("highs", lambda: tug_lost_check(sp)),
        },
        max(10, repeat // 10),
    )
    print("tug lost check (13 solves):")
    print(line("leads as set, own simplex", t["fixed"]))
    print(line("sectors, own simplex", t["own"], float(np.median(t["fixed"])) * 1e3))
    print(line("sectors, HiGHS", t["highs"], float(np.median(t["fixed"])) * 1e3))
    print(f"  HiGHS / own (paired medians): {np.median(t['highs'] / t['own']):.2f}")


if __name__ == "__main__":
    main()
