"""A body drawn turned on screen keeps no pixmap caches that Qt would draw again on every paint.

Qt keeps an item's device cache only while the item's transform to the screen does not
turn it: a tug or a hull of a body at a heading other than due east or west (090, 270)
was drawn into its pixmap again on every repaint of a drag, which costs more than
drawing it directly. The board caches an item while it lies unturned and draws it
directly while it is turned, following the body's pose.
"""

from __future__ import annotations

import math
from dataclasses import replace

import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtWidgets import QGraphicsItem

from app.board.items import LineItem, PathItem, TugItem
from app.board.poses import to_site
from tests.app.board.conftest import move_with_button, view_point

NO_CACHE = QGraphicsItem.CacheMode.NoCache
DEVICE = QGraphicsItem.CacheMode.DeviceCoordinateCache
BODY = "Kestrel 3"


def _turn(window, heading_deg: float) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    stage = c.stage
    poses = tuple(replace(p, heading_deg=heading_deg) if p.body == BODY else p for p in stage.poses)
    c.apply(c.with_stage(replace(stage, poses=poses)), "Turn the barge")
    window.view.fit_to_hull()


def _still_items(window):  # type: ignore[no-untyped-def]
    """The turned body's hull pictures and its tugs' (the ones cached at rest)."""
    d = window.board.bodies[BODY]
    hulls = [item for h in d.hulls.values() for item in h.cached]
    return hulls + [t.glyph for t in d.tugs.values()]


@pytest.fixture
def paints(monkeypatch):  # type: ignore[no-untyped-def]
    """Counts the paints of hull and tug items drawn while they had a pixmap cache
    (each such paint is Qt drawing the item into its pixmap)."""
    counted = {"cached": 0, "all": 0}
    for cls in (TugItem, PathItem, LineItem):
        original = cls.paint

        def paint(self, *args, _original=original):  # type: ignore[no-untyped-def]
            counted["all"] += 1
            if self.cacheMode() != NO_CACHE:
                counted["cached"] += 1
            return _original(self, *args)

        monkeypatch.setattr(cls, "paint", paint)
    return counted


def test_a_turned_bodys_pictures_are_not_drawn_again_into_caches_on_a_drag(
    window, qtbot, paints
) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    _turn(window, 45.0)
    qtbot.wait(50)
    pose = next(p for p in c.stage.poses if p.body == BODY)
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    start = view_point(view, *to_site(pose, share.position))
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    assert window.board.selection == ("tug", "Gannet")
    qtbot.wait(20)
    paints["cached"] = paints["all"] = 0
    for k in range(1, 9):
        a = math.radians(15 * k)
        move_with_button(view, start + QPointF(50 * math.sin(a), -30 * (1 - math.cos(a))).toPoint())
        view.viewport().repaint()  # each move painted, as the event loop would
    assert paints["all"] > 8  # the moves drew the hull and the tugs
    assert paints["cached"] == 0  # none of them into a pixmap cache
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    assert c.stage.placement("Gannet") is not None
    # at rest, turned: drawn directly; turned back to 090, cached again
    assert {item.cacheMode() for item in _still_items(window)} == {NO_CACHE}
    _turn(window, 90.0)
    assert {item.cacheMode() for item in _still_items(window)} == {DEVICE}


@pytest.mark.parametrize("heading_deg", [90.0, 270.0])
def test_a_body_east_or_west_keeps_its_pictures(window, heading_deg: float) -> None:  # type: ignore[no-untyped-def]
    _turn(window, 45.0)
    _turn(window, heading_deg)  # the view turns it by 0 or 180 degrees: no turn for Qt
    assert {item.cacheMode() for item in _still_items(window)} == {DEVICE}
