"""The one scale of the polar plots (the hold limits on screen and on paper).

The distance from the centre is a wind speed in the display speed unit. The outer
ring reaches past the planned wind and the stage's wind limit, and follows the
all-tugs curve up to two and a half times the planned wind (at least 30 kn, at most
:data:`TOP_CAP_MS`), so the region a planner reads stays large; a limit beyond the
outer ring is drawn on it.
"""

from __future__ import annotations

import math
from collections.abc import Iterable

from core.units import DisplayUnits

#: Ring spacings offered, in the display speed unit.
RING_STEPS = (1.0, 2.0, 5.0, 10.0, 15.0, 20.0, 25.0, 50.0, 100.0)
#: At most this many rings.
MAX_RINGS = 6
#: The outer ring never goes beyond this many m/s (about 78 kn): a harbour move is never
#: planned in more wind, and higher limits would squeeze the rest.
TOP_CAP_MS = 40.0
KNOT_MS = 1852.0 / 3600.0


def ring_step(top: float) -> float:
    """A ring spacing giving at most :data:`MAX_RINGS` rings up to ``top``."""
    for s in RING_STEPS:
        if top / s <= MAX_RINGS:
            return s
    return RING_STEPS[-1]


def polar_scale(
    all_tugs_ms: Iterable[float] | None,
    planned_ms: float,
    max_wind_ms: float | None,
    units: DisplayUnits,
) -> tuple[float, float]:
    """(outer ring, ring step) in the display speed unit.

    ``all_tugs_ms`` is the all-tugs limit by direction, m/s (None when there is no
    curve); ``planned_ms`` the stage's planned wind and ``max_wind_ms`` its go / no-go
    limit, m/s.
    """
    base = max(10.0 * KNOT_MS, planned_ms * 1.25)
    if max_wind_ms is not None:
        base = max(base, max_wind_ms * 1.1)
    cap = min(max(2.5 * planned_ms, 30.0 * KNOT_MS, base), max(TOP_CAP_MS, base))
    top_ms = base
    finite = [
        float(v) for v in (all_tugs_ms if all_tugs_ms is not None else ()) if math.isfinite(v)
    ]
    if finite:
        top_ms = max(base, min(max(finite), cap))
    top = units.value(top_ms, "speed")
    step = ring_step(top)
    return step * max(1, math.ceil(top / step - 1e-9)), step


def current_scale(
    limits_ms: Iterable[float] | None,
    planned_ms: float,
    max_current_ms: float | None,
    units: DisplayUnits,
) -> tuple[float, float]:
    """(outer ring, ring step) in the display speed unit for a plot of current limits:
    past the planned current and the stage's current limit, at least 2 kn, following the
    all-tugs curve up to three times the planned current (at most :data:`CURRENT_CAP_MS`)."""
    base = max(2.0 * KNOT_MS, planned_ms * 1.25)
    if max_current_ms is not None:
        base = max(base, max_current_ms * 1.1)
    cap = max(min(max(3.0 * planned_ms, 4.0 * KNOT_MS), CURRENT_CAP_MS), base)
    finite = [float(v) for v in (limits_ms if limits_ms is not None else ()) if math.isfinite(v)]
    top_ms = max(base, min(max(finite), cap)) if finite else base
    top = units.value(top_ms, "speed")
    step = current_ring_step(top)
    return step * max(1, math.ceil(top / step - 1e-9)), step


#: The outer ring of a current plot never goes beyond this, m/s (8 kn).
CURRENT_CAP_MS = 8.0 * KNOT_MS
CURRENT_RING_STEPS = (0.25, 0.5, 1.0, 2.0, 5.0)


def current_ring_step(top: float) -> float:
    """A ring spacing for a current plot giving at most :data:`MAX_RINGS` rings."""
    for s in CURRENT_RING_STEPS:
        if top / s <= MAX_RINGS:
            return s
    return ring_step(top)
