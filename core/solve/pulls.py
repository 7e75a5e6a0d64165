"""Solve pulls: the pulls (and, within working sectors, the leads) that meet a goal.

Problem -> solver -> result. :func:`pulls_problem` describes one body in one stage
as arrays; :func:`solve_pulls` returns a :class:`PullsResult` that keeps a reference
to its problem. An impossible goal is not an error: the result holds the closest
achievable state and the shortfall.

Each tug may give any force in its convex polygon (core.mechanics.tugsets): with no
working sector, any pull up to its usable pull along its lead as set; with a sector,
any lead within it and any pull within its capability at that lead. The polygon's
vertices are the columns of the linear programmes; a tug's columns share its limit
(the sum of their shares is at most one, the rest is the origin), so every mix is a
point of the polygon: one force from the tug's point, with a real lead.

The allocation, for n tugs, with each tug's use t_i its gauge in its polygon (the
share of the way from nothing to the polygon's edge along its force):

1. Spread the work: minimise the largest setting t = max t_i subject to the tugs' wrench
   (force ahead, force to port, moment about the centroid) = required (solved as its
   equivalent "largest s with s * required reachable at full use", t = 1 / s).
2. Among those, the smallest total pull (a second linear programme with every t_i <= t).
3. If no allocation within the polygons meets the goal: with every tug at most at its
   edge, minimise the largest component of the shortfall (force ahead, force abeam, and
   the moment as the sideways force at the bow or stern that would make it,
   2 |moment| / length), then their sum without making the largest worse; then spread
   the work as above on what that achieves.

Lines only pull and pushes only push (unless made fast, push-pull): every pull is zero
or positive along a lead the tug can take.

Fitting ratings bound the pulls too. Each tug's polygon is cut off where its own line
would pass its fitting's TOW or SWL (core.mechanics.fittings.pull_limits_n: the pull at
most rating x cos(line angle)). Where several tugs work at one fitting and could together
pass its rating, one more linear row keeps the sum of their tensions (each column's pull
/ cos(line angle)) within it. The fitting's load that the verdict checks is the resultant
of those tensions (core.mechanics.fittings.fitting_totals), never more than their sum, so
a solve within the sum always passes that check. Such a row ties tugs together: the
solves then go by the linear programmes, not the fleet's set of wrenches.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Literal

import numpy as np

from core.errors import InputError
from core.frames import angle_to_bearing, wrap_pi
from core.mechanics.balance import Load, TugLayout, tug_layout
from core.mechanics.bodies import Body, stage_body
from core.mechanics.fittings import tension_per_pull
from core.mechanics.forces import NEGLIGIBLE, negligible
from core.mechanics.loads import body_conditions, loads_wrench
from core.mechanics.tugsets import SECTOR_STEP_DEG, TugSets, tug_sets
from core.model.goals import Goal
from core.model.plan import Project, Stage
from core.model.tugs import Placement
from core.notices import Notice
from core.solve.lp import solve_lp
from core.solve.polytope import WrenchPolygons, zonotope_normals
from core.solve.reach import Reach, SegmentsReach
from core.solve.zonotope import FleetZonotope, HalfSpaces
from core.units import DisplayUnits, percent_words

#: The reach of a fleet with working sectors is first found with polygons this many
#: times coarser, then walked out to the fine ones (core.solve.walk).
SOLVE_NEST = 9
#: A goal counts as met when what is missing is negligible by the one rule
#: (core.mechanics.forces.negligible, half a percent) of what the goal asks of the tugs
#: (the goal less the conditions: its force, or its moment over the body's length where
#: that is larger). :data:`GOAL_FLOOR` of the strongest tug's usable pull is always
#: allowed (the solvers' rounding).
GOAL_TOL = NEGLIGIBLE
GOAL_FLOOR = 1e-6
#: From this many columns (tugs without working sectors) the ray's exit from the fleet's
#: zonotope is found by the walk of core.solve.reach (a product with the columns a step)
#: instead of among its facets (a pair of columns each: k^3 work, 4 ms at 60 columns,
#: 200 ms at 200, against 1 and 3 ms walked; about even at 40). Both give the same
#: reach to 1e-9 of it (tests/core/test_solve_walk.py).
WALK_FROM_COLUMNS = 40
#: Weights of the shortfall's components on scaled rows (force ahead, force abeam,
#: moment / length): the moment counts as the force at an end that would make it.
_SHORTFALL_WEIGHTS = np.array([1.0, 1.0, 2.0])
#: Sides of the polygon that stands for a force's length in the shortfall's programme
#: (its length to within 1 - cos(pi / 64) = 0.1 %).
_NORM_SIDES = 64
#: What the tug lost check "as re-set" assumes, said wherever it is shown.
RESET_NOTE = (
    "as re-set: the other tugs take new leads within their sectors and new pulls; "
    "the time they need to do so is not worked out"
)
#: What the tug lost check "as set" means.
AS_SET_NOTE = "as set: the other tugs keep their leads and pulls (the first seconds)"


@dataclass(frozen=True, slots=True, eq=False)
class PullsProblem:
    """What to solve for one body in one stage, as arrays (n tugs, k polygon vertices).

    ``tug_index`` maps each tug to its row in ``sets`` (which keeps every tug even when
    one is lost); ``set_wrench`` is each tug's wrench as set (setting x usable pull).
    """

    stage: str
    body: str
    goal: Goal
    placements: tuple[Placement, ...]  # (n,)
    usable_n: np.ndarray  # (n,) usable pull of each tug at its lead as set, N
    columns: np.ndarray  # (3, k): force ahead, to port, moment about the centroid per N
    column_pull_n: np.ndarray  # (k,) the pull at each vertex, N
    column_tug: np.ndarray  # (k,) index into placements of each column's tug
    column_lead_rad: np.ndarray  # (k,) the placement lead each column stands for
    conditions: np.ndarray  # (3,) wrench of the wind, current and other loads
    centroid: tuple[float, float]
    length_m: float
    loads: tuple[Load, ...] = ()
    notices: tuple[Notice, ...] = ()
    sets: TugSets | None = None
    tug_index: np.ndarray | None = None  # (n,) row of each tug in ``sets``
    set_wrench: np.ndarray | None = None  # (3, n) each tug's wrench as set
    reach: Reach | None = None  # the fleet's support mapping for the walk (with sectors)
    step_deg: float = SECTOR_STEP_DEG  # largest step of lead between a sector's vertices
    rating_n: np.ndarray | None = None  # (n,) each tug's fitting's TOW, else SWL, N; nan: none
    tension_per_n: np.ndarray | None = None  # (n,) load on the fitting per N of pull

    @property
    def tugs(self) -> tuple[str, ...]:
        return tuple(p.tug for p in self.placements)

    @property
    def required(self) -> np.ndarray:
        """(3,) what the tugs together must supply: the goal less the conditions."""
        return np.asarray(self.goal.target(), dtype=float) - self.conditions

    @property
    def generators(self) -> np.ndarray:
        """(3, k) each vertex's wrench at its full pull, N and N*m."""
        return self.columns * self.column_pull_n

    def rows(self) -> np.ndarray:
        """(n,) each tug's row in ``sets``."""
        if self.tug_index is None:
            return np.arange(len(self.placements))
        return self.tug_index

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
            column_pull_n=self.column_pull_n[keep],
            column_tug=remap[self.column_tug[keep]],
            column_lead_rad=self.column_lead_rad[keep],
            tug_index=np.delete(self.rows(), i),
            set_wrench=None if self.set_wrench is None else np.delete(self.set_wrench, i, axis=1),
            reach=None if self.reach is None else self.reach.without(i),
            rating_n=None if self.rating_n is None else np.delete(self.rating_n, i),
            tension_per_n=None if self.tension_per_n is None else np.delete(self.tension_per_n, i),
        )

    def shapes(self) -> WrenchPolygons | None:
        """Each tug's polygon and arm (about the centroid), in placement order."""
        if self.sets is None:
            return None
        rows = self.rows()
        arms = self.sets.arms()
        return WrenchPolygons(tuple(self.sets.polygons[r] for r in rows), arms[rows])

    def with_goal(self, goal: Goal) -> PullsProblem:
        return replace(self, goal=goal)

    def coarse(self) -> PullsProblem | None:
        """The same problem with SOLVE_NEST times coarser sectors (every vertex one of
        this problem's); None without sectors."""
        sets = self.sets
        if sets is None or not sets.sectors.any():
            return None
        rough = tug_sets(sets.layout, self.centroid, step_deg=self.step_deg * SOLVE_NEST)
        rows = self.rows()
        mine = np.full(len(sets.layout.placements), -1)
        mine[rows] = np.arange(len(rows))
        keep = mine[rough.vertex_tug] >= 0
        gens = rough.wrenches()[:, keep]
        pulls = np.hypot(rough.vertices[keep, 0], rough.vertices[keep, 1])
        return replace(
            self,
            columns=gens / np.where(pulls > 0, pulls, 1.0),
            column_pull_n=pulls,
            column_tug=mine[rough.vertex_tug[keep]],
            column_lead_rad=rough.vertex_lead[keep],
            sets=rough,
            reach=None,
        )


