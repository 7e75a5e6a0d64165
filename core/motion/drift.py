"""The drift preview: how the body moves, and when it first touches something, if the
pulls stay as set, a tug is lost or the lines are let go.

Problem -> solver -> result. A :class:`DriftProblem` holds everything the integration
needs (the body's motion model, where it starts, its outline and the obstacles);
:func:`solve_drift` integrates it with ``scipy.integrate.solve_ivp`` (RK45, an
explicit Runge-Kutta with dense output, and a terminal event when the outline touches
an obstacle) and returns a :class:`DriftResult` that keeps its problem.

The event is checked at the integrator's steps; a glancing contact between two steps
is looked for on the dense solution (an interval is cut finer until the gap at its
ends rules a touch out, knowing how fast the outline's fastest point can move), and
the time of the first contact is refined by root finding on the same dense solution.

A simple manoeuvring estimate, see :data:`DRIFT_CAUTION`.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass, field, replace
from typing import Literal

import numpy as np
from scipy.integrate import solve_ivp
from scipy.optimize import brentq

from core.errors import InputError
from core.frames import site_angle_to_true
from core.mechanics.site import Placing
from core.motion.contact import ALONGSIDE_M, CONTACT_M, Clearances, Obstacle
from core.motion.dynamics import Motion
from core.notices import Notice

DRIFT_CAUTION = (
    "Drift preview: a simple manoeuvring estimate in calm water. The sideways current "
    "load takes the stage's water depth into account; the other shallow-water effects "
    "(on added mass, squat, banks), waves, wash and the tugs' own response are left out: "
    "the tugs that remain keep "
    "their pulls and leads on the hull as set. The master and the pilot decide."
)

ScenarioKind = Literal["as_set", "tug_lost", "let_go", "worst_tug_lost"]
SCENARIO_KINDS: tuple[ScenarioKind, ...] = ("worst_tug_lost", "tug_lost", "let_go", "as_set")

#: Relative tolerance of the integration; absolute tolerances per state component.
RTOL = 1e-6
ATOL = (1e-4, 1e-4, 1e-7, 1e-6, 1e-6, 1e-8)
#: Longest step of the integrator, s (keeps the dense track smooth).
MAX_STEP_S = 20.0


@dataclass(frozen=True, slots=True)
class DriftScenario:
    """What happens to the tugs: pulls as set, one tug lost (the worst, or a named one),
    or every line let go."""

    kind: ScenarioKind = "worst_tug_lost"
    tug: str | None = None

    def __post_init__(self) -> None:
        if self.kind not in SCENARIO_KINDS:
            raise InputError(
                "drift scenario", self.kind, f"is not one of {', '.join(SCENARIO_KINDS)}"
            )
        if self.kind == "tug_lost" and not self.tug:
            raise InputError("drift scenario", self.kind, "needs the name of the tug lost")

    def words(self) -> str:
        if self.kind == "as_set":
            return "pulls as set"
        if self.kind == "let_go":
            return "all lines let go"
        if self.kind == "tug_lost":
            return f"{self.tug} lost"
        return f"worst tug lost ({self.tug})" if self.tug else "worst tug lost"


@dataclass(frozen=True, slots=True, eq=False)
class DriftProblem:
    """One drift to work out.

    ``start`` places the body frame in the site at t = 0; ``start_velocity`` is G's
    velocity over the ground (ahead, to port, m/s) and the yaw rate (rad/s), default
    at rest (held by its tugs). ``outlines`` are the members' outlines relative to G
    (body frame); ``centroid`` the plan centroid in the body frame, whose track is drawn.
    ``times_s`` are the moments shown as ghost outlines; ``horizon_s`` how long to look.
    """

    stage: str
    body: str
    scenario: DriftScenario
    motion: Motion
    start: Placing
    outlines: tuple[np.ndarray, ...]
    centroid: tuple[float, float]
    obstacles: tuple[Obstacle, ...] = ()
    horizon_s: float = 600.0
    times_s: tuple[float, ...] = (30.0, 60.0, 120.0)
    start_velocity: tuple[float, float, float] = (0.0, 0.0, 0.0)
    track_step_s: float = 2.0
    notices: tuple[Notice, ...] = ()

    def __post_init__(self) -> None:
        if not (math.isfinite(self.horizon_s) and self.horizon_s > 0):
            raise InputError("drift horizon", self.horizon_s, "must be a positive time in s")
        if not (math.isfinite(self.track_step_s) and self.track_step_s > 0):
            raise InputError("drift track step", self.track_step_s, "must be positive")

    @property
    def cog(self) -> tuple[float, float]:
        return self.motion.inertia.cog

    def with_scenario(self, scenario: DriftScenario) -> DriftProblem:
        return replace(self, scenario=scenario)


@dataclass(frozen=True, slots=True)
class Contact:
    """The first touch: when, what, where and how hard.

    ``point`` is on the body's outline (site frame, m); ``closing_speed_ms`` the speed
    of that point towards the obstacle, along the line between them just before they
    touch; ``point_speed_ms`` its whole speed over the ground.
    """

    time_s: float
    other: str
    other_kind: str
    point: tuple[float, float]
    closing_speed_ms: float
    point_speed_ms: float


@dataclass(frozen=True, slots=True, eq=False)
class DriftResult:
    """A worked drift: the track, sampled at ``times`` (k,), as ``states`` (k, 6) in the
    form of :mod:`core.motion.dynamics` (G's site position, psi, velocity through the
    water, yaw rate), ending at the first contact or at the horizon.

    ``alongside`` names the obstacles the body lay against at the start (not counted
    as contacts). ``ghost_times`` are the problem's times reached before the end, with
    their states in ``ghost_states`` (g, 6).
    """

    problem: DriftProblem
    times: np.ndarray
    states: np.ndarray
    contact: Contact | None
    alongside: tuple[str, ...]
    ghost_times: tuple[float, ...]
    ghost_states: np.ndarray
    evaluations: int = 0
    notices: tuple[Notice, ...] = field(default=())

    @property
    def end_s(self) -> float:
        return float(self.times[-1])

    def placing(self, state: np.ndarray) -> Placing:
        """Where a state puts the body frame's origin (for drawing)."""
        psi = float(state[2])
        gx, gy = self.problem.cog
        c, s = math.cos(psi), math.sin(psi)
        return Placing(float(state[0]) - c * gx + s * gy, float(state[1]) - s * gx - c * gy, psi)

    def ground_velocity(self, states: np.ndarray | None = None) -> np.ndarray:
        """(k, 2) G's velocity over the ground along the track (or for ``states``), m/s."""
        y = self.states if states is None else np.atleast_2d(states)
        psi, u, v = y[:, 2], y[:, 3], y[:, 4]
        c, s = np.cos(psi), np.sin(psi)
        cx, cy = self.problem.motion.current_velocity
        return np.column_stack([c * u - s * v + cx, s * u + c * v + cy])

    def speed_ms(self, states: np.ndarray | None = None) -> np.ndarray:
        """(k,) G's speed over the ground along the track (or for ``states``), m/s."""
        vel = self.ground_velocity(states)
        return np.hypot(vel[:, 0], vel[:, 1])

    def heading_deg(self) -> np.ndarray:
        """(k,) true heading of the bow, degrees."""
        return np.array([site_angle_to_true(float(p)) for p in self.states[:, 2]])

    def yaw_rate_deg_min(self) -> np.ndarray:
        """(k,) rate of turn, degrees a minute, positive when the bow swings to port."""
        return np.degrees(self.states[:, 5]) * 60.0

    def centroid_track(self, states: np.ndarray | None = None) -> np.ndarray:
        """(k, 2) the plan centroid's site position along the track (or for ``states``), m."""
        y = self.states if states is None else np.atleast_2d(states)
        return self._body_point(y, self.problem.centroid)

    def _body_point(self, states: np.ndarray, p: tuple[float, float]) -> np.ndarray:
        gx, gy = self.problem.cog
        dx, dy = p[0] - gx, p[1] - gy
        c, s = np.cos(states[:, 2]), np.sin(states[:, 2])
        return np.column_stack([states[:, 0] + c * dx - s * dy, states[:, 1] + s * dx + c * dy])

    def outlines_at(self, state: np.ndarray) -> list[np.ndarray]:
        """Each member's outline (n_i, 2) in the site frame for one state."""
        return [
            coords[0]
            for coords in Clearances(self.problem.outlines, ()).placed(np.atleast_2d(state))
        ]

    def excursion_m(self) -> float:
        """How far the outline's furthest-moved vertex lies from where it started, m."""
        cl = Clearances(self.problem.outlines, ())
        first = np.concatenate(cl.placed(self.states[:1]), axis=1)[0]
        last = np.concatenate(cl.placed(self.states[-1:]), axis=1)[0]
        return float(np.hypot(*(last - first).T).max())

    @property
    def touches(self) -> bool:
        return self.contact is not None


