"""The stage shown, in detail: its kind, notes, go / no-go limits, where the bodies lie and,
for a swing, the headings it starts and ends on and the side the bow swings to.

Every field is in the display units and writes back through the controller as one
undoable edit when it is finished (Enter or leaving the field). A field left empty
means "not set" for a limit. Bad input is refused with a message naming the field,
and the field shows the plan's value again.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QComboBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QPlainTextEdit,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app.controller import Controller
from app.guard import guarded
from app.numbers import message, parse_optional, parse_value
from app.panels.panel_field import PanelField
from core.analysis.limits import WIND_LIMIT_LABEL
from core.errors import InputError
from core.mechanics.site import body_pose
from core.model import rules
from core.model.plan import STAGE_KINDS, BodyPose, Stage
from core.model.swing import SWING_SIDES, Swing
from core.units import Quantity, fmt, label

#: The rule (core.model.rules) of each stage limit.
_LIMIT_RULES = {
    "max_wind_ms": rules.WIND_LIMIT,
    "max_current_ms": rules.CURRENT_LIMIT,
    "min_clearance_m": rules.LEAST_CLEARANCE,
}


def _with_unit(field: QWidget, unit: QLabel) -> QWidget:
    box = QWidget()
    h = QHBoxLayout(box)
    h.setContentsMargins(0, 0, 0, 0)
    h.addWidget(field, 1)
    h.addWidget(unit)
    return box


class _Notes(QPlainTextEdit):
    """Notes that are written back when the field loses the focus."""

    def __init__(self, done, parent: QWidget | None = None) -> None:  # type: ignore[no-untyped-def]
        super().__init__(parent)
        self._done = done

    @guarded
    def focusOutEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        super().focusOutEvent(event)
        self._done()


class StageDetails(QWidget):
    """Kind, notes, limits and poses of the stage shown; the plan's clearance margin."""

    LIMITS: tuple[tuple[str, str, Quantity], ...] = (
        ("max_wind_ms", WIND_LIMIT_LABEL, "speed"),
        ("max_current_ms", "Max current", "speed"),
        ("min_clearance_m", "Min clearance", "length"),
    )

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self._filling = False
        self.setObjectName("stage_details")
        self.title = QLabel(self)
        self.title.setWordWrap(True)
        self.kind = QComboBox(self)
        self.kind.addItems(list(STAGE_KINDS))
        self.kind.currentTextChanged.connect(self._kind_chosen)
        self.notes = _Notes(self._notes_done, self)
        self.notes.setPlaceholderText("Notes for the briefing: order of work, who does what…")
        self.notes.setMaximumHeight(90)
        self.limit_fields: dict[str, PanelField] = {}
        self.limit_units: dict[str, QLabel] = {}
        limits = QGroupBox("Go / no-go limits (empty: not set)", self)
        form = QFormLayout(limits)
        form.setRowWrapPolicy(QFormLayout.RowWrapPolicy.WrapLongRows)  # a narrow dock
        for key, text, _q in self.LIMITS:
            f = PanelField(parent=self)
            f.setObjectName(f"limit_{key}")
            f.committed.connect(guarded(lambda k=key: self._limit_done(k)))
            unit = QLabel(self)
            form.addRow(text, _with_unit(f, unit))
            self.limit_fields[key] = f
            self.limit_units[key] = unit
        self.margin = PanelField(parent=self)
        self.margin.setObjectName("clearance_margin")
        self.margin.committed.connect(self._margin_done)
        self.margin_unit = QLabel(self)
        form.addRow("Plan clearance margin", _with_unit(self.margin, self.margin_unit))
        self.poses = QTableWidget(0, 4, self)
        self.poses.setObjectName("stage_poses")
        self.poses.verticalHeader().setVisible(False)
        self.poses.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Stretch)
        self.poses.itemChanged.connect(self._pose_edited)
        self.poses.setMaximumHeight(110)
        self.swing_box = self._swing_box()
        top = QFormLayout()
        top.addRow("Kind", self.kind)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        layout.addWidget(self.title)
        layout.addLayout(top)
        layout.addWidget(QLabel("Notes", self))
        layout.addWidget(self.notes)
        layout.addWidget(limits)
        layout.addWidget(self.swing_box)
        where = QLabel("Where the bodies lie (site: x east, y north; heading true)", self)
        where.setWordWrap(True)
        layout.addWidget(where)
        layout.addWidget(self.poses)
        layout.addStretch(1)
        controller.follow(self._changed, self, Controller.all_but_placements)
        self.fill()

    def _swing_box(self) -> QGroupBox:
        box = QGroupBox("Swing (true headings)", self)
        box.setToolTip("Both headings empty: the stage gives no swing")
        form = QFormLayout(box)
        form.setRowWrapPolicy(QFormLayout.RowWrapPolicy.WrapLongRows)  # a narrow dock
        self.swing_start = PanelField(parent=box)
        self.swing_start.setObjectName("swing_start")
        self.swing_end = PanelField(parent=box)
        self.swing_end.setObjectName("swing_end")
        for f in (self.swing_start, self.swing_end):
            f.setPlaceholderText("none")
        self.swing_side = QComboBox(box)
        self.swing_side.setObjectName("swing_side")
        for side in SWING_SIDES:
            self.swing_side.addItem(f"bow to {side}", side)
        self.swing_turn = QLabel(box)
        self.swing_turn.setWordWrap(True)
        for f in (self.swing_start, self.swing_end):
            f.committed.connect(self._swing_done)
        self.swing_side.currentIndexChanged.connect(guarded(lambda _i: self._swing_done()))
        form.addRow("Starts on", _with_unit(self.swing_start, QLabel("°", box)))
        form.addRow("Ends on", _with_unit(self.swing_end, QLabel("°", box)))
        form.addRow("Swings", self.swing_side)
        form.addRow("", self.swing_turn)
        return box

    # -- showing -------------------------------------------------------------------------
    def _stage(self) -> Stage | None:
        return self.controller.stage

    @guarded
    def _changed(self) -> None:
        self.fill()

    def fill(self, force: bool = False) -> None:
        """Fields in line with the plan; a field being typed in is left alone unless ``force``."""
        stage = self._stage()
        project = self.controller.project
        u = project.units
        self._filling = True
        try:
            on = stage is not None
            for w in (self.kind, self.notes, self.poses, *self.limit_fields.values()):
                w.setEnabled(on)
            i = self.controller.stage_index
            self.title.setText(
                f"<b>Stage {i + 1}: {stage.name}</b>" if stage is not None else "<b>No stage</b>"
            )
            if stage is not None:
                self.kind.setCurrentText(stage.kind)
                if (force or not self.notes.hasFocus()) and self.notes.toPlainText() != stage.notes:
                    self.notes.setPlainText(stage.notes)
                for key, _text, q in self.LIMITS:
                    v = getattr(stage.limits, key)
                    f = self.limit_fields[key]
                    if force or not f.hasFocus():
                        f.setText("" if v is None else fmt(u.value(v, q), 2))
                    self.limit_units[key].setText(label(u.unit(q)))
            if force or not self.margin.hasFocus():
                self.margin.setText(fmt(u.value(project.clearance_margin_m, "length"), 2))
            self.margin_unit.setText(label(u.unit("length")))
            self._fill_swing(stage, force)
            self._fill_poses(stage)
        finally:
            self._filling = False

    def _fill_swing(self, stage: Stage | None, force: bool) -> None:
        """The swing's fields, shown for a swing stage (or any stage that has a swing)."""
        swing = stage.swing if stage is not None else None
        self.swing_box.setVisible(
            stage is not None and (stage.kind == "swing" or swing is not None)
        )
        for f, v in (
            (self.swing_start, None if swing is None else swing.start_heading_deg),
            (self.swing_end, None if swing is None else swing.end_heading_deg),
        ):
            if force or not f.hasFocus():
                f.setText("" if v is None else f"{v:05.1f}")
        if swing is not None:
            self.swing_side.setCurrentIndex(SWING_SIDES.index(swing.bow_to))
        self.swing_turn.setText("" if swing is None else f"a turn of {swing.turn_deg:.0f}°")
        self.swing_turn.setToolTip("" if swing is None else swing.words())

    def _fill_poses(self, stage: Stage | None) -> None:
        project = self.controller.project
        u = project.units
        ln = label(u.unit("length"))
        self.poses.setHorizontalHeaderLabels(["Body", f"x ({ln})", f"y ({ln})", "Heading (°)"])
        if stage is None:
            self.poses.setRowCount(0)
            return
        names = project.body_names()
        self.poses.setRowCount(len(names))
        for r, name in enumerate(names):
            pose = body_pose(project, stage, name)
            cells = [
                name,
                fmt(u.value(pose.x, "length"), 1),
                fmt(u.value(pose.y, "length"), 1),
                f"{pose.heading_deg % 360:05.1f}",
            ]
            for c, text in enumerate(cells):
                item = self.poses.item(r, c)
                if item is None:
                    item = QTableWidgetItem()
                    self.poses.setItem(r, c, item)
                if c == 0:
                    item.setFlags(item.flags() & ~Qt.ItemFlag.ItemIsEditable)
                if item.text() != text:
                    item.setText(text)

    # -- editing -------------------------------------------------------------------------
    def _refuse(self, e: InputError) -> None:
        self.controller.message.emit(f"Not changed: {message(e, self.controller.project.units)}")
        self.fill(force=True)

    def _write(self, stage: Stage, text: str) -> None:
        new = self.controller.with_stage(stage)
        self.controller.apply(new, text)

    @guarded
    def _kind_chosen(self, kind: str) -> None:
        stage = self._stage()
        if self._filling or stage is None or kind == stage.kind:
            return
        self._write(replace(stage, kind=kind), f"Stage {stage.name}: kind {kind}")

    def _notes_done(self) -> None:
        stage = self._stage()
        if self._filling or stage is None:
            return
        text = self.notes.toPlainText()
        if text != stage.notes:
            self._write(replace(stage, notes=text), f"Stage {stage.name}: notes")

    def _limit_done(self, key: str) -> None:
        stage = self._stage()
        if self._filling or stage is None:
            return
        name = next(t for k, t, _q in self.LIMITS if k == key).lower()
        text = self.limit_fields[key].text()
        u = self.controller.project.units
        try:
            value = parse_optional(text, _LIMIT_RULES[key], u)
            limits = replace(stage.limits, **{key: value})
        except InputError as e:
            self._refuse(e)
            return
        if limits != stage.limits:
            self._write(replace(stage, limits=limits), f"Stage {stage.name}: {name}")

    @guarded
    def _swing_done(self) -> None:
        stage = self._stage()
        if self._filling or stage is None:
            return
        u = self.controller.project.units
        try:
            start = parse_optional(self.swing_start.text(), rules.HEADING.named("swing start"), u)
            end = parse_optional(self.swing_end.text(), rules.HEADING.named("swing end"), u)
            if start is None and end is None:
                swing = None
            elif start is None or end is None:
                # wait for the other heading: nothing is written, nothing is lost
                self.controller.message.emit("Swing: give both the start and the end heading")
                return
            else:
                swing = Swing(start, end, self.swing_side.currentData())
        except InputError as e:
            self._refuse(e)
            return
        if swing != stage.swing:
            self._write(replace(stage, swing=swing), f"Stage {stage.name}: swing")

    @guarded
    def _margin_done(self) -> None:
        if self._filling:
            return
        p = self.controller.project
        try:
            v = parse_value(self.margin.text(), rules.CLEARANCE_MARGIN, p.units)
            new = replace(p, clearance_margin_m=v)
        except InputError as e:
            self._refuse(e)
            return
        if new != p:
            self.controller.apply(new, "Clearance margin")

    @guarded
    def _pose_edited(self, item: QTableWidgetItem) -> None:
        stage = self._stage()
        if self._filling or stage is None or item.column() == 0:
            return
        project = self.controller.project
        u = project.units
        first = self.poses.item(item.row(), 0)
        name = "" if first is None else first.text()
        if name not in project.body_names():  # a row left from a plan no longer shown
            self.fill(force=True)
            return
        pose = body_pose(project, stage, name)
        field = {1: "x", 2: "y", 3: "heading"}[item.column()]
        try:
            if field == "heading":
                v = parse_value(item.text(), rules.HEADING, u, name)
                new = BodyPose(name, pose.x, pose.y, v % 360.0)
            else:
                si = parse_value(item.text(), rules.COORDINATE.named(field), u, name)
                new = (
                    BodyPose(name, si, pose.y, pose.heading_deg)
                    if field == "x"
                    else BodyPose(name, pose.x, si, pose.heading_deg)
                )
        except InputError as e:
            self._refuse(e)
            return
        if any(p.body == name for p in stage.poses):  # in its place, as the file had it
            poses = tuple(new if p.body == name else p for p in stage.poses)
        else:
            poses = (*stage.poses, new)
        self._write(replace(stage, poses=poses), f"Stage {stage.name}: move {name}")
