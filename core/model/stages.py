"""Editing the plan's ordered list of stages: add, duplicate, reorder, rename, delete.

Stages are addressed by their index in :attr:`Project.stages` (the order of the move).
Every edit returns a new project; no stage stores results, so a stage copied from
another and then changed is analysed afresh from its own value and can never keep
the results of the stage it was copied from.
"""

from __future__ import annotations

import re
from dataclasses import replace

from core.errors import InputError
from core.model.conditions import Conditions
from core.model.goals import default_goal
from core.model.plan import Project, Stage, StageLimits

_COPY = re.compile(r"^(?P<base>.*?) \(copy(?: (?P<n>\d+))?\)$")


def _check_index(project: Project, index: int, what: str = "stage") -> None:
    n = len(project.stages)
    if not (isinstance(index, int) and 0 <= index < n):
        raise InputError(
            what,
            index,
            "is not a stage of this plan" if n == 0 else f"must be a stage number from 1 to {n}",
        )


def unique_stage_name(project: Project, wanted: str, ignore: int | None = None) -> str:
    """``wanted`` if no other stage has that name, else ``wanted (2)``, ``wanted (3)``...

    ``ignore`` is the index of a stage whose own name does not count (for a rename).
    """
    wanted = wanted.strip() or "Stage"
    taken = {s.name for i, s in enumerate(project.stages) if i != ignore}
    if wanted not in taken:
        return wanted
    n = 2
    while f"{wanted} ({n})" in taken:
        n += 1
    return f"{wanted} ({n})"


def copy_name(project: Project, name: str) -> str:
    """The name of a copy of stage ``name``: ``name (copy)``, then ``name (copy 2)``..."""
    m = _COPY.match(name)
    base = m.group("base") if m else name
    taken = {s.name for s in project.stages}
    candidate = f"{base} (copy)"
    n = 2
    while candidate in taken:
        candidate = f"{base} (copy {n})"
        n += 1
    return candidate


def add_stage(
    project: Project, after: int | None = None, name: str = "", kind: str = "other"
) -> tuple[Project, int]:
    """Insert a new stage after stage ``after`` (default: at the end).

    The new stage starts where the stage before it leaves off: the same body poses
    and conditions, no tugs made fast yet, and the goal its kind implies
    (:func:`core.model.goals.default_goal`). Returns the new project and the new index.
    """
    if after is None:
        after = len(project.stages) - 1
    elif project.stages:
        _check_index(project, after)
    else:
        after = -1
    prev = project.stages[after] if after >= 0 else None
    default = f"Stage {len(project.stages) + 1}"
    stage = Stage(
        name=unique_stage_name(project, name or default),
        kind=kind,
        poses=prev.poses if prev is not None else (),
        conditions=prev.conditions if prev is not None else Conditions(),
        limits=prev.limits if prev is not None else StageLimits(),
        goal=default_goal(kind),
    )
    stages = list(project.stages)
    stages.insert(after + 1, stage)
    return project.with_stages(tuple(stages)), after + 1


def duplicate_stage(project: Project, index: int) -> tuple[Project, int]:
    """A copy of stage ``index`` under a new unique name, placed right after it."""
    _check_index(project, index)
    original = project.stages[index]
    copy = replace(original, name=copy_name(project, original.name))
    stages = list(project.stages)
    stages.insert(index + 1, copy)
    return project.with_stages(tuple(stages)), index + 1


def move_stage(project: Project, index: int, to: int) -> Project:
    """Move stage ``index`` so that it ends up at position ``to`` (both 0-based)."""
    _check_index(project, index)
    _check_index(project, to, "new position")
    stages = list(project.stages)
    stage = stages.pop(index)
    stages.insert(to, stage)
    return project.with_stages(tuple(stages))


def rename_stage(project: Project, index: int, name: str) -> Project:
    """Give stage ``index`` a new name; raises InputError if empty or taken."""
    _check_index(project, index)
    new = name.strip()
    if not new:
        raise InputError("stage name", name, "must not be empty")
    clash = next((i for i, s in enumerate(project.stages) if s.name == new and i != index), None)
    if clash is not None:
        raise InputError("stage name", new, f"is already the name of stage {clash + 1}")
    return project.with_stage(replace(project.stages[index], name=new), index)


def delete_stage(project: Project, index: int) -> Project:
    """The plan without stage ``index``."""
    _check_index(project, index)
    return project.with_stages(project.stages[:index] + project.stages[index + 1 :])


def stage_index(project: Project, name: str) -> int:
    """Index of the stage called ``name``; raises InputError if there is none."""
    for i, s in enumerate(project.stages):
        if s.name == name:
            return i
    raise InputError("stage", name, "does not exist")
