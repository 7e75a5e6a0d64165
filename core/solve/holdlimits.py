"""The hold limits plot: the highest wind (or current) the fleet can hold from each direction.

For the flow from each true direction b (the other flow as set), the largest s with

    sum_i w_i = target - tau_fixed - s tau_unit(b),   w_i in W_i

where W_i is tug i's set of wrenches (force ahead, force to port, moment about the
centroid) within its working sector and capability (core.mechanics.tugsets; with the
lead as set, the segment up to its usable pull), ``target`` the stage goal's wrench
(zero for a hold; a walk's force, a swing's moment: "the highest wind at which the goal
can still be met"), tau_fixed the other flow's load as set and tau_unit(b) the swept
flow's load at 1 m/s. Loads grow with the square of speed, so the limiting speed is
V_max = sqrt(s) m/s, in the same measure as the stage's (for wind: the mean at its
stated height, with its gust factor). This is a quasi-static force balance with a
co-linear environment raised until the pulls just hold it, swept over directions (as
in DNV-ST-0111's level 1 capability assessment).

Each tug's polygon is cut off where its line would pass its fitting's rating, as in
the solve; where several tugs share a fitting its rating is shared out among them in
proportion to their usable pulls (core.mechanics.fittings.pull_limits_n), which never
lets the fitting pass its rating but may hold a little less than the solve finds.

The fleet's set is the Minkowski sum of the tugs' polygons; its half-spaces are worked
out once (core.solve.polytope) and every direction's ray is cut with them at once with
numpy. With one tug lost the same half-spaces serve, less that tug's part.

A limit is "held up to V": every lighter wind from that direction is held too. The winds
s (s ~ V^2) at which the goal is met along one direction's ray form an interval; it
starts at calm (s = 0) only when the goal is met with no swept flow at all (the start
lies in the set). When it does not (the wind must help the tugs, as it may in a walk,
or with a tug lost), the goal is met only in a band of winds and no wind is held from
calm: the limit is 0, and :attr:`HoldLimits.calm_fails` names the tugs whose loss
does that. Whether the start lies in the fine set is tested on the coarse set's
half-spaces first (inside them: inside), then the fine set's supports on the same
normals (outside them: outside), and only in between by a linear programme.

"Met" is judged as the solve and the tug lost check judge it: within the goal's
tolerance (core.solve.pulls.tolerance_of, worked out for the stage's flows as planned),
so a load too small to count (a current of a tenth of a knot that no tug lost can
answer) does not make a limit of 0 beside a tug lost check that holds. The tolerance is
a box (+-tol on the force ahead, the force to port and the moment) added to the fleet's
set as two more polygons the sweep treats as tugs that are never lost: a square of
forces at the centroid, and a force 10^5 arms away whose moment is the box's moment
side (its force, 10^-5 of the force tolerance, is a hair of slack).
"""

from __future__ import annotations

import math
from collections.abc import Generator
from dataclasses import dataclass, replace
from typing import Literal, TypeVar

import numpy as np

from core.mechanics.balance import TugLayout, tug_layout
from core.mechanics.bodies import stage_body
from core.mechanics.fittings import pull_limits_n
from core.mechanics.loads import (
    body_conditions,
    current_model,
    flow_angle_rad,
    loads_wrench,
    wind_model,
)
from core.mechanics.tugsets import SECTOR_STEP_DEG, tug_sets
from core.model.goals import GOAL_WORDS, Goal
from core.model.plan import Project, Stage
from core.solve.lp import solve_lp
from core.solve.polytope import (
    Exit,
    Facets,
    WrenchPolygons,
    clean_faces,
    exits_below,
    facets,
    ray_exit,
    support_parts,
    worst_lost_exit,
    zonotope_normals,
)
from core.solve.pulls import tolerance_of
from core.solve.reach import Reach
from core.solve.walk import nudged_triangles, set_size, walk
from core.units import DisplayUnits, fmt

__all__ = [
    "HoldLimits",
    "HoldLimitsProblem",
    "above_words",
    "hold_limits",
    "hold_limits_problem",
    "limit_at",
    "limit_cell",
    "limit_words",
    "live_hold_limits",
    "live_hold_limits_steps",
    "run_steps",
    "shown_limit",
    "zonotope_normals",
]

