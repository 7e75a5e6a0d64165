"""A map of the site on paper: a round scale, north up, the site's features and labels.

The stage diagrams and the overview of the move both draw on a :class:`MapFrame`:
it picks the smallest round scale 1 : N at which a box of the site (metres, x east,
y north) fits the drawing area, turns site points into device pixels, draws the
site's features clipped to the area, places labels where they cover no other label,
and draws the north arrow and the scale bar.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence

import shapely
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPen, QPolygonF

from app.briefing.layout import INK, MUTED, Ctx
from app.paint import style
from app.paint.symbols import draw_north
from core.model.plan import SiteFeature
from core.units import DisplayUnits

Pt = tuple[float, float]
Box = tuple[float, float, float, float]  # x0, y0, x1, y1, site m

#: Round drawing scales offered, 1 : N.
SCALES = (
    200,
    250,
    500,
    750,
    1000,
    1250,
    1500,
    2000,
    2500,
    3000,
    4000,
    5000,
    7500,
    10000,
    12500,
    15000,
    20000,
    25000,
    50000,
)
#: Scale bar lengths offered, display length units.
BAR_STEPS = (1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000)


def nice_scale(needed: float) -> int:
    """The smallest round scale 1 : N with N >= needed."""
    return next((s for s in SCALES if s >= needed), int(math.ceil(needed / 1000.0) * 1000))


def box_of(points: Iterable[Pt]) -> Box | None:
    pts = list(points)
    if not pts:
        return None
    xs, ys = [x for x, _ in pts], [y for _, y in pts]
    return (min(xs), min(ys), max(xs), max(ys))


def grown(box: Box, pad: float) -> Box:
    return (box[0] - pad, box[1] - pad, box[2] + pad, box[3] + pad)


class MapFrame:
    """Site metres to device pixels for one drawing area, with the labels placed so far."""

    def __init__(self, ctx: Ctx, area: QRectF, extent: Box) -> None:
        self.ctx = ctx
        self.area = QRectF(area)
        x0, y0, x1, y1 = extent
        w_m, h_m = max(x1 - x0, 1.0), max(y1 - y0, 1.0)
        # paper mm per metre must fit both ways; 1 : N means 1 m is 1000 / N mm
        mm_per_m = min(area.width() / ctx.mm(1) / w_m, area.height() / ctx.mm(1) / h_m)
        self.scale_n = nice_scale(1000.0 / mm_per_m)
        self.px_per_m = ctx.mm(1000.0 / self.scale_n)
        self.centre = ((x0 + x1) / 2, (y0 + y1) / 2)
        half_w, half_h = area.width() / 2 / self.px_per_m, area.height() / 2 / self.px_per_m
        cx, cy = self.centre
        #: What the area shows of the site, site m.
        self.view = shapely.box(cx - half_w, cy - half_h, cx + half_w, cy + half_h)
        #: Labels drawn so far (device px), so later ones can keep clear of them.
        self.taken: list[QRectF] = []

    def to_px(self, pt: Pt) -> QPointF:
        s = self.px_per_m
        return QPointF(
            self.area.center().x() + (pt[0] - self.centre[0]) * s,
            self.area.center().y() - (pt[1] - self.centre[1]) * s,
        )

    def poly(self, pts: Sequence[Pt]) -> QPolygonF:
        return QPolygonF([self.to_px(pt) for pt in pts])

    def metres(self, mm: float) -> float:
        """Site metres drawn ``mm`` long on paper."""
        return self.ctx.mm(mm) / self.px_per_m

    def shows(self, pt: Pt) -> bool:
        return bool(shapely.contains_xy(self.view, pt[0], pt[1]))

    # -- labels ------------------------------------------------------------------------
    def label_rect(self, at: QPointF, text: str, size: float, bold: bool) -> QRectF:
        m = self.ctx.metrics(size, bold)
        w, h = m.horizontalAdvance(text), m.height()
        return QRectF(at.x() - w / 2, at.y() - h / 2, w, h)

    def fits(self, r: QRectF, room: bool = False) -> bool:
        """Inside the area and clear of every label placed so far; with ``room``, by a
        margin of paper too (two labels end to end read as one phrase)."""
        inside = self.area.adjusted(self.ctx.mm(1), self.ctx.mm(1), -self.ctx.mm(1), 0)
        if room:
            side, top = self.ctx.mm(2.0), self.ctx.mm(0.3)
            r = r.adjusted(-side, -top, side, top)
        return inside.contains(r) and not any(r.intersects(o) for o in self.taken)

    def label(
        self,
        p: QPainter,
        at: QPointF,
        text: str,
        size: float = 6.5,
        color: QColor = INK,
        bold: bool = False,
        halo: bool = True,
        avoid: bool = False,
        room: bool = False,
    ) -> QRectF | None:
        """Draw a label centred on ``at``; with ``avoid``, not where it would cover another
        or leave the area (None then); ``room``: see :meth:`fits`."""
        r = self.label_rect(at, text, size, bold)
        if avoid and not self.fits(r, room):
            return None
        self.taken.append(r)
        if halo:
            ctx = self.ctx
            p.fillRect(
                r.adjusted(-ctx.mm(0.6), -ctx.mm(0.1), ctx.mm(0.6), ctx.mm(0.1)), style.LABEL_BG
            )
        p.setFont(self.ctx.font(size, bold))
        p.setPen(color)
        p.drawText(r, int(Qt.AlignmentFlag.AlignCenter), text)
        return r

    def spots_near(
        self, at: QPointF, text: str, size: float = 6.5, bold: bool = False
    ) -> list[QPointF]:
        """``at`` first, then spots round it, nearest first, each a box away: below,
        above, right and left of it, then the corners, then twice as far. For
        :meth:`first_free`, so a label that would cover another moves beside it and
        stays by what it names."""
        r = self.label_rect(at, text, size, bold)
        gap = self.ctx.mm(0.8)
        dx, dy = r.width() / 2 + gap, r.height() + gap / 2
        out = [QPointF(at)]
        for k in (1, 2):
            for sx, sy in ((0, 1), (0, -1), (1, 0), (-1, 0), (1, 1), (-1, 1), (1, -1), (-1, -1)):
                out.append(QPointF(at.x() + k * sx * dx, at.y() + k * sy * dy))
        return out

    def first_free(
        self,
        p: QPainter,
        spots: Sequence[QPointF],
        text: str,
        size: float = 6.5,
        color: QColor = INK,
        bold: bool = False,
    ) -> QRectF | None:
        """The label at the first of ``spots`` where it covers nothing with room to
        spare, else at the first where it covers nothing; at the first spot if there is
        no such place (a label is never left out)."""
        for room in (True, False):
            for at in spots:
                r = self.label(p, at, text, size, color, bold, avoid=True, room=room)
                if r is not None:
                    return r
        return self.label(p, spots[0], text, size, color, bold) if spots else None

    # -- the site ------------------------------------------------------------------------
    def features(self, p: QPainter, features: Sequence[SiteFeature]) -> None:
        ctx = self.ctx
        for f in features:
            pts = list(f.points)
            if f.kind == "quay":
                p.setPen(
                    QPen(style.QUAY, ctx.mm(1.1), Qt.PenStyle.SolidLine, Qt.PenCapStyle.FlatCap)
                )
                p.drawPolyline(self.poly(pts))
            elif f.kind == "limit":
                p.setPen(QPen(style.LIMIT, ctx.mm(0.35), Qt.PenStyle.DashLine))
                p.setBrush(Qt.BrushStyle.NoBrush)
                if f.closed:
                    p.drawPolygon(self.poly(pts))
                else:
                    p.drawPolyline(self.poly(pts))
            else:
                p.setPen(QPen(style.QUAY, ctx.mm(0.3)))
                p.setBrush(style.VESSEL_FILL if f.kind == "vessel" else style.DOLPHIN_FILL)
                p.drawPolygon(self.poly(pts))
                p.setBrush(Qt.BrushStyle.NoBrush)

    def feature_labels(
        self, p: QPainter, features: Sequence[SiteFeature], bodies: shapely.Geometry | None
    ) -> None:
        """Each feature's name on its part inside the map, away from the bodies, where it
        covers nothing already drawn; a feature with no room keeps its name off."""
        for f in features:
            for at in self._feature_label_spots(f, bodies):
                if self.label(p, at, f.name, 6.0, MUTED, avoid=True):
                    break

    def _feature_label_spots(
        self, f: SiteFeature, bodies: shapely.Geometry | None
    ) -> list[QPointF]:
        view = self.view.buffer(-self.metres(8.0))
        if f.closed and f.kind != "limit":
            part = shapely.Polygon(f.points).intersection(view)
            if part.is_empty:
                return []
            q = part.representative_point()
            return [self.to_px((q.x, q.y))]
        line = shapely.LineString(f.points if not f.closed else [*f.points, f.points[0]])
        part = line.intersection(view)
        if part.is_empty or part.length <= 0:
            return []
        centre = bodies.centroid if bodies is not None and not bodies.is_empty else None
        off = self.metres(2.6)
        spots: list[tuple[float, QPointF]] = []
        for seg in getattr(part, "geoms", [part]):
            for t in (0.15, 0.5, 0.85, 0.3, 0.7):
                q = seg.interpolate(t, normalized=True)
                a = seg.interpolate(max(0.0, t - 0.01), normalized=True)
                b = seg.interpolate(min(1.0, t + 0.01), normalized=True)
                dx, dy = b.x - a.x, b.y - a.y
                n = math.hypot(dx, dy) or 1.0
                nx, ny = -dy / n, dx / n
                if centre is not None and (centre.x - q.x) * nx + (centre.y - q.y) * ny > 0:
                    nx, ny = -nx, -ny  # the side away from the bodies
                d = bodies.distance(q) if bodies is not None else 0.0
                spots.append((d, self.to_px((q.x + nx * off, q.y + ny * off))))
        spots.sort(key=lambda s: -s[0])
        return [pt for _, pt in spots]

    # -- north and scale ------------------------------------------------------------------
    def north(self, p: QPainter) -> None:
        ctx = self.ctx
        c = QPointF(self.area.right() - ctx.mm(8), self.area.top() + ctx.mm(10))
        draw_north(p, c, ctx.mm(4.5), ctx.font(7.5, True), ctx.mm(0.25))
        self.taken.append(QRectF(c.x() - ctx.mm(6), c.y() - ctx.mm(9), ctx.mm(12), ctx.mm(15)))

    def scale_bar(
        self, p: QPainter, at: QPointF, units: DisplayUnits, max_mm: float = 28.0
    ) -> None:
        """A four-part scale bar from ``at`` (its left end) with its length and the ratio."""
        ctx = self.ctx
        unit_m = units.si(1.0, "length")
        target_m = ctx.mm(max_mm) / self.px_per_m
        n = max((s for s in BAR_STEPS if s * unit_m <= target_m), default=BAR_STEPS[0])
        length = n * unit_m * self.px_per_m
        x, y = at.x(), at.y()
        p.setPen(QPen(INK, ctx.mm(0.25)))
        for k in range(4):
            seg = QRectF(x + k * length / 4, y - ctx.mm(1.1), length / 4, ctx.mm(1.1))
            p.setBrush(INK if k % 2 == 0 else QColor("white"))
            p.drawRect(seg)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.setFont(ctx.font(6.0))
        p.drawText(QPointF(x + length + ctx.mm(1.5), y), f"{n} {units.unit('length')}")
        p.drawText(
            QPointF(x, y + ctx.mm(3.6)),
            f"Scale 1 : {self.scale_n:,}".replace(",", " ") + " on this page size",
        )
