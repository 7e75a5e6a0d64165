"""The plain case of a file's tugs and placements, read at once.

A plan of thousands of tugs is mostly tugs and placements written as the program writes
them: known keys, names of the plan, numbers within their rules. The readers here take
only that case, each field checked once by its rule (core.model.rules) in the file's
unit, and build the value without checking it again (core.model.checked). Anything else
(a key they do not know, a null, a number out of its range, a working sector, a
capability or headway table) gives :data:`NOT_PLAIN`, and the careful reader in core.io.decode reads
that entry instead: it says what is wrong with the field's path, or reads what is not
plain. Both give the same value for an entry both read (tests/core/test_plain_read.py).

:func:`tugs` and :func:`placements` read a whole list a column at a time
(core.io.columns) when every entry of it is plain, and give the values :func:`tug` and
:func:`placement` give one by one; a list with one entry that is not plain is read
entry by entry.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from itertools import repeat
from typing import Any

from core.frames import bearing_to_angle, bearings_to_angles
from core.io import columns
from core.io.columns import file_bounds
from core.io.fileformat import (
    KN,
    PLACEMENT_OPTIONAL,
    PLACEMENT_REQUIRED,
    TUG_OPTIONAL,
    TUG_REQUIRED,
    num,
)
from core.model import checked, rules
from core.model.tugs import TENSION_WARN_FRACTION

#: What a plain reader gives for a value it does not take.
NOT_PLAIN: Any = object()


def plain_number(rule: rules.Range, nullable: bool = False) -> Callable[[Any], Any]:
    """A reader of one number of the file for ``rule``: a float or an int (not a bool) in the
    file's unit whose SI value keeps ``rule`` gives that SI value; None gives None when
    ``nullable``; anything else gives :data:`NOT_PLAIN`."""
    factor, lo, hi = file_bounds(rule)

    def read(v: Any) -> Any:
        if type(v) is float or (type(v) is int and -1e300 < v < 1e300):
            si = v * factor
            if lo <= si <= hi:
                return si
        elif v is None and nullable:
            return None
        return NOT_PLAIN

    return read


_name_problem = rules.NAME.problem
_label_problem = rules.LABEL.problem

# The placement's numbers are tested inline (a call per number was a third of the time):
# each with its rule's bounds, taken from the rule here.
_SETTING_F, _SETTING_LO, _SETTING_HI = file_bounds(rules.SETTING)
_BEARING_F, _BEARING_LO, _BEARING_HI = file_bounds(rules.BEARING)
_LENGTH_F, _LENGTH_LO, _LENGTH_HI = file_bounds(rules.LINE_LENGTH)
_push_angle = plain_number(rules.PUSH_ANGLE)

PLACEMENT_KEYS = frozenset(PLACEMENT_REQUIRED + PLACEMENT_OPTIONAL)


def placement(tugs: set[str] | frozenset[str], kinds: dict[str, dict[str, str]], d: Any) -> Any:
    """A placement without a working sector whose every field is plain and right, or
    :data:`NOT_PLAIN`. ``tugs`` are the plan's tug names, ``kinds`` the kind ("line" or
    "push") of each fitting of each hull; the names, being the plan's, keep the name rule."""
    if (
        type(d) is not dict
        or not d.keys() <= PLACEMENT_KEYS
        or d.get("lead_sector_deg") is not None
    ):
        return NOT_PLAIN
    tug, hull, point = d.get("tug"), d.get("hull"), d.get("point")
    if type(tug) is not str or type(hull) is not str or type(point) is not str:
        return NOT_PLAIN
    points = kinds.get(hull)
    kind = None if points is None else points.get(point)
    s = d.get("setting_percent")
    astern, push_pull = d.get("astern", False), d.get("push_pull", False)
    if (
        kind is None
        or tug not in tugs
        or not (type(s) is float or (type(s) is int and -1e300 < s < 1e300))
        or type(astern) is not bool
        or type(push_pull) is not bool
    ):
        return NOT_PLAIN
    setting = s * _SETTING_F
    if not _SETTING_LO <= setting <= _SETTING_HI:
        return NOT_PLAIN
    if kind == "push":
        if "lead_deg" in d or "line_length_m" in d:
            return NOT_PLAIN
        angle = _push_angle(d["push_angle_deg"]) if "push_angle_deg" in d else 0.0
        if angle is NOT_PLAIN:
            return NOT_PLAIN
        return checked.placement(
            tug, hull, point, setting, -math.radians(angle), 30.0, astern, push_pull
        )
    # The defaults, 0 and 30 m, are the same in the file's unit and in SI.
    b, length = d.get("lead_deg", 0.0), d.get("line_length_m", 30.0)
    if (
        push_pull
        or "push_angle_deg" in d
        or not (type(b) is float or (type(b) is int and -1e300 < b < 1e300))
        or not (type(length) is float or (type(length) is int and -1e300 < length < 1e300))
    ):
        return NOT_PLAIN
    bearing, length = b * _BEARING_F, length * _LENGTH_F
    if not (_BEARING_LO <= bearing <= _BEARING_HI and _LENGTH_LO <= length <= _LENGTH_HI):
        return NOT_PLAIN
    lead = bearing_to_angle(bearing)
    return checked.placement(tug, hull, point, setting, lead, length, astern, push_pull)


