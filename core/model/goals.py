"""What a solve of the pulls is asked to achieve."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Literal

from core.errors import InputError

GoalKind = Literal["hold", "walk", "swing", "force"]
GOAL_KINDS: tuple[GoalKind, ...] = ("hold", "walk", "swing", "force")


@dataclass(frozen=True, slots=True)
class Goal:
    """A goal for the tugs together with the conditions, in the hull frame.

    hold: tugs plus conditions sum to zero force and zero moment.
    walk: a net force (fx, fy), N, with zero yaw moment.
    swing: a yaw moment, N*m about the centroid, with zero net force.
    force: a given net force and yaw moment about the centroid.
    """

    kind: GoalKind = "hold"
    fx_n: float = 0.0
    fy_n: float = 0.0
    moment_nm: float = 0.0

    def __post_init__(self) -> None:
        if self.kind not in GOAL_KINDS:
            raise InputError("goal", self.kind, f"is not one of {', '.join(GOAL_KINDS)}")
        for attr in ("fx_n", "fy_n", "moment_nm"):
            if not math.isfinite(getattr(self, attr)):
                raise InputError(f"goal {attr}", getattr(self, attr), "must be finite")

    def target(self) -> tuple[float, float, float]:
        """Net force ahead, abeam and moment wanted from tugs plus conditions."""
        if self.kind == "hold":
            return (0.0, 0.0, 0.0)
        if self.kind == "walk":
            return (self.fx_n, self.fy_n, 0.0)
        if self.kind == "swing":
            return (0.0, 0.0, self.moment_nm)
        return (self.fx_n, self.fy_n, self.moment_nm)
