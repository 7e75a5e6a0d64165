"""Solve pulls and the tug lost check, against linprog, Fossen's pseudo-inverse and the laws."""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.optimize import linprog

from core.analysis.stage import balance_of
from core.errors import InputError
from core.model.conditions import Conditions
from core.model.goals import Goal, goal_from_parts
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from core.solve.pulls import (
    goal_tolerance,
    pulls_problem,
    solve_pulls,
    tug_lost_check,
)
from tests.core.plan_builders import TF, box_hull

# Leads as a planner enters them, in half degrees: lines a millionth of a degree apart make
# the answer hang on the solvers' tolerances rather than on the layout.
LEAD = st.integers(0, 719).map(lambda k: k / 2)

LINE_POINTS = ("bow", "stern", "port bow", "stbd bow", "port quarter", "stbd quarter")
HULL = box_hull("Barge", 80.0, 20.0, freeboard_m=4.0, draught_m=3.0)
CENTROID = (40.0, 0.0)
# HiGHS's default feasibility tolerance (1e-7) is coarse beside small goals: tighten it.
TIGHT = {"primal_feasibility_tolerance": 1e-10, "dual_feasibility_tolerance": 1e-10}


def _plan(
    leads_deg: list[float],
    bps_t: list[float],
    conditions: Conditions | None = None,
    goal: Goal | None = None,
    points: tuple[str, ...] = LINE_POINTS,
) -> tuple[Project, Stage]:
    tugs = tuple(Tug(f"T{i}", bp * TF) for i, bp in enumerate(bps_t))
    placements = tuple(
        Placement(f"T{i}", "Barge", points[i % len(points)], 0.3, math.radians(lead), 60.0)
        for i, lead in enumerate(leads_deg)
    )
    stage = Stage(
        "s",
        poses=(BodyPose("Barge"),),
        placements=placements,
        conditions=conditions or Conditions(),
        goal=goal,
    )
    return Project(hulls=(HULL,), tugs=tugs, stages=(stage,)), stage


def _independent_b(stage: Stage) -> np.ndarray:
    """(3, n) per-newton effects written out by hand for line points on the box hull."""
    cols = []
    for p in stage.placements:
        f = HULL.fitting(p.point)
        dx, dy = math.cos(p.lead_rad), math.sin(p.lead_rad)
        cols.append((dx, dy, (f.x - CENTROID[0]) * dy - (f.y - CENTROID[1]) * dx))
    return np.array(cols).T


def _linprog_allocation(b: np.ndarray, u: np.ndarray, tau: np.ndarray) -> tuple[float, float]:
    """(least largest setting, least total pull at it) by two HiGHS solves, or (inf, inf).

    Variables are the pulls as fractions g of usable pull; rows are scaled to order one.
    """
    n = len(u)
    scale = np.array([1.0, 1.0, 1.0 / 80.0]) / u.max()
    bs, ts = b * u * scale[:, None], tau * scale  # (3, n) per unit g
    r1 = linprog(
        np.r_[np.zeros(n), 1.0],
        A_ub=np.c_[np.eye(n), -np.ones(n)],
        b_ub=np.zeros(n),
        A_eq=np.c_[bs, np.zeros(3)],
        b_eq=ts,
        bounds=[(0, 1) for _ in range(n)] + [(0, None)],
        method="highs",
        options=TIGHT,
    )
    if r1.status != 0:
        return math.inf, math.inf
    t = float(r1.x[-1])
    r2 = linprog(
        u, A_eq=bs, b_eq=ts, bounds=[(0, t * (1 + 1e-9))] * n, method="highs", options=TIGHT
    )
    return t, float(r2.fun) if r2.status == 0 else math.nan


leads = st.lists(LEAD, min_size=3, max_size=8)


