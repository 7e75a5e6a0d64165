"""The conditions panel: wind, current, sea state, and what their loads are computed with.

Speeds are typed in the display speed unit, lengths in the display length unit, areas
in its square; directions are true bearings (wind from, current towards). Optional
fields left blank take the core's value (areas from the outline and freeboard or
draught, Hoerner's coefficient, the centre of each projection), shown greyed in the
field. Below the form the panel shows what the body feels: the relative directions
and each load with its yaw moment about the centroid, from core.mechanics.loads.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Any

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QComboBox,
    QDialog,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QMessageBox,
    QPushButton,
    QScrollArea,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app.controller import Controller
from app.guard import guarded
from app.numbers import message, parse_number, parse_optional, parse_value
from app.panels.dialog_parts import note_label, ok_cancel
from app.panels.panel_field import PanelField
from core.errors import InputError, TowboardError
from core.mechanics.bodies import stage_body
from core.mechanics.loads import hoerner_cross_flow, load_words, projection
from core.model import rules
from core.model.conditions import Conditions, rule
from core.model.efficiency import EfficiencyTable
from core.model.rules import unit_of
from core.units import DisplayUnits, label


@dataclass(frozen=True, slots=True)
class Field:
    attr: str  # Conditions field
    title: str
    kind: str  # "speed", "length", "bearing", "plain", "area", "density", "sea"
    optional: bool = False
    tip: str = ""


WIND = (
    Field("wind_speed_ms", "Mean speed", "speed", tip="Mean wind speed at the height below"),
    Field("wind_height_m", "Measured at height", "length", tip="Height of the wind reading"),
    Field("wind_from_deg", "From (° true)", "bearing", tip="True bearing the wind blows from"),
    Field("gust_factor", "Gust factor", "plain", tip="Gust speed over mean speed (1 = mean)"),
    Field(
        "wind_exponent",
        "Height exponent",
        "plain",
        tip="Power law U(z) = U10 (z/10)^a; 0.12 over open sea, 1/7 over land",
    ),
)
CURRENT = (
    Field("current_speed_ms", "Speed", "speed"),
    Field(
        "current_towards_deg",
        "Sets towards (° true)",
        "bearing",
        tip="True bearing the current sets towards",
    ),
)
WATER = (
    Field(
        "water_depth_m",
        "Water depth",
        "length",
        True,
        "Depth of water under the body in this stage. Blank: deep water. Raises the "
        "current's sideways load (UFC 4-159-03 depth factor) and gives the under-keel "
        "clearance",
    ),
    Field(
        "ukc_margin_m",
        "Under-keel clearance margin",
        "length",
        tip="Warn when depth less draught is below this (0.5 m: common practice, no source; "
        "use your port's rule)",
    ),
)
SEA = (Field("sea_state", "Sea state (0-9)", "sea", tip="For the tug efficiency table"),)
LOADS = (
    Field("wind_coeff_head", "Wind coefficient head-on", "plain"),
    Field("wind_coeff_beam", "Wind coefficient beam-on", "plain"),
    Field("current_coeff_head", "Current coefficient head-on", "plain"),
    Field(
        "current_coeff_beam",
        "Current coefficient beam-on",
        "plain",
        True,
        "Blank: Hoerner's 2-D cross-flow value for the body's B/2T",
    ),
    Field("wind_area_head_m2", "Wind area head-on", "area", True, "Blank: beam × freeboard"),
    Field("wind_area_beam_m2", "Wind area beam-on", "area", True, "Blank: length × freeboard"),
    Field("current_area_head_m2", "Current area head-on", "area", True, "Blank: beam × draught"),
    Field("current_area_beam_m2", "Current area beam-on", "area", True, "Blank: length × draught"),
    Field("air_density", "Air density (kg/m³)", "density", tip="1.225: ISO 2533 at 15 °C"),
    Field(
        "water_density",
        "Water density (kg/m³)",
        "density",
        tip="1025 seawater (common practice); 1026.02 ITTC at 15 °C; 999.1 fresh",
    ),
)
#: Where the lateral load acts: the file's choice and what the panel calls it.
CENTRE_CHOICES = (
    ("moving", "moves with the angle (Hughes)"),
    ("fixed", "fixed at the centre of the side"),
)
TRAVEL = (
    Field(
        "wind_centre_head_on",
        "Wind centre head-on (share of length)",
        "plain",
        tip="Where the wind's centre of pressure lies with the wind ahead or astern, as a "
        "share of the length from that end; 0.291 (Hughes, from memory); 0.5: no travel",
    ),
    Field(
        "current_centre_head_on",
        "Current centre head-on (share of length)",
        "plain",
        tip="The same for the current; 0.291 (Hughes' figure for the wind, from memory)",
    ),
)
CENTRES = (
    ("wind_centre_m", "Wind centre of pressure (x, y)"),
    ("current_centre_m", "Current centre of pressure (x, y)"),
)


def _parse(text: str) -> float:
    return parse_number(text)


def _index_of(values: list[float], value: float) -> int | None:
    """Where ``value`` is in ``values`` (as typed, so compared closely), else None."""
    return next((k for k, v in enumerate(values) if math.isclose(v, value, rel_tol=1e-9)), None)


class ConditionsPanel(QWidget):
    """Edits the conditions of the stage shown (one undo step per field)."""

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.edits: dict[str, PanelField] = {}
        self.labels: dict[str, QLabel] = {}
        self.centre_edits: dict[str, tuple[PanelField, PanelField]] = {}
        inner = QWidget()
        col = QVBoxLayout(inner)
        col.addWidget(self._group("Wind", WIND))
        col.addWidget(self._group("Current", CURRENT + WATER))
        sea = self._group("Sea and tugs", SEA)
        self.efficiency_button = QPushButton("Tug efficiency table…")
        self.efficiency_button.setToolTip(
            "Share of its pull a tug can use, by bollard pull and sea state (your own figures)"
        )
        self.efficiency_button.clicked.connect(self.edit_efficiency)
        sea.layout().addRow(self.efficiency_button)  # type: ignore[union-attr]
        col.addWidget(sea)
        loads = self._group("Loads are computed with", LOADS)
        form = loads.layout()
        self.centre_choice = QComboBox()
        for key, words in CENTRE_CHOICES:
            self.centre_choice.addItem(words, key)
        self.centre_choice.setToolTip(
            "Moving: the side load acts at the centre of the side beam-on and moves towards "
            "the end the flow comes from as it turns head-on (Hughes), so an oblique flow "
            "turns the body across it. Fixed: always at the centre. A centre you set below "
            "overrides either."
        )
        self.centre_choice.activated.connect(self._set_centre_choice)
        self.labels["pressure_centre"] = QLabel("Centre of pressure")
        form.addRow(self.labels["pressure_centre"], self.centre_choice)  # type: ignore[union-attr]
        for f in TRAVEL:
            self._add_field(form, f)  # type: ignore[arg-type]
        for attr, title in CENTRES:
            x, y = PanelField(), PanelField()
            for w in (x, y):
                w.setPlaceholderText("auto")
                w.setToolTip("Blank: the centre of the projected area")
                w.committed.connect(guarded(lambda a=attr: self._set_centre(a)))
            row = QHBoxLayout()
            row.addWidget(x)
            row.addWidget(y)
            lab = QLabel(title)
            self.labels[attr] = lab
            form.addRow(lab, row)  # type: ignore[union-attr]
            self.centre_edits[attr] = (x, y)
        col.addWidget(loads)
        feel = QGroupBox("On the body")
        self.effect = QLabel("—")
        self.effect.setWordWrap(True)
        self.effect.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        QVBoxLayout(feel).addWidget(self.effect)
        col.addWidget(feel)
        note = note_label(
            "F = ½ ρ C A V² on the head-on and side areas (cos|cos| ahead, sin|sin| abeam of "
            "the flow). The side load's centre moves from amidships beam-on towards the end "
            "the flow comes from (Hughes), so an oblique flow turns the body across it. "
            "Defaults are typical box-barge values (common practice): set your own."
        )
        col.addWidget(note)
        col.addStretch(1)
        scroll = QScrollArea()
        scroll.setWidgetResizable(True)
        scroll.setWidget(inner)
        outer = QVBoxLayout(self)
        outer.setContentsMargins(0, 0, 0, 0)
        outer.addWidget(scroll)
        self._key: object = None
        controller.follow(self.refresh, self)
        self.refresh()

    def _group(self, title: str, fields: tuple[Field, ...]) -> QGroupBox:
        box = QGroupBox(title)
        form = QFormLayout(box)
        for f in fields:
            self._add_field(form, f)
        return box

    def _add_field(self, form: QFormLayout, f: Field) -> None:
        e = PanelField()
        e.setToolTip(f.tip)
        e.committed.connect(guarded(lambda f=f: self._set(f)))
        lab = QLabel(f.title)
        lab.setToolTip(f.tip)
        self.edits[f.attr] = e
        self.labels[f.attr] = lab
        form.addRow(lab, e)

    # -- units ----------------------------------------------------------------------
    def _units(self) -> DisplayUnits:
        return self.controller.project.units

    def _from_si(self, f: Field, v: float) -> float:
        return v / unit_of(rule(f.attr).kind, self._units())[0]

    def _area_unit(self) -> str:
        return f"{label(self._units().unit('length'))}²"

    # -- reading the stage ------------------------------------------------------------
    def conditions(self) -> Conditions | None:
        stage = self.controller.stage
        return None if stage is None else stage.conditions

    @guarded
    def refresh(self) -> None:
        p, stage = self.controller.project, self.controller.stage
        key = (
            None if stage is None else (stage.conditions, stage.poses),
            p.hulls,
            p.groups,
            p.units,
            bool(p.tugs),
            self.controller.stage_index,
        )
        if key == self._key:
            return  # a tug dragged or a setting changed: nothing here moves
        self._key = key
        c = self.conditions()
        enabled = c is not None
        for e in self.edits.values():
            e.setEnabled(enabled)
        for x, y in self.centre_edits.values():
            x.setEnabled(enabled)
            y.setEnabled(enabled)
        self.centre_choice.setEnabled(enabled)
        self.efficiency_button.setEnabled(bool(self.controller.project.tugs) or enabled)
        u = self._units()
        speed, length = label(u.unit("speed")), label(u.unit("length"))
        for f in WIND + CURRENT + WATER + SEA + LOADS:
            if f.kind in ("speed", "length"):
                self.labels[f.attr].setText(f"{f.title} ({speed if f.kind == 'speed' else length})")
            elif f.kind == "area":
                self.labels[f.attr].setText(f"{f.title} ({self._area_unit()})")
        for attr, title in CENTRES:
            self.labels[attr].setText(f"{title} ({length})")
        if c is None:
            self.effect.setText("No stage.")
            return
        derived = self._derived()
        self.centre_choice.blockSignals(True)
        self.centre_choice.setCurrentIndex(self.centre_choice.findData(c.pressure_centre))
        self.centre_choice.blockSignals(False)
        for f in WIND + CURRENT + WATER + SEA + LOADS + TRAVEL:
            e = self.edits[f.attr]
            if e.hasFocus():
                continue
            v = getattr(c, f.attr)
            e.blockSignals(True)
            e.setText("" if v is None else f"{self._from_si(f, v):.6g}")
            if f.optional:
                e.setPlaceholderText(derived.get(f.attr, "from the hull"))
            e.blockSignals(False)
        ls = u.si(1.0, "length")
        for attr, (x, y) in self.centre_edits.items():
            v = getattr(c, attr)
            for w, k in ((x, 0), (y, 1)):
                if w.hasFocus():
                    continue
                w.blockSignals(True)
                w.setText("" if v is None else f"{v[k] / ls:.6g}")
                w.blockSignals(False)
        self.effect.setText(self._effect_text())

    def _derived(self) -> dict[str, str]:
        """What a blank optional field stands for, in words."""
        p, stage = self.controller.project, self.controller.stage
        out: dict[str, str] = {"water_depth_m": "deep water"}
        if stage is None or not p.hulls:
            return out
        try:
            body = stage_body(p, stage)
        except TowboardError:
            return out
        k = self._units().si(1.0, "length") ** 2
        for height, head, beam in (
            ("freeboard", "wind_area_head_m2", "wind_area_beam_m2"),
            ("draught", "current_area_head_m2", "current_area_beam_m2"),
        ):
            proj = projection(body, height)
            if proj is None:
                out[head] = out[beam] = f"needs {height}"
            else:
                out[head] = f"auto {proj.head_m2 / k:.1f}"
                out[beam] = f"auto {proj.beam_m2 / k:.1f}"
        draughts = [x.hull.draught_m for x in body.members if x.hull.draught_m is not None]
        if draughts:
            cd = hoerner_cross_flow(body.beam / (2 * max(draughts)))
            out["current_coeff_beam"] = f"Hoerner {cd:.3f}"
        else:
            out["current_coeff_beam"] = "Hoerner (needs draught)"
        return out

    def _effect_text(self) -> str:
        """What the body feels, read from the controller's results (the stage result's own,
        or during a drag its light part); nothing is worked out here."""
        c = self.controller
        stage = c.stage
        main = c.results().get(c.main_body() or "")
        if main is None or main.conditions is None or stage is None:
            return "No hull."
        u = self._units()
        cl = main.conditions
        gusts = stage.conditions.gust_factor > 1
        lines = [
            f"Wind from {cl.wind_from_rel_deg:03.0f}° relative, "
            f"{u.show(cl.wind_speed_10m_ms, 'speed')} at 10 m"
            + (f", {u.show(cl.design_wind_ms, 'speed')} with gusts" if gusts else ""),
            f"Current towards {cl.current_towards_rel_deg:03.0f}° relative",
        ]
        lines.extend(
            f"{ld.name.capitalize()} load {load_words(ld, main.body, u)}" for ld in cl.loads
        )
        if not cl.loads:
            lines.append("No wind or current load.")
        lines.extend(n.message for n in cl.notices)
        lines.extend(self._depth_lines(main.body.name))
        return "\n".join(lines)

    def _depth_lines(self, body: str) -> list[str]:
        """The water depth's figures from the stage result (not during a drag)."""
        c = self.controller
        result = None if c.previewing else c.stage_result()
        if result is None:
            return []
        try:
            d = result.body(body).depth
        except KeyError:
            return []
        if d is None:
            return ["Deep water (no depth given)."]
        u = self._units()
        ukc = "unknown" if d.clearance_m is None else u.show(d.clearance_m, "length")
        out = [
            f"Under-keel clearance {ukc} (margin {u.show(d.margin_m, 'length')}); current "
            f"beam-on load x{d.factor:.2f} for the depth (UFC 4-159-03)"
        ]
        out.extend(n.message for n in d.notices)
        return out

    # -- writing ----------------------------------------------------------------------
    def _apply(self, new: Conditions, what: str, key: str) -> None:
        c = self.controller
        stage = c.stage
        if stage is None or new == stage.conditions:
            return
        c.apply(c.with_stage(replace(stage, conditions=new)), what, ("conditions", key))

    def _set(self, f: Field) -> None:
        c = self.conditions()
        if c is None:
            return
        text = self.edits[f.attr].text()
        try:
            if not text.strip() and not f.optional:
                raise InputError(f.title, text, "must be given")
            value = parse_optional(text, rule(f.attr), self._units())
            field: dict[str, Any] = {f.attr: value}  # a field named at run time
            new = replace(c, **field)
        except InputError as e:
            self.controller.message.emit(message(e, self._units()))
            self.refresh_field(f)
            return
        self._apply(new, f"Set {f.title.lower()}", f.attr)

    def refresh_field(self, f: Field) -> None:
        c = self.conditions()
        if c is None:
            return
        v = getattr(c, f.attr)
        e = self.edits[f.attr]
        e.blockSignals(True)
        e.setText("" if v is None else f"{self._from_si(f, v):.6g}")
        e.blockSignals(False)

    @guarded
    def _set_centre_choice(self) -> None:
        c = self.conditions()
        key = self.centre_choice.currentData()
        if c is None or key is None:
            return
        self._apply(replace(c, pressure_centre=key), "Set centre of pressure", "pressure_centre")

    def _set_centre(self, attr: str) -> None:
        c = self.conditions()
        if c is None:
            return
        x, y = self.centre_edits[attr]
        tx, ty = x.text().strip(), y.text().strip()
        if not tx and not ty:
            value = None
        elif not tx or not ty:
            return  # wait for the other one
        else:
            try:
                where = rules.COORDINATE.named("centre of pressure")
                value = (
                    parse_value(tx, where, self._units()),
                    parse_value(ty, where, self._units()),
                )
            except InputError as e:
                self.controller.message.emit(message(e, self._units()))
                return
        field: dict[str, Any] = {attr: value}  # a field named at run time
        self._apply(replace(c, **field), "Set centre of pressure", attr)

    @guarded
    def edit_efficiency(self) -> None:
        dlg = EfficiencyDialog(self.controller.project.tug_efficiency, self._units(), self)
        if dlg.exec() != QDialog.DialogCode.Accepted or dlg.table is None:
            return
        c = self.controller
        if dlg.table != c.project.tug_efficiency:
            c.apply(replace(c.project, tug_efficiency=dlg.table), "Edit tug efficiency table")


