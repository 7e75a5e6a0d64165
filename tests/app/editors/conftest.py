"""Fixtures for the editors' tests: the main window on the sample, dialogs that never block,
and helpers that type into tables and fields with real key and mouse events."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QApplication, QTableView, QWidget

from tests.app.board.conftest import dialogs, isolated, window  # noqa: F401 - fixtures


def click_cell(qtbot, table: QTableView, row: int, col: int) -> None:  # type: ignore[no-untyped-def]
    rect = table.visualRect(table.model().index(row, col))
    qtbot.mouseClick(table.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())


def open_cell(qtbot, table: QTableView, row: int, col: int) -> QWidget:  # type: ignore[no-untyped-def]
    """Double-click a cell and return its editor (the widget with the focus)."""
    table.scrollTo(table.model().index(row, col))
    click_cell(qtbot, table, row, col)
    rect = table.visualRect(table.model().index(row, col))
    qtbot.mouseDClick(table.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    editor = QApplication.focusWidget()
    assert editor is not None, "no cell editor opened"
    assert table.isAncestorOf(editor) or editor.window() is not table.window(), editor
    return editor  # the cell's editor, or the list a choice editor shows


def type_in_cell(qtbot, table: QTableView, row: int, col: int, text: str) -> None:  # type: ignore[no-untyped-def]
    """Double-click a cell, type ``text`` over what is there, press Enter."""
    editor = open_cell(qtbot, table, row, col)
    qtbot.keyClick(editor, Qt.Key.Key_A, Qt.KeyboardModifier.ControlModifier)
    if text:
        qtbot.keyClicks(editor, text)
    else:
        qtbot.keyClick(editor, Qt.Key.Key_Delete)
    press_enter(qtbot, table, editor)


def press_enter(qtbot, table: QTableView, editor: QWidget) -> None:  # type: ignore[no-untyped-def]
    """Enter in a cell editor; the view commits it on its next event (a queued call)."""
    qtbot.keyClick(editor, Qt.Key.Key_Return)
    qtbot.waitUntil(lambda: table.state() != QTableView.State.EditingState, timeout=2000)


def retype(qtbot, edit, text: str) -> None:  # type: ignore[no-untyped-def]
    """Select all in a line edit and type ``text`` over it, key by key."""
    edit.setFocus()
    qtbot.keyClick(edit, Qt.Key.Key_A, Qt.KeyboardModifier.ControlModifier)
    if text:
        qtbot.keyClicks(edit, text)
    else:
        qtbot.keyClick(edit, Qt.Key.Key_Delete)


def retype_and_enter(qtbot, edit, text: str) -> None:  # type: ignore[no-untyped-def]
    """:func:`retype`, then Enter (a panel field's text set by code is what the panel
    shows, and Enter on that commits nothing: a test types as a user does)."""
    retype(qtbot, edit, text)
    qtbot.keyClick(edit, Qt.Key.Key_Return)
