"""What a solve of the pulls is asked to achieve, and the goal each kind of stage implies."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

from core.errors import InputError
from core.model import rules

GoalKind = Literal["hold", "walk", "swing", "transit", "force"]
GOAL_KINDS: tuple[GoalKind, ...] = ("hold", "walk", "swing", "transit", "force")

#: What each goal kind asks, in words for people.
GOAL_WORDS: dict[str, str] = {
    "hold": "hold: stay put against the wind and current",
    "walk": "walk: move sideways, no swing",
    "swing": "swing: turn on the spot, no net force",
    "transit": "transit: make way ahead or astern, no swing",
    "force": "a given net force and yaw moment",
}

#: A starting value for a new walk or transit stage's net force, N (10 t; the planner sets
#: the real one for the stage: common practice, no source).
DEFAULT_NET_FORCE_N = 10 * 9806.65
#: A starting value for a new swing stage's yaw moment, N*m (300 t*m, common practice, no source).
DEFAULT_SWING_MOMENT_NM = 300 * 9806.65


@dataclass(frozen=True, slots=True)
class Goal:
    """A goal for the tugs together with the conditions, in the hull frame.

    hold: tugs plus conditions sum to zero force and zero moment.
    walk: a net force sideways, ``fy_n`` (positive to port), N, with no force ahead and no
        yaw moment (walking a body is moving it sideways).
    swing: a yaw moment, N*m about the centroid (positive swings the bow to port), with no
        net force.
    transit: a net force ahead (positive) or astern, ``fx_n``, N, with no sideways force and
        no yaw moment; ``speed_ms`` is the planned speed through the water, m/s, at which
        each tug's headway table is read (core.model.headway).
    force: a given net force (``fx_n``, ``fy_n``) and yaw moment about the centroid.
    """

    kind: GoalKind = "hold"
    fx_n: float = 0.0
    fy_n: float = 0.0
    moment_nm: float = 0.0
    speed_ms: float = 0.0

    def __post_init__(self) -> None:
        if self.kind not in GOAL_KINDS:
            raise InputError("goal", self.kind, f"is not one of {', '.join(GOAL_KINDS)}")
        rules.GOAL_FORCE_AHEAD.check(self.fx_n, "goal")
        rules.GOAL_FORCE_TO_PORT.check(self.fy_n, "goal")
        rules.GOAL_MOMENT.check(self.moment_nm, "goal")
        rules.TRANSIT_SPEED.check(self.speed_ms, "goal")
        unused = {
            "hold": ("fx_n", "fy_n", "moment_nm", "speed_ms"),
            "walk": ("fx_n", "moment_nm", "speed_ms"),
            "swing": ("fx_n", "fy_n", "speed_ms"),
            "transit": ("fy_n", "moment_nm"),
            "force": ("speed_ms",),
        }[self.kind]
        for attr in unused:
            if getattr(self, attr) != 0.0:
                raise InputError(
                    f"goal {self.kind}: {_FIELD_WORDS[attr]}",
                    getattr(self, attr),
                    f"must be zero for '{self.kind}' ({GOAL_WORDS[self.kind]}); "
                    "use 'force' for a combination",
                )

    def target(self) -> tuple[float, float, float]:
        """Net force ahead, to port and moment about the centroid wanted from tugs plus
        conditions."""
        return (self.fx_n, self.fy_n, self.moment_nm)


_FIELD_WORDS = {
    "fx_n": "force ahead",
    "fy_n": "force to port",
    "moment_nm": "yaw moment",
    "speed_ms": "speed through the water",
}


def goal_from_parts(
    kind: str, fx_n: float, fy_n: float, moment_nm: float, speed_ms: float = 0.0
) -> Goal:
    """A goal from a kind and all its figures, keeping only those the kind uses (the speed
    through the water only for a transit).

    A 'walk' written with a force ahead and none to port (as files before the
    'transit' kind did) is a transit; a walk with both is a given force.
    """
    if kind == "walk" and fx_n != 0.0:
        kind = "transit" if fy_n == 0.0 else "force"
    keep = {
        "hold": (0.0, 0.0, 0.0),
        "walk": (0.0, fy_n, 0.0),
        "swing": (0.0, 0.0, moment_nm),
        "transit": (fx_n, 0.0, 0.0),
    }.get(kind, (fx_n, fy_n, moment_nm))
    if kind == "walk" and moment_nm != 0.0:
        kind, keep = "force", (fx_n, fy_n, moment_nm)
    speed = speed_ms if kind == "transit" else 0.0
    return Goal(kind, *keep, speed_ms=speed)  # type: ignore[arg-type]


def default_goal(stage_kind: str) -> Goal | None:
    """The goal a new stage of ``stage_kind`` starts with (the planner adjusts it).

    Unberthing and berthing walk the body sideways (to starboard by default: flip the sign
    for a port-side berth), a swing stage swings, a transit makes way ahead; "other"
    stages start with no goal, and say so; a hold stage holds.
    """
    return {
        "unberth": Goal("walk", fy_n=-DEFAULT_NET_FORCE_N),
        "berth": Goal("walk", fy_n=-DEFAULT_NET_FORCE_N),
        "swing": Goal("swing", moment_nm=DEFAULT_SWING_MOMENT_NM),
        "transit": Goal("transit", fx_n=DEFAULT_NET_FORCE_N),
        "hold": Goal("hold"),
    }.get(stage_kind)
