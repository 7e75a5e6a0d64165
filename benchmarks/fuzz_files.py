"""Hostile .towboard files, ten thousand and more: mutated JSON trees and damaged bytes of
the samples (tests/fuzz/mutations.py). Every file must be refused by the project's own
error family with one line, or load, report (text and JSON) and save -> load with finite
numbers; every 20th file that loads is also briefed and its PDF text checked for nan and
inf. Prints the counts, every failure (with the file that caused it, saved beside), and
the time per file against ``json.loads`` of the same text.

Run: /work/main/.venv/bin/python benchmarks/fuzz_files.py [--cases 10000] [--seed 1]
"""

from __future__ import annotations

import argparse
import collections
import json
import os
import random
import sys
import tempfile
import time
import warnings
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from tests.fuzz.checks import brief_is_finite, outcome  # noqa: E402
from tests.fuzz.failures import record_failure  # noqa: E402
from tests.fuzz.mutations import random_case  # noqa: E402


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--cases", type=int, default=10_000, help="files (default 10000)")
    ap.add_argument("--seed", type=int, default=1)
    args = ap.parse_args()
    cases, seed = args.cases, args.seed
    warnings.simplefilter("error")  # a numpy overflow warning is a failure too
    from PySide6.QtWidgets import QApplication

    _app = QApplication.instance() or QApplication([])
    rnd = random.Random(seed)
    counts: collections.Counter[str] = collections.Counter()
    failures: dict[str, int] = collections.Counter()
    t_load = t_json = 0.0
    out_dir = Path(tempfile.mkdtemp(prefix="towboard-fuzz-"))
    t0 = time.perf_counter()
    for i in range(cases):
        data = random_case(rnd)
        try:
            text = data.decode("utf-8")
            a = time.perf_counter()
            json.loads(text)
            t_json += time.perf_counter() - a
        except (ValueError, RecursionError):
            pass
        try:
            a = time.perf_counter()
            kind, project = outcome(data, out_dir)
            t_load += time.perf_counter() - a
            counts[kind] += 1
            if project is not None and counts["accepted"] % 20 == 1:
                brief_is_finite(project, out_dir)
                counts["briefed"] += 1
        except Exception as e:
            record_failure(e, data, failures, out_dir, ".towboard", f"case {i + 1}")
        if (i + 1) % 1000 == 0:
            print(f"{i + 1} files, {dict(counts)}, {sum(failures.values())} failed", flush=True)
    spent = time.perf_counter() - t0
    print(
        f"\nfiles {cases}: refused {counts['refused']}, accepted {counts['accepted']} "
        f"(briefed {counts['briefed']}), failed {sum(failures.values())} "
        f"({len(failures)} distinct), {spent:.0f} s"
    )
    if t_json:
        print(f"time in load + checks against json.loads of the same files: {t_load / t_json:.1f}x")
    for key, n in failures.most_common():
        print(f"{n:6d}  {key}")
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
