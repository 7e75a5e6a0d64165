"""The stage diagram of the briefing: the site, the bodies, the tugs and the forces, to scale.

Drawn with QPainter from the core's numbers in the site frame (x east, y north, north
up on the paper), with the board's shapes and colours (app.paint). The diagram is
framed on the bodies, their tugs and the nearest site features: each body's least
clearance (and every clearance under its margin) lies inside it, drawn as a dotted
line labelled with what it measures. The drawing scale is a round ratio chosen to
fit, and force arrows have their own stated scale, so a planner can read both off
the paper.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import shapely
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPen

from app.briefing.diagram_key import draw_key
from app.briefing.layout import INK, RULE, Ctx
from app.briefing.mapframe import Box, MapFrame, box_of, grown
from app.paint import style
from app.paint.shapes import (
    TUG_LENGTH_M,
    arc_arrow,
    arrow_head,
    drawing_scales,
    moment_arc,
    placed_tug,
    tug_label_anchor,
    tug_origin,
)
from app.paint.symbols import (
    draw_centroid,
    draw_cog,
    draw_crossing,
    paint_arrow,
    polygon,
    polyline_path,
)
from core.frames import site_angle_to_true
from core.mechanics.balance import Balance
from core.mechanics.bodies import body_of
from core.mechanics.clearance import Clearance, notable_clearances
from core.mechanics.site import PlacedBody, body_pose, place_body, placed_bodies
from core.model.plan import Project, Stage
from core.units import DisplayUnits, fmt, label

Pt = tuple[float, float]

#: Round force-arrow scales, display units per 10 mm of arrow.
FORCE_STEPS = (1, 2, 2.5, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000)
LEGEND_MM = 17.0  # the key strip under the map


@dataclass(frozen=True, slots=True)
class Arrow:
    tail: Pt  # site frame, m
    force: Pt  # site frame, N
    label: str


@dataclass(frozen=True, slots=True)
class TugMark:
    """One tug as drawn: its pull, where it lies, which way its bow points."""

    arrow: Arrow
    position: Pt  # the line's far end (site m)
    direction: Pt  # unit, site frame: along the pull
    mode: str  # "line" or "push"


def stage_placed(project: Project, stage: Stage, balances: Sequence[Balance]) -> list[PlacedBody]:
    """Bodies posed in the stage, and any body worked on in it without a pose."""
    placed = list(placed_bodies(project, stage))
    names = {pb.name for pb in placed}
    for b in balances:
        if b.body not in names:
            placed.append(place_body(body_of(project, b.body), body_pose(project, stage, b.body)))
    return placed


def force_step(max_force_display: float) -> float:
    """Display units per 10 mm of arrow, so that the largest arrow is at most about 30 mm."""
    want = max_force_display / 3.0
    return next((s for s in FORCE_STEPS if s >= want), FORCE_STEPS[-1])


def clearance_text(c: Clearance, units: DisplayUnits) -> str:
    """What a clearance line measures, in words: "12.0 m to Fitting-out quay"."""
    if c.touching:
        return f"touching {c.other}"
    text = f"{units.show(c.distance_m, 'length')} to {c.other}"
    if c.below_margin:
        text += f", under the {units.show(c.margin_m, 'length')} margin"
    return text


class StageDiagram:
    """Everything needed to paint one stage, worked out from the core's results.

    ``balances`` and ``clearances`` are the stage's, as the core computed them; the
    diagram only lays them out.
    """

    def __init__(
        self,
        project: Project,
        stage: Stage,
        balances: Sequence[Balance],
        clearances: Sequence[Clearance],
    ) -> None:
        self.project = project
        self.stage = stage
        self.balances = tuple(balances)
        self.units = project.units
        self.placed = stage_placed(project, stage, self.balances)
        self.by_name = {pb.name: pb for pb in self.placed}
        #: The clearance lines drawn: each body's least and every one under its margin.
        self.clearances = notable_clearances(tuple(clearances))
        self.tugs: list[TugMark] = []
        self.net_arrows: list[tuple[Balance, Arrow]] = []
        self.load_arrows: list[Arrow] = []
        for b in self.balances:
            self._add_balance(b)
        forces = [math.hypot(*t.arrow.force) for t in self.tugs]
        forces += [math.hypot(*a.force) for _, a in self.net_arrows]
        forces += [math.hypot(*a.force) for a in self.load_arrows]
        top = max(forces, default=0.0)
        self.force_step = force_step(self.units.value(top, "force")) if top > 0 else 10.0
        _, self.moment_scale, self.head_m = drawing_scales(
            [h.geometry.length for h in project.hulls],
            [t.bollard_pull_n for t in project.tugs],
            [t.bollard_pull_n for t in project.tugs if t.name in {p.tug for p in stage.placements}],
        )
        self.extent = self._extent()

    def _add_balance(self, b: Balance) -> None:
        pb = self.by_name[b.body]
        pl = pb.placing
        for sh in b.shares:
            placement = self.stage.placement(sh.tug)
            member, fitting = pb.body.fitting(placement.hull, placement.point)
            tail = pl.point(member.to_body((fitting.x, fitting.y)))
            f = pl.direction(sh.force)
            mag = math.hypot(*sh.force)
            d = (f[0] / mag, f[1] / mag) if mag > 0 else pl.direction(_unit(sh.lead_bearing_deg))
            text = f"{sh.tug} {self.units.show(sh.pull_n, 'force')}"
            self.tugs.append(TugMark(Arrow(tail, f, text), pl.point(sh.position), d, sh.mode))
        c = pl.point(b.centroid)
        self.net_arrows.append((b, Arrow(c, pl.direction(b.net_force), "net")))
        for ld in b.loads:
            self.load_arrows.append(Arrow(pl.point(ld.point), pl.direction(ld.force), ld.name))

    def tug_outline(self, t: TugMark, length: float = TUG_LENGTH_M) -> tuple[Pt, ...]:
        origin = tug_origin(t.mode, t.arrow.tail, t.position, t.direction, length)
        return placed_tug(origin, t.direction, length)

    def _extent(self) -> Box:
        """The bodies, their tugs and the ends of every clearance line drawn, with room
        round them for the labels."""
        pts: list[Pt] = []
        size = 30.0
        for pb in self.placed:
            x0, y0, x1, y1 = pb.polygon.bounds
            pts += [(x0, y0), (x1, y1)]
            size = max(size, pb.body.length, pb.body.beam)
        for t in self.tugs:
            pts += list(self.tug_outline(t))
        for c in self.clearances:
            pts += [c.at_body, c.at_other]
        box = box_of(pts) or (-50.0, -50.0, 50.0, 50.0)
        return grown(box, 0.3 * size)

    # -- painting --------------------------------------------------------------------------
    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        strip = ctx.mm(LEGEND_MM)
        area = QRectF(rect.left(), rect.top(), rect.width(), rect.height() - strip)
        legend = QRectF(rect.left(), area.bottom(), rect.width(), strip)
        self.frame = f = MapFrame(ctx, area, self.extent)
        self.scale_n, self.px_per_m = f.scale_n, f.px_per_m
        p.setPen(QPen(RULE, ctx.mm(0.3)))
        p.setBrush(style.WATER)
        p.drawRect(area)
        p.setBrush(QColor("white"))
        p.drawRect(legend)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.save()
        p.setClipRect(area)
        f.features(p, self.project.site.features)
        for pb in self.placed:
            self._body(p, ctx, pb)
        self._clearance_lines(p, ctx)
        for b, _a in self.net_arrows:
            self._line_of_action(p, ctx, b)
        for t in self.tugs:
            self._tug(p, ctx, t)
        for a in self.load_arrows:
            col = style.load_color(a.label)
            end = self._arrow(p, ctx, a.tail, a.force, col, 0.45)
            at = QPointF(end.x(), end.y() + ctx.mm(2.4))
            f.first_free(p, f.spots_near(at, a.label, 6.0), a.label, 6.0, col)
        for b, a in self.net_arrows:
            self._net(p, ctx, b, a)
        f.north(p)
        for pb in self.placed:
            self._body_name(p, ctx, pb)
        self._clearance_labels(p, ctx)
        bodies = shapely.union_all([pb.polygon for pb in self.placed]) if self.placed else None
        f.feature_labels(p, self.project.site.features, bodies)
        p.restore()
        draw_key(p, ctx, legend, self)

    def _body(self, p: QPainter, ctx: Ctx, pb: PlacedBody) -> None:
        f, pl = self.frame, pb.placing
        for outline in pb.body.outlines():
            p.setPen(QPen(style.HULL_EDGE, ctx.mm(0.25)))
            p.setBrush(style.HULL_FILL)
            p.drawPolygon(f.poly([pl.point(v) for v in outline]))
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.setPen(QPen(style.HULL_EDGE, ctx.mm(0.55)))
        for part in shapely.get_parts(pb.polygon):  # hulls of a group need not touch
            p.drawPolygon(f.poly(list(part.exterior.coords)))
        body = pb.body
        # centreline of each member, its bow marked with an arrowhead
        pen = QPen(style.CENTRELINE, ctx.mm(0.18), Qt.PenStyle.DashDotLine)
        for k, m in enumerate(body.members):
            g = m.hull.geometry
            a, b = m.to_body((g.x_min, 0.0)), m.to_body((g.x_max, 0.0))
            p.setPen(pen)
            p.drawLine(f.to_px(pl.point(a)), f.to_px(pl.point(b)))
            tip = f.to_px(pl.point(m.to_body((g.x_max - 0.06 * g.length, 0.0))))
            d = pl.direction(m.direction_to_body((1.0, 0.0)))
            self._head(p, ctx, tip, d, style.HULL_EDGE, 2.6)
            if k == 0:
                word = f.to_px(pl.point(m.to_body((g.x_max - 0.2 * g.length, 0.0))))
                f.label(p, word, "BOW", 5.5, style.HULL_EDGE, True, halo=False)
        # port (red) and starboard (green) sides, just outside the outline at mid-length
        x0, y0, x1, y1 = body.polygon.bounds
        off = max(0.06 * body.beam, f.metres(1.2))
        mid, half = (x0 + x1) / 2, 0.15 * body.length
        for y, text, col in ((y1 + off, "P", style.PORT), (y0 - off, "S", style.STARBOARD)):
            a, b = pl.point((mid - half, y)), pl.point((mid + half, y))
            p.setPen(QPen(col, ctx.mm(0.8)))
            p.drawLine(f.to_px(a), f.to_px(b))
            end = f.to_px(b)
            d = pl.direction((1.0, 0.0))
            f.label(
                p,
                QPointF(end.x() + d[0] * ctx.mm(2.2), end.y() - d[1] * ctx.mm(2.2)),
                text,
                6.0,
                col,
                True,
            )
        c = f.to_px(pl.point(body.centroid))
        r = ctx.mm(2.0)
        draw_centroid(p, c, r, INK, ctx.mm(0.25))
        gp = f.to_px(pl.point(body.centre_of_gravity))
        if math.hypot(gp.x() - c.x(), gp.y() - c.y()) > ctx.mm(0.4):
            draw_cog(p, gp, r, INK, ctx.mm(0.25))

    def _body_name(self, p: QPainter, ctx: Ctx, pb: PlacedBody) -> None:
        """The body's name just beyond its stern, on the centreline (or over its middle)."""
        body, f = pb.body, self.frame
        spots = [
            f.to_px(pb.placing.point((body.x_min - f.metres(9.0), body.centroid[1]))),
            f.to_px(pb.placing.point((body.x_max + f.metres(9.0), body.centroid[1]))),
            f.to_px(pb.placing.point(body.centroid)),
        ]
        f.first_free(p, spots, pb.name, 7.0, style.HULL_EDGE, True)

    def _head(self, p: QPainter, ctx: Ctx, tip: QPointF, d: Pt, color: QColor, mm: float) -> None:
        """A filled arrowhead at ``tip`` (device px) pointing along site direction ``d``."""
        n = math.hypot(*d) or 1.0
        length = ctx.mm(mm)
        tail = (tip.x() - d[0] / n * 2 * length, tip.y() + d[1] / n * 2 * length)
        parts = arrow_head(tail, (tip.x(), tip.y()), length)
        if parts is not None:
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
        """A force arrow from ``tail`` at the force scale; returns its tip (device px)."""
        mag = math.hypot(*force)
        t = self.frame.to_px(tail)
        if mag <= 0:
            return t
        length = ctx.mm(self.arrow_mm(mag))
        d = (force[0] / mag, force[1] / mag)
        start, end = t, QPointF(t.x() + d[0] * length, t.y() - d[1] * length)
        if head_at_point:  # a push: the arrow ends at the point it pushes on
            start, end = QPointF(t.x() - d[0] * length, t.y() + d[1] * length), t
        head = ctx.mm(max(1.8, width_mm * 3.5))
        parts = arrow_head((start.x(), start.y()), (end.x(), end.y()), head)
        if parts is not None:
            pen = QPen(color, ctx.mm(width_mm), Qt.PenStyle.SolidLine, Qt.PenCapStyle.FlatCap)
            shaft = polyline_path([(start.x(), start.y()), parts[0]])
            paint_arrow(p, pen, color, shaft, polygon(parts[1]), ctx.mm(0.1))
        return end

    def _tug(self, p: QPainter, ctx: Ctx, t: TugMark) -> None:
        """The tug as on the board (app.paint.shapes), at least 5 mm long on paper."""
        f = self.frame
        if t.mode == "line":
            p.setPen(QPen(style.TOWLINE, ctx.mm(0.3)))
            p.drawLine(f.to_px(t.arrow.tail), f.to_px(t.position))
        length = max(TUG_LENGTH_M, f.metres(5.0))
        p.setPen(QPen(style.TUG_EDGE, ctx.mm(0.3)))
        p.setBrush(style.TUG_FILL)
        p.drawPolygon(f.poly(self.tug_outline(t, length)))
        p.setBrush(Qt.BrushStyle.NoBrush)
        self._arrow(p, ctx, t.arrow.tail, t.arrow.force, style.TUG_FORCE, 0.55, t.mode == "push")
        origin = tug_origin(t.mode, t.arrow.tail, t.position, t.direction, length)
        at = f.to_px(tug_label_anchor(t.mode, origin, t.direction, length, f.metres(1.5)))
        # the label's near edge, not its centre, just beyond the tug (away from the hull)
        r = f.label_rect(at, t.arrow.label, 6.5, True)
        out = 1.0 if t.mode == "line" else -1.0
        ux, uy = out * t.direction[0], -out * t.direction[1]  # device px, y down
        half = abs(ux) * r.width() / 2 + abs(uy) * r.height() / 2
        f.label(p, QPointF(at.x() + ux * half, at.y() + uy * half), t.arrow.label, 6.5, INK, True)

    def _net(self, p: QPainter, ctx: Ctx, b: Balance, a: Arrow) -> None:
        f, u = self.frame, self.units
        eq = b.equivalent
        if eq.kind == "force":
            end = self._arrow(p, ctx, a.tail, a.force, style.NET_FORCE, 0.9)
            mag = math.hypot(*a.force)
            d = (a.force[0] / mag, a.force[1] / mag)
            at = QPointF(end.x() + d[0] * ctx.mm(5), end.y() - d[1] * ctx.mm(3.5))
            text = f"net {u.show(eq.magnitude, 'force')}"
            f.first_free(p, f.spots_near(at, text, 6.5, True), text, 6.5, style.NET_FORCE, True)
        # the yaw moment as on the board: an arc astern of the centroid (app.paint.shapes)
        pb = self.by_name[b.body]
        arc = moment_arc(eq.moment, self.moment_scale, pb.body.length, pb.body.beam)
        if eq.kind == "balanced" or arc is None:
            return
        radius, start, sweep = arc
        radius = max(radius, f.metres(4.0))
        heading = math.degrees(math.atan2(*reversed(pb.placing.direction((1.0, 0.0)))))
        head = max(self.head_m * 1.2, f.metres(2.2))
        parts = arc_arrow(a.tail, radius, heading + start, sweep, head)
        if parts is None:
            return
        shaft, tip = parts
        pen = QPen(style.MOMENT, ctx.mm(0.55))
        px = [(q.x(), q.y()) for q in (f.to_px(pt) for pt in shaft)]
        head_px = [(q.x(), q.y()) for q in (f.to_px(pt) for pt in tip)]
        paint_arrow(p, pen, style.MOMENT, polyline_path(px), polygon(head_px), ctx.mm(0.1))
        text = f"yaw {fmt(u.value(eq.moment, 'moment'), 1, signed=True)} {label(u.unit('moment'))}"
        # beside the arc, clear of it: out along the arc's middle, then its ends, by the
        # label's half size on paper (a small arc lies under the loads' labels)
        box = f.label_rect(QPointF(0, 0), text, 6.0, True)
        out = radius + (math.hypot(box.width(), box.height()) / 2 + ctx.mm(1.0)) / f.px_per_m
        spots = []
        for frac in (0.5, 0.0, 1.0):
            ang = math.radians(heading + start + sweep * frac)
            spots.append(
                f.to_px((a.tail[0] + out * math.cos(ang), a.tail[1] + out * math.sin(ang)))
            )
        spots += f.spots_near(spots[0], text, 6.0, True)[1:]
        f.first_free(p, spots, text, 6.0, style.MOMENT, True)

    def _line_of_action(self, p: QPainter, ctx: Ctx, b: Balance) -> None:
        eq = b.equivalent
        if eq.point is None or eq.direction is None:
            return
        f = self.frame
        pl = self.by_name[b.body].placing
        pt, d = pl.point(eq.point), pl.direction(eq.direction)
        reach = 4 * max(self.extent[2] - self.extent[0], self.extent[3] - self.extent[1])
        a = f.to_px((pt[0] - d[0] * reach, pt[1] - d[1] * reach))
        c = f.to_px((pt[0] + d[0] * reach, pt[1] + d[1] * reach))
        p.setPen(QPen(style.LINE_OF_ACTION, ctx.mm(0.3), Qt.PenStyle.DashLine))
        p.drawLine(a, c)
        if b.crossing_shown and b.centreline_x is not None:
            x = f.to_px(pl.point((b.centreline_x, 0.0)))
            if f.area.contains(x):
                draw_crossing(p, x, ctx.mm(1.6), style.LINE_OF_ACTION, ctx.mm(0.3))

    def _clearance_lines(self, p: QPainter, ctx: Ctx) -> None:
        f = self.frame
        for c in self.clearances:
            a, b = f.to_px(c.at_body), f.to_px(c.at_other)
            col = style.CLEARANCE_LOW if c.below_margin else style.CLEARANCE
            p.setPen(QPen(col, ctx.mm(0.3), Qt.PenStyle.DotLine))
            p.drawLine(a, b)
            for q in (a, b):
                p.setPen(QPen(col, ctx.mm(0.3)))
                p.drawEllipse(q, ctx.mm(0.5), ctx.mm(0.5))

    def _clearance_labels(self, p: QPainter, ctx: Ctx) -> None:
        """Each clearance line's length and what it runs to, beside its middle."""
        f = self.frame
        for c in self.clearances:
            a, b = f.to_px(c.at_body), f.to_px(c.at_other)
            col = style.CLEARANCE_LOW if c.below_margin else style.CLEARANCE
            dx, dy = b.x() - a.x(), b.y() - a.y()
            n = math.hypot(dx, dy) or 1.0
            nx, ny = -dy / n, dx / n  # across the line (device px)
            spots = []
            for t in (0.5, 0.35, 0.65, 0.2, 0.8):
                at = QPointF(a.x() + t * dx, a.y() + t * dy)
                for side in (0.0, 1.0, -1.0):
                    off = side * ctx.mm(3.0)
                    spots.append(QPointF(at.x() + nx * off, at.y() + ny * off))
            text = clearance_text(c, self.units)
            # a line of no length (touching) gives one spot: then the spots round it
            spots += f.spots_near(spots[0], text, 6.0, True)[1:]
            f.first_free(p, spots, text, 6.0, col, True)


def _unit(bearing_deg: float) -> Pt:
    a = -math.radians(bearing_deg)
    return (math.cos(a), math.sin(a))


def true_bearing_of(site_vector: Pt) -> float:
    return site_angle_to_true(math.atan2(site_vector[1], site_vector[0]))


__all__ = ["StageDiagram", "clearance_text", "force_step", "true_bearing_of"]
