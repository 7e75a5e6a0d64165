"""Working sectors on the board: a faint wedge at each tug's point, its edges dragged.

The wedge shows where the tug may lie when the pulls are solved: for a tug on a line,
the directions its towline may lead (the tug sits on the arc, at its line's length); for
a tug at a push point, the directions it may push from (the wedge lies outside the hull,
opposite its force). A whole circle is a faint disc. Only the part of it the solve takes
(core.mechanics.tugsets.used_arc: a towline's leads clear of the hull, at most a half turn
of them where some were cut) is filled; the rest is hatched, and all of it hatched when no
lead runs clear. The selected tug's wedge has a knob
at the end of each edge: drag one to move that limit (whole degrees of the relative
bearing of the force, 5 degrees with Shift); the drag previews live and records one
undo step on release. The knobs are on the sector's own ends, not the used part's: they
edit the sector. The sector is the placement's own (core.model.tugs.Placement); the layer
draws it and the core's used arc, and writes the sector back, nothing else. The used arc
is asked of the core again only when what it hangs on changed (the tug's point, lead
frame, line, sector, or the hull's outline), not on every move of a drag.

Printed and exported boards (a scene for a fixed stage) show no wedges.
"""

from __future__ import annotations

import math
import traceback
from dataclasses import dataclass
from typing import TYPE_CHECKING

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QPainter, QPainterPath, QPen
from PySide6.QtWidgets import QGraphicsItem, QStyleOptionGraphicsItem, QWidget
from shiboken6 import isValid

from app.board.items import CACHE, GUIDE, IGNORES, ROLE, take_out
from app.guard import guarded
from app.paint import style
from app.paint.shapes import TUG_LENGTH_M
from core.frames import angle_to_bearing, wrap_pi
from core.mechanics.balance import TugLayout
from core.mechanics.tugsets import used_arc
from core.model.tugs import Placement

if TYPE_CHECKING:
    from app.board.scene import BoardScene

TAU = 2 * math.pi
Z_SECTOR = 1.0  # over the hull's fill, under towlines and tugs
Z_KNOB = 12.0  # over everything, as the vertex handles
#: Radius of a push tug's wedge, m: a little more than a tug's length.
PUSH_RADIUS_M = 1.25 * TUG_LENGTH_M
KNOB_PX = 11.0


def _pie(apex: QPointF, radius: float, start: float, width: float) -> QPainterPath:
    """A wedge from ``start`` counter-clockwise through ``width`` (rad, body frame): a disc
    for a whole turn."""
    path = QPainterPath()
    r = radius
    box = QRectF(apex.x() - r, apex.y() - r, 2 * r, 2 * r)
    if width >= TAU - 1e-9:
        path.addEllipse(box)
    elif width > 0.0:
        # arcTo's angles run as on a y-down screen; the body frame has y up (to port)
        path.moveTo(apex)
        path.arcTo(box, -math.degrees(start), -math.degrees(width))
        path.closeSubpath()
    return path


