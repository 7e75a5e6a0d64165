"""The conditions' load fields and the tug efficiency table in the .towboard file."""

from __future__ import annotations

import json
from dataclasses import replace
from pathlib import Path

import jsonschema
import pytest

from core.errors import ProjectFileError
from core.io.projectfile import dumps, load, loads
from core.model.efficiency import EfficiencyTable

ROOT = Path(__file__).resolve().parents[2]
SAMPLE = ROOT / "sample_projects" / "deck_barge_unberth.towboard"
SCHEMA = json.loads((ROOT / "docs" / "towboard.schema.json").read_text())


def _edited():  # type: ignore[no-untyped-def]
    p = load(SAMPLE)
    s0 = p.stages[0]
    c = replace(
        s0.conditions,
        wind_exponent=0.14,
        wind_coeff_head=0.7,
        wind_coeff_beam=1.1,
        current_coeff_head=0.5,
        current_coeff_beam=0.75,
        wind_area_head_m2=120.0,
        wind_area_beam_m2=555.5,
        current_area_head_m2=70.0,
        current_area_beam_m2=260.0,
        wind_centre_m=(60.0, 1.5),
        current_centre_m=(40.0, 0.0),
        sea_state=2.5,
    )
    table = EfficiencyTable((100e3, 300e3), (0.0, 3.0), ((1.0, 0.7), (1.0, 0.85)))
    return replace(p.with_stage(replace(s0, conditions=c), 0), tug_efficiency=table)


def test_every_new_field_round_trips_byte_identical() -> None:
    project = _edited()
    text = dumps(project)
    jsonschema.validate(json.loads(text), SCHEMA)
    again = loads(text)
    assert again.stages[0].conditions == project.stages[0].conditions
    assert again.tug_efficiency == project.tug_efficiency
    assert dumps(again) == text


def test_a_file_without_the_new_fields_gets_the_defaults() -> None:
    data = json.loads(SAMPLE.read_text())
    del data["tug_efficiency"]
    for key in ("wind_exponent", "sea_state", "wind_area_beam_on_m2", "wind_centre_m"):
        del data["stages"][0]["conditions"][key]
    project = loads(json.dumps(data))
    assert project.tug_efficiency == EfficiencyTable()
    c = project.stages[0].conditions
    assert (c.wind_exponent, c.sea_state, c.wind_area_beam_m2, c.wind_centre_m) == (
        0.12,
        0.0,
        None,
        None,
    )


def _problems(data: dict) -> list[str]:  # type: ignore[type-arg]
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data), "plan.towboard")
    return [str(p) for p in e.value.problems]


def test_bad_condition_fields_name_their_path() -> None:
    data = json.loads(dumps(_edited()))
    cond = data["stages"][0]["conditions"]
    cond["wind_area_beam_on_m2"] = 0
    cond["sea_state"] = 12
    cond["wind_centre_m"] = [1]
    cond["wind_coefficient_beam_on"] = -1
    cond["wind_exponent"] = "steep"
    assert _problems(data) == [
        "stages[0].conditions.wind_exponent: 'steep' is not a number",
        "stages[0].conditions.wind_coefficient_beam_on: -1.0 must be positive",
        "stages[0].conditions.wind_area_beam_on_m2: 0.0 m² must be positive",
        "stages[0].conditions.sea_state: 12.0 must be at most 9",
        "stages[0].conditions.wind_centre_m: [1] is not a pair of numbers [x, y]",
    ]


def test_bad_efficiency_table_names_its_path() -> None:
    data = json.loads(dumps(_edited()))
    data["tug_efficiency"]["efficiency"][1] = [1, 1.5]
    data["tug_efficiency"]["sea_state"] = [3, 0]
    assert _problems(data) == [
        "tug_efficiency.efficiency[1][1]: 1.5 must be at most 1",
        "tug_efficiency.sea_state: [3, 0] must be in increasing order",
    ]
    data = json.loads(dumps(_edited()))
    data["tug_efficiency"]["efficiency"] = [[1.0, 0.7]]
    (problem,) = _problems(data)
    assert problem.startswith("tug_efficiency: ") and "2 rows" in problem


def test_centre_of_pressure_fields_round_trip_and_default() -> None:
    p = load(SAMPLE)
    s0 = p.stages[0]
    c = replace(
        s0.conditions, pressure_centre="fixed", wind_centre_head_on=0.3, current_centre_head_on=0.25
    )
    project = p.with_stage(replace(s0, conditions=c), 0)
    text = dumps(project)
    jsonschema.validate(json.loads(text), SCHEMA)
    again = loads(text)
    assert again.stages[0].conditions == c
    assert dumps(again) == text
    data = json.loads(text)
    for key in ("pressure_centre", "wind_centre_head_on", "current_centre_head_on"):
        del data["stages"][0]["conditions"][key]
    old = loads(json.dumps(data)).stages[0].conditions
    # Files written before these fields get the moving centre with Hughes' 0.291.
    assert (old.pressure_centre, old.wind_centre_head_on) == ("moving", 0.291)


def test_bad_centre_of_pressure_fields_name_their_path() -> None:
    data = json.loads(dumps(_edited()))
    cond = data["stages"][0]["conditions"]
    cond["pressure_centre"] = "wandering"
    cond["current_centre_head_on"] = 0.8
    assert _problems(data) == [
        "stages[0].conditions.current_centre_head_on: 0.8 must be at most 0.5",
        "stages[0].conditions.pressure_centre: 'wandering' is not one of moving, fixed",
    ]


def test_water_depth_fields_round_trip_and_default() -> None:
    p = load(SAMPLE)
    s0 = p.stages[0]
    c = replace(s0.conditions, water_depth_m=9.5, ukc_margin_m=1.2)
    project = p.with_stage(replace(s0, conditions=c), 0)
    text = dumps(project)
    jsonschema.validate(json.loads(text), SCHEMA)
    again = loads(text)
    assert again.stages[0].conditions == c
    assert dumps(again) == text
    data = json.loads(text)
    for key in ("water_depth_m", "under_keel_margin_m"):
        del data["stages"][0]["conditions"][key]
    old = loads(json.dumps(data)).stages[0].conditions
    assert (old.water_depth_m, old.ukc_margin_m) == (None, 0.5)  # deep water, common practice


def test_bad_water_depth_fields_name_their_path() -> None:
    data = json.loads(dumps(_edited()))
    cond = data["stages"][0]["conditions"]
    cond["water_depth_m"] = -3
    cond["under_keel_margin_m"] = "plenty"
    assert _problems(data) == [
        "stages[0].conditions.water_depth_m: -3.0 m must be positive",
        "stages[0].conditions.under_keel_margin_m: 'plenty' is not a number",
    ]
