"""What the drift preview shows for the plan: the times of its ghost outlines and how
long it looks ahead for a contact."""

from __future__ import annotations

from dataclasses import dataclass

from core.errors import InputError
from core.model import rules

#: At most this many ghost times.
MAX_GHOSTS = 8
#: The longest look ahead, s (an hour: beyond it the tugs' and crew's response governs).
MAX_HORIZON_S = rules.DRIFT_HORIZON.high


@dataclass(frozen=True, slots=True)
class DriftSettings:
    """Ghost outlines at ``times_s`` (s after the tug is lost or the lines let go) and a
    look ahead of ``horizon_s`` for the first contact."""

    times_s: tuple[float, ...] = (30.0, 60.0, 120.0)
    horizon_s: float = 600.0

    def __post_init__(self) -> None:
        if not self.times_s:
            raise InputError("drift times", self.times_s, "must hold at least one time")
        if len(self.times_s) > MAX_GHOSTS:
            raise InputError(
                "drift times", len(self.times_s), f"must be at most {MAX_GHOSTS} times"
            )
        times = tuple(rules.DRIFT_TIME.check(t) for t in self.times_s)
        if list(times) != sorted(set(times)):
            raise InputError("drift times", times, "must be in increasing order, each once")
        h = rules.DRIFT_HORIZON.check(self.horizon_s)
        object.__setattr__(self, "times_s", times)
        object.__setattr__(self, "horizon_s", h)