Flow = Literal["wind", "current"]
T = TypeVar("T")
#: Work done in steps: the generator yields between its parts (each a few ms at two dozen
#: tugs, so a program's event loop can run between them) and returns the result.
Steps = Generator[None, None, T]
KNOT = 1852.0 / 3600.0
#: The sweep is first made with sector polygons this many times coarser (core.solve.walk).
SWEEP_NEST = 3
#: Limits above these are shown as "above N" (a number beyond them says nothing more).
SHOWN_UP_TO_MS: dict[str, float] = {"wind": 60.0 * KNOT, "current": 8.0 * KNOT}
#: A flow's load per (m/s)^2 shorter than this, in the sweep's scaled units (the largest
#: tug's pull is 1) times the reach of the pulls and the fixed load, is taken as none:
#: its limit would lie above 10^6 m/s.
_NO_LOAD = 1e-12


@dataclass(frozen=True, slots=True, eq=False)
class HoldLimitsProblem:
    """One body in one stage, ready for the sweep over directions (D directions).

    ``fixed`` is the load that stays as set (the current, when the wind is swept);
    ``target`` what tugs and loads together must give (the stage's goal). ``coarse``
    holds the tugs' polygons with :data:`SWEEP_NEST` times fewer sector vertices, each
    one a vertex of ``shapes`` (None: the same as ``shapes``). ``tolerance`` (3,) is how
    much of (force ahead, force to port, moment), N and N*m, may be missing with the
    goal met (None: none at all).
    """

    stage: str
    body: str
    heading_deg: float
    tugs: tuple[str, ...]  # (n,)
    shapes: WrenchPolygons  # each tug's reachable forces and its arm
    fixed: np.ndarray  # (3,) the load that stays as set
    wind_unit: np.ndarray  # (3, D): the swept flow's load at 1 m/s of the stage's measure
    directions_deg: np.ndarray  # (D,) true bearings the flow comes from (wind) or sets to
    length_m: float
    target: np.ndarray | None = None  # (3,) the goal's wrench; None: hold (zero)
    flow: Flow = "wind"
    goal_kind: str = "hold"
    coarse: WrenchPolygons | None = None
    tolerance: np.ndarray | None = None

    @property
    def generators(self) -> np.ndarray:
        """(3, n) each tug's wrench at its usable pull, for tugs at their leads as set
        (the far end of each segment)."""
        cols = []
        for i, poly in enumerate(self.shapes.polygons):
            if not len(poly):
                cols.append(np.zeros(3))
                continue
            far = poly[int(np.argmax(np.hypot(poly[:, 0], poly[:, 1])))]
            cols.append(self.shapes.wrench(i, far)[:, 0])
        return np.array(cols).T if cols else np.zeros((3, 0))

    @property
    def start(self) -> np.ndarray:
        """(3,) what the tugs must give with no swept flow: the goal less the fixed load."""
        t = np.zeros(3) if self.target is None else self.target
        return t - self.fixed

    def scaled(self, factor: float) -> HoldLimitsProblem:
        """Every usable pull times ``factor`` (for what-if and for checks)."""
        coarse = None if self.coarse is None else self.coarse.scaled(factor)
        return replace(self, shapes=self.shapes.scaled(factor), coarse=coarse)

    def without(self, tug: str) -> HoldLimitsProblem:
        i = self.tugs.index(tug)
        coarse = None if self.coarse is None else self.coarse.without(i)
        return replace(
            self,
            tugs=self.tugs[:i] + self.tugs[i + 1 :],
            shapes=self.shapes.without(i),
            coarse=coarse,
        )


def _flow_unit(
    project: Project, stage: Stage, body_name: str, flow: Flow, dirs: np.ndarray
) -> tuple[np.ndarray, np.ndarray]:
    """(unit loads (3, D) of the swept flow, fixed load (3,) of the other as set)."""
    b = stage_body(project, stage, body_name)
    c = stage.conditions
    heading = stage.pose_of(b.name).heading_deg

    def wind_of(angles: np.ndarray) -> np.ndarray:
        wind = wind_model(b, c)
        return wind.wrenches(angles, b.centroid)

    def current_of(angles: np.ndarray) -> np.ndarray:
        cm = current_model(b, c)
        return cm.wrenches(angles, b.centroid)

    if flow == "wind":
        # 1 m/s of the stage's wind measure is (gust / height factor) m/s at 10 m in the load.
        design_per_ms = c.gust_factor / (c.wind_height_m / 10.0) ** c.wind_exponent
        rel = (dirs + 180.0 - heading) % 360.0
        unit = wind_of(-np.radians(rel)) * design_per_ms**2
        fixed = np.zeros(3)
        if c.current_speed_ms > 0:
            ang = np.array([flow_angle_rad(c.current_towards_deg, heading)])
            fixed = current_of(ang)[:, 0] * c.current_speed_ms**2
        return unit, fixed
    rel = (dirs - heading) % 360.0  # the current sets towards each direction
    unit = current_of(-np.radians(rel))
    fixed = np.zeros(3)
    if c.wind_speed_ms > 0:
        ang = np.array([flow_angle_rad(c.wind_from_deg + 180.0, heading)])
        fixed = wind_of(ang)[:, 0] * c.design_wind_ms**2
    return unit, fixed


