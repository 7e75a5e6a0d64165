"""The centre of pressure that moves with the angle of incidence, and the yaw moment it
gives: against Hughes' published line, the symmetric cases, the physics of the sign, and
the same loads in the statics, the hold limits and the drift (one road)."""

from __future__ import annotations

import math

import numpy as np
import pytest

from core.errors import InputError
from core.mechanics.bodies import body_of
from core.mechanics.loads import (
    centre_shift,
    centre_shifts,
    condition_loads,
    current_model,
    loads_wrench,
    wind_model,
)
from core.model.conditions import HUGHES_HEAD_ON, Conditions
from core.model.hull import Hull
from core.model.outlines import box_outline
from core.model.plan import BodyPose, Project, Stage
from core.motion.scenarios import drift_setup
from core.solve.holdlimits import hold_limits_problem

L, B = 100.0, 20.0
BOX = Hull("Box", box_outline(L, B), draught_m=4.0, freeboard_m=5.0, displacement_kg=8.0e6)
BODY = body_of(Project(hulls=(BOX,)), "Box")


def _centre_from_bow(wind_off_bow_deg: float) -> float:
    """Where the lateral wind load acts, as a share of L from the bow, for a wind from
    ``wind_off_bow_deg`` off the starboard bow (box heading 000)."""
    c = Conditions(wind_speed_ms=20.0, wind_from_deg=wind_off_bow_deg)
    (ld,) = condition_loads(BODY, c, 0.0).loads
    return (L - ld.point[0]) / L  # the box runs x = 0 (stern) to 100 (bow)


# -- against the published line -----------------------------------------------------------


@pytest.mark.parametrize("theta", [10.0, 30.0, 45.0, 60.0, 80.0])
def test_centre_follows_hughes_line(theta: float) -> None:
    # Hughes (Trans. INA 1930, from memory): the wind's centre of pressure on a ship lies
    # x/L = 0.291 + 0.0023 theta from the bow, theta the wind's angle off the bow (deg).
    # Ours is that line made exactly symmetric (0.291 head-on, 0.5 beam-on: slope
    # 0.209/90 = 0.002322 per degree), so it may differ by at most 0.0000222 x 90 = 0.002.
    hughes = 0.291 + 0.0023 * theta
    assert _centre_from_bow(theta) == pytest.approx(hughes, abs=0.0021)


def test_centre_head_on_and_beam_on_are_hughes_end_points() -> None:
    # Hughes (from memory): 0.291 L from the bow head-on. Head-on the lateral load is zero,
    # so read the centre from the model; beam-on it is amidships (0.5 L).
    wm = wind_model(BODY, Conditions(wind_speed_ms=20.0))
    head_on = wm.point_at(math.pi)  # flow going aft: wind from ahead
    assert (L - head_on[0]) / L == pytest.approx(HUGHES_HEAD_ON)
    assert _centre_from_bow(90.0) == pytest.approx(0.5, abs=1e-12)


def test_the_same_travel_from_the_stern() -> None:
    # Wind from 150 (30 off the stern): the centre lies 0.291 + 0.0023 x 30 from the stern.
    share_from_bow = _centre_from_bow(150.0)
    assert 1.0 - share_from_bow == pytest.approx(0.291 + 0.0023 * 30.0, abs=0.0021)


def test_shift_vectorised_equals_scalar() -> None:
    angles = np.radians(np.arange(0.0, 360.0, 7.5))
    one = [centre_shift(math.cos(a), math.sin(a), 20.9) for a in angles]
    assert centre_shifts(angles, 20.9) == pytest.approx(one, abs=1e-12)


# -- symmetric cases give no moment ---------------------------------------------------------


@pytest.mark.parametrize("direction", [0.0, 90.0, 180.0, 270.0])
def test_head_on_and_beam_on_give_no_moment(direction: float) -> None:
    # A box symmetric end for end and side to side: head-on the lateral load is zero and
    # the longitudinal one acts on the centreline; beam-on the centre is amidships.
    c = Conditions(
        wind_speed_ms=20.0,
        wind_from_deg=direction,
        current_speed_ms=1.0,
        current_towards_deg=direction,
    )
    cl = condition_loads(BODY, c, 0.0)
    assert len(cl.loads) == 2
    scale = max(abs(f) for ld in cl.loads for f in ld.force) * L
    assert abs(loads_wrench(cl.loads, BODY.centroid)[2]) <= 1e-12 * scale


def test_fixed_centre_gives_no_moment_at_oblique_incidence() -> None:
    c = Conditions(wind_speed_ms=15.0, wind_from_deg=60.0, pressure_centre="fixed")
    cl = condition_loads(BODY, c, 0.0)
    assert loads_wrench(cl.loads, BODY.centroid)[2] == pytest.approx(0.0, abs=1e-6)


def test_head_on_share_of_one_half_is_no_travel() -> None:
    c = Conditions(wind_speed_ms=15.0, wind_from_deg=60.0, wind_centre_head_on=0.5)
    cl = condition_loads(BODY, c, 0.0)
    assert loads_wrench(cl.loads, BODY.centroid)[2] == pytest.approx(0.0, abs=1e-6)


# -- the sign at oblique incidence ----------------------------------------------------------


