"""How the printed briefing grows with the number of stages.

A plan of N stages is made from the twin barge sample by repeating its four stages
(each copy renamed); for N = 1, 2, 4, 8, 16, 32 and 64 the benchmark times:

- layout: the briefing's content laid into pages (what grew as N squared when every
  stage re-paginated the pages before it);
- PDF: the whole ``write_pdf`` from cold, stage checks, solves and painting included
  (the sizes in turns, three rounds), wall clock and the process's CPU time (which
  other jobs on a shared machine leave alone).

It prints the median of a few runs for each N, the exponent k of a fitted power law
t ~ N^k (least squares on the logarithms, N >= 4), and each time as a ratio against the
16-stage baseline measured in the same run. Linear growth gives 4.0 at 64 stages; the
target is 4.5 or less.

Run: .venv/bin/python benchmarks/briefing.py [--quick]   (--quick: layout only)
"""

from __future__ import annotations

import math
import os
import statistics
import sys
import tempfile
import time
from dataclasses import replace
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

SIZES = (1, 2, 4, 8, 16, 32, 64)
BASELINE = 16
ROUNDS = 3  # PDF runs per size, taken in turns


def plan_of(n: int):  # type: ignore[no-untyped-def]
    """The twin barge sample with its stages repeated to ``n`` stages."""
    from core.io.projectfile import load

    project = load(ROOT / "sample_projects" / "twin_barge_move.towboard")
    base = project.stages
    stages = tuple(
        replace(base[k % len(base)], name=f"{base[k % len(base)].name} ({k + 1})") for k in range(n)
    )
    return replace(project, stages=stages)


def median_s(fn, runs: int) -> float:  # type: ignore[no-untyped-def]
    times = []
    for _ in range(runs):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def fitted_exponent(sizes: list[int], times: list[float]) -> float:
    """The slope of log t against log N (least squares)."""
    xs = [math.log(n) for n in sizes]
    ys = [math.log(t) for t in times]
    mx, my = statistics.fmean(xs), statistics.fmean(ys)
    return sum((x - mx) * (y - my) for x, y in zip(xs, ys, strict=True)) / sum(
        (x - mx) ** 2 for x in xs
    )


def main() -> None:
    from PySide6.QtGui import QGuiApplication, QPdfWriter

    from app.briefing.document import Document, content_of, page_layout, write_pdf

    app = QGuiApplication.instance() or QGuiApplication([])
    quick = "--quick" in sys.argv
    plans = {n: plan_of(n) for n in SIZES}
    contents = {n: content_of(p) for n, p in plans.items()}
    rows: dict[str, dict[int, float]] = {"layout": {}, "PDF": {}, "PDF CPU": {}}
    with tempfile.TemporaryDirectory() as d:
        device = QPdfWriter(str(Path(d) / "measure.pdf"))
        device.setResolution(1200)
        device.setPageLayout(page_layout("a4"))
        pages = {}
        for n in SIZES:
            rows["layout"][n] = median_s(lambda n=n, dev=device: Document(contents[n], dev), 5)
            pages[n] = len(Document(contents[n], device).pages)
        if not quick:
            # Every run starts cold (a new project value: no stage result is reused, as
            # when a plan is first printed), and the sizes take turns round by round so
            # that the machine's load weighs on them alike.
            out = Path(d) / "plan.pdf"
            runs: dict[int, list[float]] = {n: [] for n in SIZES}
            cpu: dict[int, list[float]] = {n: [] for n in SIZES}
            for _ in range(ROUNDS):
                for n in SIZES:
                    fresh = replace(plans[n])
                    t0, c0 = time.perf_counter(), time.process_time()
                    write_pdf(fresh, out)
                    runs[n].append(time.perf_counter() - t0)
                    cpu[n].append(time.process_time() - c0)
            rows["PDF"] = {n: statistics.median(t) for n, t in runs.items()}
            # the process's own CPU time: what other jobs on a shared machine leave alone
            rows["PDF CPU"] = {n: statistics.median(t) for n, t in cpu.items()}
        del device
    print("stages  pages   layout s   PDF s  PDF CPU s")
    for n in SIZES:
        pdf, pdf_cpu = rows["PDF"].get(n), rows["PDF CPU"].get(n)
        pdf_txt = f"{pdf:8.2f} {pdf_cpu:10.2f}" if pdf is not None else "       -          -"
        print(f"{n:6d} {pages[n]:6d} {rows['layout'][n]:10.4f} {pdf_txt}")
    for name, row in rows.items():
        if not row:
            continue
        sizes = [n for n in SIZES if n >= 4]
        k = fitted_exponent(sizes, [row[n] for n in sizes])
        ratio = row[64] / row[BASELINE]
        print(
            f"{name}: fitted exponent {k:.2f} (N = 4-64); 64 stages / {BASELINE} stages = "
            f"{ratio:.2f}x (linear 4.00x, target <= 4.50x)"
        )
    del app


if __name__ == "__main__":
    main()
