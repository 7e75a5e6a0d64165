"""The JSON tree of a ``.towboard`` file to a Project.

Decoding collects every problem with its field path instead of stopping at the
first, and turns the core's own validation errors into file problems. Every number is
checked against its rule (core.model.rules) in the file's own units, every name as
text that can be written back; nothing hostile (deep nesting, huge integers, a list
where a name is expected, a null where a number is expected) gets past the loader to
fail later in a report, a briefing or a save.
"""

from __future__ import annotations

import itertools
import math
from collections import Counter
from collections.abc import Callable, Iterator, Sequence
from functools import partial
from operator import attrgetter
from typing import Any, TypeVar, get_args

import numpy as np

from core.errors import InputError, OutlineError, Problem
from core.frames import bearing_to_angle
from core.io import plain
from core.io.fileformat import (
    FILE_UNITS,
    FORMAT_NAME,
    KN,
    PLACEMENT_OPTIONAL,
    PLACEMENT_REQUIRED,
    TUG_OPTIONAL,
    TUG_REQUIRED,
    Json,
    num,
)
from core.model import rules
from core.model.capability import WAYS, Capability, CapabilityCurve
from core.model.conditions import Conditions
from core.model.conditions import rule as condition_rule
from core.model.drift import DriftSettings
from core.model.efficiency import EfficiencyTable
from core.model.goals import GOAL_KINDS, Goal, goal_from_parts
from core.model.headway import HeadwayTable
from core.model.hull import ADDED_MASS_METHODS, Fitting, Hull
from core.model.plan import (
    STAGE_KINDS,
    BodyPose,
    GroupMember,
    LashedGroup,
    Project,
    Revision,
    Site,
    SiteFeature,
    Stage,
    StageLimits,
)
from core.model.swing import SWING_SIDES, Swing
from core.model.tugs import TENSION_WARN_FRACTION, Placement, Tug
from core.units import CHOICES, DisplayUnits

T = TypeVar("T")

_NUMBER_TYPES = (int, float)
#: SI value of one file unit of each kind of number (kN, kn, m, deg, %...).
_FILE_FACTORS = {kind: rules.unit_of(kind, FILE_UNITS)[0] for kind in get_args(rules.Kind)}
_LO, _HI = rules.COORDINATE.low, rules.COORDINATE.high


def describe(value: Any) -> str:
    """A value from the file as a message shows it, short and safe to print."""
    if value is None:
        return "null"
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int):
        digits = len(str(abs(value))) if abs(value) < 10**300 else None
        return repr(value) if digits is not None and digits <= 20 else "a very long integer"
    if isinstance(value, float):
        return repr(value)
    if isinstance(value, str):
        text = value if len(value) <= 40 else f"{value[:37]}..."
        return ascii(text) if not text.isprintable() else repr(text)
    if isinstance(value, list):
        if len(value) <= 4 and not any(isinstance(v, list | dict) for v in value):
            return f"[{', '.join(describe(v) for v in value)}]"
        return "a list"
    if isinstance(value, dict):
        return "an object"
    return type(value).__name__


def _key(key: str) -> str:
    """A field name for a path: as written when plain, escaped otherwise."""
    if len(key) <= 40 and key.isprintable():
        return key
    return ascii(key[:40])


def _join(path: str, key: str) -> str:
    return f"{path}.{_key(key)}" if path else _key(key)


_IS_NUMBER = np.frompyfunc(lambda v: type(v) is float or type(v) is int, 1, 1)
#: The keys an object may hold, by its (required, optional) keys.
_KNOWN_KEYS: dict[tuple[tuple[str, ...], tuple[str, ...]], frozenset[str]] = {}


def _plain_pairs(value: list[Any]) -> np.ndarray | None:
    """``value`` as (x, y) floats if every item is a pair of plain numbers within the
    coordinate range (checked for the whole list at once); else None."""
    try:
        obj = np.array(value, dtype=object)
    except (ValueError, TypeError, RecursionError):
        return None
    if obj.ndim != 2 or obj.shape[1] != 2:
        return None
    if not bool(_IS_NUMBER(obj).all()):
        return None
    try:
        v = obj.astype(float)
    except OverflowError:
        return None
    if not (bool(np.isfinite(v).all()) and float(np.abs(v).max(initial=0.0)) <= _HI):
        return None
    return v


