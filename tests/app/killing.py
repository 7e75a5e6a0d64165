"""A session editing and saving, killed at random: what must survive it.

:func:`child` is a Towboard session without a window (the controller, the recovery writer
and the file saves of the real program) that edits the plan every 30-150 ms, saves now
and then, and writes a journal line after each edit: the edit's number and when it was
made. :func:`kill_round` starts it, kills it with SIGKILL at a random moment and checks
what is left: the saved file and its backup load, every recovery file loads, and the work
on offer (the saved file or the recovery file, whichever is newer) holds every edit made
more than :data:`LOSS_LIMIT_S` before the kill. Used by tests/app/test_kill_saves.py (a
few rounds) and benchmarks/kill_saves.py (hundreds).
"""

from __future__ import annotations

import os
import random
import re
import signal
import subprocess
import sys
import time
from dataclasses import dataclass, replace
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
SAMPLE = ROOT / "sample_projects" / "deck_barge_unberth.towboard"
#: At most this much work may be lost to a kill, s.
LOSS_LIMIT_S = 1.0
_EDIT = re.compile(r"edit (\d+)")


def child(folder: str, seed: int) -> None:
    """Edit, save now and then, journal every edit; run until killed."""
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    from PySide6.QtCore import QCoreApplication

    app = QCoreApplication([])
    from app.controller import Controller
    from app.window.recovery import RecoveryWriter
    from core.io.projectfile import load, save

    base = Path(folder)
    rnd = random.Random(seed)
    path = base / "plan.towboard"
    controller = Controller(load(SAMPLE))
    RecoveryWriter(controller, base / "recovery")
    save(controller.project, path)
    controller.mark_saved(path)
    with (base / "journal.txt").open("a", buffering=1) as journal:
        k = 0
        while True:
            k += 1
            project = controller.project
            stage = project.stages[0]
            tug = stage.placements[k % len(stage.placements)]
            stage = stage.with_placement(tug.with_setting(rnd.randrange(101) / 100))
            controller.apply(replace(project.with_stage(stage, 0), notes=f"edit {k}"), "edit")
            journal.write(f"{k} {time.monotonic():.6f}\n")
            if rnd.random() < 0.08:
                save(controller.project, path)
                controller.mark_saved(path)
            end = time.monotonic() + rnd.uniform(0.03, 0.15)
            while time.monotonic() < end:
                app.processEvents()
                time.sleep(0.004)


def edit_number(text: str) -> int:
    """The number of the last edit a plan's notes record (0: none)."""
    m = _EDIT.search(text)
    return int(m.group(1)) if m else 0


@dataclass(frozen=True)
class Round:
    """What one kill left: the edits made, the work on offer and how much was lost."""

    edits: int  # edits journaled before the kill
    saved: int  # the last edit in the saved file
    recovered: int  # the last edit in the newest recovery file (0: none)
    lost_s: float  # how long before the kill the first edit not on offer was made (0: none)
    files: int  # files checked to load


def kill_round(folder: Path, rnd: random.Random) -> Round:
    """Run the child in ``folder``, kill it at a random moment, check what it left.

    Raises AssertionError if a file does not load or more than a second of work is lost.
    """
    from core.io.projectfile import backup_path, load

    folder.mkdir(parents=True, exist_ok=True)
    journal = folder / "journal.txt"
    journal.write_text("")
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen", PYTHONPATH=str(ROOT))
    code = f"from tests.app.killing import child; child({str(folder)!r}, {rnd.randrange(10**6)})"
    with (folder / "stderr.txt").open("w") as err:
        proc = subprocess.Popen([sys.executable, "-c", code], cwd=ROOT, env=env, stderr=err)
    try:
        deadline = time.monotonic() + 60
        while not journal.read_text() and time.monotonic() < deadline and proc.poll() is None:
            time.sleep(0.02)
        time.sleep(rnd.uniform(0.0, 2.5))
        killed_at = time.monotonic()
    finally:
        os.kill(proc.pid, signal.SIGKILL)
        proc.wait(timeout=30)
    assert proc.returncode == -signal.SIGKILL, (folder / "stderr.txt").read_text()
    return _check(folder, killed_at, load, backup_path)


def _check(folder: Path, killed_at: float, load, backup_path) -> Round:  # type: ignore[no-untyped-def]
    from app.window.recovery import find_orphans

    made = [
        (int(k), float(t))
        for k, t in (line.split() for line in (folder / "journal.txt").read_text().splitlines())
    ]
    plan = folder / "plan.towboard"
    files = 0
    saved = 0
    if plan.exists():
        saved = edit_number(load(plan).notes)  # must load: a save is atomic
        files += 1
    if backup_path(plan).exists():
        load(backup_path(plan))
        files += 1
    orphans = find_orphans(folder / "recovery")
    recovered = 0
    for o in orphans:
        recovered = max(recovered, edit_number(o.project().notes))
        files += 1
        o.discard()
    offered = max(saved, recovered)
    missing = [t for k, t in made if k > offered]
    lost = killed_at - min(missing) if missing else 0.0
    assert lost <= LOSS_LIMIT_S, (
        f"edit {offered + 1} was made {lost:.2f} s before the kill and is not on offer "
        f"(saved {saved}, recovered {recovered}, made {len(made)})"
    )
    leftovers = sorted(p.name for p in (folder / "recovery").iterdir() if p.suffix == ".lock")
    assert not leftovers, f"stale locks left: {leftovers}"
    return Round(len(made), saved, recovered, max(lost, 0.0), files)
