"""The hold limits plot on screen: the highest wind the fleet can hold from each direction.

A polar chart drawn with QPainter: north up, true directions clockwise, the distance
from the centre is the limiting wind speed in the display speed unit (the same measure
as the stage's wind: mean speed at its stated height, gusts as set). Two curves, all
tugs and the worst single tug lost; the stage's planned wind is marked and its go / no-go
wind limit drawn as a dotted ring. A hold stage can show the current instead: the
highest current (setting towards each direction) the tugs hold with the wind as set,
with the planned current and the stage's current limit. The numbers are the core's
(the stage result's hold limits); the widget only draws them, and says a limit beyond
the core's sensible range as "above N kn" (core.solve.holdlimits.limit_words).
"""

from __future__ import annotations

import math
import time
import traceback
from dataclasses import dataclass

import numpy as np
from PySide6.QtCore import QAbstractEventDispatcher, QPointF, QRectF, QSize, Qt, QTimer
from PySide6.QtGui import (
    QColor,
    QFont,
    QPainter,
    QPainterPath,
    QPaintEvent,
    QPen,
    QPixmap,
    QPolygonF,
)
from PySide6.QtWidgets import QComboBox, QHBoxLayout, QLabel, QSizePolicy, QVBoxLayout, QWidget

from app.controller import Controller, on_screen
from app.guard import guarded
from app.paint import style
from app.paint.rings import current_scale, polar_scale
from app.paint.symbols import draw_planned_wind
from app.panels.body_choice import BodyChoice
from core.analysis.limits import wind_limit_as_given
from core.errors import TowboardError
from core.model.plan import Project, Stage
from core.solve.holdlimits import (
    Flow,
    HoldLimits,
    Steps,
    hold_limits_problem,
    limit_at,
    limit_words,
    live_hold_limits_steps,
    run_steps,
)
from core.units import DisplayUnits, label

ALL_TUGS = style.ALL_TUGS
TUG_LOST = style.TUG_LOST
PLANNED = style.HULL_EDGE
PLANNED_MARK = style.PLANNED_WIND
RING = style.GRID_MAJOR
SPOKE = style.GRID_MINOR
TEXT = style.INK
MUTED = style.MUTED
HELD_FILL = style.ALL_TUGS_FILL
LIMIT = style.NO_GO  # the stage's go / no-go limit, a dotted ring

#: While a drag is in progress the worst-tug-lost curve is swept again at most this
#: often, seconds (the all-tugs curve at every sweep of the drag).
LOST_EVERY_S = 0.05
#: A drag's sweeps come at most this often, seconds, and never in the mouse move's own
#: handling: they run once the board has been painted, in the time between moves.
FOLLOW_EVERY_S = 0.1
#: ... and at least this many times their own cost apart (a sweep of a large fleet must
#: not take the drag's whole time).
FOLLOW_SPARE = 4.0
#: A sweep that took longer than this, seconds, waits until the mouse has rested for
#: REST_S (it could not keep up with the mouse anyway).
COSTLY_S = 0.05
REST_S = 0.25
#: A piece of a drag's sweep (building its problem, one step) runs in the time between
#: mouse moves only when it can end before the next move is due (the moves' recent
#: spacing), with this much to spare, so no move waits for it...
ROOM_SPARE = 1.5
#: ... unless the sweep has been under way this long, seconds (its pieces then run at once):
#: a mouse that comes faster than the board can follow leaves no time between moves, and
#: the plot must still follow it.
STARVED_S = 0.1
#: The mouse's moves are taken to be at least this far apart, seconds (one frame at
#: 240 Hz): moves handled back to back say nothing of the mouse's pace.
LEAST_GAP_S = 1 / 240


