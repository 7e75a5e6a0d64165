"""The site: placing bodies by their stage pose, and site features from simple parameters.

Site frame: x east, y north, metres. A body's pose gives the site position of its
frame's origin and the true heading of its +x axis (the bow); a true heading of h
degrees points the +x axis at the site angle pi/2 - radians(h) (counter-clockwise
from east), so the body's +y axis (port) lies 90 degrees to the left of the heading.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import shapely

from core.errors import InputError
from core.frames import true_to_site_angle
from core.mechanics.bodies import Body, body_of
from core.model.plan import BodyPose, Project, SiteFeature, Stage

Point = tuple[float, float]


@dataclass(frozen=True, slots=True)
class Placing:
    """The rigid motion from a body frame to the site frame for one pose."""

    x: float
    y: float
    angle_rad: float  # site angle of the body's +x axis, CCW from east

    @classmethod
    def of(cls, pose: BodyPose) -> Placing:
        return cls(pose.x, pose.y, true_to_site_angle(pose.heading_deg))

    def point(self, p: Point) -> Point:
        """A body-frame point in the site frame."""
        c, s = math.cos(self.angle_rad), math.sin(self.angle_rad)
        return (self.x + c * p[0] - s * p[1], self.y + s * p[0] + c * p[1])

    def direction(self, v: Point) -> Point:
        """A body-frame direction (or force) in the site frame."""
        c, s = math.cos(self.angle_rad), math.sin(self.angle_rad)
        return (c * v[0] - s * v[1], s * v[0] + c * v[1])

    def points(self, pts: np.ndarray) -> np.ndarray:
        """(n, 2) body-frame points -> (n, 2) site-frame points."""
        c, s = math.cos(self.angle_rad), math.sin(self.angle_rad)
        rot = np.array([[c, -s], [s, c]])
        return np.asarray(pts, dtype=float) @ rot.T + np.array([self.x, self.y])

    def to_body(self, p: Point) -> Point:
        """A site-frame point in the body frame (the inverse of :meth:`point`)."""
        c, s = math.cos(self.angle_rad), math.sin(self.angle_rad)
        dx, dy = p[0] - self.x, p[1] - self.y
        return (c * dx + s * dy, -s * dx + c * dy)


def body_pose(project: Project, stage: Stage, body: str) -> BodyPose:
    """The pose of rigid body ``body`` in ``stage``.

    A pose may be given for the body itself or for one hull of a lashed group; in the
    second case the group's pose follows from where that member lies in the group.
    A body with no pose in the stage lies as :meth:`Stage.pose_of` says (at the site
    origin, bow east, as the board draws it).
    """
    for p in stage.poses:
        if p.body == body:
            return p
    group = next((g for g in project.groups if g.name == body), None)
    if group is not None:
        for p in stage.poses:
            member = next((m for m in group.members if m.hull == p.body), None)
            if member is None:
                continue
            hull_angle = true_to_site_angle(p.heading_deg)
            angle = hull_angle - member.heading_rad
            c, s = math.cos(angle), math.sin(angle)
            ox = p.x - (c * member.x - s * member.y)
            oy = p.y - (s * member.x + c * member.y)
            heading = (90.0 - math.degrees(angle)) % 360.0
            return BodyPose(body, ox, oy, heading)
    return stage.pose_of(body)


def posed_bodies(project: Project, stage: Stage) -> tuple[str, ...]:
    """The rigid bodies that have a pose in ``stage`` (directly or through a member)."""
    names: list[str] = []
    for p in stage.poses:
        group = project.group_of(p.body)
        name = group.name if group is not None else p.body
        if name not in names and (name in project.body_names()):
            names.append(name)
    return tuple(names)


@dataclass(frozen=True, slots=True)
class PlacedBody:
    """A body in the site for one stage: its frame, its outline in site coordinates."""

    body: Body
    pose: BodyPose
    placing: Placing
    polygon: shapely.Polygon  # the body's outline (union for a group), site frame

    @property
    def name(self) -> str:
        return self.body.name


def place_body(body: Body, pose: BodyPose) -> PlacedBody:
    placing = Placing.of(pose)
    poly = shapely.transform(body.polygon, placing.points)
    return PlacedBody(body, pose, placing, poly)


def placed_bodies(project: Project, stage: Stage) -> tuple[PlacedBody, ...]:
    """Every body posed in ``stage``, placed in the site."""
    return tuple(
        place_body(body_of(project, name), body_pose(project, stage, name))
        for name in posed_bodies(project, stage)
    )


# -- features from simple parameters ------------------------------------------------------


def _finite_point(field: str, p: Sequence[float]) -> Point:
    try:
        x, y = float(p[0]), float(p[1])
    except (TypeError, ValueError, IndexError):
        raise InputError(field, p, "is not a pair of numbers (x east, y north)") from None
    if not (math.isfinite(x) and math.isfinite(y)):
        raise InputError(field, p, "must be finite")
    return (x, y)


def _positive(field: str, v: float) -> float:
    v = float(v)
    if not (math.isfinite(v) and v > 0):
        raise InputError(field, v, "must be a positive length")
    return v


def quay(name: str, start: Sequence[float], end: Sequence[float]) -> SiteFeature:
    """A straight quay face from ``start`` to ``end`` (site frame, m)."""
    a, b = _finite_point(f"quay {name}: start", start), _finite_point(f"quay {name}: end", end)
    if a == b:
        raise InputError(f"quay {name}: end", end, "must differ from the start")
    return SiteFeature(name, "quay", (a, b))


def dolphin(
    name: str, centre: Sequence[float], size_m: float, shape: str = "round", sides: int = 24
) -> SiteFeature:
    """A dolphin: a circle of diameter ``size_m`` (as a ``sides``-gon) or a square of side ``size_m``.

    The round dolphin's polygon is circumscribed about the circle (its flats touch
    the circle), so a clearance to it is never larger than to the true circle.
    """
    c = _finite_point(f"dolphin {name}: centre", centre)
    size = _positive(f"dolphin {name}: size", size_m)
    pts: tuple[Point, ...]
    if shape == "square":
        h = size / 2
        pts = (
            (c[0] - h, c[1] - h),
            (c[0] + h, c[1] - h),
            (c[0] + h, c[1] + h),
            (c[0] - h, c[1] + h),
        )
    elif shape == "round":
        if sides < 8:
            raise InputError(f"dolphin {name}: sides", sides, "must be 8 or more")
        r = size / 2 / math.cos(math.pi / sides)
        pts = tuple(
            (
                c[0] + r * math.cos(2 * math.pi * k / sides),
                c[1] + r * math.sin(2 * math.pi * k / sides),
            )
            for k in range(sides)
        )
    else:
        raise InputError(f"dolphin {name}: shape", shape, "must be 'round' or 'square'")
    return SiteFeature(name, "dolphin", pts, closed=True)


def moored_vessel(
    name: str,
    centre: Sequence[float],
    heading_deg: float,
    length_m: float,
    beam_m: float,
    bow_m: float = 0.0,
) -> SiteFeature:
    """A moored vessel as a rectangle ``length_m`` x ``beam_m`` centred on ``centre``.

    ``heading_deg`` is the true heading of its bow; ``bow_m`` > 0 tapers the forward
    ``bow_m`` metres to a point, so the drawing shows which way it lies.
    """
    c = _finite_point(f"vessel {name}: centre", centre)
    length = _positive(f"vessel {name}: length", length_m)
    beam = _positive(f"vessel {name}: beam", beam_m)
    if not math.isfinite(heading_deg):
        raise InputError(f"vessel {name}: heading", heading_deg, "must be finite")
    if not (math.isfinite(bow_m) and 0 <= bow_m < length):
        raise InputError(f"vessel {name}: bow length", bow_m, f"must be from 0 to below {length}")
    h, b = length / 2, beam / 2
    if bow_m > 0:
        local = [(-h, -b), (h - bow_m, -b), (h, 0.0), (h - bow_m, b), (-h, b)]
    else:
        local = [(-h, -b), (h, -b), (h, b), (-h, b)]
    placing = Placing(c[0], c[1], true_to_site_angle(heading_deg))
    return SiteFeature(name, "vessel", tuple(placing.point(p) for p in local), closed=True)


def channel(
    name: str, start: Sequence[float], end: Sequence[float], width_m: float
) -> tuple[SiteFeature, SiteFeature]:
    """The two edges of a straight fairway of ``width_m`` along ``start`` -> ``end``.

    Returns the left and right edges (looking from start to end) as open limit lines.
    """
    a = _finite_point(f"channel {name}: start", start)
    b = _finite_point(f"channel {name}: end", end)
    w = _positive(f"channel {name}: width", width_m)
    dx, dy = b[0] - a[0], b[1] - a[1]
    n = math.hypot(dx, dy)
    if n == 0:
        raise InputError(f"channel {name}: end", end, "must differ from the start")
    ox, oy = -dy / n * w / 2, dx / n * w / 2  # to the left
    left = SiteFeature(
        f"{name} (left edge)", "limit", ((a[0] + ox, a[1] + oy), (b[0] + ox, b[1] + oy))
    )
    right = SiteFeature(
        f"{name} (right edge)", "limit", ((a[0] - ox, a[1] - oy), (b[0] - ox, b[1] - oy))
    )
    return left, right


def basin(name: str, corners: Sequence[Sequence[float]]) -> SiteFeature:
    """A closed basin limit: the body must stay inside the polygon ``corners``."""
    pts = tuple(_finite_point(f"basin {name}: corner {i}", p) for i, p in enumerate(corners))
    return SiteFeature(name, "limit", pts, closed=True)


def feature_geometry(feature: SiteFeature) -> shapely.Geometry:
    """The shapely geometry a clearance is measured to.

    Quays and open limits are lines; dolphins and vessels are areas (a body inside one
    has no clearance); a closed limit is its boundary (the body lies inside it).
    """
    if not feature.closed:
        return shapely.LineString(feature.points)
    poly = shapely.Polygon(feature.points)
    return poly.exterior if feature.kind == "limit" else poly
