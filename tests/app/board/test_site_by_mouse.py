"""Drawing on the grid and editing the site by mouse, with real mouse and key events."""

from __future__ import annotations

import math

import numpy as np
import pytest
import shapely
from PySide6.QtCore import QEvent, QPoint, QPointF, QRectF, Qt
from PySide6.QtGui import QContextMenuEvent, QMouseEvent
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication, QInputDialog, QMenu

from app.board.drafting import BOW_SHARE
from core.mechanics.site import dolphin, moored_vessel
from core.units import DisplayUnits
from tests.app.board.conftest import move_with_button, view_point
from tests.conftest import SAMPLES


def _new(window, qtbot):  # type: ignore[no-untyped-def]
    """File > New, the board fitted round the origin, snapping on (Ctrl+G)."""
    window.act_new.trigger()
    view = window.view
    view.fit_rect(QRectF(-20, -40, 120, 100))
    view.setFocus()
    QTest.keyClick(view.viewport(), Qt.Key.Key_G, Qt.KeyboardModifier.ControlModifier)
    assert window.board.snap_on and window.act_snap.isChecked()
    return view


def _click(view, qtbot, x: float, y: float) -> None:  # type: ignore[no-untyped-def]
    qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, x, y))


def _hover(view, x: float, y: float) -> None:  # type: ignore[no-untyped-def]
    """The mouse moved over site point (x, y) with no button held."""
    pt = view_point(view, x, y)
    vp = view.viewport()
    ev = QMouseEvent(
        QEvent.Type.MouseMove,
        QPointF(pt),
        QPointF(vp.mapToGlobal(pt)),
        Qt.MouseButton.NoButton,
        Qt.MouseButton.NoButton,
        Qt.KeyboardModifier.NoModifier,
    )
    QApplication.sendEvent(vp, ev)


