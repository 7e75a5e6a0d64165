"""Editing the board with real mouse and key events on the viewport."""

from __future__ import annotations

import math

import numpy as np
import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtTest import QTest

from app.window.main_window import new_project
from core.analysis.stage import compute_stage_result
from core.frames import true_to_site_angle
from core.mechanics.bodies import body_of
from core.units import fmt
from tests.app.board.conftest import move_with_button, view_point


def _site(pose, p):  # type: ignore[no-untyped-def]
    """Body-frame point to site frame, written out here (rotation by the true heading)."""
    a = true_to_site_angle(pose.heading_deg)
    c, s = math.cos(a), math.sin(a)
    return np.array([pose.x + c * p[0] - s * p[1], pose.y + s * p[0] + c * p[1]])


def _pose(window, body):  # type: ignore[no-untyped-def]
    from app.board.poses import pose_in

    return pose_in(window.controller.stage, body)


def test_draw_a_hull_by_clicking_its_vertices(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    window.controller.reset(new_project())
    view = window.view
    view.fit_to_hull()
    window.board.set_tool("draw")
    corners = [(-40.0, -10.0), (40.0, -10.0), (40.0, 10.0), (-40.0, 10.0)]
    pixels = [view_point(view, x, y) for x, y in corners]
    for px in pixels:
        qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=px)
    qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=pixels[0])  # close it
    project = window.controller.project
    assert [h.name for h in project.hulls] == ["Hull 1"]
    hull = project.hull("Hull 1")
    # where the clicks landed in the site, by Qt's own mapping
    clicked = [view.mapToScene(px) for px in pixels]
    pose = _pose(window, "Hull 1")
    drawn = sorted(tuple(np.round(_site(pose, v), 6)) for v in hull.outline)
    expected = sorted((round(p.x(), 6), round(p.y(), 6)) for p in clicked)
    assert np.array(drawn) == pytest.approx(np.array(expected), abs=1e-5)
    # the reference point is the aft end on the centreline (half-way across the beam)
    assert min(x for x, _ in hull.outline) == pytest.approx(0.0, abs=1e-9)
    ys = [y for _, y in hull.outline]
    assert max(ys) == pytest.approx(-min(ys), abs=1e-9)
    # a rectangle 80 m x 20 m, to within a pixel's rounding
    tol = 2.0 / view.pixels_per_metre()
    assert hull.geometry.length == pytest.approx(80.0, abs=tol)
    assert hull.geometry.beam == pytest.approx(20.0, abs=tol)
    assert window.board.tool == "select"
    assert window.controller.undo_stack.count() == 1


def test_add_a_line_point_and_a_push_point_on_the_edge(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    view = window.view
    pose = _pose(window, "Kestrel 3")
    hull = window.controller.project.hull("Kestrel 3")
    before = {f.name for f in hull.fittings}
    # just off the port side (y = +12 in the hull frame) at x = 40, 0.4 m out
    window.board.set_tool("line_point")
    at = _site(pose, (40.0, 12.4))
    qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *at))
    window.board.set_tool("push_point")
    at = _site(pose, (30.0, -12.3))
    qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *at))
    hull = window.controller.project.hull("Kestrel 3")
    new = [f for f in hull.fittings if f.name not in before]
    assert [(f.name, f.kind) for f in new] == [("Line point 1", "line"), ("Push point 1", "push")]
    line, push = new
    tol = 1.5 / view.pixels_per_metre()
    # snapped onto the outline: exactly on the side, at the clicked station
    assert line.y == pytest.approx(12.0, abs=1e-9)
    assert line.x == pytest.approx(40.0, abs=tol)
    assert push.y == pytest.approx(-12.0, abs=1e-9)
    assert push.x == pytest.approx(30.0, abs=tol)
    assert window.board.selection == ("fitting", "Kestrel 3", "Push point 1")


