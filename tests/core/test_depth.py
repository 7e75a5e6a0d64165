"""Water depth: UFC 4-159-03's depth factor on the sideways current load, the under-keel
clearance and its warnings, against the formula worked independently with sympy."""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest
import sympy as sp

from core.analysis.stage import stage_result
from core.errors import InputError
from core.mechanics.bodies import body_of
from core.mechanics.depth import (
    chi_of,
    depth_check,
    depth_factor,
    ufc_transverse_coefficient,
)
from core.mechanics.loads import condition_loads, current_model, loads_wrench
from core.model.conditions import UKC_MARGIN_M, Conditions
from core.model.hull import Hull
from core.model.outlines import box_outline
from core.model.plan import BodyPose, Project, Stage
from core.motion.scenarios import drift_setup
from core.units import DisplayUnits

L, B, T = 100.0, 25.0, 5.0
BOX = Hull("Box", box_outline(L, B), draught_m=T, freeboard_m=3.0, displacement_kg=1.2e7)
BODY = body_of(Project(hulls=(BOX,)), "Box")
U = DisplayUnits()

# UFC 4-159-03 (2005), section 4-5 (read): C_yc = C0 + (C1 - C0)(T/d)^K, C0 = 0.22 chi,
# chi = L^2 A_m / (B V), C1 = 3.2, K = 2. Worked here with sympy, apart from the code.
_L, _B, _T, _d, _Am, _V = sp.symbols("L B T d A_m V", positive=True)
CHI = _L**2 * _Am / (_B * _V)
C0 = sp.Rational(22, 100) * CHI
C_YC = C0 + (sp.Rational(32, 10) - C0) * (_T / _d) ** 2
# A wall-sided box: A_m = B T, V = L B T.
BOX_VALUES = {_L: L, _B: B, _T: T, _Am: B * T, _V: L * B * T}


def test_chi_of_a_box_is_its_length_over_beam() -> None:
    assert chi_of(BODY) == pytest.approx(float(CHI.subs(BOX_VALUES)), rel=1e-12)
    assert chi_of(BODY) == pytest.approx(L / B)


@pytest.mark.parametrize("depth", [5.5, 6.0, 7.5, 10.0, 20.0, 60.0])
def test_coefficient_against_the_formula(depth: float) -> None:
    expected = float(C_YC.subs({**BOX_VALUES, _d: depth}))
    assert ufc_transverse_coefficient(L / B, T / depth) == pytest.approx(expected, rel=1e-12)
    deep = float(C0.subs(BOX_VALUES))
    assert depth_factor(BODY, depth) == pytest.approx(expected / deep, rel=1e-12)


def test_limits_deep_water_and_keel_on_the_bottom() -> None:
    # Deep water: the limit d -> infinity is C0; d = T gives C1 = 3.2 (the source's ends).
    deep = sp.limit(C_YC.subs(BOX_VALUES), _d, sp.oo)
    assert float(deep) == pytest.approx(0.22 * L / B)
    assert ufc_transverse_coefficient(L / B, 0.0) == pytest.approx(float(deep))
    assert float(C_YC.subs({**BOX_VALUES, _d: T})) == pytest.approx(3.2)
    assert ufc_transverse_coefficient(L / B, 1.0) == pytest.approx(3.2)
    assert depth_factor(BODY, 1e6) == pytest.approx(1.0, abs=1e-9)
    assert depth_factor(BODY, T) == pytest.approx(3.2 / (0.22 * 4.0))
    assert depth_factor(BODY, None) == 1.0


def test_depth_never_lowers_the_load() -> None:
    # A very slender body (L/B = 20: C0 = 4.4 > C1): the factor is held at 1 (our choice).
    slender = body_of(Project(hulls=(Hull("Rod", box_outline(200.0, 10.0), draught_m=2.0),)), "Rod")
    assert ufc_transverse_coefficient(chi_of(slender), 0.5) < 0.22 * 20.0
    assert depth_factor(slender, 4.0) == 1.0


def test_the_current_load_grows_sideways_only() -> None:
    deep = Conditions(current_speed_ms=1.0, current_towards_deg=45.0, current_coeff_beam=0.8)
    shallow = replace(deep, water_depth_m=7.5)
    k = depth_factor(BODY, 7.5)
    assert k > 1.5
    m_deep, m_shallow = current_model(BODY, deep), current_model(BODY, shallow)
    assert m_shallow.k_beam == pytest.approx(k * m_deep.k_beam, rel=1e-12)
    assert m_shallow.k_head == m_deep.k_head
    f_deep = condition_loads(BODY, deep, 0.0).loads[0].force
    f_shallow = condition_loads(BODY, shallow, 0.0).loads[0].force
    assert f_shallow[0] == pytest.approx(f_deep[0], rel=1e-12)
    assert f_shallow[1] == pytest.approx(k * f_deep[1], rel=1e-12)


