"""app.panels.table_cells.fill: a table filled in place sets only the cells that differ."""

from __future__ import annotations

from PySide6.QtGui import QColor
from PySide6.QtWidgets import QTableWidget

from app.panels.table_cells import Cell, fill

RED = QColor("#b00020")


def _table(qtbot) -> QTableWidget:  # type: ignore[no-untyped-def]
    t = QTableWidget(0, 2)
    qtbot.addWidget(t)
    return t


def test_a_second_fill_of_the_same_rows_sets_nothing(qtbot) -> None:  # type: ignore[no-untyped-def]
    t = _table(qtbot)
    rows = [[Cell("Tug 1"), Cell("40 %", right=True)], [Cell("Tug 2"), Cell("55 %", right=True)]]
    assert fill(t, rows) == 4
    assert fill(t, [list(r) for r in rows]) == 0
    assert [t.item(r, 1).text() for r in range(2)] == ["40 %", "55 %"]


def test_a_change_of_colour_alignment_or_weight_alone_is_shown(qtbot) -> None:  # type: ignore[no-untyped-def]
    t = _table(qtbot)
    fill(t, [[Cell("Tug 1"), Cell("40 %")]])
    assert fill(t, [[Cell("Tug 1"), Cell("40 %", right=True, color=RED, bold=True)]]) == 1
    item = t.item(0, 1)
    assert item.foreground().color() == RED
    assert item.font().bold()
    assert int(item.textAlignment()) & 0x2  # Qt.AlignRight
    assert fill(t, [[Cell("Tug 1"), Cell("40 %")]]) == 1  # and back
    assert not t.item(0, 1).font().bold()


def test_text_changed_behind_the_fills_back_is_set_again(qtbot) -> None:  # type: ignore[no-untyped-def]
    t = _table(qtbot)
    rows = [[Cell("Tug 1"), Cell("40 %")]]
    fill(t, rows)
    t.item(0, 1).setText("typed over")
    assert fill(t, rows) == 1
    assert t.item(0, 1).text() == "40 %"
