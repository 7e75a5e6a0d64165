"""An edit in the whole main window: until the window answers, and all the work it sets off.

A drag is timed move by move in benchmarks/window_drag.py; this times what follows every
other change (a value typed in a table, an undo, the end of a drag): the controller's
new value, every panel, the board brought in line, its labels placed again, the window
painted, and the work the window leaves for a moment later (the stage's checks after
150 ms, the recovery file after 300-500 ms, the verdict's delay). The edit is a tug's
setting changed (as the tugs table would), undone and redone in turn. Two figures:

- ``answer``, wall clock: until the event loop has run everything due at once and has
  no timer under 100 ms left (the panels' one-frame updates, the label placing);
- ``all work``, CPU: until no single-shot timer of the window is left at all. The loop
  sleeps until each later timer is due, so this is the work, not the waits.

Each edit is measured against two baselines in the same run, alternating with it:

- ``repaint``: the whole window repainted at once (``QWidget.repaint``), nothing changed;
- ``labels``: the board's label placing alone (``BoardView.place_labels``), the part of an
  edit that grows fastest with the tugs.

    python benchmarks/window_edit.py [--tugs 24 200] [--rounds 20]
"""

from __future__ import annotations

import argparse
import os
import statistics
import sys
import time
from dataclasses import replace
from pathlib import Path

HERE = Path(__file__).resolve().parent
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
os.environ.setdefault("TOWBOARD_RECOVERY_DIR", "/tmp/towboard-bench-recovery")
sys.path.insert(0, str(HERE))
if str(HERE.parent) not in sys.path:
    sys.path.insert(1, str(HERE.parent))

SHORT_MS = 100  # a single-shot timer shorter than this is work due at once


def _run_out(window) -> float:  # type: ignore[no-untyped-def]
    """Run the event loop until no single-shot timer of the window is left; returns the
    wall time, ms, until none under SHORT_MS was left (the window has answered)."""
    from PySide6.QtCore import QTimer
    from PySide6.QtWidgets import QApplication

    timers = [t for t in window.findChildren(QTimer) if t.isSingleShot()]
    start = time.perf_counter()
    answered = None
    QApplication.processEvents()
    while True:
        pending = [t for t in timers if t.isActive()]
        if answered is None and not any(t.interval() < SHORT_MS for t in pending):
            QApplication.processEvents()  # what they posted
            answered = (time.perf_counter() - start) * 1000
            pending = [t for t in timers if t.isActive()]
        if not pending:
            return answered
        if time.perf_counter() - start > 10:
            raise RuntimeError("the window's timers did not run out in 10 s")
        # asleep until the next timer is due: no polling in the CPU figure
        due_ms = min(max(t.remainingTime(), 0) for t in pending)
        time.sleep(due_ms / 1000 + 0.0005)
        QApplication.processEvents()


def measure(n_tugs: int, rounds: int) -> dict[str, dict[str, list[float]]]:
    from window_drag import WindowSubject

    subject = WindowSubject(n_tugs, live=False)
    window = subject.window
    c = window.controller
    _run_out(window)
    stage = c.project.stages[0]
    first = stage.placements[0]
    setting = 0.5 if first.setting != 0.5 else 0.6
    edited = replace(stage, placements=(replace(first, setting=setting), *stage.placements[1:]))
    c.apply(replace(c.project, stages=(edited, *c.project.stages[1:])), "Set a pull")
    _run_out(window)

    def edit() -> float:
        if c.undo_stack.canRedo():
            c.undo_stack.redo()
        else:
            c.undo_stack.undo()
        return _run_out(window)

    def repaint() -> None:
        window.repaint()

    def labels() -> None:
        window.view.place_labels()

    out: dict[str, dict[str, list[float]]] = {
        k: {"wall": [], "cpu": []} for k in ("edit", "repaint", "labels")
    }
    for _ in range(3):  # warm-up
        edit()
    for r in range(rounds):
        order = [("edit", edit), ("repaint", repaint), ("labels", labels)]
        order = order[r % 3 :] + order[: r % 3]
        for name, fn in order:
            w0, c0 = time.perf_counter(), time.process_time()
            answered = fn()
            cpu = (time.process_time() - c0) * 1000
            wall = answered if answered is not None else (time.perf_counter() - w0) * 1000
            out[name]["wall"].append(wall)
            out[name]["cpu"].append(cpu)
    c.undo_stack.setClean()  # an odd number of edits leaves it changed: no question
    window.close()
    return out


def main() -> None:
    from window_drag import pct

    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--tugs", type=int, nargs="*", default=[24, 200])
    ap.add_argument("--rounds", type=int, default=20)
    args = ap.parse_args()

    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([])  # noqa: F841 (kept alive)
    print(f"load average at the start: {' '.join(f'{x:.1f}' for x in os.getloadavg())}")
    for n in args.tugs:
        res = measure(n, args.rounds)
        print(f"\n{n} tugs, {args.rounds} rounds, ms")
        print("             wall p50     p95    CPU p50     p95   CPU / repaint")
        base = statistics.median(res["repaint"]["cpu"])
        for name, r in res.items():
            c50 = statistics.median(r["cpu"])
            print(
                f"  {name:<9} {statistics.median(r['wall']):8.1f} {pct(r['wall'], 0.95):7.1f}"
                f"    {c50:7.1f} {pct(r['cpu'], 0.95):7.1f}   {c50 / base:5.1f}x"
            )
        share = statistics.median(res["labels"]["cpu"]) / statistics.median(res["edit"]["cpu"])
        print("  (an edit's wall: until the window answers; its CPU: all the work it sets off)")
        print(f"  the label placing alone is {share:.0%} of an edit's CPU (medians)")
    print(f"load average at the end: {' '.join(f'{x:.1f}' for x in os.getloadavg())}")


if __name__ == "__main__":
    main()
