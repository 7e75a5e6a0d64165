"""The drift preview on the board: ghost outlines of the body at the drift's times, the
track of its centroid, and the first contact, for the scenario chosen (the worst tug
lost, a named tug lost, all lines let go, or the pulls as set).

``DriftLayer(scene)`` adds itself to the scene's refresh hooks and draws nothing until
switched on (:meth:`DriftLayer.set_enabled`). It draws what the core worked out: the
stage result's drift (``stage_result(...).drift``, the same as the report and the
briefing) when the plan is at rest, or, while a tug is dragged, the drift of the
drag's own layout, worked out once the drag pauses (:data:`DRAG_PAUSE_MS`).
"""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import QObject, QPointF, Qt, QTimer, Signal
from PySide6.QtGui import QPainterPath, QPolygonF
from PySide6.QtWidgets import QGraphicsItem, QGraphicsPathItem

from app.board.items import CACHE, Label
from app.board.scene import BoardScene
from app.guard import guarded
from app.paint import style
from core.errors import TowboardError
from core.motion.drift import DriftResult, DriftScenario
from core.motion.scenarios import drift, drift_setup
from core.motion.summary import contact_words, ghost_groups, group_words

#: While a tug is dragged the drift is worked out again once the drag pauses this long.
DRAG_PAUSE_MS = 120

Z_GHOST = -1.0  # over the site's features, under the hulls
Z_TRACK = -0.5
Z_NOTE = 12.0
#: Ghosts whose centroids lie closer than this share of the body's size share a label.
LABEL_APART = 0.12


