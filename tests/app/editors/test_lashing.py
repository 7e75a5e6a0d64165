"""The lashing dialog: the offsets of a lashed group's hulls (``groups[].members[]``) typed
with real keys, from the board's menu on the group and from the Edit menu."""

from __future__ import annotations

import json
import math

import pytest
import shapely
from PySide6.QtCore import Qt
from PySide6.QtGui import QContextMenuEvent
from PySide6.QtWidgets import QApplication, QFileDialog, QMenu
from shapely import affinity

from app.panels.lashing_dialog import LashingDialog
from core.io.projectfile import load
from tests.app.board.conftest import view_point
from tests.app.editors.conftest import retype
from tests.conftest import SAMPLES

PAIR = "Lark pair"


@pytest.fixture
def twin(window):  # type: ignore[no-untyped-def]
    """The window on the twin barge sample: Lark 42 lashed 22 m to starboard of Lark 41."""
    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    window.view.fit_to_hull()
    return window


def _lark42(window) -> shapely.Polygon:  # type: ignore[no-untyped-def]
    """Lark 42 in the site in the stage shown, by hand: its outline through its offset in
    the group's frame, then the group's pose (rotations and shifts with shapely)."""
    c = window.controller
    m = next(x for x in c.project.group_of("Lark 42").members if x.hull == "Lark 42")
    pose = window.board.pose(PAIR)
    poly = shapely.Polygon(c.project.hull("Lark 42").outline)
    poly = affinity.rotate(poly, m.heading_rad, origin=(0, 0), use_radians=True)
    poly = affinity.translate(poly, m.x, m.y)
    poly = affinity.rotate(poly, 90.0 - pose.heading_deg, origin=(0, 0))  # bow CCW from east
    return affinity.translate(poly, pose.x, pose.y)


def _menu_on_lark41(window) -> QMenu:  # type: ignore[no-untyped-def]
    """The board's menu from a right click inside Lark 41 (20 m ahead, 5 m to starboard
    of its reference point)."""
    pose = window.board.pose(PAIR)
    a = math.pi / 2 - math.radians(pose.heading_deg)
    x, y = 20.0, -5.0
    at = (pose.x + math.cos(a) * x - math.sin(a) * y, pose.y + math.sin(a) * x + math.cos(a) * y)
    view = window.view
    pt = view_point(view, *at)
    ev = QContextMenuEvent(QContextMenuEvent.Reason.Mouse, pt, view.viewport().mapToGlobal(pt))
    QApplication.sendEvent(view.viewport(), ev)
    menu = window.board.last_menu
    assert menu is not None
    return menu


def _open_from_board(window) -> LashingDialog:  # type: ignore[no-untyped-def]
    menu = _menu_on_lark41(window)
    act = next((a for a in menu.actions() if a.text() == f"Lashing of {PAIR}…"), None)
    assert act is not None, [a.text() for a in menu.actions()]
    act.trigger()
    menu.close()
    dialogs = [d for d in window.findChildren(LashingDialog) if d.isVisible()]
    assert len(dialogs) == 1
    return dialogs[0]


def _ok(qtbot, d: LashingDialog) -> None:  # type: ignore[no-untyped-def]
    qtbot.mouseClick(d.buttons.button(d.buttons.StandardButton.Ok), Qt.MouseButton.LeftButton)


def test_the_dialog_lists_the_offsets_and_says_the_first_hull_owns_the_frame(twin) -> None:  # type: ignore[no-untyped-def]
    d = _open_from_board(twin)
    assert list(d.fields) == ["Lark 42"]  # Lark 41 is not offered
    assert [e.text() for e in d.fields["Lark 42"].values()] == ["0", "-22", "0"]  # as the file
    words = " ".join(w.text() for w in d.findChildren(type(d.error)))
    assert "Lark 41" in words and "owns the frame: lies at 0, 0, 0°" in words
    assert "x forward, y to port" in words