def test_a_hull_drawn_on_the_grid_is_exactly_its_size(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    view = _new(window, qtbot)
    QTest.keyClick(view.viewport(), Qt.Key.Key_D)
    assert window.board.tool == "draw"
    # clicks a little off the grid nodes: snapping puts them on the 1 m grid
    _click(view, qtbot, 0.3, -0.2)
    _hover(view, 54.8, 0.35)
    draft = window.board.interaction.draft
    assert [lab.text for lab in draft.labels] == ["55.0 m"]  # the side's length, as drawn
    _click(view, qtbot, 54.8, 0.35)
    _click(view, qtbot, 55.2, 17.7)
    _hover(view, -0.4, 18.3)
    assert [lab.text for lab in draft.labels] == ["55.0 m", "18.0 m", "55.0 m"]
    _click(view, qtbot, -0.4, 18.3)
    QTest.keyClick(view.viewport(), Qt.Key.Key_Return)
    hull = window.controller.project.hulls[0]
    assert hull.geometry.length == 55.0  # exactly: the 54.959 x 17.89 m is gone
    assert hull.geometry.beam == 18.0
    assert sorted(hull.outline) == [(0.0, -9.0), (0.0, 9.0), (55.0, -9.0), (55.0, 9.0)]
    assert window.board.tool == "select"
    assert window.board.interaction.draft is None  # the lengths went with the draft


def test_the_grid_step_is_set_in_the_display_unit(window, qtbot, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    view = _new(window, qtbot)
    c = window.controller
    c.apply(c.project.with_units(DisplayUnits(length="ft")), "feet")
    monkeypatch.setattr(QInputDialog, "getDouble", staticmethod(lambda *a, **k: (5.0, True)))
    window.act_grid_step.trigger()
    assert window.board.grid_step == 5.0
    QTest.keyClick(view.viewport(), Qt.Key.Key_Q)
    ft = 0.3048  # m, the international foot (exact by definition)
    _click(view, qtbot, 3.1, 1.1)  # 10.2 ft, 3.6 ft: to 10 ft, 5 ft
    _hover(view, 30.2, 1.4)  # 99.1 ft: to 100 ft
    assert window.board.interaction.draft.labels[0].text == "90.0 ft"
    _click(view, qtbot, 30.2, 1.4)
    QTest.keyClick(view.viewport(), Qt.Key.Key_Return)
    quay = c.project.site.features[0]
    assert quay.kind == "quay" and quay.name == "Quay 1"
    assert np.array(quay.points) == pytest.approx(np.array([(10 * ft, 5 * ft), (100 * ft, 5 * ft)]))


def test_draw_a_quay_a_dolphin_a_vessel_and_a_basin_limit(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    view = _new(window, qtbot)
    c = window.controller
    QTest.keyClick(view.viewport(), Qt.Key.Key_Q)
    for x, y in ((0, 40), (40, 40), (80, 50)):
        _click(view, qtbot, x, y)
    QTest.keyClick(view.viewport(), Qt.Key.Key_Return)
    QTest.keyClick(view.viewport(), Qt.Key.Key_O)
    _click(view, qtbot, 60, 0)
    _hover(view, 63, 4)
    assert window.board.interaction.draft.labels[0].text == "⌀ 10.0 m"
    _click(view, qtbot, 63, 4)
    QTest.keyClick(view.viewport(), Qt.Key.Key_V)
    for x, y in ((0, -20), (50, -20), (10, -26)):  # stern, bow, a point on the side
        _click(view, qtbot, x, y)
    QTest.keyClick(view.viewport(), Qt.Key.Key_B)
    for x, y in ((-10, -35), (90, -35), (90, 70), (-10, 70), (-10, -35)):  # back to the first
        _click(view, qtbot, x, y)
    features = {f.name: f for f in c.project.site.features}
    assert list(features) == ["Quay 1", "Dolphin 1", "Moored vessel 1", "Basin limit 1"]
    assert features["Quay 1"].points == ((0.0, 40.0), (40.0, 40.0), (80.0, 50.0))
    assert not features["Quay 1"].closed
    # the same shapes as the core's own makers give for the measures clicked
    assert features["Dolphin 1"].points == dolphin("Dolphin 1", (60.0, 0.0), 10.0).points
    vessel = moored_vessel("Moored vessel 1", (25.0, -20.0), 90.0, 50.0, 12.0, BOW_SHARE * 50.0)
    assert np.array(features["Moored vessel 1"].points) == pytest.approx(np.array(vessel.points))
    limit = features["Basin limit 1"]
    assert limit.closed and limit.kind == "limit"
    assert shapely.Polygon(limit.points).area == pytest.approx(100.0 * 105.0)
    assert c.undo_stack.count() >= 4  # one step each
    c.undo_stack.undo()
    assert [f.name for f in c.project.site.features] == ["Quay 1", "Dolphin 1", "Moored vessel 1"]


def _context(view, x: float, y: float) -> QMenu:  # type: ignore[no-untyped-def]
    pt = view_point(view, x, y)
    ev = QContextMenuEvent(QContextMenuEvent.Reason.Mouse, pt, view.viewport().mapToGlobal(pt))
    QApplication.sendEvent(view.viewport(), ev)
    menu = view.board.last_menu
    assert menu is not None
    return menu


def _action(menu: QMenu, text: str):  # type: ignore[no-untyped-def]
    for a in menu.actions():
        if a.text() == text:
            return a
        if a.menu() is not None:
            found = _action(a.menu(), text)
            if found is not None:
                return found
    return None


def test_edit_a_quay_by_mouse(window, qtbot, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    view = _new(window, qtbot)
    c = window.controller
    QTest.keyClick(view.viewport(), Qt.Key.Key_Q)
    _click(view, qtbot, 0, 40)
    _click(view, qtbot, 60, 40)
    QTest.keyClick(view.viewport(), Qt.Key.Key_Return)
    assert window.board.selection == ("site", "Quay 1")
    layer = window.plan_ui.site
    assert len(layer.handles) == 2 and all(h.isVisible() for h in layer.handles)
    # drag the east end 10 m north, on the grid
    steps = c.undo_stack.count()
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, 60, 40))
    assert window.board.selection == ("site_point", "Quay 1", 1)
    move_with_button(view, view_point(view, 65.2, 50.3))
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, 65.2, 50.3))
    assert c.project.site.features[0].points == ((0.0, 40.0), (65.0, 50.0))
    assert c.undo_stack.count() == steps + 1
    # a double-click on the line puts a point in it
    qtbot.mouseDClick(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, 32.5, 45.0))
    assert len(c.project.site.features[0].points) == 3
    # rename from the context menu
    monkeypatch.setattr(
        QInputDialog, "getText", staticmethod(lambda *a, **k: ("Outfitting quay", True))
    )
    menu = _context(view, 16.25, 42.5)
    _action(menu, "Rename Quay 1…").trigger()
    menu.close()
    assert c.project.site.features[0].name == "Outfitting quay"
    # delete the middle point with the key, then the quay from the menu
    qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, 32.5, 45.0))
    assert window.board.selection == ("site_point", "Outfitting quay", 1)
    view.setFocus()
    QTest.keyClick(view.viewport(), Qt.Key.Key_Delete)
    assert c.project.site.features[0].points == ((0.0, 40.0), (65.0, 50.0))
    QTest.keyClick(view.viewport(), Qt.Key.Key_Up)  # nudge the whole quay 1 m north
    assert c.project.site.features[0].points == ((0.0, 41.0), (65.0, 51.0))
    menu = _context(view, 30.0, 46.0)
    _action(menu, "Delete Outfitting quay").trigger()
    menu.close()
    assert c.project.site.features == ()
    assert window.board.selection is None


