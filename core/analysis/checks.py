"""Checking every stage of the plan, and what a substitute tug does to each.

A stage's check is computed from the stage's own value and the plan's tugs and hulls
each time it is asked for; nothing is cached in the stage, so a copied and then
changed stage is always checked afresh. A stage *fails* when a tug is asked for more
than 100 % of its usable pull or more than its rated pull, a fitting's SWL is
exceeded, a push points out of the hull, the stage's goal is not met, or (after a
substitution) a tug cannot give the pull the stage needs; low
clearances and conditions above the stage's limits are warnings shown with it.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from core.errors import InputError
from core.frames import turning_words
from core.mechanics.balance import Balance, tug_layout
from core.mechanics.bodies import body_name_of_hull, body_of
from core.mechanics.clearance import Clearance, clearance_notices, stage_clearances
from core.mechanics.loads import analyse_stage
from core.mechanics.site import posed_bodies
from core.model.plan import Project, Stage
from core.model.tugs import Tug
from core.notices import Notice
from core.solve.pulls import pulls_problem, solve_pulls, tug_lost_check
from core.units import DisplayUnits

#: Notice codes that make a stage fail.
FAILING = frozenset(
    {"setting_over", "over_rating", "over_swl", "push_outward", "goal_not_met", "pull_short"}
)

#: A goal is met when the residual force is within this fraction of the sum of the
#: pulls (at least 1 kN) and the residual moment within that times the body's length.
GOAL_TOLERANCE = 0.01


@dataclass(frozen=True, slots=True)
class StageCheck:
    """Everything checked about one stage: its balances, clearances and notices."""

    index: int
    stage: Stage
    balances: tuple[Balance, ...]
    clearances: tuple[Clearance, ...]
    notices: tuple[Notice, ...]

    @property
    def name(self) -> str:
        return self.stage.name

    @property
    def failures(self) -> tuple[Notice, ...]:
        return tuple(n for n in self.notices if n.code in FAILING)

    @property
    def fails(self) -> bool:
        return bool(self.failures)

    @property
    def warnings(self) -> tuple[Notice, ...]:
        return tuple(n for n in self.notices if n.code not in FAILING)


def worked_bodies(project: Project, stage: Stage) -> tuple[str, ...]:
    """Bodies with a tug placed on them in ``stage``, in placement order; else the posed
    bodies; else the plan's first body."""
    names: list[str] = []
    for p in stage.placements:
        n = body_name_of_hull(project, p.hull)
        if n not in names:
            names.append(n)
    if not names:
        names = list(posed_bodies(project, stage)[:1]) or list(project.body_names()[:1])
    return tuple(names)


def balance_of(project: Project, stage: Stage, body: str) -> Balance:
    """The balance of ``body`` in ``stage`` with the stage's wind and current, as the board
    and the report show it."""
    return analyse_stage(project, stage, body)


def tug_lost_as_set(project: Project, stage: Stage, body: str) -> tuple[tuple[str, Balance], ...]:
    """For each tug on ``body``, the balance with that tug lost and the others as set."""
    names = [p.tug for p in stage.placements if body_name_of_hull(project, p.hull) == body]
    return tuple((t, balance_of(project, stage.without_placement(t), body)) for t in names)


def _over_rating(b: Balance, units: DisplayUnits) -> list[Notice]:
    out = []
    for sh in b.shares:
        if sh.setting <= 1 + 1e-9 and sh.pull_n > sh.rated_n * (1 + 1e-9):
            out.append(
                Notice(
                    "over_rating",
                    sh.tug,
                    f"{sh.tug}: pull {units.show(sh.pull_n, 'force')} is over its rated "
                    f"{units.show(sh.rated_n, 'force')} ({sh.utilisation * 100:.0f} %)",
                )
            )
    return out


def goal_residual(b: Balance, stage: Stage) -> tuple[float, float, float]:
    """Net force ahead, abeam and moment about the centroid, less the stage goal's target."""
    goal = stage.goal
    if goal is None:
        return (0.0, 0.0, 0.0)
    tx, ty, tm = goal.target()
    fx, fy = b.net_force
    return (fx - tx, fy - ty, b.moment_centroid_nm - tm)