def hold_limits_problem(
    project: Project,
    stage: Stage,
    body: str | None = None,
    *,
    directions_deg: np.ndarray | None = None,
    layout: TugLayout | None = None,
    flow: Flow = "wind",
    goal: Goal | None = None,
    sector_step_deg: float = SECTOR_STEP_DEG,
) -> HoldLimitsProblem:
    """Describe the sweep; raises InputError when a needed area cannot be found.

    ``flow`` is the one swept ("wind", or "current" with the wind as set); ``goal``
    defaults to the stage's (a hold when it has none). ``layout`` may lend the body's
    tug layout already worked out for this stage.
    """
    b = stage_body(project, stage, body)
    if layout is None:
        layout = tug_layout(project, stage, b)
    heading = stage.pose_of(b.name).heading_deg
    dirs = np.arange(360.0) if directions_deg is None else np.asarray(directions_deg, float)
    unit, fixed = _flow_unit(project, stage, b.name, flow, dirs)
    # The fittings' ratings bound the pulls as in the solve; a rating several tugs share
    # is shared out among them (each tug's set stays its own, as the sweep needs).
    limits = pull_limits_n(layout, split_shared=True)
    sets = tug_sets(layout, b.centroid, step_deg=sector_step_deg, nest=SWEEP_NEST, limits_n=limits)
    g = goal or stage.goal or Goal("hold")
    coarse = None
    if sets.sectors.any():
        rough = tug_sets(layout, b.centroid, step_deg=sector_step_deg * SWEEP_NEST, limits_n=limits)
        coarse = WrenchPolygons(rough.polygons, rough.arms())
    target = np.asarray(g.target(), dtype=float)
    # "met" as the tug lost check has it: within the tolerance of what the tugs must
    # supply with the stage's flows as planned
    planned = loads_wrench(body_conditions(stage, b).loads, b.centroid)
    strongest = max(
        (float(np.hypot(p[:, 0], p[:, 1]).max()) for p in sets.polygons if len(p)), default=0.0
    )
    return HoldLimitsProblem(
        stage=stage.name,
        body=b.name,
        heading_deg=heading,
        tugs=tuple(p.tug for p in layout.placements),
        shapes=WrenchPolygons(sets.polygons, sets.arms()),
        fixed=fixed,
        wind_unit=unit,
        directions_deg=dirs,
        length_m=b.length,
        target=target,
        flow=flow,
        goal_kind=g.kind,
        coarse=coarse,
        tolerance=tolerance_of(target - planned, b.length, strongest),
    )


