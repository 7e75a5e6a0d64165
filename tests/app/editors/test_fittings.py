"""The fittings table and the fitting dialog: name, kind, type, position, SWL, TOW and
permitted line angles, typed with real keys; the board's tooltips in the display units."""

from __future__ import annotations

import math

import pytest
from PySide6.QtCore import Qt

from app.panels.fitting_dialog import FittingDialog
from app.panels.fittings_model import KEYS
from core.frames import bearing_to_angle
from core.units import DisplayUnits
from tests.app.editors.conftest import click_cell, open_cell, press_enter, retype, type_in_cell

TF = 9806.65  # N per tonne-force (NIST SP 811, from memory; REFERENCES.md)
HULL = "Kestrel 3"


@pytest.fixture
def tab(window):  # type: ignore[no-untyped-def]
    window.panels["hull"].raise_()
    window.hull_panel.tabs.setCurrentWidget(window.hull_panel.fittings_tab)
    return window.hull_panel.fittings_tab


def _row(tab, name: str) -> int:  # type: ignore[no-untyped-def]
    return tab.model.row_of(name)


def _fitting(window, name: str):  # type: ignore[no-untyped-def]
    return window.controller.project.hull(HULL).fitting(name)


def test_the_table_lists_every_fitting_in_the_display_units(window, tab) -> None:
    m = tab.model
    assert [f.name for f in m.rows] == [f.name for f in window.controller.project.hulls[0].fittings]
    header = [m.headerData(i, Qt.Orientation.Horizontal) for i in range(m.columnCount())]
    assert header[KEYS.index("swl")] == "SWL (t)" and header[KEYS.index("x")] == "x (m)"
    row = _row(tab, "Bow centre bitt")
    assert m.index(row, KEYS.index("swl")).data() == "80.0"
    # the model changes; the widget follows: units to kN (784.532 kN = 80 t, NIST SP 811)
    c = window.controller
    c.apply(c.project.with_units(DisplayUnits(force="kN")), "Units")
    assert m.headerData(KEYS.index("swl"), Qt.Orientation.Horizontal) == "SWL (kN)"
    assert m.index(row, KEYS.index("swl")).data() == "784.5"


def test_renaming_in_the_table_follows_into_the_placements(window, tab, qtbot) -> None:
    c = window.controller
    before = c.project
    assert any(p.point == "Bow centre bitt" for s in before.stages for p in s.placements)
    type_in_cell(qtbot, tab.table, _row(tab, "Bow centre bitt"), KEYS.index("name"), "Bow staple")
    p = c.project
    names = [f.name for f in p.hull(HULL).fittings]
    assert "Bow staple" in names and "Bow centre bitt" not in names
    points = {pl.point for s in p.stages for pl in s.placements}
    assert "Bow staple" in points and "Bow centre bitt" not in points
    assert c.undo_stack.count() == 1
    c.undo_stack.undo()
    assert c.project == before


def test_typing_swl_tow_and_permitted_lines(window, tab, qtbot) -> None:
    row = _row(tab, "Bow centre bitt")
    type_in_cell(qtbot, tab.table, row, KEYS.index("tow"), "64,5")
    type_in_cell(qtbot, tab.table, row, KEYS.index("swl"), "70")
    type_in_cell(qtbot, tab.table, row, KEYS.index("lines"), "300 to 060")
    f = _fitting(window, "Bow centre bitt")
    assert f.tow_n == pytest.approx(64.5 * TF) and f.swl_n == pytest.approx(70 * TF)
    assert f.permits_lead(bearing_to_angle(0.0)) and f.permits_lead(bearing_to_angle(310.0))
    assert not f.permits_lead(bearing_to_angle(90.0))
    assert tab.model.index(row, KEYS.index("lines")).data() == "300° to 060°"
    assert window.controller.undo_stack.count() == 3
    # and clearing them: an empty SWL is "not given", "any" is every direction
    type_in_cell(qtbot, tab.table, row, KEYS.index("swl"), "")
    type_in_cell(qtbot, tab.table, row, KEYS.index("lines"), "any")
    f = _fitting(window, "Bow centre bitt")
    assert f.swl_n is None and f.permitted_lead_rad is None and f.tow_n is not None


