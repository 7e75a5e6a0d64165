"""A symmetric hull's outline from a table of offsets: stations x and half-breadths.

The table is text with one station a row: x along the hull, then the half-breadth
(the distance from the centreline to the side, never negative). A first row of
names is optional (``x`` and ``half_breadth``, ``hb`` or ``y``, in any order, other
columns ignored); without one the first two columns are taken. A unit may follow the
x column's name (``x (mm)``, ``x_mm``, ``x [ft]``). Commas, semicolons or tabs
separate the columns; with semicolons a decimal comma is read too; lines starting
with ``#`` are comments.

The port side runs through the stations from aft to forward and the starboard side
back again, so the outline's area is twice the trapezoidal-rule integral of the
half-breadths over x.
"""

from __future__ import annotations

import csv
import itertools
import math
import re
from dataclasses import dataclass

from core.errors import DrawingError
from core.io.drawing_units import MAX_DRAWING_COORDINATE, metres_per_unit, read_coordinate
from core.io.dxf_outline import CHORD_ERROR_M
from core.io.outline_import import ImportedOutline, OutlinePlacement, place_outline
from core.io.paths import shown_row

X_NAMES = frozenset({"x", "station", "stations", "position"})
HB_NAMES = frozenset({"half_breadth", "halfbreadth", "hb", "y", "half_beam", "b/2"})
_UNIT_SUFFIX = re.compile(r"^(.*?)[\s_]*[\(\[]?\s*(mm|cm|m|in|ft)\s*[\)\]]?$")


@dataclass(frozen=True, slots=True)
class Offsets:
    """A table of offsets as read: stations (x, half-breadth) in file units, aft to forward
    as the file gives them, and the unit its header names (None if it names none)."""

    source: str
    stations: tuple[tuple[float, float], ...]
    units: str | None


def _name_and_unit(cell: str) -> tuple[str, str | None]:
    key = cell.strip().lower().replace("-", "_").replace(" ", "_")
    m = _UNIT_SUFFIX.match(key)
    if m and m.group(1):
        return m.group(1).strip("_"), m.group(2)
    return key, None


def _number(cell: str, decimal_comma: bool) -> float:
    text = cell.strip()
    if decimal_comma:
        text = text.replace(",", ".")
    return read_coordinate(float(text))


def read_offsets(text: str, source: str) -> Offsets:
    """Parse a table of offsets; raises DrawingError naming the line of a bad row."""
    lines = [(i, ln) for i, ln in enumerate(text.splitlines(), start=1)]
    rows = [(i, ln) for i, ln in lines if ln.strip() and not ln.lstrip().startswith("#")]
    if not rows:
        raise DrawingError(source, "holds no offsets")
    sample = "\n".join(ln for _, ln in rows[:20])
    delim = next((d for d in ("\t", ";", ",") if d in sample), ",")
    decimal_comma = delim == ";"
    cells = [(i, next(csv.reader([ln], delimiter=delim))) for i, ln in rows]
    xi, hi, units = 0, 1, None
    first_line, first = cells[0]
    try:
        _number(first[0], decimal_comma)
    except (ValueError, IndexError):
        names = [_name_and_unit(c) for c in first]
        keys = [n for n, _ in names]
        xi = next((k for k, n in enumerate(keys) if n in X_NAMES), -1)
        hi = next((k for k, n in enumerate(keys) if n in HB_NAMES), -1)
        if xi < 0 or hi < 0:
            raise DrawingError(
                source,
                "the first row names no x and half-breadth columns "
                f"(it has {shown_row(delim.join(c.strip() for c in first))})",
                line=first_line,
            ) from None
        units = names[xi][1] or names[hi][1]
        cells = cells[1:]
    stations: list[tuple[float, float]] = []
    for line, row in cells:
        try:
            x, hb = _number(row[xi], decimal_comma), _number(row[hi], decimal_comma)
        except (ValueError, IndexError):
            raise DrawingError(
                source, f"is not an x and a half-breadth: {shown_row(delim.join(row))}", line=line
            ) from None
        if not (math.isfinite(x) and math.isfinite(hb)):
            raise DrawingError(source, "x and half-breadth must be finite", line=line)
        if max(abs(x), abs(hb)) > MAX_DRAWING_COORDINATE:
            raise DrawingError(
                source,
                f"x and half-breadth must be at most {MAX_DRAWING_COORDINATE:g} from zero",
                line=line,
            )
        if hb < 0:
            raise DrawingError(source, f"half-breadth {hb:g} is negative", line=line)
        stations.append((x, hb))
    if len(stations) < 2:
        raise DrawingError(source, "needs at least two stations")
    steps = [b[0] - a[0] for a, b in itertools.pairwise(stations)]
    way = next((math.copysign(1.0, s) for s in steps if s != 0), 0.0)
    if way == 0.0:
        raise DrawingError(source, "every station has the same x")
    back = next((k for k, s in enumerate(steps) if s * way < 0), None)
    if back is not None:
        raise DrawingError(source, f"station x must run one way; station {back + 2} turns back")
    return Offsets(source, tuple(stations), units)


def offsets_outline(offsets: Offsets) -> list[tuple[float, float]]:
    """The closed outline through the stations, port side then starboard, file units."""
    st = list(offsets.stations)
    if st[-1][0] < st[0][0]:
        st.reverse()
    port = [(x, hb) for x, hb in st]
    starboard = [(x, -hb) for x, hb in reversed(st)]  # (x, -0.0) == (x, 0.0): ends once
    pts: list[tuple[float, float]] = []
    for p in port + starboard:
        if not pts or p != pts[-1]:
            pts.append(p)
    if len(pts) > 1 and pts[0] == pts[-1]:
        pts.pop()
    return pts


def import_offsets(
    text: str,
    source: str,
    units: str | None = None,
    x_aft: bool = False,
    reference: OutlinePlacement | None = None,
    chord_error_m: float = CHORD_ERROR_M,
) -> ImportedOutline:
    """The outline of a table of offsets in the hull frame.

    ``units`` overrides the unit the header names (metres when neither says);
    ``x_aft``: the table's x runs aft (stations numbered from the bow). ``reference``
    gives the reference point (its ``bow`` is set from ``x_aft``).
    """
    table = read_offsets(text, source)
    unit = units or table.units or "m"
    base = reference or OutlinePlacement()
    placement = OutlinePlacement("-x" if x_aft else "+x", False, base.reference, base.point)
    return place_outline(
        offsets_outline(table),
        metres_per_unit(unit),
        placement,
        chord_error_m,
        source=source,
        layer=None,
        units=unit,
    )