class _Reader:
    """Reads a JSON tree, collecting every problem with its field path."""

    def __init__(self) -> None:
        self.problems: list[Problem] = []

    def fail(self, path: str, reason: str) -> None:
        self.problems.append(Problem(path, reason))

    def obj(
        self, value: Any, path: str, required: tuple[str, ...], optional: tuple[str, ...] = ()
    ) -> Json | None:
        """``value`` if it is an object holding every required key; else None.

        Unknown keys are problems (so nothing is dropped by open and save), but the
        object is still read for the problems it holds.
        """
        if not isinstance(value, dict):
            self.fail(path, f"must be an object, not {describe(value)}")
            return None
        known = _KNOWN_KEYS.get((required, optional))
        if known is None:
            known = _KNOWN_KEYS[(required, optional)] = frozenset(required + optional)
        if not known.issuperset(value):
            for key in value:
                if key not in known:
                    self.fail(_join(path, key), "is not a known field")
        if all(key in value for key in required):
            return value
        for key in required:
            if key not in value:
                self.fail(_join(path, key), "is missing")
        return None

    def items(self, d: Json, key: str, path: str) -> Iterator[tuple[str, Any]]:
        value = d.get(key, [])
        if not isinstance(value, list):
            self.fail(_join(path, key), f"must be a list, not {describe(value)}")
            return
        base = _join(path, key)
        for i, item in enumerate(value):
            yield f"{base}[{i}]", item

    def text(
        self, d: Json, key: str, path: str, rule: rules.Text = rules.LABEL, default: str = ""
    ) -> str:
        """The text at ``key`` if it keeps ``rule``; else ``default``, with a problem."""
        if key not in d:
            return default
        v = d[key]
        reason = rule.problem(v)
        if reason is not None:
            self.fail(_join(path, key), f"{describe(v)} {reason}" if isinstance(v, str) else reason)
            return default
        return v  # type: ignore[no-any-return]

    def name(self, d: Json, key: str, path: str) -> str | None:
        """A name (one line, not empty); None with a problem if it is not one."""
        v = d.get(key)
        reason = rules.NAME.problem(v)
        if reason is not None:
            self.fail(_join(path, key), f"{describe(v)} {reason}" if isinstance(v, str) else reason)
            return None
        return v  # type: ignore[no-any-return]

    def number(
        self,
        d: Json,
        key: str,
        path: str,
        rule: rules.Range,
        *,
        default: float | None = None,
        nullable: bool = False,
    ) -> float | None:
        """The number at ``key``, converted from the file's unit to SI and checked by
        ``rule``; ``default`` (SI) when the key is absent, None with a problem when it
        is bad (or when it is null and ``nullable``)."""
        if key not in d:
            return default
        v = d[key]
        if type(v) is float or (type(v) is int and -1e300 < v < 1e300):  # the fast path
            si = v * _FILE_FACTORS[rule.kind]
            if rule.holds(si):
                return si
        return self.value(v, _join(path, key), rule, nullable=nullable)

    def value(
        self, v: Any, path: str, rule: rules.Range, *, nullable: bool = False
    ) -> float | None:
        """One number of the file in SI, checked by ``rule``; see :meth:`number`."""
        if v is None:
            if not nullable:
                self.fail(path, "must be a number, not null")
            return None
        if type(v) not in _NUMBER_TYPES:
            self.fail(path, f"{describe(v)} is not a number")
            return None
        try:
            x = float(v)
        except OverflowError:
            self.fail(path, f"{describe(v)} is too large a number")
            return None
        si = x * _FILE_FACTORS[rule.kind]
        if rule.holds(si):
            return si
        reason, shown = rule.explain(si, FILE_UNITS)
        self.fail(path, f"{shown} {reason}")
        return None

    def flag(self, d: Json, key: str, path: str, default: bool = False) -> bool:
        v = d.get(key, default)
        if not isinstance(v, bool):
            self.fail(_join(path, key), f"{describe(v)} is not true or false")
            return default
        return v

    def choice(self, d: Json, key: str, path: str, options: tuple[str, ...]) -> str | None:
        v = d.get(key)
        if not isinstance(v, str) or v not in options:
            self.fail(_join(path, key), f"{describe(v)} is not one of {', '.join(options)}")
            return None
        return v

    def point(
        self, value: Any, path: str, rule: rules.Range = rules.COORDINATE
    ) -> tuple[float, float] | None:
        """A pair [x, y] in SI, each checked by ``rule`` (metres by default)."""
        if not isinstance(value, list) or len(value) != 2:
            self.fail(path, f"{describe(value)} is not a pair of numbers [x, y]")
            return None
        if not all(type(c) in _NUMBER_TYPES for c in value):
            self.fail(
                path,
                f"[{describe(value[0])}, {describe(value[1])}] is not a pair of numbers [x, y]",
            )
            return None
        x = self.value(value[0], f"{path}[0]", rule)
        y = self.value(value[1], f"{path}[1]", rule)
        return None if x is None or y is None else (x, y)

    def points(
        self, d: Json, key: str, path: str, pairs: bool = True
    ) -> Sequence[Sequence[float]] | None:
        """The coordinate pairs at ``key``, m: a list of (x, y), or with ``pairs`` false
        perhaps an (n, 2) array (for an outline, read at once); None (with problems) if
        any is bad."""
        value = d.get(key, [])
        if not isinstance(value, list):
            self.fail(_join(path, key), f"must be a list, not {describe(value)}")
            return None
        if len(value) > rules.MAX_OUTLINE_VERTICES:
            self.fail(
                _join(path, key), f"has {len(value)} points, more than {rules.MAX_OUTLINE_VERTICES}"
            )
            return None
        fast = _plain_pairs(value)
        if fast is not None:
            return list(map(tuple, fast.tolist())) if pairs else fast  # type: ignore[return-value]
        out: list[tuple[float, float]] = []
        ok = True
        for i, p in enumerate(value):
            # The fast path: a pair of plain numbers within the coordinate range.
            if type(p) is list and len(p) == 2:
                x, y = p
                if (
                    type(x) in _NUMBER_TYPES
                    and type(y) in _NUMBER_TYPES
                    and _LO <= x <= _HI
                    and _LO <= y <= _HI
                ):
                    out.append((float(x), float(y)))
                    continue
            pt = self.point(p, f"{_join(path, key)}[{i}]")
            ok = ok and pt is not None
        return out if ok else None

    def build(self, path: str, make: Callable[[], T]) -> T | None:
        """Construct a value, turning the core's own validation error into a problem."""
        try:
            return make()
        except OutlineError as e:
            self.fail(path, str(e).split(": ", 1)[-1] if e.vertex is None else f"{e}")
        except rules.RangeError as e:
            self.fail(path, e.in_units(FILE_UNITS))
        except InputError as e:
            self.fail(path, str(e))
        return None