class SectorWedge(QGraphicsItem):
    """A faint wedge (body frame, m): from ``start`` counter-clockwise through ``width``,
    the part the solve uses (``used``: its start and width, None for none) filled and the
    rest hatched."""

    def __init__(self, parent: QGraphicsItem) -> None:
        super().__init__(parent)
        self.setZValue(Z_SECTOR)
        self.setData(GUIDE, True)  # a faint background: cards and labels may lie over it
        self.apex = QPointF()
        self.start = 0.0
        self.width = 0.0
        self.radius = -1.0  # no geometry yet
        self.used: tuple[float, float] | None = None
        self.selected = False
        self.used_path = QPainterPath()
        self.unused_path = QPainterPath()
        self._cuts: list[float] = []  # the used part's ends that are not the sector's, rad
        self._rect = QRectF()

    def set_selected(self, on: bool) -> None:
        if on != self.selected:
            self.selected = on
            self.update()

    def set_geometry(
        self,
        apex: QPointF,
        start: float,
        width: float,
        radius: float,
        used: tuple[float, float] | None,
    ) -> None:
        """The sector and the part of it the solve uses (start, width; rad, body frame)."""
        if (apex, start, width, radius, used) == (
            self.apex,
            self.start,
            self.width,
            self.radius,
            self.used,
        ):
            return  # unchanged (a drag of another tug redraws the board on every move)
        self.prepareGeometryChange()
        self.apex, self.start, self.width, self.radius = QPointF(apex), start, width, radius
        self.used = used
        whole = width >= TAU - 1e-9
        self._cuts = []
        if used is None:
            self.used_path = QPainterPath()
            self.unused_path = _pie(apex, radius, start, width)
        else:
            # within the sector (the core's arc of a whole circle may start past its end)
            u_start, u_width = used
            self.used_path = _pie(apex, radius, u_start, u_width)
            self.unused_path = QPainterPath()
            if u_width < TAU - 1e-9:
                u_end = u_start + u_width
                if whole:
                    self.unused_path = _pie(apex, radius, u_end, TAU - u_width)
                    self._cuts = [u_start, u_end]
                else:
                    if u_start - start > 1e-9:
                        self.unused_path.addPath(_pie(apex, radius, start, u_start - start))
                        self._cuts.append(u_start)
                    if start + width - u_end > 1e-9:
                        self.unused_path.addPath(_pie(apex, radius, u_end, start + width - u_end))
                        self._cuts.append(u_end)
        r = radius
        self._rect = QRectF(apex.x() - r, apex.y() - r, 2 * r, 2 * r).adjusted(-1, -1, 1, 1)
        self.update()

    def _rim(self, angle: float) -> QPointF:
        return QPointF(
            self.apex.x() + self.radius * math.cos(angle),
            self.apex.y() + self.radius * math.sin(angle),
        )

    def edge_end(self, which: str) -> QPointF:
        """The outer end of the ``"low"`` (start) or ``"high"`` edge, m."""
        return self._rim(self.start if which == "low" else self.start + self.width)

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return self._rect

    @guarded(default=QPainterPath)
    def shape(self) -> QPainterPath:
        return QPainterPath()  # never in the way of a click, nor of a label's placing

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        try:
            k = style.device_scale(painter)
            sel = self.selected
            painter.setRenderHint(QPainter.RenderHint.Antialiasing)
            painter.setPen(Qt.PenStyle.NoPen)
            painter.setBrush(style.SECTOR_FILL_SELECTED if sel else style.SECTOR_FILL)
            painter.drawPath(self.used_path)
            if not self.unused_path.isEmpty():
                # hatched, in screen pixels whatever the zoom (a pattern brush is cosmetic)
                unused = style.SECTOR_UNUSED_SELECTED if sel else style.SECTOR_UNUSED
                painter.setBrush(QBrush(unused, Qt.BrushStyle.BDiagPattern))
                painter.drawPath(self.unused_path)
            edge = style.SECTOR_EDGE_SELECTED if sel else style.SECTOR_EDGE
            painter.setPen(style.scaled_pen(style.pen(edge, 1.4 if sel else 1.0), k))
            if self.width < TAU - 1e-9:
                for which in ("low", "high"):
                    painter.drawLine(self.apex, self.edge_end(which))
            for angle in self._cuts:  # where the used part meets the hatched
                painter.drawLine(self.apex, self._rim(angle))
        except Exception:  # nothing may escape into Qt
            traceback.print_exc()


class SectorKnob(QGraphicsItem):
    """The grip at the end of a wedge's edge, fixed in pixels."""

    def __init__(self, parent: QGraphicsItem, tug: str, which: str) -> None:
        super().__init__(parent)
        self.setFlag(IGNORES)
        self.setZValue(Z_KNOB)
        self.setCacheMode(CACHE)
        self.setData(ROLE, ("sector", tug, which))
        self.setToolTip(
            f"Drag to move this limit of {tug}'s working sector (whole degrees; Shift: 5 degrees)"
        )

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        s = KNOB_PX / 2 + 1
        return QRectF(-s, -s, 2 * s, 2 * s)

    @guarded(default=QPainterPath)
    def shape(self) -> QPainterPath:
        p = QPainterPath()
        p.addEllipse(QPointF(0, 0), KNOB_PX / 2 + 2, KNOB_PX / 2 + 2)
        return p

    @guarded
    def paint(
        self, painter: QPainter, option: QStyleOptionGraphicsItem, widget: QWidget | None = None
    ) -> None:
        try:
            painter.setRenderHint(QPainter.RenderHint.Antialiasing)
            painter.setPen(QPen(style.SELECTION, 1.6))
            painter.setBrush(style.LABEL_BG)
            painter.drawEllipse(QPointF(0, 0), KNOB_PX / 2, KNOB_PX / 2)
            painter.setBrush(style.SELECTION)
            painter.drawEllipse(QPointF(0, 0), 1.8, 1.8)
        except Exception:  # nothing may escape into Qt
            traceback.print_exc()


