"""Edits of a placement's working sector and of push-pull, in the words of the tugs table.

The core keeps a sector as (low, high) leads, counter-clockwise, in the placement's own
frame (core.model.tugs.Placement: the hull's ahead at a line point, the inward normal at a
push point). People read it as the tugs table reads a lead: relative bearings of the
tug's force on the body, clockwise from ahead. Counter-clockwise from low to high is
clockwise from high to low, so the sector runs clockwise from the bearing of ``high``
("from") to the bearing of ``low`` ("to").
"""

from __future__ import annotations

import math
from dataclasses import replace

from core.errors import InputError
from core.frames import angle_to_bearing, bearing_to_angle
from core.mechanics.balance import lead_frame
from core.mechanics.bodies import Body
from core.model.tugs import Placement

TAU = 2 * math.pi
#: Words a person may type into a sector cell for the whole circle.
WHOLE_WORDS = ("whole", "whole circle", "all round")


def sector_bearings(body: Body, placement: Placement) -> tuple[float, float, float] | None:
    """(from, to, width) of the placement's sector, degrees: relative bearings of the
    force on the body, clockwise from ``from`` to ``to``; None without a sector."""
    sector = placement.lead_sector_rad
    if sector is None:
        return None
    frame = lead_frame(body, placement)
    lo, hi = sector
    return (
        angle_to_bearing(frame + hi),
        angle_to_bearing(frame + lo),
        math.degrees(hi - lo),
    )


def is_whole_circle(placement: Placement) -> bool:
    return placement.sector_width_rad >= TAU - 1e-9


def with_sector_bearings(
    body: Body, placement: Placement, from_deg: float, to_deg: float
) -> Placement:
    """The placement whose sector runs clockwise from bearing ``from_deg`` to ``to_deg``
    (relative bearings of the force on the body, degrees); equal bearings: no width."""
    frame = lead_frame(body, placement)
    width = math.radians((to_deg - from_deg) % 360.0)
    low = bearing_to_angle(to_deg) - frame
    return placement.with_sector((low, low + width))


def whole_circle(placement: Placement) -> Placement:
    """The placement free to take any lead (a tug made fast at a push point, say)."""
    return placement.with_sector((placement.lead_rad - math.pi, placement.lead_rad + math.pi))


def about_lead(placement: Placement, half_width_deg: float) -> Placement:
    """A sector ``half_width_deg`` either side of the lead as set."""
    half = math.radians(half_width_deg)
    return placement.with_sector((placement.lead_rad - half, placement.lead_rad + half))


def with_limit(
    body: Body, placement: Placement, which: str, bearing_deg: float | None
) -> Placement:
    """The placement with one limit of its sector typed: ``which`` is "from" or "to";
    None takes the sector away (the lead is kept as set). Without a sector, the other
    limit is the lead as set; from a whole circle, the other limit stays where it was."""
    if bearing_deg is None:
        return placement.with_sector(None)
    if which not in ("from", "to"):
        raise InputError("sector limit", which, "is not 'from' or 'to'")
    now = sector_bearings(body, placement)
    if now is None:
        lead = angle_to_bearing(lead_frame(body, placement) + placement.lead_rad)
        start, end = lead, lead
    else:
        start, end, _ = now
    if which == "from":
        start = bearing_deg
    else:
        end = bearing_deg
    return with_sector_bearings(body, placement, start, end)


def with_push_pull(placement: Placement, is_push_point: bool, on: bool) -> Placement:
    """The placement made fast at its push point (push-pull) or only pushing."""
    if on and not is_push_point:
        raise InputError(
            f"tug {placement.tug}: push-pull", placement.point, "applies at a push point only"
        )
    return replace(placement, push_pull=bool(on))
