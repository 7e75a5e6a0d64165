"""How long the stage checks and the printed briefing take for the four-stage sample.

Run: python benchmarks/briefing.py   (prints medians over a few runs; not a test)
"""

from __future__ import annotations

import os
import statistics
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")


def median_ms(fn, runs: int) -> float:  # type: ignore[no-untyped-def]
    times = []
    for _ in range(runs):
        t0 = time.perf_counter()
        fn()
        times.append((time.perf_counter() - t0) * 1000)
    return statistics.median(times)


def main() -> None:
    from PySide6.QtGui import QGuiApplication

    from app.briefing.document import write_pdf
    from core.analysis.checks import check_plan, check_stage
    from core.io.projectfile import load
    from core.mechanics.clearance import stage_clearances

    app = QGuiApplication.instance() or QGuiApplication([])
    project = load(ROOT / "sample_projects" / "twin_barge_move.towboard")
    stage = project.stages[0]
    print(f"plan: {len(project.stages)} stages, {len(project.site.features)} site features")
    print(
        f"clearances of one stage:        {median_ms(lambda: stage_clearances(project, stage), 50):8.2f} ms"
    )
    print(
        f"check of one stage (with goal): {median_ms(lambda: check_stage(project, 0), 20):8.2f} ms"
    )
    print(f"check of every stage:           {median_ms(lambda: check_plan(project), 10):8.2f} ms")
    with tempfile.TemporaryDirectory() as d:
        out = Path(d) / "plan.pdf"
        pages = write_pdf(project, out)
        ms = median_ms(lambda: write_pdf(project, out), 5)
        print(
            f"briefing PDF ({pages} pages, A4):  {ms:8.1f} ms, {out.stat().st_size / 1024:.0f} KiB"
        )
    del app


if __name__ == "__main__":
    main()
