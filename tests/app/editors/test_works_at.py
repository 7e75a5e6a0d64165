"""The tugs table's "Works at" column: the point chosen in its list is the point the tug
goes to, whatever the hull and point are called."""

from __future__ import annotations

from dataclasses import replace

import pytest
from PySide6.QtCore import Qt

from app.edits.hulls import renamed_fitting, renamed_hull
from app.panels.tugs_model import KEYS, NOT_PLACED
from app.panels.tugs_panel import PointBox
from core.errors import InputError
from core.io.projectfile import dumps, load, save
from tests.app.editors.conftest import open_cell, press_enter


def _renamed(window, hull_name: str, point_name: str) -> tuple[str, str]:  # type: ignore[no-untyped-def]
    """The sample's first hull and its first fitting renamed; their new names."""
    c = window.controller
    hull = c.project.hulls[0]
    old_point = hull.fittings[0].name
    p = renamed_hull(c.project, hull.name, hull_name)
    p = renamed_fitting(p, hull_name, old_point, point_name)
    c.apply(p, "Rename")
    return hull_name, point_name


@pytest.mark.parametrize(
    ("hull_name", "point_name"),
    [
        ("Osprey: 7", "Bow: port"),  # once read as hull 'Osprey', point '7: Bow: port'
        ("Osprey", "7: Bow"),
        (":", ": "),
    ],
)
def test_a_point_chosen_in_the_list_is_where_the_tug_goes(
    window, qtbot, tmp_path, hull_name: str, point_name: str
) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    _renamed(window, hull_name, point_name)
    said: list[str] = []
    c.message.connect(said.append)
    table = window.tugs_panel.table
    model = window.tugs_panel.model
    tug = model.rows[0].tug.name
    editor = open_cell(qtbot, table, 0, KEYS.index("point"))
    box = editor if isinstance(editor, PointBox) else editor.parent()
    assert isinstance(box, PointBox)
    box.setCurrentIndex(box.points.index((hull_name, point_name)))
    press_enter(qtbot, table, box)
    c.message.disconnect(said.append)
    placed = c.stage.placement(tug)
    assert (placed.hull, placed.point) == (hull_name, point_name), said
    assert not any("Not changed" in s for s in said), said
    assert model.data(model.index(0, KEYS.index("point"))) == f"{hull_name}: {point_name}"
    # and back: the list opens on the tug's own point, and the plan saves and reads back
    editor = open_cell(qtbot, table, 0, KEYS.index("point"))
    box = editor if isinstance(editor, PointBox) else editor.parent()
    assert box.points[box.currentIndex()] == (hull_name, point_name)
    qtbot.keyClick(box, Qt.Key.Key_Escape)
    out = save(c.project, tmp_path / "p.towboard")
    assert dumps(load(out)) == dumps(c.project)


def test_words_that_name_two_points_are_refused_not_guessed(window) -> None:  # type: ignore[no-untyped-def]
    model = window.tugs_panel.model
    _renamed(window, "A: b", "c")  # listed as "A: b: c" ...
    c = window.controller
    first = c.project.hulls[0]
    other = replace(first, name="A", fittings=(replace(first.fittings[0], name="b: c"),))
    c.apply(c.project.with_hull(other), "Add hull A")  # ... and so is hull A's "b: c"
    words = [w for w, _pair in model.point_choices()]
    assert words.count("A: b: c") == 2
    with pytest.raises(InputError, match="names more than one point: choose it in the list"):
        model.point_of_value("A: b: c")
    assert model.point_of_value(("A", "b: c")) == ("A", "b: c")
    assert model.point_of_value(("A: b", "c")) == ("A: b", "c")
    assert model.point_of_value(NOT_PLACED) is None
    with pytest.raises(InputError, match="is not a line point or push point of the plan"):
        model.point_of_value("Nowhere: at all")
