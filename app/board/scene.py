"""The board's scene: the site frame (x east, y north, m), every body drawn at its pose.

``BoardScene(controller)`` follows the controller (the project and the stage shown)
and edits it with the mouse and keys (see :mod:`app.board.interaction`).
``BoardScene(controller, stage_index=k)`` draws stage ``k`` only and is meant for
printing: build it without a window and call :func:`app.board.render.render_board`,
which draws it north up and to scale into any QPainter (a QPdfWriter, a printer, an
image); the same items, so the same numbers, as on screen.

Scene y grows to the north, so a view must flip y (``BoardView`` does). Things about
a body are children of its root item, in the body frame (x forward, y to port).

Hooks for other parts of the program:

- ``tug_notes``: ``{tug name: text}`` shown under the tug's label (its checks).
- ``refresh_hooks``: callables ``(scene) -> None`` run after every refresh, for
  extra items (wind and current arrows, clearances); ``body_root(name)`` is the item
  to parent body-frame drawings to.
- Non-tug loads in the balance (core.mechanics.balance.Load) are drawn as arrows with their name.
"""

from __future__ import annotations

import math
import operator
from collections.abc import Callable

from PySide6.QtCore import QPointF, QRectF, Signal
from PySide6.QtGui import QPainter
from PySide6.QtWidgets import QGraphicsItem, QGraphicsScene, QMenu

from app.board.drawing import BodyDrawing, _screen_angle
from app.board.handles import TurnHandle
from app.board.interaction import Interaction
from app.board.items import Label
from app.board.menus import board_menu
from app.board.poses import pose_in, site_angle_deg, to_site
from app.board.sector_layer import SectorLayer
from app.controller import BodyResult, Controller
from app.guard import guarded
from app.paint import style
from app.paint.shapes import drawing_scales
from core.mechanics.balance import TugShare
from core.mechanics.bodies import Body, body_name_of_hull, body_of
from core.mechanics.site import body_pose
from core.model.plan import BodyPose, Project, Site, Stage

Selection = tuple[object, ...] | None


def selection_exists(project: Project, selection: Selection) -> bool:
    """Whether what ``selection`` names is in ``project``: an undo, a redo or another
    window's edit may take away the hull, vertex, fitting, tug or site feature selected,
    and the keys that nudge or delete the selection must not reach for it."""
    if not selection:
        return True
    kind, name = selection[0], str(selection[1]) if len(selection) > 1 else ""
    if kind in ("hull", "vertex", "fitting"):
        hull = next((h for h in project.hulls if h.name == name), None)
        if hull is None:
            return kind == "hull" and any(g.name == name for g in project.groups)
        if kind == "vertex":
            return _index_in(selection, len(hull.outline))
        if kind == "fitting":
            return any(f.name == selection[2] for f in hull.fittings)
        return True
    if kind == "turn":
        return name in project.body_names()
    if kind in ("site", "site_point"):
        feature = next((f for f in project.site.features if f.name == name), None)
        if feature is None:
            return False
        return kind == "site" or _index_in(selection, len(feature.points))
    if kind == "tug":
        return any(t.name == name for t in project.tugs)
    return True


def _index_in(selection: tuple[object, ...], count: int) -> bool:
    """Whether the selection's third part is an index below ``count``."""
    try:
        k = operator.index(selection[2])  # type: ignore[arg-type]
    except (IndexError, TypeError):
        return False
    return 0 <= k < count


