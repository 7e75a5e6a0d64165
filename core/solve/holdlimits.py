"""The hold limits plot: the highest wind the fleet can hold from each direction.

For wind from each true direction b (the current as set), the largest s with

    B f + tau_current + s tau_wind(b) = 0,   0 <= f_i <= u_i

where B (3 x n) holds each tug's force ahead, force to port and yaw moment about the
centroid per newton of pull (at the leads as set), u_i the usable pulls and
tau_wind(b) the wind's load at 1 m/s. Wind load grows with the square of speed, so
the limiting wind is V_max = sqrt(s) m/s, in the same measure as the stage's wind
(mean speed at its stated height, with its gust factor). This is a quasi-static
force balance with a co-linear environment raised until the pulls just hold it,
swept over directions (as in DNV-ST-0111's level 1 capability assessment).

The method: the set of tug wrenches {B f : 0 <= f <= u} is a zonotope, the
Minkowski sum of the segments [0, u_i b_i]. Its facet normals are among the cross
products of pairs of generators, so its half-spaces n.x <= h(n), with
h(n) = sum_i max(0, n . u_i b_i), are enumerated once (O(n^2)); the limit for every
direction is then the exit of the ray -tau_current - s tau_wind(b) from the
zonotope, for all directions at once with numpy. With one tug lost, the same normals
serve (every normal gives a valid half-space, and the facet normals of the smaller
zonotope are among them), with h less that tug's part.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np

from core.mechanics.balance import TugLayout, tug_layout
from core.mechanics.bodies import stage_body
from core.mechanics.forces import moment_of
from core.mechanics.loads import current_model, flow_angle_rad, wind_model
from core.model.plan import Project, Stage

_SLACK_TOL = 1e-9  # scaled units: how far outside the zonotope still counts as inside
_DEN_TOL = 1e-10  # a ray this close to parallel to a facet does not leave through it


@dataclass(frozen=True, slots=True, eq=False)
class HoldLimitsProblem:
    """One body in one stage, ready for the sweep over wind directions (D directions)."""

    stage: str
    body: str
    heading_deg: float
    tugs: tuple[str, ...]  # (n,)
    generators: np.ndarray  # (3, n): each tug's wrench at its usable pull, N and N*m
    fixed: np.ndarray  # (3,) the current's load (and any other fixed load)
    wind_unit: np.ndarray  # (3, D): wind load at 1 m/s of the stage's wind measure
    directions_deg: np.ndarray  # (D,) true bearings the wind blows from
    length_m: float

    def scaled(self, factor: float) -> HoldLimitsProblem:
        """Every usable pull times ``factor`` (for what-if and for checks)."""
        return replace(self, generators=self.generators * factor)

    def without(self, tug: str) -> HoldLimitsProblem:
        i = self.tugs.index(tug)
        return replace(
            self,
            tugs=self.tugs[:i] + self.tugs[i + 1 :],
            generators=np.delete(self.generators, i, axis=1),
        )


def hold_limits_problem(
    project: Project,
    stage: Stage,
    body: str | None = None,
    *,
    directions_deg: np.ndarray | None = None,
    layout: TugLayout | None = None,
) -> HoldLimitsProblem:
    """Describe the sweep; raises InputError when the wind area cannot be found.

    ``layout`` may lend the body's tug layout already worked out for this stage."""
    b = stage_body(project, stage, body)
    if layout is None:
        layout = tug_layout(project, stage, b)
    c = stage.conditions
    heading = stage.pose_of(b.name).heading_deg
    dirs = np.arange(360.0) if directions_deg is None else np.asarray(directions_deg, float)
    wind = wind_model(b, c)
    # 1 m/s of the stage's wind measure is (gust / height factor) m/s at 10 m in the load.
    design_per_ms = c.gust_factor / (c.wind_height_m / 10.0) ** c.wind_exponent
    rel = (dirs + 180.0 - heading) % 360.0
    wind_unit = wind.wrenches(-np.radians(rel), b.centroid) * design_per_ms**2
    fixed = np.zeros(3)
    if c.current_speed_ms > 0:
        cm = current_model(b, c)
        fx, fy = cm.force(c.current_speed_ms, flow_angle_rad(c.current_towards_deg, heading))
        fixed = np.array([fx, fy, moment_of(cm.point, (fx, fy), b.centroid)])
    gens = layout.unit_effects(b.centroid) * layout.usable_n  # (3, n)
    return HoldLimitsProblem(
        stage=stage.name,
        body=b.name,
        heading_deg=heading,
        tugs=tuple(p.tug for p in layout.placements),
        generators=gens,
        fixed=fixed,
        wind_unit=wind_unit,
        directions_deg=dirs,
        length_m=b.length,
    )


