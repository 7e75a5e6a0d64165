"""Edits of hulls: outline vertices, line points and push points, the reference point.

Points are in the hull frame (x forward, y to port, m). Functions that build a hull
raise the core's OutlineError / InputError on impossible input; callers show it.
"""

from __future__ import annotations

import math
from dataclasses import replace

from app.edits.tugs import outward_lead
from core.errors import InputError
from core.mechanics.bodies import Member, body_name_of_hull, body_of
from core.model.hull import Fitting, FittingKind, Hull
from core.model.outlines import Outline
from core.model.plan import BodyPose, Project, Stage

Point = tuple[float, float]


def from_body(member: Member, p: Point) -> Point:
    """A body-frame point in the member hull's frame."""
    dx, dy = p[0] - member.x, p[1] - member.y
    c, s = math.cos(member.heading_rad), math.sin(member.heading_rad)
    return (c * dx + s * dy, -s * dx + c * dy)


def moved_vertex(hull: Hull, index: int, p: Point) -> Hull:
    """``hull`` with vertex ``index`` at ``p`` (raises OutlineError if it then crosses itself)."""
    pts = list(hull.outline)
    pts[index] = (float(p[0]), float(p[1]))
    return hull.with_outline(tuple(pts))


def moved_vertex_outline(hull: Hull, index: int, p: Point) -> Outline:
    pts = list(hull.outline)
    pts[index] = (float(p[0]), float(p[1]))
    return tuple(pts)


def inserted_vertex(hull: Hull, edge: int, p: Point) -> Hull:
    """``hull`` with a new vertex at ``p`` on edge ``edge`` (between vertex edge and edge + 1)."""
    pts = list(hull.outline)
    pts.insert(edge + 1, (float(p[0]), float(p[1])))
    return hull.with_outline(tuple(pts))


def deleted_vertex(hull: Hull, index: int) -> Hull:
    """``hull`` without vertex ``index``; an outline keeps at least three vertices."""
    if len(hull.outline) <= 3:
        raise InputError(f"hull {hull.name}: vertex", index, "cannot go: an outline needs three")
    pts = [v for i, v in enumerate(hull.outline) if i != index]
    return hull.with_outline(tuple(pts))


def next_fitting_name(hull: Hull, kind: FittingKind) -> str:
    base = "Line point" if kind == "line" else "Push point"
    names = {f.name for f in hull.fittings}
    n = 1
    while f"{base} {n}" in names:
        n += 1
    return f"{base} {n}"


def added_fitting(hull: Hull, kind: FittingKind, p: Point, name: str | None = None) -> Hull:
    """``hull`` with a new line point or push point at the outline point nearest ``p``."""
    q = hull.geometry.nearest(p[0], p[1])
    fitting = Fitting(
        name or next_fitting_name(hull, kind),
        kind,
        q.x,
        q.y,
        fitting_type="bitt" if kind == "line" else "pushing pad",
    )
    return hull.with_fitting(fitting)


def slid_fitting(hull: Hull, name: str, p: Point) -> Hull:
    """``hull`` with fitting ``name`` moved to the outline point nearest ``p``."""
    q = hull.geometry.nearest(p[0], p[1])
    return hull.with_fitting(hull.fitting(name).moved_to(q.x, q.y))


def slid_fitting_by(hull: Hull, name: str, ds: float) -> Hull:
    """``hull`` with fitting ``name`` moved ``ds`` m along the outline (counter-clockwise)."""
    f = hull.fitting(name)
    q = hull.geometry.nearest(f.x, f.y)
    r = hull.geometry.point_at(q.s + ds)
    return hull.with_fitting(f.moved_to(r.x, r.y))


def without_fitting(project: Project, hull: str, name: str) -> Project:
    """The project without fitting ``name`` of ``hull``, and without the tugs placed there."""
    h = project.hull(hull).without_fitting(name)
    stages = tuple(
        replace(
            s,
            placements=tuple(p for p in s.placements if not (p.hull == hull and p.point == name)),
        )
        for s in project.stages
    )
    return replace(project.with_hull(h), stages=stages)


def stage_numbers(indices: list[int]) -> str:
    """Stage indices (from 0) in words, runs joined: "stage 2", "stages 1-4, 6"."""
    runs: list[list[int]] = []
    for i in sorted(set(indices)):
        if runs and i == runs[-1][-1] + 1:
            runs[-1].append(i)
        else:
            runs.append([i])
    parts = [f"{r[0] + 1}" if len(r) == 1 else f"{r[0] + 1}-{r[-1] + 1}" for r in runs]
    word = "stage" if len(indices) == 1 else "stages"
    return f"{word} {', '.join(parts)}"


def fitting_deleted_words(project: Project, hull: str, name: str, verb: str = "Deleted") -> str:
    """What deleting fitting ``name`` of ``hull`` does, in words (for the undo step and the
    status bar): "Deleted Bow bitt; let go Gannet in stages 1-4, Tern in stage 2"."""
    where: dict[str, list[int]] = {}
    for i, s in enumerate(project.stages):
        for p in s.placements:
            if (p.hull, p.point) == (hull, name):
                where.setdefault(p.tug, []).append(i)
    if not where:
        return f"{verb} {name}"
    tugs = ", ".join(f"{tug} in {stage_numbers(stages)}" for tug, stages in where.items())
    return f"{verb} {name}; let go {tugs}"