@settings(max_examples=120, deadline=None)
@given(
    leads,
    st.lists(st.floats(20, 80), min_size=8, max_size=8),
    st.floats(-300, 300),
    st.floats(-300, 300),
    st.floats(-5000, 5000),
)
def test_solved_pulls_match_an_independent_linprog(
    leads_deg: list[float], bps: list[float], fx_t: float, fy_t: float, m_tm: float
) -> None:
    goal = Goal("force", fx_t * 1e3, fy_t * 1e3, m_tm * 1e4)
    project, stage = _plan(leads_deg, bps[: len(leads_deg)], goal=goal)
    result = solve_pulls(pulls_problem(project, stage))
    u = np.array([bp * TF for bp in bps[: len(leads_deg)]])
    t, total = _linprog_allocation(_independent_b(stage), u, np.array(goal.target()))
    miss = np.abs(result.achieved - np.array(goal.target())) / np.array([1, 1, 80]) / u.max()
    if math.isinf(t) or t > 1 + 1e-7:
        # Out of reach for HiGHS: ours must say so too, unless it comes within the
        # program's stated tolerance of the goal (goal_tolerance: GOAL_TOL of what the
        # goal asks of the tugs).
        tol = goal_tolerance(result.problem) / np.array([1, 1, 80]) / u.max()
        assert not result.feasible or np.all(miss <= tol * (1 + 1e-9))
        return
    if t < 1 - 1e-7:
        assert result.feasible
    if result.feasible:
        assert result.largest_setting == pytest.approx(t, rel=1e-6, abs=1e-8)
        if not math.isnan(total):
            assert result.total_pull_n == pytest.approx(total, rel=1e-5, abs=1e-2)


@settings(max_examples=150, deadline=None)
@given(
    leads,
    st.floats(0, 40),
    st.floats(0, 360),
    st.one_of(st.just(0.0), st.floats(0.05, 2.0)),
    st.floats(0, 360),
    st.sampled_from(["hold", "walk", "swing", "transit", "force"]),
)
def test_laws_of_any_solve(
    leads_deg: list[float],
    wind_kn: float,
    wind_from: float,
    current_kn: float,
    current_to: float,
    kind: str,
) -> None:
    cond = Conditions(
        wind_speed_ms=wind_kn * 0.514444,
        wind_from_deg=wind_from,
        current_speed_ms=current_kn * 0.514444,
        current_towards_deg=current_to,
    )
    goal = goal_from_parts(kind, 5 * TF, -8 * TF, 300 * TF)
    project, stage = _plan(leads_deg, [40.0] * len(leads_deg), cond, goal)
    problem = pulls_problem(project, stage)
    r = solve_pulls(problem)
    # No pull outside its limits, ever.
    assert np.all(r.pulls_n >= 0)
    assert np.all(r.pulls_n <= problem.usable_n)
    # The shortfall is what is missing, and zero when the goal is met.
    if r.feasible:
        # "Met" means within goal_tolerance: GOAL_TOL of what the goal asks of the tugs
        # (at least GOAL_FLOOR of the largest usable pull).
        tol_f, _, tol_m = goal_tolerance(problem) * (1 + 1e-6)
        target = np.array(goal.target())
        assert np.abs(r.net - target)[:2].max() <= tol_f
        assert abs(r.net[2] - target[2]) <= tol_m
        if kind == "hold":
            # A solved hold leaves tugs plus conditions at zero: check through the balance.
            bal = balance_of(project, r.applied_to(stage))
            assert np.abs(bal.net_force).max() <= tol_f
            assert abs(bal.moment_centroid_nm) <= tol_m
    else:
        assert np.any(r.shortfall != 0)
        assert r.shortfall == pytest.approx(problem.required - r.achieved)


def test_three_tugs_equal_fossens_pseudo_inverse() -> None:
    # Fossen, Handbook of Marine Craft Hydrodynamics and Motion Control (2021), ch. 11:
    # f = W^-1 B^T (B W^-1 B^T)^-1 tau. With three independent tugs the allocation is unique.
    project, stage = _plan([90.0, 270.0, 0.0], [50.0, 50.0, 50.0], points=("bow", "stern", "bow"))
    tau = np.array([10 * TF, 5 * TF, 400 * TF])
    r = solve_pulls(pulls_problem(project, stage, goal=Goal("force", *tau)))
    b = _independent_b(stage)
    w_inv = np.eye(3)
    f = w_inv @ b.T @ np.linalg.solve(b @ w_inv @ b.T, tau)
    assert np.all(f >= 0)
    assert r.pulls_n == pytest.approx(f, rel=1e-9)