def test_a_click_inside_a_basin_limit_pans_the_board(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    window.view.fit_to_site()
    view = window.view
    limit = next(f for f in window.controller.project.site.features if f.kind == "limit")
    inside = shapely.Polygon(limit.points).representative_point()
    assert (
        window.plan_ui.site.feature_at(QPointF(inside.x, inside.y), view.pixels_per_metre()) is None
    )
    before = view.mapToScene(view.viewport().rect().center())
    start = view_point(view, inside.x, inside.y)
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    move_with_button(view, start + QPoint(40, 0))
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=start + QPoint(40, 0))
    after = view.mapToScene(view.viewport().rect().center())
    assert after.x() < before.x()  # the board moved with the cursor (the view looks further west)
    assert window.board.selection is None


def test_lash_and_unlash_from_the_context_menu(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    window.view.fit_to_hull()
    c = window.controller
    view = window.view
    group = c.project.groups[0]
    placed = {s.name: _poly(c.project, s, group.name) for s in c.project.stages}
    pose = window.board.pose(group.name)
    a = math.pi / 2 - math.radians(pose.heading_deg)
    x, y = 20.0, -5.0  # inside Lark 41
    at = (pose.x + math.cos(a) * x - math.sin(a) * y, pose.y + math.sin(a) * x + math.cos(a) * y)
    menu = _context(view, *at)
    _action(menu, f"Unlash {group.name}").trigger()
    menu.close()
    assert c.project.groups == ()
    for s in c.project.stages:  # each hull lies where it lay in the group, in every stage
        both = shapely.union_all([_poly(c.project, s, h.hull) for h in group.members])
        # poses and lashings are kept to the micrometre
        assert both.symmetric_difference(placed[s.name]).area == pytest.approx(0.0, abs=1e-3)
    menu = _context(view, *at)
    _action(menu, "Lark 42").trigger()  # Lash Lark 41 to > Lark 42
    menu.close()
    assert len(c.project.groups) == 1
    name = c.project.groups[0].name
    for s in c.project.stages:
        assert _poly(c.project, s, name).symmetric_difference(placed[s.name]).area == pytest.approx(
            0.0, abs=1e-3
        )
    c.undo_stack.undo()
    c.undo_stack.undo()
    assert c.project.groups == (group,)


def _poly(project, stage, body):  # type: ignore[no-untyped-def]
    from core.mechanics.bodies import body_of
    from core.mechanics.site import body_pose, place_body

    return place_body(body_of(project, body), body_pose(project, stage, body)).polygon


def test_a_tugs_context_menu_sets_and_lets_go(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    pose = window.board.pose("Kestrel 3")
    a = math.pi / 2 - math.radians(pose.heading_deg)
    px, py = share.position
    at = (
        pose.x + math.cos(a) * px - math.sin(a) * py,
        pose.y + math.sin(a) * px + math.cos(a) * py,
    )
    menu = _context(view, *at)
    assert window.board.selection == ("tug", "Gannet")
    _action(menu, "50 %").trigger()
    assert c.stage.placement("Gannet").setting == pytest.approx(0.5)
    menu.close()
    menu = _context(view, *at)
    _action(menu, "Let go Gannet").trigger()
    menu.close()
    assert all(p.tug != "Gannet" for p in c.stage.placements)


def test_rename_a_lashed_group_from_the_context_menu(window, qtbot, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    """A group's name (printed in every view and the briefing) is edited in the window:
    its poses in every stage follow it; a name in use is refused and nothing changes."""
    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    window.view.fit_to_hull()
    c = window.controller
    view = window.view
    old = c.project.groups[0].name
    placed = {s.name: _poly(c.project, s, old) for s in c.project.stages}
    pose = window.board.pose(old)
    a = math.pi / 2 - math.radians(pose.heading_deg)
    x, y = 20.0, -5.0  # inside Lark 41
    at = (pose.x + math.cos(a) * x - math.sin(a) * y, pose.y + math.sin(a) * x + math.cos(a) * y)
    monkeypatch.setattr(QInputDialog, "getText", lambda *a, **k: ("Lark twins", True))
    menu = _context(view, *at)
    _action(menu, f"Rename {old}…").trigger()
    menu.close()
    assert [g.name for g in c.project.groups] == ["Lark twins"]
    assert c.undo_stack.undoText() == f"Rename {old}"
    for s in c.project.stages:  # the same group where it lay, under its new name
        assert all(p.body != old for p in s.poses)
        assert _poly(c.project, s, "Lark twins").symmetric_difference(placed[s.name]).area == (
            pytest.approx(0.0, abs=1e-6)
        )
    before = c.project
    hull = c.project.hulls[0].name
    monkeypatch.setattr(QInputDialog, "getText", lambda *a, **k: (hull, True))
    menu = _context(view, *at)
    _action(menu, "Rename Lark twins…").trigger()
    menu.close()
    assert c.project is before  # a hull's name is taken: refused, said on the status bar
    c.undo_stack.undo()
    assert [g.name for g in c.project.groups] == [old]