_PULL_F, _PULL_LO, _PULL_HI = file_bounds(rules.BOLLARD_PULL)
_astern_pull = plain_number(rules.ASTERN_PULL, nullable=True)
_height = plain_number(rules.TOWING_POINT_HEIGHT, nullable=True)
_towline = plain_number(rules.TOWLINE_LENGTH, nullable=True)
_mbl = plain_number(rules.TOWLINE_MBL, nullable=True)
_share = plain_number(rules.TOWLINE_WARN_SHARE)
_pull_holds = rules.BOLLARD_PULL.holds
_astern_holds = rules.ASTERN_PULL.holds

TUG_KEYS = frozenset(TUG_REQUIRED + TUG_OPTIONAL)


_TEXT_KEYS = ("type", "role", "certificate_date", "call_sign", "working_channel")
_NO_TEXTS = ("",) * len(_TEXT_KEYS)
_NUMBER_KEYS = frozenset(
    (
        "astern_pull_kN",
        "towing_point_height_m",
        "towline_length_m",
        "towline_mbl_kN",
        "towline_warning_share_of_mbl",
    )
)


def _texts(d: dict[str, Any]) -> Any:
    """The tug's five texts ("" where absent), or :data:`NOT_PLAIN` if one breaks its rule."""
    texts = tuple(d.get(key, "") for key in _TEXT_KEYS)
    for t in texts:
        if type(t) is not str or _label_problem(t) is not None:
            return NOT_PLAIN
    return texts


def tug(d: Any) -> Any:
    """A tug without its own capability or headway table (its type's placeholders apply)
    whose every field is plain and right, or :data:`NOT_PLAIN`."""
    if type(d) is not dict or not d.keys() <= TUG_KEYS:
        return NOT_PLAIN
    name, raw_bp = d.get("name"), d.get("bollard_pull_kN")
    if (
        type(name) is not str
        or _name_problem(name) is not None
        or not (type(raw_bp) is float or (type(raw_bp) is int and -1e300 < raw_bp < 1e300))
        or d.get("capability") is not None
        or d.get("headway") is not None
    ):
        return NOT_PLAIN
    bp = raw_bp * _PULL_F
    if not _PULL_LO <= bp <= _PULL_HI:
        return NOT_PLAIN
    astern = height = towline = mbl = None
    share = TENSION_WARN_FRACTION
    raw_astern = None
    if not _NUMBER_KEYS.isdisjoint(d):
        raw_astern = d.get("astern_pull_kN")
        astern = _astern_pull(raw_astern)
        height = _height(d.get("towing_point_height_m"))
        towline = _towline(d.get("towline_length_m"))
        mbl = _mbl(d.get("towline_mbl_kN"))
        if "towline_warning_share_of_mbl" in d:
            share = _share(d["towline_warning_share_of_mbl"])
        if NOT_PLAIN in (astern, height, towline, mbl, share):
            return NOT_PLAIN
    texts = _NO_TEXTS if d.keys().isdisjoint(_TEXT_KEYS) else _texts(d)
    if texts is NOT_PLAIN:
        return NOT_PLAIN
    # Pulls are kept as the file writes them (12 digits, in kN), so that a plan's first save
    # gives the same file again; an integer number of kN is one already. Rounded, a pull
    # is checked again (at its rule's bound it could round past it).
    if type(raw_bp) is not int:
        bp = num(bp / KN) * KN
        if not _pull_holds(bp):
            return NOT_PLAIN
    if astern is not None and type(raw_astern) is not int:
        astern = num(astern / KN) * KN
        if not _astern_holds(astern):
            return NOT_PLAIN
    tug_type, role, certificate, call_sign, channel = texts
    return checked.tug(
        name,
        bp,
        astern,
        tug_type,
        role,
        height,
        certificate,
        towline,
        mbl,
        call_sign,
        channel,
        share,
    )


