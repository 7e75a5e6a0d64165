"""Tugs and where they work.

A :class:`Tug` holds the particulars entered once for the plan. A :class:`Placement`
says, for one stage, where the tug works (a line point or a push point on a hull),
how its line leads and how hard it is asked to work (its setting).
"""

from __future__ import annotations

from dataclasses import dataclass, replace

from core.errors import InputError
from core.model import rules


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
        rules.NAME.check(self.name, "tug")
        subject = f"tug {self.name}"
        for attr, label in (
            ("tug_type", "type"),
            ("role", "role"),
            ("certificate_date", "certificate date"),
            ("call_sign", "call sign"),
            ("working_channel", "working channel"),
        ):
            rules.LABEL.check(getattr(self, attr), f"{subject}: {label}")
        rules.BOLLARD_PULL.check(self.bollard_pull_n, subject)
        if self.astern_pull_n is None:
            object.__setattr__(self, "astern_pull_n", self.bollard_pull_n)
        else:
            rules.ASTERN_PULL.check(self.astern_pull_n, subject)
        rules.TOWING_POINT_HEIGHT.check_optional(self.towing_point_height_m, subject)
        rules.TOWLINE_LENGTH.check_optional(self.towline_length_m, subject)
        rules.TOWLINE_MBL.check_optional(self.towline_mbl_n, subject)

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
        Fraction of the tug's usable pull asked for, 0 to 1 (1.0 is 100 %).
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
        rules.NAME.check(self.tug, "placement: tug")
        rules.NAME.check(self.hull, f"tug {self.tug}: hull")
        rules.NAME.check(self.point, f"tug {self.tug}: point")
        subject = f"tug {self.tug}"
        rules.SETTING.check(self.setting, subject)
        rules.LEAD.check(self.lead_rad, subject)
        rules.LINE_LENGTH.check(self.line_length_m, subject)
        if self.lead_sector_rad is not None:
            sector = self.lead_sector_rad
            if not (isinstance(sector, tuple) and len(sector) == 2):
                raise InputError(f"{subject}: lead sector", sector, "must be two angles")
            lo = rules.LEAD.check(sector[0], f"{subject}: lead sector")
            hi = rules.LEAD.check(sector[1], f"{subject}: lead sector")
            object.__setattr__(self, "lead_sector_rad", (lo, hi))

    def with_setting(self, setting: float) -> Placement:
        return replace(self, setting=float(setting))

    def with_lead(self, lead_rad: float, line_length_m: float | None = None) -> Placement:
        length = self.line_length_m if line_length_m is None else float(line_length_m)
        return replace(self, lead_rad=float(lead_rad), line_length_m=length)

    def at_point(self, hull: str, point: str) -> Placement:
        return replace(self, hull=hull, point=point)
