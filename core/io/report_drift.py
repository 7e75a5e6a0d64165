"""The drift preview in the headless report and on the command line: text in the
project's display units, JSON in SI, both read from the one computation
(``stage_result(project, i).drift``, or one drift for ``towboard drift``)."""

from __future__ import annotations

import math
from typing import Any

import numpy as np

from core.analysis.stage import stage_result
from core.errors import InputError
from core.frames import site_angle_to_true
from core.model.drift import MAX_HORIZON_S, DriftSettings
from core.model.plan import Project
from core.motion.drift import DRIFT_CAUTION, DriftResult, DriftScenario
from core.motion.scenarios import drift, drift_setup
from core.motion.summary import StageDrift, contact_words, ghost_rows
from core.units import DisplayUnits, fmt, label


def drift_lines(project: Project, index: int) -> list[str]:
    """The stage's drift preview for the report: worst tug lost and all lines let go."""
    sd = stage_result(project, index).drift
    u = project.units
    if sd.reason:
        return [f"  Drift preview   {sd.reason}"]
    out = []
    for head, r in (("worst tug lost", sd.worst), ("lines let go", sd.let_go)):
        if r is None:
            out.append(f"  Drift, {head:<15} no tug works on {sd.body}")
            continue
        who = f" ({r.problem.scenario.tug})" if r.problem.scenario.tug else ""
        out.append(f"  Drift, {head}{who}: {contact_words(r, u)}")
        if r.alongside:
            out.append(f"                  lies alongside {', '.join(r.alongside)} at the start")
    for n in sd.notices:
        out.append(f"  NOTE: {n.message}")
    return out


def result_json(r: DriftResult | None) -> dict[str, Any] | None:
    """One drift's outcome in SI: scenario, contact, ghosts (no track)."""
    if r is None:
        return None
    c = r.contact
    return {
        "scenario": r.problem.scenario.kind,
        "tug_lost": r.problem.scenario.tug,
        "words": r.problem.scenario.words(),
        "contact": None
        if c is None
        else {
            "time_s": c.time_s,
            "with": c.other,
            "kind": c.other_kind,
            "point_m": list(c.point),
            "closing_speed_m_s": c.closing_speed_ms,
            "point_speed_m_s": c.point_speed_ms,
        },
        "alongside_at_start": list(r.alongside),
        "end_s": r.end_s,
        "largest_drift_m": r.excursion_m(),
        "ghosts": [
            {
                "time_s": g.time_s,
                "centroid_moved_m": g.moved_m,
                "heading_deg": g.heading_deg,
                "speed_m_s": g.speed_ms,
                "rate_of_turn_deg_min": g.turn_deg_min,
            }
            for g in ghost_rows(r)
            if not g.at_contact
        ],
    }


def drift_json(project: Project, index: int) -> dict[str, Any]:
    """The stage's drift preview in SI for the JSON report."""
    sd: StageDrift = stage_result(project, index).drift
    return {
        "body": sd.body,
        "not_worked_out": sd.reason or None,
        "horizon_s": project.drift.horizon_s,
        "worst_tug_lost": result_json(sd.worst),
        "lines_let_go": result_json(sd.let_go),
        "each_tug_lost": [result_json(r) for r in sd.tug_lost],
        "notes": [n.message for n in sd.notices],
        "caution": DRIFT_CAUTION,
    }


def track_table(r: DriftResult, every_s: float) -> tuple[np.ndarray, np.ndarray]:
    """Times every ``every_s`` seconds and the end, with their states (k, 6), read off the
    sampled track (linear between its samples, which lie a second or two apart)."""
    ts = np.arange(0.0, r.end_s, every_s)
    if not len(ts) or ts[-1] < r.end_s - 1e-9:
        ts = np.append(ts, r.end_s)
    states = np.column_stack([np.interp(ts, r.times, r.states[:, j]) for j in range(6)])
    return ts, states


