"""A tug's usable pull with way on: its share of the bollard pull by the speed of the
tow through the water.

A tug's bollard pull is measured at rest. With the tow making way, its propellers
work in water already moving past them and its hull drags, so the pull it can give
falls with the speed; by how much depends on the tug, its propellers and its way of
working, and no single published table serves every tug. The table here is the
planner's, one per tug, linear between its rows and held beyond them; the default
rows are placeholders (marked so on screen and in the file) for the planner to
replace with the tug's own figures.
"""

from __future__ import annotations

import functools
import itertools
from dataclasses import dataclass

import numpy as np

from core.errors import InputError
from core.model import rules
from core.units import DisplayUnits, label

KNOT = rules.KNOT

#: Placeholder rows (speed through the water, kn; share of the bollard pull): NOT
#: published figures, only a falling curve to start from (common practice, no source).
PLACEHOLDER_ROWS_KN: tuple[tuple[float, float], ...] = (
    (0.0, 1.0),
    (2.0, 0.9),
    (4.0, 0.75),
    (6.0, 0.55),
    (8.0, 0.35),
)


class SpeedOrderError(InputError):
    """A headway table's speed not above the one before it; says so in knots (the file's
    unit) or, through :meth:`in_units`, in the display speed unit the table is typed in."""

    def __init__(self, before_ms: float, speed_ms: float) -> None:
        self.before_ms = before_ms
        super().__init__(
            "headway table: speed through the water",
            speed_ms,
            "must be in increasing order",
            shown=f"{speed_ms / KNOT:g} kn after {before_ms / KNOT:g} kn",
        )

    def in_units(self, units: DisplayUnits) -> str:
        """The message with both speeds in ``units`` (as typed: six significant digits)."""
        u = label(units.unit("speed"))
        after = units.value(self.before_ms, "speed")
        shown = f"{units.value(float(self.value), 'speed'):.6g} {u} after {after:.6g} {u}"  # type: ignore[arg-type]
        return f"{self.field}: {shown} {self.reason}"


@dataclass(frozen=True, slots=True)
class HeadwayTable:
    """Share of the bollard pull a tug can give against the tow's speed through the water.

    ``speeds_ms`` increasing, m/s (at least one row); ``shares`` 0 to 1, one per speed;
    ``placeholder`` true for the starting rows no one has entered.
    """

    speeds_ms: tuple[float, ...]
    shares: tuple[float, ...]
    placeholder: bool = False

    def __post_init__(self) -> None:
        speeds, shares = tuple(self.speeds_ms), tuple(self.shares)
        if not speeds or len(speeds) > rules.MAX_TABLE_SIZE:
            raise InputError(
                "headway table",
                len(speeds),
                f"must have 1 to {rules.MAX_TABLE_SIZE} rows",
                shown=f"{len(speeds)} rows",
            )
        if len(shares) != len(speeds):
            raise InputError(
                "headway table", len(shares), f"needs one share per speed ({len(speeds)})"
            )
        checked_speeds = tuple(rules.HEADWAY_SPEED.check(v, "headway table") for v in speeds)
        checked_shares = tuple(rules.HEADWAY_SHARE.check(v, "headway table") for v in shares)
        for a, b in itertools.pairwise(checked_speeds):
            if b <= a:
                raise SpeedOrderError(a, b)
        object.__setattr__(self, "speeds_ms", checked_speeds)
        object.__setattr__(self, "shares", checked_shares)

    def share_at(self, speed_ms: float) -> float:
        """Share of the bollard pull at ``speed_ms`` through the water (linear, held at
        the ends)."""
        return float(np.interp(abs(speed_ms), self.speeds_ms, self.shares))

    @property
    def rows_kn(self) -> tuple[tuple[float, float], ...]:
        """(speed kn, share) rows, for people and the file."""
        return tuple((v / KNOT, s) for v, s in zip(self.speeds_ms, self.shares, strict=True))


@functools.cache
def placeholder_headway() -> HeadwayTable:
    """The placeholder table every tug starts with (not published figures); frozen, so
    made once and shared."""
    return HeadwayTable(
        tuple(v * KNOT for v, _ in PLACEHOLDER_ROWS_KN),
        tuple(s for _, s in PLACEHOLDER_ROWS_KN),
        placeholder=True,
    )


def headway_of(speeds_kn: list[float], shares: list[float], placeholder: bool) -> HeadwayTable:
    """A table from rows in knots (the file's and the window's unit)."""
    return HeadwayTable(tuple(v * KNOT for v in speeds_kn), tuple(shares), placeholder)
