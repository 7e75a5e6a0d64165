"""A table cell's index taken before the table's rows changed names no cell.

Found by the monkey (benchmarks/monkey.py, seed 1003): a field of another panel held
typed text, a cell of the fittings table was clicked; the field committed as it lost
focus, the edit changed the table's rows, and the index of the cell, taken before, named
a row no longer there. ``flags`` read that row and raised IndexError inside Qt.

Each table model is handed indexes of its last rows taken before a change that leaves it
fewer rows: it says the cell is not editable, shows nothing, takes no edit, and the plan
is unchanged.
"""

from __future__ import annotations

from PySide6.QtCore import QAbstractItemModel, QModelIndex, Qt
from PySide6.QtWidgets import QAbstractItemView

from app.panels.capability_table import CapabilityModel
from app.panels.fittings_model import FittingsModel
from app.panels.tugs_model import TugsModel
from app.panels.vertices_model import VerticesModel
from core.model.capability import default_capability
from core.model.plan import Project, Stage
from core.units import DisplayUnits

ROLES = (
    Qt.ItemDataRole.DisplayRole,
    Qt.ItemDataRole.EditRole,
    Qt.ItemDataRole.ToolTipRole,
    Qt.ItemDataRole.CheckStateRole,
)


def _last_cells(model: QAbstractItemModel) -> list[QModelIndex]:
    last = model.rowCount() - 1
    assert last >= 0, f"{type(model).__name__} has no rows to go stale"
    return [model.index(last, c) for c in range(model.columnCount())]


def _assert_no_cell(model: QAbstractItemModel, stale: list[QModelIndex]) -> None:
    for index in stale:
        assert index.row() >= model.rowCount()  # the row is gone
        flags = model.flags(index)
        assert not flags & Qt.ItemFlag.ItemIsEditable
        assert not flags & Qt.ItemFlag.ItemIsUserCheckable
        for role in ROLES:
            assert model.data(index, role) is None
        assert model.setData(index, "12", Qt.ItemDataRole.EditRole) is False


def test_the_window_tables_take_no_stale_cell(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    kinds = (TugsModel, FittingsModel, VerticesModel)
    models = {
        type(v.model()): v.model()
        for v in window.findChildren(QAbstractItemView)
        if isinstance(v.model(), kinds)
    }
    assert set(models) == set(kinds)
    stale = {kind: _last_cells(m) for kind, m in models.items()}
    # what File > New gives: no hulls, no tugs; every table loses its rows
    window.controller.reset(Project(stages=(Stage("Stage 1"),)))
    plan = window.controller.project
    for kind, m in models.items():
        _assert_no_cell(m, stale[kind])
        # as a view does it: the click's index becomes the current cell
        view = next(v for v in window.findChildren(QAbstractItemView) if v.model() is m)
        view.setCurrentIndex(stale[kind][-1])
    assert window.controller.project is plan
    assert window.controller.undo_stack.count() == 0


def test_the_capability_table_takes_no_stale_cell(qapp) -> None:  # type: ignore[no-untyped-def]
    model = CapabilityModel(DisplayUnits())
    model.load(default_capability("ASD"))
    stale = [model.index(r, c) for r in (1, 2) for c in range(model.columnCount())]
    while model.rowCount() > 1:  # the rows removed as the editor's Remove button does
        model.remove_row(model.rowCount() - 1)
    _assert_no_cell(model, stale)