@dataclass(frozen=True, slots=True, eq=False)
class HoldLimits:
    """Limiting speed per direction, m/s, all tugs and with the worst one tug lost.

    A limit V means the goal is met for every speed of the flow from 0 up to V from that
    direction. A speed of 0 means no flow from there is held from calm: the fleet cannot
    meet the goal against any flow from that direction, or cannot meet it in calm at all.
    When the fleet cannot meet it with the other flow alone (``holds_current`` False),
    the swept flow from some directions may help: there the goal is met only between
    ``all_tugs_min_ms`` and ``all_tugs_max_ms``, and the limit is 0 from every
    direction. ``calm_fails`` names the tugs whose loss leaves the goal unmet in calm
    (the other flow as set): with any of them lost the worst-lost limit is 0 from
    every direction. Without the tug lost sweep (``with_lost`` False) the worst-lost
    curve is zero and names no tug.
    """

    problem: HoldLimitsProblem
    all_tugs_ms: np.ndarray  # (D,)
    worst_lost_ms: np.ndarray  # (D,) the limit with the worst single tug lost
    worst_lost_index: np.ndarray  # (D,) which tug's loss sets it (index into problem.tugs)
    holds_current: bool  # the goal is met with none of the swept flow (the other as set)
    all_tugs_min_ms: np.ndarray | None = None  # (D,) below this the fixed load wins (all tugs)
    with_lost: bool = True
    all_tugs_max_ms: np.ndarray | None = None  # (D,) the top of that band (all tugs)
    calm_fails: tuple[str, ...] = ()  # tugs whose loss leaves the goal unmet in calm

    @property
    def flow(self) -> Flow:
        return self.problem.flow

    @property
    def worst_lost_tug(self) -> tuple[str, ...]:
        """(D,) which tug's loss sets the worst-lost limit, per direction ("" without)."""
        if not self.with_lost:
            return tuple("" for _ in self.all_tugs_ms)
        return tuple(self.problem.tugs[i] for i in self.worst_lost_index)

    def lowest(self, curve: np.ndarray | None = None) -> tuple[float, float]:
        """(direction deg, speed m/s) of the lowest limit of a curve (default: all tugs)."""
        v = self.all_tugs_ms if curve is None else curve
        i = int(np.argmin(v))
        return float(self.problem.directions_deg[i]), float(v[i])

    def alike_all_round(self, curve: np.ndarray | None = None) -> bool:
        """Every direction of a curve (default: all tugs) reads alike, "above" or 0, so
        that no direction is the lowest: every view then names none."""
        v = self.all_tugs_ms if curve is None else curve
        shown = [shown_limit(float(x), self.flow) for x in v]
        return bool(shown) and (
            all(s is None for s in shown) or all(s is not None and s <= 0 for s in shown)
        )

    def lowest_words(
        self, units: DisplayUnits, curve: np.ndarray | None = None, mark: str = " true"
    ) -> str:
        """The lowest limit of a curve (default: all tugs) and where it is, as every view
        says it: "46.7 kn from 171 true" (``mark`` after the bearing: " true", "°", "°T";
        a current's "setting to"). Where every direction reads alike it says so, naming
        none: "0 from every direction", "above 60.0 kn from every direction"."""
        where = "from" if self.flow == "wind" else "setting to"
        if self.alike_all_round(curve):
            v = self.all_tugs_ms if curve is None else curve
            if shown_limit(float(v[0]), self.flow) is None:
                return f"{limit_words(math.inf, units, self.flow)} from every direction"
            return "0 from every direction"
        d, low = self.lowest(curve)
        return f"{limit_words(low, units, self.flow)} {where} {d:03.0f}{mark}"

    def _aim(self) -> str:
        kind = self.problem.goal_kind
        if kind == "hold":
            return "hold the body"
        return f"meet the goal ({GOAL_WORDS[kind].split(':')[0]})"

    def meaning(self) -> str:
        """What a limit means, in words every view prints with it."""
        if self.problem.goal_kind == "hold":
            return f"the highest {self.flow} held, from calm up"
        return f"the highest {self.flow} up to which the tugs {self._aim()}, from calm up"

    def calm_words(self) -> str:
        """The goal not met even in calm, in words ("" when it is met): all tugs, or
        which tugs' loss. Every view says it with these words."""
        other = "current" if self.flow == "wind" else "wind"
        aim = self._aim()
        if not self.holds_current:
            return (
                f"The tugs cannot {aim} with no {self.flow} (the {other} as set): no {self.flow} "
                f"is held from calm, the limit is 0 from every direction"
            )
        if self.with_lost and self.calm_fails:
            return (
                f"With {' or '.join(self.calm_fails)} lost the tugs cannot {aim} even with no "
                f"{self.flow} (the {other} as set): the limit with the worst tug lost is 0 from "
                "every direction"
            )
        return ""


def _scales(problem: HoldLimitsProblem) -> np.ndarray:
    big = max((float(np.abs(p).max()) for p in problem.shapes.polygons if len(p)), default=0.0)
    u = big or 1.0
    return np.array([1.0, 1.0, 1.0 / max(problem.length_m, 1.0)]) / u


def _scaled_shapes(shapes: WrenchPolygons, sc: np.ndarray) -> WrenchPolygons:
    """The polygons in scaled rows: forces x sc[0], arms so that moments come x sc[2]."""
    k = sc[2] / sc[0]  # the moment row is scaled by 1 / length more than the forces
    return WrenchPolygons(tuple(p * sc[0] for p in shapes.polygons), shapes.arms * k)


@dataclass(frozen=True, slots=True, eq=False)
class _Sweep:
    fac: Facets  # half-spaces of the coarse set
    parts: np.ndarray  # (P, n)
    start: np.ndarray  # (3,)
    rays: np.ndarray  # (3, D)
    full: Exit  # the coarse set's exits
    s_out: np.ndarray  # (D,) the exits carried to the fine set
    shapes: WrenchPolygons  # fine, scaled (the tolerance's polygons last)
    coarse: WrenchPolygons  # coarse, scaled (the same object when nothing is coarser)
    calm: bool  # the start lies in the fine set: the goal is met with no swept flow
    tugs: int  # the polygons that are tugs (the first ones; the rest are the tolerance's)

    @property
    def normals(self) -> np.ndarray:
        return self.fac.normals