def test_wind_on_the_starboard_bow_swings_the_bow_to_port() -> None:
    # Wind from 060 true on a box heading 000: it pushes the box to port. The centre of
    # pressure lies on the upwind (forward) half, so the bow is pushed downwind, to port:
    # a counter-clockwise moment, positive (CONVENTIONS.md). A flat plate or a hull lying
    # oblique in a stream turns broadside to it the same way (the load on the leading
    # half is the larger).
    c = Conditions(wind_speed_ms=15.0, wind_from_deg=60.0)
    (ld,) = condition_loads(BODY, c, 0.0).loads
    fy = ld.force[1]
    assert fy > 0
    m = loads_wrench((ld,), BODY.centroid)[2]
    # By hand: theta = 60, centre (0.291 + 0.209 x 60/90) L = 0.43033 L from the bow, so
    # 50 - 43.033 = 6.967 m ahead of the centroid; M = 6.967 x Fy.
    arm = L / 2 - (HUGHES_HEAD_ON + (0.5 - HUGHES_HEAD_ON) * 60.0 / 90.0) * L
    assert m == pytest.approx(arm * fy, rel=1e-12)
    assert m > 0


def test_wind_on_the_starboard_quarter_swings_the_bow_to_starboard() -> None:
    # Wind from 120: the stern is the upwind end, pushed to port; the bow goes to starboard.
    c = Conditions(wind_speed_ms=15.0, wind_from_deg=120.0)
    assert loads_wrench(condition_loads(BODY, c, 0.0).loads, BODY.centroid)[2] < 0


def test_current_turns_the_body_across_it() -> None:
    # A current setting towards 240 true on a box heading 000 comes from the starboard bow
    # (060): it carries the box to port and, acting on the upstream (forward) half, swings
    # the bow to port as well: across the current.
    c = Conditions(current_speed_ms=1.0, current_towards_deg=240.0)
    (ld,) = condition_loads(BODY, c, 0.0).loads
    assert ld.force[1] > 0
    assert loads_wrench((ld,), BODY.centroid)[2] > 0


@pytest.mark.parametrize("direction", [20.0, 60.0, 135.0, 170.0])
def test_mirror_directions_give_opposite_moments(direction: float) -> None:
    # Mirrored about the centreline, the wind from 360 - d gives the opposite moment.
    def moment(d: float) -> float:
        c = Conditions(wind_speed_ms=15.0, wind_from_deg=d)
        return float(loads_wrench(condition_loads(BODY, c, 0.0).loads, BODY.centroid)[2])

    assert moment(360.0 - direction) == pytest.approx(-moment(direction), rel=1e-12)


# -- a user-set centre still overrides ---------------------------------------------------


def test_user_set_centre_overrides_the_travel() -> None:
    # A deckhouse forward at x = 80: the whole load acts there whatever the angle.
    c = Conditions(wind_speed_ms=15.0, wind_from_deg=60.0, wind_centre_m=(80.0, 0.0))
    (ld,) = condition_loads(BODY, c, 0.0).loads
    assert ld.point == (80.0, 0.0)
    fy = ld.force[1]
    assert loads_wrench((ld,), BODY.centroid)[2] == pytest.approx(30.0 * fy)
    assert wind_model(BODY, c).travel_m == 0.0


def test_choice_and_share_are_checked() -> None:
    with pytest.raises(InputError, match="centre of pressure"):
        Conditions(pressure_centre="roaming")
    with pytest.raises(InputError, match="wind centre of pressure head-on"):
        Conditions(wind_centre_head_on=0.7)


# -- one road: statics, hold limits and drift -------------------------------------------------


def _stage(c: Conditions, heading: float = 20.0) -> tuple[Project, Stage]:
    stage = Stage("s", poses=(BodyPose("Box", 0.0, 0.0, heading),), conditions=c)
    return Project(hulls=(BOX,), stages=(stage,)), stage


OBLIQUE = Conditions(
    wind_speed_ms=14.0,
    wind_from_deg=75.0,
    current_speed_ms=0.8,
    current_towards_deg=200.0,
    current_coeff_beam=0.8,
)


@pytest.mark.parametrize("flow", ["wind", "current"])
def test_hold_limits_sweep_uses_the_same_loads(flow: str) -> None:
    project, stage = _stage(OBLIQUE)
    c = stage.conditions
    planned = c.wind_from_deg if flow == "wind" else c.current_towards_deg
    speed = c.wind_speed_ms if flow == "wind" else c.current_speed_ms
    problem = hold_limits_problem(
        project,
        stage,
        directions_deg=np.array([planned]),
        flow=flow,  # type: ignore[arg-type]
    )
    swept = problem.wind_unit[:, 0] * speed**2 + problem.fixed
    statics = loads_wrench(condition_loads(BODY, c, 20.0).loads, BODY.centroid)
    assert abs(statics[2]) > 1e4  # the moving centre gives a moment here
    assert swept == pytest.approx(statics, rel=1e-9)


def test_drift_starts_with_the_same_loads() -> None:
    # At rest over the ground the drift's first accelerations times the masses are the
    # statics' wind and current loads, with the moment about G.
    project, stage = _stage(OBLIQUE)
    setup = drift_setup(project, stage)
    motion = setup.base.motion
    dy = motion.derivative()(0.0, motion.start_state(setup.base.start))
    ine = motion.inertia
    cl = condition_loads(BODY, stage.conditions, 20.0)
    statics = loads_wrench(cl.loads, ine.cog)
    assert abs(statics[2]) > 1e4
    got = (dy[3] * ine.surge_kg, dy[4] * ine.sway_kg, dy[5] * ine.yaw_kgm2)
    scale = float(np.abs(statics[:2]).max())
    assert got[0] == pytest.approx(statics[0], abs=1e-9 * scale)
    assert got[1] == pytest.approx(statics[1], abs=1e-9 * scale)
    assert got[2] == pytest.approx(statics[2], abs=1e-9 * scale * L)


def test_current_model_travel_from_its_own_share() -> None:
    c = Conditions(current_centre_head_on=0.25, current_coeff_beam=0.8)
    assert current_model(BODY, c).travel_m == pytest.approx((0.5 - 0.25) * L)
    assert wind_model(BODY, c).travel_m == pytest.approx((0.5 - HUGHES_HEAD_ON) * L)
