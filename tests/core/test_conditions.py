"""Wind and current: the drag formula, the power law, frames and loads on a body."""

from __future__ import annotations

import math
from dataclasses import replace

import pytest
import shapely

from core.analysis.stage import balance_of
from core.errors import InputError
from core.mechanics.balance import Load
from core.mechanics.bodies import body_of
from core.mechanics.loads import (
    HOERNER_CROSS_FLOW,
    condition_loads,
    current_model,
    drag_force,
    dynamic_pressure,
    hoerner_cross_flow,
    load_words,
    loads_wrench,
    projection,
    wind_model,
)
from core.model.conditions import Conditions, wind_at_10m, wind_at_height
from core.model.hull import Hull
from core.model.outlines import box_outline
from core.model.plan import BodyPose, GroupMember, LashedGroup, Project, Stage
from core.units import DisplayUnits
from tests.core.plan_builders import TF, box_hull

RHO_AIR = 1.225  # kg/m^3, ISO 2533 standard atmosphere at 15 C (from memory)
RHO_SEA_ITTC = 1026.02  # kg/m^3, ITTC 7.5-02-01-03 (2011), 15 C, S = 35.165 g/kg (read)


def _project(hull: Hull, heading: float, c: Conditions) -> tuple[Project, Stage]:
    stage = Stage("s", poses=(BodyPose(hull.name, 0.0, 0.0, heading),), conditions=c)
    return Project(hulls=(hull,), stages=(stage,)), stage


# -- formulas against outside references ------------------------------------------------


def test_dynamic_pressure_at_20_ms_iso_2533_air() -> None:
    # REFERENCES.md: q = 1/2 rho V^2 = 245.0 Pa at 20 m/s with rho = 1.225 (ISO 2533).
    assert dynamic_pressure(RHO_AIR, 20.0) == pytest.approx(245.0, rel=1e-12)


def test_drag_force_with_ittc_seawater() -> None:
    # F = 1/2 rho C A V^2 (drag formula), ITTC seawater density: 0.5 * 1026.02 * 0.7 * 300 * 1.5^2.
    assert drag_force(RHO_SEA_ITTC, 0.7, 300.0, 1.5) == pytest.approx(242397.225, rel=1e-12)


def test_power_law_u5_over_u10() -> None:
    # DNV-RP-C205 (from memory): U(z) = U10 (z/10)^0.12; U5/U10 = 0.9202.
    assert wind_at_height(10.0, 5.0, 0.12) / 10.0 == pytest.approx(0.9202, abs=5e-5)
    # and back: a wind of 9.202 m/s read at 5 m is 10 m/s at 10 m.
    assert wind_at_10m(9.202, 5.0, 0.12) == pytest.approx(10.0, abs=5e-4)


def test_power_law_one_seventh_at_40_m() -> None:
    # Common practice 1/7 law: U40/U10 = 4^(1/7) = 1.2190 (computed by hand).
    assert wind_at_height(1.0, 40.0, 1 / 7) == pytest.approx(1.21901, rel=1e-5)


@pytest.mark.parametrize(("ratio", "cd"), HOERNER_CROSS_FLOW)
def test_hoerner_table_points(ratio: float, cd: float) -> None:
    # Hoerner, Fluid-Dynamic Drag, via Leite et al. 1998 (read): the tabulated points.
    assert hoerner_cross_flow(ratio) == pytest.approx(cd)


def test_hoerner_between_points_and_beyond() -> None:
    # Linear between 1.64 (0.691) and 3.01 (0.587), held beyond 4.0 (0.559).
    mid = (1.64 + 3.01) / 2
    assert hoerner_cross_flow(mid) == pytest.approx((0.691 + 0.587) / 2)
    assert hoerner_cross_flow(9.0) == pytest.approx(0.559)


# -- loads on a box barge ------------------------------------------------------------------


BOX = Hull("Box", box_outline(100.0, 20.0), draught_m=4.0, freeboard_m=5.0)


