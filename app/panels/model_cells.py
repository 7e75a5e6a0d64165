"""Whether a model index names a cell its table model has now.

A view can hand a model an index taken before the model's rows changed: the user types
in a field of another panel, then clicks a cell of a table; the field commits as it
loses focus, the edit resets the table's rows, and the index of the click (or of a
current cell kept by an editor) names a row that is no longer there. Every table model
asks :func:`holds` before it reads a row for ``flags``, ``data`` or ``setData``.
"""

from __future__ import annotations

from PySide6.QtCore import QAbstractItemModel, QModelIndex, QPersistentModelIndex

Index = QModelIndex | QPersistentModelIndex


def holds(model: QAbstractItemModel, index: Index) -> bool:
    """True when ``index`` is valid and its row and column lie within ``model`` now."""
    if not index.isValid():
        return False
    return 0 <= index.row() < model.rowCount() and 0 <= index.column() < model.columnCount()
