"""The one result of a stage: everything Towboard works out about it, once, and its verdict.

:func:`stage_result` turns a project and a stage index into a :class:`StageResult`: for
every body in the stage its tugs as arrays, the wind and current loads (or why one
could not be worked out), the balance with and without those loads, each tug's load on
its fitting, and, for the bodies the tugs work on, the pulls solved for the stage's
goal with the tug lost check and the hold limits; then the stage's clearances and its
verdict (go, caution or no-go, with every reason). The board, the panels, the stage
list, the report, the briefing and the command line all read this result and never
work out a stage figure of their own.

Results are cached by the project value (projects are immutable, so the same object
always gives the same result).
"""

from __future__ import annotations

import math
from collections import OrderedDict
from dataclasses import dataclass, field

from core.analysis.drift import drift_of
from core.analysis.limits import WindAgainstLimit, wind_against_limit
from core.analysis.swing import SwingSense, swing_sense
from core.analysis.verdict import Verdict, judge
from core.errors import TowboardError
from core.mechanics.balance import Balance, Load, TugLayout, analyse_layout, tug_layout
from core.mechanics.bodies import Body, body_name_of_hull, body_of, stage_body
from core.mechanics.clearance import Clearance, stage_clearances
from core.mechanics.depth import DepthCheck, depth_check
from core.mechanics.fittings import FittingLoad, FittingTotal, fitting_loads, fitting_totals
from core.mechanics.loads import ConditionLoads, body_conditions, missing_inputs
from core.mechanics.site import posed_bodies
from core.model.goals import Goal
from core.model.plan import Project, Stage
from core.motion.summary import StageDrift
from core.solve.holdlimits import HoldLimits, hold_limits, hold_limits_problem
from core.solve.pulls import PullsResult, TugLostCheck, pulls_problem, tug_lost_check
from core.units import DisplayUnits


@dataclass(frozen=True, slots=True, eq=False)
class BodyResult:
    """One rigid body in one stage.

    ``worked`` bodies have tugs on them (or are the stage's only body); for them the
    goal is solved, the tug lost check made and the hold limits swept. ``notes`` say
    why a part could not be worked out.
    """

    body: Body
    worked: bool
    layout: TugLayout
    conditions: ConditionLoads
    balance: Balance  # the tugs as set, with the wind and current
    balance_tugs: Balance  # the tugs as set, alone
    fittings: tuple[FittingLoad, ...]
    goal: Goal | None
    goal_residual: tuple[float, float, float] | None  # as set, less the goal's target
    #: (force N, moment N*m) within which the goal is met: the balance's own tolerance
    #: (core.mechanics.forces.negligible), the one that decides the words too
    goal_tolerance: tuple[float, float]
    tug_lost: TugLostCheck | None  # the goal solved with every tug, and with each lost
    hold_limits: HoldLimits | None
    notes: tuple[str, ...] = ()
    #: A hold stage: the highest current (setting towards each direction) the fleet holds
    #: with every tug, the wind as set (no tug lost: the wind's curves say that).
    current_limits: HoldLimits | None = None
    stage: Stage | None = None  # the stage value it is about
    units: DisplayUnits | None = None  # the plan's display units (for the words of warnings)
    depth: DepthCheck | None = None  # the stage's water depth under the body (None: deep)
    #: Each fitting in use and the load of every tug at it together (core.mechanics.fittings).
    fitting_totals: tuple[FittingTotal, ...] = ()
    #: A swing stage: the goal's and the pulls' yaw moments against the way it swings.
    swing: SwingSense | None = None
    _lost: list[tuple[tuple[str, Balance], ...]] = field(
        default_factory=list, repr=False, compare=False
    )

    @property
    def name(self) -> str:
        return self.body.name

    @property
    def loads(self) -> tuple[Load, ...]:
        """The wind and current loads on the body (those that could be worked out)."""
        return self.conditions.loads

    def fitting_total(self, hull: str, point: str) -> FittingTotal | None:
        """The load of every tug at fitting ``point`` of ``hull`` together (None: unused)."""
        return next((t for t in self.fitting_totals if (t.hull, t.point) == (hull, point)), None)

    @property
    def solved(self) -> PullsResult | None:
        """The pulls solved for the goal with every tug (None without a goal)."""
        return None if self.tug_lost is None else self.tug_lost.full

    @property
    def lost_as_set(self) -> tuple[tuple[str, Balance], ...]:
        """Each tug lost in turn with the others as set: (tug, the balance then). What
        happens in the first seconds, before anyone re-sets a pull; worked out on first use
        (the same arrays less one row, so the same numbers as a stage without that tug)."""
        if not self._lost:
            lost: tuple[tuple[str, Balance], ...] = ()
            if self.stage is not None and self.units is not None and self.worked:
                lost = tuple(
                    (
                        p.tug,
                        analyse_layout(
                            self.stage, self.body, self.layout.without(i), self.units, self.loads
                        ),
                    )
                    for i, p in enumerate(self.layout.placements)
                )
            self._lost.append(lost)
        return self._lost[0]

    @property
    def goal_met_as_set(self) -> bool | None:
        """Whether the pulls as set meet the goal (None without a goal)."""
        if self.goal_residual is None:
            return None
        rx, ry, rm = self.goal_residual
        tol_f, tol_m = self.goal_tolerance
        return math.hypot(rx, ry) <= tol_f and abs(rm) <= tol_m


