"""Fixtures for the board and main-window tests: an isolated window on the sample."""

from __future__ import annotations

from pathlib import Path

import pytest
from PySide6.QtCore import QEvent, QPoint, QPointF, QSize, Qt, QTimer
from PySide6.QtGui import QMouseEvent
from PySide6.QtWidgets import QApplication

from tests.conftest import SAMPLES

SAMPLE = SAMPLES / "deck_barge_unberth.towboard"


@pytest.fixture(autouse=True)
def isolated(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    """Recovery files and settings of the test go to its own folder."""
    monkeypatch.setenv("TOWBOARD_RECOVERY_DIR", str(tmp_path / "recovery"))
    monkeypatch.setenv("TOWBOARD_SETTINGS_FILE", str(tmp_path / "settings.ini"))
    return tmp_path


class Dialogs:
    """Every modal dialog the window tried to show (none blocks in a test)."""

    def __init__(self) -> None:
        self.shown: list[str] = []
        self.answer = None  # what QMessageBox.question returns; None: Discard / No


@pytest.fixture(autouse=True)
def dialogs(monkeypatch: pytest.MonkeyPatch) -> Dialogs:
    from PySide6.QtWidgets import QDialog, QMessageBox

    d = Dialogs()

    def question(parent, title, text, *args, **kwargs):  # type: ignore[no-untyped-def]
        d.shown.append(f"{title}: {text}")
        if d.answer is not None:
            return d.answer
        return (
            QMessageBox.StandardButton.Discard
            if "Unsaved" in title
            else QMessageBox.StandardButton.No
        )

    def message(parent, title, text, *args, **kwargs):  # type: ignore[no-untyped-def]
        d.shown.append(f"{title}: {text}")
        return QMessageBox.StandardButton.Ok

    def box_exec(self):  # type: ignore[no-untyped-def]
        d.shown.append(f"{self.windowTitle()}: {self.text()}\n{self.informativeText()}")
        return int(QMessageBox.StandardButton.Ok)

    def dialog_exec(self):  # type: ignore[no-untyped-def]
        d.shown.append(self.windowTitle())
        return int(QDialog.DialogCode.Rejected)

    monkeypatch.setattr(QMessageBox, "question", staticmethod(question))
    monkeypatch.setattr(QMessageBox, "warning", staticmethod(message))
    monkeypatch.setattr(QMessageBox, "information", staticmethod(message))
    monkeypatch.setattr(QMessageBox, "exec", box_exec)
    monkeypatch.setattr(QDialog, "exec", dialog_exec)
    return d


@pytest.fixture
def window(qtbot):  # type: ignore[no-untyped-def]
    from app.window.main_window import MainWindow

    w = MainWindow()
    qtbot.addWidget(w)
    w.resize(1400, 900)
    w.show()
    qtbot.waitExposed(w)
    assert w.open_path(SAMPLE, ask=False)
    w.view.fit_to_hull()
    yield w
    w.controller.undo_stack.setClean()  # nothing to ask about when the test closes it


def view_point(view, x: float, y: float) -> QPoint:  # type: ignore[no-untyped-def]
    """The viewport pixel of site point (x, y)."""
    return view.mapFromScene(QPointF(x, y))


def move_with_button(view, pt: QPoint) -> None:  # type: ignore[no-untyped-def]
    """A mouse move with the left button held, sent to the viewport."""
    vp = view.viewport()
    ev = QMouseEvent(
        QEvent.Type.MouseMove,
        QPointF(pt),
        QPointF(vp.mapToGlobal(pt)),
        Qt.MouseButton.NoButton,
        Qt.MouseButton.LeftButton,
        Qt.KeyboardModifier.NoModifier,
    )
    QApplication.sendEvent(vp, ev)


def send_mouse(  # type: ignore[no-untyped-def]
    view,
    kind: QEvent.Type,
    pt: QPointF,
    buttons: Qt.MouseButton,
    button: Qt.MouseButton = Qt.MouseButton.LeftButton,
) -> None:
    """A mouse press, move or release of ``button`` (``buttons``: those held), sent to the
    viewport at ``pt`` (pixels, may be fractional), the events it leads to handled."""
    vp = view.viewport()
    button = Qt.MouseButton.NoButton if kind == QEvent.Type.MouseMove else button
    ev = QMouseEvent(
        kind, pt, QPointF(vp.mapToGlobal(pt.toPoint())), button, buttons,
        Qt.KeyboardModifier.NoModifier,
    )  # fmt: skip
    QApplication.sendEvent(vp, ev)
    QApplication.processEvents()


def show_fitted(qtbot, widget, view, size: QSize) -> None:  # type: ignore[no-untyped-def]
    """Show ``widget`` at ``size``, exposed, with its board ``view`` fitted to the hull."""
    qtbot.addWidget(widget)
    widget.resize(size)
    widget.show()
    qtbot.waitExposed(widget)
    view.fit_to_hull()
    QApplication.processEvents()


def settle(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    """Wait until every pending one-shot timer of the window has fired.

    The stage's checks run a moment after a change and add notes under the tugs' names;
    the labels are placed again once those events are done.
    """
    qtbot.wait(1)
    qtbot.waitUntil(
        lambda: not any(t.isActive() for t in window.findChildren(QTimer) if t.isSingleShot()),
        timeout=5000,
    )
    qtbot.wait(1)
