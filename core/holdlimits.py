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

from core.balance import tug_layout
from core.conditions import current_model, flow_angle_rad, wind_model
from core.loads import stage_body
from core.plan import Project, Stage

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
    directions_deg: np.ndarray | None = None,
) -> HoldLimitsProblem:
    """Describe the sweep; raises InputError when the wind area cannot be found."""
    b = stage_body(project, stage, body)
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
        dx, dy = cm.point[0] - b.centroid[0], cm.point[1] - b.centroid[1]
        fixed = np.array([fx, fy, dx * fy - dy * fx])
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

    A speed of 0 means the fleet cannot hold the body against the current alone (or
    cannot resist any wind from that direction); inf, that the wind from there puts
    no load the fleet cannot take.
    """

    problem: HoldLimitsProblem
    all_tugs_ms: np.ndarray  # (D,)
    lost_ms: np.ndarray  # (n, D): row i with tug i lost
    holds_current: bool

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
    g = gens[:, norms > 1e-12 * max(float(norms.max(initial=0.0)), 1e-300)].T  # (q, 3)
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


def _exit(
    normals: np.ndarray, support: np.ndarray, start: np.ndarray, inv_den: np.ndarray
) -> tuple[np.ndarray, bool]:
    """Largest s per direction with start + s d inside {n.x <= h}; (D,), and whether start is inside."""
    slack = support - normals @ start  # (P,)
    if slack.min(initial=0.0) < -_SLACK_TOL:
        return np.zeros(inv_den.shape[1]), False
    return (np.maximum(slack, 0.0)[:, None] * inv_den).min(axis=0), True


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

    def inv(ns: np.ndarray) -> np.ndarray:
        den = ns @ rays  # (P, D)
        size = np.linalg.norm(rays, axis=0)
        with np.errstate(divide="ignore"):
            return np.where(den > _DEN_TOL * size, 1.0 / den, np.inf)

    inv_den = inv(normals)
    s_all, holds = _exit(normals, support, start, inv_den)
    full_rank = _rank(gens)
    lost = np.zeros((gens.shape[1] if with_lost else 0, rays.shape[1]))
    for k in range(len(lost)):
        rest = np.delete(gens, k, axis=1)
        if _rank(rest) == full_rank:
            lost[k], _ = _exit(normals, support - parts[:, k], start, inv_den)
        else:  # losing this tug flattens the zonotope: its own normals are needed
            ns = zonotope_normals(rest)
            lost[k], _ = _exit(ns, np.maximum(ns @ rest, 0.0).sum(axis=1), start, inv(ns))
    return HoldLimits(problem, np.sqrt(s_all), np.sqrt(lost), holds)


def limit_at(limits: HoldLimits, wind_from_deg: float, curve: np.ndarray | None = None) -> float:
    """The limit for wind from ``wind_from_deg`` (linear between swept directions)."""
    v = limits.all_tugs_ms if curve is None else curve
    d = limits.problem.directions_deg
    if not np.all(np.isfinite(v)):
        return float(v[int(np.argmin(np.abs((d - wind_from_deg + 180) % 360 - 180)))])
    return float(np.interp(wind_from_deg % 360.0, np.append(d, d[0] + 360.0), np.append(v, v[0])))
