"""The hold limits sweep against linprog, a closed form, and its laws."""

from __future__ import annotations

import math
import warnings
from dataclasses import replace

import numpy as np
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st
from scipy.optimize import linprog

from core.model.conditions import Conditions
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from core.solve.holdlimits import (
    HoldLimitsProblem,
    hold_limits,
    hold_limits_problem,
    limit_at,
    zonotope_normals,
)
from tests.core.plan_builders import TF, box_hull


def _problem(*args: object, **kw: object) -> HoldLimitsProblem:
    """The sweep's problem with no goal tolerance: the closed forms and linprog below are
    exact (the tolerance has its own tests, tests/core/test_hold_tolerance.py)."""
    return replace(hold_limits_problem(*args, **kw), tolerance=None)  # type: ignore[arg-type]


# Leads as a planner enters them, in half degrees: lines a millionth of a degree apart make
# the answer hang on the solvers' tolerances rather than on the layout.
LEAD = st.integers(0, 719).map(lambda k: k / 2)

HULL = box_hull("Barge", 80.0, 20.0, freeboard_m=4.0, draught_m=3.0)
POINTS = ("bow", "stern", "port bow", "stbd bow", "port quarter", "stbd quarter")
TIGHT = {"primal_feasibility_tolerance": 1e-10, "dual_feasibility_tolerance": 1e-10}


def _plan(
    leads_deg: list[float],
    bps_t: list[float],
    points: tuple[str, ...] = POINTS,
    heading: float = 0.0,
    conditions: Conditions | None = None,
) -> tuple[Project, Stage]:
    tugs = tuple(Tug(f"T{i}", bp * TF) for i, bp in enumerate(bps_t))
    placements = tuple(
        Placement(f"T{i}", "Barge", points[i % len(points)], 0.0, math.radians(lead), 60.0)
        for i, lead in enumerate(leads_deg)
    )
    stage = Stage(
        "s",
        poses=(BodyPose("Barge", 0.0, 0.0, heading),),
        placements=placements,
        conditions=conditions or Conditions(wind_speed_ms=10.0),
    )
    return Project(hulls=(HULL,), tugs=tugs, stages=(stage,)), stage


def _linprog_limit(gens: np.ndarray, fixed: np.ndarray, wind: np.ndarray) -> float:
    """max s: G g + s w = -fixed, 0 <= g <= 1 (HiGHS), as V = sqrt(s); 0 when s = 0 is
    not feasible (then the winds met form a band that does not start at calm, and no
    wind is held from calm)."""
    n = gens.shape[1]
    sc = np.array([1.0, 1.0, 1 / 80.0]) / max(np.abs(gens).max(), 1.0)
    calm = linprog(
        np.zeros(n),
        A_eq=gens * sc[:, None],
        b_eq=-fixed * sc,
        bounds=[(0, 1)] * n,
        method="highs",
    )
    if calm.status == 2:
        return 0.0
    for options in (TIGHT, {}):  # tight tolerances, or HiGHS's own where they trip it up
        r = linprog(
            np.r_[np.zeros(n), -1.0],
            A_eq=np.c_[gens * sc[:, None], wind * sc],
            b_eq=-fixed * sc,
            bounds=[(0, 1)] * n + [(0, None)],
            method="highs",
            options=options,
        )
        if r.status in (0, 2):
            break
    return math.sqrt(max(r.x[-1], 0.0)) if r.status == 0 else 0.0


def test_closed_form_two_tugs_against_a_beam_wind() -> None:
    # Wind from the starboard beam pushes the barge to port with q C A = 1/2 rho V^2 1.2 (80 x 4);
    # tugs at the starboard bow and quarter lead square to starboard, 30 t each, symmetric
    # about the centroid: they hold while 60 t >= 1/2 * 1.225 * 1.2 * 320 V^2.
    project, stage = _plan([-90.0, -90.0], [30.0, 30.0], ("stbd bow", "stbd quarter"))
    lim = hold_limits(_problem(project, stage))
    v = math.sqrt(60 * TF / (0.5 * 1.225 * 1.2 * 320.0))
    assert limit_at(lim, 90.0) == pytest.approx(v, rel=1e-9)
    # From the other beam the tugs cannot push: no wind can be held.
    assert limit_at(lim, 270.0) == pytest.approx(0.0, abs=1e-9)


