"""A swing stage's sense against its yaw moments: the verdict, the report text and JSON.

Signs by hand (CONVENTIONS.md): a positive yaw moment turns the body counter-clockwise
seen from above, the bow to port, so its true heading falls; the bow swinging to
starboard turns it clockwise and its heading grows (090 -> 180 -> 270 through south).
A swing from 090 to 270 to starboard therefore wants a negative moment.
"""

from __future__ import annotations

import json
from dataclasses import replace
from pathlib import Path

import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.io.report import report_json, report_text
from core.model.goals import Goal
from core.model.plan import BodyPose, Project, Stage
from core.model.swing import Swing
from core.model.tugs import Tug
from tests.core.plan_builders import TF, box_hull, line

ROOT = Path(__file__).resolve().parents[2]
DECK_BARGE = ROOT / "sample_projects" / "deck_barge_unberth.towboard"
STARBOARD = Swing(90.0, 270.0, "starboard")
PORT_MOMENT = 100 * TF  # +100 t·m: bow to port


def _plan(
    goal: Goal | None,
    settings: tuple[float, ...] = (0.0, 0.0, 0.0, 0.0),
    swing: Swing | None = STARBOARD,
) -> Project:
    """A 60 m x 18 m barge heading 090; a tug on the bow line leading to port (270
    relative) and one on the stern line leading to starboard (090): set alike they
    make a couple turning the bow to port (bow: + to port at x = 60 m, ahead of the
    centroid at 30 m; stern: - to port at x = 0, abaft it). Two more, on the starboard
    bow leading to starboard and the port quarter leading to port, make the couple to
    starboard."""
    hull = box_hull("Barge", 60.0, 18.0, draught_m=3.0, freeboard_m=2.0)
    tugs = tuple(Tug(n, 30 * TF) for n in ("Bow tug", "Stern tug", "Bow tug 2", "Stern tug 2"))
    stage = Stage(
        "Swing",
        "swing",
        poses=(BodyPose("Barge", 0.0, 0.0, 90.0),),
        placements=(
            line("Bow tug", "Barge", "bow", settings[0], 270),
            line("Stern tug", "Barge", "stern", settings[1], 90),
            line("Bow tug 2", "Barge", "stbd bow", settings[2], 90),
            line("Stern tug 2", "Barge", "port quarter", settings[3], 270),
        ),
        goal=goal,
        swing=swing,
    )
    return Project(name="Swing plan", hulls=(hull,), tugs=tugs, stages=(stage,))


def _solved(project: Project) -> Project:
    """The plan with the stage's pulls set to the solved ones (what Solve pulls does)."""
    r = stage_result(project, 0)
    assert r.main is not None and r.main.solved is not None and r.main.solved.feasible
    return project.with_stage(r.main.solved.applied_to(project.stages[0]), 0)


def _reasons(project: Project) -> list[tuple[str, str, str]]:
    return [(r.status, r.code, r.text) for r in stage_result(project, 0).verdict.reasons]


def test_a_goal_turning_the_bow_to_port_on_a_swing_to_starboard_is_no_go() -> None:
    project = _solved(_plan(Goal("swing", moment_nm=PORT_MOMENT)))
    r = stage_result(project, 0)
    assert r.verdict.status == "no-go"
    assert (
        "no-go",
        "swing_against",
        "Barge: the stage swings bow to starboard (090.0° to 270.0°) but the goal turns "
        "the bow to port (100.0 t·m about the centroid)",
    ) in _reasons(project)
    assert r.main is not None and r.main.swing is not None
    assert r.main.swing.goal_turn == "port" and r.main.swing.against


def test_the_same_goal_on_a_swing_to_port_passes_the_swing_check() -> None:
    project = _solved(_plan(Goal("swing", moment_nm=PORT_MOMENT), swing=Swing(90, 270, "port")))
    # with the couple of two tugs either lost leaves none (a caution): no swing reason
    assert [c for _, c, _ in _reasons(project)] == ["tug_lost_fails"]


def test_a_goal_turning_the_right_way_with_the_pulls_as_set_turning_the_wrong_way() -> None:
    # Goal -100 t·m (to starboard, with the swing); tugs set at 50 % make a couple to port.
    project = _plan(Goal("swing", moment_nm=-PORT_MOMENT), settings=(0.5, 0.5, 0.0, 0.0))
    reasons = _reasons(project)
    codes = [(s, c) for s, c, _ in reasons]
    assert ("no-go", "pulls_miss_goal") in codes
    text = next(t for s, c, t in reasons if c == "swing_against")
    assert "but the pulls as set turn the bow to port" in text


