"""The hull panel's Outline and Fittings tabs: the vertex table and the fittings table.

Both tables edit in place (double-click or start typing; Enter records one undo step)
and follow the project: an undo, a drag on the board or a change of units shows at once.
"""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtCore import QModelIndex, QPersistentModelIndex, Qt, Signal
from PySide6.QtWidgets import (
    QAbstractItemView,
    QComboBox,
    QHBoxLayout,
    QHeaderView,
    QPushButton,
    QStyledItemDelegate,
    QStyleOptionViewItem,
    QTableView,
    QVBoxLayout,
    QWidget,
)

from app.controller import Controller
from app.edits import hulls as hull_edits
from app.guard import guarded
from app.panels import fitting_fields as ff
from app.panels.dialog_parts import error_label, note_label
from app.panels.fittings_model import KEYS, FittingsModel
from app.panels.vertices_model import VerticesModel
from core.model.hull import FITTING_TYPES

Index = QModelIndex | QPersistentModelIndex

EDIT_TRIGGERS = (
    QAbstractItemView.EditTrigger.DoubleClicked
    | QAbstractItemView.EditTrigger.EditKeyPressed
    | QAbstractItemView.EditTrigger.AnyKeyPressed
)


def _table(model) -> QTableView:  # type: ignore[no-untyped-def]
    t = QTableView()
    t.setModel(model)
    t.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
    t.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
    t.setEditTriggers(EDIT_TRIGGERS)
    t.setAlternatingRowColors(True)
    t.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
    t.horizontalHeader().setStretchLastSection(True)
    return t


class ChoiceDelegate(QStyledItemDelegate):
    """A list to choose from (editable: the user may type a word of their own)."""

    def __init__(self, choices: tuple[str, ...], editable: bool, parent: QWidget) -> None:
        super().__init__(parent)
        self.choices, self.editable = choices, editable

    @guarded
    def createEditor(self, parent: QWidget, option: QStyleOptionViewItem, index: Index) -> QWidget:
        box = QComboBox(parent)
        box.setEditable(self.editable)
        box.addItems(list(self.choices))
        return box

    @guarded
    def setEditorData(self, editor: QWidget, index: Index) -> None:
        if isinstance(editor, QComboBox):
            editor.setCurrentText(str(index.data(Qt.ItemDataRole.EditRole)))

    @guarded
    def setModelData(self, editor: QWidget, model, index: Index) -> None:  # type: ignore[no-untyped-def]
        if isinstance(editor, QComboBox):
            model.setData(index, editor.currentText(), Qt.ItemDataRole.EditRole)


class OutlineTab(QWidget):
    """The outline's vertices as typed coordinates, with insert and delete."""

    def __init__(self, controller: Controller, hull_name: Callable[[], str | None]) -> None:
        super().__init__()
        self.model = VerticesModel(controller, hull_name)
        self.table = _table(self.model)
        self.table.verticalHeader().setVisible(True)
        self.table.verticalHeader().setToolTip("Vertex number, as outline messages name it")
        self.error = error_label()
        self.model.refused = self._show_error
        self.insert = QPushButton("Insert after")
        self.insert.setToolTip("A new vertex half way along the edge after the selected one")
        self.delete = QPushButton("Delete vertex")
        self.insert.clicked.connect(self._insert)
        self.delete.clicked.connect(self._delete)
        self.buttons = QHBoxLayout()
        self.buttons.addWidget(self.insert)
        self.buttons.addWidget(self.delete)
        self.buttons.addStretch(1)
        note = note_label(
            "x forward, y to port, from the reference point. The board draws the same "
            "outline; a change that makes it cross itself is refused."
        )
        layout = QVBoxLayout(self)
        layout.addWidget(self.table, 1)
        layout.addWidget(self.error)
        layout.addLayout(self.buttons)
        layout.addWidget(note)

    def refresh(self) -> None:
        self.model.refresh()
        on = self.model.hull() is not None
        self.insert.setEnabled(on)
        self.delete.setEnabled(on)

    def _show_error(self, text: str) -> None:
        self.error.setText(text)
        self.error.setVisible(bool(text))

    def _row(self) -> int:
        i = self.table.currentIndex()
        return i.row() if i.isValid() else len(self.model.rows) - 1

    @guarded
    def _insert(self) -> None:
        row = self.model.insert_after(self._row())
        if row is not None:
            self.table.selectRow(row)

    @guarded
    def _delete(self) -> None:
        self.model.delete(self._row())