def goal_notices(project: Project, stage: Stage, b: Balance) -> list[Notice]:
    """A ``goal_not_met`` notice when the stage's pulls and loads miss its goal."""
    if stage.goal is None:
        return []
    u = project.units
    rx, ry, rm = goal_residual(b, stage)
    scale = sum(sh.pull_n for sh in b.shares) + sum(math.hypot(*ld.force) for ld in b.loads)
    tol_f = max(GOAL_TOLERANCE * scale, 1000.0)
    length = body_of(project, b.body).length
    if math.hypot(rx, ry) <= tol_f and abs(rm) <= tol_f * length:
        return []
    parts = []
    if math.hypot(rx, ry) > tol_f:
        parts.append(
            f"net force {u.show(math.hypot(rx, ry), 'force')} {_sides(rx, ry, tol_f)} of the goal"
        )
    if abs(rm) > tol_f * length:
        parts.append(
            f"yaw moment off the goal by {u.show(abs(rm), 'moment')} "
            f"({turning_words(rm, tol_f * length)})"
        )
    return [
        Notice(
            "goal_not_met",
            stage.name,
            f"goal '{stage.goal.kind}' not met on {b.body}: "
            + "; ".join(parts)
            + _resolve_words(project, stage, b.body),
        )
    ]


def _sides(fx: float, fy: float, tol: float) -> str:
    """Which way a force points on the body, in words: "ahead", "astern and to port"..."""
    parts = []
    if abs(fx) > tol:
        parts.append("ahead" if fx > 0 else "astern")
    if abs(fy) > tol:
        parts.append("to port" if fy > 0 else "to starboard")
    return " and ".join(parts)


def _resolve_words(project: Project, stage: Stage, body: str) -> str:
    """Whether solving the pulls again would meet the goal, in words."""
    result = solve_pulls(pulls_problem(project, stage, body))
    if result.feasible:
        return "; solving the pulls again would meet it"
    u = project.units
    sx, sy, sm = (float(v) for v in result.shortfall)
    return (
        "; these tugs cannot meet it even with the pulls solved again (short by "
        f"{u.show(math.hypot(sx, sy), 'force')} and {u.show(abs(sm), 'moment')})"
    )


def tug_lost_notices(project: Project, stage: Stage, body: str) -> list[Notice]:
    """A warning when the stage's goal is not met with some single tug lost (pulls
    solved again without it)."""
    if stage.goal is None:
        return []
    check = tug_lost_check(pulls_problem(project, stage, body))
    if len(check.cases) < 2 or check.passes:
        return []
    failing = [c.tug for c in check.cases if not c.holds]
    worst = check.worst
    if worst is None:
        return []
    u = project.units
    sx, sy, sm = (float(v) for v in worst.result.shortfall)
    return [
        Notice(
            "tug_lost_fails",
            stage.name,
            f"no margin with a tug lost: the goal '{stage.goal.kind}' is not met with "
            f"{' or '.join(failing)} lost; worst {worst.tug} (short by "
            f"{u.show(math.hypot(sx, sy), 'force')} and {u.show(abs(sm), 'moment')})",
        )
    ]


def limit_notices(project: Project, stage: Stage) -> list[Notice]:
    """Warnings where the stage's planned conditions exceed its own go / no-go limits."""
    u, c, lim = project.units, stage.conditions, stage.limits
    out = []
    if lim.max_wind_ms is not None and c.wind_speed_ms > lim.max_wind_ms * (1 + 1e-9):
        out.append(
            Notice(
                "conditions_over_limit",
                stage.name,
                f"planned wind {u.show(c.wind_speed_ms, 'speed')} is above the stage's "
                f"limit {u.show(lim.max_wind_ms, 'speed')}",
            )
        )
    if lim.max_current_ms is not None and c.current_speed_ms > lim.max_current_ms * (1 + 1e-9):
        out.append(
            Notice(
                "conditions_over_limit",
                stage.name,
                f"planned current {u.show(c.current_speed_ms, 'speed')} is above the stage's "
                f"limit {u.show(lim.max_current_ms, 'speed')}",
            )
        )
    return out


