"""The title block, the revision history, fitting ratings (SWL, TOW, permitted line angles)
and the tug particulars: the model's rules, the file round trip and the checks they drive."""

from __future__ import annotations

import json
import math
from dataclasses import replace
from pathlib import Path

import jsonschema
import pytest

from core.analysis.checks import check_stage
from core.errors import InputError, ProjectFileError
from core.frames import angle_in_sector, bearing_to_angle
from core.io.projectfile import dumps, load, loads
from core.model.hull import Fitting
from core.model.plan import Project, Revision
from core.model.tugs import Tug
from tests.core.plan_builders import TF, two_tug_plan

ROOT = Path(__file__).resolve().parents[2]
SAMPLE = ROOT / "sample_projects" / "deck_barge_unberth.towboard"
SCHEMA = json.loads((ROOT / "docs" / "towboard.schema.json").read_text())


def _rad(from_deg: float, to_deg: float) -> tuple[float, float]:
    """A sector given clockwise from ``from_deg`` to ``to_deg`` (relative bearings) as the
    core's counter-clockwise (low, high) hull-frame pair."""
    return (bearing_to_angle(to_deg), bearing_to_angle(from_deg))


def _edited() -> Project:
    p = load(SAMPLE)
    hull = p.hulls[0]
    bow = replace(
        hull.fittings[0], swl_n=80 * TF, tow_n=64.5 * TF, permitted_lead_rad=_rad(300, 60)
    )
    tug = replace(
        p.tugs[0],
        certificate_date="2026-03-14",
        towline_length_m=220.0,
        towline_mbl_n=1912.3e3,
        call_sign="LXQ4",
        working_channel="VHF 71",
    )
    history = (
        Revision("A", "2026-11-02", "R. Okonkwo", "First issue for comment"),
        Revision("B", "2026-12-14", "R. Okonkwo", "Tug Skerry added"),
    )
    p = p.with_title_block(checked_by="T. Vane", approved_by="M. Ilse", history=history)
    return replace(p.with_hull(hull.with_fitting(bow)), tugs=(tug, *p.tugs[1:]))


def test_every_new_field_round_trips_and_matches_the_schema() -> None:
    project = _edited()
    text = dumps(project)
    jsonschema.validate(json.loads(text), SCHEMA)
    again = loads(text)
    assert again == project
    assert again.history == project.history
    assert again.hulls[0].fittings[0] == project.hulls[0].fittings[0]
    assert again.tugs[0] == project.tugs[0]
    assert dumps(again) == text


def test_the_file_writes_the_new_fields_in_their_units() -> None:
    data = json.loads(dumps(_edited()))
    bow = data["hulls"][0]["fittings"][0]
    # 64.5 t = 632.5 kN (1 t = 9.80665 kN, NIST SP 811, from memory)
    assert bow["tow_kN"] == pytest.approx(64.5 * 9.80665)
    assert bow["permitted_lead_deg"] == pytest.approx([300.0, 60.0])
    tug = data["tugs"][0]
    assert tug["towline_mbl_kN"] == pytest.approx(1912.3)
    assert tug["towline_length_m"] == 220.0
    assert (tug["call_sign"], tug["working_channel"], tug["certificate_date"]) == (
        "LXQ4",
        "VHF 71",
        "2026-03-14",
    )
    assert data["plan"]["history"][1] == {
        "revision": "B",
        "date": "2026-12-14",
        "by": "R. Okonkwo",
        "description": "Tug Skerry added",
    }


def test_a_file_without_the_new_fields_gets_the_defaults() -> None:
    data = json.loads(SAMPLE.read_text())
    del data["plan"]["history"]
    for f in data["hulls"][0]["fittings"]:
        del f["tow_kN"], f["permitted_lead_deg"]
    for t in data["tugs"]:
        for key in ("certificate_date", "towline_length_m", "towline_mbl_kN", "call_sign"):
            del t[key]
    p = loads(json.dumps(data))
    assert p.history == ()
    assert all(f.tow_n is None and f.permitted_lead_rad is None for f in p.hulls[0].fittings)
    assert all(t.towline_mbl_n is None and t.call_sign == "" for t in p.tugs)