class FittingsTab(QWidget):
    """Every line point and push point of the hull, with its ratings."""

    tool_requested = Signal(str)
    fitting_selected = Signal(str)
    edit_requested = Signal(str)

    def __init__(self, controller: Controller, hull_name: Callable[[], str | None]) -> None:
        super().__init__()
        self.controller = controller
        self.model = FittingsModel(controller, hull_name)
        self.table = _table(self.model)
        self.table.verticalHeader().setVisible(False)
        kinds = tuple(ff.KIND_TEXT.values())
        self.table.setItemDelegateForColumn(KEYS.index("kind"), ChoiceDelegate(kinds, False, self))
        self.table.setItemDelegateForColumn(
            KEYS.index("type"), ChoiceDelegate(FITTING_TYPES, True, self)
        )
        self.table.selectionModel().currentRowChanged.connect(self._row_changed)
        self.edit = QPushButton("Edit…")
        self.edit.setToolTip("Every field of the selected fitting in one dialog")
        self.add_line = QPushButton("Add line point")
        self.add_line.setToolTip("Then click the hull's edge on the board")
        self.add_push = QPushButton("Add push point")
        self.add_push.setToolTip("Then click the hull's edge on the board")
        self.remove = QPushButton("Remove")
        self.remove.setToolTip("Remove the selected fitting; tugs working there are let go")
        self.edit.clicked.connect(self._edit)
        self.add_line.clicked.connect(guarded(lambda: self.tool_requested.emit("line_point")))
        self.add_push.clicked.connect(guarded(lambda: self.tool_requested.emit("push_point")))
        self.remove.clicked.connect(self._remove)
        buttons = QHBoxLayout()
        for b in (self.edit, self.add_line, self.add_push, self.remove):
            buttons.addWidget(b)
        buttons.addStretch(1)
        layout = QVBoxLayout(self)
        layout.addWidget(self.table, 1)
        layout.addLayout(buttons)

    def refresh(self) -> None:
        self.model.refresh()
        on = self.model.hull() is not None
        for b in (self.add_line, self.add_push):
            b.setEnabled(on)
        has = self.current() is not None
        self.edit.setEnabled(has)
        self.remove.setEnabled(has)

    def current(self) -> str | None:
        i = self.table.currentIndex()
        if not i.isValid() or i.row() >= len(self.model.rows):
            return None
        return self.model.rows[i.row()].name

    def select(self, name: str) -> None:
        row = self.model.row_of(name)
        if row >= 0 and self.table.currentIndex().row() != row:
            sm = self.table.selectionModel()
            sm.blockSignals(True)  # the board chose it: no echo back to the board
            self.table.selectRow(row)
            sm.blockSignals(False)
            self.table.viewport().update()
            self.refresh()

    @guarded
    def _row_changed(self, current: QModelIndex, _previous: QModelIndex) -> None:
        self.refresh()
        name = self.current()
        if name is not None:
            self.fitting_selected.emit(name)

    @guarded
    def _edit(self) -> None:
        name = self.current()
        if name is not None:
            self.edit_requested.emit(name)

    @guarded
    def _remove(self) -> None:
        name = self.current()
        h = self.model.hull()
        if name is None or h is None:
            return
        c = self.controller
        words = hull_edits.fitting_deleted_words(c.project, h.name, name, "Removed")
        c.apply(hull_edits.without_fitting(c.project, h.name, name), words)
        c.message.emit(words)
