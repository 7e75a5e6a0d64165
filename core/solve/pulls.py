"""Solve pulls: the pulls (and, within sectors, the leads) that meet a goal.

Problem -> solver -> result. :func:`pulls_problem` describes one body in one stage
as arrays; :func:`solve_pulls` returns a :class:`PullsResult` that keeps a reference
to its problem. An impossible goal is not an error: the result holds the closest
achievable state and the shortfall.

The allocation, for n tugs with usable pulls u_i and unit effects b_i (force ahead,
force to port and yaw moment about the centroid per newton of pull):

1. Spread the work: minimise the largest utilisation t = max f_i / u_i subject to
   sum b_i f_i = required, 0 <= f_i <= u_i (a linear programme; solved as its
   equivalent "largest s with s * required reachable at full pull", t = 1 / s).
2. Among those, the smallest total pull (a second linear programme with every
   f_i <= t u_i).
3. If no allocation within the usable pulls meets the goal: with every tug at most
   at its usable pull, minimise the largest component of the shortfall (force ahead,
   force abeam, and the moment as the sideways force at the bow or stern that would
   make it, 2 |moment| / length), then their sum without making the largest worse;
   then spread the work as above on what that achieves.

Lines only pull and pushes only push: every pull is zero or positive along the
tug's own direction. A tug with a lead sector may change its lead within it: the
sector (at most 180 degrees) is cut into candidate leads every
``SECTOR_STEP_DEG`` degrees, each an extra column sharing the tug's limit
(sum of its columns' pulls <= its usable pull). Their sum is one force from the
same point whose direction lies in the sector and whose size is no more than the
limit, so the answer is a real single lead; the chords between candidates make it
slightly conservative (at most 1 - cos(step / 2), 0.1 % at 5 degrees).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from core.errors import InputError
from core.frames import angle_to_bearing
from core.mechanics.balance import Load, TugLayout, tug_direction, tug_layout
from core.mechanics.bodies import stage_body
from core.mechanics.forces import moment_of
from core.mechanics.loads import body_conditions, loads_wrench
from core.model.goals import Goal
from core.model.plan import Project, Stage
from core.model.tugs import Placement
from core.notices import Notice
from core.solve.holdlimits import zonotope_normals
from core.solve.lp import solve_lp
from core.units import DisplayUnits

#: Spacing of candidate leads within a lead sector, degrees.
SECTOR_STEP_DEG = 5.0
#: A goal counts as met when the shortfall is below this fraction of the usable pull
#: (forces) or of usable pull x body length (moment).
GOAL_TOL = 1e-6
#: Weights of the shortfall's components on scaled rows (force ahead, force abeam,
#: moment / length): the moment counts as the force at an end that would make it.
_SHORTFALL_WEIGHTS = np.array([1.0, 1.0, 2.0])


@dataclass(frozen=True, slots=True, eq=False)
class PullsProblem:
    """What to solve for one body in one stage, as arrays (n tugs, k >= n columns)."""

    stage: str
    body: str
    goal: Goal
    placements: tuple[Placement, ...]  # (n,)
    usable_n: np.ndarray  # (n,) usable pull of each tug, N
    columns: np.ndarray  # (3, k): force ahead, to port, moment about the centroid per N of pull
    column_tug: np.ndarray  # (k,) index into placements of each column's tug
    column_lead_rad: np.ndarray  # (k,) the placement lead each column stands for
    conditions: np.ndarray  # (3,) wrench of the wind, current and other loads
    centroid: tuple[float, float]
    length_m: float
    loads: tuple[Load, ...] = ()
    notices: tuple[Notice, ...] = ()

    @property
    def tugs(self) -> tuple[str, ...]:
        return tuple(p.tug for p in self.placements)

    @property
    def required(self) -> np.ndarray:
        """(3,) what the tugs together must supply: the goal less the conditions."""
        return np.asarray(self.goal.target(), dtype=float) - self.conditions

    def without(self, tug: str) -> PullsProblem:
        """The same problem with one tug lost."""
        names = self.tugs
        if tug not in names:
            raise InputError("tug lost", tug, "is not placed on this body")
        i = names.index(tug)
        keep = self.column_tug != i
        remap = np.arange(len(names)) - (np.arange(len(names)) > i)
        return replace(
            self,
            placements=self.placements[:i] + self.placements[i + 1 :],
            usable_n=np.delete(self.usable_n, i),
            columns=self.columns[:, keep],
            column_tug=remap[self.column_tug[keep]],
            column_lead_rad=self.column_lead_rad[keep],
        )

    def with_goal(self, goal: Goal) -> PullsProblem:
        return replace(self, goal=goal)


def _sector_leads(p: Placement, is_push: bool, step_deg: float) -> np.ndarray:
    """Candidate leads (rad) across a placement's lead sector, ends included."""
    if p.lead_sector_rad is None:
        return np.array([p.lead_rad])
    lo, hi = p.lead_sector_rad
    span = (hi - lo) % (2 * math.pi)
    if span > math.pi + 1e-9:
        raise InputError(
            f"tug {p.tug}: lead sector",
            f"{math.degrees(span):.0f} deg",
            "is wider than 180 deg; narrow it so the lead can be solved",
        )
    leads = lo + np.linspace(0.0, span, max(2, math.ceil(math.degrees(span) / step_deg) + 1))
    if is_push:  # a push must stay into the hull
        leads = np.clip(leads, -math.radians(89.0), math.radians(89.0))
        leads = np.unique(leads)
    return leads if span > 0 else np.array([lo])


