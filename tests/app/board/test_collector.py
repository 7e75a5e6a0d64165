"""Python's cycle collector is kept out of a drag, and the program sets its start-up
objects aside: a full collection walks some 125,000 library objects and, falling in a
drag, made one move last a tenth of a second (app/collector.py)."""

from __future__ import annotations

import gc

import pytest
from PySide6.QtCore import QEvent, QPointF, QSize, Qt

import app.window.main_window as main_window
from app.collector import CollectorHold, freeze_at_start
from app.controller import Controller
from tests.app.board.conftest import send_mouse, show_fitted
from tests.app.board.test_drag_backdrop import LEFT, _start, crowded


@pytest.fixture(autouse=True)
def collector_on():  # type: ignore[no-untyped-def]
    """Each test starts with the collector on, nothing set aside, and leaves it so."""
    assert gc.isenabled()
    yield
    gc.enable()
    gc.unfreeze()


@pytest.fixture
def view(qtbot):  # type: ignore[no-untyped-def]
    """A board of 24 tugs round a barge, shown."""
    from app.board.scene import BoardScene
    from app.board.view import BoardView

    v = BoardView(BoardScene(Controller(crowded(24))))
    show_fitted(qtbot, v, v, QSize(900, 700))
    return v


def test_a_drag_holds_the_collector_off_until_the_release(view) -> None:  # type: ignore[no-untyped-def]
    end = _start(view, "T005")
    assert view.board.controller.previewing
    assert not gc.isenabled()
    send_mouse(view, QEvent.Type.MouseButtonRelease, end, Qt.MouseButton.NoButton)
    assert not view.board.controller.previewing
    assert view.board.controller.undo_stack.count() == 1  # the drag was recorded
    assert gc.isenabled()


def test_escape_and_undo_under_a_drag_also_let_go(view) -> None:  # type: ignore[no-untyped-def]
    c = view.board.controller
    _start(view, "T005")
    assert not gc.isenabled()
    c.cancel_preview()  # what Escape does
    assert gc.isenabled()
    end = _start(view, "T006")
    assert not gc.isenabled()
    send_mouse(view, QEvent.Type.MouseButtonRelease, end, Qt.MouseButton.NoButton)
    _start(view, "T007")
    c.undo_stack.undo()  # undo drops the drag under way
    assert not c.previewing and gc.isenabled()


def test_a_new_plan_under_a_drag_lets_go() -> None:
    c = Controller(crowded(3))
    stage = c.stage
    moved = stage.with_placement(stage.placements[0].with_setting(0.5))
    c.preview(c.with_stage(moved))
    assert not gc.isenabled()
    c.reset(crowded(4))
    assert gc.isenabled()


def test_a_controller_dropped_mid_drag_lets_go() -> None:
    c = Controller(crowded(3))
    stage = c.stage
    c.preview(c.with_stage(stage.with_placement(stage.placements[0].with_setting(0.5))))
    assert not gc.isenabled()
    del c, stage
    assert gc.isenabled()


def test_a_collector_off_before_the_hold_stays_off() -> None:
    gc.disable()
    hold = CollectorHold()
    hold.hold()
    hold.let_go()
    assert not gc.isenabled()  # only the hold that turned it off turns it on


def test_freezing_sets_aside_what_is_alive() -> None:
    gc.unfreeze()
    kept = [[] for _ in range(100)]
    freeze_at_start()
    assert gc.get_freeze_count() > 100 and not gc.get_objects(generation=2)
    assert kept  # still reachable, so set aside


def test_the_program_freezes_once_its_window_is_up(monkeypatch, qtbot) -> None:  # type: ignore[no-untyped-def]
    from PySide6.QtWidgets import QApplication

    seen: list[int] = []
    monkeypatch.setattr(QApplication, "exec", lambda self: seen.append(gc.get_freeze_count()) or 0)
    main_window.OPEN_WINDOWS.clear()
    gc.unfreeze()
    try:
        assert main_window.run(None) == 0
        (w,) = main_window.OPEN_WINDOWS
        assert w.controller.project.stages  # the sample is open
        assert seen and seen[0] > 0  # set aside before the event loop ran
    finally:
        for w in main_window.OPEN_WINDOWS:
            w.controller.undo_stack.setClean()
            w.close()
        main_window.OPEN_WINDOWS.clear()


def test_the_move_in_progress_is_drawn_with_the_collector_off(view) -> None:  # type: ignore[no-untyped-def]
    at = _start(view, "T010", moves=1)
    for k in range(2, 6):
        send_mouse(view, QEvent.Type.MouseMove, at + QPointF(4.0 * k, 3.0 * k), LEFT)
        assert not gc.isenabled()
    send_mouse(view, QEvent.Type.MouseButtonRelease, at, Qt.MouseButton.NoButton)
    assert gc.isenabled()
