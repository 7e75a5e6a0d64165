"""A tug dragged in the whole main window with Qt's event loop running, against baselines.

This is the drag a user feels. Every move is a mouse event *posted* to the board's
viewport at 60 Hz (``--interval``); Qt's own event loop delivers it, runs whatever the
move sets off (the board, every panel, timers due) and paints the window. A move's time
runs from the moment it was due until the loop next goes idle after the board has been
painted: wall clock and the process's CPU time. Work a move leaves for later (panels on
a timer) lands in the next move's figure when it is still running when that move is due,
and in "CPU per move, all work" (the whole burst's CPU over its moves) in any case.

Four subjects, measured in the same process in turn (a burst of moves on each, in a
rotating order, repeated), so that the machine's load weighs on all of them alike:

- ``window``: the main window (app/window/main_window.py) with every dock open as it
  opens for a user, live solving off;
- ``window live``: the same with live solving on (the stage's goal is "hold" in wind and
  current, so every move solves the pulls again) and the hold limits plot following;
- ``board``: the board alone (app/board scene and view, no window), its viewport the size
  of the window's board;
- ``bare``: a bare antialiased QGraphicsView, 1200 x 800, a polygon (the barge), one line
  and one ellipse per tug, every line moved on every event: what Qt itself costs.

Each figure is printed with its ratio to the board alone and to the bare view. Device
pixel ratios 1 and 2 each run in their own process (``QT_SCALE_FACTOR``), alternating,
``--repeats`` times each; the 2x figures are also given as a ratio to the 1x ones.

Targets (issue 9): window 24 tugs median within 1.3x the board alone and 5x the bare
view, p99 under 16.7 ms wall; 200 tugs median under 16.7 ms; live p99 under 16.7 ms;
2x within 2x of 1x.

    python benchmarks/window_drag.py [--moves 150] [--rounds 3] [--tugs 24 200]
                                     [--scales 1 2] [--repeats 1] [--interval 16.7]
                                     [--live-tugs 24]
"""

from __future__ import annotations

import argparse
import json
import math
import os
import statistics
import subprocess
import sys
import time
from dataclasses import replace
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
os.environ.setdefault("TOWBOARD_RECOVERY_DIR", "/tmp/towboard-bench-recovery")
sys.path.insert(0, str(HERE))
if str(ROOT) not in sys.path:  # the checkout's packages, even from another folder
    sys.path.insert(1, str(ROOT))

FRAME_MS = 1000.0 / 60.0
SUBJECTS = ("window", "window live", "board", "bare")


# -- the subjects -------------------------------------------------------------------------
def live_project(n_tugs: int):  # type: ignore[no-untyped-def]
    """The drag benchmark's barge in wind and current, its stage asked to hold."""
    from drag_live import live_project as base

    from core.model.goals import Goal

    p = base(n_tugs)
    return replace(p, stages=(replace(p.stages[0], goal=Goal("hold")),))


class Subject:
    """Something to drag: a viewport, where to press, and how to tidy up."""

    name = ""
    button = "left"  # the mouse button held: "left" or "middle"

    def __init__(self) -> None:
        self.viewport = None
        self.start = None

    def path(self, k: int, moves: int):  # type: ignore[no-untyped-def]
        """Where the mouse is on move ``k``: a loop round the grip point, px."""
        from PySide6.QtCore import QPointF

        a = 2 * math.pi * (k + 1) / (moves + 1)  # never back at the grip
        return QPointF(self.start) + QPointF(80 * math.sin(a), 60 * (1 - math.cos(a)))

    def grip(self):  # type: ignore[no-untyped-def]
        """Where to press, px (worked out again before each burst: the view may have moved)."""
        return self.start

    def grabbed(self) -> bool:
        """Whether the press took hold of what is to be dragged."""
        return True

    def before_release(self) -> str:
        """Called after the last move: let go of the drag (Escape puts the plan back, so
        every burst starts from the same plan and its result is not worked out again);
        says what is wrong with the drag, if anything."""
        return ""

    def after_drag(self) -> None:
        """Called once a burst's release has been processed."""

    def close(self) -> None:
        """Let go of the windows."""


