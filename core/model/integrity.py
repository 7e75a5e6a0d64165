"""Names that must name something: the plan's cross references, checked as a whole.

A plan refers to its own parts by name: a lashed group lists hulls, a stage poses
bodies (hulls and groups), and a placement names a tug, a hull and one of that hull's
fittings. The file reader refuses a file where such a name names nothing (with the
path of the entry). The window builds plans by edits instead, and an edit made from a
stale view (a dialog, a menu or a drag that outlived the plan it was opened on) could
name a hull the plan no longer has. :func:`broken_reference` is the rule for those
values: the controller asks it before taking any edit, so the window never holds a
plan its own file would refuse.
"""

from __future__ import annotations

from core.errors import InputError
from core.model.plan import Project, Stage


def broken_reference(project: Project, before: Project | None = None) -> InputError | None:
    """The first name in ``project`` that names nothing in it, as an error; None if none.

    ``before`` is the value the edit started from, assumed whole: when the hulls, groups
    and tugs are the same tuples, only the stages that are not the same objects are
    looked at (a drag changes one stage; the check stays cheap on large plans).
    """
    same_parts = (
        before is not None
        and project.hulls is before.hulls
        and project.groups is before.groups
        and project.tugs is before.tugs
    )
    fittings = {h.name: {f.name for f in h.fittings} for h in project.hulls}
    if not same_parts:
        for g in project.groups:
            for m in g.members:
                if m.hull not in fittings:
                    return InputError(
                        f"group {g.name}: member", m.hull, "is not a hull of this plan"
                    )
    old = set() if not same_parts or before is None else {id(s) for s in before.stages}
    bodies = set(fittings) | {g.name for g in project.groups}
    tugs = {t.name for t in project.tugs}
    for stage in project.stages:
        if id(stage) in old:
            continue
        problem = _stage_problem(stage, bodies, tugs, fittings)
        if problem is not None:
            return problem
    return None


def _stage_problem(
    stage: Stage, bodies: set[str], tugs: set[str], fittings: dict[str, set[str]]
) -> InputError | None:
    where = f"stage {stage.name}"
    for pose in stage.poses:
        if pose.body not in bodies:
            return InputError(f"{where}: pose", pose.body, "is not a hull or group of this plan")
    placed: set[str] = set()
    for p in stage.placements:
        if p.tug not in tugs:
            return InputError(f"{where}: tug", p.tug, "is not a tug of this plan")
        if p.tug in placed:
            return InputError(f"{where}: tug", p.tug, "is placed twice in this stage")
        placed.add(p.tug)
        points = fittings.get(p.hull)
        if points is None:
            return InputError(f"{where}: {p.tug}'s hull", p.hull, "is not a hull of this plan")
        if p.point not in points:
            return InputError(
                f"{where}: {p.tug}'s point", p.point, f"is not a fitting of hull {p.hull}"
            )
    return None