def _each(
    r: _Reader,
    d: Json,
    key: str,
    path: str,
    whole: Callable[[list[Any]], Any],
    fast: Callable[[Any], Any],
    careful: Callable[[_Reader, Any, str], T | None],
) -> list[T]:
    """The values of the list at ``key``: all read at once by ``whole`` (core.io.plain) when
    every entry is plain; else each entry read by ``fast``, or where that gives
    plain.NOT_PLAIN, by ``careful``, which says what is wrong with the entry's path (and
    gives None)."""
    value = d.get(key, [])
    if not isinstance(value, list):
        r.fail(_join(path, key), f"must be a list, not {describe(value)}")
        return []
    not_plain = plain.NOT_PLAIN
    got = whole(value)
    if got is not not_plain:
        return got  # type: ignore[no-any-return]
    got = [fast(item) for item in value]
    if any(v is not_plain for v in got):
        base = _join(path, key)
        for i, v in enumerate(got):
            if v is not_plain:
                got[i] = careful(r, value[i], f"{base}[{i}]")
        got = [v for v in got if v is not None]
    return got  # type: ignore[no-any-return]


_NAME, _TUG = attrgetter("name"), attrgetter("tug")


def decode(data: Any) -> tuple[Project | None, list[Problem]]:
    """A Project from a JSON tree, or None and the list of every problem found."""
    r = _Reader()
    top = r.obj(
        data,
        "",
        ("format", "format_version"),
        (
            "plan",
            "display_units",
            "clearance_margin_m",
            "hulls",
            "groups",
            "tugs",
            "tug_efficiency",
            "drift",
            "site",
            "stages",
        ),
    )
    if top is None:
        return None, r.problems
    if top.get("format") != FORMAT_NAME:
        r.fail("format", f"{describe(top.get('format'))} is not {FORMAT_NAME!r}")
    plan = _decode_plan(r, top.get("plan", {}))
    units = _decode_units(r, top.get("display_units", {}))
    hulls = [
        h for p, item in r.items(top, "hulls", "") if (h := _decode_hull(r, item, p)) is not None
    ]
    hull_names = {h.name for h in hulls}
    groups = [
        g
        for p, item in r.items(top, "groups", "")
        if (g := _decode_group(r, item, p, hull_names)) is not None
    ]
    tugs = _each(r, top, "tugs", "", plain.tugs, plain.tug, _decode_tug)
    efficiency = _decode_efficiency(r, top.get("tug_efficiency"), "tug_efficiency")
    drift = _decode_drift(r, top.get("drift"), "drift")
    site = _decode_site(r, top.get("site", {}))
    ctx = _Context(hulls, set(map(_NAME, tugs)), hull_names | {g.name for g in groups})
    stages = [
        s
        for p, item in r.items(top, "stages", "")
        if (s := _decode_stage(r, item, p, ctx)) is not None
    ]
    margin = r.number(top, "clearance_margin_m", "", rules.CLEARANCE_MARGIN, default=10.0)
    if r.problems:
        return None, r.problems
    project = r.build(
        "",
        lambda: Project(
            **plan,
            units=units or DisplayUnits(),
            hulls=tuple(hulls),
            groups=tuple(groups),
            tugs=tuple(tugs),
            site=site or Site(),
            stages=tuple(stages),
            clearance_margin_m=margin if margin is not None else 10.0,
            tug_efficiency=efficiency or EfficiencyTable(),
            drift=drift or DriftSettings(),
        ),
    )
    return (project if not r.problems else None), r.problems


_PLAN_TEXT = ("name", "revision", "date", "prepared_by", "checked_by", "approved_by")


def _decode_plan(r: _Reader, value: Any) -> dict[str, Any]:
    d = r.obj(value, "plan", (), (*_PLAN_TEXT, "notes", "history"))
    if d is None:
        return {}
    out: dict[str, Any] = {key: r.text(d, key, "plan") for key in _PLAN_TEXT if key in d}
    if "notes" in d:
        out["notes"] = r.text(d, "notes", "plan", rules.NOTES)
    out["history"] = tuple(_decode_history(r, d))
    return out


def _decode_history(r: _Reader, plan: Json) -> list[Revision]:
    """The plan's revision history, one entry per revision."""
    out = []
    for p, item in r.items(plan, "history", "plan"):
        d = r.obj(item, p, ("revision",), ("date", "by", "description"))
        if d is None:
            continue
        rev = r.build(
            p,
            partial(
                Revision,
                r.text(d, "revision", p),
                r.text(d, "date", p),
                r.text(d, "by", p),
                r.text(d, "description", p, rules.NOTES),
            ),
        )
        if rev is not None:
            out.append(rev)
    return out


