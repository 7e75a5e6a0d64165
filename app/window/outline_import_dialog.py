"""File > Import outline…: a hull outline from a DXF drawing or a CSV of offsets.

The dialog lists the drawing's layers with what each holds, preselects the one with
the largest closed outline, takes the drawing's units from its header (or asks for
them), and lets the user say which way the bow points in the drawing and which point
becomes the hull's reference point. Every change imports again through the core
(:mod:`core.io.dxf_outline`, :mod:`core.io.offsets`) and shows the result: the
outline as it will lie in the hull frame, its length, beam, area and centroid, and
any warning. The units must be confirmed before the outline is taken.
"""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QButtonGroup,
    QCheckBox,
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QDoubleSpinBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QListWidget,
    QListWidgetItem,
    QRadioButton,
    QVBoxLayout,
    QWidget,
)

from app.guard import guarded
from app.paint import style
from app.panels.dialog_parts import ok_cancel
from app.window.drawing_preview import Mark, PreviewPane, Shape, Tag
from core.errors import DrawingError, InputError, TowboardError
from core.io.drawing_units import METRES_PER_UNIT, UNIT_WORDS
from core.io.dxf_geometry import Drawing
from core.io.dxf_outline import (
    CHORD_ERROR_M,
    JOIN_TOLERANCE_M,
    import_outline,
    layer_summaries,
    likely_layer,
)
from core.io.offsets import import_offsets, read_offsets
from core.io.outline_import import REFERENCE_WORDS, ImportedOutline, OutlinePlacement
from core.io.paths import read_table
from core.model.plan import Project
from core.units import DisplayUnits, factor, label

BOW_WORDS = {
    "+x": "+x (to the right: the drawing's x runs forward)",
    "-x": "−x (to the left: the drawing's x runs aft)",
    "+y": "+y (up the sheet)",
    "-y": "−y (down the sheet)",
}


def _spin(value: float, low: float, high: float, decimals: int, step: float) -> QDoubleSpinBox:
    s = QDoubleSpinBox()
    s.setRange(low, high)
    s.setDecimals(decimals)
    s.setSingleStep(step)
    s.setValue(value)
    s.setKeyboardTracking(False)
    return s


