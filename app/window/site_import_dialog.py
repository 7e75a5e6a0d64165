"""File > Import site…: quays, dolphins, other vessels and limits from a DXF or a CSV of points.

For a drawing, each layer is listed with what it holds and the kind of feature it
will give (guessed from its name; "leave out" unless chosen). For a table, the
columns are named in the dialog. The drawing's units, the drawing point that becomes
the site's origin and the direction of true north in the drawing are chosen here;
the preview draws the features north up, with the current stage's bodies faint for
comparison, as the core places them (:mod:`core.io.dxf_site`, :mod:`core.io.site_points`).
"""

from __future__ import annotations

from pathlib import Path

import shapely
from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QDoubleSpinBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QRadioButton,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app.guard import guarded
from app.paint import style
from app.panels.dialog_parts import ok_cancel
from app.window.drawing_preview import PreviewPane, Shape, Tag
from core.errors import DrawingError, InputError, TowboardError
from core.io.drawing_units import METRES_PER_UNIT, UNIT_WORDS
from core.io.dxf_geometry import Drawing
from core.io.dxf_site import import_site
from core.io.paths import read_table
from core.io.site_import import KIND_WORDS, ImportedSite, Joining, SiteFrame, guess_kind
from core.io.site_points import import_site_points
from core.mechanics.site import placed_bodies
from core.model.plan import SITE_FEATURE_KINDS, Project, SiteFeature

LEAVE_OUT = "— leave out —"
TABLE_HELP = (
    "One point a row, with a first row naming the columns feature (or name), kind "
    "(quay, dolphin, vessel or limit), x (easting), y (northing) and optionally closed "
    "(yes/no). Rows of one feature follow each other."
)
EDGE = {
    "quay": style.QUAY,
    "dolphin": style.HULL_EDGE,
    "vessel": style.HULL_EDGE,
    "limit": style.LIMIT,
}
FILL = {"dolphin": style.DOLPHIN_FILL, "vessel": style.VESSEL_FILL}


def _spin(value: float, low: float, high: float, decimals: int) -> QDoubleSpinBox:
    s = QDoubleSpinBox()
    s.setRange(low, high)
    s.setDecimals(decimals)
    s.setValue(value)
    s.setKeyboardTracking(False)
    return s


