"""Edits of where bodies lie: move and turn a body in a stage, lash and unlash hulls, and
set where each hull lies in its lashed group.

A body's pose is the site position (x east, y north, m) of its frame's origin and the
true heading of its +x axis (its bow). A lashed group's pose may be written for the
group or for one of its hulls; an edit keeps the form the stage had, so a file that
posed a member keeps posing it.
"""

from __future__ import annotations

import math
from dataclasses import replace

from core.errors import InputError
from core.frames import site_angle_to_true, true_to_site_angle
from core.mechanics.bodies import body_of
from core.mechanics.site import Placing, body_pose
from core.model.plan import BodyPose, GroupMember, LashedGroup, Project, Stage

Point = tuple[float, float]


def _clean(v: float, places: int) -> float:
    """``v`` rounded to ``places`` decimals, never -0.0 (a pose reads as typed)."""
    r = round(v, places)
    return 0.0 if r == 0 else r


def _heading(deg: float) -> float:
    """A true heading in [0, 360), rounded to 1e-9 degree."""
    r = _clean(deg % 360.0, 9)
    return 0.0 if r >= 360.0 else r


def posed(project: Project, stage: Stage, pose: BodyPose) -> Stage:
    """``stage`` with body ``pose.body`` lying at ``pose``.

    A group posed through one of its hulls keeps that form: the hull's pose is written
    so that the group lies at ``pose``. A body with no pose gets one.
    """
    name = pose.body
    if any(p.body == name for p in stage.poses):
        return replace(stage, poses=tuple(pose if p.body == name else p for p in stage.poses))
    group = next((g for g in project.groups if g.name == name), None)
    if group is not None:
        for i, p in enumerate(stage.poses):
            member = next((m for m in group.members if m.hull == p.body), None)
            if member is None:
                continue
            placing = Placing.of(pose)
            hx, hy = placing.point((member.x, member.y))
            heading = site_angle_to_true(placing.angle_rad + member.heading_rad)
            poses = list(stage.poses)
            poses[i] = BodyPose(p.body, hx, hy, heading)
            return replace(stage, poses=tuple(poses))
    return replace(stage, poses=(*stage.poses, pose))


def moved_body(project: Project, stage: Stage, body: str, to: Point) -> Stage:
    """``stage`` with ``body``'s reference point at site point ``to`` (m), heading kept."""
    old = body_pose(project, stage, body)
    return posed(
        project, stage, BodyPose(body, _clean(to[0], 6), _clean(to[1], 6), old.heading_deg)
    )


def shifted_body(project: Project, stage: Stage, body: str, dx: float, dy: float) -> Stage:
    """``stage`` with ``body`` moved by (dx east, dy north), m."""
    old = body_pose(project, stage, body)
    return moved_body(project, stage, body, (old.x + dx, old.y + dy))


def turned_body(
    project: Project, stage: Stage, body: str, heading_deg: float, about: Point | None = None
) -> Stage:
    """``stage`` with ``body`` turned to true ``heading_deg`` about site point ``about``.

    The default pivot is the body's centroid, so the body turns where it lies. The
    point ``about`` stays where it is in the site.
    """
    old = body_pose(project, stage, body)
    b = body_of(project, body)
    before = Placing.of(old)
    pivot_site = about if about is not None else before.point(b.centroid)
    pivot_body = before.to_body(pivot_site)
    heading = _heading(heading_deg)
    after = Placing(0.0, 0.0, true_to_site_angle(heading))
    rx, ry = after.direction(pivot_body)
    x, y = pivot_site[0] - rx, pivot_site[1] - ry
    return posed(project, stage, BodyPose(body, _clean(x, 6), _clean(y, 6), heading))


def lashed(project: Project, stage_index: int, hulls: tuple[str, ...], name: str) -> Project:
    """``project`` with ``hulls`` lashed into a group called ``name``, as they lie in a stage.

    The group's frame is the first hull's frame; each other hull keeps where it lies
    relative to the first in stage ``stage_index``. In every stage the group then lies
    where the first hull lay (hulls that lay elsewhere in other stages follow it).
    Hulls already lashed, or fewer than two, are refused.
    """
    if len(hulls) < 2:
        raise InputError("lash", hulls, "needs two or more hulls")
    taken = {h.name for h in project.hulls} | {g.name for g in project.groups}
    name = name.strip()
    if not name:
        raise InputError("group name", name, "must not be empty")
    if name in taken:
        raise InputError("group name", name, "is used twice")
    for h in hulls:
        project.hull(h)  # raises for an unknown hull
        if project.group_of(h) is not None:
            raise InputError("lash", h, f"is already lashed in {project.group_of(h).name}")  # type: ignore[union-attr]
    stage = project.stages[stage_index]
    first = Placing.of(body_pose(project, stage, hulls[0]))
    members = [GroupMember(hulls[0])]
    for h in hulls[1:]:
        p = body_pose(project, stage, h)
        x, y = first.to_body((p.x, p.y))
        angle = true_to_site_angle(p.heading_deg) - first.angle_rad
        a = math.atan2(math.sin(angle), math.cos(angle))
        members.append(GroupMember(h, _clean(x, 6), _clean(y, 6), _clean(a, 12)))
    group = LashedGroup(name, tuple(members))
    stages = []
    for s in project.stages:
        lead = body_pose(project, s, hulls[0])
        poses = tuple(p for p in s.poses if p.body not in hulls)
        stages.append(replace(s, poses=(*poses, replace(lead, body=name))))
    return replace(project, groups=(*project.groups, group), stages=tuple(stages))


