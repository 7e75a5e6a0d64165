"""The equations of motion of a drifting body in the horizontal plane (surge, sway, yaw).

State (site frame, about the centre of gravity G):

    y = [X, Y, psi, u, v, r]

X, Y: G's site position, m (x east, y north); psi: site angle of the body's +x axis,
rad counter-clockwise from east; u, v: G's velocity *through the water* in body axes
(ahead, to port), m/s; r: yaw rate, rad/s, positive counter-clockwise.

With a current that is uniform and steady, the rigid body's equations keep their form
in the velocity relative to the water (Fossen, Handbook of Marine Craft Hydrodynamics
and Motion Control, 2nd ed. 2021, ch. 10, from memory). With the mass m and yaw inertia
Iz about G and the added masses A11, A22, A66:

    (m + A11) du/dt = X + m v r
    (m + A22) dv/dt = Y - m u r
    (Iz + A66) dr/dt = N
    dX/dt = u cos(psi) - v sin(psi) + current_x,  dY/dt = u sin(psi) + v cos(psi) + current_y
    dpsi/dt = r

The added mass's own Coriolis terms (and with them the Munk moment, -(A22 - A11) u v)
and its sway-yaw coupling are left out: the yaw moment of an oblique flow is the current
load's business (core.mechanics.loads), so that a body at rest feels exactly the loads
of the statics and a balanced plan does not drift. Without forces the kinetic energy
1/2 (m + A11) u^2 + 1/2 (m + A22) v^2 + 1/2 (Iz + A66) r^2 is kept (the rigid body's
Coriolis terms do no work); the drag only takes it away.

X, Y, N are the tugs' pulls (constant in the body frame: each tug keeps its pull and
its lead on the hull), the wind load on the wind relative to the moving body, and the
water's drag, quadratic in the velocity through the water from the same coefficients
as the current load (core.mechanics.loads): ahead, -k_head u |u|; across, the cross-flow
drag of each strip of the length at its own sideways speed v + r x, integrated along
the length, which also gives the yaw damping:

    Y = -int q(x) (v + r x) |v + r x| dx,   N = -int q(x) x (v + r x) |v + r x| dx.

The current load's centre of pressure moves towards the end the water comes from at
oblique incidence (core.mechanics.loads.centre_shift); the drag adds that moment,
shift(-u, -v) times the sideways drag at G's own speed, -k v |v|, and the wind's load
acts at its own moving centre, so that at rest over the ground these give exactly the
current's and the wind's loads of the statics (one road for both, tested).
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Callable
from dataclasses import dataclass

import numpy as np

from core.errors import InputError
from core.mechanics.loads import FlowModel, centre_shift
from core.mechanics.site import Placing
from core.motion.inertia import Inertia

Derivative = Callable[[float, np.ndarray], list[float]]


@dataclass(frozen=True, slots=True)
class Strip:
    """A length of the body with the same cross-flow drag per metre.

    ``x0`` < ``x1`` measured forward from the centre of gravity, m; ``q`` is
    1/2 rho C_D T per metre, N per (m/s)^2 per metre of length.
    """

    x0: float
    x1: float
    q: float


@dataclass(frozen=True, slots=True)
class WaterDrag:
    """The water's quadratic drag on the body, from the centre of gravity.

    ``surge_k`` = 1/2 rho C A head-on, N / (m/s)^2, acting ``surge_y`` m to port of G;
    ``strips`` the cross-flow drag along the length; ``travel_m`` how far the sideways
    load's centre moves towards the leading end head-on (the current load's, m).
    """

    surge_k: float
    surge_y: float
    strips: tuple[Strip, ...]
    travel_m: float = 0.0

    @property
    def sway_k(self) -> float:
        """The whole side's 1/2 rho C A, N / (m/s)^2."""
        return sum(s.q * (s.x1 - s.x0) for s in self.strips)


NO_DRAG = WaterDrag(0.0, 0.0, ())


def strip_integrals(a: float, b: float, x0: float, x1: float) -> tuple[float, float]:
    """Exact int w|w| dx and int x w|w| dx over [x0, x1] for w = a + b x.

    w|w| is +-w^2 on each side of the root x = -a / b, so the interval is split there and
    each piece integrated as a polynomial (no cancellation when b is small).
    """
    pieces = [x0, x1]
    if (a + b * x0) * (a + b * x1) < 0.0:  # w changes sign: |b| (x1 - x0) > |a|, no overflow
        pieces = [x0, min(max(-a / b, x0), x1), x1]
    i0 = i1 = 0.0
    for p, q in itertools.pairwise(pieces):
        w_mid = a + b * 0.5 * (p + q)
        sign = 1.0 if w_mid > 0 else -1.0 if w_mid < 0 else 0.0
        p2, q2 = p * p, q * q
        p3, q3 = p2 * p, q2 * q
        i0 += sign * (a * a * (q - p) + a * b * (q2 - p2) + b * b * (q3 - p3) / 3.0)
        i1 += sign * (
            a * a * (q2 - p2) / 2.0
            + 2.0 * a * b * (q3 - p3) / 3.0
            + b * b * (q2 * q2 - p2 * p2) / 4.0
        )
    return i0, i1


