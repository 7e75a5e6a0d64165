"""The key strip under a stage diagram: the conditions, the scales and the symbols."""

from __future__ import annotations

import math
from typing import TYPE_CHECKING

from PySide6.QtCore import QPointF, QRectF
from PySide6.QtGui import QColor, QPainter, QPen, Qt

from app.briefing.layout import INK, Ctx
from app.paint import style
from app.paint.shapes import arrow_head
from app.paint.symbols import draw_centroid, draw_cog, draw_crossing, polygon
from core.frames import true_to_site_angle
from core.units import label

if TYPE_CHECKING:
    from app.briefing.diagram import StageDiagram


def _head(p: QPainter, ctx: Ctx, tip: QPointF, d: tuple[float, float], color: QColor) -> None:
    """A filled arrowhead on ``tip`` pointing along ``d`` (y up)."""
    length = ctx.mm(1.9)
    tail = (tip.x() - d[0] * 2 * length, tip.y() + d[1] * 2 * length)
    parts = arrow_head(tail, (tip.x(), tip.y()), length)
    if parts is not None:
        p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(color)
        p.drawPolygon(polygon(parts[1]))
        p.setBrush(Qt.BrushStyle.NoBrush)


def _conditions(p: QPainter, ctx: Ctx, x: float, top: float, diagram: StageDiagram) -> None:
    c = diagram.stage.conditions
    u = diagram.units
    rows = [
        (
            "Wind",
            c.wind_speed_ms,
            (c.wind_from_deg + 180.0) % 360.0,
            f"{u.show(c.wind_speed_ms, 'speed')} from {c.wind_from_deg:03.0f}°",
            style.WIND,
        ),
        (
            "Current",
            c.current_speed_ms,
            c.current_towards_deg,
            f"{u.show(c.current_speed_ms, 'speed')} towards {c.current_towards_deg:03.0f}°",
            style.CURRENT,
        ),
    ]
    for i, (name, speed, towards, text, col) in enumerate(rows):
        cy = top + ctx.mm(7.0 * i)
        cx = x + ctx.mm(3.5)
        if speed > 0:
            ang = true_to_site_angle(towards)
            d = (math.cos(ang), math.sin(ang))
            length = ctx.mm(3.0)
            a = QPointF(cx - d[0] * length, cy + d[1] * length)
            b = QPointF(cx + d[0] * length, cy - d[1] * length)
            p.setPen(QPen(col, ctx.mm(0.6)))
            p.drawLine(a, QPointF(b.x() - d[0] * ctx.mm(1.2), b.y() + d[1] * ctx.mm(1.2)))
            _head(p, ctx, b, d, col)
        p.setPen(INK)
        p.setFont(ctx.font(6.5, True))
        p.drawText(QPointF(cx + ctx.mm(5), cy + ctx.mm(0.9)), name)
        p.setFont(ctx.font(6.5))
        w = ctx.metrics(6.5, True).horizontalAdvance(name)
        p.drawText(
            QPointF(cx + ctx.mm(6) + w, cy + ctx.mm(0.9)), text
        )  # a calm as the report says it


def _symbols(p: QPainter, ctx: Ctx, rect: QRectF, top: float) -> None:
    r = ctx.mm(1.0)
    p.setFont(ctx.font(6.0))
    x, x2 = rect.left() + ctx.mm(102), rect.left() + ctx.mm(141)
    ys = [top - ctx.mm(0.3), top + ctx.mm(3.9), top + ctx.mm(8.1)]
    texts = ["centroid", "centre of gravity", "crossing of the centreline"]
    draw_centroid(p, QPointF(x + r, ys[0]), 1.6 * r, INK, ctx.mm(0.25))
    draw_cog(p, QPointF(x + r, ys[1]), 1.25 * r, INK, ctx.mm(0.25))
    draw_crossing(p, QPointF(x + r, ys[2]), 1.6 * r, style.LINE_OF_ACTION, ctx.mm(0.3))
    p.setPen(INK)
    for y, text in zip(ys, texts, strict=True):
        p.drawText(QPointF(x + ctx.mm(3.5), y + ctx.mm(0.8)), text)
    lines = [
        (
            QPen(style.LINE_OF_ACTION, ctx.mm(0.3), Qt.PenStyle.DashLine),
            "line of action, net force",
        ),
        (QPen(style.NET_FORCE, ctx.mm(0.9)), "net force, yaw moment"),
        (QPen(style.CLEARANCE, ctx.mm(0.3), Qt.PenStyle.DotLine), "clearance, to scale"),
    ]
    for y, (pen, text) in zip(ys, lines, strict=True):
        p.setPen(pen)
        p.drawLine(QPointF(x2, y), QPointF(x2 + ctx.mm(6), y))
        p.setPen(INK)
        p.drawText(QPointF(x2 + ctx.mm(7.5), y + ctx.mm(0.8)), text)


def draw_key(p: QPainter, ctx: Ctx, rect: QRectF, diagram: StageDiagram) -> None:
    """The key under the map: conditions, scale, force scale, symbols."""
    top = rect.top() + ctx.mm(4.2)
    _conditions(p, ctx, rect.left() + ctx.mm(3), top, diagram)
    x = rect.left() + ctx.mm(52)
    diagram.frame.scale_bar(p, QPointF(x, top + ctx.mm(0.6)), diagram.units)
    yy = top + ctx.mm(7.8)
    fl = ctx.mm(10)
    p.setPen(QPen(style.TUG_FORCE, ctx.mm(0.55)))
    p.drawLine(QPointF(x, yy), QPointF(x + fl - ctx.mm(1.5), yy))
    _head(p, ctx, QPointF(x + fl, yy), (1.0, 0.0), style.TUG_FORCE)
    p.setPen(INK)
    p.setFont(ctx.font(6.0))
    step = f"{diagram.force_step:g} {label(diagram.units.unit('force'))}"
    p.drawText(QPointF(x + fl + ctx.mm(1.5), yy + ctx.mm(0.9)), f"force arrows: 10 mm = {step}")
    _symbols(p, ctx, rect, top)