def pulls_problem(
    project: Project,
    stage: Stage,
    body: str | None = None,
    goal: Goal | None = None,
    *,
    loads: tuple[Load, ...] | None = None,
    sector_step_deg: float = SECTOR_STEP_DEG,
    layout: TugLayout | None = None,
) -> PullsProblem:
    """Describe the solve for ``body`` in ``stage`` (goal: given, the stage's, or hold).

    ``loads`` default to the stage's wind and current on the body; a load whose
    area is unknown is left out and a notice in the problem says so. ``layout`` may
    lend the body's tug layout already worked out for this stage (the drag path).
    """
    b = stage_body(project, stage, body)
    if layout is None or tuple(p.tug for p in layout.placements) != tuple(
        p.tug for p in stage.placements if p.hull in {m.hull.name for m in b.members}
    ):
        layout = tug_layout(project, stage, b)
    notices: tuple[Notice, ...] = ()
    if loads is None:
        cond = body_conditions(stage, b)
        loads, notices = cond.loads, cond.notices
    c = b.centroid
    cols, col_tug, col_lead = [], [], []
    base = layout.unit_effects(c)  # (3, n)
    for i, p in enumerate(layout.placements):
        if p.lead_sector_rad is None:
            cols.append(base[:, i])
            col_tug.append(i)
            col_lead.append(p.lead_rad)
            continue
        for lead in _sector_leads(p, bool(layout.is_push[i]), sector_step_deg):
            point, d, _ = tug_direction(b, replace(p, lead_rad=float(lead)))
            m = moment_of(point, d, c)
            cols.append(np.array([d[0], d[1], m]))
            col_tug.append(i)
            col_lead.append(float(lead))
    columns = np.array(cols).T if cols else np.zeros((3, 0))
    return PullsProblem(
        stage=stage.name,
        body=b.name,
        goal=goal or stage.goal or Goal("hold"),
        placements=layout.placements,
        usable_n=layout.usable_n.copy(),
        columns=columns,
        column_tug=np.array(col_tug, dtype=int),
        column_lead_rad=np.array(col_lead, dtype=float),
        conditions=loads_wrench(tuple(loads), c),
        centroid=c,
        length_m=b.length,
        loads=tuple(loads),
        notices=notices,
    )


# -- the result -----------------------------------------------------------------------


@dataclass(frozen=True, slots=True, eq=False)
class PullsResult:
    """Solved pulls for a :class:`PullsProblem`.

    ``achieved`` is the tugs' wrench (force ahead, force to port, moment about the
    centroid); ``shortfall`` = required - achieved, zero when the goal is met.
    """

    problem: PullsProblem
    feasible: bool
    pulls_n: np.ndarray  # (n,) N
    leads_rad: np.ndarray  # (n,) the lead each tug works at (solved within a sector)
    achieved: np.ndarray  # (3,)
    shortfall: np.ndarray  # (3,)
    directions: np.ndarray | None = None  # (n, 2) unit direction of each tug's force, body frame

    @property
    def utilisation(self) -> np.ndarray:
        """(n,) pull as a fraction of the usable pull (0 for a tug with none)."""
        u = self.problem.usable_n
        return np.divide(self.pulls_n, u, out=np.zeros_like(u), where=u > 0)

    @property
    def max_utilisation(self) -> float:
        return float(self.utilisation.max(initial=0.0))

    @property
    def total_pull_n(self) -> float:
        return float(self.pulls_n.sum())

    def bearing_deg(self, i: int) -> float:
        """Relative bearing of tug ``i``'s force on the body (degrees clockwise from ahead)."""
        d = self.directions[i] if self.directions is not None else (1.0, 0.0)
        return angle_to_bearing(math.atan2(d[1], d[0]))

    @property
    def net(self) -> np.ndarray:
        """(3,) tugs plus conditions."""
        return self.achieved + self.problem.conditions

    def placements(self) -> tuple[Placement, ...]:
        """The problem's placements with the solved settings and leads."""
        return tuple(
            replace(p, setting=float(s), lead_rad=float(lead))
            for p, s, lead in zip(
                self.problem.placements, self.utilisation, self.leads_rad, strict=True
            )
        )

    def applied_to(self, stage: Stage) -> Stage:
        """``stage`` with every solved tug's setting (and lead) filled in."""
        out = stage
        for p in self.placements():
            out = out.with_placement(p)
        return out


