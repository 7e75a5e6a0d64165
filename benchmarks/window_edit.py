"""An edit in the whole main window, from the change until the window is at rest.

A drag is timed move by move in benchmarks/window_drag.py; this times what follows every
other change (a value typed in a table, an undo, the end of a drag): the controller's
new value, every panel, the board brought in line, its labels placed again, and the
window painted. The edit is a tug's setting changed (as the tugs table would), undone
and redone in turn. "At rest" is the moment the event loop has no short timer left to
run (one under 100 ms: the panels' one-frame updates, the label placing; the delays a
user is meant to see, such as the verdict's, are left out).

Each edit is measured against two baselines in the same run, alternating with it:

- ``repaint``: the whole window repainted at once (``QWidget.repaint``), nothing changed;
- ``labels``: the board's label placing alone (``BoardView.place_labels``), the part of an
  edit that grows fastest with the tugs.

    python benchmarks/window_edit.py [--tugs 24 200] [--rounds 40]
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

SHORT_MS = 100  # a single-shot timer shorter than this is work still to do


def _at_rest(window) -> None:  # type: ignore[no-untyped-def]
    """Run the event loop until no short single-shot timer of the window is pending."""
    from PySide6.QtCore import QTimer
    from PySide6.QtWidgets import QApplication

    timers = window.findChildren(QTimer)
    start = time.perf_counter()
    while True:
        QApplication.processEvents()
        busy = [t for t in timers if t.isActive() and t.isSingleShot() and t.interval() < SHORT_MS]
        if not busy:
            QApplication.processEvents()
            return
        if time.perf_counter() - start > 10:
            raise RuntimeError("the window did not come to rest in 10 s")
        time.sleep(0.0005)


def _timed(fn) -> tuple[float, float]:  # type: ignore[no-untyped-def]
    w0, c0 = time.perf_counter(), time.process_time()
    fn()
    return (time.perf_counter() - w0) * 1000, (time.process_time() - c0) * 1000


def measure(n_tugs: int, rounds: int) -> dict[str, dict[str, list[float]]]:
    from window_drag import WindowSubject

    subject = WindowSubject(n_tugs, live=False)
    window = subject.window
    c = window.controller
    _at_rest(window)
    stage = c.project.stages[0]
    first = stage.placements[0]
    setting = 0.5 if first.setting != 0.5 else 0.6
    edited = replace(stage, placements=(replace(first, setting=setting), *stage.placements[1:]))
    c.apply(replace(c.project, stages=(edited, *c.project.stages[1:])), "Set a pull")
    _at_rest(window)

    def edit() -> None:
        if c.undo_stack.canRedo():
            c.undo_stack.redo()
        else:
            c.undo_stack.undo()
        _at_rest(window)

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
            wall, cpu = _timed(fn)
            out[name]["wall"].append(wall)
            out[name]["cpu"].append(cpu)
    window.close()
    return out


def _p(values: list[float], q: float) -> float:
    s = sorted(values)
    return s[min(len(s) - 1, round(q * (len(s) - 1)))]


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--tugs", type=int, nargs="*", default=[24, 200])
    ap.add_argument("--rounds", type=int, default=40)
    args = ap.parse_args()

    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([])  # noqa: F841 (kept alive)
    print(f"load average at the start: {' '.join(f'{x:.1f}' for x in os.getloadavg())}")
    for n in args.tugs:
        res = measure(n, args.rounds)
        print(f"\n{n} tugs, {args.rounds} rounds, ms")
        print("             wall p50     p95    CPU p50     p95   / repaint (wall, CPU)")
        base_w = statistics.median(res["repaint"]["wall"])
        base_c = statistics.median(res["repaint"]["cpu"])
        for name, r in res.items():
            w50, c50 = statistics.median(r["wall"]), statistics.median(r["cpu"])
            print(
                f"  {name:<9} {w50:8.1f} {_p(r['wall'], 0.95):7.1f}"
                f"    {c50:7.1f} {_p(r['cpu'], 0.95):7.1f}"
                f"   {w50 / base_w:5.1f}x {c50 / base_c:5.1f}x"
            )
        share = statistics.median(res["labels"]["cpu"]) / statistics.median(res["edit"]["cpu"])
        print(f"  the label placing is {share:.0%} of an edit's CPU (medians)")
    print(f"load average at the end: {' '.join(f'{x:.1f}' for x in os.getloadavg())}")


if __name__ == "__main__":
    main()