def _tug_grip(view, controller, pulling: bool = False):  # type: ignore[no-untyped-def]
    """The viewport point of the first tug on a line (its towing point); ``pulling``: the
    tug on a line with the largest setting (with live solving, a tug the solver gives no
    pull may be dragged without any setting changing; with 200 tugs sharing the load,
    every setting is under 1 %)."""
    from PySide6.QtCore import QPointF

    r = next(iter(controller.results().values()))
    lay = r.layout
    rows = [k for k in range(len(lay.placements)) if not lay.is_push[k]]
    if pulling:
        rows = [max(rows, key=lambda k: lay.placements[k].setting)]
    return QPointF(view.mapFromScene(QPointF(*lay.positions[rows[0]])))


class WindowSubject(Subject):
    def __init__(self, n_tugs: int, live: bool) -> None:
        super().__init__()
        from app.window.main_window import MainWindow

        self.name = "window live" if live else "window"
        w = self.window = MainWindow(live_project(n_tugs))
        w.resize(1400, 900)
        w.show()
        if live:
            w.solve_ui.set_live(True)  # type: ignore[attr-defined]
            w.panels["hold_limits"].show()
            w.panels["hold_limits"].raise_()
        _settle(0.2)
        w.view.fit_to_hull()
        _settle(0.2)
        self.viewport = w.view.viewport()
        self.live = live
        self.start = _tug_grip(w.view, w.controller, pulling=live)

    def grip(self):  # type: ignore[no-untyped-def]
        return _tug_grip(self.window.view, self.window.controller, pulling=self.live)

    def grabbed(self) -> bool:
        return self.window.board.interaction.drag is not None

    def before_release(self) -> str:
        c = self.window.controller
        if not c.previewing:
            return "the drag showed no preview"
        base = c._preview_base
        moved = c.project.stages[0].placements != base.stages[0].placements
        solved = [p.setting for p in c.project.stages[0].placements] != [
            p.setting for p in base.stages[0].placements
        ]
        _escape(self.window.board)
        if not moved:
            return "the drag moved no tug"
        if self.live and not solved:
            return "live solving changed no setting"
        return ""

    def after_drag(self) -> None:
        c = self.window.controller
        while c.undo_stack.canUndo() and c.undo_stack.index() > (1 if self.live else 0):
            c.undo_stack.undo()  # every burst starts from the same plan
        c.undo_stack.setClean()

    def close(self) -> None:
        self.window.controller.undo_stack.setClean()
        self.window.close()
        self.window.deleteLater()


class BoardSubject(Subject):
    def __init__(self, n_tugs: int, size) -> None:  # type: ignore[no-untyped-def]
        super().__init__()
        from app.board.scene import BoardScene
        from app.board.view import BoardView
        from app.controller import Controller

        self.name = "board"
        self.controller = Controller(live_project(n_tugs))
        self.scene = BoardScene(self.controller)
        self.view = BoardView(self.scene)
        self.view.resize(size)
        self.view.show()
        _settle(0.2)
        self.view.fit_to_hull()
        _settle(0.2)
        self.viewport = self.view.viewport()
        self.start = _tug_grip(self.view, self.controller)

    def grip(self):  # type: ignore[no-untyped-def]
        return _tug_grip(self.view, self.controller)

    def grabbed(self) -> bool:
        return self.scene.interaction.drag is not None

    def before_release(self) -> str:
        previewing = self.controller.previewing
        _escape(self.scene)
        return "" if previewing else "the drag showed no preview"

    def after_drag(self) -> None:
        while self.controller.undo_stack.canUndo():
            self.controller.undo_stack.undo()

    def close(self) -> None:
        self.view.close()
        self.view.deleteLater()


