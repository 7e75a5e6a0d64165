"""During a drag's mouse moves only the views that show and read what changed are
redone; the drag's end brings every view up to date (controller.follow). The board's
pictures fit Qt's picture cache."""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtGui import QPixmapCache

from app.board.cache import OTHERS_KIB, board_cache_kib, fit_pixmap_cache
from app.controller import _Follower, on_screen


def _drag_step(c, tug: str, turn: float) -> None:  # type: ignore[no-untyped-def]
    stage = c.stage
    p = stage.placement(tug)
    c.preview(c.with_stage(stage.with_placement(p.with_lead(p.lead_rad + turn))))


def _runs(view) -> list[int]:  # type: ignore[no-untyped-def]
    """A list that grows by one each time ``view``'s followed slot runs."""
    (follower,) = view.findChildren(_Follower)
    runs: list[int] = []
    slot = follower._slot

    def counted() -> None:
        runs.append(1)
        slot()

    follower._slot = counted
    return runs


def test_a_panel_behind_a_tab_waits_for_the_drag_to_end(window) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    hull, balance = window.hull_panel, window.balance_panel
    assert on_screen(balance) and not on_screen(hull)  # the hull's tab is behind
    hull_runs, balance_runs = _runs(hull), _runs(balance)
    tug = c.stage.placements[0].tug
    before = balance.fields["net"].text()
    for k in range(1, 4):
        _drag_step(c, tug, 0.1 * k)
    assert len(balance_runs) == 3 and balance.fields["net"].text() != before
    assert hull_runs == []
    c.cancel_preview()
    assert len(hull_runs) == 1  # the drag's end is a change like any other
    assert balance.fields["net"].text() == before
    window.panels["hull"].raise_()  # shown, it follows a drag's moves too
    assert on_screen(hull)
    pose = c.stage.poses[0]
    hull_runs.clear()
    c.preview(c.with_stage(replace(c.stage, poses=(replace(pose, x=pose.x + 5.0),))))
    assert len(hull_runs) == 1
    c.cancel_preview()


def test_views_that_read_nothing_a_tug_drag_changes_are_left_alone(window) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    details = window.panels["stage"].widget().widget()  # in its scroll area
    assert on_screen(details)
    runs = _runs(details)
    tug = c.stage.placements[0].tug
    for k in range(1, 4):
        _drag_step(c, tug, 0.1 * k)
    assert runs == []  # poses, notes, limits: a tug drag moves none of them
    c.commit_preview("turn")
    assert len(runs) == 1
    pose = c.stage.poses[0]  # a body drag moves what it shows: it follows that
    c.preview(c.with_stage(replace(c.stage, poses=(replace(pose, x=pose.x + 5.0),))))
    assert len(runs) == 2
    assert details.poses.item(0, 1).text() != ""
    c.cancel_preview()


def test_the_picture_cache_holds_the_board(window) -> None:  # type: ignore[no-untyped-def]
    old = QPixmapCache.cacheLimit()
    try:
        QPixmapCache.setCacheLimit(64)
        need = board_cache_kib(window.view)
        assert need > 0
        limit = fit_pixmap_cache(window.view)
        assert limit == QPixmapCache.cacheLimit() >= 2 * need + OTHERS_KIB
        QPixmapCache.setCacheLimit(10 * limit)
        assert fit_pixmap_cache(window.view) == 10 * limit  # it only ever grows it
    finally:
        QPixmapCache.setCacheLimit(old)
