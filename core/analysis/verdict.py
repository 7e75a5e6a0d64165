"""A stage's verdict: go, caution or no-go, with every reason in words and as data.

A stage is **no-go** when its goal cannot be met with every tug, or the pulls as set
miss it; a setting is above 100 % or a push points out of the hull; a fitting's load
(the line's tension) is above its rating, or the load of all the tugs at one fitting
together is (core.mechanics.fittings.fitting_totals); a clearance is under the margin; the planned
wind or current is above what the fleet can hold (a hold stage) or above the stage's
own go / no-go limit; the water is no deeper than the body's draught (aground); or a load
the conditions ask for cannot be worked out (the reason says which input is missing). Whether the fleet can hold the planned wind and current is
the hold goal's own solve (the hold limits, for the same conditions, say it again with the
margin, and are quoted in the reason). It is a **caution** when it passes with every tug but not
with the worst tug lost, when no goal is set ("the pulls as set"), when from some
direction the tugs hold less wind than the stage's own wind limit, and for every other
warning (a steep line, a fitting not rated for the tug's bollard pull, two tugs at one
point, an under-keel clearance below the stage's margin...). Otherwise it is **go**. Nothing says "go" that is not.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING, Literal

from core.analysis.limits import WIND_LIMIT_MEASURE, wind_against_limit, wind_limit_as_given
from core.analysis.wind_limit import wind_limit_words
from core.frames import angle_to_bearing, turning_words
from core.mechanics.clearance import Clearance, clearance_notices
from core.mechanics.towline import towline_notices
from core.model.goals import GOAL_WORDS
from core.model.plan import Project, Stage
from core.notices import Notice
from core.solve.holdlimits import limit_at, limit_words
from core.solve.pulls import shortfall_words
from core.units import DisplayUnits, percent

if TYPE_CHECKING:  # the stage result builds the verdict from its own parts
    from core.analysis.stage import BodyResult

Status = Literal["go", "caution", "no-go"]
STATUSES: tuple[Status, ...] = ("go", "caution", "no-go")

#: Reason codes that make a stage no-go; every other reason is a caution.
NO_GO_CODES = frozenset(
    {
        "no_hull",
        "load_missing",
        "goal_cannot_be_met",
        "goal_not_solved",
        "pulls_miss_goal",
        "setting_over",
        "push_outward",
        "line_over_hull",
        "fitting_over_rating",
        "fitting_total_over_rating",
        "outside_permitted_angles",
        "low_clearance",
        "conditions_over_limit",
        "pull_short",
        "aground",
    }
)


@dataclass(frozen=True, slots=True)
class Reason:
    """One reason for a verdict: a stable ``code``, the sentence people read (display
    units), whether it makes the stage ``no-go`` or a ``caution``, and what it is about."""

    code: str
    text: str
    status: Status
    subject: str = ""

    def __str__(self) -> str:
        return self.text


@dataclass(frozen=True, slots=True)
class Verdict:
    """go, caution or no-go, and every reason (no-go reasons first)."""

    status: Status
    reasons: tuple[Reason, ...] = ()

    @property
    def is_go(self) -> bool:
        return self.status == "go"

    @property
    def label(self) -> str:
        """The status as printed: GO, CAUTION or NO-GO."""
        return self.status.upper()

    def headline(self) -> str:
        """One line: the status and the first reason (and how many more)."""
        if not self.reasons:
            return f"{self.label}: within every limit checked"
        more = len(self.reasons) - 1
        tail = f" (and {more} more)" if more else ""
        return f"{self.label}: {self.reasons[0].text}{tail}"


def reason(code: str, text: str, subject: str = "") -> Reason:
    """A reason, no-go or caution by its code."""
    return Reason(code, text, "no-go" if code in NO_GO_CODES else "caution", subject)


def verdict_of(reasons: Sequence[Reason]) -> Verdict:
    ordered = sorted(reasons, key=lambda r: r.status != "no-go")
    if any(r.status == "no-go" for r in ordered):
        status: Status = "no-go"
    elif ordered:
        status = "caution"
    else:
        status = "go"
    return Verdict(status, tuple(ordered))


_NOTICE_CODES = {"no_wind_load": "load_missing", "no_current_load": "load_missing"}


def _from_notice(n: Notice) -> Reason:
    return reason(_NOTICE_CODES.get(n.code, n.code), n.message, n.subject)


def judge(
    project: Project,
    stage: Stage,
    bodies: Sequence[BodyResult],
    clearances: Sequence[Clearance],
) -> Verdict:
    """The verdict of ``stage`` from its bodies' results and its clearances."""
    u = project.units
    out: list[Reason] = []
    if not project.hulls:
        out.append(reason("no_hull", "no hull to work on: draw one on the board or import it"))
    for b in bodies:
        if not b.worked:
            continue
        out.extend(_from_notice(n) for n in b.balance.notices)
        out.extend(_load_reasons(stage, b))
        if b.depth is not None:
            out.extend(_from_notice(n) for n in b.depth.notices)
        out.extend(_fitting_reasons(b, u))
        out.extend(_towline_reasons(project, b, u))
        out.extend(_goal_reasons(stage, b, u))
        out.extend(
            reason("goal_not_solved", f"{b.name}: {n}", b.name)
            for n in b.notes
            if n.startswith("pulls not solved")
        )
        out.extend(_swing_reasons(b, u))
        out.extend(_wind_limit_reasons(stage, b, u))
    out.extend(_from_notice(n) for n in clearance_notices(tuple(clearances), u))
    out.extend(_limit_reasons(stage, u))
    return verdict_of(_unique(out))


