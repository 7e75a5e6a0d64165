"""The report's parts about conditions, fittings, solved pulls, the tug lost check and
hold limits, read from one body's part of the stage result (core.analysis.stage).

The ``*_json`` functions give SI numbers, the ``*_lines`` functions text in the display
units. Used by core.io.report; nothing here works a figure out.
"""

from __future__ import annotations

import math
from typing import Any

import numpy as np

from core.analysis.limits import WIND_LIMIT_LABEL
from core.analysis.stage import BodyResult, StageResult
from core.analysis.swing import is_swing_stage, swing_words
from core.frames import angle_to_bearing, turning_words
from core.mechanics.fittings import FittingLoad, FittingTotal
from core.mechanics.loads import load_words
from core.model.plan import Stage
from core.model.tugs import STANDING_BY, setting_words, standing_by
from core.solve.holdlimits import (
    SHOWN_UP_TO_MS,
    HoldLimits,
    above_words,
    limit_at,
    limit_cell,
    limit_words,
    shown_limit,
)
from core.solve.pulls import (
    PullsResult,
    shortfall_words,
)
from core.units import DisplayUnits, label, percent

#: Directions listed in the text report's hold limits table, degrees true.
TEXT_DIRECTIONS = tuple(range(0, 360, 30))


def _finite(v: float) -> float | None:
    return float(v) if math.isfinite(v) else None


# -- JSON (SI) --------------------------------------------------------------------------


def conditions_json(stage: Stage, br: BodyResult) -> dict[str, Any]:
    c = stage.conditions
    cl, body = br.conditions, br.body
    return {
        "wind_speed_ms": c.wind_speed_ms,
        "wind_height_m": c.wind_height_m,
        "wind_speed_10m_ms": cl.wind_speed_10m_ms,
        "design_wind_ms": cl.design_wind_ms,
        "gust_factor": c.gust_factor,
        "wind_from_true_deg": c.wind_from_deg,
        "wind_from_relative_deg": cl.wind_from_rel_deg,
        "current_speed_ms": c.current_speed_ms,
        "current_towards_true_deg": c.current_towards_deg,
        "current_towards_relative_deg": cl.current_towards_rel_deg,
        "sea_state": c.sea_state,
        "water_depth_m": c.water_depth_m,
        "under_keel_clearance_m": None if br.depth is None else br.depth.clearance_m,
        "under_keel_margin_m": c.ukc_margin_m,
        "current_depth_factor": 1.0 if br.depth is None else br.depth.factor,
        "loads": [
            {
                "name": ld.name,
                "point_m": list(ld.point),
                "force_N": {"ahead": ld.force[0], "to_port": ld.force[1]},
                "yaw_moment_about_centroid_Nm": ld.moment_about(body.centroid),
            }
            for ld in cl.loads
        ],
        "notes": [n.message for n in cl.notices],
    }


def _result_json(r: PullsResult) -> dict[str, Any]:
    p = r.problem
    return {
        "goal_met": r.feasible,
        "largest_setting": r.largest_setting,
        "total_pull_N": r.total_pull_n,
        "shortfall": {
            "force_ahead_N": float(r.shortfall[0]),
            "force_to_port_N": float(r.shortfall[1]),
            "yaw_moment_about_centroid_Nm": float(r.shortfall[2]),
        },
        "tugs": [
            {
                "tug": pl.tug,
                "point": pl.point,
                "pull_N": float(r.pulls_n[i]),
                "usable_pull_N": float(p.usable_n[i]),
                "setting_percent": float(r.settings[i] * 100),
                "force_bearing_deg": r.bearing_deg(i),
                "lead_deg": angle_to_bearing(float(r.leads_rad[i]))
                if r.problem.placements[i].lead_sector_rad is not None
                else None,
            }
            for i, pl in enumerate(p.placements)
        ],
    }


def goal_json(br: BodyResult) -> dict[str, Any] | None:
    g = br.goal
    if g is None:
        return None
    return {
        "kind": g.kind,
        "force_ahead_N": g.fx_n,
        "force_to_port_N": g.fy_n,
        "yaw_moment_about_centroid_Nm": g.moment_nm,
        "met_by_the_pulls_as_set": br.goal_met_as_set,
    }


def fittings_json(br: BodyResult) -> list[dict[str, Any]]:
    """Each tug's load on its fitting: the line's tension (or the push) against the SWL,
    and the load of every tug at that fitting together (core.mechanics.fittings)."""
    return [
        {
            **_fitting_json(f),
            **_total_json(br.fitting_total(f.hull, f.point)),
        }
        for f in br.fittings
    ]


