"""A swing: the heading a body starts a swing stage on, the heading it ends on, and which
way its bow swings between them.

Headings are true bearings of the body's bow, degrees clockwise from north. The bow
swinging to starboard turns the body clockwise seen from above, so its heading grows;
to port it turns counter-clockwise and its heading falls. The two headings alone do not
say which way (090 to 270 is half a turn either way), so the side is part of the value.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

from core.errors import InputError
from core.model import rules
from core.units import filed_degrees

SwingSide = Literal["port", "starboard"]
SWING_SIDES: tuple[SwingSide, ...] = ("port", "starboard")


def _heading(value: float, what: str) -> float:
    """A heading in [0, 360), as a plan file holds it (so a heading of 1e-300
    is 0 here as it is once saved, and two headings equal in the file are equal here)."""
    h = filed_degrees(rules.HEADING.check(value, f"swing {what}") % 360.0)
    return 0.0 if h >= 360.0 else h


@dataclass(frozen=True, slots=True)
class Swing:
    """The start and end headings of a swing stage (true, degrees) and the bow's side."""

    start_heading_deg: float
    end_heading_deg: float
    bow_to: SwingSide = "port"

    def __post_init__(self) -> None:
        object.__setattr__(self, "start_heading_deg", _heading(self.start_heading_deg, "start"))
        object.__setattr__(self, "end_heading_deg", _heading(self.end_heading_deg, "end"))
        if self.bow_to not in SWING_SIDES:
            raise InputError("swing: bow swings to", self.bow_to, "is not port or starboard")
        turn = self.turn_deg
        if min(turn, 360.0 - turn) < 1e-9:
            raise InputError(
                "swing: end heading", self.end_heading_deg, "must differ from the start heading"
            )

    @property
    def turn_deg(self) -> float:
        """How far the bow swings, degrees, more than 0 and less than 360."""
        if self.bow_to == "starboard":
            return (self.end_heading_deg - self.start_heading_deg) % 360.0
        return (self.start_heading_deg - self.end_heading_deg) % 360.0

    @property
    def sign(self) -> float:
        """+1 when the heading grows through the swing (bow to starboard), -1 to port."""
        return 1.0 if self.bow_to == "starboard" else -1.0

    @property
    def moment_sign(self) -> float:
        """The sign of the yaw moment that turns the body this way: +1 to port (a positive
        moment turns counter-clockwise seen from above, bow to port), -1 to starboard."""
        return -self.sign

    def span_words(self) -> str:
        """The headings in words: "090.0° to 270.0°"."""
        return f"{self.start_heading_deg:05.1f}° to {self.end_heading_deg:05.1f}°"

    def heading_at(self, fraction: float) -> float:
        """The true heading a ``fraction`` (0 start, 1 end) of the way through the swing."""
        h = (self.start_heading_deg + self.sign * fraction * self.turn_deg) % 360.0
        return 0.0 if h >= 360.0 else h

    def progress(self, heading_deg: float) -> float | None:
        """How far through the swing ``heading_deg`` lies (0 to 1), None when off its arc."""
        done = (self.sign * (heading_deg - self.start_heading_deg)) % 360.0
        if done <= self.turn_deg + 1e-9:
            return min(done / self.turn_deg, 1.0)
        return None

    def words(self) -> str:
        """The swing in words, e.g. "swings bow to port 180° from 090° to 270°"."""
        return f"swings bow to {self.bow_to} {self.turn_deg:.0f}° from {self.span_words()}"
