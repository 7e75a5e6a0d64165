"""The stage's drift preview, computed once and read by the report (text and JSON)."""

from __future__ import annotations

from dataclasses import replace

import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.io.report import report_json, report_text
from core.motion.drift import DRIFT_CAUTION
from core.motion.summary import ghost_rows, time_words
from tests.conftest import SAMPLES

KNOT = 1852.0 / 3600.0


@pytest.fixture(scope="module")
def twin():  # type: ignore[no-untyped-def]
    return load(SAMPLES / "twin_barge_move.towboard")


def test_stage_drift_is_worked_out_once_per_project_value(twin) -> None:  # type: ignore[no-untyped-def]
    a = stage_result(twin, 3).drift
    assert stage_result(twin, 3).drift is a
    assert a.reason == "" and a.body == "Lark pair"
    assert a.worst is not None and a.let_go is not None
    times = [r.contact.time_s for r in a.tug_lost if r.contact is not None]
    assert a.worst.contact is not None and a.worst.contact.time_s == min(times)
    changed = replace(twin, name="Another name")
    assert stage_result(changed, 3).drift is not a


def test_report_text_says_the_worst_tug_lost_and_lines_let_go(twin) -> None:  # type: ignore[no-untyped-def]
    text = report_text(twin)
    sd = stage_result(twin, 3).drift
    w = sd.worst
    assert w is not None and w.contact is not None
    line = (
        f"  Drift, worst tug lost ({w.problem.scenario.tug}): touches {w.contact.other} (quay) "
        f"after {round(w.contact.time_s)} s, closing at {w.contact.closing_speed_ms / KNOT:.2f} kn"
    )
    assert line in text
    assert text.count("  Drift, lines let go: ") == len(twin.stages)
    assert DRIFT_CAUTION in text


def test_report_json_carries_the_same_numbers(twin) -> None:  # type: ignore[no-untyped-def]
    data = report_json(twin)
    sd = stage_result(twin, 3).drift
    d = data["stages"][3]["drift"]
    assert d["worst_tug_lost"]["contact"]["time_s"] == sd.worst.contact.time_s  # type: ignore[union-attr]
    assert d["lines_let_go"]["scenario"] == "let_go"
    assert len(d["each_tug_lost"]) == len(sd.tug_lost)
    assert data["drift_caution"] == DRIFT_CAUTION


def test_a_stage_that_cannot_drift_says_why(twin) -> None:  # type: ignore[no-untyped-def]
    p = twin.with_hull(replace(twin.hulls[0], draught_m=None, displacement_kg=None))
    sd = stage_result(p, 0).drift
    assert sd.worst is None and sd.reason.startswith("drift not worked out: ")
    assert "  Drift preview   drift not worked out: " in report_text(p)


def test_ghost_rows_follow_the_track(twin) -> None:  # type: ignore[no-untyped-def]
    r = stage_result(twin, 1).drift.let_go
    assert r is not None and r.contact is None
    rows = ghost_rows(r)
    assert [g.time_s for g in rows] == list(twin.drift.times_s)
    assert all(g.moved_m >= 0 for g in rows)
    assert rows[-1].moved_m >= rows[0].moved_m


@pytest.mark.parametrize(
    ("seconds", "words"),
    [(0.4, "0 s"), (45.2, "45 s"), (119.6, "2 min"), (600.0, "10 min"), (200, "3 min 20 s")],
)
def test_time_words(seconds: float, words: str) -> None:
    assert time_words(seconds) == words
