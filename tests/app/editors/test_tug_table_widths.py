"""The tugs table keeps its words whole: a tug renamed in its editor, or made fast at a
point with a longer name, widens its column (the row stays, so there is no reset to size
the columns again)."""

from __future__ import annotations

from PySide6.QtCore import Qt

from app.panels.tug_dialog import TugDialog
from app.panels.tugs_model import KEYS
from app.panels.tugs_panel import PointBox
from tests.app.editors.conftest import click_cell, open_cell, press_enter, retype


def _text_fits(table, row: int, key: str) -> bool:  # type: ignore[no-untyped-def]
    """Whether the cell's text is shown whole: the column is as wide as its widest cell."""
    col = KEYS.index(key)
    return table.columnWidth(col) >= table.sizeHintForColumn(col)


def test_a_tug_renamed_in_its_editor_is_not_cut_short(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    table = window.tugs_panel.table
    model = window.tugs_panel.model
    row = model.row_of("Tern")
    click_cell(qtbot, table, row, KEYS.index("name"))
    qtbot.mouseClick(window.tugs_panel.edit_button, Qt.MouseButton.LeftButton)
    dialog = next(d for d in window.findChildren(TugDialog) if d.isVisible())
    retype(qtbot, dialog.form.name, "Tern of Marrow Point, harbour tug no. 2")
    qtbot.mouseClick(
        dialog.buttons.button(dialog.buttons.StandardButton.Ok), Qt.MouseButton.LeftButton
    )
    assert window.controller.project.tug("Tern of Marrow Point, harbour tug no. 2")
    assert model.row_of("Tern of Marrow Point, harbour tug no. 2") == row  # the row stayed
    assert _text_fits(table, row, "name")


def test_a_tug_made_fast_at_a_longer_named_point_is_not_cut_short(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    table = window.tugs_panel.table
    model = window.tugs_panel.model
    # a point of the sample's hull with a long name, reached as a user does: the hull's
    # fittings renamed through the plan, then the tug's "Works at" cell chosen by keys
    from app.edits.hulls import renamed_fitting

    hull = c.project.hulls[0]
    spare = hull.fittings[-1]
    long_name = "Starboard quarter pushing pad, frame 14, doubled plate"
    c.apply(renamed_fitting(c.project, hull.name, spare.name, long_name), "Rename")
    editor = open_cell(qtbot, table, 0, KEYS.index("point"))
    box = editor if isinstance(editor, PointBox) else editor.parent()
    assert isinstance(box, PointBox)
    box.setCurrentIndex(box.points.index((hull.name, long_name)))
    press_enter(qtbot, table, box)
    assert c.stage.placement(model.rows[0].tug.name).point == long_name
    assert _text_fits(table, 0, "point")


def test_headers_are_not_cut_short_when_the_force_unit_changes(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    table = window.tugs_panel.table
    header = table.horizontalHeader()
    col = KEYS.index("bp")
    box = window.units_panel.boxes["force"]
    box.setFocus()
    # the longest force unit the list offers, chosen with the keyboard as a user does
    target = max(range(box.count()), key=lambda i: len(box.itemText(i)))
    while box.currentIndex() != target:
        key = Qt.Key.Key_Down if box.currentIndex() < target else Qt.Key.Key_Up
        qtbot.keyClick(box, key)
    title = table.model().headerData(col, Qt.Orientation.Horizontal)
    assert box.itemText(target) in title
    assert table.columnWidth(col) >= header.sectionSizeFromContents(col).width()