class HoldPlot(QWidget):
    """Paints a :class:`core.solve.pulls.holdlimits.HoldLimits` (or a message when there is none)."""

    def __init__(self, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.limits: HoldLimits | None = None
        self.stage: Stage | None = None
        self.units = DisplayUnits()
        self.message = "No hold limits yet."
        self.coarse = False
        self.lost_curve: tuple[np.ndarray, np.ndarray] | None = None
        #: Which flow the curves are for: "wind" (from), or "current" (towards).
        self.flow: Flow = "wind"
        self._grid_cache: QPixmap | None = None
        self._grid_key: object = None
        #: What the last paint took, seconds.
        self.painted_in = 0.0
        self.setMinimumSize(220, 220)
        self.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Expanding)

    @guarded(default=QSize)
    def sizeHint(self) -> QSize:
        return QSize(360, 380)

    def set_data(
        self,
        limits: HoldLimits | None,
        stage: Stage | None,
        units: DisplayUnits,
        message: str = "",
        coarse: bool = False,
        lost_curve: tuple[np.ndarray, np.ndarray] | None = None,
        flow: Flow = "wind",
    ) -> None:
        """Show ``limits``; ``lost_curve`` (directions, m/s) replaces its worst-lost curve
        (while dragging it is swept on fewer directions than the all-tugs curve)."""
        self.limits, self.stage, self.units = limits, stage, units
        self.flow = flow
        self.message = message
        self.coarse = coarse
        self.lost_curve = lost_curve
        self.update()

    # -- geometry -------------------------------------------------------------------
    def scale_top(self) -> tuple[float, float]:
        """(outer ring, ring step) in the display speed unit (:func:`app.paint.rings.polar_scale`,
        the same scale as the printed plot)."""
        stage = self.stage
        if self.flow == "current":
            return current_scale(
                None if self.limits is None else self.limits.all_tugs_ms,
                0.0 if stage is None else stage.conditions.current_speed_ms,
                None if stage is None else stage.limits.max_current_ms,
                self.units,
            )
        return polar_scale(
            None if self.limits is None else self.limits.all_tugs_ms,
            0.0 if stage is None else stage.conditions.wind_speed_ms,
            None if stage is None else wind_limit_as_given(stage),
            self.units,
        )

    def clipped(self) -> bool:
        """True when part of the all-tugs curve lies beyond the outer ring."""
        if self.limits is None:
            return False
        top, _ = self.scale_top()
        v = [self.units.value(float(x), "speed") for x in self.limits.all_tugs_ms]
        return any((not math.isfinite(x)) or x > top * (1 + 1e-9) for x in v)

    def _frame(self) -> tuple[QPointF, float]:
        """Centre and radius of the chart: room round it for bearings, under it for the legend."""
        r = self.rect()
        legend = 40.0  # the key, and its note on a second line when the key is long
        radius = max(min((r.width() - 64.0) / 2.0, (r.height() - legend - 48.0) / 2.0), 20.0)
        spare = max(r.height() - legend - 48.0 - 2 * radius, 0.0)
        return QPointF(r.center().x(), 24.0 + spare / 2 + radius), radius

    # -- painting -------------------------------------------------------------------
    def _grid_pixmap(self, centre: QPointF, radius: float, top: float, step: float) -> QPixmap:
        """The background, rings and bearings, drawn once per size and scale."""
        ratio = self.devicePixelRatioF()
        key = (self.width(), self.height(), ratio, top, step, self.units.unit("speed"))
        if self._grid_key != key or self._grid_cache is None:
            pm = QPixmap(round(self.width() * ratio), round(self.height() * ratio))
            pm.setDevicePixelRatio(ratio)
            pm.fill(QColor("white"))
            g = QPainter(pm)
            g.setRenderHint(QPainter.RenderHint.Antialiasing)
            g.setFont(self.font())
            self._grid(g, centre, radius, top, step)
            g.end()
            self._grid_cache, self._grid_key = pm, key
        return self._grid_cache

    @guarded
    def paintEvent(self, event: QPaintEvent) -> None:
        start = time.perf_counter()
        p = QPainter(self)
        try:
            self._paint(p)
        except Exception:  # nothing may escape into Qt
            traceback.print_exc()
        finally:
            if p.isActive():
                p.end()
            self.painted_in = time.perf_counter() - start

    def _paint(self, p: QPainter) -> None:
        p.setRenderHint(QPainter.RenderHint.Antialiasing)
        centre, radius = self._frame()
        top, step = self.scale_top()
        p.drawPixmap(0, 0, self._grid_pixmap(centre, radius, top, step))
        lim = self.limits
        if lim is None:
            self._message(p, centre, radius, self.message or "No hold limits for this stage.")
            p.end()
            return
        k = self.units.value(1.0, "speed")  # display units per m/s
        dirs = np.asarray(lim.problem.directions_deg, float)
        all_v = np.asarray(lim.all_tugs_ms, float) * k
        self._curve(p, centre, radius, top, dirs, all_v, ALL_TUGS, Qt.PenStyle.SolidLine, True)
        lost_dirs, lost = None, None
        if self.lost_curve is not None:
            lost_dirs, lost = self.lost_curve
        elif lim.with_lost:
            lost_dirs, lost = dirs, np.asarray(lim.worst_lost_ms, float)
        if lost is not None and lost_dirs is not None:
            self._curve(
                p, centre, radius, top, lost_dirs, lost * k, TUG_LOST, Qt.PenStyle.DashLine, False
            )
        self._heading(p, centre, radius)
        limit = self._stage_limit()
        if limit is not None:
            r = radius * min(self.units.value(limit, "speed"), top) / top if top > 0 else 0.0
            p.setPen(QPen(LIMIT, 1.6, Qt.PenStyle.DotLine))
            p.setBrush(Qt.BrushStyle.NoBrush)
            p.drawEllipse(centre, r, r)
        self._planned(p, centre, radius, top)
        self._legend(p, centre, radius, lost is not None, limit)
        p.end()

    def _stage_limit(self) -> float | None:
        """The stage's go / no-go limit for the flow shown, m/s (None when not set)."""
        if self.stage is None:
            return None
        lim = self.stage.limits
        return lim.max_current_ms if self.flow == "current" else wind_limit_as_given(self.stage)

    def _at(self, centre: QPointF, radius: float, top: float, from_deg: float, v: float) -> QPointF:
        r = radius * min(max(v, 0.0), top) / top if top > 0 else 0.0
        a = math.radians(from_deg)
        return QPointF(centre.x() + r * math.sin(a), centre.y() - r * math.cos(a))

    def _grid(self, p: QPainter, centre: QPointF, radius: float, top: float, step: float) -> None:
        small = QFont(self.font())
        small.setPointSizeF(max(7.0, self.font().pointSizeF() - 1.0))
        p.setFont(small)
        for k in range(0, 360, 30):
            p.setPen(QPen(SPOKE, 1.0))
            p.drawLine(centre, self._at(centre, radius, top, k, top))
            a = math.radians(k)
            out = QPointF(
                centre.x() + (radius + 14) * math.sin(a), centre.y() - (radius + 12) * math.cos(a)
            )
            text = {0: "N", 90: "E", 180: "S", 270: "W"}.get(k, f"{k:03d}")
            p.setPen(TEXT if k % 90 == 0 else MUTED)
            p.drawText(
                QRectF(out.x() - 18, out.y() - 8, 36, 16), Qt.AlignmentFlag.AlignCenter, text
            )
        unit = label(self.units.unit("speed"))
        n = round(top / step)
        for i in range(1, n + 1):
            r = radius * i / n
            p.setPen(QPen(RING, 1.0))
            p.setBrush(Qt.BrushStyle.NoBrush)
            p.drawEllipse(centre, r, r)
        # Ring values along the spoke 135 degrees true (south-east), every other one if crowded.
        a = math.radians(135.0)
        every = 1 if radius / n >= 24 else 2
        for i in range(1, n + 1):
            if (n - i) % every:
                continue
            r = radius * i / n
            v = step * i
            text = f"{v:g} {unit}" if i == n else f"{v:g}"
            at = QPointF(centre.x() + r * math.sin(a), centre.y() - r * math.cos(a))
            w = p.fontMetrics().horizontalAdvance(text) + 4
            box = QRectF(at.x() + 2, at.y() - 2, w, p.fontMetrics().height())
            p.fillRect(box, style.LABEL_BG)
            p.setPen(MUTED)
            p.drawText(box, Qt.AlignmentFlag.AlignCenter, text)

    def _curve(
        self,
        p: QPainter,
        centre: QPointF,
        radius: float,
        top: float,
        dirs: np.ndarray,
        values: np.ndarray,
        color: QColor,
        dash: Qt.PenStyle,
        fill: bool,
    ) -> None:
        v = np.where(np.isfinite(values), values, top)
        r = radius * np.clip(v, 0.0, top) / top if top > 0 else np.zeros_like(v)
        a = np.radians(dirs)
        xs, ys = centre.x() + r * np.sin(a), centre.y() - r * np.cos(a)
        path = QPainterPath()
        path.addPolygon(
            QPolygonF([QPointF(x, y) for x, y in zip(xs.tolist(), ys.tolist(), strict=True)])
        )
        path.closeSubpath()
        if fill:
            p.fillPath(path, HELD_FILL)
        pen = QPen(color, 2.2, dash)
        pen.setJoinStyle(Qt.PenJoinStyle.RoundJoin)
        p.setPen(pen)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.drawPath(path)

    def _heading(self, p: QPainter, centre: QPointF, radius: float) -> None:
        """The body's heading: a small hull shape at the centre, bow towards the heading."""
        if self.limits is None:
            return
        h = math.radians(self.limits.problem.heading_deg)
        ux, uy = math.sin(h), -math.cos(h)  # screen y grows downwards
        px, py = -uy, ux
        half, beam = 0.11 * radius, 0.035 * radius
        cx, cy = centre.x(), centre.y()
        shape = QPainterPath()
        shape.moveTo(cx + ux * half * 1.35, cy + uy * half * 1.35)
        for sx, sy in ((half, beam), (-half, beam), (-half, -beam), (half, -beam)):
            shape.lineTo(cx + ux * sx + px * sy, cy + uy * sx + py * sy)
        shape.closeSubpath()
        p.setPen(QPen(PLANNED, 1.2))
        p.setBrush(style.HULL_FILL)
        p.drawPath(shape)

    def _planned(self, p: QPainter, centre: QPointF, radius: float, top: float) -> None:
        """The stage's planned wind: a marked point at its direction and speed."""
        if self.stage is None:
            return
        c = self.stage.conditions
        if self.flow == "current":
            speed, direction, word = c.current_speed_ms, c.current_towards_deg, "to"
        else:
            speed, direction, word = c.wind_speed_ms, c.wind_from_deg, "from"
        v = self.units.value(speed, "speed")
        pt = self._at(centre, radius, top, direction, v)
        draw_planned_wind(p, pt, 6.0, 2.0)
        text = f"planned {self.units.show(speed, 'speed')} {word} {direction:03.0f}°"
        w = p.fontMetrics().horizontalAdvance(text) + 6
        box = self.planned_box(pt, centre, radius, w, p.fontMetrics().height() + 2)
        p.fillRect(box, style.LABEL_BG)
        p.setPen(PLANNED_MARK)
        p.drawText(box, Qt.AlignmentFlag.AlignCenter, text)

    def planned_box(
        self, pt: QPointF, centre: QPointF, radius: float, w: float, h: float
    ) -> QRectF:
        """Where the planned mark's label goes: beside the mark, on the side with room,
        and never past the plot's edges (it was cut off at the right edge)."""
        x = pt.x() + 9 if pt.x() < centre.x() + radius * 0.3 else pt.x() - 9 - w
        if x + w > self.width() - 2:  # no room to the right: to the left of the mark
            x = pt.x() - 9 - w
        x = max(2.0, min(x, self.width() - 2.0 - w))
        y = max(2.0, min(pt.y() - 20, self.height() - 2.0 - h))
        return QRectF(x, y, w, h)

    def _legend(
        self, p: QPainter, centre: QPointF, radius: float, lost: bool, limit: float | None
    ) -> None:
        y = min(centre.y() + radius + 30, self.height() - 30.0)
        x = 8.0
        entries = [(ALL_TUGS, Qt.PenStyle.SolidLine, "all tugs")]
        if lost:
            entries.append((TUG_LOST, Qt.PenStyle.DashLine, "worst tug lost"))
        if limit is not None:
            entries.append((LIMIT, Qt.PenStyle.DotLine, f"limit {self.units.show(limit, 'speed')}"))
        for color, dash, text in entries:
            p.setPen(QPen(color, 2.2, dash))
            p.drawLine(QPointF(x, y), QPointF(x + 22, y))
            p.setPen(TEXT)
            p.drawText(QPointF(x + 27, y + 4), text)
            x += 36 + p.fontMetrics().horizontalAdvance(text)
        p.setPen(MUTED)
        note = "5°/10° steps" if self.coarse else ""
        if self.clipped():
            note = "higher: on the rim" + (f"; {note}" if note else "")
        if note:
            if x + p.fontMetrics().horizontalAdvance(note) > self.width() - 4:
                x, y = 8.0, y + p.fontMetrics().height() + 2  # a line of its own
            p.drawText(QPointF(x, y + 4), note)

    def _message(self, p: QPainter, at: QPointF, radius: float, text: str) -> None:
        """``text`` wrapped within the rings (clear of the compass letters round them)."""
        p.setPen(style.NO_GO)
        width = max(80.0, min(300.0, 1.6 * radius))
        flags = Qt.AlignmentFlag.AlignCenter | Qt.TextFlag.TextWordWrap
        high = p.fontMetrics().boundingRect(QRectF(0, 0, width, 1e4).toRect(), int(flags), text)
        h = float(high.height())
        p.drawText(QRectF(at.x() - width / 2, at.y() - h / 2, width, h), flags, text)


