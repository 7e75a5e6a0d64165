"""The drift's equations of motion against cases with closed-form solutions."""

from __future__ import annotations

import math

import numpy as np
import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.mechanics.site import Placing
from core.motion.drift import solve_drift
from core.motion.dynamics import Motion, Strip, WaterDrag, strip_integrals
from core.motion.scenarios import drift_setup
from tests.conftest import SAMPLES
from tests.core.drift_builders import INERTIA, LENGTH, problem

TIMES = (10.0, 30.0, 60.0, 120.0)
M11 = INERTIA.surge_kg
M22 = INERTIA.sway_kg
M66 = INERTIA.yaw_kgm2


def test_constant_force_without_damping() -> None:
    # Closed form (Newton's second law with the added mass): x = F t^2 / (2 (m + m_a)).
    f = 200e3
    heading = 0.7
    r = solve_drift(
        problem(
            Motion(INERTIA, tug=(f, 0.0, 0.0)), start=Placing(5.0, -3.0, heading), times_s=TIMES
        )
    )
    t = np.array(r.ghost_times)
    along = f * t**2 / (2 * M11)
    expected = np.column_stack([5.0 + along * math.cos(heading), -3.0 + along * math.sin(heading)])
    assert r.ghost_states[:, :2] == pytest.approx(expected, rel=1e-7, abs=1e-6)
    assert r.ghost_states[:, 2] == pytest.approx(heading, abs=1e-12)


def test_constant_sideways_force_meets_the_sway_mass() -> None:
    # Closed form: y = F t^2 / (2 (m + A22)) for a push to port.
    f = 150e3
    r = solve_drift(problem(Motion(INERTIA, tug=(0.0, f, 0.0)), times_s=TIMES))
    t = np.array(r.ghost_times)
    assert r.ghost_states[:, 1] == pytest.approx(f * t**2 / (2 * M22), rel=1e-7)
    assert r.ghost_states[:, 0] == pytest.approx(0.0, abs=1e-9)


def test_quadratic_drag_tanh_law_and_terminal_speed() -> None:
    # Closed form: with drag k u^2 only, u(t) = u_t tanh(F t / (m u_t)), u_t = sqrt(F / k),
    # x(t) = (m u_t^2 / F) ln cosh(F t / (m u_t)); with k = 1/2 rho C A the terminal speed
    # is sqrt(2 F / (rho C A)).
    f, rho, c, area = 100e3, 1025.0, 0.6, 60.0
    k = 0.5 * rho * c * area
    water = WaterDrag(surge_k=k, surge_y=0.0, strips=())
    r = solve_drift(
        problem(Motion(INERTIA, tug=(f, 0.0, 0.0), water=water), horizon_s=900.0, times_s=TIMES)
    )
    ut = math.sqrt(2 * f / (rho * c * area))
    t = np.array(r.ghost_times)
    arg = f * t / (M11 * ut)
    assert r.ghost_states[:, 3] == pytest.approx(ut * np.tanh(arg), rel=1e-5)
    assert r.ghost_states[:, 0] == pytest.approx(M11 * ut**2 / f * np.log(np.cosh(arg)), rel=1e-5)
    assert r.speed_ms()[-1] == pytest.approx(ut, rel=1e-4)


def test_pure_couple_turns_without_moving() -> None:
    # A couple M on a body with uniform cross-flow drag q along its length, G at mid-length:
    # no translation, and N = -k_N r |r| with k_N = q int |x|^3 dx = q L^4 / 32, so
    # r(t) = r_t tanh(M t / ((Iz + A66) r_t)), r_t = sqrt(M / k_N) (closed form).
    moment, q = 5e6, 400.0
    water = WaterDrag(surge_k=3e4, surge_y=0.0, strips=(Strip(-LENGTH / 2, LENGTH / 2, q),))
    r = solve_drift(problem(Motion(INERTIA, tug=(0.0, 0.0, moment), water=water), times_s=TIMES))
    k_n = q * LENGTH**4 / 32.0
    rt = math.sqrt(moment / k_n)
    t = np.array(r.ghost_times)
    assert r.ghost_states[:, 5] == pytest.approx(rt * np.tanh(moment * t / (M66 * rt)), rel=1e-5)
    assert np.abs(r.states[:, :2]).max() < 1e-9
    assert np.abs(r.states[:, 3:5]).max() < 1e-12