def pulls_problem(
    project: Project,
    stage: Stage,
    body: str | None = None,
    goal: Goal | None = None,
    *,
    loads: tuple[Load, ...] | None = None,
    sector_step_deg: float = SECTOR_STEP_DEG,
    layout: TugLayout | None = None,
    made_body: Body | None = None,
) -> PullsProblem:
    """Describe the solve for ``body`` in ``stage`` (goal: given, the stage's, or hold).

    ``loads`` default to the stage's wind and current on the body; a load whose
    area is unknown is left out and a notice in the problem says so. ``layout`` and
    ``made_body`` may lend the body's tug layout and the body already worked out for
    this stage (the drag path).
    """
    b = made_body if made_body is not None else stage_body(project, stage, body)
    if layout is None or tuple(p.tug for p in layout.placements) != tuple(
        p.tug for p in stage.placements if p.hull in {m.hull.name for m in b.members}
    ):
        layout = tug_layout(project, stage, b)
    notices: tuple[Notice, ...] = ()
    if loads is None:
        cond = body_conditions(stage, b)
        loads, notices = cond.loads, cond.notices
    c = b.centroid
    sets = tug_sets(layout, c, step_deg=sector_step_deg, nest=SOLVE_NEST)
    notices += tuple(
        Notice(
            "no_clear_lead",
            layout.placements[i].tug,
            f"{layout.placements[i].tug}: no lead in its working sector from "
            f"{layout.placements[i].point} runs clear of the hull; the solve leaves it out",
        )
        for i in sets.no_clear_lead
    )
    problem = _problem_of(stage, b.name, goal, layout, sets, c, b.length, loads, notices)
    if not sets.sectors.any():
        return problem
    shapes = problem.shapes()
    return replace(
        problem, reach=None if shapes is None else Reach(shapes), step_deg=sector_step_deg
    )