def test_projection_of_a_box_from_outline_and_freeboard() -> None:
    p = projection(body_of(Project(hulls=(BOX,)), "Box"), "freeboard")
    assert p is not None
    assert (p.head_m2, p.beam_m2) == pytest.approx((20.0 * 5.0, 100.0 * 5.0))
    assert (p.beam_x, p.head_y) == pytest.approx((50.0, 0.0))


@pytest.mark.parametrize(
    ("wind_from", "expected"),
    [
        # heading 000: wind from 090 true is on the starboard beam and pushes to port.
        (90.0, (0.0, 245.0 * 1.2 * 500.0)),
        # from 270 true: the port beam, pushes to starboard.
        (270.0, (0.0, -245.0 * 1.2 * 500.0)),
        # from dead ahead: pushes astern on the head-on area.
        (0.0, (-245.0 * 0.8 * 100.0, 0.0)),
        # from 135 true (starboard quarter): cos^2 = sin^2 = 1/2 on each component.
        (135.0, (0.5 * 245.0 * 0.8 * 100.0, 0.5 * 245.0 * 1.2 * 500.0)),
    ],
)
def test_box_wind_load_by_decomposition(wind_from: float, expected: tuple[float, float]) -> None:
    # q = 245 Pa at 20 m/s (ISO 2533 air); C 0.8 head-on, 1.2 beam-on (defaults, common practice).
    c = Conditions(wind_speed_ms=20.0, wind_from_deg=wind_from)
    loads = condition_loads(body_of(Project(hulls=(BOX,)), "Box"), c, 0.0).loads
    assert [ld.name for ld in loads] == ["wind"]
    assert loads[0].force == pytest.approx(expected, abs=1e-6)


def test_heading_turns_the_wind_into_the_hull_frame() -> None:
    # Bow east (heading 090), wind from north: it blows onto the port side, towards starboard.
    c = Conditions(wind_speed_ms=20.0, wind_from_deg=0.0)
    cl = condition_loads(body_of(Project(hulls=(BOX,)), "Box"), c, 90.0)
    assert cl.wind_from_rel_deg == pytest.approx(270.0)
    fx, fy = cl.loads[0].force
    assert fx == pytest.approx(0.0, abs=1e-6)
    assert fy == pytest.approx(-245.0 * 1.2 * 500.0)


def test_current_sets_towards_its_bearing() -> None:
    # Bow east, current setting towards north: it carries the body to port.
    c = Conditions(current_speed_ms=1.0, current_towards_deg=0.0, current_coeff_beam=0.9)
    cl = condition_loads(body_of(Project(hulls=(BOX,)), "Box"), c, 90.0)
    assert cl.current_towards_rel_deg == pytest.approx(270.0)
    (ld,) = cl.loads
    # 1/2 rho C A V^2 = 0.5 * 1025 * 0.9 * (100 * 4) * 1.
    assert ld.force == pytest.approx((0.0, 0.5 * 1025.0 * 0.9 * 400.0), abs=1e-6)


def test_current_beam_coefficient_defaults_to_hoerner() -> None:
    # B / 2T = 20 / 8 = 2.5: between Hoerner's 1.64 (0.691) and 3.01 (0.587).
    m = current_model(body_of(Project(hulls=(BOX,)), "Box"), Conditions())
    expected_cd = 0.691 + (2.5 - 1.64) / (3.01 - 1.64) * (0.587 - 0.691)
    assert m.k_beam == pytest.approx(0.5 * 1025.0 * expected_cd * 400.0)


def test_gust_factor_scales_the_load_by_its_square() -> None:
    body = body_of(Project(hulls=(BOX,)), "Box")
    calm = condition_loads(body, Conditions(wind_speed_ms=10.0, wind_from_deg=90.0), 0.0)
    gusty = condition_loads(
        body, Conditions(wind_speed_ms=10.0, wind_from_deg=90.0, gust_factor=1.3), 0.0
    )
    assert gusty.loads[0].force[1] == pytest.approx(1.69 * calm.loads[0].force[1])


