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

- ``tug_notes``: ``{tug name: text}`` shown under the tug's label (utilisation...).
- ``refresh_hooks``: callables ``(scene) -> None`` run after every refresh, for
  extra items (wind and current arrows, clearances); ``body_root(name)`` is the item
  to parent body-frame drawings to.
- Non-tug loads in the balance (core.mechanics.balance.Load) are drawn as arrows with their name.
"""

from __future__ import annotations

import math
from collections.abc import Callable

from PySide6.QtCore import QPointF, QRectF, Signal
from PySide6.QtGui import QPainter
from PySide6.QtWidgets import QGraphicsItem, QGraphicsScene

from app.board.drawing import BodyDrawing
from app.board.interaction import Interaction
from app.board.items import Label
from app.board.poses import pose_in, site_angle_deg, to_site
from app.controller import BodyResult, Controller
from app.paint import style
from core.mechanics.balance import TugShare
from core.mechanics.bodies import body_of
from core.model.plan import Stage

Selection = tuple[object, ...] | None


class BoardScene(QGraphicsScene):
    """The board's items for one project and one stage."""

    selection_changed = Signal()
    tool_changed = Signal(str)

    def __init__(self, controller: Controller, stage_index: int | None = None) -> None:
        super().__init__()
        self.controller = controller
        self.fixed_stage = stage_index
        self.bodies: dict[str, BodyDrawing] = {}
        self.selection: Selection = None
        self.tug_notes: dict[str, str] = {}
        self.refresh_hooks: list[Callable[[BoardScene], None]] = []
        #: Why the balance on screen is not the current geometry's (None when it is).
        self.stale: str | None = None
        self.interaction = Interaction(self)
        self._fixed_results: dict[str, BodyResult] | None = None
        self._units = controller.project.units
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
        self.addItem(self._hint)
        controller.changed.connect(self.refresh)
        self.refresh()

    # -- what is shown ------------------------------------------------------------
    @property
    def tool(self) -> str:
        return self.interaction.tool

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
            self._fixed_results = self.controller.compute_results(
                self.controller.project, self.stage()
            )
        return self._fixed_results

    def body_root(self, name: str) -> QGraphicsItem | None:
        d = self.bodies.get(name)
        return d.root if d is not None else None

    def scales(self) -> tuple[float, float, float]:
        """(metres per newton of force arrows, moment for a full arc, arrow head, m)."""
        p = self.controller.project
        lengths = [h.geometry.length for h in p.hulls] or [50.0]
        lref = max(lengths)
        fref = max((t.bollard_pull_n for t in p.tugs), default=500e3)
        force_scale = 0.55 * lref / fref
        stage = self.stage()
        placed = {pl.tug for pl in stage.placements} if stage is not None else set()
        total = sum(t.bollard_pull_n for t in p.tugs if t.name in placed) or fref
        moment_scale = total * 0.5 * lref
        head = max(2.0, min(0.035 * lref, 12.0))
        return force_scale, moment_scale, head

    def tug_text(self, share: TugShare) -> str:
        u = self.controller.project.units
        text = f"{share.tug}\n{u.show(share.pull_n, 'force')} ({share.setting * 100:.0f} %)"
        note = self.tug_notes.get(share.tug)
        return f"{text}\n{note}" if note else text

    def set_tug_notes(self, notes: dict[str, str]) -> None:
        self.tug_notes = dict(notes)
        for d in self.bodies.values():
            for t in d.tugs.values():
                t._key = None
        self.refresh()

    # -- refresh ------------------------------------------------------------------
    def refresh(self) -> None:
        """Bring every item in line with the controller's value (in place)."""
        self._fixed_results = None
        project = self.controller.project
        stage = self.stage()
        results = self.results()
        names = project.body_names()
        for name in list(self.bodies):
            if name not in names:
                self.bodies.pop(name).remove()
        self._hint.setVisible(not names and self.fixed_stage is None)
        force_scale, moment_scale, head = self.scales()
        if project.units != self._units:  # every label is written again in the new units
            self._units = project.units
            for d in self.bodies.values():
                for t in d.tugs.values():
                    t._key = None
        for name in names:
            d = self.bodies.get(name)
            if d is None:
                d = self.bodies[name] = BodyDrawing(self, name)
            r = results.get(name)
            body = r.body if r is not None else body_of(project, name)
            if d.body is not body:
                d.set_body(body)
            pose = pose_in(stage, name)
            d.set_pose(pose, site_angle_deg(pose))
            if r is None:
                d.set_tugs(None, {}, force_scale, head, self.tug_text)
                d.balance.hide()
                continue
            lay = r.layout
            pts, dirs = lay.points.tolist(), lay.directions.tolist()
            points = {p.tug: (tuple(pts[i]), tuple(dirs[i])) for i, p in enumerate(lay.placements)}
            d.set_tugs(r.balance, points, force_scale, head, self.tug_text)  # type: ignore[arg-type]
            if r.balance.shares or r.balance.loads:
                d.balance.update(
                    r.balance, body, project.units, force_scale, moment_scale, head, self.stale
                )
            else:
                d.balance.hide()
                d.balance.centroid.setPos(*body.centroid)
                d.balance.cog.setPos(*body.centre_of_gravity)
        self._apply_selection()
        self._update_rect()
        for hook in self.refresh_hooks:
            hook(self)

    def _update_rect(self) -> None:
        box = self.bodies_rect()
        if box.isNull():
            box = QRectF(-100, -100, 200, 200)
        span = max(box.width(), box.height(), 100.0)
        self.setSceneRect(box.adjusted(-3 * span, -3 * span, 3 * span, 3 * span))

    def bodies_rect(self) -> QRectF:
        """The site-frame box round every body (outlines only), m."""
        stage = self.stage()
        xs: list[float] = []
        ys: list[float] = []
        for name, d in self.bodies.items():
            if d.body is None:
                continue
            pose = pose_in(stage, name)
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

    def selected_hull(self) -> str | None:
        sel = self.selection
        if sel and sel[0] in ("hull", "vertex", "fitting"):
            return str(sel[1])
        return None

    def selected_tug(self) -> str | None:
        sel = self.selection
        return str(sel[1]) if sel and sel[0] == "tug" else None

    # -- drawing helpers ------------------------------------------------------------
    def drawBackground(self, painter: QPainter, rect: QRectF) -> None:
        super().drawBackground(painter, rect)
        from app.board.overlay import draw_grid

        draw_grid(painter, rect)

    # -- events go to the interaction -------------------------------------------------
    def mousePressEvent(self, event):  # type: ignore[no-untyped-def]
        if self.interaction.press(event):
            event.accept()
        else:
            super().mousePressEvent(event)

    def mouseMoveEvent(self, event):  # type: ignore[no-untyped-def]
        if self.interaction.move(event):
            event.accept()
        else:
            super().mouseMoveEvent(event)

    def mouseReleaseEvent(self, event):  # type: ignore[no-untyped-def]
        if self.interaction.release(event):
            event.accept()
        else:
            super().mouseReleaseEvent(event)

    def mouseDoubleClickEvent(self, event):  # type: ignore[no-untyped-def]
        if self.interaction.double_click(event):
            event.accept()
        else:
            super().mouseDoubleClickEvent(event)

    def keyPressEvent(self, event):  # type: ignore[no-untyped-def]
        if self.interaction.key(event):
            event.accept()
        else:
            super().keyPressEvent(event)

    def pixels_per_metre(self) -> float:
        views = self.views()
        if not views:
            return 1.0
        t = views[0].transform()
        return math.hypot(t.m11(), t.m12()) or 1.0