# -- a whole list at once, a column at a time (core.io.columns) -----------------------------


def _numbers(entries: list[Any], key: str, rule: rules.Range, default: Any) -> Any:
    """The SI values of ``key`` of each entry (the number ``default`` where absent), or
    :data:`NOT_PLAIN` unless every one is plain."""
    got = columns.numbers(columns.column(entries, key, default), rule)  # type: ignore[arg-type]
    return NOT_PLAIN if got is None else got


def _optional(entries: list[Any], found: set[str], key: str, rule: rules.Range) -> Any:
    """A column of a nullable number: its SI values (None where null or absent), or
    :data:`NOT_PLAIN`."""
    if key not in found:
        return repeat(None, len(entries))
    got = columns.numbers(columns.column(entries, key, None), rule, nullable=True)  # type: ignore[arg-type]
    return NOT_PLAIN if got is None else got


def _none_at(entries: list[Any], found: set[str], key: str) -> bool:
    """Whether no entry gives ``key`` a value other than null."""
    if key not in found:
        return True
    values = columns.column(entries, key, None)
    return values is not None and values.count(None) == len(values)


def _filed_pulls(raw: list[Any], si: list[Any], rule: rules.Range) -> Any:
    """Pulls as the file writes them (as :func:`tug` keeps them): a pull not given as an
    integer number of kN rounded to 12 digits, and checked again; :data:`NOT_PLAIN` if one
    rounds past its bound."""
    if columns.all_of_type(raw, int):
        return si
    filed = [
        v if v is None or type(r) is int else num(v / KN) * KN for r, v in zip(raw, si, strict=True)
    ]
    given = [v for v in filed if v is not None]
    _, lo, hi = file_bounds(rule)
    if given and not (lo <= min(given) and max(given) <= hi):
        return NOT_PLAIN
    return filed


def tugs(entries: list[Any]) -> Any:
    """Every tug of ``entries``, read a column at a time, if each is plain as :func:`tug`
    takes it (the same value :func:`tug` gives); else :data:`NOT_PLAIN`."""
    found = columns.keys(entries)
    if (
        found is None
        or not found <= TUG_KEYS
        or not _none_at(entries, found, "capability")
        or not _none_at(entries, found, "headway")
    ):
        return NOT_PLAIN
    names = columns.column(entries, "name")
    raw_bp = columns.column(entries, "bollard_pull_kN")
    if names is None or raw_bp is None or not columns.texts(names, rules.NAME):
        return NOT_PLAIN
    bp = columns.numbers(raw_bp, rules.BOLLARD_PULL)
    if bp is None or (bp := _filed_pulls(raw_bp, bp, rules.BOLLARD_PULL)) is NOT_PLAIN:
        return NOT_PLAIN
    astern = _optional(entries, found, "astern_pull_kN", rules.ASTERN_PULL)
    if astern is not NOT_PLAIN and type(astern) is list:
        raw_astern = columns.column(entries, "astern_pull_kN", None)
        astern = _filed_pulls(raw_astern, astern, rules.ASTERN_PULL)  # type: ignore[arg-type]
    numbers = [
        astern,
        _optional(entries, found, "towing_point_height_m", rules.TOWING_POINT_HEIGHT),
        _optional(entries, found, "towline_length_m", rules.TOWLINE_LENGTH),
        _optional(entries, found, "towline_mbl_kN", rules.TOWLINE_MBL),
    ]
    # The share's rule is in plain numbers (one file unit is one SI unit): the default is
    # the same in the file and in the value.
    share: Any = repeat(TENSION_WARN_FRACTION, len(entries))
    if "towline_warning_share_of_mbl" in found:
        share = _numbers(
            entries, "towline_warning_share_of_mbl", rules.TOWLINE_WARN_SHARE, TENSION_WARN_FRACTION
        )
    texts: list[Any] = []
    for key in _TEXT_KEYS:
        if key not in found:
            texts.append(repeat("", len(entries)))
            continue
        values = columns.column(entries, key, "")
        if not columns.texts(values, rules.LABEL):  # type: ignore[arg-type]
            return NOT_PLAIN
        texts.append(values)
    if share is NOT_PLAIN or any(v is NOT_PLAIN for v in numbers):
        return NOT_PLAIN
    astern, height, towline, mbl = numbers
    tug_type, role, certificate, call_sign, channel = texts
    return checked.tugs(
        names,
        bp,
        astern,
        tug_type,
        role,
        height,
        certificate,
        towline,
        mbl,
        call_sign,
        channel,
        share,
    )


