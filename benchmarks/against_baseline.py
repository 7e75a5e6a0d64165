"""Today's figures as ratios against an earlier commit, both measured in one run.

The earlier commit is checked out into a temporary git worktree; each measurement runs in
a fresh child process for one tree at a time, alternating old and new, several rounds, so
both see the same machine load. The measurements are written once, here, and import the
project's modules under either layout (``core.model.plan`` or the older ``core.plan``),
so the same work is timed in both trees:

- drag: a tug dragged on the board alone, 24 and 200 tugs (median and p99 per move,
  from the mouse move until the board has repainted);
- live drag: the same in the whole main window with live solving on (24 tugs, goal hold);
- hold limits: the sweep of the deck barge sample's first stage, problem building included;
- briefing: the twin barge sample's PDF;
- load: a plan of 10,000 tugs each placed once (benchmarks/growth.py's), and the same plan
  as the program saves it (each tug with its capability and headway rows), each as a
  ratio against ``json.loads`` of the same text, the two alternated in the same process.

The samples are read from the earlier commit's files, which both trees can read.

    python benchmarks/against_baseline.py [--base cf70e04] [--rounds 3] [--moves 200]

Prints, per figure, the median over rounds for each tree and new / old.
"""

from __future__ import annotations

import argparse
import json
import math
import os
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


# -- the child: measure in the tree on sys.path[0] -----------------------------------------


def _imports() -> dict[str, object]:
    """The modules the measurements need, under either layout."""
    import importlib

    def first(*names: str) -> object:
        for n in names:
            try:
                return importlib.import_module(n)
            except ImportError:
                continue
        raise ImportError(names[0])

    return {
        "hull": first("core.model.hull", "core.hull"),
        "outlines": first("core.model.outlines", "core.outlines"),
        "plan": first("core.model.plan", "core.plan"),
        "tugs": first("core.model.tugs", "core.tugs"),
        "goals": first("core.model.goals", "core.goals"),
        "projectfile": first("core.io.projectfile", "core.projectfile"),
        "holdlimits": first("core.solve.holdlimits", "core.holdlimits"),
        "window": first("app.window.main_window", "app.main_window"),
        "briefing": first("app.briefing.document", "app.briefing"),
    }


def _project(m: dict, n_tugs: int, goal: bool) -> object:  # type: ignore[type-arg]
    hull_m, plan, tugs_m = m["hull"], m["plan"], m["tugs"]
    tf = 9806.65
    length, beam = 200.0, 48.0
    outline = m["outlines"].raked_outline(length, beam, 20.0, 10.0, 0.7)
    bare = hull_m.Hull("Bench barge", outline)
    fittings, tugs, placements = [], [], []
    for i in range(n_tugs):
        q = bare.geometry.point_at((i + 0.5) / n_tugs * bare.geometry.perimeter)
        kind = "push" if i % 3 == 2 else "line"
        name = f"P{i:03d}"
        fittings.append(hull_m.Fitting(name, kind, q.x, q.y))
        tugs.append(tugs_m.Tug(f"Tug {i:03d}", (30 + i % 50) * tf))
        out = math.atan2(q.normal[1], q.normal[0])
        placements.append(
            tugs_m.Placement(
                f"Tug {i:03d}",
                bare.name,
                name,
                setting=0.3 + 0.5 * ((i * 37) % 11) / 10,
                lead_rad=out if kind == "line" else 0.0,
                line_length_m=35.0,
            )
        )
    hull = hull_m.Hull(bare.name, outline, fittings=tuple(fittings))
    stage = plan.Stage(
        "Bench",
        poses=(plan.BodyPose(hull.name, 0.0, 0.0, 90.0),),
        placements=tuple(placements),
        goal=m["goals"].Goal("hold") if goal else None,
    )
    return plan.Project(name="Bench", hulls=(hull,), tugs=tuple(tugs), stages=(stage,))


