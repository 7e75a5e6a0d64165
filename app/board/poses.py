"""Where each body lies on the board: its pose in the site frame (x east, y north, m)."""

from __future__ import annotations

import math

from core.frames import true_to_site_angle
from core.model.plan import BodyPose, Stage

#: A body with no pose in the stage lies at the site origin with its bow to the east.
DEFAULT_HEADING_DEG = 90.0


def pose_in(stage: Stage | None, body: str) -> BodyPose:
    """The stage's pose of ``body``; a missing pose is (0, 0) heading 090 (bow east)."""
    if stage is not None:
        for p in stage.poses:
            if p.body == body:
                return p
    return BodyPose(body, 0.0, 0.0, DEFAULT_HEADING_DEG)


def site_angle_deg(pose: BodyPose) -> float:
    """Angle of the body's +x axis in the site frame, degrees counter-clockwise from east."""
    return math.degrees(true_to_site_angle(pose.heading_deg))


def to_site(pose: BodyPose, p: tuple[float, float]) -> tuple[float, float]:
    """A body-frame point in the site frame."""
    a = math.radians(site_angle_deg(pose))
    c, s = math.cos(a), math.sin(a)
    return (pose.x + c * p[0] - s * p[1], pose.y + s * p[0] + c * p[1])


def to_body(pose: BodyPose, p: tuple[float, float]) -> tuple[float, float]:
    """A site-frame point in the body frame."""
    a = math.radians(site_angle_deg(pose))
    c, s = math.cos(a), math.sin(a)
    dx, dy = p[0] - pose.x, p[1] - pose.y
    return (c * dx + s * dy, -s * dx + c * dy)


def direction_to_body(pose: BodyPose, v: tuple[float, float]) -> tuple[float, float]:
    a = math.radians(site_angle_deg(pose))
    c, s = math.cos(a), math.sin(a)
    return (c * v[0] + s * v[1], -s * v[0] + c * v[1])
