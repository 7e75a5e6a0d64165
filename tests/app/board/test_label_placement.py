"""The label placer's parts, and the placer on a crowded board of its own.

The placer works out what every label's boxes cost apart from the labels placed before
it all at once, then the overlaps label by label (app/board/placement.py). These tests
check the parts it is built from against plain geometry, and the whole on labels
crowded round one point, where only the overlap term keeps them apart.
"""

from __future__ import annotations

import math
import random

import numpy as np
import pytest
from PySide6.QtCore import QPointF, QRectF
from PySide6.QtWidgets import QGraphicsScene, QGraphicsView

from app.board.items import Label
from app.board.placement import _candidates, _leaders_cross, place_labels


def _cross_one(box: tuple[float, ...], anchor: tuple[float, float], reserved: list) -> bool:  # type: ignore[type-arg]
    return bool(
        _leaders_cross(np.array([box]), np.array([anchor]), np.array(reserved).reshape(-1, 4))[0]
    )


def test_a_leader_through_a_reserved_box_is_seen() -> None:
    # anchor at the origin, box to the right: the leader runs along y = 0 from x 0 to 100
    box = (100.0, -5.0, 140.0, 5.0)
    assert _cross_one(box, (0.0, 0.0), [(40.0, -10.0, 60.0, 10.0)])
    assert not _cross_one(box, (0.0, 0.0), [(40.0, 20.0, 60.0, 40.0)])  # above it
    assert not _cross_one(box, (0.0, 0.0), [])


def test_a_leader_past_the_corner_of_a_reserved_box_is_not_seen() -> None:
    # the leader from (0, 0) to the box's nearest corner (100, 100) is the diagonal; the
    # reserved box sits inside the leader's own box but off the diagonal
    box = (100.0, 100.0, 140.0, 120.0)
    assert not _cross_one(box, (0.0, 0.0), [(60.0, 5.0, 95.0, 30.0)])
    assert _cross_one(box, (0.0, 0.0), [(45.0, 45.0, 55.0, 55.0)])  # on the diagonal


def test_each_leader_is_checked_from_its_own_anchor() -> None:
    boxes = np.array([(100.0, -5.0, 140.0, 5.0)] * 2)
    anchors = np.array([(0.0, 0.0), (0.0, 200.0)])
    # the second anchor's leader climbs from y 200 to the box at y 5 and x 100
    reserved = np.array([(40.0, -10.0, 60.0, 10.0)])
    assert _leaders_cross(boxes, anchors, reserved).tolist() == [True, False]


def test_every_box_round_the_anchor_keeps_clear_of_it() -> None:
    """The first 13 shifts are the home box and small nudges; every other box lies round
    the anchor with the anchor outside it (a leader joins it)."""
    rng = random.Random(5)
    homes, anchors = [], []
    for _ in range(200):
        w, h = rng.uniform(10, 200), rng.uniform(10, 60)
        cx, cy = rng.uniform(-300, 300), rng.uniform(-300, 300)
        homes.append((cx, cy, w / 2, h / 2))
        anchors.append((rng.uniform(-300, 300), rng.uniform(-300, 300)))
    shifts = _candidates(np.array(homes), np.array(anchors))
    assert shifts.shape == (200, 13 + 7 * 16, 2)
    assert (shifts[:, 0] == 0).all()
    assert np.abs(shifts[:, 1:13]).max() == 20.0
    for (cx, cy, hw, hh), (ax, ay), sh in zip(homes, anchors, shifts, strict=True):
        for dx, dy in sh[13:]:
            x, y = cx + dx, cy + dy  # the moved box's centre
            clear = max(abs(ax - x) - hw, abs(ay - y) - hh)  # > 0: the anchor is outside
            assert clear > 4.0 * math.sin(math.pi / 16) - 1e-9


@pytest.fixture
def crowd(qtbot):  # type: ignore[no-untyped-def]
    """Eight labels anchored at one point in the middle of a 600 x 400 px view (scene
    units are pixels)."""
    view = QGraphicsView()
    qtbot.addWidget(view)
    scene = QGraphicsScene(view)  # the view keeps it
    view.setScene(scene)
    view.resize(600, 400)
    view.setSceneRect(QRectF(-300, -200, 600, 400))
    labels = []
    for k in range(8):
        lab = Label(f"Tug {k + 1}\n{10 + k}.0 t")
        scene.addItem(lab)
        lab.setPos(QPointF(0, 0))
        labels.append(lab)
    return view, labels


def _box(view: QGraphicsView, lab: Label) -> QRectF:
    return lab.deviceTransform(view.viewportTransform()).mapRect(lab.boundingRect())


def test_labels_at_one_point_are_spread_so_none_covers_another(crowd) -> None:  # type: ignore[no-untyped-def]
    view, labels = crowd
    placed = place_labels(view.scene(), view.viewportTransform(), view.viewport().size())
    assert sorted(map(id, placed)) == sorted(map(id, labels))
    boxes = [_box(view, lab) for lab in labels]
    for i, a in enumerate(boxes):
        for b in boxes[i + 1 :]:
            r = a.intersected(b)
            assert r.width() * r.height() < 1.0
        assert view.viewport().rect().toRectF().contains(a)
    assert any(lab.shift != (0.0, 0.0) for lab in labels)


def test_a_fixed_label_stays_home_and_the_others_keep_clear_of_it(crowd) -> None:  # type: ignore[no-untyped-def]
    view, labels = crowd
    labels[5].fixed = True
    labels[5].setPos(QPointF(270, 0))  # its home box runs off the right edge of the view
    labels[5].set_shift(30.0, 30.0)  # where an earlier placing left it: it goes home
    home = labels[5].home_rect()
    placed = place_labels(view.scene(), view.viewportTransform(), view.viewport().size())
    assert placed[0] is labels[5]  # placed first
    assert labels[5].shift == (0.0, 0.0)
    assert labels[5].boundingRect() == home
    fixed_box = _box(view, labels[5])
    assert fixed_box.right() > view.viewport().width()  # a label free to move would not stay
    for lab in labels[:5] + labels[6:]:
        r = _box(view, lab).intersected(fixed_box)
        assert r.width() * r.height() < 1.0