class HoldLimitsPanel(QWidget):
    """The plot with a line of figures under it, kept up to date with the controller.

    Once an edit settles the plot shows the stage result's hold limits (every degree, all
    tugs and each tug lost). With ``follow_drag`` on (live solving) and the plot visible,
    a drag in progress sweeps all tugs every 5 degrees and the worst tug lost every 10
    degrees, so the plot follows the mouse: at most every :data:`FOLLOW_EVERY_S` (and
    :data:`FOLLOW_SPARE` times a sweep's cost), from a timer, so the board's moves are
    not held up by it; a fleet whose sweep is costly is swept when the mouse rests. A
    drag's sweep is worked in steps (core.solve.holdlimits.live_hold_limits_steps), one
    each time the event loop would go idle, so no mouse move waits for more than one
    step; the plot shows the sweep once it is whole. The drag's end always shows the
    stage result's limits.
    """

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.plot = HoldPlot()
        self.warning = QLabel("")
        self.warning.setWordWrap(True)
        self.warning.setStyleSheet(f"color: {style.NO_GO.name()};")
        self.caption = QLabel("")
        self.caption.setWordWrap(True)
        self.caption.setStyleSheet(f"color: {style.CLEARANCE.name()};")
        #: Wind limits, or (a hold stage) the current limits with the wind as set.
        self.flow_box = QComboBox()
        self.flow_box.addItem("Wind the tugs can hold", "wind")
        self.flow_box.addItem("Current the tugs can hold", "current")
        self.flow_box.setToolTip(
            "A hold stage: the highest wind (from each direction), or the highest current "
            "(setting towards each direction, the wind as planned), the tugs can hold"
        )
        self.flow_box.currentIndexChanged.connect(guarded(lambda _i: self.update_now(coarse=False)))
        self.flow_row = QWidget()
        row = QHBoxLayout(self.flow_row)
        row.setContentsMargins(0, 0, 0, 0)
        row.addWidget(QLabel("Show"))
        row.addWidget(self.flow_box, 1)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        #: In a stage with more than one worked body: the body shown and the stage's verdict.
        self.body_choice = BodyChoice()
        self.body_choice.chosen.connect(guarded(lambda: self.update_now(coarse=False)))
        layout.addWidget(self.body_choice)
        layout.addWidget(self.flow_row)
        layout.addWidget(self.plot, 1)
        layout.addWidget(self.warning)
        layout.addWidget(self.caption)
        self.setToolTip(EXPLAIN)
        self.limits: HoldLimits | None = None
        #: Sweep on every mouse move of a drag (live solving on); else wait for the drag's end.
        self.follow_drag = False
        self._lost_at: float | None = None
        self._lost_curve: tuple[np.ndarray, np.ndarray] | None = None
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(0)
        self._timer.timeout.connect(guarded(lambda: self.update_now(coarse=False)))
        #: A drag's sweep, waiting for its turn (see :meth:`_changed`).
        self._follow = QTimer(self)
        self._follow.setSingleShot(True)
        self._follow.timeout.connect(self._follow_drag)
        self._swept_at: float | None = None  # when the drag's last sweep ended
        self._sweep_cost = 0.0  # what it took, seconds
        self._waiting = False  # for the event loop to go idle (see _schedule_follow)
        #: A drag's sweep under way: its steps, what it is for, and what it has taken.
        self._job: _SweepJob | None = None
        self._step_timer = QTimer(self)
        self._step_timer.setSingleShot(True)
        self._step_timer.setInterval(0)
        self._step_timer.timeout.connect(self._step)
        self._step_waiting = False
        #: The drag's pace: when the last move was shown, the moves' spacing, seconds.
        self._moved_at: float | None = None
        self._move_gap = 1 / 60
        #: What the sweep's pieces have taken lately, seconds (the larger of the last and
        #: a fading memory of the earlier ones), and when the sweep under way first asked
        #: for room (from then on it has STARVED_S to be shown before it stops waiting).
        self._piece_cost = {"problem": 0.0, "step": 0.0, "show": 0.0}
        self._began: float | None = None
        #: A piece of the sweep held back for the next move's end (no room before it), and
        #: a timer for when the mouse rests or the sweep has waited too long.
        self._held: str | None = None
        self._held_timer = QTimer(self)
        self._held_timer.setSingleShot(True)
        self._held_timer.timeout.connect(self._run_held)
        #: How many sweeps the drags have run (for whoever checks the plot keeps up).
        self.drag_sweeps = 0
        controller.changed.connect(self._changed)
        self.update_now(coarse=False)

    @guarded
    def _changed(self) -> None:
        if self.controller.previewing:
            self._timer.stop()
            self._paced()
            if self._held is not None:
                self._held_timer.stop()
                self._after_move()  # its turn comes again once this move is shown
            if self.follow_drag and on_screen(self):
                self._schedule_follow()
        else:
            self._follow.stop()
            self._drop_job()
            self._swept_at = None
            self._moved_at = self._began = None
            self._timer.start()

    def _paced(self) -> None:
        """Note a drag's move: when it began (before live solving and the views, which
        run before this is told) and the moves' recent spacing."""
        began = self.controller.previewed_at
        if self._moved_at is not None and 0 < began - self._moved_at < STARVED_S:
            gap = max(began - self._moved_at, LEAST_GAP_S)
            self._move_gap = 0.7 * self._move_gap + 0.3 * gap
        self._moved_at = began

    def _room(self, piece: str) -> bool:
        """Whether the sweep's ``piece`` may run now: it ends before the next move is due,
        the mouse rests (no move came when due), or the sweep has waited long enough."""
        now = time.perf_counter()
        if self._moved_at is None:
            return True
        if self._began is None:
            self._began = now
        due = self._moved_at + self._move_gap
        return (
            due - now >= ROOM_SPARE * self._piece_cost[piece]
            or now > due + 0.5 * self._move_gap
            or now - self._began >= STARVED_S
        )

    def _hold_back(self, piece: str) -> None:
        """Keep ``piece`` for when the next move has been shown (or the mouse rests, or
        the sweep has waited :data:`STARVED_S`)."""
        self._held = piece
        now = time.perf_counter()
        rest = (self._moved_at or now) + 1.5 * self._move_gap
        starved = (self._began or now) + STARVED_S
        self._held_timer.start(max(1, math.ceil((min(rest, starved) - now) * 1000)))

    def _after_move(self) -> None:
        piece, self._held = self._held, None
        if piece == "step":
            self._next_step()
        # a held problem: the move schedules the sweep's turn as any move does

    @guarded
    def _run_held(self) -> None:
        piece, self._held = self._held, None
        if piece == "step":
            self._step()
        elif piece == "problem":
            self._follow_drag()

    def _worked(self, piece: str, start: float) -> None:
        took = time.perf_counter() - start
        self._piece_cost[piece] = max(took, 0.8 * self._piece_cost[piece])

    def _schedule_follow(self) -> None:
        """Sweep for the drag once its turn comes (one sweep for any number of moves)."""
        if self._sweep_cost > COSTLY_S:
            self._follow.start(round(REST_S * 1000))  # again on every move: when it rests
            return
        if self._follow.isActive() or self._waiting or self._job is not None:
            return
        # the turn is counted from when the event loop next goes idle (the move handled
        # and the board painted), so the sweep runs between moves, not inside one
        self._waiting = True
        QAbstractEventDispatcher.instance().aboutToBlock.connect(self._idle)

    @guarded
    def _idle(self) -> None:
        QAbstractEventDispatcher.instance().aboutToBlock.disconnect(self._idle)
        self._waiting = False
        if not self.controller.previewing:
            return
        wait = 0.0
        if self._swept_at is not None:
            gap = max(FOLLOW_EVERY_S, FOLLOW_SPARE * self._sweep_cost)
            wait = self._swept_at + gap - time.perf_counter()
        self._follow.start(max(0, round(wait * 1000)))

    @guarded
    def _follow_drag(self) -> None:
        if not (self.controller.previewing and self.follow_drag and on_screen(self)):
            return
        if self._job is not None:
            return  # one under way: it sweeps again when it ends, if the plan moved on
        if not self._room("problem"):
            self._hold_back("problem")
            return
        start = time.perf_counter()
        job = self._start_sweep()
        self._worked("problem", start)
        if job is None:  # nothing to sweep: the plot says why at once
            self._sweep_done(start, 0.0)
            return
        self._job = job
        job.cost = time.perf_counter() - start
        self._next_step()

    def _next_step(self) -> None:
        """Run the sweep's next step once the event loop would go idle."""
        if self._step_waiting:
            return
        self._step_waiting = True
        QAbstractEventDispatcher.instance().aboutToBlock.connect(self._step_idle)

    @guarded
    def _step_idle(self) -> None:
        QAbstractEventDispatcher.instance().aboutToBlock.disconnect(self._step_idle)
        self._step_waiting = False
        if self._job is not None:
            self._step_timer.start()

    @guarded
    def _step(self) -> None:
        job = self._job
        if job is None:
            return
        if not (self.controller.previewing and self.follow_drag and on_screen(self)):
            self._drop_job()
            return
        if not self._room("step" if job.result is None else "show"):
            self._hold_back("step")
            return
        start = time.perf_counter()
        if job.result is not None:
            self._show_job(job, job.result, start)
            return
        try:
            next(job.steps)
        except StopIteration as done:
            job.result = done.value  # shown as a piece of its own, with the plot's paint
        except TowboardError as e:
            self._job = None
            self.plot.set_data(None, job.stage, job.units, f"No hold limits: {e}")
            self.caption.setText("")
            self._sweep_done(start, job.cost + time.perf_counter() - start)
            return
        job.cost += time.perf_counter() - start
        self._worked("step", start)
        self._next_step()

    def _show_job(
        self, job: _SweepJob, result: tuple[HoldLimits, np.ndarray, np.ndarray], start: float
    ) -> None:
        self._job = None
        self._show_sweep(job, result)
        # the plot paints when the window next does: its last paint's time counts too
        took = time.perf_counter() - start
        self._piece_cost["show"] = max(took + self.plot.painted_in, 0.8 * self._piece_cost["show"])
        self._sweep_done(start, job.cost + took)
        if self.controller.project is not job.project:
            self._schedule_follow()  # the mouse moved on meanwhile: its turn comes

    def _sweep_done(self, start: float, cost: float) -> None:
        self._began = None  # the next sweep's wait starts afresh
        self.drag_sweeps += 1
        self._swept_at = time.perf_counter()
        self._sweep_cost = cost

    def _drop_job(self) -> None:
        self._job = None
        self._step_timer.stop()
        self._held_timer.stop()
        self._held = None
        self._began = None

    def _start_sweep(self) -> _SweepJob | None:
        """A drag's sweep of the plan as it is now, to be worked in steps: all tugs every
        5 degrees; each tug lost every 10 degrees, at most LOST_EVERY_S apart (the costlier
        sweep). None when there is nothing to sweep (the plot says why at once)."""
        c = self.controller
        stage = c.stage
        units = c.project.units
        body = self.body_choice.name() or c.main_body()
        if self._flow() == "current":
            return None  # the current's curve follows once the drag settles
        if stage is None or body is None or not stage.placements:
            self.limits = None
            self.plot.set_data(None, stage, units, "Place tugs to see what wind they can hold.")
            self.caption.setText("")
            return None
        try:
            r = c.results().get(body)
            problem = hold_limits_problem(
                c.project,
                stage,
                body,
                directions_deg=np.arange(0.0, 360.0, 5.0),
                layout=r.layout if r else None,
            )
        except TowboardError as e:
            self.limits = None
            self.plot.set_data(None, stage, units, f"No hold limits: {e}")
            self.caption.setText("")
            return None
        now = time.perf_counter()
        fresh = self._lost_at is None or now - self._lost_at >= LOST_EVERY_S
        if fresh:
            self._lost_at = now
        steps = live_hold_limits_steps(problem, lost_step=2 if fresh else 0)
        job = _SweepJob(steps, c.project, stage, units, fresh, bool(problem.tugs))
        job.body = body
        return job

    def _show_sweep(self, job: _SweepJob, done: tuple[HoldLimits, np.ndarray, np.ndarray]) -> None:
        lim, lost_dirs, worst = done
        if job.fresh:
            self._lost_curve = (lost_dirs, worst) if job.any_tugs else None
        self.limits = lim
        msg = held_words(lim, "wind")
        self.warning.setText(msg)
        self.plot.set_data(lim, job.stage, job.units, msg, True, self._lost_curve)
        self.caption.setText(f"{job.body}: {summary(lim, job.stage, job.units)}")

    def _flow(self) -> Flow:
        """The flow shown: the current only for a hold stage whose box asks for it."""
        stage = self.controller.stage
        is_hold = stage is not None and stage.goal is not None and stage.goal.kind == "hold"
        return "current" if is_hold and self.flow_box.currentData() == "current" else "wind"

    def update_now(self, coarse: bool) -> None:
        """Show the hold limits: the stage result's (``coarse`` False), or during a drag a
        coarse sweep of the same problem that follows the mouse (worked here in one go)."""
        if coarse:
            self._drop_job()
            job = self._start_sweep()
            if job is not None:
                try:
                    self._show_sweep(job, run_steps(job.steps))
                except TowboardError as e:
                    self.plot.set_data(None, job.stage, job.units, f"No hold limits: {e}")
                    self.caption.setText("")
            return
        c = self.controller
        stage = c.stage
        units = c.project.units
        body = c.main_body()
        self.limits = None
        self.warning.setText("")
        is_hold = stage is not None and stage.goal is not None and stage.goal.kind == "hold"
        self.flow_row.setVisible(is_hold)
        if self._flow() == "current":
            self._show_current(stage, units)
            return
        if stage is None or body is None or not stage.placements:
            self.body_choice.body(None)
            self.plot.set_data(None, stage, units, "Place tugs to see what wind they can hold.")
            self.caption.setText("")
            return
        self._lost_at = None
        main = self.body_choice.body(c.stage_result())
        lim = None if main is None else main.hold_limits
        if main is None or lim is None:
            why = "; ".join(n for n in (main.notes if main else ()) if "hold limits" in n)
            self.plot.set_data(None, stage, units, f"No hold limits: {why or 'no tugs'}")
            self.caption.setText("")
            return
        self.limits = lim
        msg = held_words(lim, "wind")
        self.warning.setText(msg)
        self.plot.set_data(lim, stage, units, msg)
        self.caption.setText(f"{main.name}: {summary(lim, stage, units)}")

    def _show_current(self, stage: Stage | None, units: DisplayUnits) -> None:
        """The stage result's current limits (a hold stage), or why there are none."""
        main = self.body_choice.body(self.controller.stage_result())
        lim = None if main is None else main.current_limits
        if stage is None or main is None or lim is None:
            why = "; ".join(n for n in (main.notes if main else ()) if "current limits" in n)
            self.plot.set_data(
                None, stage, units, f"No current limits: {why or 'no tugs'}", flow="current"
            )
            self.caption.setText("")
            return
        self.limits = lim
        msg = held_words(lim, "current")
        self.warning.setText(msg)
        self.plot.set_data(lim, stage, units, msg, flow="current")
        self.caption.setText(f"{main.name}: {current_summary(lim, stage, units)}")