def _all_str(values: list[Any]) -> bool:
    """Whether each of ``values`` is text (a name of the plan, if the plan has it)."""
    return columns.all_of_type(values, str)


def _flags(entries: list[Any], found: set[str], key: str) -> Any:
    """A column of true or false (false where absent), or :data:`NOT_PLAIN`."""
    if key not in found:
        return repeat(False, len(entries))
    values = columns.column(entries, key, False)
    return values if columns.all_of_type(values, bool) else NOT_PLAIN  # type: ignore[arg-type]


def _has(entries: list[Any], found: set[str], key: str) -> bool:
    """Whether any of the entries has ``key``."""
    return key in found and any(map(dict.__contains__, entries, repeat(key)))


def _leads(entries: list[Any], found: set[str], push: bool) -> Any:
    """The leads (rad) and line lengths (m) of placements all at line points, or all at
    push points, as :func:`placement` reads them; or :data:`NOT_PLAIN`."""
    if push:
        if _has(entries, found, "lead_deg") or _has(entries, found, "line_length_m"):
            return NOT_PLAIN
        angles = _numbers(entries, "push_angle_deg", rules.PUSH_ANGLE, 0.0)
        if angles is NOT_PLAIN:
            return NOT_PLAIN
        return [-math.radians(a) for a in angles], [30.0] * len(entries)
    if _has(entries, found, "push_angle_deg") or (
        "push_pull" in found and any(map(dict.get, entries, repeat("push_pull")))
    ):
        return NOT_PLAIN
    # The defaults, 0 and 30 m, are the same in the file's unit and in SI.
    bearings = _numbers(entries, "lead_deg", rules.BEARING, 0.0)
    lengths = _numbers(entries, "line_length_m", rules.LINE_LENGTH, 30.0)
    if bearings is NOT_PLAIN or lengths is NOT_PLAIN:
        return NOT_PLAIN
    return bearings_to_angles(bearings), lengths


def placements(
    tugs: set[str] | frozenset[str], kinds: dict[str, dict[str, str]], entries: list[Any]
) -> Any:
    """Every placement of ``entries``, read a column at a time, if each is plain as
    :func:`placement` takes it (the same value :func:`placement` gives); else
    :data:`NOT_PLAIN`."""
    found = columns.keys(entries)
    if (
        found is None
        or not found <= PLACEMENT_KEYS
        or not _none_at(entries, found, "lead_sector_deg")
    ):
        return NOT_PLAIN
    tug, hull, point = (columns.column(entries, key) for key in ("tug", "hull", "point"))
    if (
        tug is None
        or hull is None
        or point is None
        or not (_all_str(tug) and _all_str(hull) and _all_str(point))
    ):
        return NOT_PLAIN
    if not tugs.issuperset(tug):  # type: ignore[arg-type]
        return NOT_PLAIN
    if hull.count(hull[0]) == len(hull) if hull else True:  # one hull (as a rule)
        kind = list(map(kinds.get(hull[0], {}).get, point)) if hull else []
    else:
        kind_of = {(h, p): k for h, points in kinds.items() for p, k in points.items()}
        kind = list(map(kind_of.get, zip(hull, point, strict=True)))  # type: ignore[arg-type]
    settings = _numbers(entries, "setting_percent", rules.SETTING, None)
    astern, push_pull = _flags(entries, found, "astern"), _flags(entries, found, "push_pull")
    if settings is NOT_PLAIN or astern is NOT_PLAIN or push_pull is NOT_PLAIN:
        return NOT_PLAIN
    at = set(kind)
    if not at <= {"line", "push"}:
        return NOT_PLAIN
    if len(at) < 2:
        got = _leads(entries, found, "push" in at)
        if got is NOT_PLAIN:
            return NOT_PLAIN
        leads, lengths = got
    else:
        leads, lengths = [0.0] * len(entries), [0.0] * len(entries)
        for push in (False, True):
            rows = [i for i, k in enumerate(kind) if (k == "push") is push]
            got = _leads([entries[i] for i in rows], found, push)
            if got is NOT_PLAIN:
                return NOT_PLAIN
            for i, lead, length in zip(rows, *got, strict=True):
                leads[i], lengths[i] = lead, length
    return checked.placements(tug, hull, point, settings, leads, lengths, astern, push_pull)
