"""One stage's pages of the briefing: its verdict with every reason, its diagram, its tables.

Everything is read off the stage's result (core.analysis.stage.StageResult). The tables
after the diagram are the functions in :data:`BODY_SECTIONS` (once per worked body) and
:data:`STAGE_SECTIONS` (once per stage), in order: a new section (the drift preview,
say) is one more function in its own module, added to one of these tuples.
"""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtGui import QColor

from app.briefing.cover import verdict_color
from app.briefing.diagram import StageDiagram
from app.briefing.layout import MUTED, Block, Boxed, Drawing, Group, PageBreak, Text, heading
from app.briefing.stage_tables import (
    balance_table,
    clearances_table,
    fittings_table,
    hold_limits_plot,
    tug_lost_table,
    tugs_table,
)
from app.paint import style
from core.analysis.stage import BodyResult, StageResult
from core.analysis.swing import is_swing_stage, swing_words
from core.analysis.verdict import Verdict
from core.model.goals import GOAL_WORDS
from core.model.plan import Project
from core.units import fmt, label

BodySection = Callable[[Project, StageResult, BodyResult], list[Block]]
StageSection = Callable[[Project, StageResult], list[Block]]

#: Under the diagram, for each body the tugs work on.
BODY_TABLES: tuple[BodySection, ...] = (tugs_table, fittings_table, balance_table)
#: After those, kept together on one page where they fit: per worked body, then per stage.
BODY_SECTIONS: tuple[BodySection, ...] = (tug_lost_table, hold_limits_plot)
STAGE_SECTIONS: tuple[StageSection, ...] = (clearances_table,)


def verdict_box(v: Verdict) -> Block:
    """The verdict and every reason, in a box coloured by the verdict."""
    color = verdict_color(v)
    fill = {"go": style.GO_FILL, "caution": style.CAUTION_FILL}.get(v.status, style.NO_GO_FILL)
    if v.reasons:
        lines = [
            ("NO-GO: " if r.status == "no-go" else "Caution: ") + r.text[:1].upper() + r.text[1:]
            for r in v.reasons
        ]
    else:
        lines = ["Every check of this stage is within its limits."]
    return Boxed(lines, 8.5, color, QColor(fill), f"Verdict: {v.label}", color)


def swing_blocks(result: StageResult) -> list[Block]:
    """A swing stage's headings and side, and each body's moments against them
    (core.analysis.swing, as the verdict reads them)."""
    if not is_swing_stage(result.stage):
        return []
    u = result.project.units
    lines = [f"Swing: {swing_words(result.stage)}"]
    lines += [b.swing.words(u) for b in result.worked if b.swing is not None]
    return [Text(lines[0], 8.5, True), *(Text(line, 8.5) for line in lines[1:])]


def stage_blocks(project: Project, result: StageResult, diagram_mm: float) -> list[Block]:
    u = project.units
    s = result.stage
    n = len(project.stages)
    title = f"Stage {result.index + 1} of {n}: {s.name}"
    v = result.verdict
    goal = "none set: the pulls as set" if s.goal is None else GOAL_WORDS[s.goal.kind]
    pose_txt = "; ".join(
        f"{p.body} at ({fmt(u.value(p.x, 'length'))}, {fmt(u.value(p.y, 'length'))}) "
        f"{label(u.unit('length'))}, heading {p.heading_deg:05.1f}° true"
        for p in s.poses
    )
    out: list[Block] = [
        PageBreak(),
        heading(title, 1),
        Text(
            f"Kind: {s.kind}   ·   Verdict: {v.label}   ·   Goal: {goal}",
            8.5,
            True,
            verdict_color(v),
        ),
    ]
    if pose_txt:
        out.append(Text(pose_txt, 8.0, color=QColor(MUTED)))
    out.extend(swing_blocks(result))
    out.append(verdict_box(v))
    if s.notes:
        out.append(Text(s.notes, 8.5))
    worked = result.worked
    diagram = StageDiagram(project, s, tuple(b.balance for b in worked), result.clearances)
    out.append(Drawing(diagram_mm, diagram.paint))
    for body in worked:
        for section in BODY_TABLES:
            out += section(project, result, body)
    tail: list[Block] = []
    for body in worked:
        for body_section in BODY_SECTIONS:
            tail += body_section(project, result, body)
    for stage_section in STAGE_SECTIONS:
        tail += stage_section(project, result)
    out.append(Group(tail, heading(f"{title} (continued)", 1)))
    return out
