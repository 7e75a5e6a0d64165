"""Tugs and placements built from fields the file reader has already checked.

The frozen dataclasses check every field against its rule (core.model.rules) in
``__post_init__``. The file reader (core.io.decode) checks the same fields by the same
rules as it reads them, because it must name the file's field and its unit in a
message; building the value the usual way would then check each field twice, which is
most of the time a plan of thousands of tugs takes to load. The functions here build
the value without checking it again, and do what ``__post_init__`` does besides
checking (a tug's placeholder capability and headway table).

Only the file reader's plain path (core.io.plain) may use them, and only with values it
has checked by the rule ``__post_init__`` would apply: ``tests/test_architecture.py``
fails if any other module of the program imports this one, and
``tests/core/test_plain_read.py`` holds the values built here equal to the ones built
the usual way.
"""

from __future__ import annotations

from collections.abc import Iterable
from typing import Any

from core.model.capability import Capability, default_capability, tug_kind
from core.model.headway import placeholder_headway
from core.model.tugs import Placement, Tug, astern_share


def _twin(cls: type) -> type:
    """A plain class with the slots of the frozen dataclass ``cls``, in the same order: its
    instances are written with ordinary (fast) attribute stores, then take ``cls`` as
    their class. Python allows that change between classes of one layout; the result is
    an ordinary frozen ``cls``, as immutable as one built by its ``__init__``."""
    return type(f"_{cls.__name__}Fields", (), {"__slots__": cls.__slots__})  # type: ignore[attr-defined]


_PlacementFields = _twin(Placement)
_TugFields = _twin(Tug)
_HEADWAY = placeholder_headway()  # frozen, and the one every tug without its own table shares
#: Each tug type's placeholder capability (no astern pull given), as made before.
_capability_of_type: dict[str, Capability] = {}


def placement(
    tug: str,
    hull: str,
    point: str,
    setting: float,
    lead_rad: float,
    line_length_m: float,
    astern: bool,
    push_pull: bool,
) -> Placement:
    """A Placement without a working sector, from fields each checked by its rule: the
    names are names of the plan (so :data:`rules.NAME` holds), ``setting`` keeps
    :data:`rules.SETTING`, ``lead_rad`` :data:`rules.LEAD` and ``line_length_m``
    :data:`rules.LINE_LENGTH`."""
    p: Any = _PlacementFields()
    p.tug = tug
    p.hull = hull
    p.point = point
    p.setting = setting
    p.lead_rad = lead_rad
    p.line_length_m = line_length_m
    p.astern = astern
    p.lead_sector_rad = None
    p.push_pull = push_pull
    p.__class__ = Placement
    return p  # type: ignore[no-any-return]


def placements(
    tugs: Iterable[str],
    hulls: Iterable[str],
    points: Iterable[str],
    settings: Iterable[float],
    leads_rad: Iterable[float],
    line_lengths_m: Iterable[float],
    asterns: Iterable[bool],
    push_pulls: Iterable[bool],
) -> list[Placement]:
    """Placements without a working sector, one from each row of the columns (each field
    checked by its rule, as :func:`placement` asks)."""
    out: list[Placement] = []
    add = out.append
    fields = _PlacementFields
    for tug, hull, point, setting, lead, length, astern, push_pull in zip(
        tugs, hulls, points, settings, leads_rad, line_lengths_m, asterns, push_pulls, strict=True
    ):
        p: Any = fields()
        p.tug = tug
        p.hull = hull
        p.point = point
        p.setting = setting
        p.lead_rad = lead
        p.line_length_m = length
        p.astern = astern
        p.lead_sector_rad = None
        p.push_pull = push_pull
        p.__class__ = Placement
        add(p)
    return out


def _capability(tug_type: str, astern_pull_n: float | None, bollard_pull_n: float) -> Capability:
    """The placeholder capability of a tug of ``tug_type`` with these pulls."""
    if astern_pull_n is not None:
        return default_capability(tug_kind(tug_type), astern_share(astern_pull_n, bollard_pull_n))
    capability = _capability_of_type.get(tug_type)
    if capability is None:
        capability = default_capability(tug_kind(tug_type), None)
        if len(_capability_of_type) < 1000:
            _capability_of_type[tug_type] = capability
    return capability


def tug(
    name: str,
    bollard_pull_n: float,
    astern_pull_n: float | None,
    tug_type: str,
    role: str,
    towing_point_height_m: float | None,
    certificate_date: str,
    towline_length_m: float | None,
    towline_mbl_n: float | None,
    call_sign: str,
    working_channel: str,
    towline_warn_fraction: float,
) -> Tug:
    """A Tug with its type's placeholder capability and headway table, from fields each
    checked by the rule :class:`Tug` applies to it (the name by :data:`rules.NAME`, the
    texts by :data:`rules.LABEL`, the numbers by their ranges; None where not given)."""
    capability = _capability(tug_type, astern_pull_n, bollard_pull_n)
    t: Any = _TugFields()
    t.name = name
    t.bollard_pull_n = bollard_pull_n
    t.astern_pull_n = astern_pull_n
    t.tug_type = tug_type
    t.role = role
    t.towing_point_height_m = towing_point_height_m
    t.certificate_date = certificate_date
    t.towline_length_m = towline_length_m
    t.towline_mbl_n = towline_mbl_n
    t.call_sign = call_sign
    t.working_channel = working_channel
    t.towline_warn_fraction = towline_warn_fraction
    t.capability = capability
    t.headway = _HEADWAY
    t.__class__ = Tug
    return t  # type: ignore[no-any-return]


def tugs(
    names: Iterable[str],
    bollard_pulls_n: Iterable[float],
    astern_pulls_n: Iterable[float | None],
    tug_types: Iterable[str],
    roles: Iterable[str],
    towing_point_heights_m: Iterable[float | None],
    certificate_dates: Iterable[str],
    towline_lengths_m: Iterable[float | None],
    towline_mbls_n: Iterable[float | None],
    call_signs: Iterable[str],
    working_channels: Iterable[str],
    towline_warn_fractions: Iterable[float],
) -> list[Tug]:
    """Tugs with their types' placeholder capability and headway table, one from each row
    of the columns (each field checked by its rule, as :func:`tug` asks)."""
    out: list[Tug] = []
    add = out.append
    fields = _TugFields
    capability_of_type = _capability_of_type
    headway = _HEADWAY
    for (
        name,
        bollard_pull_n,
        astern_pull_n,
        tug_type,
        role,
        height,
        certificate_date,
        towline_length,
        towline_mbl,
        call_sign,
        working_channel,
        warn_fraction,
    ) in zip(
        names,
        bollard_pulls_n,
        astern_pulls_n,
        tug_types,
        roles,
        towing_point_heights_m,
        certificate_dates,
        towline_lengths_m,
        towline_mbls_n,
        call_signs,
        working_channels,
        towline_warn_fractions,
        strict=True,
    ):
        capability = None if astern_pull_n is not None else capability_of_type.get(tug_type)
        if capability is None:
            capability = _capability(tug_type, astern_pull_n, bollard_pull_n)
        t: Any = fields()
        t.name = name
        t.bollard_pull_n = bollard_pull_n
        t.astern_pull_n = astern_pull_n
        t.tug_type = tug_type
        t.role = role
        t.towing_point_height_m = height
        t.certificate_date = certificate_date
        t.towline_length_m = towline_length
        t.towline_mbl_n = towline_mbl
        t.call_sign = call_sign
        t.working_channel = working_channel
        t.towline_warn_fraction = warn_fraction
        t.capability = capability
        t.headway = headway
        t.__class__ = Tug
        add(t)
    return out
