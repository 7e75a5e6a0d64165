"""The one unit registry, and conversion at the edges.

The core computes in SI magnitudes. Units enter and leave only here: at file
input/output, at GUI entry and in print. ``t`` on a bollard-pull rating means the
tonne-force (9.80665 kN); pint's own ``t`` is the tonne of *mass* and its
``ton_force`` the short ton-force, so the tonne-force is defined here explicitly
and never printed as a bare "ton".
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import Literal

import pint

from core.errors import InputError

ureg: pint.UnitRegistry = pint.UnitRegistry()
ureg.define("tonne_force = 9.80665 * kilonewton = tf")

Quantity = Literal["force", "moment", "length", "speed"]

#: Display symbol -> pint expression, per quantity, in the order offered to users.
CHOICES: dict[Quantity, dict[str, str]] = {
    "force": {"t": "tonne_force", "kN": "kilonewton", "kip": "kip", "lbf": "lbf"},
    "moment": {"t*m": "tonne_force * meter", "kN*m": "kilonewton * meter", "kip*ft": "kip * foot"},
    "length": {"m": "meter", "ft": "foot"},
    "speed": {"kn": "knot", "m/s": "meter / second"},
}
_SI: dict[Quantity, str] = {
    "force": "newton",
    "moment": "newton * meter",
    "length": "meter",
    "speed": "meter / second",
}

#: SI magnitude of one display unit, e.g. FACTORS["force"]["t"] == 9806.65.
FACTORS: dict[Quantity, dict[str, float]] = {
    q: {sym: float(ureg.Quantity(1.0, expr).to(_SI[q]).magnitude) for sym, expr in units.items()}
    for q, units in CHOICES.items()
}

#: Printed form of each display symbol (a real multiplication sign for moments).
LABELS: dict[str, str] = {"t*m": "t·m", "kN*m": "kN·m", "kip*ft": "kip·ft"}


def filed(value: float) -> float:
    """A number as a plan file holds it: 12 significant digits, so that save -> load ->
    save is stable. Values worked out from numbers a file holds are worked from these."""
    return float(f"{value:.12g}") + 0.0


def filed_degrees(deg: float) -> float:
    """An angle in degrees as a plan file holds it: 12 significant digits and at most 11
    decimals (a bearing near 0 comes back from the hull frame as 90 - (90 - b), good to
    about 1e-13 degrees, so finer digits would change on each save)."""
    return filed(round(deg, 11))


def filed_bearing(deg: float) -> float:
    """A bearing round the circle as a plan file holds it: :func:`filed_degrees` of it in
    [0, 360), what rounds to 360 being 0, so that save -> load -> save is stable."""
    b = filed_degrees(deg % 360.0)
    return 0.0 if b >= 360.0 else b


def factor(quantity: Quantity, unit: str) -> float:
    """SI magnitude of one ``unit`` of ``quantity``; raises InputError if unknown."""
    try:
        return FACTORS[quantity][unit]
    except KeyError:
        allowed = ", ".join(FACTORS.get(quantity, {}))
        raise InputError(f"{quantity} unit", unit, f"is not one of {allowed}") from None


def to_si(value: float, quantity: Quantity, unit: str) -> float:
    """Convert ``value`` given in display ``unit`` to SI."""
    return value * factor(quantity, unit)


def from_si(value: float, quantity: Quantity, unit: str) -> float:
    """Convert an SI ``value`` to display ``unit``."""
    return value / factor(quantity, unit)


def fmt(value: float, digits: int = 1, signed: bool = False) -> str:
    """A number for people: fixed digits, and never "-0.0" for a value that rounds to zero."""
    v = round(value, digits)
    if v == 0:
        v = 0.0
    return f"{v:+.{digits}f}" if signed else f"{v:.{digits}f}"


#: How near 100 % a share may be and still read "100" (the checks' own 1e-9 relative).
_AT_LIMIT = 1e-9


def _whole_percent(pct: float) -> str:
    """``pct`` from 1 up: whole percents, with the digits it needs where a whole percent
    would cross 100 (the limit of a setting or a rating): 100.3 reads "100.3", never "100",
    and 99.7 reads "99.7", never "100"; within 0.001 of 100 it reads "just over 100" or
    "just under 100"."""
    if abs(pct - 100) <= 100 * _AT_LIMIT:
        return "100"
    for digits in (0, 1, 2, 3):
        text = f"{pct:.{digits}f}"
        shown = float(text)
        if (shown > 100) == (pct > 100) and (shown < 100) == (pct < 100):
            return text
    return "just over 100" if pct > 100 else "just under 100"


def percent(fraction: float) -> str:
    """A fraction as a percent for people, without the "%": whole percents from 1 %, with
    more digits where a whole percent would read over a limit of 100 % that the value is
    under or the other way round (1.003 -> "100.3"), and below 1 % the digits it needs so
    that only nothing at all reads "0" (0.005 -> "0.5", 0.0004 -> "0.04"); below 0.001 %
    it reads "under 0.001"."""
    pct = fraction * 100
    if pct == 0:
        return "0"
    if abs(pct) >= 1:
        return _whole_percent(pct)
    for digits in (1, 2, 3):
        text = f"{pct:.{digits}f}"
        if abs(float(text)) >= 1:
            return _whole_percent(pct)
        if float(text) != 0:
            return text
    return "under 0.001" if pct > 0 else "over -0.001"


def percent_words(fraction: float) -> str:
    """A fraction as a percent with its sign, by :func:`percent`'s rule: "60 %", "0.4 %"."""
    return f"{percent(fraction)} %"


