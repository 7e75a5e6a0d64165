"""A drag that changes tugs' pulls while they stay where they are (live solving does, on
every move) draws those tugs' arrows again, not the tugs: each arrow is drawn apart from
its tug's picture while the drag lasts and taken back when it ends, so the board at rest
looks as it did, and what the moves left on screen is the board painted afresh.
"""

from __future__ import annotations

from dataclasses import replace

import pytest
from PySide6.QtCore import QSize
from PySide6.QtWidgets import QApplication

from app.board.items import TugArrow, TugItem
from core.model.plan import BodyPose
from tests.app.board.conftest import show_fitted
from tests.app.board.test_drag_backdrop import _most_apart, _screen, crowded


@pytest.fixture
def painted(monkeypatch: pytest.MonkeyPatch) -> list[TugItem]:
    """Every TugItem painted (into its picture or onto the board), in order."""
    out: list[TugItem] = []
    paint = TugItem.paint

    def counted(self, *args):  # type: ignore[no-untyped-def]
        out.append(self)
        return paint(self, *args)

    monkeypatch.setattr(TugItem, "paint", counted)
    return out


@pytest.fixture
def view(qtbot, painted):  # type: ignore[no-untyped-def]
    from app.board.scene import BoardScene
    from app.board.view import BoardView
    from app.controller import Controller

    plan = crowded(24)
    # heading east, the body square to the screen: Qt keeps the items' pictures (a
    # body turned on screen has them drawn again on every repaint, by Qt)
    east = (BodyPose("Crowded", 0.0, 0.0, 90.0),)
    plan = replace(plan, stages=(replace(plan.stages[0], poses=east),))
    v = BoardView(BoardScene(Controller(plan)))
    show_fitted(qtbot, v, v, QSize(900, 700))
    return v


def _pulls(view, settings: dict[str, float]):  # type: ignore[no-untyped-def]
    """The plan with these tugs' settings (what live solving previews on a move)."""
    c = view.board.controller
    stage = c.stage
    for tug, setting in settings.items():
        stage = stage.with_placement(stage.placement(tug).with_setting(setting))
    return c.with_stage(stage)


def test_a_pull_that_changes_alone_draws_its_arrow_again_not_its_tug(view, painted) -> None:  # type: ignore[no-untyped-def]
    c = view.board.controller
    tugs = view.board.bodies["Crowded"].tugs
    at_rest = _screen(view)
    c.preview(_pulls(view, {"T003": 0.6, "T010": 0.4}))
    QApplication.processEvents()
    changed = [tugs["T003"].glyph, tugs["T010"].glyph]
    assert all(g.apart for g in changed)
    assert not any(t.glyph.apart for name, t in tugs.items() if name not in ("T003", "T010"))
    painted.clear()
    for k in range(1, 4):
        c.preview(_pulls(view, {"T003": 0.6 + 0.1 * k, "T010": 0.4 - 0.1 * k}))
        QApplication.processEvents()
    assert not any(g in painted for g in changed)  # their pictures were kept
    for g in changed:  # the arrow apart is the tug's arrow, stacked over the tug
        (arrow,) = [i for i in g.childItems() if isinstance(i, TugArrow)]
        assert arrow.isVisible() and arrow.parts() == g.arrow_parts()
        assert not g.arrow_parts()[1].isEmpty()
    moved = _screen(view)
    assert _most_apart(moved, at_rest) > 0  # the arrows did change
    view.viewport().repaint()  # every pixel painted again, from the same items
    assert _most_apart(moved, _screen(view)) == 0
    c.cancel_preview()
    QApplication.processEvents()
    assert not any(t.glyph.apart for t in tugs.values())
    assert not [i for i in view.board.items() if isinstance(i, TugArrow)]  # let go
    # the same plan at rest: drawn as it was before the drag, pixel for pixel
    view.viewport().repaint()
    assert _most_apart(at_rest, _screen(view)) == 0


def test_a_tug_that_moves_in_a_drag_is_drawn_whole(view) -> None:  # type: ignore[no-untyped-def]
    c = view.board.controller
    tugs = view.board.bodies["Crowded"].tugs
    stage = c.stage
    p = stage.placement("T003")
    c.preview(_pulls(view, {"T010": 0.7}))
    QApplication.processEvents()
    assert tugs["T010"].glyph.apart
    # the tug's lead turns (it moves) and its pull changes: one picture, arrow and all
    c.preview(c.with_stage(stage.with_placement(p.with_lead(p.lead_rad + 0.2).with_setting(0.7))))
    QApplication.processEvents()
    assert not tugs["T003"].glyph.apart
    c.cancel_preview()
    QApplication.processEvents()
    assert not tugs["T010"].glyph.apart