@dataclass(slots=True)
class _SweepJob:
    """A drag's sweep being worked in steps, and what its plot is for."""

    steps: Steps[tuple[HoldLimits, np.ndarray, np.ndarray]]
    project: Project  # the plan it sweeps
    stage: Stage
    units: DisplayUnits
    fresh: bool  # it sweeps the worst tug lost too
    any_tugs: bool
    cost: float = 0.0  # seconds its steps have taken so far
    #: What the steps gave, once they are all done (then shown as a piece of its own).
    result: tuple[HoldLimits, np.ndarray, np.ndarray] | None = None
    body: str = ""  # the body swept


def summary(lim: HoldLimits, stage: Stage, units: DisplayUnits) -> str:
    """The plot's figures in two short sentences: from the planned direction, and the lowest."""
    c = stage.conditions
    at = limit_at(lim, c.wind_from_deg)
    text = f"From {c.wind_from_deg:03.0f}°T: {_speed(at, units)} with all tugs"
    if lim.with_lost:
        lost = limit_at(lim, c.wind_from_deg, lim.worst_lost_ms)
        text += f", {_speed(lost, units)} with the worst tug lost"
    text += f" (planned {units.show(c.wind_speed_ms, 'speed')}"
    limit = wind_limit_as_given(stage)
    if limit is not None:
        text += f", limit {units.show(limit, 'speed')}"
    text += f"). Lowest: {lim.lowest_words(units, mark='°T')}"
    if lim.with_lost:
        who = lim.worst_lost_tug[int(np.argmin(lim.worst_lost_ms))]
        text += f"; {lim.lowest_words(units, lim.worst_lost_ms, mark='°T')} losing {who}"
    return text + "."


