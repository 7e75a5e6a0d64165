"""The shapes of the plan, in plain numbers: the tug, the straight and the curved arrow.

The board (body frame, metres, y to port) and the printed diagram (site frame, metres,
y north) both lay these out in their own frame and draw them with their own painter,
so a tug or an arrow is the same shape, the same size and in the same place on screen
and on paper. Every function here takes and returns plain ``(x, y)`` tuples in whatever
frame it is given; none of them knows about Qt.
"""

from __future__ import annotations

import math

Pt = tuple[float, float]

#: Drawn size of a tug, m: a generic harbour tug (both the board and the paper are to scale).
TUG_LENGTH_M = 26.0
TUG_BEAM_M = 10.0
#: The towing point (where the line is made fast on the tug) lies this share of the
#: tug's length forward of its stern: aft of midships, as on a tug towing over the stern.
TOWING_POINT_FROM_STERN = 0.35
#: Gap between a pushing tug's bow and the push point, m (its fender).
PUSH_GAP_M = 0.5
#: An arrowhead's half-width as a share of its length; its shaft stops this share of
#: the head's length short of the tip, under the filled head.
HEAD_HALF_WIDTH = 0.45
SHAFT_INTO_HEAD = 0.2


def tug_outline(length: float = TUG_LENGTH_M, beam: float = TUG_BEAM_M) -> tuple[Pt, ...]:
    """A tug's plan shape, bow at +x, its towing point at the origin.

    A transom stern, parallel sides and a bow that narrows to a point over the forward
    fifth: read at any size as a small vessel pointing the way it works.
    """
    h = beam / 2
    aft = -TOWING_POINT_FROM_STERN * length
    fwd = (1.0 - TOWING_POINT_FROM_STERN) * length
    shoulder = fwd - 0.3 * length
    return (
        (aft, -h * 0.85),
        (aft + 0.08 * length, -h),
        (shoulder, -h),
        (fwd - 0.08 * length, -h * 0.45),
        (fwd, 0.0),
        (fwd - 0.08 * length, h * 0.45),
        (shoulder, h),
        (aft + 0.08 * length, h),
        (aft, h * 0.85),
    )


def tug_origin(
    mode: str, point: Pt, tug_position: Pt, direction: Pt, length: float = TUG_LENGTH_M
) -> Pt:
    """Where the tug's towing point lies, its bow along ``direction`` (a unit vector).

    On a line (``mode == "line"``) the tug lies at the line's far end, ``tug_position``,
    stern to the hull. Pushing, its bow rests on the push point ``point``.
    """
    if mode == "line":
        return tug_position
    off = (1.0 - TOWING_POINT_FROM_STERN) * length + PUSH_GAP_M
    return (point[0] - direction[0] * off, point[1] - direction[1] * off)


def placed_tug(origin: Pt, direction: Pt, length: float = TUG_LENGTH_M) -> tuple[Pt, ...]:
    """The tug's outline with its towing point at ``origin`` and bow along ``direction``.

    ``length`` may be drawn larger than the tug (a small-scale diagram); the beam
    keeps the tug's proportions.
    """
    beam = length * TUG_BEAM_M / TUG_LENGTH_M
    dx, dy = direction
    n = math.hypot(dx, dy) or 1.0
    ux, uy = dx / n, dy / n
    ox, oy = origin
    return tuple((ox + ux * x - uy * y, oy + uy * x + ux * y) for x, y in tug_outline(length, beam))


def tug_label_anchor(
    mode: str, origin: Pt, direction: Pt, length: float = TUG_LENGTH_M, gap: float = 5.0
) -> Pt:
    """A point just beyond the tug on the side away from the hull, for its name."""
    if mode == "line":
        far = (1.0 - TOWING_POINT_FROM_STERN) * length + gap
    else:
        far = -(TOWING_POINT_FROM_STERN * length + gap)
    return (origin[0] + direction[0] * far, origin[1] + direction[1] * far)


