"""A Project to the JSON-ready tree of the ``.towboard`` format."""

from __future__ import annotations

import math

from core.errors import InputError
from core.frames import angle_to_bearing
from core.io.fileformat import FORMAT_NAME, FORMAT_VERSION, KN, KNOT, Json, num
from core.model.capability import WAYS, Capability
from core.model.headway import placeholder_headway
from core.model.hull import Hull
from core.model.plan import Project, Stage
from core.model.tugs import Placement, Tug
from core.units import CHOICES, filed_bearing, filed_degrees


def angle(deg: float) -> float:
    """An angle in degrees as the file writes it (core.units.filed_degrees)."""
    return filed_degrees(deg)


def bearing(deg: float) -> float:
    """A bearing written in [0, 360): what rounds to 360 is written 0, so that
    save -> load -> save gives the same bytes."""
    return filed_bearing(deg)


def _opt(v: float | None, scale: float = 1.0) -> float | None:
    return None if v is None else num(v / scale)


def _pt(p: tuple[float, float]) -> list[float]:
    return [num(p[0]), num(p[1])]


def encode(project: Project) -> Json:
    """The project as a JSON-ready dict, keys in a fixed order."""
    return {
        "format": FORMAT_NAME,
        "format_version": FORMAT_VERSION,
        "plan": {
            "name": project.name,
            "revision": project.revision,
            "date": project.date,
            "prepared_by": project.prepared_by,
            "checked_by": project.checked_by,
            "approved_by": project.approved_by,
            "notes": project.notes,
            "history": [
                {"revision": r.revision, "date": r.date, "by": r.by, "description": r.description}
                for r in project.history
            ],
        },
        "display_units": {q: project.units.unit(q) for q in CHOICES},
        "clearance_margin_m": num(project.clearance_margin_m),
        "hulls": [_encode_hull(h) for h in project.hulls],
        "groups": [
            {
                "name": g.name,
                "members": [
                    {
                        "hull": m.hull,
                        "position_m": _pt((m.x, m.y)),
                        "heading_deg": bearing(angle_to_bearing(m.heading_rad)),
                    }
                    for m in g.members
                ],
            }
            for g in project.groups
        ],
        "tugs": [
            {
                "name": t.name,
                "type": t.tug_type,
                "role": t.role,
                "bollard_pull_kN": num(t.bollard_pull_n / KN),
                "astern_pull_kN": _opt(t.astern_pull_n, KN),
                "towing_point_height_m": _opt(t.towing_point_height_m),
                "certificate_date": t.certificate_date,
                "towline_length_m": _opt(t.towline_length_m),
                "towline_mbl_kN": _opt(t.towline_mbl_n, KN),
                "call_sign": t.call_sign,
                "working_channel": t.working_channel,
                "towline_warning_share_of_mbl": num(t.towline_warn_fraction),
                "capability": _encode_capability(t.capability_curves),
                "headway": _encode_headway(t),
            }
            for t in project.tugs
        ],
        "tug_efficiency": {
            "bollard_pull_kN": [num(v / KN) for v in project.tug_efficiency.bollard_pulls_n],
            "sea_state": [num(v) for v in project.tug_efficiency.sea_states],
            "efficiency": [[num(v) for v in row] for row in project.tug_efficiency.values],
        },
        "drift": {
            "ghost_times_s": [num(t) for t in project.drift.times_s],
            "horizon_s": num(project.drift.horizon_s),
        },
        "site": {
            "name": project.site.name,
            "features": [
                {
                    "name": f.name,
                    "kind": f.kind,
                    "closed": f.closed,
                    "points_m": [_pt(p) for p in f.points],
                }
                for f in project.site.features
            ],
        },
        "stages": [_encode_stage(project, s) for s in project.stages],
    }


def _encode_headway(t: Tug) -> Json:
    """The tug's share of its bollard pull by speed through the water, as [kn, share]
    rows; placeholder rows are marked."""
    table = t.headway or placeholder_headway()
    return {
        "placeholder": table.placeholder,
        "speed_kn_and_share": [[num(v), num(f)] for v, f in table.rows_kn],
    }


def _encode_capability(c: Capability) -> Json:
    """The capability with its values, each way as [relative bearing deg, share] pairs; a
    placeholder is marked (and worked out again from the tug's type when loaded)."""
    ways: Json = {}
    for way in WAYS:
        curve = c.curve(way)
        ways[way] = (
            None
            if curve is None
            else [
                [num(b), num(f)] for b, f in zip(curve.bearings_deg, curve.fractions, strict=True)
            ]
        )
    return {"placeholder": c.placeholder, "source": c.source, "bearing_deg_and_share": ways}


def _encode_hull(h: Hull) -> Json:
    return {
        "name": h.name,
        "outline_m": [_pt(p) for p in h.outline],
        "draught_m": _opt(h.draught_m),
        "freeboard_m": _opt(h.freeboard_m),
        "displacement_t": _opt(h.displacement_kg, 1000.0),
        "centre_of_gravity_m": None if h.cog is None else _pt(h.cog),
        "yaw_radius_of_gyration_m": _opt(h.yaw_gyradius_m),
        "added_mass_method": h.added_mass_method,
        "fittings": [
            {
                "name": f.name,
                "kind": f.kind,
                "type": f.fitting_type,
                "position_m": _pt((f.x, f.y)),
                "swl_kN": _opt(f.swl_n, KN),
                "tow_kN": _opt(f.tow_n, KN),
                "permitted_lead_deg": _sector(f.permitted_lead_rad),
            }
            for f in h.fittings
        ],
    }


