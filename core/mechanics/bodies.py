"""Rigid bodies: one hull, or several hulls lashed into one group.

A body has its own frame: a single hull's frame, or for a lashed group the frame of
the group (its members' poses are given in it). The solver and the balance work in
the body frame; the board and the briefing place the body in the site by its pose.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
import shapely

from core.errors import InputError
from core.model.hull import Fitting, Hull
from core.model.plan import Project, Stage


def _pair(a: np.ndarray) -> tuple[float, float]:
    return (float(a[0]), float(a[1]))


def rotate(v: tuple[float, float], angle_rad: float) -> tuple[float, float]:
    c, s = math.cos(angle_rad), math.sin(angle_rad)
    return (c * v[0] - s * v[1], s * v[0] + c * v[1])


@dataclass(frozen=True, slots=True)
class Member:
    """A hull in a body, with the pose of its hull frame in the body frame."""

    hull: Hull
    x: float
    y: float
    heading_rad: float

    def to_body(self, p: tuple[float, float]) -> tuple[float, float]:
        """A hull-frame point in the body frame."""
        rx, ry = rotate(p, self.heading_rad)
        return (self.x + rx, self.y + ry)

    def direction_to_body(self, v: tuple[float, float]) -> tuple[float, float]:
        return rotate(v, self.heading_rad)


class Body:
    """A rigid body's outline and mass centre in its own frame (computed once)."""

    __slots__ = (
        "_breadths",
        "_normals",
        "beam",
        "centre_of_gravity",
        "centroid",
        "length",
        "members",
        "name",
        "polygon",
        "x_max",
        "x_min",
    )

    def __init__(self, name: str, members: tuple[Member, ...]) -> None:
        self._normals: dict[tuple[str, str], tuple[float, float]] = {}
        self._breadths: dict[str, float] = {}
        self.name = name
        self.members = members
        polys = [shapely.Polygon([m.to_body(p) for p in m.hull.outline]) for m in members]
        self.polygon = polys[0] if len(polys) == 1 else shapely.union_all(polys)
        areas = np.array([m.hull.geometry.area for m in members])
        cents = np.array([m.to_body(m.hull.centroid) for m in members])  # (k, 2)
        self.centroid = _pair((areas[:, None] * cents).sum(0) / areas.sum())
        masses = [m.hull.displacement_kg for m in members]
        cogs = np.array([m.to_body(m.hull.centre_of_gravity) for m in members])
        if len(members) == 1:
            self.centre_of_gravity = _pair(cogs[0])
        elif all(w is not None for w in masses):
            w = np.array(masses, dtype=float)
            self.centre_of_gravity = _pair((w[:, None] * cogs).sum(0) / w.sum())
        else:  # no displacements to weight by: area stands in for mass
            self.centre_of_gravity = _pair((areas[:, None] * cogs).sum(0) / areas.sum())
        x0, y0, x1, y1 = self.polygon.bounds
        self.x_min, self.x_max = float(x0), float(x1)
        self.length = float(x1 - x0)
        self.beam = float(y1 - y0)

    @property
    def is_group(self) -> bool:
        return len(self.members) > 1

    @property
    def frame_hull(self) -> str | None:
        """For a lashed group, the member whose hull frame is the group's frame (lashing
        makes it the first hull's): its reference point is the origin and its centreline
        the x axis. None for a single hull, or a group whose frame is no member's."""
        if not self.is_group:
            return None
        for m in self.members:
            if abs(m.x) < 1e-6 and abs(m.y) < 1e-6 and abs(m.heading_rad) < 1e-9:
                return m.hull.name
        return None

    @property
    def centreline_words(self) -> str:
        """The line y = 0 of the body frame in words: "the centreline" of a single hull;
        for a group the hull whose centreline it is ("Lark 41's centreline"), since the
        group's own middle may lie well off it."""
        if not self.is_group:
            return "the centreline"
        hull = self.frame_hull
        return f"the {self.name} frame's x axis" if hull is None else f"{hull}'s centreline"

    @property
    def reference_words(self) -> str:
        """The body frame's origin in words: "the hull's reference point" of a single hull;
        for a group the hull whose reference point it is ("Lark 41's reference point")."""
        if not self.is_group:
            return "the hull's reference point"
        hull = self.frame_hull
        return f"the {self.name} frame's origin" if hull is None else f"{hull}'s reference point"

    def member(self, hull: str) -> Member:
        for m in self.members:
            if m.hull.name == hull:
                return m
        raise InputError(f"body {self.name}: hull", hull, "is not part of this body")

    def fitting(self, hull: str, point: str) -> tuple[Member, Fitting]:
        m = self.member(hull)
        return m, m.hull.fitting(point)

    def breadth_of(self, hull: str) -> float:
        """The breadth of member ``hull``: its outline's extent across its own centreline, m."""
        got = self._breadths.get(hull)
        if got is None:  # a body never changes: each member's breadth is worked out once
            ys = [p[1] for p in self.member(hull).hull.outline]
            got = self._breadths[hull] = float(max(ys) - min(ys))
        return got

    def inward_normal(self, hull: str, point: str) -> tuple[float, float]:
        """Unit inward normal of the hull at a fitting, in the body frame."""
        key = (hull, point)
        cached = self._normals.get(key)
        if cached is None:  # a body never changes, so each normal is worked out once
            m, f = self.fitting(hull, point)
            nx, ny = m.hull.geometry.nearest(f.x, f.y).normal
            cached = self._normals[key] = m.direction_to_body((-nx, -ny))
        return cached

    def outlines(self) -> list[list[tuple[float, float]]]:
        """Each member's outline in the body frame (for drawing)."""
        return [[m.to_body(p) for p in m.hull.outline] for m in self.members]


def body_of(project: Project, name: str) -> Body:
    """The rigid body called ``name``: a lashed group, or a hull in no group."""
    for g in project.groups:
        if g.name == name:
            members = tuple(
                Member(project.hull(m.hull), m.x, m.y, m.heading_rad) for m in g.members
            )
            return Body(g.name, members)
    hull = project.hull(name)
    group = project.group_of(name)
    if group is not None:
        return body_of(project, group.name)
    return Body(hull.name, (Member(hull, 0.0, 0.0, 0.0),))


def stage_body(project: Project, stage: Stage, body: str | None = None) -> Body:
    """The body a stage is about: ``body``, or the one its first tug works on."""
    if body is None:
        if stage.placements:
            body = body_name_of_hull(project, stage.placements[0].hull)
        elif project.hulls:
            body = project.body_names()[0]
        else:
            raise InputError(f"stage {stage.name}", "", "has no hull to work on")
    return body_of(project, body)


def body_name_of_hull(project: Project, hull: str) -> str:
    group = project.group_of(hull)
    return group.name if group is not None else hull


def group_frame_words(project: Project) -> str:
    """Whose frame each lashed group's is, in words for the frame note ("for the lashed
    group Lark pair, Lark 41's"); empty for a plan with no group."""
    parts = []
    for g in project.groups:
        hull = body_of(project, g.name).frame_hull
        parts.append(
            f"for the lashed group {g.name}, "
            + ("a frame of its own" if hull is None else f"{hull}'s")
        )
    return "; ".join(parts)