def test_the_drift_feels_the_same_depth() -> None:
    c = Conditions(current_speed_ms=0.8, current_towards_deg=250.0, water_depth_m=7.0)
    stage = Stage("s", poses=(BodyPose("Box", 0.0, 0.0, 10.0),), conditions=c)
    project = Project(hulls=(BOX,), stages=(stage,))
    setup = drift_setup(project, stage)
    motion = setup.base.motion
    dy = motion.derivative()(0.0, motion.start_state(setup.base.start))
    statics = loads_wrench(condition_loads(BODY, c, 10.0).loads, motion.inertia.cog)
    scale = float(np.abs(statics[:2]).max())
    assert dy[4] * motion.inertia.sway_kg == pytest.approx(statics[1], abs=1e-9 * scale)
    assert dy[5] * motion.inertia.yaw_kgm2 == pytest.approx(statics[2], abs=1e-9 * scale * L)


# -- under-keel clearance ---------------------------------------------------------------


def _verdict(depth: float | None, margin: float = UKC_MARGIN_M):  # type: ignore[no-untyped-def]
    c = Conditions(water_depth_m=depth, ukc_margin_m=margin)
    stage = Stage("s", poses=(BodyPose("Box", 0.0, 0.0, 0.0),), conditions=c)
    result = stage_result(Project(hulls=(BOX,), stages=(stage,)), 0)
    assert result.main is not None
    return result.main.depth, result.verdict


def test_deep_water_has_no_depth_figures() -> None:
    depth, verdict = _verdict(None)
    assert depth is None
    assert not any(r.code in ("aground", "low_under_keel") for r in verdict.reasons)


def test_clearance_above_the_margin_is_quiet() -> None:
    depth, _ = _verdict(6.0)
    assert depth is not None and depth.clearance_m == pytest.approx(1.0)
    assert depth.notices == ()


def test_clearance_below_the_margin_is_a_caution() -> None:
    depth, verdict = _verdict(5.3)
    assert depth is not None and depth.clearance_m == pytest.approx(0.3)
    (r,) = [r for r in verdict.reasons if r.code == "low_under_keel"]
    assert r.status == "caution"
    assert "under-keel clearance 0.3 m is below the margin 0.5 m" in r.text


def test_a_user_margin_is_used() -> None:
    _, verdict = _verdict(6.0, margin=1.5)
    assert any(r.code == "low_under_keel" and "margin 1.5 m" in r.text for r in verdict.reasons)


@pytest.mark.parametrize("depth", [5.0, 4.0])
def test_no_water_under_the_keel_is_a_no_go(depth: float) -> None:
    _, verdict = _verdict(depth)
    assert verdict.status == "no-go"
    (r,) = [r for r in verdict.reasons if r.code == "aground"]
    assert r.status == "no-go"
    assert "would be aground" in r.text


def test_unknown_draught_says_what_to_enter() -> None:
    bare = Hull("Bare", box_outline(50.0, 10.0), freeboard_m=2.0)
    body = body_of(Project(hulls=(bare,)), "Bare")
    check = depth_check(body, Conditions(water_depth_m=8.0), U)
    assert check is not None and check.clearance_m is None
    (n,) = check.notices
    assert n.code == "ukc_unknown" and "enter the draught of Bare" in n.message


def test_depth_and_margin_are_checked() -> None:
    with pytest.raises(InputError, match="water depth"):
        Conditions(water_depth_m=0.0)
    with pytest.raises(InputError, match="under-keel clearance margin"):
        Conditions(ukc_margin_m=-1.0)
    with pytest.raises(InputError, match="water depth"):
        Conditions(water_depth_m=math.nan)


def test_a_clearance_just_under_the_margin_reads_under_it() -> None:
    # 0.48 m of water under the keel against the 0.5 m margin read "0.5 m is below the
    # margin 0.5 m"; the figures take the decimals that tell them apart.
    _depth, verdict = _verdict(5.48)
    (r,) = [r for r in verdict.reasons if r.code == "low_under_keel"]
    assert "under-keel clearance 0.48 m is below the margin 0.50 m" in r.text
