"""The symbols of the plan painted with any QPainter: marks, north arrow, arrows, tugs.

Sizes are in the painter's own units (screen pixels on the board, device pixels on
paper); the caller picks them. Shapes come from :mod:`app.paint.shapes`, colours from
:mod:`app.paint.style`.
"""

from __future__ import annotations

from collections.abc import Sequence

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QFont, QPainter, QPainterPath, QPen, QPolygonF

from app.paint import style
from app.paint.shapes import Pt


def polygon(points: Sequence[Pt]) -> QPolygonF:
    return QPolygonF([QPointF(x, y) for x, y in points])


def polyline_path(points: Sequence[Pt]) -> QPainterPath:
    path = QPainterPath()
    if points:
        path.moveTo(*points[0])
        for pt in points[1:]:
            path.lineTo(*pt)
    return path


def paint_arrow(
    painter: QPainter,
    shaft_pen: QPen,
    color: QColor,
    shaft: QPainterPath,
    head: QPolygonF,
    outline_width: float,
) -> None:
    """An arrow: its shaft with ``shaft_pen`` and its head filled, edged ``outline_width``."""
    if head.isEmpty():
        return
    painter.setPen(shaft_pen)
    painter.setBrush(Qt.BrushStyle.NoBrush)
    painter.drawPath(shaft)
    edge = QPen(color, outline_width)
    edge.setJoinStyle(Qt.PenJoinStyle.MiterJoin)
    painter.setPen(edge)
    painter.setBrush(QBrush(color))
    painter.drawPolygon(head)
    painter.setBrush(Qt.BrushStyle.NoBrush)


def draw_centroid(p: QPainter, c: QPointF, r: float, color: QColor, width: float) -> None:
    """The centroid: a ring with a cross through it; ``r`` is the cross's half-length."""
    p.setPen(QPen(color, width))
    p.setBrush(Qt.BrushStyle.NoBrush)
    p.drawEllipse(c, r * 0.7, r * 0.7)
    p.drawLine(QPointF(c.x() - r, c.y()), QPointF(c.x() + r, c.y()))
    p.drawLine(QPointF(c.x(), c.y() - r), QPointF(c.x(), c.y() + r))


def draw_cog(p: QPainter, c: QPointF, r: float, color: QColor, width: float) -> None:
    """The centre of gravity: a quartered disc of radius ``0.8 r``."""
    rect = QRectF(c.x() - r * 0.8, c.y() - r * 0.8, r * 1.6, r * 1.6)
    p.setPen(QPen(color, width))
    p.setBrush(QColor("white"))
    p.drawEllipse(rect)
    p.setBrush(color)
    p.drawPie(rect, 0, 90 * 16)
    p.drawPie(rect, 180 * 16, 90 * 16)
    p.setBrush(Qt.BrushStyle.NoBrush)


def draw_crossing(p: QPainter, c: QPointF, r: float, color: QColor, width: float) -> None:
    """Where the line of action crosses the centreline: a white diamond."""
    p.setPen(QPen(color, width))
    p.setBrush(QColor("white"))
    p.drawPolygon(
        QPolygonF(
            [
                QPointF(c.x(), c.y() - r * 0.8),
                QPointF(c.x() + r * 0.8, c.y()),
                QPointF(c.x(), c.y() + r * 0.8),
                QPointF(c.x() - r * 0.8, c.y()),
            ]
        )
    )
    p.setBrush(Qt.BrushStyle.NoBrush)


def draw_north(p: QPainter, centre: QPointF, size: float, font: QFont, width: float) -> None:
    """A north arrow pointing up the page on a light disc, "N" above its tip."""
    p.save()
    p.setRenderHint(QPainter.RenderHint.Antialiasing)
    cx, cy = centre.x(), centre.y()
    p.setPen(Qt.PenStyle.NoPen)
    p.setBrush(style.LABEL_BG)
    p.drawEllipse(centre, size * 1.25, size * 1.25)
    p.setPen(QPen(style.INK, width))
    for side, fill in ((-1.0, style.INK), (1.0, QColor("white"))):
        p.setBrush(fill)
        p.drawPolygon(
            QPolygonF(
                [
                    QPointF(cx, cy - size),
                    QPointF(cx + side * size * 0.4, cy + size * 0.7),
                    QPointF(cx, cy + size * 0.35),
                ]
            )
        )
    p.setFont(font)
    h = size * 0.8
    p.drawText(
        QRectF(cx - size, cy - size - h * 1.05, 2 * size, h), Qt.AlignmentFlag.AlignCenter, "N"
    )
    p.restore()


def draw_planned_wind(p: QPainter, at: QPointF, r: float, width: float) -> None:
    """The planned wind on a hold limits plot: a white ring with a dot, radius ``r``."""
    p.setPen(QPen(style.PLANNED_WIND, width))
    p.setBrush(QColor("white"))
    p.drawEllipse(at, r, r)
    p.setBrush(style.PLANNED_WIND)
    p.drawEllipse(at, r * 0.42, r * 0.42)
    p.setBrush(Qt.BrushStyle.NoBrush)
