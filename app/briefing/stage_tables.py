"""The tables of one stage's page, each read off the stage's result (core.analysis.stage).

Each function takes the project, the stage's result and one worked body's result (or
the result alone for the whole stage) and returns blocks; none computes a figure.
"""

from __future__ import annotations

import math

from PySide6.QtGui import QColor

from app.briefing.holdplot import HoldPlot
from app.briefing.layout import FAIL, MUTED, WARN, Block, Column, Drawing, Table, Text, heading
from core.analysis.stage import BodyResult, StageResult
from core.mechanics.balance import Balance
from core.mechanics.fittings import FittingLoad, FittingTotal
from core.mechanics.loads import load_words
from core.model.plan import Project
from core.model.tugs import setting_cell
from core.units import DisplayUnits, fmt, label, percent

#: Clearances listed per stage besides those below the margin (the nearest first).
SHOWN_CLEARANCES = 4


def signed(u: DisplayUnits, value_si: float, quantity: str) -> str:
    unit = u.unit(quantity)  # type: ignore[arg-type]
    return f"{fmt(u.value(value_si, quantity), 1, signed=True)} {label(unit)}"  # type: ignore[arg-type]


def tugs_table(project: Project, result: StageResult, body: BodyResult) -> list[Block]:
    u = project.units
    s = result.stage
    rows, colors = [], []
    for sh in body.balance.shares:
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
                setting_cell(sh.setting),
                u.show(sh.pull_n, "force"),
                u.show(sh.usable_n, "force"),
                f"{percent(sh.share_of_rated)} %",
                signed(u, sh.moment_centroid_nm, "moment"),
            ]
        )
        colors.append(FAIL if over else None)
    return [
        heading(f"Tugs on {body.name}", 2),
        Table(
            [
                Column("Tug", 1.0),
                Column("Works at", 2.2),
                Column("Lead (rel.)", 1.6),
                Column("Setting", 1.0, "right"),  # "standing by" on one line
                Column("Assigned pull", 1.0, "right"),
                Column("Usable pull", 1.0, "right"),
                Column("Share of rated pull", 0.8, "right"),
                Column("Yaw moment about centroid", 1.2, "right"),
            ],
            rows,
            row_colors=colors,
        ),
        *headway_note(project, body),
    ]


def headway_words(project: Project, body: BodyResult) -> str | None:
    """For a transit: the planned speed through the water and each tug's share of its
    bollard pull then (the stage result's layout), saying which tables are placeholders;
    None for other goals."""
    layout = body.layout
    if body.goal is None or body.goal.kind != "transit" or layout.headway_share is None:
        return None
    u = project.units
    parts, guessed = [], []
    for p, share in zip(layout.placements, layout.headway_share, strict=True):
        parts.append(f"{p.tug} {share * 100:.0f} %")
        table = project.tug(p.tug).headway
        if table is None or table.placeholder:
            guessed.append(p.tug)
    text = (
        f"Making {u.show(layout.speed_through_water_ms, 'speed')} through the water, each "
        f"tug gives this share of its bollard pull (its headway table): {', '.join(parts)}."
    )
    if guessed:
        text += (
            f" PLACEHOLDER rows for {', '.join(guessed)}: not published figures; enter the "
            "tug's own."
        )
    return text


def headway_note(project: Project, body: BodyResult) -> list[Block]:
    words = headway_words(project, body)
    return [] if words is None else [Text(words, 8.0, color=QColor(MUTED))]


def _fitting_cells(load: FittingLoad | FittingTotal, angle: str, u: DisplayUnits) -> list[str]:
    """A fitting's row after the tug column: the fitting, its type, ``angle``, the load,
    the rating and the load's use of it."""
    if load.rating_n is None:
        state = "no rating given" if load.mode == "line" else "-"
    elif load.over_rating:
        state = "OVER its rating"
    else:
        state = f"{load.use_words} of its {load.rating_label}"
    rating = (
        "not given"
        if load.rating_n is None
        else f"{load.rating_label} {u.show(load.rating_n, 'force')}"
    )
    return [
        f"{load.hull}: {load.point}",
        load.fitting_type,
        angle,
        u.show(load.load_n, "force"),
        rating,
        state,
    ]


def fittings_table(project: Project, result: StageResult, body: BodyResult) -> list[Block]:
    """Each tug's load on its fitting: the towline's tension (or the push) against the
    fitting's rating."""
    if not body.fittings:
        return []
    u = project.units
    rows, colors = [], []
    for fl in body.fittings:
        angle = f"{abs(math.degrees(fl.line_angle_rad)):.0f}°" if fl.mode == "line" else "push"
        rows.append([fl.tug, *_fitting_cells(fl, angle, u)])
        unrated = fl.rating_n is None and fl.mode == "line"
        colors.append(FAIL if fl.over_rating else (WARN if unrated else None))
    for t in body.fitting_totals:
        if t.shared:
            rows.append([" + ".join(t.tugs), *_fitting_cells(t, "together", u)])
            colors.append(FAIL if t.over_rating else None)
    return [
        heading(f"Fittings of {body.name}: line tension against rating", 2),
        Table(
            [
                Column("Tug", 1.0),
                Column("Fitting", 2.2),
                Column("Type", 0.9),
                Column("Line angle to horizontal", 1.0, "right"),
                Column("Load (tension or push)", 1.3, "right"),
                Column("Rating", 1.0, "right"),
                Column("", 1.3),
            ],
            rows,
            row_colors=colors,
        ),
    ]


