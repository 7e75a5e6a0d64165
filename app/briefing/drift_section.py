"""The drift preview in the briefing: for each stage, the time to the first contact with
the worst tug lost and with all lines let go, what is touched and how hard, how far the
body has gone at each ghost time, and a small diagram of the ghosts, to scale.

Everything printed is the stage result's drift (``stage_result(project, i).drift``), the
same computation the board and the report read. :func:`drift_blocks` gives the blocks of
one stage, kept together on a page.
"""

from __future__ import annotations

import numpy as np
import shapely
from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QPainter, QPen

from app.briefing.layout import (
    INK,
    MUTED,
    WARN,
    Block,
    Boxed,
    Column,
    Ctx,
    Drawing,
    Group,
    Table,
    Text,
    heading,
)
from app.briefing.mapframe import MapFrame, box_of, grown
from app.paint import style
from core.analysis.stage import stage_result
from core.mechanics.site import placed_bodies
from core.model.plan import Project
from core.motion.drift import DRIFT_CAUTION, DriftResult
from core.motion.summary import StageDrift, ghost_groups, ghost_rows, group_words, time_words
from core.units import DisplayUnits

DIAGRAM_MM = 62.0


def _title(label: str, r: DriftResult) -> str:
    tug = r.problem.scenario.tug
    return f"{label} ({tug})" if tug and label.startswith("Worst") else label


def _row(label: str, r: DriftResult, times: tuple[float, ...], u: DisplayUnits) -> list[str]:
    c = r.contact
    if c is None:
        first = f"none within {time_words(r.problem.horizon_s)}"
        closing = "—"
    else:
        kind = "" if c.other_kind == "body" else f" ({c.other_kind})"
        first = f"{c.other}{kind} after {time_words(c.time_s)}"
        closing = u.show(c.closing_speed_ms, "speed", 2)
    moved = {g.time_s: g for g in ghost_rows(r) if not g.at_contact}
    cells = [
        u.show(moved[t].moved_m, "length", 0) + f", {moved[t].heading_deg:03.0f}°"
        if t in moved
        else "(touched)"
        for t in times
    ]
    return [_title(label, r), first, closing, *cells]


def drift_blocks(project: Project, index: int) -> list[Block]:
    """The drift preview of stage ``index``: a table, the diagram, notes and the caution."""
    sd = stage_result(project, index).drift
    u = project.units
    stage = project.stages[index]
    more = heading(f"Stage {index + 1} of {len(project.stages)}: {stage.name} (continued)", 1)
    out: list[Block] = [heading("Drift preview", 2)]
    if sd.reason or sd.let_go is None:
        out.append(Text(f"Not worked out: {sd.reason or 'no body to drift'}.", 8.0, color=MUTED))
        return [Group(out, more)]
    times = project.drift.times_s
    scenarios = [("All lines let go", sd.let_go)]
    if sd.worst is not None:
        scenarios.insert(0, ("Worst tug lost", sd.worst))
    out.append(
        Text(
            f"{sd.body} if a tug is lost (the others keep their pulls as set) or every line "
            "is let go: the first contact with the site or another body, and at each time "
            "how far the centroid has gone and the body's heading. The worst tug lost here "
            "is the loss that touches soonest (else drifts furthest); the tug lost check "
            "judges a loss by what the others, solved again, fall short of, so the two may "
            "name different tugs.",
            8.0,
        )
    )
    columns = [
        Column("Scenario", 1.5),
        Column("First contact", 2.0),
        Column("Closing speed", 0.9, "right"),
        *(Column(f"At {t:g} s", 1.0, "right") for t in times),
    ]
    rows = [_row(label, r, times, u) for label, r in scenarios]
    colors = [WARN if r.contact is not None else None for _, r in scenarios]
    out.append(Table(columns, rows, 7.5, colors))
    diagram = DriftDiagram(project, sd, scenarios)
    out.append(Drawing(DIAGRAM_MM, diagram.paint))
    for n in sd.notices:
        out.append(Text(n.message, 7.5, color=WARN))
    out.append(Boxed([DRIFT_CAUTION], 7.5))
    return [Group(out, more)]


