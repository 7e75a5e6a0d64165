"""The overview of the move: the site, every stage's pose in order and the track between.

One map for the whole plan, north up and to a round scale: the site's features, each
body's outline at each stage's pose (numbered with the stage, its bow marked) and the
track of its centroid from stage to stage, with the nearest feature of each stage in
the frame.
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Sequence
from dataclasses import dataclass

import shapely
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPen

from app.briefing.layout import (
    INK,
    MUTED,
    RULE,
    Block,
    Column,
    Ctx,
    Drawing,
    Table,
    Text,
    heading,
)
from app.briefing.mapframe import Box, MapFrame, box_of, grown
from app.paint import style
from app.paint.shapes import arrow_head
from app.paint.symbols import polygon
from core.mechanics.clearance import Clearance, least_per_body
from core.mechanics.site import PlacedBody, placed_bodies
from core.model.plan import Project
from core.units import fmt, label

Pt = tuple[float, float]
KEY_MM = 10.0  # the key strip under the map


@dataclass(frozen=True, slots=True)
class Pose:
    """One body as it lies in one stage."""

    stage: int  # index
    placed: PlacedBody

    @property
    def centroid(self) -> Pt:
        return self.placed.placing.point(self.placed.body.centroid)


class OverviewDiagram:
    """The whole move on one map; ``clearances`` are each stage's (the core's), whose
    nearest feature per body is kept in the frame."""

    def __init__(self, project: Project, clearances: Sequence[Sequence[Clearance]]) -> None:
        self.project = project
        self.poses: list[Pose] = [
            Pose(i, pb) for i, s in enumerate(project.stages) for pb in placed_bodies(project, s)
        ]
        self.tracks: dict[str, list[Pose]] = {}
        for pose in self.poses:
            self.tracks.setdefault(pose.placed.name, []).append(pose)
        self.nearest = [c for cs in clearances for c in least_per_body(tuple(cs)).values()]
        self.extent = self._extent()

    def _extent(self) -> Box:
        pts: list[Pt] = []
        size = 30.0
        for pose in self.poses:
            x0, y0, x1, y1 = pose.placed.polygon.bounds
            pts += [(x0, y0), (x1, y1)]
            size = max(size, pose.placed.body.length)
        for c in self.nearest:
            if not c.outside_limit:
                pts += [c.at_body, c.at_other]
        box = box_of(pts)
        if box is None:  # no poses: the site itself
            box = box_of(p for f in self.project.site.features for p in f.points)
        return grown(box or (-50.0, -50.0, 50.0, 50.0), 0.25 * size)

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        strip = ctx.mm(KEY_MM)
        area = QRectF(rect.left(), rect.top(), rect.width(), rect.height() - strip)
        key = QRectF(rect.left(), area.bottom(), rect.width(), strip)
        self.frame = f = MapFrame(ctx, area, self.extent)
        p.setPen(QPen(RULE, ctx.mm(0.3)))
        p.setBrush(style.WATER)
        p.drawRect(area)
        p.setBrush(QColor("white"))
        p.drawRect(key)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.save()
        p.setClipRect(area)
        f.features(p, self.project.site.features)
        last = {name: track[-1].stage for name, track in self.tracks.items()}
        for pose in self.poses:
            self._pose(p, ctx, pose, final=pose.stage == last[pose.placed.name])
        for track in self.tracks.values():
            self._track(p, ctx, track)
        f.north(p)
        for pose in self.poses:
            self._number(p, ctx, pose)
        bodies = [pose.placed.polygon for pose in self.poses]
        f.feature_labels(
            p, self.project.site.features, shapely.union_all(bodies) if bodies else None
        )
        p.restore()
        self._key(p, ctx, key)

    def _pose(self, p: QPainter, ctx: Ctx, pose: Pose, final: bool) -> None:
        f, pb = self.frame, pose.placed
        fill = QColor(style.HULL_FILL)
        fill.setAlpha(150)
        p.setPen(QPen(style.HULL_EDGE, ctx.mm(0.45 if final else 0.25)))
        p.setBrush(fill)
        for part in shapely.get_parts(pb.polygon):  # hulls of a group need not touch
            p.drawPolygon(f.poly(list(part.exterior.coords)))
        p.setBrush(Qt.BrushStyle.NoBrush)
        # the bow: an arrowhead on the centreline near the bow of the body
        body, pl = pb.body, pb.placing
        tip = f.to_px(pl.point((body.x_max - 0.04 * body.length, body.centroid[1])))
        back = f.to_px(pl.point((body.x_max - 0.04 * body.length - 1.0, body.centroid[1])))
        d = (tip.x() - back.x(), tip.y() - back.y())
        n = math.hypot(*d) or 1.0
        head = ctx.mm(2.4)
        tail = (tip.x() - d[0] / n * 2 * head, tip.y() - d[1] / n * 2 * head)
        parts = arrow_head(tail, (tip.x(), tip.y()), head)
        if parts is not None:
            p.setPen(Qt.PenStyle.NoPen)
            p.setBrush(style.HULL_EDGE)
            p.drawPolygon(polygon(parts[1]))
            p.setBrush(Qt.BrushStyle.NoBrush)

    def _track(self, p: QPainter, ctx: Ctx, track: list[Pose]) -> None:
        """The centroid's track from pose to pose, an arrowhead halfway along each leg."""
        f = self.frame
        for a, b in itertools.pairwise(track):
            pa, pb = f.to_px(a.centroid), f.to_px(b.centroid)
            length = math.hypot(pb.x() - pa.x(), pb.y() - pa.y())
            if length < ctx.mm(1.0):
                continue  # the same place: a turn on the spot
            p.setPen(QPen(style.TRACK, ctx.mm(0.45), Qt.PenStyle.DashLine))
            p.drawLine(pa, pb)
            mid = QPointF((pa.x() + pb.x()) / 2, (pa.y() + pb.y()) / 2)
            ux, uy = (pb.x() - pa.x()) / length, (pb.y() - pa.y()) / length
            head = min(ctx.mm(3.0), 0.4 * length)
            tip = (mid.x() + ux * head / 2, mid.y() + uy * head / 2)
            parts = arrow_head((tip[0] - ux * 2 * head, tip[1] - uy * 2 * head), tip, head)
            if parts is not None:
                p.setPen(Qt.PenStyle.NoPen)
                p.setBrush(style.TRACK)
                p.drawPolygon(polygon(parts[1]))
                p.setBrush(Qt.BrushStyle.NoBrush)

    def _number(self, p: QPainter, ctx: Ctx, pose: Pose) -> None:
        """The stage's number in a ring at the body's centroid (or beside it if taken)."""
        f = self.frame
        c = f.to_px(pose.centroid)
        text = str(pose.stage + 1)
        r = ctx.mm(2.3)
        spots = [c] + [
            QPointF(c.x() + ctx.mm(5.5) * math.cos(a), c.y() + ctx.mm(5.5) * math.sin(a))
            for a in (math.radians(k) for k in (-45, 45, 135, 225, 0, 90, 180, 270))
        ]
        for at in spots:
            box = QRectF(at.x() - r, at.y() - r, 2 * r, 2 * r)
            if f.fits(box) or at is spots[-1]:
                break
        f.taken.append(box)
        p.setPen(QPen(INK, ctx.mm(0.3)))
        p.setBrush(QColor("white"))
        p.drawEllipse(box)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.setFont(ctx.font(7.0, True))
        p.drawText(box, int(Qt.AlignmentFlag.AlignCenter), text)

    def _key(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        y = rect.top() + ctx.mm(4.5)
        self.frame.scale_bar(p, QPointF(rect.left() + ctx.mm(3), y), self.project.units)
        x = rect.left() + ctx.mm(62)
        r = ctx.mm(2.0)
        p.setPen(QPen(INK, ctx.mm(0.3)))
        p.setBrush(QColor("white"))
        box = QRectF(x, y - r - ctx.mm(0.4), 2 * r, 2 * r)
        p.drawEllipse(box)
        p.setFont(ctx.font(6.5, True))
        p.drawText(box, int(Qt.AlignmentFlag.AlignCenter), "n")
        p.setFont(ctx.font(6.5))
        p.drawText(QPointF(x + 2 * r + ctx.mm(1.5), y), "the body's pose in stage n, bow marked")
        x2 = rect.left() + ctx.mm(125)
        p.setPen(QPen(style.TRACK, ctx.mm(0.45), Qt.PenStyle.DashLine))
        p.drawLine(QPointF(x2, y - ctx.mm(0.8)), QPointF(x2 + ctx.mm(8), y - ctx.mm(0.8)))
        p.setPen(INK)
        p.drawText(QPointF(x2 + ctx.mm(10), y), "track of its centroid, stage to stage")


def overview_blocks(
    project: Project, clearances: Sequence[Sequence[Clearance]], height_mm: float
) -> list[Block]:
    """The overview page: the map and, under it, where each stage puts each body."""
    u = project.units
    out: list[Block] = [
        heading("Overview of the move", 1),
        Text(
            "The site with each stage's pose in order, numbered with its stage, and the track "
            "of each body's centroid from stage to stage; north up, to the scale shown. "
            "Each stage's diagram follows on its own page.",
            8.5,
        ),
    ]
    if not any(s.poses for s in project.stages):
        out.append(Text("No stage places a body in the site yet.", 8.5, color=QColor(MUTED)))
    out.append(Drawing(height_mm, OverviewDiagram(project, clearances).paint))
    rows = []
    for i, s in enumerate(project.stages):
        poses = "; ".join(
            f"{p.body} at ({fmt(u.value(p.x, 'length'))}, {fmt(u.value(p.y, 'length'))}) "
            f"{label(u.unit('length'))}, heading {p.heading_deg:05.1f}° true"
            for p in s.poses
        )
        rows.append([str(i + 1), s.name, s.kind, poses or "not placed in the site"])
    out.append(
        Table(
            [Column("#", 0.3), Column("Stage", 2.6), Column("Kind", 0.8), Column("Pose", 4.0)],
            rows,
        )
    )
    return out