@settings(max_examples=60, deadline=None)
@given(st.lists(LEAD, min_size=4, max_size=6), st.integers(0, 2**31))
def test_min_max_never_worse_than_the_pseudo_inverse(leads_deg: list[float], seed: int) -> None:
    # Where Fossen's unconstrained pseudo-inverse happens to respect the limits, it is one
    # allowed allocation: the solved largest setting can only be lower or equal.
    project, stage = _plan(leads_deg, [50.0] * len(leads_deg))
    b = _independent_b(stage)
    rng = np.random.default_rng(seed)
    f_true = rng.uniform(0, 0.5, len(leads_deg)) * 50 * TF
    tau = b @ f_true
    f = b.T @ np.linalg.lstsq(b @ b.T, tau, rcond=None)[0]
    r = solve_pulls(pulls_problem(project, stage, goal=Goal("force", *tau)))
    assert r.feasible
    if np.all(f >= 0) and np.all(f <= 50 * TF):
        assert r.largest_setting <= f.max() / (50 * TF) + 1e-9
    assert r.largest_setting <= f_true.max() / (50 * TF) + 1e-9


def test_impossible_goal_returns_the_shortfall() -> None:
    # Both tugs lead to port; walking to starboard cannot be done at all: no pull helps,
    # so the closest state is no pull and the shortfall is the whole goal.
    project, stage = _plan([90.0, 90.0], [50.0, 50.0], points=("port bow", "port quarter"))
    goal = Goal("walk", 0.0, -20 * TF)
    r = solve_pulls(pulls_problem(project, stage, goal=goal))
    assert not r.feasible
    assert r.pulls_n == pytest.approx([0.0, 0.0], abs=1e-6)
    assert r.shortfall == pytest.approx([0.0, -20 * TF, 0.0], abs=1e-6)


def test_too_big_a_goal_is_met_as_far_as_it_goes() -> None:
    # Two 50 t tugs on the port bow and quarter leading to port: at most 100 t to port.
    project, stage = _plan([90.0, 90.0], [50.0, 50.0], points=("port bow", "port quarter"))
    r = solve_pulls(pulls_problem(project, stage, goal=Goal("walk", 0.0, 130 * TF)))
    assert not r.feasible
    assert r.pulls_n == pytest.approx([50 * TF, 50 * TF])
    assert r.shortfall == pytest.approx([0.0, 30 * TF, 0.0], abs=1e-3)


def test_hold_against_beam_wind_shares_the_work() -> None:
    # Wind on the port beam (from 270, heading 000) pushes 23.5 t to starboard (q A C);
    # two equal tugs at the port bow and quarter leading to port hold it at equal pulls.
    cond = Conditions(wind_speed_ms=20.0, wind_from_deg=270.0)
    project, stage = _plan([90.0, 90.0], [50.0, 50.0], cond, points=("port bow", "port quarter"))
    r = solve_pulls(pulls_problem(project, stage))
    wind = 245.0 * 1.2 * 80.0 * 4.0  # N, q = 245 Pa at 20 m/s (ISO 2533 air)
    assert r.feasible
    assert r.pulls_n == pytest.approx([wind / 2, wind / 2])


def test_lead_sector_is_solved_within_the_sector() -> None:
    # The bow tug may lead from the starboard beam round to ahead, the stern tug from astern
    # round to the starboard beam (both sectors counter-clockwise from low to high). Asked
    # to walk the barge to starboard with no swing, both must lead square to starboard.
    project, stage = _plan([0.0, 180.0], [50.0, 50.0], points=("bow", "stern"))
    bow = replace(stage.placement("T0"), lead_sector_rad=(-math.pi / 2, 0.0))
    stern = replace(stage.placement("T1"), lead_sector_rad=(-math.pi, -math.pi / 2))
    stage = stage.with_placement(bow).with_placement(stern)
    r = solve_pulls(pulls_problem(project, stage, goal=Goal("walk", 0.0, -30 * TF)))
    assert r.feasible
    assert r.leads_rad == pytest.approx([-math.pi / 2, -math.pi / 2], abs=1e-6)
    assert r.pulls_n == pytest.approx([15 * TF, 15 * TF], rel=1e-6)
    bal = balance_of(project, r.applied_to(stage))
    assert bal.net_force == pytest.approx((0.0, -30 * TF), abs=1e-3)
    assert bal.moment_centroid_nm == pytest.approx(0.0, abs=1e-2)


def test_lead_sector_lead_between_candidates_is_exact() -> None:
    # A single bow tug free from ahead to the starboard beam, asked for a force 37 deg to
    # starboard of ahead (between the 5 deg candidates) with the moment that force makes.
    project, stage = _plan([0.0], [50.0], points=("bow",))
    stage = stage.with_placement(
        replace(stage.placement("T0"), lead_sector_rad=(-math.pi / 2, 0.0))
    )
    a = -math.radians(37.0)
    f = 20 * TF
    goal = Goal("force", f * math.cos(a), f * math.sin(a), 40.0 * f * math.sin(a))
    r = solve_pulls(pulls_problem(project, stage, goal=goal))
    assert r.feasible
    assert r.leads_rad[0] == pytest.approx(a, abs=1e-9)
    assert r.pulls_n[0] == pytest.approx(f, rel=1e-9)


