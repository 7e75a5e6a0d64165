"""The stage list beside the board: the move's stages in order, each with its verdict.

Selecting a stage shows it on the board. Add, duplicate, move up and down, rename
(double-click or F2) and delete are undoable edits through the controller. Each row
carries the stage's verdict from the one stage result (core.analysis.stage), read again
shortly after every change (not on every mouse move of a drag): NO-GO in red, CAUTION in
amber, GO in green, with every reason in the row's tooltip.
"""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtCore import (
    QAbstractItemModel,
    QModelIndex,
    QPersistentModelIndex,
    QSize,
    Qt,
    QTimer,
)
from PySide6.QtGui import QBrush, QColor
from PySide6.QtWidgets import (
    QAbstractItemView,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QListWidget,
    QListWidgetItem,
    QStyledItemDelegate,
    QToolButton,
    QVBoxLayout,
    QWidget,
)

from app.controller import Controller
from app.guard import guarded
from core.analysis.stage import StageResult, plan_results
from core.errors import InputError, TowboardError
from core.model.stages import add_stage, delete_stage, duplicate_stage, move_stage, rename_stage

FAIL = QColor("#b3261e")
WARN = QColor("#8a5a00")
OK = QColor("#1e6b35")

#: Delay after the last change before the stages are checked again, ms.
CHECK_DELAY_MS = 150


#: The mark and the word of each verdict in a row.
MARKS = {"go": "✓ GO", "caution": "! CAUTION", "no-go": "✖ NO-GO"}
COLOURS = {"go": OK, "caution": WARN, "no-go": FAIL}


def row_mark(result: StageResult | None) -> str:
    """The verdict's mark and word, or … while the stage is being worked out."""
    return "…" if result is None else MARKS[result.verdict.status]


def _shown_rows(c: Controller) -> tuple[object, ...]:
    """What the list shows that a tug drag could change: nothing but whether the verdicts
    are those of the plan on screen (during a drag they are not)."""
    return (c.all_but_placements(), c.previewing)


def row_text(index: int, result: StageResult | None, name: str, kind: str) -> str:
    return f"{index + 1}. {name}  [{kind}]\n{row_mark(result)}"


class _NameEditor(QStyledItemDelegate):
    """Edits a row as the bare stage name; the new name goes to ``done(row, text)``."""

    def __init__(self, done: Callable[[int, str], None], parent: QWidget) -> None:
        super().__init__(parent)
        self._done = done

    @guarded
    def setEditorData(self, editor: QWidget, index: QModelIndex | QPersistentModelIndex) -> None:
        if isinstance(editor, QLineEdit):
            editor.setText(str(index.data(Qt.ItemDataRole.UserRole) or ""))
            editor.selectAll()

    @guarded
    def setModelData(
        self,
        editor: QWidget,
        model: QAbstractItemModel,
        index: QModelIndex | QPersistentModelIndex,
    ) -> None:
        if isinstance(editor, QLineEdit):
            self._done(index.row(), editor.text())