def test_typing_an_offset_moves_the_hull_as_one_undo_step(twin, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = twin.controller
    before, lark42 = c.project, _lark42(twin)
    lark41 = twin.board.pose(PAIR)
    steps = c.undo_stack.count()
    d = _open_from_board(twin)
    retype(qtbot, d.fields["Lark 42"]["y"], "-25")
    retype(qtbot, d.fields["Lark 42"]["heading"], "350")
    _ok(qtbot, d)
    assert not d.isVisible()
    m = c.project.group_of("Lark 42").members[1]
    # 350° clockwise from ahead is 10° to port: +10° counter-clockwise (CONVENTIONS.md)
    assert (m.x, m.y) == (0.0, -25.0)
    assert m.heading_rad == pytest.approx(math.radians(10.0), abs=1e-12)
    assert twin.board.pose(PAIR) == lark41  # the frame's owner stays where it lay
    # by hand: Lark 42 turned 10° CCW about its reference point, which moves 3 m more to
    # starboard of Lark 41; the stage shown has the pair heading 090 (port is north), so
    # that is 3 m south
    ref = twin.board.pose(PAIR)
    assert ref.heading_deg == 90.0
    turned = affinity.rotate(lark42, 10.0, origin=(ref.x, ref.y - 22.0))
    expected = affinity.translate(turned, 0.0, -3.0)
    assert _lark42(twin).symmetric_difference(expected).area == pytest.approx(0.0, abs=1e-6)
    assert c.undo_stack.count() == steps + 1
    c.undo_stack.undo()
    assert c.project == before
    assert _lark42(twin).symmetric_difference(lark42).area == pytest.approx(0.0, abs=1e-9)


@pytest.mark.parametrize(
    ("field", "text", "words"),
    [
        ("x", "abc", "Lark 42: x: 'abc' is not a number"),
        ("y", "nan", "is not a finite number"),
        ("y", "inf", "is not a finite number"),
        ("x", "100001", "x: 100001.0 m must be at most 100000 m"),  # rules.COORDINATE: 100 km
        ("heading", "36001", "heading: 36001.0° must be at most 36000°"),  # rules.HEADING
        ("y", "", "Lark 42: y: '' must be given"),
    ],
)
def test_a_bad_entry_is_named_and_changes_nothing(twin, qtbot, field, text, words) -> None:  # type: ignore[no-untyped-def]
    c = twin.controller
    before, steps = c.project, c.undo_stack.count()
    d = _open_from_board(twin)
    edit = d.fields["Lark 42"][field]
    retype(qtbot, edit, text)
    qtbot.keyClick(edit, Qt.Key.Key_Return)  # Enter is OK
    assert d.isVisible()
    assert d.error.isVisible() and d.error.text().startswith("Not changed: ")
    assert words in d.error.text()
    assert edit.text() == text  # what was typed is kept
    assert c.project == before and c.undo_stack.count() == steps


def test_the_new_offset_survives_save_and_load(twin, qtbot, monkeypatch, tmp_path) -> None:  # type: ignore[no-untyped-def]
    d = _open_from_board(twin)
    retype(qtbot, d.fields["Lark 42"]["x"], "1,5")  # a decimal comma, as everywhere
    retype(qtbot, d.fields["Lark 42"]["y"], "-23.25")
    _ok(qtbot, d)
    target = tmp_path / "moved.towboard"
    monkeypatch.setattr(
        QFileDialog, "getSaveFileName", staticmethod(lambda *a, **k: (str(target), ""))
    )
    twin.act_save_as.trigger()
    member = json.loads(target.read_text())["groups"][0]["members"][1]
    assert member == {"hull": "Lark 42", "position_m": [1.5, -23.25], "heading_deg": 0.0}
    assert load(target).group_of("Lark 42").members[1].y == -23.25
    assert twin.open_path(target, ask=False)
    d = twin.editors.edit_lashing(PAIR)
    assert [e.text() for e in d.fields["Lark 42"].values()] == ["1.5", "-23.25", "0"]


def test_the_edit_menu_opens_it_for_the_group_selected(twin, qtbot) -> None:  # type: ignore[no-untyped-def]
    act = twin.editors.act_lashing
    assert act in twin.menu("edit").actions()
    twin.board.select(("hull", "Lark 42"))
    act.trigger()
    dialogs = [d for d in twin.findChildren(LashingDialog) if d.isVisible()]
    assert [d.group_name for d in dialogs] == [PAIR]


def test_the_edit_menu_says_when_nothing_is_lashed(window) -> None:  # type: ignore[no-untyped-def]
    assert window.controller.project.groups == ()  # the deck barge sample
    window.editors.act_lashing.trigger()
    assert not window.findChildren(LashingDialog)
    assert "No hulls are lashed" in window.statusBar().currentMessage()
