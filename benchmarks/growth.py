"""How loading a plan grows with its size: outline vertices (4-100,000) and tug placements
(10-10,000), each load timed against ``json.loads`` of the same text in the same run (the
two alternated, the least of each taken), with the fitted exponent of the growth (time ~
n^k, least squares on log-log over the larger sizes) and the peak memory of the biggest
load. ``benchmarks/against_baseline.py --only "load 10,000 tugs"`` sets the 10,000 against
an earlier commit.

Targets (issue 9): a 100,000-vertex outline loads in under 1 s and 300 MB; 10,000
placements load within 5x ``json.loads``.

Run: /work/main/.venv/bin/python benchmarks/growth.py
"""

from __future__ import annotations

import json
import math
import sys
import time
import tracemalloc
from collections.abc import Callable
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from core.io.projectfile import loads


def _paired(a: Callable[[], object], b: Callable[[], object], repeat: int) -> tuple[float, float]:
    """The least of ``repeat`` timings of ``a`` and of ``b``, s, the two alternated (which
    goes first swaps on each repeat), so both see the same machine load."""
    ta, tb = [], []
    for k in range(repeat):
        for fn, out in ((a, ta), (b, tb)) if k % 2 else ((b, tb), (a, ta)):
            t0 = time.perf_counter()
            fn()
            out.append(time.perf_counter() - t0)
    return min(ta), min(tb)


def outline_text(n: int) -> str:
    """A plan with one hull whose outline is an ellipse of ``n`` vertices (100 m x 30 m)."""
    a = np.linspace(0.0, 2 * math.pi, n, endpoint=False)
    pts = [[round(50 + 50 * math.cos(t), 9), round(15 * math.sin(t), 9)] for t in a]
    return json.dumps(
        {
            "format": "towboard",
            "format_version": 1,
            "plan": {"name": f"Outline of {n}"},
            "hulls": [{"name": "Barge", "outline_m": pts}],
        }
    )


def placements_text(n: int) -> str:
    """A plan with ``n`` tugs, each placed in one stage on one of four line points."""
    points = ["Bow", "Stern", "Port", "Stbd"]
    where = {"Bow": [100.0, 0.0], "Stern": [0.0, 0.0], "Port": [50.0, 15.0], "Stbd": [50.0, -15.0]}
    hull = {
        "name": "Barge",
        "outline_m": [[0.0, -15.0], [100.0, -15.0], [100.0, 15.0], [0.0, 15.0]],
        "fittings": [{"name": p, "kind": "line", "position_m": where[p]} for p in points],
    }
    tugs = [{"name": f"Tug {i}", "bollard_pull_kN": 400 + i % 300} for i in range(n)]
    placed = [
        {
            "tug": f"Tug {i}",
            "hull": "Barge",
            "point": points[i % 4],
            "setting_percent": i % 101,
            "lead_deg": (i * 7) % 360,
            "line_length_m": 30 + i % 50,
        }
        for i in range(n)
    ]
    return json.dumps(
        {
            "format": "towboard",
            "format_version": 1,
            "plan": {"name": f"{n} tugs"},
            "hulls": [hull],
            "tugs": tugs,
            "stages": [{"name": "Hold", "kind": "other", "tugs": placed}],
        }
    )


def exponent(sizes: list[int], times: list[float]) -> float:
    """k in time ~ n^k, by least squares on log-log."""
    return float(np.polyfit(np.log(sizes), np.log(times), 1)[0])


def peak_mb(fn: Callable[[], object]) -> float:
    tracemalloc.start()
    try:
        fn()
        return tracemalloc.get_traced_memory()[1] / 1e6
    finally:
        tracemalloc.stop()


def curve(title: str, sizes: list[int], make: Callable[[int], str], fit_from: int) -> None:
    print(f"\n{title}")
    print(f"{'n':>8} {'load ms':>10} {'json.loads ms':>14} {'ratio':>7}")
    loads_t, json_t = [], []
    for n in sizes:
        text = make(n)
        repeat = 5 if n <= 10_000 else 3
        tl, tj = _paired(lambda text=text: loads(text), lambda text=text: json.loads(text), repeat)
        loads_t.append(tl)
        json_t.append(tj)
        print(f"{n:>8} {tl * 1e3:>10.2f} {tj * 1e3:>14.2f} {tl / tj:>7.1f}")
    big = [i for i, n in enumerate(sizes) if n >= fit_from]
    k = exponent([sizes[i] for i in big], [loads_t[i] for i in big])
    kj = exponent([sizes[i] for i in big], [json_t[i] for i in big])
    print(f"fitted exponent (n >= {fit_from}): load {k:.2f}, json.loads {kj:.2f}")
    text = make(sizes[-1])
    print(f"peak memory of the largest load (tracemalloc): {peak_mb(lambda: loads(text)):.0f} MB")


def main() -> None:
    curve(
        "Outline vertices (one hull)",
        [4, 10, 100, 1_000, 3_000, 10_000, 30_000, 100_000],
        outline_text,
        1_000,
    )
    curve("Tug placements (one stage)", [10, 100, 1_000, 3_000, 10_000], placements_text, 100)


if __name__ == "__main__":
    main()
