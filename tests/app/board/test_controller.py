"""The controller: one value, undo as a swap, drags as one step, merged nudges."""

from __future__ import annotations

from dataclasses import replace

import pytest

from app.controller import Controller
from core.io.projectfile import load
from tests.app.board.conftest import SAMPLE


@pytest.fixture
def controller(qtbot):  # type: ignore[no-untyped-def]
    return Controller(load(SAMPLE))


def _with_setting(c: Controller, tug: str, value: float):  # type: ignore[no-untyped-def]
    stage = c.stage
    return c.with_stage(stage.with_placement(stage.placement(tug).with_setting(value)))


def test_apply_undo_redo_swap_values(controller: Controller) -> None:
    before = controller.project
    after = _with_setting(controller, "Gannet", 0.8)
    controller.apply(after, "Setting")
    assert controller.project is after
    assert controller.dirty
    controller.undo_stack.undo()
    assert controller.project is before
    assert not controller.dirty
    controller.undo_stack.redo()
    assert controller.project is after


def test_changed_only_when_the_value_differs(controller: Controller) -> None:
    seen = []
    controller.changed.connect(lambda: seen.append(1))
    same = replace(controller.project)  # equal, but a new object
    controller.apply(same, "Nothing")
    assert seen == []
    assert controller.undo_stack.count() == 0
    controller.apply(_with_setting(controller, "Gannet", 0.5), "Setting")
    assert seen == [1]


def test_a_previewed_drag_is_one_undo_step(controller: Controller) -> None:
    before = controller.project
    for v in (0.1, 0.2, 0.3, 0.4):
        controller.preview(_with_setting(controller, "Gannet", v))
    assert controller.undo_stack.count() == 0
    assert controller.stage.placement("Gannet").setting == 0.4
    controller.commit_preview("Drag")
    assert controller.undo_stack.count() == 1
    controller.undo_stack.undo()
    assert controller.project == before
    controller.undo_stack.redo()
    assert controller.stage.placement("Gannet").setting == 0.4


def test_cancelled_preview_puts_the_value_back(controller: Controller) -> None:
    before = controller.project
    controller.preview(_with_setting(controller, "Gannet", 0.9))
    controller.cancel_preview()
    assert controller.project is before
    assert controller.undo_stack.count() == 0


def test_consecutive_edits_with_one_key_merge(controller: Controller) -> None:
    was = controller.stage.placement("Gannet").setting  # the sample's value
    for v in (0.46, 0.47, 0.48):
        controller.apply(
            _with_setting(controller, "Gannet", v), "Step", merge_key=("setting", "Gannet")
        )
    controller.apply(
        _with_setting(controller, "Puffin", 0.1), "Step", merge_key=("setting", "Puffin")
    )
    assert controller.undo_stack.count() == 2
    controller.undo_stack.undo()
    controller.undo_stack.undo()
    assert controller.stage.placement("Gannet").setting == was


def test_results_are_the_stage_results_balance(controller: Controller) -> None:
    from core.analysis.stage import compute_stage_result

    b = controller.balance()
    ref = compute_stage_result(controller.project, 0).main
    assert ref is not None and b == ref.balance
    assert [ld.name for ld in b.loads] == ["wind", "current"]  # the stage's conditions
    controller.set_stage_index(1)
    ref = compute_stage_result(controller.project, 1).main
    assert ref is not None and controller.balance() == ref.balance
    assert controller.stage_result() is controller.stage_result()  # worked out once