def run_steps(steps: Steps[T]) -> T:
    """Run work done in steps (see :data:`Steps`) to its end; its result."""
    while True:
        try:
            next(steps)
        except StopIteration as done:
            return done.value  # type: ignore[no-any-return]


def _sweep(problem: HoldLimitsProblem) -> _Sweep:
    return run_steps(_sweep_steps(problem))


def _sweep_steps(problem: HoldLimitsProblem) -> Steps[_Sweep]:
    sc = _scales(problem)
    shapes = _scaled_shapes(problem.shapes, sc)
    coarse = shapes if problem.coarse is None else _scaled_shapes(problem.coarse, sc)
    start = problem.start * sc
    n = shapes.n
    if problem.tolerance is not None and np.all(np.asarray(problem.tolerance) > 0):
        box, shift = _tolerance_box(np.asarray(problem.tolerance) * sc, shapes.arms)
        same = coarse is shapes
        shapes = _joined(shapes, box)
        coarse = shapes if same else _joined(coarse, box)
        start = start + shift
    rays = -problem.wind_unit * sc[:, None]
    # a flow whose load is nothing beside the pulls (a coefficient of 1e-300) is no load:
    # its exit lies beyond any speed shown, and dividing by so short a ray overflows
    reach = 1.0 + len(shapes.polygons) + float(np.abs(start).max(initial=0.0))
    rays[:, np.linalg.norm(rays, axis=0) < _NO_LOAD * reach] = 0.0
    fac = facets(coarse)
    yield
    parts = support_parts(fac.normals, coarse)
    full = ray_exit(fac.normals, parts.sum(axis=1), start, rays)
    s_out = full.s_out
    if coarse is not shapes and full.inside:
        yield
        s_out = _refine(shapes, coarse, fac, full.facet, start, rays, s_out)
    calm = full.inside or _holds_start(fac.normals, shapes, start)
    return _Sweep(fac, parts, start, rays, full, s_out, shapes, coarse, calm, n)


#: The tolerance box's moment side is a force this many times the fleet's longest arm
#: (scaled) from the centroid: a hair of force, 1e-5 of the force tolerance or less.
_BOX_ARM = 1e5


def _tolerance_box(tol: np.ndarray, arms: np.ndarray) -> tuple[WrenchPolygons, np.ndarray]:
    """The goal's tolerance ``tol`` (3,) (scaled rows) as polygons to add to the fleet's
    set, and the shift (3,) to add to the start: the box +-tol is the square of forces
    [0, 2 tol_x] x [0, 2 tol_y] at the centroid plus a force [0, 2a] to port a long arm
    ahead (moment [0, 2 tol_m]), less half of each. Polygons must hold the origin as a
    vertex (core.solve.polytope), hence the shift."""
    tx, ty, tm = (float(v) for v in tol)
    arm = _BOX_ARM * (1.0 + float(np.abs(arms).max(initial=0.0)))
    a = tm / arm
    square = np.array([[0.0, 0.0], [2 * tx, 0.0], [2 * tx, 2 * ty], [0.0, 2 * ty]])
    segment = np.array([[0.0, 0.0], [0.0, 2 * a]])
    box = WrenchPolygons((square, segment), np.array([[0.0, 0.0], [arm, 0.0]]))
    return box, np.array([tx, ty + a, tm])


def _joined(a: WrenchPolygons, b: WrenchPolygons) -> WrenchPolygons:
    return WrenchPolygons(a.polygons + b.polygons, np.vstack([a.arms, b.arms]))


def _holds_start(normals: np.ndarray, shapes: WrenchPolygons, start: np.ndarray) -> bool:
    """Whether ``start`` (3,) lies in the fleet's set ``shapes`` (scaled), for a start
    outside a coarser set whose half-spaces have ``normals`` (P, 3): outside the fine set's
    supports on those normals it lies outside; else a linear programme says (each tug's
    wrench a share of its polygon's vertices, the shares at most 1 together)."""
    if len(normals):
        fine = support_parts(normals, shapes).sum(axis=1)
        if np.any(normals @ start > fine + _SLACK + _SLACK * np.abs(fine)):
            return False
    verts, tug = shapes.vertices()  # (3, K), (K,)
    n, k = shapes.n, verts.shape[1]
    a = np.zeros((3 + n, k + n))
    a[:3, :k] = verts
    a[3 + tug, np.arange(k)] = 1.0
    a[3:, k:] = np.eye(n)  # each tug's share left unused (its polygon holds the origin)
    b = np.concatenate([start, np.ones(n)])
    got = solve_lp(np.zeros(k + n), a, b, np.ones(k + n))
    return got.ok


