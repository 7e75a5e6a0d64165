"""A tug's capability as a small polar diagram, for the tug editor.

The tug sits at the centre, bow up. Each way of working it can do is one closed curve:
the distance from the centre in a direction is the usable share of the rated bollard
pull when the tug works that way with its pull in that direction, read as a relative
bearing of the tug's own heading (000 up, clockwise). The rings are every quarter of
the bollard pull, the full pull in bold. The figures are the capability's own
(core.model.capability); the widget only draws them.
"""

from __future__ import annotations

import math
import traceback

import numpy as np
from PySide6.QtCore import QPointF, QRectF, QSize, Qt
from PySide6.QtGui import QColor, QPainter, QPainterPath, QPaintEvent, QPen, QPolygonF
from PySide6.QtWidgets import QSizePolicy, QWidget

from app.guard import guarded
from app.paint import style
from app.paint.shapes import tug_outline
from core.model.capability import WAY_WORDS, WAYS, Capability, CapabilityCurve, Way

#: One pen per way of working: colour and dash, so the curves part on grey paper too.
#: The width falls from the first to the last way, so a curve drawn over an equal one
#: leaves it showing on both sides.
WAY_PENS: dict[Way, tuple[QColor, Qt.PenStyle, float]] = {
    "line": (style.CAPABILITY_LINE, Qt.PenStyle.SolidLine, 4.0),
    "push": (style.CAPABILITY_PUSH, Qt.PenStyle.DashLine, 2.0),
    "push_pull": (style.CAPABILITY_PUSH_PULL, Qt.PenStyle.DashLine, 1.6),
}
#: Each curve is drawn through this many bearings (its own points are among them).
CURVE_STEPS = 360


