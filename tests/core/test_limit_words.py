"""How far a hold limit is reported, one rule for every view (REVIEW.md F9).

The text report and its JSON printed 300 kn limits where the window and the briefing
said "above 60.0 kn"; a limit of 0 was said as "none", easily read as "no limit".
"""

from __future__ import annotations

import json
import re
from pathlib import Path

import pytest

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