@dataclass
class SectorDrag:
    """A drag of one edge of a tug's working sector (leads unwrapped as the mouse turns)."""

    body: str
    placement: Placement
    which: str  # "low" or "high"
    apex: tuple[float, float]  # the tug's point, body frame, m
    frame: float  # body-frame angle of lead 0, rad
    flip: float  # pi for a push (the wedge lies opposite the force), else 0
    low: float
    high: float
    prev: float  # body-frame angle of the cursor round the apex at the last move, rad


class SectorLayer:
    """Every placement's working sector on a BoardScene, and the drag of its edges."""

    def __init__(self, scene: BoardScene) -> None:
        self.scene = scene
        self.wedges: dict[str, SectorWedge] = {}
        self.knobs: dict[str, tuple[SectorKnob, SectorKnob]] = {}
        #: each tug's used arc with what it was worked out for: (key, outline, arc)
        self._arcs: dict[str, tuple[tuple[object, ...], object, tuple[float, float] | None]] = {}
        scene.refresh_hooks.append(self.refresh)
        scene.selection_changed.connect(self.refresh)

    # -- drawing --------------------------------------------------------------------------
    @guarded
    def refresh(self, _scene: object = None) -> None:
        scene = self.scene
        seen: set[str] = set()
        if scene.fixed_stage is None:
            for name, r in scene.results().items():
                d = scene.bodies.get(name)
                lay = r.layout
                if d is None or lay.lead_frame_rad is None:
                    continue
                for i, p in enumerate(lay.placements):
                    if p.lead_sector_rad is None:
                        continue
                    seen.add(p.tug)
                    push = bool(lay.is_push[i])
                    flip = math.pi if push else 0.0
                    lo, hi = p.lead_sector_rad
                    apex = QPointF(float(lay.points[i, 0]), float(lay.points[i, 1]))
                    radius = PUSH_RADIUS_M if push else p.line_length_m
                    frame = float(lay.lead_frame_rad[i]) + flip
                    arc = self._used(lay, i)
                    used = None if arc is None else (frame + arc[0], arc[1] - arc[0])
                    wedge = self._wedge(p.tug, d.root)
                    wedge.set_geometry(apex, frame + lo, hi - lo, radius, used)
                    self._knobs(p.tug, d.root, wedge)
        for tug in [t for t in self.wedges if t not in seen]:
            self._drop(tug)

    def _used(self, lay: TugLayout, i: int) -> tuple[float, float] | None:
        """The core's used arc of tug ``i``'s sector (tugsets.used_arc), asked again only
        when what it hangs on changed."""
        p = lay.placements[i]
        frame = lay.lead_frame_rad
        allowance = lay.over_allowance_m
        key = (
            bool(lay.is_push[i]),
            float(lay.points[i, 0]),
            float(lay.points[i, 1]),
            None if frame is None else float(frame[i]),
            p.line_length_m,
            p.lead_sector_rad,
            None if allowance is None else float(allowance[i]),
        )
        got = self._arcs.get(p.tug)
        # the same outline: the same object (a tug dragged), else an equal one (a body
        # made again for a preview)
        if got is not None and got[0] == key and (got[1] is lay.outline or got[1] == lay.outline):
            return got[2]
        arc = used_arc(lay, i)
        self._arcs[p.tug] = (key, lay.outline, arc)
        return arc

    def _wedge(self, tug: str, root: QGraphicsItem) -> SectorWedge:
        w = self.wedges.get(tug)
        # a body's items go with its root (another plan opened, a body taken away)
        if w is None or not isValid(w) or w.parentItem() is not root:
            if w is not None:
                self._drop(tug)
            w = self.wedges[tug] = SectorWedge(root)
        return w

    def _knobs(self, tug: str, root: QGraphicsItem, wedge: SectorWedge) -> None:
        pair = self.knobs.get(tug)
        if pair is None or not all(isValid(k) for k in pair) or pair[0].parentItem() is not root:
            self._drop_knobs(tug)
            pair = self.knobs[tug] = (SectorKnob(root, tug, "low"), SectorKnob(root, tug, "high"))
        shown = self.scene.selected_tug() == tug or self._dragging(tug)
        wedge.set_selected(shown)
        for knob, which in zip(pair, ("low", "high"), strict=True):
            knob.setPos(wedge.edge_end(which))
            knob.setVisible(shown)

    def _dragging(self, tug: str) -> bool:
        drag = self.scene.interaction.drag
        return isinstance(drag, SectorDrag) and drag.placement.tug == tug

    def _drop(self, tug: str) -> None:
        w = self.wedges.pop(tug, None)
        self._arcs.pop(tug, None)
        self._remove([] if w is None else [w])
        self._drop_knobs(tug)

    def _drop_knobs(self, tug: str) -> None:
        self._remove(list(self.knobs.pop(tug, ())))

    @staticmethod
    def _remove(items: list[QGraphicsItem]) -> None:
        for item in items:
            if not isValid(item):
                continue  # already deleted with its body's root
            take_out(item)

    # -- the drag -------------------------------------------------------------------------
    def start(self, tug: str, which: str, pos: QPointF) -> SectorDrag | None:
        """Begin dragging edge ``which`` of ``tug``'s sector from site point ``pos``."""
        for name, r in self.scene.controller.results().items():
            lay = r.layout
            for i, p in enumerate(lay.placements):
                if p.tug != tug or p.lead_sector_rad is None or lay.lead_frame_rad is None:
                    continue
                apex = (float(lay.points[i, 0]), float(lay.points[i, 1]))
                local = self.scene.bodies[name].root.mapFromScene(pos)
                lo, hi = p.lead_sector_rad
                return SectorDrag(
                    body=name,
                    placement=p,
                    which=which,
                    apex=apex,
                    frame=float(lay.lead_frame_rad[i]),
                    flip=math.pi if bool(lay.is_push[i]) else 0.0,
                    low=lo,
                    high=hi,
                    prev=math.atan2(local.y() - apex[1], local.x() - apex[0]),
                )
        return None

    def move(self, drag: SectorDrag, pos: QPointF, coarse: bool) -> None:
        """Turn the dragged edge with the cursor round the tug's point; preview it."""
        local = self.scene.bodies[drag.body].root.mapFromScene(pos)
        ax, ay = drag.apex
        if math.hypot(local.x() - ax, local.y() - ay) < 1e-6:
            return
        angle = math.atan2(local.y() - ay, local.x() - ax)
        turn = wrap_pi(angle - drag.prev)
        drag.prev = angle
        if drag.which == "high":
            drag.high += turn
        else:
            drag.low += turn
        step = 5.0 if coarse else 1.0
        lo, hi = drag.low, drag.high
        if drag.which == "high":
            hi = min(max(self._snapped(drag, hi, step), lo), lo + TAU)
        else:
            lo = max(min(self._snapped(drag, lo, step), hi), hi - TAU)
        c = self.scene.controller
        stage = c.stage
        if stage is None:
            return  # no stage to preview on (an edit under a drag drops it before a move)
        new = drag.placement.with_sector((lo, hi))
        c.preview(c.with_stage(stage.with_placement(new)))
        c.message.emit(self.words(drag, lo, hi))

    def _snapped(self, drag: SectorDrag, lead: float, step_deg: float) -> float:
        """``lead`` moved so that the bearing of the force there is a whole ``step_deg``."""
        force = math.degrees(drag.frame + lead)
        return math.radians(round(force / step_deg) * step_deg) - drag.frame

    def words(self, drag: SectorDrag, lo: float, hi: float) -> str:
        tug = drag.placement.tug
        width = math.degrees(hi - lo)
        if width >= 360.0 - 1e-6:
            return f"Working sector of {tug}: the whole circle"
        start = angle_to_bearing(drag.frame + hi)
        end = angle_to_bearing(drag.frame + lo)
        return (
            f"Working sector of {tug}: clockwise from {start:05.1f}° to {end:05.1f}° "
            f"relative ({width:.0f}° wide)"
        )

    def finish(self, drag: SectorDrag) -> None:
        self.scene.controller.commit_preview(f"Working sector of {drag.placement.tug}")
