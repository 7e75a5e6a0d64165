"""The hull panel: particulars, the outline's vertices and the fittings, on three tabs.

Particulars: dimensions from the outline (the core's plane-area properties), draught,
freeboard, displacement, centre of gravity and the reference point, typed in the display
length unit (displacement in tonnes of mass). Outline: every vertex as typed
coordinates. Fittings: every line point and push point with its ratings.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

from PySide6.QtCore import Signal
from PySide6.QtWidgets import (
    QComboBox,
    QFormLayout,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QPushButton,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from app import formatting as fmt
from app.controller import Controller
from app.edits import hulls as hull_edits
from app.guard import guarded
from app.numbers import message, parse_optional
from app.panels.dialog_parts import note_label
from app.panels.hull_tables import FittingsTab, OutlineTab
from app.panels.panel_field import PanelField
from core.errors import TowboardError
from core.model import rules
from core.model.hull import Hull


class HullPanel(QWidget):
    """Particulars of one hull (the selected one, else the first)."""

    generate_requested = Signal()
    #: A board tool the panel asks for ("line_point", "push_point").
    tool_requested = Signal(str)
    #: (hull, fitting) chosen in the fittings table.
    fitting_selected = Signal(str, str)
    #: (hull, fitting) whose dialog the panel asks for.
    fitting_edit_requested = Signal(str, str)

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.current: str | None = None
        self.choose = QComboBox()
        self.choose.currentTextChanged.connect(self._chosen)
        self.name = PanelField()
        self.length = QLabel("—")
        self.beam = QLabel("—")
        self.area = QLabel("—")
        self.centroid = QLabel("—")
        self.draught = PanelField()
        self.freeboard = PanelField()
        self.displacement = PanelField()
        self.cog_x = PanelField()
        self.cog_y = PanelField()
        self.reference = QLabel("—")
        self.reference.setWordWrap(True)
        for w in (self.cog_x, self.cog_y):
            w.setPlaceholderText("at the centroid")
        for w in (self.draught, self.freeboard, self.displacement):
            w.setPlaceholderText("not given")
        self.name.committed.connect(self._rename)
        self.draught.committed.connect(guarded(lambda: self._set_length("draught_m", self.draught)))
        self.freeboard.committed.connect(
            guarded(lambda: self._set_length("freeboard_m", self.freeboard))
        )
        self.displacement.committed.connect(self._set_displacement)
        self.cog_x.committed.connect(self._set_cog)
        self.cog_y.committed.connect(self._set_cog)
        self.to_aft = QPushButton("Reference to aft end on centreline")
        self.to_aft.clicked.connect(self._reference_to_aft)
        self.generate = QPushButton("Outline from dimensions…")
        self.generate.clicked.connect(self.generate_requested.emit)
        form = QFormLayout()
        form.addRow("Name", self.name)
        self._length_labels: list[tuple[QLabel, str]] = []
        for text, widget in (
            ("Length overall", self.length),
            ("Beam", self.beam),
            ("Plan area", self.area),
            ("Centroid (x, y)", self.centroid),
            ("Draught", self.draught),
            ("Freeboard", self.freeboard),
        ):
            lab = QLabel(text)
            self._length_labels.append((lab, text))
            form.addRow(lab, widget)
        form.addRow("Displacement (t mass)", self.displacement)
        cog = QHBoxLayout()
        cog.addWidget(self.cog_x)
        cog.addWidget(self.cog_y)
        self.cog_label = QLabel("Centre of gravity (x, y)")
        form.addRow(self.cog_label, cog)
        form.addRow("Reference point", self.reference)
        particulars = QWidget()
        pl = QVBoxLayout(particulars)
        pl.addLayout(form)
        pl.addWidget(self.to_aft)
        note = note_label(
            "x forward, y to port, from the reference point (the hull frame's origin)."
        )
        pl.addWidget(note)
        pl.addStretch(1)
        self.outline_tab = OutlineTab(controller, lambda: self.current)
        self.outline_tab.buttons.addWidget(self.generate)
        self.fittings_tab = FittingsTab(controller, lambda: self.current)
        self.fittings_tab.tool_requested.connect(self.tool_requested)
        self.fittings_tab.fitting_selected.connect(
            guarded(lambda name: self.fitting_selected.emit(self.current or "", name))
        )
        self.fittings_tab.edit_requested.connect(
            guarded(lambda name: self.fitting_edit_requested.emit(self.current or "", name))
        )
        self.tabs = QTabWidget()
        self.tabs.addTab(particulars, "Particulars")
        self.tabs.addTab(self.outline_tab, "Outline")
        self.tabs.addTab(self.fittings_tab, "Fittings")
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        chooser = QFormLayout()
        chooser.addRow("Hull", self.choose)
        layout.addLayout(chooser)
        layout.addWidget(self.tabs, 1)
        controller.follow(self.refresh, self, Controller.all_but_placements)
        self.refresh()

    def show_hull(self, name: str | None) -> None:
        if name is not None and name != self.current:
            self.current = name
            self.refresh()

    def show_fitting(self, hull: str, name: str) -> None:
        """Show ``hull`` and select fitting ``name`` in the fittings table."""
        self.show_hull(hull)
        self.fittings_tab.select(name)

    def hull(self) -> Hull | None:
        hulls = self.controller.project.hulls
        for h in hulls:
            if h.name == self.current:
                return h
        return hulls[0] if hulls else None

    @guarded
    def refresh(self) -> None:
        c = self.controller
        u = c.project.units
        names = [h.name for h in c.project.hulls]
        self.choose.blockSignals(True)
        if [self.choose.itemText(i) for i in range(self.choose.count())] != names:
            self.choose.clear()
            self.choose.addItems(names)
        h = self.hull()
        self.current = h.name if h else None
        if h is not None:
            self.choose.setCurrentText(h.name)
        self.choose.blockSignals(False)
        self.outline_tab.refresh()
        self.fittings_tab.refresh()
        ln = fmt.unit_label(u, "length")
        for lab, text in self._length_labels:
            lab.setText(f"{text} ({ln})" if text not in ("Plan area",) else f"{text} ({ln}²)")
        self.cog_label.setText(f"Centre of gravity x, y ({ln})")
        enabled = h is not None
        for w in (
            self.name,
            self.draught,
            self.freeboard,
            self.displacement,
            self.cog_x,
            self.cog_y,
            self.to_aft,
        ):
            w.setEnabled(enabled)
        if h is None:
            for shown in (self.length, self.beam, self.area, self.centroid, self.reference):
                shown.setText("—")
            return
        g = h.geometry
        k = u.value(1.0, "length")
        self.name.setText(h.name)
        self.length.setText(f"{g.length * k:.2f}")
        self.beam.setText(f"{g.beam * k:.2f}")
        self.area.setText(f"{g.area * k * k:.1f}")
        self.centroid.setText(f"{g.centroid[0] * k:.2f}, {g.centroid[1] * k:.2f}")
        self.draught.setText("" if h.draught_m is None else f"{h.draught_m * k:.6g}")
        self.freeboard.setText("" if h.freeboard_m is None else f"{h.freeboard_m * k:.6g}")
        self.displacement.setText(
            "" if h.displacement_kg is None else f"{h.displacement_kg / 1000:.6g}"
        )
        self.cog_x.setText("" if h.cog is None else f"{h.cog[0] * k:.6g}")
        self.cog_y.setText("" if h.cog is None else f"{h.cog[1] * k:.6g}")
        aft = abs(g.x_min) < 1e-6
        self.reference.setText(
            "the hull frame's origin; "
            + (
                "at the aft end of the outline"
                if aft
                else f"{fmt.value(u, -g.x_min, 'length')} forward of the aft end"
            )
        )

    # -- edits ------------------------------------------------------------------------
    @guarded
    def _chosen(self, name: str) -> None:
        if name:
            self.current = name
            self.refresh()

    def _apply(self, hull: Hull, text: str) -> None:
        c = self.controller
        c.apply(c.project.with_hull(hull), text)

    def _number(self, edit: QLineEdit, rule: rules.Range) -> float | None:
        """The SI value typed in ``edit`` (None if blank), checked by the core's ``rule``."""
        return parse_optional(edit.text(), rule, self.controller.project.units)

    def _guard(self, fn) -> None:  # type: ignore[no-untyped-def]
        try:
            fn()
        except (TowboardError, ValueError) as e:
            self.controller.message.emit(
                f"Not changed: {message(e, self.controller.project.units)}"
            )
            self.refresh()

    @guarded
    def _rename(self) -> None:
        h = self.hull()
        new = self.name.text().strip()
        if h is None or not new or new == h.name:
            return

        def go() -> None:
            c = self.controller
            c.apply(hull_edits.renamed_hull(c.project, h.name, new), f"Rename {h.name}")
            self.current = new

        self._guard(go)

    def _set_length(self, attr: str, edit: QLineEdit) -> None:
        h = self.hull()
        if h is None:
            return

        def go() -> None:
            si = self._number(edit, rules.DRAUGHT if attr == "draught_m" else rules.FREEBOARD)
            if si != getattr(h, attr):
                field: dict[str, Any] = {attr: si}  # a field named at run time
                self._apply(replace(h, **field), f"{attr.split('_')[0].title()} of {h.name}")

        self._guard(go)

    @guarded
    def _set_displacement(self) -> None:
        h = self.hull()
        if h is None:
            return

        def go() -> None:
            kg = self._number(self.displacement, rules.DISPLACEMENT)
            if kg != h.displacement_kg:
                self._apply(replace(h, displacement_kg=kg), f"Displacement of {h.name}")

        self._guard(go)

    @guarded
    def _set_cog(self) -> None:
        h = self.hull()
        if h is None:
            return

        def go() -> None:
            x = self._number(self.cog_x, rules.COORDINATE.named("centre of gravity x"))
            y = self._number(self.cog_y, rules.COORDINATE.named("centre of gravity y"))
            if x is None and y is None:
                cog = None
            else:
                cx, cy = h.geometry.centroid
                cog = (cx if x is None else x, cy if y is None else y)
            if cog != h.cog:
                self._apply(replace(h, cog=cog), f"Centre of gravity of {h.name}")

        self._guard(go)

    @guarded
    def _reference_to_aft(self) -> None:
        h = self.hull()
        if h is None:
            return

        def go() -> None:
            c = self.controller
            x = h.geometry.x_min
            if abs(x) < 1e-9:
                return
            c.apply(
                hull_edits.with_reference_at(c.project, h.name, x, 0.0),
                f"Reference point of {h.name}",
            )

        self._guard(go)
