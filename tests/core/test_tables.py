"""The report's tables as CSV: every number the JSON report's, read back exactly."""

from __future__ import annotations

import csv
import io

import pytest

from core.io.projectfile import load
from core.io.report import report_json
from core.io.tables import (
    BALANCE_COLUMNS,
    TUG_COLUMNS,
    balance_table,
    cell,
    csv_text,
    lookup,
    stage_rows,
    tug_rows,
    tug_table,
)
from core.units import DisplayUnits
from tests.conftest import SAMPLES


def _parse(text: str) -> list[list[str]]:
    return list(csv.reader(io.StringIO(text)))


def _back(text: str, like: object) -> object:
    """A cell read back as the JSON value it came from."""
    if text == "":
        return None
    if isinstance(like, bool):
        return {"yes": True, "no": False}[text]
    if isinstance(like, int):
        return int(text)
    if isinstance(like, float):
        return float(text)
    return text


@pytest.mark.parametrize("name", sorted(p.name for p in SAMPLES.glob("*.towboard")))
def test_csv_round_trip_equals_the_report_json(name: str) -> None:
    report = report_json(load(SAMPLES / name))
    for rows, columns, table in (
        (tug_rows(report), TUG_COLUMNS, tug_table(report)),
        (stage_rows(report), BALANCE_COLUMNS, balance_table(report)),
    ):
        parsed = _parse(csv_text(table))
        assert parsed[0] == [c.title(None) for c in columns]
        assert len(parsed) == len(rows) + 1
        for row, cells in zip(rows, parsed[1:], strict=True):
            for col, text in zip(columns, cells, strict=True):
                want = lookup(row, col.path)
                assert _back(text, want) == want, (col.heading, text, want)


def test_tables_are_filled_from_the_report() -> None:
    """Not empty by accident: the tugs of every stage, the pulls and the balance are there."""
    project = load(SAMPLES / "pontoon_swing.towboard")
    report = report_json(project)
    tugs = _parse(csv_text(tug_table(report)))
    heads = tugs[0]
    placed = sum(len(s.placements) for s in project.stages)
    assert len(tugs) - 1 == placed
    for stage_no, stage in enumerate(project.stages, start=1):
        names = {
            r[heads.index("Tug")] for r in tugs[1:] if r[heads.index("Stage no.")] == str(stage_no)
        }
        assert names == {p.tug for p in stage.placements}
    pull = heads.index("Assigned pull (N)")
    assert all(r[pull] != "" for r in tugs[1:])
    tension = heads.index("Line tension (N)")
    assert all(r[tension] != "" for r in tugs[1:] if r[heads.index("Mode")] == "line")
    bal = _parse(csv_text(balance_table(report)))
    assert len(bal) - 1 == len(project.stages)
    assert all(r[bal[0].index("Yaw moment about the centroid (N*m)")] != "" for r in bal[1:])
    verdicts = [r[bal[0].index("Verdict")] for r in bal[1:]]
    assert verdicts == [s["verdict"]["status"] for s in report["stages"]]
    assert all(v in ("go", "caution", "no-go") for v in verdicts)


def test_display_units_are_the_report_converted() -> None:
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    report = report_json(project)
    si = _parse(csv_text(tug_table(report)))
    shown = _parse(csv_text(tug_table(report, DisplayUnits())))  # t, t*m, m, kn
    assert "Assigned pull (t)" in shown[0] and "Yaw moment about the centroid (t·m)" in shown[0]
    i_si, i_t = si[0].index("Assigned pull (N)"), shown[0].index("Assigned pull (t)")
    for a, b in zip(si[1:], shown[1:], strict=True):
        # 1 t (tonne-force) = 9806.65 N (NIST SP 811, from memory)
        assert float(b[i_t]) == pytest.approx(float(a[i_si]) / 9806.65, rel=1e-12)


def test_cells() -> None:
    assert cell(None, None, None) == ""
    assert cell(True, None, None) == "yes"
    assert cell(3, None, None) == "3"
    assert cell(-0.0, "force", None) == "0.0"
    assert float(cell(0.1 + 0.2, None, None)) == 0.1 + 0.2  # read back exactly
    assert cell("walks to port", None, None) == "walks to port"
    assert lookup({"a": [1, {"b": 2}]}, ("a", 1, "b")) == 2
    assert lookup({"a": [1]}, ("a", 5)) is None


def test_no_lowest_direction_where_the_report_says_every_direction_alike() -> None:
    # The deck barge's stage 1: the tugs meet the walk above the shown range from every
    # true direction, and the report says "above 60.0 kn from every direction". The JSON
    # and the CSV named a direction (353) beside no speed; they name none, as the text.
    from core.io.report import report_text

    project = load(SAMPLES / "deck_barge_unberth.towboard")
    stage1 = report_text(project).split("Stage 2:")[0]
    assert "lowest above 60.0 kn from every direction" in stage1
    lowest = report_json(project)["stages"][0]["hold_limits"]["lowest_all_tugs"]
    assert lowest == {"from_true_deg": None, "speed_ms": None}
    rows = _parse(csv_text(balance_table(report_json(project))))
    head = rows[0]
    first = dict(zip(head, rows[1], strict=True))
    assert first["Lowest hold limit (m/s)"] == ""
    assert first["Lowest hold limit from, true (deg)"] == ""
    # where one direction is the lowest, it is still named (stage 3: 3.2 kn from 007)
    third = report_json(project)["stages"][2]["hold_limits"]["lowest_all_tugs"]
    assert third["from_true_deg"] == 7.0