class StageList(QWidget):
    """The stages of the plan in order, with buttons to edit the list."""

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.results: tuple[StageResult, ...] = ()
        self._filling = False
        self.setObjectName("stage_list")
        self.list = QListWidget(self)
        self.list.setObjectName("stage_rows")
        self.list.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.list.setWordWrap(True)
        self.list.setResizeMode(QListWidget.ResizeMode.Adjust)
        self.list.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.list.setEditTriggers(
            QAbstractItemView.EditTrigger.DoubleClicked
            | QAbstractItemView.EditTrigger.EditKeyPressed
        )
        self.list.setItemDelegate(_NameEditor(self.rename_to, self.list))
        self.list.currentRowChanged.connect(self._row_chosen)
        self.summary = QLabel(self)
        self.summary.setWordWrap(True)
        buttons = QHBoxLayout()
        buttons.setSpacing(2)
        self.buttons: dict[str, QToolButton] = {}
        for key, text, tip, slot in (
            ("add", "Add", "Add a stage after this one (same poses and conditions)", self.add),
            ("duplicate", "Copy", "Duplicate this stage, tugs and all", self.duplicate),
            ("up", "Up", "Move this stage earlier in the move", lambda: self.move(-1)),
            ("down", "Down", "Move this stage later in the move", lambda: self.move(1)),
            ("rename", "Rename", "Rename this stage (F2)", self.rename),
            ("delete", "Delete", "Delete this stage (undo brings it back)", self.delete),
        ):
            b = QToolButton(self)
            b.setText(text)
            b.setToolTip(tip)
            b.setObjectName(f"stage_{key}")
            b.clicked.connect(guarded(slot))
            buttons.addWidget(b)
            self.buttons[key] = b
        buttons.addStretch(1)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        title = QLabel("<b>Stages of the move</b>", self)
        layout.addWidget(title)
        layout.addWidget(self.list, 1)
        layout.addLayout(buttons)
        layout.addWidget(self.summary)
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(CHECK_DELAY_MS)
        self._timer.timeout.connect(self.recheck)
        controller.follow(self._project_changed, self, _shown_rows)
        controller.stage_changed.connect(self._stage_shown)
        self.fill()
        self.recheck()

    @guarded(default=QSize)
    def sizeHint(self) -> QSize:
        return QSize(260, 320)

    # -- showing -----------------------------------------------------------------------
    def result_of(self, i: int) -> StageResult | None:
        """The verdict shown for stage ``i``: the stage result of the project as it stands."""
        if i < len(self.results) and self.results[i].project is self.controller.project:
            return self.results[i]
        return None

    def fill(self) -> None:
        """Rows in line with the plan's stages (text, marks, tooltips, selection)."""
        stages = self.controller.project.stages
        self._filling = True
        try:
            while self.list.count() > len(stages):
                self.list.takeItem(self.list.count() - 1)
            while self.list.count() < len(stages):
                item = QListWidgetItem()
                item.setFlags(item.flags() | Qt.ItemFlag.ItemIsEditable)
                self.list.addItem(item)
            for i, s in enumerate(stages):
                item = self.list.item(i)
                result = self.result_of(i)
                item.setText(row_text(i, result, s.name, s.kind))
                item.setData(Qt.ItemDataRole.UserRole, s.name)
                color = None
                tip = [s.name]
                if result is not None:
                    v = result.verdict
                    color = COLOURS[v.status]
                    tip.append(v.label)
                    tip += [f"{r.status.upper()}: {r.text}" for r in v.reasons]
                    if not v.reasons:
                        tip.append("Within every limit checked.")
                item.setForeground(QBrush(color) if color is not None else QBrush())
                item.setToolTip("\n".join(tip))
            if stages:
                self.list.setCurrentRow(min(self.controller.stage_index, len(stages) - 1))
        finally:
            self._filling = False
        self._update_buttons()
        self._update_summary()

    def _update_buttons(self) -> None:
        n = len(self.controller.project.stages)
        i = self.controller.stage_index
        for key, on in (
            ("duplicate", n > 0),
            ("up", n > 1 and i > 0),
            ("down", n > 1 and i < n - 1),
            ("rename", n > 0),
            ("delete", n > 0),
        ):
            self.buttons[key].setEnabled(on)

    def _update_summary(self) -> None:
        stages = self.controller.project.stages
        results = [self.result_of(i) for i in range(len(stages))]
        if not stages:
            self.summary.setText("No stages yet: Add makes the first.")
            return
        if any(r is None for r in results):
            self.summary.setText("Working the stages out…")
            return
        nogo = [r.index + 1 for r in results if r is not None and r.verdict.status == "no-go"]
        caution = [r.index + 1 for r in results if r is not None and r.verdict.status == "caution"]
        parts = []
        if nogo:
            parts.append(f"<span style='color:{FAIL.name()}'>NO-GO: stage {_nums(nogo)}</span>")
        if caution:
            parts.append(
                f"<span style='color:{WARN.name()}'>CAUTION: stage {_nums(caution)}</span>"
            )
        if not parts:
            parts.append(f"<span style='color:{OK.name()}'>Every stage is GO.</span>")
        self.summary.setText("<br>".join(parts))

    @guarded
    def _project_changed(self) -> None:
        self.fill()
        if not self.controller.previewing:
            self._timer.start()

    @guarded
    def _stage_shown(self, index: int) -> None:
        if self.list.currentRow() != index and index < self.list.count():
            self._filling = True
            self.list.setCurrentRow(index)
            self._filling = False
        self._update_buttons()

    @guarded
    def recheck(self) -> None:
        """Read every stage's result now (normally run shortly after a change)."""
        self._timer.stop()
        try:
            self.results = plan_results(self.controller.project)
        except TowboardError as e:  # a half-made plan: say so, keep the list usable
            self.results = ()
            self.summary.setText(f"Cannot work the stages out: {e}")
            return
        self.fill()

    # -- editing -----------------------------------------------------------------------
    @guarded
    def _row_chosen(self, row: int) -> None:
        if not self._filling and row >= 0:
            self.controller.set_stage_index(row)
            self._update_buttons()

    def _index(self) -> int | None:
        n = len(self.controller.project.stages)
        return min(self.controller.stage_index, n - 1) if n else None

    def add(self) -> None:
        project, new = add_stage(self.controller.project, self._index())
        self.controller.apply(project, f"Add stage {project.stages[new].name}")
        self.controller.set_stage_index(new)

    def duplicate(self) -> None:
        i = self._index()
        if i is None:
            return
        project, new = duplicate_stage(self.controller.project, i)
        self.controller.apply(project, f"Duplicate stage {project.stages[i].name}")
        self.controller.set_stage_index(new)

    @guarded
    def move(self, step: int) -> None:
        i = self._index()
        if i is None or not 0 <= i + step < len(self.controller.project.stages):
            return
        name = self.controller.project.stages[i].name
        self.controller.apply(
            move_stage(self.controller.project, i, i + step),
            f"Move stage {name} {'up' if step < 0 else 'down'}",
        )
        self.controller.set_stage_index(i + step)

    def rename(self) -> None:
        """Start editing the shown stage's name in its row."""
        i = self._index()
        if i is not None:
            self.list.editItem(self.list.item(i))

    def delete(self) -> None:
        i = self._index()
        if i is None:
            return
        name = self.controller.project.stages[i].name
        self.controller.apply(delete_stage(self.controller.project, i), f"Delete stage {name}")
        self.controller.set_stage_index(min(i, len(self.controller.project.stages) - 1))

    def rename_to(self, index: int, name: str) -> None:
        """Rename stage ``index``; a name that is empty or taken is refused with a message."""
        stages = self.controller.project.stages
        if not 0 <= index < len(stages) or name.strip() == stages[index].name:
            self.fill()
            return
        old = stages[index].name
        try:
            project = rename_stage(self.controller.project, index, name)
        except InputError as e:
            self.controller.message.emit(f"Stage not renamed: {e.field} {e.value!r} {e.reason}")
            self.fill()
            return
        self.controller.apply(project, f"Rename stage {old} to {name.strip()}")


def _nums(numbers: list[int]) -> str:
    return ", ".join(str(n) for n in numbers)
