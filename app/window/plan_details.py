"""The plan details dialog: the title block the briefing's cover prints.

Name, the site's name, revision, date, prepared / checked / approved by, the revision history (one line
per revision) and the notes. OK records every change as one undo step; input the core
refuses (an empty name, a history line without its revision) is named in the dialog,
which stays open with everything typed.
"""

from __future__ import annotations

import datetime
from dataclasses import replace

from PySide6.QtCore import QModelIndex, Qt
from PySide6.QtWidgets import (
    QAbstractItemView,
    QDialog,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QHeaderView,
    QLineEdit,
    QPlainTextEdit,
    QPushButton,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app.controller import Controller
from app.guard import guarded
from app.panels.dialog_parts import error_label, ok_cancel
from core.errors import InputError, TowboardError
from core.model.plan import Project, Revision

HISTORY_COLUMNS = ("Revision", "Date", "By", "What changed")


def today() -> str:
    """Today's date as the plan writes dates (ISO 8601)."""
    return datetime.date.today().isoformat()


class PlanDetailsDialog(QDialog):
    """Edit the plan's title block; OK applies it through the controller."""

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.setWindowTitle("Plan details")
        self.setObjectName("plan_details")
        self.name = QLineEdit()
        self.site = QLineEdit()
        self.site.setPlaceholderText("the basin, harbour or fairway of the move")
        self.revision = QLineEdit()
        self.date = QLineEdit()
        self.date.setPlaceholderText("YYYY-MM-DD")
        self.today = QPushButton("Today")
        self.today.setAutoDefault(False)
        self.today.clicked.connect(guarded(lambda: self.date.setText(today())))
        self.prepared = QLineEdit()
        self.checked = QLineEdit()
        self.approved = QLineEdit()
        for w in (self.prepared, self.checked, self.approved):
            w.setPlaceholderText("name, position")
        self.history = QTableWidget(0, len(HISTORY_COLUMNS))
        self.history.setHorizontalHeaderLabels(list(HISTORY_COLUMNS))
        self.history.verticalHeader().setVisible(False)
        self.history.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        header = self.history.horizontalHeader()
        header.setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        header.setStretchLastSection(True)
        self.history.setMinimumHeight(120)
        self.add_line = QPushButton("Add line")
        self.add_line.setAutoDefault(False)
        self.add_line.setToolTip("A line for the revision above, dated today unless a date is set")
        self.add_line.clicked.connect(self._add_line)
        self.remove_line = QPushButton("Remove line")
        self.remove_line.setAutoDefault(False)
        self.remove_line.clicked.connect(self._remove_line)
        self.notes = QPlainTextEdit()
        self.notes.setTabChangesFocus(True)
        self.notes.setPlaceholderText("Printed on the briefing's cover")
        self.notes.setMinimumHeight(70)
        self.error = error_label()
        self.buttons = ok_cancel(self)
        self._lay_out()
        self.load(controller.project)
        self.resize(620, 560)

    def _lay_out(self) -> None:
        form = QFormLayout()
        form.addRow("Plan name", self.name)
        form.addRow("Site", self.site)
        form.addRow("Revision", self.revision)
        date = QHBoxLayout()
        date.addWidget(self.date, 1)
        date.addWidget(self.today)
        form.addRow("Date", date)
        form.addRow("Prepared by", self.prepared)
        form.addRow("Checked by", self.checked)
        form.addRow("Approved by", self.approved)
        box = QGroupBox("Revision history")
        hl = QVBoxLayout(box)
        hl.addWidget(self.history)
        row = QHBoxLayout()
        row.addWidget(self.add_line)
        row.addWidget(self.remove_line)
        row.addStretch(1)
        hl.addLayout(row)
        notes = QGroupBox("Notes")
        QVBoxLayout(notes).addWidget(self.notes)
        layout = QVBoxLayout(self)
        layout.addLayout(form)
        layout.addWidget(box, 2)
        layout.addWidget(notes, 1)
        layout.addWidget(self.error)
        layout.addWidget(self.buttons)

    # -- the project to the fields and back ---------------------------------------------
    def load(self, project: Project) -> None:
        """Fill every field from ``project``."""
        self.name.setText(project.name)
        self.site.setText(project.site.name)
        self.revision.setText(project.revision)
        self.date.setText(project.date)
        self.prepared.setText(project.prepared_by)
        self.checked.setText(project.checked_by)
        self.approved.setText(project.approved_by)
        self.notes.setPlainText(project.notes)
        self.history.setRowCount(0)
        for r in project.history:
            self._append((r.revision, r.date, r.by, r.description))

    def _append(self, cells: tuple[str, str, str, str]) -> int:
        row = self.history.rowCount()
        self.history.insertRow(row)
        for col, text in enumerate(cells):
            self.history.setItem(row, col, QTableWidgetItem(text))
        return row

    def _cell(self, row: int, col: int) -> str:
        item = self.history.item(row, col)
        return item.text().strip() if item is not None else ""

    def revisions(self) -> tuple[Revision, ...]:
        """The history lines typed, blank lines left out; a line without its revision is
        refused with its number."""
        out = []
        for row in range(self.history.rowCount()):
            cells = [self._cell(row, c) for c in range(len(HISTORY_COLUMNS))]
            if not any(cells):
                continue
            try:
                out.append(Revision(*cells))
            except InputError as e:
                raise InputError(f"revision history line {row + 1}", e.value, e.reason) from e
        return tuple(out)

    def project(self) -> Project:
        """The controller's project with the title block as typed (raises on refused input)."""
        p = self.controller.project
        site = self.site.text().strip()
        if site != p.site.name:
            p = replace(p, site=replace(p.site, name=site))
        return p.with_title_block(
            name=self.name.text().strip(),
            revision=self.revision.text().strip(),
            date=self.date.text().strip(),
            prepared_by=self.prepared.text().strip(),
            checked_by=self.checked.text().strip(),
            approved_by=self.approved.text().strip(),
            notes=self.notes.toPlainText().rstrip(),
            history=self.revisions(),
        )

    # -- buttons --------------------------------------------------------------------------
    @guarded
    def _add_line(self) -> None:
        rev = self.revision.text().strip()
        date = self.date.text().strip() or today()
        row = self._append((rev, date, self.prepared.text().strip(), ""))
        self.history.setCurrentCell(row, len(HISTORY_COLUMNS) - 1)
        item = self.history.item(row, len(HISTORY_COLUMNS) - 1)
        if item is not None:  # _append gave every cell its item
            self.history.editItem(item)

    @guarded
    def _remove_line(self) -> None:
        row = self.history.currentRow()
        if row >= 0:
            self.history.removeRow(row)

    @guarded
    def accept(self) -> None:
        # a cell still being typed in counts (what setCurrentItem(None) does, which
        # PySide6's stubs do not let through)
        self.history.setCurrentIndex(QModelIndex())
        try:
            new = self.project()
        except TowboardError as e:
            self.error.setText(f"Not changed: {e}")
            self.error.setVisible(True)
            return
        self.controller.apply(new, "Plan details")
        super().accept()


def open_plan_details(controller: Controller, parent: QWidget | None = None) -> PlanDetailsDialog:
    """Show the plan details dialog (window-modal, without blocking) and return it."""
    dialog = PlanDetailsDialog(controller, parent)
    dialog.setAttribute(Qt.WidgetAttribute.WA_DeleteOnClose)
    dialog.open()
    return dialog
