"""Net force, moments and the single equivalent force, against outside references.

References: the textbook laws of equivalent force systems (any statics text);
sympy.physics.vector as an independent reference for cross products; two published
textbook worked examples (values recalled, marked "(from memory)").
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st
from sympy import Rational
from sympy.physics.vector import ReferenceFrame, cross

from core.mechanics.forces import NEGLIGIBLE, equivalent, moments_about, resultant, transfer_moment

# -- sympy.physics.vector cross-check -------------------------------------------------


@pytest.mark.parametrize("seed", range(12))
def test_resultant_and_moment_match_sympy_vector(seed: int) -> None:
    """R = sum F_i and M_P = sum (r_i - r_P) x F_i, computed exactly by sympy.physics.vector."""
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 9))
    # Rational inputs so sympy's answer is exact; the core works in floats.
    pts = rng.integers(-500, 500, size=(n, 2)) / 7
    frc = rng.integers(-900, 900, size=(n, 2)) / 3
    ref = tuple(rng.integers(-50, 50, size=2) / 11)
    N = ReferenceFrame("N")
    R = 0 * N.x
    M = 0 * N.x
    for (x, y), (fx, fy) in zip(pts, frc, strict=True):
        r = (Rational(str(x)) - Rational(str(ref[0]))) * N.x + (
            Rational(str(y)) - Rational(str(ref[1]))
        ) * N.y
        F = Rational(str(fx)) * N.x + Rational(str(fy)) * N.y
        R += F
        M += cross(r, F)
    net, moment = resultant(pts, frc, ref)
    assert net[0] == pytest.approx(float(R.dot(N.x)), rel=1e-12, abs=1e-9)
    assert net[1] == pytest.approx(float(R.dot(N.y)), rel=1e-12, abs=1e-9)
    assert moment == pytest.approx(float(M.dot(N.z)), rel=1e-12, abs=1e-7)


def test_moment_sign_counter_clockwise_positive() -> None:
    # A force ahead (+x) applied on the starboard side (y < 0) turns the bow to port: positive.
    m = moments_about(np.array([[0.0, -2.0]]), np.array([[10.0, 0.0]]), (0.0, 0.0))
    assert m[0] == pytest.approx(20.0)


# -- published worked examples --------------------------------------------------------


def test_beam_reduced_to_single_force_beer_johnston() -> None:
    """Beer & Johnston, Vector Mechanics for Engineers: Statics, sample problem on a 4.80 m
    beam (from memory): 150 N up at A, 600 N down at 1.6 m, 100 N up at 2.8 m, 250 N down
    at B (4.8 m). Published answers: R = 600 N down, M_A = 1880 N*m clockwise,
    M_B = 1000 N*m counter-clockwise, single force 3.13 m from A."""
    pts = np.array([[0.0, 0.0], [1.6, 0.0], [2.8, 0.0], [4.8, 0.0]])
    frc = np.array([[0.0, 150.0], [0.0, -600.0], [0.0, 100.0], [0.0, -250.0]])
    eq = equivalent(pts, frc, (0.0, 0.0), length_scale=4.8)
    assert eq.kind == "force"
    assert eq.force == pytest.approx((0.0, -600.0))
    assert eq.moment == pytest.approx(-1880.0)
    assert eq.moment_about((4.8, 0.0)) == pytest.approx(1000.0)
    x_on_beam = eq.crossing_x(0.0)
    assert x_on_beam is not None
    assert x_on_beam == pytest.approx(3.13, abs=0.005)


def test_beam_with_inclined_force_hibbeler() -> None:
    """Hibbeler, Engineering Mechanics: Statics, example replacing the coplanar forces on
    beam AE by one resultant located from E (from memory): 500 N at 60 deg below the
    horizontal 4 m from E, 100 N horizontal 0.5 m above the beam, 200 N up 2.5 m from E.
    Published answers: F_R = 420.5 N at 33.7 deg below the horizontal, d = 5.07 m from E."""
    s60, c60 = math.sin(math.radians(60)), math.cos(math.radians(60))
    pts = np.array([[-4.0, 0.0], [0.0, 0.5], [-2.5, 0.0]])
    frc = np.array([[500 * c60, -500 * s60], [100.0, 0.0], [0.0, 200.0]])
    eq = equivalent(pts, frc, (0.0, 0.0), length_scale=6.0)
    assert eq.magnitude == pytest.approx(420.5, abs=0.05)
    assert math.degrees(math.atan2(-eq.force[1], eq.force[0])) == pytest.approx(33.7, abs=0.05)
    x_on_beam = eq.crossing_x(0.0)
    assert x_on_beam is not None
    assert -x_on_beam == pytest.approx(5.07, abs=0.005)


# -- degenerate cases -----------------------------------------------------------------


def test_equal_and_opposite_pair_is_a_pure_couple() -> None:
    pts = np.array([[0.0, 5.0], [0.0, -5.0]])
    frc = np.array([[100.0, 0.0], [-100.0, 0.0]])
    eq = equivalent(pts, frc, (3.0, 1.0), length_scale=10.0)
    assert eq.kind == "couple"
    assert eq.point is None and eq.direction is None and eq.offset_m is None
    assert eq.moment == pytest.approx(-1000.0)
    assert eq.moment_about((-40.0, 17.0)) == pytest.approx(-1000.0)


def test_collinear_equal_and_opposite_pair_is_balanced() -> None:
    pts = np.array([[0.0, 0.0], [10.0, 0.0]])
    frc = np.array([[100.0, 0.0], [-100.0, 0.0]])
    assert equivalent(pts, frc, (0.0, 0.0), length_scale=10.0).kind == "balanced"


def test_negligible_is_relative_to_the_forces_present() -> None:
    # A net of ten times the negligible share of the forces present is a force; a
    # milli-newton in two meganewtons is not.
    big = 1e6
    pts = np.array([[0.0, 0.0], [0.0, 0.0]])
    small = equivalent(pts, np.array([[big, 0.0], [-big + 1e-3, 0.0]]), (0.0, 0.0))
    assert small.kind == "balanced"
    real = equivalent(pts, np.array([[big, 0.0], [-big * (1 - 10 * NEGLIGIBLE), 0.0]]), (0.0, 0.0))
    assert real.kind == "force"


def test_no_forces_at_all_is_balanced() -> None:
    eq = equivalent(np.zeros((0, 2)), np.zeros((0, 2)), (0.0, 0.0))
    assert eq.kind == "balanced"


# -- laws as properties -----------------------------------------------------------------

coord = st.floats(-200, 200, allow_nan=False, allow_infinity=False)
force = st.floats(-1e6, 1e6, allow_nan=False, allow_infinity=False)


@st.composite
def systems(draw: st.DrawFn) -> tuple[np.ndarray, np.ndarray]:
    n = draw(st.integers(1, 8))
    pts = np.array([[draw(coord), draw(coord)] for _ in range(n)])
    frc = np.array([[draw(force), draw(force)] for _ in range(n)])
    return pts, frc


def _scale(frc: np.ndarray) -> float:
    return float(np.hypot(frc[:, 0], frc[:, 1]).sum()) + 1.0


@given(systems(), coord, coord, coord, coord)
def test_moment_transfer_law(
    system: tuple[np.ndarray, np.ndarray], ax: float, ay: float, bx: float, by: float
) -> None:
    """M_B = M_A + (r_A - r_B) x R (textbook law)."""
    pts, frc = system
    net, m_a = resultant(pts, frc, (ax, ay))
    _, m_b = resultant(pts, frc, (bx, by))
    assert transfer_moment(m_a, (ax, ay), (bx, by), net) == pytest.approx(
        m_b, abs=1e-9 * _scale(frc) * 800
    )


@given(systems(), st.lists(st.floats(-300, 300, allow_nan=False), min_size=8, max_size=8))
def test_sliding_a_force_along_its_line_changes_nothing(
    system: tuple[np.ndarray, np.ndarray], ts: list[float]
) -> None:
    """Transmissibility: r_i -> r_i + t F_i/|F_i| leaves R and every moment unchanged."""
    pts, frc = system
    norm = np.hypot(frc[:, 0], frc[:, 1])
    unit = np.divide(frc, norm[:, None], out=np.zeros_like(frc), where=norm[:, None] > 0)
    moved = pts + unit * np.array(ts[: len(pts)])[:, None]
    for ref in ((0.0, 0.0), (37.0, -12.0)):
        net0, m0 = resultant(pts, frc, ref)
        net1, m1 = resultant(moved, frc, ref)
        np.testing.assert_allclose(net1, net0)
        assert m1 == pytest.approx(m0, abs=1e-9 * _scale(frc) * 800)


@given(systems(), st.floats(-math.pi, math.pi), coord, coord)
def test_rigid_motion_moves_the_line_of_action_with_the_system(
    system: tuple[np.ndarray, np.ndarray], angle: float, dx: float, dy: float
) -> None:
    pts, frc = system
    eq = equivalent(pts, frc, (0.0, 0.0), 400.0)
    assume(eq.kind == "force" and eq.magnitude > 1e-3 * _scale(frc))
    c, s = math.cos(angle), math.sin(angle)
    rot = np.array([[c, -s], [s, c]])
    pts2 = pts @ rot.T + np.array([dx, dy])
    frc2 = frc @ rot.T
    eq2 = equivalent(pts2, frc2, (dx, dy), 400.0)  # the moved reference point
    assert eq2.kind == "force"
    assert eq.point is not None and eq2.point is not None
    expected = rot @ np.array(eq.point) + np.array([dx, dy])
    tol = 1e-6 * (1 + float(np.abs(pts).max()) * _scale(frc) / eq.magnitude)
    np.testing.assert_allclose(eq2.point, expected, atol=tol)
    np.testing.assert_allclose(eq2.force, rot @ np.array(eq.force), atol=1e-9 * _scale(frc))


@given(coord, coord, force, coord, coord, coord, coord)
def test_a_couple_has_the_same_moment_about_every_point(
    x: float, y: float, f: float, d: float, px: float, py: float, qx: float
) -> None:
    assume(abs(f) > 1.0 and abs(d) > 0.1)
    pts = np.array([[x, y], [x, y + d]])
    frc = np.array([[f, 0.0], [-f, 0.0]])
    _, m1 = resultant(pts, frc, (px, py))
    _, m2 = resultant(pts, frc, (qx, -py))
    assert m1 == pytest.approx(f * d, rel=1e-9)
    assert m2 == pytest.approx(m1, rel=1e-9)


@settings(max_examples=200)
@given(systems(), coord, coord)
def test_the_equivalent_force_reproduces_net_force_and_moment(
    system: tuple[np.ndarray, np.ndarray], qx: float, qy: float
) -> None:
    """One force R placed anywhere on the line of action gives the same moment about any point."""
    pts, frc = system
    eq = equivalent(pts, frc, (0.0, 0.0), 400.0)
    assume(eq.kind == "force")
    assert eq.point is not None and eq.direction is not None
    net, m_q = resultant(pts, frc, (qx, qy))
    for t in (-50.0, 0.0, 120.0):
        on_line = np.array([eq.point]) + t * np.array([eq.direction])
        net1, m1 = resultant(on_line, np.array([eq.force]), (qx, qy))
        np.testing.assert_allclose(net1, net, atol=1e-9 * _scale(frc))
        assert m1 == pytest.approx(m_q, abs=1e-7 * _scale(frc) * (400 + abs(t)))