class BareSubject(Subject):
    """A bare antialiased QGraphicsView: a polygon, a line and an ellipse per tug."""

    def __init__(self, n_tugs: int) -> None:
        super().__init__()
        from PySide6.QtCore import QLineF, QPointF
        from PySide6.QtGui import QBrush, QColor, QPainter, QPen, QPolygonF, QTransform
        from PySide6.QtWidgets import QGraphicsScene, QGraphicsView

        self.name = "bare"
        project = live_project(n_tugs)
        hull = project.hulls[0]
        scene = self.scene = QGraphicsScene()
        scene.setBackgroundBrush(QColor("#eef4f8"))
        poly = QPolygonF([QPointF(x, y) for x, y in hull.outline])
        scene.addPolygon(poly, QPen(QColor("#34495e"), 0), QBrush(QColor("#dde6ee")))
        pen = QPen(QColor("#1565c0"), 0)
        self.lines = []
        self.anchors = []
        for f in hull.fittings:
            a = QPointF(f.x, f.y)
            line = scene.addLine(QLineF(a, a + QPointF(0, 30)), pen)
            scene.addEllipse(f.x - 5, f.y - 5, 10, 10, QPen(QColor("#444"), 0))
            self.lines.append(line)
            self.anchors.append(a)
        bare = self

        class View(QGraphicsView):
            def mousePressEvent(self, event):  # type: ignore[no-untyped-def]
                bare.held = self.mapToScene(event.position().toPoint())
                event.accept()

            def mouseMoveEvent(self, event):  # type: ignore[no-untyped-def]
                if bare.held is None:
                    return
                d = self.mapToScene(event.position().toPoint()) - bare.held
                for line, a in zip(bare.lines, bare.anchors, strict=True):
                    line.setLine(QLineF(a, a + QPointF(d.x(), 30 + d.y())))
                event.accept()

            def mouseReleaseEvent(self, event):  # type: ignore[no-untyped-def]
                bare.held = None
                event.accept()

        self.held = None
        v = self.view = View(scene)
        v.setRenderHint(QPainter.RenderHint.Antialiasing)
        v.resize(1200, 800)
        v.setTransform(QTransform.fromScale(1.0, -1.0))
        v.show()
        _settle(0.2)
        v.fitInView(scene.itemsBoundingRect().adjusted(-40, -40, 40, 40), _keep_aspect())
        _settle(0.2)
        self.viewport = v.viewport()
        self.start = QPointF(v.mapFromScene(self.anchors[0]))

    def close(self) -> None:
        self.view.close()
        self.view.deleteLater()


def _escape(scene) -> None:  # type: ignore[no-untyped-def]
    """Press Escape on a board (a drag in progress is let go, the plan put back)."""
    from PySide6.QtCore import QEvent, Qt
    from PySide6.QtGui import QKeyEvent
    from PySide6.QtWidgets import QApplication

    for kind in (QEvent.Type.KeyPress, QEvent.Type.KeyRelease):
        ev = QKeyEvent(kind, Qt.Key.Key_Escape, Qt.KeyboardModifier.NoModifier)
        QApplication.sendEvent(scene, ev)


def _keep_aspect():  # type: ignore[no-untyped-def]
    from PySide6.QtCore import Qt

    return Qt.AspectRatioMode.KeepAspectRatio


# -- driving the event loop -----------------------------------------------------------------
def _settle(seconds: float) -> None:
    """Run the event loop for ``seconds`` (timers fire, deferred work finishes)."""
    from PySide6.QtCore import QEventLoop, QTimer

    loop = QEventLoop()
    QTimer.singleShot(int(seconds * 1000), loop.quit)
    loop.exec()


