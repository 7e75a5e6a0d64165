"""What ran in each move of a tug drag in the whole main window: for finding slow moves.

The drag of benchmarks/window_drag.py (the same window, project and mouse path, moves
posted at 60 Hz to the board's viewport), with the main pieces of work wrapped so each
records how long it took, per move: the board's handling of the move, the controller's
preview and its edit filters (live solving), the scene's refresh, the board's paint, each
view following the controller, the tugs table, the hold limits plot's sweep steps and
paint, and garbage collection. A move runs from when it was due until the event loop
goes idle after the board painted (as in window_drag.py); work done between moves (the
plot's sweep steps when they fit) is listed apart.

Prints the moves' wall and CPU percentiles, what each piece took per move on average
(all moves, and the slow ones), and the slowest moves with what ran in each.

    python benchmarks/drag_moves.py [--live] [--tugs 24] [--moves 120] [--rounds 3]
                                    [--slow 16.7]
"""

from __future__ import annotations

import argparse
import collections
import gc
import os
import sys
import time
from collections.abc import Callable
from pathlib import Path
from typing import Any

HERE = Path(__file__).resolve().parent
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
os.environ.setdefault("TOWBOARD_RECOVERY_DIR", "/tmp/towboard-bench-recovery")
sys.path.insert(0, str(HERE))
if str(HERE.parent) not in sys.path:
    sys.path.insert(1, str(HERE.parent))

#: What the pieces of work recorded since the last move began: (name, ms).
LOG: list[tuple[str, float]] = []


def timed(name: str, f: Callable[..., Any]) -> Callable[..., Any]:
    def run(*a: Any, **k: Any) -> Any:
        t = time.perf_counter()
        try:
            return f(*a, **k)
        finally:
            LOG.append((name, (time.perf_counter() - t) * 1000))

    run.__name__ = (
        f"timed_{f.__name__}"  # not a QObject method's name (PySide looks slots up by it)
    )
    return run


def wrap(owner: Any, attr: str, name: str) -> None:
    setattr(owner, attr, timed(name, getattr(owner, attr)))


def instrument() -> None:
    """Wrap the pieces of work (before the window is made: its connections take the
    wrapped methods)."""
    import app.board.interaction as interaction
    import app.board.scene as scene
    import app.board.view as view
    import app.controller as controller
    import app.panels.hold_plot as hold_plot
    import app.panels.solve_panel as solve_panel
    import app.panels.tugs_model as tugs_model

    wrap(interaction.Interaction, "move", "board: the move")
    wrap(controller.Controller, "preview_moved_tug", "controller: preview")
    wrap(controller, "analyse_layout", "controller: the balance")
    wrap(solve_panel, "solved_stage", "live solving")
    wrap(scene.BoardScene, "refresh", "board: scene refresh")
    wrap(view.BoardView, "paintEvent", "board: paint")
    wrap(tugs_model.TugsModel, "refresh", "tugs table")
    wrap(hold_plot.HoldPlot, "_paint", "hold plot: paint")
    wrap(hold_plot, "hold_limits_problem", "hold plot: sweep's problem")
    steps = hold_plot.live_hold_limits_steps

    def stepped(*a: Any, **k: Any) -> Any:
        g = steps(*a, **k)
        t = [0.0]

        def one() -> Any:
            while True:
                t[0] = time.perf_counter()
                try:
                    next(g)
                except StopIteration as done:
                    LOG.append(("hold plot: sweep step", (time.perf_counter() - t[0]) * 1000))
                    return done.value
                LOG.append(("hold plot: sweep step", (time.perf_counter() - t[0]) * 1000))
                yield

        return one()

    hold_plot.live_hold_limits_steps = stepped
    follow = controller._Follower.changed

    def followed(self: Any) -> None:
        t = time.perf_counter()
        follow(self)
        name = getattr(self._slot, "__qualname__", str(self._slot))
        LOG.append((f"view: {name}", (time.perf_counter() - t) * 1000))

    controller._Follower.changed = followed
    started = [0.0]

    def collected(phase: str, info: dict[str, int]) -> None:
        if phase == "start":
            started[0] = time.perf_counter()
        else:
            LOG.append((f"gc {info['generation']}", (time.perf_counter() - started[0]) * 1000))

    gc.callbacks.append(collected)