@settings(max_examples=40, deadline=None)
@given(
    st.lists(LEAD, min_size=3, max_size=7),
    st.lists(st.floats(10, 80), min_size=7, max_size=7),
    st.one_of(st.just(0.0), st.floats(0.05, 1.5)),  # a current of 1e-5 kn is noise
    st.floats(0, 360),
)
def test_agrees_with_linprog_direction_by_direction(
    leads: list[float], bps: list[float], current_kn: float, current_to: float
) -> None:
    cond = Conditions(
        wind_speed_ms=10.0,
        current_speed_ms=current_kn * 0.514444,
        current_towards_deg=current_to,
    )
    project, stage = _plan(leads, bps[: len(leads)], conditions=cond, heading=35.0)
    problem = _problem(project, stage, directions_deg=np.arange(0.0, 360.0, 15.0))
    lim = hold_limits(problem)
    # Speeds agree to 1e-6 relative; near zero, to 1 mm/s (tolerances on flat cases).
    for k in range(len(problem.directions_deg)):
        ref = _linprog_limit(problem.generators, problem.fixed, problem.wind_unit[:, k])
        assert lim.all_tugs_ms[k] == pytest.approx(ref, rel=1e-6, abs=1e-3)
    # With one tug lost: the least over the tugs of linprog without that tug's column.
    refs = [
        _linprog_limit(
            np.delete(problem.generators, i, axis=1), problem.fixed, problem.wind_unit[:, 3]
        )
        for i in range(len(leads))
    ]
    assert lim.worst_lost_ms[3] == pytest.approx(min(refs), rel=1e-6, abs=1e-3)
    named = problem.tugs.index(lim.worst_lost_tug[3])
    assert refs[named] == pytest.approx(min(refs), rel=1e-6, abs=1e-3)


def test_flat_zonotope_when_no_tug_turns_the_body() -> None:
    # Bow and stern tugs on the centreline leading fore and aft: no moment, no sideways
    # pull: the reachable set is a segment; only head and stern winds can be held.
    project, stage = _plan([0.0, 180.0], [40.0, 40.0], ("bow", "stern"))
    problem = _problem(project, stage, directions_deg=np.array([0.0, 45.0, 180.0]))
    lim = hold_limits(problem)
    v = math.sqrt(40 * TF / (0.5 * 1.225 * 0.8 * 20.0 * 4.0))  # head-on area 20 x 4, C 0.8
    assert lim.all_tugs_ms == pytest.approx([v, 0.0, v], rel=1e-9, abs=1e-9)
    # Bow tug lost: nothing pulls ahead, so a head wind (which pushes astern) cannot be held;
    # stern tug lost: the same for a stern wind. The worst of the two holds neither.
    bow_lost = hold_limits(problem.without(problem.tugs[0]), with_lost=False)
    assert bow_lost.all_tugs_ms == pytest.approx([0.0, 0.0, v], rel=1e-9, abs=1e-9)
    assert lim.worst_lost_ms == pytest.approx([0.0, 0.0, 0.0], abs=1e-9)
    assert lim.worst_lost_tug[0] == problem.tugs[0]


def test_zonotope_normals_bound_the_zonotope() -> None:
    rng = np.random.default_rng(3)
    gens = rng.normal(size=(3, 6))
    normals = zonotope_normals(gens)
    support = np.maximum(normals @ gens, 0).sum(axis=1)
    # Every corner of the zonotope lies inside every half-space and on some of them.
    for bits in range(64):
        corner = gens @ np.array([(bits >> i) & 1 for i in range(6)], dtype=float)
        slack = support - normals @ corner
        assert slack.min() >= -1e-12