def _refine(
    shapes: WrenchPolygons,
    coarse: WrenchPolygons,
    fac: Facets,
    facet: np.ndarray,
    start: np.ndarray,
    rays: np.ndarray,
    s: np.ndarray,
    lost: np.ndarray | None = None,
) -> np.ndarray:
    """The coarse exits (D,) carried to the fine set by walking from the coarse faces."""
    d = rays.T  # (D, 3)
    st = np.broadcast_to(start, d.shape)
    # the walk moves each line a hair sideways (core.solve.walk)
    tri, ok, w = nudged_triangles(coarse, fac, facet, st, d, s, lost, set_size(shapes))
    out = s.copy()
    if ok.any():
        idx = np.flatnonzero(ok)
        lost_i = None if lost is None else lost[idx]
        s_fine, _, _ = walk(shapes, st[idx], d[idx], tri[idx], lost_i, w[idx])
        good = np.isfinite(s_fine)
        out[idx[good]] = np.maximum(s[idx[good]], s_fine[good])
    # where the coarse face gave no triangle (an exit on an edge or a corner of the set),
    # the ray's own first triangle and walk, one ray at a time
    for j in np.flatnonzero(~ok & (facet >= 0) & np.isfinite(s)):
        rest = shapes if lost is None or lost[j] < 0 else shapes.without(int(lost[j]))
        got = Reach(rest, (float(start[0]), float(start[1]), float(start[2]))).exit(
            (float(d[j, 0]), float(d[j, 1]), float(d[j, 2]))
        )
        if got is not None and math.isfinite(got[0]):
            out[j] = max(out[j], got[0])
    return out


def _worst_lost(sw: _Sweep, every: int = 1) -> tuple[np.ndarray, np.ndarray, tuple[int, ...]]:
    return run_steps(_worst_lost_steps(sw, every))


def _worst_lost_steps(
    sw: _Sweep, every: int = 1
) -> Steps[tuple[np.ndarray, np.ndarray, tuple[int, ...]]]:
    """The sweep with the worst one tug lost, on every ``every``-th direction: (D',) the
    load factor, (D',) the tug whose loss sets it, and the tugs whose loss leaves the goal
    unmet with none of the swept flow (their limit is 0 from every direction).

    Tugs whose loss leaves the start inside a solid set share the fleet's half-spaces
    (core.solve.polytope.worst_lost_exit: one cut for all of them); on finer polygons the
    worst tug's exit is walked out to the fine set, and then any other tug whose coarse
    exit lies below that, since on the fine set it may be the worst. The rest (a loss
    that leaves the start outside, or flattens the set) are swept one by one.
    """
    rays = sw.rays[:, ::every]
    n = sw.tugs  # the tolerance's polygons are never lost
    d = rays.shape[1]
    worst = np.full(d, np.inf)
    who = np.zeros(d, dtype=int)
    if not n:
        return np.zeros(d), who, ()
    if not sw.calm:  # not met in calm with every tug: nor with any one lost
        return np.zeros(d), who, tuple(range(n))
    full = sw.full
    if every != 1:
        full = Exit(full.s_out[::every], full.s_in[::every], full.inside, full.facet[::every])
    normals = sw.normals
    support = sw.parts.sum(axis=1)
    slack = (support - normals @ sw.start)[:, None] - sw.parts  # (P, n)
    inside = slack.min(axis=0)[:n] >= -1e-9
    solid = _ranks_without_each(sw.coarse)[:n] == 3
    fast = np.flatnonzero(inside & solid & full.inside)
    if len(fast):
        yield
        worst, who, facet = worst_lost_exit(normals, sw.parts, sw.start, rays, fast)
        if sw.coarse is not sw.shapes:
            yield
            worst, who = _refine_worst(sw, rays, fast, worst, who, facet)
    fails: list[int] = []
    for k in np.flatnonzero(~np.isin(np.arange(n), fast)):
        yield
        row, calm = _lost_alone(sw, int(k), rays, support, solid[k])
        if not calm:
            fails.append(int(k))
            row = np.zeros(d)
        lower = row < worst
        worst = np.where(lower, row, worst)
        who = np.where(lower, k, who)
    if fails:  # a loss that fails in calm is named where it sets the (zero) limit
        who = np.full(d, fails[0])
    return worst, who, tuple(fails)


