"""A tug drag on a crowded board draws what it leaves alone as pictures, and the balance's
arrows repaint a band along themselves.

The pictures show the board exactly as the items would; the still items draw nothing
while they stand in; the drag's end, a change of zoom or a still item that changes
after all lets them go. A small board is drawn item by item as ever.
"""

from __future__ import annotations

import math

import pytest
from PySide6.QtCore import QEvent, QPointF, QSize, Qt
from PySide6.QtGui import QImage
from PySide6.QtWidgets import QApplication, QGraphicsItem

from core.model.hull import Fitting, Hull
from core.model.outlines import box_outline
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug
from tests.app.board.conftest import send_mouse, show_fitted

NO_CONTENTS = QGraphicsItem.GraphicsItemFlag.ItemHasNoContents
LEFT = Qt.MouseButton.LeftButton


def crowded(n_tugs: int) -> Project:
    """A 160 m x 40 m box with ``n_tugs`` tugs on lines spread round its edge."""
    hull = Hull("Crowded", box_outline(160.0, 40.0))
    fittings, tugs, placements = [], [], []
    perimeter = hull.geometry.perimeter
    for i in range(n_tugs):
        q = hull.geometry.point_at((i + 0.5) / n_tugs * perimeter)
        fittings.append(Fitting(f"B{i:03d}", "line", q.x, q.y))
        tugs.append(Tug(f"T{i:03d}", 40e4 + 1e3 * i))
        out = math.atan2(q.normal[1], q.normal[0])
        placements.append(Placement(f"T{i:03d}", hull.name, f"B{i:03d}", setting=0.5, lead_rad=out))
    hull = Hull(hull.name, hull.outline, fittings=tuple(fittings))
    stage = Stage("One", poses=(BodyPose(hull.name, 0.0, 0.0, 0.0),), placements=tuple(placements))
    return Project(name="Crowded", hulls=(hull,), tugs=tuple(tugs), stages=(stage,))


@pytest.fixture
def board(qtbot):  # type: ignore[no-untyped-def]
    def make(n_tugs: int):  # type: ignore[no-untyped-def]
        from app.board.scene import BoardScene
        from app.board.view import BoardView
        from app.controller import Controller

        scene = BoardScene(Controller(crowded(n_tugs)))
        view = BoardView(scene)
        show_fitted(qtbot, view, view, QSize(900, 700))
        return view

    return make


def _grip(view, tug: str) -> QPointF:  # type: ignore[no-untyped-def]
    d = next(iter(view.board.bodies.values()))
    glyph = d.tugs[tug].glyph
    centre = glyph.mapToScene(glyph.glyph.boundingRect().center())
    return QPointF(view.mapFromScene(centre))


def _start(view, tug: str, moves: int = 3) -> QPointF:  # type: ignore[no-untyped-def]
    at = _grip(view, tug)
    send_mouse(view, QEvent.Type.MouseButtonPress, at, LEFT)
    for k in range(1, moves + 1):
        send_mouse(view, QEvent.Type.MouseMove, at + QPointF(4.0 * k, 3.0 * k), LEFT)
    return at + QPointF(4.0 * moves, 3.0 * moves)


def _picture(view) -> QImage:  # type: ignore[no-untyped-def]
    return view.viewport().grab().toImage().convertToFormat(QImage.Format.Format_ARGB32)


def _most_apart(a: QImage, b: QImage) -> int:
    """The largest difference of one colour channel between two pictures of one size."""
    assert a.size() == b.size()
    worst = 0
    for y in range(0, a.height(), 2):
        for x in range(0, a.width(), 2):
            p, q = a.pixelColor(x, y), b.pixelColor(x, y)
            worst = max(
                worst, abs(p.red() - q.red()), abs(p.green() - q.green()), abs(p.blue() - q.blue())
            )
    return worst


def test_a_crowded_tug_drag_draws_the_still_items_as_pictures_that_look_the_same(board) -> None:  # type: ignore[no-untyped-def]
    view = board(150)
    d = next(iter(view.board.bodies.values()))
    before = {id(i) for i in view.board.items() if i.flags() & NO_CONTENTS}
    _start(view, "T010")
    assert view.backdrop.frozen
    body, tug = view.board.interaction.dragged_tug()
    assert body == "Crowded" and tug in ("T009", "T010", "T011")  # the one under the press
    moving = d.tugs[tug]
    for item in (moving.glyph, moving.label, d.balance.net, *d.balance.action.pieces):
        assert not item.flags() & NO_CONTENTS  # drawn on every move
    # stacked under the dragged tug: in the picture under; its labels over: in the one over
    assert d.tugs["T005"].glyph.flags() & NO_CONTENTS
    for name in ("T015", "T140"):
        assert d.tugs[name].label.flags() & NO_CONTENTS
    # stacked between moving items: a long run (the tugs over the dragged one, under the
    # net force) in a picture of its own in its place; a short one (the labels under the
    # dragged tug's label, over the balance's labels) drawn item by item
    from app.board.backdrop import Picture

    assert d.tugs["T015"].glyph.flags() & NO_CONTENTS
    pictures = [i for i in view.board.items() if isinstance(i, Picture)]
    assert [p.parentItem() for p in pictures] == [d.tugs["T149"].glyph]
    assert not d.tugs["T005"].label.flags() & NO_CONTENTS
    frozen = _picture(view)
    view.backdrop.thaw()
    QApplication.processEvents()
    assert {id(i) for i in view.board.items() if i.flags() & NO_CONTENTS} == before
    assert not any(isinstance(i, Picture) for i in view.board.items())
    # the same board: at most a level of rounding where translucent label boxes lie
    assert _most_apart(frozen, _picture(view)) <= 2


