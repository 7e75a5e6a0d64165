"""File > Export picture… and Export tables…: what to write, how big, and where.

Each dialog only gathers choices; :meth:`PictureDialog.jobs` and
:meth:`TablesDialog.jobs` say which files get what, and the window writes them
(app.drawings.pictures, core.io.tables).
"""

from __future__ import annotations

from pathlib import Path

from PySide6.QtWidgets import (
    QButtonGroup,
    QCheckBox,
    QComboBox,
    QDialog,
    QDoubleSpinBox,
    QFileDialog,
    QFormLayout,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QPushButton,
    QRadioButton,
    QSpinBox,
    QVBoxLayout,
    QWidget,
)

from app.drawings.pictures import KINDS, MAX_SIDE_PX, PictureSpec
from app.guard import guarded
from app.panels.dialog_parts import ok_cancel
from core.errors import TowboardError
from core.model.plan import Project
from core.units import label

Area = tuple[float, float, float, float]


def _file_row(edit: QLineEdit, choose: QPushButton) -> QHBoxLayout:
    row = QHBoxLayout()
    row.addWidget(edit, 1)
    row.addWidget(choose)
    return row


def numbered(path: Path, index: int) -> Path:
    """The file for stage ``index`` (0-based) when every stage is written."""
    return path.with_name(f"{path.stem}-{index + 1}{path.suffix}")


class PictureDialog(QDialog):
    """The board or the stage diagram, this stage or every one, SVG or PNG, size and dpi."""

    def __init__(
        self,
        project: Project,
        stage_index: int,
        start: Path,
        shown_area: Area | None = None,
        parent: QWidget | None = None,
    ) -> None:
        super().__init__(parent)
        self.setWindowTitle("Export picture")
        self.project = project
        self.stage_index = stage_index
        self.shown_area = shown_area
        self.kind = QComboBox()
        for key, words in KINDS.items():
            self.kind.addItem(words.capitalize(), key)
        stage = project.stages[stage_index]
        self.this_stage = QRadioButton(f"This stage ({stage_index + 1}. {stage.name})")
        self.every_stage = QRadioButton(f"Every stage ({len(project.stages)} files, numbered)")
        self.this_stage.setChecked(True)
        stages = QButtonGroup(self)
        stages.addButton(self.this_stage)
        stages.addButton(self.every_stage)
        self.fit = QRadioButton("The bodies and their tugs")
        self.shown = QRadioButton("As shown on the board now")
        self.shown.setEnabled(shown_area is not None)
        self.fit.setChecked(True)
        group = QButtonGroup(self)
        group.addButton(self.fit)
        group.addButton(self.shown)
        self.width_px = QSpinBox()
        self.height_px = QSpinBox()
        for s, v in ((self.width_px, 1600), (self.height_px, 1200)):
            s.setRange(64, MAX_SIDE_PX)
            s.setValue(v)
            s.setSuffix(" px")
        self.dpi = QDoubleSpinBox()
        self.dpi.setRange(24, 2400)
        self.dpi.setDecimals(0)
        self.dpi.setValue(150)
        self.dpi.setSuffix(" dpi")
        self.paper = QLabel()
        self.format = QComboBox()
        self.format.addItem("SVG (vector drawing)", ".svg")
        self.format.addItem("PNG (image)", ".png")
        self.file = QLineEdit(str(start.with_suffix(".svg")))
        self.choose = QPushButton("Choose…")
        self.error = QLabel()
        self.error.setStyleSheet("color: #b3261e;")
        form = QFormLayout()
        form.addRow("Picture", self.kind)
        form.addRow("Stage", self.this_stage)
        form.addRow("", self.every_stage)
        form.addRow("Board area", self.fit)
        form.addRow("", self.shown)
        size = QHBoxLayout()
        size.addWidget(self.width_px)
        size.addWidget(QLabel("×"))
        size.addWidget(self.height_px)
        size.addWidget(self.dpi)
        form.addRow("Size", size)
        form.addRow("", self.paper)
        form.addRow("Format", self.format)
        form.addRow("File", _file_row(self.file, self.choose))
        layout = QVBoxLayout(self)
        layout.addLayout(form)
        layout.addWidget(self.error)
        self.buttons = ok_cancel(self, ok_text="Export")
        layout.addWidget(self.buttons)
        for w in (self.width_px, self.height_px):
            w.valueChanged.connect(self._paper)
        self.dpi.valueChanged.connect(self._paper)
        self.kind.currentIndexChanged.connect(self._kind_changed)
        self.format.currentIndexChanged.connect(self._format_changed)
        self.file.textChanged.connect(self._file_changed)
        self.choose.clicked.connect(self._choose)
        self._paper()
        self._kind_changed()

    @guarded
    def _paper(self) -> None:
        mm = 25.4 / self.dpi.value()
        self.paper.setText(
            f"{self.width_px.value() * mm:.0f} mm × {self.height_px.value() * mm:.0f} mm "
            f"on paper at {self.dpi.value():.0f} dpi"
        )

    @guarded
    def _kind_changed(self) -> None:
        board = self.kind.currentData() == "board"
        self.fit.setEnabled(board)
        self.shown.setEnabled(board and self.shown_area is not None)

    @guarded
    def _format_changed(self) -> None:
        suffix = str(self.format.currentData())
        path = Path(self.file.text() or "picture")
        if path.suffix.lower() != suffix:
            self.file.setText(str(path.with_suffix(suffix)))

    @guarded
    def _file_changed(self, text: str) -> None:
        suffix = Path(text).suffix.lower()
        i = self.format.findData(suffix)
        if i >= 0 and i != self.format.currentIndex():
            self.format.blockSignals(True)
            self.format.setCurrentIndex(i)
            self.format.blockSignals(False)

    @guarded
    def _choose(self) -> None:
        name, _ = QFileDialog.getSaveFileName(
            self, "Export picture", self.file.text(), "SVG drawings (*.svg);;PNG images (*.png)"
        )
        if name:
            self.file.setText(name)
            self._format_changed()

    def jobs(self) -> list[tuple[Path, PictureSpec]]:
        """Each file to write with its picture (raises the core's InputError on bad sizes)."""
        path = Path(self.file.text())
        if path.suffix.lower() not in (".svg", ".png"):
            path = path.with_suffix(str(self.format.currentData()))
        kind = self.kind.currentData()
        area = self.shown_area if (kind == "board" and self.shown.isChecked()) else None
        stages = (
            range(len(self.project.stages)) if self.every_stage.isChecked() else [self.stage_index]
        )
        out = []
        for i in stages:
            spec = PictureSpec(
                kind, i, self.width_px.value(), self.height_px.value(), self.dpi.value(), area
            )
            out.append((numbered(path, i) if self.every_stage.isChecked() else path, spec))
        return out

    @guarded
    def accept(self) -> None:
        if not self.file.text().strip():
            self.error.setText("Choose the file to write.")
            return
        try:
            self.jobs()
        except TowboardError as e:
            self.error.setText(str(e))
            return
        super().accept()


