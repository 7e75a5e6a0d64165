"""Wind and current for a stage.

Wind is given as the true bearing it blows *from*; current as the true bearing it
sets *towards* (both common practice). Speeds are m/s in the core.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, fields

from core.errors import InputError


@dataclass(frozen=True, slots=True)
class Conditions:
    """Wind and current for one stage, with the coefficients used for their loads."""

    wind_speed_ms: float = 0.0
    wind_height_m: float = 10.0
    wind_from_deg: float = 0.0
    gust_factor: float = 1.0
    current_speed_ms: float = 0.0
    current_towards_deg: float = 0.0
    air_density: float = 1.225  # kg/m^3, ISO 2533 standard atmosphere at 15 C
    water_density: float = 1025.0  # kg/m^3, common practice for seawater

    def __post_init__(self) -> None:
        for f in fields(self):
            v = getattr(self, f.name)
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