def unlashed(project: Project, group: str) -> Project:
    """``project`` with ``group`` let go into its hulls, each lying where it lay in the group."""
    g = next((x for x in project.groups if x.name == group), None)
    if g is None:
        raise InputError("group", group, "does not exist")
    stages = []
    for s in project.stages:
        pose = body_pose(project, s, group)
        placing = Placing.of(pose)
        members = {m.hull for m in g.members}
        poses = [p for p in s.poses if p.body != group and p.body not in members]
        for m in g.members:
            x, y = placing.point((m.x, m.y))
            heading = site_angle_to_true(placing.angle_rad + m.heading_rad)
            poses.append(BodyPose(m.hull, _clean(x, 6), _clean(y, 6), _heading(heading)))
        stages.append(replace(s, poses=tuple(poses)))
    groups = tuple(x for x in project.groups if x.name != group)
    return replace(project, groups=groups, stages=tuple(stages))


def relashed(
    project: Project, group: str, offsets: dict[str, tuple[float, float, float]]
) -> Project:
    """``project`` with the hulls of ``group`` lashed at new offsets in the group's frame.

    ``offsets`` maps a member hull to (x forward, y to port, m; heading, rad CCW from the
    group's +x), in the frame of the first member, which owns the frame and stays at 0,
    0, 0 (an offset given for it other than that is refused). Members not named keep
    theirs. The group's frame stays where it lies in every stage, so a member moves by
    its change of offset; a stage that poses the group through one of its hulls gets
    that hull's pose written again to keep it so.
    """
    g = next((x for x in project.groups if x.name == group), None)
    if g is None:
        raise InputError("group", group, "does not exist")
    hulls = [m.hull for m in g.members]
    for hull, (x, y, a) in offsets.items():
        if hull not in hulls:
            raise InputError(f"group {group}: member", hull, "is not one of its hulls")
        if hull == hulls[0] and (x, y, a) != (0.0, 0.0, 0.0):
            raise InputError(
                f"group {group}: {hull}", (x, y, a), "owns the group's frame: it lies at 0, 0, 0"
            )
    members = tuple(
        m if m.hull not in offsets else GroupMember(m.hull, *offsets[m.hull]) for m in g.members
    )
    if members == g.members:
        return project
    new = replace(
        project,
        groups=tuple(replace(x, members=members) if x is g else x for x in project.groups),
    )
    stages = []
    for s in project.stages:
        if any(p.body in hulls for p in s.poses):
            s = posed(new, s, replace(body_pose(project, s, group), body=group))
        stages.append(s)
    return replace(new, stages=tuple(stages))


def renamed_group(project: Project, old: str, new: str) -> Project:
    """Rename lashed group ``old`` and the stages' poses of it (a group is a body: its poses
    go by its name)."""
    new = new.strip()
    if not any(g.name == old for g in project.groups):
        raise InputError("group", old, "does not exist")
    if new != old and (
        any(h.name == new for h in project.hulls) or any(g.name == new for g in project.groups)
    ):
        raise InputError("group name", new, "is used twice")
    groups = tuple(replace(g, name=new) if g.name == old else g for g in project.groups)
    stages = tuple(
        replace(s, poses=tuple(replace(p, body=new) if p.body == old else p for p in s.poses))
        for s in project.stages
    )
    return replace(project, groups=groups, stages=stages)


def group_name(project: Project, hulls: tuple[str, ...]) -> str:
    """A free name for a group of ``hulls``: "<first> + <second>", numbered if taken."""
    taken = {h.name for h in project.hulls} | {g.name for g in project.groups}
    base = " + ".join(hulls[:2]) + (" + …" if len(hulls) > 2 else "")
    name, n = base, 2
    while name in taken:
        name = f"{base} ({n})"
        n += 1
    return name
