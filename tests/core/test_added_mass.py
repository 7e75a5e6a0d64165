"""Added mass and the rigid body's inertia for the drift preview, against published values."""

from __future__ import annotations

import math

import pytest

from core.errors import InputError
from core.mechanics.bodies import Body, Member, body_of
from core.model.hull import Hull
from core.model.outlines import box_outline, ship_outline
from core.motion.added_mass import (
    body_sections,
    clarke_sway_yaw,
    rectangle_coefficient,
    sections_added_mass,
    soding_surge,
    sway_added_mass_per_length,
)
from core.motion.inertia import SECTIONS_WORDS, SHIP_WORDS, body_inertia
from tests.core.plan_builders import twin_group_project

RHO = 1025.0


def single(hull: Hull) -> Body:
    return Body(hull.name, (Member(hull, 0.0, 0.0, 0.0),))


def box(length: float, beam: float, draught: float, **kw: object) -> Hull:
    mass = kw.pop("displacement_kg", length * beam * draught * RHO)
    return Hull("box", box_outline(length, beam), draught_m=draught, displacement_kg=mass, **kw)  # type: ignore[arg-type]


# -- 2-D coefficients -------------------------------------------------------------------


@pytest.mark.parametrize(
    ("a_over_b", "c_a"),
    [
        # DNV-RP-C205 Appendix A, Table A-1, rectangle (from memory).
        (10.0, 1.14),
        (5.0, 1.21),
        (2.0, 1.36),
        (1.0, 1.51),
        (0.5, 1.70),
        (0.2, 1.98),
        (0.1, 2.23),
    ],
)
def test_rectangle_coefficient_at_dnv_table_rows(a_over_b: float, c_a: float) -> None:
    assert rectangle_coefficient(a_over_b) == pytest.approx(c_a, rel=1e-12)


def test_square_section_against_the_exact_potential_flow_value() -> None:
    # A square of side 2a moving normal to a side: m_a = 4.754 rho a^2 (Newman, Marine
    # Hydrodynamics, 1977, table of 2-D added masses, from memory), C_A = 4.754 / pi.
    assert rectangle_coefficient(1.0) == pytest.approx(4.754 / math.pi, rel=0.005)


def test_thin_rectangle_tends_to_the_flat_plate() -> None:
    # A flat plate of width 2a broadside: m_a = rho pi a^2 exactly (potential flow).
    assert rectangle_coefficient(1e9) == pytest.approx(1.0, abs=1e-6)
    assert 1.0 < rectangle_coefficient(20.0) < 1.14


def test_coefficient_between_rows_lies_between_them() -> None:
    assert 1.51 < rectangle_coefficient(0.7) < 1.70


def test_bad_section_aspect_is_refused() -> None:
    with pytest.raises(InputError, match="section aspect a/b: -1.0 must be a positive number"):
        rectangle_coefficient(-1.0)


def test_sway_section_is_half_the_double_body() -> None:
    # Beam 20 m, draught 2.5 m: the double body is 5 m deep, a/b = 5 / 20 = 0.25; half of
    # C_A rho pi T^2 (strip theory with a rigid free surface, from the definition).
    expected = 0.5 * rectangle_coefficient(0.25) * RHO * math.pi * 2.5**2
    assert sway_added_mass_per_length(20.0, 2.5, RHO) == pytest.approx(expected, rel=1e-12)
    assert 1.70 < rectangle_coefficient(0.25) < 1.98


# -- surge and the ship regressions ---------------------------------------------------------


def test_soding_surge_worked_by_hand() -> None:
    # V = 3000 m^3, L = 60 m, rho = 1025: 3000^(5/3) = 624 025 (by hand), so
    # A11 = 2.7 x 1025 x 624 025 / 3600 = 479.7 t (Soding 1982 formula).
    assert soding_surge(3000.0, 60.0, RHO) == pytest.approx(479.7e3, rel=1e-3)


