"""The report's parts about conditions, solved pulls, the tug lost check and hold limits.

:func:`stage_extras` computes them for one stage; the ``*_json`` functions give SI
numbers, the ``*_lines`` functions text in the display units. Used by core.io.report.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np

from core.errors import TowboardError
from core.frames import angle_to_bearing, turning_words, walking_words
from core.mechanics.bodies import Body, stage_body
from core.mechanics.loads import body_conditions, loads_wrench
from core.model.goals import Goal
from core.model.plan import Project, Stage
from core.solve.holdlimits import HoldLimits, hold_limits, hold_limits_problem, limit_at
from core.solve.pulls import (
    PullsResult,
    TugLostCheck,
    pulls_problem,
    shortfall_words,
    tug_lost_check,
)
from core.units import DisplayUnits, fmt, label

#: Directions listed in the text report's hold limits table, degrees true.
TEXT_DIRECTIONS = tuple(range(0, 360, 30))


@dataclass(frozen=True, slots=True)
class StageExtras:
    """Conditions, solve, tug lost check and hold limits of one stage (None where not possible)."""

    body: Body
    goal: Goal
    goal_given: bool  # False: the stage sets no goal and "hold" was solved
    check: TugLostCheck | None
    limits: HoldLimits | None
    notes: tuple[str, ...]

    @property
    def solved(self) -> PullsResult | None:
        return None if self.check is None else self.check.full


def stage_extras(project: Project, stage: Stage) -> StageExtras | None:
    """Everything the solver adds to a stage; None for a stage with no hull."""
    if not project.hulls:
        return None
    body = stage_body(project, stage)
    goal = stage.goal or Goal("hold")
    notes: list[str] = []
    check = limits = None
    try:
        check = tug_lost_check(pulls_problem(project, stage, body.name, goal))
        notes.extend(n.message for n in check.problem.notices)
    except TowboardError as e:
        notes.append(f"Pulls not solved: {e}")
    if stage.placements:
        try:
            limits = hold_limits(hold_limits_problem(project, stage, body.name))
        except TowboardError as e:
            notes.append(f"Hold limits not computed: {e}")
    return StageExtras(body, goal, stage.goal is not None, check, limits, tuple(notes))


def _finite(v: float) -> float | None:
    return float(v) if math.isfinite(v) else None


# -- JSON (SI) --------------------------------------------------------------------------


def conditions_json(project: Project, stage: Stage, body: Body) -> dict[str, Any]:
    c = stage.conditions
    cl = body_conditions(stage, body)
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
        "loads": [
            {
                "name": ld.name,
                "point_m": list(ld.point),
                "force_N": {"ahead": ld.force[0], "to_port": ld.force[1]},
                "yaw_moment_about_centroid_Nm": float(loads_wrench((ld,), body.centroid)[2]),
            }
            for ld in cl.loads
        ],
        "notes": [n.message for n in cl.notices],
    }


def _result_json(r: PullsResult) -> dict[str, Any]:
    p = r.problem
    return {
        "goal_met": r.feasible,
        "largest_utilisation": r.max_utilisation,
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
                "setting_percent": float(r.utilisation[i] * 100),
                "force_bearing_deg": r.bearing_deg(i),
                "lead_deg": angle_to_bearing(float(r.leads_rad[i]))
                if r.problem.placements[i].lead_sector_rad is not None
                else None,
            }
            for i, pl in enumerate(p.placements)
        ],
    }


def solve_json(x: StageExtras) -> dict[str, Any] | None:
    if x.check is None:
        return None
    c = x.check
    worst = c.worst
    return {
        "goal": {
            "kind": x.goal.kind,
            "given_by_stage": x.goal_given,
            "force_ahead_N": x.goal.fx_n,
            "force_to_port_N": x.goal.fy_n,
            "yaw_moment_about_centroid_Nm": x.goal.moment_nm,
        },
        "solved": _result_json(c.full),
        "tug_lost": {
            "passes": c.passes,
            "worst_loss": None if worst is None else worst.tug,
            "cases": [
                {
                    "tug_lost": case.tug,
                    "goal_still_met": case.holds,
                    "largest_utilisation": case.worst_utilisation,
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
    if lim is None:
        return None
    d_lo, v_lo = lim.lowest()
    w = lim.worst_lost_ms
    planned = limit_at(lim, stage.conditions.wind_from_deg)
    return {
        "wind_measure": "mean speed at the stage's wind height, with its gust factor",
        "holds_current_alone": lim.holds_current,
        "directions_true_deg": [float(d) for d in lim.problem.directions_deg],
        "all_tugs_ms": [_finite(v) for v in lim.all_tugs_ms],
        "worst_tug_lost_ms": [_finite(v) for v in w],
        "worst_tug_lost": list(lim.worst_lost_tug),
        "lowest_all_tugs": {"from_true_deg": d_lo, "speed_ms": _finite(v_lo)},
        "at_planned_wind_direction": {
            "from_true_deg": stage.conditions.wind_from_deg,
            "all_tugs_ms": _finite(planned),
            "worst_tug_lost_ms": _finite(limit_at(lim, stage.conditions.wind_from_deg, w))
            if len(w)
            else None,
            "planned_ms": stage.conditions.wind_speed_ms,
        },
    }


# -- text (display units) ---------------------------------------------------------------


def conditions_lines(stage: Stage, body: Body, u: DisplayUnits) -> list[str]:
    c = stage.conditions
    cl = body_conditions(stage, body)
    design = ""
    if abs(cl.design_wind_ms - c.wind_speed_ms) > 1e-9:
        design = f"; {u.show(cl.design_wind_ms, 'speed')} at 10 m with gusts for the load"
    out = [
        f"  Wind            {u.show(c.wind_speed_ms, 'speed')} at {c.wind_height_m:g} m from "
        f"{c.wind_from_deg:05.1f} true ({cl.wind_from_rel_deg:05.1f} relative){design}",
        f"  Current         {u.show(c.current_speed_ms, 'speed')} setting towards "
        f"{c.current_towards_deg:05.1f} true ({cl.current_towards_rel_deg:05.1f} relative)",
    ]
    for ld in cl.loads:
        m = float(loads_wrench((ld,), body.centroid)[2])
        out.append(
            f"  {ld.name.capitalize() + ' load':<16}{u.show(math.hypot(*ld.force), 'force')}"
            f" (ahead {fmt(u.value(ld.force[0], 'force'), signed=True)}, to port "
            f"{fmt(u.value(ld.force[1], 'force'), signed=True)} {label(u.unit('force'))}), "
            f"{fmt(u.value(m, 'moment'), signed=True)} {label(u.unit('moment'))} about the centroid"
        )
    out.extend(f"  NOTE: {n.message}" for n in cl.notices)
    return out


def solve_lines(x: StageExtras, u: DisplayUnits) -> list[str]:
    out: list[str] = []
    if x.check is None:
        return [f"  {n}" for n in x.notes]
    r = x.check.full
    g = x.goal
    what = {
        "hold": "hold (tugs and conditions sum to nothing)",
        "walk": f"walk: {walking_words(g.fx_n, g.fy_n)} with {u.show(math.hypot(g.fx_n, g.fy_n), 'force')}",
        "swing": f"swing: {u.show(abs(g.moment_nm), 'moment')}, {turning_words(g.moment_nm)}",
        "force": "the given net force and moment",
    }[g.kind]
    given = "" if x.goal_given else " (the stage sets no goal)"
    state = (
        f"met, largest use {r.max_utilisation * 100:.0f} %"
        if r.feasible
        else f"NOT MET: {shortfall_words(r.shortfall, u)}"
    )
    out.append(f"  Solved pulls    goal {what}{given}: {state}")
    for i, pl in enumerate(r.problem.placements):
        out.append(
            f"    {pl.tug:<14}{u.show(float(r.pulls_n[i]), 'force'):>10}  setting "
            f"{r.utilisation[i] * 100:>4.0f} %  pulling towards {r.bearing_deg(i):05.1f} relative"
        )
    c = x.check
    worst = c.worst
    if not r.feasible:
        out.append("  Tug lost check  not meaningful: the goal is not met with every tug")
        out.extend(f"  NOTE: {n}" for n in x.notes)
        return out
    out.append(
        "  Tug lost check  "
        + ("the goal holds with any one tug lost" if c.passes else "FAILS with a tug lost")
        + ("" if worst is None else f"; the loss that hurts most: {worst.tug}")
    )
    for case in c.cases:
        res = (
            f"holds, largest use {case.worst_utilisation * 100:.0f} % ({case.worst_tug})"
            if case.holds
            else f"does not hold: {shortfall_words(case.result.shortfall, u)}"
        )
        out.append(f"    without {case.tug:<14}{res}")
    out.extend(f"  NOTE: {n}" for n in x.notes)
    return out


def hold_limit_lines(stage: Stage, lim: HoldLimits | None, u: DisplayUnits) -> list[str]:
    if lim is None:
        return []
    sp = label(u.unit("speed"))
    w = lim.worst_lost_ms

    def show(v: float) -> str:
        return "  beyond" if not math.isfinite(v) else f"{u.value(v, 'speed'):>8.1f}"

    out = [
        f"  Hold limits     highest wind ({sp}, as the stage's wind is given) by true direction:"
    ]
    out.append("    from   " + "".join(f"{d:03d}".rjust(8) for d in TEXT_DIRECTIONS))
    out.append("    all    " + "".join(show(limit_at(lim, float(d))) for d in TEXT_DIRECTIONS))
    if len(w):
        out.append(
            "    1 lost " + "".join(show(limit_at(lim, float(d), w)) for d in TEXT_DIRECTIONS)
        )
    d_lo, v_lo = lim.lowest()
    c = stage.conditions
    planned = limit_at(lim, c.wind_from_deg)
    out.append(
        f"    lowest {show(v_lo).strip()} {sp} from {d_lo:03.0f} true; from the planned "
        f"{c.wind_from_deg:03.0f} true: {show(planned).strip()} {sp} against the planned "
        f"{u.show(c.wind_speed_ms, 'speed')}"
    )
    if not lim.holds_current:
        out.append("    WARNING: the tugs cannot hold the body against the current alone")
    elif float(np.min(lim.all_tugs_ms)) <= 0:
        out.append("    WARNING: from some directions the tugs cannot hold any wind")
    return out
