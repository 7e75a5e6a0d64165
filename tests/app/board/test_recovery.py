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
