"""The plan details dialog: the title block typed with real keys and clicks, one undo step."""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt
from PySide6.QtPrintSupport import QPrintPreviewDialog
from PySide6.QtWidgets import QDialog, QMessageBox, QToolBar

from app.window.main_window import MainWindow
from app.window.plan_details import PlanDetailsDialog
from core.io.projectfile import load
from core.model.plan import Revision
from tests.conftest import SAMPLES

TWIN = SAMPLES / "twin_barge_move.towboard"


@pytest.fixture
def window(qtbot, tmp_path, monkeypatch):  # type: ignore[no-untyped-def]
    monkeypatch.setenv("TOWBOARD_SETTINGS_FILE", str(tmp_path / "settings.ini"))
    monkeypatch.setenv("TOWBOARD_RECOVERY_DIR", str(tmp_path / "recovery"))
    w = MainWindow(load(TWIN), TWIN)
    qtbot.addWidget(w)
    w.show()
    # pytest-qt closes the window before this fixture ends: leave nothing to ask about
    discard = QMessageBox.StandardButton.Discard
    monkeypatch.setattr(QMessageBox, "question", staticmethod(lambda *a, **k: discard))
    yield w


def retype(qtbot, edit, text: str) -> None:  # type: ignore[no-untyped-def]
    """Select all in a line edit and type ``text`` over it, key by key."""
    edit.setFocus()
    qtbot.keyClick(edit, Qt.Key.Key_A, Qt.KeyboardModifier.ControlModifier)
    qtbot.keyClicks(edit, text)


def opened(window) -> PlanDetailsDialog:  # type: ignore[no-untyped-def]
    window.plan_ui.act_details.trigger()
    dialogs = [d for d in window.findChildren(PlanDetailsDialog) if d.isVisible()]
    assert len(dialogs) == 1
    return dialogs[0]


def test_the_plan_menu_opens_the_dialog_filled_from_the_plan(window) -> None:
    assert "Plan &details…" in [a.text() for a in window.menu("plan").actions()]
    d = opened(window)
    p = window.controller.project
    assert d.name.text() == p.name
    assert d.checked.text() == "M. Serrano, tow master"
    assert d.site.text() == p.site.name == "Tollan basin, Vessmark yard"
    assert d.history.rowCount() == len(p.history) == 3
    assert d.history.item(1, 3).text() == "Lay-by berth moved 40 m north"
    assert d.notes.toPlainText() == p.notes


def test_typing_the_title_block_and_ok_is_one_undo_step(window, qtbot) -> None:
    c = window.controller
    before = c.project
    d = opened(window)
    retype(qtbot, d.name, "Lark pair to the lay-by quay")
    retype(qtbot, d.revision, "D")
    retype(qtbot, d.approved, "K. Moreau, harbour master")
    retype(qtbot, d.site, "Tollan basin, east arm")
    d.notes.setFocus()
    qtbot.keyClick(d.notes, Qt.Key.Key_End, Qt.KeyboardModifier.ControlModifier)
    qtbot.keyClicks(d.notes, " High water 14:20.")
    qtbot.mouseClick(d.add_line, Qt.MouseButton.LeftButton)
    # the new line is open for its description; the revision comes from the field above
    editor = d.history.focusWidget() or d.history.viewport()
    qtbot.keyClicks(editor, "Approved for the move")
    qtbot.keyClick(editor, Qt.Key.Key_Return)
    ok = d.buttons.button(d.buttons.StandardButton.Ok)
    qtbot.mouseClick(ok, Qt.MouseButton.LeftButton)
    p = c.project
    assert p.name == "Lark pair to the lay-by quay"
    assert (p.revision, p.approved_by) == ("D", "K. Moreau, harbour master")
    assert p.site.name == "Tollan basin, east arm"
    assert p.site.features == before.site.features
    assert p.notes.endswith("tugs. High water 14:20.")
    assert p.history[-1] == Revision(
        "D", before.date, "J. Amadi, towage planner", "Approved for the move"
    )
    assert p.history[:3] == before.history
    assert "Lark pair to the lay-by quay" in window.windowTitle()
    assert c.undo_stack.undoText() == "Plan details"
    c.undo_stack.undo()
    assert c.project == before


def test_a_blank_name_is_refused_in_the_dialog_and_nothing_typed_is_lost(window, qtbot) -> None:
    c = window.controller
    before = c.project
    d = opened(window)
    retype(qtbot, d.prepared, "A. Brisk")
    d.name.setFocus()
    qtbot.keyClick(d.name, Qt.Key.Key_A, Qt.KeyboardModifier.ControlModifier)
    qtbot.keyClick(d.name, Qt.Key.Key_Delete)
    qtbot.keyClick(d.name, Qt.Key.Key_Return)  # the default button: OK
    assert d.isVisible()
    assert d.error.isVisible() and "plan name" in d.error.text()
    assert "must not be empty" in d.error.text()
    assert d.prepared.text() == "A. Brisk"
    assert c.project == before


def test_a_history_line_without_its_revision_is_named_by_its_number(window, qtbot) -> None:
    d = opened(window)
    qtbot.mouseClick(d.add_line, Qt.MouseButton.LeftButton)
    d.history.item(3, 0).setText("")
    d.history.item(3, 3).setText("Something")
    d.accept()
    assert "revision history line 4" in d.error.text()
    assert d.result() != QDialog.DialogCode.Accepted


def test_remove_line_and_blank_lines_are_dropped(window, qtbot) -> None:
    c = window.controller
    d = opened(window)
    d.history.setCurrentCell(0, 0)
    qtbot.mouseClick(d.remove_line, Qt.MouseButton.LeftButton)
    qtbot.mouseClick(d.add_line, Qt.MouseButton.LeftButton)
    for col in range(4):
        d.history.item(2, col).setText("")
    d.accept()
    assert [r.revision for r in c.project.history] == ["B", "C"]


def test_ok_keeps_a_history_cell_still_being_typed_in(window, qtbot) -> None:
    c = window.controller
    d = opened(window)
    qtbot.mouseClick(d.add_line, Qt.MouseButton.LeftButton)
    editor = d.history.focusWidget()
    assert editor is not None and d.history.isAncestorOf(editor)  # the new line is open
    qtbot.keyClicks(editor, "Tug Wren added aft")
    d.accept()  # no Enter and no click away: the open cell is read all the same
    assert c.project.history[-1].description == "Tug Wren added aft"


def test_an_undo_then_a_new_dialog_shows_the_plan_as_it_is_now(window) -> None:
    c = window.controller
    c.apply(c.project.with_title_block(revision="E"), "Revision E")
    assert opened(window).revision.text() == "E"
    c.undo_stack.undo()
    assert PlanDetailsDialog(c).revision.text() == "C"


def test_the_print_preview_has_a_plan_details_button(window, monkeypatch) -> None:
    seen: list[QPrintPreviewDialog] = []
    monkeypatch.setattr(QPrintPreviewDialog, "exec", lambda self: seen.append(self) or 0)
    window.plan_ui.preview()
    bar = seen[0].findChild(QToolBar)
    act = next(a for a in bar.actions() if a.objectName() == "preview_plan_details")
    act.trigger()
    d = next(x for x in seen[0].findChildren(PlanDetailsDialog))
    d.revision.setText("F")
    d.accept()
    assert window.controller.project.revision == "F"