def test_the_drag_end_lets_the_pictures_go(board) -> None:  # type: ignore[no-untyped-def]
    view = board(150)
    before = {id(i) for i in view.board.items() if i.flags() & NO_CONTENTS}
    end = _start(view, "T020")
    assert view.backdrop.frozen
    send_mouse(view, QEvent.Type.MouseButtonRelease, end, Qt.MouseButton.NoButton)
    assert not view.backdrop.frozen
    assert {id(i) for i in view.board.items() if i.flags() & NO_CONTENTS} == before
    assert view.board.controller.undo_stack.count() == 1  # the move was recorded


def test_a_zoom_or_a_still_tug_changing_under_the_drag_lets_them_go(board) -> None:  # type: ignore[no-untyped-def]
    view = board(150)
    at = _start(view, "T030")
    assert view.backdrop.frozen
    view.zoom(1.2)
    QApplication.processEvents()  # the next paint finds the view moved
    assert not view.backdrop.frozen
    send_mouse(view, QEvent.Type.MouseButtonRelease, at, Qt.MouseButton.NoButton)
    at = _start(view, "T030")
    assert view.backdrop.frozen
    view.board.set_tug_notes({"T100": "a note"})  # another tug's label is written again
    assert not view.backdrop.frozen
    send_mouse(view, QEvent.Type.MouseMove, at + QPointF(5, 5), LEFT)
    assert not view.backdrop.frozen  # not taken again in this drag
    label = view.board.bodies["Crowded"].tugs["T100"].label
    assert "a note" in label.text and not label.flags() & NO_CONTENTS


def test_a_small_board_is_drawn_item_by_item(board) -> None:  # type: ignore[no-untyped-def]
    view = board(12)
    before = {id(i) for i in view.board.items() if i.flags() & NO_CONTENTS}
    _start(view, "T003", moves=4)
    assert view.board.controller.previewing
    assert not view.backdrop.frozen
    assert {id(i) for i in view.board.items() if i.flags() & NO_CONTENTS} == before


def _screen(view) -> QImage:  # type: ignore[no-untyped-def]
    """What the window shows now: its backing store, as the moves' repaints left it."""
    shot = view.screen().grabWindow(view.winId())
    return shot.toImage().convertToFormat(QImage.Format.Format_ARGB32)


def test_what_the_moves_left_on_screen_is_the_board_painted_afresh(board) -> None:  # type: ignore[no-untyped-def]
    view = board(150)
    at = _start(view, "T060", moves=2)
    regions = []

    from PySide6.QtCore import QObject

    class Watch(QObject):
        def eventFilter(self, obj, event):  # type: ignore[no-untyped-def]
            if event.type() == QEvent.Type.Paint:
                regions.append(event.region())
            return False

    watch = Watch()
    view.viewport().installEventFilter(watch)
    for k in range(1, 15):  # round a loop: the net force and the yaw swing about
        a = 2 * math.pi * k / 15
        send_mouse(
            view,
            QEvent.Type.MouseMove,
            at + QPointF(60 * math.sin(a), 40 * (1 - math.cos(a))),
            LEFT,
        )
    view.viewport().removeEventFilter(watch)
    assert view.backdrop.frozen
    d = view.board.bodies["Crowded"]
    net = d.balance.net
    assert net.isVisible() and net.boundingRect().contains(net._rect)
    moved = _screen(view)
    view.viewport().repaint()  # every pixel painted again, from the same items
    assert _most_apart(moved, _screen(view)) == 0
    # a move repainted a part of the board, not all of it
    port = view.viewport().width() * view.viewport().height()
    areas = [sum(r.width() * r.height() for r in region) for region in regions]
    assert areas and max(areas) < port / 2
    send_mouse(view, QEvent.Type.MouseButtonRelease, at, Qt.MouseButton.NoButton)
    # at rest, the arrows have their own boxes again
    assert net.boundingRect() == net._rect
    assert d.balance.moment.boundingRect() == d.balance.moment._rect