def test_bad_new_fields_are_reported_with_their_paths() -> None:
    data = json.loads(SAMPLE.read_text())
    data["plan"]["history"] = [{"revision": "", "date": "x"}, {"date": "2026-01-01"}]
    data["hulls"][0]["fittings"][0]["tow_kN"] = -3
    data["hulls"][0]["fittings"][0]["permitted_lead_deg"] = [10]
    data["tugs"][0]["towline_mbl_kN"] = 5e-324  # a denormal made the share of it infinite
    data["tugs"][0]["towline_length_m"] = "long"
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data), "plan.towboard")
    problems = [str(p) for p in e.value.problems]
    assert "plan.history[0]: revision history: revision: '' must not be empty" in problems, problems
    assert "plan.history[1].revision: is missing" in problems
    assert "hulls[0].fittings[0].tow_kN: -3.0 kN must be at least 0.980665 kN" in problems
    assert (
        "hulls[0].fittings[0].permitted_lead_deg: [10] is not a pair of numbers [x, y]" in problems
    )
    assert "tugs[0].towline_mbl_kN: 4.94066e-324 kN must be at least 0.980665 kN" in problems
    assert "tugs[0].towline_length_m: 'long' is not a number" in problems


def test_permitted_angles_on_a_push_point_are_refused_in_the_file() -> None:
    data = json.loads(SAMPLE.read_text())
    push = next(i for i, f in enumerate(data["hulls"][0]["fittings"]) if f["kind"] == "push")
    data["hulls"][0]["fittings"][push]["permitted_lead_deg"] = [0, 90]
    with pytest.raises(ProjectFileError) as e:
        loads(json.dumps(data))
    assert any("apply to line points only" in str(p) for p in e.value.problems)


# -- the model's rules ------------------------------------------------------------------
@pytest.mark.parametrize(
    ("kwargs", "match"),
    [
        ({"tow_n": 0.0}, "TOW"),
        ({"tow_n": math.nan}, "TOW"),
        ({"swl_n": -1.0}, "SWL"),
        ({"permitted_lead_rad": (0.3, 0.3)}, "more than one direction"),
        ({"permitted_lead_rad": (0.0, math.inf)}, "finite"),
    ],
)
def test_impossible_fitting_ratings_are_refused(kwargs: dict[str, object], match: str) -> None:
    with pytest.raises(InputError, match=match):
        Fitting("Bow bitt", "line", 0.0, 0.0, **kwargs)  # type: ignore[arg-type]


@pytest.mark.parametrize(
    ("kwargs", "match"),
    [
        ({"towline_length_m": 0.0}, "towline length"),
        ({"towline_mbl_n": -5.0}, "towline MBL"),
        ({"towline_mbl_n": math.inf}, "towline MBL"),
    ],
)
def test_impossible_tug_particulars_are_refused(kwargs: dict[str, object], match: str) -> None:
    with pytest.raises(InputError, match=match):
        Tug("Skerry", 50 * TF, **kwargs)  # type: ignore[arg-type]


def test_revision_and_plan_name_must_not_be_blank() -> None:
    with pytest.raises(InputError, match="revision"):
        Revision("  ")
    with pytest.raises(InputError, match="plan name"):
        Project(name=" ")


def test_only_title_block_fields_go_through_with_title_block() -> None:
    p = Project().with_title_block(name="Pontoon 7 out", prepared_by="A. Ried")
    assert (p.name, p.prepared_by) == ("Pontoon 7 out", "A. Ried")
    with pytest.raises(InputError, match="not part of the title block"):
        Project().with_title_block(hulls=())


def test_towing_rating_is_tow_else_swl() -> None:
    f = Fitting("Bow bitt", "line", 0.0, 0.0, swl_n=60 * TF)
    assert (f.towing_rating_n, f.rating_label) == (60 * TF, "SWL")
    g = replace(f, tow_n=40 * TF)
    assert (g.towing_rating_n, g.rating_label) == (40 * TF, "TOW")
    assert Fitting("x", "line", 0.0, 0.0).rating_label == ""


