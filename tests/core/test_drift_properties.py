"""Laws the drift must keep, for any plan (hypothesis): mirror images drift as mirror
images, the kinetic energy is kept without drag and only lost with it, and the adaptive
track agrees with a fixed-step integration whose step halving no longer changes it."""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

from core.mechanics.loads import FlowModel
from core.mechanics.site import Placing
from core.model.conditions import Conditions
from core.model.drift import DriftSettings
from core.model.plan import BodyPose, Project, Site, SiteFeature, Stage
from core.model.tugs import Placement, Tug
from core.motion.drift import DriftScenario, solve_drift
from core.motion.dynamics import Motion, Strip, WaterDrag, rk4
from core.motion.scenarios import drift, drift_setup
from tests.core.drift_builders import INERTIA, problem
from tests.core.plan_builders import TF, box_hull

KNOT = 1852.0 / 3600.0
#: What the integration is good to along a two-minute track, m (RTOL 1e-6 on tracks of
#: tens of metres, accumulated): the step-halving check must stay below it.
TRACK_TOL_M = 0.01

MIRROR = {
    "bow": "bow",
    "stern": "stern",
    "port bow": "stbd bow",
    "stbd bow": "port bow",
    "port quarter": "stbd quarter",
    "stbd quarter": "port quarter",
    "port pad": "stbd pad",
    "stbd pad": "port pad",
}

tug_setups = st.lists(
    st.tuples(
        st.sampled_from(sorted(MIRROR)),
        st.floats(0.0, 1.0),
        st.floats(-math.pi, math.pi),
    ),
    min_size=1,
    max_size=4,
)


def _plan(
    tugs: list[tuple[str, float, float]],
    wind: tuple[float, float],
    current: tuple[float, float],
    pose: tuple[float, float, float],
) -> Project:
    hull = box_hull("Barge", 70.0, 22.0, draught_m=3.0, freeboard_m=4.0, displacement_kg=4.5e6)
    names = [f"T{i}" for i in range(len(tugs))]
    placements = []
    for name, (point, setting, lead) in zip(names, tugs, strict=True):
        if point.endswith("pad"):
            lead = max(-1.0, min(1.0, lead))  # a push stays within 57 deg of square
        placements.append(Placement(name, "Barge", point, setting, lead, 40.0))
    stage = Stage(
        "Drift",
        poses=(BodyPose("Barge", *pose),),
        placements=tuple(placements),
        conditions=Conditions(
            wind_speed_ms=wind[0],
            wind_from_deg=wind[1],
            current_speed_ms=current[0],
            current_towards_deg=current[1],
        ),
    )
    site = Site(
        "Basin",
        (
            SiteFeature("Quay", "quay", ((-300.0, 150.0), (300.0, 90.0))),
            SiteFeature("D1", "dolphin", ((120.0, -60.0), (126.0, -60.0), (126.0, -54.0)), True),
        ),
    )
    return Project(
        hulls=(hull,),
        tugs=tuple(Tug(n, 40 * TF) for n in names),
        site=site,
        stages=(stage,),
        drift=DriftSettings(horizon_s=180.0),
    )


def _mirrored(project: Project) -> Project:
    """The plan mirrored in the site's east-west axis (y -> -y)."""
    s = project.stages[0]
    pose = s.poses[0]
    c = s.conditions
    mirrored = replace(
        s,
        poses=(BodyPose(pose.body, pose.x, -pose.y, (180.0 - pose.heading_deg) % 360.0),),
        placements=tuple(
            replace(p, point=MIRROR[p.point], lead_rad=-p.lead_rad) for p in s.placements
        ),
        conditions=replace(
            c,
            wind_from_deg=(180.0 - c.wind_from_deg) % 360.0,
            current_towards_deg=(180.0 - c.current_towards_deg) % 360.0,
        ),
    )
    site = replace(
        project.site,
        features=tuple(
            SiteFeature(f.name, f.kind, tuple((x, -y) for x, y in f.points), f.closed)
            for f in project.site.features
        ),
    )
    return replace(project, stages=(mirrored,), site=site)


#: How closely a mirror image's drift must mirror the plan's: to what the integration is
#: good to (RTOL 1e-6, TRACK_TOL_M). The arithmetic mirrors all but exactly, except at the
#: wrap of the heading angle (a heading of 270, -pi, which a float does not hold exactly):
#: there the adaptive steps may be chosen differently, and the tracks part by about 2e-4 m
#: on a 100 m track. A sign slip in the mirror shows as metres and knots.
MIRROR_M = TRACK_TOL_M
MIRROR_TURN = 1e-4  # sin and cos of the heading: 0.01 m at the end of a 70 m barge
MIRROR_SPEED = 1e-3  # m/s and rad/s