def _refine_worst(
    sw: _Sweep,
    rays: np.ndarray,
    fast: np.ndarray,
    s_c: np.ndarray,
    who: np.ndarray,
    facet: np.ndarray,
) -> tuple[np.ndarray, np.ndarray]:
    """The coarse worst-lost exits (D,) made fine: the worst tug's walked out first; then
    every other tug whose coarse exit (a lower bound of its fine one) lies below that."""
    owners = sw.fac.owners()
    normals, parts, start = sw.normals, sw.parts, sw.start
    faces = clean_faces(normals, parts, start, rays, facet, who, owners)
    upper = _refine(sw.shapes, sw.coarse, sw.fac, faces, start, rays, s_c, who)
    s_j, which = exits_below(normals, parts, start, rays, fast, upper, owners)
    col, ray = np.nonzero((s_j < upper[None, :]) & (fast[:, None] != who[None, :]))
    out, out_who = upper.copy(), who.copy()
    if len(ray):
        tug = fast[col]
        fine = _refine(
            sw.shapes, sw.coarse, sw.fac, which[col, ray], start, rays[:, ray], s_j[col, ray], tug
        )
        order = np.lexsort((tug, fine, ray))  # per ray, the least first (ties: lower tug)
        ray, fine, tug = ray[order], fine[order], tug[order]
        first = np.r_[True, ray[1:] != ray[:-1]]
        ray, fine, tug = ray[first], fine[first], tug[first]
        lower = fine < out[ray]
        out[ray[lower]] = fine[lower]
        out_who[ray[lower]] = tug[lower]
    return out, out_who


def _lost_alone(
    sw: _Sweep, k: int, rays: np.ndarray, support: np.ndarray, solid: bool
) -> tuple[np.ndarray, bool]:
    """(D',) the sweep with tug k lost, on its own (its loss leaves the start outside the
    fleet's set, or flattens it), and whether the start lies in the set without it."""
    finer = sw.coarse is not sw.shapes
    fine = sw.shapes.without(k)
    if solid:
        ex = ray_exit(sw.normals, support - sw.parts[:, k], sw.start, rays)
        if finer and ex.inside:
            lost = np.full(rays.shape[1], k)
            s = _refine(sw.shapes, sw.coarse, sw.fac, ex.facet, sw.start, rays, ex.s_out, lost)
            return s, True
        return ex.s_out, ex.inside or _holds_start(sw.normals, fine, sw.start)
    # losing this tug flattens the set: its own half-spaces are needed
    rest = sw.coarse.without(k)
    fac = facets(rest)
    ex = ray_exit(fac.normals, support_parts(fac.normals, rest).sum(axis=1), sw.start, rays)
    if finer and ex.inside:
        return _refine(fine, rest, fac, ex.facet, sw.start, rays, ex.s_out), True
    return ex.s_out, ex.inside or _holds_start(fac.normals, fine, sw.start)


