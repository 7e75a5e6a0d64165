"""The drift panel: what the drift preview on the board says, in numbers, and its inputs.

It shows the drift the board draws (the scenario's first contact, and where the body is
at each ghost time: how far its centroid has moved, its heading, speed and rate of
turn), the body's mass and added mass that drift used, and the inputs: the ghost times,
the look ahead, and each hull's yaw radius of gyration and added mass method. Inputs
write back through the controller as one undoable edit each; bad input is refused with
a message naming the field. The caution is always in view.
"""

from __future__ import annotations

import re
from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QComboBox,
    QFormLayout,
    QFrame,
    QGroupBox,
    QHeaderView,
    QLabel,
    QScrollArea,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app.controller import Controller
from app.guard import guarded
from app.numbers import message, parse_optional, parse_value
from app.panels.panel_field import PanelField
from core.errors import TowboardError
from core.model import rules
from core.model.drift import DriftSettings
from core.model.hull import ADDED_MASS_METHODS
from core.motion.drift import DRIFT_CAUTION, DriftResult
from core.motion.summary import ghost_rows, outcome_words, time_words
from core.units import fmt, label

METHOD_WORDS = {
    "sections": "2-D sections (barge, pontoon)",
    "ship": "ship regressions (ship-shaped)",
}


def _cell(text: str, align: Qt.AlignmentFlag = Qt.AlignmentFlag.AlignRight) -> QTableWidgetItem:
    item = QTableWidgetItem(text)
    item.setTextAlignment(align | Qt.AlignmentFlag.AlignVCenter)
    item.setFlags(item.flags() & ~Qt.ItemFlag.ItemIsEditable)
    return item


def _fit_height(table: QTableWidget) -> None:
    """Make ``table`` exactly as tall as its header and rows (the panel scrolls instead)."""
    table.resizeRowsToContents()
    h = table.horizontalHeader().sizeHint().height() + 2 * table.frameWidth()
    h += sum(table.rowHeight(i) for i in range(table.rowCount()))
    table.setFixedHeight(h)