def _total_json(t: FittingTotal | None) -> dict[str, Any]:
    if t is None:
        return {}
    return {
        "tugs_at_fitting": list(t.tugs),
        "fitting_total_load_N": t.load_n,
        "fitting_total_use_of_rating": t.use_of_rating,
        "fitting_total_over_rating": t.over_rating,
    }


def _fitting_json(f: FittingLoad) -> dict[str, Any]:
    return {
        "tug": f.tug,
        "hull": f.hull,
        "point": f.point,
        "mode": f.mode,
        "fitting_type": f.fitting_type,
        "pull_N": f.pull_n,
        "line_angle_deg": math.degrees(f.line_angle_rad),
        "tension_N": f.tension_n,
        "load_N": f.load_n,
        "rating_N": f.rating_n,
        "over_rating": f.over_rating,
        "rated_for_the_tug": f.suits_tug,
    }


def solve_json(br: BodyResult) -> dict[str, Any] | None:
    if br.tug_lost is None:
        return None
    c = br.tug_lost
    worst = c.worst
    return {
        "solved": _result_json(c.full),
        "tug_lost": {
            "passes": c.passes,
            "worst_loss": None if worst is None else worst.tug,
            "cases": [
                {
                    "tug_lost": case.tug,
                    "goal_still_met": case.holds,
                    "largest_setting": case.largest_setting,
                    "hardest_working_tug": case.worst_tug,
                    "shortfall": {
                        "force_ahead_N": float(case.result.shortfall[0]),
                        "force_to_port_N": float(case.result.shortfall[1]),
                        "yaw_moment_about_centroid_Nm": float(case.result.shortfall[2]),
                    },
                }
                for case in c.cases
            ],
        },
    }


def hold_limits_json(stage: Stage, lim: HoldLimits | None) -> dict[str, Any] | None:
    """The hold limits, m/s, each as every view reports it (core.solve.holdlimits.
    shown_limit): null above ``shown_up_to_ms``."""
    if lim is None:
        return None
    d_lo, v_lo = lim.lowest()
    w = lim.worst_lost_ms
    planned = limit_at(lim, stage.conditions.wind_from_deg)

    def shown(values: np.ndarray) -> list[float | None]:
        return [shown_limit(float(v)) for v in values]

    return {
        "wind_measure": "mean speed at the stage's wind height, with its gust factor",
        "meaning": "the goal is met for every wind from calm up to the limit; 0: not even in calm",
        "shown_up_to_ms": SHOWN_UP_TO_MS["wind"],
        "null_means": "above shown_up_to_ms",
        "holds_current_alone": lim.holds_current,
        "goal_not_met_in_calm": lim.calm_words() or None,
        "tugs_whose_loss_fails_in_calm": list(lim.calm_fails),
        "directions_true_deg": [float(d) for d in lim.problem.directions_deg],
        "all_tugs_ms": shown(lim.all_tugs_ms),
        "all_tugs_band_ms": None
        if lim.all_tugs_min_ms is None or lim.all_tugs_max_ms is None
        else {"lowest": shown(lim.all_tugs_min_ms), "highest": shown(lim.all_tugs_max_ms)},
        "worst_tug_lost_ms": shown(w),
        "worst_tug_lost": list(lim.worst_lost_tug),
        "lowest_all_tugs": {
            "from_true_deg": None if lim.alike_all_round() else d_lo,
            "speed_ms": shown_limit(v_lo),
        },
        "at_planned_wind_direction": {
            "from_true_deg": stage.conditions.wind_from_deg,
            "all_tugs_ms": shown_limit(planned),
            "worst_tug_lost_ms": shown_limit(limit_at(lim, stage.conditions.wind_from_deg, w))
            if len(w)
            else None,
            "planned_ms": stage.conditions.wind_speed_ms,
        },
    }


def swing_json(r: StageResult) -> dict[str, Any] | None:
    """A swing stage's headings and side, and each worked body's moments against them
    (core.analysis.swing); None for a stage that is not a swing."""
    if not is_swing_stage(r.stage):
        return None
    sw = r.stage.swing
    u = r.project.units
    return {
        "start_heading_deg": None if sw is None else sw.start_heading_deg,
        "end_heading_deg": None if sw is None else sw.end_heading_deg,
        "bow_swings_to": None if sw is None else sw.bow_to,
        "turn_deg": None if sw is None else sw.turn_deg,
        "words": swing_words(r.stage),
        "bodies": [
            {
                "body": s.body,
                "goal_yaw_moment_about_centroid_Nm": s.goal_moment_nm,
                "goal_turns_bow_to": s.goal_turn,
                "as_set_yaw_moment_about_centroid_Nm": s.as_set_moment_nm,
                "as_set_turns_bow_to": s.as_set_turn,
                "against_the_swing": s.against,
                "no_turn": s.no_turn,
                "words": s.words(u),
            }
            for s in (b.swing for b in r.worked)
            if s is not None
        ],
    }


