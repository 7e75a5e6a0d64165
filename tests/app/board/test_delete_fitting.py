"""Deleting a fitting that tugs work at: what is let go is said, in every stage."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

from app.edits.hulls import stage_numbers
from tests.app.board.conftest import view_point
from tests.app.board.test_board_mouse import _pose, _site


def test_stage_numbers_join_runs() -> None:
    assert stage_numbers([1]) == "stage 2"
    assert stage_numbers([0, 1, 2, 3]) == "stages 1-4"
    assert stage_numbers([0, 2, 3, 5]) == "stages 1, 3-4, 6"


def test_delete_a_fitting_on_the_board_says_which_tugs_are_let_go(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    c.set_stage_index(2)
    # the sample: Gannet is made fast at the bow centre bitt in all four stages, and no
    # other tug works there
    placed = [
        [p.tug for p in s.placements if p.point == "Bow centre bitt"] for s in c.project.stages
    ]
    assert placed == [["Gannet"]] * 4
    f = c.project.hull("Kestrel 3").fitting("Bow centre bitt")
    x, y = _site(_pose(window, "Kestrel 3"), (f.x, f.y))
    window.view.fit_to_hull()
    qtbot.mouseClick(
        window.view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(window.view, x, y)
    )
    assert window.board.selection == ("fitting", "Kestrel 3", "Bow centre bitt")
    window.view.setFocus()
    QTest.keyClick(window.view.viewport(), Qt.Key.Key_Delete)
    words = "Deleted Bow centre bitt; let go Gannet in stages 1-4"
    assert window.statusBar().currentMessage() == words
    assert c.undo_stack.undoText() == words
    assert all("Gannet" not in [p.tug for p in s.placements] for s in c.project.stages)