def _unique(reasons: list[Reason]) -> list[Reason]:
    seen: set[tuple[str, str]] = set()
    out = []
    for r in reasons:
        if (r.code, r.text) not in seen:
            seen.add((r.code, r.text))
            out.append(r)
    return out


def _load_reasons(stage: Stage, b: BodyResult) -> list[Reason]:
    """A load the conditions ask for that cannot be worked out (which input is missing)."""
    c = stage.conditions
    wanted = {"no_wind_load": c.wind_speed_ms > 0, "no_current_load": c.current_speed_ms > 0}
    return [_from_notice(n) for n in b.conditions.notices if wanted.get(n.code, True)]


def _fitting_reasons(b: BodyResult, u: DisplayUnits) -> list[Reason]:
    out = []
    for f in b.fittings:
        if f.over_rating and f.rating_n is not None:
            what = "line tension" if f.mode == "line" else "push"
            angle = (
                f" (pull {u.show(f.pull_n, 'force')} on a line "
                f"{math.degrees(f.line_angle_rad):.0f}° off the horizontal)"
                if f.mode == "line" and f.line_angle_rad > 1e-9
                else ""
            )
            out.append(
                reason(
                    "fitting_over_rating",
                    f"{f.tug}: {what} {u.show(f.load_n, 'force')}{angle} is over the "
                    f"{f.rating_label} {u.show(f.rating_n, 'force')} of {f.point}",
                    f.tug,
                )
            )
        if not f.lead_permitted and f.permitted_lead_rad is not None:
            lo, hi = f.permitted_lead_rad
            out.append(
                reason(
                    "outside_permitted_angles",
                    f"{f.tug}: towline leads at {_bearing(f.lead_rad)} relative, outside the "
                    f"line angles {f.point} is rated for ({_bearing(hi)} to {_bearing(lo)} "
                    "clockwise)",
                    f.tug,
                )
            )
        if f.suits_tug is False and f.rating_n is not None:
            out.append(
                reason(
                    "fitting_under_rated",
                    f"{f.tug}: bollard pull {u.show(f.bollard_pull_n, 'force')} is above the "
                    f"{f.rating_label} {u.show(f.rating_n, 'force')} of {f.point}; the fitting is "
                    "not rated for this tug (IMO MSC.1/Circ.1175)",
                    f.tug,
                )
            )
    for t in b.fitting_totals:
        if t.shared and t.over_rating and t.rating_n is not None:
            what = "lines" if t.mode == "line" else "pushes"
            out.append(
                reason(
                    "fitting_total_over_rating",
                    f"{t.point}: the {what} of {' and '.join(t.tugs)} together load it with "
                    f"{u.show(t.load_n, 'force')}, over its {t.rating_label} "
                    f"{u.show(t.rating_n, 'force')} ({t.use_words})",
                    t.point,
                )
            )
    return out