def track_lines(r: DriftResult, units: DisplayUnits, every_s: float) -> list[str]:
    """The track as a table: time, the centroid's east and north, heading, speed over the
    ground and rate of turn (positive: the bow swings to port)."""
    ln, sp = label(units.unit("length")), label(units.unit("speed"))
    ts, states = track_table(r, every_s)
    cent = r.centroid_track(states)
    speed = r.speed_ms(states)
    lines = [
        f"{'t s':>7} {'east ' + ln:>10} {'north ' + ln:>10} {'heading':>8} "
        f"{'speed ' + sp:>10} {'turn °/min':>11}"
    ]
    for k, t in enumerate(ts):
        east, north = (units.value(float(v), "length") for v in cent[k])
        lines.append(
            f"{t:>7.0f} {east:>10.1f} {north:>10.1f} "
            f"{site_angle_to_true(float(states[k, 2])):>7.1f}° "
            f"{units.value(float(speed[k]), 'speed'):>10.2f} "
            f"{fmt(math.degrees(float(states[k, 5])) * 60, 1, signed=True):>11}"
        )
    return lines


def track_json(r: DriftResult, every_s: float) -> list[dict[str, float]]:
    """The track in SI, one entry every ``every_s`` seconds and at the end."""
    ts, states = track_table(r, every_s)
    cent = r.centroid_track(states)
    vel = r.ground_velocity(states)
    return [
        {
            "time_s": float(t),
            "centroid_east_m": float(cent[k, 0]),
            "centroid_north_m": float(cent[k, 1]),
            "heading_deg": site_angle_to_true(float(states[k, 2])),
            "velocity_east_m_s": float(vel[k, 0]),
            "velocity_north_m_s": float(vel[k, 1]),
            "speed_m_s": float(math.hypot(*vel[k])),
            "rate_of_turn_deg_min": math.degrees(float(states[k, 5])) * 60.0,
        }
        for k, t in enumerate(ts)
    ]


# -- towboard drift ----------------------------------------------------------------------

#: The shortest step between the printed track's rows, s (the track itself is sampled a
#: second or two apart: finer rows are read off it in straight lines).
MIN_EVERY_S = 0.1
#: The most rows the printed track may have (an hour's look ahead every 0.4 s).
MAX_TRACK_ROWS = 10_000


def check_every(every_s: float, horizon_s: float) -> float:
    """``--every`` as given, checked against its range and the rows it would print over a
    look ahead of ``horizon_s``.

    Raises InputError naming ``--every``.
    """
    if not (math.isfinite(every_s) and MIN_EVERY_S <= every_s <= MAX_HORIZON_S):
        raise InputError(
            "--every", every_s, f"must be from {MIN_EVERY_S:g} to {MAX_HORIZON_S:g} seconds"
        )
    rows = math.ceil(horizon_s / every_s) + 1  # the rows from 0 s and the end
    if rows > MAX_TRACK_ROWS:
        least = horizon_s / (MAX_TRACK_ROWS - 1)
        raise InputError(
            "--every",
            every_s,
            f"gives {rows:,} rows over the {horizon_s:g} s look ahead, more than "
            f"{MAX_TRACK_ROWS:,}: take at least {math.ceil(least * 100) / 100:g} s",
        )
    return every_s