@settings(max_examples=25, deadline=None)
@given(
    tugs=tug_setups,
    wind=st.tuples(st.floats(0.0, 30 * KNOT), st.floats(0.0, 359.0)),
    current=st.tuples(st.floats(0.0, 2 * KNOT), st.floats(0.0, 359.0)),
    pose=st.tuples(st.floats(-50, 50), st.floats(-40, 40), st.floats(0.0, 359.0)),
    scenario=st.sampled_from(["as_set", "let_go", "tug_lost"]),
)
# found by hypothesis: heading 270 (the wrap), tracks apart by 4e-5 m and 2.4e-4 m, and
# the contact 3e-4 s apart in 156 s
@example([("bow", 1.0, 1.0)], (0.0, 0.0), (0.0, 0.0), (0.0, 34.0, 270.0), "as_set")
@example(
    [("bow", 1.0, 1.0), ("port bow", 1.0, 0.0)],
    (8.0, 45.0),
    (0.979498107940703, 56.14168452617458),
    (22.722603253431046, -10.460737170623627, 270.0),
    "as_set",
)
def test_mirror_image_plans_drift_as_mirror_images(
    tugs: list[tuple[str, float, float]],
    wind: tuple[float, float],
    current: tuple[float, float],
    pose: tuple[float, float, float],
    scenario: str,
) -> None:
    plan = _plan(tugs, wind, current, pose)
    sc = DriftScenario(scenario, "T0" if scenario == "tug_lost" else None)  # type: ignore[arg-type]
    a = drift(plan, plan.stages[0], sc)
    b = drift(_mirrored(plan), _mirrored(plan).stages[0], sc)
    assert a is not None and b is not None
    assert (a.contact is None) == (b.contact is None)
    if a.contact is not None and b.contact is not None:
        assert b.contact.time_s == pytest.approx(a.contact.time_s, rel=1e-5, abs=1e-3)
        assert b.contact.other == a.contact.other
        mirrored_point = (a.contact.point[0], -a.contact.point[1])
        assert b.contact.point == pytest.approx(mirrored_point, abs=MIRROR_M)
    ga, gb = a.ghost_states, b.ghost_states
    assert gb.shape == ga.shape
    assert gb[:, 0] == pytest.approx(ga[:, 0], abs=MIRROR_M)
    assert gb[:, 1] == pytest.approx(-ga[:, 1], abs=MIRROR_M)
    assert np.sin(gb[:, 2]) == pytest.approx(-np.sin(ga[:, 2]), abs=MIRROR_TURN)
    assert np.cos(gb[:, 2]) == pytest.approx(np.cos(ga[:, 2]), abs=MIRROR_TURN)
    assert gb[:, 3:] * [1, -1, -1] == pytest.approx(ga[:, 3:], abs=MIRROR_SPEED)


forces = st.tuples(st.floats(-300e3, 300e3), st.floats(-300e3, 300e3), st.floats(-10e6, 10e6))
velocities = st.tuples(st.floats(-1.5, 1.5), st.floats(-1.5, 1.5))


def _motion(
    tug: tuple[float, float, float],
    wind: tuple[float, float],
    current: tuple[float, float],
) -> Motion:
    return Motion(
        INERTIA,
        tug=tug,
        wind=FlowModel("wind", 0.5 * 1.225 * 0.8 * 80.0, 0.5 * 1.225 * 1.2 * 240.0, (5.0, 0.0)),
        wind_velocity=(wind[0] * 10, wind[1] * 10),
        water=WaterDrag(
            0.5 * 1025 * 0.6 * 60.0, 0.0, (Strip(-30.0, 30.0, 0.5 * 1025 * 0.8 * 3.0),)
        ),
        current_velocity=current,
    )


@settings(max_examples=15, deadline=None)
@given(tug=forces, wind=velocities, current=velocities, heading=st.floats(-math.pi, math.pi))
def test_halving_the_fixed_step_no_longer_changes_the_track(
    tug: tuple[float, float, float],
    wind: tuple[float, float],
    current: tuple[float, float],
    heading: float,
) -> None:
    motion = _motion(tug, wind, current)
    p = problem(motion, start=Placing(0.0, 0.0, heading), horizon_s=120.0)
    f = motion.derivative()
    y0 = motion.start_state(p.start)
    _t1, y1 = rk4(f, y0, 120.0, 1.0)
    _t2, y2 = rk4(f, y0, 120.0, 0.5)
    assert np.abs(y2[::2, :2] - y1[:, :2]).max() < TRACK_TOL_M
    # The adaptive integration agrees with the fixed-step one to the same tolerance.
    r = solve_drift(p)
    at = [round(t / 0.5) for t in r.ghost_times]
    assert np.abs(r.ghost_states[:, :2] - y2[at, :2]).max() < TRACK_TOL_M
    # and the heading to what moves the ends (30 m from G) by as much.
    assert np.abs(r.ghost_states[:, 2] - y2[at, 2]).max() < TRACK_TOL_M / 30.0


@settings(max_examples=20, deadline=None)
@given(
    u=st.floats(-2.0, 2.0),
    v=st.floats(-2.0, 2.0),
    r=st.floats(-0.05, 0.05),
    current=velocities,
)
def test_kinetic_energy_is_kept_without_drag_and_lost_with_it(
    u: float, v: float, r: float, current: tuple[float, float]
) -> None:
    free = Motion(INERTIA, current_velocity=current)
    a = solve_drift(problem(free, velocity=(u, v, r), horizon_s=120.0))
    energy = free.kinetic_energy(a.states)
    assert energy == pytest.approx(energy[0], rel=1e-5, abs=1.0)
    damped = replace(free, water=WaterDrag(3e4, 0.0, (Strip(-30.0, 30.0, 1000.0),)))
    b = solve_drift(problem(damped, velocity=(u, v, r), horizon_s=120.0))
    e = damped.kinetic_energy(b.states)
    assert (np.diff(e) <= 1e-6 * max(e[0], 1.0)).all()


def test_tug_lost_takes_away_exactly_that_tugs_pull() -> None:
    plan = _plan(
        [("port bow", 0.6, 1.2), ("stern", 0.4, 3.0)], (8.0, 250.0), (0.3, 40.0), (0, 0, 30)
    )
    setup = drift_setup(plan, plan.stages[0])
    full = np.array(setup.problem(DriftScenario("as_set")).motion.tug)
    lost = np.array(setup.problem(DriftScenario("tug_lost", "T0")).motion.tug)
    assert full - lost == pytest.approx(setup.tug_wrenches[0], rel=1e-12)
    let_go = setup.problem(DriftScenario("let_go")).motion.tug
    assert let_go == (0.0, 0.0, 0.0)
