"""The stage list beside the board, driven with real mouse and keyboard events."""

from __future__ import annotations

from dataclasses import replace

import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLineEdit

from app.controller import Controller
from app.panels.stage_list import StageList
from core.io.projectfile import load
from tests.conftest import SAMPLES

TWIN = SAMPLES / "twin_barge_move.towboard"


@pytest.fixture
def panel(qtbot):
    controller = Controller(load(TWIN))
    w = StageList(controller)
    qtbot.addWidget(w)
    w.show()
    yield controller, w
    controller.undo_stack.clear()  # while the controller lives, so no signal reaches it dead


def names(controller):
    return [s.name for s in controller.project.stages]


def click_row(qtbot, w, row):
    rect = w.list.visualItemRect(w.list.item(row))
    qtbot.mouseClick(w.list.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())


def test_rows_follow_the_plan_with_their_checks(panel):
    _controller, w = panel
    assert w.list.count() == 4
    for i, c in enumerate(w.checks):
        mark = "✖" if c.fails else "!" if c.warnings else "✓"
        assert w.list.item(i).text() == f"{mark}  {i + 1}. {c.name}  [{c.stage.kind}]"
        for n in c.notices:
            assert n.message in w.list.item(i).toolTip()


def test_clicking_a_row_shows_that_stage(panel, qtbot):
    controller, w = panel
    click_row(qtbot, w, 2)
    assert controller.stage_index == 2
    assert controller.stage.name == "Transit: shift west across the basin"
    controller.set_stage_index(3)  # and the other way round
    assert w.list.currentRow() == 3


def test_add_duplicate_move_delete_and_undo(panel, qtbot):
    controller, w = panel
    start = names(controller)
    qtbot.mouseClick(w.buttons["add"], Qt.MouseButton.LeftButton)
    assert names(controller) == [start[0], "Stage 5", *start[1:]]
    assert controller.stage_index == 1 and w.list.currentRow() == 1
    assert controller.project.stages[1].poses == controller.project.stages[0].poses
    controller.undo_stack.undo()
    assert names(controller) == start

    click_row(qtbot, w, 1)
    qtbot.mouseClick(w.buttons["duplicate"], Qt.MouseButton.LeftButton)
    assert names(controller)[2] == f"{start[1]} (copy)"
    copy = controller.project.stages[2]
    assert replace(copy, name=start[1]) == controller.project.stages[1]
    assert controller.stage_index == 2

    qtbot.mouseClick(w.buttons["up"], Qt.MouseButton.LeftButton)
    assert names(controller)[1] == f"{start[1]} (copy)" and controller.stage_index == 1
    qtbot.mouseClick(w.buttons["down"], Qt.MouseButton.LeftButton)
    assert names(controller)[2] == f"{start[1]} (copy)" and controller.stage_index == 2

    qtbot.mouseClick(w.buttons["delete"], Qt.MouseButton.LeftButton)
    assert names(controller) == start
    controller.undo_stack.undo()
    assert names(controller)[2] == f"{start[1]} (copy)"
    assert w.list.count() == 5


def test_rename_by_typing_and_a_taken_name_is_refused(panel, qtbot):
    controller, w = panel
    click_row(qtbot, w, 1)
    qtbot.keyClick(w.list, Qt.Key.Key_F2)
    editor = w.list.findChild(QLineEdit)
    assert editor is not None and editor.text() == "Swing: bows round to north"
    editor.clear()
    qtbot.keyClicks(editor, "Swing clear of Northern Wren")
    qtbot.keyClick(editor, Qt.Key.Key_Return)  # the view commits the edit on its next turn
    qtbot.waitUntil(lambda: names(controller)[1] == "Swing clear of Northern Wren", timeout=2000)
    assert w.list.item(1).text().endswith("2. Swing clear of Northern Wren  [swing]")
    controller.undo_stack.undo()
    assert names(controller)[1] == "Swing: bows round to north"

    messages = []
    controller.message.connect(messages.append)
    w.rename_to(1, names(controller)[0])
    assert names(controller)[1] == "Swing: bows round to north"
    assert messages and "is already the name of stage 1" in messages[0]


def test_a_weaker_tug_flags_the_stages_it_fails(panel, qtbot):
    controller, w = panel
    assert not any(c.fails for c in w.checks)
    rowan = controller.project.tug("Rowan")
    weak = replace(
        rowan, bollard_pull_n=rowan.bollard_pull_n * 0.2, astern_pull_n=rowan.astern_pull * 0.2
    )
    controller.apply(controller.project.with_tug(weak), "Substitute Rowan")
    qtbot.waitUntil(lambda: any(c.fails for c in w.checks), timeout=3000)
    for i, c in enumerate(w.checks):
        assert w.list.item(i).text().startswith("✖" if c.fails else "!" if c.warnings else "✓")
        if c.fails:
            assert w.list.item(i).foreground().color().name() == "#b3261e"
            assert "goal" in w.list.item(i).toolTip()
    assert "checks." in w.summary.text() and "fail" in w.summary.text()


def test_an_empty_plan(qtbot):
    from core.model.plan import Project

    controller = Controller(Project())
    w = StageList(controller)
    qtbot.addWidget(w)
    assert w.list.count() == 0
    assert not w.buttons["delete"].isEnabled()
    qtbot.mouseClick(w.buttons["add"], Qt.MouseButton.LeftButton)
    assert names(controller) == ["Stage 1"]
    controller.undo_stack.clear()
