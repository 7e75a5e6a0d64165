"""An edit made from a stale view never gives the window a plan its own file refuses.

A dialog, a menu or a table row opened on one plan can hand the controller an edit after
the plan was replaced (File > New, Open): the edit then names a hull, a body or a tug the
plan no longer has. The controller refuses it, whichever view it comes from, and the plan
stays as it was.
"""

from __future__ import annotations

from dataclasses import replace

import pytest

from app.controller import Controller
from core.errors import InputError
from core.io.projectfile import dumps, load, loads
from core.model.plan import BodyPose, Project, Stage
from tests.conftest import SAMPLES


def _fresh_plan() -> Project:
    """What File > New gives: no hulls, no tugs, one empty stage."""
    return Project(stages=(Stage("Stage 1"),))


@pytest.fixture
def controller(qapp) -> Controller:  # type: ignore[no-untyped-def]
    c = Controller()
    c.reset(load(SAMPLES / "twin_barge_move.towboard"))
    return c


def test_a_pose_for_a_body_of_the_plan_before_is_refused(controller: Controller) -> None:
    stale_body = controller.project.hulls[0].name
    controller.reset(_fresh_plan())
    before = controller.project
    stage = controller.stage
    assert stage is not None
    stale = controller.with_stage(replace(stage, poses=(BodyPose(stale_body, 5.0, 5.0, 90.0),)))
    with pytest.raises(InputError, match="is not a hull or group of this plan"):
        controller.apply(stale, "Move")
    with pytest.raises(InputError):
        controller.preview(stale)
    assert controller.project is before
    assert controller.undo_stack.count() == 0
    loads(dumps(controller.project))  # what the window holds, its file holds


def test_a_placement_of_a_tug_no_longer_in_the_plan_is_refused(controller: Controller) -> None:
    stage = controller.stage
    assert stage is not None
    gone = stage.placements[0].tug
    without = controller.project.without_tug(gone)
    controller.apply(without, "Delete tug")
    assert controller.undo_stack.count() == 1
    # the tugs table's row, opened before the delete, sets that tug's pull
    stale = controller.with_stage(
        controller.stage.with_placement(replace(stage.placements[0], setting=0.5))  # type: ignore[union-attr]
    )
    with pytest.raises(InputError, match="is not a tug of this plan"):
        controller.apply(stale, "Set pull")
    assert controller.project is without or controller.project == without
    assert controller.undo_stack.count() == 1


def test_whole_edits_and_drags_still_go_through(controller: Controller) -> None:
    stage = controller.stage
    assert stage is not None
    pose = stage.poses[0]
    moved = replace(pose, x=pose.x + 10.0)
    new = controller.with_stage(
        replace(stage, poses=tuple(moved if p is pose else p for p in stage.poses))
    )
    controller.preview(new)
    controller.commit_preview("Move")
    assert controller.project == new
    assert controller.undo_stack.count() == 1
