"""The handle that turns the selected body: a knob on a stalk ahead of its bow.

The handle is fixed in pixels (it keeps its size at every zoom). Its anchor is the
body's bow on the line through the centroid; the knob sits ``STALK_PX`` beyond it in
the direction the bow points on screen. Dragging the knob turns the body about its
centroid (see :mod:`app.board.interaction`).
"""

from __future__ import annotations

import math

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPainterPath, QPen
from PySide6.QtWidgets import QGraphicsItem, QStyleOptionGraphicsItem, QWidget

from app.board.items import IGNORES, ROLE
from app.guard import guarded
from app.paint import style

STALK_PX = 34.0
KNOB_PX = 8.0


class TurnHandle(QGraphicsItem):
    """A knob to turn body ``name`` by dragging (ROLE: ("turn", name))."""

    def __init__(self) -> None:
        super().__init__()
        self.setFlag(IGNORES)
        self.setZValue(40)
        self._ux, self._uy = 1.0, 0.0  # the bow's direction on screen, y down
        self.setVisible(False)
        self.setCursor(Qt.CursorShape.SizeAllCursor)

    def set_body(self, name: str | None) -> None:
        self.setData(ROLE, None if name is None else ("turn", name))
        self.setVisible(name is not None)

    def set_direction(self, screen_angle_deg: float) -> None:
        """Point the stalk along a screen angle (degrees clockwise from +x, y down)."""
        a = math.radians(screen_angle_deg)
        ux, uy = math.cos(a), math.sin(a)
        if (ux, uy) != (self._ux, self._uy):
            self.prepareGeometryChange()
            self._ux, self._uy = ux, uy
            self.update()

    def knob(self) -> QPointF:
        """The knob's centre in the item's pixels (the anchor is the origin)."""
        return QPointF(self._ux * STALK_PX, self._uy * STALK_PX)

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        k = self.knob()
        r = KNOB_PX + 3
        return QRectF(
            min(0.0, k.x()) - r, min(0.0, k.y()) - r, abs(k.x()) + 2 * r, abs(k.y()) + 2 * r
        )

    @guarded(default=QPainterPath)
    def shape(self) -> QPainterPath:
        path = QPainterPath()
        path.addEllipse(self.knob(), KNOB_PX + 2, KNOB_PX + 2)
        return path

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        k = style.device_scale(painter)
        if k != 1.0:
            painter.scale(k, k)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        knob = self.knob()
        painter.setPen(QPen(style.HULL_SELECTED, 1.4, Qt.PenStyle.DashLine))
        painter.drawLine(QPointF(0, 0), knob)
        painter.setPen(QPen(style.HULL_SELECTED, 1.6))
        painter.setBrush(QColor("white"))
        painter.drawEllipse(knob, KNOB_PX, KNOB_PX)
        # a curved double arrow inside the knob: "turn"
        r = KNOB_PX * 0.55
        painter.setBrush(Qt.BrushStyle.NoBrush)
        rect = QRectF(knob.x() - r, knob.y() - r, 2 * r, 2 * r)
        painter.drawArc(rect, 30 * 16, 120 * 16)
        painter.drawArc(rect, 210 * 16, 120 * 16)
