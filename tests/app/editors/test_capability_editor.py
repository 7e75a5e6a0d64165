"""The tug editor's capability: the polar diagram, the table typed with real keys, the
type's placeholders, the towline warning share; one undo step, the core's rules, and the
stage result read back from the saved file."""

from __future__ import annotations

import numpy as np
import pytest
from PySide6.QtCore import Qt

from app.panels.capability_editor import CapabilityEditor
from app.panels.tug_dialog import TugDialog
from core.analysis.stage import stage_result
from core.io.projectfile import load, save
from core.model.capability import PLACEHOLDER_NOTE, WAYS, default_capability
from core.model.tugs import astern_share
from tests.app.editors.conftest import retype, type_in_cell

LINE = 1 + WAYS.index("line")  # the table's column of the shares on a line
PUSH_PULL = 1 + WAYS.index("push_pull")


def _ok(qtbot, d: TugDialog) -> None:  # type: ignore[no-untyped-def]
    qtbot.mouseClick(d.buttons.button(d.buttons.StandardButton.Ok), Qt.MouseButton.LeftButton)


def _editor(d: TugDialog) -> CapabilityEditor:
    return d.capability_editor


def _open(qtbot, window, name: str) -> TugDialog:  # type: ignore[no-untyped-def]
    """The tug editor of ``name``, made the active window (as a window manager would)."""
    d = window.editors.edit_tug(name)
    d.activateWindow()
    qtbot.waitUntil(d.isActiveWindow)
    return d


def test_a_placeholder_capability_says_so_and_follows_the_type(window, qtbot) -> None:
    d = _open(qtbot, window, "Gannet")  # an ASD with its type's placeholder figures
    e = _editor(d)
    assert e.placeholder and e.note.text().lower().startswith(PLACEHOLDER_NOTE[:30])
    assert e.polar.capability is not None and e.polar.capability.push is not None
    d.form.type.setFocus()
    qtbot.keyClick(d.form.type.lineEdit(), Qt.Key.Key_A, Qt.KeyboardModifier.ControlModifier)
    qtbot.keyClicks(d.form.type.lineEdit(), "conventional single screw")
    # the polar follows the type at once: a conventional tug works on a line only
    shown = e.polar.capability
    assert shown.push is None and shown.push_pull is None
    gannet = window.controller.project.tug("Gannet")
    astern = astern_share(gannet.astern_pull, gannet.bollard_pull_n)
    assert shown.line == default_capability("conventional single screw", astern).line
    assert not e.boxes["push"].isChecked()


def test_typing_a_capability_changes_the_file_and_the_hold_limits(window, qtbot, tmp_path) -> None:
    c = window.controller
    before = c.project
    old = c.stage_result().main.hold_limits.all_tugs_ms.copy()
    d = _open(qtbot, window, "Gannet")
    e = _editor(d)
    rows = e.model.rowCount()
    for row in range(rows):
        type_in_cell(qtbot, e.table, row, LINE, "0,3")  # a comma is a decimal mark too
    assert e.polar.capability.line.fractions == (0.3,) * rows  # redrawn as typed
    assert not e.placeholder and "entered by the user" in e.note.text()
    retype(qtbot, e.source, "bollard pull trials, May 2026")
    _ok(qtbot, d)
    assert not d.isVisible()
    cap = c.project.tug("Gannet").capability_curves
    assert not cap.placeholder and cap.source == "bollard pull trials, May 2026"
    assert cap.line.at_bearing(33.0) == pytest.approx(0.3)
    # the file holds it, and the stage result from the file is the window's
    path = tmp_path / "cap.towboard"
    save(c.project, path)
    again = load(path)
    kept = again.tug("Gannet").capability_curves  # the file writes 12 significant digits
    assert (kept.placeholder, kept.source) == (False, cap.source)
    for way in WAYS:
        a, b = kept.curve(way), cap.curve(way)
        assert a.bearings_deg == b.bearings_deg
        assert a.fractions == pytest.approx(b.fractions, rel=1e-11)
    new = c.stage_result().main.hold_limits.all_tugs_ms
    from_file = stage_result(again, 0).main.hold_limits.all_tugs_ms
    np.testing.assert_allclose(new, from_file, rtol=1e-9)
    # less capability never raises a hold limit (issue 12's property), and here lowers one
    assert np.all(new <= old + 1e-9) and np.any(new < old - 1e-3)
    assert c.undo_stack.count() == 1 and c.undo_stack.undoText() == "Edit Gannet"
    c.undo_stack.undo()
    assert c.project == before
    np.testing.assert_allclose(c.stage_result().main.hold_limits.all_tugs_ms, old)