def test_a_click_far_from_the_edge_adds_nothing(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    view = window.view
    pose = _pose(window, "Kestrel 3")
    window.board.set_tool("line_point")
    before = window.controller.project
    qtbot.mouseClick(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, (40.0, 0.0)))
    )
    assert window.controller.project is before
    assert "edge" in window.statusBar().currentMessage()


def _panel_matches_core(window) -> None:  # type: ignore[no-untyped-def]
    """The balance panel shows exactly the stage result's numbers for the geometry now on
    screen (worked out from scratch, not through the drag's fast path)."""
    c = window.controller
    project = c.project
    name = c.main_body()
    ref = compute_stage_result(project, c.stage_index).body(name).balance
    u = project.units
    f = window.balance_panel.fields
    assert f["net"].text() == u.show(ref.net_magnitude, "force")

    def signed(v: float, q: str) -> str:
        return fmt(u.value(v, q), signed=True)  # type: ignore[arg-type]

    assert f["net_ahead"].text().startswith(signed(ref.net_force[0], "force"))
    assert f["net_abeam"].text().startswith(signed(ref.net_force[1], "force"))
    assert f["moment_centroid"].text().startswith(signed(ref.moment_centroid_nm, "moment"))
    assert f["moment_cog"].text().startswith(signed(ref.moment_cog_nm, "moment"))
    if ref.centreline_x is not None:
        assert u.show(ref.centreline_x, "length") in f["crossing"].text()


def test_drag_a_tug_updates_the_balance_on_every_move(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    start_site = _site(pose, share.position)
    start_px = view_point(view, *start_site)
    before = c.project
    steps_before = c.undo_stack.count()
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start_px)
    assert window.board.selection == ("tug", "Gannet")
    grab = np.array([view.mapToScene(start_px).x(), view.mapToScene(start_px).y()])
    fitting = c.project.hull("Kestrel 3").fitting("Bow centre bitt")
    for k in range(1, 16):
        a = math.radians(12 * k)
        px = start_px + QPointF(60 * math.sin(a), -40 * (1 - math.cos(a))).toPoint()
        move_with_button(view, px)
        _panel_matches_core(window)
        # the tug followed the mouse: its line now ends where the cursor moved it to
        mouse = view.mapToScene(px)
        p = c.stage.placement("Gannet")
        end_body = (
            fitting.x + p.line_length_m * math.cos(p.lead_rad),
            fitting.y + p.line_length_m * math.sin(p.lead_rad),
        )
        moved = _site(pose, end_body) - start_site
        assert moved == pytest.approx(np.array([mouse.x(), mouse.y()]) - grab, abs=1e-6)
        # and the table shows the same lead
        row = window.tugs_panel.model.row_of("Gannet")
        model = window.tugs_panel.model
        lead_text = model.data(model.index(row, 6))
        bearing = (-math.degrees(p.lead_rad)) % 360
        assert int(lead_text) == round(bearing) % 360
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=px)
    assert c.undo_stack.count() == steps_before + 1  # the whole drag is one undo step
    dragged = c.project
    assert dragged != before
    c.undo_stack.undo()
    assert c.project == before
    _panel_matches_core(window)
    c.undo_stack.redo()
    assert c.project == dragged


def test_drag_a_push_tug_swings_its_push(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    t = window.board.bodies["Kestrel 3"].tugs["Tern"]
    centre = t.glyph.mapToScene(t.glyph.boundingRect().center())
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=view.mapFromScene(centre))
    # move the cursor aft along the side: the push then leans forward
    target = _site(pose, (46.0, -30.0))
    move_with_button(view, view_point(view, *target))
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *target))
    p = c.stage.placement("Tern")
    # push from the cursor towards the pad at (66, -12): angle off the inward normal (+y)
    expected = math.atan2(-12.0 - (-30.0), 66.0 - 46.0) - math.pi / 2
    assert p.lead_rad == pytest.approx(expected, abs=0.01)
    _panel_matches_core(window)


