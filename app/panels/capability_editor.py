"""The tug editor's capability part: the polar diagram, the table, and where the figures
come from.

While the tug keeps its type's placeholder figures the part says so in words and follows
the type and the astern pull typed in the form. Editing any figure makes the capability
the user's own (no longer a placeholder); "Type's defaults" goes back to the
placeholders. :meth:`CapabilityEditor.capability` reads it back for the Tug: None for the
type's defaults, the tug's own capability exactly when nothing was touched.
"""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtCore import Signal
from PySide6.QtWidgets import (
    QAbstractItemView,
    QCheckBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QLineEdit,
    QPushButton,
    QTableView,
    QVBoxLayout,
    QWidget,
)

from app.guard import guarded
from app.numbers import message
from app.panels.capability_polar import CapabilityPolar
from app.panels.capability_table import CapabilityModel
from app.panels.dialog_parts import NOTE_COLOUR, error_label
from core.errors import TowboardError
from core.model import rules
from core.model.capability import WAY_WORDS, WAYS, Capability, Way
from core.units import DisplayUnits

PLACEHOLDER_TIP = (
    "These are the defaults of the tug's type. Type the tug's own figures (its trials or "
    "its owner's data) into the table and say where they come from under Source."
)


class CapabilityEditor(QWidget):
    """Polar diagram, ways of working, the table and its source; ``edited`` on any change."""

    edited = Signal()

    def __init__(self, units: DisplayUnits, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.units = units
        #: The figures in force are the type's placeholders (they follow the form).
        self.placeholder = True
        self._original: Capability | None = None
        self._touched = False
        self._loading = False
        #: Gives the type's placeholder capability for what the form now holds.
        self.defaults_of: Callable[[], Capability | None] = lambda: None
        self.polar = CapabilityPolar()
        self.note = QLabel("")
        self.note.setObjectName("capability_note")
        self.note.setWordWrap(True)
        self.model = CapabilityModel(units)
        self.table = QTableView()
        self.table.setModel(self.model)
        self.table.verticalHeader().setVisible(False)
        self.table.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.table.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Stretch)
        self.table.setMinimumHeight(150)
        self.boxes: dict[Way, QCheckBox] = {}
        ways = QHBoxLayout()
        ways.addWidget(QLabel("Works:"))
        for way in WAYS:
            box = QCheckBox(WAY_WORDS[way])
            box.toggled.connect(guarded(lambda on, w=way: self._way_toggled(w, on)))
            self.boxes[way] = box
            ways.addWidget(box)
        ways.addStretch(1)
        self.add_button = QPushButton("Add bearing")
        self.remove_button = QPushButton("Remove bearing")
        self.reset_button = QPushButton("Type's defaults")
        self.reset_button.setToolTip(
            "Go back to the placeholder figures of the tug's type (and its astern pull)"
        )
        self.add_button.clicked.connect(self._add)
        self.remove_button.clicked.connect(self._remove)
        self.reset_button.clicked.connect(self.reset_to_defaults)
        buttons = QHBoxLayout()
        for b in (self.add_button, self.remove_button, self.reset_button):
            buttons.addWidget(b)
        buttons.addStretch(1)
        self.source = QLineEdit()
        self.source.setPlaceholderText("where the figures come from, e.g. trials 2025")
        self.source.textEdited.connect(self._source_edited)
        source_row = QHBoxLayout()
        source_row.addWidget(QLabel("Source"))
        source_row.addWidget(self.source, 1)
        self.error = error_label()
        self.error.setObjectName("capability_error")  # the dialog's own is "error"
        layout = QVBoxLayout(self)
        layout.setContentsMargins(0, 0, 0, 0)
        layout.addWidget(self.polar, 3)
        layout.addWidget(self.note)
        layout.addLayout(ways)
        layout.addWidget(self.table, 2)
        layout.addLayout(buttons)
        layout.addLayout(source_row)
        layout.addWidget(self.error)
        self.model.changed.connect(self._table_changed)
        self.model.refused.connect(self.say)

    # -- loading ----------------------------------------------------------------------
    def load(self, capability: Capability) -> None:
        """Show ``capability`` (a tug's capability in force)."""
        self._original = capability
        self._touched = False
        self.placeholder = capability.placeholder
        self.source.setText(capability.source)
        self._show(capability)

    def follow_defaults(self, capability: Capability | None) -> None:
        """The type's placeholders for what the form now holds: shown while the tug keeps
        placeholders, ignored once it has its own figures."""
        if self.placeholder and capability is not None:
            self._show(capability)

    @guarded
    def reset_to_defaults(self) -> None:
        cap = self.defaults_of()
        if cap is None:
            self.say("Not changed: the type's defaults need a valid bollard pull and astern pull")
            return
        self.placeholder = True
        self._touched = True
        self._show(cap)
        self.edited.emit()

    def _show(self, capability: Capability) -> None:
        self._loading = True
        try:
            self.model.load(capability)
            for way, box in self.boxes.items():
                box.setChecked(way in self.model.ways)
        finally:
            self._loading = False
        self._redraw()

    # -- reading back -------------------------------------------------------------------
    def capability(self) -> Capability | None:
        """The capability as edited: None for the type's placeholders, the loaded value
        when untouched; raises InputError (naming the field) when a rule is broken."""
        if self.placeholder:
            return None
        if not self._touched and self._original is not None:
            return self._original
        source = rules.LABEL.named("capability source").check(self.source.text().strip())
        c = self.model.curves()
        return Capability(c["line"], c["push"], c["push_pull"], placeholder=False, source=source)

    # -- editing ------------------------------------------------------------------------
    @guarded
    def say(self, text: str) -> None:
        self.error.setText(text)
        self.error.setVisible(bool(text))

    def _own(self) -> None:
        """An edit: the figures are now the user's own."""
        self._touched = True
        self.placeholder = False

    @guarded
    def _table_changed(self) -> None:
        if self._loading:
            return
        self._own()
        self.say("")
        self._redraw()
        self.edited.emit()

    def _way_toggled(self, way: Way, on: bool) -> None:
        if self._loading:
            return
        try:
            self.model.set_way(way, on)
        except TowboardError as e:
            self.say(f"Not changed: {message(e, self.units)}")
            box = self.boxes[way]
            box.blockSignals(True)
            box.setChecked(not on)
            box.blockSignals(False)

    @guarded
    def _add(self) -> None:
        try:
            row = self.model.add_row()
        except TowboardError as e:
            self.say(f"Not changed: {message(e, self.units)}")
            return
        self.table.selectRow(row)

    @guarded
    def _remove(self) -> None:
        try:
            self.model.remove_row(self.table.currentIndex().row())
        except TowboardError as e:
            self.say(f"Not changed: {message(e, self.units)}")

    @guarded
    def _source_edited(self, _text: str) -> None:
        self._own()
        self._redraw()
        self.edited.emit()

    def _redraw(self) -> None:
        """The polar and the note from the table as it stands (what would be saved)."""
        try:
            c = self.model.curves()
            shown = Capability(
                c["line"],
                c["push"],
                c["push_pull"],
                placeholder=self.placeholder,
                source=self.source.text().strip(),
            )
        except TowboardError:
            return  # the table keeps only valid rows; a moment with no way is not drawn
        self.polar.set_capability(shown)
        if self.placeholder:
            self.note.setText(f"{shown.note[:1].upper()}{shown.note[1:]}.")
            self.note.setToolTip(PLACEHOLDER_TIP)
            self.note.setStyleSheet("color: #8a5a00;")
        else:
            self.note.setText(f"Figures: {shown.note}.")
            self.note.setToolTip("")
            self.note.setStyleSheet(f"color: {NOTE_COLOUR};")