# -- the solver -----------------------------------------------------------------------


class _Scaled:
    """The problem in scaled units: pulls as fractions g of usable, rows of order one."""

    def __init__(self, problem: PullsProblem) -> None:
        u = problem.usable_n
        self.u_ref = float(u.max(initial=0.0)) or 1.0
        self.l_ref = max(problem.length_m, 1.0)
        self.row_scale = np.array([1.0, 1.0, 1.0 / self.l_ref]) / self.u_ref
        col_u = u[problem.column_tug] if len(u) else np.zeros(0)
        self.col_u = col_u  # (k,)
        self.gen = problem.columns * col_u * self.row_scale[:, None]  # (3, k)
        self.cost = col_u / self.u_ref  # total pull, scaled
        self.k = problem.columns.shape[1]
        # Tugs with several columns (a lead sector) share one limit: one extra row each.
        counts = np.bincount(problem.column_tug, minlength=len(u))
        self.shared = [int(i) for i in np.flatnonzero(counts > 1)]
        self.col_tug = problem.column_tug

    def scale(self, wrench: np.ndarray) -> np.ndarray:
        return np.asarray(wrench) * self.row_scale

    def _shared_rows(self, extra: int) -> np.ndarray:
        """(len(shared), k + len(shared) + extra): sum of a tug's columns plus its slack."""
        s = len(self.shared)
        rows = np.zeros((s, self.k + s + extra))
        for r, i in enumerate(self.shared):
            rows[r, : self.k] = self.col_tug == i
            rows[r, self.k + r] = 1.0
        return rows

    def widest_reach(self, target: np.ndarray) -> float:
        """Largest s with s * target reachable at full pull (inf for a zero target).

        Without lead sectors the reachable wrenches are a zonotope and s is where the ray
        along ``target`` leaves it (its half-spaces, as in core.solve.pulls.holdlimits); with sectors
        it is a small LP.
        """
        if not self.shared:
            return self._ray_exit(target)
        s = len(self.shared)
        a = np.vstack(
            [
                np.hstack([self.gen, np.zeros((3, s)), -target[:, None]]),
                self._shared_rows(1),
            ]
        )
        b = np.concatenate([np.zeros(3), np.ones(s)])
        c = np.zeros(self.k + s + 1)
        c[-1] = -1.0
        up = np.concatenate([np.ones(self.k), np.full(s, np.inf), [np.inf]])
        r = solve_lp(c, a, b, up)
        if r.status == "unbounded":
            return math.inf
        return float(r.x[-1]) if r.ok else 0.0

    def _ray_exit(self, target: np.ndarray) -> float:
        normals = zonotope_normals(self.gen)  # (P, 3), unit
        proj = normals @ self.gen  # (P, k)
        support = np.maximum(proj, 0.0).sum(axis=1)  # (P,)
        along = normals @ target  # (P,)
        self._exit_facet = None
        size = float(np.linalg.norm(target))
        if size == 0.0:
            return math.inf
        # A half-space through the origin that the target points out of: no s > 0 works.
        if np.any((support <= 1e-12) & (along > 1e-10 * size)):
            return 0.0
        out = np.flatnonzero(along > 1e-12 * size)
        if not len(out):
            return math.inf
        ratios = support[out] / along[out]
        j = int(out[int(np.argmin(ratios))])
        self._exit_facet = proj[j]  # (k,) each column's reach across the exit face
        return float(ratios.min())

    def on_exit_face(self, target: np.ndarray, t: float) -> np.ndarray | None:
        """The one allocation with every tug at most ``t`` that meets ``target``, when the
        target lies on the face of t x (reachable set) through which its ray left it.

        On that face every column pointing out of it is at ``t``, every one pointing in
        is at zero, and the columns along it make up the rest: with exactly two of those
        the allocation is unique; with more (pushes on one flat side lie in one plane)
        a small LP over them alone gives the least total pull. None when the face cannot
        be used (the full LP decides then).
        """
        proj = getattr(self, "_exit_facet", None)
        if proj is None or t <= 0:
            return None
        scale = float(np.abs(proj).max(initial=0.0)) or 1.0
        along = np.abs(proj) <= 1e-9 * scale
        if int(along.sum()) < 2:
            return None
        g = np.where(proj > 0, t, 0.0)
        g[along] = 0.0
        rest = target - self.gen @ g
        cols = self.gen[:, along]  # (3, a)
        if cols.shape[1] == 2:
            part, *_ = np.linalg.lstsq(cols, rest, rcond=None)
            if np.any(part < -1e-9 * t) or np.any(part > t * (1 + 1e-9)):
                return None
        else:  # several along the face (pushes on one flat side): least total among them
            cap = t * (1 + 1e-9) + 1e-12
            r = solve_lp(self.cost[along], cols, rest, np.full(cols.shape[1], cap))
            if not r.ok:
                return None
            part = r.x
        g[along] = np.clip(part, 0.0, t)
        miss = np.abs(self.gen @ g - target).max()
        if miss > 1e-9 * max(float(np.abs(target).max()), 1e-12):
            return None
        return g

    def least_total(self, target: np.ndarray, cap: float) -> np.ndarray | None:
        """Fractions g (k,) meeting target with every tug at most ``cap``, least total pull."""
        s = len(self.shared)
        a = np.vstack([np.hstack([self.gen, np.zeros((3, s))]), self._shared_rows(0)])
        b = np.concatenate([target, np.full(s, cap)])
        c = np.concatenate([self.cost, np.zeros(s)])
        up = np.concatenate([np.full(self.k, cap), np.full(s, np.inf)])
        r = solve_lp(c, a, b, up)
        return r.x[: self.k] if r.ok else None

    def closest(self, target: np.ndarray) -> np.ndarray:
        """Fractions g (k,) at most 1 that come closest to ``target``.

        Closest first in the worst component (weighted L-infinity), then in the sum of
        the components (weighted L1) without making the worst one worse. Weights: 1 on
        the forces and 2 / length on the moment (the moment as the sideways force at
        the bow or the stern that would make it).
        """
        s, k = len(self.shared), self.k
        w = _SHORTFALL_WEIGHTS
        eye = np.eye(3)
        # L-infinity: rows  gen g + r+ - r- = target;  shared;  w (r+ + r-) + slack - z = 0.
        a = np.vstack(
            [
                np.hstack([self.gen, np.zeros((3, s)), eye, -eye, np.zeros((3, 4))]),
                self._shared_rows(10),
                np.hstack([np.zeros((3, k + s)), np.diag(w), np.diag(w), eye, -np.ones((3, 1))]),
            ]
        )
        b = np.concatenate([target, np.ones(s), np.zeros(3)])
        c = np.zeros(k + s + 10)
        c[-1] = 1.0
        up = np.concatenate([np.ones(k), np.full(s + 10, np.inf)])
        r = solve_lp(c, a, b, up)
        if not r.ok:
            return np.zeros(k)
        worst = float(r.x[-1]) * (1 + 1e-9) + 1e-12
        # L1 with every component held within the worst found.
        a = np.vstack([np.hstack([self.gen, np.zeros((3, s)), eye, -eye]), self._shared_rows(6)])
        b = np.concatenate([target, np.ones(s)])
        c = np.concatenate([np.zeros(k + s), w, w])
        up = np.concatenate([np.ones(k), np.full(s, np.inf), worst / w, worst / w])
        r2 = solve_lp(c, a, b, up)
        return (r2 if r2.ok else r).x[:k]