def _problem_of(
    stage: Stage,
    body: str,
    goal: Goal | None,
    layout: TugLayout,
    sets: TugSets,
    c: tuple[float, float],
    length: float,
    loads: tuple[Load, ...],
    notices: tuple[Notice, ...],
) -> PullsProblem:
    gens = sets.wrenches()  # (3, k)
    pulls = (
        np.hypot(sets.vertices[:, 0], sets.vertices[:, 1]) if len(sets.vertices) else np.zeros(0)
    )
    columns = gens / np.where(pulls > 0, pulls, 1.0) if len(pulls) else np.zeros((3, 0))
    forces = layout.directions * layout.pulls_n[:, None]  # (n, 2)
    arms = layout.points - np.asarray(c)
    set_wrench = np.vstack(
        [forces[:, 0], forces[:, 1], arms[:, 0] * forces[:, 1] - arms[:, 1] * forces[:, 0]]
    )
    return PullsProblem(
        stage=stage.name,
        body=body,
        goal=goal or stage.goal or Goal("hold"),
        placements=layout.placements,
        usable_n=layout.usable_n.copy(),
        columns=columns,
        column_pull_n=pulls,
        column_tug=sets.vertex_tug.astype(int),
        column_lead_rad=sets.vertex_lead.astype(float),
        conditions=loads_wrench(tuple(loads), c),
        centroid=c,
        length_m=length,
        loads=tuple(loads),
        notices=notices,
        sets=sets,
        tug_index=np.arange(len(layout.placements)),
        set_wrench=set_wrench,
        rating_n=np.asarray(layout.swl_n, dtype=float).copy(),
        tension_per_n=tension_per_pull(layout),
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
    usable_at_lead_n: np.ndarray | None = None  # (n,) usable pull at the solved lead, N
    uses: np.ndarray | None = None  # (n,) each tug's gauge in its polygon (0 to 1)

    @property
    def usable_n(self) -> np.ndarray:
        """(n,) each tug's usable pull at the lead it works at, N."""
        if self.usable_at_lead_n is not None:
            return self.usable_at_lead_n
        return self.problem.usable_n

    @property
    def settings(self) -> np.ndarray:
        """(n,) pull as a fraction of the usable pull at its lead (the setting; 0 for a
        tug with none). Above 1 only where a non-convex capability was made convex."""
        u = self.usable_n
        return np.divide(self.pulls_n, u, out=np.zeros_like(u), where=u > 0)

    def beyond_capability(self) -> tuple[str, ...]:
        """Tugs asked for more than their capability at the solved lead (the convex hull
        of a capability that is not convex), by name."""
        return tuple(
            t for t, v in zip(self.problem.tugs, self.settings, strict=True) if v > 1 + 1e-6
        )

    def what_each_does(self, units: DisplayUnits) -> tuple[str, ...]:
        """One line per tug: its pull, its setting and the bearing it pulls towards."""
        out = []
        for i, p in enumerate(self.problem.placements):
            pull = float(self.pulls_n[i])
            if pull <= 1e-9 * max(float(self.usable_n.max(initial=0.0)), 1.0):
                out.append(f"{p.tug}: not needed")
                continue
            out.append(
                f"{p.tug}: {units.show(pull, 'force')} ({percent_words(float(self.settings[i]))}) "
                f"towards {self.bearing_deg(i):05.1f} relative"
            )
        return tuple(out)

    @property
    def largest_setting(self) -> float:
        return float(self.settings.max(initial=0.0))

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
                self.problem.placements, self.settings, self.leads_rad, strict=True
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
    """The problem in scaled units: each column's share g of its vertex, rows of order one."""

    def __init__(self, problem: PullsProblem, u_ref: float | None = None) -> None:
        self.problem = problem
        pulls = problem.column_pull_n
        self.u_ref = u_ref or float(pulls.max(initial=0.0)) or 1.0
        self.l_ref = max(problem.length_m, 1.0)
        self.row_scale = np.array([1.0, 1.0, 1.0 / self.l_ref]) / self.u_ref
        self.col_u = pulls  # (k,)
        self.gen = problem.columns * pulls * self.row_scale[:, None]  # (3, k)
        self.cost = pulls / self.u_ref  # total pull, scaled
        self.k = problem.columns.shape[1]
        # Tugs with several columns (a working sector) share one limit: one extra row each.
        counts = np.bincount(problem.column_tug, minlength=len(problem.placements))
        self.shared = [int(i) for i in np.flatnonzero(counts > 1)]
        self.col_tug = problem.column_tug
        self.sectors = bool(self.shared) and problem.reach is not None
        self._normal: np.ndarray | None = None  # the exit face's normal, scaled rows
        #: The zonotope's half-spaces when worked out already (the tug lost check's).
        self.halfspaces: HalfSpaces | None = None
        # (f, k), (f,): each shared fitting's tension per column share, and its rating
        self.fit_rows, self.fit_caps = _fitting_rows(problem, self.u_ref)
        self.coupled = bool(len(self.fit_caps))

    def _with_fittings(
        self, c: np.ndarray, a: np.ndarray, b: np.ndarray, up: np.ndarray, cols: np.ndarray
    ) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
        """A programme whose first variables are the shares of ``cols``, with each shared
        fitting's row (the tensions plus a slack make its rating) added after the rest."""
        if not self.coupled:
            return c, a, b, up
        f, (m, n) = len(self.fit_caps), a.shape
        rows = np.zeros((f, n + f))
        rows[:, : len(cols)] = self.fit_rows[:, cols]
        rows[:, n:] = np.eye(f)
        a2 = np.vstack([np.hstack([a, np.zeros((m, f))]), rows])
        return (
            np.concatenate([c, np.zeros(f)]),
            a2,
            np.concatenate([b, self.fit_caps]),
            np.concatenate([up, np.full(f, np.inf)]),
        )

    def coarse(self) -> _Scaled:
        """The problem with coarser sectors, in the same scaled units."""
        rough = self.problem.coarse() if self.sectors else None
        return self if rough is None else _Scaled(rough, self.u_ref)

    def shapes(self, problem: PullsProblem) -> WrenchPolygons:
        """``problem``'s polygons in scaled units (forces / u_ref, moments / (u_ref L))."""
        raw = problem.shapes()
        if raw is None:
            return WrenchPolygons((), np.zeros((0, 2)))
        return WrenchPolygons(tuple(p / self.u_ref for p in raw.polygons), raw.arms / self.l_ref)

    def scale(self, wrench: np.ndarray) -> np.ndarray:
        return np.asarray(wrench) * self.row_scale

    def _shared_rows(self, extra: int) -> np.ndarray:
        """(len(shared), k + len(shared) + extra): sum of a tug's columns plus its slack."""
        s = len(self.shared)
        rows = np.zeros((s, self.k + s + extra))
        if s:
            rows[:, : self.k] = np.asarray(self.shared)[:, None] == self.col_tug[None, :]
            rows[np.arange(s), self.k + np.arange(s)] = 1.0
        return rows

    def widest_reach(self, target: np.ndarray) -> float:
        """Largest s with s * target reachable at full pull (inf for a zero target).

        Without lead sectors the reachable wrenches are a zonotope and s is where the ray
        along ``target`` leaves it (its half-spaces, as in core.solve.pulls.holdlimits); with sectors
        it is a small LP.
        """
        if not self.shared and not self.coupled:
            return self._ray_exit(target)
        if self.sectors and not self.coupled:
            reach = self._walk_reach(target)
            if reach is not None:
                return reach
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
        r = solve_lp(*self._with_fittings(c, a, b, up, np.arange(self.k)))
        if r.status == "unbounded":
            return math.inf
        return float(r.x[self.k + s]) if r.ok else 0.0

    def _walk_reach(self, target: np.ndarray) -> float | None:
        """The reach with sectors: a walk over triangles of the fleet's set out to the face
        the ray leaves through (core.solve.reach, in newtons and newton-metres: the
        reach is the same in any scaling of the rows); None where it cannot start."""
        self._normal = None
        reach = self.problem.reach
        if reach is None:
            return None
        aim = target / self.row_scale  # back to N and N*m
        out = reach.exit((float(aim[0]), float(aim[1]), float(aim[2])))
        if out is None:
            return None
        s, normal = out
        self._normal = np.asarray(normal)
        return max(s, 0.0)

    def face_columns(self) -> tuple[np.ndarray, np.ndarray] | None:
        """For the face the last walked reach left through: ((k,) bool, each tug's
        farthest vertices in that direction; (n,) bool, the tugs whose farthest is
        nothing, with their vertices along the face); None without one."""
        if self._normal is None:
            return None
        gen = self.problem.generators  # N and N*m: the normal is in those units
        score = self._normal @ gen  # (k,)
        size = np.abs(self._normal) @ np.abs(gen)
        out = np.zeros(self.k, dtype=bool)
        at_origin = np.zeros(len(self.problem.placements), dtype=bool)
        for i in range(len(self.problem.placements)):
            sel = np.flatnonzero(self.col_tug == i)
            if not len(sel):
                continue
            tol = 1e-9 * float(size[sel].max())
            best = max(float(score[sel].max()), 0.0)
            out[sel] = score[sel] >= best - tol
            at_origin[i] = best <= tol and bool(out[sel].any())
        return out, at_origin

    def face_allocation(
        self, target: np.ndarray, t: float, face: np.ndarray, at_origin: np.ndarray
    ) -> np.ndarray | None:
        """The allocation on the exit face at use ``t``: a tug with one face vertex at ``t``
        on it, the shares of a tug with an edge on the face (adding up to ``t``) or with
        nothing on it (at most ``t``) solved for; None when that does not fix it (the
        least-total programme decides then)."""
        cols = np.flatnonzero(face)
        tug = self.col_tug[cols]
        counts = np.bincount(tug, minlength=len(self.problem.placements))
        free = at_origin[tug] | (counts[tug] > 1)
        single, multi = cols[~free], cols[free]
        g = np.zeros(self.k)
        g[single] = t
        if len(multi):
            owners = np.unique(self.col_tug[multi])
            edge = owners[~at_origin[owners]]  # their shares add up to t
            a = np.vstack([self.gen[:, multi], edge[:, None] == self.col_tug[multi][None, :]])
            rest = target - self.gen[:, single] @ g[single]
            rhs = np.concatenate([rest, np.full(len(edge), t)])
            if a.shape[0] < a.shape[1]:
                return None  # more freedom than the face fixes: least total pull decides
            part, *_ = np.linalg.lstsq(a, rhs, rcond=None)
            if np.any(part < -1e-9 * max(t, 1e-300)) or np.any(part > t * (1 + 1e-9)):
                return None
            g[multi] = np.clip(part, 0.0, t)
            sums = np.bincount(self.col_tug[multi], weights=g[multi], minlength=len(counts))
            if np.any(sums > t * (1 + 1e-9)):
                return None
        miss = np.abs(self.gen @ g - target).max()
        if miss > 1e-9 * max(float(np.abs(target).max()), 1e-12):
            return None
        return g

    def _ray_exit(self, target: np.ndarray) -> float:
        hs = self.halfspaces
        if hs is None and self.k >= WALK_FROM_COLUMNS:
            got = SegmentsReach(self.gen).exit(
                (float(target[0]), float(target[1]), float(target[2]))
            )
            if got is not None:  # None: a flat set, or the ray along its edge (see below)
                s, normal = got
                self._exit_facet = np.asarray(normal) @ self.gen
                return max(s, 0.0)
        if hs is not None:
            normals, support, proj = hs.normals, hs.support, None
        else:
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
        # (k,) each column's reach across the exit face
        self._exit_facet = proj[j] if proj is not None else hs.across(j)  # type: ignore[union-attr]
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

    def least_total(
        self, target: np.ndarray, cap: float, columns: np.ndarray | None = None
    ) -> np.ndarray | None:
        """Fractions g (k,) meeting target with every tug at most ``cap``, least total pull
        (using only ``columns`` (k,) bool where given)."""
        keep = np.ones(self.k, dtype=bool) if columns is None else columns
        cols = np.flatnonzero(keep)
        tug = self.col_tug[cols]
        counts = np.bincount(tug, minlength=len(self.problem.placements))
        shared = np.flatnonzero(counts > 1)
        s, k = len(shared), len(cols)
        a = np.zeros((3 + s, k + s))
        a[:3, :k] = self.gen[:, cols]
        if s:
            a[3:, :k] = shared[:, None] == tug[None, :]
            a[3 + np.arange(s), k + np.arange(s)] = 1.0
        b = np.concatenate([target, np.full(s, cap)])
        c = np.concatenate([self.cost[cols], np.zeros(s)])
        up = np.concatenate([np.full(k, cap), np.full(s, np.inf)])
        r = solve_lp(*self._with_fittings(c, a, b, up, cols))
        if not r.ok:
            return None
        g = np.zeros(self.k)
        g[cols] = r.x[:k]
        return g

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
        every = np.arange(k)
        r = solve_lp(*self._with_fittings(c, a, b, up, every))
        if not r.ok:
            return np.zeros(k)
        worst = float(r.x[k + s + 9]) * (1 + 1e-9) + 1e-12
        # L1 with every component held within the worst found.
        a = np.vstack([np.hstack([self.gen, np.zeros((3, s)), eye, -eye]), self._shared_rows(6)])
        b = np.concatenate([target, np.ones(s)])
        c = np.concatenate([np.zeros(k + s), w, w])
        up = np.concatenate([np.ones(k), np.full(s, np.inf), worst / w, worst / w])
        r2 = solve_lp(*self._with_fittings(c, a, b, up, every))
        return (r2 if r2.ok else r).x[:k]

    def actionable(self, target: np.ndarray) -> np.ndarray:
        """Fractions g (k,) at most 1 that leave a shortfall a tug master can act on: the
        force met and the least yaw moment missing, or the yaw moment met and the least
        force missing, whichever misses less (the moment counted as the force at the bow
        or the stern that would make it, :data:`_SHORTFALL_WEIGHTS`); where the fleet can
        meet neither alone, the closest state (:meth:`closest`)."""
        best: tuple[float, np.ndarray] | None = None
        for free, weight in ((2, float(_SHORTFALL_WEIGHTS[2])), (0, 1.0)):
            got = self.met_but(target, free)
            if got is not None and (best is None or weight * got[1] < best[0]):
                best = (weight * got[1], got[0])
        return self.closest(target) if best is None else best[1]

    def met_but(self, target: np.ndarray, free: int) -> tuple[np.ndarray, float] | None:
        """Fractions g (k,) at most 1 that meet ``target`` exactly but for row ``free``
        (2: the moment; 0: the force, both its rows), and come closest there; with the
        closeness in scaled rows (the force as the length of its shortfall, to 1 %: a
        polygon of :data:`_NORM_SIDES` sides); None when the other rows cannot be met.
        """
        s, k = len(self.shared), self.k
        if free == 2:
            # rows: force rows exact; moment row + r+ - r- = target; shared. min r+ + r-.
            extra = 2
            a = np.vstack(
                [
                    np.hstack([self.gen, np.zeros((3, s)), np.array([[0, 0], [0, 0], [1, -1]])]),
                    self._shared_rows(extra),
                ]
            )
            b = np.concatenate([target, np.ones(s)])
            c = np.concatenate([np.zeros(k + s), [1.0, 1.0]])
        else:
            # force rows + r+ - r- (x, y) = target; moment exact; shared; and for each
            # direction d of the polygon d.(r+ - r-) + q - z = 0 (z >= d.r). min z.
            m = _NORM_SIDES
            ang = 2 * math.pi * np.arange(m) / m
            d = np.column_stack([np.cos(ang), np.sin(ang)])  # (m, 2)
            extra = 4 + m + 1
            r = np.zeros((3, extra))
            r[0, 0], r[0, 1], r[1, 2], r[1, 3] = 1.0, -1.0, 1.0, -1.0
            poly = np.zeros((m, k + s + extra))
            poly[:, k + s + 0], poly[:, k + s + 1] = d[:, 0], -d[:, 0]
            poly[:, k + s + 2], poly[:, k + s + 3] = d[:, 1], -d[:, 1]
            poly[:, k + s + 4 : k + s + 4 + m] = np.eye(m)
            poly[:, -1] = -1.0
            a = np.vstack(
                [
                    np.hstack([self.gen, np.zeros((3, s)), r]),
                    self._shared_rows(extra),
                    poly,
                ]
            )
            b = np.concatenate([target, np.ones(s), np.zeros(m)])
            c = np.zeros(k + s + extra)
            c[-1] = 1.0
        up = np.concatenate([np.ones(k), np.full(s + extra, np.inf)])
        res = solve_lp(*self._with_fittings(c, a, b, up, np.arange(k)))
        if not res.ok:
            return None
        g = np.clip(res.x[:k], 0.0, 1.0)
        miss = target - self.gen @ g  # scaled rows
        size = abs(float(miss[2])) if free == 2 else float(np.hypot(miss[0], miss[1]))
        return g, size


def _fitting_rows(problem: PullsProblem, u_ref: float) -> tuple[np.ndarray, np.ndarray]:
    """((f, k), (f,)): for each rated fitting that several tugs work at and that their
    largest pulls could together load past its rating, each column's load on it per unit
    share (its pull x tension per pull, scaled by ``u_ref``), and the rating / ``u_ref``.

    The row holds the sum of the tensions within the rating: linear, and never less than
    their resultant, which is what the verdict checks (so a solve within it passes)."""
    rating, per_n = problem.rating_n, problem.tension_per_n
    k = problem.columns.shape[1]
    if rating is None or per_n is None or not k:
        return np.zeros((0, k)), np.zeros(0)
    groups: dict[tuple[str, str], list[int]] = {}
    for i, p in enumerate(problem.placements):
        if math.isfinite(float(rating[i])):
            groups.setdefault((p.hull, p.point), []).append(i)
    col_load = problem.column_pull_n * per_n[problem.column_tug]  # (k,) N at each vertex
    rows, caps = [], []
    for idx in groups.values():
        if len(idx) < 2:
            continue
        mine = np.isin(problem.column_tug, idx)
        most = sum(float(col_load[problem.column_tug == i].max(initial=0.0)) for i in idx)
        r = float(rating[idx[0]])
        if most <= r * (1 + 1e-9):
            continue  # they cannot pass it together
        rows.append(np.where(mine, col_load, 0.0) / u_ref)
        caps.append(r / u_ref)
    if not rows:
        return np.zeros((0, k)), np.zeros(0)
    return np.array(rows), np.array(caps)


def _spread(sc: _Scaled, target: np.ndarray) -> np.ndarray | None:
    """Steps 1 and 2: least largest setting, then least total pull; None if out of reach."""
    reach = sc.widest_reach(target)
    if reach < 1.0 - 1e-9:
        return None
    t = 0.0 if math.isinf(reach) else min(1.0, 1.0 / reach)
    if not sc.shared and not sc.coupled and reach >= 1.0:
        g = sc.on_exit_face(target, t)
        if g is not None:
            return g
    got = sc.face_columns() if sc.sectors and not sc.coupled else None
    if got is not None:  # only the face's columns can reach the target at use t
        face, at_origin = got
        g = sc.face_allocation(target, t, face, at_origin)
        if g is None:
            g = sc.least_total(target, t * (1 + 1e-9) + 1e-12, face)
        if g is not None:
            return g
    g = sc.least_total(target, t * (1 + 1e-9) + 1e-12)
    if g is None:  # a hair of numerical slack was not enough: allow the full pull
        g = sc.least_total(target, 1.0)
    return g


def solve_pulls(
    problem: PullsProblem, *, lost_from: tuple[FleetZonotope, int] | None = None
) -> PullsResult:
    """The pulls that meet the problem's goal, spreading the work; never raises on an
    impossible goal (the result is the closest achievable state, ``feasible`` False).

    ``lost_from`` (the tug lost check's): the whole fleet's zonotope and the column lost
    to make ``problem``, whose half-spaces then serve (core.solve.zonotope).
    """
    sc = _Scaled(problem)
    if lost_from is not None and not sc.shared and not sc.coupled:
        zonotope, lost = lost_from
        sc.halfspaces = zonotope.without(lost, sc.u_ref)
    required = problem.required
    target = sc.scale(required)
    if sc.k == 0 or not np.any(np.abs(target) > 1e-15):
        g = np.zeros(sc.k)
    else:
        spread = _spread(sc, target)
        if spread is None:
            near = sc.coarse()  # with sectors, the closest state of the coarse set
            reach_target = near.gen @ near.actionable(target)
            spread = _spread(sc, reach_target)
            g = spread if spread is not None else sc.actionable(target)
        else:
            g = spread
    g = np.clip(g, 0.0, 1.0)
    pulls, leads, dirs, usable, uses = _per_tug(problem, g * sc.col_u)
    achieved = problem.columns @ (g * sc.col_u) if sc.k else np.zeros(3)
    shortfall = required - achieved
    met = bool(np.all(np.abs(shortfall) <= goal_tolerance(problem)))
    return PullsResult(
        problem,
        met,
        pulls,
        leads,
        achieved,
        np.where(met, 0.0, shortfall),
        dirs,
        usable,
        uses,
    )


def goal_tolerance(problem: PullsProblem) -> np.ndarray:
    """(3,) how much of (force ahead, force to port, moment) may be missing with the goal
    still met, N and N*m (:func:`tolerance_of` the problem's required wrench)."""
    strongest = float(problem.column_pull_n.max(initial=0.0))
    return tolerance_of(problem.required, problem.length_m, strongest)


def tolerance_of(required: np.ndarray, length_m: float, strongest_n: float) -> np.ndarray:
    """(3,) how much of (force ahead, force to port, moment) may be missing with a goal
    still met, N and N*m, when the tugs must supply ``required`` (3,) (the goal less the
    conditions) to a body ``length_m`` long whose strongest tug gives ``strongest_n``
    (:data:`GOAL_TOL`, :data:`GOAL_FLOOR`). The tug lost check and the hold limits both
    judge "met" by it."""
    fx, fy, m = (float(v) for v in required)
    length = max(length_m, 1.0)
    asked = max(math.hypot(fx, fy), abs(m) / length)
    floor = GOAL_FLOOR * max(strongest_n, 1.0)
    tol_f, tol_m = negligible(asked, length, floor_n=floor)
    return np.array([tol_f, tol_f, tol_m])


def _per_tug(
    problem: PullsProblem, pull_cols: np.ndarray
) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """Each tug's (pull, lead, direction, usable pull at that lead, use) from the pulls
    along its vertices (k,): the sum is one force from the tug's point."""
    n = len(problem.placements)
    col_tug = problem.column_tug
    shares = np.divide(
        pull_cols,
        problem.column_pull_n,
        out=np.zeros_like(pull_cols),
        where=problem.column_pull_n > 0,
    )
    fx = np.bincount(col_tug, weights=problem.columns[0] * pull_cols, minlength=n)
    fy = np.bincount(col_tug, weights=problem.columns[1] * pull_cols, minlength=n)
    sums = np.bincount(col_tug, weights=shares, minlength=n)  # the way out to each edge
    pulls = np.hypot(fx, fy)
    leads = np.array([p.lead_rad for p in problem.placements], dtype=float)
    usable = problem.usable_n.copy()
    sets, rows = problem.sets, problem.rows()
    if sets is None:
        dirs = np.zeros((n, 2))
        for i in range(n):
            sel = np.flatnonzero(col_tug == i)
            dirs[i] = problem.columns[:2, sel[0]] if len(sel) else (1.0, 0.0)
        pulls = np.minimum(pulls, usable)
        return (
            pulls,
            leads,
            dirs,
            usable,
            np.divide(pulls, usable, out=np.zeros(n), where=usable > 0),
        )
    dirs = sets.layout.directions[rows].copy()
    uses = np.divide(pulls, usable, out=np.zeros(n), where=usable > 0)
    fixed = ~sets.sectors[rows]
    pulls[fixed] = np.minimum(pulls[fixed], usable[fixed])
    uses[fixed] = np.divide(pulls, usable, out=np.zeros(n), where=usable > 0)[fixed]
    frame = sets.layout.lead_frame_rad
    small = 1e-12 * max(float(problem.column_pull_n.max(initial=0.0)), 1.0)
    for k in np.flatnonzero(~fixed):
        i = int(k)
        p, row = problem.placements[i], int(rows[i])
        if pulls[i] > small:
            dirs[i] = (fx[i] / pulls[i], fy[i] / pulls[i])
            base = float(frame[row]) if frame is not None else 0.0
            leads[i] = wrap_pi(_into_sector(p, wrap_pi(math.atan2(fy[i], fx[i]) - base)))
        else:
            dirs[i] = _direction_at(sets, row, p.lead_rad)
        usable[i] = sets.capability_at(row, float(leads[i]))
        uses[i] = sums[i]
    return pulls, leads, dirs, usable, uses


def _into_sector(p: Placement, lead: float) -> float:
    """The turn of ``lead`` (rad) that lies in the placement's sector, else the nearest."""
    if p.lead_sector_rad is None:
        return lead
    lo, hi = p.lead_sector_rad
    k = math.floor((lead - lo) / (2 * math.pi))
    cand = lead - 2 * math.pi * k  # in [lo, lo + 2 pi)
    if cand <= hi + 1e-9:
        return cand
    return hi if cand - hi < lo + 2 * math.pi - cand else lo


def _direction_at(sets: TugSets, row: int, lead: float) -> np.ndarray:
    frame = sets.layout.lead_frame_rad
    base = float(frame[row]) if frame is not None else 0.0
    return np.array([math.cos(base + lead), math.sin(base + lead)])


# -- the tug lost check ---------------------------------------------------------------


#: From this many tugs on (every lead as set), the tug lost check's solves share the
#: fleet's half-spaces (below it, each solve making its own costs no more).
ZONOTOPE_FROM = 8


@dataclass(frozen=True, slots=True, eq=False)
class TugLostCase:
    """One tug out of action, answered two ways.

    ``result`` is the answer as re-set: the others re-lead within their sectors and
    re-set their pulls (what each must do is in the result; the time that takes is not
    worked out, :data:`RESET_NOTE`). ``as_set_shortfall`` is the answer as set: the
    others keep their leads and pulls, what happens in the first seconds
    (:data:`AS_SET_NOTE`): the goal less what they then give, (3,) N and N*m.
    """

    tug: str
    result: PullsResult
    as_set_shortfall: np.ndarray | None = None  # (3,)

    @property
    def holds(self) -> bool:
        """The goal is still met as re-set."""
        return self.result.feasible

    @property
    def holds_as_set(self) -> bool | None:
        """The goal is still met as set (None when the settings are not known)."""
        if self.as_set_shortfall is None:
            return None
        tol_f, tol_m = self.as_set_tolerance
        fx, fy, m = (float(v) for v in self.as_set_shortfall)
        return math.hypot(fx, fy) <= tol_f and abs(m) <= tol_m

    @property
    def as_set_tolerance(self) -> tuple[float, float]:
        """(force N, moment N*m) within which the goal is still met as set: the one rule of
        the balance (core.mechanics.forces.negligible) of the remaining tugs' pulls as set
        and the loads, as the stage's balance without that tug would judge it."""
        p = self.result.problem
        w = p.set_wrench  # (3, n - 1): the lost tug's column taken out (problem.without)
        pulls = 0.0 if w is None else float(np.hypot(w[0], w[1]).sum())
        loads = sum(math.hypot(*ld.force) for ld in p.loads)
        return negligible(pulls + loads, p.length_m)

    @property
    def largest_setting(self) -> float:
        return self.result.largest_setting

    @property
    def worst_tug(self) -> str | None:
        """The remaining tug working hardest."""
        if not len(self.result.pulls_n):
            return None
        # one placement's name (the tugs property makes the tuple of all of them)
        return self.result.problem.placements[int(np.argmax(self.result.settings))].tug


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
            return (float(np.abs(c.result.shortfall * w).sum()), c.largest_setting)

        return max(self.cases, key=hurt)


def tug_lost_check(problem: PullsProblem) -> TugLostCheck:
    """Solve again without each tug in turn (as re-set), and say what the others give
    as set."""
    full = solve_pulls(problem)
    zonotope = _fleet_zonotope(problem)
    cases = []
    for i, t in enumerate(problem.tugs):
        as_set = None
        if problem.set_wrench is not None:
            others = problem.set_wrench.sum(axis=1) - problem.set_wrench[:, i]
            as_set = problem.required - others
        lost_from = None if zonotope is None else (zonotope, i)
        cases.append(TugLostCase(t, solve_pulls(problem.without(t), lost_from=lost_from), as_set))
    return TugLostCheck(problem, full, tuple(cases))


def _fleet_zonotope(problem: PullsProblem) -> FleetZonotope | None:
    """The fleet's half-spaces once for all the check's solves, when every tug is one
    column (every lead as set) and the fleet is large enough for it to pay."""
    sc = _Scaled(problem)
    if sc.shared or sc.coupled or sc.k != len(problem.placements) or sc.k < ZONOTOPE_FROM:
        return None
    z = FleetZonotope(sc.gen, sc.u_ref)
    return z if z.usable else None


def shortfall_words(shortfall: np.ndarray, units: DisplayUnits) -> str:
    """What the tugs would need on top of what they give, in words and display units.

    ``shortfall`` is (force ahead, force to port, moment about the centroid), N and N*m;
    a part that is nothing but rounding is met (:func:`solve_pulls` leaves either the
    force or the yaw moment met where the fleet can, and the words say which).
    """
    fx, fy, m = (float(v) for v in shortfall)
    parts = []
    tol_f = 1e-9 * (abs(fx) + abs(fy)) + 1e-6
    force_met = abs(fx) <= tol_f and abs(fy) <= tol_f
    moment_met = abs(m) <= 1e-6
    if abs(fx) > tol_f:
        parts.append(f"{_amount(abs(fx), 'force', units)} more {'ahead' if fx > 0 else 'astern'}")
    if abs(fy) > tol_f:
        parts.append(
            f"{_amount(abs(fy), 'force', units)} more to {'port' if fy > 0 else 'starboard'}"
        )
    if not moment_met:
        side = "port" if m > 0 else "starboard"
        parts.append(f"{_amount(abs(m), 'moment', units)} more swinging the bow to {side}")
    if not parts:
        return "nothing missing"
    met = ""
    if force_met:
        met = ", with the force met"
    elif moment_met:
        met = ", with the yaw moment met"
    return "needs " + ", ".join(parts) + met


def _amount(value_si: float, quantity: Literal["force", "moment"], units: DisplayUnits) -> str:
    """``value_si`` in the display unit, with as many decimals as it takes to show its first
    significant digit (390 N in tonnes-force: "0.04 t", never "0.0 t" nor a switch to N)."""
    v = abs(units.value(value_si, quantity))
    digits = 1 if v == 0 or v >= 0.095 else min(-math.floor(math.log10(v)), 12)
    return units.show(value_si, quantity, digits)