class BoardScene(QGraphicsScene):
    """The board's items for one project and one stage."""

    selection_changed = Signal()
    tool_changed = Signal(str)
    grid_changed = Signal()
    #: A double-click on a fitting or a tug: ("fitting", hull, name) or ("tug", name).
    edit_requested = Signal(object)

    def __init__(self, controller: Controller, stage_index: int | None = None) -> None:
        super().__init__()
        self.controller = controller
        self.fixed_stage = stage_index
        self.bodies: dict[str, BodyDrawing] = {}
        self.selection: Selection = None
        self.tug_notes: dict[str, str] = {}
        self.refresh_hooks: list[Callable[[BoardScene], None]] = []
        #: Callables ``(menu, target)`` adding entries to a context menu (see app.board.menus).
        self.menu_hooks: list[Callable[[QMenu, tuple[object, ...] | None], None]] = []
        #: The context menu shown last (kept alive while it is open).
        self.last_menu: QMenu | None = None
        #: Why the balance on screen is not the current geometry's (None when it is).
        self.stale: str | None = None
        self.interaction = Interaction(self)
        self._fixed_results: dict[str, BodyResult] | None = None
        self._units = controller.project.units
        self._rect_key: tuple[Site, list[tuple[Body | None, BodyPose]]] | None = None
        #: Grid snap: on or off, and the step in the display length unit.
        self.snap_on = False
        self.grid_step = 1.0
        self.setBackgroundBrush(style.WATER)
        self._hint = Label(
            "No hull yet: choose Draw outline and click its vertices,\n"
            "or Outline from dimensions to make one from length and beam.",
            None,
            style.TEXT,
            style.label_font(11),
            (0, 0),
            "centre",
        )
        self._hint.fixed = True
        self.addItem(self._hint)
        self.turn_handle = TurnHandle()
        self.addItem(self.turn_handle)
        #: Each placement's working sector, drawn and dragged (app.board.sector_layer).
        self.sectors = SectorLayer(self)
        controller.changed.connect(self.refresh)
        self.refresh()

    # -- what is shown ------------------------------------------------------------
    @property
    def tool(self) -> str:
        return self.interaction.tool

    @guarded
    def set_tool(self, tool: str) -> None:
        self.interaction.set_tool(tool)

    def stage(self) -> Stage | None:
        p = self.controller.project
        if self.fixed_stage is None:
            return self.controller.stage
        return p.stages[self.fixed_stage] if 0 <= self.fixed_stage < len(p.stages) else None

    def results(self) -> dict[str, BodyResult]:
        if self.fixed_stage is None:
            return self.controller.results()
        if self._fixed_results is None:
            self._fixed_results = self.controller.results_for(self.fixed_stage)
        return self._fixed_results

    def pose(self, body: str, project: Project | None = None) -> BodyPose:
        """Where ``body`` lies in the stage shown (a group posed through a hull too)."""
        stage = self.stage()
        if stage is None:
            return pose_in(None, body)
        return body_pose(project or self.controller.project, stage, body)

    def main_body(self) -> str | None:
        """The body the stage shown works on: its first tug's, else the first body."""
        project = self.controller.project
        names = project.body_names()
        stage = self.stage()
        if stage is not None and stage.placements:
            try:
                return body_name_of_hull(project, stage.placements[0].hull)
            except ValueError:
                pass
        return names[0] if names else None

    def body_root(self, name: str) -> QGraphicsItem | None:
        d = self.bodies.get(name)
        return d.root if d is not None else None

    def scales(self) -> tuple[float, float, float]:
        """(metres per newton of force arrows, moment for a full arc, arrow head, m)."""
        p = self.controller.project
        stage = self.stage()
        placed = {pl.tug for pl in stage.placements} if stage is not None else set()
        return drawing_scales(
            [h.geometry.length for h in p.hulls],
            [t.bollard_pull_n for t in p.tugs],
            [t.bollard_pull_n for t in p.tugs if t.name in placed],
        )

    def tug_text(self, share: TugShare) -> str:
        u = self.controller.project.units
        text = f"{share.tug}\n{u.show(share.pull_n, 'force')} ({share.setting_words})"
        note = self.tug_notes.get(share.tug)
        return f"{text}\n{note}" if note else text

    def set_tug_notes(self, notes: dict[str, str]) -> None:
        self.tug_notes = dict(notes)
        for d in self.bodies.values():
            for t in d.tugs.values():
                t.forget()
        self.refresh()

    # -- refresh ------------------------------------------------------------------
    @guarded
    def refresh(self) -> None:
        """Bring every item in line with the controller's value (in place)."""
        self._fixed_results = None
        project = self.controller.project
        results = self.results()
        names = project.body_names()
        for name in list(self.bodies):
            if name not in names:
                self.bodies.pop(name).remove()
        self._hint.setVisible(not names and self.fixed_stage is None)
        force_scale, moment_scale, head = self.scales()
        if project.units != self._units:  # every label is written again in the new units
            self._units = project.units
            for shown in self.bodies.values():
                for t in shown.tugs.values():
                    t.forget()
        for name in names:
            d = self.bodies.get(name)
            if d is None:
                d = self.bodies[name] = BodyDrawing(self, name)
            r = results.get(name)
            body = r.body if r is not None else body_of(project, name)
            if d.body is not body:
                d.set_body(body)
            for h in d.hulls.values():
                h.set_units(project.units)
            pose = self.pose(name, project)
            d.set_pose(pose, site_angle_deg(pose))
            moving = self.fixed_stage is None and self.controller.previewing
            d.balance.set_moving(moving)
            if r is None:
                d.set_tugs(None, {}, force_scale, head, self.tug_text)
                d.balance.hide()
                continue
            lay = r.layout
            pts, dirs = lay.points.tolist(), lay.directions.tolist()
            points = {p.tug: (tuple(pts[i]), tuple(dirs[i])) for i, p in enumerate(lay.placements)}
            d.set_tugs(r.balance, points, force_scale, head, self.tug_text, moving)  # type: ignore[arg-type]
            if r.balance.shares or r.balance.loads:
                d.balance.update(
                    r.balance, body, project.units, force_scale, moment_scale, head, self.stale
                )
            else:
                d.balance.hide()
                d.balance.centroid.setPos(*body.centroid)
                d.balance.cog.setPos(*body.centre_of_gravity)
        if not selection_exists(project, self.selection):
            self.select(None)  # an undo took away what was selected
        self._apply_selection()
        self._update_rect()
        for hook in self.refresh_hooks:
            hook(self)

    def _update_rect(self) -> None:
        # room to pan round the bodies and the whole site; the same bodies where they
        # were and the same site (a tug drag's moves) give the same room
        key = (
            self.controller.project.site,
            [(d.body, self.pose(name)) for name, d in self.bodies.items()],
        )
        old = self._rect_key
        if (
            old is not None
            and old[0] is key[0]
            and len(old[1]) == len(key[1])
            and all(a[0] is b[0] and a[1] == b[1] for a, b in zip(old[1], key[1], strict=True))
        ):
            return
        self._rect_key = key
        box = self.bodies_rect()
        site = self.features_rect()
        box = site if box.isNull() else (box if site.isNull() else box.united(site))
        if box.isNull():
            box = QRectF(-100, -100, 200, 200)
        span = max(box.width(), box.height(), 100.0)
        self.setSceneRect(box.adjusted(-3 * span, -3 * span, 3 * span, 3 * span))

    def features_rect(self) -> QRectF:
        """The site-frame box round every site feature, m (null when there is none)."""
        box = QRectF()
        for f in self.controller.project.site.features:
            xs = [x for x, _ in f.points]
            ys = [y for _, y in f.points]
            r = QRectF(QPointF(min(xs), min(ys)), QPointF(max(xs), max(ys)))
            box = r if box.isNull() else box.united(r)
        return box

    def bodies_rect(self) -> QRectF:
        """The site-frame box round every body (outlines only), m."""
        xs: list[float] = []
        ys: list[float] = []
        for name, d in self.bodies.items():
            if d.body is None:
                continue
            pose = self.pose(name)
            x0, y0, x1, y1 = d.body.polygon.bounds
            for p in ((x0, y0), (x1, y0), (x1, y1), (x0, y1)):
                sx, sy = to_site(pose, p)
                xs.append(sx)
                ys.append(sy)
        if not xs:
            return QRectF()
        return QRectF(QPointF(min(xs), min(ys)), QPointF(max(xs), max(ys)))

    def fit_rect(self) -> QRectF:
        """The box a fit-to-hull view shows: the bodies with room for tugs and labels."""
        box = self.bodies_rect()
        if box.isNull():
            return QRectF(-60, -60, 120, 120)
        for d in self.bodies.values():
            for t in d.tugs.values():
                box = box.united(t.glyph.sceneBoundingRect())
        pad = 0.08 * max(box.width(), box.height()) + 10.0
        return box.adjusted(-pad, -pad, pad, pad)

    def site_rect(self) -> QRectF:
        """The box round every site feature and every body with its tugs, m, padded."""
        box = self.fit_rect() if not self.bodies_rect().isNull() else QRectF()
        site = self.features_rect()
        if not site.isNull():
            box = site if box.isNull() else box.united(site)
        if box.isNull():
            return self.fit_rect()
        pad = 0.04 * max(box.width(), box.height()) + 5.0
        return box.adjusted(-pad, -pad, pad, pad)

    # -- selection ------------------------------------------------------------------
    def select(self, selection: Selection) -> None:
        if selection == self.selection:
            return
        self.selection = selection
        self._apply_selection()
        self.selection_changed.emit()

    def _apply_selection(self) -> None:
        sel = self.selection
        for d in self.bodies.values():
            for h in d.hulls.values():
                h.set_selection(sel)
            for name, t in d.tugs.items():
                t.set_selected(sel is not None and sel[0] == "tug" and sel[1] == name)
        self._place_turn_handle()

    def selected_body(self) -> str | None:
        """The body of the selected hull (a lashed group for a lashed hull), or None."""
        sel = self.selection
        if not sel or sel[0] not in ("hull", "turn"):
            return None
        name = str(sel[1])
        project = self.controller.project
        if sel[0] == "turn" or name in {g.name for g in project.groups}:
            return name
        try:
            return body_name_of_hull(project, name)
        except ValueError:
            return None

    def _place_turn_handle(self) -> None:
        """The turn handle ahead of the selected body's bow (hidden when none is selected)."""
        name = self.selected_body() if self.fixed_stage is None else None
        d = self.bodies.get(name) if name is not None else None
        if d is None or d.body is None:
            self.turn_handle.set_body(None)
            return
        self.turn_handle.set_body(name)
        self.turn_handle.setPos(d.root.mapToScene(QPointF(d.body.x_max, d.body.centroid[1])))
        self.turn_handle.set_direction(_screen_angle(d.root, (1.0, 0.0)))

    def selected_hull(self) -> str | None:
        sel = self.selection
        if sel and sel[0] in ("hull", "vertex", "fitting"):
            return str(sel[1])
        return None

    def selected_tug(self) -> str | None:
        sel = self.selection
        return str(sel[1]) if sel and sel[0] == "tug" else None

    # -- the grid ------------------------------------------------------------------------
    def grid_step_m(self) -> float:
        """The grid step in metres (it is set in the display length unit)."""
        return self.controller.project.units.si(self.grid_step, "length")

    def set_grid(self, step: float | None = None, snap: bool | None = None) -> None:
        """Set the grid step (display length unit, > 0) and whether points snap to it."""
        if step is not None:
            if not (math.isfinite(step) and step > 0):
                raise ValueError(f"grid step {step!r} must be a positive length")
            self.grid_step = float(step)
        if snap is not None:
            self.snap_on = bool(snap)
        self.grid_changed.emit()
        for v in self.views():
            v.resetCachedContent()
        self.update()

    def snap(self, p: tuple[float, float]) -> tuple[float, float]:
        """Site point ``p`` on the nearest grid node when snapping is on (else as it is).

        The node is a whole number of steps in the display unit, so a hull drawn on a
        1 m grid is a whole number of metres long.
        """
        if not self.snap_on:
            return p
        u = self.controller.project.units
        step = self.grid_step
        return tuple(  # type: ignore[return-value]
            u.si(round(round(u.value(v, "length") / step) * step, 9), "length") for v in p
        )

    # -- drawing helpers ------------------------------------------------------------
    @guarded
    def drawBackground(self, painter: QPainter, rect: QRectF) -> None:
        super().drawBackground(painter, rect)
        from app.board.overlay import draw_grid

        draw_grid(painter, rect, base=self.grid_step_m())

    # -- events go to the interaction -------------------------------------------------
    def _drop_edit(self, *_: object) -> None:
        """After an error in a mouse or key handler: drop the drag and its preview."""
        self.interaction.drop_drag()
        self.controller.cancel_preview()

    def _pass_on(self, handled: bool, event, base: Callable[[object], None]) -> None:  # type: ignore[no-untyped-def]
        if handled:
            event.accept()
        else:
            base(event)

    @guarded(on_error=_drop_edit)
    def mousePressEvent(self, event):  # type: ignore[no-untyped-def]
        self._pass_on(self.interaction.press(event), event, super().mousePressEvent)

    @guarded(on_error=_drop_edit)
    def mouseMoveEvent(self, event):  # type: ignore[no-untyped-def]
        self._pass_on(self.interaction.move(event), event, super().mouseMoveEvent)

    @guarded(on_error=_drop_edit)
    def mouseReleaseEvent(self, event):  # type: ignore[no-untyped-def]
        self._pass_on(self.interaction.release(event), event, super().mouseReleaseEvent)

    @guarded(on_error=_drop_edit)
    def mouseDoubleClickEvent(self, event):  # type: ignore[no-untyped-def]
        self._pass_on(self.interaction.double_click(event), event, super().mouseDoubleClickEvent)

    @guarded(on_error=_drop_edit)
    def keyPressEvent(self, event):  # type: ignore[no-untyped-def]
        self._pass_on(self.interaction.key(event), event, super().keyPressEvent)

    @guarded
    def contextMenuEvent(self, event):  # type: ignore[no-untyped-def]
        if self.fixed_stage is not None:
            return
        menu = board_menu(self, event.scenePos())
        self.last_menu = menu
        # A menu a right-click, parented to the view: deleted once closed, not piled up
        # (deleteLater waits for the event loop, after the chosen entry has run).
        menu.aboutToHide.connect(menu.deleteLater)
        if menu.isEmpty():
            menu.deleteLater()
        else:
            menu.popup(event.screenPos())
        event.accept()

    def pixels_per_metre(self) -> float:
        views = self.views()
        if not views:
            return 1.0
        t = views[0].transform()
        return math.hypot(t.m11(), t.m12()) or 1.0
