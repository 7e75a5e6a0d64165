"""Every stage checked, and what a substitute tug does to each stage's verdict.

Both read the one stage result (:mod:`core.analysis.stage`): a stage's check is its
verdict; a substitution re-works every stage with the new tug and compares verdicts.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

from core.analysis.stage import StageResult, plan_results, stage_result
from core.analysis.verdict import Reason, Verdict, reason, verdict_of
from core.errors import InputError
from core.mechanics.balance import Balance, tug_layout
from core.mechanics.bodies import body_name_of_hull, body_of
from core.mechanics.clearance import Clearance
from core.model.plan import Project, Stage
from core.model.tugs import Tug
from core.notices import Notice


@dataclass(frozen=True, slots=True, eq=False)
class StageCheck:
    """A stage's verdict seen as a check: what fails it (no-go) and what warns (caution).

    A view of :class:`core.analysis.stage.StageResult` for code that lists failures and
    warnings; the figures are the stage result's own.
    """

    result: StageResult
    verdict: Verdict

    @property
    def index(self) -> int:
        return self.result.index

    @property
    def stage(self) -> Stage:
        return self.result.stage

    @property
    def name(self) -> str:
        return self.result.stage.name

    @property
    def balances(self) -> tuple[Balance, ...]:
        return tuple(b.balance for b in self.result.worked)

    @property
    def clearances(self) -> tuple[Clearance, ...]:
        return self.result.clearances

    @property
    def notices(self) -> tuple[Notice, ...]:
        return tuple(Notice(r.code, r.subject, r.text) for r in self.verdict.reasons)

    @property
    def failures(self) -> tuple[Notice, ...]:
        return tuple(
            Notice(r.code, r.subject, r.text) for r in self.verdict.reasons if r.status == "no-go"
        )

    @property
    def fails(self) -> bool:
        return self.verdict.status == "no-go"

    @property
    def warnings(self) -> tuple[Notice, ...]:
        return tuple(
            Notice(r.code, r.subject, r.text, "caution")
            for r in self.verdict.reasons
            if r.status != "no-go"
        )


def check_stage(project: Project, index: int) -> StageCheck:
    r = stage_result(project, index)
    return StageCheck(r, r.verdict)


def check_plan(project: Project) -> tuple[StageCheck, ...]:
    """Every stage checked, in the order of the move."""
    return tuple(StageCheck(r, r.verdict) for r in plan_results(project))


def tug_lost_as_set(project: Project, stage: Stage, body: str) -> tuple[tuple[str, Balance], ...]:
    """For each tug on ``body``, the balance with that tug lost and the others as set."""
    index = project.stages.index(stage)
    return stage_result(project, index).body(body).lost_as_set


# -- a substitute tug -------------------------------------------------------------------


@dataclass(frozen=True, slots=True, eq=False)
class Substitution:
    """The plan after a tug was replaced, with every stage's verdict before and after.

    ``after`` holds the substitute's own checks: a stage where it cannot give the pull the
    old tug gave carries a ``pull_short`` reason (no-go) on top of the stage's verdict.
    """

    project: Project
    tug: str
    before: tuple[StageCheck, ...]
    after: tuple[StageCheck, ...]

    @property
    def changed(self) -> tuple[tuple[StageCheck, StageCheck], ...]:
        """(before, after) of every stage whose verdict status changed."""
        return tuple(
            (b, a)
            for b, a in zip(self.before, self.after, strict=True)
            if b.verdict.status != a.verdict.status
        )

    @property
    def now_failing(self) -> tuple[StageCheck, ...]:
        """Stages that are no-go with the substitute and were not before."""
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
    where the substitute cannot give the pull, the stage is no-go with a ``pull_short``
    reason naming the shortfall. ``keep="settings"``: settings stay as they were and
    the pulls follow the new tug's particulars (a stage with a goal may then miss it).
    """
    if keep not in ("pulls", "settings"):
        raise InputError("substitute keeps", keep, "must be 'pulls' or 'settings'")
    project.tug(name)  # raises a clear error for an unknown tug
    before = check_plan(project)
    new = project.with_tug(tug, old_name=name)
    short: dict[int, Reason] = {}
    if keep == "pulls":
        stages = []
        for i, (s_old, s_new) in enumerate(zip(project.stages, new.stages, strict=True)):
            stage, why = _keep_pull(project, s_old, new, s_new, name, tug.name)
            stages.append(stage)
            if why is not None:
                short[i] = why
        new = new.with_stages(tuple(stages))
    after = tuple(
        replace(c, verdict=verdict_of((short[c.index], *c.verdict.reasons)))
        if c.index in short
        else c
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
) -> tuple[Stage, Reason | None]:
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
    why = reason(
        "pull_short",
        f"{new_name}: this stage needs {u.show(pull, 'force')} where {old_name} worked; "
        f"{new_name} gives at most {u.show(usable, 'force')} (short by "
        f"{u.show(pull - usable, 'force')})",
        new_name,
    )
    return stage, why