class TablesDialog(QDialog):
    """The tug table and the balance table of every stage, in SI or in the plan's units."""

    def __init__(self, project: Project, start: Path, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.setWindowTitle("Export tables")
        self.tugs = QCheckBox("Tugs of every stage (setting, pulls, forces, moments)")
        self.balance = QCheckBox(
            "Balance of every stage (verdict, net force, yaw moment, goal, solved pulls, hold limits)"
        )
        self.tugs.setChecked(True)
        self.balance.setChecked(True)
        u = project.units
        self.si = QRadioButton("SI, the numbers of the JSON report (N, N·m, m, m/s)")
        shown = ", ".join(label(u.unit(q)) for q in ("force", "moment", "length", "speed"))  # type: ignore[arg-type]
        self.display = QRadioButton(f"The plan's units ({shown})")
        self.display.setChecked(True)
        self.file = QLineEdit(str(start.with_suffix(".csv")))
        self.choose = QPushButton("Choose…")
        self.files = QLabel()
        self.error = QLabel()
        self.error.setStyleSheet("color: #b3261e;")
        form = QFormLayout()
        form.addRow("Tables", self.tugs)
        form.addRow("", self.balance)
        form.addRow("Units", self.display)
        form.addRow("", self.si)
        form.addRow("File name", _file_row(self.file, self.choose))
        form.addRow("Writes", self.files)
        layout = QVBoxLayout(self)
        layout.addLayout(form)
        layout.addWidget(self.error)
        self.buttons = ok_cancel(self, ok_text="Export")
        layout.addWidget(self.buttons)
        for w in (self.tugs, self.balance):
            w.toggled.connect(self._files)
        self.file.textChanged.connect(self._files)
        self.choose.clicked.connect(self._choose)
        self._files()

    @guarded
    def _choose(self) -> None:
        name, _ = QFileDialog.getSaveFileName(
            self, "Export tables", self.file.text(), "CSV files (*.csv)"
        )
        if name:
            self.file.setText(name)

    def jobs(self) -> list[tuple[Path, str]]:
        """(file, table name) for each table chosen."""
        base = Path(self.file.text().strip() or "tables.csv")
        stem = base.with_suffix("") if base.suffix.lower() == ".csv" else base
        names = [
            n for n, box in (("tugs", self.tugs), ("balance", self.balance)) if box.isChecked()
        ]
        return [(stem.with_name(f"{stem.name}-{n}.csv"), n) for n in names]

    def in_display_units(self) -> bool:
        return self.display.isChecked()

    @guarded
    def _files(self) -> None:
        self.files.setText(", ".join(p.name for p, _ in self.jobs()) or "nothing: choose a table")

    @guarded
    def accept(self) -> None:
        if not self.jobs():
            self.error.setText("Choose at least one table.")
            return
        super().accept()