class SiteImportDialog(QDialog):
    """Map layers to kinds, set units, origin and north; ``imported`` and ``joining()``."""

    def __init__(
        self, path: Path, project: Project, stage_index: int = 0, parent: QWidget | None = None
    ) -> None:
        super().__init__(parent)
        self.path = Path(path)
        self.project = project
        self.stage_index = stage_index
        self.imported: ImportedSite | None = None
        self.drawing: Drawing | None = None
        self.text = ""
        self.setWindowTitle(f"Import site from {self.path.name}")
        if self.is_table:
            self.text = read_table(self.path)
        else:
            self.drawing = Drawing.open(self.path)
        self._build()
        self.refresh()

    @property
    def is_table(self) -> bool:
        return self.path.suffix.lower() == ".csv"

    def _build(self) -> None:
        self.table = QTableWidget(0, 3)
        self.table.setHorizontalHeaderLabels(["Layer", "Holds", "Import as"])
        header = self.table.horizontalHeader()
        header.setSectionResizeMode(1, QHeaderView.ResizeMode.Stretch)
        header.setSectionResizeMode(2, QHeaderView.ResizeMode.ResizeToContents)
        self.table.verticalHeader().hide()
        self.kind_boxes: dict[str, QComboBox] = {}
        if self.drawing is not None:
            for layer in self.drawing.layers():
                self._add_layer_row(layer)
        self.units_box = QComboBox()
        for sym in METRES_PER_UNIT:
            self.units_box.addItem(f"{UNIT_WORDS[sym]} ({sym})", sym)
        start = (self.drawing.units if self.drawing is not None else None) or "m"
        self.units_box.setCurrentIndex(list(METRES_PER_UNIT).index(start))
        self.origin_x = _spin(0.0, -1e10, 1e10, 3)
        self.origin_y = _spin(0.0, -1e10, 1e10, 3)
        self.north = _spin(0.0, -360.0, 360.0, 2)
        self.add_to = QRadioButton("Add to the site's features")
        n = len(self.project.site.features)
        self.replace_all = QRadioButton(f"Replace the site's features ({n} now)")
        self.add_to.setChecked(True)
        self.preview = PreviewPane()
        self.summary = QLabel()
        self.summary.setWordWrap(True)
        self.warnings = QLabel()
        self.warnings.setWordWrap(True)
        self.warnings.setStyleSheet("color: #8a5a00;")
        self.error = QLabel()
        self.error.setWordWrap(True)
        self.error.setStyleSheet("color: #b3261e;")
        self.buttons = ok_cancel(self, ok_text="Import")
        self._lay_out()
        for spin in (self.origin_x, self.origin_y, self.north):
            spin.valueChanged.connect(self.refresh)
        self.units_box.currentIndexChanged.connect(self.refresh)

    def _add_layer_row(self, layer: str) -> None:
        if self.drawing is None:
            return
        row = self.table.rowCount()
        self.table.insertRow(row)
        name = QTableWidgetItem(layer)
        counts = self.drawing.counts(layer)
        holds = QTableWidgetItem(", ".join(f"{n} {t}" for t, n in sorted(counts.items())))
        for item in (name, holds):
            item.setFlags(item.flags() & ~Qt.ItemFlag.ItemIsEditable)
        self.table.setItem(row, 0, name)
        self.table.setItem(row, 1, holds)
        box = QComboBox()
        box.addItem(LEAVE_OUT, None)
        for kind in SITE_FEATURE_KINDS:
            box.addItem(KIND_WORDS[kind], kind)
        guess = guess_kind(layer)
        if guess is not None:
            box.setCurrentIndex(box.findData(guess))
        box.currentIndexChanged.connect(self.refresh)
        self.table.setCellWidget(row, 2, box)
        self.kind_boxes[layer] = box

    def _lay_out(self) -> None:
        source = QGroupBox("Table of points" if self.is_table else "Layers")
        sl = QVBoxLayout(source)
        if self.is_table:
            help_text = QLabel(TABLE_HELP)
            help_text.setWordWrap(True)
            sl.addWidget(help_text)
            self.table.hide()
        else:
            sl.addWidget(self.table)
        frame = QGroupBox("Units, origin and north")
        ff = QFormLayout(frame)
        ff.addRow("Units", self.units_box)
        row = QHBoxLayout()
        row.addWidget(QLabel("x"))
        row.addWidget(self.origin_x)
        row.addWidget(QLabel("y"))
        row.addWidget(self.origin_y)
        ff.addRow("Site origin at (drawing units)", row)
        ff.addRow("True north, degrees clockwise from the drawing's +y (up)", self.north)
        join = QGroupBox("Into the plan")
        jl = QVBoxLayout(join)
        jl.addWidget(self.add_to)
        jl.addWidget(self.replace_all)
        left = QVBoxLayout()
        left.addWidget(source, 1)
        left.addWidget(frame)
        left.addWidget(join)
        right = QVBoxLayout()
        right.addWidget(QLabel("The site, north up (the stage's bodies faint):"))
        right.addWidget(self.preview, 1)
        right.addWidget(self.summary)
        right.addWidget(self.warnings)
        right.addWidget(self.error)
        body = QHBoxLayout()
        body.addLayout(left, 1)
        body.addLayout(right, 1)
        outer = QVBoxLayout(self)
        outer.addLayout(body, 1)
        outer.addWidget(self.buttons)
        self.resize(1000, 620)

    # -- choices --------------------------------------------------------------------------
    def layer_kinds(self) -> dict[str, str]:
        return {
            layer: str(box.currentData())
            for layer, box in self.kind_boxes.items()
            if box.currentData() is not None
        }

    def set_kind(self, layer: str, kind: str | None) -> None:
        box = self.kind_boxes[layer]
        box.setCurrentIndex(box.findData(kind) if kind is not None else 0)

    def frame(self) -> SiteFrame:
        return SiteFrame((self.origin_x.value(), self.origin_y.value()), self.north.value())

    def units(self) -> str:
        return str(self.units_box.currentData())

    def joining(self) -> Joining:
        return "replace" if self.replace_all.isChecked() else "add"

    def import_now(self) -> ImportedSite:
        if self.is_table:
            return import_site_points(self.text, self.path.name, self.units(), self.frame())
        if self.drawing is None:
            raise DrawingError(self.path.name, "cannot be read")
        kinds = self.layer_kinds()
        if not kinds:
            raise InputError("layers", None, "choose at least one layer and its kind")
        return import_site(self.drawing, kinds, self.units(), self.frame())

    @guarded
    def refresh(self) -> None:
        try:
            self.imported = self.import_now()
        except (TowboardError, ValueError) as e:
            self.imported = None
            self.error.setText(str(e))
            self.summary.setText("")
            self.warnings.setText("")
            self.preview.show_message(str(e))
            self.buttons.button(QDialogButtonBox.StandardButton.Ok).setEnabled(False)
            return
        self.error.setText("")
        self._show(self.imported)
        self.buttons.button(QDialogButtonBox.StandardButton.Ok).setEnabled(
            bool(self.imported.features)
        )

    def _show(self, r: ImportedSite) -> None:
        shapes = [self._shape(f) for f in r.features]
        stages = self.project.stages
        stage = stages[min(self.stage_index, len(stages) - 1)] if stages else None
        if stage is not None and self.project.hulls:
            for pb in placed_bodies(self.project, stage):
                for part in shapely.get_parts(pb.polygon):  # hulls of a group need not touch
                    pts = tuple((float(x), float(y)) for x, y in list(part.exterior.coords)[:-1])
                    shapes.append(Shape(pts, True, style.MUTED, None, 1.0, dashed=True))
        xs = [x for s in shapes for x, _ in s.points]
        ys = [y for s in shapes for _, y in s.points]
        u = self.project.units
        span = f"{u.show(max(xs) - min(xs), 'length')} east–west, {u.show(max(ys) - min(ys), 'length')} north–south"
        self.summary.setText(f"{r.words()}; the features and bodies span {span}.")
        self.warnings.setText("\n".join(f"⚠ {n.message}" for n in r.notices))
        tags = [Tag(f.points[0], f.name, EDGE[f.kind], beside=True) for f in r.features[:12]]
        self.preview.show_shapes(shapes, (), tags, "N ↑")

    @staticmethod
    def _shape(f: SiteFeature) -> Shape:
        return Shape(
            f.points,
            f.closed,
            EDGE[f.kind],
            FILL.get(f.kind),
            2.0 if f.kind == "quay" else 1.5,
            f.kind == "limit",
        )

    @guarded
    def accept(self) -> None:
        if self.imported is None or not self.imported.features:
            return
        super().accept()
