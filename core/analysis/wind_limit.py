"""A stage's go / no-go wind limit against the hold limits from every direction.

The verdict checks the planned wind from its planned direction. A stage whose wind limit
is 20 kn while the tugs hold only 3 kn from the north is right only as long as the wind
does not shift: this says so as a caution, with the lowest limit and the directions from
which the stage's limit is held. It reads the stage result's own hold limits (swept once
for the stage), so it costs nothing more to work out.
"""

from __future__ import annotations

import numpy as np

from core.solve.holdlimits import HoldLimits, limit_words
from core.units import DisplayUnits

__all__ = ["held_arcs", "wind_limit_words"]


def held_arcs(directions_deg: np.ndarray, held: np.ndarray) -> list[tuple[float, float]]:
    """The runs of directions (clockwise, each (first, last) in degrees) where ``held``
    (D,) is true, on a full circle of evenly swept directions (D,): a run across north
    is one run. Empty when none is held; [(d0, d_last)] when all are."""
    d = np.asarray(directions_deg, dtype=float)
    h = np.asarray(held, dtype=bool)
    n = len(h)
    if not h.any():
        return []
    if h.all():
        return [(float(d[0]), float(d[-1]))]
    # start each run where a held direction follows one not held (circularly)
    starts = [i for i in range(n) if h[i] and not h[i - 1]]
    out = []
    for s in starts:
        e = s
        while h[(e + 1) % n]:
            e = (e + 1) % n
        out.append((float(d[s]), float(d[e])))
    return out


def wind_limit_words(lim: HoldLimits, max_wind_ms: float | None, units: DisplayUnits) -> str:
    """The caution when the tugs hold less than the stage's wind limit from some
    direction ("" when they hold it from every direction, or the stage sets no limit):
    the lowest limit and where it is, and the directions from which the limit is held."""
    if max_wind_ms is None or lim.flow != "wind" or not len(lim.all_tugs_ms):
        return ""
    v = np.asarray(lim.all_tugs_ms, dtype=float)
    held = v >= max_wind_ms * (1 - 1e-9)
    if held.all():
        return ""
    d_low, v_low = lim.lowest()
    arcs = held_arcs(lim.problem.directions_deg, held)
    where = (
        " and ".join(f"{a:03.0f}° to {b:03.0f}°" if a != b else f"{a:03.0f}°" for a, b in arcs)
        + " true (clockwise)"
        if arcs
        else "no direction"
    )
    return (
        f"the tugs hold the stage's wind limit {units.show(max_wind_ms, 'speed')} only from "
        f"{where}; from {d_low:03.0f}° true they hold {limit_words(v_low, units)} with all "
        "tugs (the go / no-go check is for the planned direction: a shift of wind can break "
        "it)"
    )