@dataclass(frozen=True, slots=True, eq=False)
class HoldLimits:
    """Limiting wind speed per direction, m/s, all tugs and with each tug lost.

    A speed of 0 means the fleet cannot hold the body against any wind from that
    direction. When the fleet cannot hold the current alone (``holds_current`` False),
    a wind from some directions may help: there the body is held only between
    ``all_tugs_min_ms`` and ``all_tugs_ms``.
    """

    problem: HoldLimitsProblem
    all_tugs_ms: np.ndarray  # (D,)
    lost_ms: np.ndarray  # (n, D): row i with tug i lost
    holds_current: bool
    all_tugs_min_ms: np.ndarray | None = None  # (D,) below this the current wins (all tugs)

    @property
    def worst_lost_ms(self) -> np.ndarray:
        """(D,) the limit with the worst single tug lost, per direction."""
        if not len(self.lost_ms):
            return np.zeros_like(self.all_tugs_ms)
        return self.lost_ms.min(axis=0)

    @property
    def worst_lost_tug(self) -> tuple[str, ...]:
        """(D,) which tug's loss sets the worst-lost limit, per direction."""
        if not len(self.lost_ms):
            return tuple("" for _ in self.all_tugs_ms)
        idx = self.lost_ms.argmin(axis=0)
        return tuple(self.problem.tugs[i] for i in idx)

    def lowest(self, curve: np.ndarray | None = None) -> tuple[float, float]:
        """(direction deg, speed m/s) of the lowest limit of a curve (default: all tugs)."""
        v = self.all_tugs_ms if curve is None else curve
        i = int(np.argmin(v))
        return float(self.problem.directions_deg[i]), float(v[i])


def _scales(problem: HoldLimitsProblem) -> np.ndarray:
    u = float(np.abs(problem.generators[:2]).max(initial=0.0)) or 1.0
    return np.array([1.0, 1.0, 1.0 / max(problem.length_m, 1.0)]) / u


def zonotope_normals(gens: np.ndarray) -> np.ndarray:
    """(P, 3) unit normals that include every facet normal of the zonotope of ``gens`` (3, n).

    Cross products of every pair of generators; when the generators span less than
    three dimensions, also the directions out of their span and the crosses with them.
    """
    norms = np.linalg.norm(gens, axis=0)
    big = max(float(norms.max(initial=0.0)), 1e-300)
    g = gens[:, norms > 1e-12 * big].T  # (q, 3)
    if len(g) >= 3:  # the usual case first: the pairs' normals, if the set is solid
        i, j = np.triu_indices(len(g), 1)
        cr = np.cross(g[i], g[j])
        size = np.linalg.norm(cr, axis=1)
        keep = size > 1e-9 * norms[norms > 1e-12 * big][i] * norms[norms > 1e-12 * big][j]
        if keep.any():
            normals = cr[keep] / size[keep, None]
            if float(np.abs(normals @ g.T).max()) > 1e-9 * big:
                return np.vstack([normals, -normals])
    if len(g):
        u, sv, _ = np.linalg.svd(g.T)
        rank = int((sv > 1e-9 * sv[0]).sum())
    else:
        u, rank = np.eye(3), 0
    comp = u[:, rank:].T  # (3 - rank, 3) directions out of the span
    vecs = np.vstack([g, comp])
    i, j = np.triu_indices(len(vecs), 1)
    cr = np.cross(vecs[i], vecs[j])
    size = np.linalg.norm(cr, axis=1)
    scale = np.linalg.norm(vecs[i], axis=1) * np.linalg.norm(vecs[j], axis=1)
    keep = size > 1e-9 * scale
    normals = np.vstack([cr[keep] / size[keep, None], comp])
    return np.vstack([normals, -normals])


