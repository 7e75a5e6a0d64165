"""The stage diagram of the briefing: the site, the bodies, the tugs and the forces, to scale.

Drawn with QPainter from the core's numbers in the site frame (x east, y north,
north up on the paper). The drawing scale is a round ratio chosen to fit, and force
arrows have their own stated scale, so a planner can read both off the paper.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import shapely
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPainterPath, QPen, QPolygonF

from app.briefing.layout import FAIL, INK, MUTED, RULE, Ctx
from app.paint import style
from app.paint.shapes import TUG_LENGTH_M, arrow_head, placed_tug, tug_label_anchor, tug_origin
from app.paint.symbols import (
    draw_centroid,
    draw_cog,
    draw_crossing,
    draw_north,
    paint_arrow,
    polygon,
    polyline_path,
)
from core.analysis.checks import StageCheck
from core.frames import site_angle_to_true, true_to_site_angle
from core.mechanics.balance import Balance
from core.mechanics.bodies import body_of
from core.mechanics.clearance import notable_clearances
from core.mechanics.site import PlacedBody, body_pose, place_body, placed_bodies
from core.model.plan import Project, SiteFeature
from core.units import fmt, label

Pt = tuple[float, float]

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
#: Round force-arrow scales, display units per 10 mm of arrow.
FORCE_STEPS = (1, 2, 2.5, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000)
LEGEND_MM = 17.0  # the key strip under the map

HULL_FILL, HULL_EDGE = style.HULL_FILL, style.HULL_EDGE
TUG_FILL, TUG_EDGE, TUG_FORCE = style.TUG_FILL, style.TUG_EDGE, style.TUG_FORCE
NET_FORCE, LOAD_FORCE, CURRENT = style.NET_FORCE, style.WIND, style.CURRENT
QUAY, VESSEL_FILL, LIMIT = style.QUAY, style.VESSEL_FILL, style.LIMIT
PORT_RED, STBD_GREEN = style.PORT, style.STARBOARD


@dataclass(frozen=True, slots=True)
class Arrow:
    tail: Pt  # site frame, m
    force: Pt  # site frame, N
    label: str


def stage_placed(project: Project, check: StageCheck) -> list[PlacedBody]:
    """Bodies posed in the stage, and any body worked on in it without a pose."""
    stage = check.stage
    placed = list(placed_bodies(project, stage))
    names = {pb.name for pb in placed}
    for b in check.balances:
        if b.body not in names:
            placed.append(place_body(body_of(project, b.body), body_pose(project, stage, b.body)))
    return placed


def _nice_scale(needed: float) -> int:
    """The smallest round scale 1 : N with N >= needed."""
    return next((s for s in SCALES if s >= needed), int(math.ceil(needed / 1000.0) * 1000))


def force_step(max_force_display: float) -> float:
    """Display units per 10 mm of arrow, so that the largest arrow is at most about 30 mm."""
    want = max_force_display / 3.0
    return next((s for s in FORCE_STEPS if s >= want), FORCE_STEPS[-1])


class StageDiagram:
    """Everything needed to paint one stage, worked out from the core's results."""

    def __init__(self, project: Project, check: StageCheck) -> None:
        self.project = project
        self.check = check
        self.units = project.units
        self.placed = stage_placed(project, check)
        self.by_name = {pb.name: pb for pb in self.placed}
        self.tug_arrows: list[tuple[Balance, Arrow, Pt, Pt, bool]] = []  # arrow, tug pos, dir, push
        self.net_arrows: list[tuple[Balance, Arrow]] = []
        self.load_arrows: list[Arrow] = []
        for b in check.balances:
            pb = self.by_name[b.body]
            pl = pb.placing
            for sh in b.shares:
                layout_point = self._share_point(b, sh.tug)
                tail = pl.point(layout_point)
                f = pl.direction(sh.force)
                mag = math.hypot(*sh.force)
                d = (
                    (f[0] / mag, f[1] / mag)
                    if mag > 0
                    else pl.direction(_unit(sh.lead_bearing_deg))
                )
                self.tug_arrows.append(
                    (
                        b,
                        Arrow(tail, f, f"{sh.tug} {self.units.show(sh.pull_n, 'force')}"),
                        pl.point(sh.position),
                        d,
                        sh.mode == "push",
                    )
                )
            c = pl.point(b.centroid)
            self.net_arrows.append((b, Arrow(c, pl.direction(b.net_force), "net")))
            for ld in b.loads:
                self.load_arrows.append(Arrow(pl.point(ld.point), pl.direction(ld.force), ld.name))
        forces = [math.hypot(*a.force) for _, a, *_ in self.tug_arrows]
        forces += [math.hypot(*a.force) for _, a in self.net_arrows]
        forces += [math.hypot(*a.force) for a in self.load_arrows]
        top = max(forces, default=0.0)
        self.force_step = force_step(self.units.value(top, "force")) if top > 0 else 10.0
        self.extent = self._extent()

    def _share_point(self, b: Balance, tug: str) -> Pt:
        stage = self.check.stage
        placement = stage.placement(tug)
        body = self.by_name[b.body].body
        member, fitting = body.fitting(placement.hull, placement.point)
        return member.to_body((fitting.x, fitting.y))

    def _extent(self) -> tuple[float, float, float, float]:
        xs: list[float] = []
        ys: list[float] = []
        size = 30.0
        for pb in self.placed:
            x0, y0, x1, y1 = pb.polygon.bounds
            xs += [x0, x1]
            ys += [y0, y1]
            size = max(size, pb.body.length, pb.body.beam)
        for _b, _a, pos, d, push in self.tug_arrows:
            far = (pos[0] + d[0] * TUG_LENGTH_M, pos[1] + d[1] * TUG_LENGTH_M) if not push else pos
            xs += [pos[0], far[0]]
            ys += [pos[1], far[1]]
        if not xs:
            xs, ys = [-50.0, 50.0], [-50.0, 50.0]
        pad = 0.35 * size
        return (min(xs) - pad, min(ys) - pad, max(xs) + pad, max(ys) + pad)

    # -- painting --------------------------------------------------------------------------
    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        strip = ctx.mm(LEGEND_MM)
        area = QRectF(rect.left(), rect.top(), rect.width(), rect.height() - strip)
        legend = QRectF(rect.left(), area.bottom(), rect.width(), strip)
        x0, y0, x1, y1 = self.extent
        w_m, h_m = max(x1 - x0, 1.0), max(y1 - y0, 1.0)
        # paper mm per metre must fit both ways; 1 : N means 1 m is 1000 / N mm
        mm_per_m = min(area.width() / ctx.mm(1) / w_m, area.height() / ctx.mm(1) / h_m)
        self.scale_n = _nice_scale(1000.0 / mm_per_m)
        s = ctx.mm(1000.0 / self.scale_n)  # device px per metre
        cx, cy = (x0 + x1) / 2, (y0 + y1) / 2
        ox, oy = area.center().x(), area.center().y()

        def to_px(pt: Pt) -> QPointF:
            return QPointF(ox + (pt[0] - cx) * s, oy - (pt[1] - cy) * s)

        self.to_px, self.px_per_m = to_px, s
        self.taken: list[QRectF] = []
        half_w, half_h = area.width() / 2 / s, area.height() / 2 / s
        self.view = shapely.box(cx - half_w, cy - half_h, cx + half_w, cy + half_h)
        p.setPen(QPen(RULE, ctx.mm(0.3)))
        p.setBrush(style.WATER)
        p.drawRect(area)
        p.setBrush(QColor("white"))
        p.drawRect(legend)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.save()
        p.setClipRect(area)
        for f in self.project.site.features:
            self._feature(p, ctx, f)
        for pb in self.placed:
            self._body(p, ctx, pb)
        self._clearances(p, ctx)
        for b, _a in self.net_arrows:
            self._line_of_action(p, ctx, b, area)
        for _b, a, pos, d, push in self.tug_arrows:
            self._tug(p, ctx, a, pos, d, push)
        for a in self.load_arrows:
            col = style.load_color(a.label)
            self._arrow(p, ctx, a.tail, a.force, col, 0.45)
            end = self._arrow_end(ctx, a.tail, a.force)
            self._label(p, ctx, QPointF(end.x(), end.y() + ctx.mm(2.4)), a.label, 6.0, col)
        for b, a in self.net_arrows:
            self._net(p, ctx, b, a)
        for pb in self.placed:
            self._body_name(p, ctx, pb)
        self._clearance_labels(p, ctx)
        self._feature_labels(p, ctx)
        p.restore()
        self._north(p, ctx, area)
        self._legend(p, ctx, legend)

    def _poly(self, pts: list[Pt] | tuple[Pt, ...]) -> QPolygonF:
        return QPolygonF([self.to_px(pt) for pt in pts])

    def _label(
        self,
        p: QPainter,
        ctx: Ctx,
        at: QPointF,
        text: str,
        size: float = 6.5,
        color: QColor = INK,
        bold: bool = False,
        halo: bool = True,
        avoid: bool = False,
    ) -> bool:
        """Draw a centred label; with ``avoid``, skip it (False) where it would cover another."""
        p.setFont(ctx.font(size, bold))
        m = ctx.metrics(size, bold)
        w, h = m.horizontalAdvance(text), m.height()
        r = QRectF(at.x() - w / 2, at.y() - h / 2, w, h)
        if avoid and any(r.intersects(o) for o in self.taken):
            return False
        self.taken.append(r)
        if halo:
            p.fillRect(
                r.adjusted(-ctx.mm(0.6), -ctx.mm(0.1), ctx.mm(0.6), ctx.mm(0.1)),
                style.LABEL_BG,
            )
        p.setPen(color)
        p.drawText(r, int(Qt.AlignmentFlag.AlignCenter), text)
        return True

    def _feature(self, p: QPainter, ctx: Ctx, f: SiteFeature) -> None:
        pts = list(f.points)
        if f.kind == "quay":
            p.setPen(QPen(QUAY, ctx.mm(1.1), Qt.PenStyle.SolidLine, Qt.PenCapStyle.FlatCap))
            p.drawPolyline(self._poly(pts))
        elif f.kind == "limit":
            p.setPen(QPen(LIMIT, ctx.mm(0.35), Qt.PenStyle.DashLine))
            p.setBrush(Qt.BrushStyle.NoBrush)
            if f.closed:
                p.drawPolygon(self._poly(pts))
            else:
                p.drawPolyline(self._poly(pts))
        else:
            fill = VESSEL_FILL if f.kind == "vessel" else style.DOLPHIN_FILL
            p.setPen(QPen(QUAY, ctx.mm(0.3)))
            p.setBrush(fill)
            p.drawPolygon(self._poly(pts))
            p.setBrush(Qt.BrushStyle.NoBrush)

    def _feature_labels(self, p: QPainter, ctx: Ctx) -> None:
        """Each feature's name where it covers nothing already drawn, else left out."""
        for f in self.project.site.features:
            for at in self._feature_label_spots(ctx, f):
                if self._label(p, ctx, at, f.name, 6.0, MUTED, avoid=True):
                    break

    def _feature_label_spots(self, ctx: Ctx, f: SiteFeature) -> list[QPointF]:
        """Where a feature's name may go, best first: on its part inside the map, away from
        the bodies."""
        inset = 8.0 / (self.px_per_m / ctx.mm(1))  # 8 mm in from the map's edge, in metres
        view = self.view.buffer(-inset)
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
        bodies = shapely.union_all([pb.polygon for pb in self.placed]) if self.placed else None
        centre = bodies.centroid if bodies is not None else None
        off = 2.6 / (self.px_per_m / ctx.mm(1))
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

    def _body(self, p: QPainter, ctx: Ctx, pb: PlacedBody) -> None:
        pl = pb.placing
        for outline in pb.body.outlines():
            p.setPen(QPen(HULL_EDGE, ctx.mm(0.25)))
            p.setBrush(HULL_FILL)
            p.drawPolygon(self._poly([pl.point(v) for v in outline]))
        p.setBrush(Qt.BrushStyle.NoBrush)
        ext = pb.polygon.exterior.coords
        p.setPen(QPen(HULL_EDGE, ctx.mm(0.55)))
        p.drawPolygon(self._poly([(x, y) for x, y in ext]))
        body = pb.body
        # centreline of each member, its bow marked with an arrowhead
        pen = QPen(HULL_EDGE, ctx.mm(0.18), Qt.PenStyle.DashDotLine)
        for k, m in enumerate(body.members):
            g = m.hull.geometry
            a, b = m.to_body((g.x_min, 0.0)), m.to_body((g.x_max, 0.0))
            p.setPen(pen)
            p.drawLine(self.to_px(pl.point(a)), self.to_px(pl.point(b)))
            tip = m.to_body((g.x_max - 0.06 * g.length, 0.0))
            self._arrowhead(
                p,
                ctx,
                self.to_px(pl.point(tip)),
                pl.direction(m.direction_to_body((1.0, 0.0))),
                HULL_EDGE,
                2.6,
            )
            if k == 0:
                word = m.to_body((g.x_max - 0.2 * g.length, 0.0))
                self._label(
                    p, ctx, self.to_px(pl.point(word)), "BOW", 5.5, HULL_EDGE, True, halo=False
                )
        # port (red) and starboard (green) sides, just outside the outline at mid-length
        x0, y0, x1, y1 = body.polygon.bounds
        off = max(0.06 * body.beam, 3.0)
        mid = (x0 + x1) / 2
        half = 0.15 * body.length
        for y, text, col in ((y1 + off, "P", PORT_RED), (y0 - off, "S", STBD_GREEN)):
            a, b = pl.point((mid - half, y)), pl.point((mid + half, y))
            p.setPen(QPen(col, ctx.mm(0.8)))
            p.drawLine(self.to_px(a), self.to_px(b))
            end = self.to_px(b)
            d = pl.direction((1.0, 0.0))
            at = QPointF(end.x() + d[0] * ctx.mm(2.2), end.y() - d[1] * ctx.mm(2.2))
            self._label(p, ctx, at, text, 6.0, col, True)
        # centroid (circle and cross) and centre of gravity (quartered circle)
        c = self.to_px(pl.point(body.centroid))
        r = ctx.mm(2.0)
        draw_centroid(p, c, r, INK, ctx.mm(0.25))
        gp = self.to_px(pl.point(body.centre_of_gravity))
        if math.hypot(gp.x() - c.x(), gp.y() - c.y()) > ctx.mm(0.4):
            draw_cog(p, gp, r, INK, ctx.mm(0.25))

    def _body_name(self, p: QPainter, ctx: Ctx, pb: PlacedBody) -> None:
        """The body's name just beyond its stern, on the centreline."""
        body = pb.body
        gap = 5.0 / (self.px_per_m / ctx.mm(1))
        at = pb.placing.point((body.x_min - gap, body.centroid[1]))
        self._label(p, ctx, self.to_px(at), pb.name, 7.0, HULL_EDGE, True)

    def _arrowhead(
        self, p: QPainter, ctx: Ctx, tip: QPointF, d: Pt, color: QColor, size_mm: float
    ) -> None:
        # d is a site direction; on paper y is down
        n = math.hypot(*d) or 1.0
        L = ctx.mm(size_mm)
        tail = QPointF(tip.x() - d[0] / n * L * 2, tip.y() + d[1] / n * L * 2)
        parts = arrow_head((tail.x(), tail.y()), (tip.x(), tip.y()), L)
        if parts is None:
            return
        p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(color)
        p.drawPolygon(polygon(parts[1]))
        p.setBrush(Qt.BrushStyle.NoBrush)

    def arrow_mm(self, force_n: float) -> float:
        """Paper length of an arrow for a force, mm."""
        return 10.0 * self.units.value(force_n, "force") / self.force_step

    def _arrow(
        self,
        p: QPainter,
        ctx: Ctx,
        tail: Pt,
        force: Pt,
        color: QColor,
        width_mm: float,
        head_at_point: bool = False,
    ) -> QPointF:
        mag = math.hypot(*force)
        if mag <= 0:
            return self.to_px(tail)
        length = ctx.mm(self.arrow_mm(mag))
        d = (force[0] / mag, force[1] / mag)
        t = self.to_px(tail)
        start = t
        end = QPointF(t.x() + d[0] * length, t.y() - d[1] * length)
        if head_at_point:  # a push: the arrow ends at the point it pushes on
            start, end = QPointF(t.x() - d[0] * length, t.y() + d[1] * length), t
        parts = arrow_head(
            (start.x(), start.y()), (end.x(), end.y()), ctx.mm(max(1.8, width_mm * 3.5))
        )
        if parts is not None:
            pen = QPen(color, ctx.mm(width_mm), Qt.PenStyle.SolidLine, Qt.PenCapStyle.FlatCap)
            shaft = polyline_path([(start.x(), start.y()), parts[0]])
            paint_arrow(p, pen, color, shaft, polygon(parts[1]), ctx.mm(0.1))
        return end

    def _tug(self, p: QPainter, ctx: Ctx, a: Arrow, pos: Pt, d: Pt, push: bool) -> None:
        """The tug as on the board (app.paint.shapes), at least 5 mm long on paper."""
        mode = "push" if push else "line"
        if not push:
            p.setPen(QPen(style.TOWLINE, ctx.mm(0.3)))
            p.drawLine(self.to_px(a.tail), self.to_px(pos))
        length = max(TUG_LENGTH_M, ctx.mm(5) / self.px_per_m)
        origin = tug_origin(mode, a.tail, pos, d, length)
        p.setPen(QPen(TUG_EDGE, ctx.mm(0.3)))
        p.setBrush(TUG_FILL)
        p.drawPolygon(self._poly(placed_tug(origin, d, length)))
        p.setBrush(Qt.BrushStyle.NoBrush)
        self._arrow(p, ctx, a.tail, a.force, TUG_FORCE, 0.55, head_at_point=push)
        # the name beyond the tug, away from the hull
        gap = ctx.mm(3.0) / self.px_per_m
        at = self.to_px(tug_label_anchor(mode, origin, d, length, gap))
        self._label(p, ctx, at, a.label, 6.5, INK, True)

    def _arrow_end(self, ctx: Ctx, tail: Pt, force: Pt) -> QPointF:
        mag = math.hypot(*force)
        t = self.to_px(tail)
        if mag <= 0:
            return t
        length = ctx.mm(self.arrow_mm(mag))
        return QPointF(t.x() + force[0] / mag * length, t.y() - force[1] / mag * length)

    def _net(self, p: QPainter, ctx: Ctx, b: Balance, a: Arrow) -> None:
        eq = b.equivalent
        if eq.kind == "force":
            end = self._arrow(p, ctx, a.tail, a.force, NET_FORCE, 0.9)
            mag = math.hypot(*a.force)
            d = (a.force[0] / mag, a.force[1] / mag)
            at = QPointF(end.x() + d[0] * ctx.mm(5), end.y() - d[1] * ctx.mm(3.5))
            self._label(
                p, ctx, at, f"net {self.units.show(eq.magnitude, 'force')}", 6.5, NET_FORCE, True
            )
        # yaw moment: a curved arrow round the centroid, its sweep growing with the moment
        m = eq.moment
        ref = max(sum(abs(sh.moment_centroid_nm) for sh in b.shares), abs(m), 1e-9)
        if eq.kind == "balanced" or abs(m) < 0.02 * ref:
            return
        body = self.by_name[b.body].body
        size = max(ctx.mm(5.0), min(ctx.mm(13.0), 0.3 * body.length * self.px_per_m))
        c = self.to_px(a.tail)
        sweep = 70.0 + 200.0 * min(1.0, abs(m) / ref)
        rect = QRectF(c.x() - size, c.y() - size, 2 * size, 2 * size)
        start = 210.0
        sign = 1.0 if m > 0 else -1.0  # Qt's angles run counter-clockwise on paper, as the moment
        path = QPainterPath()
        path.arcMoveTo(rect, start)
        path.arcTo(rect, start, sign * sweep)
        p.setPen(QPen(NET_FORCE, ctx.mm(0.55)))
        p.drawPath(path)
        end_deg = math.radians(start + sign * sweep)
        tip = QPointF(c.x() + size * math.cos(end_deg), c.y() - size * math.sin(end_deg))
        tangent = (-math.sin(end_deg) * sign, math.cos(end_deg) * sign)  # y up, like the site
        self._arrowhead(p, ctx, tip, tangent, NET_FORCE, 2.2)
        mid = math.radians(start + sign * sweep / 2)
        at = QPointF(
            c.x() + (size + ctx.mm(4)) * math.cos(mid), c.y() - (size + ctx.mm(4)) * math.sin(mid)
        )
        self._label(p, ctx, at, self._moment_text(m), 6.0, NET_FORCE, True)

    def _moment_text(self, m: float) -> str:
        u = self.units
        return f"{fmt(u.value(m, 'moment'), 1, signed=True)} {label(u.unit('moment'))}"

    def _line_of_action(self, p: QPainter, ctx: Ctx, b: Balance, rect: QRectF) -> None:
        eq = b.equivalent
        if eq.point is None or eq.direction is None:
            return
        pl = self.by_name[b.body].placing
        pt, d = pl.point(eq.point), pl.direction(eq.direction)
        reach = 4 * max(self.extent[2] - self.extent[0], self.extent[3] - self.extent[1])
        a = self.to_px((pt[0] - d[0] * reach, pt[1] - d[1] * reach))
        c = self.to_px((pt[0] + d[0] * reach, pt[1] + d[1] * reach))
        p.setPen(QPen(NET_FORCE, ctx.mm(0.3), Qt.PenStyle.DashLine))
        p.drawLine(a, c)
        if b.centreline_x is not None:
            x = self.to_px(pl.point((b.centreline_x, 0.0)))
            if rect.contains(x):
                draw_crossing(p, x, ctx.mm(1.6), NET_FORCE, ctx.mm(0.3))

    def _clearances(self, p: QPainter, ctx: Ctx) -> None:
        for c in notable_clearances(self.check.clearances):
            a, b = self.to_px(c.at_body), self.to_px(c.at_other)
            col = FAIL if c.below_margin else style.CLEARANCE
            p.setPen(QPen(col, ctx.mm(0.3), Qt.PenStyle.DotLine))
            p.drawLine(a, b)
            for q in (a, b):
                p.setPen(QPen(col, ctx.mm(0.3)))
                p.drawEllipse(q, ctx.mm(0.5), ctx.mm(0.5))

    def _clearance_labels(self, p: QPainter, ctx: Ctx) -> None:
        for c in notable_clearances(self.check.clearances):
            a, b = self.to_px(c.at_body), self.to_px(c.at_other)
            col = FAIL if c.below_margin else style.CLEARANCE
            text = self.units.show(c.distance_m, "length")
            for t in (0.4, 0.25, 0.6, 0.15, 0.8):
                at = QPointF(a.x() + t * (b.x() - a.x()), a.y() + t * (b.y() - a.y()))
                if self._label(p, ctx, at, text, 6.0, col, True, avoid=True):
                    break

    def _north(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        c = QPointF(rect.right() - ctx.mm(8), rect.top() + ctx.mm(10))
        draw_north(p, c, ctx.mm(4.5), ctx.font(7.5, True), ctx.mm(0.25))

    def _legend(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        """The key under the map: conditions, scale, force scale, symbols, the result."""
        x = rect.left() + ctx.mm(3)
        top = rect.top() + ctx.mm(4.2)
        # wind and current
        c = self.check.stage.conditions
        u = self.units
        rows = [
            (
                "Wind",
                c.wind_speed_ms,
                (c.wind_from_deg + 180.0) % 360.0,
                f"{u.show(c.wind_speed_ms, 'speed')} from {c.wind_from_deg:03.0f}°",
                LOAD_FORCE,
            ),
            (
                "Current",
                c.current_speed_ms,
                c.current_towards_deg,
                f"{u.show(c.current_speed_ms, 'speed')} towards {c.current_towards_deg:03.0f}°",
                CURRENT,
            ),
        ]
        for i, (name, speed, towards, text, col) in enumerate(rows):
            cy = top + ctx.mm(7.0 * i)
            cx = x + ctx.mm(3.5)
            if speed > 0:
                ang = true_to_site_angle(towards)
                d = (math.cos(ang), math.sin(ang))
                L = ctx.mm(3.0)
                a = QPointF(cx - d[0] * L, cy + d[1] * L)
                b = QPointF(cx + d[0] * L, cy - d[1] * L)
                p.setPen(QPen(col, ctx.mm(0.6)))
                p.drawLine(a, QPointF(b.x() - d[0] * ctx.mm(1.2), b.y() + d[1] * ctx.mm(1.2)))
                self._arrowhead(p, ctx, b, d, col, 1.9)
            p.setPen(INK)
            p.setFont(ctx.font(6.5, True))
            p.drawText(QPointF(cx + ctx.mm(5), cy + ctx.mm(0.9)), name)
            p.setFont(ctx.font(6.5))
            w = ctx.metrics(6.5, True).horizontalAdvance(name)
            p.drawText(QPointF(cx + ctx.mm(6) + w, cy + ctx.mm(0.9)), text if speed > 0 else "none")
        # scale bar and force scale
        x = rect.left() + ctx.mm(52)
        unit_m = u.si(1.0, "length")
        target_m = ctx.mm(28) / self.px_per_m
        steps = [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000]
        n = max((s for s in steps if s * unit_m <= target_m), default=steps[0])
        length = n * unit_m * self.px_per_m
        y = top + ctx.mm(0.6)
        p.setPen(QPen(INK, ctx.mm(0.25)))
        for k in range(4):
            seg = QRectF(x + k * length / 4, y - ctx.mm(1.1), length / 4, ctx.mm(1.1))
            p.setBrush(INK if k % 2 == 0 else QColor("white"))
            p.drawRect(seg)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.setFont(ctx.font(6.0))
        p.drawText(QPointF(x + length + ctx.mm(1.5), y), f"{n} {u.unit('length')}")
        p.drawText(
            QPointF(x, y + ctx.mm(3.6)),
            f"Scale 1 : {self.scale_n:,}".replace(",", " ") + " on this page size",
        )
        yy = top + ctx.mm(7.8)
        fl = ctx.mm(10)
        p.setPen(QPen(TUG_FORCE, ctx.mm(0.55)))
        p.drawLine(QPointF(x, yy), QPointF(x + fl - ctx.mm(1.5), yy))
        self._arrowhead(p, ctx, QPointF(x + fl, yy), (1.0, 0.0), TUG_FORCE, 1.9)
        p.setPen(INK)
        p.setFont(ctx.font(6.0))
        step_txt = f"{self.force_step:g} {label(u.unit('force'))}"
        p.drawText(
            QPointF(x + fl + ctx.mm(1.5), yy + ctx.mm(0.9)), f"force arrows: 10 mm = {step_txt}"
        )
        # symbols, in two columns
        r = ctx.mm(1.0)
        p.setFont(ctx.font(6.0))
        x = rect.left() + ctx.mm(104)
        x2 = rect.left() + ctx.mm(142)
        ys = [top - ctx.mm(0.3), top + ctx.mm(3.9), top + ctx.mm(8.1)]
        draw_centroid(p, QPointF(x + r, ys[0]), 1.6 * r, INK, ctx.mm(0.25))
        p.setPen(INK)
        p.drawText(QPointF(x + ctx.mm(3.5), ys[0] + ctx.mm(0.8)), "centroid")
        draw_cog(p, QPointF(x + r, ys[1]), 1.25 * r, INK, ctx.mm(0.25))
        p.setPen(INK)
        p.drawText(QPointF(x + ctx.mm(3.5), ys[1] + ctx.mm(0.8)), "centre of gravity")
        draw_crossing(p, QPointF(x + r, ys[2]), 1.6 * r, NET_FORCE, ctx.mm(0.3))
        p.setPen(INK)
        p.drawText(QPointF(x + ctx.mm(3.5), ys[2] + ctx.mm(0.8)), "crosses the centreline")
        p.setPen(QPen(NET_FORCE, ctx.mm(0.3), Qt.PenStyle.DashLine))
        p.drawLine(QPointF(x2, ys[0]), QPointF(x2 + ctx.mm(6), ys[0]))
        p.setPen(INK)
        p.drawText(QPointF(x2 + ctx.mm(7.5), ys[0] + ctx.mm(0.8)), "line of action, net force")
        p.setPen(QPen(NET_FORCE, ctx.mm(0.9)))
        p.drawLine(QPointF(x2, ys[1]), QPointF(x2 + ctx.mm(6), ys[1]))
        p.setPen(INK)
        p.drawText(QPointF(x2 + ctx.mm(7.5), ys[1] + ctx.mm(0.8)), "net force, yaw moment")
        p.setPen(QPen(FAIL, ctx.mm(0.3), Qt.PenStyle.DotLine))
        p.drawLine(QPointF(x2, ys[2]), QPointF(x2 + ctx.mm(6), ys[2]))
        p.setPen(INK)
        p.drawText(QPointF(x2 + ctx.mm(7.5), ys[2] + ctx.mm(0.8)), "least clearance")


def _unit(bearing_deg: float) -> Pt:
    a = -math.radians(bearing_deg)
    return (math.cos(a), math.sin(a))


def _midpoint(pts: list[Pt]) -> Pt:
    if len(pts) == 2:
        return ((pts[0][0] + pts[1][0]) / 2, (pts[0][1] + pts[1][1]) / 2)
    return pts[len(pts) // 2]


def true_bearing_of(site_vector: Pt) -> float:
    return site_angle_to_true(math.atan2(site_vector[1], site_vector[0]))


__all__ = ["StageDiagram", "force_step", "true_bearing_of"]