def burst(subject: Subject, moves: int, interval_ms: float) -> dict[str, list[float] | float]:
    """Press on the subject's grip point, ``moves`` moves ``interval_ms`` apart, release.

    Returns each move's wall and CPU time, ms, and the burst's CPU per move, all work.
    """
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

    vp = subject.viewport
    loop = QEventLoop()
    wall: list[float] = []
    cpu: list[float] = []
    state: dict = {
        "problem": "",
        "k": -1,
        "due": 0.0,
        "cpu0": 0.0,
        "painted": False,
        "waiting": False,
        "unpainted": 0,
    }

    def post(kind: QEvent.Type, pt: QPointF, button: Qt.MouseButton, buttons) -> None:  # type: ignore[no-untyped-def]
        ev = QMouseEvent(
            kind,
            pt,
            QPointF(vp.mapToGlobal(pt.toPoint())),
            button,
            buttons,
            Qt.KeyboardModifier.NoModifier,
        )
        QApplication.postEvent(vp, ev)

    held = Qt.MouseButton.MiddleButton if subject.button == "middle" else Qt.MouseButton.LeftButton

    class Watch(QObject):
        def eventFilter(self, obj, event):  # type: ignore[no-untyped-def]
            if event.type() == QEvent.Type.Paint:
                state["painted"] = True
            return False

    watch = Watch()
    vp.installEventFilter(watch)

    def next_move() -> None:
        k = state["k"] = state["k"] + 1
        if k >= moves:
            state["problem"] = subject.before_release()
            post(
                QEvent.Type.MouseButtonRelease,
                subject.path(moves - 1, moves),
                held,
                Qt.MouseButton.NoButton,
            )
            QTimer.singleShot(0, loop.quit)
            return
        state["painted"] = False
        state["waiting"] = True
        state["cpu0"] = time.process_time()
        post(QEvent.Type.MouseMove, subject.path(k, moves), Qt.MouseButton.NoButton, held)

    pacer = QTimer()
    pacer.setSingleShot(True)
    pacer.setTimerType(Qt.TimerType.PreciseTimer)
    pacer.timeout.connect(lambda: next_move())

    def idle() -> None:
        if not state["waiting"]:
            return
        now = time.perf_counter()
        if not state["painted"]:
            if now - state["due"] < 2.0:
                return
            state["unpainted"] += 1  # nothing was painted: count it, do not wait for ever
        wall.append((now - state["due"]) * 1000)
        cpu.append((time.process_time() - state["cpu0"]) * 1000)
        state["waiting"] = False
        # the next move is due one interval after this one; late, it comes at once (the
        # window system hands over the newest position when the program catches up)
        due = state["due"] + interval_ms / 1000
        state["due"] = max(due, now)
        pacer.start(max(0, round((due - now) * 1000)))

    dispatcher = QAbstractEventDispatcher.instance()
    dispatcher.aboutToBlock.connect(idle)
    wake = QTimer()  # a move that paints nothing must not leave the loop asleep for ever
    wake.start(250)
    subject.start = subject.grip()
    post(QEvent.Type.MouseButtonPress, QPointF(subject.start), held, held)
    _settle(0.05)
    if not subject.grabbed():
        raise RuntimeError(f"{subject.name}: the press did not take hold of the tug")
    cpu_start = time.process_time()
    state["due"] = time.perf_counter()
    QTimer.singleShot(0, next_move)
    loop.exec()
    dispatcher.aboutToBlock.disconnect(idle)
    wake.stop()
    if os.environ.get("WINDOW_DRAG_DEBUG"):
        print(subject.name, len(wall), "unpainted", state["unpainted"], file=sys.stderr)
    _settle(0.3)  # deferred work after the release (the panels' timers) finishes here
    cpu_all = (time.process_time() - cpu_start) * 1000 / max(moves, 1)
    vp.removeEventFilter(watch)
    subject.after_drag()
    _settle(0.2)
    return {
        "wall": wall,
        "cpu": cpu,
        "cpu_all": cpu_all,
        "unpainted": state["unpainted"],
        "problem": state["problem"],
    }


def child(args: argparse.Namespace) -> None:
    """Measure every subject at this process's scale; print the figures as JSON."""
    from PySide6.QtWidgets import QApplication

    from app.collector import freeze_at_start

    app = QApplication.instance() or QApplication([])
    out: dict[str, object] = {"scale": app.primaryScreen().devicePixelRatio(), "runs": {}}
    for n in args.tugs:
        win = WindowSubject(n, live=False)
        board = BoardSubject(n, win.window.view.viewport().size())
        bare = BareSubject(n)
        subjects: list[Subject] = [win, board, bare]
        if args.live_tugs is None or n in args.live_tugs:
            subjects.insert(1, WindowSubject(n, live=True))
        if not args.no_freeze:
            freeze_at_start()  # as app.window.main_window.run does once the window is up
        figures: dict[str, dict[str, list[float]]] = {
            s.name: {"wall": [], "cpu": [], "cpu_all": []} for s in subjects
        }
        problems: list[str] = []
        for s in subjects:  # warm up: first paints, caches, the stage result
            burst(s, 10, args.interval)
        for r in range(args.rounds):
            order = subjects[r % len(subjects) :] + subjects[: r % len(subjects)]
            for s in order:
                b = burst(s, args.moves, args.interval)
                f = figures[s.name]
                f["wall"] += b["wall"]  # type: ignore[operator]
                f["cpu"] += b["cpu"]  # type: ignore[operator]
                f["cpu_all"].append(b["cpu_all"])  # type: ignore[arg-type]
                if b["problem"] and f"{s.name}: {b['problem']}" not in problems:
                    problems.append(f"{s.name}: {b['problem']}")
        for s in subjects:
            s.close()
        _settle(0.2)
        out["runs"][str(n)] = {"figures": figures, "problems": problems}  # type: ignore[index]
    print(json.dumps(out))


