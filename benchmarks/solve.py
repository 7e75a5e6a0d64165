"""One solve of the pulls for 12 tugs (target: median at most 1 ms), and the tug lost check.

Also times scipy.optimize.linprog (HiGHS) on the first of the two LPs, to show why the
program carries its own small solver, and the same solve with four tugs free to
change their lead within a 60 degree sector.

Run: /tmp/venv/bin/python benchmarks/solve.py
"""

from __future__ import annotations

import math
import sys
import time
from dataclasses import replace
from pathlib import Path

import numpy as np
from scipy.optimize import linprog

sys.path.insert(0, str(Path(__file__).resolve().parent))

from tug_fleet import fleet_project

from core.solve.pulls import pulls_problem, solve_pulls, tug_lost_check


def _median_ms(fn, repeat: int) -> float:
    fn()
    runs = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        runs.append(time.perf_counter() - t0)
    return float(np.median(runs)) * 1e3


def main() -> None:
    project = fleet_project(12)
    stage = project.stages[0]
    problem = pulls_problem(project, stage)
    result = solve_pulls(problem)
    print(
        f"12 tugs, hold against {stage.conditions.wind_speed_ms / 0.514444:.0f} kn wind and "
        f"{stage.conditions.current_speed_ms / 0.514444:.1f} kn current: goal met {result.feasible}, "
        f"largest utilisation {result.max_utilisation * 100:.1f} %"
    )
    print(f"solve pulls (12 tugs): median {_median_ms(lambda: solve_pulls(problem), 500):.3f} ms")
    print(
        f"pulls_problem + solve (from the project): median "
        f"{_median_ms(lambda: solve_pulls(pulls_problem(project, stage)), 200):.3f} ms"
    )

    sectors = tuple(
        replace(p, lead_sector_rad=(p.lead_rad - math.radians(30), p.lead_rad + math.radians(30)))
        if i % 3 == 0 and not p.point.startswith("pad")
        else p
        for i, p in enumerate(stage.placements)
    )
    sp = pulls_problem(project, replace(stage, placements=sectors))
    print(
        f"solve pulls with {sum(p.lead_sector_rad is not None for p in sectors)} lead sectors "
        f"({sp.columns.shape[1]} columns): median {_median_ms(lambda: solve_pulls(sp), 200):.3f} ms"
    )
    print(
        f"tug lost check (13 solves): median {_median_ms(lambda: tug_lost_check(problem), 50):.2f} ms"
    )

    # The first LP through linprog, for comparison: min t, B f = required, 0 <= f <= t u.
    n = len(problem.usable_n)
    b, u, req = problem.columns, problem.usable_n, problem.required
    c = np.r_[np.zeros(n), 1.0]
    a_ub = np.c_[np.eye(n), -u]
    ms = _median_ms(
        lambda: linprog(
            c,
            A_ub=a_ub,
            b_ub=np.zeros(n),
            A_eq=np.c_[b, np.zeros(3)],
            b_eq=req,
            bounds=[(0, None)] * (n + 1),
            method="highs",
        ),
        100,
    )
    print(f"for comparison, one scipy linprog (HiGHS) of the first LP: median {ms:.3f} ms")


if __name__ == "__main__":
    main()