@dataclass(frozen=True, slots=True, eq=False)
class StageResult:
    """Everything about one stage of one project, and its verdict."""

    project: Project
    index: int
    stage: Stage
    bodies: tuple[BodyResult, ...]  # the worked bodies (main first), then every other body
    clearances: tuple[Clearance, ...]
    verdict: Verdict

    @property
    def worked(self) -> tuple[BodyResult, ...]:
        """The bodies the tugs work on (the stage's main body first)."""
        return tuple(b for b in self.bodies if b.worked)

    @property
    def main(self) -> BodyResult | None:
        """The body the stage's first tug works on, else the stage's first body."""
        w = self.worked
        return w[0] if w else None

    @property
    def worst(self) -> BodyResult | None:
        """The worked body worst off, for a view that shows one body at a time: one whose
        goal cannot be met with every tug, then the most no-go reasons of the verdict about
        it (naming it or one of its tugs), then the most cautions, then the largest setting of
        its solved pulls; the main body on a tie."""
        w = self.worked
        if len(w) < 2:
            return self.main

        def rank(k: int) -> tuple[bool, int, int, float, int]:
            b = w[k]
            names = {b.name, *(p.tug for p in b.layout.placements)}
            about = [r for r in self.verdict.reasons if r.subject in names]
            use = b.solved.largest_setting if b.solved is not None else 0.0
            nogo = sum(r.status == "no-go" for r in about)
            out_of_reach = b.solved is not None and not b.solved.feasible
            return (out_of_reach, nogo, len(about) - nogo, use, -k)

        return w[max(range(len(w)), key=rank)]

    @property
    def wind_limit(self) -> WindAgainstLimit | None:
        """The planned wind against the stage's wind limit, in its measure (mean at 10 m);
        None without a limit (core.analysis.limits, as the verdict judges it)."""
        return wind_against_limit(self.stage)

    @property
    def drift(self) -> StageDrift:
        """The stage's drift preview (worst tug lost, lines let go), worked out on first
        use and kept (core.analysis.drift)."""
        return drift_of(self)

    def body(self, name: str) -> BodyResult:
        for b in self.bodies:
            if b.name == name:
                return b
        raise KeyError(name)


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


def _residual(balance: Balance, goal: Goal) -> tuple[float, float, float]:
    tx, ty, tm = goal.target()
    fx, fy = balance.net_force
    return (fx - tx, fy - ty, balance.moment_centroid_nm - tm)


def body_balance(
    project: Project, stage: Stage, body: Body
) -> tuple[TugLayout, ConditionLoads, Balance]:
    """A body's tugs as arrays, the wind and current on it, and its balance with them.

    The light part of :func:`body_result`, for a drag in progress: the same function
    gives the same numbers.
    """
    layout = tug_layout(project, stage, body)
    cond = body_conditions(stage, body)
    return layout, cond, analyse_layout(stage, body, layout, project.units, cond.loads)


def balance_of(project: Project, stage: Stage, body: str | None = None) -> Balance:
    """The balance of ``body`` (default: the body the first tug works on) in ``stage``, a
    stage value that need not be in the project (a what-if): :func:`body_balance`'s."""
    return body_balance(project, stage, stage_body(project, stage, body))[2]


