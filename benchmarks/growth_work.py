"""How the stage's own work grows: tugs (10-10,000) and hold limits directions (36-3,600).

benchmarks/growth.py covers loading (outline vertices, placements) and
benchmarks/briefing.py the stages (1-64); this one times what a stage costs once loaded,
each curve with its fitted exponent (time ~ n^k, least squares on log-log over the
larger sizes) and each time as a ratio against a baseline measured in the same run:

- tugs, 10-10,000 (benchmarks/tug_fleet.py's barge, leads as set): the balance of the
  stage (every tug's row and the reduction), and one move of a tug drag (the drag's fast
  path: one row made again, the balance reduced again), against the balance at 100 tugs;
- tugs, 10-200: the tug lost check (the goal solved with every tug and with each lost)
  and the hold limits with each tug lost (360 directions), against the same at 24 tugs;
- directions, 36-3,600 (24 tugs): the hold limits sweep with each tug lost, against 360.

Targets (issue 9): hold limits with each tug lost at 200 tugs under 1 s, growing no
faster than tugs^2.

    python benchmarks/growth_work.py [--quick]     (--quick: the smaller sizes only)
"""

from __future__ import annotations

import argparse
import sys
import time
from collections.abc import Callable
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
sys.path[:0] = [str(ROOT), str(ROOT / "benchmarks")]

from tug_fleet import fleet_project  # noqa: E402

from core.analysis.stage import body_balance  # noqa: E402
from core.mechanics.balance import analyse_layout, with_placement_row  # noqa: E402
from core.mechanics.bodies import body_of  # noqa: E402
from core.model.goals import Goal  # noqa: E402
from core.solve.holdlimits import hold_limits, hold_limits_problem  # noqa: E402
from core.solve.pulls import pulls_problem, tug_lost_check  # noqa: E402


def best_of(fn: Callable[[], object], budget_s: float = 1.0, at_most: int = 7) -> float:
    """The least of a few timings, s (at least one, more while within ``budget_s``)."""
    times: list[float] = []
    spent = 0.0
    while len(times) < at_most and (not times or spent < budget_s):
        t0 = time.perf_counter()
        fn()
        t = time.perf_counter() - t0
        times.append(t)
        spent += t
    return min(times)


def exponent(sizes: list[int], times: list[float]) -> float:
    """k in time ~ n^k, by least squares on log-log."""
    return float(np.polyfit(np.log(sizes), np.log(times), 1)[0])


def stage_of(n: int):  # type: ignore[no-untyped-def]
    """The fleet plan with ``n`` tugs, its stage asked to hold, and its body."""
    from dataclasses import replace

    p = fleet_project(n)
    stage = replace(p.stages[0], goal=Goal("hold"))
    p = replace(p, stages=(stage,))
    return p, stage, body_of(p, p.hulls[0].name)


def balance_times(n: int) -> tuple[float, float]:
    """(the stage's balance, one drag move), s."""
    p, stage, body = stage_of(n)
    layout, cond, _ = body_balance(p, stage, body)
    placement = stage.placements[0]
    moved = placement.with_lead(placement.lead_rad + 0.1)
    moved_stage = stage.with_placement(moved)

    def drag_move() -> None:
        row = with_placement_row(layout, p, moved_stage, body, moved)
        analyse_layout(moved_stage, body, row, p.units, cond.loads)

    return best_of(lambda: body_balance(p, stage, body)), best_of(drag_move)


def lost_times(n: int, directions: int = 360) -> tuple[float, float]:
    """(the tug lost check, the hold limits with each tug lost), s, problems built inside."""
    p, stage, body = stage_of(n)
    layout, cond, _ = body_balance(p, stage, body)
    dirs = np.arange(directions) * (360.0 / directions)

    def lost() -> None:
        tug_lost_check(pulls_problem(p, stage, body.name, loads=cond.loads, layout=layout))

    def limits() -> None:
        hold_limits(hold_limits_problem(p, stage, body.name, directions_deg=dirs, layout=layout))

    return best_of(lost, 0.5, 3), best_of(limits, 0.5, 3)


def table(title: str, head: tuple[str, ...], rows: list[tuple[object, ...]]) -> None:
    print(f"\n{title}")
    print("  ".join(f"{h:>14s}" for h in head))
    for r in rows:
        print("  ".join(f"{v:>14.4g}" if isinstance(v, float) else f"{v!s:>14s}" for v in r))


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--quick", action="store_true", help="the smaller sizes only")
    args = ap.parse_args()

    sizes = [10, 30, 100, 300, 1_000] if args.quick else [10, 30, 100, 300, 1_000, 3_000, 10_000]
    bal, drag = [], []
    for n in sizes:
        b, d = balance_times(n)
        bal.append(b)
        drag.append(d)
    base = bal[sizes.index(100)]
    rows = [
        (n, b * 1e3, b / base, d * 1e3, d / base) for n, b, d in zip(sizes, bal, drag, strict=True)
    ]
    table(
        "Tugs: the stage's balance and one drag move (ratios: over the balance at 100 tugs)",
        ("tugs", "balance ms", "/ at 100", "drag move ms", "/ at 100"),
        rows,
    )
    big = [i for i, n in enumerate(sizes) if n >= 100]
    print(
        f"fitted exponent (tugs >= 100): balance {exponent([sizes[i] for i in big], [bal[i] for i in big]):.2f}, "
        f"drag move {exponent([sizes[i] for i in big], [drag[i] for i in big]):.2f}"
    )

    fleets = [10, 24, 50, 100] if args.quick else [10, 24, 50, 100, 200]
    lost, limits = [], []
    for n in fleets:
        a, b = lost_times(n)
        lost.append(a)
        limits.append(b)
    b_lost, b_lim = lost[fleets.index(24)], limits[fleets.index(24)]
    rows = [(n, a, a / b_lost, b, b / b_lim) for n, a, b in zip(fleets, lost, limits, strict=True)]
    table(
        "Tugs: the tug lost check and the hold limits with each tug lost (ratios: over 24 tugs)",
        ("tugs", "lost check s", "/ at 24", "hold limits s", "/ at 24"),
        rows,
    )
    big = [i for i, n in enumerate(fleets) if n >= 24]
    print(
        f"fitted exponent (tugs >= 24): tug lost check "
        f"{exponent([fleets[i] for i in big], [lost[i] for i in big]):.2f}, hold limits "
        f"{exponent([fleets[i] for i in big], [limits[i] for i in big]):.2f} (target <= 2); "
        f"hold limits at {fleets[-1]} tugs {limits[-1]:.2f} s (target < 1 s at 200)"
    )

    dirs = [36, 90, 360, 900, 3_600] if not args.quick else [36, 90, 360, 900]
    times = [lost_times(24, d)[1] for d in dirs]
    rows = [(d, t * 1e3, t / times[dirs.index(360)]) for d, t in zip(dirs, times, strict=True)]
    table(
        "Directions: the hold limits with each tug lost, 24 tugs (ratio: over 360 directions)",
        ("directions", "hold limits ms", "/ at 360"),
        rows,
    )
    big = [i for i, d in enumerate(dirs) if d >= 360]
    print(
        f"fitted exponent (directions >= 360): "
        f"{exponent([dirs[i] for i in big], [times[i] for i in big]):.2f}"
    )


if __name__ == "__main__":
    main()
