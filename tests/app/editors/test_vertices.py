"""The vertex table: the outline as typed coordinates, through the core's outline rules."""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt

from core.units import DisplayUnits
from tests.app.editors.conftest import click_cell, type_in_cell

HULL = "Kestrel 3"
FT = 0.3048  # m per foot, exactly (NIST SP 811)


@pytest.fixture
def tab(window):  # type: ignore[no-untyped-def]
    window.panels["hull"].raise_()
    window.hull_panel.tabs.setCurrentWidget(window.hull_panel.outline_tab)
    return window.hull_panel.outline_tab


def _outline(window):  # type: ignore[no-untyped-def]
    return window.controller.project.hull(HULL).outline


def test_the_table_shows_the_outline_and_follows_the_units(window, tab) -> None:
    m = tab.model
    assert m.rowCount() == len(_outline(window)) == 8
    assert m.index(2, 0).data() == "75.00" and m.index(2, 1).data() == "-12.00"
    assert m.headerData(0, Qt.Orientation.Horizontal) == "x forward (m)"
    c = window.controller
    c.apply(c.project.with_units(DisplayUnits(length="ft")), "Units")
    assert m.headerData(0, Qt.Orientation.Horizontal) == "x forward (ft)"
    assert m.index(2, 0).data() == f"{75.0 / FT:.2f}"  # 246.06 ft


def test_a_typed_coordinate_moves_the_vertex_as_one_undo_step(window, tab, qtbot) -> None:
    c = window.controller
    before = c.project
    type_in_cell(qtbot, tab.table, 3, 0, "86.5")  # the bow's starboard corner
    assert _outline(window)[3] == (86.5, -9.0)
    type_in_cell(qtbot, tab.table, 3, 1, "-8")
    assert _outline(window)[3] == (86.5, -8.0)
    assert c.undo_stack.count() == 2
    c.undo_stack.undo()
    c.undo_stack.undo()
    assert c.project == before
    assert tab.model.index(3, 0).data() == "84.00"  # the table followed the undo


def test_feet_are_typed_in_feet(window, tab, qtbot) -> None:
    c = window.controller
    c.apply(c.project.with_units(DisplayUnits(length="ft")), "Units")
    type_in_cell(qtbot, tab.table, 3, 0, "280")
    assert _outline(window)[3][0] == pytest.approx(280 * FT)


def test_an_outline_that_would_cross_itself_is_refused_with_the_cores_words(
    window, tab, qtbot
) -> None:
    c = window.controller
    before = c.project
    # vertex 2 (75, -12) pulled across to port crosses the port side
    type_in_cell(qtbot, tab.table, 2, 1, "20")
    assert c.project == before
    assert tab.error.isVisible()
    assert "crosses itself" in tab.error.text() and "edge" in tab.error.text()
    assert tab.model.index(2, 1).data() == "-12.00"
    type_in_cell(qtbot, tab.table, 2, 1, "abc")
    assert "vertex 2: y: 'abc' is not a number" in tab.error.text()
    type_in_cell(qtbot, tab.table, 2, 1, "-12.5")  # a good one clears the message
    assert not tab.error.isVisible()


def test_insert_after_and_delete(window, tab, qtbot) -> None:
    click_cell(qtbot, tab.table, 1, 0)
    qtbot.mouseClick(tab.insert, Qt.MouseButton.LeftButton)
    outline = _outline(window)
    assert len(outline) == 9 and outline[2] == (40.0, -12.0)  # half way from (5,-12) to (75,-12)
    assert tab.table.currentIndex().row() == 2
    qtbot.mouseClick(tab.delete, Qt.MouseButton.LeftButton)
    assert len(_outline(window)) == 8 and (40.0, -12.0) not in _outline(window)


def test_a_triangle_keeps_its_three_vertices(window, tab, qtbot) -> None:
    from core.model.hull import Hull

    c = window.controller
    tri = Hull("Raft", ((0.0, -5.0), (20.0, 0.0), (0.0, 5.0)))
    c.apply(c.project.with_hull(tri), "Raft")
    window.hull_panel.show_hull("Raft")
    click_cell(qtbot, tab.table, 0, 0)
    qtbot.mouseClick(tab.delete, Qt.MouseButton.LeftButton)
    assert len(c.project.hull("Raft").outline) == 3
    assert "an outline needs three" in tab.error.text()
