"""A tug made fast at 0 % is working (standing by on its line): the cover and the stage
page both list it, in the same words."""

from __future__ import annotations

from PySide6.QtGui import QPageSize, QPdfWriter

from app.briefing.cover import cover
from app.briefing.layout import Ctx, Table
from app.briefing.stage_page import stage_blocks
from core.analysis.stage import plan_results
from core.io.projectfile import load
from tests.conftest import SAMPLES


def _tables(blocks, first: str) -> list[Table]:  # type: ignore[no-untyped-def]
    return [b for b in blocks if isinstance(b, Table) and b.columns[0].title == first]


def test_a_tug_at_0_percent_is_listed_as_standing_by_on_the_cover_and_its_page() -> None:
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    stage = project.stages[0]
    tugs = [p.tug for p in stage.placements]
    assert len(tugs) >= 2
    idle, busy = tugs[0], tugs[1]
    stage = stage.with_placement(stage.placement(idle).with_setting(0.0))
    stage = stage.with_placement(stage.placement(busy).with_setting(0.5))
    project = project.with_stage(stage, 0)
    results = plan_results(project)

    verdicts = next(
        t for t in _tables(cover(project, results), "#") if t.columns[3].title == "Tugs working"
    )
    listed = verdicts.rows[0][3].split(", ")
    assert listed[0] == f"{idle} (standing by)"
    assert listed[1] == busy  # a tug pulling is listed plainly
    assert [t.split(" (")[0] for t in listed] == tugs  # every tug placed, in order

    page = _tables(stage_blocks(project, results[0], 60.0), "Tug")
    rows = {row[0]: row for t in page if t.columns[3].title == "Setting" for row in t.rows}
    assert rows[idle][3] == "standing by"  # alone: "0 %, standing by" wrapped in the column
    assert rows[busy][3] == "50 %"


def test_a_tug_at_a_small_setting_is_working_on_the_cover_and_its_page() -> None:
    # The sample's hold (stage 3): Gannet at 0.5 % gives 0.3 t, which the hold's GO rests
    # on (tests/core/test_standing_by.py), so it is listed plainly, its setting "0.5 %".
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    results = plan_results(project)
    verdicts = next(
        t for t in _tables(cover(project, results), "#") if t.columns[3].title == "Tugs working"
    )
    assert verdicts.rows[2][3].split(", ")[0] == "Gannet"
    page = _tables(stage_blocks(project, results[2], 60.0), "Tug")
    rows = {row[0]: row for t in page if t.columns[3].title == "Setting" for row in t.rows}
    assert rows["Gannet"][3] == "0.5 %"


def test_the_setting_of_a_tug_standing_by_fits_its_column_on_one_line(qapp, tmp_path) -> None:  # type: ignore[no-untyped-def]
    # The sample's unberth (stage 1) solves Tern to nothing: its Setting cell, measured
    # at the briefing's A4 body width (210 mm less 15 mm margins each side), is one line.
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    results = plan_results(project)
    (table,) = [
        t
        for t in _tables(stage_blocks(project, results[0], 60.0), "Tug")
        if t.columns[3].title == "Setting"
    ]
    writer = QPdfWriter(str(tmp_path / "m.pdf"))
    writer.setResolution(300)
    writer.setPageSize(QPageSize(QPageSize.PageSizeId.A4))
    ctx = Ctx(writer)
    width = table.widths(ctx.mm(210 - 2 * 15))[3] - 2 * ctx.mm(table.pad_mm)
    tern = next(row for row in table.rows if row[0] == "Tern")
    assert tern[3] == "standing by"
    one_line = ctx.text_height("8 %", width, table.size_pt)
    assert ctx.text_height(tern[3], width, table.size_pt) == one_line
    del writer