def _towline_reasons(project: Project, b: BodyResult, u: DisplayUnits) -> list[Reason]:
    """Each towline's tension against its MBL, and a line drawn longer than the tug
    carries (core.mechanics.towline): cautions."""
    out: list[Reason] = []
    for f, p in zip(b.fittings, b.layout.placements, strict=True):
        if f.mode != "line":
            continue
        tug = project.tug(f.tug)
        out.extend(_from_notice(n) for n in towline_notices(tug, f.load_n, p.line_length_m, u))
    return out


def _bearing(angle_rad: float) -> str:
    """A hull-frame angle as a three-digit relative bearing: "045°"."""
    return f"{round(angle_to_bearing(angle_rad)) % 360:03d}°"


def _sides(fx: float, fy: float, tol: float) -> str:
    parts = []
    if abs(fx) > tol:
        parts.append("ahead" if fx > 0 else "astern")
    if abs(fy) > tol:
        parts.append("to port" if fy > 0 else "to starboard")
    return " and ".join(parts)


def _goal_reasons(stage: Stage, b: BodyResult, u: DisplayUnits) -> list[Reason]:
    goal = b.goal
    if goal is None:
        no_goal = reason(
            "no_goal",
            f"no goal set: the pulls as set on {b.name} (choose hold, walk, swing, "
            "transit or a given force to have them checked)",
            stage.name,
        )
        return [no_goal]
    out: list[Reason] = []
    solved = b.solved
    words = GOAL_WORDS[goal.kind].split(":")[0]
    if solved is not None and not solved.feasible:
        fleet = "with every tug" if solved.problem.placements else "with no tug placed on it"
        text = (
            f"{b.name}: the goal ({words}) cannot be met {fleet}: "
            f"{shortfall_words(solved.shortfall, u)}"
        )
        if goal.kind == "hold":
            text += _hold_words(stage, b, u)
        out.append(reason("goal_cannot_be_met", text, b.name))
    elif b.goal_met_as_set is False:
        out.append(reason("pulls_miss_goal", _miss_words(b, u, words, solved), b.name))
    if solved is not None and solved.feasible and b.tug_lost is not None:
        out.extend(_tug_lost(b, u, words))
    return out


def _miss_words(b: BodyResult, u: DisplayUnits, words: str, solved: object) -> str:
    rx, ry, rm = b.goal_residual or (0.0, 0.0, 0.0)
    tol_f, tol_m = b.goal_tolerance
    parts = []
    if math.hypot(rx, ry) > tol_f:
        parts.append(
            f"net force {u.show(math.hypot(rx, ry), 'force')} {_sides(rx, ry, tol_f)} of it"
        )
    if abs(rm) > tol_m:
        parts.append(f"yaw moment off by {u.show(abs(rm), 'moment')} ({turning_words(rm, tol_m)})")
    fix = ""
    if b.solved is not None and b.solved.feasible:
        fix = f"; Solve pulls would meet it (largest setting {percent(b.solved.largest_setting)} %)"
    return f"{b.name}: the pulls as set miss the goal ({words}): " + "; ".join(parts) + fix


def _tug_lost(b: BodyResult, u: DisplayUnits, words: str) -> list[Reason]:
    check = b.tug_lost
    if check is None or len(check.cases) < 2 or check.passes or check.worst is None:
        return []
    failing = [c.tug for c in check.cases if not c.holds]
    worst = check.worst
    return [
        reason(
            "tug_lost_fails",
            f"{b.name}: no margin with a tug lost: the goal ({words}) is not met with "
            f"{' or '.join(failing)} lost; worst {worst.tug} "
            f"({shortfall_words(worst.result.shortfall, u)})",
            b.name,
        )
    ]