@pytest.mark.parametrize(
    ("bearing", "inside"),
    [(0.0, True), (300.0, True), (60.0, True), (59.0, True), (90.0, False), (180.0, False)],
)
def test_permitted_sector_runs_clockwise_from_its_first_bearing(
    bearing: float, inside: bool
) -> None:
    # 300 to 060 clockwise spans ahead (geometry of the bearing circle)
    f = Fitting("Bow fairlead", "line", 0.0, 0.0, permitted_lead_rad=_rad(300, 60))
    assert f.permits_lead(bearing_to_angle(bearing)) is inside


def test_angle_in_sector_wraps_through_pi() -> None:
    assert angle_in_sector(math.pi, 3.0, -3.0)
    assert angle_in_sector(-3.1, 3.0, -3.0)
    assert not angle_in_sector(0.0, 3.0, -3.0)
    assert angle_in_sector(0.0, -3.0, 3.0)


# -- the checks these fields drive ----------------------------------------------------------
def _with_bow(project: Project, **kw: object) -> Project:
    hull = project.hulls[0]
    return project.with_hull(hull.with_fitting(replace(hull.fitting("bow"), **kw)))


def _codes(project: Project, index: int) -> list[str]:
    return [n.code for n in check_stage(project, index).notices]


def test_tow_governs_the_fitting_check_over_swl() -> None:
    # Stage 3: Gannet (50 t BP) on the bow bitt. IMO MSC.1/Circ.1175 (read, see
    # REFERENCES.md): a fitting of rating S suits tugs of bollard pull up to S.
    plan = two_tug_plan()
    assert "fitting_under_rated" not in _codes(_with_bow(plan, swl_n=60 * TF), 2)
    low_tow = _with_bow(plan, swl_n=60 * TF, tow_n=45 * TF)
    notes = check_stage(low_tow, 2).notices
    msg = next(n.message for n in notes if n.code == "fitting_under_rated")
    assert "TOW 45.0 t" in msg and "Gannet" in msg


def test_a_pull_over_the_tow_names_tow() -> None:
    # Gannet at 40 % of 50 t x efficiency pulls about 20 t; a TOW of 10 t is exceeded.
    plan = _with_bow(two_tug_plan(), tow_n=10 * TF)
    notes = check_stage(plan, 2).notices
    msg = next(n.message for n in notes if n.code == "fitting_over_rating")
    assert "is over the TOW 10.0 t of bow" in msg


def test_a_towline_outside_the_permitted_angles_is_warned() -> None:
    plan = two_tug_plan()  # stage 3: Gannet's line leads dead ahead (000)
    ahead = _with_bow(plan, permitted_lead_rad=_rad(300, 60))
    assert "outside_permitted_angles" not in _codes(ahead, 2)
    beam = _with_bow(plan, permitted_lead_rad=_rad(30, 150))
    msg = next(
        n.message for n in check_stage(beam, 2).notices if n.code == "outside_permitted_angles"
    )
    assert "000°" in msg and "030° to 150°" in msg


@pytest.mark.parametrize("setting", [0.0, 0.37, 1.0, -0.1, 1.5, math.nan, math.inf])
def test_a_new_setting_is_the_placement_made_afresh_or_the_same_refusal(setting: float) -> None:
    """``Placement.with_setting`` copies the placement and checks the one value (the live
    solve's fast path); it must give what making the placement afresh gives."""
    placement = two_tug_plan().stages[0].placements[0]
    before = placement.setting
    try:
        made = replace(placement, setting=setting)
    except InputError as e:
        with pytest.raises(InputError) as got:
            placement.with_setting(setting)
        assert str(got.value) == str(e)
        return
    new = placement.with_setting(setting)
    assert new == made and hash(new) == hash(made) and type(new.setting) is float
    assert placement.setting == before  # the old one is untouched