def current_summary(lim: HoldLimits, stage: Stage, units: DisplayUnits) -> str:
    """The current plot's figures: towards the planned direction, and the lowest."""
    c = stage.conditions
    at = limit_at(lim, c.current_towards_deg)
    text = (
        f"Current setting to {c.current_towards_deg:03.0f}°T: {_speed(at, units, 'current')} "
        f"with all tugs, the wind as planned (planned {units.show(c.current_speed_ms, 'speed')}"
    )
    if stage.limits.max_current_ms is not None:
        text += f", limit {units.show(stage.limits.max_current_ms, 'speed')}"
    text += f"). Lowest: {lim.lowest_words(units, mark='°T')}."
    return text


EXPLAIN = (
    "The highest wind the tugs can hold the body against, by the true direction it blows "
    "from (north up), with the current as set; each tug may take any lead in its working "
    "sector (the lead as set where it has none). Speeds are in the same "
    "measure as the stage's wind: the mean at its stated height, with its gust factor. "
    "A limit is held from calm up: 0 where the goal is not met even with no wind."
)


def held_words(lim: HoldLimits, flow: Flow) -> str:
    """What the plot cannot show by itself: the other flow is more than the tugs hold
    alone, or from some directions they hold none of ``flow``; else nothing."""
    calm = lim.calm_words()
    if not lim.holds_current:  # not met even in calm (the other flow as set)
        return calm + "."
    out = [calm + "."] if calm else []
    if float(np.min(lim.all_tugs_ms)) <= 0:
        out.append(f"From some directions the tugs as set cannot hold any {flow}.")
    return " ".join(out)


def _speed(v: float, units: DisplayUnits, flow: Flow = "wind") -> str:
    """A limit in words: "above N kn" beyond the core's sensible range, "none" at nothing."""
    return limit_words(v, units, flow)