def test_body_at_rest_with_no_forces_stays_at_rest() -> None:
    water = WaterDrag(3e4, 0.0, (Strip(-30.0, 30.0, 400.0),))
    r = solve_drift(problem(Motion(INERTIA, water=water), start=Placing(12.0, 7.0, 0.3)))
    assert (r.states == r.states[0]).all()
    assert r.states[0, :3] == pytest.approx([12.0, 7.0, 0.3])
    assert r.contact is None


def test_uniform_current_carries_the_body_to_its_speed() -> None:
    # Closed form: with only the drag k u|u| on the speed through the water u, a body
    # starting at rest in a current c along its length has u(t) = -c / (1 + k c t / m11),
    # so its speed over the ground c + u(t) tends to the current's.
    c_speed, k = 0.8, 5e4
    water = WaterDrag(k, 0.0, (Strip(-30.0, 30.0, 2000.0),))
    motion = Motion(INERTIA, water=water, current_velocity=(c_speed, 0.0))
    r = solve_drift(problem(motion, horizon_s=3600.0, times_s=(60.0, 600.0, 3600.0)))
    t = np.array(r.ghost_times)
    ground = c_speed - c_speed / (1 + k * c_speed * t / M11)
    assert c_speed + r.ghost_states[:, 3] == pytest.approx(ground, rel=1e-5)
    speed = r.speed_ms()
    assert (np.diff(speed) >= -1e-12).all() and speed[-1] == pytest.approx(c_speed, rel=0.03)


def test_oblique_current_carries_the_body_along_the_current() -> None:
    water = WaterDrag(5e5, 0.0, (Strip(-30.0, 30.0, 2e4),))
    current = (0.5 * math.cos(2.0), 0.5 * math.sin(2.0))
    motion = Motion(INERTIA, water=water, current_velocity=current)
    r = solve_drift(problem(motion, horizon_s=3600.0))
    v = r.ground_velocity()[-1]
    assert v == pytest.approx(current, abs=0.01)


@pytest.mark.parametrize(
    ("a", "b", "x0", "x1"),
    [(0.3, 0.01, -30, 30), (-0.2, 0.0, -10, 40), (0.0, -0.02, -30, 30), (0.1, 0.05, -30, 30)],
)
def test_strip_integrals_against_numerical_quadrature(
    a: float, b: float, x0: float, x1: float
) -> None:
    # Reference: scipy.integrate.quad of w|w| and x w|w|, w = a + b x.
    from scipy.integrate import quad

    i0, i1 = strip_integrals(a, b, x0, x1)
    root = [-a / b] if b != 0 and x0 < -a / b < x1 else None
    q0 = quad(lambda x: (a + b * x) * abs(a + b * x), x0, x1, points=root, epsabs=1e-13)[0]
    q1 = quad(lambda x: x * (a + b * x) * abs(a + b * x), x0, x1, points=root, epsabs=1e-13)[0]
    assert i0 == pytest.approx(q0, rel=1e-9, abs=1e-12)
    assert i1 == pytest.approx(q1, rel=1e-9, abs=1e-12)


@pytest.mark.parametrize("index", [0, 1, 2, 3])
def test_at_the_start_the_body_feels_the_statics(index: int) -> None:
    # The drift's first acceleration times the masses is the stage's balance (tugs as set,
    # wind and current at rest), force in the body frame and moment about G.
    project = load(SAMPLES / "twin_barge_move.towboard")
    stage = project.stages[index]
    setup = drift_setup(project, stage)
    p = setup.base
    y0 = p.motion.start_state(p.start)
    dy = p.motion.derivative()(0.0, y0)
    b = stage_result(project, index).body(setup.body.name).balance
    fx, fy = b.net_force
    scale = b.net_magnitude + sum(abs(sh.pull_n) for sh in b.shares)
    assert dy[3] * p.motion.inertia.surge_kg == pytest.approx(fx, abs=1e-9 * scale)
    assert dy[4] * p.motion.inertia.sway_kg == pytest.approx(fy, abs=1e-9 * scale)
    assert dy[5] * p.motion.inertia.yaw_kgm2 == pytest.approx(
        b.moment_cog_nm, abs=1e-9 * scale * LENGTH
    )