def test_current_too_strong_alone_is_held_only_with_a_head_wind() -> None:
    # A 3 m/s current sets the barge ahead with 1/2 rho C A V^2 = 0.5 * 1025 * 0.6 * (20 * 3) * 9;
    # one 5 t stern tug pulls astern. Only a head wind (pushing astern, 1/2 rho C A per (m/s)^2
    # = 0.5 * 1.225 * 0.8 * 80) can make up the rest: the body is held between two speeds.
    cond = Conditions(wind_speed_ms=5.0, current_speed_ms=3.0, current_towards_deg=0.0)
    project, stage = _plan([180.0], [5.0], ("stern",), conditions=cond)
    lim = hold_limits(_problem(project, stage))
    assert not lim.holds_current
    f_current, k_wind = 0.5 * 1025 * 0.6 * 60.0 * 9.0, 0.5 * 1.225 * 0.8 * 80.0
    # No wind is held from calm: the limit is 0; the band is given apart.
    assert np.all(lim.all_tugs_ms == 0.0)
    assert lim.all_tugs_max_ms is not None
    assert lim.all_tugs_max_ms[0] == pytest.approx(math.sqrt(f_current / k_wind), rel=1e-9)
    assert lim.all_tugs_min_ms is not None
    assert lim.all_tugs_min_ms[0] == pytest.approx(
        math.sqrt((f_current - 5 * TF) / k_wind), rel=1e-9
    )
    assert np.all(lim.all_tugs_max_ms[1:] == 0.0)  # from anywhere else the wind cannot help


@pytest.mark.parametrize("tiny", [1e-300, 1e-320])
def test_a_flow_with_next_to_no_load_is_held_at_any_speed(tiny: float) -> None:
    # Found by the file fuzzer: a current coefficient of 1e-300 (coefficients need only be
    # above 0) gave a load so small that the exits overflowed (RuntimeWarning). Its limit
    # from dead ahead lies beyond any speed: unbounded, where the usual 0.6 has one.
    def limits(coeff: float):  # type: ignore[no-untyped-def]
        cond = Conditions(
            wind_speed_ms=5.0,
            current_speed_ms=0.5,
            current_towards_deg=0.0,
            current_coeff_head=coeff,
        )
        project, stage = _plan([0.0, 180.0, 90.0, 270.0], [20.0] * 4, POINTS[:4], conditions=cond)
        with warnings.catch_warnings():
            warnings.simplefilter("error")
            return hold_limits(_problem(project, stage, flow="current"))

    usual, faint = limits(0.6), limits(tiny)
    assert 0.0 < usual.all_tugs_ms[0] < math.inf
    assert faint.all_tugs_ms[0] == math.inf
    assert np.all(np.isfinite(faint.worst_lost_ms) | (faint.worst_lost_ms == math.inf))


leads = st.lists(LEAD, min_size=2, max_size=6)


@settings(max_examples=40, deadline=None)
@given(leads, st.floats(1.1, 4.0))
def test_scaling_every_pull_scales_the_limit_by_its_root(lead: list[float], k: float) -> None:
    # Wind load ~ V^2: with only wind on the body, k times the pulls holds sqrt(k) times the wind.
    project, stage = _plan(lead, [40.0] * len(lead))
    p = _problem(project, stage, directions_deg=np.arange(0.0, 360.0, 10.0))
    base, more = hold_limits(p), hold_limits(p.scaled(k))
    assert more.all_tugs_ms == pytest.approx(base.all_tugs_ms * math.sqrt(k), rel=1e-7, abs=1e-9)
    assert more.worst_lost_ms == pytest.approx(
        base.worst_lost_ms * math.sqrt(k), rel=1e-7, abs=1e-9
    )