def test_wind_measured_high_is_brought_down_to_10_m() -> None:
    body = body_of(Project(hulls=(BOX,)), "Box")
    at10 = condition_loads(body, Conditions(wind_speed_ms=10.0, wind_from_deg=90.0), 0.0)
    at40 = condition_loads(
        body, Conditions(wind_speed_ms=10.0, wind_from_deg=90.0, wind_height_m=40.0), 0.0
    )
    # U10 = U40 / 4^0.12 (power law); load goes with U10^2.
    ratio = at40.loads[0].force[1] / at10.loads[0].force[1]
    assert ratio == pytest.approx(4.0 ** (-0.24), rel=1e-12)


def test_symmetric_box_has_no_yaw_moment_from_wind_with_a_fixed_centre() -> None:
    # The moving centre (the default) is tested in test_pressure_centre.py.
    body = body_of(Project(hulls=(BOX,)), "Box")
    c = Conditions(wind_speed_ms=15.0, wind_from_deg=60.0, pressure_centre="fixed")
    cl = condition_loads(body, c, 0.0)
    assert loads_wrench(cl.loads, body.centroid)[2] == pytest.approx(0.0, abs=1e-6)


def test_user_set_centre_of_pressure_gives_the_yaw_moment() -> None:
    # A deckhouse forward: centre of pressure at x = 80, 30 m ahead of the centroid (x = 50).
    body = body_of(Project(hulls=(BOX,)), "Box")
    c = Conditions(wind_speed_ms=20.0, wind_from_deg=90.0, wind_centre_m=(80.0, 0.0))
    cl = condition_loads(body, c, 0.0)
    fy = 245.0 * 1.2 * 500.0
    # M = r x F about the centroid: (80 - 50) * Fy; positive swings the bow to port.
    assert loads_wrench(cl.loads, body.centroid)[2] == pytest.approx(30.0 * fy)


def test_ship_shape_side_area_centre_is_off_the_centroid() -> None:
    # A box 0..80 m with a pointed bow to 100 m: the side projection is centred at 50 m
    # while the plan centroid (shapely, independent) lies aft of it.
    outline = ((0, -10), (80, -10), (100, 0), (80, 10), (0, 10))
    hull = Hull("Pointed", outline, freeboard_m=4.0)
    body = body_of(Project(hulls=(hull,)), "Pointed")
    cx = shapely.Polygon(outline).centroid.x
    cl = condition_loads(body, Conditions(wind_speed_ms=20.0, wind_from_deg=90.0), 0.0)
    fy = 245.0 * 1.2 * 100.0 * 4.0
    assert cl.loads[0].force[1] == pytest.approx(fy)
    assert loads_wrench(cl.loads, body.centroid)[2] == pytest.approx((50.0 - cx) * fy)


def test_user_areas_replace_the_derived_ones() -> None:
    body = body_of(Project(hulls=(BOX,)), "Box")
    c = Conditions(wind_speed_ms=20.0, wind_from_deg=90.0, wind_area_beam_m2=1234.0)
    assert wind_model(body, c).k_beam == pytest.approx(0.5 * RHO_AIR * 1.2 * 1234.0)


def test_lashed_pair_areas_add_without_shielding() -> None:
    a = Hull("A", box_outline(60.0, 18.0), freeboard_m=3.0, draught_m=2.0)
    b = Hull("B", box_outline(50.0, 14.0), freeboard_m=4.0, draught_m=2.0)
    group = LashedGroup("Pair", (GroupMember("A"), GroupMember("B", 0.0, -16.0, 0.0)))
    p = projection(body_of(Project(hulls=(a, b), groups=(group,)), "Pair"), "freeboard")
    assert p is not None
    assert p.beam_m2 == pytest.approx(60 * 3 + 50 * 4)
    assert p.head_m2 == pytest.approx(18 * 3 + 14 * 4)
    # Area-weighted centre of the two side projections: (180 * 30 + 200 * 25) / 380.
    assert p.beam_x == pytest.approx((180 * 30 + 200 * 25) / 380)


def test_balance_with_conditions_includes_the_loads() -> None:
    hull = box_hull("Barge", 80.0, 20.0, freeboard_m=4.0, draught_m=3.0)
    project, stage = _project(hull, 0.0, Conditions(wind_speed_ms=20.0, wind_from_deg=90.0))
    bal = balance_of(project, stage)
    assert bal.net_force == pytest.approx((0.0, 245.0 * 1.2 * 320.0), abs=1e-6)
    assert [ld.name for ld in bal.loads] == ["wind"]


