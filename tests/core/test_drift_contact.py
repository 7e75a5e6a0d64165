"""First contact of a drifting body with the site: time, place and closing speed."""

from __future__ import annotations

import math

import numpy as np
import pytest
import shapely

from core.mechanics.site import Placing
from core.motion.contact import CONTACT_M, Clearances, Obstacle
from core.motion.drift import solve_drift
from core.motion.dynamics import Motion
from tests.core.drift_builders import BOX, INERTIA, problem


def quay(name: str, a: tuple[float, float], b: tuple[float, float]) -> Obstacle:
    return Obstacle(name, "quay", shapely.LineString([a, b]))


def square(name: str, x0: float, y0: float, side: float, kind: str = "dolphin") -> Obstacle:
    return Obstacle(name, kind, shapely.box(x0, y0, x0 + side, y0 + side))


FREE = Motion(INERTIA)  # no force, no drag: the body keeps the speed it starts with


def test_constant_speed_approach_to_a_straight_quay() -> None:
    # Worked by hand: the bow face (x = 30) heads east at 0.5 m/s for a quay at x = 80, so
    # the 50 m gap closes to the contact distance at t = (50 - CONTACT_M) / 0.5, with a
    # closing speed of 0.5 m/s, on the bow face.
    q = quay("North quay", (80.0, -100.0), (80.0, 100.0))
    r = solve_drift(problem(FREE, obstacles=(q,), velocity=(0.5, 0.0, 0.0), horizon_s=600.0))
    c = r.contact
    assert c is not None
    assert c.time_s == pytest.approx((50.0 - CONTACT_M) / 0.5, abs=1e-6)
    assert c.other == "North quay" and c.other_kind == "quay"
    assert c.closing_speed_ms == pytest.approx(0.5, rel=1e-6)
    assert c.point[0] == pytest.approx(80.0 - CONTACT_M, abs=1e-6)
    assert -10.0 <= c.point[1] <= 10.0
    assert r.end_s == pytest.approx(c.time_s)
    assert r.times[-1] == c.time_s and (np.diff(r.times) > 0).all()


def test_sideways_approach_of_a_turned_body() -> None:
    # Worked by hand: heading north (site angle pi/2), walking to port (west) at 0.25 m/s;
    # the port side lies 10 m west of G and the quay 40 m west: contact after
    # (30 - CONTACT_M) / 0.25 s.
    q = quay("West quay", (-40.0, -200.0), (-40.0, 200.0))
    r = solve_drift(
        problem(
            FREE,
            start=Placing(0.0, 0.0, math.pi / 2),
            obstacles=(q,),
            velocity=(0.0, 0.25, 0.0),
            horizon_s=600.0,
        )
    )
    assert r.contact is not None
    assert r.contact.time_s == pytest.approx((30.0 - CONTACT_M) / 0.25, abs=1e-6)
    assert r.contact.closing_speed_ms == pytest.approx(0.25, rel=1e-6)


def test_a_corner_clipping_a_dolphin_between_steps_is_found() -> None:
    # At 5 m/s north the box's north-east corner (30, 10) clips a 2 m dolphin by 0.3 m for
    # under five seconds, far shorter than the integrator's steps. Worked by hand: its
    # south face (y = 140) is reached at (130 - CONTACT_M) / 5 s, by the corner.
    d = square("D7", 29.7, 140.0, 2.0)
    r = solve_drift(problem(FREE, obstacles=(d,), velocity=(0.0, 5.0, 0.0), horizon_s=300.0))
    assert r.contact is not None
    assert r.contact.time_s == pytest.approx((130.0 - CONTACT_M) / 5.0, abs=1e-6)
    assert r.contact.point == pytest.approx((30.0, 140.0 - CONTACT_M), abs=1e-6)
    assert r.contact.other_kind == "dolphin"


def test_a_fast_body_does_not_pass_through_a_thin_quay() -> None:
    q = quay("Thin quay", (-500.0, 300.0), (500.0, 300.0))
    r = solve_drift(problem(FREE, obstacles=(q,), velocity=(0.0, 12.0, 0.0), horizon_s=300.0))
    assert r.contact is not None
    assert r.contact.time_s == pytest.approx((290.0 - CONTACT_M) / 12.0, abs=1e-6)


def test_a_near_miss_is_not_a_contact() -> None:
    # The corner passes 5 cm clear of the dolphin: no contact.
    d = square("D8", 30.05, 140.0, 2.0)
    r = solve_drift(problem(FREE, obstacles=(d,), velocity=(0.0, 5.0, 0.0), horizon_s=100.0))
    assert r.contact is None
    assert r.end_s == 100.0