def _rank(gens: np.ndarray) -> int:
    if gens.shape[1] == 0:
        return 0
    sv = np.linalg.svd(gens, compute_uv=False)
    return int((sv > 1e-9 * max(float(sv[0]), 1e-300)).sum())


@dataclass(frozen=True, slots=True, eq=False)
class _Rays:
    """The swept rays against one set of half-space normals (P normals, D directions)."""

    den: np.ndarray  # (P, D): n . d
    inv_den: np.ndarray  # (P, D): 1 / (n . d) where the ray leaves through n, else 0
    blocked: np.ndarray  # (P, D): 0 where the ray leaves through n, else inf
    tol: np.ndarray  # (D,) below this |n . d| the ray runs along the half-space's face


def _rays(normals: np.ndarray, rays: np.ndarray) -> _Rays:
    den = normals @ rays
    tol = _DEN_TOL * np.linalg.norm(rays, axis=0)
    leaves = den > tol
    with np.errstate(divide="ignore"):
        inv_den = np.where(leaves, 1.0 / np.where(leaves, den, 1.0), 0.0)
    return _Rays(den, inv_den, np.where(leaves, 0.0, np.inf), tol)


def _exit(
    normals: np.ndarray, support: np.ndarray, start: np.ndarray, r: _Rays
) -> tuple[np.ndarray, np.ndarray, bool]:
    """Where each ray start + s d (s >= 0) is inside {n.x <= h}: (s_out, s_in, start inside).

    s_out is the largest such s and s_in the smallest (both (D,)); where no s >= 0 is
    inside, both are 0. When the start is inside, s_in = 0 everywhere.
    """
    slack = support - normals @ start  # (P,)
    slack[np.abs(slack) < 1e-13] = 0.0  # rounding on faces through the start
    if slack.min(initial=0.0) >= -_SLACK_TOL:
        s_out = (np.maximum(slack, 0.0)[:, None] * r.inv_den + r.blocked).min(axis=0)
        return s_out, np.zeros_like(s_out), True
    # The start is outside (the current alone cannot be held): some wind may help.
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        ratio = slack[:, None] / r.den
    s_out = (np.maximum(slack, 0.0)[:, None] * r.inv_den + r.blocked).min(axis=0)
    enters = r.den < -r.tol
    s_in = np.maximum(np.where(enters, ratio, -np.inf).max(axis=0, initial=-np.inf), 0.0)
    stuck = ((np.abs(r.den) <= r.tol) & (slack[:, None] < -_SLACK_TOL)).any(axis=0)
    never = stuck | (s_in > s_out * (1 + 1e-9) + _SLACK_TOL)
    return np.where(never, 0.0, s_out), np.where(never, 0.0, s_in), False


def live_hold_limits(
    problem: HoldLimitsProblem, lost_step: int = 2
) -> tuple[HoldLimits, np.ndarray, np.ndarray]:
    """For a plot that follows the mouse: all tugs on every direction of ``problem``, the
    worst tug lost on every ``lost_step``-th (0: not at all), from one set of half-spaces.

    Returns (limits without lost rows, lost directions (D',), worst lost m/s (D',)).
    """
    sc = _scales(problem)
    gens = problem.generators * sc[:, None]
    start = -problem.fixed * sc
    rays = -problem.wind_unit * sc[:, None]
    normals = zonotope_normals(gens)
    parts = np.maximum(normals @ gens, 0.0)
    support = parts.sum(axis=1)
    terms = _rays(normals, rays)
    s_all, s_min, holds = _exit(normals, support, start, terms)
    limits = HoldLimits(
        problem, np.sqrt(s_all), np.zeros((0, rays.shape[1])), holds, np.sqrt(s_min)
    )
    if lost_step <= 0:  # the all-tugs curve alone
        return limits, problem.directions_deg[:0], np.zeros(0)
    k = int(lost_step)
    sub = _Rays(terms.den[:, ::k], terms.inv_den[:, ::k], terms.blocked[:, ::k], terms.tol[::k])
    lost = np.zeros((gens.shape[1], sub.den.shape[1]))
    if len(lost):
        _lost_sweeps(lost, gens, normals, parts, support, start, rays[:, ::k], sub)
    worst = np.sqrt(lost.min(axis=0)) if len(lost) else np.zeros(sub.den.shape[1])
    return limits, problem.directions_deg[::k], worst


