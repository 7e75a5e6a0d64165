"""Usable pull: the efficiency table's mechanics, the towline angle, the IMO fitting rule."""

from __future__ import annotations

import math
from dataclasses import replace

import pytest

from core.analysis.stage import stage_result
from core.errors import InputError
from core.mechanics.balance import analyse, tug_layout
from core.mechanics.bodies import body_of
from core.mechanics.usable import (
    fitting_design_load_n,
    fitting_suits,
    horizontal_factor,
    largest_swl_n,
    line_angle_rad,
)
from core.model.conditions import Conditions
from core.model.efficiency import EfficiencyTable
from core.model.hull import Fitting
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from tests.core.plan_builders import TF, box_hull

# The table's numbers are user data (not verified); these tests check the mechanics only.
# Rows in N: 100 and 300 kN.
TABLE = EfficiencyTable((100e3, 300e3), (0.0, 4.0), ((1.0, 0.6), (1.0, 0.8)))


def test_table_corners_are_the_entries() -> None:
    assert TABLE.efficiency(100e3, 4.0) == pytest.approx(0.6)
    assert TABLE.efficiency(300e3, 4.0) == pytest.approx(0.8)


def test_table_interpolates_bilinearly() -> None:
    # Middle of the cell: the mean of the four corners (bilinear interpolation).
    assert TABLE.efficiency(200e3, 2.0) == pytest.approx((1.0 + 0.6 + 1.0 + 0.8) / 4)
    # Along one edge, linear: a quarter of the way from 0.6 to 0.8.
    assert TABLE.efficiency(150e3, 4.0) == pytest.approx(0.65)


def test_table_is_held_at_its_edges() -> None:
    assert TABLE.efficiency(50e3, 9.0) == pytest.approx(0.6)
    assert TABLE.efficiency(900e3, 6.0) == pytest.approx(0.8)


def test_vectorised_lookup_matches_single() -> None:
    got = TABLE.efficiencies([100e3, 200e3, 500e3], 3.0)  # type: ignore[arg-type]
    assert list(got) == pytest.approx([TABLE.efficiency(v, 3.0) for v in (100e3, 200e3, 500e3)])


@pytest.mark.parametrize(
    ("kwargs", "match"),
    [
        ({"bollard_pulls_n": (300e3, 100e3)}, "increasing"),
        ({"sea_states": (0.0, 12.0)}, "sea states"),
        ({"values": ((1.0, 0.6),)}, "2 rows"),
        ({"values": ((1.0,), (1.0, 0.8))}, "row 1"),
        ({"values": ((1.0, 1.2), (1.0, 0.8))}, "row 1: efficiency: 1.2 must be at most 1"),
        ({"bollard_pulls_n": (0.0, 100e3)}, "bollard pulls"),
        # below a tenth of a tonne-force, the least a working tug pulls
        (
            {"bollard_pulls_n": (1e-300, 100e3)},
            "bollard pulls: 1.01972e-304 t must be at least 0.1 t",
        ),
        ({"values": ((1.0, math.nan), (1.0, 0.8))}, "NaN must be a finite number"),
    ],
)
def test_bad_tables_are_refused(kwargs: dict[str, object], match: str) -> None:
    with pytest.raises(InputError, match=match):
        replace(TABLE, **kwargs)  # type: ignore[arg-type]


def test_line_angle_and_horizontal_share() -> None:
    # Deck 8 m, towing point 3 m, 5 m of line: 45 deg; horizontal = tension x cos(angle)
    # (geometry, REFERENCES.md).
    a = line_angle_rad(8.0, 3.0, 5.0)
    assert math.degrees(a) == pytest.approx(45.0)
    assert horizontal_factor(a) == pytest.approx(math.sqrt(0.5))
    assert line_angle_rad(None, 3.0, 5.0) == 0.0


def _stage_project(
    freeboard: float, height: float | None, length: float, sea: float = 0.0
) -> tuple[Project, Stage]:
    hull = box_hull("Barge", 80.0, 20.0, freeboard_m=freeboard)
    tug = Tug("Gannet", 50 * TF, 30 * TF, towing_point_height_m=height)
    pusher = Tug("Tern", 30 * TF)
    stage = Stage(
        "s",
        poses=(BodyPose("Barge"),),
        placements=(
            Placement("Gannet", "Barge", "bow", 0.5, 0.0, length),
            Placement("Tern", "Barge", "stbd pad", 0.5),
        ),
        conditions=Conditions(sea_state=sea),
    )
    return Project(hulls=(hull,), tugs=(tug, pusher), stages=(stage,), tug_efficiency=TABLE), stage


def test_layout_usable_pull_is_rated_times_efficiency_times_cos() -> None:
    project, stage = _stage_project(12.0, 4.0, 8.0 / math.tan(math.radians(30.0)), sea=2.0)
    layout = tug_layout(project, stage, body_of(project, "Barge"))
    eff_line = TABLE.efficiency(50 * TF, 2.0)
    eff_push = TABLE.efficiency(30 * TF, 2.0)
    # Line drops 8 m over 8 / tan 30 m: 30 deg below the horizontal.
    assert layout.usable_n[0] == pytest.approx(50 * TF * eff_line * math.cos(math.radians(30)))
    assert layout.usable_n[1] == pytest.approx(30 * TF * eff_push)  # a push has no line


def test_astern_uses_the_astern_pull() -> None:
    project, stage = _stage_project(4.0, 4.0, 30.0)
    stage = stage.with_placement(replace(stage.placement("Gannet"), astern=True))
    layout = tug_layout(project, stage, body_of(project, "Barge"))
    assert layout.usable_n[0] == pytest.approx(30 * TF)


def test_steep_towline_is_warned_short_line_is_not_refused() -> None:
    project, stage = _stage_project(12.0, 4.0, 10.0)  # atan(8 / 10) = 38.7 deg
    codes = [n.code for n in analyse(project, stage).notices]
    assert "steep_line" in codes
    msg = next(n.message for n in analyse(project, stage).notices if n.code == "steep_line")
    assert "39 deg" in msg and "78 %" in msg
    project, stage = _stage_project(12.0, 4.0, 60.0)  # 7.6 deg: fine
    assert "steep_line" not in [n.code for n in analyse(project, stage).notices]


# -- IMO MSC.1/Circ.1175 (2005, read): design load 1.25 x max towing load, SWL <= 80 % --


def test_imo_design_load_and_swl() -> None:
    assert fitting_design_load_n(100.0) == pytest.approx(125.0)
    assert largest_swl_n(125.0) == pytest.approx(100.0)


@pytest.mark.parametrize(("bp_t", "suits"), [(50.0, True), (49.0, True), (51.0, False)])
def test_fitting_of_swl_s_suits_tugs_up_to_s(bp_t: float, suits: bool) -> None:
    assert fitting_suits(50 * TF, bp_t * TF) is suits


def test_under_rated_fitting_is_flagged_on_the_stage() -> None:
    project, stage = _stage_project(4.0, 4.0, 30.0)
    hull = project.hull("Barge")
    bow = hull.fitting("bow")
    small = Fitting(bow.name, bow.kind, bow.x, bow.y, swl_n=40 * TF)
    project = project.with_hull(hull.with_fitting(small))
    project = replace(project, stages=(stage,))
    reasons = stage_result(project, 0).verdict.reasons
    (r,) = [r for r in reasons if r.code == "fitting_under_rated"]
    assert r.subject == "Gannet" and r.status == "caution"
    assert "bollard pull 50.0 t is above the SWL 40.0 t of bow" in r.text