def _spread(sc: _Scaled, target: np.ndarray) -> np.ndarray | None:
    """Steps 1 and 2: least largest utilisation, then least total pull; None if out of reach."""
    reach = sc.widest_reach(target)
    if reach < 1.0 - 1e-9:
        return None
    t = 0.0 if math.isinf(reach) else min(1.0, 1.0 / reach)
    if not sc.shared and reach >= 1.0:
        g = sc.on_exit_face(target, t)
        if g is not None:
            return g
    g = sc.least_total(target, t * (1 + 1e-9) + 1e-12)
    if g is None:  # a hair of numerical slack was not enough: allow the full pull
        g = sc.least_total(target, 1.0)
    return g


def solve_pulls(problem: PullsProblem) -> PullsResult:
    """The pulls that meet the problem's goal, spreading the work; never raises on an
    impossible goal (the result is the closest achievable state, ``feasible`` False)."""
    sc = _Scaled(problem)
    required = problem.required
    target = sc.scale(required)
    n = len(problem.placements)
    if sc.k == 0 or not np.any(np.abs(target) > 1e-15):
        g = np.zeros(sc.k)
    else:
        spread = _spread(sc, target)
        if spread is None:
            reach_target = sc.gen @ sc.closest(target)
            spread = _spread(sc, reach_target)
            g = spread if spread is not None else sc.closest(target)
        else:
            g = spread
    g = np.clip(g, 0.0, 1.0)
    pull_cols = g * sc.col_u  # (k,) N
    forces = problem.columns[:2] * pull_cols  # (2, k)
    pulls = np.zeros(n)
    leads = np.array([p.lead_rad for p in problem.placements], dtype=float)
    dirs = np.zeros((n, 2))
    for i in range(n):
        sel = problem.column_tug == i
        first = problem.columns[:2, sel][:, 0]
        dirs[i] = first
        if sel.sum() == 1:
            pulls[i] = pull_cols[sel][0]
            continue
        f = forces[:, sel].sum(axis=1)
        pulls[i] = math.hypot(f[0], f[1])
        if pulls[i] > 0:
            turn = math.atan2(first[0] * f[1] - first[1] * f[0], first @ f)
            leads[i] = float(problem.column_lead_rad[sel][0] + turn)
            dirs[i] = f / pulls[i]
    pulls = np.minimum(pulls, problem.usable_n)
    achieved = problem.columns @ pull_cols if sc.k else np.zeros(3)
    shortfall = required - achieved
    scale = np.array([1.0, 1.0, sc.l_ref]) * max(sc.u_ref, 1.0)
    met = bool(np.all(np.abs(shortfall) <= GOAL_TOL * scale))
    return PullsResult(problem, met, pulls, leads, achieved, np.where(met, 0.0, shortfall), dirs)


