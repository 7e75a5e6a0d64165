"""The headless report: each stage's balance in words and numbers, or as JSON in SI."""

from __future__ import annotations

from typing import Any

from core.analysis.stage import StageResult, plan_results
from core.analysis.verdict import Verdict
from core.io.report_drift import drift_json, drift_lines
from core.io.report_parts import (
    conditions_json,
    conditions_lines,
    fitting_lines,
    fittings_json,
    goal_json,
    hold_limit_lines,
    hold_limits_json,
    solve_json,
    solve_lines,
    swing_json,
    swing_lines,
    wind_limit_lines,
)
from core.mechanics.balance import Balance
from core.mechanics.bodies import group_frame_words
from core.model.plan import Project
from core.motion.drift import DRIFT_CAUTION
from core.units import DisplayUnits, fmt, label, percent


def frame_note(project: Project) -> str:
    """The frame and sign note; a lashed group's frame is one member's, named."""
    groups = group_frame_words(project)
    return (
        "Hull frame: origin at the hull's reference point on the centreline"
        + (f" ({groups})" if groups else "")
        + ", x forward, y to port. "
        "Yaw moment positive counter-clockwise seen from above (swings the bow to port). "
        "Directions are relative bearings, degrees clockwise from ahead."
    )


CAUTION = (
    "Planning aid only, under the stated assumptions. Certified bollard pull, fitting ratings "
    "and the conditions on the day govern; the master, the pilot, local port rules and "
    "applicable standards decide."
)


def balance_json(b: Balance) -> dict[str, Any]:
    eq = b.equivalent
    return {
        "body": b.body,
        "centroid_m": list(b.centroid),
        "centre_of_gravity_m": list(b.centre_of_gravity),
        "net_force_N": {"ahead": eq.force[0], "to_port": eq.force[1], "magnitude": eq.magnitude},
        "net_force_bearing_deg": b.net_bearing_deg,
        "net_force_words": b.walking,
        "yaw_moment_about_centroid_Nm": eq.moment,
        "yaw_moment_about_centre_of_gravity_Nm": b.moment_cog_nm,
        "turning": b.turning,
        "equivalent": {
            "kind": eq.kind,
            "point_on_line_m": None if eq.point is None else list(eq.point),
            "direction": None if eq.direction is None else list(eq.direction),
            "offset_from_centroid_m": eq.offset_m,
            "crosses_centreline_at_x_m": b.centreline_x,
            "centreline": b.centreline,
            "crossing_far_off_the_hull": b.crossing_is_far,
            "along_centreline": b.along_centreline,
            "enters_outline_m": None if b.chord is None else list(b.chord[0]),
            "leaves_outline_m": None if b.chord is None else list(b.chord[1]),
        },
        "tugs": [
            {
                "tug": sh.tug,
                "hull": sh.hull,
                "point": sh.point,
                "mode": sh.mode,
                "setting_percent": sh.setting * 100,
                "assigned_pull_N": sh.pull_n,
                "usable_pull_N": sh.usable_n,
                "rated_pull_N": sh.rated_n,
                "share_of_rated_pull": sh.share_of_rated,
                "force_N": {"ahead": sh.force[0], "to_port": sh.force[1]},
                "force_bearing_deg": sh.lead_bearing_deg,
                "yaw_moment_about_centroid_Nm": sh.moment_centroid_nm,
                "tug_position_m": list(sh.position),
            }
            for sh in b.shares
        ],
        "warnings": [
            {"code": n.code, "subject": n.subject, "message": n.message} for n in b.notices
        ],
    }


def report_json(project: Project) -> dict[str, Any]:
    """The report as a JSON-ready dict in SI units, with frame and units stated."""
    return {
        "plan": project.name,
        "revision": project.revision,
        "units": {"force": "N", "moment": "N*m", "length": "m", "speed": "m/s", "angle": "deg"},
        # the reasons, warnings and words are written for people, in the plan's units
        "text_units": {q: project.units.unit(q) for q in ("force", "moment", "length", "speed")},
        "frame": frame_note(project),
        "caution": CAUTION,
        "drift_caution": DRIFT_CAUTION,
        "stages": [
            {**_stage_json(r), "drift": drift_json(project, r.index)} for r in plan_results(project)
        ],
    }


