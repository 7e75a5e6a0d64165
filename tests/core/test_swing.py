"""A swing stage's start and end headings and the bow's side: the value, the file, the schema."""

from __future__ import annotations

import json
from dataclasses import replace
from pathlib import Path
from typing import Any

import jsonschema
import pytest
from hypothesis import given
from hypothesis import strategies as st

from core.errors import InputError, ProjectFileError
from core.io.projectfile import dumps, load, loads
from core.model.plan import Project, Stage
from core.model.swing import Swing

ROOT = Path(__file__).resolve().parents[2]
SCHEMA = json.loads((ROOT / "docs" / "towboard.schema.json").read_text())
SAMPLE = ROOT / "sample_projects" / "deck_barge_unberth.towboard"


# Check values worked by hand on a compass rose (a true heading grows clockwise; the bow
# swinging to starboard turns the body clockwise seen from above): common practice, no source.
@pytest.mark.parametrize(
    ("start", "end", "side", "turn"),
    [
        (90.0, 270.0, "port", 180.0),
        (90.0, 270.0, "starboard", 180.0),
        (90.0, 0.0, "port", 90.0),
        (90.0, 0.0, "starboard", 270.0),
        (350.0, 10.0, "starboard", 20.0),
        (10.0, 350.0, "port", 20.0),
        (10.0, 350.0, "starboard", 340.0),
    ],
)
def test_the_turn_follows_the_side(start: float, end: float, side: str, turn: float) -> None:
    s = Swing(start, end, side)  # type: ignore[arg-type]
    assert s.turn_deg == pytest.approx(turn)
    assert s.heading_at(0.0) == pytest.approx(start)
    assert s.heading_at(1.0) % 360 == pytest.approx(end % 360, abs=1e-9)


def test_halfway_lies_on_the_side_the_bow_swings_to() -> None:
    assert Swing(90.0, 0.0, "port").heading_at(0.5) == pytest.approx(45.0)
    assert Swing(90.0, 0.0, "starboard").heading_at(0.5) == pytest.approx(225.0)
    assert Swing(90.0, 0.0, "port").progress(45.0) == pytest.approx(0.5)
    assert Swing(90.0, 0.0, "port").progress(180.0) is None  # not on the way round
    assert Swing(90.0, 0.0, "starboard").progress(180.0) == pytest.approx(1 / 3)


@given(
    start=st.floats(0.0, 359.0),
    turn=st.floats(1.0, 359.0),
    side=st.sampled_from(["port", "starboard"]),
    f=st.floats(0.0, 1.0),
)
def test_progress_undoes_heading_at(start: float, turn: float, side: str, f: float) -> None:
    sign = 1.0 if side == "starboard" else -1.0
    s = Swing(start, (start + sign * turn) % 360.0, side)  # type: ignore[arg-type]
    assert s.progress(s.heading_at(f)) == pytest.approx(f, abs=1e-6)


def test_headings_are_kept_from_0_to_below_360() -> None:
    s = Swing(-90.0, 720.0, "port")
    assert (s.start_heading_deg, s.end_heading_deg) == (270.0, 0.0)


def test_a_swing_refuses_what_cannot_be_meant() -> None:
    with pytest.raises(InputError, match="must differ from the start heading"):
        Swing(90.0, 450.0, "port")
    with pytest.raises(InputError, match="is not port or starboard"):
        Swing(90.0, 0.0, "left")  # type: ignore[arg-type]
    with pytest.raises(InputError, match="swing start"):
        Swing(float("nan"), 0.0, "port")


@pytest.mark.parametrize("side", ["port", "starboard"])
@pytest.mark.parametrize(
    ("start", "end"),
    [(1e-300, 0.0), (0.0, 1e-300), (1e-10, 0.0), (359.99999999999997, 0.0), (90.0, 90.0 + 5e-12)],
)
def test_headings_equal_in_the_file_are_equal_in_the_swing(
    start: float, end: float, side: str
) -> None:
    # Found by the monkey: 1e-300 typed as the start of a swing ending on 000 gave a swing
    # of a whole turn less 1e-300 (the window took it), which the file wrote as 000 to 000
    # and then refused to read back.
    with pytest.raises(InputError, match="must differ from the start heading"):
        Swing(start, end, side)  # type: ignore[arg-type]


def test_a_swing_keeps_the_headings_the_file_holds() -> None:
    s = Swing(12.3456789012345678, 1e-300 + 200.0, "port")
    assert (s.start_heading_deg, s.end_heading_deg) == (12.3456789012, 200.0)  # 12 digits
    again = loads(dumps(Project(stages=(Stage("Swing", "swing", swing=s),))))
    assert again.stages[0].swing == s


def test_words_say_the_turn_and_the_side() -> None:
    assert Swing(90.0, 270.0, "port").words() == "swings bow to port 180° from 090.0° to 270.0°"


def _data() -> dict[str, Any]:
    return json.loads(SAMPLE.read_text())


def _problems(data: Any) -> list[str]:
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data), "plan.towboard")
    return [str(p) for p in e.value.problems]


def test_a_swing_round_trips_through_the_file_and_matches_the_schema() -> None:
    p = load(SAMPLE)
    stage = replace(p.stages[0], swing=Swing(12.5, 300.25, "starboard"))
    p = p.with_stage(stage, 0)
    text = dumps(p)
    data = json.loads(text)
    jsonschema.validate(data, SCHEMA)
    assert data["stages"][0]["swing"] == {
        "start_heading_deg": 12.5,
        "end_heading_deg": 300.25,
        "bow_swings_to": "starboard",
    }
    back = loads(text, "plan.towboard")
    assert back == p
    assert dumps(back) == text


def test_the_samples_swing_stages_have_their_headings() -> None:
    p = load(SAMPLE)
    swing = p.stages[1].swing
    assert p.stages[1].kind == "swing"
    # "Swing the barge to port through 180 degrees" (the stage's notes)
    assert swing == Swing(90.0, 270.0, "port")
    assert p.stages[0].swing is None


def test_a_file_without_swings_still_reads() -> None:
    data = _data()
    for s in data["stages"]:
        s.pop("swing", None)
    p = loads(json.dumps(data), "old.towboard")
    assert all(s.swing is None for s in p.stages)


@pytest.mark.parametrize(
    ("swing", "problem"),
    [
        (
            {"start_heading_deg": 90, "end_heading_deg": 0, "bow_swings_to": "left"},
            "stages[1].swing.bow_swings_to: 'left' is not one of port, starboard",
        ),
        (
            {"start_heading_deg": 90, "end_heading_deg": 90, "bow_swings_to": "port"},
            "stages[1].swing: swing: end heading: 90.0 must differ from the start heading",
        ),
        (
            {"start_heading_deg": 90, "bow_swings_to": "port"},
            "stages[1].swing.end_heading_deg",
        ),
        (
            {"start_heading_deg": "north", "end_heading_deg": 0, "bow_swings_to": "port"},
            "stages[1].swing.start_heading_deg",
        ),
    ],
)
def test_a_bad_swing_is_named_by_its_field_path(swing: dict[str, Any], problem: str) -> None:
    data = _data()
    data["stages"][1]["swing"] = swing
    problems = _problems(data)
    assert len(problems) == 1
    assert problems[0].startswith(problem)
