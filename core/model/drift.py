"""What the drift preview shows for the plan: the times of its ghost outlines and how
long it looks ahead for a contact."""

from __future__ import annotations

import math
from dataclasses import dataclass

from core.errors import InputError

#: At most this many ghost times.
MAX_GHOSTS = 8
#: The longest look ahead, s (an hour: beyond it the tugs' and crew's response governs).
MAX_HORIZON_S = 3600.0


@dataclass(frozen=True, slots=True)
class DriftSettings:
    """Ghost outlines at ``times_s`` (s after the tug is lost or the lines let go) and a
    look ahead of ``horizon_s`` for the first contact."""

    times_s: tuple[float, ...] = (30.0, 60.0, 120.0)
    horizon_s: float = 600.0

    def __post_init__(self) -> None:
        times = tuple(float(t) for t in self.times_s)
        if not times:
            raise InputError("drift times", self.times_s, "must hold at least one time")
        if len(times) > MAX_GHOSTS:
            raise InputError("drift times", len(times), f"must be at most {MAX_GHOSTS} times")
        for t in times:
            if not (math.isfinite(t) and t > 0):
                raise InputError("drift time", t, "must be a positive number of seconds")
        if list(times) != sorted(set(times)):
            raise InputError("drift times", times, "must be in increasing order, each once")
        h = float(self.horizon_s)
        if not (math.isfinite(h) and 0 < h <= MAX_HORIZON_S):
            raise InputError("drift horizon", h, f"must be above 0 and at most {MAX_HORIZON_S:g} s")
        object.__setattr__(self, "times_s", times)
        object.__setattr__(self, "horizon_s", h)
