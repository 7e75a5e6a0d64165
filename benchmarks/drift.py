"""The drift preview's speed, each figure against a baseline measured in the same run.

1. A 600 s track of a lashed pair (the twin-barge sample's transit: 7500 t, four tugs)
   with one tug lost, in open water (the site's features removed, so the track runs its
   whole length), wind and current as planned. Baselines: the same equations by a
   fixed-step classical Runge-Kutta at 1 s (600 steps), and solve_ivp with the same
   tolerances on a trivial ODE (six states decaying over 200 s) over the same 600 s.
   Target: at most 50 ms median.
2. The same plan on the main window (the site back), dragging a tug round a circle with
   the drift ghosts on (worst tug lost): per move, from the mouse move until the board has
   repainted, every pending event processed. Baseline: the same drag with the ghosts off.
   While a drag goes on the ghosts wait for it to pause (app.board.drift_layer); the time
   of that update is printed as well. Target: within one 60 Hz frame (16.7 ms) median.

    python benchmarks/drift.py [--runs 30] [--moves 200]
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

import numpy as np
from scipy.integrate import solve_ivp

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
os.environ.setdefault("TOWBOARD_RECOVERY_DIR", "/tmp/towboard-bench-recovery")
ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from core.io.projectfile import load  # noqa: E402
from core.model.plan import Site  # noqa: E402
from core.motion.drift import ATOL, RTOL, DriftScenario, solve_drift  # noqa: E402
from core.motion.dynamics import rk4  # noqa: E402
from core.motion.scenarios import drift_setup  # noqa: E402

SAMPLE = ROOT / "sample_projects" / "twin_barge_move.towboard"
STAGE = 2  # the transit: four tugs on the pair
LOST = "Alder"


def _percentile(values: list[float], q: float) -> float:
    s = sorted(values)
    return s[min(len(s) - 1, math.ceil(q * len(s)) - 1)]


def _timed(fn, runs: int) -> list[float]:  # type: ignore[no-untyped-def]
    fn()  # warm up
    out = []
    for _ in range(runs):
        t0 = time.perf_counter()
        fn()
        out.append((time.perf_counter() - t0) * 1000)
    return out


def track_benchmark(runs: int) -> None:
    project = load(SAMPLE)
    project = replace(project, site=Site(project.site.name, ()))
    stage = project.stages[STAGE]
    setup = drift_setup(project, stage)
    problem = setup.problem(DriftScenario("tug_lost", LOST))
    problem = replace(problem, horizon_s=600.0)
    r = solve_drift(problem)
    if r.end_s < 600.0 - 1e-9:
        raise SystemExit(f"the track stopped at {r.end_s:.0f} s")
    f = problem.motion.derivative()
    y0 = problem.motion.start_state(problem.start)
    drift_ms = _timed(lambda: solve_drift(problem), runs)
    rk4_ms = _timed(lambda: rk4(f, y0, 600.0, 1.0), runs)
    atol = np.array(ATOL)

    def trivial():  # type: ignore[no-untyped-def]
        return solve_ivp(
            lambda t, y: -y / 200.0,
            (0.0, 600.0),
            np.ones(6),
            rtol=RTOL,
            atol=atol,
            dense_output=True,
        )

    trivial_ms = _timed(trivial, runs)
    trivial_nfev = trivial().nfev
    setup_ms = _timed(lambda: drift_setup(project, stage), runs)
    med = statistics.median(drift_ms)
    print(
        f"1. 600 s track, lashed pair, {len(setup.tugs)} tugs, {LOST} lost "
        f"({r.evaluations} evaluations, {len(r.times)} samples):"
    )
    print(
        f"   drift (solve_ivp RK45 + contact search): median {med:.1f} ms, p99 {_percentile(drift_ms, 0.99):.1f} ms   target 50 ms"
    )
    for name, base in (
        ("fixed-step RK4 at 1 s, same equations", rk4_ms),
        (f"bare solve_ivp, dy/dt = -y / 200 s ({trivial_nfev} evaluations)", trivial_ms),
    ):
        b = statistics.median(base)
        print(f"   baseline {name}: median {b:.1f} ms; drift / baseline = {med / b:.2f}")
    print(f"   (setting the problem up: median {statistics.median(setup_ms):.1f} ms, once a stage)")


def drag_benchmark(moves: int) -> None:
    from PySide6.QtCore import QEvent, QPointF, Qt
    from PySide6.QtWidgets import QApplication

    sys.path.insert(0, str(ROOT / "benchmarks"))
    from drag import _send  # the drag benchmark's synthetic mouse events

    app = QApplication.instance() or QApplication([])
    from app.window.main_window import MainWindow

    def run(ghosts: bool) -> tuple[list[float], float | None]:
        w = MainWindow(load(SAMPLE))
        w.resize(1400, 900)
        w.show()
        w.controller.set_stage_index(STAGE)
        ui = w.drift_ui  # type: ignore[attr-defined]
        ui.act_drift.setChecked(ghosts)
        for _ in range(3):
            app.processEvents()
        w.view.fit_to_hull()
        app.processEvents()
        view, controller = w.view, w.controller
        vp = view.viewport()
        r = controller.results()["Lark pair"]
        i = next(k for k in range(len(r.layout.placements)) if not r.layout.is_push[k])
        start = view.mapFromScene(QPointF(*_site(controller, r.layout.positions[i])))
        _send(
            vp,
            QEvent.Type.MouseButtonPress,
            QPointF(start),
            Qt.MouseButton.LeftButton,
            Qt.MouseButton.LeftButton,
        )
        times = []
        for k in range(moves):
            a = 2 * math.pi * k / moves
            pt = QPointF(start) + QPointF(60 * math.sin(a), 40 * (1 - math.cos(a)))
            t0 = time.perf_counter()
            _send(vp, QEvent.Type.MouseMove, pt, Qt.MouseButton.NoButton, Qt.MouseButton.LeftButton)
            vp.repaint()
            app.processEvents()
            times.append((time.perf_counter() - t0) * 1000)
        pause = None
        if ghosts:  # the drag pauses: the ghosts catch up
            t0 = time.perf_counter()
            ui.layer._timer.stop()
            ui.layer._update_now()
            vp.repaint()
            pause = (time.perf_counter() - t0) * 1000
        _send(
            vp,
            QEvent.Type.MouseButtonRelease,
            pt,
            Qt.MouseButton.LeftButton,
            Qt.MouseButton.NoButton,
        )
        controller.undo_stack.setClean()
        w.close()
        return times, pause

    # Alternated, so a change in the machine's load falls on both alike.
    off, on, pause = [], [], None
    for _ in range(2):
        off += run(False)[0]
        times, pause = run(True)
        on += times
    m_on, m_off = statistics.median(on), statistics.median(off)
    print(
        f"2. dragging a tug of the pair, {moves} moves, board repainted and every event processed:"
    )
    print(
        f"   ghosts on: median {m_on:.2f} ms, p99 {_percentile(on, 0.99):.2f} ms   target 16.7 ms"
    )
    print(
        f"   baseline, ghosts off: median {m_off:.2f} ms, p99 {_percentile(off, 0.99):.2f} ms; on / off = {m_on / m_off:.2f}"
    )
    if pause is not None:
        print(
            f"   when the drag pauses, the ghosts (worst of 4 tugs lost) catch up in {pause:.0f} ms"
        )


def _site(controller, p):  # type: ignore[no-untyped-def]
    from core.mechanics.site import Placing, body_pose

    pose = body_pose(controller.project, controller.stage, "Lark pair")
    return Placing.of(pose).point((float(p[0]), float(p[1])))


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--runs", type=int, default=30)
    ap.add_argument("--moves", type=int, default=200)
    args = ap.parse_args()
    track_benchmark(args.runs)
    drag_benchmark(args.moves)


if __name__ == "__main__":
    main()
