"""A board line's box: worked out when the line or its pen changes, never short of Qt's.

Qt's own QGraphicsLineItem strokes its line into a path each time it is asked for its box,
which it asks several times a frame for each of the line of action's pieces during a drag;
:class:`app.board.items.LineItem` keeps the box instead. The box must hold everything Qt's
holds, or a moved line leaves a trail of its ends on the screen.
"""

from __future__ import annotations

import itertools

import numpy as np
import pytest
from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QImage, QPainter
from PySide6.QtWidgets import QGraphicsLineItem, QGraphicsScene, QGraphicsView

from app.board.items import LineItem
from app.paint import style

CAPS = [Qt.PenCapStyle.RoundCap, Qt.PenCapStyle.SquareCap, Qt.PenCapStyle.FlatCap]
LINES = [
    QLineF(0.0, 0.0, 300.0, 170.0),
    QLineF(40.0, -12.5, -200.0, 90.0),
    QLineF(5.0, 5.0, 5.0, 80.0),  # upright
    QLineF(-7.0, 3.0, 60.0, 3.0),  # level
    QLineF(2.0, 2.0, 2.0, 2.0),  # a point
]


@pytest.mark.parametrize(
    ("cap", "width", "dash"), list(itertools.product(CAPS, [0.0, 1.0, 4.0], [False, True]))
)
def test_the_box_holds_qts_own_for_every_cap_width_and_slant(qapp, cap, width, dash) -> None:  # type: ignore[no-untyped-def]
    pen = style.pen(QColor("black"), width, Qt.PenStyle.DashLine if dash else Qt.PenStyle.SolidLine)
    pen.setCapStyle(cap)
    reach = width / 2 * 2**0.5  # the most a square cap's corner reaches on an axis
    for line in LINES:
        ours, qts = LineItem(), QGraphicsLineItem()
        for item in (ours, qts):
            item.setPen(pen)
            item.setLine(line)
        mine, theirs = ours.boundingRect(), qts.boundingRect()
        assert mine.contains(theirs) or theirs.isEmpty(), (line, mine, theirs)
        # and no more than the ends' box widened by that reach
        ends = QRectF(line.p1(), line.p2()).normalized()
        assert mine == ends.adjusted(-reach, -reach, reach, reach)


def test_the_box_follows_the_line_and_the_pen_in_every_form_qt_takes(qapp) -> None:  # type: ignore[no-untyped-def]
    item = LineItem()
    item.setPen(style.pen(QColor("black"), 2.0))
    item.setLine(0.0, 0.0, 10.0, 0.0)  # four numbers
    assert item.line() == QLineF(0.0, 0.0, 10.0, 0.0)
    assert item.boundingRect().right() == pytest.approx(10.0 + 2**0.5)
    item.setLine(QLineF(QPointF(0.0, 0.0), QPointF(0.0, 30.0)))  # a QLineF
    assert item.boundingRect().bottom() == pytest.approx(30.0 + 2**0.5)
    assert item.boundingRect().right() == pytest.approx(2**0.5)
    item.setPen(style.pen(QColor("black"), 6.0))  # a wider pen widens the box
    assert item.boundingRect().right() == pytest.approx(3 * 2**0.5)


def _shown(view: QGraphicsView) -> np.ndarray:
    """What the window shows now (its backing store), RGB."""
    img = view.screen().grabWindow(view.winId()).toImage()
    img = img.convertToFormat(QImage.Format.Format_RGB32)
    rows = np.frombuffer(img.constBits(), np.uint8).reshape(img.height(), img.bytesPerLine())
    return rows[:, : 4 * img.width()].reshape(img.height(), img.width(), 4)[:, :, :3].astype(int)


@pytest.mark.parametrize("cap", CAPS)
def test_a_moved_line_leaves_nothing_where_it_was(qapp, cap) -> None:  # type: ignore[no-untyped-def]
    """Moved in steps, as a drag moves it, a thick line is repainted where it was: what
    the window shows is what a repaint of the whole view draws."""
    scene = QGraphicsScene(0, 0, 200, 120)
    scene.setBackgroundBrush(QColor("white"))
    view = QGraphicsView(scene)
    view.setRenderHint(QPainter.RenderHint.Antialiasing)
    view.setFrameShape(QGraphicsView.Shape.NoFrame)
    view.resize(200, 120)
    view.show()
    pen = style.pen(QColor("black"), 9.0)
    pen.setCosmetic(False)  # the width in scene units: the caps reach as far as Qt allows
    pen.setCapStyle(cap)
    item = LineItem()
    item.setPen(pen)
    scene.addItem(item)
    item.setLine(20.0, 20.0, 180.0, 30.0)
    for _ in range(3):
        qapp.processEvents()
    for k in range(1, 6):
        item.setLine(20.0 + 9 * k, 20.0 + 13 * k, 180.0 - 7 * k, 30.0 + 11 * k)
        for _ in range(3):
            qapp.processEvents()
    shown = _shown(view)
    view.viewport().repaint()
    qapp.processEvents()
    apart = np.abs(shown - _shown(view)).max(axis=2)
    view.close()
    assert apart.max() <= 3, f"{int((apart > 3).sum())} px left from where the line was"
