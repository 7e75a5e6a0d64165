"""The hold limits plot for the briefing: limiting wind speed against the true direction
the wind blows from, north up and clockwise, drawn with QPainter from core.solve.pulls.holdlimits."""

from __future__ import annotations

import math

import numpy as np
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPainterPath, QPen

from app.briefing.layout import FAIL, INK, MUTED, RULE, Ctx
from app.paint.rings import polar_scale
from app.paint.style import ALL_TUGS, ALL_TUGS_FILL, TUG_LOST
from app.paint.symbols import draw_planned_wind
from core.analysis.limits import wind_limit_as_given
from core.model.plan import Stage
from core.solve.holdlimits import HoldLimits, limit_at, limit_words
from core.units import DisplayUnits, fmt, label


class HoldPlot:
    """Paints one stage's hold limits (a core.solve.pulls.holdlimits.HoldLimits)."""

    def __init__(
        self,
        limits: HoldLimits,
        stage: Stage,
        units: DisplayUnits,
        current: HoldLimits | None = None,
    ) -> None:
        self.limits = limits
        self.stage = stage
        self.units = units
        #: A hold stage's current limits (all tugs, the wind as planned), said in words.
        self.current = current

    @property
    def has_curve(self) -> bool:
        """False when there is nothing a planner could read off a plot: the tugs cannot
        hold the body against the current alone, or can hold no wind from anywhere."""
        v = np.asarray(self.limits.all_tugs_ms, float)
        return bool(self.limits.holds_current and np.any(v > 0))

    def _speed(self, v_ms: np.ndarray) -> np.ndarray:
        return np.array([self.units.value(float(v), "speed") for v in v_ms])

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        lim = self.limits
        u = self.units
        dirs = np.asarray(lim.problem.directions_deg, float)
        all_v = self._speed(np.asarray(lim.all_tugs_ms))
        lost_v = self._speed(np.asarray(lim.worst_lost_ms)) if lim.with_lost else None
        c = self.stage.conditions
        planned = u.value(c.wind_speed_ms, "speed")
        max_wind = wind_limit_as_given(self.stage)
        top, ring = polar_scale(lim.all_tugs_ms, c.wind_speed_ms, max_wind, u)
        size = min(rect.height(), rect.width() * 0.55)
        r_max = size / 2 - ctx.mm(6)
        centre = QPointF(rect.left() + size / 2, rect.top() + size / 2)

        def at(direction_deg: float, speed: float) -> QPointF:
            r = r_max * min(speed, top) / top
            a = math.radians(direction_deg)
            return QPointF(centre.x() + r * math.sin(a), centre.y() - r * math.cos(a))

        p.setFont(ctx.font(6.0))
        for k in range(1, round(top / ring) + 1):
            r = r_max * k * ring / top
            p.setPen(QPen(RULE, ctx.mm(0.15)))
            p.drawEllipse(centre, r, r)
            p.setPen(MUTED)
            q = at(15.0, k * ring)  # along a spoke clear of north
            p.drawText(QPointF(q.x() + ctx.mm(0.5), q.y() + ctx.mm(0.8)), fmt(k * ring, 0))
        for d in range(0, 360, 30):
            p.setPen(QPen(RULE, ctx.mm(0.12)))
            p.drawLine(centre, at(d, top))
            q = at(d, top * 1.09)
            text = {0: "N", 90: "E", 180: "S", 270: "W"}.get(d, f"{d:03d}")
            p.setPen(INK)
            w = ctx.metrics(6.0).horizontalAdvance(text)
            p.drawText(QPointF(q.x() - w / 2, q.y() + ctx.mm(1)), text)

        def curve(values: np.ndarray, color: QColor, dash: Qt.PenStyle, fill: bool) -> None:
            path = QPainterPath()
            for i, (d, v) in enumerate(zip(dirs, values, strict=True)):
                pt = at(float(d), float(v) if math.isfinite(v) else top)
                if i == 0:
                    path.moveTo(pt)
                else:
                    path.lineTo(pt)
            path.closeSubpath()
            if fill:
                p.fillPath(path, ALL_TUGS_FILL)
            p.setPen(QPen(color, ctx.mm(0.5), dash))
            p.drawPath(path)

        curve(all_v, ALL_TUGS, Qt.PenStyle.SolidLine, True)
        if lost_v is not None:
            curve(lost_v, TUG_LOST, Qt.PenStyle.DashLine, False)
        if max_wind is not None:
            r = r_max * min(u.value(max_wind, "speed"), top) / top
            p.setPen(QPen(FAIL, ctx.mm(0.3), Qt.PenStyle.DotLine))
            p.drawEllipse(centre, r, r)
        if planned > 0:
            draw_planned_wind(p, at(c.wind_from_deg, planned), ctx.mm(1.4), ctx.mm(0.4))
        # legend and figures to the right
        x = rect.left() + size + ctx.mm(4)
        y = rect.top() + ctx.mm(4)
        sp = label(u.unit("speed"))
        lines: list[tuple[QColor | None, Qt.PenStyle | None, str]] = [
            (ALL_TUGS, Qt.PenStyle.SolidLine, "all tugs"),
        ]
        if lost_v is not None:
            lines.append((TUG_LOST, Qt.PenStyle.DashLine, "worst single tug lost"))
        if max_wind is not None:
            lines.append((FAIL, Qt.PenStyle.DotLine, f"stage limit {u.show(max_wind, 'speed')}"))
        if planned > 0:
            lines.append(
                (
                    None,
                    None,
                    f"planned wind {u.show(c.wind_speed_ms, 'speed')} from {c.wind_from_deg:03.0f}° (ringed dot)",
                )
            )
        p.setFont(ctx.font(7.0))
        for color, dash, text in lines:
            if color is not None and dash is not None:
                p.setPen(QPen(color, ctx.mm(0.5), dash))
                p.drawLine(QPointF(x, y - ctx.mm(1)), QPointF(x + ctx.mm(8), y - ctx.mm(1)))
            else:
                draw_planned_wind(
                    p, QPointF(x + ctx.mm(4), y - ctx.mm(1)), ctx.mm(1.4), ctx.mm(0.4)
                )
            p.setPen(INK)
            p.drawText(QPointF(x + ctx.mm(10), y), text)
            y += ctx.mm(4.5)
        y += ctx.mm(2)
        meaning = lim.meaning()
        facts = [
            f"{meaning[:1].upper()}{meaning[1:]} ({sp}), by the true direction the wind "
            "blows from, with the current as planned; same measure as the planned wind "
            "(mean at its height, with its gust factor).",
            f"Lowest with all tugs: {lim.lowest_words(u, mark='°')}.",
        ]
        if lost_v is not None:
            lost = lim.lowest_words(u, np.asarray(lim.worst_lost_ms), mark="°")
            facts.append(f"Lowest with the worst tug lost: {lost}.")
        if planned > 0:
            here = limit_at(lim, c.wind_from_deg)
            facts.append(
                f"From the planned direction {c.wind_from_deg:03.0f}°: {limit_words(here, u)} "
                f"with all tugs (planned {u.show(c.wind_speed_ms, 'speed')})."
                + (
                    " The planned wind is more than the tugs can hold."
                    if here < c.wind_speed_ms
                    else ""
                )
            )
        held = int(np.count_nonzero(np.asarray(lim.all_tugs_ms) > 0))
        if held < len(dirs):
            facts.append(
                f"Some wind can be held from {held} of the {len(dirs)} directions swept; from the "
                "others the tugs, within their working sectors (or at their leads as set where "
                "they have none), cannot resist any wind."
            )
        if lim.calm_words():
            facts.append(lim.calm_words() + ".")
        if self.current is not None:
            facts.append(self.current_words())
        beyond = [
            f"{int(np.count_nonzero(far))} directions for {name}"
            for name, v in (("all tugs", all_v), ("the worst tug lost", lost_v))
            if v is not None
            for far in [~np.isfinite(v) | (v > top * (1 + 1e-9))]
            if np.any(far)
        ]
        if beyond:
            facts.append(
                f"Limits beyond the outer ring ({fmt(top, 0)} {sp}) are drawn on it: from "
                f"{' and from '.join(beyond)}."
            )
        width = rect.right() - x
        p.setFont(ctx.font(7.0))
        for t in facts:
            h = ctx.text_height(t, width, 7.0)
            p.drawText(QRectF(x, y, width, h), int(Qt.TextFlag.TextWordWrap), t)
            y += h + ctx.mm(1.2)

    def current_words(self) -> str:
        """The current the tugs hold (a hold stage), from the stage result, in words."""
        cur = self.current
        if cur is None:
            return ""
        u, c, lim = self.units, self.stage.conditions, self.stage.limits
        here = limit_at(cur, c.current_towards_deg)
        text = (
            "Current the tugs can hold (all tugs, the wind as planned): lowest "
            f"{cur.lowest_words(u, mark='°')}; setting to the planned "
            f"{c.current_towards_deg:03.0f}°, {limit_words(here, u, 'current')} (planned "
            f"{u.show(c.current_speed_ms, 'speed')}"
        )
        if lim.max_current_ms is not None:
            text += f", stage limit {u.show(lim.max_current_ms, 'speed')}"
        return text + ")."