def _decode_units(r: _Reader, value: Any) -> DisplayUnits | None:
    d = r.obj(value, "display_units", (), tuple(CHOICES))
    if d is None:
        return None
    ok = True
    for q, choices in CHOICES.items():
        if q in d and (not isinstance(d[q], str) or d[q] not in choices):
            r.fail(f"display_units.{q}", f"{describe(d[q])} is not one of {', '.join(choices)}")
            ok = False
    return DisplayUnits(**{q: d[q] for q in CHOICES if q in d}) if ok else None


def _decode_hull(r: _Reader, value: Any, path: str) -> Hull | None:
    d = r.obj(
        value,
        path,
        ("name", "outline_m"),
        (
            "draught_m",
            "freeboard_m",
            "displacement_t",
            "centre_of_gravity_m",
            "yaw_radius_of_gyration_m",
            "added_mass_method",
            "fittings",
        ),
    )
    if d is None:
        return None
    name = r.name(d, "name", path)
    outline = r.points(d, "outline_m", path, pairs=False)
    draught = r.number(d, "draught_m", path, rules.DRAUGHT, nullable=True)
    freeboard = r.number(d, "freeboard_m", path, rules.FREEBOARD, nullable=True)
    disp = r.number(d, "displacement_t", path, rules.DISPLACEMENT, nullable=True)
    gyradius = r.number(d, "yaw_radius_of_gyration_m", path, rules.YAW_GYRADIUS, nullable=True)
    method = (
        "sections"
        if "added_mass_method" not in d
        else r.choice(d, "added_mass_method", path, ADDED_MASS_METHODS)
    )
    cog = (
        None
        if d.get("centre_of_gravity_m") is None
        else r.point(d["centre_of_gravity_m"], f"{path}.centre_of_gravity_m")
    )
    fittings = [f for p, item in r.items(d, "fittings", path) if (f := _decode_fitting(r, item, p))]
    if outline is None or name is None or method is None:
        return None
    hull = r.build(
        path,
        lambda: Hull(
            name,
            outline,  # type: ignore[arg-type]  # validated (and made a tuple) by Hull
            draught,
            freeboard,
            disp,
            cog,
            tuple(fittings),
            gyradius,
            method,  # type: ignore[arg-type]
        ),
    )
    if hull is not None:
        # A fitting must lie on the outline; snapping more than half a metre is a mistake in the file.
        for i, (given, snapped) in enumerate(zip(fittings, hull.fittings, strict=True)):
            off = math.hypot(given.x - snapped.x, given.y - snapped.y)
            if off > 0.5:
                r.fail(f"{path}.fittings[{i}].position_m", f"is {off:.2f} m off the hull outline")
    return hull


def _decode_fitting(r: _Reader, value: Any, path: str) -> Fitting | None:
    f = r.obj(
        value,
        path,
        ("name", "kind", "position_m"),
        ("type", "swl_kN", "tow_kN", "permitted_lead_deg"),
    )
    if f is None:
        return None
    name = r.name(f, "name", path)
    pos = r.point(f["position_m"], f"{path}.position_m")
    swl = r.number(f, "swl_kN", path, rules.SWL, nullable=True)
    tow = r.number(f, "tow_kN", path, rules.TOW, nullable=True)
    kind = r.choice(f, "kind", path, ("line", "push"))
    fitting_type = r.text(f, "type", path, default="bitt")
    permitted = None
    if f.get("permitted_lead_deg") is not None:
        pair = r.point(f["permitted_lead_deg"], f"{path}.permitted_lead_deg", rules.BEARING)
        if pair is None:
            return None
        permitted = _sector(pair)
    if name is None or kind is None or pos is None:
        return None
    return r.build(
        path,
        partial(Fitting, name, kind, pos[0], pos[1], fitting_type, swl, tow, permitted),  # type: ignore[arg-type]
    )


def _decode_group(r: _Reader, value: Any, path: str, hulls: set[str]) -> LashedGroup | None:
    d = r.obj(value, path, ("name", "members"))
    if d is None:
        return None
    name = r.name(d, "name", path)
    members = []
    for p, item in r.items(d, "members", path):
        m = r.obj(item, p, ("hull",), ("position_m", "heading_deg"))
        if m is None:
            continue
        hull = r.name(m, "hull", p)
        if hull is None:
            continue
        if hull not in hulls:
            r.fail(f"{p}.hull", f"{describe(hull)} is not a hull of this plan")
            continue
        pos = r.point(m.get("position_m", [0, 0]), f"{p}.position_m")
        hdg = r.number(m, "heading_deg", p, rules.HEADING, default=0.0)
        if pos is not None and hdg is not None:
            members.append(GroupMember(hull, pos[0], pos[1], bearing_to_angle(hdg)))
    if name is None:
        return None
    return r.build(path, lambda: LashedGroup(name, tuple(members)))