def test_wheel_and_keys_change_the_selected_tugs_setting(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    share = next(s for s in c.balance().shares if s.tug == "Puffin")
    px = view_point(view, *_site(pose, share.position))
    qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=px)
    assert window.board.selection == ("tug", "Puffin")
    view.setFocus()
    count = c.undo_stack.count()
    was = c.stage.placement("Puffin").setting
    for _ in range(3):
        QTest.keyClick(view.viewport(), Qt.Key.Key_Plus)
    assert c.stage.placement("Puffin").setting == pytest.approx(was + 0.03)
    assert c.undo_stack.count() == count + 1  # the three steps merged
    for _ in range(12):
        QTest.keyClick(view.viewport(), Qt.Key.Key_PageUp)
    assert c.stage.placement("Puffin").setting == 1.0  # kept at 100 %
    for _ in range(15):
        QTest.keyClick(view.viewport(), Qt.Key.Key_PageDown)
    assert c.stage.placement("Puffin").setting == 0.0  # and at 0 %
    from PySide6.QtCore import QPoint
    from PySide6.QtGui import QWheelEvent
    from PySide6.QtWidgets import QApplication

    wheel = QWheelEvent(
        QPointF(px),
        QPointF(view.viewport().mapToGlobal(px)),
        QPoint(0, 0),
        QPoint(0, 240),
        Qt.MouseButton.NoButton,
        Qt.KeyboardModifier.NoModifier,
        Qt.ScrollPhase.NoScrollPhase,
        False,
    )
    QApplication.sendEvent(view.viewport(), wheel)
    assert c.stage.placement("Puffin").setting == pytest.approx(0.10)  # two notches of 5 %
    _panel_matches_core(window)


def test_arrow_keys_nudge_a_tug_one_metre(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    before = _site(pose, share.position)
    qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *before))
    count = c.undo_stack.count()
    QTest.keyClick(view.viewport(), Qt.Key.Key_Right)
    QTest.keyClick(view.viewport(), Qt.Key.Key_Right)
    QTest.keyClick(view.viewport(), Qt.Key.Key_Up)
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    after = _site(pose, share.position)
    assert after - before == pytest.approx(np.array([2.0, 1.0]), abs=1e-6)  # east 2 m, north 1 m
    assert c.undo_stack.count() == count + 1


def test_an_invalid_outline_never_reaches_the_balance(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    # select the hull, then take vertex 3, (84, -9), the bow's starboard corner
    qtbot.mouseClick(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, (30.0, 3.0)))
    )
    assert window.board.selection == ("hull", "Kestrel 3")
    hull = c.project.hull("Kestrel 3")
    assert hull.outline[3] == (84.0, -9.0)
    balance_before = c.balance()
    qtbot.mousePress(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, (84.0, -9.0)))
    )
    assert window.board.selection == ("vertex", "Kestrel 3", 3)
    # a valid move first: the bow corner 2 m further forward
    move_with_button(view, view_point(view, *_site(pose, (86.0, -9.0))))
    valid = c.project.hull("Kestrel 3")
    assert valid.outline[3][0] == pytest.approx(86.0, abs=1.0 / view.pixels_per_metre())
    valid_balance = c.balance()
    assert valid_balance != balance_before
    assert window.board.stale is None
    # now across the port side: edge 2-3 would cross edge 5-6 (the port side at y = 12)
    move_with_button(view, view_point(view, *_site(pose, (40.0, 30.0))))
    assert c.project.hull("Kestrel 3") == valid  # the solver never saw it
    assert c.balance() == valid_balance  # the last valid balance stays
    assert window.board.stale is not None and "crosses itself" in window.board.stale
    assert window.balance_panel.stale.isVisible()
    drawing = window.board.bodies["Kestrel 3"].hulls["Kestrel 3"]
    assert drawing.invalid.isVisible()
    # released while invalid: the last valid outline is kept, as one undo step
    qtbot.mouseRelease(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, (40.0, 30.0)))
    )
    assert c.project.hull("Kestrel 3") == valid
    assert window.board.stale is None
    assert not drawing.invalid.isVisible()
    c.undo_stack.undo()
    assert c.project.hull("Kestrel 3").outline == hull.outline


