"""A tug's headway table as an editor: the share of its bollard pull it can give at each
speed of the tow through the water (core.model.headway), for the tug editor.

Speeds are typed in the display speed unit, shares as fractions of the bollard pull
(0.75); every cell goes through the one number parser and the core's rules. Rows left
as they were loaded keep their values exactly, and placeholder rows stay marked as
placeholders until one is changed.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtWidgets import (
    QGroupBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QPushButton,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app import numbers
from app.guard import guarded
from app.panels.dialog_parts import NOTE_COLOUR
from core.errors import InputError
from core.model import rules
from core.model.headway import HeadwayTable, placeholder_headway
from core.model.tugs import Tug
from core.units import DisplayUnits, label

PLACEHOLDER_NOTE = (
    "PLACEHOLDER rows, not published figures: enter the tug's own shares. Read at a "
    "transit's planned speed through the water."
)
OWN_NOTE = "The tug's own figures. Read at a transit's planned speed through the water."


class HeadwayEditor(QGroupBox):
    """Edit one tug's headway table; :meth:`applied_to` puts it on a tug."""

    def __init__(self, units: DisplayUnits, parent: QWidget | None = None) -> None:
        super().__init__("Pull with way on", parent)
        self.setObjectName("headway_editor")
        self.units = units
        self.table = QTableWidget(0, 2)
        self.table.setObjectName("headway_table")
        self.table.setHorizontalHeaderLabels(
            [f"Speed through water ({label(units.unit('speed'))})", "Share of bollard pull"]
        )
        self.table.verticalHeader().setVisible(False)
        self.table.verticalHeader().setDefaultSectionSize(22)
        self.table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Stretch)
        self.table.setMinimumHeight(150)
        self.add_button = QPushButton("Add row")
        self.remove_button = QPushButton("Remove row")
        self.add_button.clicked.connect(self.add_row)
        self.remove_button.clicked.connect(self.remove_row)
        self.note = QLabel("")
        self.note.setObjectName("headway_note")
        self.note.setWordWrap(True)
        buttons = QHBoxLayout()
        buttons.addWidget(self.add_button)
        buttons.addWidget(self.remove_button)
        buttons.addStretch(1)
        col = QVBoxLayout(self)
        col.addWidget(self.table)
        col.addLayout(buttons)
        col.addWidget(self.note)
        self._loaded: HeadwayTable = placeholder_headway()
        self._texts: list[tuple[str, str]] = []
        self.table.itemChanged.connect(self._show_note)
        self.load(self._loaded)

    # -- showing ------------------------------------------------------------------------
    def load(self, table: HeadwayTable | None) -> None:
        """Show ``table`` (None: the placeholder rows)."""
        self._loaded = table or placeholder_headway()
        u = self.units
        self.table.blockSignals(True)
        self.table.setRowCount(0)
        for v, share in zip(self._loaded.speeds_ms, self._loaded.shares, strict=True):
            self._append(f"{u.value(v, 'speed'):.6g}", f"{share:.6g}")
        self.table.blockSignals(False)
        self._texts = self._cells()
        self._show_note()

    def _append(self, speed: str, share: str) -> None:
        row = self.table.rowCount()
        self.table.insertRow(row)
        self.table.setItem(row, 0, QTableWidgetItem(speed))
        self.table.setItem(row, 1, QTableWidgetItem(share))

    def _cells(self) -> list[tuple[str, str]]:
        out = []
        for i in range(self.table.rowCount()):
            a, b = self.table.item(i, 0), self.table.item(i, 1)
            out.append((a.text() if a else "", b.text() if b else ""))
        return out

    def edited(self) -> bool:
        """Whether any row differs from what was loaded."""
        return self._cells() != self._texts

    @guarded
    def _show_note(self) -> None:
        placeholder = self._loaded.placeholder and not self.edited()
        self.note.setText(PLACEHOLDER_NOTE if placeholder else OWN_NOTE)
        self.note.setStyleSheet("color: #8d5a00;" if placeholder else f"color: {NOTE_COLOUR};")

    # -- editing ------------------------------------------------------------------------
    @guarded
    def add_row(self) -> None:
        """A new row below the last, a knot faster, with the last row's share."""
        rows = self._cells()
        speed, share = "0", "1"
        if rows:
            try:
                last = numbers.parse_number(rows[-1][0])
                speed = f"{last + self.units.value(rules.KNOT, 'speed'):.6g}"
            except InputError:
                speed = rows[-1][0]
            share = rows[-1][1]
        self._append(speed, share)
        self._show_note()

    @guarded
    def remove_row(self) -> None:
        """Take out the selected row (else the last); one row always stays."""
        if self.table.rowCount() <= 1:
            return
        row = self.table.currentRow()
        self.table.removeRow(row if row >= 0 else self.table.rowCount() - 1)
        self._show_note()

    def headway(self, subject: str = "") -> HeadwayTable:
        """The table as shown; raises InputError naming the bad cell (display units)."""
        if not self.edited():
            return self._loaded
        where = f"{subject}: headway table" if subject else "headway table"
        speeds, shares = [], []
        for i, (speed, share) in enumerate(self._cells()):
            row = f"{where}, row {i + 1}"
            speeds.append(numbers.parse_value(speed, rules.HEADWAY_SPEED, self.units, row))
            shares.append(numbers.parse_value(share, rules.HEADWAY_SHARE, self.units, row))
        return HeadwayTable(tuple(speeds), tuple(shares), placeholder=False)

    def applied_to(self, tug: Tug) -> Tug:
        """``tug`` with the table shown (raises InputError on a refused cell)."""
        return replace(tug, headway=self.headway(f"tug {tug.name}"))
