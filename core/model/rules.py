"""One rule for every input: the range of each value the user can give, kept once.

Every value a plan holds is checked against its rule here, whichever road it comes by:
the frozen dataclasses check it when they are built, the file decoder checks the file's
numbers with the same rules, and the window's number parser (``app/numbers.py``) checks
what is typed. A rule works on the core's SI value and phrases a bad value in whichever
display units the caller names, so the window says "wind speed: -5.0 kn must not be
negative" in the units the user chose and the file loader says it in the file's units.

The bounds are wide, meant to refuse what cannot be meant (a 1e200 kn current, a 5000 t
tug, a wind measured 1e-300 m above the water) and to keep every result finite, not to
judge whether a plan is wise; warnings (core.notices) do that.

Text is checked too: names and notes are text that can be written back to a file (no
lone surrogates), names are one line with no control characters, and every text has a
length limit.
"""

from __future__ import annotations

import math
import re
from collections.abc import Collection
from dataclasses import dataclass, field
from typing import Literal

from core.errors import InputError
from core.units import DisplayUnits, label

#: How a value is shown: a quantity of the display units, or a fixed unit.
Kind = Literal[
    "force",
    "moment",
    "length",
    "speed",
    "area",
    "mass",
    "percent",
    "angle",
    "degrees",
    "density",
    "time",
    "plain",
]

#: The display units an error is phrased in when the caller names none.
DEFAULT_UNITS = DisplayUnits()

_FIXED: dict[str, tuple[float, str]] = {
    "mass": (1000.0, "t"),  # the displacement in tonnes (of mass)
    "percent": (0.01, "%"),  # a setting is kept as a fraction, shown in percent
    "angle": (math.pi / 180.0, "°"),  # kept in radians, shown in degrees
    "degrees": (1.0, "°"),  # kept in degrees (bearings, headings)
    "density": (1.0, "kg/m³"),
    "time": (1.0, "s"),
    "plain": (1.0, ""),
}


def unit_of(kind: Kind, units: DisplayUnits) -> tuple[float, str]:
    """SI magnitude of one shown unit of ``kind``, and the unit's printed symbol.

    Parameters
    ----------
    kind:
        How the value is shown (a display quantity or a fixed unit).
    units:
        The display units to show it in.
    """
    if kind in ("force", "moment", "length", "speed"):
        return units.si(1.0, kind), label(units.unit(kind))  # type: ignore[arg-type]
    if kind == "area":
        u = units.unit("length")
        return units.si(1.0, "length") ** 2, f"{label(u)}²"
    return _FIXED[kind]


def shown(value: float, unit: str) -> str:
    """A number as a message shows it: six significant digits, ``"-5.0 kN"``, ``"1e+200 kn"``."""
    if not math.isfinite(value):
        text = "NaN" if math.isnan(value) else ("infinity" if value > 0 else "-infinity")
    else:
        text = f"{value:.6g}"
        if not any(c in text for c in ".en"):
            text += ".0"
    return _with_unit(text, unit)


def _with_unit(text: str, unit: str) -> str:
    if not unit:
        return text
    return f"{text}{unit}" if unit == "°" else f"{text} {unit}"


def _bound(value: float, unit: str) -> str:
    return _with_unit(f"{value:.6g}", unit)


class RangeError(InputError):
    """A number outside its rule; can say so again in any display units.

    ``value`` is the SI value; :meth:`in_units` phrases the message in other display
    units (the window's, the file's) than the ones it was raised with.
    """

    def __init__(self, rule: Range, value: object, subject: str, units: DisplayUnits) -> None:
        self.rule = rule
        self.subject = subject
        reason, text = rule.explain(value, units)
        name = f"{subject}: {rule.label}" if subject else rule.label
        super().__init__(name, value, reason, shown=text)

    def in_units(self, units: DisplayUnits) -> str:
        """The message with the value and its bounds in ``units``."""
        reason, text = self.rule.explain(self.value, units)
        return f"{self.field}: {text} {reason}"


