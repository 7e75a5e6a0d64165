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
