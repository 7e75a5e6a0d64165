"""What a tug can give in each direction: its type and its capability.

A tug's capability is, for each way of working, the usable share of its rated bollard
pull (ahead) against the direction of its pull relative to its own heading, read as a
relative bearing (degrees clockwise from the tug's ahead: 000 the tug pulls or pushes
over its bow... 180 it works astern, 090 and 270 to either side):

- **on a line** the tug lies along its towline: working ahead it pulls at 000 of its own
  heading, working astern (on a line from its bow) at 180; the other bearings say what
  it gives with the line leading off its fore-and-aft line;
- **pushing** the tug has its bow on the push point, square to the hull; it pushes at
  000 and can angle its push a little to either side (it cannot pull);
- **push-pull** the tug is made fast at the push point, square to the hull: it pushes
  at 000, pulls back on its line at 180, and works to either side between.

Values are linear between the given bearings (round the circle). The defaults per type
are placeholders with no published source, marked as such on screen and in the file,
to be replaced by the tug's own figures (its trials or its owner's data). A
conventional tug has a small astern pull and works on a line only.
"""

from __future__ import annotations

import functools
import itertools
import math
from dataclasses import dataclass, replace
from typing import Literal

import numpy as np

from core.errors import InputError
from core.model import rules
from core.units import filed_degrees

TugKind = Literal["ASD", "tractor", "conventional single screw", "conventional twin screw", "other"]
TUG_KINDS: tuple[TugKind, ...] = (
    "ASD",
    "tractor",
    "conventional single screw",
    "conventional twin screw",
    "other",
)
Way = Literal["line", "push", "push_pull"]
WAYS: tuple[Way, ...] = ("line", "push", "push_pull")
#: How each way of working is said to people.
WAY_WORDS: dict[Way, str] = {"line": "on a line", "push": "pushing", "push_pull": "push-pull"}
#: Largest share of the rated bollard pull a capability may give in any direction.
MAX_FRACTION = rules.CAPABILITY_SHARE.high
PLACEHOLDER_NOTE = "placeholder values, no published source: replace them with the tug's own"


@functools.lru_cache(maxsize=1024)
def tug_kind(type_text: str) -> TugKind:
    """The kind of tug a free-text type names ("other" when none is recognised)."""
    t = " ".join(type_text.lower().replace("-", " ").split())
    for kind in TUG_KINDS:
        if t == kind.lower():
            return kind
    if "asd" in t.split() or "azimuth" in t:
        return "ASD"
    if "tractor" in t:
        return "tractor"
    if "twin" in t:
        return "conventional twin screw"
    if "conventional" in t or "single screw" in t:
        return "conventional single screw"
    return "other"


@dataclass(frozen=True, slots=True)
class CapabilityCurve:
    """Usable share of rated bollard pull against relative bearing (clockwise from the
    tug's ahead, degrees), linear between points and round the circle."""

    bearings_deg: tuple[float, ...]
    fractions: tuple[float, ...]

    def __post_init__(self) -> None:
        given = tuple(float(v) for v in self.bearings_deg)
        f = tuple(float(v) for v in self.fractions)
        if not given or len(given) != len(f):
            raise InputError(
                "capability",
                (len(given), len(f)),
                "needs one share for each bearing, at least one",
            )
        # the bearings as a file holds them, so that the curve saved is the curve read back
        b = tuple(filed_degrees(rules.CAPABILITY_BEARING.check(v)) for v in given)
        for v, held in zip(given, b, strict=True):
            if held >= 360.0:
                raise InputError(
                    "capability bearing", v, "is 360 to the file's 11 decimals, and 360 is 0"
                )
        if any(b2 <= b1 for b1, b2 in itertools.pairwise(b)):
            raise InputError("capability bearings", list(b), "must be in increasing order")
        for v in f:
            rules.CAPABILITY_SHARE.check(v)
        object.__setattr__(self, "bearings_deg", b)
        object.__setattr__(self, "fractions", f)

    def at_bearing(self, bearing_deg: float) -> float:
        """The share at a relative bearing (degrees clockwise from the tug's ahead)."""
        return float(self.at_bearings(np.array([bearing_deg]))[0])

    def at_bearings(self, bearings_deg: np.ndarray) -> np.ndarray:
        """(k,) shares at relative bearings (k,), degrees."""
        b = np.asarray(self.bearings_deg)
        f = np.asarray(self.fractions)
        xs = np.concatenate([b - 360.0, b, b + 360.0])
        ys = np.concatenate([f, f, f])
        return np.interp(np.mod(np.asarray(bearings_deg, dtype=float), 360.0), xs, ys)

    def at_angles(self, angles_rad: np.ndarray) -> np.ndarray:
        """(k,) shares at angles counter-clockwise from the tug's ahead (the core's way)."""
        return self.at_bearings(-np.degrees(np.asarray(angles_rad, dtype=float)))

    def scaled_aft(self, astern: float) -> CapabilityCurve:
        """The curve with its share at 180 set to ``astern`` (other aft points in proportion)."""
        old = self.at_bearing(180.0)
        out = []
        for bearing, v in zip(self.bearings_deg, self.fractions, strict=True):
            aft = max(0.0, -math.cos(math.radians(bearing)))  # 1 at 180, 0 abeam and forward
            target = v * astern / old if old > 0 else astern
            out.append(v + aft * (target - v))
        return CapabilityCurve(self.bearings_deg, tuple(min(MAX_FRACTION, x) for x in out))


