"""A session editing and saving, killed with SIGKILL at random, hundreds of times.

Each round starts tests/app/killing.py's child (the program's controller, recovery writer
and atomic saves, editing every 30-150 ms and saving now and then), kills it at a random
moment and checks that the saved file, its backup and every recovery file load, and that
no edit made more than a second before the kill is lost. Prints how much was lost per
round (the time between the first edit not on offer and the kill) against the one-second
limit.

Run: /work/main/.venv/bin/python benchmarks/kill_saves.py [--rounds 200] [--seed 1]
"""

from __future__ import annotations

import argparse
import os
import random
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from PySide6.QtCore import QCoreApplication  # noqa: E402

from tests.app.killing import LOSS_LIMIT_S, kill_round  # noqa: E402


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--rounds", type=int, default=200, help="kills (default 200)")
    ap.add_argument("--seed", type=int, default=1)
    args = ap.parse_args()
    rounds, seed = args.rounds, args.seed
    _app = QCoreApplication.instance() or QCoreApplication([])
    rnd = random.Random(seed)
    results = []
    failures = []
    t0 = time.perf_counter()
    with tempfile.TemporaryDirectory() as tmp:
        for i in range(rounds):
            try:
                results.append(kill_round(Path(tmp) / "session", rnd))
            except AssertionError as e:
                failures.append(f"round {i + 1}: {e}")
                print(failures[-1], flush=True)
            if (i + 1) % 20 == 0:
                print(f"{i + 1} rounds, {len(failures)} failed", flush=True)
    lost = sorted(r.lost_s for r in results)
    edits = sum(r.edits for r in results)
    files = sum(r.files for r in results)
    from_recovery = sum(1 for r in results if r.recovered > r.saved)
    print(f"rounds {rounds}, failed {len(failures)}, {time.perf_counter() - t0:.0f} s")
    print(f"edits made {edits}, files checked to load {files}")
    print(f"rounds whose newest work came from the recovery file: {from_recovery}")
    if lost:
        p99 = lost[min(len(lost) - 1, int(0.99 * len(lost)))]
        print(
            f"work lost to a kill: median {lost[len(lost) // 2]:.2f} s, p99 {p99:.2f} s, "
            f"max {lost[-1]:.2f} s; as a share of the {LOSS_LIMIT_S:.0f} s limit: "
            f"max {lost[-1] / LOSS_LIMIT_S:.2f}"
        )
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