def test_lying_alongside_at_the_start_is_not_a_contact() -> None:
    q = quay("Berth", (-100.0, -10.0), (100.0, -10.0))  # along the starboard side
    r = solve_drift(problem(FREE, obstacles=(q,), velocity=(0.0, 0.2, 0.0)))
    assert r.alongside == ("Berth",)
    assert r.contact is None


def test_contact_with_another_body() -> None:
    other = Obstacle("Barge B", "body", shapely.box(-20.0, 25.0, 20.0, 45.0))
    r = solve_drift(problem(FREE, obstacles=(other,), velocity=(0.0, 0.3, 0.0), horizon_s=600.0))
    assert r.contact is not None
    assert r.contact.other_kind == "body"
    assert r.contact.time_s == pytest.approx((15.0 - CONTACT_M) / 0.3, abs=1e-6)


def test_closing_speed_is_the_contact_point_speed_towards_the_obstacle() -> None:
    # Worked by hand: turning clockwise at r about G with no translation, the bow corner
    # (30, 10) moves at r x 31.62 m/s at right angles to its radius; a quay at x = 31 is met
    # when the corner's x, 31.62 cos(theta), reaches it, theta falling from atan(10 / 30).
    q = quay("Q", (31.0, -100.0), (31.0, 100.0))
    rate = 0.01
    r = solve_drift(problem(FREE, obstacles=(q,), velocity=(0.0, 0.0, -rate), horizon_s=600.0))
    c = r.contact
    assert c is not None
    reach = math.hypot(30.0, 10.0)
    angle = math.acos((31.0 - CONTACT_M) / reach)
    t = (math.atan2(10.0, 30.0) - angle) / rate
    assert c.time_s == pytest.approx(t, rel=1e-6)
    assert c.point_speed_ms == pytest.approx(rate * reach, rel=1e-6)
    assert c.closing_speed_ms == pytest.approx(rate * reach * math.sin(angle), rel=1e-4)


def test_clearances_agree_with_shapely_for_many_states() -> None:
    obstacles = (quay("Q", (0.0, 50.0), (100.0, 60.0)), square("D", 60.0, -5.0, 3.0))
    cl = Clearances((BOX,), obstacles)
    rng = np.random.default_rng(7)
    states = np.column_stack(
        [rng.uniform(-50, 150, 40), rng.uniform(-50, 100, 40), rng.uniform(-3, 3, 40)]
    )
    got = cl.distances(states)
    for k, s in enumerate(states):
        c, sn = math.cos(s[2]), math.sin(s[2])
        poly = shapely.Polygon([(s[0] + c * x - sn * y, s[1] + sn * x + c * y) for x, y in BOX])
        for j, ob in enumerate(obstacles):
            assert got[k, j] == pytest.approx(poly.distance(ob.geometry), abs=1e-9)
        lower = cl.bounds(s[None, :2])[0]
        assert (lower <= got[k] + 1e-9).all()  # a lower bound
        near = lower <= 0.0  # within reach: measured exactly; the others by their bound
        expected = min(got[k][near].min(initial=math.inf), lower[~near].min(initial=math.inf))
        assert cl.least(s) == pytest.approx(expected, abs=1e-9)


def test_members_with_different_numbers_of_vertices() -> None:
    # A body of two lashed hulls whose outlines differ in vertex count (a 4-vertex box and
    # a 5-vertex pointed hull) once failed to build its polygons (numpy refused the ragged
    # array). The least gap must be shapely's distance from the nearer member (reference:
    # shapely.distance on the same polygons placed by hand).
    box = np.array([[-10.0, -5.0], [10.0, -5.0], [10.0, 5.0], [-10.0, 5.0]])
    pointed = np.array([[-10.0, 6.0], [8.0, 6.0], [14.0, 11.0], [8.0, 16.0], [-10.0, 16.0]])
    wall = square("Dolphin", 15.0, 1.0, 3.0)  # within reach: the gap is exact
    clear = Clearances((box, pointed), (wall,))
    state = np.array([1.0, 0.5, 0.1, 0.0, 0.0, 0.0])
    c, s = math.cos(0.1), math.sin(0.1)

    def placed(o: np.ndarray) -> shapely.Polygon:
        return shapely.Polygon([(1.0 + c * x - s * y, 0.5 + s * x + c * y) for x, y in o])

    expected = min(shapely.distance(placed(o), wall.geometry) for o in (box, pointed))
    assert clear.least(state) == pytest.approx(expected, rel=1e-12)
    assert clear.distances(state)[0, 0] == pytest.approx(expected, rel=1e-12)