@dataclass(frozen=True, slots=True)
class Range:
    """The range of one number, in SI, and how to show it.

    Parameters
    ----------
    label:
        What the value is, in the user's words (``"bollard pull"``).
    kind:
        How it is shown (see :data:`Kind`).
    low, high:
        The bounds, SI; ``low`` is excluded when ``above`` is true and ``high`` when
        ``below`` is (a bearing of a curve round the circle: 360 is 0); both ends are
        included otherwise.
    """

    label: str
    kind: Kind
    low: float = -math.inf
    high: float = math.inf
    above: bool = False
    below: bool = False
    # Bounds widened by a part in 1e9, so a value at a bound survives a trip through a
    # file written with 12 significant digits in another unit (an excluded top is not
    # widened: the greatest float below it is the last that keeps the rule).
    _lo: float = field(init=False, repr=False, compare=False)
    _hi: float = field(init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        object.__setattr__(self, "_lo", self.low - 1e-9 * abs(self.low))
        hi = math.nextafter(self.high, -math.inf) if self.below else self.high
        object.__setattr__(self, "_hi", hi if self.below else hi + 1e-9 * abs(hi))

    def named(self, label: str) -> Range:
        """The same range under another label (``WIND_SPEED.named("wind limit")``)."""
        return Range(label, self.kind, self.low, self.high, self.above, self.below)

    def holds(self, value: float) -> bool:
        """Whether ``value`` (SI) keeps the rule."""
        try:
            if self.above:
                return bool(self.low < value <= self._hi)
            return bool(self._lo <= value <= self._hi)
        except TypeError:
            return False

    def limits(self) -> tuple[float, float]:
        """The least and the greatest float that keep the rule, SI: for a float ``x``,
        ``lo <= x <= hi`` is :meth:`holds` (for readers that inline the test)."""
        return (math.nextafter(self.low, math.inf) if self.above else self._lo), self._hi

    def check(self, value: float, subject: str = "", units: DisplayUnits = DEFAULT_UNITS) -> float:
        """``value`` as a float if it keeps the rule; else a :class:`RangeError`.

        ``subject`` names what the value belongs to (``"tug Castor"``); ``units`` are
        the display units the message is phrased in.
        """
        if type(value) is float or type(value) is int:  # the fast path (drags)
            ok = (self.low < value <= self._hi) if self.above else (self._lo <= value <= self._hi)
            if ok:
                return float(value)
        elif not isinstance(value, bool) and self.holds(value):
            return float(value)
        raise RangeError(self, value, subject, units)

    def check_optional(
        self, value: float | None, subject: str = "", units: DisplayUnits = DEFAULT_UNITS
    ) -> float | None:
        """None (not given) or ``value`` checked by :meth:`check`."""
        return None if value is None else self.check(value, subject, units)

    def explain(self, value: object, units: DisplayUnits) -> tuple[str, str]:
        """Why ``value`` (SI) breaks the rule, and the value as shown, in ``units``."""
        factor, unit = unit_of(self.kind, units)
        if isinstance(value, bool) or not isinstance(value, int | float):
            return "must be a number", repr(value)
        try:
            v = float(value)
        except OverflowError:
            return "is too large a number", "a number"
        text = shown(v / factor, unit)
        if not math.isfinite(v):
            return "must be a finite number", text
        if v <= self.low if self.above else v < self.low:
            lo = self.low / factor
            if self.above:
                return (
                    "must be positive" if lo == 0 else f"must be above {_bound(lo, unit)}"
                ), text
            return (
                "must not be negative" if lo == 0 else f"must be at least {_bound(lo, unit)}"
            ), text
        if self.below and v >= self.high:
            return f"must be below {_bound(self.high / factor, unit)}", text
        if v > self.high:
            return f"must be at most {_bound(self.high / factor, unit)}", text
        return "is within its range", text

    def span(self, units: DisplayUnits = DEFAULT_UNITS) -> str:
        """The range in words and ``units``, for a tooltip: ``"0 to 100 %"``."""
        factor, unit = unit_of(self.kind, units)
        lo, hi = self.low / factor, self.high / factor
        if math.isinf(lo) and math.isinf(hi):
            return "any finite number"
        if math.isinf(hi):
            return f"above {_bound(lo, unit)}" if self.above else f"{_bound(lo, unit)} or more"
        if math.isinf(lo):
            return f"at most {_bound(hi, unit)}"
        start = f"above {_bound(lo, unit)}" if self.above else f"{lo:.6g}"
        return f"{start} to {'under ' if self.below else ''}{_bound(hi, unit)}"


# -- text ---------------------------------------------------------------------------------


#: Characters no text may hold (lone surrogates cannot be written as UTF-8), and control
#: characters: a name has none, free text may break lines and hold tabs.
_BAD_IN_NOTES = re.compile(r"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f\ud800-\udfff]")
_BAD_IN_NAME = re.compile(r"[\x00-\x1f\x7f-\x9f\u2028\u2029\ud800-\udfff]")


@dataclass(frozen=True, slots=True)
class Text:
    """The rule for a piece of text: a name (one line, not empty) or free text.

    Every text must be writable to a UTF-8 file (no lone surrogates) and within
    ``max_length`` characters; one-line text has no control characters at all, free
    text only tabs and line breaks.
    """

    label: str
    max_length: int = 100
    required: bool = False
    multiline: bool = False
    # Texts found good before (names repeat across a plan): checked once each.
    _known: set[str] = field(default_factory=set, init=False, repr=False, compare=False)

    def problem(self, value: object) -> str | None:
        """Why ``value`` breaks the rule, or None."""
        if type(value) is str and value in self._known:
            return None
        reason = self._problem(value)
        if reason is None and len(self._known) < 100_000:
            self._known.add(value)  # type: ignore[arg-type]
        return reason

    def keeps_all(self, values: Collection[str]) -> bool:
        """Whether every one of ``values`` (each a str) keeps the rule, tested at once: a
        file's column of thousands of names. False says only that one does not; which one
        and why is :meth:`problem`'s to say."""
        known = self._known
        if known.issuperset(values):
            return True
        new = set(values).difference(known)
        # A character the rule refuses is one code point: it is in the joined text exactly
        # when it is in one of the texts (Python's str never merges two code points).
        if (
            max(map(len, new)) > self.max_length
            or (self.required and not all(map(str.strip, new)))
            or (_BAD_IN_NOTES if self.multiline else _BAD_IN_NAME).search("".join(new))
        ):
            return False
        if len(known) + len(new) <= 100_000:
            known.update(new)
        return True

    def _problem(self, value: object) -> str | None:
        if not isinstance(value, str):
            return f"{_short(value)} is not text"
        if self.required and not value.strip():
            return "must not be empty"
        if len(value) > self.max_length:
            return f"is {len(value)} characters long, more than {self.max_length}"
        bad = (_BAD_IN_NOTES if self.multiline else _BAD_IN_NAME).search(value)
        if bad is not None:
            code, at = ord(bad.group()), bad.start() + 1
            if 0xD800 <= code <= 0xDFFF:
                return (
                    f"has a lone surrogate (U+{code:04X}) at character {at}, "
                    "which cannot be written to a file"
                )
            return f"has a control character (U+{code:04X}) at character {at}"
        return None

    def named(self, label: str) -> Text:
        """The same rule under another label."""
        return Text(label, self.max_length, self.required, self.multiline)

    def check(self, value: str, subject: str = "", label: str | None = None) -> str:
        """``value`` if it keeps the rule; else an InputError naming the field
        (``label``, by default the rule's own, of ``subject``)."""
        if type(value) is str and value in self._known:
            return value
        reason = self.problem(value)
        if reason is not None:
            label = self.label if label is None else label
            name = f"{subject}: {label}" if subject else label
            raise InputError(name, value, reason, shown=_short(value))
        return value


def _short(value: object) -> str:
    text = repr(value)
    return text if len(text) <= 40 else f"{text[:37]}..."


@dataclass(frozen=True, slots=True)
class Choice:
    """The rule for a value taken from a fixed list (a stage kind, a goal kind)."""

    label: str
    options: tuple[str, ...]

    def check(self, value: str, subject: str = "") -> str:
        if not isinstance(value, str) or value not in self.options:
            name = f"{subject}: {self.label}" if subject else self.label
            raise InputError(
                name, value, f"is not one of {', '.join(self.options)}", shown=_short(value)
            )
        return value


# -- the rules ----------------------------------------------------------------------------

TONNE_FORCE = 9806.65  # N (NIST SP 811: 1 kgf = 9.80665 N, exact)
KNOT = 1852.0 / 3600.0  # m/s (the international knot, exact)

#: The largest distance from the origin of any coordinate (hull frame or site), m.
MAX_COORDINATE_M = 100_000.0
#: Angles wrap; a hundred turns either way is plenty and keeps them exact enough.
MAX_TURNS = 100
#: The most vertices an outline may have.
MAX_OUTLINE_VERTICES = 200_000
#: The most rows or columns of the tugs' efficiency table.
MAX_TABLE_SIZE = 50

# names and text
NAME = Text("name", 100, required=True)
PLAN_NAME = Text("plan name", 200, required=True)
LABEL = Text("text", 200)
NOTES = Text("notes", 100_000, multiline=True)

# positions and angles
COORDINATE = Range("coordinate", "length", -MAX_COORDINATE_M, MAX_COORDINATE_M)
ANGLE = Range("angle", "angle", -MAX_TURNS * 2 * math.pi, MAX_TURNS * 2 * math.pi)
BEARING = Range("bearing", "degrees", -MAX_TURNS * 360.0, MAX_TURNS * 360.0)
HEADING = Range("heading", "degrees", -MAX_TURNS * 360.0, MAX_TURNS * 360.0)
MEMBER_HEADING = Range("heading", "angle", ANGLE.low, ANGLE.high)  # within a lashed group
DIRECTION = Range("direction", "degrees", 0.0, 360.0)  # wind from, current towards

# tugs and where they work
#: No working tug pulls less than a tenth of a tonne-force (common practice, no source);
#: a smaller positive pull (5e-324 N) passed "positive" and broke the solvers' scaling.
MIN_BOLLARD_PULL = 0.1 * TONNE_FORCE
BOLLARD_PULL = Range("bollard pull", "force", MIN_BOLLARD_PULL, 1000 * TONNE_FORCE)
ASTERN_PULL = Range("astern pull", "force", 0.0, 1000 * TONNE_FORCE)
TOWING_POINT_HEIGHT = Range("towing point height", "length", 0.0, 50.0)
TOWLINE_LENGTH = Range("towline length", "length", 0.0, 10_000.0, above=True)
#: A towline or fitting rated below a tenth of a tonne-force holds no tug (common
#: practice, no source); 5e-324 passed "positive" and made the share of it infinite.
MIN_RATING = 0.1 * TONNE_FORCE
TOWLINE_MBL = Range("towline MBL", "force", MIN_RATING, 10_000 * TONNE_FORCE)
#: The share of the MBL a towline's tension is warned above (core.model.tugs).
TOWLINE_WARN_SHARE = Range("towline warning share of MBL", "plain", 0.0, 1.0, above=True)
#: A tug's capability: usable share of its bollard pull at a relative bearing of its own
#: heading (core.model.capability).
CAPABILITY_SHARE = Range("capability share", "plain", 0.0, 2.0)
#: Bearings of a curve round the circle: 360 is 0, so a curve's last bearing is below it.
CAPABILITY_BEARING = Range("capability bearing", "degrees", 0.0, 360.0, below=True)
SETTING = Range("setting", "percent", 0.0, 1.0)
#: A tug's headway table (core.model.headway): speed through the water and the share of
#: its bollard pull it can give then.
HEADWAY_SPEED = Range("speed through the water", "speed", 0.0, 20 * KNOT)
HEADWAY_SHARE = Range("share of bollard pull", "plain", 0.0, 1.0)
LEAD = Range("lead", "angle", ANGLE.low, ANGLE.high)
LINE_LENGTH = Range("line length", "length", 0.0, 5000.0, above=True)
#: A push off square to the hull, degrees (a tug cannot push outwards).
PUSH_ANGLE = Range("push angle", "degrees", -89.999, 89.999)

# hulls
#: Nothing towed floats with less than a centimetre of draught or freeboard, nor weighs
#: less than a tonne (common practice, no source): a 1e-300 m draught broke the areas'
#: arithmetic and a 1e-300 t body made the drift preview run on without end.
DRAUGHT = Range("draught", "length", 0.01, 50.0)
FREEBOARD = Range("freeboard", "length", 0.01, 100.0)
DISPLACEMENT = Range("displacement", "mass", 1000.0, 1e9)  # kg (1 to a million tonnes)
YAW_GYRADIUS = Range("yaw radius of gyration", "length", 0.0, 10_000.0, above=True)
SWL = Range("SWL", "force", MIN_RATING, 5000 * TONNE_FORCE)
TOW = Range("TOW", "force", MIN_RATING, 5000 * TONNE_FORCE)

# conditions
WIND_SPEED = Range("wind speed", "speed", 0.0, 200 * KNOT)
WIND_HEIGHT = Range("wind height", "length", 0.5, 500.0)
GUST_FACTOR = Range("gust factor", "plain", 1.0, 3.0)
WIND_EXPONENT = Range("wind exponent", "plain", 0.0, 1.0)
CURRENT_SPEED = Range("current speed", "speed", 0.0, 20 * KNOT)
AIR_DENSITY = Range("air density", "density", 0.5, 2.0)
WATER_DENSITY = Range("water density", "density", 950.0, 1100.0)
COEFFICIENT = Range("coefficient", "plain", 0.0, 10.0, above=True)
AREA = Range("area", "area", 0.0, 1e6, above=True)
SEA_STATE = Range("sea state", "plain", 0.0, 9.0)
#: Where the lateral load's centre of pressure lies head-on, as a share of the length from
#: the leading end (core.mechanics.loads: 1/2 is amidships, no travel).
CENTRE_HEAD_ON = Range("centre of pressure head-on", "plain", 0.0, 0.5)
#: A stage's water depth (core.mechanics.depth) and the under-keel clearance below which
#: it is warned about.
WATER_DEPTH = Range("water depth", "length", 0.0, 11_000.0, above=True)
UKC_MARGIN = Range("under-keel clearance margin", "length", 0.0, 100.0)
#: How the centre of pressure is placed (core.mechanics.loads).
PRESSURE_CENTRE = Choice("centre of pressure", ("moving", "fixed"))
EFFICIENCY = Range("efficiency", "plain", 0.0, 1.0)

# the drift preview
DRIFT_TIME = Range("drift time", "time", 0.0, 3600.0, above=True)
DRIFT_HORIZON = Range("drift horizon", "time", 0.0, 3600.0, above=True)

# drawings read in (DXF, tables of offsets): how far a chord may stray from its arc, and
# how near two line ends must be to be joined; 0.01 mm is far finer than any drawing is
# drawn, and keeps an arc's chords countable (common practice, no source)
CHORD_ERROR = Range("chord error", "length", 1e-5, 10.0)
JOIN_TOLERANCE = Range("join tolerance", "length", 0.0, 10.0)

# goals and limits
GOAL_FORCE = Range("net force", "force", -10_000 * TONNE_FORCE, 10_000 * TONNE_FORCE)
GOAL_FORCE_AHEAD = Range("force ahead", "force", GOAL_FORCE.low, GOAL_FORCE.high)
GOAL_FORCE_TO_PORT = Range("force to port", "force", GOAL_FORCE.low, GOAL_FORCE.high)
GOAL_MOMENT = Range("yaw moment", "moment", -10_000_000 * TONNE_FORCE, 10_000_000 * TONNE_FORCE)
#: A transit's planned speed through the water (the tugs' headway tables are read at it).
TRANSIT_SPEED = Range("speed through the water", "speed", 0.0, 20 * KNOT)
WIND_LIMIT = Range("wind limit", "speed", 0.0, WIND_SPEED.high)
CURRENT_LIMIT = Range("current limit", "speed", 0.0, CURRENT_SPEED.high)
CLEARANCE = Range("clearance", "length", 0.0, 10_000.0)
LEAST_CLEARANCE = CLEARANCE.named("least clearance")
CLEARANCE_MARGIN = CLEARANCE.named("clearance margin")
