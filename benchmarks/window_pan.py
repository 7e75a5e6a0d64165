"""Panning the board in the whole main window, step by step, against a tug drag there.

A pan is a press of the middle button on the board and moves at 60 Hz (benchmarks/
window_drag.py's ``burst``: the moves are posted and Qt's own event loop delivers them;
a step's time runs until the loop is idle after the board has painted). Every label
rides with the board while it moves and is placed once the view stands still
(app/board/view.py, ``place_at_rest``). The baseline, measured in the same run and
alternated with the pan, is a tug dragged in the same window (live solving off).

    python benchmarks/window_pan.py [--tugs 24 200] [--moves 120] [--rounds 3]
"""

from __future__ import annotations

import argparse
import os
import statistics
import sys
from pathlib import Path

HERE = Path(__file__).resolve().parent
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
os.environ.setdefault("TOWBOARD_RECOVERY_DIR", "/tmp/towboard-bench-recovery")
sys.path.insert(0, str(HERE))
if str(HERE.parent) not in sys.path:
    sys.path.insert(1, str(HERE.parent))

from window_drag import Subject, WindowSubject, burst, pct  # noqa: E402


class PanSubject(Subject):
    """The main window's board, panned with the middle button from its middle."""

    def __init__(self, window: WindowSubject) -> None:
        super().__init__()
        self.name = "pan"
        self.view = window.window.view
        self.viewport = self.view.viewport()
        self.button = "middle"

    def grip(self):  # type: ignore[no-untyped-def]
        from PySide6.QtCore import QPointF

        return QPointF(self.viewport.rect().center())

    def grabbed(self) -> bool:
        return self.view._pan is not None


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--tugs", type=int, nargs="*", default=[24, 200])
    ap.add_argument("--moves", type=int, default=120)
    ap.add_argument("--rounds", type=int, default=3)
    args = ap.parse_args()

    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([])  # noqa: F841 (kept alive)
    print(f"load average at the start: {' '.join(f'{x:.1f}' for x in os.getloadavg())}")
    for n in args.tugs:
        drag = WindowSubject(n, live=False)
        drag.name = "tug drag"
        pan = PanSubject(drag)
        subjects: list[Subject] = [pan, drag]
        figures: dict[str, dict[str, list[float]]] = {
            s.name: {"wall": [], "cpu": []} for s in subjects
        }
        for s in subjects:
            burst(s, 10, 1000 / 60)
        for r in range(args.rounds):
            for s in subjects[r % 2 :] + subjects[: r % 2]:
                b = burst(s, args.moves, 1000 / 60)
                figures[s.name]["wall"] += b["wall"]  # type: ignore[operator]
                figures[s.name]["cpu"] += b["cpu"]  # type: ignore[operator]
        drag.close()
        print(f"\n{n} tugs: {args.rounds * args.moves} steps each, 60 Hz, ms per step")
        print("              wall p50    p95    p99    CPU p50    p95    p99   / tug drag")
        base = statistics.median(figures["tug drag"]["cpu"])
        for name, f in figures.items():
            w, c = f["wall"], f["cpu"]
            print(
                f"  {name:<10} {statistics.median(w):8.1f} {pct(w, 0.95):6.1f} {pct(w, 0.99):6.1f}"
                f"   {statistics.median(c):8.1f} {pct(c, 0.95):6.1f} {pct(c, 0.99):6.1f}"
                f"   {statistics.median(c) / base:5.2f}x CPU"
            )
    print(f"load average at the end: {' '.join(f'{x:.1f}' for x in os.getloadavg())}")


if __name__ == "__main__":
    main()