def balance_table(project: Project, result: StageResult, body: BodyResult) -> list[Block]:
    u = project.units
    b: Balance = body.balance
    eq = b.equivalent
    bearing = b.net_bearing_deg
    rows = [
        [
            "Net force",
            f"{u.show(eq.magnitude, 'force')}"
            + ("" if bearing is None else f" towards {bearing:05.1f}° relative")
            + f": {b.walking} (ahead {signed(u, eq.force[0], 'force')}, "
            f"to port {signed(u, eq.force[1], 'force')})",
        ],
        [
            "Yaw moment",
            f"{signed(u, eq.moment, 'moment')} about the centroid: {b.turning}; "
            f"{signed(u, b.moment_cog_nm, 'moment')} about the centre of gravity",
        ],
    ]
    if eq.kind == "force":
        rows.append(["Equivalent force", f"{b.equivalent_words(u)} (dashed on the diagram)"])
    else:
        rows.append(["Equivalent", b.equivalent_words(u)])
    for ld in b.loads:
        rows.append(
            [
                f"{ld.name.capitalize()} load",
                f"{load_words(ld, body.body, u)}; included in the net force",
            ]
        )
    for n in body.conditions.notices:  # a load the conditions ask for and could not be had
        rows.append(["Not included", n.message[:1].upper() + n.message[1:]])
    return [
        heading(f"Balance of {body.name}", 2),
        Table([Column("", 1.1), Column("", 6.0)], rows, header=False, first_bold=True),
    ]


def tug_lost_table(project: Project, result: StageResult, body: BodyResult) -> list[Block]:
    u = project.units
    out: list[Block] = [heading(f"Tug lost: {body.name}", 2)]
    tl = body.tug_lost
    if tl is not None and body.goal is not None:
        out.append(
            Text(
                f"Pulls solved again for the goal '{body.goal.kind}' with each tug in turn out "
                "of action.",
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
                    f"{percent(case.largest_setting)} %"
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
                    Column("Largest setting of the tugs left", 1.6),
                    Column("Shortfall", 3.0),
                    Column("", 0.6),
                ],
                rows,
                row_colors=colors,
            )
        )
    else:
        why = (
            "No goal is set for this stage"
            if body.goal is None
            else "The pulls could not be solved"
        )
        out.append(
            Text(
                f"{why}, so the pulls are not solved again; the outcome with each tug lost and "
                "the others as set:",
                8.0,
                color=QColor(MUTED),
            )
        )
        rows = [
            [
                tug,
                f"{u.show(lost.equivalent.magnitude, 'force')}: {lost.walking}",
                f"{signed(u, lost.equivalent.moment, 'moment')}: {lost.turning}",
            ]
            for tug, lost in body.lost_as_set
        ]
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
    for note in body.notes:
        out.append(Text(note[:1].upper() + note[1:] + ".", 8.0, color=QColor(MUTED)))
    return out


def hold_limits_plot(project: Project, result: StageResult, body: BodyResult) -> list[Block]:
    hl = body.hold_limits
    if hl is None:
        return []
    out: list[Block] = [heading(f"Hold limits: {body.name}", 2)]
    plot = HoldPlot(hl, result.stage, project.units, body.current_limits)
    if not plot.has_curve:
        why = (
            hl.calm_words()
            if not hl.holds_current
            else "With the tugs placed and leading as in this stage, the fleet cannot resist "
            "wind from any direction"
        )
        out.append(
            Text(
                f"{why}, so there is no hold limit to plot.",
                8.0,
                color=QColor(MUTED),
            )
        )
        return out
    out.append(Drawing(72.0, plot.paint))
    return out


def clearances_table(project: Project, result: StageResult) -> list[Block]:
    u = project.units
    out: list[Block] = [heading("Clearances", 2)]
    if not result.clearances:
        out.append(Text("No site features or other bodies in this plan.", 8.0, color=QColor(MUTED)))
        return out
    rows, colors = [], []
    ordered = sorted(result.clearances, key=lambda c: (not c.below_margin, c.distance_m))
    shown = [c for i, c in enumerate(ordered) if c.below_margin or i < SHOWN_CLEARANCES]
    rest = ordered[len(shown) :]
    for c in shown:
        state = (
            "OUTSIDE the limit"
            if c.outside_limit
            else "TOUCHING"
            if c.touching
            else "UNDER the margin"
            if c.below_margin
            else "above the margin"
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