def hold_limits(problem: HoldLimitsProblem, *, with_lost: bool = True) -> HoldLimits:
    """Sweep every direction, all tugs and (``with_lost``) each tug lost, by ray-zonotope
    intersection. Without ``with_lost`` the lost rows are left empty (n = 0)."""
    sc = _scales(problem)
    gens = problem.generators * sc[:, None]  # (3, n)
    start = -problem.fixed * sc  # (3,)
    rays = -problem.wind_unit * sc[:, None]  # (3, D)
    normals = zonotope_normals(gens)
    parts = np.maximum(normals @ gens, 0.0)  # (P, n)
    support = parts.sum(axis=1)

    terms = _rays(normals, rays)
    s_all, s_min, holds = _exit(normals, support, start, terms)
    n = gens.shape[1]
    lost = np.zeros((n if with_lost else 0, rays.shape[1]))
    if len(lost):
        _lost_sweeps(lost, gens, normals, parts, support, start, rays, terms)
    return HoldLimits(problem, np.sqrt(s_all), np.sqrt(lost), holds, np.sqrt(s_min))


def _ranks_without_each(gens: np.ndarray) -> np.ndarray:
    """(n,) rank of the generators with each one left out, in one batched SVD."""
    n = gens.shape[1]
    if n <= 1:
        return np.zeros(n, dtype=int)
    keep = np.array([[j for j in range(n) if j != k] for k in range(n)])  # (n, n - 1)
    sv = np.linalg.svd(np.transpose(gens[:, keep], (1, 0, 2)), compute_uv=False)  # (n, m)
    top = np.maximum(sv[:, :1], 1e-300)
    return (sv > 1e-9 * top).sum(axis=1)


def _lost_sweeps(
    lost: np.ndarray,
    gens: np.ndarray,
    normals: np.ndarray,
    parts: np.ndarray,
    support: np.ndarray,
    start: np.ndarray,
    rays: np.ndarray,
    terms: _Rays,
) -> None:
    """Fill ``lost`` (n, D): the sweep with each tug lost.

    Where losing the tug keeps the zonotope solid and the current inside it (the usual
    case), the half-spaces of the full set serve with that tug's part taken off their
    support, for many tugs in one array operation; otherwise that tug gets its own sweep.
    """
    full_rank = _rank(gens)
    slack = (support - normals @ start)[:, None] - parts  # (P, n)
    slack[np.abs(slack) < 1e-13] = 0.0
    fast = (_ranks_without_each(gens) == full_rank) & (slack.min(axis=0) >= -_SLACK_TOL)
    idx = np.flatnonzero(fast)
    p, d = terms.inv_den.shape
    chunk = max(1, 100_000 // max(p * d, 1))
    for c0 in range(0, len(idx), chunk):
        ks = idx[c0 : c0 + chunk]
        sl = np.maximum(slack[:, ks], 0.0).T[:, :, None]  # (m, P, 1)
        lost[ks] = (sl * terms.inv_den[None] + terms.blocked[None]).min(axis=1)
    for k in np.flatnonzero(~fast):
        rest = np.delete(gens, k, axis=1)
        if _rank(rest) == full_rank:
            lost[k] = _exit(normals, support - parts[:, k], start, terms)[0]
        else:  # losing this tug flattens the zonotope: its own normals are needed
            ns = zonotope_normals(rest)
            h = np.maximum(ns @ rest, 0.0).sum(axis=1)
            lost[k] = _exit(ns, h, start, _rays(ns, rays))[0]


def limit_at(limits: HoldLimits, wind_from_deg: float, curve: np.ndarray | None = None) -> float:
    """The limit for wind from ``wind_from_deg`` (linear between swept directions)."""
    v = limits.all_tugs_ms if curve is None else curve
    d = limits.problem.directions_deg
    if not np.all(np.isfinite(v)):
        return float(v[int(np.argmin(np.abs((d - wind_from_deg + 180) % 360 - 180)))])
    return float(np.interp(wind_from_deg % 360.0, np.append(d, d[0] + 360.0), np.append(v, v[0])))
