"""Angles near zero keep their written digits through save and load.

A bearing b comes back from the hull frame as 90 - (90 - b): near 0 that keeps only
about 1e-14 degrees, so a lead sector written [3.60064234379e-10, 30.0] came back as
[3.6005787327e-10, 30.0] and every save changed the file. Found by
benchmarks/fuzz_files.py (seed 7, case 2821). Angles are now written with 12
significant digits and at most 11 decimals.
"""

from __future__ import annotations

import json

import pytest

from core.io.projectfile import dumps, loads
from tests.conftest import SAMPLES


def _placements(d: dict) -> list[dict]:  # type: ignore[type-arg]
    return [p for s in d["stages"] for p in s.get("tugs", [])]


@pytest.mark.parametrize("tiny", [3.60064234379e-10, 2.5e-12, 359.9999999999, 1e-9])
def test_a_near_zero_lead_and_sector_are_stable(tiny: float) -> None:
    d = json.loads((SAMPLES / "pontoon_swing.towboard").read_text())
    lines = [p for p in _placements(d) if "lead_deg" in p]
    assert lines, "the sample has line placements"
    lines[0]["lead_deg"] = tiny
    lines[0]["lead_sector_deg"] = [tiny, 30.0]
    d["stages"][0]["conditions"]["wind_from_deg"] = tiny
    first = dumps(loads(json.dumps(d)))
    assert dumps(loads(first)) == first
    # and what is written is the value given, to 12 significant digits of a bearing
    written = _placements(json.loads(first))
    lead = next(p for p in written if p["tug"] == lines[0]["tug"])
    assert abs((lead["lead_deg"] - tiny + 180.0) % 360.0 - 180.0) <= 1e-9
