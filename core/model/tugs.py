"""Tugs and where they work.

A :class:`Tug` holds the particulars entered once for the plan. A :class:`Placement`
says, for one stage, where the tug works (a line point or a push point on a hull),
how its line leads and how hard it is asked to work (its setting).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from core.errors import InputError


def _check_force(field: str, value: float, *, allow_zero: bool = False) -> None:
    ok = math.isfinite(value) and (value >= 0 if allow_zero else value > 0)
    if not ok:
        raise InputError(
            field, value, "must be a positive force" if not allow_zero else "must not be negative"
        )


@dataclass(frozen=True, slots=True)
class Tug:
    """A tug's particulars, entered once for the plan.

    Parameters
    ----------
    bollard_pull_n:
        Rated (certified) bollard pull ahead, N.
    astern_pull_n:
        Rated pull astern, N (defaults to the pull ahead).
    tug_type:
        Free text: "ASD", "tractor", "conventional twin screw"...
    role:
        Free text for the briefing: "centre lead forward", "pushing starboard quarter".
    towing_point_height_m:
        Height of the tug's towing point (staple, winch or hook) above the water, m.
    certificate_date:
        Date of the bollard pull certificate, as written on it (free text, ISO date
        preferred).
    towline_length_m:
        Length of the tug's towline, m, where known.
    towline_mbl_n:
        Minimum breaking load of the tug's towline, N, where known.
    call_sign, working_channel:
        The tug's radio call sign and the VHF channel it works on in this move.
    """

    name: str
    bollard_pull_n: float
    astern_pull_n: float | None = None
    tug_type: str = ""
    role: str = ""
    towing_point_height_m: float | None = None
    certificate_date: str = ""
    towline_length_m: float | None = None
    towline_mbl_n: float | None = None
    call_sign: str = ""
    working_channel: str = ""

    def __post_init__(self) -> None:
        if not self.name.strip():
            raise InputError("tug name", self.name, "must not be empty")
        _check_force(f"tug {self.name}: bollard pull", self.bollard_pull_n)
        if self.astern_pull_n is None:
            object.__setattr__(self, "astern_pull_n", self.bollard_pull_n)
        else:
            _check_force(f"tug {self.name}: astern pull", self.astern_pull_n, allow_zero=True)
        h = self.towing_point_height_m
        if h is not None and not (math.isfinite(h) and h >= 0):
            raise InputError(f"tug {self.name}: towing point height", h, "must be zero or positive")
        n = self.towline_length_m
        if n is not None and not (math.isfinite(n) and n > 0):
            raise InputError(f"tug {self.name}: towline length", n, "must be a positive length")
        if self.towline_mbl_n is not None:
            _check_force(f"tug {self.name}: towline MBL", self.towline_mbl_n)

    @property
    def astern_pull(self) -> float:
        """Rated pull astern, N (never None once constructed)."""
        return float(self.astern_pull_n if self.astern_pull_n is not None else self.bollard_pull_n)

    def rated_pull(self, astern: bool) -> float:
        return self.astern_pull if astern else self.bollard_pull_n


@dataclass(frozen=True, slots=True)
class Placement:
    """Where one tug works in one stage, and how hard.

    Parameters
    ----------
    tug:
        Name of a tug of the plan.
    hull, point:
        The hull and the fitting (line point or push point) the tug works at.
    setting:
        Fraction of the tug's usable pull asked for (1.0 is 100 %; above 1 warns).
    lead_rad:
        Line point: direction of the towline from the point towards the tug, hull-frame
        angle (rad, counter-clockwise from ahead). Push point: angle of the push off
        the inward normal, counter-clockwise (0 pushes square to the hull).
    line_length_m:
        Line point: horizontal length of towline from the fitting to the tug, m.
    astern:
        The tug works astern (uses its astern pull).
    lead_sector_rad:
        Optional (low, high) limits on the lead for solving, in the same frame as
        ``lead_rad``, counter-clockwise from low to high.
    """

    tug: str
    hull: str
    point: str
    setting: float = 0.0
    lead_rad: float = 0.0
    line_length_m: float = 30.0
    astern: bool = False
    lead_sector_rad: tuple[float, float] | None = None

    def __post_init__(self) -> None:
        if not (math.isfinite(self.setting) and self.setting >= 0):
            raise InputError(f"tug {self.tug}: setting", self.setting, "must be zero or more")
        if not math.isfinite(self.lead_rad):
            raise InputError(f"tug {self.tug}: lead", self.lead_rad, "must be finite")
        if not (math.isfinite(self.line_length_m) and self.line_length_m > 0):
            raise InputError(
                f"tug {self.tug}: line length", self.line_length_m, "must be a positive length"
            )
        if self.lead_sector_rad is not None:
            lo, hi = (float(v) for v in self.lead_sector_rad)
            if not (math.isfinite(lo) and math.isfinite(hi)):
                raise InputError(
                    f"tug {self.tug}: lead sector", self.lead_sector_rad, "must be finite"
                )
            object.__setattr__(self, "lead_sector_rad", (lo, hi))

    def with_setting(self, setting: float) -> Placement:
        return replace(self, setting=float(setting))

    def with_lead(self, lead_rad: float, line_length_m: float | None = None) -> Placement:
        length = self.line_length_m if line_length_m is None else float(line_length_m)
        return replace(self, lead_rad=float(lead_rad), line_length_m=length)

    def at_point(self, hull: str, point: str) -> Placement:
        return replace(self, hull=hull, point=point)
