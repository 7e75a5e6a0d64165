"""The load of every tug at one fitting together, against the fitting's one rating.

The barge is 80 m x 20 m (tests.core.plan_builders.box_hull). Lines are level where the
freeboard equals the tug's towing point height (angle 0, tension = pull); a 12 m
freeboard, a 3 m towing point and 12 m of line make a 3-4-5 line at 36.87 deg
(cos 0.8, sin 0.6: tension = 1.25 x pull, vertical part 0.75 x pull; geometry).
"""

from __future__ import annotations

import math
from dataclasses import replace

import pytest

from core.analysis.stage import stage_result
from core.io.report import report_json, report_text
from core.mechanics.fittings import FittingLoad
from core.model.goals import Goal
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from tests.core.plan_builders import TF, box_hull


def _two_at_bow(
    settings: tuple[float, float],
    bearings_deg: tuple[float, float] = (0.0, 0.0),
    *,
    tow_t: float = 50.0,
    freeboard: float = 4.0,
    line_m: float = 50.0,
    goal: Goal | None = None,
) -> Project:
    """Two 45 t tugs on the bow bitt (TOW ``tow_t``), leads as relative bearings."""
    hull = box_hull("Barge", 80.0, 20.0, freeboard_m=freeboard, draught_m=3.0)
    hull = hull.with_fitting(replace(hull.fitting("bow"), tow_n=tow_t * TF))
    height = 4.0 if freeboard == 4.0 else 3.0
    tugs = (
        Tug("A", 45 * TF, towing_point_height_m=height),
        Tug("B", 45 * TF, towing_point_height_m=height),
    )
    placements = tuple(
        Placement(t, "Barge", "bow", s, -math.radians(b), line_m)
        for t, s, b in zip(("A", "B"), settings, bearings_deg, strict=True)
    )
    stage = Stage(
        "Tow",
        "transit",
        poses=(BodyPose("Barge", 0.0, 0.0, 0.0),),
        placements=placements,
        goal=goal,
    )
    return Project(name="Shared bitt", hulls=(hull,), tugs=tugs, stages=(stage,))


def test_two_tugs_over_the_bitt_together_are_no_go_though_each_is_under_it() -> None:
    # Each tug at 40/45 of 45 t = 40 t on a level line: 40 t each, 80 % of the 50 t TOW;
    # together 40 + 40 = 80 t ahead on one bitt, 160 % of its TOW (hand calculation).
    p = _two_at_bow((40 / 45, 40 / 45), goal=Goal("force", fx_n=80 * TF))
    r = stage_result(p, 0)
    body = r.main
    assert body is not None
    assert [f.over_rating for f in body.fittings] == [False, False]
    (total,) = body.fitting_totals
    assert total.tugs == ("A", "B")
    assert total.load_n == pytest.approx(80 * TF)
    assert total.use_of_rating == pytest.approx(1.6)
    assert total.over_rating
    assert r.verdict.status == "no-go"
    (why,) = [x for x in r.verdict.reasons if x.code == "fitting_total_over_rating"]
    assert why.status == "no-go"
    assert why.text == (
        "bow: the lines of A and B together load it with 80.0 t, over its TOW 50.0 t (160 %)"
    )


def test_the_total_is_the_resultant_of_the_lines() -> None:
    # 3-4-5 lines, 24 t of pull each (setting 24 / (45 x 0.8) = 2/3): tension 30 t, vertical
    # part 18 t each. Leads ahead and astern: the horizontal parts cancel, the vertical
    # parts add: 36 t on the bitt, under its 50 t TOW though the tensions add up to 60 t.
    p = _two_at_bow((2 / 3, 2 / 3), (0.0, 180.0), freeboard=12.0, line_m=12.0)
    body = stage_result(p, 0).main
    assert body is not None
    assert [f.load_n for f in body.fittings] == pytest.approx([30 * TF, 30 * TF])
    (total,) = body.fitting_totals
    assert total.sum_n == pytest.approx(60 * TF)
    assert total.load_n == pytest.approx(36 * TF)
    assert not total.over_rating
    # Leads ahead and to starboard, level lines, 30 t each: sqrt(30^2 + 30^2) = 42.4 t.
    level = _two_at_bow((30 / 45, 30 / 45), (0.0, 90.0))
    (total,) = stage_result(level, 0).main.fitting_totals  # type: ignore[union-attr]
    assert total.load_n == pytest.approx(math.sqrt(2) * 30 * TF)


def test_one_tug_at_a_fitting_totals_its_own_load() -> None:
    p = _two_at_bow((40 / 45, 40 / 45))
    one = replace(p.stages[0], placements=p.stages[0].placements[:1])
    body = stage_result(p.with_stage(one, 0), 0).main
    assert body is not None
    (total,) = body.fitting_totals
    assert not total.shared
    assert total.load_n == pytest.approx(body.fittings[0].load_n)


def test_the_report_shows_the_fittings_total() -> None:
    p = _two_at_bow((40 / 45, 40 / 45), goal=Goal("force", fx_n=80 * TF))
    text = report_text(p)
    assert "together      bow                   load 80.0 t from A and B against TOW 50.0 t " in (
        text
    )
    assert "(160 %)  OVER" in text
    (stage,) = report_json(p)["stages"]
    for f in stage["fittings"]:
        assert f["tugs_at_fitting"] == ["A", "B"]
        assert f["fitting_total_load_N"] == pytest.approx(80 * TF)
        assert f["fitting_total_use_of_rating"] == pytest.approx(1.6)
        assert f["fitting_total_over_rating"] is True


def test_a_load_just_over_its_rating_never_reads_100_percent() -> None:
    # 60.18 t on a 60 t SWL: 60.18 / 60 = 1.003, 100.3 % (hand calculation): over the
    # rating, so its words must not read "100 %" beside the OVER flag.
    load = FittingLoad(
        tug="A",
        hull="Barge",
        point="bow",
        mode="line",
        fitting_type="bitt",
        pull_n=60.18 * TF,
        line_angle_rad=0.0,
        load_n=60.18 * TF,
        rating_n=60 * TF,
        rating_label="SWL",
        bollard_pull_n=50 * TF,
        suits_tug=True,
    )
    assert load.over_rating
    assert load.use_words == "100.3 %"
