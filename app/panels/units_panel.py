"""The units panel: the display unit of each quantity (kept in the project file)."""

from __future__ import annotations

from PySide6.QtWidgets import QComboBox, QFormLayout, QWidget

from app.controller import Controller
from app.guard import guarded
from app.panels.dialog_parts import note_label
from core.units import CHOICES, Quantity, label

NAMES: dict[Quantity, str] = {
    "force": "Force",
    "moment": "Moment",
    "length": "Length",
    "speed": "Speed",
}


class UnitsPanel(QWidget):
    """One list a quantity; a change applies to everything on screen at once."""

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        form = QFormLayout(self)
        self.boxes: dict[Quantity, QComboBox] = {}
        for q, choices in CHOICES.items():
            box = QComboBox()
            for sym in choices:
                box.addItem(label(sym), sym)
            box.currentIndexChanged.connect(guarded(lambda _i, q=q: self._chosen(q)))
            box.setObjectName(f"unit_{q}")
            self.boxes[q] = box
            form.addRow(NAMES[q], box)
        note = note_label("t is the tonne-force (9.80665 kN), as bollard pull is rated.")
        form.addRow(note)
        controller.follow(self.refresh, self, Controller.all_but_placements)
        self.refresh()

    @guarded
    def refresh(self) -> None:
        units = self.controller.project.units
        for q, box in self.boxes.items():
            i = box.findData(units.unit(q))
            if box.currentIndex() != i:
                box.blockSignals(True)
                box.setCurrentIndex(i)
                box.blockSignals(False)

    def _chosen(self, q: Quantity) -> None:
        c = self.controller
        unit = self.boxes[q].currentData()
        if unit == c.project.units.unit(q):
            return
        c.apply(
            c.project.with_units(c.project.units.with_unit(q, unit)), f"{NAMES[q]} in {label(unit)}"
        )