def arrow_head(start: Pt, end: Pt, head: float) -> tuple[Pt, tuple[Pt, Pt, Pt]] | None:
    """Where a straight arrow's shaft stops and its filled head, or None when it has no length.

    ``head`` is the head's length in the frame's units; on a short arrow it is cut to
    six tenths of the arrow. Returns ``(shaft_end, (tip, left, right))``.
    """
    dx, dy = end[0] - start[0], end[1] - start[1]
    length = math.hypot(dx, dy)
    if length < 1e-9:
        return None
    ux, uy = dx / length, dy / length
    h = min(head, 0.6 * length)
    w = HEAD_HALF_WIDTH * h
    bx, by = end[0] - ux * h, end[1] - uy * h
    shaft_end = (bx + ux * SHAFT_INTO_HEAD * h, by + uy * SHAFT_INTO_HEAD * h)
    return shaft_end, (end, (bx - uy * w, by + ux * w), (bx + uy * w, by - ux * w))


def arc_arrow(
    centre: Pt, radius: float, start_deg: float, sweep_deg: float, head: float
) -> tuple[tuple[Pt, ...], tuple[Pt, Pt, Pt]] | None:
    """A curved arrow round ``centre``: its shaft as points and its filled head.

    Angles are counter-clockwise from +x in a y-up frame (seen from above, like a
    yaw moment); ``sweep_deg > 0`` turns counter-clockwise. The head takes the last
    part of the arc. None when there is nothing to draw.
    """
    if abs(sweep_deg) < 1e-6 or radius <= 0:
        return None
    cx, cy = centre
    n = max(8, int(abs(sweep_deg) / 4))
    a0 = math.radians(start_deg)
    head_angle = min(head / radius, abs(math.radians(sweep_deg)) * 0.5)
    sign = 1.0 if sweep_deg > 0 else -1.0
    a_end = a0 + math.radians(sweep_deg)
    a_shaft = a_end - sign * head_angle * (1.0 - SHAFT_INTO_HEAD)
    shaft = tuple(
        (
            cx + radius * math.cos(a0 + (a_shaft - a0) * i / n),
            cy + radius * math.sin(a0 + (a_shaft - a0) * i / n),
        )
        for i in range(n + 1)
    )
    tip = (cx + radius * math.cos(a_end), cy + radius * math.sin(a_end))
    base_a = a_end - sign * head_angle
    w = HEAD_HALF_WIDTH * head
    bx, by = cx + radius * math.cos(base_a), cy + radius * math.sin(base_a)
    rx, ry = math.cos(base_a), math.sin(base_a)  # radial unit at the head's base
    return shaft, (tip, (bx + rx * w, by + ry * w), (bx - rx * w, by - ry * w))


def drawing_scales(
    hull_lengths: list[float], pulls_n: list[float], placed_pulls_n: list[float]
) -> tuple[float, float, float]:
    """(force arrows in m per N, the moment of a full yaw arc in N*m, arrowhead length in m).

    Arrows scale with the plan, not the stage: the strongest tug's rated pull is drawn
    0.55 times the longest hull, so a force looks the same size in every stage. A yaw
    moment of half the longest hull times the placed tugs' rated pulls sweeps the arc
    to its full length.
    """
    lref = max(hull_lengths, default=50.0)
    fref = max(pulls_n, default=500e3)
    total = sum(placed_pulls_n) or fref
    return 0.55 * lref / fref, total * 0.5 * lref, max(2.0, min(0.035 * lref, 12.0))


def moment_arc(
    moment: float, moment_scale: float, length: float, beam: float
) -> tuple[float, float, float] | None:
    """(radius m, start, sweep degrees) of the yaw moment's arc round the centroid, in
    the body frame (x forward, counter-clockwise positive); None for no moment.

    The arc is centred astern of the centroid, clear of most arrows; it sweeps 30 to
    300 degrees as the square root of the moment's share of ``moment_scale`` (small
    moments still show, large ones never wrap round), and stays inside the sides.
    """
    frac = math.sqrt(min(1.0, abs(moment) / moment_scale)) if moment_scale > 0 else 0.0
    if abs(moment) <= 1e-6 * max(moment_scale, 1.0):
        return None
    sweep = math.copysign(30.0 + 270.0 * frac, moment)
    radius = min(0.18 * length, 0.4 * beam) * (0.7 + 0.5 * frac)
    return radius, 180.0 - sweep / 2, sweep