def _sector(sector: tuple[float, float] | None) -> list[float] | None:
    """A (low, high) counter-clockwise hull-frame sector as [from, to] relative bearings,
    clockwise (counter-clockwise from low to high is clockwise from high to low)."""
    if sector is None:
        return None
    lo, hi = sector
    return [bearing(angle_to_bearing(hi)), bearing(angle_to_bearing(lo))]


def _working_sector(sector: tuple[float, float], push: bool) -> list[float]:
    """A working sector (low, high), counter-clockwise, as [from, to], degrees clockwise
    (relative bearings of a line, from 0 up to 360; push angles off square, from -180 up to
    180): counter-clockwise from low to high is clockwise from high to low. ``to`` is
    ``from`` plus the width for a whole circle, else taken round to the same range."""
    lo, hi = sector
    width = math.degrees(hi - lo)
    start = (
        angle((-math.degrees(hi) + 180.0) % 360.0 - 180.0)
        if push
        else bearing(angle_to_bearing(hi))
    )
    end = start + width if width >= 360.0 - 1e-9 else (start + width) % 360.0
    if push and end >= 180.0 and width < 360.0 - 1e-9:
        end -= 360.0
    return [start, angle(end)]


def _fitting_kind(project: Project, p: Placement) -> str:
    try:
        return project.hull(p.hull).fitting(p.point).kind
    except InputError:
        return "line"


def _encode_placement(project: Project, p: Placement) -> Json:
    d: Json = {
        "tug": p.tug,
        "hull": p.hull,
        "point": p.point,
        "setting_percent": num(p.setting * 100),
    }
    if _fitting_kind(project, p) == "push":
        d["push_angle_deg"] = angle(-math.degrees(p.lead_rad))
    else:
        d["lead_deg"] = bearing(angle_to_bearing(p.lead_rad))
        d["line_length_m"] = num(p.line_length_m)
    d["astern"] = p.astern
    push = _fitting_kind(project, p) == "push"
    if push:
        d["push_pull"] = p.push_pull
    if p.lead_sector_rad is not None:
        d["lead_sector_deg"] = _working_sector(p.lead_sector_rad, push)
    return d


def _encode_stage(project: Project, s: Stage) -> Json:
    c, lim = s.conditions, s.limits
    return {
        "name": s.name,
        "kind": s.kind,
        "notes": s.notes,
        "poses": [
            {"body": p.body, "position_m": _pt((p.x, p.y)), "heading_deg": bearing(p.heading_deg)}
            for p in s.poses
        ],
        "tugs": [_encode_placement(project, p) for p in s.placements],
        "conditions": {
            "wind_speed_kn": num(c.wind_speed_ms / KNOT),
            "wind_height_m": num(c.wind_height_m),
            "wind_from_deg": angle(c.wind_from_deg),
            "gust_factor": num(c.gust_factor),
            "current_speed_kn": num(c.current_speed_ms / KNOT),
            "current_towards_deg": angle(c.current_towards_deg),
            "air_density_kg_m3": num(c.air_density),
            "water_density_kg_m3": num(c.water_density),
            "wind_exponent": num(c.wind_exponent),
            "wind_coefficient_head_on": num(c.wind_coeff_head),
            "wind_coefficient_beam_on": num(c.wind_coeff_beam),
            "current_coefficient_head_on": num(c.current_coeff_head),
            "current_coefficient_beam_on": _opt(c.current_coeff_beam),
            "wind_area_head_on_m2": _opt(c.wind_area_head_m2),
            "wind_area_beam_on_m2": _opt(c.wind_area_beam_m2),
            "current_area_head_on_m2": _opt(c.current_area_head_m2),
            "current_area_beam_on_m2": _opt(c.current_area_beam_m2),
            "wind_centre_m": None if c.wind_centre_m is None else _pt(c.wind_centre_m),
            "current_centre_m": None if c.current_centre_m is None else _pt(c.current_centre_m),
            "sea_state": num(c.sea_state),
            "pressure_centre": c.pressure_centre,
            "wind_centre_head_on": num(c.wind_centre_head_on),
            "current_centre_head_on": num(c.current_centre_head_on),
            "water_depth_m": _opt(c.water_depth_m),
            "under_keel_margin_m": num(c.ukc_margin_m),
        },
        "goal": None
        if s.goal is None
        else {
            "kind": s.goal.kind,
            "force_ahead_kN": num(s.goal.fx_n / KN),
            "force_to_port_kN": num(s.goal.fy_n / KN),
            "moment_kNm": num(s.goal.moment_nm / KN),
            "speed_through_water_kn": num(s.goal.speed_ms / KNOT),
        },
        "limits": {
            "max_wind_kn": _opt(lim.max_wind_ms, KNOT),
            "max_current_kn": _opt(lim.max_current_ms, KNOT),
            "min_clearance_m": _opt(lim.min_clearance_m),
        },
        "swing": None
        if s.swing is None
        else {
            "start_heading_deg": bearing(s.swing.start_heading_deg),
            "end_heading_deg": bearing(s.swing.end_heading_deg),
            "bow_swings_to": s.swing.bow_to,
        },
    }