def solve_drift(problem: DriftProblem) -> DriftResult:
    """Integrate ``problem`` until the first contact or its horizon."""
    motion = problem.motion
    y0 = motion.start_state(problem.start, problem.start_velocity)
    d0 = Clearances(problem.outlines, problem.obstacles).distances(y0)[0]
    alongside = tuple(problem.obstacles[i].name for i in np.flatnonzero(d0 <= ALONGSIDE_M))
    watch = Clearances(
        problem.outlines, tuple(problem.obstacles[i] for i in np.flatnonzero(d0 > ALONGSIDE_M))
    )

    def gap(t: float, y: np.ndarray) -> float:
        return watch.least(y) - CONTACT_M

    gap.terminal = True  # type: ignore[attr-defined]
    gap.direction = -1  # type: ignore[attr-defined]
    sol = solve_ivp(
        motion.derivative(),
        (0.0, problem.horizon_s),
        y0,
        method="RK45",
        rtol=RTOL,
        atol=np.array(ATOL),
        dense_output=True,
        max_step=MAX_STEP_S,
        events=gap if watch.obstacles else None,
    )
    if sol.status < 0:
        raise InputError("drift", problem.scenario.words(), f"cannot be integrated: {sol.message}")
    end = float(sol.t[-1])
    times = np.linspace(0.0, end, max(1, math.ceil(end / problem.track_step_s - 1e-9)) + 1)
    states = sol.sol(times).T
    contact = None
    if watch.obstacles:
        hit = _ContactSearch(watch, sol.sol, states, sol.y.T, motion.current_velocity).first(times)
        if hit is None and len(sol.t_events[0]):  # the step's event, a hair from zero
            hit = float(sol.t_events[0][0])
        if hit is not None:
            end = hit
            keep = times < end
            times = np.append(times[keep], end)
            states = np.vstack([states[keep], sol.sol(end)])
            contact = _contact(problem, watch, states[-1], end)
    ghosts = tuple(t for t in problem.times_s if t <= end + 1e-9)
    ghost_states = sol.sol(np.array(ghosts)).T if ghosts else np.zeros((0, 6))
    return DriftResult(
        problem,
        times,
        states,
        contact,
        alongside,
        ghosts,
        ghost_states,
        int(sol.nfev),
        problem.notices + motion.inertia.notices,
    )