class EfficiencyDialog(QDialog):
    """Edit the tug efficiency table: bollard pulls (rows), sea states (columns), values 0-1."""

    def __init__(self, table: EfficiencyTable, units: DisplayUnits, parent: QWidget | None = None):
        super().__init__(parent)
        self.setWindowTitle("Tug efficiency table")
        self.units = units
        self.table: EfficiencyTable | None = None
        f = label(units.unit("force"))
        self.pulls = QLineEdit(
            ", ".join(f"{units.value(v, 'force'):g}" for v in table.bollard_pulls_n)
        )
        self.seas = QLineEdit(", ".join(f"{v:g}" for v in table.sea_states))
        self.grid = QTableWidget()
        form = QFormLayout()
        form.addRow(f"Bollard pulls ({f}), rows", self.pulls)
        form.addRow("Sea states, columns", self.seas)
        note = QLabel(
            "The share of its rated pull a tug can use. These are your figures: the values "
            "Towboard starts with are placeholders, not published data. Between rows and "
            "columns the table is interpolated linearly; beyond them the edge values hold. "
            "A bollard pull or sea state added to the lists gets its row or column read "
            "from the table so; one taken out takes its row or column with it."
        )
        note.setWordWrap(True)
        buttons = ok_cancel(self, accept=self._accept)
        layout = QVBoxLayout(self)
        layout.addLayout(form)
        layout.addWidget(self.grid)
        layout.addWidget(note)
        layout.addWidget(buttons)
        self.pulls.editingFinished.connect(self._reshape)
        self.seas.editingFinished.connect(self._reshape)
        #: The bollard pulls (display unit) and sea states the grid's rows and columns are
        #: for: a reshape keeps each value with the pull and sea state it was entered for.
        self._rows: list[float] = [units.value(v, "force") for v in table.bollard_pulls_n]
        self._cols: list[float] = list(table.sea_states)
        self._fill(table)
        self.resize(520, 360)

    def _lists(self) -> tuple[list[float], list[float]]:
        pulls = [_parse(t) for t in self.pulls.text().split(",") if t.strip()]
        seas = [_parse(t) for t in self.seas.text().split(",") if t.strip()]
        return pulls, seas

    def _fill(self, table: EfficiencyTable) -> None:
        g = self.grid
        g.setRowCount(len(table.bollard_pulls_n))
        g.setColumnCount(len(table.sea_states))
        g.setHorizontalHeaderLabels([f"sea {v:g}" for v in table.sea_states])
        f = label(self.units.unit("force"))
        g.setVerticalHeaderLabels(
            [f"{self.units.value(v, 'force'):g} {f}" for v in table.bollard_pulls_n]
        )
        for i, row in enumerate(table.values):
            for j, v in enumerate(row):
                g.setItem(i, j, QTableWidgetItem(f"{v:g}"))

    def _values(self) -> list[list[float]]:
        g = self.grid
        out = []
        for i in range(g.rowCount()):
            row = []
            for j in range(g.columnCount()):
                item = g.item(i, j)
                row.append(_parse(item.text() if item is not None else "1"))
            out.append(row)
        return out

    @guarded
    def _reshape(self) -> None:
        """Rows and columns for the pulls and sea states now listed: a value stays with
        the pull and sea state it was entered for (matched by value, not by position); a
        new row or column is read from the table as it was (the core's interpolation,
        held at the edges), or left empty when that table is not valid."""
        try:
            pulls, seas = self._lists()
        except InputError:
            return
        g = self.grid
        old: dict[tuple[int, int], str] = {}
        for i in range(g.rowCount()):
            for j in range(g.columnCount()):
                item = g.item(i, j)
                old[(i, j)] = item.text() if item is not None else ""
        try:
            before: EfficiencyTable | None = EfficiencyTable(
                tuple(self.units.si(v, "force") for v in self._rows),
                tuple(self._cols),
                tuple(
                    tuple(_parse(old[(i, j)]) for j in range(len(self._cols)))
                    for i in range(len(self._rows))
                ),
            )
        except InputError:
            before = None
        g.clearContents()
        g.setRowCount(len(pulls))
        g.setColumnCount(len(seas))
        g.setHorizontalHeaderLabels([f"sea {v:g}" for v in seas])
        f = label(self.units.unit("force"))
        g.setVerticalHeaderLabels([f"{v:g} {f}" for v in pulls])
        for i, pull in enumerate(pulls):
            oi = _index_of(self._rows, pull)
            for j, sea in enumerate(seas):
                oj = _index_of(self._cols, sea)
                if oi is not None and oj is not None:
                    text = old[(oi, oj)]
                elif before is not None:
                    text = f"{before.efficiency(self.units.si(pull, 'force'), sea):g}"
                else:
                    text = ""
                g.setItem(i, j, QTableWidgetItem(text))
        self._rows, self._cols = pulls, seas

    def build(self) -> EfficiencyTable:
        pulls, seas = self._lists()
        return EfficiencyTable(
            tuple(self.units.si(v, "force") for v in pulls),
            tuple(seas),
            tuple(tuple(r) for r in self._values()),
        )

    @guarded
    def _accept(self) -> None:
        try:
            self.table = self.build()
        except InputError as e:
            QMessageBox.warning(self, "Table not valid", message(e, self.units))
            return
        self.accept()
