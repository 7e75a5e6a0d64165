"""A dialog that makes an outline from parameters with the core's generators."""

from __future__ import annotations

from PySide6.QtWidgets import (
    QComboBox,
    QDialog,
    QDoubleSpinBox,
    QFormLayout,
    QLabel,
    QVBoxLayout,
    QWidget,
)

from app.guard import guarded
from app.panels.dialog_parts import ok_cancel
from core.errors import TowboardError
from core.model.outlines import (
    BOW_SHAPES,
    STERN_SHAPES,
    Outline,
    box_outline,
    raked_outline,
    ship_outline,
)
from core.units import DisplayUnits, label

SHAPES = {"box": "Box barge", "raked": "Raked barge", "ship": "Ship-shaped"}


def _spin(
    value: float, low: float = 0.0, high: float = 2000.0, step: float = 1.0
) -> QDoubleSpinBox:
    s = QDoubleSpinBox()
    s.setRange(low, high)
    s.setDecimals(2)
    s.setSingleStep(step)
    s.setValue(value)
    return s


class OutlineDialog(QDialog):
    """Choose a shape and its dimensions (in the display length unit; ``length`` and
    ``beam`` are given in metres); ``outline()`` gives the result in metres."""

    def __init__(
        self,
        parent: QWidget | None = None,
        length: float = 80.0,
        beam: float = 24.0,
        units: DisplayUnits | None = None,
    ) -> None:
        super().__init__(parent)
        self.units = units or DisplayUnits()
        k = self.units.value(1.0, "length")  # display units per metre
        length, beam = length * k, beam * k
        ln = label(self.units.unit("length"))
        self.setWindowTitle("Outline from dimensions")
        self.shape = QComboBox()
        for key, text in SHAPES.items():
            self.shape.addItem(text, key)
        top = 2000.0 * k  # 2 km, in the display unit
        self.length = _spin(length, 1.0, top)
        self.beam = _spin(beam, 1.0, top)
        self.bow_rake = _spin(0.1 * length, 0.0, top)
        self.stern_rake = _spin(0.05 * length, 0.0, top)
        self.end_fraction = _spin(0.7, 0.05, 1.0, 0.05)
        self.parallel = _spin(0.5 * length, 0.0, top)
        self.bow_shape = QComboBox()
        self.bow_shape.addItems(list(BOW_SHAPES))
        self.bow_shape.setCurrentText("normal")
        self.stern_shape = QComboBox()
        self.stern_shape.addItems(list(STERN_SHAPES))
        form = QFormLayout()
        form.addRow("Shape", self.shape)
        form.addRow(f"Length overall ({ln})", self.length)
        form.addRow(f"Beam ({ln})", self.beam)
        self.rows: dict[str, list[tuple[str, QWidget]]] = {
            "raked": [
                (f"Bow rake length ({ln})", self.bow_rake),
                (f"Stern rake length ({ln})", self.stern_rake),
                ("Width of the ends / beam", self.end_fraction),
            ],
            "ship": [
                (f"Parallel body length ({ln})", self.parallel),
                ("Bow", self.bow_shape),
                ("Stern", self.stern_shape),
            ],
        }
        self._labels: dict[QWidget, QLabel] = {}
        for rows in self.rows.values():
            for text, w in rows:
                lab = QLabel(text)
                self._labels[w] = lab
                form.addRow(lab, w)
        self.error = QLabel("")
        self.error.setStyleSheet("color: #b71c1c;")
        self.error.setWordWrap(True)
        buttons = ok_cancel(self)
        layout = QVBoxLayout(self)
        layout.addLayout(form)
        layout.addWidget(self.error)
        layout.addWidget(buttons)
        self.shape.currentIndexChanged.connect(self._shape_changed)
        self._shape_changed()

    @guarded
    def _shape_changed(self) -> None:
        key = self.shape.currentData()
        for shape, rows in self.rows.items():
            for _, w in rows:
                w.setVisible(shape == key)
                self._labels[w].setVisible(shape == key)

    def outline(self) -> Outline:
        """The outline for the chosen parameters (raises the core's InputError / OutlineError)."""
        key = self.shape.currentData()
        m = self.units.si(1.0, "length")  # metres per display unit
        L, B = self.length.value() * m, self.beam.value() * m
        if key == "box":
            return box_outline(L, B)
        if key == "raked":
            return raked_outline(
                L,
                B,
                self.bow_rake.value() * m,
                self.stern_rake.value() * m,
                self.end_fraction.value(),
            )
        return ship_outline(
            L,
            B,
            self.parallel.value() * m,
            self.bow_shape.currentText(),
            self.stern_shape.currentText(),
        )

    @guarded
    def accept(self) -> None:
        try:
            self.outline()
        except TowboardError as e:
            self.error.setText(str(e))
            return
        super().accept()
