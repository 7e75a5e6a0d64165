"""The briefing's content, section by section, as blocks for the page layout.

Every number comes from the core (core.analysis.checks for the stages, core.solve.pulls.pulls and
core.solve.pulls.holdlimits for the tug lost check and the hold limits) and is formatted with
the same functions the board uses (core.units.DisplayUnits.show, core.units.fmt).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from PySide6.QtGui import QColor

from app.briefing.diagram import StageDiagram
from app.briefing.holdplot import HoldPlot
from app.briefing.layout import (
    FAIL,
    GOOD,
    INK,
    MUTED,
    WARN,
    Block,
    Boxed,
    Column,
    Drawing,
    Group,
    PageBreak,
    Spacer,
    Table,
    Text,
    heading,
)
from app.paint import style
from core.analysis.checks import StageCheck, tug_lost_as_set
from core.frames import turning_words, walking_words
from core.io.report import CAUTION
from core.mechanics.balance import Balance
from core.mechanics.bodies import body_of
from core.model.plan import Project, Stage
from core.solve.holdlimits import HoldLimits
from core.solve.pulls import TugLostCheck
from core.units import DisplayUnits, fmt, label

#: Clearances listed per stage besides those below the margin (the nearest first).
SHOWN_CLEARANCES = 4

CAUTIONS = (
    "This briefing is a planning aid. Its figures hold only under the assumptions stated "
    "in it (quasi-static forces, the conditions as entered, the pulls and ratings as "
    "entered).",
    "Certified bollard pulls, the fittings' certified ratings and the conditions on the "
    "day govern over any figure here.",
    "The master, the pilot, local port rules and applicable standards decide how the move "
    "is made; stop and re-plan when the day differs from the plan.",
)


@dataclass(frozen=True, slots=True)
class StageExtras:
    """What the solver adds to a stage, where it is available."""

    tug_lost: TugLostCheck | None = None
    hold_limits: HoldLimits | None = None
    note: str = ""


def signed(u: DisplayUnits, value_si: float, quantity: str) -> str:
    unit = u.unit(quantity)  # type: ignore[arg-type]
    return f"{fmt(u.value(value_si, quantity), 1, signed=True)} {label(unit)}"  # type: ignore[arg-type]


def tolerances(b: Balance) -> tuple[float, float]:
    """Below these a net force or moment is said as none (as core.io.report does)."""
    scale = sum(abs(sh.pull_n) for sh in b.shares) + sum(math.hypot(*ld.force) for ld in b.loads)
    scale = scale or 1.0
    return 1e-6 * scale, 1e-6 * scale * 100.0


def stage_status(check: StageCheck) -> tuple[str, QColor]:
    if check.fails:
        return f"FAILS ({len(check.failures)})", FAIL
    if check.warnings:
        n = len(check.warnings)
        return f"{n} warning{'s' if n > 1 else ''}", WARN
    return "OK", GOOD


# -- cover ----------------------------------------------------------------------------


def cover(project: Project, checks: tuple[StageCheck, ...]) -> list[Block]:
    u = project.units
    out: list[Block] = [
        Text("MOVE PLAN BRIEFING", 9.0, True, QColor(MUTED), 1.5),
        heading(project.name, 0),
        Text(
            f"Revision {project.revision}" + (f"  ·  {project.date}" if project.date else ""),
            11.0,
            False,
            space_after_mm=1.0,
        ),
    ]
    bodies = []
    for name in project.body_names():
        b = body_of(project, name)
        made = " + ".join(m.hull.name for m in b.members)
        bodies.append(f"{name} ({made}, lashed)" if b.is_group else name)
    if project.site.name:
        out.append(Text(f"Site: {project.site.name}", 9.5))
    out.append(Text(f"Bodies: {'; '.join(bodies) or 'none'}", 9.5))
    out.append(Text(f"Tugs: {', '.join(t.name for t in project.tugs) or 'none'}", 9.5))
    if project.notes:
        out.append(Text(project.notes, 8.5, color=QColor(MUTED)))
    out.append(Spacer(3))
    out.append(
        Table(
            [Column("", 1.5), Column("Name", 3.0), Column("Signature", 2.4), Column("Date", 1.3)],
            [
                ["Prepared by", project.prepared_by or "", "", ""],
                ["Checked by", project.checked_by or "", "", ""],
                ["Approved by", project.approved_by or "", "", ""],
            ],
            size_pt=9.0,
            first_bold=True,
            pad_mm=2.2,
        )
    )
    if project.history:
        out.append(heading("Revision history", 2))
        out.append(
            Table(
                [
                    Column("Rev.", 0.5),
                    Column("Date", 1.0),
                    Column("By", 1.6),
                    Column("Change", 4.5),
                ],
                [
                    [r.revision, r.date or "-", r.by or "-", r.description or "-"]
                    for r in project.history
                ],
            )
        )
    out.append(heading("Stages", 2))
    rows, colors = [], []
    for c in checks:
        status, col = stage_status(c)
        tugs = ", ".join(p.tug for p in c.stage.placements if p.setting > 0) or "-"
        rows.append([str(c.index + 1), c.stage.name, c.stage.kind, tugs, status])
        colors.append(col if c.fails or c.warnings else None)
    out.append(
        Table(
            [
                Column("#", 0.3),
                Column("Stage", 3.4),
                Column("Kind", 0.9),
                Column("Tugs working", 2.4),
                Column("Status", 1.1),
            ],
            rows,
            row_colors=colors,
        )
    )
    out.append(heading("Conditions planned for", 2))
    out.append(
        Table(
            [
                Column("#", 0.3),
                Column("Stage", 3.0),
                Column("Wind (mean, from)", 2.0),
                Column("At height / gust", 1.5),
                Column("Current (towards)", 2.0),
                Column("Sea state", 0.9),
            ],
            [
                [
                    str(i + 1),
                    s.name,
                    f"{u.show(s.conditions.wind_speed_ms, 'speed')} from {s.conditions.wind_from_deg:03.0f}°",
                    f"{u.show(s.conditions.wind_height_m, 'length')} / x{s.conditions.gust_factor:.2f}",
                    f"{u.show(s.conditions.current_speed_ms, 'speed')} towards "
                    f"{s.conditions.current_towards_deg:03.0f}°",
                    _sea_state(s),
                ]
                for i, s in enumerate(project.stages)
            ],
        )
    )
    out.append(heading("Go / no-go limits", 2))
    lim_rows, lim_colors = [], []
    for c in checks:
        s, lim = c.stage, c.stage.limits
        over = [n for n in c.notices if n.code == "conditions_over_limit"]
        lim_rows.append(
            [
                str(c.index + 1),
                s.name,
                "-" if lim.max_wind_ms is None else u.show(lim.max_wind_ms, "speed"),
                "-" if lim.max_current_ms is None else u.show(lim.max_current_ms, "speed"),
                u.show(_margin(project, s), "length"),
                "NO-GO: planned conditions over the limit" if over else "within limits",
            ]
        )
        lim_colors.append(FAIL if over else None)
    out.append(
        Table(
            [
                Column("#", 0.3),
                Column("Stage", 3.0),
                Column("Max wind", 1.2),
                Column("Max current", 1.2),
                Column("Min clearance", 1.3),
                Column("Planned conditions", 2.2),
            ],
            lim_rows,
            row_colors=lim_colors,
        )
    )
    out.append(Spacer(2))
    out.append(Boxed(CAUTIONS, 8.5, QColor(FAIL), QColor(style.NO_GO_FILL), "Cautions"))
    return out


def _sea_state(s: Stage) -> str:
    v = getattr(s.conditions, "sea_state", None)
    return "-" if v is None else f"{v:g}"


def _margin(project: Project, s: Stage) -> float:
    m = s.limits.min_clearance_m
    return project.clearance_margin_m if m is None else m


# -- conventions ------------------------------------------------------------------------


def conventions(project: Project) -> list[Block]:
    u = project.units
    units = ", ".join(f"{q} in {label(u.unit(q))}" for q in ("force", "moment", "length", "speed"))
    items = [
        f"Units: {units}. A force in t is the tonne-force (9.80665 kN).",
        "Body frame: origin at the hull's reference point on the centreline (for a lashed "
        "group, the first hull's), x forward, y to port. Yaw moment positive counter-clockwise "
        "seen from above, which swings the bow to port; each moment names the point it is "
        "taken about.",
        "Site frame: x east, y north, metres; the diagrams are drawn north up, to the scale "
        "printed on each, with force arrows at their own printed scale.",
        "Directions on the body are relative bearings, degrees clockwise from ahead (000 ahead, "
        "090 starboard beam, 180 astern, 270 port beam). Headings and the conditions are true "
        "bearings. Wind is given as the direction it blows from; current as the direction it "
        "sets towards.",
        "A tug's assigned pull is its setting times its usable pull (rated bollard pull, or "
        "astern pull when it works astern, times its efficiency and the towline angle factor). "
        "Use is the assigned pull as a share of the rated pull.",
        "Forces are quasi-static: no inertia, waves, squat or interaction with other vessels "
        "are included. Wind and current loads follow F = 1/2 rho C A V^2 with the areas and "
        "coefficients of each stage.",
        f"Clearances are the least plan-view distances between the outlines at each stage's "
        f"pose; below the stage's minimum (or the plan's {u.show(project.clearance_margin_m, 'length')} "
        "margin) they are warned about. Tugs, fenders and overhangs are not included.",
    ]
    out: list[Block] = [heading("Units, frames and assumptions", 1)]
    out += [Text("•  " + t, 8.5, indent_mm=0.0) for t in items]
    out.append(Text(CAUTION, 8.5, True))
    return out


# -- one stage ---------------------------------------------------------------------------


def stage_blocks(
    project: Project,
    check: StageCheck,
    extras: StageExtras,
    diagram_mm: float,
) -> list[Block]:
    u = project.units
    s = check.stage
    n = len(project.stages)
    status, col = stage_status(check)
    out: list[Block] = [PageBreak(), heading(f"Stage {check.index + 1} of {n}: {s.name}", 1)]
    pose_txt = "; ".join(
        f"{p.body} at ({fmt(u.value(p.x, 'length'))}, {fmt(u.value(p.y, 'length'))}) "
        f"{label(u.unit('length'))}, heading {p.heading_deg:05.1f}° true"
        for p in s.poses
    )
    out.append(
        Text(
            f"Kind: {s.kind}   ·   Status: {status}" + (f"   ·   {pose_txt}" if pose_txt else ""),
            8.5,
            True,
            col,
        )
    )
    out += _warnings(check)
    if s.notes:
        out.append(Text(s.notes, 8.5))
    diagram = StageDiagram(project, s, check.balances, check.clearances)
    out.append(Drawing(diagram_mm, diagram.paint))
    for b in check.balances:
        out += _tug_table(project, s, b)
        out += _balance(project, b)
    tail = _tug_lost(project, check, extras) + _hold_limits(project, check, extras)
    tail += _clearances(project, check)
    more = heading(f"Stage {check.index + 1} of {n}: {s.name} (continued)", 1)
    out.append(Group(tail, more))
    return out


def _tug_table(project: Project, s: Stage, b: Balance) -> list[Block]:
    u = project.units
    rows, colors = [], []
    for sh in b.shares:
        p = s.placement(sh.tug)
        lead = f"{sh.lead_bearing_deg:05.1f}°" + (
            f", {u.show(p.line_length_m, 'length')} line" if sh.mode == "line" else " push"
        )
        over = sh.setting > 1 + 1e-9 or sh.pull_n > sh.rated_n * (1 + 1e-9)
        rows.append(
            [
                sh.tug,
                f"{sh.hull}: {sh.point}",
                lead + (" (astern)" if p.astern else ""),
                f"{sh.setting * 100:.0f} %",
                u.show(sh.pull_n, "force"),
                u.show(sh.usable_n, "force"),
                f"{sh.utilisation * 100:.0f} %",
                signed(u, sh.moment_centroid_nm, "moment"),
            ]
        )
        colors.append(FAIL if over else None)
    return [
        heading(f"Tugs on {b.body}", 2),
        Table(
            [
                Column("Tug", 1.0),
                Column("Works at", 2.2),
                Column("Lead (rel.)", 1.6),
                Column("Setting", 0.8, "right"),
                Column("Assigned pull", 1.0, "right"),
                Column("Usable pull", 1.0, "right"),
                Column("Use of rated", 0.8, "right"),
                Column("Yaw moment share", 1.3, "right"),
            ],
            rows,
            row_colors=colors,
        ),
    ]


def _balance(project: Project, b: Balance) -> list[Block]:
    u = project.units
    eq = b.equivalent
    tol_f, tol_m = tolerances(b)
    bearing = b.net_bearing_deg
    rows = [
        [
            "Net force",
            f"{u.show(eq.magnitude, 'force')}"
            + ("" if bearing is None else f" towards {bearing:05.1f}° relative")
            + f": {walking_words(*eq.force, tol_f)} (ahead {signed(u, eq.force[0], 'force')}, "
            f"to port {signed(u, eq.force[1], 'force')})",
        ],
        [
            "Yaw moment",
            f"{signed(u, eq.moment, 'moment')} about the centroid: {turning_words(eq.moment, tol_m)}; "
            f"{signed(u, b.moment_cog_nm, 'moment')} about the centre of gravity",
        ],
    ]
    if eq.kind == "couple":
        rows.append(["Equivalent", "a pure couple: no single force, no line of action"])
    elif eq.kind == "balanced":
        rows.append(["Equivalent", "balanced: no net force and no yaw moment"])
    else:
        cross = b.crossing_words(u)
        rows.append(
            [
                "Equivalent force",
                f"{u.show(eq.magnitude, 'force')} on a line {u.show(abs(eq.offset_m or 0.0), 'length')} "
                f"from the centroid, {cross} (dashed on the diagram)",
            ]
        )
    for ld in b.loads:
        rows.append(
            [
                f"{ld.name.capitalize()} load",
                f"{u.show(math.hypot(*ld.force), 'force')} (ahead {signed(u, ld.force[0], 'force')}, "
                f"to port {signed(u, ld.force[1], 'force')}), included in the net force",
            ]
        )
    return [
        heading(f"Balance of {b.body}", 2),
        Table([Column("", 1.1), Column("", 6.0)], rows, header=False, first_bold=True),
    ]


def _tug_lost(project: Project, check: StageCheck, extras: StageExtras) -> list[Block]:
    u = project.units
    out: list[Block] = [heading("Tug lost", 2)]
    tl = extras.tug_lost
    if tl is not None:
        goal = check.stage.goal
        out.append(
            Text(
                f"Pulls solved again for the goal '{goal.kind if goal else 'hold'}' with each tug "
                "in turn out of action.",
                8.0,
                color=QColor(MUTED),
            )
        )
        rows, colors = [], []
        worst = tl.worst
        for case in tl.cases:
            sf = case.result.shortfall
            short = (
                "none"
                if case.holds
                else f"ahead {signed(u, sf[0], 'force')}, to port {signed(u, sf[1], 'force')}, "
                f"yaw {signed(u, sf[2], 'moment')}"
            )
            rows.append(
                [
                    case.tug,
                    "yes" if case.holds else "NO",
                    f"{case.worst_utilisation * 100:.0f} %"
                    + (f" ({case.worst_tug})" if case.worst_tug else ""),
                    short,
                    "worst" if worst is not None and worst.tug == case.tug else "",
                ]
            )
            colors.append(None if case.holds else FAIL)
        out.append(
            Table(
                [
                    Column("Tug lost", 1.0),
                    Column("Goal still met", 1.0),
                    Column("Hardest-worked tug left", 1.6),
                    Column("Shortfall", 3.0),
                    Column("", 0.6),
                ],
                rows,
                row_colors=colors,
            )
        )
        return out
    out.append(
        Text(
            "No goal is set for this stage, so the pulls are not solved again; the outcome "
            "with each tug lost and the others as set:",
            8.0,
            color=QColor(MUTED),
        )
    )
    rows = []
    for b in check.balances:
        for tug, lost in tug_lost_as_set(project, check.stage, b.body):
            eq = lost.equivalent
            tol_f, tol_m = tolerances(lost)
            rows.append(
                [
                    tug,
                    f"{u.show(eq.magnitude, 'force')}: {walking_words(*eq.force, tol_f)}",
                    f"{signed(u, eq.moment, 'moment')}: {turning_words(eq.moment, tol_m)}",
                ]
            )
    out.append(
        Table(
            [
                Column("Tug lost", 1.0),
                Column("Net force then", 2.6),
                Column("Yaw moment then", 2.6),
            ],
            rows,
        )
    )
    if extras.note:
        out.append(Text(extras.note, 8.0, color=QColor(MUTED)))
    return out


def _hold_limits(project: Project, check: StageCheck, extras: StageExtras) -> list[Block]:
    hl = extras.hold_limits
    if hl is None:
        return []
    out: list[Block] = [heading("Hold limits", 2)]
    plot = HoldPlot(hl, check.stage, project.units)
    if not plot.has_curve:
        why = (
            "cannot hold the body against the planned current alone"
            if not hl.holds_current
            else "cannot resist wind from any direction"
        )
        out.append(
            Text(
                f"With the tugs placed and leading as in this stage, the fleet {why}, so there "
                "is no hold limit to plot.",
                8.0,
                color=QColor(MUTED),
            )
        )
        return out
    out.append(Drawing(72.0, plot.paint))
    return out


def _clearances(project: Project, check: StageCheck) -> list[Block]:
    u = project.units
    out: list[Block] = [heading("Clearances", 2)]
    if not check.clearances:
        out.append(Text("No site features or other bodies in this plan.", 8.0, color=QColor(MUTED)))
        return out
    rows, colors = [], []
    ordered = sorted(check.clearances, key=lambda c: (not c.below_margin, c.distance_m))
    shown = [c for i, c in enumerate(ordered) if c.below_margin or i < SHOWN_CLEARANCES]
    rest = ordered[len(shown) :]
    for c in shown:
        state = (
            "OUTSIDE the limit"
            if c.outside_limit
            else "TOUCHING"
            if c.touching
            else "BELOW margin"
            if c.below_margin
            else "ok"
        )
        rows.append(
            [
                c.body,
                c.other,
                c.other_kind,
                u.show(c.distance_m, "length"),
                u.show(c.margin_m, "length"),
                state,
            ]
        )
        colors.append(FAIL if c.below_margin else None)
    if rest:
        rows.append(
            [
                f"{len(rest)} more",
                "farther off",
                "",
                f"≥ {u.show(rest[0].distance_m, 'length')}",
                "",
                "",
            ]
        )
        colors.append(QColor(MUTED))
    out.append(
        Table(
            [
                Column("Body", 1.2),
                Column("To", 2.0),
                Column("Kind", 0.8),
                Column("Least distance", 1.1, "right"),
                Column("Margin", 0.9, "right"),
                Column("", 1.2),
            ],
            rows,
            row_colors=colors,
        )
    )
    return out


def _warnings(check: StageCheck) -> list[Block]:
    """Every warning of the stage, in a box at the top of its page (failures first)."""
    if not check.notices:
        return [Text("No warnings for this stage.", 8.5, color=QColor(GOOD))]
    lines = [f"FAILS: {n.message}" for n in check.failures]
    lines += [n.message[:1].upper() + n.message[1:] for n in check.warnings]
    fails = bool(check.failures)
    return [
        Boxed(
            lines,
            8.5,
            QColor(FAIL if fails else WARN),
            QColor(style.NO_GO_FILL if fails else style.CAUTION_FILL),
            "This stage fails its checks" if fails else "Warnings",
            QColor(FAIL if fails else INK),
        )
    ]