class DriftLayer(QObject):
    """Ghosts, track and contact of the stage shown, for one scenario."""

    #: Emitted after the drift drawn has changed (the panel shows its figures).
    updated = Signal()

    def __init__(self, scene: BoardScene) -> None:
        super().__init__()
        self.scene = scene
        self.enabled = False
        self.scenario = DriftScenario("worst_tug_lost")
        self.result: DriftResult | None = None
        #: Why nothing is drawn (no hull, no draught, no tug to lose...), else "".
        self.note = ""
        #: True while the drawing is of a value before the drag's latest move.
        self.pending = False
        self.items: list[QGraphicsItem] = []
        self._key: object = None
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(DRAG_PAUSE_MS)
        self._timer.timeout.connect(self._update_now)
        scene.refresh_hooks.append(self.refresh)

    # -- what to show ------------------------------------------------------------------
    def set_enabled(self, on: bool) -> None:
        if on != self.enabled:
            self.enabled = on
            self._key = None
            self.refresh(self.scene)

    def set_scenario(self, scenario: DriftScenario) -> None:
        if scenario != self.scenario:
            self.scenario = scenario
            self._key = None
            self.refresh(self.scene)

    def _state_key(self) -> object:
        c = self.scene.controller
        return (id(c.project), c.stage_index, self.scenario, self.enabled)

    # -- keeping up with the board ---------------------------------------------------------
    def refresh(self, scene: BoardScene) -> None:
        """The scene's refresh hook: work the drift out again when anything changed."""
        key = self._state_key()
        if key == self._key:
            return
        if not self.enabled:
            shown_off = self._key is not None and not self._key[-1]  # type: ignore[index]
            self._key = key
            self._timer.stop()
            if not shown_off:  # said once; not again on every move of a drag
                self._show(None, "")
            return
        if scene.controller.previewing:  # a drag: wait for it to pause
            if not self.pending:
                self.pending = True
                self._set_pending_look(True)
            # The pause counts from when this move has been drawn, not from now: a slow
            # repaint must not pass for a pause of the hand.
            QTimer.singleShot(0, guarded(self._timer.start))  # Qt's own slot, as it is
            return
        self._timer.stop()
        self._update_now()

    @guarded
    def _update_now(self) -> None:
        self._key = self._state_key()
        try:
            result, note = self.compute()
        except TowboardError as e:  # bad input on the way: say so, draw nothing
            result, note = None, str(e)
        except (ValueError, ArithmeticError) as e:  # never a traceback from a drag
            result, note = None, f"drift not worked out: {e}"
        self.pending = False
        self._show(result, note)

    def compute(self) -> tuple[DriftResult | None, str]:
        """The drift to draw, and why there is none (or "")."""
        c = self.scene.controller
        stage = self.scene.stage()
        if stage is None or not c.project.hulls:
            return None, "no hull to drift"
        if c.previewing:
            return self._drag_drift()
        result = c.stage_result()
        if result is None:
            return None, "no stage"
        sd = result.drift
        if sd.reason or sd.setup is None:
            return None, sd.reason
        if self.scenario.kind == "as_set":
            return drift(c.project, stage, self.scenario, setup=sd.setup), ""
        if self.scenario.kind == "tug_lost" and self.scenario.tug not in sd.setup.tugs:
            return None, f"{self.scenario.tug} does not work on {sd.body} in this stage"
        r = sd.result(self.scenario)
        return r, "" if r is not None else f"no tug works on {sd.body} in this stage"

    def _drag_drift(self) -> tuple[DriftResult | None, str]:
        """The drift of the value being dragged, from the drag's own tug layout."""
        c = self.scene.controller
        stage = self.scene.stage()
        main = c.main_body()
        results = c.results()
        if stage is None or main is None or main not in results:
            return None, "no hull to drift"
        setup = drift_setup(c.project, stage, main, layout=results[main].layout)
        if self.scenario.kind == "tug_lost" and self.scenario.tug not in setup.tugs:
            return None, f"{self.scenario.tug} does not work on {main} in this stage"
        r = drift(c.project, stage, self.scenario, setup=setup)
        return r, "" if r is not None else f"no tug works on {main} in this stage"

    # -- drawing ---------------------------------------------------------------------------
    def _clear(self) -> None:
        for item in self.items:
            self.scene.removeItem(item)
        self.items = []

    def _set_pending_look(self, pending: bool) -> None:
        for item in self.items:
            item.setOpacity(0.35 if pending else 1.0)

    def _show(self, result: DriftResult | None, note: str) -> None:
        self._clear()
        self.result, self.note = result, note
        if result is not None:
            self._draw(result)
        self.updated.emit()

    def _add(self, item: QGraphicsItem, z: float) -> None:
        item.setCacheMode(CACHE)  # dashed outlines drawn once, not on every frame of a drag
        item.setZValue(z)
        item.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        item.setData(0, ("drift",))
        self.scene.addItem(item)
        self.items.append(item)

    def _draw(self, r: DriftResult) -> None:
        track = r.centroid_track()
        path = QPainterPath(QPointF(*track[0]))
        for x, y in track[1:]:
            path.lineTo(x, y)
        line = QGraphicsPathItem(path)
        line.setPen(style.pen(style.DRIFT, 1.4, Qt.PenStyle.DotLine))
        self._add(line, Z_TRACK)
        for state in r.ghost_states:
            self._ghost(r, state)
        self._time_labels(r)
        if r.contact is not None:
            self._ghost(r, r.states[-1], contact=True)
            self._contact(r)

    def _ghost(self, r: DriftResult, state: np.ndarray, contact: bool = False) -> None:
        color = style.DRIFT_CONTACT if contact else style.DRIFT
        for pts in r.outlines_at(state):
            item = QGraphicsPathItem()
            p = QPainterPath()
            p.addPolygon(QPolygonF([QPointF(x, y) for x, y in pts] + [QPointF(*pts[0])]))
            item.setPath(p)
            item.setPen(style.pen(color, 1.6 if contact else 1.2, Qt.PenStyle.DashLine))
            self._add(item, Z_GHOST)

    def _time_labels(self, r: DriftResult) -> None:
        """A label per ghost at its leading point in the direction of the drift; ghosts
        that lie almost on top of each other share one label ("30, 60 s")."""
        start = r.centroid_track()[0]
        cents = r.centroid_track(r.ghost_states)
        for group in ghost_groups(r, LABEL_APART):
            k = group[-1]
            d = cents[k] - start
            norm = float(np.hypot(*d))
            u = d / norm if norm > 1e-6 else np.array([0.0, 1.0])
            pts = np.vstack(r.outlines_at(r.ghost_states[k]))
            lead = pts[int(np.argmax((pts - cents[k]) @ u))]
            lab = Label(
                group_words(r, group), None, style.DRIFT, style.label_font(8.0, True), (0.0, 0.0)
            )
            lab.set_outward(float(u[0]), float(-u[1]))  # the screen's y runs down
            lab.setPos(float(lead[0]), float(lead[1]))
            self._add(lab, Z_NOTE)

    def _contact(self, r: DriftResult) -> None:
        c = r.contact
        if c is None:
            return
        ring = QGraphicsPathItem()
        p = QPainterPath()
        radius = max(1.0, 0.03 * max(float(abs(r.problem.outlines[0]).max()), 1.0))
        p.addEllipse(QPointF(*c.point), radius, radius)
        ring.setPath(p)
        ring.setPen(style.pen(style.DRIFT_CONTACT, 2.0))
        self._add(ring, Z_NOTE - 1)
        units = self.scene.controller.project.units
        lab = Label(
            _sentence(contact_words(r, units)),
            None,
            style.DRIFT_CONTACT,
            style.label_font(8.5, True),
            (10.0, -12.0),
        )
        lab.setPos(*c.point)
        self._add(lab, Z_NOTE)


def _sentence(text: str) -> str:
    """``text`` with a capital first letter (names in it keep theirs)."""
    return text[:1].upper() + text[1:]
