"""Whether a towline leads clear of the hull it works on.

A towline runs from its fitting out over the side to the tug. Drawn in plan, a line from a
fitting on the edge may cross a corner of the deck (a bow centre bitt's line led to the
beam crosses the bow's shoulder), but a line that runs along or across the deck (a bow
bitt's line led aft, over a lashed neighbour's deck) or ends on it (the tug on the deck)
is not a lead a tug can take.

:func:`over_hull_m` measures, for each line, how much of it lies over the hull beyond the
shortest way out from its fitting (none for a fitting on the edge). The allowance
(:func:`over_hull_allowance_m`) is half the breadth of the fitting's hull, the most a line
from its centreline crosses to reach the near side, and :data:`OVER_HULL_TOL_M` more; a line
over the hull by more than that, or a tug at the end of its line over the hull, is a no-go
(core.mechanics.balance says it for each tug). The hull is taken a few centimetres in
from its outline, so a line that grazes the edge, or starts on it, is not over it.
"""

from __future__ import annotations

import numpy as np
import shapely

#: How much more than half its hull's breadth a towline may lie over the hull, m (common
#: practice, no source: a line may cross a bulwark, a rail and a metre or two of deck to
#: reach a chock).
OVER_HULL_TOL_M = 2.0
#: The hull taken this far in from its outline, m: a line starting on the edge or grazing
#: it is not over the hull (rounding of a fitting snapped onto the outline).
EDGE_M = 0.05


def _inner(polygon: shapely.Polygon | shapely.MultiPolygon) -> shapely.Geometry:
    """``polygon`` taken EDGE_M in, prepared for fast tests; kept for the last few bodies
    (a drag asks for the same body's on every move)."""
    key = id(polygon)
    got = _INNER.get(key)
    if got is None or got[0] is not polygon:
        inner = polygon.buffer(-EDGE_M)
        shapely.prepare(inner)
        if len(_INNER) >= 16:
            _INNER.pop(next(iter(_INNER)))
        got = _INNER[key] = (polygon, inner)
    return got[1]


#: id(polygon) -> (polygon, its inner polygon), the polygon held so its id stays its own.
_INNER: dict[int, tuple[shapely.Geometry, shapely.Geometry]] = {}


def over_hull_m(
    polygon: shapely.Polygon | shapely.MultiPolygon, points: np.ndarray, ends: np.ndarray
) -> np.ndarray:
    """(n,) length of each line from ``points[i]`` (its fitting) to ``ends[i]`` (the tug)
    lying over ``polygon`` beyond the shortest way out from the fitting, m (0 for a line
    clear of the hull). ``points`` and ``ends`` are (n, 2), in the polygon's frame."""
    points = np.asarray(points, dtype=float).reshape(-1, 2)
    ends = np.asarray(ends, dtype=float).reshape(-1, 2)
    out = np.zeros(len(points))
    inner = _inner(polygon)
    if len(points) == 0 or inner.is_empty:  # a hull thinner than the edge allowance
        return out
    lines = shapely.linestrings(np.stack([points, ends], axis=1))
    hit = np.flatnonzero(shapely.intersects(inner, lines))  # most lines lead clear of it
    if len(hit) == 0:
        return out
    over = shapely.length(shapely.intersection(lines[hit], inner))
    starts = shapely.points(points[hit])
    inside = shapely.contains(inner, starts)
    way_out = np.where(inside, shapely.distance(inner.boundary, starts), 0.0)
    out[hit] = np.maximum(np.nan_to_num(over - way_out, nan=0.0), 0.0)
    return out


def over_hull_allowance_m(breadth_m: float) -> float:
    """How much of a towline may lie over a hull of breadth ``breadth_m`` (m): half the
    breadth, and :data:`OVER_HULL_TOL_M` more."""
    return 0.5 * breadth_m + OVER_HULL_TOL_M