def _decode_tug(r: _Reader, value: Any, path: str) -> Tug | None:
    d = r.obj(value, path, TUG_REQUIRED, TUG_OPTIONAL)
    if d is None:
        return None
    before = len(r.problems)
    name = r.name(d, "name", path)
    bp = r.number(d, "bollard_pull_kN", path, rules.BOLLARD_PULL)
    astern = r.number(d, "astern_pull_kN", path, rules.ASTERN_PULL, nullable=True)
    height = r.number(d, "towing_point_height_m", path, rules.TOWING_POINT_HEIGHT, nullable=True)
    towline = r.number(d, "towline_length_m", path, rules.TOWLINE_LENGTH, nullable=True)
    mbl = r.number(d, "towline_mbl_kN", path, rules.TOWLINE_MBL, nullable=True)
    share = r.number(
        d,
        "towline_warning_share_of_mbl",
        path,
        rules.TOWLINE_WARN_SHARE,
        default=TENSION_WARN_FRACTION,
    )
    # A placeholder capability follows astern / bollard pull: both are read as the file
    # writes them (12 digits), so that a plan's first save gives the same file again.
    bp = None if bp is None else num(bp / KN) * KN
    astern = None if astern is None else num(astern / KN) * KN
    capability = _decode_capability(r, d.get("capability"), f"{path}.capability")
    headway = _decode_headway(r, d.get("headway"), f"{path}.headway")
    texts = [
        r.text(d, key, path)
        for key in ("type", "role", "certificate_date", "call_sign", "working_channel")
    ]
    if bp is None or name is None or share is None or len(r.problems) != before:
        return None
    tug_type, role, certificate, call_sign, channel = texts
    return r.build(
        path,
        lambda: Tug(
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
            capability,
            headway,
        ),
    )


def _decode_headway(r: _Reader, value: Any, path: str) -> HeadwayTable | None:
    """A tug's headway table; None when absent (the placeholder rows apply)."""
    if value is None:
        return None
    d = r.obj(value, path, ("speed_kn_and_share",), ("placeholder",))
    if d is None:
        return None
    placeholder = r.flag(d, "placeholder", path)
    inner = f"{path}.speed_kn_and_share"
    checks = (rules.HEADWAY_SPEED, rules.HEADWAY_SHARE)
    most = rules.MAX_TABLE_SIZE
    rows = _rows(r, d["speed_kn_and_share"], inner, checks, "row [speed_kn, share]", most)
    if rows is None:
        return None
    speeds, shares = (tuple(c) for c in zip(*rows, strict=True))
    if any(b <= a for a, b in itertools.pairwise(speeds)):
        r.fail(f"{inner}", "the speeds must be in increasing order")
        return None
    return r.build(path, lambda: HeadwayTable(speeds, shares, placeholder))


def _decode_capability(r: _Reader, value: Any, path: str) -> Capability | None:
    """A tug's capability; None when absent or a placeholder (the type's defaults apply)."""
    if value is None:
        return None
    d = r.obj(value, path, (), ("placeholder", "source", "bearing_deg_and_share"))
    if d is None:
        return None
    before = len(r.problems)
    placeholder = r.flag(d, "placeholder", path)
    source = r.text(d, "source", path)
    inner = f"{path}.bearing_deg_and_share"
    ways = r.obj(d.get("bearing_deg_and_share", {}), inner, (), WAYS) or {}
    curves = {way: _decode_curve(r, ways.get(way), f"{inner}.{way}") for way in WAYS}
    if len(r.problems) != before or placeholder:
        return None
    return r.build(
        path,
        lambda: Capability(curves["line"], curves["push"], curves["push_pull"], False, source),
    )


def _decode_curve(r: _Reader, value: Any, path: str) -> CapabilityCurve | None:
    """One way's curve: a list of [relative bearing deg, share] pairs."""
    if value is None:
        return None
    checks = (rules.CAPABILITY_BEARING, rules.CAPABILITY_SHARE)
    pairs = _rows(r, value, path, checks, "pair [bearing_deg, share]", 360, ", or null")
    if pairs is None:
        return None
    bearings, shares = (tuple(c) for c in zip(*pairs, strict=True))
    return r.build(path, lambda: CapabilityCurve(bearings, shares))


def _rows(
    r: _Reader,
    value: Any,
    path: str,
    checks: tuple[rules.Range, rules.Range],
    row: str,
    most: int,
    or_else: str = "",
) -> list[tuple[float, float]] | None:
    """A list of 1 to ``most`` [a, b] rows, a checked by ``checks[0]`` and b by
    ``checks[1]``, in SI; None once a problem is said. ``row`` names one in the
    messages ("row [speed_kn, share]"), ``or_else`` what else the field may be."""
    kind, fields = row.split(" ", 1)
    if not isinstance(value, list) or not value or len(value) > most:
        r.fail(path, f"must be a list of 1 to {most} {fields} {kind}s{or_else}")
        return None
    out = []
    for i, item in enumerate(value):
        if not isinstance(item, list) or len(item) != 2:
            r.fail(f"{path}[{i}]", f"{describe(item)} is not a {row}")
            return None
        a = r.value(item[0], f"{path}[{i}][0]", checks[0])
        b = r.value(item[1], f"{path}[{i}][1]", checks[1])
        if a is None or b is None:
            return None
        out.append((a, b))
    return out


