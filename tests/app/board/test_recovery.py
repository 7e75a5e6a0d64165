"""Nothing lost to a kill: a killed session's last edit is offered at the next start."""

from __future__ import annotations

import os
import signal
import subprocess
import sys
import textwrap
from pathlib import Path

from PySide6.QtWidgets import QMessageBox

from core.io.projectfile import load
from tests.app.board.conftest import SAMPLE
from tests.conftest import ROOT

CHILD = textwrap.dedent(
    """
    import time
    from PySide6.QtCore import Qt
    from PySide6.QtWidgets import QApplication
    app = QApplication([])
    from app.window.main_window import MainWindow, SAMPLE
    from app.panels.tugs_model import KEYS
    from core.io.projectfile import dumps
    w = MainWindow()
    w.show()
    w.open_path(SAMPLE, ask=False)
    model = w.tugs_panel.model
    model.setData(model.index(model.row_of("Gannet"), KEYS.index("setting")), "62", Qt.ItemDataRole.EditRole)
    for _ in range(3):
        w.board.interaction.step_setting("Puffin", 0.01)
    want = dumps(w.controller.project)
    deadline = time.time() + 30
    while time.time() < deadline:
        app.processEvents()
        if w.recovery.path.exists() and w.recovery.path.read_text(encoding="utf-8") == want:
            break
        time.sleep(0.02)
    print("READY", flush=True)
    app.exec()
    """
)


def test_a_killed_session_is_restored_to_its_last_edit(qtbot, isolated: Path, dialogs) -> None:  # type: ignore[no-untyped-def]
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen", PYTHONPATH=str(ROOT))
    err = isolated / "child-stderr.txt"
    with (
        err.open("w") as err_file,
        subprocess.Popen(
            [sys.executable, "-c", CHILD],
            cwd=ROOT,
            env=env,
            stdout=subprocess.PIPE,
            stderr=err_file,
            text=True,
        ) as child,
    ):
        try:
            line = child.stdout.readline()
            assert line.strip() == "READY", err.read_text()
        finally:
            os.kill(child.pid, signal.SIGKILL)  # mid-session: no chance to clean up
            child.wait(timeout=30)
    assert child.returncode == -signal.SIGKILL
    # the edits the child made, done here with the core alone
    expected = load(SAMPLE)
    stage = expected.stages[0]
    stage = stage.with_placement(stage.placement("Gannet").with_setting(0.62))
    puffin = stage.placement("Puffin").setting
    for _ in range(3):  # three steps of 1 %, each kept to 0.1 % as the board does
        puffin = round((puffin + 0.01) * 1000) / 1000
    stage = stage.with_placement(stage.placement("Puffin").with_setting(puffin))
    expected = expected.with_stage(stage, 0)

    from app.window.main_window import MainWindow

    dialogs.answer = QMessageBox.StandardButton.Yes
    w = MainWindow()
    qtbot.addWidget(w)
    assert w.offer_recovery()
    assert any("Restore" in s for s in dialogs.shown)
    assert w.controller.project == expected
    assert w.controller.dirty  # restored work is not saved work
    assert w.controller.path == SAMPLE
    # offered once: the orphan is gone, and this window's own file is not an orphan
    from app.window.recovery import find_orphans

    assert find_orphans(w.recovery.folder) == []
    w.controller.undo_stack.setClean()


def test_a_clean_close_leaves_nothing_to_recover(qtbot, dialogs) -> None:  # type: ignore[no-untyped-def]
    from app.window.main_window import MainWindow
    from app.window.recovery import find_orphans

    w = MainWindow()
    qtbot.addWidget(w)
    w.open_path(SAMPLE, ask=False)
    w.board.interaction.step_setting("Gannet", 0.05)
    w.recovery.write_now()
    assert w.recovery.path.exists()
    w.controller.undo_stack.setClean()
    w.close()
    assert not w.recovery.path.exists()
    assert find_orphans(w.recovery.folder) == []


def test_a_burst_of_edits_is_written_by_its_deadline(qtbot, isolated: Path) -> None:  # type: ignore[no-untyped-def]
    """Edits closer together than the pause never let the pause timer fire; the deadline,
    started by the burst's first edit and never restarted, writes anyway."""
    from app.controller import Controller
    from app.window.recovery import DEADLINE_MS, DELAY_MS, RecoveryWriter

    c = Controller(load(SAMPLE))
    writer = RecoveryWriter(c, isolated / "burst")

    def edit(k: int) -> None:
        stage = c.project.stages[0]
        tug = stage.placements[0]
        c.apply(c.with_stage(stage.with_placement(tug.with_setting(k / 100))), "edit")

    edit(1)
    left = writer._deadline.remainingTime()
    assert 0 < left <= DEADLINE_MS + 10 and DEADLINE_MS < 1000  # under a second behind
    for k in range(2, 5):
        writes = writer.writes
        qtbot.wait(20)
        edit(k)
        assert writer._timer.remainingTime() > DELAY_MS * 0.8  # the pause timer restarts
        now = writer._deadline.remainingTime()
        if writer.writes == writes:  # (on a slow machine the deadline may have come)
            assert 0 <= now < left  # the deadline does not restart
        left = now
    k = 5
    while not writer.writes and k < 200:  # keep editing, never pausing
        qtbot.wait(20)
        edit(k)
        k += 1
    assert writer.writes, "a burst of edits was never written"
    assert edit_of(writer.path) >= 1
    writer.close()


def edit_of(path: Path) -> int:
    """How many of the burst's edits the recovery file holds (its first tug's setting)."""
    return round(load(path).stages[0].placements[0].setting * 100)


def test_stale_locks_of_killed_windows_are_cleared(isolated: Path) -> None:
    """A window killed with nothing unsaved leaves only its lock; the next start clears it,
    and keeps the lock of a window still running."""
    from PySide6.QtCore import QLockFile, QSysInfo

    from app.window.recovery import find_orphans

    folder = isolated / "locks"
    folder.mkdir()
    dead = folder / "session-1-1.lock"
    # a lock file as a killed process leaves it: a PID no process has
    dead.write_text(f"4194303\nTowboard\n{QSysInfo.machineHostName()}\n")
    live = QLockFile(str(folder / "session-2-2.lock"))
    assert live.tryLock(0)
    (folder / "session-3-3.json").write_text("{}")  # the notes of a recovery file now gone
    assert find_orphans(folder) == []
    names = sorted(p.name for p in folder.iterdir())
    assert names == ["session-2-2.lock"]
    live.unlock()


def test_recovery_files_are_private(qtbot, isolated: Path) -> None:  # type: ignore[no-untyped-def]
    import stat

    from app.controller import Controller
    from app.window.recovery import RecoveryWriter

    c = Controller(load(SAMPLE))
    writer = RecoveryWriter(c, isolated / "private")
    stage = c.project.stages[0]
    c.apply(c.with_stage(stage.with_placement(stage.placements[0].with_setting(0.3))), "edit")
    writer.write_now()
    assert stat.S_IMODE(writer.path.stat().st_mode) == 0o600
    writer.close()
