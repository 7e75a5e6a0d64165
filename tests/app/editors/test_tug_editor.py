"""The tug editor: every particular typed with real keys, one undo step, the core's rules."""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt

from app.panels.tug_dialog import TugDialog
from app.panels.tug_form import TugForm
from core.units import DisplayUnits
from tests.app.editors.conftest import click_cell, retype

TF = 9806.65  # N per tonne-force (NIST SP 811, from memory; REFERENCES.md)


def _shown(window) -> TugDialog:  # type: ignore[no-untyped-def]
    found = [d for d in window.findChildren(TugDialog) if d.isVisible()]
    assert len(found) == 1
    return found[0]


def _ok(qtbot, d) -> None:  # type: ignore[no-untyped-def]
    qtbot.mouseClick(d.buttons.button(d.buttons.StandardButton.Ok), Qt.MouseButton.LeftButton)


def test_the_tugs_menu_edits_the_tug_selected_in_the_table(window, qtbot) -> None:
    texts = [a.text() for a in window.menu("tugs").actions()]
    assert texts[0] == "&Edit tug…"
    table = window.tugs_panel.table
    click_cell(qtbot, table, window.tugs_panel.model.row_of("Puffin"), 0)
    window.editors.act_edit_tug.trigger()
    d = _shown(window)
    assert d.form.name.text() == "Puffin" and d.form.call_sign.text() == "PFN2"
    assert d.form.bollard_pull.text() == "45"  # 441.29925 kN = 45 t (1 t = 9.80665 kN)


def test_double_click_on_a_tug_on_the_board_opens_its_editor(window, qtbot) -> None:
    item = window.board.bodies["Kestrel 3"].tugs["Tern"].glyph
    at = window.view.mapFromScene(item.sceneBoundingRect().center())
    qtbot.mouseDClick(window.view.viewport(), Qt.MouseButton.LeftButton, pos=at)
    assert _shown(window).form.name.text() == "Tern"


def test_typing_every_particular_is_one_undo_step(window, qtbot) -> None:
    c = window.controller
    before = c.project
    d = window.editors.edit_tug("Tern")
    f = d.form
    retype(qtbot, f.name, "Tern II")
    f.type.setFocus()
    qtbot.keyClick(f.type.lineEdit(), Qt.Key.Key_A, Qt.KeyboardModifier.ControlModifier)
    qtbot.keyClicks(f.type.lineEdit(), "tractor")
    retype(qtbot, f.role, "Pushing starboard shoulder")
    retype(qtbot, f.bollard_pull, "38.5")
    retype(qtbot, f.astern_pull, "35")
    retype(qtbot, f.certificate, "2026-05-02")
    retype(qtbot, f.towing_point_height, "4.2")
    retype(qtbot, f.towline_length, "160")
    retype(qtbot, f.towline_mbl, "120")
    assert f.mbl_ratio.text() == "MBL is 3.1 × the rated bollard pull"
    retype(qtbot, f.call_sign, "TRN9")
    retype(qtbot, f.channel, "VHF 12")
    _ok(qtbot, d)
    assert not d.isVisible()
    t = c.project.tug("Tern II")
    assert (t.tug_type, t.role, t.certificate_date) == (
        "tractor",
        "Pushing starboard shoulder",
        "2026-05-02",
    )
    assert t.bollard_pull_n == pytest.approx(38.5 * TF)
    assert t.astern_pull == pytest.approx(35 * TF)
    assert t.towline_mbl_n == pytest.approx(120 * TF)
    assert (t.towing_point_height_m, t.towline_length_m) == (4.2, 160.0)
    assert (t.call_sign, t.working_channel) == ("TRN9", "VHF 12")
    assert c.project.stages[0].placement("Tern II").point == "Stbd shoulder pad"
    assert c.undo_stack.count() == 1 and c.undo_stack.undoText() == "Edit Tern"
    c.undo_stack.undo()
    assert c.project == before


def test_untouched_fields_keep_their_values_exactly(window, qtbot) -> None:
    c = window.controller
    before = c.project
    d = window.editors.edit_tug("Gannet")
    assert d.form.towline_mbl.text() == "159.076"  # 1560 kN in t, six digits
    _ok(qtbot, d)
    assert c.project == before and c.undo_stack.count() == 0


def test_the_fields_are_in_the_display_units(window, qtbot) -> None:
    c = window.controller
    c.apply(c.project.with_units(DisplayUnits(force="kN", length="ft")), "Units")
    d = window.editors.edit_tug("Gannet")
    assert d.form.bollard_pull.text() == "539.366"
    assert d.form.towing_point_height.text() == f"{5.5 / 0.3048:.6g}"  # 0.3048 m per ft exactly
    retype(qtbot, d.form.towline_mbl, "1600")
    retype(qtbot, d.form.towing_point_height, "20")
    _ok(qtbot, d)
    t = c.project.tug("Gannet")
    assert t.towline_mbl_n == pytest.approx(1600e3)
    assert t.towing_point_height_m == pytest.approx(20 * 0.3048)


@pytest.mark.parametrize(
    ("field", "text", "words"),
    [
        ("bollard_pull", "0", "tug Gannet: bollard pull: 0.0 t must be at least 0.1 t"),
        (
            "bollard_pull",
            "5e-324",
            "tug Gannet: bollard pull: 4.94066e-324 t must be at least 0.1 t",
        ),
        ("bollard_pull", "", "bollard pull: '' must be given"),
        ("towline_mbl", "lots", "towline MBL: 'lots' is not a number"),
        ("towline_length", "-5", "towline length"),
        ("name", "Puffin", "tug name: 'Puffin' is used twice"),
    ],
)
def test_refused_input_is_named_and_nothing_is_lost(
    window, qtbot, field: str, text: str, words: str
) -> None:
    c = window.controller
    before = c.project
    d = window.editors.edit_tug("Gannet")
    retype(qtbot, d.form.call_sign, "GNT8")
    retype(qtbot, getattr(d.form, field), text)
    _ok(qtbot, d)
    assert d.isVisible() and words in d.error.text()
    assert d.form.call_sign.text() == "GNT8"
    assert c.project == before


def test_the_form_keeps_the_widget_methods_its_fields_are_named_after(qtbot) -> None:
    """A field of the form once stood in the attribute ``height``, which hid QWidget.height():
    asking the form its height raised TypeError."""
    form = TugForm(DisplayUnits())
    qtbot.addWidget(form)
    form.resize(320, 400)
    assert form.height() == form.geometry().height()
    assert form.width() == form.geometry().width()