def _decode_site(r: _Reader, value: Any) -> Site | None:
    d = r.obj(value, "site", (), ("name", "features"))
    if d is None:
        return None
    features = []
    for p, item in r.items(d, "features", "site"):
        f = r.obj(item, p, ("name", "kind", "points_m"), ("closed",))
        if f is None:
            continue
        name = r.name(f, "name", p)
        kind = r.choice(f, "kind", p, ("quay", "dolphin", "vessel", "limit"))
        pts = r.points(f, "points_m", p)
        closed = r.flag(f, "closed", p)
        if pts is None or name is None or kind is None:
            continue
        feature = r.build(p, partial(SiteFeature, name, kind, tuple(pts), closed))  # type: ignore[arg-type]
        if feature is not None:
            features.append(feature)
    return r.build("site", lambda: Site(r.text(d, "name", "site"), tuple(features)))


def _sector(pair: tuple[float, float]) -> tuple[float, float]:
    """[from, to] relative bearings, clockwise, as a (low, high) counter-clockwise hull-frame
    sector: clockwise from ``from`` to ``to`` is counter-clockwise from ``to`` to ``from``."""
    return (bearing_to_angle(pair[1]), bearing_to_angle(pair[0]))


def _working_sector(pair: tuple[float, float], push: bool) -> tuple[float, float]:
    """A working sector [from, to], degrees clockwise (relative bearings of a line, or push
    angles off square), as the core's (low, high) radians counter-clockwise: clockwise
    from ``from`` to ``to`` is counter-clockwise from ``to`` back to ``from``. ``to -
    from`` from 0 to 360 is the width as written (360: the whole circle); otherwise it
    is taken modulo 360 ([350, 10] is 20 degrees wide)."""
    start, end = pair
    width = end - start if 0.0 <= end - start <= 360.0 else (end - start) % 360.0
    low = -math.radians(start + width) if push else bearing_to_angle(start + width)
    return (low, low + math.radians(width))


class _Context:
    """What a stage's entries are checked against: the plan's hulls, tugs and bodies."""

    def __init__(self, hulls: list[Hull], tugs: set[str], bodies: set[str]) -> None:
        self.hulls = {h.name: h for h in hulls}
        self.kinds: dict[str, dict[str, str]] = {
            h.name: {f.name: f.kind for f in h.fittings} for h in hulls
        }
        self.tugs, self.bodies = tugs, bodies

        #: A plain placement read at once (core.io.plain), or plain.NOT_PLAIN.
        self.plain_placement = partial(plain.placement, self.tugs, self.kinds)
        #: A list of plain placements read at once, or plain.NOT_PLAIN.
        self.plain_placements = partial(plain.placements, self.tugs, self.kinds)

    def placement(self, r: _Reader, value: Any, path: str) -> Placement | None:
        """A placement read the careful way."""
        return _decode_placement(r, value, path, self)


def _decode_placement(r: _Reader, value: Any, path: str, ctx: _Context) -> Placement | None:
    d = r.obj(value, path, PLACEMENT_REQUIRED, PLACEMENT_OPTIONAL)
    if d is None:
        return None
    tug, hull_name, point = (
        r.name(d, "tug", path),
        r.name(d, "hull", path),
        r.name(d, "point", path),
    )
    ok = tug is not None and hull_name is not None and point is not None
    if tug is not None and tug not in ctx.tugs:
        r.fail(f"{path}.tug", f"{describe(tug)} is not a tug of this plan")
        ok = False
    kinds = ctx.kinds.get(hull_name) if hull_name is not None else None
    kind = "line"
    if hull_name is not None and kinds is None:
        r.fail(f"{path}.hull", f"{describe(hull_name)} is not a hull of this plan")
        ok = False
    elif kinds is not None and point is not None:
        if point not in kinds:
            r.fail(f"{path}.point", f"{describe(point)} is not a fitting of hull {hull_name}")
            ok = False
        else:
            kind = kinds[point]
    # A setting is a share of the tug's usable pull: above 100 % cannot be asked of a tug, so a
    # file that says so is refused. A substitute tug short of pull shows up as a shortfall of the
    # stage's goal or a warning, not as a setting over 100 %.
    setting = r.number(d, "setting_percent", path, rules.SETTING)
    length: float | None = 30.0
    if kind == "push":
        for key in ("lead_deg", "line_length_m"):
            if key in d:
                r.fail(f"{path}.{key}", f"does not apply at push point {point}; use push_angle_deg")
        angle = r.number(d, "push_angle_deg", path, rules.PUSH_ANGLE, default=0.0)
        lead = None if angle is None else -math.radians(angle)
    else:
        if "push_angle_deg" in d:
            r.fail(f"{path}.push_angle_deg", f"does not apply at line point {point}; use lead_deg")
        bearing = r.number(d, "lead_deg", path, rules.BEARING, default=0.0)
        lead = None if bearing is None else bearing_to_angle(bearing)
        length = r.number(d, "line_length_m", path, rules.LINE_LENGTH, default=30.0)
    sector = None
    if d.get("lead_sector_deg") is not None:
        pair = r.point(d["lead_sector_deg"], f"{path}.lead_sector_deg", rules.BEARING)
        if pair is None:
            ok = False
        else:
            sector = _working_sector(pair, kind == "push")
    astern = r.flag(d, "astern", path)
    push_pull = r.flag(d, "push_pull", path)
    if push_pull and kind != "push":
        r.fail(f"{path}.push_pull", f"applies at a push point only; {point} is a line point")
        ok = False
    if not ok or setting is None or lead is None or length is None:
        return None
    return r.build(
        path,
        lambda: Placement(
            tug,  # type: ignore[arg-type]
            hull_name,  # type: ignore[arg-type]
            point,  # type: ignore[arg-type]
            setting,
            lead,
            length,
            astern,
            sector,
            push_pull,
        ),
    )