class _ContactSearch:
    """The first contact along a dense solution, found between samples without missing a
    glancing touch: the gap moves no faster than the fastest point of the outline, so an
    interval whose ends' gaps add up to more than that point's travel cannot touch."""

    def __init__(
        self,
        watch: Clearances,
        dense: Callable[[np.ndarray], np.ndarray],
        states: np.ndarray,
        steps: np.ndarray,
        current: tuple[float, float],
    ) -> None:
        self.watch = watch
        self.dense = dense
        self.states = states
        both = np.vstack([states, steps])  # the samples and the integrator's own steps
        # G's speed over the ground is at most its speed through the water plus the current's.
        ground = np.hypot(both[:, 3], both[:, 4]) + math.hypot(*current)
        # 25 % margin: between samples the speed may exceed the samples' a little.
        self.g_speed = 1.25 * float(ground.max()) + 1e-3
        self.p_speed = 1.25 * float((ground + np.abs(both[:, 5]) * watch.reach).max()) + 1e-3

    def _gap(self, t: np.ndarray, which: np.ndarray) -> np.ndarray:
        y = self.dense(t)
        return self.watch.distances(y.T, which).min(axis=1) - CONTACT_M

    def first(self, times: np.ndarray) -> float | None:
        lb = self.watch.bounds(self.states[:, :2])  # (k, n)
        dt = np.diff(times)
        # An obstacle can be within reach during an interval only if the bounds allow it.
        suspect = (lb[:-1] + lb[1:] - self.g_speed * dt[:, None]) / 2.0 <= 0.0  # (k-1, n)
        for i in np.flatnonzero(suspect.any(axis=1)):
            which = np.flatnonzero(suspect[i])
            ta, tb = float(times[i]), float(times[i + 1])
            ga, gb = self._gap(np.array([ta, tb]), which)
            hit = self._refine(ta, tb, float(ga), float(gb), which)
            if hit is not None:
                return hit
        return None

    def _refine(
        self, ta: float, tb: float, ga: float, gb: float, which: np.ndarray
    ) -> float | None:
        if gb <= 0.0:

            def g(t: float) -> float:
                return float(self._gap(np.array([t]), which)[0])

            # Evaluated afresh: at a step's end the dense solution's two pieces agree only
            # to rounding, which may flip the sign of a gap a hair from zero.
            fa, fb = g(ta), g(tb)
            if fa <= 0.0:
                return ta
            if fb > 0.0:
                return tb
            return float(brentq(g, ta, tb, xtol=1e-9, rtol=1e-12))
        travel = self.p_speed * (tb - ta)
        if (ga + gb - travel) / 2.0 > 0.0 or travel < 1e-4:
            return None  # cannot touch in between (or only by less than 0.1 mm)
        ts = np.linspace(ta, tb, 9)
        gs = self._gap(ts, which)
        gs[0], gs[-1] = ga, gb
        for k in range(8):
            hit = self._refine(
                float(ts[k]), float(ts[k + 1]), float(gs[k]), float(gs[k + 1]), which
            )
            if hit is not None:
                return hit
        return None


def _contact(problem: DriftProblem, watch: Clearances, state: np.ndarray, t: float) -> Contact:
    k = int(np.argmin(watch.distances(state)[0]))
    at_body, at_other = watch.nearest(state, k)
    x, y, psi, u, v, r = (float(q) for q in state)
    c, s = math.cos(psi), math.sin(psi)
    cx, cy = problem.motion.current_velocity
    vx, vy = c * u - s * v + cx, s * u + c * v + cy
    px, py = vx - r * (at_body[1] - y), vy + r * (at_body[0] - x)  # the point's velocity
    nx, ny = at_other[0] - at_body[0], at_other[1] - at_body[1]
    norm = math.hypot(nx, ny)
    closing = (px * nx + py * ny) / norm if norm > 0 else math.hypot(px, py)
    ob = watch.obstacles[k]
    return Contact(t, ob.name, ob.kind, at_body, closing, math.hypot(px, py))