def test_with_no_goal_the_pulls_as_set_are_judged() -> None:
    project = _plan(None, settings=(0.5, 0.5, 0.0, 0.0))
    assert ("no-go", "swing_against") in [(s, c) for s, c, _ in _reasons(project)]
    right_way = _plan(None, settings=(0.5, 0.5, 0.0, 0.0), swing=Swing(90, 270, "port"))
    assert "swing_against" not in [c for _, c, _ in _reasons(right_way)]


def test_a_swing_stage_whose_goal_gives_no_moment_is_a_caution() -> None:
    project = _plan(Goal("hold"))
    r = stage_result(project, 0)
    assert r.verdict.status == "caution"
    assert (
        "caution",
        "swing_no_turn",
        "Barge: the stage swings bow to starboard (090.0° to 270.0°) but the goal asks "
        "for no yaw moment (hold)",
    ) in _reasons(project)


def test_a_tiny_goal_moment_is_a_caution_too() -> None:
    # 0.01 t·m is far under the goal's moment tolerance (at least 1 kN x 60 m = 6.1 t·m)
    project = _plan(Goal("swing", moment_nm=0.01 * TF))
    assert "swing_no_turn" in [c for _, c, _ in _reasons(project)]


def test_the_deck_barge_sample_swing_turns_the_way_it_is_planned() -> None:
    # Its swing stage: 090 to 270 with the bow to port, goal +400 t·m (to port).
    project = load(DECK_BARGE)
    i = next(k for k, s in enumerate(project.stages) if s.swing is not None)
    r = stage_result(project, i)
    assert r.main is not None and r.main.swing is not None
    assert r.main.swing.goal_turn == "port" and not r.main.swing.against
    assert not {c for _, c, _ in _reasons_at(project, i)} & {"swing_against", "swing_no_turn"}
    text = report_text(project)
    assert "  Swing           swings bow to port 180° from 090.0° to 270.0°" in text
    assert (
        "Kestrel 3: the goal turns the bow to port (400.0 t·m about the centroid): with the swing"
        in text
    )
    swing = report_json(project)["stages"][i]["swing"]
    assert (swing["start_heading_deg"], swing["end_heading_deg"], swing["bow_swings_to"]) == (
        90.0,
        270.0,
        "port",
    )
    assert swing["bodies"][0]["against_the_swing"] is False
    # a stage that is not a swing has no swing
    assert report_json(project)["stages"][0]["swing"] is None


def _reasons_at(project: Project, i: int) -> list[tuple[str, str, str]]:
    return [(r.status, r.code, r.text) for r in stage_result(project, i).verdict.reasons]


def test_the_report_prints_the_swing_and_its_sense_against_it() -> None:
    project = _solved(_plan(Goal("swing", moment_nm=PORT_MOMENT)))
    text = report_text(project)
    assert "  Swing           swings bow to starboard 180° from 090.0° to 270.0°" in text
    assert (
        "Barge: the goal turns the bow to port (100.0 t·m about the centroid): AGAINST the swing"
        in text
    )
    data = json.loads(json.dumps(report_json(project)))
    swing = data["stages"][0]["swing"]
    assert swing["bow_swings_to"] == "starboard" and swing["turn_deg"] == pytest.approx(180.0)
    body = swing["bodies"][0]
    assert body["body"] == "Barge" and body["goal_turns_bow_to"] == "port"
    assert body["goal_yaw_moment_about_centroid_Nm"] == pytest.approx(PORT_MOMENT)
    assert body["against_the_swing"] is True
    assert data["stages"][0]["verdict"]["status"] == "no-go"


def test_a_swing_stage_without_headings_says_so() -> None:
    project = _plan(Goal("swing", moment_nm=PORT_MOMENT), swing=None)
    assert "  Swing           no headings given" in report_text(project)
    assert "swing_against" not in [c for _, c, _ in _reasons(project)]
    project = replace(project, stages=(replace(project.stages[0], kind="other"),))
    assert report_json(project)["stages"][0]["swing"] is None
