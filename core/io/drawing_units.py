"""Lengths in drawings and tables: the units offered, and what a DXF header says.

A DXF drawing states its length unit in the header variable ``$INSUNITS`` (an integer
code: 1 inch, 2 foot, 4 millimetre, 5 centimetre, 6 metre; 0 says nothing; DXF
reference, HEADER section). The factors come from the one unit registry.
"""

from __future__ import annotations

from core.errors import InputError
from core.units import ureg

#: Our symbol -> pint unit, in the order offered to people.
_NAMES = {"mm": "millimeter", "cm": "centimeter", "m": "meter", "in": "inch", "ft": "foot"}

#: Metres in one drawing unit, by our symbol.
METRES_PER_UNIT: dict[str, float] = {
    sym: float(ureg.Quantity(1.0, name).to("meter").magnitude) for sym, name in _NAMES.items()
}

#: Words for each unit, for a dialog.
UNIT_WORDS = {
    "mm": "millimetres",
    "cm": "centimetres",
    "m": "metres",
    "in": "inches",
    "ft": "feet",
}

#: ``$INSUNITS`` code -> our symbol, for the codes we read.
INSUNITS_SYMBOLS = {1: "in", 2: "ft", 4: "mm", 5: "cm", 6: "m"}


#: The farthest a point may lie from the origin of a drawing or table, drawing units: a million
#: kilometres in millimetres, far beyond any survey grid, and small enough that areas and
#: lengths worked from such points stay finite.
MAX_DRAWING_COORDINATE = 1e12
#: A coordinate smaller than this, in any unit, is read as zero: far below any length a
#: drawing means (1e-100 mm), while subnormal numbers such as 5e-324 make shapely divide by
#: zero when it simplifies an outline.
NEGLIGIBLE = 1e-100


def read_coordinate(value: float) -> float:
    """A coordinate as read from a drawing or table: a negligible one (and -0.0) is 0.0."""
    return 0.0 if abs(value) < NEGLIGIBLE else value


def metres_per_unit(unit: str) -> float:
    """Metres in one ``unit``; raises InputError for a unit not offered."""
    try:
        return METRES_PER_UNIT[unit]
    except KeyError:
        raise InputError("drawing units", unit, f"is not one of {', '.join(_NAMES)}") from None