class DriftDiagram:
    """Side by side, one small map per scenario: the body where it starts, its ghosts at
    the drift times, the centroid's track and the first contact, north up, to scale."""

    def __init__(
        self, project: Project, sd: StageDrift, scenarios: list[tuple[str, DriftResult]]
    ) -> None:
        self.project = project
        self.sd = sd
        self.scenarios = scenarios

    def paint(self, p: QPainter, ctx: Ctx, rect: QRectF) -> None:
        n = len(self.scenarios)
        gap = ctx.mm(4)
        w = (rect.width() - gap * (n - 1)) / n
        for k, (label, r) in enumerate(self.scenarios):
            area = QRectF(rect.left() + k * (w + gap), rect.top(), w, rect.height())
            self._panel(p, ctx, area, _title(label, r), r)

    def _extent(self, r: DriftResult) -> tuple[float, float, float, float]:
        pts = [tuple(q) for q in np.vstack(r.outlines_at(r.states[0]))]
        for s in (*r.ghost_states, r.states[-1]):
            pts += [tuple(q) for q in np.vstack(r.outlines_at(s))]
        pts += [tuple(q) for q in r.centroid_track()]
        box = box_of(pts) or (0.0, 0.0, 1.0, 1.0)  # type: ignore[arg-type]
        size = max(box[2] - box[0], box[3] - box[1])
        return grown(box, 0.12 * size + 10.0)

    def _panel(self, p: QPainter, ctx: Ctx, area: QRectF, title: str, r: DriftResult) -> None:
        p.save()
        p.setPen(QPen(style.RULE, ctx.mm(0.2)))
        p.drawRect(area)
        p.setClipRect(area)
        p.setRenderHint(QPainter.RenderHint.Antialiasing)
        mf = MapFrame(
            ctx, area.adjusted(ctx.mm(2), ctx.mm(6), -ctx.mm(2), -ctx.mm(7)), self._extent(r)
        )
        mf.features(p, self.project.site.features)
        stage = self.project.stages[self.sd.index]
        for pb in placed_bodies(self.project, stage):
            if pb.name == r.problem.body:
                continue
            p.setPen(QPen(style.HULL_EDGE, ctx.mm(0.25)))
            p.setBrush(style.VESSEL_FILL)
            for ring in _rings(pb.polygon):
                p.drawPolygon(mf.poly(ring))
        p.setPen(QPen(style.HULL_EDGE, ctx.mm(0.35)))
        p.setBrush(style.HULL_FILL)
        for pts in r.outlines_at(r.states[0]):
            p.drawPolygon(mf.poly([tuple(q) for q in pts]))
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.setPen(QPen(style.DRIFT, ctx.mm(0.3), Qt.PenStyle.DotLine))
        p.drawPolyline(mf.poly([tuple(q) for q in r.centroid_track()]))
        p.setPen(QPen(style.DRIFT, ctx.mm(0.3), Qt.PenStyle.DashLine))
        for s in r.ghost_states:
            for pts in r.outlines_at(s):
                p.drawPolygon(mf.poly([tuple(q) for q in pts]))
        for group in ghost_groups(r):
            c = r.centroid_track(r.ghost_states[group[-1]])[0]
            at = mf.to_px((float(c[0]), float(c[1])))
            mf.label(p, at, group_words(r, group), 6.0, style.DRIFT, True)
        c = r.contact
        if c is not None:
            p.setPen(QPen(style.DRIFT_CONTACT, ctx.mm(0.4), Qt.PenStyle.DashLine))
            for pts in r.outlines_at(r.states[-1]):
                p.drawPolygon(mf.poly([tuple(q) for q in pts]))
            at = mf.to_px(c.point)
            p.setPen(QPen(style.DRIFT_CONTACT, ctx.mm(0.5)))
            p.drawEllipse(at, ctx.mm(1.6), ctx.mm(1.6))
            mf.first_free(
                p,
                [at + QPointF(0, -ctx.mm(4)), at + QPointF(0, ctx.mm(4))],
                f"touches after {time_words(c.time_s)}",
                6.0,
                style.DRIFT_CONTACT,
                True,
            )
        mf.north(p)
        ctx_bar = QRectF(area.left(), area.bottom() - ctx.mm(8.5), ctx.mm(48), ctx.mm(8.5))
        p.fillRect(ctx_bar, style.LABEL_BG)
        mf.scale_bar(
            p,
            QPointF(area.left() + ctx.mm(3), area.bottom() - ctx.mm(4.5)),
            self.project.units,
            18.0,
        )
        p.setClipping(False)
        p.setFont(ctx.font(7.5, True))
        w = ctx.metrics(7.5, True).horizontalAdvance(title)
        p.fillRect(
            QRectF(area.left() + ctx.mm(1), area.top() + ctx.mm(0.8), w + ctx.mm(2), ctx.mm(4.4)),
            style.LABEL_BG,
        )
        p.setPen(INK)
        p.drawText(QPointF(area.left() + ctx.mm(2), area.top() + ctx.mm(4)), title)
        p.restore()


def _rings(geom: shapely.Geometry) -> list[list[tuple[float, float]]]:
    return [
        [(float(x), float(y)) for x, y in shapely.get_coordinates(g.exterior)]
        for g in shapely.get_parts(geom)
    ]
