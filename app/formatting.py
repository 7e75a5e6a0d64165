"""How numbers are written on screen: the core's SI values in the display units.

(Numbers typed by people are read back by app/numbers.py, the one parser.)"""

from __future__ import annotations

from core.units import DisplayUnits, Quantity, fmt, label


def bearing(deg: float | None) -> str:
    """A relative or true bearing as three digits, e.g. ``"045°"``; a dash for None."""
    if deg is None:
        return "—"
    d = round(deg) % 360
    return f"{d:03d}°"


def value(units: DisplayUnits, si: float, quantity: Quantity, digits: int = 1) -> str:
    """``si`` in the display unit with its symbol: ``"45.0 t"``."""
    return units.show(si, quantity, digits)


def signed(units: DisplayUnits, si: float, quantity: Quantity, digits: int = 1) -> str:
    """With an explicit sign: ``"+12.5 t·m"``."""
    u = units.unit(quantity)
    return f"{fmt(units.value(si, quantity), digits, signed=True)} {label(u)}"


def number(units: DisplayUnits, si: float, quantity: Quantity, digits: int = 1) -> str:
    """The bare number in the display unit (for table cells whose header names the unit)."""
    return fmt(units.value(si, quantity), digits)


def unit_label(units: DisplayUnits, quantity: Quantity) -> str:
    return label(units.unit(quantity))