def drag(subject: Any, moves: int) -> list[tuple[float, float, list[tuple[str, float]]]]:
    """One burst as in window_drag.burst; each move's wall ms, CPU ms and what ran in it
    (what ran between moves is logged as a move of its own with wall and CPU -1)."""
    from PySide6.QtCore import (
        QAbstractEventDispatcher,
        QEvent,
        QEventLoop,
        QObject,
        QPointF,
        Qt,
        QTimer,
    )
    from PySide6.QtGui import QMouseEvent
    from PySide6.QtWidgets import QApplication
    from window_drag import FRAME_MS, _settle

    vp = subject.viewport
    loop = QEventLoop()
    out: list[tuple[float, float, list[tuple[str, float]]]] = []
    state: dict[str, Any] = {"k": -1, "due": 0.0, "painted": False, "waiting": False}
    left = Qt.MouseButton.LeftButton

    def post(kind: QEvent.Type, pt: QPointF, button: Any, buttons: Any) -> None:
        glob = QPointF(vp.mapToGlobal(pt.toPoint()))
        ev = QMouseEvent(kind, pt, glob, button, buttons, Qt.KeyboardModifier.NoModifier)
        QApplication.postEvent(vp, ev)

    class Watch(QObject):
        def eventFilter(self, obj: Any, event: Any) -> bool:  # a benchmark's, not the app's
            if event.type() == QEvent.Type.Paint:
                state["painted"] = True
            return False

    watch = Watch()
    vp.installEventFilter(watch)

    def next_move() -> None:
        k = state["k"] = state["k"] + 1
        if LOG:
            out.append((-1.0, -1.0, LOG[:]))  # between the moves
        LOG.clear()
        if k >= moves:
            subject.before_release()
            post(
                QEvent.Type.MouseButtonRelease,
                subject.path(moves - 1, moves),
                left,
                Qt.MouseButton.NoButton,
            )
            QTimer.singleShot(0, loop.quit)
            return
        state.update(painted=False, waiting=True, cpu0=time.process_time())
        post(QEvent.Type.MouseMove, subject.path(k, moves), Qt.MouseButton.NoButton, left)

    pacer = QTimer()
    pacer.setSingleShot(True)
    pacer.setTimerType(Qt.TimerType.PreciseTimer)
    pacer.timeout.connect(next_move)

    def idle() -> None:
        if not state["waiting"]:
            return
        now = time.perf_counter()
        if not state["painted"] and now - state["due"] < 2.0:
            return
        cpu = (time.process_time() - state["cpu0"]) * 1000
        out.append(((now - state["due"]) * 1000, cpu, LOG[:]))
        LOG.clear()
        state["waiting"] = False
        due = state["due"] + FRAME_MS / 1000
        state["due"] = max(due, now)
        pacer.start(max(0, round((due - now) * 1000)))

    dispatcher = QAbstractEventDispatcher.instance()
    dispatcher.aboutToBlock.connect(idle)
    wake = QTimer()
    wake.start(250)
    subject.start = subject.grip()
    post(QEvent.Type.MouseButtonPress, QPointF(subject.start), left, left)
    _settle(0.05)
    state["due"] = time.perf_counter()
    QTimer.singleShot(0, next_move)
    loop.exec()
    dispatcher.aboutToBlock.disconnect(idle)
    wake.stop()
    _settle(0.3)
    vp.removeEventFilter(watch)
    subject.after_drag()
    _settle(0.2)
    LOG.clear()
    return out


def report(moves: list[tuple[float, float, list[tuple[str, float]]]], slow_ms: float) -> None:
    from window_drag import pct

    timed_moves = [m for m in moves if m[0] >= 0]
    between = [m for m in moves if m[0] < 0]
    wall = [m[0] for m in timed_moves]
    cpu = [m[1] for m in timed_moves]
    print(
        f"{len(wall)} moves, ms: wall p50 {pct(wall, 0.5):.1f} p95 {pct(wall, 0.95):.1f} "
        f"p99 {pct(wall, 0.99):.1f}; CPU p50 {pct(cpu, 0.5):.1f} p95 {pct(cpu, 0.95):.1f} "
        f"p99 {pct(cpu, 0.99):.1f}"
    )
    slow = [m for m in timed_moves if m[0] > slow_ms]
    groups = (
        ("every move", timed_moves),
        (f"moves over {slow_ms:g} ms", slow),
        ("between moves", between),
    )
    for title, ms in groups:
        if not ms:
            continue
        total: dict[str, float] = collections.defaultdict(float)
        count: collections.Counter[str] = collections.Counter()
        for _, _, log in ms:
            for name, dt in log:
                total[name] += dt
                count[name] += 1
        print(f"\n{title} ({len(ms)}): ms per move, times per move")
        for name in sorted(total, key=lambda n: -total[n]):
            print(f"  {total[name] / len(ms):7.3f} {count[name] / len(ms):5.2f}  {name}")
    print("\nthe slowest moves: wall, CPU, what ran (ms)")
    for w, c, log in sorted(timed_moves, key=lambda m: -m[0])[:12]:
        named: collections.Counter[str] = collections.Counter()
        for name, dt in log:
            named[name] += dt
        what = ", ".join(f"{n} {v:.1f}" for n, v in named.most_common() if v >= 0.3)
        print(f"  {w:6.1f} {c:6.1f}  {what}")


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--live", action="store_true", help="live solving, the hold plot following")
    ap.add_argument("--tugs", type=int, default=24)
    ap.add_argument("--moves", type=int, default=120)
    ap.add_argument("--rounds", type=int, default=3)
    ap.add_argument("--slow", type=float, default=16.7, help="a slow move, wall ms")
    args = ap.parse_args()
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([])
    instrument()
    from window_drag import WindowSubject, load

    print(f"load average at the start: {load()}")
    subject = WindowSubject(args.tugs, live=args.live)
    drag(subject, 10)  # warm up
    moves = []
    for _ in range(args.rounds):
        moves += drag(subject, args.moves)
    report(moves, args.slow)
    print(f"load average at the end: {load()}")
    subject.close()
    del app


if __name__ == "__main__":
    main()
