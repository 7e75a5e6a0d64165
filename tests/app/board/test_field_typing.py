"""Typing in a panel's field, driven by real keys: Escape drops it, closing commits it."""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QMessageBox

KN = 1852.0 / 3600.0  # m/s in a knot (the international nautical mile, 1852 m)


def _active(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    window.activateWindow()
    qtbot.waitUntil(window.isActiveWindow)


def _type(field, text: str) -> None:  # type: ignore[no-untyped-def]
    field.setFocus()
    field.selectAll()
    QTest.keyClicks(field, text)


def test_escape_in_a_conditions_field_puts_back_the_value_and_applies_nothing(
    window, qtbot
) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    window.panels["conditions"].raise_()
    _active(window, qtbot)
    cp = window.solve_ui.conditions
    speed = cp.edits["wind_speed_ms"]
    shown, before, steps = speed.text(), c.project, c.undo_stack.count()
    _type(speed, "99")
    assert speed.text() == "99"
    QTest.keyClick(speed, Qt.Key.Key_Escape)
    assert speed.text() == shown
    # leaving the field afterwards (a click in the next one) applies nothing either
    QTest.mouseClick(cp.edits["wind_height_m"], Qt.MouseButton.LeftButton)
    assert not speed.hasFocus()
    assert c.project is before
    assert c.undo_stack.count() == steps
    # and typing again after the Escape is an edit like any other
    _type(speed, "30")
    QTest.keyClick(speed, Qt.Key.Key_Return)
    assert c.stage.conditions.wind_speed_ms / KN == pytest.approx(30.0)  # typed in kn, shown unit


def test_escape_in_the_hull_panel_and_the_stage_details_too(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    _active(window, qtbot)
    before = c.project
    fields = [
        ("hull", window.hull_panel.draught),
        ("stage", window.plan_ui.stage_details.limit_fields["max_wind_ms"]),
        ("solve", window.solve_ui.solve_panel.speed),
    ]
    for dock, field in fields:
        window.panels[dock].raise_()
        shown = field.text()
        _type(field, "7")
        QTest.keyClick(field, Qt.Key.Key_Escape)
        assert field.text() == shown, dock
        window.view.setFocus()
        assert c.project is before, dock


def test_quit_with_typing_in_a_field_asks_and_keeps_the_typing(window, qtbot, dialogs) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    window.panels["hull"].raise_()
    _active(window, qtbot)
    _type(window.hull_panel.draught, "9")  # no Enter
    assert not c.dirty
    dialogs.answer = QMessageBox.StandardButton.Cancel
    window.act_quit.trigger()
    assert any(s.startswith("Unsaved changes") for s in dialogs.shown)
    assert window.isVisible()  # cancelled: the window stays, with the draught typed
    assert c.project.hull("Kestrel 3").draught_m == 9.0
    assert c.undo_stack.undoText() != ""
