"""The board's view: refit on a change of stage unless the user zoomed; fit to site; tool keys."""

from __future__ import annotations

from PySide6.QtCore import QPoint, QPointF, Qt
from PySide6.QtGui import QWheelEvent
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

from tests.conftest import SAMPLES

TWIN = SAMPLES / "twin_barge_move.towboard"


def _in_view(window, x: float, y: float) -> bool:  # type: ignore[no-untyped-def]
    vp = window.view.viewport().rect()
    return vp.contains(window.view.mapFromScene(QPointF(x, y)))


def _bodies_in_view(window) -> bool:  # type: ignore[no-untyped-def]
    box = window.board.bodies_rect()
    return all(
        _in_view(window, p.x(), p.y())
        for p in (box.topLeft(), box.topRight(), box.bottomLeft(), box.bottomRight())
    )


def _wheel(view, notches: int) -> None:  # type: ignore[no-untyped-def]
    at = view.viewport().rect().center()
    ev = QWheelEvent(
        QPointF(at),
        QPointF(view.viewport().mapToGlobal(at)),
        QPoint(0, 0),
        QPoint(0, 120 * notches),
        Qt.MouseButton.NoButton,
        Qt.KeyboardModifier.NoModifier,
        Qt.ScrollPhase.NoScrollPhase,
        False,
    )
    QApplication.sendEvent(view.viewport(), ev)


def test_a_change_of_stage_refits_the_board(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    assert window.open_path(TWIN, ask=False)
    window.view.fit_to_hull()
    for i in range(len(window.controller.project.stages)):
        window.stage_box.setCurrentIndex(i)
        assert window.controller.stage_index == i
        assert _bodies_in_view(window), f"stage {i + 1} is not in view"


def test_a_user_zoom_is_kept_across_stages_until_fit(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    assert window.open_path(TWIN, ask=False)
    window.view.fit_to_hull()
    _wheel(window.view, 2)  # the user zooms in
    zoomed = window.view.transform()
    centre = window.view.mapToScene(window.view.viewport().rect().center())
    window.stage_box.setCurrentIndex(3)
    assert window.view.transform() == zoomed
    assert window.view.mapToScene(window.view.viewport().rect().center()) == centre
    window.act_fit.trigger()  # fit again: the next change of stage refits
    window.stage_box.setCurrentIndex(1)
    assert _bodies_in_view(window)


def test_fit_to_site_shows_every_feature_and_body(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    assert window.open_path(TWIN, ask=False)
    window.view.fit_to_hull()
    features = window.controller.project.site.features
    assert features
    assert not all(_in_view(window, x, y) for f in features for x, y in f.points)
    window.act_fit_site.trigger()
    assert all(_in_view(window, x, y) for f in features for x, y in f.points)
    assert _bodies_in_view(window)


def test_each_tool_has_a_key_shown_in_its_menu_and_tooltip(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    view = window.view
    view.setFocus()
    keys = {}
    for tool, action in window.tool_actions.items():
        key = action.shortcut().toString()
        assert len(key) == 1, f"{tool} has no one-letter key"
        assert f"({key})" in action.toolTip()
        keys[tool] = key
    assert len(set(keys.values())) == len(keys)  # no two tools share a key
    for tool, key in keys.items():
        if tool == "select":
            continue
        QTest.keyClick(view.viewport(), key.lower())
        assert window.board.tool == tool
        assert window.tool_actions[tool].isChecked()
        QTest.keyClick(view.viewport(), keys["select"].lower())
        assert window.board.tool == "select"
    # the toolbar's buttons show the same tooltip
    button = window.toolbar.widgetForAction(window.tool_actions["draw"])
    assert f"({keys['draw']})" in button.toolTip()


def test_the_grid_is_kept_for_the_next_window(window, qtbot, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    from PySide6.QtWidgets import QInputDialog

    from app.window.main_window import MainWindow

    monkeypatch.setattr(QInputDialog, "getDouble", staticmethod(lambda *a, **k: (2.5, True)))
    window.act_grid_step.trigger()
    window.act_snap.trigger()
    assert window.board.snap_on and window.board.grid_step == 2.5
    other = MainWindow()
    qtbot.addWidget(other)
    assert other.board.grid_step == 2.5
    assert other.board.snap_on and other.act_snap.isChecked()
