"""Tugs and where they work.

A :class:`Tug` holds the particulars entered once for the plan: its pulls, its type and
capability (:mod:`core.model.capability`) and its towline. A :class:`Placement` says,
for one stage, where the tug works (a line point or a push point on a hull), how its
line leads, how hard it is asked to work (its setting) and the working sector within
which it may change its lead when the pulls are solved.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, fields, replace

from core.errors import InputError
from core.model import rules
from core.model.capability import Capability, TugKind, Way, default_capability, tug_kind
from core.model.headway import HeadwayTable, placeholder_headway
from core.units import filed, percent_words

#: Default share of a towline's minimum breaking load above which its tension is warned
#: about (common practice, no source: harbour towlines are commonly sized at two to three
#: times the bollard pull; ocean towing rules ask more, see shared/REFERENCES.md).
TENSION_WARN_FRACTION = 0.5

#: Astern pull as a share of the bollard pull when none is given, by kind (placeholders,
#: as in core.model.capability; other kinds keep the pull ahead, as before types existed).
_DEFAULT_ASTERN: dict[str, float] = {
    "conventional single screw": 0.35,
    "conventional twin screw": 0.5,
}


def astern_share(astern_pull_n: float, bollard_pull_n: float) -> float:
    """The astern pull's share of the pull ahead that a placeholder capability follows,
    worked from the two pulls as a plan file holds them (kN, 12 significant digits): a
    pull typed with more digits then gives the shares it gives when loaded back, so the
    first save is the one every later save repeats."""
    return filed(astern_pull_n / 1000.0) / filed(bollard_pull_n / 1000.0)


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
        Free text naming its type: "ASD", "tractor", "conventional single screw",
        "conventional twin screw", or the user's own words (kind "other"); see
        :attr:`kind`.
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
    towline_warn_fraction:
        The towline's tension above this share of its MBL is warned about (default
        :data:`TENSION_WARN_FRACTION`, common practice).
    capability:
        Usable share of the bollard pull by direction, for each way of working. None, or
        a placeholder, takes the defaults of the tug's kind (with its astern pull), so a
        placeholder always follows the type and the astern pull.
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
    towline_warn_fraction: float = TENSION_WARN_FRACTION
    capability: Capability | None = None
    headway: HeadwayTable | None = None

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
            rules.LABEL.check(getattr(self, attr), subject, label)
        rules.BOLLARD_PULL.check(self.bollard_pull_n, subject)
        given_astern = rules.ASTERN_PULL.check_optional(self.astern_pull_n, subject) is not None
        rules.TOWING_POINT_HEIGHT.check_optional(self.towing_point_height_m, subject)
        rules.TOWLINE_LENGTH.check_optional(self.towline_length_m, subject)
        rules.TOWLINE_MBL.check_optional(self.towline_mbl_n, subject)
        rules.TOWLINE_WARN_SHARE.check(self.towline_warn_fraction, subject)
        if self.capability is None or self.capability.placeholder:
            share = astern_share(self.astern_pull, self.bollard_pull_n) if given_astern else None
            object.__setattr__(self, "capability", default_capability(self.kind, share))
        if self.headway is None:
            object.__setattr__(self, "headway", placeholder_headway())
        elif not isinstance(self.headway, HeadwayTable):
            raise InputError(f"{subject}: headway table", self.headway, "is not a table")

    def headway_share(self, speed_ms: float) -> float:
        """Share of the bollard pull the tug can give with the tow making ``speed_ms``
        through the water (1 at rest when its table says so)."""
        table = self.headway if self.headway is not None else placeholder_headway()
        return table.share_at(speed_ms)

    @property
    def astern_pull(self) -> float:
        """Rated pull astern, N: as given, else the kind's placeholder share of the pull
        ahead (the pull ahead for kinds without one). "Not given" stays None in the value
        so that the file writes back what the planner gave."""
        if self.astern_pull_n is not None:
            return float(self.astern_pull_n)
        share = _DEFAULT_ASTERN.get(self.kind)
        return self.bollard_pull_n * (1.0 if share is None else share)

    def rated_pull(self, astern: bool) -> float:
        return self.astern_pull if astern else self.bollard_pull_n

    @property
    def kind(self) -> TugKind:
        """The kind of tug its type names (ASD, tractor, conventional..., or other)."""
        return tug_kind(self.tug_type)

    @property
    def capability_curves(self) -> Capability:
        """The capability in force (never None once constructed)."""
        cap = self.capability
        if cap is None:  # pragma: no cover - filled in by __post_init__
            raise InputError(f"tug {self.name}: capability", None, "is missing")
        return cap

    def share(self, way: Way, bearing_deg: float) -> float:
        """Usable share of the bollard pull working ``way`` at a relative bearing of its
        own heading (0 when the tug cannot work that way)."""
        curve = self.capability_curves.curve(way)
        return 0.0 if curve is None else curve.at_bearing(bearing_deg)

    def with_astern_pull(self, astern_pull_n: float | None) -> Tug:
        """The tug with a new astern pull, N (None: not given, the kind's placeholder)."""
        return replace(self, astern_pull_n=astern_pull_n)

    def with_capability(self, capability: Capability | None) -> Tug:
        """The tug with a new capability (None: the defaults of its kind)."""
        return replace(self, capability=capability)

    @property
    def towline_warn_tension_n(self) -> float | None:
        """Tension above which the towline is warned about, N (None without an MBL)."""
        if self.towline_mbl_n is None:
            return None
        return self.towline_mbl_n * self.towline_warn_fraction


#: The name of a tug's certified bollard pull ahead (its ``bollard_pull_n``) wherever it
#: is shown: one name, as in the project's names table (a column title: BOLLARD_PULL_TITLE).
BOLLARD_PULL_NAME = "rated bollard pull (BP)"
BOLLARD_PULL_TITLE = BOLLARD_PULL_NAME[:1].upper() + BOLLARD_PULL_NAME[1:]

#: The words for a tug made fast with a setting of exactly nothing: on its line, not pulling.
STANDING_BY = "standing by"


def standing_by(setting: float) -> bool:
    """Whether a tug made fast at ``setting`` stands by: only at a setting of exactly
    nothing. Any pull, however small, counts in the stage's balance (and may be what its
    verdict rests on), so a tug giving it is working, whatever its setting rounds to."""
    return setting == 0.0


def setting_words(setting: float) -> str:
    """A tug's setting as every view prints it: "60 %", "0.5 %", or "0 %, standing by"."""
    words = percent_words(setting)
    return f"{words}, {STANDING_BY}" if standing_by(setting) else words


def setting_cell(setting: float) -> str:
    """A tug's setting in a narrow column: "60 %", "0.5 %", or "standing by" alone (the
    words say the setting of nothing; "0 %, standing by" wraps in a narrow column)."""
    return STANDING_BY if standing_by(setting) else percent_words(setting)


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
        The tug works astern (on a line: it pulls at 180 of its own heading).
    lead_sector_rad:
        Optional working sector: (low, high) limits on the lead for solving, in the same
        frame as ``lead_rad``, counter-clockwise from low to high; kept with ``low`` in
        (-pi, pi] and 0 <= high - low <= 2 pi (a whole circle for a push-pull tug).
    push_pull:
        At a push point: the tug is made fast there and can push or pull (push-pull);
        otherwise it only pushes. No meaning at a line point.
    """

    tug: str
    hull: str
    point: str
    setting: float = 0.0
    lead_rad: float = 0.0
    line_length_m: float = 30.0
    astern: bool = False
    lead_sector_rad: tuple[float, float] | None = None
    push_pull: bool = False

    def __post_init__(self) -> None:
        rules.NAME.check(self.tug, "placement", "tug")
        subject = f"tug {self.tug}"
        rules.NAME.check(self.hull, subject, "hull")
        rules.NAME.check(self.point, subject, "point")
        rules.SETTING.check(self.setting, subject)
        rules.LEAD.check(self.lead_rad, subject)
        rules.LINE_LENGTH.check(self.line_length_m, subject)
        if self.lead_sector_rad is not None:
            sector = self.lead_sector_rad
            if not (isinstance(sector, tuple) and len(sector) == 2):
                raise InputError(f"{subject}: lead sector", sector, "must be two angles")
            lo = rules.LEAD.check(sector[0], f"{subject}: lead sector")
            hi = rules.LEAD.check(sector[1], f"{subject}: lead sector")
            object.__setattr__(self, "lead_sector_rad", sector_span(lo, hi))

    @property
    def standing_by(self) -> bool:
        """The tug is made fast and not pulling (its setting is exactly nothing)."""
        return standing_by(self.setting)

    @property
    def sector_width_rad(self) -> float:
        """Width of the working sector, rad (0 without one)."""
        if self.lead_sector_rad is None:
            return 0.0
        return self.lead_sector_rad[1] - self.lead_sector_rad[0]

    def with_sector(self, sector: tuple[float, float] | None) -> Placement:
        return replace(self, lead_sector_rad=sector)

    def with_setting(self, setting: float) -> Placement:
        """The placement asked for ``setting``: only that value is checked (the others
        were when this placement was made), since a live solve sets every tug's setting
        on every mouse move."""
        value = rules.SETTING.check(float(setting), f"tug {self.tug}")
        new = object.__new__(Placement)
        for name in _PLACEMENT_FIELDS:
            object.__setattr__(new, name, getattr(self, name))
        object.__setattr__(new, "setting", value)
        return new

    def with_lead(self, lead_rad: float, line_length_m: float | None = None) -> Placement:
        length = self.line_length_m if line_length_m is None else float(line_length_m)
        return replace(self, lead_rad=float(lead_rad), line_length_m=length)

    def at_point(self, hull: str, point: str) -> Placement:
        return replace(self, hull=hull, point=point)


_PLACEMENT_FIELDS = tuple(f.name for f in fields(Placement))


def sector_span(low_rad: float, high_rad: float) -> tuple[float, float]:
    """A sector counter-clockwise from ``low_rad`` to ``high_rad`` as (low, high) with low
    in (-pi, pi] and 0 <= high - low <= 2 pi. A difference of a whole turn or more is
    the whole circle; otherwise the difference is taken modulo a turn."""
    tau = 2 * math.pi
    lo = math.remainder(low_rad, tau)
    if lo <= -math.pi:
        lo += tau
    diff = high_rad - low_rad
    width = tau if diff >= tau - 1e-12 else diff % tau
    if width > tau - 1e-12:
        width = 0.0 if diff < tau - 1e-12 else tau
    return (lo, lo + width)