def _hold_words(stage: Stage, b: BodyResult, u: DisplayUnits) -> str:
    lim = b.hold_limits
    if lim is None:
        return ""
    if not lim.holds_current:
        return "; the tugs cannot hold it against the current alone"
    c = stage.conditions
    v = limit_at(lim, c.wind_from_deg)
    if not math.isfinite(v):
        return ""
    return (
        f"; they hold at most {limit_words(v, u)} of wind from {c.wind_from_deg:03.0f}° true "
        f"(planned {u.show(c.wind_speed_ms, 'speed')})"
    )


def _wind_limit_reasons(stage: Stage, b: BodyResult, u: DisplayUnits) -> list[Reason]:
    """A caution when the tugs hold less than the stage's wind limit from some direction
    (core.analysis.wind_limit), from the body's hold limits already swept."""
    if b.goal is None or b.hold_limits is None:
        return []
    # the hold limits are speeds as the stage's wind is given: the limit brought to them
    text = wind_limit_words(b.hold_limits, wind_limit_as_given(stage), u)
    return [reason("wind_limit_not_held_all_round", f"{b.name}: {text}", b.name)] if text else []


def _limit_reasons(stage: Stage, u: DisplayUnits) -> list[Reason]:
    """The planned conditions against the stage's own go / no-go limits: the wind in the
    limit's measure, the mean at 10 m (core.analysis.limits), with a caution where only
    the gusts the load is worked with are above it."""
    c, lim = stage.conditions, stage.limits
    out = []
    wind = wind_against_limit(stage)
    if wind is not None:
        given = (
            ""
            if c.wind_height_m == 10.0
            else f" (given as {u.show(c.wind_speed_ms, 'speed')} at "
            f"{u.show(c.wind_height_m, 'length')})"
        )
        if wind.over:
            planned, limit = u.show_against(wind.mean_10m_ms, wind.limit_ms, "speed")
            out.append(
                reason(
                    "conditions_over_limit",
                    f"planned wind {planned} mean at 10 m{given} is "
                    f"above the stage's go / no-go limit {limit} ({WIND_LIMIT_MEASURE})",
                    stage.name,
                )
            )
        elif wind.gusts_over:
            gusts, limit = u.show_against(wind.gust_10m_ms, wind.limit_ms, "speed")
            out.append(
                reason(
                    "gusts_over_limit",
                    f"gusts of {gusts} at 10 m (planned mean "
                    f"{u.show(wind.mean_10m_ms, 'speed')}{given} x gust factor "
                    f"{c.gust_factor:.2f}), which the load is worked with, are above the "
                    f"stage's limit {limit} ({WIND_LIMIT_MEASURE})",
                    stage.name,
                )
            )
    if lim.max_current_ms is not None and c.current_speed_ms > lim.max_current_ms * (1 + 1e-9):
        out.append(
            reason(
                "conditions_over_limit",
                "planned current {} is above the stage's go / no-go limit {}".format(
                    *u.show_against(c.current_speed_ms, lim.max_current_ms, "speed")
                ),
                stage.name,
            )
        )
    return out


def _swing_reasons(b: BodyResult, u: DisplayUnits) -> list[Reason]:
    """A swing stage whose goal (or, with no goal, whose pulls as set) turns the bow the
    other way from the swing is no-go, as are pulls as set turning it the other way from a
    goal that is right; one that gives no yaw moment to speak of is a caution
    (core.analysis.swing). Made here, not by :func:`reason`, so the codes stay with the
    swing."""
    sense = b.swing
    if sense is None:
        return []
    out = []
    head = f"{b.name}: {sense.stage_words()} but "
    if sense.goal_against or (sense.goal is None and sense.as_set_against):
        who, m, _ = sense.judged
        out.append(Reason("swing_against", head + sense.turn_words(who, m, u), "no-go", b.name))
    elif sense.as_set_against:
        words = sense.turn_words("the pulls as set", sense.as_set_moment_nm, u)
        out.append(Reason("swing_against", head + words, "no-go", b.name))
    if sense.no_turn:
        who, m, _ = sense.judged
        out.append(Reason("swing_no_turn", head + sense.turn_words(who, m, u), "caution", b.name))
    return out
