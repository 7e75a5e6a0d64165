"""Nothing that matters is hidden on a fitted board: every sample stage, checked by the
items' bounding rectangles in the view's pixels.

- no two labels overlap;
- no label covers a tug (its shape's bounding rectangle);
- the wind and current card covers no item (guides that run across the whole board, the
  line of action, quay faces and limits, aside: no corner could avoid them);
- each load is drawn as its own arrow, ending at its own point of action, with its value.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest
from PySide6.QtCore import QRectF
from PySide6.QtWidgets import QGraphicsItem

from app.board.items import GUIDE, Arrow, Label, TugItem
from tests.app.board.conftest import settle
from tests.conftest import SAMPLES

STAGES = [
    (path, i)
    for path in sorted(SAMPLES.glob("*.towboard"))
    for i in range(len(__import__("json").loads(path.read_text())["stages"]))
]


def _rect(item: QGraphicsItem, view) -> QRectF:  # type: ignore[no-untyped-def]
    return item.deviceTransform(view.viewportTransform()).mapRect(item.boundingRect())


def _overlap(a: QRectF, b: QRectF) -> float:
    r = a.intersected(b)
    return max(r.width(), 0.0) * max(r.height(), 0.0)


def _show(window, path: Path, index: int, qtbot) -> None:  # type: ignore[no-untyped-def]
    assert window.open_path(path, ask=False)
    window.stage_box.setCurrentIndex(index)
    window.view.fit_to_hull()
    settle(window, qtbot)


def _labels(window) -> list[Label]:  # type: ignore[no-untyped-def]
    return [i for i in window.board.items() if isinstance(i, Label) and i.isVisible() and i.text]


@pytest.mark.parametrize(("path", "index"), STAGES, ids=lambda v: getattr(v, "stem", str(v)))
def test_no_label_hides_a_label_or_a_tug(window, qtbot, path: Path, index: int) -> None:  # type: ignore[no-untyped-def]
    _show(window, path, index, qtbot)
    view = window.view
    labels = [(lab, _rect(lab, view)) for lab in _labels(window)]
    assert len(labels) >= 8  # tugs, the balance, the hull's marks
    for i, (a, ra) in enumerate(labels):
        for b, rb in labels[i + 1 :]:
            assert _overlap(ra, rb) < 1.0, f"{a.text!r} overlaps {b.text!r}"
    tugs = [i for i in window.board.items() if isinstance(i, TugItem) and i.isVisible()]
    assert tugs
    for t in tugs:
        shape = t.deviceTransform(view.viewportTransform()).map(t.glyph).boundingRect()
        for lab, r in labels:
            assert _overlap(r, shape) < 1.0, f"{lab.text!r} covers a tug"


@pytest.mark.parametrize(("path", "index"), STAGES, ids=lambda v: getattr(v, "stem", str(v)))
def test_the_wind_card_covers_no_item(window, qtbot, path: Path, index: int) -> None:  # type: ignore[no-untyped-def]
    _show(window, path, index, qtbot)
    view = window.view
    window.view.viewport().repaint()  # the card records where it was drawn
    card = window.solve_ui.card.rect
    assert not card.isEmpty()
    assert view.viewport().rect().toRectF().contains(card)
    for item in window.board.items():
        if not item.isVisible() or item.data(GUIDE) or item.boundingRect().isEmpty():
            continue
        if item.flags() & QGraphicsItem.GraphicsItemFlag.ItemHasNoContents:
            continue
        r = _rect(item, view)
        assert _overlap(card, r) < 1.0, f"the card covers {type(item).__name__} {item.data(0)}"


@pytest.mark.parametrize("path", sorted(SAMPLES.glob("*.towboard")), ids=lambda p: p.stem)
def test_each_load_is_its_own_arrow_at_its_point_with_its_value(window, qtbot, path) -> None:  # type: ignore[no-untyped-def]
    _show(window, path, 0, qtbot)
    c = window.controller
    u = c.project.units
    for name, r in c.results().items():
        drawing = window.board.bodies[name].balance
        loads = r.balance.loads
        assert len(drawing.loads) == len(loads)
        for (arrow, label), ld in zip(drawing.loads, loads, strict=True):
            assert isinstance(arrow, Arrow) and arrow.isVisible()
            _shaft, head = arrow.parts()
            # the head's tip is the load's point of action (body frame, m)
            tip = head.at(0)
            assert (tip.x(), tip.y()) == pytest.approx(ld.point, abs=1e-9)
            assert label.text == f"{ld.name} {u.show(math.hypot(*ld.force), 'force')}"