def _decode_pose(r: _Reader, value: Any, path: str, ctx: _Context) -> BodyPose | None:
    m = r.obj(value, path, ("body",), ("position_m", "heading_deg"))
    if m is None:
        return None
    body = r.name(m, "body", path)
    if body is None:
        return None
    if body not in ctx.bodies:
        r.fail(f"{path}.body", f"{describe(body)} is not a hull or group of this plan")
        return None
    pos = r.point(m.get("position_m", [0, 0]), f"{path}.position_m")
    hdg = r.number(m, "heading_deg", path, rules.HEADING, default=0.0)
    if pos is None or hdg is None:
        return None
    return BodyPose(body, pos[0], pos[1], hdg % 360.0)


def _decode_stage(r: _Reader, value: Any, path: str, ctx: _Context) -> Stage | None:
    d = r.obj(
        value,
        path,
        ("name",),
        ("kind", "notes", "poses", "tugs", "conditions", "goal", "limits", "swing"),
    )
    if d is None:
        return None
    name = r.name(d, "name", path)
    kind = "other" if "kind" not in d else r.choice(d, "kind", path, STAGE_KINDS)
    notes = r.text(d, "notes", path, rules.NOTES)
    poses = [
        pose for p, item in r.items(d, "poses", path) if (pose := _decode_pose(r, item, p, ctx))
    ]
    placements = _each(r, d, "tugs", path, ctx.plain_placements, ctx.plain_placement, ctx.placement)
    placed = list(map(_TUG, placements))
    if len(set(placed)) != len(placed):
        # said at the file's entry: an entry refused before it is not among those read
        twice = {tug for tug, n in Counter(placed).items() if n > 1}
        seen: set[str] = set()
        for i, item in enumerate(d["tugs"]):
            tug = item.get("tug") if isinstance(item, dict) else None
            if isinstance(tug, str) and tug in twice:
                if tug in seen:
                    r.fail(f"{path}.tugs[{i}].tug", f"{tug!r} is placed twice in this stage")
                seen.add(tug)
    conditions = _decode_conditions(r, d.get("conditions", {}), f"{path}.conditions")
    goal = _decode_goal(r, d.get("goal"), f"{path}.goal")
    limits = _decode_limits(r, d.get("limits", {}), f"{path}.limits")
    swing = _decode_swing(r, d.get("swing"), f"{path}.swing")
    if name is None or kind is None:
        return None
    return r.build(
        path,
        lambda: Stage(
            name,
            kind,
            notes,
            tuple(poses),
            tuple(placements),
            conditions or Conditions(),
            goal,
            limits or StageLimits(),
            swing,
        ),
    )


#: The file's keys of a stage's conditions -> the Conditions fields (each with its rule).
_CONDITION_KEYS = {
    "wind_speed_kn": "wind_speed_ms",
    "wind_height_m": "wind_height_m",
    "wind_from_deg": "wind_from_deg",
    "gust_factor": "gust_factor",
    "current_speed_kn": "current_speed_ms",
    "current_towards_deg": "current_towards_deg",
    "air_density_kg_m3": "air_density",
    "water_density_kg_m3": "water_density",
    "wind_exponent": "wind_exponent",
    "wind_coefficient_head_on": "wind_coeff_head",
    "wind_coefficient_beam_on": "wind_coeff_beam",
    "current_coefficient_head_on": "current_coeff_head",
    "current_coefficient_beam_on": "current_coeff_beam",
    "wind_area_head_on_m2": "wind_area_head_m2",
    "wind_area_beam_on_m2": "wind_area_beam_m2",
    "current_area_head_on_m2": "current_area_head_m2",
    "current_area_beam_on_m2": "current_area_beam_m2",
    "sea_state": "sea_state",
    "wind_centre_head_on": "wind_centre_head_on",
    "current_centre_head_on": "current_centre_head_on",
    "water_depth_m": "water_depth_m",
    "under_keel_margin_m": "ukc_margin_m",
}
_CENTRE_KEYS = ("wind_centre_m", "current_centre_m")
_CHOICE_KEYS = {"pressure_centre": rules.PRESSURE_CENTRE}


def _decode_conditions(r: _Reader, value: Any, path: str) -> Conditions | None:
    d = r.obj(value, path, (), (*_CONDITION_KEYS, *_CENTRE_KEYS, *_CHOICE_KEYS))
    if d is None:
        return None
    before = len(r.problems)
    base = Conditions()
    vals: dict[str, object] = {}
    for key, name in _CONDITION_KEYS.items():
        if key in d:
            vals[name] = r.value(
                d[key], f"{path}.{key}", condition_rule(name), nullable=name in _NULLABLE
            )
        else:
            vals[name] = getattr(base, name)
    for key in _CENTRE_KEYS:
        vals[key] = None if d.get(key) is None else r.point(d[key], f"{path}.{key}")
    for key, choice in _CHOICE_KEYS.items():
        vals[key] = r.choice(d, key, path, choice.options) if key in d else getattr(base, key)
    if len(r.problems) != before:
        return None
    return r.build(path, lambda: Conditions(**vals))  # type: ignore[arg-type]


