"""The tugs panel: the table of tugs, and add / duplicate / remove."""

from __future__ import annotations

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
from app.edits import tugs as tug_edits
from app.guard import guarded
from app.panels.tugs_model import KEYS, Point, TugsModel
from core.mechanics.bodies import body_name_of_hull, body_of
from core.model.tugs import Placement, Tug

Index = QModelIndex | QPersistentModelIndex


class PointBox(QComboBox):
    """The "Works at" list; keeps each entry's (hull, point) beside its words."""

    def __init__(self, choices: list[tuple[str, Point]], parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.points = [pair for _words, pair in choices]
        self.addItems([words for words, _pair in choices])


class PointDelegate(QStyledItemDelegate):
    """A list of the line points and push points for the "Works at" column."""

    def __init__(self, model: TugsModel, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.model = model

    @guarded
    def createEditor(self, parent: QWidget, option: QStyleOptionViewItem, index: Index) -> QWidget:
        return PointBox(self.model.point_choices(), parent)

    @guarded
    def setEditorData(self, editor: QWidget, index: Index) -> None:
        if isinstance(editor, PointBox):  # the editor createEditor made
            where = self.model.point_at(index)
            if where in editor.points:
                editor.setCurrentIndex(editor.points.index(where))

    @guarded
    def setModelData(self, editor: QWidget, model, index: Index) -> None:  # type: ignore[no-untyped-def]
        if isinstance(editor, PointBox) and 0 <= editor.currentIndex() < len(editor.points):
            model.setData(index, editor.points[editor.currentIndex()], Qt.ItemDataRole.EditRole)


class TugsPanel(QWidget):
    """Tugs of the plan and how each works in the stage shown."""

    tug_selected = Signal(str)
    #: The "Edit…" button: open the tug editor of this tug.
    edit_requested = Signal(str)

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.model = TugsModel(controller)
        self.table = QTableView()
        self.table.setModel(self.model)
        self.table.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.table.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.table.setEditTriggers(
            QAbstractItemView.EditTrigger.DoubleClicked
            | QAbstractItemView.EditTrigger.EditKeyPressed
            | QAbstractItemView.EditTrigger.AnyKeyPressed
        )
        self.table.setItemDelegateForColumn(KEYS.index("point"), PointDelegate(self.model, self))
        self.table.verticalHeader().setVisible(False)
        # sized to the contents when the rows are made, not on every change (that would
        # measure every cell on every mouse move of a drag)
        self.table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Interactive)
        self.table.horizontalHeader().setStretchLastSection(True)
        self.model.modelReset.connect(self.table.resizeColumnsToContents)
        self.table.resizeColumnsToContents()
        # a tug renamed or made fast elsewhere keeps its row (no reset): the name and
        # "Works at" columns are sized again when their words change, and every column
        # when the units (the headers) do; a drag changes neither, so it measures nothing
        self._words = self._column_words()
        self.model.dataChanged.connect(guarded(lambda *_: self._words_changed()))
        self.model.modelReset.connect(guarded(lambda: self._units_changed(size=False)))
        self.model.headerDataChanged.connect(guarded(lambda *_: self._units_changed()))
        self.table.setAlternatingRowColors(True)
        self.table.setMinimumHeight(130)  # four rows at least
        self.table.selectionModel().currentRowChanged.connect(self._row_changed)
        buttons = QHBoxLayout()
        self.edit_button = QPushButton("Edit…")
        self.edit_button.setToolTip(
            "Every particular of the selected tug: type, role, pulls and certificate, towing "
            "point, towline, call sign and channel"
        )
        self.edit_button.clicked.connect(self._edit)
        buttons.addWidget(self.edit_button)
        self.add_button = QPushButton("Add tug")
        self.duplicate_button = QPushButton("Duplicate")
        self.remove_button = QPushButton("Remove")
        for b in (self.add_button, self.duplicate_button, self.remove_button):
            buttons.addWidget(b)
        buttons.addStretch(1)
        self.add_button.clicked.connect(self.add_tug)
        self.duplicate_button.clicked.connect(self.duplicate_tug)
        self.remove_button.clicked.connect(self.remove_tug)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        layout.addWidget(self.table)
        layout.addLayout(buttons)

    def _column_words(self) -> tuple[tuple[str, str, str] | str, ...]:
        return tuple(
            r.tug.name if r.placement is None else (r.tug.name, r.placement.hull, r.placement.point)
            for r in self.model.rows
        )

    def _words_changed(self) -> None:
        words = self._column_words()
        if words == self._words:
            return
        self._words = words
        for key in ("name", "point"):
            self.table.resizeColumnToContents(KEYS.index(key))

    def _units_changed(self, size: bool = True) -> None:
        self._words = self._column_words()
        if size:  # (a reset has sized every column already)
            self.table.resizeColumnsToContents()

    @guarded
    def _row_changed(self, current: QModelIndex, previous: QModelIndex) -> None:
        if current.isValid() and current.row() < len(self.model.rows):
            self.tug_selected.emit(self.model.rows[current.row()].tug.name)

    @guarded
    def _edit(self) -> None:
        name = self.current_tug()
        if name is None:
            self.controller.message.emit("Select a tug in the table to edit it.")
            return
        self.edit_requested.emit(name)

    def current_tug(self) -> str | None:
        i = self.table.currentIndex()
        if not i.isValid() or i.row() >= len(self.model.rows):
            return None
        return self.model.rows[i.row()].tug.name

    def select_tug(self, name: str | None) -> None:
        row = self.model.row_of(name) if name else -1
        if row < 0:
            self.table.clearSelection()
            return
        if self.table.currentIndex().row() != row:
            self.table.blockSignals(True)
            self.table.selectRow(row)
            self.table.blockSignals(False)

    # -- add, duplicate, remove ----------------------------------------------------------
    @guarded
    def add_tug(self) -> None:
        """A new tug of 40 t bollard pull, made fast at a free line point if there is one."""
        c = self.controller
        project, stage = c.ensure_stage(c.project)
        name = tug_edits.next_tug_name(project)
        tug = Tug(name, 40 * 9806.65)
        placement = None
        free = tug_edits.free_point(project, stage, None)
        if free is not None:
            hull, point = free
            body = body_of(project, body_name_of_hull(project, hull))
            kind = project.hull(hull).fitting(point).kind
            lead = tug_edits.outward_lead(body, hull, point) if kind == "line" else 0.0
            placement = Placement(name, hull, point, setting=0.0, lead_rad=lead, line_length_m=30.0)
        new = project.with_tug(tug)
        if placement is not None:
            new = c.with_stage(stage.with_placement(placement), new)
        c.apply(new, f"Add {name}")
        self.select_tug(name)

    @guarded
    def duplicate_tug(self) -> None:
        name = self.current_tug()
        if name is None:
            self.controller.message.emit("Select a tug in the table to duplicate it.")
            return
        c = self.controller
        project, new_name = tug_edits.duplicated_tug(c.project, c.stage_index, name)
        c.apply(project, f"Duplicate {name}")
        self.select_tug(new_name)

    @guarded
    def remove_tug(self) -> None:
        name = self.current_tug()
        if name is None:
            self.controller.message.emit("Select a tug in the table to remove it.")
            return
        self.controller.apply(self.controller.project.without_tug(name), f"Remove {name}")
