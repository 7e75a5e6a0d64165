"""The tug efficiency table dialog, driven by keys: values stay with their bollard pull."""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

from app.panels.conditions import EfficiencyDialog
from core.model.efficiency import EfficiencyTable
from core.units import DisplayUnits

TF = 9806.65  # N in a tonne-force (standard gravity times 1000 kg)

# invented test figures: rows 20, 50, 100 t; sea states 0, 2, 4, 6
TABLE = EfficiencyTable(
    (20 * TF, 50 * TF, 100 * TF),
    (0.0, 2.0, 4.0, 6.0),
    ((1.0, 0.9, 0.7, 0.45), (1.0, 0.93, 0.8, 0.6), (1.0, 0.95, 0.85, 0.7)),
)


def _rows(dlg) -> dict[str, list[str]]:  # type: ignore[no-untyped-def]
    g = dlg.grid
    return {
        g.verticalHeaderItem(i).text(): [g.item(i, j).text() for j in range(g.columnCount())]
        for i in range(g.rowCount())
    }


def _retype(field, text: str) -> None:  # type: ignore[no-untyped-def]
    field.setFocus()
    field.selectAll()
    QTest.keyClicks(field, text)
    QTest.keyClick(field, Qt.Key.Key_Return)


@pytest.fixture
def dialog(qtbot):  # type: ignore[no-untyped-def]
    dlg = EfficiencyDialog(TABLE, DisplayUnits(force="t"))
    qtbot.addWidget(dlg)
    dlg.show()
    qtbot.waitExposed(dlg)
    dlg.activateWindow()
    qtbot.waitUntil(dlg.isActiveWindow)
    return dlg


def test_a_pull_added_in_front_keeps_every_row_with_its_pull(dialog) -> None:  # type: ignore[no-untyped-def]
    dialog.grid.item(0, 1).setText("0.5")  # the planner's own figure for 20 t, sea 2
    dialog.pulls.setFocus()
    QTest.keyClick(dialog.pulls, Qt.Key.Key_Home)
    QTest.keyClicks(dialog.pulls, "10, ")
    QTest.keyClick(dialog.pulls, Qt.Key.Key_Return)
    rows = _rows(dialog)
    assert list(rows) == ["10 t", "20 t", "50 t", "100 t"]
    assert rows["20 t"] == ["1", "0.5", "0.7", "0.45"]
    assert rows["50 t"] == ["1", "0.93", "0.8", "0.6"]
    assert rows["100 t"] == ["1", "0.95", "0.85", "0.7"]
    # below the first row the table holds its edge (as EfficiencyTable reads it)
    assert rows["10 t"] == ["1", "0.5", "0.7", "0.45"]


def test_a_pull_added_between_rows_is_interpolated_and_one_removed_goes(dialog) -> None:  # type: ignore[no-untyped-def]
    _retype(dialog.pulls, "20, 50, 75, 100")
    rows = _rows(dialog)
    # 75 t is half-way from 50 t to 100 t; at sea 6: 0.6 + (0.7 - 0.6) * 25 / 50 = 0.65,
    # at sea 2: 0.93 + (0.95 - 0.93) / 2 = 0.94, at sea 4: 0.8 + 0.05 / 2 = 0.825
    assert [float(v) for v in rows["75 t"]] == pytest.approx([1.0, 0.94, 0.825, 0.65])
    _retype(dialog.pulls, "20, 75, 100")
    rows = _rows(dialog)
    assert list(rows) == ["20 t", "75 t", "100 t"]
    assert rows["100 t"] == ["1", "0.95", "0.85", "0.7"]
    _retype(dialog.seas, "0, 6")
    assert _rows(dialog)["100 t"] == ["1", "0.7"]
    dialog._accept()
    assert dialog.table is not None
    assert dialog.table.values == ((1.0, 0.45), (1.0, pytest.approx(0.65)), (1.0, 0.7))
