"""The tug editor's headway table: placeholder rows marked, rows typed with real keys and
kept as one undo step with the tug, refusals in the display units; and a transit's speed
through the water in the solve panel, which the usable pulls then follow."""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt

from app.briefing.stage_tables import headway_words
from app.panels.headway_editor import OWN_NOTE, PLACEHOLDER_NOTE
from tests.app.editors.conftest import retype, type_in_cell

KNOT = 1852 / 3600  # m/s per knot (international knot, exact)


def _edit(window, qtbot, name: str):  # type: ignore[no-untyped-def]
    """Open the tug editor and make it the active window (so cell editors get the keys)."""
    d = window.editors.edit_tug(name)
    d.activateWindow()
    qtbot.waitUntil(d.isActiveWindow, timeout=2000)
    return d


def _ok(qtbot, d) -> None:  # type: ignore[no-untyped-def]
    qtbot.mouseClick(d.buttons.button(d.buttons.StandardButton.Ok), Qt.MouseButton.LeftButton)


def test_placeholder_rows_are_marked_and_kept_until_edited(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    d = _edit(window, qtbot, "Tern")
    ed = d.headway
    assert ed.note.text() == PLACEHOLDER_NOTE
    assert ed.table.rowCount() == 5
    assert ed.table.item(2, 0).text() == "4" and ed.table.item(2, 1).text() == "0.75"
    before = window.controller.project
    _ok(qtbot, d)
    assert window.controller.project.tug("Tern").headway == before.tug("Tern").headway


def test_typing_a_row_makes_the_tugs_own_table(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    steps = c.undo_stack.count()
    d = _edit(window, qtbot, "Tern")
    type_in_cell(qtbot, d.headway.table, 2, 1, "0.8")
    assert d.headway.note.text() == OWN_NOTE
    qtbot.mouseClick(d.headway.add_button, Qt.MouseButton.LeftButton)
    assert d.headway.table.item(5, 0).text() == "9"  # a knot past the last row
    type_in_cell(qtbot, d.headway.table, 5, 1, "0.2")
    _ok(qtbot, d)
    table = c.project.tug("Tern").headway
    assert table is not None and not table.placeholder
    assert table.shares == pytest.approx((1.0, 0.9, 0.8, 0.55, 0.35, 0.2))
    assert table.speeds_ms[-1] == pytest.approx(9 * KNOT)
    assert c.undo_stack.count() == steps + 1
    c.undo_stack.undo()
    assert c.project.tug("Tern").headway.placeholder  # type: ignore[union-attr]


def test_a_refused_cell_keeps_the_dialog_open(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    before = c.project
    d = _edit(window, qtbot, "Tern")
    type_in_cell(qtbot, d.headway.table, 1, 1, "1.4")
    _ok(qtbot, d)
    assert d.isVisible()
    assert "share of bollard pull: 1.4 must be at most 1" in d.error.text()
    assert "headway table, row 2" in d.error.text()
    type_in_cell(qtbot, d.headway.table, 1, 1, "0.9")
    type_in_cell(qtbot, d.headway.table, 3, 0, "3")
    _ok(qtbot, d)
    assert "must be in increasing order" in d.error.text()
    assert c.project is before


def test_a_transit_speed_is_typed_and_read_by_the_tugs(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    panel = window.solve_ui.solve_panel
    panel.kind.setCurrentIndex(panel.kind.findData("transit"))
    assert c.stage.goal.kind == "transit"
    assert panel.speed.isEnabled()
    retype(qtbot, panel.speed, "4")
    qtbot.keyClick(panel.speed, Qt.Key.Key_Return)
    assert c.stage.goal.speed_ms == pytest.approx(4 * KNOT)
    main = c.stage_result().main
    # Placeholder rows: 0.75 of the bollard pull at 4 kn, read by every tug's usable pull.
    assert main.layout.headway_share == pytest.approx([0.75] * len(main.layout.placements))
    words = headway_words(c.project, main)
    assert words is not None and "4.0 kn through the water" in words
    assert "PLACEHOLDER rows for" in words
    panel.kind.setCurrentIndex(panel.kind.findData("hold"))
    assert not panel.speed.isEnabled()
    assert c.stage.goal.speed_ms == 0.0


def test_speeds_out_of_order_are_said_in_the_speed_unit_typed_in(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    # With speed in m/s the table is typed in m/s; a row slower than the one before it was
    # refused in knots ("1.94384 kn after 2 kn"), figures the planner never typed.
    box = window.units_panel.boxes["speed"]
    box.setFocus()
    qtbot.keyClick(box, Qt.Key.Key_End)  # m/s, the last of the list
    assert window.controller.project.units.speed == "m/s"
    before = window.controller.project
    d = _edit(window, qtbot, "Tern")
    assert d.headway.table.item(1, 0).text() == f"{2 * KNOT:.6g}"  # the placeholder's 2 kn
    type_in_cell(qtbot, d.headway.table, 2, 0, "1")
    _ok(qtbot, d)
    assert d.isVisible()
    assert f"1 m/s after {2 * KNOT:.6g} m/s must be in increasing order" in d.error.text()
    assert " kn" not in d.error.text()
    assert window.controller.project is before