# -- text (display units) ---------------------------------------------------------------


def swing_lines(r: StageResult) -> list[str]:
    """A swing stage's headings and side, then each worked body's moments against them."""
    if not is_swing_stage(r.stage):
        return []
    u = r.project.units
    out = [f"  {'Swing':<16}{swing_words(r.stage)}"]
    out.extend(f"  {'':<16}{b.swing.words(u)}" for b in r.worked if b.swing is not None)
    return out


def wind_limit_lines(r: StageResult, u: DisplayUnits) -> list[str]:
    """The stage's wind limit in its measure and the planned wind in the same measure."""
    w = r.wind_limit
    if w is None:
        return []
    gusts = (
        "" if w.gust_10m_ms == w.mean_10m_ms else f", {u.show(w.gust_10m_ms, 'speed')} with gusts"
    )
    return [
        f"  {WIND_LIMIT_LABEL}  {u.show(w.limit_ms, 'speed')}: planned "
        f"{u.show(w.mean_10m_ms, 'speed')} mean at 10 m{gusts}"
    ]


def conditions_lines(stage: Stage, br: BodyResult, u: DisplayUnits) -> list[str]:
    c = stage.conditions
    cl, body = br.conditions, br.body
    design = ""
    if abs(cl.design_wind_ms - c.wind_speed_ms) > 1e-9:
        design = f"; {u.show(cl.design_wind_ms, 'speed')} at 10 m with gusts for the load"
    out = [
        f"  Wind            {u.show(c.wind_speed_ms, 'speed')} at {u.show(c.wind_height_m, 'length')} "
        f"from "
        f"{c.wind_from_deg:05.1f} true ({cl.wind_from_rel_deg:05.1f} relative){design}",
        f"  Current         {u.show(c.current_speed_ms, 'speed')} setting towards "
        f"{c.current_towards_deg:05.1f} true ({cl.current_towards_rel_deg:05.1f} relative)",
    ]
    out.append(depth_line(br, u))
    for ld in cl.loads:
        out.append(f"  {ld.name.capitalize() + ' load':<16}{load_words(ld, body, u)}")
    out.extend(f"  NOTE: {n.message}" for n in cl.notices)
    return out


def depth_words(br: BodyResult, u: DisplayUnits) -> str:
    """The water depth, the under-keel clearance and the current's depth factor, in words
    (from the stage result)."""
    d = br.depth
    if d is None:
        return "deep water (no depth given)"
    ukc = "unknown (no draught)" if d.clearance_m is None else u.show(d.clearance_m, "length")
    return (
        f"{u.show(d.depth_m, 'length')}; under-keel clearance {ukc} (margin "
        f"{u.show(d.margin_m, 'length')}); current beam-on x{d.factor:.2f} for depth "
        "(UFC 4-159-03)"
    )


def depth_line(br: BodyResult, u: DisplayUnits) -> str:
    return f"  {'Water depth':<16}{depth_words(br, u)}"