@dataclass(frozen=True, slots=True, eq=False)
class Motion:
    """What moves the body: its inertia and every force, as the equations need them.

    ``tug`` is the tugs' (force ahead, force to port, moment about G), body frame,
    constant. ``wind`` is the wind's load model (body frame, its point relative to the
    body frame's origin) and ``wind_velocity`` the air's site velocity (where it blows
    towards), m/s; ``current_velocity`` the water's, m/s.
    """

    inertia: Inertia
    tug: tuple[float, float, float] = (0.0, 0.0, 0.0)
    wind: FlowModel | None = None
    wind_velocity: tuple[float, float] = (0.0, 0.0)
    water: WaterDrag = NO_DRAG
    current_velocity: tuple[float, float] = (0.0, 0.0)

    def derivative(self) -> Derivative:
        """dy/dt as a function of (t, y) (plain floats: this runs thousands of times)."""
        ine = self.inertia
        m11, m22, m66 = ine.surge_kg, ine.sway_kg, ine.yaw_kgm2
        m = ine.mass_kg
        tx, ty, tn = self.tug
        cx, cy = self.current_velocity
        wx, wy = self.wind_velocity
        gx, gy = ine.cog
        if self.wind is not None:
            kwx, kwy = self.wind.k_head, self.wind.k_beam
            pwx, pwy = self.wind.point[0] - gx, self.wind.point[1] - gy
        else:
            kwx = kwy = pwx = pwy = 0.0
        khx, hy = self.water.surge_k, self.water.surge_y
        strips = [(s.x0, s.x1, s.q) for s in self.water.strips]
        ksy, water_travel = self.water.sway_k, self.water.travel_m
        wind_travel = 0.0 if self.wind is None else self.wind.travel_m
        cos, sin = math.cos, math.sin

        def f(t: float, y: np.ndarray) -> list[float]:
            psi, u, v, r = y[2], y[3], y[4], y[5]
            c, s = cos(psi), sin(psi)
            vx = c * u - s * v + cx  # G's velocity over the ground, site frame
            vy = s * u + c * v + cy
            ax, ay = wx - vx, wy - vy  # the wind as the moving body feels it
            au, av = c * ax + s * ay, -s * ax + c * ay
            fwx, fwy = kwx * au * abs(au), kwy * av * abs(av)
            fx = tx + fwx - khx * u * abs(u)
            fy = ty + fwy
            arm = pwx + centre_shift(au, av, wind_travel)
            n = tn + arm * fwy - pwy * fwx + hy * khx * u * abs(u)
            n -= centre_shift(-u, -v, water_travel) * ksy * v * abs(v)
            for x0, x1, q in strips:
                i0, i1 = strip_integrals(v, r, x0, x1)
                fy -= q * i0
                n -= q * i1
            return [
                vx,
                vy,
                r,
                (fx + m * v * r) / m11,
                (fy - m * u * r) / m22,
                n / m66,
            ]

        return f

    def start_state(
        self, placing: Placing, velocity: tuple[float, float, float] = (0.0, 0.0, 0.0)
    ) -> np.ndarray:
        """y at t = 0 for the body frame placed by ``placing``, moving at ``velocity``
        (G's velocity over the ground ahead and to port, m/s, and the yaw rate, rad/s;
        default at rest over the ground, as a body held by its tugs)."""
        g = placing.point(self.inertia.cog)
        psi = placing.angle_rad
        c, s = math.cos(psi), math.sin(psi)
        cx, cy = self.current_velocity
        cu, cv = c * cx + s * cy, -s * cx + c * cy  # the current in body axes
        return np.array([g[0], g[1], psi, velocity[0] - cu, velocity[1] - cv, velocity[2]])

    def kinetic_energy(self, states: np.ndarray) -> np.ndarray:
        """(k,) 1/2 (m+A11) u^2 + 1/2 (m+A22) v^2 + 1/2 (Iz+A66) r^2, J, of states (k, 6)."""
        ine = self.inertia
        u, v, r = states[:, 3], states[:, 4], states[:, 5]
        return 0.5 * (ine.surge_kg * u * u + ine.sway_kg * v * v + ine.yaw_kgm2 * r * r)


def rk4(
    f: Derivative, y0: np.ndarray, t_end: float, step_s: float
) -> tuple[np.ndarray, np.ndarray]:
    """Classical fixed-step Runge-Kutta from 0 to ``t_end``; states at each step (k, 6).

    The check on the adaptive integration (and its benchmark baseline): the step is
    shortened to land on ``t_end``.
    """
    if not (math.isfinite(step_s) and step_s > 0):
        raise InputError("time step", step_s, "must be a positive number of seconds")
    n = max(1, math.ceil(t_end / step_s - 1e-9))
    h = t_end / n
    y = np.asarray(y0, dtype=float)
    ts, ys = [0.0], [y]
    for k in range(n):
        t = k * h
        k1 = np.asarray(f(t, y))
        k2 = np.asarray(f(t + h / 2, y + h / 2 * k1))
        k3 = np.asarray(f(t + h / 2, y + h / 2 * k2))
        k4 = np.asarray(f(t + h, y + h * k3))
        y = y + h / 6 * (k1 + 2 * k2 + 2 * k3 + k4)
        ts.append((k + 1) * h)
        ys.append(y)
    return np.array(ts), np.array(ys)
