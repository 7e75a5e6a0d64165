"""A tug's usable pull: rated pull x efficiency x towline angle; fitting ratings.

A towline made fast on a high deck runs down to the tug's towing point; only its
horizontal part moves the body: horizontal pull = tension x cos(angle below the
horizontal) (geometry, common practice). The angle comes from the hull's freeboard,
the tug's towing point height and the line's horizontal length. Pushing tugs have no
line and lose nothing here. A tug working astern uses its astern pull.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from core.errors import InputError
from core.model.efficiency import EfficiencyTable

#: A towline steeper than this below (or above) the horizontal is warned about
#: (common practice, no source: at 20 degrees 6 % of the pull is lost).
STEEP_LINE_DEG = 20.0


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