def ends_on_hull(polygon: shapely.Polygon | shapely.MultiPolygon, ends: np.ndarray) -> np.ndarray:
    """(n,) whether each tug, at the end of its line, lies over ``polygon`` (taken EDGE_M in)."""
    ends = np.asarray(ends, dtype=float).reshape(-1, 2)
    inner = _inner(polygon)
    if len(ends) == 0 or inner.is_empty:
        return np.zeros(len(ends), dtype=bool)
    return np.asarray(shapely.contains(inner, shapely.points(ends)), dtype=bool)


#: Leads are tried this far apart to find the part of a working sector clear of the hull,
#: degrees: at the end of a 60 m line a step moves the tug 2 m, the allowance's margin.
CLEAR_STEP_DEG = 2.0


def is_clear(
    polygon: shapely.Polygon | shapely.MultiPolygon,
    points: np.ndarray,
    ends: np.ndarray,
    allowance_m: np.ndarray | float,
) -> np.ndarray:
    """(n,) whether each line from ``points[i]`` to ``ends[i]`` leads clear: over the hull
    by no more than its allowance, and its tug not on the hull."""
    over = over_hull_m(polygon, points, ends)
    return (over <= np.asarray(allowance_m, dtype=float)) & ~ends_on_hull(polygon, ends)


def clear_arc(
    polygon: shapely.Polygon | shapely.MultiPolygon,
    point: tuple[float, float],
    frame_rad: float,
    length_m: float,
    allowance_m: float,
    sector: tuple[float, float],
) -> tuple[float, float] | None:
    """The part of a towline's working sector ``sector`` (leads lo..hi, rad, from
    ``frame_rad`` in the body frame) whose leads run clear of ``polygon`` (:func:`is_clear`):
    the longest unbroken run of clear leads tried :data:`CLEAR_STEP_DEG` apart, ends
    included; the whole sector when every lead is clear; None when none is.

    Only one run is kept, so that every lead between its ends is clear: a set of forces
    spanning two runs would hold forces along the leads between them.
    """
    key = (id(polygon), point, frame_rad, length_m, allowance_m, sector)
    got = _ARCS.get(key)
    if got is not None and got[0] is polygon:
        return got[1]
    lo, hi = sector
    width = hi - lo
    whole = width >= 2 * np.pi - 1e-12
    n = max(1, int(np.ceil(width / np.radians(CLEAR_STEP_DEG) - 1e-9)))
    leads = lo + width * np.arange(n + 1) / n
    if whole:
        leads = leads[:-1]
    ang = frame_rad + leads
    starts = np.broadcast_to(np.asarray(point, dtype=float), (len(leads), 2))
    ends = starts + length_m * np.column_stack([np.cos(ang), np.sin(ang)])
    ok = is_clear(polygon, starts, ends, allowance_m)
    arc: tuple[float, float] | None
    if ok.all():
        arc = (lo, hi)
    elif not ok.any():
        arc = None
    else:
        if whole:  # round the circle: start the runs just after a blocked lead
            shift = int(np.flatnonzero(~ok)[0]) + 1
            ok = np.roll(ok, -shift)
            leads = np.roll(leads, -shift)
            leads = np.where(np.arange(len(leads)) >= len(leads) - shift, leads + 2 * np.pi, leads)
        best, first, run_start = 0, 0, None
        for j, good in enumerate(np.append(ok, False).tolist()):
            if good and run_start is None:
                run_start = j
            elif not good and run_start is not None:
                if j - run_start > best:
                    best, first = j - run_start, run_start
                run_start = None
        arc = (float(leads[first]), float(leads[first + best - 1]))
    if len(_ARCS) >= 512:
        _ARCS.pop(next(iter(_ARCS)))
    _ARCS[key] = (polygon, arc)
    return arc


#: The arcs worked out lately (a drag and the hold limits ask for the same ones again),
#: each with its polygon held so that the id in its key stays that polygon's.
_ARCS: dict[tuple[object, ...], tuple[shapely.Geometry, tuple[float, float] | None]] = {}