# -- the report ------------------------------------------------------------------------
def pct(values: list[float], q: float) -> float:
    s = sorted(values)
    return s[min(len(s) - 1, max(0, math.ceil(q * len(s)) - 1))]


def stats(values: list[float]) -> dict[str, float]:
    return {
        "p50": statistics.median(values),
        "p95": pct(values, 0.95),
        "p99": pct(values, 0.99),
        "max": max(values),
    }


def load() -> str:
    a, b, c = os.getloadavg()
    return f"{a:.1f} {b:.1f} {c:.1f} (1, 5, 15 min) on {os.cpu_count()} cores"


def report(results: dict[float, list[dict]], args: argparse.Namespace) -> None:
    merged: dict[float, dict[str, dict[str, dict[str, list[float]]]]] = {}
    for scale, runs in results.items():
        for run in runs:
            for n, r in run["runs"].items():
                for p in r["problems"]:
                    print(f"  !! {scale:g}x, {n} tugs: {p}")
                for name, f in r["figures"].items():
                    m = (
                        merged.setdefault(scale, {})
                        .setdefault(n, {})
                        .setdefault(name, {"wall": [], "cpu": [], "cpu_all": []})
                    )
                    for key in m:
                        m[key] += f[key]
    summary: dict[tuple[float, str, str], dict[str, dict[str, float]]] = {}
    for scale in sorted(merged):
        for n in sorted(merged[scale], key=int):
            figs = merged[scale][n]
            moves = len(figs["bare"]["wall"])
            print(
                f"\n{scale:g}x device pixels, {n} tugs: {moves} moves per subject, "
                f"{args.interval:g} ms apart, ms"
            )
            print(
                f"  {'':12s} {'wall p50':>9s} {'p95':>7s} {'p99':>7s} {'max':>7s}   {'CPU p50':>8s} "
                f"{'p95':>7s} {'p99':>7s}   {'CPU all':>7s}   {'p50 / board':>11s} "
                f"{'p50 / bare':>10s}"
            )
            st = {name: {k: stats(v) for k, v in f.items()} for name, f in figs.items()}
            for name in SUBJECTS:
                if name not in st:  # not measured (--live-tugs)
                    continue
                w, c, a = st[name]["wall"], st[name]["cpu"], st[name]["cpu_all"]
                rb = w["p50"] / st["board"]["wall"]["p50"]
                rr = w["p50"] / st["bare"]["wall"]["p50"]
                rbc = c["p50"] / st["board"]["cpu"]["p50"]
                rrc = c["p50"] / st["bare"]["cpu"]["p50"]
                print(
                    f"  {name:12s} {w['p50']:9.2f} {w['p95']:7.2f} {w['p99']:7.2f} {w['max']:7.1f}   "
                    f"{c['p50']:8.2f} {c['p95']:7.2f} {c['p99']:7.2f}   {a['p50']:7.2f}   "
                    f"{rb:5.2f} {rbc:5.2f} {rr:5.2f} {rrc:5.2f}"
                )
                summary[(scale, n, name)] = st[name]
            print("  (the ratios: wall, then CPU)")
    print()
    targets(summary)


