"""Units everywhere: each tug's turning sense in words, the wind's height and the outline
dialog in the display length unit."""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt

from app.panels.tugs_model import KEYS, turn_words
from app.window.outline_dialog import OutlineDialog
from core.units import DisplayUnits
from tests.app.editors.conftest import retype

FT = 0.3048  # m per foot, exactly (NIST SP 811)


def _cell(window, tug: str, key: str) -> str:  # type: ignore[no-untyped-def]
    m = window.tugs_panel.model
    return m.index(m.row_of(tug), KEYS.index(key)).data()


def test_no_share_of_yaw_each_tug_turns_the_bow_one_way_in_words(window) -> None:
    m = window.tugs_panel.model
    titles = [m.headerData(i, Qt.Orientation.Horizontal) for i in range(m.columnCount())]
    # no share of the yaw moment (the share of rated pull is another figure)
    assert not any("share of yaw" in str(t).lower() for t in titles)
    assert "Share of rated pull %" in titles
    assert "Turns the bow" in titles
    # every tug's words follow the sign of its moment as the table shows it (CONVENTIONS.md:
    # positive is counter-clockwise seen from above, bow to port), whatever the others do
    for tug in (t.name for t in window.controller.project.tugs):
        moment = float(_cell(window, tug, "moment"))
        expected = "none" if moment == 0 else "bow to port" if moment > 0 else "bow to starboard"
        assert _cell(window, tug, "turns") == expected, tug


@pytest.mark.parametrize(
    ("moment", "words"),
    [(12.0, "bow to port"), (-0.6, "bow to starboard"), (0.4, "none"), (-0.4, "none")],
)
def test_turn_words_follow_the_sign_convention(moment: float, words: str) -> None:
    # positive yaw moment is counter-clockwise seen from above: bow to port (CONVENTIONS.md)
    assert turn_words(moment) == words


def test_the_wind_height_is_in_the_display_length_unit(window, qtbot) -> None:
    c = window.controller
    c.apply(c.project.with_units(DisplayUnits(length="ft")), "Units")
    panel = window.solve_ui.conditions
    assert panel.labels["wind_height_m"].text() == "Measured at height (ft)"
    edit = panel.edits["wind_height_m"]
    assert float(edit.text()) == pytest.approx(c.stage.conditions.wind_height_m / FT, rel=1e-5)
    retype(qtbot, edit, "50")
    qtbot.keyClick(edit, Qt.Key.Key_Return)
    assert c.stage.conditions.wind_height_m == pytest.approx(50 * FT)


def test_the_outline_dialog_speaks_feet_and_gives_metres(qtbot) -> None:
    d = OutlineDialog(None, 60.96, 18.288, units=DisplayUnits(length="ft"))
    qtbot.addWidget(d)
    assert d.length.value() == pytest.approx(200.0) and d.beam.value() == pytest.approx(60.0)
    texts = [w.text() for w in d.findChildren(type(d.error))]
    assert "Length overall (ft)" in texts and "Beam (ft)" in texts
    xs = [x for x, _ in d.outline()]
    ys = [y for _, y in d.outline()]
    assert max(xs) - min(xs) == pytest.approx(60.96)  # 200 ft = 60.96 m
    assert max(ys) - min(ys) == pytest.approx(18.288)  # 60 ft


LBF = 0.45359237 * 9.80665  # N per pound-force, exact by definition (NIST SP 811, from memory)


def _choose(qtbot, window, quantity: str, unit: str) -> None:  # type: ignore[no-untyped-def]
    """Pick ``unit`` in the Units panel's list with the keyboard."""
    box = window.units_panel.boxes[quantity]
    box.setFocus()
    qtbot.keyClick(box, Qt.Key.Key_Home)
    for _ in range(box.findData(unit)):
        qtbot.keyClick(box, Qt.Key.Key_Down)
    assert window.controller.project.units.unit(quantity) == unit


def test_a_tug_cell_closed_unchanged_in_another_unit_keeps_its_value(window, qtbot) -> None:
    # A cell's editor opens on the value to six significant digits of the display unit:
    # Gannet's 55 t reads 121.254 (kip). Enter without typing wrote that back (539 364.7 N
    # for 539 365.75 N, a 45 m line became 45.0000624 m), one undo step a cell nobody
    # changed, and each change of units drifted the plan further.
    from tests.app.editors.conftest import open_cell, press_enter, type_in_cell

    c = window.controller
    _choose(qtbot, window, "force", "kip")
    _choose(qtbot, window, "length", "ft")
    before, steps = c.project, c.undo_stack.count()
    table, m = window.tugs_panel.table, window.tugs_panel.model
    for key in ("bp", "astern_bp", "length", "setting", "lead"):
        for tug in ("Gannet", "Puffin"):
            press_enter(qtbot, table, open_cell(qtbot, table, m.row_of(tug), KEYS.index(key)))
    assert c.project == before
    assert c.undo_stack.count() == steps
    # a figure typed is read in the unit the column shows: 50 kip, 1 kip = 1000 lbf
    type_in_cell(qtbot, table, m.row_of("Gannet"), KEYS.index("bp"), "50")
    assert c.project.tug("Gannet").bollard_pull_n == pytest.approx(50_000 * LBF, rel=1e-12)


def test_enter_in_any_panel_field_left_as_shown_changes_nothing(window, qtbot) -> None:
    # Panel fields show six significant digits of the display unit (a 6.5 m depth reads
    # 21.3255 ft). Enter in one left as shown read that back: the depth became 6.500002 m,
    # the 10 m wind height 10.0000003 m, a walk goal of 17.637 kip another goal, each an
    # undo step, in the conditions, hull, solve and drift panels alike; back in metres the
    # plan no longer held its own figures.
    from PySide6.QtWidgets import QLineEdit

    from app.panels.panel_field import PanelField

    c = window.controller
    _choose(qtbot, window, "force", "kip")
    _choose(qtbot, window, "length", "ft")
    _choose(qtbot, window, "speed", "m/s")
    before, steps = c.project, c.undo_stack.count()
    tried = []
    for stage in range(len(c.project.stages)):
        c.set_stage_index(stage)
        for field in window.findChildren(PanelField):
            if field.isVisible() and field.isEnabled() and field.text():
                field.setFocus()
                qtbot.keyClick(field, Qt.Key.Key_Return)
                tried.append(field.text())
    assert "21.3255" in tried and "32.8084" in tried  # the depth and the wind's height, ft
    assert c.undo_stack.count() == steps
    assert c.project == before
    # typing still commits: a depth typed in feet is stored in metres
    depth = window.solve_ui.conditions.edits["water_depth_m"]
    assert isinstance(depth, QLineEdit)
    retype(qtbot, depth, "30")
    qtbot.keyClick(depth, Qt.Key.Key_Return)
    assert c.stage.conditions.water_depth_m == pytest.approx(30 * FT)
