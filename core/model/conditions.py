"""Wind and current for a stage: the values the planner gives.

Wind is given as the true bearing it blows *from*; current as the true bearing it
sets *towards* (both common practice). Speeds are m/s in the core. The loads these
put on a body are worked out in :mod:`core.mechanics.loads`.

The wind speed is the mean speed at ``wind_height_m``; it is brought to 10 m by the
power law U(z) = U10 (z / 10)^a (a = 0.12 over open sea, DNV-RP-C205, from memory;
1/7 is common practice over land) and multiplied by the gust factor for the load.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, fields

from core.errors import InputError

_OPTIONAL_POSITIVE = (
    "wind_coeff_head",
    "wind_coeff_beam",
    "current_coeff_head",
    "current_coeff_beam",
    "wind_area_head_m2",
    "wind_area_beam_m2",
    "current_area_head_m2",
    "current_area_beam_m2",
)


@dataclass(frozen=True, slots=True)
class Conditions:
    """Wind and current for one stage, with the coefficients used for their loads.

    Parameters
    ----------
    wind_speed_ms, wind_height_m:
        Mean wind speed, m/s, measured at ``wind_height_m`` above the water.
    wind_from_deg:
        True bearing the wind blows from.
    gust_factor:
        Ratio of the gust speed to the mean speed used for the load (1 = mean wind).
    wind_exponent:
        Power-law exponent for the height correction (0.12 open sea, DNV-RP-C205, from
        memory; 1/7 common practice).
    current_speed_ms, current_towards_deg:
        Current speed, m/s, and the true bearing it sets towards.
    air_density, water_density:
        kg/m^3. Defaults: 1.225 (ISO 2533 standard atmosphere at 15 C, from memory) and
        1025 (seawater, common practice; ITTC gives 1026.02 at 15 C).
    wind_coeff_head, wind_coeff_beam:
        Wind drag coefficients on the head-on and side areas. Defaults 0.8 and 1.2, in
        the box-barge ranges 0.6-1.0 and 1.0-1.3 (common practice).
    current_coeff_head:
        Current drag coefficient on the head-on underwater area; default 0.6 (a blunt
        box end, common practice, no source).
    current_coeff_beam:
        Current drag coefficient on the side underwater area; None takes Hoerner's
        2-D cross-flow value for the body's B / (2T).
    wind_area_*_m2, current_area_*_m2:
        Projected areas, m^2; None derives them from the outline and the freeboard
        (wind) or the draught (current).
    wind_centre_m, current_centre_m:
        A user-set centre of pressure (x, y) in the body frame, m; None uses the centre
        of each projection.
    sea_state:
        Sea state code 0-9 (Douglas), used to look up the tugs' efficiency.
    """

    wind_speed_ms: float = 0.0
    wind_height_m: float = 10.0
    wind_from_deg: float = 0.0
    gust_factor: float = 1.0
    current_speed_ms: float = 0.0
    current_towards_deg: float = 0.0
    air_density: float = 1.225
    water_density: float = 1025.0
    wind_exponent: float = 0.12
    wind_coeff_head: float = 0.8
    wind_coeff_beam: float = 1.2
    current_coeff_head: float = 0.6
    current_coeff_beam: float | None = None
    wind_area_head_m2: float | None = None
    wind_area_beam_m2: float | None = None
    current_area_head_m2: float | None = None
    current_area_beam_m2: float | None = None
    wind_centre_m: tuple[float, float] | None = field(default=None)
    current_centre_m: tuple[float, float] | None = field(default=None)
    sea_state: float = 0.0

    def __post_init__(self) -> None:
        for f in fields(self):
            v = getattr(self, f.name)
            if isinstance(v, bool):
                raise InputError(f"conditions {f.name}", v, "must be a number")
            if isinstance(v, float | int) and not math.isfinite(v):
                raise InputError(f"conditions {f.name}", v, "must be finite")
        for name in ("wind_speed_ms", "current_speed_ms"):
            if getattr(self, name) < 0:
                raise InputError(f"conditions {name}", getattr(self, name), "must not be negative")
        for name in ("wind_height_m", "air_density", "water_density"):
            if getattr(self, name) <= 0:
                raise InputError(f"conditions {name}", getattr(self, name), "must be positive")
        if self.gust_factor < 1:
            raise InputError("conditions gust_factor", self.gust_factor, "must be 1 or more")
        if not 0 <= self.wind_exponent <= 1:
            raise InputError("conditions wind_exponent", self.wind_exponent, "must be 0 to 1")
        for name in _OPTIONAL_POSITIVE:
            v = getattr(self, name)
            if v is not None and not (math.isfinite(v) and v > 0):
                raise InputError(f"conditions {name}", v, "must be positive")
        for name in ("wind_centre_m", "current_centre_m"):
            v = getattr(self, name)
            if v is not None:
                x, y = (float(c) for c in v)
                if not (math.isfinite(x) and math.isfinite(y)):
                    raise InputError(f"conditions {name}", v, "must be finite")
                object.__setattr__(self, name, (x, y))
        if not 0 <= self.sea_state <= 9:
            raise InputError("conditions sea_state", self.sea_state, "must be 0 to 9")

    @property
    def wind_speed_10m_ms(self) -> float:
        """Mean wind speed at 10 m by the power law, m/s."""
        return wind_at_10m(self.wind_speed_ms, self.wind_height_m, self.wind_exponent)

    @property
    def design_wind_ms(self) -> float:
        """The wind speed the load is computed with: 10 m mean times the gust factor."""
        return self.wind_speed_10m_ms * self.gust_factor


def wind_at_height(u10_ms: float, height_m: float, exponent: float) -> float:
    """Power law U(z) = U10 (z / 10)^a, m/s."""
    if not (math.isfinite(height_m) and height_m > 0):
        raise InputError("wind height", height_m, "must be a positive height")
    return u10_ms * (height_m / 10.0) ** exponent


def wind_at_10m(speed_ms: float, height_m: float, exponent: float) -> float:
    """A wind speed measured at ``height_m`` brought to 10 m by the power law, m/s."""
    if not (math.isfinite(height_m) and height_m > 0):
        raise InputError("wind height", height_m, "must be a positive height")
    return speed_ms / (height_m / 10.0) ** exponent