def test_a_line_sector_wider_than_a_half_turn_is_solved_within_it() -> None:
    # A bow tug whose line may lead anywhere from the starboard quarter round the bow to the
    # port quarter (270 deg) pulls astern-to-starboard only through its sector's ends.
    project, stage = _plan([0.0], [50.0], points=("bow",))
    p = replace(stage.placement("T0"), lead_sector_rad=(-math.radians(135), math.radians(135)))
    stage = stage.with_placement(p)
    f = 10 * TF
    a = math.radians(90.0)  # square to port, with the moment a bow pull to port makes
    goal = Goal("force", 0.0, f, 40.0 * f)
    r = solve_pulls(pulls_problem(project, stage, goal=goal))
    assert r.feasible
    assert r.leads_rad[0] == pytest.approx(a, abs=1e-9)
    with pytest.raises(InputError, match="must be a finite number"):
        replace(p, lead_sector_rad=(0.0, math.inf))


def test_tug_lost_check_names_the_loss_that_hurts_most() -> None:
    # Four tugs hold a beam wind; the big tug on the port bow is the one we cannot lose.
    cond = Conditions(wind_speed_ms=20.0, wind_from_deg=270.0)
    project, stage = _plan(
        [90.0, 90.0, 90.0, 0.0],
        [60.0, 15.0, 15.0, 20.0],
        cond,
        points=("port bow", "port quarter", "port quarter", "bow"),
    )
    check = tug_lost_check(pulls_problem(project, stage))
    assert check.full.feasible
    by_tug = {c.tug: c for c in check.cases}
    assert not by_tug["T0"].holds
    assert by_tug["T3"].holds
    assert not check.passes
    assert check.worst is not None and check.worst.tug == "T0"


def test_no_tugs_is_a_shortfall_not_an_error() -> None:
    cond = Conditions(wind_speed_ms=10.0, wind_from_deg=90.0)
    project, stage = _plan([], [], cond)
    r = solve_pulls(pulls_problem(project, stage, body="Barge"))
    assert not r.feasible
    assert r.shortfall[1] < 0  # the wind pushes to port; the tugs would have to pull to starboard


@settings(max_examples=40, deadline=None)
@given(
    st.lists(LEAD, min_size=9, max_size=14),
    st.lists(st.floats(20, 80), min_size=14, max_size=14),
    st.floats(-200, 200),
    st.floats(-200, 200),
    st.floats(-3000, 3000),
)
def test_tug_lost_check_of_a_large_fleet_matches_linprog(
    leads_deg: list[float], bps: list[float], fx_t: float, fy_t: float, m_tm: float
) -> None:
    # From ZONOTOPE_FROM tugs on, every loss's solve reads the whole fleet's half-spaces
    # (core.solve.zonotope) instead of making its own: each case must still be HiGHS's
    # answer for the fleet less that tug, and the solve of that fleet on its own.
    goal = Goal("force", fx_t * 1e3, fy_t * 1e3, m_tm * 1e4)
    project, stage = _plan(leads_deg, bps[: len(leads_deg)], goal=goal)
    problem = pulls_problem(project, stage)
    check = tug_lost_check(problem)
    b = _independent_b(stage)
    u = np.array([bp * TF for bp in bps[: len(leads_deg)]])
    for i, case in enumerate(check.cases):
        alone = solve_pulls(problem.without(case.tug))
        assert case.result.feasible == alone.feasible
        # the same optimum; the pulls the same to the solvers' rounding (a millionth)
        assert case.result.largest_setting == pytest.approx(alone.largest_setting, rel=1e-9)
        assert case.result.total_pull_n == pytest.approx(alone.total_pull_n, rel=1e-6)
        np.testing.assert_allclose(case.result.pulls_n, alone.pulls_n, atol=1e-6 * u.max())
        keep = np.arange(len(u)) != i
        t, _total = _linprog_allocation(b[:, keep], u[keep], np.array(goal.target()))
        if case.result.feasible and not math.isinf(t):
            assert case.result.largest_setting == pytest.approx(t, rel=1e-6, abs=1e-8)
        if t < 1 - 1e-7:
            assert case.holds
