"""What the board's own repaints leave on screen is what a full repaint draws.

After a tug drag is let go or called off with Escape, and after an undo or a redo, the
window shows (its backing store) the board as the repaints of the parts that changed left
it; painted again whole from the same items it must look the same. Two things once told
them apart by a pixel: a dashed line (the line of action) clipped to the repainted box
before it was drawn started its dashes at the box's edge, and a label kept as a picture
on the device kept the sub-pixel place it was first drawn at after its tug moved.
"""

from __future__ import annotations

import numpy as np
import pytest
from PySide6.QtCore import QEvent, QPoint, QPointF, QSize, Qt
from PySide6.QtGui import QImage, QKeyEvent
from PySide6.QtWidgets import QApplication

from tests.app.board.conftest import send_mouse, show_fitted
from tests.app.board.test_drag_backdrop import crowded

LEFT = Qt.MouseButton.LeftButton
#: Antialiasing may round a level apart where translucent boxes overlap; a stale pixel is
#: tens of levels apart.
LEVELS = 3


@pytest.fixture
def window(qtbot):  # type: ignore[no-untyped-def]
    def make(n_tugs: int):  # type: ignore[no-untyped-def]
        from app.window.main_window import MainWindow

        w = MainWindow(crowded(n_tugs))
        show_fitted(qtbot, w, w.view, QSize(1400, 900))
        return w

    return make


def _escape(view) -> None:  # type: ignore[no-untyped-def]
    for kind in (QEvent.Type.KeyPress, QEvent.Type.KeyRelease):
        ev = QKeyEvent(kind, Qt.Key.Key_Escape, Qt.KeyboardModifier.NoModifier)
        QApplication.sendEvent(view.viewport(), ev)
        QApplication.processEvents()


def _grip(view, tug: str) -> QPointF:  # type: ignore[no-untyped-def]
    d = next(iter(view.board.bodies.values()))
    glyph = d.tugs[tug].glyph
    return QPointF(view.mapFromScene(glyph.mapToScene(glyph.glyph.boundingRect().center())))


def _drag(view, tug: str, steps: list[tuple[float, float]]) -> QPointF:  # type: ignore[no-untyped-def]
    """Press on ``tug`` and move the mouse by ``steps`` (px), the button held."""
    at = _grip(view, tug)
    send_mouse(view, QEvent.Type.MouseButtonPress, at, LEFT)
    for dx, dy in steps:
        at = at + QPointF(dx, dy)
        send_mouse(view, QEvent.Type.MouseMove, at, LEFT)
    return at


def _viewport_pixels(w) -> np.ndarray:  # type: ignore[no-untyped-def]
    """The viewport's part of what the window shows now (its backing store), RGB."""
    img = w.screen().grabWindow(w.winId()).toImage().convertToFormat(QImage.Format.Format_RGB32)
    rows = np.frombuffer(img.constBits(), np.uint8).reshape(img.height(), img.bytesPerLine())
    vp = w.view.viewport()
    o = vp.mapTo(w, QPoint(0, 0))
    k = img.devicePixelRatio()
    y0, x0 = round(o.y() * k), round(o.x() * k)
    h, wd = round(vp.height() * k), round(vp.width() * k)
    return rows[y0 : y0 + h, 4 * x0 : 4 * (x0 + wd)].reshape(h, wd, 4)[:, :, :3].astype(int)


def _stale(w) -> str:  # type: ignore[no-untyped-def]
    """Where the screen differs from the board painted again whole ('' if nowhere)."""
    for _ in range(10):  # what the change set going (the label placer, the repaints) done
        QApplication.processEvents()
    shown = _viewport_pixels(w)
    w.view.viewport().repaint()
    QApplication.processEvents()
    apart = np.abs(shown - _viewport_pixels(w)).max(axis=2)
    if apart.max() <= LEVELS:
        return ""
    ys, xs = np.nonzero(apart > LEVELS)
    box = f"x {xs.min()}-{xs.max()}, y {ys.min()}-{ys.max()}"
    return f"{len(ys)} px up to {apart.max()} levels apart in {box}"


# a few tugs, some, and a crowded board (its drag draws the still items as pictures)
@pytest.mark.parametrize(("n_tugs", "zoom"), [(6, 1.0), (24, 1.0), (24, 1.37), (150, 0.83)])
def test_a_drag_let_go_called_off_undone_and_redone_leaves_the_board_as_painted_afresh(
    window, n_tugs: int, zoom: float
) -> None:  # type: ignore[no-untyped-def]
    w = window(n_tugs)
    view, stack = w.view, w.controller.undo_stack
    if zoom != 1.0:  # every label and mark then lies a fraction of a pixel elsewhere
        view.zoom(zoom)
        for _ in range(5):
            QApplication.processEvents()
    tugs = sorted(next(iter(view.board.bodies.values())).tugs)
    found = []
    wander = [(13.0, -7.0), (-9.0, 11.0), (6.5, 8.5), (-12.0, -3.5), (7.0, 9.0)]
    for k, tug in enumerate(tugs[:: max(1, len(tugs) // 5)][:5]):
        steps = wander[k:] + wander[:k]
        at = _drag(view, tug, steps)
        send_mouse(view, QEvent.Type.MouseButtonRelease, at, Qt.MouseButton.NoButton)
        found.append(("let go", tug, _stale(w)))
        _drag(view, tug, steps[::-1])
        _escape(view)
        found.append(("Escape", tug, _stale(w)))
        stack.undo()
        found.append(("undo", tug, _stale(w)))
        stack.redo()
        found.append(("redo", tug, _stale(w)))
    assert stack.count() == 5
    assert [f for f in found if f[2]] == []
