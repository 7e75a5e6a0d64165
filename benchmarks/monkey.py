"""The monkey at length: thousands of random actions on the main window, seed by seed.

Each seed runs in its own subprocess (``python -X faulthandler -m tests.fuzz.monkey``), so
a crash (a segmentation fault, an abort) ends that seed only and is reported here with
its signal, the faulthandler's stack and the last actions written to the seed's trail
file before it. A seed that ends normally reports its uncaught errors (faults) and the
checks of the plan that failed (report with finite numbers, save and load back equal).

    python benchmarks/monkey.py                      # 10 seeds x 5,000 actions
    python benchmarks/monkey.py --seeds 3 --actions 500 --first 100
    python benchmarks/monkey.py --jobs 2             # two seeds at a time

Prints one line per seed (actions, faults, failed checks, crash, actions per second) and
the totals; exit 1 if anything was found. Trails are kept in ``--out`` (default a
temporary folder, printed) for a crashed or faulty seed.
"""

from __future__ import annotations

import argparse
import json
import os
import signal
import subprocess
import sys
import tempfile
import time
from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


@dataclass
class SeedRun:
    seed: int
    returncode: int
    seconds: float
    actions: int
    faults: list[str]
    failed_checks: list[str]
    qt_warnings: dict[str, int]
    trail: Path
    stderr: str

    @property
    def crashed(self) -> bool:
        return self.returncode not in (0, 1)

    def crash_words(self) -> str:
        rc = self.returncode
        if rc < 0:
            try:
                return f"killed by {signal.Signals(-rc).name}"
            except ValueError:
                return f"killed by signal {-rc}"
        return f"exit {rc}"


def run_seed(seed: int, actions: int, check_every: int, out: Path, weights: str = "") -> SeedRun:
    trail = out / f"trail_seed{seed}.txt"
    cmd = [
        sys.executable,
        "-X",
        "faulthandler",
        "-m",
        "tests.fuzz.monkey",
        "--seed",
        str(seed),
        "--actions",
        str(actions),
        "--check-every",
        str(check_every),
        "--trail",
        str(trail),
        *(["--weights", weights] if weights else []),
    ]
    start = time.perf_counter()
    env = {
        **os.environ,
        "PYTHONPATH": os.pathsep.join([str(ROOT), os.environ.get("PYTHONPATH", "")]),
    }
    proc = subprocess.run(cmd, cwd=ROOT, env=env, capture_output=True, text=True, errors="replace")
    seconds = time.perf_counter() - start
    faults: list[str] = []
    failed: list[str] = []
    warned: dict[str, int] = {}
    done = 0
    for line in reversed(proc.stdout.splitlines()):
        if line.startswith("{"):
            data = json.loads(line)
            faults, failed, done = data["faults"], data["failed_checks"], data["actions"]
            warned = data.get("qt_warnings", {})
            break
    if not done and trail.exists():
        done = sum(
            1 for line in trail.read_text(errors="replace").splitlines() if line[:1].isdigit()
        )
    stderr = "\n".join(
        line for line in proc.stderr.splitlines() if not line.startswith("This plugin does not")
    )
    return SeedRun(seed, proc.returncode, seconds, done, faults, failed, warned, trail, stderr)


def _last_lines(path: Path, n: int) -> str:
    if not path.exists():
        return "(no trail)"
    lines = path.read_text(encoding="utf-8", errors="replace").splitlines()
    return "\n".join(lines[-n:])


def main() -> int:
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--seeds", type=int, default=10, help="how many seeds")
    p.add_argument("--first", type=int, default=1, help="the first seed")
    p.add_argument("--actions", type=int, default=5000, help="actions per seed")
    p.add_argument("--check-every", type=int, default=100)
    p.add_argument("--jobs", type=int, default=1, help="seeds run at the same time")
    p.add_argument("--out", type=Path, default=None, help="folder for the trails")
    p.add_argument("--weights", default="", help="e.g. act_table=40 (see tests/fuzz/monkey.py)")
    args = p.parse_args()
    out = args.out or Path(tempfile.mkdtemp(prefix="towboard-monkey-runs-"))
    out.mkdir(parents=True, exist_ok=True)
    seeds = list(range(args.first, args.first + args.seeds))
    print(f"monkey: {len(seeds)} seeds x {args.actions} actions; trails in {out}")
    print(
        f"{'seed':>5} {'actions':>8} {'faults':>7} {'checks failed':>14} {'crash':>22} {'act/s':>7}"
    )
    runs: list[SeedRun] = []

    def one(seed: int) -> SeedRun:
        r = run_seed(seed, args.actions, args.check_every, out, args.weights)
        crash = r.crash_words() if r.crashed else "-"
        rate = r.actions / r.seconds if r.seconds else 0.0
        print(
            f"{r.seed:>5} {r.actions:>8} {len(r.faults):>7} {len(r.failed_checks):>14} "
            f"{crash:>22} {rate:>7.1f}",
            flush=True,
        )
        return r

    with ThreadPoolExecutor(max_workers=max(1, args.jobs)) as pool:
        runs = list(pool.map(one, seeds))

    found = False
    for r in runs:
        if r.crashed:
            found = True
            print(f"\n=== seed {r.seed} CRASHED ({r.crash_words()}) after {r.actions} actions")
            print("--- last actions (trail):")
            print(_last_lines(r.trail, 30))
            print("--- stderr (faulthandler):")
            print("\n".join(r.stderr.splitlines()[-60:]))
        for text in r.faults + r.failed_checks:
            found = True
            print(f"\n=== seed {r.seed}:")
            print(text)
    warned: dict[str, int] = {}
    for r in runs:
        for text, n in r.qt_warnings.items():
            warned[text] = warned.get(text, 0) + n
    if warned:
        print("\nQt's own warnings (not counted as faults unless listed above):")
        for text, n in sorted(warned.items(), key=lambda kv: -kv[1]):
            print(f"  {n:>6}x {text[:160]}")
    total = sum(r.actions for r in runs)
    print(
        f"\ntotal: {total} actions over {len(runs)} seeds; "
        f"{sum(len(r.faults) for r in runs)} faults, "
        f"{sum(len(r.failed_checks) for r in runs)} failed checks, "
        f"{sum(r.crashed for r in runs)} crashes"
    )
    return 1 if found else 0


if __name__ == "__main__":
    sys.exit(main())
