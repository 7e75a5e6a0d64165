"""The JSON tree of a ``.towboard`` file to a Project.

Decoding collects every problem with its field path instead of stopping at the
first, and turns the core's own validation errors into file problems.
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Callable, Iterator
from functools import partial
from typing import Any, TypeVar

from core.errors import InputError, OutlineError, Problem
from core.frames import bearing_to_angle
from core.io.fileformat import FORMAT_NAME, KN, KNOT, Json
from core.model.conditions import Conditions
from core.model.drift import DriftSettings
from core.model.efficiency import EfficiencyTable
from core.model.goals import GOAL_KINDS, Goal, goal_from_parts
from core.model.hull import ADDED_MASS_METHODS, Fitting, Hull
from core.model.plan import (
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
from core.model.tugs import Placement, Tug
from core.units import CHOICES, DisplayUnits

T = TypeVar("T")


class _Reader:
    """Reads a JSON tree, collecting every problem with its field path."""

    def __init__(self) -> None:
        self.problems: list[Problem] = []

    def fail(self, path: str, reason: str) -> None:
        self.problems.append(Problem(path, reason))

    def obj(
        self, value: Any, path: str, required: tuple[str, ...], optional: tuple[str, ...] = ()
    ) -> Json | None:
        if not isinstance(value, dict):
            self.fail(path, f"must be an object, not {type(value).__name__}")
            return None
        for key in value:
            if key not in required and key not in optional:
                self.fail(f"{path}.{key}" if path else key, "is not a known field")
        for key in required:
            if key not in value:
                self.fail(f"{path}.{key}" if path else key, "is missing")
        return value

    def items(self, d: Json, key: str, path: str) -> Iterator[tuple[str, Any]]:
        value = d.get(key, [])
        if not isinstance(value, list):
            self.fail(f"{path}.{key}", "must be a list")
            return
        for i, item in enumerate(value):
            yield f"{path}.{key}[{i}]", item

    def text(self, d: Json, key: str, path: str, default: str = "") -> str:
        v = d.get(key, default)
        if not isinstance(v, str):
            self.fail(f"{path}.{key}", f"{v!r} is not text")
            return default
        return v

    def number(
        self,
        d: Json,
        key: str,
        path: str,
        *,
        default: float | None = None,
        low: float | None = None,
        high: float | None = None,
        positive: bool = False,
        unit: str = "",
    ) -> float | None:
        v = d.get(key, default)
        p = f"{path}.{key}" if path else key
        if v is None:
            return None
        if isinstance(v, bool) or not isinstance(v, int | float):
            self.fail(p, f"{v!r} is not a number")
            return None
        v = float(v)
        u = f" {unit}" if unit else ""
        if not math.isfinite(v):
            self.fail(p, f"{v} is not a finite number")
        elif positive and v <= 0:
            self.fail(p, f"{v:g}{u} must be above zero")
        elif low is not None and v < low:
            self.fail(p, f"{v:g}{u} is below {low:g}{u}")
        elif high is not None and v > high:
            self.fail(p, f"{v:g}{u} is above {high:g}{u}")
        else:
            return v
        return None

    def flag(self, d: Json, key: str, path: str, default: bool = False) -> bool:
        v = d.get(key, default)
        if not isinstance(v, bool):
            self.fail(f"{path}.{key}", f"{v!r} is not true or false")
            return default
        return v

    def point(self, value: Any, path: str) -> tuple[float, float] | None:
        if (
            not isinstance(value, list)
            or len(value) != 2
            or not all(isinstance(c, int | float) and not isinstance(c, bool) for c in value)
        ):
            self.fail(path, f"{value!r} is not a pair of numbers [x, y]")
            return None
        x, y = float(value[0]), float(value[1])
        if not (math.isfinite(x) and math.isfinite(y)):
            self.fail(path, f"{value!r} is not finite")
            return None
        return (x, y)

    def points(self, d: Json, key: str, path: str) -> list[tuple[float, float]] | None:
        out: list[tuple[float, float]] = []
        ok = True
        for p, item in self.items(d, key, path):
            pt = self.point(item, p)
            ok = ok and pt is not None
            if pt is not None:
                out.append(pt)
        return out if ok else None

    def build(self, path: str, make: Callable[[], T]) -> T | None:
        """Construct a value, turning the core's own validation error into a problem."""
        try:
            return make()
        except OutlineError as e:
            self.fail(path, str(e).split(": ", 1)[-1] if e.vertex is None else f"{e}")
        except InputError as e:
            self.fail(path, f"{e.field}: {e.value!r} {e.reason}")
        return None


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
        r.fail("format", f"{top.get('format')!r} is not {FORMAT_NAME!r}")
    plan = (
        r.obj(
            top.get("plan", {}),
            "plan",
            (),
            (
                "name",
                "revision",
                "date",
                "prepared_by",
                "checked_by",
                "approved_by",
                "notes",
                "history",
            ),
        )
        or {}
    )
    history = _decode_history(r, plan)
    units = _decode_units(r, top.get("display_units", {}))
    hulls = [
        h
        for p, item in r.items(top, "hulls", "")
        if (h := _decode_hull(r, item, p.lstrip("."))) is not None
    ]
    hull_names = {h.name for h in hulls}
    groups = [
        g
        for p, item in r.items(top, "groups", "")
        if (g := _decode_group(r, item, p.lstrip("."), hull_names))
    ]
    tugs = [
        t
        for p, item in r.items(top, "tugs", "")
        if (t := _decode_tug(r, item, p.lstrip("."))) is not None
    ]
    efficiency = _decode_efficiency(r, top.get("tug_efficiency"), "tug_efficiency")
    drift = _decode_drift(r, top.get("drift"), "drift")
    site = _decode_site(r, top.get("site", {}))
    ctx = _Context(
        {h.name: h for h in hulls}, {t.name for t in tugs}, hull_names | {g.name for g in groups}
    )
    stages = [
        s
        for p, item in r.items(top, "stages", "")
        if (s := _decode_stage(r, item, p.lstrip("."), ctx))
    ]
    margin = r.number(top, "clearance_margin_m", "", default=10.0, low=0.0, unit="m")
    if r.problems:
        return None, r.problems
    project = r.build(
        "",
        lambda: Project(
            name=r.text(plan, "name", "plan", "Untitled plan"),
            revision=r.text(plan, "revision", "plan", "A"),
            date=r.text(plan, "date", "plan"),
            prepared_by=r.text(plan, "prepared_by", "plan"),
            checked_by=r.text(plan, "checked_by", "plan"),
            approved_by=r.text(plan, "approved_by", "plan"),
            notes=r.text(plan, "notes", "plan"),
            history=tuple(history),
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
                r.text(d, "description", p),
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
        if q in d and d[q] not in choices:
            r.fail(f"display_units.{q}", f"{d[q]!r} is not one of {', '.join(choices)}")
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
    name = r.text(d, "name", path)
    outline = r.points(d, "outline_m", path)
    draught = r.number(d, "draught_m", path, positive=True, unit="m")
    freeboard = r.number(d, "freeboard_m", path, positive=True, unit="m")
    disp = r.number(d, "displacement_t", path, positive=True, unit="t")
    gyradius = r.number(d, "yaw_radius_of_gyration_m", path, positive=True, unit="m")
    method = r.text(d, "added_mass_method", path, "sections")
    if method not in ADDED_MASS_METHODS:
        r.fail(
            f"{path}.added_mass_method", f"{method!r} is not one of {', '.join(ADDED_MASS_METHODS)}"
        )
        method = "sections"
    cog = (
        None
        if d.get("centre_of_gravity_m") is None
        else r.point(d["centre_of_gravity_m"], f"{path}.centre_of_gravity_m")
    )
    fittings: list[Fitting] = []
    for p, item in r.items(d, "fittings", path):
        f = r.obj(
            item,
            p,
            ("name", "kind", "position_m"),
            ("type", "swl_kN", "tow_kN", "permitted_lead_deg"),
        )
        if f is None:
            continue
        pos = r.point(f.get("position_m"), f"{p}.position_m")
        swl = r.number(f, "swl_kN", p, positive=True, unit="kN")
        tow = r.number(f, "tow_kN", p, positive=True, unit="kN")
        permitted = None
        if f.get("permitted_lead_deg") is not None:
            pair = r.point(f["permitted_lead_deg"], f"{p}.permitted_lead_deg")
            if pair is None:
                continue
            permitted = _sector(pair)
        kind = f.get("kind")
        if kind not in ("line", "push"):
            r.fail(f"{p}.kind", f"{kind!r} is not 'line' or 'push'")
            continue
        if pos is not None:
            fitting = r.build(
                p,
                partial(
                    Fitting,
                    r.text(f, "name", p),
                    kind,
                    pos[0],
                    pos[1],
                    r.text(f, "type", p, "bitt"),
                    None if swl is None else swl * KN,
                    None if tow is None else tow * KN,
                    permitted,
                ),
            )
            if fitting is not None:
                fittings.append(fitting)
    if outline is None:
        return None
    hull = r.build(
        path,
        lambda: Hull(
            name,
            tuple(outline),
            draught,
            freeboard,
            None if disp is None else disp * 1000.0,
            cog,
            tuple(fittings),
            gyradius,
            method,
        ),
    )
    if hull is not None:
        # A fitting must lie on the outline; snapping more than half a metre is a mistake in the file.
        for i, (given, snapped) in enumerate(zip(fittings, hull.fittings, strict=True)):
            off = math.hypot(given.x - snapped.x, given.y - snapped.y)
            if off > 0.5:
                r.fail(f"{path}.fittings[{i}].position_m", f"is {off:.2f} m off the hull outline")
    return hull


def _decode_group(r: _Reader, value: Any, path: str, hulls: set[str]) -> LashedGroup | None:
    d = r.obj(value, path, ("name", "members"))
    if d is None:
        return None
    members = []
    for p, item in r.items(d, "members", path):
        m = r.obj(item, p, ("hull",), ("position_m", "heading_deg"))
        if m is None:
            continue
        if m["hull"] not in hulls:
            r.fail(f"{p}.hull", f"{m['hull']!r} is not a hull of this plan")
            continue
        pos = r.point(m.get("position_m", [0, 0]), f"{p}.position_m")
        hdg = r.number(m, "heading_deg", p, default=0.0)
        if pos is not None and hdg is not None:
            members.append(GroupMember(m["hull"], pos[0], pos[1], bearing_to_angle(hdg)))
    return r.build(path, lambda: LashedGroup(r.text(d, "name", path), tuple(members)))


def _decode_tug(r: _Reader, value: Any, path: str) -> Tug | None:
    d = r.obj(
        value,
        path,
        ("name", "bollard_pull_kN"),
        (
            "type",
            "role",
            "astern_pull_kN",
            "towing_point_height_m",
            "certificate_date",
            "towline_length_m",
            "towline_mbl_kN",
            "call_sign",
            "working_channel",
        ),
    )
    if d is None:
        return None
    bp = r.number(d, "bollard_pull_kN", path, positive=True, unit="kN")
    astern = r.number(d, "astern_pull_kN", path, low=0.0, unit="kN")
    height = r.number(d, "towing_point_height_m", path, low=0.0, unit="m")
    towline = r.number(d, "towline_length_m", path, positive=True, unit="m")
    mbl = r.number(d, "towline_mbl_kN", path, positive=True, unit="kN")
    if bp is None:
        return None
    return r.build(
        path,
        lambda: Tug(
            r.text(d, "name", path),
            bp * KN,
            None if astern is None else astern * KN,
            r.text(d, "type", path),
            r.text(d, "role", path),
            height,
            r.text(d, "certificate_date", path),
            towline,
            None if mbl is None else mbl * KN,
            r.text(d, "call_sign", path),
            r.text(d, "working_channel", path),
        ),
    )


def _decode_site(r: _Reader, value: Any) -> Site | None:
    d = r.obj(value, "site", (), ("name", "features"))
    if d is None:
        return None
    features = []
    for p, item in r.items(d, "features", "site"):
        f = r.obj(item, p, ("name", "kind", "points_m"), ("closed",))
        if f is None:
            continue
        pts = r.points(f, "points_m", p)
        if pts is None:
            continue
        feature = r.build(
            p,
            partial(
                SiteFeature, r.text(f, "name", p), f["kind"], tuple(pts), r.flag(f, "closed", p)
            ),
        )
        if feature is not None:
            features.append(feature)
    return Site(r.text(d, "name", "site"), tuple(features))


def _sector(pair: tuple[float, float]) -> tuple[float, float]:
    """[from, to] relative bearings, clockwise, as a (low, high) counter-clockwise hull-frame
    sector: clockwise from ``from`` to ``to`` is counter-clockwise from ``to`` to ``from``."""
    return (bearing_to_angle(pair[1]), bearing_to_angle(pair[0]))


class _Context:
    def __init__(self, hulls: dict[str, Hull], tugs: set[str], bodies: set[str]) -> None:
        self.hulls, self.tugs, self.bodies = hulls, tugs, bodies


def _decode_placement(r: _Reader, value: Any, path: str, ctx: _Context) -> Placement | None:
    d = r.obj(
        value,
        path,
        ("tug", "hull", "point", "setting_percent"),
        ("lead_deg", "line_length_m", "push_angle_deg", "astern", "lead_sector_deg"),
    )
    if d is None:
        return None
    tug, hull_name, point = (
        r.text(d, "tug", path),
        r.text(d, "hull", path),
        r.text(d, "point", path),
    )
    ok = True
    if tug not in ctx.tugs:
        r.fail(f"{path}.tug", f"{tug!r} is not a tug of this plan")
        ok = False
    hull = ctx.hulls.get(hull_name)
    kind = "line"
    if hull is None:
        r.fail(f"{path}.hull", f"{hull_name!r} is not a hull of this plan")
        ok = False
    else:
        names = {f.name: f.kind for f in hull.fittings}
        if point not in names:
            r.fail(f"{path}.point", f"{point!r} is not a fitting of hull {hull_name}")
            ok = False
        else:
            kind = names[point]
    # A setting is a share of the tug's usable pull: above 100 % cannot be asked of a tug, so a
    # file that says so is refused (issue 2 names this very message). A substitute tug short of
    # pull shows up as a shortfall of the stage's goal or a warning, not as a setting over 100 %.
    setting = r.number(d, "setting_percent", path, low=0.0, high=100.0, unit="%")
    if kind == "push":
        for key in ("lead_deg", "line_length_m"):
            if key in d:
                r.fail(f"{path}.{key}", f"does not apply at push point {point}; use push_angle_deg")
        angle = r.number(
            d, "push_angle_deg", path, default=0.0, low=-89.999, high=89.999, unit="deg"
        )
        lead = None if angle is None else -math.radians(angle)
        length: float | None = 30.0
    else:
        if "push_angle_deg" in d:
            r.fail(f"{path}.push_angle_deg", f"does not apply at line point {point}; use lead_deg")
        bearing = r.number(d, "lead_deg", path, default=0.0)
        lead = None if bearing is None else bearing_to_angle(bearing)
        length = r.number(d, "line_length_m", path, default=30.0, positive=True, unit="m")
    sector = None
    if d.get("lead_sector_deg") is not None:
        pair = r.point(d["lead_sector_deg"], f"{path}.lead_sector_deg")
        if pair is None:
            ok = False
        elif kind == "push":
            sector = (-math.radians(pair[1]), -math.radians(pair[0]))
        else:
            sector = _sector(pair)
    if not ok or setting is None or lead is None or length is None:
        return None
    return r.build(
        path,
        lambda: Placement(
            tug, hull_name, point, setting / 100.0, lead, length, r.flag(d, "astern", path), sector
        ),
    )


def _decode_stage(r: _Reader, value: Any, path: str, ctx: _Context) -> Stage | None:
    d = r.obj(
        value, path, ("name",), ("kind", "notes", "poses", "tugs", "conditions", "goal", "limits")
    )
    if d is None:
        return None
    poses = []
    for p, item in r.items(d, "poses", path):
        m = r.obj(item, p, ("body",), ("position_m", "heading_deg"))
        if m is None:
            continue
        if m["body"] not in ctx.bodies:
            r.fail(f"{p}.body", f"{m['body']!r} is not a hull or group of this plan")
            continue
        pos = r.point(m.get("position_m", [0, 0]), f"{p}.position_m")
        hdg = r.number(m, "heading_deg", p, default=0.0)
        if pos is not None and hdg is not None:
            poses.append(BodyPose(m["body"], pos[0], pos[1], hdg % 360.0))
    placements = [
        pl
        for p, item in r.items(d, "tugs", path)
        if (pl := _decode_placement(r, item, p, ctx)) is not None
    ]
    seen: set[str] = set()
    for i, pl in enumerate(placements):
        if pl.tug in seen:
            r.fail(f"{path}.tugs[{i}].tug", f"{pl.tug!r} is placed twice in this stage")
        seen.add(pl.tug)
    conditions = _decode_conditions(r, d.get("conditions", {}), f"{path}.conditions")
    goal = _decode_goal(r, d.get("goal"), f"{path}.goal")
    limits = _decode_limits(r, d.get("limits", {}), f"{path}.limits")
    return r.build(
        path,
        lambda: Stage(
            r.text(d, "name", path),
            r.text(d, "kind", path, "other"),
            r.text(d, "notes", path),
            tuple(poses),
            tuple(placements),
            conditions or Conditions(),
            goal,
            limits or StageLimits(),
        ),
    )


def _decode_conditions(r: _Reader, value: Any, path: str) -> Conditions | None:
    keys = (
        "wind_speed_kn",
        "wind_height_m",
        "wind_from_deg",
        "gust_factor",
        "current_speed_kn",
        "current_towards_deg",
        "air_density_kg_m3",
        "water_density_kg_m3",
        *_LOAD_KEYS,
    )
    d = r.obj(value, path, (), keys)
    if d is None:
        return None
    base = Conditions()
    vals = {
        "wind_speed_ms": r.number(d, "wind_speed_kn", path, default=0.0, low=0.0, unit="kn"),
        "wind_height_m": r.number(
            d, "wind_height_m", path, default=base.wind_height_m, positive=True, unit="m"
        ),
        "wind_from_deg": r.number(
            d, "wind_from_deg", path, default=0.0, low=0.0, high=360.0, unit="deg"
        ),
        "gust_factor": r.number(d, "gust_factor", path, default=1.0, low=1.0),
        "current_speed_ms": r.number(d, "current_speed_kn", path, default=0.0, low=0.0, unit="kn"),
        "current_towards_deg": r.number(
            d, "current_towards_deg", path, default=0.0, low=0.0, high=360.0, unit="deg"
        ),
        "air_density": r.number(
            d, "air_density_kg_m3", path, default=base.air_density, positive=True
        ),
        "water_density": r.number(
            d, "water_density_kg_m3", path, default=base.water_density, positive=True
        ),
    }
    if any(v is None for v in vals.values()):
        return None
    vals["wind_speed_ms"] = vals["wind_speed_ms"] * KNOT  # type: ignore[operator]
    vals["current_speed_ms"] = vals["current_speed_ms"] * KNOT  # type: ignore[operator]
    extra = _decode_condition_loads(r, d, path)
    if extra is None:
        return None
    return r.build(path, lambda: Conditions(**vals, **extra))  # type: ignore[arg-type]


#: Keys of the loads part of the conditions (all optional) -> Conditions fields.
_LOAD_KEYS = (
    "wind_exponent",
    "wind_coefficient_head_on",
    "wind_coefficient_beam_on",
    "current_coefficient_head_on",
    "current_coefficient_beam_on",
    "wind_area_head_on_m2",
    "wind_area_beam_on_m2",
    "current_area_head_on_m2",
    "current_area_beam_on_m2",
    "wind_centre_m",
    "current_centre_m",
    "sea_state",
)


_OPTIONAL_LOADS = {
    "current_coefficient_beam_on": "current_coeff_beam",
    "wind_area_head_on_m2": "wind_area_head_m2",
    "wind_area_beam_on_m2": "wind_area_beam_m2",
    "current_area_head_on_m2": "current_area_head_m2",
    "current_area_beam_on_m2": "current_area_beam_m2",
}


def _decode_condition_loads(r: _Reader, d: Json, path: str) -> dict[str, object] | None:
    """The coefficients, areas, centres of pressure and sea state of a stage's conditions."""
    base = Conditions()
    before = len(r.problems)
    out: dict[str, object] = {
        "wind_exponent": r.number(
            d, "wind_exponent", path, default=base.wind_exponent, low=0.0, high=1.0
        ),
        "wind_coeff_head": r.number(
            d, "wind_coefficient_head_on", path, default=base.wind_coeff_head, positive=True
        ),
        "wind_coeff_beam": r.number(
            d, "wind_coefficient_beam_on", path, default=base.wind_coeff_beam, positive=True
        ),
        "current_coeff_head": r.number(
            d, "current_coefficient_head_on", path, default=base.current_coeff_head, positive=True
        ),
        "sea_state": r.number(d, "sea_state", path, default=0.0, low=0.0, high=9.0),
    }
    for key, name in _OPTIONAL_LOADS.items():
        out[name] = r.number(d, key, path, positive=True, unit="m^2" if key.endswith("m2") else "")
    for key, name in (("wind_centre_m", "wind_centre_m"), ("current_centre_m", "current_centre_m")):
        out[name] = None if d.get(key) is None else r.point(d[key], f"{path}.{key}")
    return out if len(r.problems) == before else None


def _decode_efficiency(r: _Reader, value: Any, path: str) -> EfficiencyTable | None:
    """The tug efficiency table (bollard pull rows in kN, sea state columns)."""
    if value is None:
        return None
    d = r.obj(value, path, ("bollard_pull_kN", "sea_state", "efficiency"))
    if d is None:
        return None
    before = len(r.problems)
    pulls = _numbers(r, d.get("bollard_pull_kN"), f"{path}.bollard_pull_kN")
    seas = _numbers(r, d.get("sea_state"), f"{path}.sea_state")
    rows_in = d.get("efficiency")
    rows: list[list[float]] = []
    if not isinstance(rows_in, list):
        r.fail(f"{path}.efficiency", "must be a list of rows, one per bollard pull")
    else:
        for i, row in enumerate(rows_in):
            nums = _numbers(r, row, f"{path}.efficiency[{i}]") or []
            for j, v in enumerate(nums):
                if not 0.0 <= v <= 1.0:
                    r.fail(
                        f"{path}.efficiency[{i}][{j}]", f"{v:g} is not an efficiency from 0 to 1"
                    )
            rows.append(nums)
    for key, values in (("bollard_pull_kN", pulls), ("sea_state", seas)):
        if values and any(b <= a for a, b in itertools.pairwise(values)):
            r.fail(f"{path}.{key}", f"{values} must be in increasing order")
    if len(r.problems) != before or pulls is None or seas is None:
        return None
    return r.build(
        path,
        lambda: EfficiencyTable(
            tuple(v * KN for v in pulls), tuple(seas), tuple(tuple(row) for row in rows)
        ),
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
        else _numbers(r, d["ghost_times_s"], f"{path}.ghost_times_s")
    )
    horizon = r.number(d, "horizon_s", path, default=base.horizon_s, positive=True, unit="s")
    if times is None or horizon is None:
        return None
    return r.build(path, lambda: DriftSettings(tuple(times), horizon))


def _numbers(r: _Reader, value: Any, path: str) -> list[float] | None:
    if not isinstance(value, list):
        r.fail(path, "must be a list of numbers")
        return None
    out = []
    for i, v in enumerate(value):
        if isinstance(v, bool) or not isinstance(v, int | float) or not math.isfinite(v):
            r.fail(f"{path}[{i}]", f"{v!r} is not a finite number")
            return None
        out.append(float(v))
    return out


def _decode_goal(r: _Reader, value: Any, path: str) -> Goal | None:
    if value is None:
        return None
    d = r.obj(value, path, ("kind",), ("force_ahead_kN", "force_to_port_kN", "moment_kNm"))
    if d is None:
        return None
    if d["kind"] not in GOAL_KINDS:
        r.fail(f"{path}.kind", f"{d['kind']!r} is not one of {', '.join(GOAL_KINDS)}")
        return None
    fx = r.number(d, "force_ahead_kN", path, default=0.0)
    fy = r.number(d, "force_to_port_kN", path, default=0.0)
    mz = r.number(d, "moment_kNm", path, default=0.0)
    if fx is None or fy is None or mz is None:
        return None
    return r.build(path, lambda: goal_from_parts(d["kind"], fx * KN, fy * KN, mz * KN))


def _decode_limits(r: _Reader, value: Any, path: str) -> StageLimits | None:
    d = r.obj(value, path, (), ("max_wind_kn", "max_current_kn", "min_clearance_m"))
    if d is None:
        return None
    wind = r.number(d, "max_wind_kn", path, low=0.0, unit="kn")
    current = r.number(d, "max_current_kn", path, low=0.0, unit="kn")
    clearance = r.number(d, "min_clearance_m", path, low=0.0, unit="m")
    return StageLimits(
        None if wind is None else wind * KNOT,
        None if current is None else current * KNOT,
        clearance,
    )