# -- bad input --------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("changes", "field"),
    [
        ({"wind_speed_ms": -1.0}, "wind speed: -1.94384 kn must not be negative"),
        ({"current_speed_ms": -0.1}, "current speed"),
        ({"wind_speed_ms": math.nan}, "wind speed: NaN kn must be a finite number"),
        ({"air_density": 0.0}, "air density: 0.0 kg/m³ must be at least 0.5 kg/m³"),
        ({"gust_factor": 0.9}, "gust factor: 0.9 must be at least 1"),
        ({"wind_area_beam_m2": 0.0}, "wind area beam-on: 0.0 m² must be positive"),
        ({"current_area_head_m2": -5.0}, "current area head-on"),
        ({"wind_coeff_beam": math.inf}, "wind coefficient beam-on: infinity must be a finite"),
        ({"wind_centre_m": (math.nan, 0.0)}, "wind_centre_m"),
        ({"sea_state": 10.0}, "sea state: 10.0 must be at most 9"),
        ({"wind_exponent": 1.5}, "wind exponent: 1.5 must be at most 1"),
        ({"wind_height_m": 5e-324}, "wind height: 4.94066e-324 m must be at least 0.5 m"),
        ({"gust_factor": 1e300}, "gust factor: 1e\\+300 must be at most 3"),
        ({"current_speed_ms": 1e200}, "current speed: 1.94384e\\+200 kn must be at most 20 kn"),
        ({"wind_exponent": None}, "wind exponent: None must be a number"),
        ({"sea_state": None}, "sea state: None must be a number"),
        ({"wind_coeff_head": None}, "wind coefficient head-on: None must be a number"),
    ],
)
def test_absurd_conditions_are_refused_with_the_field_named(
    changes: dict[str, object], field: str
) -> None:
    with pytest.raises(InputError, match=field):
        replace(Conditions(), **changes)  # type: ignore[arg-type]


def test_missing_freeboard_names_what_to_enter() -> None:
    bare = Hull("Bare", box_outline(50.0, 10.0))
    body = body_of(Project(hulls=(bare,)), "Bare")
    c = Conditions(wind_speed_ms=10.0)
    with pytest.raises(InputError, match="freeboard"):
        condition_loads(body, c, 0.0)
    soft = condition_loads(body, c, 0.0, strict=False)
    assert soft.loads == ()
    assert [n.code for n in soft.notices] == ["no_wind_load"]
    assert "freeboard" in soft.notices[0].message


def test_calm_conditions_need_no_areas() -> None:
    bare = Hull("Bare", box_outline(50.0, 10.0))
    assert condition_loads(body_of(Project(hulls=(bare,)), "Bare"), Conditions(), 0.0).loads == ()


# -- a load in words ----------------------------------------------------------------------
@pytest.mark.parametrize(
    ("x", "words"),
    [
        # A 2 t load to starboard at x on an 80 m box (centroid x = 40): moment
        # (x - 40) * (-2 t). Its own negligible moment (core.mechanics.forces.negligible):
        # max(0.5 % of 2 t, 1000 N) * 80 m = 80 kN*m = 8.16 t*m (hand calculation).
        (60.0, "-40.0 t·m about the centroid, swings bow to starboard"),
        (45.0, "-10.0 t·m about the centroid, swings bow to starboard"),  # 10 > 8.16
        (44.0, "-8.0 t·m about the centroid, no swing (within the tolerance)"),  # 8 < 8.16
        (20.0, "+40.0 t·m about the centroid, swings bow to port"),
    ],
)
def test_a_load_is_worded_with_its_signed_moment_judged_on_itself(x: float, words: str) -> None:
    body = body_of(Project(hulls=(box_hull("Barge", 80.0, 20.0),)), "Barge")
    load = Load("wind", (x, 0.0), (0.0, -2 * TF))
    assert load_words(load, body, DisplayUnits()) == (
        f"2.0 t (ahead +0.0, to port -2.0 t), {words}"
    )
