"""Edits of tugs and their placements: drag a tug, change its setting, add or remove one.

Leads follow the core's convention (core.model.tugs.Placement): a line's lead is the
hull-frame angle of the towline from the line point towards the tug; a push's lead
is the angle of the push off the inward normal, kept within +-85 degrees because a
tug cannot push outwards.
"""

from __future__ import annotations

import math
from dataclasses import replace

from core.errors import InputError
from core.frames import bearing_to_angle, wrap_pi
from core.mechanics.bodies import Body
from core.model.plan import Project, Stage
from core.model.tugs import Placement, Tug

Point = tuple[float, float]

#: Largest push angle off the inward normal the board lets a drag set, rad.
MAX_PUSH_ANGLE = math.radians(85.0)
#: Shortest towline a drag may set, m.
MIN_LINE_M = 1.0


def dragged_placement(body: Body, placement: Placement, target: Point) -> Placement:
    """The placement with its tug moved towards ``target`` (body frame, m).

    Line point: the towline runs from the point to ``target`` (lead and length).
    Push point: the tug pushes from ``target`` towards the point (push angle).
    """
    member, fitting = body.fitting(placement.hull, placement.point)
    px, py = member.to_body((fitting.x, fitting.y))
    dx, dy = target[0] - px, target[1] - py
    if math.hypot(dx, dy) < 1e-9:
        return placement
    if fitting.kind == "line":
        # lead is in the hull frame; take the member's heading off the body-frame angle
        lead = wrap_pi(math.atan2(dy, dx) - member.heading_rad)
        return placement.with_lead(lead, max(MIN_LINE_M, math.hypot(dx, dy)))
    nx, ny = body.inward_normal(placement.hull, placement.point)
    push = math.atan2(-dy, -dx)  # from the tug towards the point
    off = wrap_pi(push - math.atan2(ny, nx))
    return placement.with_lead(max(-MAX_PUSH_ANGLE, min(MAX_PUSH_ANGLE, off)))


def clamp_setting(value: float) -> float:
    """A setting kept within 0..1 (0..100 %)."""
    return max(0.0, min(1.0, float(value)))


def with_setting(stage: Stage, tug: str, setting: float) -> Stage:
    return stage.with_placement(stage.placement(tug).with_setting(clamp_setting(setting)))


def lead_from_bearing(body: Body, placement: Placement, bearing_deg: float) -> Placement:
    """The placement whose force on the body points at relative bearing ``bearing_deg``."""
    member, fitting = body.fitting(placement.hull, placement.point)
    angle = bearing_to_angle(bearing_deg)  # body frame
    if fitting.kind == "line":
        return placement.with_lead(wrap_pi(angle - member.heading_rad))
    nx, ny = body.inward_normal(placement.hull, placement.point)
    off = wrap_pi(angle - math.atan2(ny, nx))
    if abs(off) > MAX_PUSH_ANGLE + 1e-9:
        raise InputError(
            f"tug {placement.tug}: push bearing",
            bearing_deg,
            "points more than 85 degrees off square to the hull; a tug cannot push that way",
        )
    return placement.with_lead(off)


def next_tug_name(project: Project, base: str = "Tug") -> str:
    names = {t.name for t in project.tugs}
    n = 1
    while f"{base} {n}" in names:
        n += 1
    return f"{base} {n}"


def copy_name(project: Project, name: str) -> str:
    names = {t.name for t in project.tugs}
    candidate = f"{name} (copy)"
    n = 2
    while candidate in names:
        candidate = f"{name} (copy {n})"
        n += 1
    return candidate


def free_point(project: Project, stage: Stage | None, hull: str | None) -> tuple[str, str] | None:
    """A (hull, fitting) no tug works at in ``stage``, line points first; None if all are taken."""
    taken = {(p.hull, p.point) for p in stage.placements} if stage is not None else set()
    hulls = [project.hull(hull)] if hull is not None else list(project.hulls)
    for kind in ("line", "push"):
        for h in hulls:
            for f in h.fittings:
                if f.kind == kind and (h.name, f.name) not in taken:
                    return h.name, f.name
    return None


def outward_lead(body: Body, hull: str, point: str) -> float:
    """Lead of a line squarely off the hull at a line point (hull-frame angle, rad)."""
    member = body.member(hull)
    nx, ny = body.inward_normal(hull, point)
    return wrap_pi(math.atan2(-ny, -nx) - member.heading_rad)


def with_new_tug(
    project: Project, stage_index: int, tug: Tug, placement: Placement | None
) -> Project:
    """The project with ``tug`` added to the plan and, if given, placed in one stage."""
    p = project.with_tug(tug)
    if placement is not None and p.stages:
        p = p.with_stage(p.stages[stage_index].with_placement(placement), stage_index)
    return p


def duplicated_tug(project: Project, stage_index: int, name: str) -> tuple[Project, str]:
    """A copy of tug ``name`` under a new name (particulars only; it is not placed)."""
    tug = project.tug(name)
    new = replace(tug, name=copy_name(project, name))
    return project.with_tug(new), new.name


def edited_tug(project: Project, old: str, tug: Tug) -> Project:
    """The project with tug ``old`` replaced by ``tug`` (its placements follow a rename)."""
    if tug.name != old and any(t.name == tug.name for t in project.tugs):
        raise InputError("tug name", tug.name, "is used twice")
    project.tug(old)  # a clear InputError when there is no such tug
    return project.with_tug(tug, old_name=old)


def renamed_tug(project: Project, old: str, new: str) -> Project:
    if new != old and any(t.name == new for t in project.tugs):
        raise InputError("tug name", new, "is used twice")
    return project.with_tug(replace(project.tug(old), name=new), old_name=old)
