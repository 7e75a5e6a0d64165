"""How far a hold limit is reported, one rule for every view (REVIEW.md F9).

The text report and its JSON printed 300 kn limits where the window and the briefing
said "above 60.0 kn"; a limit of 0 was said as "none", easily read as "no limit".
"""

from __future__ import annotations

import json
import re
from pathlib import Path

import numpy as np
import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.io.report import report_json, report_text
from core.solve.holdlimits import SHOWN_UP_TO_MS, limit_cell, limit_words, shown_limit
from core.units import DisplayUnits

ROOT = Path(__file__).resolve().parents[2]
KN = 1852.0 / 3600.0  # m/s per knot (by definition)


def test_one_rule_for_how_far_a_limit_is_reported() -> None:
    u = DisplayUnits()  # speeds in kn
    cap = SHOWN_UP_TO_MS["wind"]
    assert cap == pytest.approx(60.0 * KN)  # 60 kn, common practice, no source
    assert shown_limit(155.3) is None and shown_limit(float("inf")) is None
    assert shown_limit(12.0) == 12.0
    assert limit_words(155.3, u) == "above 60.0 kn"
    assert limit_cell(155.3, u) == "above"
    assert limit_cell(10.0 * KN, u) == "10.0"
    # 0 is said as not held, never as "none"
    assert limit_words(0.0, u) == "0.0 kn (not held)"


def _pontoon() -> object:
    return load(ROOT / "sample_projects" / "pontoon_swing.towboard")


def test_the_text_report_prints_no_limit_above_the_shown_range() -> None:
    # REVIEW.md F9: pontoon stage 1 printed 301.9 ... 302.7 kn
    text = report_text(_pontoon())
    rows = [ln for ln in text.splitlines() if re.match(r"    (all|1 lost) ", ln)]
    assert rows
    for row in rows:
        for cell in row[11:].split():
            assert cell == "above" or float(cell) <= 60.0, row
    assert "(above: more than 60.0 kn)" in text
    assert "lowest above 60.0 kn from" in text


def test_the_json_gives_null_above_the_shown_range() -> None:
    data = json.loads(json.dumps(report_json(_pontoon()), allow_nan=False))
    for stage in data["stages"]:
        h = stage["hold_limits"]
        if h is None:
            continue
        assert h["shown_up_to_ms"] == pytest.approx(SHOWN_UP_TO_MS["wind"])
        values = h["all_tugs_ms"] + h["worst_tug_lost_ms"]
        assert all(v is None or 0.0 <= v <= h["shown_up_to_ms"] for v in values)
    first = data["stages"][0]["hold_limits"]
    assert None in first["all_tugs_ms"]  # the 300 kn figures are "above"


def test_the_lowest_limit_names_no_direction_when_every_direction_reads_alike() -> None:
    # The deck barge's unberth (stage 1): with all tugs every direction is above the
    # 60 kn the limits are shown up to, and with Gannet or Puffin lost the walk is not met
    # even in calm, so that limit is 0 from every direction: no one direction is lowest.
    project = load(ROOT / "sample_projects" / "deck_barge_unberth.towboard")
    u = project.units
    main = stage_result(project, 0).main
    assert main is not None and main.hold_limits is not None
    lim = main.hold_limits
    assert all(shown_limit(float(v)) is None for v in lim.all_tugs_ms)
    assert float(np.max(lim.worst_lost_ms)) <= 0.0
    assert lim.lowest_words(u) == "above 60.0 kn from every direction"
    assert lim.lowest_words(u, lim.worst_lost_ms) == "0 from every direction"
    text = report_text(project).split("Stage 1:")[1].split("Stage 2:")[0]
    assert "    lowest above 60.0 kn from every direction; from the planned 200 true" in text
    # a curve with a lowest direction names it (stage 2, the swing: 46.7 kn from 171)
    swing = stage_result(project, 1).main
    assert swing is not None and swing.hold_limits is not None
    d, v = swing.hold_limits.lowest()
    assert swing.hold_limits.lowest_words(u) == f"{limit_words(v, u)} from {d:03.0f} true"
    assert swing.hold_limits.lowest_words(u, mark="°") == f"{limit_words(v, u)} from {d:03.0f}°"