def test_doubling_pulls_gives_root_two() -> None:
    project, stage = _plan(
        [-90.0, -90.0, 0.0], [30.0, 30.0, 20.0], ("stbd bow", "stbd quarter", "bow")
    )
    p = _problem(project, stage)
    base, double = hold_limits(p), hold_limits(p.scaled(2.0))
    held = base.all_tugs_ms > 0
    assert (double.all_tugs_ms[held] / base.all_tugs_ms[held]) == pytest.approx(math.sqrt(2.0))


@settings(max_examples=30, deadline=None)
@given(st.lists(st.tuples(st.sampled_from([0, 1, 2]), st.floats(0, 180)), min_size=1, max_size=3))
def test_mirror_symmetric_layout_gives_a_mirror_symmetric_plot(
    pairs: list[tuple[int, float]],
) -> None:
    # Each tug on the port side has its twin on the starboard side with the mirrored lead;
    # heading 000 so that true and relative bearings agree; no current.
    port = ("port bow", "port quarter", "bow")
    stbd = ("stbd bow", "stbd quarter", "bow")
    leads, points = [], []
    for side, lead in pairs:
        leads += [lead, -lead]
        points += [port[side], stbd[side]]
    project, stage = _plan(leads, [30.0] * len(leads), tuple(points))
    lim = hold_limits(_problem(project, stage))
    v = lim.all_tugs_ms
    mirrored = v[(-np.arange(360)) % 360]
    assert v == pytest.approx(mirrored, rel=1e-7, abs=1e-9)
    w = lim.worst_lost_ms
    assert w == pytest.approx(w[(-np.arange(360)) % 360], rel=1e-7, abs=1e-9)


@settings(max_examples=40, deadline=None)
@given(leads, st.one_of(st.just(0.0), st.floats(0.05, 1.0)), st.floats(0, 360))
# found by hypothesis: a slight current puts the start a hair outside a corner of the set of
# lines only towing; with one tug lost the flow's line crosses that set over a sliver, read
# as a window by the lost tug's own sweep and as none by the shared half-spaces
@example([187.5, 22.0, 194.5, 0.0, 20.0, 90.0], 0.125, 0.125)
@example([187.5, 18.0, 201.0, 0.0, 90.0], 0.125, 0.125)
def test_losing_a_tug_never_raises_the_limit(
    lead: list[float], current_kn: float, current_to: float
) -> None:
    cond = Conditions(
        wind_speed_ms=10.0, current_speed_ms=current_kn * 0.514444, current_towards_deg=current_to
    )
    project, stage = _plan(lead, [40.0] * len(lead), conditions=cond)
    p = _problem(project, stage, directions_deg=np.arange(0.0, 360.0, 10.0))
    lim = hold_limits(p)
    assert np.all(
        lim.worst_lost_ms <= lim.all_tugs_ms * (1 + 1e-7) + 1e-9
    )  # rounding on near-parallel lines
    # And the worst lost curve is the least of the sweeps of the problem without each tug,
    # each direction naming a tug whose own sweep gives it.
    each = [hold_limits(p.without(t), with_lost=False) for t in p.tugs]
    rows = np.array([e.all_tugs_ms for e in each])
    # Where the start lies a hair outside the set with a tug lost and the flow's line
    # crosses it over a sliver (in and out within 1e-4 of the speed), whether there is a
    # window at all hangs on rounding in the facets (HiGHS's own answer flips with its
    # tolerances there): the sliver and none are both allowed.
    lows = np.array(
        [e.all_tugs_ms if e.all_tugs_min_ms is None else e.all_tugs_min_ms for e in each]
    )
    sliver = (rows > 0) & (rows - lows <= 1e-4 * rows)
    rows_or_none = np.where(sliver, 0.0, rows)
    low, high = rows_or_none.min(axis=0), rows.min(axis=0)
    got = lim.worst_lost_ms
    close = np.isclose(got, high, rtol=1e-7, atol=1e-9) | np.isclose(got, low, rtol=1e-7, atol=1e-9)
    assert close.all(), (got[~close], high[~close], low[~close])
    named = [p.tugs.index(t) for t in lim.worst_lost_tug]
    own = rows[named, np.arange(rows.shape[1])]
    own_or_none = rows_or_none[named, np.arange(rows.shape[1])]
    assert np.all(
        np.isclose(own, got, rtol=1e-7, atol=1e-9) | np.isclose(own_or_none, got, atol=1e-9)
    )


