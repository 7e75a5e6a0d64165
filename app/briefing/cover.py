"""The briefing's front matter: the cover with one verdict line per stage, and the page
of units, frames and assumptions.

Verdicts are the stage results' own (core.analysis.stage); nothing here judges a stage.
"""

from __future__ import annotations

from collections.abc import Sequence

from PySide6.QtGui import QColor

from app.briefing.layout import (
    FAIL,
    MUTED,
    Block,
    Boxed,
    Column,
    Spacer,
    Table,
    Text,
    heading,
)
from app.paint import style
from core.analysis.limits import WIND_LIMIT_LABEL, WIND_LIMIT_MEASURE
from core.analysis.stage import StageResult
from core.analysis.verdict import Verdict
from core.io.report import CAUTION
from core.mechanics.bodies import body_of, group_frame_words
from core.model.plan import Project, Stage
from core.model.tugs import BOLLARD_PULL_NAME, STANDING_BY
from core.units import label

CAUTIONS = (
    "This briefing is a planning aid. Its figures hold only under the assumptions stated "
    "in it (quasi-static forces, the conditions as entered, the pulls and ratings as "
    "entered).",
    "Certified bollard pulls, the fittings' certified ratings and the conditions on the "
    "day govern over any figure here.",
    "The master, the pilot, local port rules and applicable standards decide how the move "
    "is made; stop and re-plan when the day differs from the plan.",
)


#: How each of a tug's figures is worked out, in the words every table uses.
PULL_WORDS = (
    f"Rated pull: the tug's {BOLLARD_PULL_NAME} times its capability share at the lead (the "
    "share of its bollard pull its type gives in that direction and way of working: on a line, "
    "pushing, or working astern).",
    "Usable pull: rated pull × efficiency (sea state) × cos(towline angle to the "
    "horizontal; 1 for a push) × headway share (the share of its bollard pull at a "
    "transit's speed through the water; 1 otherwise).",
    "Setting: assigned pull ÷ usable pull; the assigned pull is setting × usable pull. A tug "
    "is standing by only at a setting of exactly nothing.",
    "Share of rated pull: assigned pull ÷ rated pull.",
)


def verdict_color(v: Verdict) -> QColor:
    """The verdict's colour: go green, caution amber-brown, no-go red."""
    return QColor({"go": style.GO, "caution": style.CAUTION}.get(v.status, style.NO_GO))


def cover(project: Project, results: Sequence[StageResult]) -> list[Block]:
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
    out.append(Spacer(2))
    out.append(Boxed(CAUTIONS, 8.0, QColor(FAIL), QColor(style.NO_GO_FILL), "Cautions"))
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
            pad_mm=1.8,
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
    out.append(heading("Stages and their verdicts", 2))
    rows, colors = [], []
    for r in results:
        v = r.verdict
        # every tug made fast works in the stage; one set to nothing stands by on its line
        tugs = (
            ", ".join(
                f"{p.tug} ({STANDING_BY})" if p.standing_by else p.tug for p in r.stage.placements
            )
            or "-"
        )
        rows.append([str(r.index + 1), r.stage.name, r.stage.kind, tugs, v.headline()])
        colors.append(None if v.is_go else verdict_color(v))
    out.append(
        Table(
            [
                Column("#", 0.3),
                Column("Stage", 2.6),
                Column("Kind", 0.8),
                Column("Tugs working", 1.6),
                Column("Verdict", 3.6),
            ],
            rows,
            row_colors=colors,
        )
    )
    out.append(heading("Conditions planned for, and the Go / no-go limits", 2))
    out.append(
        Table(
            [
                Column("#", 0.3),
                Column("Stage", 2.2),
                Column("Wind (mean, from)", 1.6),
                Column("At height / gust", 1.3),
                Column("Current (towards)", 1.6),
                Column("Depth / UKC", 1.2),
                Column("Sea state", 0.6),
                Column(WIND_LIMIT_LABEL, 1.0),
                Column("Max current", 0.9),
                Column("Min clearance", 1.1),
            ],
            [
                [
                    str(i + 1),
                    s.name,
                    f"{u.show(s.conditions.wind_speed_ms, 'speed')} from {s.conditions.wind_from_deg:03.0f}°",
                    f"{u.show(s.conditions.wind_height_m, 'length')} / x{s.conditions.gust_factor:.2f}",
                    f"{u.show(s.conditions.current_speed_ms, 'speed')} towards "
                    f"{s.conditions.current_towards_deg:03.0f}°",
                    _depth(project, results, i),
                    _sea_state(s),
                    "-" if s.limits.max_wind_ms is None else u.show(s.limits.max_wind_ms, "speed"),
                    "-"
                    if s.limits.max_current_ms is None
                    else u.show(s.limits.max_current_ms, "speed"),
                    u.show(_margin(project, s), "length"),
                ]
                for i, s in enumerate(project.stages)
            ],
        )
    )
    out.append(
        Text(
            "The limits are the stage's own (min clearance: the stage's, else the plan's margin). "
            f"The wind limit is a {WIND_LIMIT_MEASURE}: the planned wind is brought to 10 m "
            "and compared with it, and gusts above it are a caution. "
            "Each stage's verdict above says whether its planned conditions are within them "
            "and what its tugs can hold.",
            8.0,
            color=QColor(MUTED),
        )
    )
    return out


def _depth(project: Project, results: Sequence[StageResult], index: int) -> str:
    """The stage's water depth and its main body's under-keel clearance, from the stage
    result ("deep" without a depth)."""
    r = next((r for r in results if r.index == index), None)
    main = None if r is None else r.main
    d = None if main is None else main.depth
    if d is None:
        return "deep"
    u = project.units
    ukc = "-" if d.clearance_m is None else u.show(d.clearance_m, "length")
    return f"{u.show(d.depth_m, 'length')} / {ukc}"


def _sea_state(s: Stage) -> str:
    v = getattr(s.conditions, "sea_state", None)
    return "-" if v is None else f"{v:g}"


def _margin(project: Project, s: Stage) -> float:
    m = s.limits.min_clearance_m
    return project.clearance_margin_m if m is None else m


def conventions(project: Project) -> list[Block]:
    u = project.units
    units = ", ".join(f"{q} in {label(u.unit(q))}" for q in ("force", "moment", "length", "speed"))
    groups = group_frame_words(project)  # a lashed group's frame is one member's, named
    items = [
        f"Units: {units}. A force in t is the tonne-force (9.80665 kN).",
        "Body frame: origin at the hull's reference point on the centreline"
        + (f" ({groups})" if groups else "")
        + ", x forward, y to port. Yaw moment positive counter-clockwise seen from above, "
        "which swings the bow to port; each moment names the point it is taken about.",
        "Site frame: x east, y north, metres; the diagrams are drawn north up, to the scale "
        "printed on each, with force arrows at their own printed scale.",
        "Directions on the body are relative bearings, degrees clockwise from ahead (000 ahead, "
        "090 starboard beam, 180 astern, 270 port beam). Headings and the conditions are true "
        "bearings. Wind is given as the direction it blows from; current as the direction it "
        "sets towards.",
        *PULL_WORDS,
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