def verdict_json(v: Verdict) -> dict[str, Any]:
    return {
        "status": v.status,
        "reasons": [
            {"code": r.code, "text": r.text, "status": r.status, "subject": r.subject}
            for r in v.reasons
        ],
    }


def _stage_json(r: StageResult) -> dict[str, Any]:
    s, main = r.stage, r.main
    out: dict[str, Any] = {
        "stage": s.name,
        "kind": s.kind,
        "verdict": verdict_json(r.verdict),
        "goal": None if main is None else goal_json(main),
        "swing": swing_json(r),
        "balance": None if main is None else balance_json(main.balance),
    }
    if main is not None:
        out["fittings"] = fittings_json(main)
        out["conditions"] = conditions_json(s, main)
        out["solve"] = solve_json(main)
        out["hold_limits"] = hold_limits_json(s, main.hold_limits)
        out["notes"] = list(main.notes)
        others = [b for b in r.worked if b is not main]
        if others:
            out["other_bodies"] = [
                {"balance": balance_json(b.balance), "fittings": fittings_json(b)} for b in others
            ]
    out["clearances"] = [
        {
            "body": c.body,
            "other": c.other,
            "other_kind": c.other_kind,
            "distance_m": c.distance_m,
            "margin_m": c.margin_m,
            "below_margin": c.below_margin,
        }
        for c in r.clearances
    ]
    return out


def _balance_lines(b: Balance, u: DisplayUnits) -> list[str]:
    eq = b.equivalent
    f, m = u.unit("force"), u.unit("moment")
    lines = []
    bearing = "" if b.net_bearing_deg is None else f" towards {b.net_bearing_deg:05.1f} relative"
    lines.append(
        f"  Net force       {u.show(eq.magnitude, 'force')}{bearing}"
        f"  (ahead {fmt(u.value(eq.force[0], 'force'), signed=True)} {label(f)}, "
        f"to port {fmt(u.value(eq.force[1], 'force'), signed=True)} {label(f)})"
        f"  {b.walking}"
    )
    lines.append(
        f"  Yaw moment      {fmt(u.value(eq.moment, 'moment'), signed=True)} {label(m)} about the centroid, "
        f"{b.turning}"
    )
    lines.append(
        f"                  {fmt(u.value(b.moment_cog_nm, 'moment'), signed=True)} {label(m)} about the centre of gravity"
    )
    lines.append(f"  Equivalent      {b.equivalent_words(u)}")
    lines.append(
        f"  {'Tug':<14}{'Point':<22}{'Mode':<6}{'Setting':>17}{'Pull':>12}{'Bearing':>9}{'Moment':>14}{'Share of rated pull':>22}"
    )
    for sh in b.shares:
        lines.append(
            f"  {sh.tug:<14}{sh.point:<22}{sh.mode:<6}{sh.setting_words:>17}"
            f"{u.value(sh.pull_n, 'force'):>8.1f} {label(f):<3}{sh.lead_bearing_deg:>8.0f} "
            f"{fmt(u.value(sh.moment_centroid_nm, 'moment')):>9} {label(m):<4}{percent(sh.share_of_rated) + ' %':>22}"
        )
    for n in b.notices:
        lines.append(f"  WARNING: {n.message}")
    return lines


def report_text(project: Project) -> str:
    """The report in the project's display units, for a terminal."""
    u = project.units
    out = [f"{project.name} (revision {project.revision})", frame_note(project), ""]
    for r in plan_results(project):
        s = r.stage
        out.append(f"Stage {r.index + 1}: {s.name} [{s.kind}]")
        out.append(f"  Verdict         {r.verdict.label}")
        out.extend(f"    {reason.status.upper():<8}{reason.text}" for reason in r.verdict.reasons)
        out.extend(wind_limit_lines(r, u))
        out.extend(swing_lines(r))
        for b in r.worked:
            if len(r.worked) > 1:
                out.append(f"  Body            {b.name}")
            out.extend(_balance_lines(b.balance, u))
            out.extend(fitting_lines(b, u))
            out.extend(conditions_lines(s, b, u))
            out.extend(solve_lines(b, u))
            out.extend(hold_limit_lines(s, b.hold_limits, u))
        if not r.worked:
            out.append("  no hull to work on")
        else:
            out.extend(drift_lines(project, r.index))
        out.append("")
    out.append(CAUTION)
    out.append(DRIFT_CAUTION)
    return "\n".join(out) + "\n"
