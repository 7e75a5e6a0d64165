"""A table model over one hull's rows (its outline's vertices, its fittings).

The hull shown is the one ``hull_name()`` names; the model follows the project row by
row, so an edit committed from a cell's editor does not reset the view under it.
"""

from __future__ import annotations

from collections.abc import Callable
from typing import Any

from PySide6.QtCore import QAbstractTableModel, QModelIndex, Qt

from app.controller import Controller
from app.guard import guarded
from app.panels.model_cells import Index
from core.model.hull import Hull


class HullRowsModel(QAbstractTableModel):
    """Rows taken from the shown hull by :meth:`rows_of`, ``COLUMN_COUNT`` columns."""

    COLUMN_COUNT = 0

    def __init__(self, controller: Controller, hull_name: Callable[[], str | None]) -> None:
        super().__init__()
        self.controller = controller
        self._hull_name = hull_name
        self.rows: tuple[Any, ...] = ()
        self._units = controller.project.units
        self.refresh()

    def rows_of(self, hull: Hull) -> tuple[Any, ...]:
        """The hull's rows this table shows."""
        raise NotImplementedError

    def hull(self) -> Hull | None:
        name = self._hull_name()
        return next((h for h in self.controller.project.hulls if h.name == name), None)

    def refresh(self) -> None:
        """Follow the project: the rows that changed, all of them when rows came or went."""
        # (a reset while a cell's editor commits would close the editor under the view)
        h = self.hull()
        new = self.rows_of(h) if h is not None else ()
        units = self.controller.project.units
        if len(new) != len(self.rows):  # a rename is a change of one row, not a reset
            self.beginResetModel()
            self.rows, self._units = new, units
            self.endResetModel()
            return
        old, self.rows = self.rows, new
        last = self.COLUMN_COUNT - 1
        if units != self._units:
            self._units = units
            self.headerDataChanged.emit(Qt.Orientation.Horizontal, 0, last)
            changed = list(range(len(new)))
        else:
            changed = [i for i, (a, b) in enumerate(zip(old, new, strict=True)) if a != b]
        for i in changed:
            self.dataChanged.emit(self.index(i, 0), self.index(i, last))

    @guarded(default=0)
    def rowCount(self, parent: Index = QModelIndex()) -> int:  # noqa: B008
        return 0 if parent.isValid() else len(self.rows)

    @guarded(default=0)
    def columnCount(self, parent: Index = QModelIndex()) -> int:  # noqa: B008
        return 0 if parent.isValid() else self.COLUMN_COUNT