def test_refused_input_names_the_field_and_changes_nothing(window, tab, qtbot) -> None:
    c = window.controller
    before = c.project
    messages: list[str] = []
    c.message.connect(messages.append)
    row = _row(tab, "Bow centre bitt")
    type_in_cell(qtbot, tab.table, row, KEYS.index("tow"), "heavy")
    type_in_cell(qtbot, tab.table, row, KEYS.index("tow"), "-3")
    type_in_cell(qtbot, tab.table, row, KEYS.index("lines"), "300")
    type_in_cell(qtbot, tab.table, row, KEYS.index("name"), "Port quarter bitt")
    assert c.project == before
    assert "Bow centre bitt: TOW: 'heavy' is not a number" in messages[0]
    assert "Bow centre bitt: TOW: -3.0 t must be at least 0.1 t" in messages[1]
    assert "is not two bearings" in messages[2]
    assert "is used twice" in messages[3]


def test_a_typed_position_lands_on_the_outline(window, tab, qtbot) -> None:
    c = window.controller
    messages: list[str] = []
    c.message.connect(messages.append)
    row = _row(tab, "Port quarter bitt")
    type_in_cell(qtbot, tab.table, row, KEYS.index("x"), "40")
    f = _fitting(window, "Port quarter bitt")
    assert (f.x, f.y) == pytest.approx((40.0, 12.0))  # on the port side, y = 12 m
    type_in_cell(qtbot, tab.table, row, KEYS.index("y"), "14")
    f = _fitting(window, "Port quarter bitt")
    assert (f.x, f.y) == pytest.approx((40.0, 12.0))
    assert "moved onto the outline" in messages[-1] and "2.00 m from where typed" in messages[-1]


def test_turning_a_push_point_into_a_line_point_re_leads_its_tug(window, tab, qtbot) -> None:
    c = window.controller
    stage = c.project.stages[0]
    assert stage.placement("Tern").point == "Stbd shoulder pad"
    editor = open_cell(qtbot, tab.table, _row(tab, "Stbd shoulder pad"), KEYS.index("kind"))
    qtbot.keyClick(editor, Qt.Key.Key_Up)  # "push point" -> "line point"
    press_enter(qtbot, tab.table, editor)
    f = _fitting(window, "Stbd shoulder pad")
    assert f.kind == "line"
    tern = c.project.stages[0].placement("Tern")
    # a line off the starboard side leads square out: relative bearing 090 (geometry)
    assert tern.lead_rad == pytest.approx(bearing_to_angle(90.0))


def test_the_type_is_a_list_or_a_word_of_ones_own(window, tab, qtbot) -> None:
    row = _row(tab, "Port quarter bitt")
    type_in_cell(qtbot, tab.table, row, KEYS.index("type"), "Panama chock")
    assert _fitting(window, "Port quarter bitt").fitting_type == "Panama chock"


def test_board_and_table_select_the_same_fitting(window, tab, qtbot) -> None:
    click_cell(qtbot, tab.table, _row(tab, "Stbd quarter bitt"), 0)
    assert window.board.selection == ("fitting", HULL, "Stbd quarter bitt")
    window.board.select(("fitting", HULL, "Bow centre bitt"))
    assert tab.current() == "Bow centre bitt"


def _mark_point(window, name: str):  # type: ignore[no-untyped-def]
    mark = window.board.bodies[HULL].hulls[HULL].fittings[name][0]
    return window.view.mapFromScene(mark.scenePos()), mark