def command_drift(
    project: Project,
    stage_number: int,
    lose: str | None,
    let_go: bool,
    seconds: float | None,
    every_s: float,
) -> DriftResult:
    """The one drift ``towboard drift`` asks for (stage numbers count from 1), its track
    to be printed every ``every_s`` seconds.

    Raises InputError naming the option that is wrong, before any work.
    """
    n = len(project.stages)
    if not 1 <= stage_number <= n:
        raise InputError(
            "--stage", stage_number, f"must be from 1 to {n}" if n else "is not a stage: none"
        )
    settings = project.drift
    if seconds is not None:
        if not (math.isfinite(seconds) and 0 < seconds <= MAX_HORIZON_S):
            raise InputError("--seconds", seconds, f"must be above 0 and at most {MAX_HORIZON_S:g}")
        settings = DriftSettings(settings.times_s, seconds)
    check_every(every_s, settings.horizon_s)
    if lose is not None and not lose.strip():
        raise InputError("--lose", lose, "must name a tug (leave --lose out for pulls as set)")
    if not project.hulls:
        raise InputError("plan", project.name, "has no hull to drift")
    stage = project.stages[stage_number - 1]
    scenario = (
        DriftScenario("let_go")
        if let_go
        else DriftScenario("tug_lost", lose)
        if lose
        else DriftScenario("as_set")
    )
    result = drift(project, stage, scenario, setup=drift_setup(project, stage, settings=settings))
    if result is None:  # only "worst tug lost" can come back empty
        raise InputError("--lose", lose, "no tug works on the body")
    return result


def drift_command_text(
    project: Project,
    stage_number: int,
    lose: str | None,
    let_go: bool,
    seconds: float | None,
    every_s: float,
) -> str:
    """What ``towboard drift`` prints: the track in the plan's units, then the first contact."""
    r = command_drift(project, stage_number, lose, let_go, seconds, every_s)
    u = project.units
    ine = r.problem.motion.inertia
    out = [
        f"{project.name} (revision {project.revision})",
        f"Stage {stage_number}: {r.problem.stage}; {r.problem.body}, {r.problem.scenario.words()}",
        f"Mass {ine.mass_kg / 1000:.0f} t; added mass ahead {ine.surge_added_kg / 1000:.0f} t, "
        f"abeam {ine.sway_added_kg / 1000:.0f} t; yaw radius of gyration "
        f"{u.show(ine.gyradius_m, 'length')} ({ine.method})",
        "Track of the centroid (site frame: east, north); heading true; turn positive with the "
        "bow swinging to port",
        *track_lines(r, u, every_s),
        "",
        f"First contact: {contact_words(r, u)}",
    ]
    c = r.contact
    if c is not None:
        east, north = (u.show(v, "length") for v in c.point)
        out.append(
            f"  at {east} east, {north} north; that point moving at "
            f"{u.show(c.point_speed_ms, 'speed', 2)}"
        )
    if r.alongside:
        out.append(f"Lies alongside {', '.join(r.alongside)} at the start (not a contact)")
    out += [f"NOTE: {n.message}" for n in r.notices]
    out += ["", DRIFT_CAUTION]
    return "\n".join(out) + "\n"


def drift_command_json(
    project: Project,
    stage_number: int,
    lose: str | None,
    let_go: bool,
    seconds: float | None,
    every_s: float,
) -> dict[str, Any]:
    """What ``towboard drift --json`` prints, in SI."""
    r = command_drift(project, stage_number, lose, let_go, seconds, every_s)
    ine = r.problem.motion.inertia
    return {
        "plan": project.name,
        "revision": project.revision,
        "stage": r.problem.stage,
        "stage_number": stage_number,
        "body": r.problem.body,
        "units": {"length": "m", "speed": "m/s", "time": "s", "angle": "deg"},
        "frame": "site frame: x east, y north; headings true; rate of turn positive to port",
        "horizon_s": r.problem.horizon_s,
        "inertia": {
            "mass_kg": ine.mass_kg,
            "yaw_inertia_kg_m2": ine.yaw_inertia_kgm2,
            "added_mass_surge_kg": ine.surge_added_kg,
            "added_mass_sway_kg": ine.sway_added_kg,
            "added_mass_yaw_kg_m2": ine.yaw_added_kgm2,
            "centre_of_gravity_m": list(ine.cog),
            "method": ine.method,
        },
        **(result_json(r) or {}),
        "track": track_json(r, every_s),
        "notes": [n.message for n in r.notices],
        "caution": DRIFT_CAUTION,
    }