def test_double_click_inserts_a_vertex_and_delete_removes_it(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    n = len(c.project.hull("Kestrel 3").outline)
    at = view_point(view, *_site(pose, (40.0, 12.0)))
    qtbot.mouseDClick(view.viewport(), Qt.MouseButton.LeftButton, pos=at)
    hull = c.project.hull("Kestrel 3")
    assert len(hull.outline) == n + 1
    sel = window.board.selection
    assert sel[0] == "vertex"
    assert hull.outline[sel[2]][1] == pytest.approx(12.0, abs=1e-9)
    view.setFocus()
    QTest.keyClick(view.viewport(), Qt.Key.Key_Delete)
    assert len(c.project.hull("Kestrel 3").outline) == n


def test_slide_a_line_point_along_the_hull(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    qtbot.mousePress(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, (5.0, 12.0)))
    )
    assert window.board.selection == ("fitting", "Kestrel 3", "Port quarter bitt")
    for x in (10.0, 20.0, 30.0):
        move_with_button(view, view_point(view, *_site(pose, (x, 15.0))))
        f = c.project.hull("Kestrel 3").fitting("Port quarter bitt")
        assert f.y == pytest.approx(12.0, abs=1e-9)  # stays on the side
        assert f.x == pytest.approx(x, abs=1.0 / view.pixels_per_metre())
        _panel_matches_core(window)
    qtbot.mouseRelease(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, (30.0, 15.0)))
    )


def test_drag_a_tug_on_a_lashed_group(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    from tests.conftest import SAMPLES

    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    window.view.fit_to_hull()
    c = window.controller
    view = window.view
    name = c.main_body()
    assert len(body_of(c.project, name).members) == 2  # the sample's two lashed barges
    pose = _pose(window, name)
    share = c.balance().shares[0]
    start = view_point(view, *_site(pose, share.position))
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    assert window.board.selection == ("tug", share.tug)
    s0 = view.mapToScene(start)
    for k in range(1, 8):
        px = start + QPointF(10 * k, 6 * k).toPoint()
        move_with_button(view, px)
        _panel_matches_core(window)
        # the tug's end of the line moved with the cursor, in the site
        now = next(s for s in c.balance().shares if s.tug == share.tug)
        moved = _site(pose, now.position) - _site(pose, share.position)
        m = view.mapToScene(px)
        assert moved == pytest.approx(np.array([m.x() - s0.x(), m.y() - s0.y()]), abs=1e-6)
    qtbot.mouseRelease(
        view.viewport(), Qt.MouseButton.LeftButton, pos=start + QPointF(70, 42).toPoint()
    )
    assert c.balance().shares[0] != share
    _panel_matches_core(window)


def _tug_drawing(window, tug: str):  # type: ignore[no-untyped-def]
    return next(b.tugs[tug] for b in window.board.bodies.values() if tug in b.tugs)


@pytest.mark.parametrize("ending", ["escape", "edit under the drag"])
def test_a_drag_ended_without_a_release_leaves_the_tug_in_its_resting_look(
    window, qtbot, ending: str
) -> None:  # type: ignore[no-untyped-def]
    from app.board.items import CACHE, FIXED_CACHE, NO_CACHE

    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    start_px = view_point(view, *_site(pose, share.position))
    before = c.project
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start_px)
    for k in range(1, 4):
        move_with_button(view, start_px + QPointF(15 * k, 10 * k).toPoint())
    dragged = _tug_drawing(window, "Gannet")
    assert dragged.glyph.cacheMode() == NO_CACHE  # drawn directly while dragged
    if ending == "escape":
        QTest.keyClick(view.viewport(), Qt.Key.Key_Escape)
        assert c.project == before
    else:  # the plan changed under the drag: the next move drops it
        window.board.interaction.step_setting("Puffin", 0.10)
        move_with_button(view, start_px + QPointF(60, 40).toPoint())
    assert window.board.interaction.drag is None
    for drawing in {id(dragged): dragged, 0: _tug_drawing(window, "Gannet")}.values():
        assert drawing.glyph.cacheMode() == CACHE
        assert drawing.label.cacheMode() == FIXED_CACHE


