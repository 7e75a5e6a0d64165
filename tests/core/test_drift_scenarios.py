"""Drift scenarios from plans: the worst tug lost, a named tug lost, lines let go, pulls as
set; the drift's inputs in the project file."""

from __future__ import annotations

import json
import math
from dataclasses import replace

import numpy as np
import pytest

from core.errors import InputError
from core.io.decode import decode
from core.io.encode import encode
from core.io.projectfile import load
from core.model.drift import DriftSettings
from core.motion.drift import DRIFT_CAUTION, DriftScenario
from core.motion.scenarios import drift, drift_setup, tug_lost_drifts, worst_of
from tests.conftest import SAMPLES


@pytest.fixture(scope="module")
def twin():  # type: ignore[no-untyped-def]
    return load(SAMPLES / "twin_barge_move.towboard")


def test_worst_tug_lost_is_the_soonest_contact(twin) -> None:  # type: ignore[no-untyped-def]
    stage = twin.stages[3]  # berthing at the lay-by quay
    setup = drift_setup(twin, stage)
    each = tug_lost_drifts(setup)
    assert [r.problem.scenario.tug for r in each] == list(setup.tugs)
    worst = drift(twin, stage, DriftScenario("worst_tug_lost"), setup=setup)
    assert worst is not None and worst.contact is not None
    soonest = min(r.contact.time_s for r in each if r.contact is not None)
    assert worst.contact.time_s == soonest
    assert worst.problem.scenario.kind == "worst_tug_lost"
    assert worst.problem.scenario.words() == f"worst tug lost ({worst.problem.scenario.tug})"


def test_without_contact_the_worst_is_the_furthest_drift(twin) -> None:  # type: ignore[no-untyped-def]
    stage = twin.stages[1]
    setup = drift_setup(twin, stage)
    each = tug_lost_drifts(setup)
    assert all(r.contact is None for r in each)  # the swing is in open water
    worst = worst_of(each)
    assert worst is not None
    assert worst.excursion_m() == max(r.excursion_m() for r in each)


def test_every_sample_stage_drifts_in_every_scenario(sample_paths) -> None:  # type: ignore[no-untyped-def]
    for path in sample_paths:
        project = load(path)
        for stage in project.stages:
            setup = drift_setup(project, stage)
            for sc in (
                DriftScenario("as_set"),
                DriftScenario("let_go"),
                DriftScenario("worst_tug_lost"),
            ):
                r = drift(project, stage, sc, setup=setup)
                if r is None:
                    assert not setup.tugs
                    continue
                assert np.isfinite(r.states).all()
                assert r.times[0] == 0.0 and r.end_s <= project.drift.horizon_s + 1e-9
                if r.contact is not None:
                    assert math.isfinite(r.contact.closing_speed_ms)


def test_a_tug_not_on_the_body_is_refused(twin) -> None:  # type: ignore[no-untyped-def]
    setup = drift_setup(twin, twin.stages[0])
    with pytest.raises(InputError, match="tug lost: 'Nobody' does not work on Lark pair"):
        setup.problem(DriftScenario("tug_lost", "Nobody"))


def test_a_named_tug_lost_needs_its_name() -> None:
    with pytest.raises(InputError, match="drift scenario: 'tug_lost' needs the name"):
        DriftScenario("tug_lost")


def test_a_hull_without_draught_cannot_drift(twin) -> None:  # type: ignore[no-untyped-def]
    hull = replace(twin.hulls[0], draught_m=None)
    p = twin.with_hull(hull)
    with pytest.raises(InputError, match="draught"):
        drift_setup(p, p.stages[0])


def test_the_caution_says_what_is_left_out() -> None:
    for word in ("waves", "wash", "shallow", "squat", "tugs' own response", "master", "pilot"):
        assert word in DRIFT_CAUTION


def test_settings_are_checked() -> None:
    with pytest.raises(InputError, match="drift times: .* must be in increasing order"):
        DriftSettings((60.0, 30.0))
    with pytest.raises(InputError, match="drift time: -5.0 s must be positive"):
        DriftSettings((-5.0,))
    with pytest.raises(InputError, match="drift horizon: 7200.0 s must be at most 3600 s"):
        DriftSettings(horizon_s=7200.0)


def test_drift_inputs_round_trip_through_the_file(twin) -> None:  # type: ignore[no-untyped-def]
    hull = replace(twin.hulls[0], yaw_gyradius_m=21.5, added_mass_method="ship")
    p = replace(twin.with_hull(hull), drift=DriftSettings((20.0, 90.0), 300.0))
    back, problems = decode(json.loads(json.dumps(encode(p))))
    assert problems == [] and back is not None
    assert back.hulls[0].yaw_gyradius_m == 21.5
    assert back.hulls[0].added_mass_method == "ship"
    assert back.drift == DriftSettings((20.0, 90.0), 300.0)


def test_bad_drift_inputs_in_a_file_are_reported_with_their_paths(twin) -> None:  # type: ignore[no-untyped-def]
    data = encode(twin)
    data["hulls"][0]["added_mass_method"] = "strips"
    data["hulls"][1]["yaw_radius_of_gyration_m"] = -3
    data["drift"] = {"ghost_times_s": [30, 20], "horizon_s": 0}
    project, problems = decode(data)
    assert project is None
    text = "\n".join(str(p) for p in problems)
    assert "hulls[0].added_mass_method: 'strips' is not one of sections, ship" in text
    assert "hulls[1].yaw_radius_of_gyration_m: -3.0 m must be positive" in text
    assert "drift.horizon_s: 0.0 s must be positive" in text
