"""Hostile drawings and tables to import, ten thousand and more (tests/fuzz/drawing_mutations.py):
DXF files written by ezdxf with their tags or bytes damaged or built hostile on purpose, and
tables of offsets and site points with odd rows. Every drawing goes through open -> layer
summaries -> likely layer -> outline -> new plan -> report and save -> load, and its layers
through the site import into a small plan -> report; every table through its import the same
way (tests/fuzz/drawing_checks.py). Each must be refused by the project's own error family with
one line, or carried through with finite numbers. Prints the counts and every distinct failure,
with the file that caused it saved in the folder named at the start.

Run: .venv/bin/python benchmarks/fuzz_drawings.py [--cases 10000] [--seed 1] [--out DIR]
"""

from __future__ import annotations

import argparse
import collections
import random
import signal
import sys
import tempfile
import time
import warnings
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from tests.fuzz.drawing_checks import drawing_outcome, table_outcome  # noqa: E402
from tests.fuzz.drawing_mutations import drawing_case, table_case  # noqa: E402
from tests.fuzz.failures import record_failure  # noqa: E402

#: A case still running after this many seconds is stopped and counted a failure (a hang).
CASE_SECONDS = 120


class Hang(Exception):
    """A case ran past CASE_SECONDS."""


def _hang(_signum: int, _frame: object) -> None:
    raise Hang(f"still running after {CASE_SECONDS} s")


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--cases", type=int, default=10_000, help="files (default 10000)")
    ap.add_argument("--seed", type=int, default=1)
    ap.add_argument(
        "--out", type=Path, help="folder for failing files (default: a new temporary one)"
    )
    ap.add_argument("--tables", type=float, default=0.25, help="share of tables among the cases")
    args = ap.parse_args()
    warnings.simplefilter("error")  # a numpy overflow warning is a failure too
    rnd = random.Random(args.seed)
    out_dir = args.out or Path(tempfile.mkdtemp(prefix="towboard-fuzz-drawings-"))
    out_dir.mkdir(parents=True, exist_ok=True)
    work = Path(tempfile.mkdtemp(prefix="towboard-fuzz-work-"))
    print(f"failures are saved in {out_dir}", flush=True)
    counts: collections.Counter[str] = collections.Counter()
    failures: collections.Counter[str] = collections.Counter()
    signal.signal(signal.SIGALRM, _hang)
    t0 = time.perf_counter()
    for i in range(args.cases):
        if rnd.random() < args.tables:
            what, how, data = table_case(rnd)
            suffix = ".csv"
        else:
            what, suffix = "drawing", ".dxf"
            how, data = drawing_case(rnd)
        signal.alarm(CASE_SECONDS)
        try:
            if what == "drawing":
                outline, site = drawing_outcome(data, work)
                counts[f"outline {outline}"] += 1
                counts[f"site {site}"] += 1
            else:
                counts[f"{what} {table_outcome(what, data, work)}"] += 1
        except Exception as e:
            record_failure(e, data, failures, out_dir, suffix, f"case {i + 1} ({how})")
        finally:
            signal.alarm(0)
        if (i + 1) % 1000 == 0:
            print(
                f"{i + 1} cases, {dict(sorted(counts.items()))}, {sum(failures.values())} failed",
                flush=True,
            )
    spent = time.perf_counter() - t0
    print(f"\ncases {args.cases} (seed {args.seed}), {spent:.0f} s")
    for key, n in sorted(counts.items()):
        print(f"  {key}: {n}")
    print(f"  failed: {sum(failures.values())} ({len(failures)} distinct)")
    for key, n in failures.most_common():
        print(f"{n:6d}  {key}")
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
