"""A site feature's outline closed or opened from its board menu ("Closed outline"), one
undo step, kept through save and load; closing a line of two points is refused."""

from __future__ import annotations

import json

from PySide6.QtGui import QContextMenuEvent
from PySide6.QtWidgets import QApplication, QFileDialog, QMenu

from core.io.projectfile import load
from tests.app.board.conftest import view_point
from tests.conftest import SAMPLES


def _twin(window):  # type: ignore[no-untyped-def]
    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    window.view.fit_to_site()
    return window


def _menu_at(window, x: float, y: float) -> QMenu:  # type: ignore[no-untyped-def]
    view = window.view
    pt = view_point(view, x, y)
    ev = QContextMenuEvent(QContextMenuEvent.Reason.Mouse, pt, view.viewport().mapToGlobal(pt))
    QApplication.sendEvent(view.viewport(), ev)
    menu = window.board.last_menu
    assert menu is not None
    return menu


def _closed_action(menu: QMenu):  # type: ignore[no-untyped-def]
    act = next((a for a in menu.actions() if a.text() == "Closed outline"), None)
    assert act is not None, [a.text() for a in menu.actions()]
    return act


def _feature(window, name: str):  # type: ignore[no-untyped-def]
    return next(f for f in window.controller.project.site.features if f.name == name)


# the basin limit's south edge runs from (-230, -2) to (420, -2) (east of the fitting-out
# quay's end at x = 300); its west edge, from its last point (-230, 300) back to its first,
# is the side an open outline no longer has. The lay-by quay runs from (-200, 30) to
# (-200, 280). (The sample file's points.)
LIMIT, LIMIT_EDGE, CLOSING_EDGE = "Dredged basin limit", (380.0, -2.0), (-230.0, 100.0)
QUAY, QUAY_LINE = "Lay-by quay", (-200.0, 150.0)


def test_opening_and_closing_the_basin_limit_round_trips(
    window, qtbot, monkeypatch, tmp_path
) -> None:  # type: ignore[no-untyped-def]
    w = _twin(window)
    c = w.controller
    before, steps = c.project, c.undo_stack.count()
    menu = _menu_at(w, *LIMIT_EDGE)
    act = _closed_action(menu)
    assert act.isCheckable() and act.isChecked()
    act.trigger()  # unchecks it: the limit becomes a line through its eight points
    menu.close()
    f = _feature(w, LIMIT)
    assert not f.closed and f.points == _feature_of(before, LIMIT).points
    menu = _menu_at(w, *CLOSING_EDGE)  # nothing there now: open water's menu
    assert all(a.text() != "Closed outline" for a in menu.actions())
    menu.close()
    assert c.undo_stack.count() == steps + 1
    target = tmp_path / "open.towboard"
    monkeypatch.setattr(
        QFileDialog, "getSaveFileName", staticmethod(lambda *a, **k: (str(target), ""))
    )
    w.act_save_as.trigger()
    saved = json.loads(target.read_text())["site"]["features"]
    assert next(x for x in saved if x["name"] == LIMIT)["closed"] is False
    assert not next(x for x in load(target).site.features if x.name == LIMIT).closed
    c.undo_stack.undo()
    assert c.project == before
    c.undo_stack.redo()
    assert not _feature(w, LIMIT).closed
    menu = _menu_at(w, *LIMIT_EDGE)
    act = _closed_action(menu)
    assert not act.isChecked()
    act.trigger()  # and closed again
    menu.close()
    assert _feature(w, LIMIT).closed
    assert c.project.site == before.site


def test_a_quay_of_three_points_closes_and_one_of_two_is_refused(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    w = _twin(window)
    c = w.controller
    before, steps = c.project, c.undo_stack.count()
    menu = _menu_at(w, *QUAY_LINE)
    act = _closed_action(menu)
    assert not act.isChecked()
    act.trigger()
    menu.close()
    assert c.project == before and c.undo_stack.count() == steps
    assert w.statusBar().currentMessage() == (
        f"Close the outline of {QUAY}: not done (site {QUAY}: needs at least three "
        "distinct vertices, has 2)"
    )
    # a point added on the quay's line (the site's own edit), then the outline closes
    from app.edits import site as site_edits

    c.apply(site_edits.inserted_point(c.project, QUAY, 0, (-170.0, 150.0)), "Add a point")
    menu = _menu_at(w, -185.0, 90.0)  # on its first side, now to (-170, 150)
    _closed_action(menu).trigger()
    menu.close()
    f = _feature(w, QUAY)
    assert f.closed and len(f.points) == 3
    c.undo_stack.undo()
    assert not _feature(w, QUAY).closed


def _feature_of(project, name: str):  # type: ignore[no-untyped-def]
    return next(f for f in project.site.features if f.name == name)