def test_clarke_regression_worked_by_hand() -> None:
    # L = 150, B = 25, T = 8, Cb = 0.7 (Clarke, Gedling and Hine 1983 as transcribed):
    # S = pi (8/150)^2 = 0.0089361; Yv' = S (1 + 0.16 x 0.7 x 3.125 - 5.1 x 0.027778) = 0.0107978;
    # Nr' = S (0.083333 + 0.017 x 0.7 x 3.125 - 0.33 x 0.166667) = 0.00058550.
    a22, a66 = clarke_sway_yaw(150.0, 25.0, 8.0, 0.7, RHO)
    assert a22 == pytest.approx(0.0107978 * 0.5 * RHO * 150.0**3, rel=1e-4)
    assert a66 == pytest.approx(0.00058550 * 0.5 * RHO * 150.0**5, rel=1e-4)


@pytest.mark.parametrize(("length", "beam", "draught"), [(80.0, 20.0, 3.0), (120.0, 20.0, 5.0)])
def test_sections_and_ship_regression_agree_on_sway_for_a_slender_box(
    length: float, beam: float, draught: float
) -> None:
    # Two independent published methods (DNV 2-D sections by strip theory; Clarke's
    # regression of measured ships) for a box of B/L <= 1/4: within 20 %.
    body = single(box(length, beam, draught))
    a22, _ = sections_added_mass(body_sections(body), body.centroid[0], RHO)
    clarke, _ = clarke_sway_yaw(length, beam, draught, 1.0, RHO)
    assert a22 == pytest.approx(clarke, rel=0.20)


def test_uniform_box_yaw_added_mass_is_the_strip_closed_form() -> None:
    # Uniform sections: A66 = A22' int x^2 dx = A22 L^2 / 12 about mid-length (strip theory).
    body = single(box(90.0, 18.0, 3.0))
    a22, a66 = sections_added_mass(body_sections(body), 45.0, RHO)
    assert a22 == pytest.approx(90.0 * sway_added_mass_per_length(18.0, 3.0, RHO), rel=1e-12)
    assert a66 == pytest.approx(a22 * 90.0**2 / 12.0, rel=1e-12)


def test_sections_follow_a_ship_outline_narrowing_at_the_ends() -> None:
    hull = Hull("ship", ship_outline(100.0, 16.0, 50.0), draught_m=5.0)
    s = body_sections(single(hull))
    assert s.beam.max() == pytest.approx(16.0, rel=1e-6)
    assert s.beam[0] < 16.0 and s.beam[-1] < 16.0
    assert (s.draught == 5.0).all()


# -- the whole body -------------------------------------------------------------------------


def test_box_plate_radius_of_gyration() -> None:
    # Uniform rectangular plate: k = sqrt((L^2 + B^2) / 12) (REFERENCES.md, handbook formula).
    ine = body_inertia(single(box(60.0, 20.0, 2.5)), RHO)
    assert ine.gyradius_m == pytest.approx(math.sqrt((60.0**2 + 20.0**2) / 12.0), rel=1e-12)
    assert ine.method == SECTIONS_WORDS


def test_given_radius_of_gyration_is_used() -> None:
    ine = body_inertia(single(box(60.0, 20.0, 2.5, yaw_gyradius_m=15.0)), RHO)
    assert ine.yaw_inertia_kgm2 == pytest.approx(ine.mass_kg * 15.0**2, rel=1e-12)


def test_missing_displacement_is_estimated_with_a_caution() -> None:
    hull = Hull("pontoon", box_outline(40.0, 20.0), draught_m=2.0)
    ine = body_inertia(single(hull), RHO)
    assert ine.mass_kg == pytest.approx(RHO * 40.0 * 20.0 * 2.0, rel=1e-12)
    assert [n.code for n in ine.notices] == ["mass_estimated"]
    assert "1640 t" in ine.notices[0].message


def test_no_displacement_and_no_draught_is_refused_in_words() -> None:
    hull = Hull("pontoon", box_outline(40.0, 20.0))
    with pytest.raises(InputError, match="hull pontoon: displacement: None is unknown"):
        body_inertia(single(hull), RHO)


