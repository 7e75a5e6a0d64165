"""The vertex table's model: one hull's outline as typed coordinates.

Rows are the outline's vertices, numbered as the core's outline messages number them
(from 0, counter-clockwise); x forward and y to port in the display length unit. A
typed coordinate goes through the core's outline rules (:func:`app.edits.hulls.moved_vertex`):
an outline that would cross itself is refused with the core's message, and nothing
changes.
"""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtCore import Qt

from app import formatting as fmt
from app import numbers
from app.controller import Controller
from app.edits import hulls as hull_edits
from app.guard import guarded
from app.panels.hull_rows import HullRowsModel
from app.panels.model_cells import Index, holds
from core.errors import InputError, TowboardError
from core.model import rules
from core.model.hull import Hull


class VerticesModel(HullRowsModel):
    """Rows are the vertices of the hull ``hull_name()`` returns; columns x and y."""

    COLUMN_COUNT = 2
    rows: tuple[tuple[float, float], ...]

    def __init__(self, controller: Controller, hull_name: Callable[[], str | None]) -> None:
        super().__init__(controller, hull_name)
        #: Called with the reason when a typed coordinate is refused (the panel shows it).
        self.refused: Callable[[str], None] = lambda _text: None

    def rows_of(self, hull: Hull) -> tuple[tuple[float, float], ...]:
        return hull.outline

    # -- Qt model ---------------------------------------------------------------------
    @guarded
    def headerData(
        self, section: int, orientation: Qt.Orientation, role: int = Qt.ItemDataRole.DisplayRole
    ):  # type: ignore[no-untyped-def]
        if orientation == Qt.Orientation.Vertical:
            return str(section) if role == Qt.ItemDataRole.DisplayRole else None
        if not 0 <= section < 2:
            return None
        if role == Qt.ItemDataRole.DisplayRole:
            ln = fmt.unit_label(self.controller.project.units, "length")
            return f"x forward ({ln})" if section == 0 else f"y to port ({ln})"
        if role == Qt.ItemDataRole.ToolTipRole:
            return "Hull frame, from the reference point"
        return None

    @guarded(default=Qt.ItemFlag.NoItemFlags)
    def flags(self, index: Index) -> Qt.ItemFlag:
        base = Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable
        return base | Qt.ItemFlag.ItemIsEditable if holds(self, index) else base

    @guarded
    def data(self, index: Index, role: int = Qt.ItemDataRole.DisplayRole):  # type: ignore[no-untyped-def]
        if not holds(self, index):
            return None
        v = self.rows[index.row()][index.column()]
        u = self.controller.project.units
        if role == Qt.ItemDataRole.DisplayRole:
            return fmt.number(u, v, "length", 2)
        if role == Qt.ItemDataRole.EditRole:
            return f"{u.value(v, 'length'):.6g}"
        if role == Qt.ItemDataRole.TextAlignmentRole:
            return int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
        return None

    @guarded(default=False)
    def setData(self, index: Index, value: object, role: int = Qt.ItemDataRole.EditRole) -> bool:
        if role != Qt.ItemDataRole.EditRole or not holds(self, index):
            return False
        try:
            return self._set(index.row(), index.column(), str(value))
        except (TowboardError, ValueError) as e:
            self._refuse(e)
        return False

    def _set(self, row: int, col: int, text: str) -> bool:
        h = self.hull()
        if h is None:
            return False
        u = self.controller.project.units
        if text.strip() == self.data(self.index(row, col), Qt.ItemDataRole.EditRole):
            return False  # the editor closed unchanged: keep the value exactly
        axis = "x" if col == 0 else "y"
        if not text.strip():
            raise InputError(f"vertex {row}: {axis}", "", "must be given")
        v = numbers.parse_value(text, rules.COORDINATE.named(axis), u, f"vertex {row}")
        x, y = h.outline[row]
        p = (v, y) if col == 0 else (x, v)
        new = hull_edits.moved_vertex(h, row, p)
        self.controller.apply(self.controller.project.with_hull(new), f"Vertex {row} of {h.name}")
        self.refused("")
        return True

    def _refuse(self, e: Exception) -> None:
        text = f"Not changed: {numbers.message(e, self.controller.project.units)}"
        self.refused(text)
        self.controller.message.emit(text)

    # -- rows -----------------------------------------------------------------------
    def insert_after(self, row: int) -> int | None:
        """A new vertex half way along the edge from vertex ``row``; its row, or None."""
        h = self.hull()
        if h is None or not 0 <= row < len(h.outline):
            return None
        (ax, ay), (bx, by) = h.outline[row], h.outline[(row + 1) % len(h.outline)]
        try:
            new = hull_edits.inserted_vertex(h, row, ((ax + bx) / 2, (ay + by) / 2))
        except TowboardError as e:
            self._refuse(e)
            return None
        self.controller.apply(self.controller.project.with_hull(new), f"Insert vertex in {h.name}")
        return row + 1

    def delete(self, row: int) -> bool:
        h = self.hull()
        if h is None or not 0 <= row < len(h.outline):
            return False
        try:
            new = hull_edits.deleted_vertex(h, row)
        except TowboardError as e:
            self._refuse(e)
            return False
        self.controller.apply(
            self.controller.project.with_hull(new), f"Delete vertex {row} of {h.name}"
        )
        return True
