"""A tug's usable pull: rated pull x efficiency x towline angle.

The efficiency of a tug falls as the sea gets up, more for a small tug than a large
one. The table below is the user's data: its default values are placeholders with
no source (1.0 in sheltered water), to be replaced by figures the planner trusts.
The table is looked up by the tug's rated bollard pull ahead and the stage's sea
state, linearly between rows and columns and held at the edges.

A towline made fast on a high deck runs down to the tug's towing point; only its
horizontal part moves the body: horizontal pull = tension x cos(angle below the
horizontal) (geometry, common practice). The angle comes from the hull's freeboard,
the tug's towing point height and the line's horizontal length. Pushing tugs have no
line and lose nothing here. A tug working astern uses its astern pull.
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np

from core.errors import InputError

#: A towline steeper than this below (or above) the horizontal is warned about
#: (common practice, no source: at 20 degrees 6 % of the pull is lost).
STEEP_LINE_DEG = 20.0

TONNE_FORCE = 9806.65


def _default_pulls() -> tuple[float, ...]:
    return (20 * TONNE_FORCE, 50 * TONNE_FORCE, 100 * TONNE_FORCE)


def _default_values() -> tuple[tuple[float, ...], ...]:
    # Placeholders, no source: rows by bollard pull, columns by sea state 0, 2, 4, 6.
    return (
        (1.0, 0.9, 0.7, 0.45),
        (1.0, 0.93, 0.8, 0.6),
        (1.0, 0.95, 0.85, 0.7),
    )


@dataclass(frozen=True, slots=True)
class EfficiencyTable:
    """Tug efficiency (0-1) by rated bollard pull (rows, N) and sea state (columns, 0-9)."""

    bollard_pulls_n: tuple[float, ...] = field(default_factory=_default_pulls)
    sea_states: tuple[float, ...] = (0.0, 2.0, 4.0, 6.0)
    values: tuple[tuple[float, ...], ...] = field(default_factory=_default_values)

    def __post_init__(self) -> None:
        bp = tuple(float(v) for v in self.bollard_pulls_n)
        ss = tuple(float(v) for v in self.sea_states)
        vals = tuple(tuple(float(v) for v in row) for row in self.values)
        _ascending("efficiency table bollard pulls", bp, low=0.0, strict_low=True)
        _ascending("efficiency table sea states", ss, low=0.0, high=9.0)
        if len(vals) != len(bp):
            raise InputError(
                "efficiency table", len(vals), f"must have {len(bp)} rows, one per bollard pull"
            )
        for i, row in enumerate(vals):
            if len(row) != len(ss):
                raise InputError(
                    f"efficiency table row {i + 1}",
                    len(row),
                    f"must have {len(ss)} values, one per sea state",
                )
            for j, v in enumerate(row):
                if not (math.isfinite(v) and 0.0 <= v <= 1.0):
                    raise InputError(
                        f"efficiency table row {i + 1}, sea state {ss[j]:g}", v, "must be 0 to 1"
                    )
        object.__setattr__(self, "bollard_pulls_n", bp)
        object.__setattr__(self, "sea_states", ss)
        object.__setattr__(self, "values", vals)

    def efficiency(self, bollard_pull_n: float, sea_state: float) -> float:
        """Bilinear interpolation in the table, held at its edges."""
        return float(self.efficiencies(np.array([bollard_pull_n]), sea_state)[0])

    def efficiencies(self, bollard_pulls_n: np.ndarray, sea_state: float) -> np.ndarray:
        """(n,) efficiencies for tugs of the given rated bollard pulls (n,), N."""
        by_sea = [float(np.interp(sea_state, self.sea_states, row)) for row in self.values]
        return np.interp(np.asarray(bollard_pulls_n, dtype=float), self.bollard_pulls_n, by_sea)


def _ascending(
    name: str,
    values: Sequence[float],
    *,
    low: float,
    high: float | None = None,
    strict_low: bool = False,
) -> None:
    if not values:
        raise InputError(name, values, "must have at least one value")
    for v in values:
        bad_low = v <= low if strict_low else v < low
        if not math.isfinite(v) or bad_low or (high is not None and v > high):
            span = f"above {low:g}" if strict_low else f"{low:g} or more"
            if high is not None:
                span = f"{low:g} to {high:g}"
            raise InputError(name, v, f"must be {span}")
    if any(b <= a for a, b in itertools.pairwise(values)):
        raise InputError(name, list(values), "must be in increasing order")


def line_angle_rad(
    freeboard_m: float | None, towing_point_height_m: float | None, line_length_m: float
) -> float:
    """Angle of a towline off the horizontal, rad (0 when a height is unknown)."""
    if freeboard_m is None or towing_point_height_m is None:
        return 0.0
    if not (math.isfinite(line_length_m) and line_length_m > 0):
        raise InputError("line length", line_length_m, "must be a positive length")
    return math.atan2(abs(freeboard_m - towing_point_height_m), line_length_m)


def horizontal_factor(angle_rad: float) -> float:
    """Share of the line's tension that pulls horizontally: cos(angle)."""
    return math.cos(angle_rad)


@dataclass(frozen=True, slots=True)
class UsablePull:
    """How one tug's usable pull is made up (N and fractions)."""

    rated_n: float
    efficiency: float
    line_angle_rad: float

    @property
    def usable_n(self) -> float:
        return self.rated_n * self.efficiency * horizontal_factor(self.line_angle_rad)

    @property
    def steep(self) -> bool:
        return math.degrees(self.line_angle_rad) > STEEP_LINE_DEG + 1e-9


def usable_pull(
    rated_n: float,
    bollard_pull_n: float,
    sea_state: float,
    table: EfficiencyTable,
    angle_rad: float = 0.0,
) -> UsablePull:
    """A tug's usable pull from its rated pull (ahead or astern) for the way it works."""
    return UsablePull(rated_n, table.efficiency(bollard_pull_n, sea_state), angle_rad)


# -- fittings (IMO MSC.1/Circ.1175, 2005) -----------------------------------------------

#: Design load of a towing fitting as a multiple of the intended maximum towing load.
FITTING_DESIGN_FACTOR = 1.25
#: Largest safe working load as a fraction of the design load.
FITTING_SWL_FRACTION = 0.8


def fitting_design_load_n(max_towing_load_n: float) -> float:
    """Design load of a towing fitting: 1.25 x the intended maximum towing load (IMO)."""
    return FITTING_DESIGN_FACTOR * max_towing_load_n


def largest_swl_n(design_load_n: float) -> float:
    """The largest SWL a fitting of this design load may carry: 80 % of it (IMO)."""
    return FITTING_SWL_FRACTION * design_load_n


def fitting_suits(swl_n: float, bollard_pull_n: float) -> bool:
    """Whether a fitting of SWL ``swl_n`` suits a tug of this bollard pull.

    A fitting designed for a tug of bollard pull P has design load 1.25 P and SWL up
    to 0.8 x 1.25 P = P, so a fitting of SWL S suits tugs of bollard pull up to S.
    """
    return bollard_pull_n <= largest_swl_n(fitting_design_load_n(swl_n)) * (1 + 1e-9)