# -- the tug lost check ---------------------------------------------------------------


@dataclass(frozen=True, slots=True, eq=False)
class TugLostCase:
    """The solve with one tug out of action."""

    tug: str
    result: PullsResult

    @property
    def holds(self) -> bool:
        return self.result.feasible

    @property
    def worst_utilisation(self) -> float:
        return self.result.max_utilisation

    @property
    def worst_tug(self) -> str | None:
        """The remaining tug working hardest."""
        if not len(self.result.pulls_n):
            return None
        return self.result.problem.tugs[int(np.argmax(self.result.utilisation))]


@dataclass(frozen=True, slots=True, eq=False)
class TugLostCheck:
    """The tug lost check of a problem: the full solve and one solve per tug lost."""

    problem: PullsProblem
    full: PullsResult
    cases: tuple[TugLostCase, ...]

    @property
    def passes(self) -> bool:
        """True when the goal still holds with any one tug lost."""
        return all(c.holds for c in self.cases)

    @property
    def worst(self) -> TugLostCase | None:
        """The loss that hurts most: the largest shortfall, else the hardest-worked fleet."""
        if not self.cases:
            return None
        l_ref = max(self.problem.length_m, 1.0)
        w = np.array([1.0, 1.0, 1.0 / l_ref])

        def hurt(c: TugLostCase) -> tuple[float, float]:
            return (float(np.abs(c.result.shortfall * w).sum()), c.worst_utilisation)

        return max(self.cases, key=hurt)


def tug_lost_check(problem: PullsProblem) -> TugLostCheck:
    """Solve again without each tug in turn."""
    full = solve_pulls(problem)
    cases = tuple(TugLostCase(t, solve_pulls(problem.without(t))) for t in problem.tugs)
    return TugLostCheck(problem, full, cases)


def shortfall_words(shortfall: np.ndarray, units: DisplayUnits) -> str:
    """What the tugs would need on top of what they give, in words and display units.

    ``shortfall`` is (force ahead, force to port, moment about the centroid), N and N*m.
    """
    fx, fy, m = (float(v) for v in shortfall)
    parts = []
    tol_f = 1e-9 * (abs(fx) + abs(fy)) + 1e-6
    if abs(fx) > tol_f:
        parts.append(f"{units.show(abs(fx), 'force')} more {'ahead' if fx > 0 else 'astern'}")
    if abs(fy) > tol_f:
        parts.append(f"{units.show(abs(fy), 'force')} more to {'port' if fy > 0 else 'starboard'}")
    if abs(m) > 1e-6:
        side = "port" if m > 0 else "starboard"
        parts.append(f"{units.show(abs(m), 'moment')} more swinging the bow to {side}")
    return "needs " + ", ".join(parts) if parts else "nothing missing"
