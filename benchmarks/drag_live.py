"""The board drag benchmark with live solving and the live hold limits plot.

The same drag as benchmarks/drag.py (its synthetic barge, 24 tugs, synthetic mouse
events on the offscreen main window), with the hull given a freeboard and draught and
the stage a wind and a current, so that on every mouse move the window

- solves the pulls again for the stage's goal (hold) and fills in every setting,
- works out the balance with the wind and current loads,
- sweeps the hold limits (every 5 degrees while dragging, all tugs and each tug lost),
- repaints the board and the hold limits plot.

Per move the time runs from sending the move until both have repainted. Prints the
median and the 99th percentile, and the same with every pending event of the window
processed (tables and panels too). Target: within one 60 Hz frame (16.7 ms).

    python benchmarks/drag_live.py [--moves 500] [--tugs 24]
"""

from __future__ import annotations

import argparse
import math
import os
import statistics
import sys
import time
from dataclasses import replace
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
os.environ.setdefault("TOWBOARD_RECOVERY_DIR", "/tmp/towboard-bench-recovery")
sys.path.insert(0, str(Path(__file__).resolve().parent))

from drag import _send, synthetic_project
from PySide6.QtCore import QEvent, QPointF, Qt
from PySide6.QtWidgets import QApplication

from core.model.conditions import Conditions
from core.model.plan import Project

KNOT = 1852.0 / 3600.0


def live_project(n_tugs: int) -> Project:
    p = synthetic_project(n_tugs)
    hull = replace(p.hulls[0], freeboard_m=5.0, draught_m=4.0)
    stage = replace(
        p.stages[0],
        conditions=Conditions(
            wind_speed_ms=18 * KNOT,
            wind_from_deg=300.0,
            current_speed_ms=0.6 * KNOT,
            current_towards_deg=150.0,
        ),
    )
    return replace(p, hulls=(hull,), stages=(stage,))


def _percentile(values: list[float], q: float) -> float:
    s = sorted(values)
    return s[min(len(s) - 1, math.ceil(q * len(s)) - 1)]


def run(n_tugs: int, moves: int) -> dict[str, float]:
    app = QApplication.instance() or QApplication([])
    from app.window.main_window import MainWindow

    w = MainWindow(live_project(n_tugs))
    w.resize(1400, 900)
    w.show()
    ui = w.solve_ui  # type: ignore[attr-defined]
    ui.set_live(True)
    for _ in range(3):
        app.processEvents()
    w.view.fit_to_hull()
    app.processEvents()
    view, scene, controller = w.view, w.board, w.controller
    plot = ui.hold.plot
    vp = view.viewport()
    r = controller.results()["Bench barge"]
    i = next(k for k in range(len(r.layout.placements)) if not r.layout.is_push[k])
    tug = r.layout.placements[i].tug
    start = view.mapFromScene(QPointF(*r.layout.positions[i]))
    _send(
        vp,
        QEvent.Type.MouseButtonPress,
        QPointF(start),
        Qt.MouseButton.LeftButton,
        Qt.MouseButton.LeftButton,
    )
    assert scene.selected_tug() == tug, "the press did not land on the tug"
    frame, whole = [], []
    settings_changed = 0
    last = None
    for k in range(moves):
        a = 2 * math.pi * k / moves
        pt = QPointF(start) + QPointF(80 * math.sin(a), 60 * (1 - math.cos(a)))
        t0 = time.perf_counter()
        _send(vp, QEvent.Type.MouseMove, pt, Qt.MouseButton.NoButton, Qt.MouseButton.LeftButton)
        vp.repaint()
        plot.repaint()
        t1 = time.perf_counter()
        app.processEvents()
        t2 = time.perf_counter()
        frame.append((t1 - t0) * 1000)
        whole.append((t2 - t0) * 1000)
        settings = tuple(p.setting for p in controller.stage.placements)
        settings_changed += settings != last
        last = settings
    _send(
        vp, QEvent.Type.MouseButtonRelease, pt, Qt.MouseButton.LeftButton, Qt.MouseButton.NoButton
    )
    assert controller.undo_stack.count() >= 1
    assert ui.hold.limits is not None, "the hold limits plot had nothing to show"
    controller.undo_stack.setClean()
    w.close()
    return {
        "median": statistics.median(frame),
        "p99": _percentile(frame, 0.99),
        "whole_median": statistics.median(whole),
        "whole_p99": _percentile(whole, 0.99),
        "resolved": settings_changed,
    }


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--moves", type=int, default=500)
    ap.add_argument("--tugs", type=int, default=24)
    args = ap.parse_args()
    res = run(args.tugs, args.moves)
    print(
        f"{args.tugs} tugs, {args.moves} moves, live solving and live hold limits plot:\n"
        f"  board + plot repainted: median {res['median']:.2f} ms, p99 {res['p99']:.2f} ms\n"
        f"  every pending event of the window processed too: median {res['whole_median']:.2f} ms, "
        f"p99 {res['whole_p99']:.2f} ms\n"
        f"  the settings changed on {res['resolved']} of {args.moves} moves   target: one 60 Hz "
        "frame (16.7 ms)"
    )


if __name__ == "__main__":
    main()
