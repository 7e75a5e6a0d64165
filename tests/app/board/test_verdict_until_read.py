"""A verdict on screen is the plan's, or says it is being worked out: after an edit, a
change of stage or another plan opened, the views never show the verdict of the plan as it
was as if it were the plan's (they once showed an empty window's "no hull" for 120 ms over
a sample just opened, its stage 2 headed "Stage 1")."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QApplication

from app.panels.verdict_view import DELAY_MS
from tests.conftest import SAMPLES


def _views(window):  # type: ignore[no-untyped-def]
    return (window.verdict_line, window.balance_panel.verdict)


def _settled(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    """Wait until both views show the stage result's verdict."""
    qtbot.waitUntil(
        lambda: all(
            v.verdict is window.controller.stage_result().verdict
            and "working" not in v.says()
            and "updating" not in v.says()
            for v in _views(window)
        ),
        timeout=3000,
    )


def test_another_plan_or_stage_says_working_out_until_its_verdict_is_read(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    _settled(window, qtbot)
    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    for v in _views(window):
        assert "working the verdict out" in v.text()
    assert window.verdict_line.text().startswith("Stage 1: ")
    c.set_stage_index(1)
    assert window.verdict_line.text().startswith("Stage 2: ")
    assert "working the verdict out" in window.verdict_line.text()
    _settled(window, qtbot)
    assert window.verdict_line.text().startswith("Stage 2: ")
    assert window.balance_panel.verdict.verdict is c.stage_result().verdict


def test_an_edit_marks_the_verdict_updating_until_it_is_read(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    _settled(window, qtbot)
    texts = [v.text() for v in _views(window)]
    sizes = [v.size() for v in _views(window)]
    looks = [v.grab().toImage() for v in _views(window)]
    stage = c.stage
    p = stage.placements[0]
    c.apply(c.with_stage(stage.with_placement(p.with_setting(1.0 - p.setting))), "edit")
    for v, text, size, look in zip(_views(window), texts, sizes, looks, strict=True):
        assert v.says() == text + " <i>(updating…)</i>"  # the stage's, marked as old
        # drawn over the verdict: its text and size are kept, so nothing is laid out again
        assert v.text() == text and v.size() == size
        assert v.grab().toImage() != look
    # what is queued runs; the verdict is read only when its timer is due (a wait of half
    # the delay was sometimes the whole delay on a loaded machine)
    QApplication.processEvents()
    assert (
        window.verdict_line._timer.isActive() and window.verdict_line._timer.interval() == DELAY_MS
    )
    assert "updating" in window.verdict_line.says()
    _settled(window, qtbot)
    assert not any(v.updating for v in _views(window))
    qtbot.keyClick(window.view.viewport(), Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier)
    assert c.stage.placements[0].setting == p.setting  # undone by the keyboard
    assert "updating" in window.verdict_line.says()
    _settled(window, qtbot)
    assert not any(v.updating for v in _views(window))
