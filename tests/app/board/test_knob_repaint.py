"""A working sector's knob left where its drag let it go is what a full repaint draws.

The knobs are fixed in pixels and move with the wedge's edge by fractions of a pixel.
"""

from __future__ import annotations

import math

import pytest
from PySide6.QtCore import QEvent, QPointF, Qt
from PySide6.QtWidgets import QApplication

from core.frames import bearing_to_angle
from tests.app.board.conftest import send_mouse
from tests.app.board.test_partial_repaint import _stale
from tests.app.board.test_sector_wedges import _body_px, _knob_px, _select

LEFT = Qt.MouseButton.LeftButton


@pytest.mark.parametrize("zoom", [1.0, 1.37, 0.83])
def test_a_knob_dragged_let_go_and_undone_leaves_the_board_as_painted_afresh(
    window, qtbot, zoom: float
) -> None:  # type: ignore[no-untyped-def]
    view = window.view
    if zoom != 1.0:
        view.zoom(zoom)
        for _ in range(5):
            QApplication.processEvents()
    _select(qtbot, window, "Gannet")
    wedge = window.board.sectors.wedges["Gannet"]
    ax, ay, r = wedge.apex.x(), wedge.apex.y(), wedge.radius
    found = []
    for which, bearings in (("high", (57.3, 51.1, 44.7, 38.2)), ("low", (141.3, 147.9, 152.6))):
        at = QPointF(_knob_px(window, "Gannet", which))
        send_mouse(view, QEvent.Type.MouseButtonPress, at, LEFT)
        for b in bearings:
            a = bearing_to_angle(b)
            at = QPointF(_body_px(window, ax + r * math.cos(a), ay + r * math.sin(a)))
            send_mouse(view, QEvent.Type.MouseMove, at, LEFT)
        send_mouse(view, QEvent.Type.MouseButtonRelease, at, Qt.MouseButton.NoButton)
        found.append(("let go", which, _stale(window)))
        window.controller.undo_stack.undo()
        found.append(("undo", which, _stale(window)))
        window.controller.undo_stack.redo()
        found.append(("redo", which, _stale(window)))
    assert window.controller.undo_stack.count() == 2
    assert [f for f in found if f[2]] == []
