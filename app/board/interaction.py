"""Editing the board with the mouse and the keys.

Tools: ``select`` (drag bodies, tugs, points, vertices and site features; double-click
an edge to insert a vertex; Delete removes the selection), ``draw`` (click vertices,
click the first one again, double-click or press Enter to close; Backspace takes one
back), ``line_point`` and ``push_point`` (click the hull edge; the point snaps to it),
and the site's drawing tools ``quay``, ``limit``, ``dolphin`` and ``vessel`` (see
:mod:`app.board.drafting`; the site's editing with the select tool is in
:mod:`app.board.site_tools`).

Keys on a selected tug: + / - change its setting by 1 %, Page Up / Page Down by 10 %,
the wheel over it by 5 % a notch; arrow keys nudge the selection 1 m (Shift: 10 m,
vertices and points 0.5 m / 5 m). Consecutive nudges or steps of one item are one
undo step. Every drag previews on every mouse move and records one undo step on
release.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import TYPE_CHECKING

from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QTransform

from app.board.drafting import DRAW_TOOLS, Draft
from app.board.items import ROLE
from app.board.poses import pose_in
from app.board.sector_layer import SectorDrag
from app.board.site_tools import FeatureDrag, PointDrag, SiteTools
from app.edits import bodies as body_edits
from app.edits import hulls as hull_edits
from app.edits import site as site_edits
from app.edits import tugs as tug_edits
from app.guard import guarded
from core.errors import OutlineError, TowboardError
from core.mechanics.balance import with_placement_row
from core.model.hull import Hull
from core.model.outlines import validate_outline
from core.model.plan import BodyPose
from core.model.tugs import Placement

if TYPE_CHECKING:
    from app.board.scene import BoardScene

#: Each tool: (menu text, key, what it does). The window makes an action of each.
TOOL_INFO: dict[str, tuple[str, str, str]] = {
    "select": (
        "Select / drag",
        "S",
        "Select and drag bodies, tugs, points and vertices; drag the knob ahead of a "
        "selected body to turn it",
    ),
    "draw": ("Draw outline", "D", "Click the vertices of an outline; click the first one to close"),
    "line_point": ("Add line point", "L", "Click the hull edge to add a line point"),
    "push_point": ("Add push point", "P", "Click the hull edge to add a push point"),
    "quay": (
        "Draw quay",
        "Q",
        "Click the points of a quay face; Enter or a double-click ends it",
    ),
    "dolphin": ("Draw dolphin", "O", "Click a dolphin's centre, then a point on its edge"),
    "vessel": (
        "Draw moored vessel",
        "V",
        "Click the vessel's stern and bow on its centreline, then a point on its side",
    ),
    "limit": (
        "Draw basin limit",
        "B",
        "Click the points of a limit; click the first one to close it, Enter leaves it open",
    ),
}
#: What each drawing tool says on the status bar when it is chosen.
TOOL_HINTS = {
    "quay": "Click the points of the quay face; Enter or a double-click ends it, Esc stops.",
    "dolphin": "Click the dolphin's centre, then a point on its edge; Esc stops.",
    "vessel": "Click the moored vessel's stern, then its bow, then a point on its side.",
    "limit": "Click the points of the limit; click the first point to close it, "
    "Enter to leave it open; Esc stops.",
}
TOOLS = tuple(TOOL_INFO)
#: Keys that only modify a drag (Shift: turn in steps), never end it.
MODIFIER_KEYS = frozenset(
    (Qt.Key.Key_Shift, Qt.Key.Key_Control, Qt.Key.Key_Alt, Qt.Key.Key_Meta, Qt.Key.Key_AltGr)
)
SNAP_PX = 14.0  # how near the hull edge a click must be to place a point, px
EDGE_PX = 7.0  # how near an edge a double-click inserts a vertex, px


@dataclass
class _TugDrag:
    body: str
    index: int
    placement: Placement
    grab: tuple[float, float]  # from the tug's reference position to the grab point, body frame


@dataclass
class _BodyDrag:
    body: str
    pose: BodyPose  # where the body lay when grabbed
    grab: tuple[float, float]  # the site point grabbed, m
    press_px: QPointF  # where the press landed on screen, px (a drag starts 3 px away)
    moving: bool = False


@dataclass
class _TurnDrag:
    body: str
    pose: BodyPose
    pivot: tuple[float, float]  # the body's centroid in the site, m (it stays put)
    angle0: float  # site angle of the cursor round the pivot at the press, rad


@dataclass
class _FittingDrag:
    hull: str
    name: str


@dataclass
class _VertexDrag:
    hull: str
    index: int
    moved: bool = False


#: Whatever a drag in progress moves.
_Drag = (
    _TugDrag
    | _FittingDrag
    | _VertexDrag
    | _BodyDrag
    | _TurnDrag
    | PointDrag
    | FeatureDrag
    | SectorDrag
)


class Interaction:
    """Mouse and key handling of one BoardScene (kept apart from the drawing)."""

    def __init__(self, scene: BoardScene) -> None:
        self.scene = scene
        self.tool = "select"
        self.drag: _Drag | None = None
        #: The plan as the drag left it: if it is another, something else (a key, a menu,
        #: undo) edited the plan under the drag, whose indexes and names may be stale.
        self._drag_plan: object = None
        self.draft: Draft | None = None  # the shape being drawn with a drawing tool
        self._draft_target: str | None = None  # hull whose outline the draft replaces
        self.site = SiteTools(self)

    @property
    def controller(self):  # type: ignore[no-untyped-def]
        return self.scene.controller

    def _say(self, text: str) -> None:
        self.controller.message.emit(text)

    # -- tools --------------------------------------------------------------------
    @guarded
    def set_tool(self, tool: str) -> None:
        if tool not in TOOLS:
            raise ValueError(f"unknown board tool {tool!r}")
        if tool == self.tool:
            return
        self._clear_draft()
        self.tool = tool
        if tool == "draw":
            self._draft_target = self.scene.selected_hull()
            if self._draft_target:
                self._say(
                    f"Click the vertices of the new outline of {self._draft_target}; "
                    "click the first vertex or press Enter to close, Esc to stop."
                )
            else:
                self._say(
                    "Click the vertices of a new hull (bow to the east, to the right); "
                    "click the first vertex or press Enter to close, Esc to stop."
                )
        elif tool in ("line_point", "push_point"):
            kind = "line point" if tool == "line_point" else "push point"
            self._say(f"Click on the hull's edge to add a {kind}; Esc to stop.")
        elif tool in TOOL_HINTS:
            self._say(TOOL_HINTS[tool])
        self.scene.tool_changed.emit(tool)

    # -- geometry helpers ---------------------------------------------------------------
    def _ppm(self) -> float:
        return self.scene.pixels_per_metre()

    def _hit(self, pos: QPointF) -> tuple[object, ...] | None:
        views = self.scene.views()
        t = views[0].transform() if views else QTransform()
        for item in self.scene.items(
            pos, Qt.ItemSelectionMode.IntersectsItemShape, Qt.SortOrder.DescendingOrder, t
        ):
            role = item.data(ROLE)
            if role:
                return tuple(role)
        return None

    def _nearest_edge(self, pos: QPointF) -> tuple[str, tuple[float, float], float, int] | None:
        """(hull, hull-frame foot point, distance in px, edge) of the nearest hull edge."""
        best = None
        for d in self.scene.bodies.values():
            for name, h in d.hulls.items():
                if h.hull is None:
                    continue
                local = h.frame.mapFromScene(pos)
                q = h.hull.geometry.nearest(local.x(), local.y())
                px = q.distance * self._ppm()
                if best is None or px < best[2]:
                    best = (name, (q.x, q.y), px, q.edge)
        return best

    def _hull_frame_point(self, hull: str, pos: QPointF) -> tuple[float, float]:
        for d in self.scene.bodies.values():
            if hull in d.hulls:
                p = d.hulls[hull].frame.mapFromScene(pos)
                return (p.x(), p.y())
        raise KeyError(hull)

    def _body_of_hull(self, hull: str) -> str:
        for name, d in self.scene.bodies.items():
            if hull in d.hulls:
                return name
        raise KeyError(hull)

    # -- mouse --------------------------------------------------------------------
    def press(self, event) -> bool:  # type: ignore[no-untyped-def]
        handled = self._press(event)
        self._drag_plan = self.controller.project  # the plan a drag it started works on
        return handled

    def _press(self, event) -> bool:  # type: ignore[no-untyped-def]
        if event.button() != Qt.MouseButton.LeftButton or self.scene.fixed_stage is not None:
            return False
        pos = event.scenePos()
        if self.tool in DRAW_TOOLS:
            self._draft_click(pos)
            return True
        if self.tool in ("line_point", "push_point"):
            self._add_point(pos, "line" if self.tool == "line_point" else "push")
            return True
        hit = self._hit(pos)
        if hit is not None and hit[0] == "sector":
            self.drag = self.scene.sectors.start(str(hit[1]), str(hit[2]), pos)
            return True
        if hit is None or hit[0] not in ("tug", "fitting", "vertex", "hull", "turn", "site_point"):
            if self.site.press(pos, event.screenPos()):
                return True
            self.scene.select(None)
            return False
        kind = hit[0]
        if kind == "tug":
            self._start_tug_drag(str(hit[1]), pos)
        elif kind == "fitting":
            self.scene.select(hit)
            self.drag = _FittingDrag(str(hit[1]), str(hit[2]))
        elif kind == "vertex":
            self.scene.select(hit)
            self.drag = _VertexDrag(str(hit[1]), int(hit[2]))  # type: ignore[call-overload]
        elif kind == "hull":
            self.scene.select(hit)
            self._start_body_drag(pos, event.screenPos())
        elif kind == "turn":
            self._start_turn_drag(str(hit[1]), pos)
        elif kind == "site_point":
            self.site.press_point(hit)
        return True

    def dragged_tug(self) -> tuple[str, str] | None:
        """(body, tug) of the tug being dragged, None when no tug is."""
        drag = self.drag
        return (drag.body, drag.placement.tug) if isinstance(drag, _TugDrag) else None

    def _drag_overtaken(self) -> bool:
        """True (and the drag dropped) when the plan was edited under a drag in progress."""
        if self.drag is None or self.controller.project is self._drag_plan:
            return False
        self.drop_drag()
        self._clear_invalid()
        return True

    def drop_drag(self) -> _Drag | None:
        """End the drag in progress, however it ends, and return it: a dragged tug goes
        back to its resting look (Escape or an edit under the drag has no release)."""
        drag, self.drag = self.drag, None
        if isinstance(drag, _TugDrag):
            body = self.scene.bodies.get(drag.body)
            tug = None if body is None else body.tugs.get(drag.placement.tug)
            if tug is not None:
                tug.set_dragging(False)
        return drag

    def cancel_drag(self) -> None:
        """Drop the drag in progress and put back the plan from before it."""
        if self.drag is not None:
            self.drop_drag()
            self._clear_invalid()
            self.controller.cancel_preview()

    def move(self, event) -> bool:  # type: ignore[no-untyped-def]
        pos = event.scenePos()
        if self.tool in DRAW_TOOLS and self.draft is not None and self.draft.points:
            self.draft.hover((pos.x(), pos.y()))
            return True
        if self._drag_overtaken():
            return True
        drag = self.drag
        if drag is None:
            return False
        if isinstance(drag, _TugDrag):
            self._move_tug(drag, pos)
        elif isinstance(drag, SectorDrag):
            coarse = bool(event.modifiers() & Qt.KeyboardModifier.ShiftModifier)
            self.scene.sectors.move(drag, pos, coarse)
        elif isinstance(drag, _BodyDrag):
            self._move_body(drag, pos, event.screenPos())
        elif isinstance(drag, _TurnDrag):
            self._turn_body(drag, pos, bool(event.modifiers() & Qt.KeyboardModifier.ShiftModifier))
        elif isinstance(drag, _FittingDrag):
            self._move_fitting(drag, pos)
        elif isinstance(drag, (PointDrag, FeatureDrag)):
            self.site.move(drag, pos, event.screenPos())
        else:
            self._move_vertex(drag, pos)
        self._drag_plan = self.controller.project
        return True

    def release(self, event) -> bool:  # type: ignore[no-untyped-def]
        if self._drag_overtaken():
            return True
        drag = self.drop_drag()
        if drag is None:
            return False
        c = self.controller
        if isinstance(drag, _TugDrag):
            c.commit_preview(f"Move {drag.placement.tug}")
        elif isinstance(drag, SectorDrag):
            self.scene.sectors.finish(drag)
        elif isinstance(drag, _BodyDrag):
            c.commit_preview(f"Move {drag.body}")
        elif isinstance(drag, _TurnDrag):
            c.commit_preview(f"Turn {drag.body}")
        elif isinstance(drag, _FittingDrag):
            c.commit_preview(f"Slide {drag.name}")
        elif isinstance(drag, (PointDrag, FeatureDrag)):
            self.site.release(drag)
        else:
            if self.scene.stale:
                self._say(f"Outline not changed there: {self.scene.stale}")
            self._clear_invalid()
            c.commit_preview(f"Move vertex {drag.index} of {drag.hull}")
        return True

    def double_click(self, event) -> bool:  # type: ignore[no-untyped-def]
        if event.button() != Qt.MouseButton.LeftButton:
            return False
        if self.tool in DRAW_TOOLS:
            self.finish_draft()
            return True
        if self.tool != "select":
            return False
        pos = event.scenePos()
        hit = self._hit(pos)
        if hit is not None and hit[0] in ("fitting", "tug"):
            self.drag = None
            self.scene.select(hit)
            self.scene.edit_requested.emit(hit)  # the window opens its editor
            return True
        if self.site.double_click(pos):
            return True
        edge = self._nearest_edge(pos)
        if edge is None or edge[2] > EDGE_PX:
            return False
        hull_name, foot, _, k = edge
        hull = self.controller.project.hull(hull_name)
        try:
            new = hull_edits.inserted_vertex(hull, k, foot)
        except TowboardError as e:
            self._say(str(e))
            return True
        self.controller.apply(
            self.controller.project.with_hull(new), f"Insert vertex in {hull_name}"
        )
        self.scene.select(("vertex", hull_name, k + 1))
        return True

    # -- tug drag -----------------------------------------------------------------
    def _start_tug_drag(self, tug: str, pos: QPointF) -> None:
        self.scene.select(("tug", tug))
        for name, r in self.controller.results().items():
            for i, p in enumerate(r.layout.placements):
                if p.tug == tug:
                    local = self.scene.bodies[name].root.mapFromScene(pos)
                    if r.layout.is_push[i]:
                        grab = (0.0, 0.0)  # a push tug follows the cursor round its point
                    else:
                        px, py = r.layout.positions[i]
                        grab = (local.x() - px, local.y() - py)
                    self.drag = _TugDrag(name, i, p, grab)
                    self.scene.bodies[name].tugs[tug].set_dragging(True)
                    return

    def _move_tug(self, drag: _TugDrag, pos: QPointF) -> None:
        c = self.controller
        d = self.scene.bodies[drag.body]
        local = d.root.mapFromScene(pos)
        target = (local.x() - drag.grab[0], local.y() - drag.grab[1])
        r = c.results().get(drag.body)
        if r is None:
            return
        placement = tug_edits.dragged_placement(r.body, drag.placement, target)
        project = c.project
        stage = c.stage
        if stage is None:
            return
        stage = stage.with_placement(placement)
        project = c.with_stage(stage, project)
        # the fast path: the one tug's row of the arrays is made again, the rest are kept
        layout = with_placement_row(r.layout, project, stage, r.body, placement)
        drag.placement = placement
        c.preview_moved_tug(project, drag.body, layout, drag.index)

    # -- moving and turning a body ------------------------------------------------------
    def _start_body_drag(self, pos: QPointF, screen: QPointF) -> None:
        body = self.scene.selected_body()
        if body is None or self.controller.stage is None:
            return
        self.drag = _BodyDrag(body, self.scene.pose(body), (pos.x(), pos.y()), QPointF(screen))

    def _move_body(self, drag: _BodyDrag, pos: QPointF, screen: QPointF) -> None:
        if not drag.moving:
            d = QPointF(screen) - drag.press_px
            if math.hypot(d.x(), d.y()) < 3.0:
                return  # a click that wobbles is still a click, not a move
            drag.moving = True
        c = self.controller
        to = (drag.pose.x + pos.x() - drag.grab[0], drag.pose.y + pos.y() - drag.grab[1])
        to = self.scene.snap(to)
        stage = c.stage
        if stage is None:
            return
        project = c.project
        c.preview(c.with_stage(body_edits.moved_body(project, stage, drag.body, to)))

    def _start_turn_drag(self, body: str, pos: QPointF) -> None:
        d = self.scene.bodies.get(body)
        if d is None or d.body is None or self.controller.stage is None:
            return
        pose = self.scene.pose(body)
        c = d.root.mapToScene(QPointF(*d.body.centroid))
        pivot = (c.x(), c.y())
        self.drag = _TurnDrag(body, pose, pivot, math.atan2(pos.y() - c.y(), pos.x() - c.x()))

    def _turn_body(self, drag: _TurnDrag, pos: QPointF, coarse: bool) -> None:
        c = self.controller
        stage = c.stage
        if stage is None:
            return
        a = math.atan2(pos.y() - drag.pivot[1], pos.x() - drag.pivot[0])
        # the site angle grows counter-clockwise; the true heading clockwise
        heading = drag.pose.heading_deg - math.degrees(a - drag.angle0)
        step = 5.0 if coarse else 0.1
        heading = round(heading / step) * step
        project = c.project
        # turned from the pose at the press, so the pivot never drifts with rounding
        start = body_edits.posed(project, stage, drag.pose)
        new = body_edits.turned_body(project, start, drag.body, heading, drag.pivot)
        c.preview(c.with_stage(new))

    # -- fitting and vertex drags ---------------------------------------------------------
    def _move_fitting(self, drag: _FittingDrag, pos: QPointF) -> None:
        c = self.controller
        p = self._hull_frame_point(drag.hull, pos)
        hull = c.project.hull(drag.hull)
        c.preview(c.project.with_hull(hull_edits.slid_fitting(hull, drag.name, p)))

    def _move_vertex(self, drag: _VertexDrag, pos: QPointF) -> None:
        c = self.controller
        p = self.scene.snap(self._hull_frame_point(drag.hull, pos))  # on the hull's own grid
        hull = c.project.hull(drag.hull)
        try:
            new = hull_edits.moved_vertex(hull, drag.index, p)
        except OutlineError as e:
            outline = hull_edits.moved_vertex_outline(hull, drag.index, p)
            self._show_invalid(drag.hull, list(outline), str(e).split(": ", 1)[-1])
            return
        self._clear_invalid()
        c.preview(c.project.with_hull(new))

    def _show_invalid(self, hull: str, outline: list[tuple[float, float]], why: str) -> None:
        self.scene.stale = f"outline invalid ({why}); the balance shown is the last valid one"
        for d in self.scene.bodies.values():
            if hull in d.hulls:
                d.hulls[hull].show_invalid(outline)
        self.scene.refresh()

    def _clear_invalid(self) -> None:
        if self.scene.stale is None:
            return
        self.scene.stale = None
        for d in self.scene.bodies.values():
            for h in d.hulls.values():
                h.show_invalid(None)
        self.scene.refresh()

    # -- adding points ----------------------------------------------------------------
    def _add_point(self, pos: QPointF, kind: str) -> None:
        edge = self._nearest_edge(pos)
        if edge is None:
            self._say("There is no hull to put a point on; draw or generate one first.")
            return
        hull_name, foot, px, _ = edge
        if px > SNAP_PX:
            self._say("Click on the hull's edge (nearer the outline) to add a point there.")
            return
        hull = self.controller.project.hull(hull_name)
        new = hull_edits.added_fitting(hull, kind, foot)  # type: ignore[arg-type]
        name = next(f.name for f in new.fittings if f.name not in {g.name for g in hull.fittings})
        self.controller.apply(self.controller.project.with_hull(new), f"Add {name} to {hull_name}")
        self.scene.select(("fitting", hull_name, name))
        self._say(f"Added {name} on {hull_name}.")

    # -- drawing an outline --------------------------------------------------------------
    def _draft_click(self, pos: QPointF) -> None:
        if self.draft is None:
            self.draft = Draft(self.scene, self.tool)
        if self.draft.click((pos.x(), pos.y()), self._ppm()):
            self.finish_draft()

    def _clear_draft(self) -> None:
        if self.draft is not None:
            self.draft.clear()
            self.draft = None

    def finish_draft(self) -> None:
        """End the shape being drawn: a hull's outline, or a site feature."""
        if self.tool == "draw":
            self.close_draft()
        elif self.tool in DRAW_TOOLS:
            self._add_site_feature()

    def _add_site_feature(self) -> None:
        d = self.draft
        if d is None or not d.points:
            return
        c = self.controller
        kind = {"quay": "quay", "limit": "limit", "dolphin": "dolphin", "vessel": "vessel"}[
            self.tool
        ]
        name = site_edits.next_name(c.project, kind)  # type: ignore[arg-type]
        try:
            feature = d.feature(name)
            project = site_edits.added(c.project, feature)
        except (TowboardError, IndexError, ZeroDivisionError) as e:
            need = {"dolphin": "its centre and a point on its edge", "vessel": "three points"}
            why = (
                str(e)
                if isinstance(e, TowboardError)
                else f"it needs {need.get(self.tool, 'more points')}"
            )
            self._say(f"Cannot use that {kind}: {why}")
            return
        self._clear_draft()
        c.apply(project, f"Draw {name}")
        self.set_tool("select")
        self.scene.select(("site", name))
        self._say(f"Drew {name}; double-click a line to add a point, right-click to rename.")

    def close_draft(self) -> None:
        """Close the outline being drawn and make it a hull's outline."""
        pts = list(self.draft.points) if self.draft is not None else []
        if len(pts) < 3:
            self._say("An outline needs at least three vertices.")
            return
        c = self.controller
        project = c.project
        try:
            validate_outline(pts, "drawn outline")
            target = self._draft_target
            if target is not None and any(h.name == target for h in project.hulls):
                hull = project.hull(target)
                local = [self._hull_frame_point(target, QPointF(*p)) for p in pts]
                project = project.with_hull(hull.with_outline(tuple(local)))
                text = f"Draw outline of {target}"
                name = target
            else:
                project, name = self._new_hull(project, pts)
                text = f"Draw hull {name}"
        except TowboardError as e:
            self._say(f"Cannot use that outline: {e}")
            return
        self._clear_draft()
        c.apply(project, text)
        self.tool = "select"
        self.scene.tool_changed.emit("select")
        self.scene.select(("hull", name))
        self._say(f"{text}: done.")

    def _new_hull(self, project, pts):  # type: ignore[no-untyped-def]
        names = {h.name for h in project.hulls} | {g.name for g in project.groups}
        n = 1
        while f"Hull {n}" in names:
            n += 1
        name = f"Hull {n}"
        # the reference point goes to the aft end on the centreline (the middle of the beam)
        xs, ys = [p[0] for p in pts], [p[1] for p in pts]
        ox, oy = min(xs), 0.5 * (min(ys) + max(ys))
        hull = Hull(name, tuple((x - ox, y - oy) for x, y in pts))
        project, stage = self.controller.ensure_stage(project)
        stage = hull_edits.with_pose(stage, BodyPose(name, ox, oy, 90.0))
        project = project.with_hull(hull)
        project = self.controller.with_stage(stage, project)
        return project, name

    # -- keys -----------------------------------------------------------------------
    def key(self, event) -> bool:  # type: ignore[no-untyped-def]
        k = event.key()
        shift = bool(event.modifiers() & Qt.KeyboardModifier.ShiftModifier)
        if k == Qt.Key.Key_Escape:
            if self.drag is not None:
                self.cancel_drag()
            elif self.tool != "select":
                self.set_tool("select")
            else:
                self.scene.select(None)
            return True
        if self.tool in DRAW_TOOLS:
            if k in (Qt.Key.Key_Return, Qt.Key.Key_Enter):
                self.finish_draft()
                return True
            if k == Qt.Key.Key_Backspace and self.draft is not None:
                self.draft.back()
                return True
            return False
        sel = self.scene.selection
        if sel is None:
            return False
        if self.drag is not None and k not in MODIFIER_KEYS:
            self.cancel_drag()  # a key that edits ends the drag first (it edits the plan before it)
        if sel[0] == "tug":
            steps = {
                Qt.Key.Key_Plus: 0.01,
                Qt.Key.Key_Equal: 0.01,
                Qt.Key.Key_Minus: -0.01,
                Qt.Key.Key_PageUp: 0.10,
                Qt.Key.Key_PageDown: -0.10,
            }
            if k in steps:
                self.step_setting(str(sel[1]), steps[k])
                return True
        if sel[0] == "hull" and k in (Qt.Key.Key_BracketLeft, Qt.Key.Key_BracketRight):
            step = 10.0 if shift else 1.0
            self.turn_selected(-step if k == Qt.Key.Key_BracketLeft else step)
            return True
        arrows = {
            Qt.Key.Key_Left: (-1.0, 0.0),
            Qt.Key.Key_Right: (1.0, 0.0),
            Qt.Key.Key_Up: (0.0, 1.0),
            Qt.Key.Key_Down: (0.0, -1.0),
        }
        if k in arrows:
            dx, dy = arrows[k]
            self.nudge(dx, dy, big=shift)
            return True
        if k in (Qt.Key.Key_Delete, Qt.Key.Key_Backspace):
            self.delete_selection()
            return True
        return False

    def step_setting(self, tug: str, delta: float) -> None:
        """Change a tug's setting by ``delta`` (fraction), kept within 0..100 %."""
        c = self.controller
        stage = c.stage
        if stage is None:
            return
        try:
            p = stage.placement(tug)
        except TowboardError:
            return
        value = tug_edits.clamp_setting(round((p.setting + delta) * 1000) / 1000)
        if value == p.setting:
            return
        c.apply(
            c.with_stage(stage.with_placement(p.with_setting(value))),
            f"Setting of {tug}",
            merge_key=("setting", tug),
        )

    def nudge(self, dx: float, dy: float, big: bool = False) -> None:
        """Move the selection by (dx, dy) screen steps (site east, north)."""
        sel = self.scene.selection
        c = self.controller
        if sel is None:
            return
        try:
            if sel[0] in ("site", "site_point"):
                self.site.nudge(sel, dx, dy, big)
            elif sel[0] == "hull":
                body = self.scene.selected_body()
                step = 10.0 if big else 1.0
                if body is not None and c.stage is not None:
                    stage = body_edits.shifted_body(c.project, c.stage, body, dx * step, dy * step)
                    c.apply(c.with_stage(stage), f"Nudge {body}", merge_key=("nudge", "body", body))
            elif sel[0] == "tug":
                self._nudge_tug(str(sel[1]), dx * (10 if big else 1), dy * (10 if big else 1))
            elif sel[0] == "vertex":
                step = 5.0 if big else 0.5
                hull = c.project.hull(str(sel[1]))
                i = int(sel[2])  # type: ignore[call-overload]
                x, y = self._site_step_in_hull(hull.name, dx * step, dy * step)
                vx, vy = hull.outline[i]
                new = hull_edits.moved_vertex(hull, i, (vx + x, vy + y))
                c.apply(
                    c.project.with_hull(new),
                    f"Nudge vertex {i} of {hull.name}",
                    merge_key=("nudge", "vertex", hull.name, i),
                )
            elif sel[0] == "fitting":
                step = 5.0 if big else 0.5
                hull = c.project.hull(str(sel[1]))
                f = hull.fitting(str(sel[2]))
                x, y = self._site_step_in_hull(hull.name, dx * step, dy * step)
                new = hull_edits.slid_fitting(hull, f.name, (f.x + x, f.y + y))
                if new.fitting(f.name) == f:  # the step ran into the outline: slide along it
                    new = hull_edits.slid_fitting_by(hull, f.name, step if dx + dy > 0 else -step)
                c.apply(
                    c.project.with_hull(new),
                    f"Nudge {f.name}",
                    merge_key=("nudge", "fitting", hull.name, f.name),
                )
        except TowboardError as e:  # a bad step, or what was selected is gone
            self._say(f"Not moved: {e}")

    def turn_selected(self, degrees: float) -> None:
        """Turn the selected body by ``degrees`` clockwise (to starboard) about its centroid."""
        c = self.controller
        body = self.scene.selected_body()
        if body is None or c.stage is None:
            return
        heading = self.scene.pose(body).heading_deg + degrees
        stage = body_edits.turned_body(c.project, c.stage, body, heading)
        c.apply(c.with_stage(stage), f"Turn {body}", merge_key=("nudge", "turn", body))

    def _site_step_in_hull(self, hull: str, dx: float, dy: float) -> tuple[float, float]:
        d = self.scene.bodies[self._body_of_hull(hull)].hulls[hull].frame
        a = d.mapFromScene(QPointF(0.0, 0.0))
        b = d.mapFromScene(QPointF(dx, dy))
        return (b.x() - a.x(), b.y() - a.y())

    def _nudge_tug(self, tug: str, dx: float, dy: float) -> None:
        c = self.controller
        stage = c.stage
        for name, r in c.results().items():
            for i, p in enumerate(r.layout.placements):
                if p.tug != tug or stage is None:
                    continue
                root = self.scene.bodies[name].root
                a, b = root.mapFromScene(QPointF(0, 0)), root.mapFromScene(QPointF(dx, dy))
                if r.layout.is_push[i]:
                    # a push tug swings about its point: move its stand-off position
                    base = r.layout.points[i] - r.layout.directions[i] * 10.0
                else:
                    base = r.layout.positions[i]
                target = (base[0] + b.x() - a.x(), base[1] + b.y() - a.y())
                new = tug_edits.dragged_placement(r.body, p, target)
                c.apply(
                    c.with_stage(stage.with_placement(new)),
                    f"Nudge {tug}",
                    merge_key=("nudge", "tug", tug),
                )
                return

    @guarded
    def delete_selection(self) -> None:
        sel = self.scene.selection
        c = self.controller
        if sel is None:
            return
        self.cancel_drag()  # deleting what is being dragged: the drag ends first
        try:
            if sel[0] in ("site", "site_point"):
                self.site.delete(sel)
            elif sel[0] == "vertex":
                hull = c.project.hull(str(sel[1]))
                new = hull_edits.deleted_vertex(hull, int(sel[2]))  # type: ignore[call-overload]
                c.apply(c.project.with_hull(new), f"Delete vertex {sel[2]} of {hull.name}")
                self.scene.select(("hull", hull.name))
            elif sel[0] == "fitting":
                hull_name, name = str(sel[1]), str(sel[2])
                words = hull_edits.fitting_deleted_words(c.project, hull_name, name)
                c.apply(hull_edits.without_fitting(c.project, hull_name, name), words)
                self.scene.select(("hull", hull_name))
                self._say(words)
            elif sel[0] == "tug" and c.stage is not None:
                c.apply(c.with_stage(c.stage.without_placement(str(sel[1]))), f"Let go {sel[1]}")
                self.scene.select(None)
        except TowboardError as e:
            self._say(f"Not deleted: {e}")

    def pose_of(self, body: str) -> BodyPose:
        return pose_in(self.scene.stage(), body)