def test_right_clicks_leave_no_menus_behind(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    from PySide6.QtCore import QTimer
    from PySide6.QtGui import QContextMenuEvent
    from PySide6.QtWidgets import QApplication, QMenu

    view = window.view
    vp = view.viewport()
    tug = _tug_drawing(window, "Gannet").glyph
    places = [view.mapFromScene(tug.sceneBoundingRect().center()), QPointF(5, 5).toPoint()]

    def right_click(k: int) -> None:
        pt = places[k % 2]  # a tug (a menu with a submenu), then open water
        QTimer.singleShot(0, lambda: window.board.last_menu.close())  # the user answers
        ev = QContextMenuEvent(QContextMenuEvent.Reason.Mouse, pt, vp.mapToGlobal(pt))
        QApplication.sendEvent(vp, ev)
        qtbot.wait(5)

    counts = []
    for k in range(20):
        right_click(k)
        counts.append(len(view.findChildren(QMenu)))
    assert max(counts) <= 2  # at most the one just closed, with its submenu, going
    qtbot.waitUntil(lambda: not view.findChildren(QMenu), timeout=2000)


def test_keys_after_an_undo_took_the_selected_vertex_away(window, qtbot, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    """Insert a vertex on the closing edge (it is selected, the last one), undo the
    insertion, press the arrow and Delete keys: the selection is dropped with the vertex,
    and no key reaches for it."""
    import sys

    faults: list[BaseException] = []
    monkeypatch.setattr(sys, "excepthook", lambda t, e, tb: faults.append(e))
    c = window.controller
    view = window.view
    pose = _pose(window, "Kestrel 3")
    outline = c.project.hull("Kestrel 3").outline
    qtbot.mouseDClick(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, (0.0, 2.0)))
    )
    assert outline[-1][0] == outline[0][0] == 0.0  # the closing edge runs along x = 0
    sel = window.board.selection
    assert sel[0] == "vertex" and sel[2] == len(outline)  # the new vertex, one past the old last
    c.undo_stack.undo()
    assert c.project.hull("Kestrel 3").outline == outline
    assert window.board.selection != sel  # it went with the vertex
    view.setFocus()
    for key in (Qt.Key.Key_Down, Qt.Key.Key_Right, Qt.Key.Key_Delete):
        QTest.keyClick(view.viewport(), key)
    assert not faults
    assert c.project.hull("Kestrel 3").outline == outline


def test_a_selection_exists_only_while_what_it_names_does(window) -> None:  # type: ignore[no-untyped-def]
    from app.board.scene import selection_exists

    p = window.controller.project
    hull = p.hull("Kestrel 3")
    n = len(hull.outline)
    fitting = hull.fittings[0].name
    tug = p.tugs[0].name
    assert selection_exists(p, None)
    assert selection_exists(p, ("hull", "Kestrel 3"))
    assert not selection_exists(p, ("hull", "No such hull"))
    assert selection_exists(p, ("vertex", "Kestrel 3", n - 1))
    assert not selection_exists(p, ("vertex", "Kestrel 3", n))
    assert not selection_exists(p, ("vertex", "Kestrel 3", -1))
    assert selection_exists(p, ("fitting", "Kestrel 3", fitting))
    assert not selection_exists(p, ("fitting", "Kestrel 3", fitting + " gone"))
    assert selection_exists(p, ("tug", tug))
    assert not selection_exists(p, ("tug", tug + " gone"))
    assert not selection_exists(p, ("site", "No such quay"))
    assert not selection_exists(p, ("site_point", "No such quay", 0))