def _ranks_without_each(shapes: WrenchPolygons) -> np.ndarray:
    """(n,) rank of the fleet's wrench set with each tug left out.

    Each tug's columns are set to zero in turn (zero columns leave the singular values as
    they are), so one stacked SVD serves a batch of tugs.
    """
    verts, tug = shapes.vertices()
    n, k = shapes.n, verts.shape[1]
    out = np.zeros(n, dtype=int)
    if k == 0:
        return out
    batch = max(1, _RANK_BATCH // (3 * k))
    for first in range(0, n, batch):
        lost = np.arange(first, min(first + batch, n))
        kept = tug[None, :] != lost[:, None]  # (b, K)
        stack = verts[None, :, :] * kept[:, None, :]  # (b, 3, K)
        sv = np.linalg.svd(stack, compute_uv=False)  # (b, 3)
        ranks = (sv > 1e-9 * np.maximum(sv[:, :1], 1e-300)).sum(axis=1)
        out[lost] = np.where(kept.any(axis=1), ranks, 0)
    return out


#: Elements of the stacked matrices one SVD in _ranks_without_each works at once.
_RANK_BATCH = 500_000


#: A start this far (scaled units) outside the fine set's supports is outside it.
_SLACK = 1e-9


#: Load factors below this (scaled units) are rounding, not a limit: shown as 0.
_S_TINY = 1e-10


def _speed(s: np.ndarray) -> np.ndarray:
    """Limiting speed from the load factor: V = sqrt(s), 0 for rounding below _S_TINY."""
    return np.sqrt(np.where(s < _S_TINY, 0.0, s))


def _limits(
    problem: HoldLimitsProblem,
    sw: _Sweep,
    worst: np.ndarray,
    who: np.ndarray,
    fails: tuple[int, ...],
    with_lost: bool,
) -> HoldLimits:
    """The sweep's limits: held from calm up to the exit, or 0 where calm is not held."""
    top = _speed(sw.s_out)
    band = None if sw.calm else (_speed(sw.full.s_in), top)
    return HoldLimits(
        problem,
        top if band is None else np.zeros_like(top),
        _speed(worst),
        who,
        sw.calm,
        None if band is None else band[0],
        with_lost,
        None if band is None else band[1],
        tuple(problem.tugs[i] for i in fails) if with_lost else (),
    )


def hold_limits(problem: HoldLimitsProblem, *, with_lost: bool = True) -> HoldLimits:
    """Sweep every direction, all tugs and (``with_lost``) the worst one tug lost."""
    sw = _sweep(problem)
    d = sw.rays.shape[1]
    with_lost = with_lost and bool(problem.tugs)
    none: tuple[int, ...] = ()
    worst, who, fails = (
        _worst_lost(sw) if with_lost else (np.zeros(d), np.zeros(d, dtype=int), none)
    )
    return _limits(problem, sw, worst, who, fails, with_lost)


def live_hold_limits(
    problem: HoldLimitsProblem, lost_step: int = 2
) -> tuple[HoldLimits, np.ndarray, np.ndarray]:
    """For a plot that follows the mouse: all tugs on every direction of ``problem``, the
    worst tug lost on every ``lost_step``-th (0: not at all), from one set of half-spaces.

    Returns (limits without the tug lost sweep, lost directions (D',), worst lost m/s (D',)).
    """
    return run_steps(live_hold_limits_steps(problem, lost_step))


def live_hold_limits_steps(
    problem: HoldLimitsProblem, lost_step: int = 2
) -> Steps[tuple[HoldLimits, np.ndarray, np.ndarray]]:
    """:func:`live_hold_limits` in steps (see :data:`Steps`): the same work, cut where a
    program may let its event loop run (a plot that follows a drag sweeps between the
    mouse's moves, a few ms at a time)."""
    sw = yield from _sweep_steps(problem)
    d = sw.rays.shape[1]
    limits = _limits(problem, sw, np.zeros(d), np.zeros(d, dtype=int), (), False)
    if lost_step <= 0:
        return limits, problem.directions_deg[:0], np.zeros(0)
    k = int(lost_step)
    yield
    worst, _, _ = yield from _worst_lost_steps(sw, k)
    return limits, problem.directions_deg[::k], _speed(worst)


def limit_at(limits: HoldLimits, wind_from_deg: float, curve: np.ndarray | None = None) -> float:
    """The limit for the flow from ``wind_from_deg`` (linear between swept directions)."""
    v = limits.all_tugs_ms if curve is None else curve
    d = limits.problem.directions_deg
    if not np.all(np.isfinite(v)):
        return float(v[int(np.argmin(np.abs((d - wind_from_deg + 180) % 360 - 180)))])
    return float(np.interp(wind_from_deg % 360.0, np.append(d, d[0] + 360.0), np.append(v, v[0])))


def shown_limit(speed_ms: float, flow: Flow = "wind") -> float | None:
    """A limit as every view reports it: the speed, m/s, or None when it lies above
    :data:`SHOWN_UP_TO_MS` (or is unbounded), said as "above N" (a figure beyond that
    says nothing a planner can use)."""
    if not math.isfinite(speed_ms) or speed_ms > SHOWN_UP_TO_MS[flow]:
        return None
    return max(float(speed_ms), 0.0)


def limit_cell(speed_ms: float, units: DisplayUnits, flow: Flow = "wind") -> str:
    """A limit in a table cell, display units, no unit: "12.3", or "above" beyond
    :data:`SHOWN_UP_TO_MS` (the table says how far that is: :func:`above_words`)."""
    v = shown_limit(speed_ms, flow)
    return "above" if v is None else fmt(units.value(v, "speed"), units.digits("speed"))


def above_words(units: DisplayUnits, flow: Flow = "wind") -> str:
    """What "above" in a table of limits means."""
    return f"above: more than {units.show(SHOWN_UP_TO_MS[flow], 'speed')}"


def limit_words(speed_ms: float, units: DisplayUnits, flow: Flow = "wind") -> str:
    """A limit for people: "above 60.0 kn" beyond :data:`SHOWN_UP_TO_MS`, else the speed.

    A limit of zero is "0 kn (not held)": the fleet cannot meet the goal against any of
    that flow from there (or not even in calm).
    """
    v = shown_limit(speed_ms, flow)
    if v is None:
        return f"above {units.show(SHOWN_UP_TO_MS[flow], 'speed')}"
    if v <= 0:
        return f"{units.show(0.0, 'speed')} (not held)"
    return units.show(v, "speed")