class OutlineImportDialog(QDialog):
    """Choose layer, units, axes and reference point; ``imported`` is the outline."""

    def __init__(self, path: Path, project: Project, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.path = Path(path)
        self.project = project
        self.units: DisplayUnits = project.units
        self.imported: ImportedOutline | None = None
        self.drawing: Drawing | None = None
        self.offsets_text = ""
        self.header_units: str | None = None
        self.setWindowTitle(f"Import outline from {self.path.name}")
        self._load()  # raises DrawingError for a file that cannot be read at all
        self._build()
        self.refresh()

    # -- reading the file once -------------------------------------------------------------
    @property
    def is_table(self) -> bool:
        return self.path.suffix.lower() == ".csv"

    def _load(self) -> None:
        if self.is_table:
            self.offsets_text = read_table(self.path)
            self.header_units = read_offsets(self.offsets_text, self.path.name).units
        else:
            self.drawing = Drawing.open(self.path)
            self.header_units = self.drawing.units

    # -- the form ---------------------------------------------------------------------------
    def _build(self) -> None:
        ln = label(self.units.unit("length"))
        self.layers = QListWidget()
        self.layers.setMinimumHeight(90)
        self.units_box = QComboBox()
        for sym in METRES_PER_UNIT:
            self.units_box.addItem(f"{UNIT_WORDS[sym]} ({sym})", sym)
        start = self.header_units or ("m" if self.is_table else None)
        self.units_box.setCurrentIndex(list(METRES_PER_UNIT).index(start) if start else -1)
        self.units_note = QLabel(self._units_note())
        self.units_note.setWordWrap(True)
        k = factor("length", self.units.unit("length"))
        self.chord = _spin(CHORD_ERROR_M / k, 0.0001, 10.0, 4, 0.001)
        self.tolerance = _spin(JOIN_TOLERANCE_M / k, 0.0, 10.0, 4, 0.001)
        self.bow = QComboBox()
        for key, words in BOW_WORDS.items():
            if not self.is_table or key in ("+x", "-x"):
                self.bow.addItem(words, key)
        self.from_below = QCheckBox(
            "Drawn as seen from below (a bottom plan): port and starboard swap"
        )
        self.reference = QComboBox()
        for key, words in REFERENCE_WORDS.items():
            self.reference.addItem(words.capitalize(), key)
        self.ref_x = _spin(0.0, -1e9, 1e9, 3, 1.0)
        self.ref_y = _spin(0.0, -1e9, 1e9, 3, 1.0)
        self.new_hull = QRadioButton("Add a new hull named")
        self.hull_name = QLineEdit(self._free_name(self.path.stem))
        self.replace_hull = QRadioButton("Replace the outline of")
        self.hull_box = QComboBox()
        self.hull_box.addItems([h.name for h in self.project.hulls])
        self.target = QButtonGroup(self)
        self.target.addButton(self.new_hull)
        self.target.addButton(self.replace_hull)
        self.new_hull.setChecked(True)
        self.replace_hull.setEnabled(bool(self.project.hulls))
        self.preview = PreviewPane()
        self.figures = QLabel()
        self.figures.setWordWrap(True)
        self.warnings = QLabel()
        self.warnings.setWordWrap(True)
        self.warnings.setStyleSheet("color: #8a5a00;")
        self.error = QLabel()
        self.error.setWordWrap(True)
        self.error.setStyleSheet("color: #b3261e;")
        self.confirm = QCheckBox()
        self.buttons = ok_cancel(self, ok_text="Import")
        self._lay_out(ln)
        self._fill_layers()
        for signal in (
            self.layers.currentRowChanged,
            self.units_box.currentIndexChanged,
            self.chord.valueChanged,
            self.tolerance.valueChanged,
            self.bow.currentIndexChanged,
            self.from_below.toggled,
            self.reference.currentIndexChanged,
            self.ref_x.valueChanged,
            self.ref_y.valueChanged,
        ):
            signal.connect(self.refresh)
        self.units_box.currentIndexChanged.connect(self._units_changed)
        self.confirm.toggled.connect(self._update_ok)
        self.new_hull.toggled.connect(self._update_ok)
        self.hull_name.textChanged.connect(self._update_ok)

    def _lay_out(self, ln: str) -> None:
        source = QGroupBox("Drawing" if not self.is_table else "Table of offsets")
        sf = QFormLayout(source)
        if self.is_table:
            sf.addRow(QLabel("Stations x and half-breadths, port side mirrored to starboard."))
            self.layers.hide()
        else:
            sf.addRow("Layer", self.layers)
        sf.addRow("Units", self.units_box)
        sf.addRow("", self.units_note)
        sf.addRow(f"Chord error ({ln})", self.chord)
        if not self.is_table:
            sf.addRow(f"Join ends closer than ({ln})", self.tolerance)
        else:
            self.tolerance.hide()
        axes = QGroupBox("Axes and reference point")
        af = QFormLayout(axes)
        af.addRow("The bow points to the drawing's", self.bow)
        if not self.is_table:
            af.addRow("", self.from_below)
        else:
            self.from_below.hide()
        af.addRow("Reference point", self.reference)
        row = QHBoxLayout()
        row.addWidget(QLabel("x"))
        row.addWidget(self.ref_x)
        row.addWidget(QLabel("y"))
        row.addWidget(self.ref_y)
        row.addWidget(QLabel("(drawing units)"))
        af.addRow("Given point", row)
        target = QGroupBox("Into the plan")
        tl = QFormLayout(target)
        tl.addRow(self.new_hull, self.hull_name)
        tl.addRow(self.replace_hull, self.hull_box)
        left = QVBoxLayout()
        left.addWidget(source)
        left.addWidget(axes)
        left.addWidget(target)
        left.addStretch(1)
        right = QVBoxLayout()
        right.addWidget(QLabel("The outline in the hull frame (forward to the right, port up):"))
        right.addWidget(self.preview, 1)
        right.addWidget(self.figures)
        right.addWidget(self.warnings)
        right.addWidget(self.error)
        right.addWidget(self.confirm)
        body = QHBoxLayout()
        body.addLayout(left)
        body.addLayout(right, 1)
        outer = QVBoxLayout(self)
        outer.addLayout(body, 1)
        outer.addWidget(self.buttons)
        self.resize(1000, 600)

    def _fill_layers(self) -> None:
        if self.drawing is None:
            return
        units = self.chosen_units() or "m"
        try:
            rows = layer_summaries(self.drawing, units, self._chord_m(), self._tolerance_m())
        except TowboardError as e:
            self.error.setText(str(e))
            return
        self.layers.blockSignals(True)
        current = self.layer()
        self.layers.clear()
        for r in rows:
            item = QListWidgetItem(r.words())
            item.setData(Qt.ItemDataRole.UserRole, r.layer)
            self.layers.addItem(item)
        names = [r.layer for r in rows]
        pick = current if current in names else likely_layer(rows)
        self.layers.setCurrentRow(names.index(pick) if pick in names else 0)
        self.layers.blockSignals(False)

    # -- what is chosen -----------------------------------------------------------------------
    def layer(self) -> str | None:
        item = self.layers.currentItem()
        return None if item is None else str(item.data(Qt.ItemDataRole.UserRole))

    def chosen_units(self) -> str | None:
        data = self.units_box.currentData()
        return None if data is None else str(data)

    def _chord_m(self) -> float:
        return self.chord.value() * factor("length", self.units.unit("length"))

    def _tolerance_m(self) -> float:
        return self.tolerance.value() * factor("length", self.units.unit("length"))

    def placement(self) -> OutlinePlacement:
        return OutlinePlacement(
            self.bow.currentData(),
            self.from_below.isChecked(),
            self.reference.currentData(),
            (self.ref_x.value(), self.ref_y.value()),
        )

    def _units_note(self) -> str:
        if self.is_table:
            return (
                f"The table's header names {UNIT_WORDS[self.header_units]}."
                if self.header_units
                else "The table names no units: metres unless you choose others."
            )
        if self.header_units:
            d = self.drawing
            code = d.insunits if d is not None else 0
            return f"From the drawing's header: {UNIT_WORDS[self.header_units]} ($INSUNITS {code})."
        return "The drawing does not say its units: choose them."

    def _free_name(self, base: str) -> str:
        names = {h.name for h in self.project.hulls} | {g.name for g in self.project.groups}
        base = base.strip() or "Hull"
        name, n = base, 2
        while name in names:
            name = f"{base} {n}"
            n += 1
        return name

    # -- importing again on every change --------------------------------------------------------
    @guarded
    def _units_changed(self) -> None:
        self.confirm.setChecked(False)
        self._fill_layers()

    def import_now(self) -> ImportedOutline:
        units = self.chosen_units()
        if units is None:
            raise InputError("drawing units", None, "must be chosen: the drawing does not say")
        if self.is_table:
            return import_offsets(
                self.offsets_text,
                self.path.name,
                units,
                self.bow.currentData() == "-x",
                self.placement(),
                self._chord_m(),
            )
        layer = self.layer()
        if layer is None or self.drawing is None:
            raise DrawingError(self.path.name, "has no layer to read")
        return import_outline(
            self.drawing, layer, units, self.placement(), self._chord_m(), self._tolerance_m()
        )

    @guarded
    def refresh(self) -> None:
        given = self.reference.currentData() == "point"
        self.ref_x.setEnabled(given)
        self.ref_y.setEnabled(given)
        try:
            self.imported = self.import_now()
        except (TowboardError, ValueError) as e:
            self.imported = None
            self.error.setText(str(e))
            self.figures.setText("")
            self.warnings.setText("")
            self.preview.show_message(str(e))
            self.confirm.setText("Units checked")
            self._update_ok()
            return
        self.error.setText("")
        self._show(self.imported)
        self._update_ok()

    def _show(self, r: ImportedOutline) -> None:
        u = self.units
        k = factor("length", u.unit("length"))
        ln = label(u.unit("length"))
        area = r.area_m2 / (k * k)
        cx, cy = r.centroid_m
        self.figures.setText(
            f"Length {u.show(r.length_m, 'length', 2)}, beam {u.show(r.beam_m, 'length', 2)}, "
            f"area {area:,.1f} {ln}²\n"
            f"Centroid x {u.show(cx, 'length', 2)}, y {u.show(cy, 'length', 2)} from the reference "
            f"point, which lies at ({r.reference_in_drawing[0]:.6g}, {r.reference_in_drawing[1]:.6g}) "
            f"in the drawing\n{r.points_kept} vertices (of {r.points_read} read)"
        )
        self.warnings.setText("\n".join(f"⚠ {n.message}" for n in r.notices))
        self.confirm.setText(
            f"Units checked: the hull is {u.show(r.length_m, 'length', 1)} long and "
            f"{u.show(r.beam_m, 'length', 1)} in beam"
        )
        xs = [x for x, _ in r.outline]
        ys = [y for _, y in r.outline]
        mid_y = (min(ys) + max(ys)) / 2
        gap = 0.06 * max(r.length_m, r.beam_m)
        self.preview.show_shapes(
            [
                Shape(r.outline, True, style.HULL_EDGE, style.HULL_FILL, 2.0),
                Shape(
                    ((min(xs) - gap, 0.0), (max(xs) + gap, 0.0)),
                    False,
                    style.CENTRELINE,
                    dashed=True,
                ),
            ],
            [
                Mark((0.0, 0.0), "cross", "reference", style.SELECTION),
                Mark(r.centroid_m, "ring", "centroid", style.NET_FORCE),
            ],
            [
                Tag((max(xs) + 2.2 * gap, mid_y), "BOW"),
                Tag((min(xs) - 2.2 * gap, mid_y), "STERN"),
                Tag(((min(xs) + max(xs)) / 2, max(ys) + gap), "PORT", style.PORT),
                Tag(((min(xs) + max(xs)) / 2, min(ys) - gap), "STBD", style.STARBOARD),
            ],
        )

    @guarded
    def _update_ok(self) -> None:
        ok = self.imported is not None and self.confirm.isChecked()
        if self.new_hull.isChecked():
            name = self.hull_name.text().strip()
            taken = {h.name for h in self.project.hulls} | {g.name for g in self.project.groups}
            ok = ok and bool(name) and name not in taken
        self.buttons.button(QDialogButtonBox.StandardButton.Ok).setEnabled(ok)

    def target_hull(self) -> tuple[str, bool]:
        """(hull name, True for a new hull) as chosen."""
        if self.new_hull.isChecked():
            return self.hull_name.text().strip(), True
        return self.hull_box.currentText(), False

    @guarded
    def accept(self) -> None:
        if self.imported is None or not self.confirm.isChecked():
            return
        super().accept()
