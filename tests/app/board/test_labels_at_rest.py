"""A pan or a wheel's zoom moves the labels with the board and places them once at rest.

Placing the labels after every small step of a pan cost more than a frame (a tenth of
a second with 200 tugs). In between, every label keeps its place beside its anchor, as
on a chart; once the view has stood still a moment, or the pan is let go, they are
placed for the new view.
"""

from __future__ import annotations

import pytest
from PySide6.QtCore import QEvent, QPoint, QPointF, Qt
from PySide6.QtGui import QWheelEvent
from PySide6.QtWidgets import QApplication

import app.board.view as board_view
from app.board.items import Label
from tests.app.board.conftest import send_mouse, settle

MIDDLE = Qt.MouseButton.MiddleButton


@pytest.fixture
def placings(monkeypatch: pytest.MonkeyPatch) -> list[int]:
    """Each placing of the labels, counted."""
    calls: list[int] = []
    real = board_view.place_labels

    def counted(*args, **kwargs):  # type: ignore[no-untyped-def]
        calls.append(1)
        return real(*args, **kwargs)

    monkeypatch.setattr(board_view, "place_labels", counted)
    return calls


def _pan(view, kind: QEvent.Type, pt: QPointF) -> None:  # type: ignore[no-untyped-def]
    """A press, move or release of the middle button (it pans anywhere on the board)."""
    held = Qt.MouseButton.NoButton if kind == QEvent.Type.MouseButtonRelease else MIDDLE
    send_mouse(view, kind, pt, held, button=MIDDLE)


def _labels(window) -> dict[int, tuple[QPointF, tuple[float, float]]]:  # type: ignore[no-untyped-def]
    """Each shown label's anchor on screen and its shift from home."""
    view = window.view
    return {
        id(i): (QPointF(view.mapFromScene(i.scenePos())), i.shift)
        for i in window.board.items()
        if isinstance(i, Label) and i.isVisible() and i.text
    }


def _still(qtbot, window) -> None:  # type: ignore[no-untyped-def]
    """Every pending timer of the window run (the stage's checks, a placing), then the
    view's wait for rest made long: under load a step of the test may take longer than
    the real wait, which must not run out while the view is still being moved."""
    settle(window, qtbot)
    window.view._rest_timer.setInterval(60_000)


def _rest(qtbot, window) -> None:  # type: ignore[no-untyped-def]
    """The view stands still: its wait for rest, back to its real length, runs out."""
    timer = window.view._rest_timer
    assert timer.isActive()
    timer.setInterval(board_view.PLACE_AT_REST_MS)  # started again, from now
    qtbot.waitUntil(lambda: not timer.isActive(), timeout=3000)
    qtbot.wait(1)


def test_a_pan_carries_the_labels_and_places_them_once_it_stands_still(
    window, qtbot, placings
) -> None:  # type: ignore[no-untyped-def]
    view = window.view
    _still(qtbot, window)
    start = QPointF(view.viewport().rect().center())
    before = _labels(window)
    placings.clear()
    _pan(view, QEvent.Type.MouseButtonPress, start)
    for k in range(1, 9):
        _pan(view, QEvent.Type.MouseMove, start + QPointF(6 * k, 4 * k))
    during = _labels(window)
    assert placings == []  # not placed on any step of the pan
    assert during.keys() == before.keys()
    for key, (anchor, shift) in during.items():
        assert shift == before[key][1]  # each label where it was beside its anchor
        assert anchor - before[key][0] == QPointF(48, 32)  # carried with the board
    _rest(qtbot, window)  # the mouse stands still, the button still down
    assert placings == [1]
    _pan(view, QEvent.Type.MouseButtonRelease, start + QPointF(48, 32))
    qtbot.wait(1)
    assert placings == [1]  # nothing moved since


def test_letting_go_of_a_pan_places_the_labels_at_once(window, qtbot, placings) -> None:  # type: ignore[no-untyped-def]
    view = window.view
    _still(qtbot, window)
    start = QPointF(view.viewport().rect().center())
    placings.clear()
    _pan(view, QEvent.Type.MouseButtonPress, start)
    _pan(view, QEvent.Type.MouseMove, start + QPointF(30, 0))
    _pan(view, QEvent.Type.MouseButtonRelease, start + QPointF(30, 0))
    assert placings == [1]  # at once, not after the pause
    assert not view._rest_timer.isActive()


def test_wheel_notches_in_a_row_place_the_labels_once_at_rest(window, qtbot, placings) -> None:  # type: ignore[no-untyped-def]
    view = window.view
    _still(qtbot, window)
    placings.clear()
    at = view.viewport().rect().center()
    scale = view.pixels_per_metre()
    for _ in range(3):
        ev = QWheelEvent(
            QPointF(at), QPointF(view.viewport().mapToGlobal(at)), QPoint(0, 0), QPoint(0, 120),
            Qt.MouseButton.NoButton, Qt.KeyboardModifier.NoModifier,
            Qt.ScrollPhase.NoScrollPhase, False,
        )  # fmt: skip
        QApplication.sendEvent(view.viewport(), ev)
        QApplication.processEvents()
    assert view.pixels_per_metre() == pytest.approx(scale * 1.2**3)
    assert placings == []
    _rest(qtbot, window)
    assert placings == [1]