def _drag(m: dict, n_tugs: int, moves: int, live: bool) -> dict[str, float]:  # type: ignore[type-arg]
    from PySide6.QtCore import QEvent, QPointF, Qt
    from PySide6.QtGui import QMouseEvent
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([])
    project = _project(m, n_tugs, goal=live)
    if live:
        w = m["window"].MainWindow(project)
        w.resize(1400, 900)
        w.show()
        w.solve_ui.set_live(True)
        view, controller = w.view, w.controller
    else:
        from app.board.scene import BoardScene
        from app.board.view import BoardView
        from app.controller import Controller

        controller = Controller(project)
        view = BoardView(BoardScene(controller))
        view.resize(1100, 800)
        view.show()
        w = view
    app.processEvents()
    view.fit_to_hull()
    app.processEvents()
    vp = view.viewport()

    def send(
        kind: QEvent.Type, pt: QPointF, button: Qt.MouseButton, buttons: Qt.MouseButton
    ) -> None:
        global_pt = QPointF(vp.mapToGlobal(pt.toPoint()))
        ev = QMouseEvent(kind, pt, global_pt, button, buttons, Qt.KeyboardModifier.NoModifier)
        QApplication.sendEvent(vp, ev)

    r = controller.results()["Bench barge"]
    i = next(k for k in range(len(r.layout.placements)) if not r.layout.is_push[k])
    start = QPointF(view.mapFromScene(QPointF(*r.layout.positions[i])))
    left, none = Qt.MouseButton.LeftButton, Qt.MouseButton.NoButton
    send(QEvent.Type.MouseButtonPress, start, left, left)
    times = []
    pt = start
    for k in range(moves):
        a = 2 * math.pi * k / moves
        pt = start + QPointF(80 * math.sin(a), 60 * (1 - math.cos(a)))
        t0 = time.perf_counter()
        send(QEvent.Type.MouseMove, pt, none, left)
        vp.repaint()
        times.append((time.perf_counter() - t0) * 1000)
    send(QEvent.Type.MouseButtonRelease, pt, left, none)
    controller.undo_stack.clear()
    w.close()
    times.sort()
    return {
        "median_ms": statistics.median(times),
        "p99_ms": times[math.ceil(0.99 * len(times)) - 1],
    }


def _hold_limits(m: dict, base: Path) -> dict[str, float]:  # type: ignore[type-arg]
    project = m["projectfile"].load(base / "sample_projects" / "deck_barge_unberth.towboard")
    stage = project.stages[0]
    body = project.body_names()[0]
    hl = m["holdlimits"]
    times = []
    for _ in range(30):
        t0 = time.perf_counter()
        hl.hold_limits(hl.hold_limits_problem(project, stage, body))
        times.append((time.perf_counter() - t0) * 1000)
    return {"median_ms": statistics.median(times)}


def _briefing(m: dict, base: Path) -> dict[str, float]:  # type: ignore[type-arg]
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([])
    project = m["projectfile"].load(base / "sample_projects" / "twin_barge_move.towboard")
    times = []
    with tempfile.TemporaryDirectory() as d:
        for _ in range(3):
            t0 = time.perf_counter()
            m["briefing"].write_pdf(project, Path(d) / "plan.pdf")
            times.append((time.perf_counter() - t0) * 1000)
    del app
    return {"median_ms": statistics.median(times)}


def _load(m: dict, text: str, repeats: int) -> dict[str, float]:  # type: ignore[type-arg]
    """Loading ``text`` against ``json.loads`` of the same text, alternated (which goes
    first swaps on each repeat): medians of ``repeats`` each, their ratio, and the
    ratio of the least of each."""
    loads = m["projectfile"].loads
    loads(text)  # the first load fills the name rules' caches; it is timed apart below
    took: dict[str, list[float]] = {"load": [], "json": []}
    runs = [("json", lambda: json.loads(text)), ("load", lambda: loads(text))]
    for k in range(repeats):
        for name, fn in runs if k % 2 else runs[::-1]:
            t0 = time.perf_counter()
            fn()
            took[name].append((time.perf_counter() - t0) * 1000)
    load, js = statistics.median(took["load"]), statistics.median(took["json"])
    # The medians follow the machine's load (Python code suffers more from a busy machine
    # than json's C); the least of each is the one least disturbed.
    least = min(took["load"]) / min(took["json"])
    return {"load_ms": load, "json_ms": js, "load/json": load / js, "least l/j": least}


def _first_load(m: dict, text: str) -> dict[str, float]:  # type: ignore[type-arg]
    """The first load in a fresh process (no name checked and cached yet), against the
    json.loads of the same text just before it (the first in the process too)."""
    t0 = time.perf_counter()
    json.loads(text)
    js = (time.perf_counter() - t0) * 1000
    t0 = time.perf_counter()
    m["projectfile"].loads(text)
    load = (time.perf_counter() - t0) * 1000
    return {"load_ms": load, "json_ms": js, "load/json": load / js}


