"""A fitting's fields as people read and type them, shared by the fittings table and the
fitting dialog: ratings in the display force unit, positions in the display length
unit, permitted line angles as relative bearings swept clockwise ("300° to 060°").

Every edit goes through :func:`app.edits.hulls.edited_fitting`, so a rename follows
into the placements and a position lands on the outline, whichever widget made it.
"""

from __future__ import annotations

import re

from app import formatting as fmt
from app import numbers
from core.errors import InputError
from core.frames import angle_to_bearing, bearing_to_angle
from core.model import rules
from core.model.hull import Fitting
from core.units import DisplayUnits, Quantity

KIND_TEXT = fmt.FITTING_KIND_TEXT
KIND_OF_TEXT = {v: k for k, v in KIND_TEXT.items()}

#: "from" and "to" of a typed sector: "300 to 060", "300-60", "300–060", "300, 60"
_SECTOR_SPLIT = re.compile(r"\s*(?:to|–|—|,|;|\s-\s|(?<=\d)-(?=\d))\s*", re.IGNORECASE)


def sector_text(fitting: Fitting) -> str:
    """The permitted line angles in words: "300° to 060°", or "any" when none are set."""
    return fmt.permitted_lines(fitting)


def sector_bearings(fitting: Fitting) -> tuple[float, float] | None:
    """(from, to) relative bearings, degrees clockwise, or None."""
    if fitting.permitted_lead_rad is None:
        return None
    lo, hi = fitting.permitted_lead_rad
    return (angle_to_bearing(hi), angle_to_bearing(lo))


def sector_from_bearings(start: float | None, end: float | None) -> tuple[float, float] | None:
    """The core's (low, high) sector from bearings typed clockwise; both or neither."""
    if start is None and end is None:
        return None
    if start is None or end is None:
        raise InputError(
            "permitted line angles", (start, end), "need both ends (or neither, for any)"
        )
    return (bearing_to_angle(end), bearing_to_angle(start))


def parse_sector(text: str) -> tuple[float, float] | None:
    """A typed sector ("300 to 060"; empty or "any": none) as the core's (low, high)."""
    t = text.strip().replace("°", "")
    if not t or t.lower() in ("any", "—", "-"):
        return None
    parts = [p for p in _SECTOR_SPLIT.split(t) if p]
    if len(parts) != 2:
        raise InputError(
            "permitted line angles", text.strip(), "is not two bearings, like 300 to 060"
        )
    start = numbers.parse_number(parts[0], "permitted line angles: from")
    end = numbers.parse_number(parts[1], "permitted line angles: to")
    return sector_from_bearings(start, end)


def edit_text(units: DisplayUnits, value_si: float | None, quantity: Quantity) -> str:
    """A value to edit: in the display unit to six significant digits; "" for None."""
    return "" if value_si is None else f"{units.value(value_si, quantity):.6g}"


def parse_bearing(text: str, what: str) -> float | None:
    """A relative bearing typed in degrees; None for an empty field."""
    return None if not text.strip() else numbers.parse_number(text, what)


def parse_rating(units: DisplayUnits, text: str, rule: rules.Range, subject: str) -> float | None:
    """A rating (``rules.SWL`` or ``rules.TOW``) typed in the display force unit, N; None
    for an empty field."""
    return numbers.parse_optional(text, rule, units, subject)


def parse_length(units: DisplayUnits, text: str, axis: str, subject: str) -> float:
    """A hull-frame coordinate typed in the display length unit, m (required)."""
    rule = rules.COORDINATE.named(axis)
    if not text.strip():
        raise InputError(f"{subject}: {axis}", "", "must be given")
    return numbers.parse_value(text, rule, units, subject)