#: The digits a unit is printed with where a view asks for none: m/s to the hundredth (a
#: 0.4 kn current is 0.21 m/s, which one decimal would print 0.2), every other to the tenth.
DIGITS: dict[str, int] = {"m/s": 2}


def digits_of(unit: str) -> int:
    """How many decimals ``unit`` is printed with by default (:data:`DIGITS`, else 1)."""
    return DIGITS.get(unit, 1)


def label(unit: str) -> str:
    """How a unit symbol is printed."""
    return LABELS.get(unit, unit)


@dataclass(frozen=True, slots=True)
class DisplayUnits:
    """The user's choice of unit per quantity, kept in the project file."""

    force: str = "t"
    moment: str = "t*m"
    length: str = "m"
    speed: str = "kn"

    def __post_init__(self) -> None:
        for q in ("force", "moment", "length", "speed"):
            factor(q, getattr(self, q))  # raises a clear InputError on an unknown unit

    def unit(self, quantity: Quantity) -> str:
        return str(getattr(self, quantity))

    def with_unit(self, quantity: Quantity, unit: str) -> DisplayUnits:
        return replace(self, **{quantity: unit})

    def digits(self, quantity: Quantity) -> int:
        """The decimals ``quantity`` is printed with in this display unit by default."""
        return digits_of(self.unit(quantity))

    def show(self, value_si: float, quantity: Quantity, digits: int | None = None) -> str:
        """``value_si`` in this display unit with its symbol, e.g. ``"45.0 t"``, ``"0.21
        m/s"``: to ``digits`` decimals, by default the unit's own (:func:`digits_of`)."""
        u = self.unit(quantity)
        d = digits_of(u) if digits is None else digits
        return f"{fmt(from_si(value_si, quantity, u), d)} {label(u)}"

    def show_against(self, value_si: float, limit_si: float, quantity: Quantity) -> tuple[str, str]:
        """``value_si`` and the ``limit_si`` it is held against, as :meth:`show` says
        them, with up to three more decimals where the unit's own would read the two
        alike though they differ: 20.04 kn over a 20 kn limit is "20.04 kn" against
        "20.00 kn", not "20.0 kn" against "20.0 kn"."""
        d = digits_of(self.unit(quantity))
        for more in range(4):
            a, b = self.show(value_si, quantity, d + more), self.show(limit_si, quantity, d + more)
            if a != b or value_si == limit_si:
                break
        return a, b

    def value(self, value_si: float, quantity: Quantity) -> float:
        return from_si(value_si, quantity, self.unit(quantity))

    def si(self, value: float, quantity: Quantity) -> float:
        return to_si(value, quantity, self.unit(quantity))