def body_result(project: Project, stage: Stage, body: Body, worked: bool) -> BodyResult:
    """One body's part of the stage result (the heavy parts only for a worked body)."""
    layout, cond, balance = body_balance(project, stage, body)
    units = project.units
    tugs_only = analyse_layout(stage, body, layout, units, ())
    fits = fitting_loads(project, body, layout)
    goal = stage.goal if worked else None
    notes: list[str] = []
    check: TugLostCheck | None = None
    limits: HoldLimits | None = None
    if worked and goal is not None:
        try:
            problem = pulls_problem(
                project, stage, body.name, goal, loads=cond.loads, layout=layout
            )
            check = tug_lost_check(problem)
        except TowboardError as e:
            notes.append(f"pulls not solved: {e}")
    if worked and layout.placements:
        missing = missing_inputs(body, stage.conditions, "wind")
        if missing:
            notes.append(f"hold limits need {' and '.join(missing)}")
        else:
            try:
                limits = hold_limits(hold_limits_problem(project, stage, body.name, layout=layout))
            except TowboardError as e:
                notes.append(f"hold limits not worked out: {e}")
    tolerance = balance.tolerance  # one rule: what the words call none is met
    sense = (
        swing_sense(stage, body.name, goal, balance.moment_centroid_nm, tolerance[1])
        if worked
        else None
    )
    current = None
    if worked and layout.placements and goal is not None and goal.kind == "hold":
        current = _current_limits(project, stage, body, layout, notes)
    return BodyResult(
        body=body,
        worked=worked,
        layout=layout,
        conditions=cond,
        balance=balance,
        balance_tugs=tugs_only,
        fittings=fits,
        goal=goal,
        goal_residual=None if goal is None else _residual(balance, goal),
        goal_tolerance=tolerance,
        tug_lost=check,
        hold_limits=limits,
        notes=tuple(notes),
        current_limits=current,
        stage=stage,
        units=units,
        depth=depth_check(body, stage.conditions, units),
        fitting_totals=fitting_totals(fits, layout),
        swing=sense,
    )


def _current_limits(
    project: Project, stage: Stage, body: Body, layout: TugLayout, notes: list[str]
) -> HoldLimits | None:
    """The current limits of a hold stage (all tugs), or None with the reason in ``notes``."""
    missing = missing_inputs(body, stage.conditions, "current")
    if missing:
        notes.append(f"current limits need {' and '.join(missing)}")
        return None
    try:
        problem = hold_limits_problem(project, stage, body.name, layout=layout, flow="current")
        return hold_limits(problem, with_lost=False)
    except TowboardError as e:
        notes.append(f"current limits not worked out: {e}")
        return None


def compute_stage_result(project: Project, index: int) -> StageResult:
    """Work stage ``index`` of ``project`` out from scratch (see :func:`stage_result`)."""
    stage = project.stages[index]
    worked = worked_bodies(project, stage) if project.hulls else ()
    order = [*worked, *(n for n in project.body_names() if n not in worked)]
    bodies = tuple(
        body_result(project, stage, body_of(project, name), name in worked) for name in order
    )
    clearances = stage_clearances(project, stage) if project.hulls else ()
    verdict = judge(project, stage, bodies, clearances)
    return StageResult(project, index, stage, bodies, clearances, verdict)


_CACHE: OrderedDict[tuple[int, int], tuple[Project, StageResult]] = OrderedDict()
_CACHE_SIZE = 256


def stage_result(project: Project, index: int) -> StageResult:
    """The result of stage ``index`` of ``project``, worked out once per project value."""
    if not 0 <= index < len(project.stages):
        raise IndexError(f"stage {index + 1} of {len(project.stages)}")
    key = (id(project), index)
    hit = _CACHE.get(key)
    if hit is not None and hit[0] is project:
        _CACHE.move_to_end(key)
        return hit[1]
    result = compute_stage_result(project, index)
    _CACHE[key] = (project, result)
    while len(_CACHE) > _CACHE_SIZE:
        _CACHE.popitem(last=False)
    return result


def plan_results(project: Project) -> tuple[StageResult, ...]:
    """Every stage's result, in the order of the move."""
    return tuple(stage_result(project, i) for i in range(len(project.stages)))