_EIGHT = (0.0, 45.0, 90.0, 135.0, 180.0, 225.0, 270.0, 315.0)


def _round(ahead: float, side: float, astern: float) -> CapabilityCurve:
    """A curve symmetric to port and starboard from its ahead, abeam and astern shares."""
    q_fwd, q_aft = 0.5 * (ahead + side), 0.5 * (side + astern)
    return CapabilityCurve(_EIGHT, (ahead, q_fwd, side, q_aft, astern, q_aft, side, q_fwd))


def _push(ahead: float, side: float) -> CapabilityCurve:
    """Pushing: the bow on the hull; nothing aft of the beam (a push cannot pull)."""
    return CapabilityCurve(
        _EIGHT, (ahead, 0.5 * (ahead + side), side, 0, 0, 0, side, 0.5 * (ahead + side))
    )


#: Placeholder shares per kind (ahead, abeam, astern) for each way; None: cannot work
#: that way. No published source: typical of the trade as remembered, to be replaced.
_DEFAULTS: dict[TugKind, dict[Way, tuple[float, float, float] | None]] = {
    "ASD": {"line": (1.0, 0.5, 0.9), "push": (1.0, 0.4, 0.0), "push_pull": (1.0, 0.5, 0.9)},
    "tractor": {"line": (1.0, 0.6, 0.9), "push": (1.0, 0.5, 0.0), "push_pull": (1.0, 0.6, 0.9)},
    "conventional single screw": {"line": (1.0, 0.0, 0.35), "push": None, "push_pull": None},
    "conventional twin screw": {"line": (1.0, 0.0, 0.5), "push": None, "push_pull": None},
    "other": {"line": (1.0, 1.0, 1.0), "push": (1.0, 1.0, 0.0), "push_pull": (1.0, 1.0, 1.0)},
}


@dataclass(frozen=True, slots=True)
class Capability:
    """A tug's capability for each way of working (None: it cannot work that way).

    ``placeholder`` is True for the defaults of a tug type (no published source);
    ``source`` says where user-entered values come from.
    """

    line: CapabilityCurve | None
    push: CapabilityCurve | None
    push_pull: CapabilityCurve | None
    placeholder: bool = False
    source: str = ""

    def __post_init__(self) -> None:
        if self.line is None and self.push is None and self.push_pull is None:
            raise InputError("capability", None, "must allow at least one way of working")

    def curve(self, way: Way) -> CapabilityCurve | None:
        if way not in WAYS:
            raise InputError("way of working", way, f"is not one of {', '.join(WAYS)}")
        return getattr(self, way)  # type: ignore[no-any-return]

    def with_curve(self, way: Way, curve: CapabilityCurve | None) -> Capability:
        """The capability with one way's curve replaced (no longer a placeholder)."""
        self.curve(way)
        return replace(self, **{way: curve}, placeholder=False)  # type: ignore[arg-type]

    @property
    def note(self) -> str:
        """What to say beside the figures: the placeholder warning or the source."""
        return PLACEHOLDER_NOTE if self.placeholder else (self.source or "entered by the user")


@functools.lru_cache(maxsize=256)
def default_capability(kind: TugKind, astern: float | None = None) -> Capability:
    """The placeholder capability of a tug kind; ``astern`` (share of the bollard pull)
    replaces the kind's astern share on a line and in push-pull when the tug's own
    astern pull is known. The value is frozen, so one is made per kind and share and
    shared (a plan of thousands of tugs of a few kinds builds a handful)."""
    table = _DEFAULTS[kind]
    curves: dict[str, CapabilityCurve | None] = {}
    for way in WAYS:
        shares = table[way]
        if shares is None:
            curves[way] = None
            continue
        ahead, side, aft = shares
        if way == "push":
            curves[way] = _push(ahead, side)
            continue
        if astern is not None:
            aft = min(MAX_FRACTION, astern)
        curves[way] = _round(ahead, side, aft)
    return Capability(curves["line"], curves["push"], curves["push_pull"], placeholder=True)
