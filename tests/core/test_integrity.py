"""The plan's cross references: the rule the window's edits meet, and the file's agreement."""

from __future__ import annotations

from dataclasses import replace

import pytest
from hypothesis import given, settings

from core.errors import ProjectFileError
from core.io.projectfile import dumps, load, loads
from core.model.integrity import broken_reference
from core.model.plan import BodyPose, Project
from tests.conftest import SAMPLES
from tests.plan_strategies import plans

TWIN = SAMPLES / "twin_barge_move.towboard"


def _first_stage(project: Project, **changes: object) -> Project:
    return project.with_stage(replace(project.stages[0], **changes), 0)


def _broken_variants(project: Project) -> dict[str, Project]:
    """One plan per kind of name that names nothing, each from a whole plan."""
    stage = project.stages[0]
    p0 = stage.placements[0]
    return {
        "pose": _first_stage(project, poses=(*stage.poses, BodyPose("Gone 1", 0.0, 0.0, 90.0))),
        "tug": _first_stage(project, placements=(replace(p0, tug="Gone 2"),)),
        "hull": _first_stage(project, placements=(replace(p0, hull="Gone 3"),)),
        "point": _first_stage(project, placements=(replace(p0, point="Gone 4"),)),
        "twice": _first_stage(project, placements=(p0, p0)),
    }


def test_the_samples_are_whole(sample_paths: list) -> None:
    for path in sample_paths:
        assert broken_reference(load(path)) is None, path.name


@settings(max_examples=40, deadline=None)
@given(plans())
def test_every_generated_plan_is_whole(project: Project) -> None:
    assert broken_reference(project) is None


@pytest.mark.parametrize("kind", ["pose", "tug", "hull", "point", "twice"])
def test_each_dangling_name_is_found_and_the_file_refuses_it_too(kind: str) -> None:
    project = load(TWIN)
    broken = _broken_variants(project)[kind]
    problem = broken_reference(broken)
    assert problem is not None
    # the rule and the file reader agree: the file refuses the same plan for the same reason
    with pytest.raises(ProjectFileError) as refused:
        loads(dumps(broken))
    reasons = " ".join(p.reason for p in refused.value.problems)
    assert problem.reason in reasons
    assert str(problem.value) in str(refused.value.details())


def test_a_group_member_that_is_no_hull_is_found() -> None:
    from core.model.plan import GroupMember, LashedGroup

    project = load(TWIN)
    stray = replace(
        project,
        groups=(
            LashedGroup(
                "Raft",
                (
                    GroupMember(project.hulls[0].name, 0.0, 0.0, 0.0),
                    GroupMember("Nowhere", 0.0, 30.0, 0.0),
                ),
            ),
        ),
    )
    problem = broken_reference(stray)
    assert problem is not None and problem.value == "Nowhere"


def test_from_a_whole_plan_only_the_stages_edited_are_looked_at() -> None:
    project = load(TWIN)
    broken = _broken_variants(project)["pose"]
    # the broken stage is a new object: found, with or without the plan it came from
    assert broken_reference(broken, project) is not None
    # a plan whose stages are the very objects of the plan it came from is whole by the
    # assumption (its parts unchanged); changing a hull looks at everything again
    assert broken_reference(broken, broken) is None
    renamed = replace(broken, hulls=tuple(reversed(broken.hulls)))
    assert broken_reference(renamed, broken) is not None