class DriftPanel(QWidget):
    """The drift shown on the board, in numbers, and the drift's inputs."""

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.setObjectName("drift_panel")
        self.controller = controller
        self._filling = False
        self.result: DriftResult | None = None
        self.outcome = QLabel("Drift preview is off: switch it on with Drift on the toolbar.")
        self.outcome.setWordWrap(True)
        self.outcome.setObjectName("drift_outcome")
        self.table = QTableWidget(0, 5)
        self.table.setObjectName("drift_ghosts")
        self.table.verticalHeader().setVisible(False)
        self.table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Stretch)
        self.table.horizontalHeader().setSectionResizeMode(
            0, QHeaderView.ResizeMode.ResizeToContents
        )
        self.table.setVerticalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.body = QLabel("")
        self.body.setWordWrap(True)
        self.notes = QLabel("")
        self.notes.setWordWrap(True)
        self.notes.setStyleSheet("color: #8a5a00;")
        self.times = PanelField()
        self.times.setToolTip(
            "Seconds after the tug is lost or the lines let go, apart by commas or spaces: "
            "30, 60, 120"
        )
        self.horizon = PanelField()
        self.horizon.setToolTip("How long to look ahead for a contact, s (at most 3600)")
        self.times.committed.connect(self._set_times)
        self.horizon.committed.connect(self._set_horizon)
        self.hulls = QTableWidget(0, 3)
        self.hulls.setObjectName("drift_hulls")
        self.hulls.verticalHeader().setVisible(False)
        self.hulls.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Stretch)
        self.hulls.setVerticalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.hulls.itemChanged.connect(self._gyradius_changed)
        caution = QLabel(f"⚠ {DRIFT_CAUTION}")
        caution.setWordWrap(True)
        caution.setObjectName("drift_caution")
        caution.setStyleSheet("background: #fff4d6; color: #5d4a1f; padding: 4px;")

        shown = QGroupBox("On the board")
        v = QVBoxLayout(shown)
        v.addWidget(self.outcome)
        v.addWidget(self.table)
        v.addWidget(self.body)
        v.addWidget(self.notes)
        inputs = QGroupBox("Inputs")
        form = QFormLayout(inputs)
        form.addRow("Ghosts at (s)", self.times)
        form.addRow("Look ahead (s)", self.horizon)
        form.addRow(self.hulls)
        inner = QWidget()
        layout = QVBoxLayout(inner)
        layout.addWidget(shown)
        layout.addWidget(inputs)
        layout.addWidget(caution)
        layout.addStretch(1)
        scroll = QScrollArea(self)
        scroll.setWidgetResizable(True)
        scroll.setFrameShape(QFrame.Shape.NoFrame)
        scroll.setWidget(inner)
        outer = QVBoxLayout(self)
        outer.setContentsMargins(0, 0, 0, 0)
        outer.addWidget(scroll)
        controller.follow(self.refresh_inputs, self, Controller.all_but_placements)
        self.refresh_inputs()
        self.show_result(None, "", enabled=False)

    # -- what the board shows ----------------------------------------------------------------
    def show_result(
        self, result: DriftResult | None, note: str, *, enabled: bool, pending: bool = False
    ) -> None:
        """Show ``result`` (the drift on the board), or why there is none."""
        self.result = result
        u = self.controller.project.units
        self.table.setRowCount(0)
        _fit_height(self.table)
        if not enabled:
            self.outcome.setText("Drift preview is off: switch it on with Drift on the toolbar.")
            self.body.setText("")
            self.notes.setText("")
            return
        if result is None:
            self.outcome.setText(f"No drift to show: {note}" if note else "No drift to show.")
            self.body.setText("")
            self.notes.setText("")
            return
        text = outcome_words(result, u)
        self.outcome.setText(text[0].upper() + text[1:] + (" (updating…)" if pending else ""))
        ln, sp = label(u.unit("length")), label(u.unit("speed"))
        self.table.setHorizontalHeaderLabels(
            ["Time", f"Moved\n{ln}", "Heading\n°T", f"Speed\n{sp}", "Turn\n°/min"]
        )
        rows = ghost_rows(result)
        self.table.setRowCount(len(rows))
        _fit_height(self.table)
        for i, g in enumerate(rows):
            when = f"{time_words(g.time_s)}, touches" if g.at_contact else time_words(g.time_s)
            cells = (
                when,
                fmt(u.value(g.moved_m, "length"), 0),
                f"{g.heading_deg:03.0f}°",
                fmt(u.value(g.speed_ms, "speed"), 2),
                fmt(g.turn_deg_min, 1, signed=True),
            )
            for j, t in enumerate(cells):
                self.table.setItem(
                    i,
                    j,
                    _cell(t, Qt.AlignmentFlag.AlignLeft if j == 0 else Qt.AlignmentFlag.AlignRight),
                )
        ine = result.problem.motion.inertia
        self.body.setText(
            f"{result.problem.body}: mass {ine.mass_kg / 1000:.0f} t; added mass ahead "
            f"{ine.surge_added_kg / 1000:.0f} t, abeam {ine.sway_added_kg / 1000:.0f} t; "
            f"yaw radius of gyration {u.show(ine.gyradius_m, 'length')}, added yaw inertia "
            f"{ine.yaw_added_kgm2 / ine.yaw_inertia_kgm2 * 100:.0f} % of the body's. "
            f"Added mass by {ine.method}."
        )
        self.notes.setText("\n".join(n.message for n in result.notices))

    # -- inputs -------------------------------------------------------------------------
    @guarded
    def refresh_inputs(self) -> None:
        p = self.controller.project
        self._filling = True
        try:
            if not self.times.hasFocus():
                self.times.setText(", ".join(f"{t:g}" for t in p.drift.times_s))
            if not self.horizon.hasFocus():
                self.horizon.setText(f"{p.drift.horizon_s:g}")
            self._fill_hulls()
        finally:
            self._filling = False

    def _fill_hulls(self) -> None:
        p = self.controller.project
        u = p.units
        self.hulls.setHorizontalHeaderLabels(
            ["Hull", f"Yaw radius of\ngyration ({label(u.unit('length'))})", "Added mass"]
        )
        self.hulls.setRowCount(len(p.hulls))
        for i, h in enumerate(p.hulls):
            self.hulls.setItem(i, 0, _cell(h.name, Qt.AlignmentFlag.AlignLeft))
            k = QTableWidgetItem(
                "" if h.yaw_gyradius_m is None else fmt(u.value(h.yaw_gyradius_m, "length"), 2)
            )
            k.setToolTip("Empty: the plan taken as a uniform plate")
            k.setTextAlignment(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
            self.hulls.setItem(i, 1, k)
            box = self.hulls.cellWidget(i, 2)
            if not isinstance(box, QComboBox):
                box = QComboBox()
                for m in ADDED_MASS_METHODS:
                    box.addItem(METHOD_WORDS[m], m)
                box.currentIndexChanged.connect(
                    guarded(lambda _=0, row=i: self._method_chosen(row))
                )
                self.hulls.setCellWidget(i, 2, box)
            box.blockSignals(True)
            box.setCurrentIndex(ADDED_MASS_METHODS.index(h.added_mass_method))
            box.blockSignals(False)
        _fit_height(self.hulls)

    def _refuse(self, e: Exception) -> None:
        self.controller.message.emit(f"Not changed: {message(e, self.controller.project.units)}")
        self.refresh_inputs()

    @guarded
    def _set_times(self) -> None:
        p = self.controller.project
        try:
            # commas, semicolons or spaces part the times (so a comma is no decimal mark here)
            parts = [s for s in re.split(r"[,;\s]+", self.times.text()) if s]
            times = tuple(parse_value(s, rules.DRIFT_TIME, p.units, "drift") for s in parts)
            new = DriftSettings(times, p.drift.horizon_s)
        except TowboardError as e:
            self._refuse(e)
            return
        if new != p.drift:
            self.controller.apply(replace(p, drift=new), "Drift ghost times")

    @guarded
    def _set_horizon(self) -> None:
        p = self.controller.project
        try:
            horizon = parse_value(self.horizon.text(), rules.DRIFT_HORIZON, p.units, "drift")
            new = DriftSettings(p.drift.times_s, horizon)
        except TowboardError as e:
            self._refuse(e)
            return
        if new != p.drift:
            self.controller.apply(replace(p, drift=new), "Drift look ahead")

    @guarded
    def _gyradius_changed(self, item: QTableWidgetItem) -> None:
        if self._filling or item.column() != 1:
            return
        p = self.controller.project
        row = item.row()
        if row >= len(p.hulls):
            return
        h = p.hulls[row]
        try:
            k = parse_optional(item.text(), rules.YAW_GYRADIUS, p.units, f"hull {h.name}")
            new = replace(h, yaw_gyradius_m=k)
        except TowboardError as e:
            self._refuse(e)
            return
        if new != h:
            self.controller.apply(p.with_hull(new), f"Yaw radius of gyration of {h.name}")

    def _method_chosen(self, row: int) -> None:
        if self._filling:
            return
        p = self.controller.project
        box = self.hulls.cellWidget(row, 2)
        if row >= len(p.hulls) or not isinstance(box, QComboBox):
            return
        h = p.hulls[row]
        method = str(box.currentData())
        if method != h.added_mass_method:
            self.controller.apply(
                p.with_hull(replace(h, added_mass_method=method)), f"Added mass method of {h.name}"
            )
