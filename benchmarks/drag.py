"""Drag a tug on the offscreen board with synthetic mouse events and time each move.

Per mouse move the time runs from sending the move to the viewport until the board
has repainted (``viewport().repaint()`` paints the whole viewport synchronously):
the balance solved again for the new lead and length, the items updated, the board
drawn. 500 moves, for 24 and 200 tugs on a synthetic project. Prints the median and
the 99th percentile.

Targets (this 2-core machine): 24 tugs median <= 4 ms and p99 <= 12 ms; 200 tugs
median < 16 ms (one 60 Hz frame).

    python benchmarks/drag.py [--moves 500] [--window]

``--window`` drags in the whole main window (panels, table) instead of the board alone.
"""

from __future__ import annotations

import argparse
import math
import os
import statistics
import time

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from PySide6.QtCore import QEvent, QPointF, Qt
from PySide6.QtGui import QMouseEvent
from PySide6.QtWidgets import QApplication

from core.model.hull import Fitting, Hull
from core.model.outlines import raked_outline
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug

TF = 9806.65


def synthetic_project(n_tugs: int) -> Project:
    """A 200 m x 48 m raked barge with ``n_tugs`` tugs, two thirds on lines, a third pushing."""
    length, beam = 200.0, 48.0
    outline = raked_outline(length, beam, 20.0, 10.0, 0.7)
    hull = Hull("Bench barge", outline)
    fittings = []
    tugs = []
    placements = []
    perimeter = hull.geometry.perimeter
    for i in range(n_tugs):
        s = (i + 0.5) / n_tugs * perimeter
        q = hull.geometry.point_at(s)
        kind = "push" if i % 3 == 2 else "line"
        name = f"P{i:03d}"
        fittings.append(Fitting(name, kind, q.x, q.y, "bitt" if kind == "line" else "pushing pad"))
        tug = f"Tug {i:03d}"
        tugs.append(Tug(tug, (30 + i % 50) * TF))
        out = math.atan2(q.normal[1], q.normal[0])
        placements.append(
            Placement(
                tug,
                hull.name,
                name,
                setting=0.3 + 0.5 * ((i * 37) % 11) / 10,
                lead_rad=out if kind == "line" else 0.0,
                line_length_m=35.0,
            )
        )
    hull = Hull(hull.name, outline, fittings=tuple(fittings))
    stage = Stage(
        "Bench", poses=(BodyPose(hull.name, 0.0, 0.0, 90.0),), placements=tuple(placements)
    )
    return Project(
        name=f"Drag benchmark, {n_tugs} tugs", hulls=(hull,), tugs=tuple(tugs), stages=(stage,)
    )


def _send(
    viewport, kind: QEvent.Type, pt: QPointF, button: Qt.MouseButton, buttons: Qt.MouseButton
) -> None:
    ev = QMouseEvent(
        kind,
        pt,
        QPointF(viewport.mapToGlobal(pt.toPoint())),
        button,
        buttons,
        Qt.KeyboardModifier.NoModifier,
    )
    QApplication.sendEvent(viewport, ev)


def run(n_tugs: int, moves: int, window: bool) -> tuple[float, float, float]:
    app = QApplication.instance() or QApplication([])
    project = synthetic_project(n_tugs)
    if window:
        os.environ.setdefault("TOWBOARD_RECOVERY_DIR", "/tmp/towboard-bench-recovery")
        from app.window.main_window import MainWindow

        w = MainWindow(project)
        w.resize(1400, 900)
        w.show()
        view, scene, controller = w.view, w.board, w.controller
    else:
        from app.board.scene import BoardScene
        from app.board.view import BoardView
        from app.controller import Controller

        controller = Controller(project)
        scene = BoardScene(controller)
        view = BoardView(scene)
        view.resize(1100, 800)
        view.show()
        w = view
    app.processEvents()
    view.fit_to_hull()
    app.processEvents()
    vp = view.viewport()
    # grab the first tug on a line by its towing point (with 200 tugs their shapes
    # overlap, and the one on top is taken)
    r = controller.results()["Bench barge"]
    i = next(k for k in range(len(r.layout.placements)) if not r.layout.is_push[k])
    start = view.mapFromScene(QPointF(*r.layout.positions[i]))
    _send(
        vp,
        QEvent.Type.MouseButtonPress,
        QPointF(start),
        Qt.MouseButton.LeftButton,
        Qt.MouseButton.LeftButton,
    )
    assert scene.selected_tug() is not None, "the press did not land on a tug"
    times = []
    solve = []
    for k in range(moves):
        a = 2 * math.pi * k / moves
        pt = QPointF(start) + QPointF(80 * math.sin(a), 60 * (1 - math.cos(a)))
        t0 = time.perf_counter()
        _send(vp, QEvent.Type.MouseMove, pt, Qt.MouseButton.NoButton, Qt.MouseButton.LeftButton)
        t1 = time.perf_counter()
        vp.repaint()
        times.append(time.perf_counter() - t0)
        solve.append(t1 - t0)
    _send(
        vp, QEvent.Type.MouseButtonRelease, pt, Qt.MouseButton.LeftButton, Qt.MouseButton.NoButton
    )
    assert controller.undo_stack.count() == 1
    times_ms = sorted(t * 1000 for t in times)
    p99 = times_ms[min(len(times_ms) - 1, math.ceil(0.99 * len(times_ms)) - 1)]
    if window:
        w.controller.undo_stack.setClean()
    w.close()
    return statistics.median(times_ms), p99, statistics.median(solve) * 1000


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--moves", type=int, default=500)
    ap.add_argument("--window", action="store_true", help="drag in the whole main window")
    args = ap.parse_args()
    where = "main window" if args.window else "board"
    targets = {24: "median <= 4 ms, p99 <= 12 ms", 200: "median < 16 ms"}
    for n in (24, 200):
        med, p99, solve = run(n, args.moves, args.window)
        print(
            f"{n:4d} tugs, {args.moves} moves on the {where}: median {med:6.2f} ms, "
            f"p99 {p99:6.2f} ms (of which solve and item updates, median {solve:5.2f} ms)"
            f"   target {targets[n]}"
        )


if __name__ == "__main__":
    main()