def check_stage(project: Project, index: int) -> StageCheck:
    """Check stage ``index`` of ``project`` from scratch."""
    stage = project.stages[index]
    balances = (
        tuple(balance_of(project, stage, name) for name in worked_bodies(project, stage))
        if project.hulls
        else ()
    )
    notices: list[Notice] = []
    for b in balances:
        notices.extend(b.notices)
        notices.extend(_over_rating(b, project.units))
        notices.extend(goal_notices(project, stage, b))
        notices.extend(tug_lost_notices(project, stage, b.body))
    notices.extend(limit_notices(project, stage))
    clearances = stage_clearances(project, stage) if project.hulls else ()
    notices.extend(clearance_notices(clearances, project.units))
    return StageCheck(index, stage, balances, clearances, tuple(notices))


def check_plan(project: Project) -> tuple[StageCheck, ...]:
    """Every stage checked, in the order of the move."""
    return tuple(check_stage(project, i) for i in range(len(project.stages)))


@dataclass(frozen=True, slots=True)
class Substitution:
    """The plan after a tug was replaced, with every stage re-checked."""

    project: Project
    tug: str
    before: tuple[StageCheck, ...]
    after: tuple[StageCheck, ...]

    @property
    def now_failing(self) -> tuple[StageCheck, ...]:
        """Stages that fail with the substitute and did not fail before."""
        return tuple(
            a for b, a in zip(self.before, self.after, strict=True) if a.fails and not b.fails
        )

    @property
    def failing(self) -> tuple[StageCheck, ...]:
        return tuple(a for a in self.after if a.fails)


def substitute_tug(project: Project, name: str, tug: Tug, keep: str = "pulls") -> Substitution:
    """Replace tug ``name`` by ``tug`` (a new vessel or new particulars) and re-check every stage.

    ``keep="pulls"``: each stage still needs the pull it asked of the old tug, so the
    substitute's setting becomes that pull over its own usable pull, at most 100 %;
    where the substitute cannot give the pull, the stage fails with a ``pull_short``
    notice naming the shortfall. ``keep="settings"``: settings stay as they were and
    the pulls follow the new tug's particulars (a stage with a goal may then miss it).
    """
    if keep not in ("pulls", "settings"):
        raise InputError("substitute keeps", keep, "must be 'pulls' or 'settings'")
    before = check_plan(project)
    new = project.with_tug(tug, old_name=name)
    short: dict[int, Notice] = {}
    if keep == "pulls":
        stages = []
        for i, (s_old, s_new) in enumerate(zip(project.stages, new.stages, strict=True)):
            stage, notice = _keep_pull(project, s_old, new, s_new, name, tug.name)
            stages.append(stage)
            if notice is not None:
                short[i] = notice
        new = new.with_stages(tuple(stages))
    after = tuple(
        replace(c, notices=(short[c.index], *c.notices)) if c.index in short else c
        for c in check_plan(new)
    )
    return Substitution(new, tug.name, before, after)


def _pull_of(project: Project, stage: Stage, tug: str) -> tuple[float, float] | None:
    """(assigned pull, usable pull) of ``tug`` in ``stage``, N; None where it is not placed."""
    placed = next((p for p in stage.placements if p.tug == tug), None)
    if placed is None:
        return None
    body = body_of(project, body_name_of_hull(project, placed.hull))
    layout = tug_layout(project, stage, body)
    i = next(k for k, p in enumerate(layout.placements) if p.tug == tug)
    return float(layout.pulls_n[i]), float(layout.usable_n[i])


def _keep_pull(
    old_project: Project,
    old: Stage,
    new_project: Project,
    new: Stage,
    old_name: str,
    new_name: str,
) -> tuple[Stage, Notice | None]:
    was = _pull_of(old_project, old, old_name)
    now = _pull_of(new_project, new, new_name)
    if was is None or now is None or was[0] == 0:
        return new, None
    pull, usable = was[0], now[1]
    setting = min(1.0, pull / usable) if usable > 0 else 1.0
    stage = new.with_placement(replace(new.placement(new_name), setting=setting))
    if pull <= usable * (1 + 1e-9):
        return stage, None
    u = new_project.units
    notice = Notice(
        "pull_short",
        new_name,
        f"{new_name}: this stage needs {u.show(pull, 'force')} where {old_name} worked; "
        f"{new_name} gives at most {u.show(usable, 'force')} (short by "
        f"{u.show(pull - usable, 'force')})",
    )
    return stage, notice
