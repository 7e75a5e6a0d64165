"""Try a substitute tug: per stage, the verdict now and with the substitute, and applying it.

The twin barge sample's stage 4 is GO (every other stage CAUTION). Rowan (55 t) pulls a
little in it; a 10 t substitute that keeps Rowan's settings cannot give the walk its pull,
so the stage misses its goal and turns NO-GO, on screen and on the briefing's cover."""

from __future__ import annotations

import unicodedata

import pypdf
import pytest
from PySide6.QtCore import Qt

from app.briefing.document import write_pdf
from app.panels.stage_list import MARKS
from app.window.substitute_dialog import SubstituteDialog
from core.analysis.stage import plan_results
from core.io.projectfile import load
from tests.app.editors.conftest import retype
from tests.conftest import SAMPLES

TF = 9806.65  # N per tonne-force (NIST SP 811, from memory; REFERENCES.md)
TWIN = SAMPLES / "twin_barge_move.towboard"


@pytest.fixture
def twin(window):  # type: ignore[no-untyped-def]
    assert window.open_path(TWIN, ask=False)
    return window


def _dialog(window) -> SubstituteDialog:  # type: ignore[no-untyped-def]
    window.editors.act_substitute.trigger()
    found = [d for d in window.findChildren(SubstituteDialog) if d.isVisible()]
    assert len(found) == 1
    return found[0]


def _weak_wren(qtbot, d: SubstituteDialog) -> None:  # type: ignore[no-untyped-def]
    d.replace.setFocus()
    qtbot.keyClicks(d.replace, "Rowan")  # a combo box finds its item by typing
    assert d.replace.currentText() == "Rowan"
    retype(qtbot, d.form.name, "Wren")
    retype(qtbot, d.form.bollard_pull, "10")
    retype(qtbot, d.form.astern_pull, "10")
    qtbot.mouseClick(d.keep_settings, Qt.MouseButton.LeftButton)
    qtbot.mouseClick(d.check_button, Qt.MouseButton.LeftButton)


def test_the_tugs_menu_offers_it(twin) -> None:
    assert "Try a &substitute tug…" in [a.text() for a in twin.menu("tugs").actions()]


def test_a_weaker_substitute_turns_a_go_stage_no_go_per_stage(twin, qtbot) -> None:
    before = twin.controller.project
    assert plan_results(before)[3].verdict.status == "go"
    d = _dialog(twin)
    _weak_wren(qtbot, d)
    assert d.table.rowCount() == len(before.stages) == 4
    row = [d.table.item(3, c).text() for c in range(4)]
    assert row[0].startswith("4. Berth")
    assert (row[1], row[2]) == (MARKS["go"], MARKS["no-go"])
    assert "now:" in row[3] and "walk" in row[3]
    assert "stage 4 GO → NO-GO" in d.summary.text()
    assert d.apply_button.isEnabled()
    assert twin.controller.project is before  # nothing changes until it is applied


def test_changing_an_input_after_the_check_asks_for_a_new_check(twin, qtbot) -> None:
    d = _dialog(twin)
    _weak_wren(qtbot, d)
    retype(qtbot, d.form.bollard_pull, "60")
    assert not d.apply_button.isEnabled()
    assert "check the plan again" in d.summary.text()
    qtbot.mouseClick(d.check_button, Qt.MouseButton.LeftButton)
    assert d.apply_button.isEnabled()


def test_refused_particulars_are_named(twin, qtbot) -> None:
    d = _dialog(twin)
    retype(qtbot, d.form.name, "Alder")  # another tug of the plan
    qtbot.mouseClick(d.check_button, Qt.MouseButton.LeftButton)
    assert "'Alder' is another tug of the plan" in d.error.text()
    retype(qtbot, d.form.name, "Wren")
    retype(qtbot, d.form.bollard_pull, "0")
    qtbot.mouseClick(d.check_button, Qt.MouseButton.LeftButton)
    assert "tug Wren: bollard pull: 0.0 t must be at least 0.1 t" in d.error.text()
    assert not d.apply_button.isEnabled()


def test_applying_is_one_undo_step_and_the_window_and_briefing_say_no_go(
    twin, qtbot, tmp_path
) -> None:
    c = twin.controller
    before = c.project
    d = _dialog(twin)
    _weak_wren(qtbot, d)
    qtbot.mouseClick(d.apply_button, Qt.MouseButton.LeftButton)
    assert not d.isVisible()
    p = c.project
    assert "Rowan" not in [t.name for t in p.tugs]
    wren = p.tug("Wren")
    assert wren.bollard_pull_n == pytest.approx(10 * TF)
    assert p.stages[3].placement("Wren").setting == before.stages[3].placement("Rowan").setting
    assert c.undo_stack.count() == 1 and c.undo_stack.undoText() == "Substitute Wren for Rowan"
    # the window: the stage list reads the verdict of the project as it now stands
    sl = twin.plan_ui.stage_list
    qtbot.waitUntil(lambda: MARKS["no-go"] in sl.list.item(3).text(), timeout=10000)
    # the briefing: the cover's verdict lines (keeping Rowan's settings, all four stages
    # miss their goals with Wren: stages 1 to 3 were CAUTION, stage 4 GO)
    assert [r.verdict.status for r in plan_results(p)] == ["no-go"] * 4
    assert _cover(before, tmp_path).count("NO-GO") == 0
    cover = _cover(p, tmp_path)
    assert cover.count("NO-GO") == 4 and "Wren" in cover
    c.undo_stack.undo()
    assert c.project == before
    assert load(TWIN) == before


def _cover(project, tmp_path) -> str:  # type: ignore[no-untyped-def]
    pdf = tmp_path / "brief.pdf"
    write_pdf(project, pdf)
    return unicodedata.normalize("NFKC", pypdf.PdfReader(pdf).pages[0].extract_text())