def solve_lines(br: BodyResult, u: DisplayUnits) -> list[str]:
    out: list[str] = []
    g = br.goal
    if g is None:
        return ["  Solved pulls    no goal set: the pulls as set are shown, not checked"]
    if br.tug_lost is None:
        return [f"  {n}" for n in br.notes]
    r = br.tug_lost.full
    what = {
        "hold": "hold (tugs and conditions sum to nothing)",
        "walk": f"walk {u.show(abs(g.fy_n), 'force')} to {'port' if g.fy_n > 0 else 'starboard'}",
        "swing": f"swing: {u.show(abs(g.moment_nm), 'moment')}, {turning_words(g.moment_nm)}",
        "transit": f"transit {u.show(abs(g.fx_n), 'force')} {'ahead' if g.fx_n >= 0 else 'astern'}",
        "force": "the given net force and moment",
    }[g.kind]
    given = ""
    state = (
        f"can be met, largest setting {percent(r.largest_setting)} %"
        if r.feasible
        else f"CANNOT be met: {shortfall_words(r.shortfall, u)}"
    )
    out.append(f"  Solved pulls    goal {what}{given}: {state}")
    for i, pl in enumerate(r.problem.placements):
        setting = float(r.settings[i])
        row = f"    {pl.tug:<14}{u.show(float(r.pulls_n[i]), 'force'):>10}  "
        if standing_by(setting):  # it pulls nothing: no direction to give
            out.append(row + STANDING_BY)
            continue
        out.append(
            row + f"setting {setting_words(setting):>6}  pulling towards "
            f"{r.bearing_deg(i):05.1f} relative"
        )
    c = br.tug_lost
    worst = c.worst
    if not r.feasible:
        fleet = "with every tug" if r.problem.placements else "with no tug placed"
        out.append(f"  Tug lost check  not meaningful: the goal is not met {fleet}")
        out.extend(f"  NOTE: {n}" for n in br.notes)
        return out
    out.append(
        "  Tug lost check  "
        + ("the goal holds with any one tug lost" if c.passes else "FAILS with a tug lost")
        + ("" if worst is None else f"; the loss that hurts most: {worst.tug}")
    )
    for case in c.cases:
        res = (
            f"holds, largest setting {percent(case.largest_setting)} % ({case.worst_tug})"
            if case.holds
            else f"does not hold: {shortfall_words(case.result.shortfall, u)}"
        )
        out.append(f"    without {case.tug:<14}{res}")
    out.extend(f"  NOTE: {n}" for n in br.notes)
    return out


def _against(load: FittingLoad | FittingTotal, u: DisplayUnits) -> str:
    """A load's rating, its use of it and OVER: "TOW 50.0 t (80 %)", "no rating given"."""
    if load.rating_n is None:
        return "no rating given"
    use = "" if load.use_words is None else f" ({load.use_words})"
    flag = "  OVER" if load.over_rating else ""
    return f"{load.rating_label} {u.show(load.rating_n, 'force')}{use}{flag}"


def fitting_lines(br: BodyResult, u: DisplayUnits) -> list[str]:
    """Each tug's load on its fitting against its rating (TOW, else SWL), one line each."""
    out = []
    for f in br.fittings:
        load = "push" if f.mode == "push" else "tension"
        out.append(
            f"    {f.tug:<14}{f.point:<22}{load} {u.show(f.load_n, 'force')} against "
            f"{_against(f, u)}"
        )
    for t in br.fitting_totals:
        if t.shared:
            out.append(
                f"    {'together':<14}{t.point:<22}load {u.show(t.load_n, 'force')} from "
                f"{' and '.join(t.tugs)} against {_against(t, u)}"
            )
    return (
        ["  Fittings        each tug's load (line tension = pull / cos(line angle))", *out]
        if out
        else []
    )


def hold_limit_lines(stage: Stage, lim: HoldLimits | None, u: DisplayUnits) -> list[str]:
    if lim is None:
        return []
    sp = label(u.unit("speed"))
    w = lim.worst_lost_ms

    def show(v: float) -> str:
        return limit_cell(v, u).rjust(8)

    out = [
        f"  Hold limits     {lim.meaning()}, by true direction ({sp}, as the stage's wind "
        "is given):"
    ]
    out.append("    from   " + "".join(f"{d:03d}".rjust(8) for d in TEXT_DIRECTIONS))
    out.append("    all    " + "".join(show(limit_at(lim, float(d))) for d in TEXT_DIRECTIONS))
    if len(w):
        out.append(
            "    1 lost " + "".join(show(limit_at(lim, float(d), w)) for d in TEXT_DIRECTIONS)
        )
    c = stage.conditions
    planned = limit_at(lim, c.wind_from_deg)
    curves = (None, w) if len(w) else (None,)
    if any(
        shown_limit(limit_at(lim, float(d), v)) is None for d in TEXT_DIRECTIONS for v in curves
    ):
        out.append(f"    ({above_words(u)})")
    out.append(
        f"    lowest {lim.lowest_words(u)}; from the planned "
        f"{c.wind_from_deg:03.0f} true: {limit_words(planned, u)} against the planned "
        f"{u.show(c.wind_speed_ms, 'speed')}"
    )
    calm = lim.calm_words()
    if calm:
        out.append(f"    WARNING: {calm[:1].lower()}{calm[1:]}")
    if lim.holds_current and float(np.min(lim.all_tugs_ms)) <= 0:
        out.append("    WARNING: from some directions the tugs cannot hold any wind")
    return out