def renamed_fitting(project: Project, hull: str, old: str, new: str) -> Project:
    """Rename a fitting and every placement that works at it."""
    h = project.hull(hull)
    h.fitting(old)  # raises a clear InputError when there is no such fitting
    if new != old and any(x.name == new for x in h.fittings):
        raise InputError(f"hull {hull}: fitting name", new, "is used twice")
    fittings = tuple(replace(x, name=new) if x.name == old else x for x in h.fittings)
    h2 = replace(h, fittings=fittings)
    stages = tuple(
        replace(
            s,
            placements=tuple(
                replace(p, point=new) if (p.hull == hull and p.point == old) else p
                for p in s.placements
            ),
        )
        for s in project.stages
    )
    return replace(project.with_hull(h2), stages=stages)


def edited_fitting(project: Project, hull: str, old: str, fitting: Fitting) -> Project:
    """The project with fitting ``old`` of ``hull`` replaced by ``fitting``.

    A new name follows into every placement at the fitting (:func:`renamed_fitting`); the
    position is snapped onto the outline; a line point turned into a push point (or back)
    loses its permitted line angles, and the tugs working there are re-led square to the
    hull (a towline lead means nothing as a push angle).
    """
    if fitting.name != old:
        project = renamed_fitting(project, hull, old, fitting.name)
    h = project.hull(hull)
    was = h.fitting(fitting.name)
    if fitting.kind == "push" and fitting.permitted_lead_rad is not None:
        fitting = replace(fitting, permitted_lead_rad=None)
    q = h.geometry.nearest(fitting.x, fitting.y)
    project = project.with_hull(h.with_fitting(fitting.moved_to(q.x, q.y)))
    if was.kind == fitting.kind:
        return project
    return _re_led(project, hull, fitting.name)


def _re_led(project: Project, hull: str, point: str) -> Project:
    """Every placement at ``point`` led square to the hull: a line straight out, a push
    square on."""
    body = body_of(project, body_name_of_hull(project, hull))
    kind = project.hull(hull).fitting(point).kind
    lead = outward_lead(body, hull, point) if kind == "line" else 0.0
    stages = tuple(
        replace(
            s,
            placements=tuple(
                p.with_lead(lead) if (p.hull == hull and p.point == point) else p
                for p in s.placements
            ),
        )
        for s in project.stages
    )
    return replace(project, stages=stages)


def with_pose(stage: Stage, pose: BodyPose) -> Stage:
    """``stage`` with ``pose`` replacing the pose of the same body (or added)."""
    poses = tuple(p for p in stage.poses if p.body != pose.body)
    return replace(stage, poses=(*poses, pose))


def with_reference_at(project: Project, hull: str, x: float, y: float) -> Project:
    """Move ``hull``'s reference point to hull-frame (x, y) without moving it in the site.

    Every coordinate of the hull becomes relative to the new origin; each stage's pose
    of the hull moves by the same amount, so the hull stays where it lies. A hull in a
    lashed group is refused (its place is set by the group).
    """
    if project.group_of(hull) is not None:
        raise InputError(
            f"hull {hull}: reference point", (x, y), "of a lashed hull is set by its group"
        )
    h = project.hull(hull).shifted(x, y)
    stages = []
    for s in project.stages:
        poses = []
        found = False
        for p in s.poses:
            if p.body == hull:
                found = True
                a = math.radians(90.0 - p.heading_deg)  # site angle of the bow
                c, sn = math.cos(a), math.sin(a)
                p = replace(p, x=p.x + c * x - sn * y, y=p.y + sn * x + c * y)
            poses.append(p)
        if not found:  # no pose: the hull lay at the origin, bow east
            poses.append(BodyPose(hull, x, y, 90.0))
        stages.append(replace(s, poses=tuple(poses)))
    return replace(project.with_hull(h), stages=tuple(stages))


def renamed_hull(project: Project, old: str, new: str) -> Project:
    """Rename a hull and every reference to it (placements, poses, lashed groups)."""
    new = new.strip()
    if new != old and (
        any(h.name == new for h in project.hulls) or any(g.name == new for g in project.groups)
    ):
        raise InputError("hull name", new, "is used twice")
    h = replace(project.hull(old), name=new)
    stages = tuple(
        replace(
            s,
            placements=tuple(replace(p, hull=new) if p.hull == old else p for p in s.placements),
            poses=tuple(replace(p, body=new) if p.body == old else p for p in s.poses),
        )
        for s in project.stages
    )
    groups = tuple(
        replace(g, members=tuple(replace(m, hull=new) if m.hull == old else m for m in g.members))
        for g in project.groups
    )
    return replace(project.with_hull(h, old_name=old), stages=stages, groups=groups)
