"""Wind and current on the board: a card under the north arrow, always in view.

The card shows the wind as an arrow blowing from the true bearing it comes from and
the current as an arrow setting towards its true bearing, north up like the board,
each labelled with its speed in the display unit and its bearing. The loads they put
on the body are the core's (core.mechanics.loads) and are drawn on the body by the body's
drawing, like the tug forces; this card only says what the conditions are.

:func:`draw_conditions_card` paints into any QPainter (device pixels);
``ConditionsCard(view)`` adds it to a BoardView's foreground hooks.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QPointF, QRectF, QSizeF, Qt
from PySide6.QtGui import QColor, QFontMetricsF, QPainter, QPen, QPixmap, QPolygonF

from app.board.view import BoardView
from app.guard import guarded
from app.paint import style
from core.model.conditions import Conditions
from core.units import DisplayUnits

WIND = style.WIND
CURRENT = style.CURRENT
CARD_WIDTH = 176.0


def _arrow(p: QPainter, centre: QPointF, towards_true_deg: float, r: float, color: QColor) -> None:
    """An arrow across a circle of radius ``r``, pointing towards a true bearing (north up)."""
    a = math.radians(towards_true_deg)
    ux, uy = math.sin(a), -math.cos(a)
    tail = QPointF(centre.x() - ux * r, centre.y() - uy * r)
    tip = QPointF(centre.x() + ux * r, centre.y() + uy * r)
    p.setPen(QPen(color, 3.0, Qt.PenStyle.SolidLine, Qt.PenCapStyle.RoundCap))
    back = QPointF(tip.x() - ux * 9, tip.y() - uy * 9)
    p.drawLine(tail, back)
    p.setPen(QPen(color, 1.0))
    p.setBrush(color)
    p.drawPolygon(
        QPolygonF(
            [
                tip,
                QPointF(back.x() - uy * 5, back.y() + ux * 5),
                QPointF(back.x() + uy * 5, back.y() - ux * 5),
            ]
        )
    )


def card_lines(c: Conditions, units: DisplayUnits) -> list[tuple[str, QColor]]:
    lines = []
    if c.wind_speed_ms > 0:
        lines.append(
            (f"Wind {units.show(c.wind_speed_ms, 'speed')} from {c.wind_from_deg:03.0f}°T", WIND)
        )
    else:
        lines.append(("No wind", WIND))
    if c.current_speed_ms > 0:
        lines.append(
            (
                f"Current {units.show(c.current_speed_ms, 'speed')} to {c.current_towards_deg:03.0f}°T",
                CURRENT,
            )
        )
    else:
        lines.append(("No current", CURRENT))
    return lines


def draw_conditions_card(
    p: QPainter, top_right: QPointF, c: Conditions, units: DisplayUnits
) -> QRectF:
    """Paint the card with its top-right corner at ``top_right`` (device pixels)."""
    p.save()
    p.setRenderHint(QPainter.RenderHint.Antialiasing)
    p.setFont(style.label_font(8.5, True))
    fm = p.fontMetrics()
    lines = card_lines(c, units)
    h = 84.0 + fm.height() * len(lines)
    rect = QRectF(top_right.x() - CARD_WIDTH, top_right.y(), CARD_WIDTH, h)
    p.setPen(Qt.PenStyle.NoPen)
    p.setBrush(style.LABEL_BG)
    p.drawRoundedRect(rect, 5, 5)
    centre = QPointF(rect.center().x(), rect.top() + 42)
    p.setPen(QPen(style.GRID_MAJOR, 1.0))
    p.setBrush(Qt.BrushStyle.NoBrush)
    p.drawEllipse(centre, 34, 34)
    p.setPen(style.TEXT)
    p.drawText(
        QRectF(centre.x() - 8, centre.y() - 34 - 1, 16, 12), Qt.AlignmentFlag.AlignCenter, "N"
    )
    if c.wind_speed_ms > 0:
        _arrow(p, centre, (c.wind_from_deg + 180.0) % 360.0, 28, WIND)
    if c.current_speed_ms > 0:
        _arrow(p, centre, c.current_towards_deg, 18, CURRENT)
    y = rect.top() + 84 + fm.ascent() - 4
    for text, color in lines:
        p.setPen(color)
        p.drawText(QPointF(rect.left() + 8, y), text)
        y += fm.height()
    p.restore()
    return rect


def card_height() -> float:
    """The card's height in pixels (its two lines of text under the rose)."""
    return 84.0 + QFontMetricsF(style.label_font(8.5, True)).height() * 2


class ConditionsCard:
    """Draws the stage's wind and current on a BoardView, in a corner it leaves free.

    The view puts the card in the first corner that covers no item (under the north
    arrow if it can) and keeps the labels off it (:meth:`BoardView.choose_corner`).
    """

    def __init__(self, view: BoardView) -> None:
        self.view = view
        self.rect = QRectF()
        view.corner_size = QSizeF(CARD_WIDTH + 2, card_height())
        view.foreground_hooks.append(self.paint)
        view.board.controller.changed.connect(self._changed)
        self._key: object = None
        self._pixmap: QPixmap | None = None
        self._pixmap_key: object = None
        self._card = QRectF()

    @guarded
    def _changed(self) -> None:
        stage = self.view.board.stage()
        key = (
            None if stage is None else stage.conditions,
            self.view.board.controller.project.units,
        )
        if key != self._key:
            self._key = key
            self.view.viewport().update()

    def paint(self, p: QPainter, width: int, height: int) -> None:
        stage = self.view.board.stage()
        if stage is None:
            return
        units = self.view.board.controller.project.units
        # Drawn once per value into a pixmap: the board repaints on every move of a drag.
        ratio = self.view.devicePixelRatioF()
        key = (stage.conditions, units, ratio)
        if key != self._pixmap_key or self._pixmap is None:
            pm = QPixmap(round((CARD_WIDTH + 2) * ratio), round(140 * ratio))
            pm.setDevicePixelRatio(ratio)
            pm.fill(Qt.GlobalColor.transparent)
            q = QPainter(pm)
            self._card = draw_conditions_card(
                q, QPointF(CARD_WIDTH + 1, 0), stage.conditions, units
            )
            q.end()
            self._pixmap, self._pixmap_key = pm, key
        corner = self.view.corner_rect
        if corner.isNull():
            corner = QRectF(width - 10 - CARD_WIDTH - 2, 86, CARD_WIDTH + 2, card_height())
        x, y = round(corner.left()), round(corner.top())
        p.drawPixmap(x, y, self._pixmap)
        self.rect = self._card.translated(x, y)