class CapabilityPolar(QWidget):
    """Draws a :class:`Capability` (or says there is none)."""

    def __init__(self, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.capability: Capability | None = None
        self.setMinimumSize(200, 220)
        self.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Expanding)
        self.setToolTip(
            "Usable share of the rated bollard pull by the direction of the tug's pull, "
            "relative to its own heading (000 over the bow, clockwise), one curve per way "
            "of working. Rings every 25 % of the bollard pull."
        )

    @guarded(default=QSize)
    def sizeHint(self) -> QSize:
        return QSize(260, 280)

    def set_capability(self, capability: Capability | None) -> None:
        self.capability = capability
        self.update()

    # -- geometry -------------------------------------------------------------------
    def top(self) -> float:
        """The outer ring, as a share of the bollard pull (1, or more when a curve is)."""
        cap = self.capability
        big = 1.0
        if cap is not None:
            for way in WAYS:
                c = cap.curve(way)
                if c is not None:
                    big = max(big, max(c.fractions))
        return math.ceil(big * 4 - 1e-9) / 4

    def frame(self) -> tuple[QPointF, float]:
        """Centre and radius of the chart (room for bearings round it, the key under it)."""
        r = self.rect()
        key = 22.0
        radius = max(min((r.width() - 56.0) / 2.0, (r.height() - key - 40.0) / 2.0), 20.0)
        return QPointF(r.center().x(), 20.0 + radius), radius

    def at(self, bearing_deg: float, share: float) -> QPointF:
        """Where a share at a relative bearing lies on the widget."""
        centre, radius = self.frame()
        r = radius * share / self.top()
        a = math.radians(bearing_deg)
        return QPointF(centre.x() + r * math.sin(a), centre.y() - r * math.cos(a))

    # -- painting -------------------------------------------------------------------
    @guarded
    def paintEvent(self, event: QPaintEvent) -> None:
        p = QPainter(self)
        try:
            p.setRenderHint(QPainter.RenderHint.Antialiasing)
            p.fillRect(self.rect(), QColor("white"))
            self._grid(p)
            self._tug(p)
            cap = self.capability
            if cap is None:
                p.setPen(style.MUTED)
                p.drawText(self.rect(), Qt.AlignmentFlag.AlignCenter, "No capability")
                return
            shown: list[Way] = []
            for way in WAYS:
                curve = cap.curve(way)
                if curve is not None:
                    self._curve(p, curve, *WAY_PENS[way])
                    shown.append(way)
            self._key(p, cap, shown)
        except Exception:  # nothing may escape into Qt
            traceback.print_exc()
        finally:
            p.end()

    def _grid(self, p: QPainter) -> None:
        centre, radius = self.frame()
        top = self.top()
        n = round(top * 4)
        for i in range(1, n + 1):
            r = radius * i / n
            full = abs(i / 4 - 1.0) < 1e-9
            p.setPen(QPen(style.RULE if full else style.GRID_MAJOR, 1.4 if full else 1.0))
            p.setBrush(Qt.BrushStyle.NoBrush)
            p.drawEllipse(centre, r, r)
        for k in range(0, 360, 45):
            p.setPen(QPen(style.GRID_MINOR, 1.0))
            p.drawLine(centre, self.at(k, top))
        small = p.font()
        small.setPointSizeF(max(7.0, small.pointSizeF() - 1.0))
        p.setFont(small)
        for k, text in ((0, "000 ahead"), (90, "090"), (180, "180 astern"), (270, "270")):
            a = math.radians(k)
            x = centre.x() + (radius + 16) * math.sin(a)
            y = centre.y() - (radius + 9) * math.cos(a)
            p.setPen(style.MUTED)
            p.drawText(QRectF(x - 40, y - 8, 80, 16), Qt.AlignmentFlag.AlignCenter, text)
        # ring values up the 045 spoke: 50 % and 100 % of the bollard pull
        for share in (0.5, 1.0):
            if share > top + 1e-9:
                continue
            at = self.at(22.5, share)
            text = "100 % BP" if share == 1.0 else "50 %"
            w = p.fontMetrics().horizontalAdvance(text) + 4
            box = QRectF(at.x() + 1, at.y() - p.fontMetrics().height() + 2, w, 14)
            p.fillRect(box, style.LABEL_BG)
            p.setPen(style.MUTED)
            p.drawText(box, Qt.AlignmentFlag.AlignCenter, text)

    def _tug(self, p: QPainter) -> None:
        """A small tug at the centre, bow up."""
        centre, radius = self.frame()
        size = 0.22 * radius
        pts = [
            QPointF(centre.x() - y * size / 30.0, centre.y() - x * size / 30.0)
            for x, y in tug_outline()
        ]
        p.setPen(QPen(style.TUG_EDGE, 1.0))
        p.setBrush(style.TUG_FILL)
        p.drawPolygon(QPolygonF(pts))
        p.setBrush(Qt.BrushStyle.NoBrush)

    def _curve(
        self, p: QPainter, curve: CapabilityCurve, color: QColor, dash: Qt.PenStyle, width: float
    ) -> None:
        bearings = np.union1d(np.linspace(0.0, 360.0, CURVE_STEPS + 1), curve.bearings_deg)
        shares = curve.at_bearings(bearings)
        path = QPainterPath()
        path.addPolygon(
            QPolygonF(
                [self.at(b, s) for b, s in zip(bearings.tolist(), shares.tolist(), strict=True)]
            )
        )
        path.closeSubpath()
        pen = QPen(QColor(color.red(), color.green(), color.blue(), 150) if width > 3 else color)
        pen.setWidthF(width)
        pen.setStyle(dash)
        pen.setJoinStyle(Qt.PenJoinStyle.RoundJoin)
        p.setPen(pen)
        p.drawPath(path)
        # the entered points, so a planner sees where the figures are and where they are
        # only joined by straight lines
        p.setBrush(color)
        p.setPen(Qt.PenStyle.NoPen)
        for b, s in zip(curve.bearings_deg, curve.fractions, strict=True):
            p.drawEllipse(self.at(b, s), 2.2, 2.2)
        p.setBrush(Qt.BrushStyle.NoBrush)

    def _key(self, p: QPainter, cap: Capability, ways: list[Way]) -> None:
        y = self.height() - 10.0
        x = 6.0
        for way in ways:
            color, dash, width = WAY_PENS[way]
            p.setPen(QPen(color, min(width, 2.5), dash))
            p.drawLine(QPointF(x, y - 4), QPointF(x + 20, y - 4))
            p.setPen(style.TEXT)
            text = WAY_WORDS[way]
            if way == "push_pull" and cap.push_pull is not None and cap.push_pull == cap.line:
                text += " (= on a line)"
            p.drawText(QPointF(x + 24, y), text)
            x += 34 + p.fontMetrics().horizontalAdvance(text)