def test_worst_lost_names_the_tug() -> None:
    project, stage = _plan([-90.0, -90.0], [50.0, 20.0], ("stbd bow", "stbd quarter"))
    lim = hold_limits(_problem(project, stage))
    assert lim.worst_lost_tug[90] in ("T0", "T1")
    assert lim.worst_lost_ms[90] == pytest.approx(0.0, abs=1e-9)  # one tug alone turns the body


LIVE_LEADS = [90.0, 270.0, 45.0, 180.0, 0.0, 200.0, 250.0, 100.0]


def test_live_sweep_is_the_full_sweep_on_fewer_directions() -> None:
    from core.solve.holdlimits import live_hold_limits

    cond = Conditions(wind_speed_ms=10.0, current_speed_ms=0.4, current_towards_deg=30.0)
    # eight fixed leads that hold the current with any one tug lost (with the first four
    # alone the current is not held in calm, and no wind is: every limit would be 0)
    project, stage = _plan(LIVE_LEADS, [30.0, 40.0, 25.0] + [20.0] * 5, conditions=cond)
    p = _problem(project, stage, directions_deg=np.arange(0.0, 360.0, 5.0))
    full = hold_limits(p)
    lim, dirs, worst = live_hold_limits(p, lost_step=2)
    assert lim.all_tugs_ms == pytest.approx(full.all_tugs_ms, rel=1e-12)
    assert list(dirs) == list(p.directions_deg[::2])
    assert worst == pytest.approx(full.worst_lost_ms[::2], rel=1e-12)


@pytest.mark.parametrize("sectors", [False, True])
def test_the_live_sweep_in_steps_is_the_sweep_in_one_go(sectors: bool) -> None:
    """A plot that follows a drag works the sweep a step at a time: several steps, and
    what they end with is the same sweep (with working sectors, the walk to the fine set
    is a step of its own)."""
    from core.solve.holdlimits import live_hold_limits, live_hold_limits_steps

    cond = Conditions(wind_speed_ms=10.0, current_speed_ms=0.4, current_towards_deg=30.0)
    # eight fixed leads that hold the current with any one tug lost (with the first four
    # alone the current is not held in calm, and no wind is: every limit would be 0)
    project, stage = _plan(LIVE_LEADS, [30.0, 40.0, 25.0] + [20.0] * 5, conditions=cond)
    if sectors:
        wide = tuple(
            replace(p, lead_sector_rad=(p.lead_rad - 0.6, p.lead_rad + 0.6))
            for p in stage.placements
        )
        stage = replace(stage, placements=wide)
        project = replace(project, stages=(stage,))
    p = _problem(project, stage, directions_deg=np.arange(0.0, 360.0, 5.0))
    assert (p.coarse is not None) == sectors
    steps = live_hold_limits_steps(p, lost_step=2)
    taken = 0
    while True:
        try:
            next(steps)
        except StopIteration as done:
            lim, dirs, worst = done.value
            break
        taken += 1
    assert taken >= 3
    ref, ref_dirs, ref_worst = live_hold_limits(p, lost_step=2)
    assert lim.all_tugs_ms == pytest.approx(ref.all_tugs_ms, rel=1e-12)
    assert list(dirs) == list(ref_dirs)
    assert worst == pytest.approx(ref_worst, rel=1e-12)
    full = hold_limits(p)
    assert lim.all_tugs_ms == pytest.approx(full.all_tugs_ms, rel=1e-12)
    assert worst == pytest.approx(full.worst_lost_ms[::2], rel=1e-12)