def test_no_draught_is_refused_for_the_added_mass() -> None:
    hull = Hull("pontoon", box_outline(40.0, 20.0), displacement_kg=1e6)
    with pytest.raises(InputError, match="hull pontoon: draught: None is unknown"):
        body_inertia(single(hull), RHO)


def test_ship_method_for_a_ship() -> None:
    hull = Hull(
        "ship",
        ship_outline(150.0, 25.0, 60.0),
        draught_m=8.0,
        displacement_kg=0.7 * 150 * 25 * 8 * RHO,
        added_mass_method="ship",
    )
    ine = body_inertia(single(hull), RHO)
    assert ine.method == SHIP_WORDS
    block = ine.mass_kg / RHO / (150.0 * 25.0 * 8.0)
    a22, _ = clarke_sway_yaw(150.0, 25.0, 8.0, block, RHO)
    assert ine.sway_added_kg == pytest.approx(a22, rel=1e-12)
    assert ine.notices == ()


def test_ship_method_out_of_its_range_falls_back_to_sections() -> None:
    hull = box(40.0, 30.0, 2.0, added_mass_method="ship")
    ine = body_inertia(single(hull), RHO)
    assert ine.method == SECTIONS_WORDS
    assert [n.code for n in ine.notices] == ["ship_added_mass_out_of_range"]
    assert "B/L = 0.75" in ine.notices[0].message


def test_unknown_added_mass_method_is_refused() -> None:
    with pytest.raises(InputError, match="hull box: added mass method: 'strip' is not one of"):
        box(40.0, 10.0, 2.0, added_mass_method="strip")


def test_lashed_pair_inertia_by_the_parallel_axis_rule() -> None:
    # Two box plates (A 60 x 18, 3000 t, G at (28, 0.5); B 50 x 14, 1500 t, turned end for
    # end at (55, -16)); worked by hand from the plate formula and the parallel-axis rule.
    p = twin_group_project()
    p = p.with_hull(
        Hull(**{**_fields(p.hull("A")), "draught_m": 3.0})  # type: ignore[arg-type]
    ).with_hull(Hull(**{**_fields(p.hull("B")), "draught_m": 2.5}))  # type: ignore[arg-type]
    body = body_of(p, "Pair")
    ine = body_inertia(body, RHO)
    ga = (28.0, 0.5)
    gb = (55.0 - 24.0, -16.0)  # B's G (24, 0) turned by 180 deg and moved to (55, -16)
    gx = (3.0e6 * ga[0] + 1.5e6 * gb[0]) / 4.5e6
    gy = (3.0e6 * ga[1] + 1.5e6 * gb[1]) / 4.5e6
    plate_a = 3.0e6 * ((60**2 + 18**2) / 12 + (30 - 28) ** 2 + 0.5**2)
    plate_b = 1.5e6 * ((50**2 + 14**2) / 12 + (25 - 24) ** 2)
    iz = (
        plate_a
        + plate_b
        + 3.0e6 * ((ga[0] - gx) ** 2 + (ga[1] - gy) ** 2)
        + 1.5e6 * ((gb[0] - gx) ** 2 + (gb[1] - gy) ** 2)
    )
    assert ine.mass_kg == pytest.approx(4.5e6, rel=1e-12)
    assert ine.cog == pytest.approx((gx, gy), rel=1e-12)
    assert ine.yaw_inertia_kgm2 == pytest.approx(iz, rel=1e-9)
    # Sections across the whole pair: the breadth is the pair's where both lie (32 m).
    s = body_sections(body)
    assert s.beam.max() == pytest.approx(32.0, rel=1e-9)


def _fields(h: Hull) -> dict[str, object]:
    return {
        "name": h.name,
        "outline": h.outline,
        "displacement_kg": h.displacement_kg,
        "cog": h.cog,
        "fittings": h.fittings,
    }
