"""How numbers are written on screen: the core's SI values in the display units.

(Numbers typed by people are read back by app/numbers.py, the one parser.)"""

from __future__ import annotations

from core.frames import angle_to_bearing
from core.model.hull import Fitting
from core.units import DisplayUnits, Quantity, fmt, label

FITTING_KIND_TEXT = {"line": "line point", "push": "push point"}


def bearing(deg: float | None) -> str:
    """A relative or true bearing as three digits, e.g. ``"045°"``; a dash for None."""
    if deg is None:
        return "—"
    d = round(deg) % 360
    return f"{d:03d}°"


def value(units: DisplayUnits, si: float, quantity: Quantity, digits: int | None = None) -> str:
    """``si`` in the display unit with its symbol: ``"45.0 t"`` (the unit's own digits
    unless ``digits`` is given: core.units.digits_of)."""
    return units.show(si, quantity, digits)


def signed(units: DisplayUnits, si: float, quantity: Quantity, digits: int | None = None) -> str:
    """With an explicit sign: ``"+12.5 t·m"``."""
    u = units.unit(quantity)
    d = units.digits(quantity) if digits is None else digits
    return f"{fmt(units.value(si, quantity), d, signed=True)} {label(u)}"


def number(units: DisplayUnits, si: float, quantity: Quantity, digits: int | None = None) -> str:
    """The bare number in the display unit (for table cells whose header names the unit)."""
    return fmt(units.value(si, quantity), units.digits(quantity) if digits is None else digits)


def unit_label(units: DisplayUnits, quantity: Quantity) -> str:
    return label(units.unit(quantity))


def permitted_lines(fitting: Fitting) -> str:
    """A line point's permitted line angles: "300° to 060°" (relative bearings, swept
    clockwise), "any" when none are set; a dash for a push point."""
    if fitting.kind != "line":
        return "—"
    if fitting.permitted_lead_rad is None:
        return "any"
    lo, hi = fitting.permitted_lead_rad
    return f"{bearing(angle_to_bearing(hi))} to {bearing(angle_to_bearing(lo))}"


def fitting_summary(units: DisplayUnits, fitting: Fitting) -> str:
    """One line about a fitting for a tooltip, every rating in the display force unit:
    "Bow bitt (line point, bitt, SWL 80.0 t, TOW 64.5 t, lines 300° to 060°)"."""
    parts = [FITTING_KIND_TEXT[fitting.kind], fitting.fitting_type]
    if fitting.swl_n is not None:
        parts.append(f"SWL {units.show(fitting.swl_n, 'force')}")
    if fitting.tow_n is not None:
        parts.append(f"TOW {units.show(fitting.tow_n, 'force')}")
    if fitting.swl_n is None and fitting.tow_n is None:
        parts.append("no rating given")
    if fitting.permitted_lead_rad is not None:
        parts.append(f"lines {permitted_lines(fitting)}")
    return f"{fitting.name} ({', '.join(p for p in parts if p)})"