def measure(what: str, moves: int, base: Path) -> dict[str, float]:
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    m = _imports()
    if what == "drag 24 tugs":
        return _drag(m, 24, moves, live=False)
    if what == "drag 200 tugs":
        return _drag(m, 200, moves, live=False)
    if what == "live drag 24 tugs":
        return _drag(m, 24, moves, live=True)
    if what == "hold limits":
        return _hold_limits(m, base)
    if what.startswith("load"):
        texts = base.parent / "texts"
        if what == "load 10,000 tugs":
            return _load(m, (texts / "plain.json").read_text(), 15)
        if what == "load 10,000 first":
            return _first_load(m, (texts / "plain.json").read_text())
        return _load(m, (texts / "saved.json").read_text(), 5)
    return _briefing(m, base)


# -- the parent: check out, alternate, compare ---------------------------------------------

FIGURES = (
    "drag 24 tugs",
    "drag 200 tugs",
    "live drag 24 tugs",
    "hold limits",
    "briefing",
    "load 10,000 tugs",
    "load 10,000 first",
    "load 10,000 saved",
)


def _write_texts(scratch: Path) -> None:
    """The plans the load figures read, written once for both trees (the saved one as this
    tree writes it, which the earlier commit reads as well)."""
    sys.path.insert(0, str(ROOT))
    sys.path.insert(0, str(ROOT / "benchmarks"))
    from growth import placements_text

    from core.io.projectfile import dumps, loads

    texts = scratch / "texts"
    texts.mkdir()
    plain = placements_text(10_000)
    (texts / "plain.json").write_text(plain)
    (texts / "saved.json").write_text(dumps(loads(plain)))


def _run(tree: Path, what: str, moves: int, base: Path, scratch: Path) -> dict[str, float]:
    env = dict(
        os.environ,
        PYTHONPATH=str(tree),
        QT_QPA_PLATFORM="offscreen",
        TOWBOARD_RECOVERY_DIR=str(scratch / "recovery"),
        TOWBOARD_SETTINGS_FILE=str(scratch / "settings.ini"),
    )
    code = (
        "import json, sys; sys.path.insert(0, sys.argv[1]); "
        f"sys.path.insert(0, {str(ROOT / 'benchmarks')!r}); "
        "import against_baseline as b; "
        "print(json.dumps(b.measure(sys.argv[2], int(sys.argv[3]), __import__('pathlib').Path(sys.argv[4]))))"
    )
    done = subprocess.run(
        [sys.executable, "-c", code, str(tree), what, str(moves), str(base)],
        cwd=tree,
        env=env,
        capture_output=True,
        text=True,
        timeout=1800,
    )
    if done.returncode != 0:
        raise SystemExit(f"{what} in {tree}: {done.stderr.strip().splitlines()[-1:]}")
    return json.loads(done.stdout.strip().splitlines()[-1])


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--base", default="cf70e04", help="the earlier commit (default cf70e04)")
    ap.add_argument("--rounds", type=int, default=3)
    ap.add_argument("--moves", type=int, default=200)
    ap.add_argument("--only", nargs="*", choices=FIGURES, default=list(FIGURES))
    args = ap.parse_args()
    scratch = Path(tempfile.mkdtemp(prefix="towboard-baseline-"))
    base = scratch / "base"
    subprocess.run(
        ["git", "-C", str(ROOT), "worktree", "add", "--detach", "-q", str(base), args.base],
        check=True,
    )
    try:
        if any(what.startswith("load") for what in args.only):
            _write_texts(scratch)
        got: dict[tuple[str, str], list[dict[str, float]]] = {}
        before = os.getloadavg()[0]
        for k in range(args.rounds):
            for what in args.only:
                trees = [("old", base), ("new", ROOT)]
                if k % 2:
                    trees.reverse()
                for label, tree in trees:
                    got.setdefault((what, label), []).append(
                        _run(tree, what, args.moves, base, scratch)
                    )
        load = os.getloadavg()
        print(
            f"{args.rounds} rounds, alternating; load average {before:.1f} before, now "
            f"{load[0]:.1f} (1 min), {load[1]:.1f} (5 min)"
        )
        print(f"{'figure':<22}{'measure':<11}{'old':>10}{'new':>10}{'new/old':>9}")
        for what in args.only:
            for key in got[(what, "old")][0]:
                old = statistics.median(r[key] for r in got[(what, "old")])
                new = statistics.median(r[key] for r in got[(what, "new")])
                print(f"{what:<22}{key:<11}{old:>10.2f}{new:>10.2f}{new / old:>9.2f}")
    finally:
        subprocess.run(["git", "-C", str(ROOT), "worktree", "remove", "--force", str(base)])
        shutil.rmtree(scratch, ignore_errors=True)


if __name__ == "__main__":
    main()