_NULLABLE = frozenset(
    {
        "current_coeff_beam",
        "wind_area_head_m2",
        "wind_area_beam_m2",
        "current_area_head_m2",
        "current_area_beam_m2",
        "water_depth_m",
    }
)


def _decode_efficiency(r: _Reader, value: Any, path: str) -> EfficiencyTable | None:
    """The tug efficiency table (bollard pull rows in kN, sea state columns)."""
    if value is None:
        return None
    d = r.obj(value, path, ("bollard_pull_kN", "sea_state", "efficiency"))
    if d is None:
        return None
    before = len(r.problems)
    pulls = _numbers(r, d["bollard_pull_kN"], f"{path}.bollard_pull_kN", rules.BOLLARD_PULL)
    seas = _numbers(r, d["sea_state"], f"{path}.sea_state", rules.SEA_STATE)
    rows_in = d["efficiency"]
    rows: list[list[float]] = []
    if not isinstance(rows_in, list) or len(rows_in) > rules.MAX_TABLE_SIZE:
        r.fail(f"{path}.efficiency", "must be a list of rows, one per bollard pull")
    else:
        for i, row in enumerate(rows_in):
            rows.append(_numbers(r, row, f"{path}.efficiency[{i}]", rules.EFFICIENCY) or [])
    for key, values in (("bollard_pull_kN", pulls), ("sea_state", seas)):
        if values and any(b <= a for a, b in itertools.pairwise(values)):
            r.fail(f"{path}.{key}", f"{describe(d[key])} must be in increasing order")
    if len(r.problems) != before or pulls is None or seas is None:
        return None
    return r.build(
        path,
        lambda: EfficiencyTable(tuple(pulls), tuple(seas), tuple(tuple(row) for row in rows)),
    )


def _decode_drift(r: _Reader, value: Any, path: str) -> DriftSettings | None:
    """The drift preview's ghost times and look ahead."""
    if value is None:
        return None
    d = r.obj(value, path, (), ("ghost_times_s", "horizon_s"))
    if d is None:
        return None
    base = DriftSettings()
    times = (
        base.times_s
        if d.get("ghost_times_s") is None
        else _numbers(r, d["ghost_times_s"], f"{path}.ghost_times_s", rules.DRIFT_TIME)
    )
    horizon = r.number(d, "horizon_s", path, rules.DRIFT_HORIZON, default=base.horizon_s)
    if times is None or horizon is None:
        return None
    return r.build(path, lambda: DriftSettings(tuple(times), horizon))


def _numbers(r: _Reader, value: Any, path: str, rule: rules.Range) -> list[float] | None:
    """A list of numbers in SI, each checked by ``rule``; None (with problems) if any is bad."""
    if not isinstance(value, list) or len(value) > rules.MAX_TABLE_SIZE:
        r.fail(path, f"must be a list of at most {rules.MAX_TABLE_SIZE} numbers")
        return None
    out = [r.value(v, f"{path}[{i}]", rule) for i, v in enumerate(value)]
    return None if any(v is None for v in out) else out  # type: ignore[return-value]


def _decode_goal(r: _Reader, value: Any, path: str) -> Goal | None:
    if value is None:
        return None
    d = r.obj(
        value,
        path,
        ("kind",),
        ("force_ahead_kN", "force_to_port_kN", "moment_kNm", "speed_through_water_kn"),
    )
    if d is None:
        return None
    kind = r.choice(d, "kind", path, GOAL_KINDS)
    fx = r.number(d, "force_ahead_kN", path, rules.GOAL_FORCE_AHEAD, default=0.0)
    fy = r.number(d, "force_to_port_kN", path, rules.GOAL_FORCE_TO_PORT, default=0.0)
    mz = r.number(d, "moment_kNm", path, rules.GOAL_MOMENT, default=0.0)
    v = r.number(d, "speed_through_water_kn", path, rules.TRANSIT_SPEED, default=0.0)
    if kind is None or fx is None or fy is None or mz is None or v is None:
        return None
    return r.build(path, lambda: goal_from_parts(kind, fx, fy, mz, v))


def _decode_swing(r: _Reader, value: Any, path: str) -> Swing | None:
    if value is None:
        return None
    d = r.obj(value, path, ("start_heading_deg", "end_heading_deg", "bow_swings_to"))
    if d is None:
        return None
    start = r.number(d, "start_heading_deg", path, rules.HEADING)
    end = r.number(d, "end_heading_deg", path, rules.HEADING)
    side = r.choice(d, "bow_swings_to", path, SWING_SIDES)
    if start is None or end is None or side is None:
        return None
    return r.build(path, lambda: Swing(start, end, side))  # type: ignore[arg-type]


def _decode_limits(r: _Reader, value: Any, path: str) -> StageLimits | None:
    d = r.obj(value, path, (), ("max_wind_kn", "max_current_kn", "min_clearance_m"))
    if d is None:
        return None
    wind = r.number(d, "max_wind_kn", path, rules.WIND_LIMIT, nullable=True)
    current = r.number(d, "max_current_kn", path, rules.CURRENT_LIMIT, nullable=True)
    clearance = r.number(d, "min_clearance_m", path, rules.LEAST_CLEARANCE, nullable=True)
    return r.build(path, lambda: StageLimits(wind, current, clearance))
