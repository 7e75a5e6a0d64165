"""The stage list beside the board, driven with real mouse and keyboard events."""

from __future__ import annotations

from dataclasses import replace

import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLineEdit

from app.controller import Controller
from app.panels.stage_list import StageList
from core.analysis.stage import stage_result
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


MARK = {"go": "✓ GO", "caution": "! CAUTION", "no-go": "✖ NO-GO"}


def test_rows_follow_the_plan_with_their_verdicts(panel):
    controller, w = panel
    assert w.list.count() == 4
    for i, r in enumerate(w.results):
        assert r.verdict is stage_result(controller.project, i).verdict  # the one result
        text = w.list.item(i).text()
        assert text == f"{i + 1}. {r.stage.name}  [{r.stage.kind}]\n{MARK[r.verdict.status]}"
        for reason in r.verdict.reasons:
            assert reason.text in w.list.item(i).toolTip()


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
    assert w.list.item(1).text().startswith("2. Swing clear of Northern Wren  [swing]")
    controller.undo_stack.undo()
    assert names(controller)[1] == "Swing: bows round to north"

    messages = []
    controller.message.connect(messages.append)
    w.rename_to(1, names(controller)[0])
    assert names(controller)[1] == "Swing: bows round to north"
    assert messages and "is already the name of stage 1" in messages[0]


def test_a_weaker_tug_flags_the_stages_it_fails(panel, qtbot):
    controller, w = panel
    assert not any(r.verdict.status == "no-go" for r in w.results)
    rowan = controller.project.tug("Rowan")
    weak = replace(
        rowan, bollard_pull_n=rowan.bollard_pull_n * 0.2, astern_pull_n=rowan.astern_pull * 0.2
    )
    controller.apply(controller.project.with_tug(weak), "Substitute Rowan")
    qtbot.waitUntil(lambda: any(r.verdict.status == "no-go" for r in w.results), timeout=3000)
    nogo = []
    for i, r in enumerate(w.results):
        assert w.list.item(i).text().endswith(MARK[r.verdict.status])
        if r.verdict.status == "no-go":
            nogo.append(str(i + 1))
            assert w.list.item(i).foreground().color().name() == "#b3261e"
            assert "goal" in w.list.item(i).toolTip()
    assert f"NO-GO: stage {', '.join(nogo)}" in w.summary.text()


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
