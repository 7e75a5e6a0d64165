"""Frames, angles and the words for directions.

Inside the core, angles are radians counter-clockwise from +x of their frame (hull
frame: x forward, y to port; site frame: x east, y north). People read relative
bearings (degrees clockwise from ahead) and true bearings (degrees clockwise from
north); these helpers are the only place the two meet.
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from itertools import repeat


def bearing_to_angle(bearing_deg: float) -> float:
    """Relative bearing (deg, clockwise from ahead) -> hull-frame angle (rad, CCW from +x),
    in (-pi, pi]."""
    # wrap_pi(-math.radians(bearing_deg)), written out: the file reader calls this for
    # every placement of a plan.
    a = math.fmod(math.pi - math.radians(bearing_deg), _TAU)
    if a <= 0:
        a += _TAU
    return a - math.pi


def bearings_to_angles(bearings_deg: Iterable[float]) -> list[float]:
    """:func:`bearing_to_angle` of each bearing, the same floats, for a file's column of
    thousands (the steps mapped in C, one Python step left)."""
    pi, tau = math.pi, _TAU
    turned = map(math.fmod, map(pi.__sub__, map(math.radians, bearings_deg)), repeat(tau))
    return [(a + tau if a <= 0 else a) - pi for a in turned]


def angle_to_bearing(angle_rad: float) -> float:
    """Hull-frame angle (rad, CCW from +x) -> relative bearing in [0, 360) deg."""
    b = (-math.degrees(angle_rad)) % 360.0
    return 0.0 if b >= 359.9999999995 else b


def true_to_site_angle(true_deg: float) -> float:
    """True bearing (deg, clockwise from north) -> site angle (rad, CCW from east)."""
    return wrap_pi(math.pi / 2 - math.radians(true_deg))


def site_angle_to_true(angle_rad: float) -> float:
    """Site angle (rad, CCW from east) -> true bearing in [0, 360) deg."""
    b = (90.0 - math.degrees(angle_rad)) % 360.0
    return 0.0 if b >= 359.9999999995 else b


_TAU = 2 * math.pi


def wrap_pi(angle_rad: float) -> float:
    """Angle wrapped to (-pi, pi]."""
    a = math.fmod(angle_rad + math.pi, _TAU)
    if a <= 0:
        a += _TAU
    return a - math.pi


def angle_in_sector(angle_rad: float, low_rad: float, high_rad: float) -> bool:
    """Whether ``angle_rad`` lies in the sector swept counter-clockwise from ``low_rad`` to
    ``high_rad`` (edges included, to a nanoradian)."""
    span = (high_rad - low_rad) % (2 * math.pi)
    off = (angle_rad - low_rad) % (2 * math.pi)
    return off <= span + 1e-9 or off >= 2 * math.pi - 1e-9


def turning_words(moment_nm: float, tolerance_nm: float = 0.0) -> str:
    """Words for a yaw moment: positive (CCW seen from above) swings the bow to port."""
    if abs(moment_nm) <= tolerance_nm:
        return "no swing"
    return "swings bow to port" if moment_nm > 0 else "swings bow to starboard"


def walking_words(fx_n: float, fy_n: float, tolerance_n: float = 0.0) -> str:
    """Words for a net force in the hull frame: ahead/astern and to port/starboard."""
    parts = []
    if abs(fx_n) > tolerance_n:
        parts.append("ahead" if fx_n > 0 else "astern")
    if abs(fy_n) > tolerance_n:
        parts.append("walks to port" if fy_n > 0 else "walks to starboard")
    if not parts:
        return "no net force"
    if len(parts) == 2:
        return f"{parts[1]} and moves {parts[0]}"
    return parts[0] if parts[0].startswith("walks") else f"moves {parts[0]}"
