"""Undo and redo of an edit made in another stage, driven by real keys."""

from __future__ import annotations

import pytest
from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

KN = 1852.0 / 3600.0  # m/s in a knot (the international nautical mile, 1852 m)


def _set_wind(window, qtbot, text: str) -> None:  # type: ignore[no-untyped-def]
    window.panels["conditions"].raise_()
    window.activateWindow()
    qtbot.waitUntil(window.isActiveWindow)
    field = window.solve_ui.conditions.edits["wind_speed_ms"]
    field.setFocus()
    field.selectAll()
    QTest.keyClicks(field, text)
    QTest.keyClick(field, Qt.Key.Key_Return)


def _undo_key(window) -> None:  # type: ignore[no-untyped-def]
    window.view.setFocus()
    QTest.keyClick(window.view.viewport(), Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier)


def _winds(c) -> list[float]:  # type: ignore[no-untyped-def]
    return [round(s.conditions.wind_speed_ms / KN, 1) for s in c.project.stages]


def test_undo_of_an_edit_in_another_stage_shows_that_stage_and_says_so(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    c.set_stage_index(1)
    _set_wind(window, qtbot, "33")
    assert _winds(c)[1] == pytest.approx(33.0)
    c.set_stage_index(0)
    assert window.act_undo.text().endswith("(stage 2)")
    _undo_key(window)
    assert c.stage_index == 1  # the edit's stage is shown, not changed out of sight
    assert _winds(c)[1] == pytest.approx(12.0)  # the sample's wind in stage 2
    said = window.statusBar().currentMessage()
    assert "Set mean speed" in said and "stage 2" in said
    assert c.project.stages[1].name in said
    c.set_stage_index(0)
    window.act_redo.trigger()
    assert c.stage_index == 1 and _winds(c)[1] == pytest.approx(33.0)


def test_undo_in_the_stage_shown_moves_nothing_and_says_nothing(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    c.set_stage_index(2)
    window.statusBar().clearMessage()
    _set_wind(window, qtbot, "25")
    _undo_key(window)
    assert c.stage_index == 2
    assert "Undone" not in window.statusBar().currentMessage()


def test_edits_of_one_field_in_two_stages_are_two_undo_steps(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    c.set_stage_index(0)
    _set_wind(window, qtbot, "20")
    _set_wind(window, qtbot, "22")  # the same field in the same stage: one step
    c.set_stage_index(1)
    _set_wind(window, qtbot, "30")
    assert c.undo_stack.count() == 2
    _undo_key(window)
    assert _winds(c)[:2] == [pytest.approx(22.0), pytest.approx(12.0)]
    _undo_key(window)
    assert _winds(c)[:2] == [pytest.approx(12.0), pytest.approx(12.0)]
    assert c.stage_index == 0