@pytest.mark.parametrize(
    ("col", "text", "words"),
    [
        (LINE, "2.5", "on a line: capability share: 2.5 must be at most 2"),
        (LINE, "-0.1", "on a line: capability share: -0.1 must not be negative"),
        (PUSH_PULL, "lots", "push-pull: capability share: 'lots' is not a number"),
        (0, "45", "capability bearing: 45° is in the table already"),
        (0, "400", "Not changed: capability bearing: 400.0° must be below 360°"),
    ],
)
def test_a_refused_figure_is_named_and_changes_nothing(
    window, qtbot, col: int, text: str, words: str
) -> None:
    c = window.controller
    before = c.project
    d = _open(qtbot, window, "Gannet")
    e = _editor(d)
    rows = [(r.bearing_deg, dict(r.shares)) for r in e.model.rows]
    type_in_cell(qtbot, e.table, 0, col, text)
    assert e.error.isVisible() and words in e.error.text(), e.error.text()
    assert [(r.bearing_deg, dict(r.shares)) for r in e.model.rows] == rows
    assert e.placeholder  # still the type's figures
    _ok(qtbot, d)
    assert c.project == before and c.undo_stack.count() == 0


def test_a_bearing_that_files_as_360_is_taken_as_0(window, qtbot) -> None:
    """359.9999999999999 is 360 to the file's 11 decimals, and 360 is 0: the table says 0
    is there already, where it used to keep a bearing that saved a file that loads no more."""
    d = _open(qtbot, window, "Gannet")
    e = _editor(d)
    assert e.model.rows[0].bearing_deg == 0.0
    rows = [r.bearing_deg for r in e.model.rows]
    type_in_cell(qtbot, e.table, 1, 0, "359.9999999999999")
    assert "capability bearing: 0° is in the table already" in e.error.text()
    assert [r.bearing_deg for r in e.model.rows] == rows
    type_in_cell(qtbot, e.table, 1, 0, "359.99999")  # the file holds this one as it is
    assert e.model.rows[-1].bearing_deg == 359.99999


def test_a_bearing_typed_is_kept_in_order_and_rows_come_and_go(window, qtbot) -> None:
    c = window.controller
    d = _open(qtbot, window, "Puffin")
    e = _editor(d)
    n = e.model.rowCount()
    qtbot.mouseClick(e.add_button, Qt.MouseButton.LeftButton)
    assert e.model.rowCount() == n + 1
    added = e.table.currentIndex().row()
    type_in_cell(qtbot, e.table, added, 0, "10")
    assert [r.bearing_deg for r in e.model.rows] == sorted(r.bearing_deg for r in e.model.rows)
    ten = next(i for i, r in enumerate(e.model.rows) if r.bearing_deg == 10.0)
    type_in_cell(qtbot, e.table, ten, PUSH_PULL, "1.2")
    e.table.selectRow(ten)
    qtbot.mouseClick(e.remove_button, Qt.MouseButton.LeftButton)
    assert all(r.bearing_deg != 10.0 for r in e.model.rows)
    type_in_cell(qtbot, e.table, 0, PUSH_PULL, "1.2")
    qtbot.mouseClick(e.boxes["push"], Qt.MouseButton.LeftButton)  # no pushing
    _ok(qtbot, d)
    cap = c.project.tug("Puffin").capability_curves
    assert cap.push is None and cap.push_pull.at_bearing(0.0) == pytest.approx(1.2)
    assert not cap.placeholder


def test_no_way_of_working_left_is_refused(window, qtbot) -> None:
    d = _open(qtbot, window, "Gannet")
    e = _editor(d)
    for way in ("line", "push"):
        qtbot.mouseClick(e.boxes[way], Qt.MouseButton.LeftButton)
    qtbot.mouseClick(e.boxes["push_pull"], Qt.MouseButton.LeftButton)
    assert e.boxes["push_pull"].isChecked()
    assert "capability: the tug must be able to work at least one way" in e.error.text()
    assert e.model.ways == {"push_pull"}


def test_the_types_defaults_bring_the_placeholders_back(window, qtbot) -> None:
    c = window.controller
    d = _open(qtbot, window, "Tern")  # the sample gives Tern figures of its own
    e = _editor(d)
    assert not e.placeholder and "pushing trials" in e.note.text()
    qtbot.mouseClick(e.reset_button, Qt.MouseButton.LeftButton)
    assert e.placeholder and e.polar.capability.push is None  # a conventional twin screw
    _ok(qtbot, d)
    t = c.project.tug("Tern")
    assert t.capability_curves.placeholder
    assert t.capability_curves == default_capability(t.kind, t.astern_pull / t.bollard_pull_n)


@pytest.mark.parametrize(
    ("text", "expect", "words"),
    [
        ("0.4", 0.4, None),
        ("0", None, "towline warning share of MBL: 0.0 must be positive"),
        ("1.5", None, "towline warning share of MBL: 1.5 must be at most 1"),
    ],
)
def test_the_towline_warning_share(window, qtbot, text, expect, words) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    before = c.project
    d = _open(qtbot, window, "Gannet")
    retype(qtbot, d.form.warn_share, text)
    _ok(qtbot, d)
    if expect is None:
        assert d.isVisible() and words in d.error.text(), d.error.text()
        assert c.project == before
    else:
        assert c.project.tug("Gannet").towline_warn_fraction == expect
