"""The board's grid, scale bar and north arrow.

The grid is drawn in site metres behind the items; the scale bar and north arrow are
drawn in device pixels on top (:func:`draw_scale_bar`, :func:`draw_north_arrow`), so a
printed diagram can call them too.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPen

from app.paint import style
from app.paint.symbols import draw_north
from core.units import DisplayUnits, from_si, label


def nice_step(raw: float) -> float:
    """The 1-2-5 step at or above ``raw``."""
    if raw <= 0 or not math.isfinite(raw):
        return 1.0
    k = 10 ** math.floor(math.log10(raw))
    for m in (1, 2, 5, 10):
        if m * k >= raw:
            return m * k
    return 10 * k


def nice_floor(raw: float) -> float:
    """The 1-2-5 value at or below ``raw``."""
    if raw <= 0 or not math.isfinite(raw):
        return 1.0
    k = 10 ** math.floor(math.log10(raw))
    for m in (5, 2, 1):
        if m * k <= raw * (1 + 1e-12):
            return m * k
    return k


def draw_grid(
    painter: QPainter, rect: QRectF, min_px: float = 22.0, base: float | None = None
) -> None:
    """Grid lines over ``rect`` (site m): minor every step, major every fifth.

    With ``base`` (m, the snap step) the lines fall on whole 1-2-5 multiples of it, so
    every line drawn is one a point can snap to; without, on a 1-2-5 step of metres.
    """
    t = painter.worldTransform()
    k = style.device_scale(painter)
    ppm = (math.hypot(t.m11(), t.m12()) or 1.0) / k
    if base is not None and base > 0:
        step = base * nice_step(min_px / ppm / base) if base * ppm < min_px else base
    else:
        step = nice_step(min_px / ppm)
    x0 = math.floor(rect.left() / step) * step
    y0 = math.floor(rect.top() / step) * step
    if (rect.width() / step) > 400 or (rect.height() / step) > 400:
        return
    minor_lines: list[QLineF] = []
    major_lines: list[QLineF] = []
    x = x0
    while x <= rect.right():
        (major_lines if round(x / step) % 5 == 0 else minor_lines).append(
            QLineF(x, rect.top(), x, rect.bottom())
        )
        x += step
    y = y0
    while y <= rect.bottom():
        (major_lines if round(y / step) % 5 == 0 else minor_lines).append(
            QLineF(rect.left(), y, rect.right(), y)
        )
        y += step
    painter.save()
    painter.setRenderHint(QPainter.RenderHint.Antialiasing, False)  # crisp, and cheaper
    painter.setPen(style.pen(style.GRID_MINOR, k))
    painter.drawLines(minor_lines)
    painter.setPen(style.pen(style.GRID_MAJOR, k))
    painter.drawLines(major_lines)
    painter.restore()


def draw_scale_bar(
    painter: QPainter, corner: QPointF, px_per_m: float, units: DisplayUnits, max_px: float = 160.0
) -> None:
    """A scale bar with its bottom-left at ``corner`` (device pixels), in the length unit."""
    u = units.unit("length")
    unit_m = 1.0 / from_si(1.0, "length", u)  # metres in one display unit
    length_units = nice_floor(max_px / (px_per_m * unit_m))
    step_units = length_units / 2
    w = length_units * unit_m * px_per_m
    painter.save()
    painter.setRenderHint(QPainter.RenderHint.Antialiasing)
    x, y = corner.x(), corner.y()
    painter.setPen(Qt.PenStyle.NoPen)
    painter.setBrush(style.LABEL_BG)
    painter.drawRoundedRect(QRectF(x - 6, y - 30, w + 12, 36), 4, 4)
    painter.setPen(QPen(style.TEXT, 1))
    painter.setBrush(style.TEXT)
    painter.drawRect(QRectF(x, y - 8, w / 2, 6))
    painter.setBrush(QColor("white"))
    painter.drawRect(QRectF(x + w / 2, y - 8, w / 2, 6))
    painter.setFont(style.label_font(8.5))
    painter.drawText(QPointF(x - 2, y - 12), "0")
    painter.drawText(QPointF(x + w / 2 - 6, y - 12), f"{step_units:g}")
    painter.drawText(QPointF(x + w - 10, y - 12), f"{length_units:g} {label(u)}")
    painter.restore()


def draw_north_arrow(painter: QPainter, centre: QPointF, size: float = 22.0) -> None:
    """A north arrow pointing up the device (the board always has north up)."""
    draw_north(painter, centre, size, style.label_font(9, bold=True), 1.2)