def test_double_click_on_the_board_opens_the_fitting_dialog(window, qtbot) -> None:
    c = window.controller
    swl_before = _fitting(window, "Bow centre bitt").swl_n
    at, _mark = _mark_point(window, "Bow centre bitt")
    vertices = len(c.project.hull(HULL).outline)
    qtbot.mouseDClick(window.view.viewport(), Qt.MouseButton.LeftButton, pos=at)
    dialogs = [d for d in window.findChildren(FittingDialog) if d.isVisible()]
    assert len(dialogs) == 1
    d = dialogs[0]
    assert len(c.project.hull(HULL).outline) == vertices  # no vertex inserted under it
    assert d.name.text() == "Bow centre bitt" and d.swl.text() == "80"
    retype(qtbot, d.name, "Bow fairlead")
    d.type.setFocus()
    qtbot.keyClick(d.type.lineEdit(), Qt.Key.Key_A, Qt.KeyboardModifier.ControlModifier)
    qtbot.keyClicks(d.type.lineEdit(), "fairlead")
    retype(qtbot, d.tow, "60")
    retype(qtbot, d.lines_from, "270")
    retype(qtbot, d.lines_to, "90")
    qtbot.mouseClick(d.buttons.button(d.buttons.StandardButton.Ok), Qt.MouseButton.LeftButton)
    assert not d.isVisible()
    f = _fitting(window, "Bow fairlead")
    assert f.fitting_type == "fairlead" and f.tow_n == pytest.approx(60 * TF)
    assert f.swl_n == swl_before  # untouched in the dialog: kept exactly, not re-read from text
    assert f.permits_lead(0.0) and not f.permits_lead(math.pi)
    assert c.undo_stack.count() == 1
    assert c.project.stages[0].placement("Gannet").point == "Bow fairlead"


def test_the_dialog_refuses_half_a_sector_and_keeps_what_was_typed(window, qtbot) -> None:
    d = window.editors.edit_fitting(HULL, "Bow centre bitt")
    before = window.controller.project
    retype(qtbot, d.lines_from, "300")
    retype(qtbot, d.tow, "55")
    qtbot.keyClick(d.tow, Qt.Key.Key_Return)
    assert d.isVisible() and "need both ends" in d.error.text()
    assert d.tow.text() == "55"
    assert window.controller.project == before


def test_a_refused_rating_is_said_of_the_fitting_as_renamed(window, qtbot) -> None:
    """A new name and a refused TOW typed together: the message names the fitting by
    the name typed (the one the planner sees), and keeps everything typed."""
    d = window.editors.edit_fitting(HULL, "Bow centre bitt")
    before = window.controller.project
    retype(qtbot, d.name, "Bow staple")
    retype(qtbot, d.tow, "-5")
    qtbot.keyClick(d.tow, Qt.Key.Key_Return)
    assert d.isVisible() and "Bow staple" in d.error.text() and "TOW" in d.error.text()
    assert "Bow centre bitt" not in d.error.text()
    assert d.name.text() == "Bow staple" and d.tow.text() == "-5"
    assert window.controller.project == before


def test_board_tooltips_say_the_ratings_in_the_display_units(window) -> None:
    _at, mark = _mark_point(window, "Bow centre bitt")
    assert mark.toolTip() == "Bow centre bitt (line point, bitt, SWL 80.0 t)"
    c = window.controller
    c.apply(c.project.with_units(DisplayUnits(force="kN")), "Units")
    assert mark.toolTip() == "Bow centre bitt (line point, bitt, SWL 784.5 kN)"
    _at, pad = _mark_point(window, "Stbd shoulder pad")
    assert pad.toolTip() == "Stbd shoulder pad (push point, pushing pad, no rating given)"


def test_the_dialog_keeps_the_widget_methods_its_fields_are_named_after(window) -> None:
    """The position's fields once stood in the attributes ``x`` and ``y``, which hid
    QWidget.x() and y(): asking the dialog where it lies raised TypeError."""
    d = window.editors.edit_fitting(HULL, "Bow centre bitt")
    d.move(40, 50)
    assert (d.x(), d.y()) == (d.pos().x(), d.pos().y())
    assert (d.width(), d.height()) == (d.size().width(), d.size().height())