def targets(s: dict[tuple[float, str, str], dict[str, dict[str, float]]]) -> None:
    def get(scale: float, n: str, name: str) -> dict[str, dict[str, float]] | None:
        return s.get((scale, n, name))

    lines = []
    w = get(1.0, "24", "window")
    if w is not None:
        b, bare = get(1.0, "24", "board"), get(1.0, "24", "bare")
        lines.append(
            f"window, 24 tugs: median {w['wall']['p50'] / b['wall']['p50']:.2f}x the board "
            f"(CPU {w['cpu']['p50'] / b['cpu']['p50']:.2f}x; target <= 1.3x), "
            f"{w['wall']['p50'] / bare['wall']['p50']:.2f}x the bare view "
            f"(CPU {w['cpu']['p50'] / bare['cpu']['p50']:.2f}x; target <= 5x), "
            f"p99 {w['wall']['p99']:.1f} ms wall (target < {FRAME_MS:.1f})"
        )
        # what the machine adds to a wall p99 in this run, whatever the code: the bare
        # view's wall p99 over its CPU p99 (the process waiting for a core)
        lines.append(
            f"the machine in this run: the bare view's p99 {bare['wall']['p99']:.1f} ms wall "
            f"against {bare['cpu']['p99']:.1f} ms CPU; the board's {b['wall']['p99']:.1f} "
            f"against {b['cpu']['p99']:.1f}"
        )
    w = get(1.0, "200", "window")
    if w is not None:
        lines.append(
            f"window, 200 tugs: median {w['wall']['p50']:.1f} ms wall, {w['cpu']['p50']:.1f} ms "
            f"CPU (target < {FRAME_MS:.1f})"
        )
    for n in ("24", "200"):
        w = get(1.0, n, "window live")
        if w is not None:
            lines.append(
                f"window live, {n} tugs: p99 {w['wall']['p99']:.1f} ms wall, "
                f"{w['cpu']['p99']:.1f} ms CPU (target < {FRAME_MS:.1f})"
            )
    for n in ("24", "200"):
        for name in ("window", "board", "bare"):
            one, two = get(1.0, n, name), get(2.0, n, name)
            if one is not None and two is not None:
                lines.append(
                    f"2x / 1x, {name}, {n} tugs: median {two['wall']['p50'] / one['wall']['p50']:.2f}"
                    f"x wall, {two['cpu']['p50'] / one['cpu']['p50']:.2f}x CPU (target <= 2x)"
                )
    print("Targets:")
    for line in lines:
        print("  " + line)


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--moves", type=int, default=150, help="moves per burst")
    ap.add_argument("--rounds", type=int, default=3, help="bursts per subject")
    ap.add_argument("--tugs", type=int, nargs="+", default=[24, 200])
    ap.add_argument("--scales", type=float, nargs="+", default=[1.0, 2.0])
    ap.add_argument("--repeats", type=int, default=1, help="processes per scale, alternating")
    ap.add_argument(
        "--live-tugs",
        type=int,
        nargs="*",
        default=None,
        help="drag with live solving on only with these numbers of tugs (default: every --tugs)",
    )
    ap.add_argument("--interval", type=float, default=FRAME_MS, help="ms between moves")
    ap.add_argument(
        "--no-freeze",
        action="store_true",
        help="leave out the program's gc.freeze at start (app.collector), to measure it",
    )
    ap.add_argument("--child", action="store_true", help=argparse.SUPPRESS)
    args = ap.parse_args()
    if args.child:
        child(args)
        return
    print(f"load average at the start: {load()}")
    results: dict[float, list[dict]] = {}
    for _ in range(args.repeats):
        for scale in args.scales:
            env = dict(os.environ, QT_SCALE_FACTOR=f"{scale:g}")
            cmd = [sys.executable, str(Path(__file__).resolve()), "--child"]
            cmd += ["--moves", str(args.moves), "--rounds", str(args.rounds)]
            cmd += ["--interval", str(args.interval), "--tugs", *map(str, args.tugs)]
            if args.live_tugs is not None:
                cmd += ["--live-tugs", *map(str, args.live_tugs)]
            if args.no_freeze:
                cmd += ["--no-freeze"]
            done = subprocess.run(cmd, env=env, capture_output=True, text=True, cwd=ROOT)
            if done.returncode != 0:
                sys.exit(f"the {scale:g}x run failed:\n{done.stderr}")
            line = done.stdout.strip().splitlines()[-1]
            results.setdefault(scale, []).append(json.loads(line))
    report(results, args)
    print(f"load average at the end: {load()}")


if __name__ == "__main__":
    main()
