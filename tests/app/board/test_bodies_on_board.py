"""Moving and turning bodies on the board with real mouse and key events."""

from __future__ import annotations

import math

import numpy as np
import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtTest import QTest

from core.mechanics.bodies import body_of
from core.mechanics.site import Placing, body_pose
from core.units import fmt
from tests.app.board.conftest import move_with_button, view_point

BODY = "Kestrel 3"


def _pose(window, body=BODY):  # type: ignore[no-untyped-def]
    c = window.controller
    return body_pose(c.project, c.stage, body)


def _site(pose, p):  # type: ignore[no-untyped-def]
    """Body-frame point to the site, written out (x forward to the site by the true heading)."""
    a = math.pi / 2 - math.radians(pose.heading_deg)
    return np.array(
        [
            pose.x + math.cos(a) * p[0] - math.sin(a) * p[1],
            pose.y + math.sin(a) * p[0] + math.cos(a) * p[1],
        ]
    )


def _pose_row(window, body=BODY):  # type: ignore[no-untyped-def]
    table = window.plan_ui.stage_details.poses
    for r in range(table.rowCount()):
        if table.item(r, 0).text() == body:
            return [table.item(r, c).text() for c in range(1, 4)]
    raise AssertionError(f"{body} is not in the pose table")


def _table_agrees(window, body=BODY) -> None:  # type: ignore[no-untyped-def]
    pose = _pose(window, body)
    u = window.controller.project.units
    assert _pose_row(window, body) == [
        fmt(u.value(pose.x, "length"), 1),
        fmt(u.value(pose.y, "length"), 1),
        f"{pose.heading_deg % 360:05.1f}",
    ]


def test_drag_a_body_moves_it_with_the_cursor_as_one_undo_step(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c, view = window.controller, window.view
    before = c.project
    pose0 = _pose(window)
    grab = view_point(view, *_site(pose0, (20.0, 5.0)))  # inside the hull, clear of tugs
    steps = c.undo_stack.count()
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=grab)
    assert window.board.selection == ("hull", BODY)
    g = view.mapToScene(grab)
    for k in range(1, 6):
        px = grab + QPointF(14 * k, -9 * k).toPoint()
        move_with_button(view, px)
        m = view.mapToScene(px)
        pose = _pose(window)
        # the reference point moved exactly as far as the cursor, in the site
        assert (pose.x - pose0.x, pose.y - pose0.y) == pytest.approx(
            (m.x() - g.x(), m.y() - g.y()), abs=1e-5
        )
        assert pose.heading_deg == pose0.heading_deg
        _table_agrees(window)  # the stage's pose table follows every move
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=px)
    assert c.undo_stack.count() == steps + 1
    moved = c.project
    c.undo_stack.undo()
    assert c.project == before
    _table_agrees(window)
    c.undo_stack.redo()
    assert c.project == moved


def test_a_click_on_a_body_selects_it_without_an_undo_step(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c, view = window.controller, window.view
    before = c.project
    at = view_point(view, *_site(_pose(window), (20.0, 5.0)))
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=at)
    move_with_button(view, at + QPointF(1, 1).toPoint())  # a wobble of a pixel is no move
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=at)
    assert window.board.selection == ("hull", BODY)
    assert c.project is before


def _knob(window):  # type: ignore[no-untyped-def]
    h = window.board.turn_handle
    assert h.isVisible()
    return h.deviceTransform(window.view.viewportTransform()).map(h.knob()).toPoint()


def test_drag_the_turn_knob_turns_the_body_about_its_centroid(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c, view = window.controller, window.view
    qtbot.mouseClick(
        view.viewport(),
        Qt.MouseButton.LeftButton,
        pos=view_point(view, *_site(_pose(window), (20.0, 5.0))),
    )
    pose0 = _pose(window)
    body = body_of(c.project, BODY)
    centroid0 = _site(pose0, body.centroid)
    knob = _knob(window)
    steps = c.undo_stack.count()
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=knob)
    # round the centroid by 30 degrees counter-clockwise on the chart: bow to port
    cpx = view.mapFromScene(QPointF(*centroid0))
    r = np.array([knob.x() - cpx.x(), knob.y() - cpx.y()], dtype=float)
    for deg in (10, 20, 30):
        a = math.radians(-deg)  # screen y points down, so counter-clockwise is negative
        rot = np.array([[math.cos(a), -math.sin(a)], [math.sin(a), math.cos(a)]]) @ r
        px = QPointF(cpx.x() + rot[0], cpx.y() + rot[1]).toPoint()
        move_with_button(view, px)
        _table_agrees(window)
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=px)
    pose = _pose(window)
    turned = (pose0.heading_deg - pose.heading_deg) % 360.0
    assert turned == pytest.approx(30.0, abs=0.5)  # within the pixel rounding of the cursor
    # the centroid stayed where it was
    assert _site(pose, body.centroid) == pytest.approx(centroid0, abs=1e-6)
    assert c.undo_stack.count() == steps + 1
    c.undo_stack.undo()
    assert _pose(window) == pose0


def test_arrow_keys_nudge_a_body_and_brackets_turn_it(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c, view = window.controller, window.view
    pose0 = _pose(window)
    qtbot.mouseClick(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose0, (20.0, 5.0)))
    )
    view.setFocus()
    steps = c.undo_stack.count()
    QTest.keyClick(view.viewport(), Qt.Key.Key_Right)
    QTest.keyClick(view.viewport(), Qt.Key.Key_Right)
    QTest.keyClick(view.viewport(), Qt.Key.Key_Up, Qt.KeyboardModifier.ShiftModifier)
    pose = _pose(window)
    assert (pose.x - pose0.x, pose.y - pose0.y) == pytest.approx((2.0, 10.0))
    assert c.undo_stack.count() == steps + 1  # three nudges, one undo step
    _table_agrees(window)
    centroid = _site(pose, body_of(c.project, BODY).centroid)
    QTest.keyClick(view.viewport(), Qt.Key.Key_BracketRight)
    QTest.keyClick(view.viewport(), Qt.Key.Key_BracketRight, Qt.KeyboardModifier.ShiftModifier)
    turned = _pose(window)
    assert turned.heading_deg == pytest.approx((pose.heading_deg + 11.0) % 360)  # to starboard
    assert _site(turned, body_of(c.project, BODY).centroid) == pytest.approx(centroid, abs=1e-6)
    assert c.undo_stack.count() == steps + 2
    c.undo_stack.undo()
    c.undo_stack.undo()
    assert _pose(window) == pose0


def test_a_lashed_group_posed_through_a_hull_keeps_that_form(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    from dataclasses import replace

    from tests.conftest import SAMPLES

    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    c = window.controller
    group = c.project.groups[0]
    # pose the group through its second hull, as a file may
    stage = c.stage
    gpose = body_pose(c.project, stage, group.name)
    m = group.members[1]
    placing = Placing.of(gpose)
    hx, hy = placing.point((m.x, m.y))
    from core.model.plan import BodyPose

    member_pose = BodyPose(m.hull, hx, hy, gpose.heading_deg)
    c.apply(c.with_stage(replace(stage, poses=(member_pose,))), "pose through a hull")
    window.view.fit_to_hull()
    assert body_pose(c.project, c.stage, group.name) == pytest.approx(gpose)  # type: ignore[arg-type]
    view = window.view
    inside = _site(gpose, (20.0, -5.0))  # inside the first barge
    qtbot.mouseClick(view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *inside))
    assert window.board.selected_body() == group.name
    view.setFocus()
    QTest.keyClick(view.viewport(), Qt.Key.Key_Left)
    poses = c.stage.poses
    assert [p.body for p in poses] == [m.hull]  # still posed through the hull
    new = body_pose(c.project, c.stage, group.name)
    assert (new.x - gpose.x, new.y - gpose.y) == pytest.approx((-1.0, 0.0), abs=1e-6)


def test_a_lashed_group_s_crossing_names_the_hull_whose_centreline_it_is(window) -> None:  # type: ignore[no-untyped-def]
    # Stage 1 of the bundled Lark pair: the line of action crosses y = 0 of the pair's
    # frame, which is Lark 41's (the first hull lashed), not the pair's middle.
    from app.board.items import Label
    from tests.conftest import SAMPLES

    assert window.open_path(SAMPLES / "twin_barge_move.towboard", ask=False)
    c = window.controller
    c.set_stage_index(0)
    b = c.balance()
    assert b.crossing_shown and b.centreline_x is not None
    x = c.project.units.show(b.centreline_x, "length")
    words = f"crosses Lark 41's centreline at x = {x}"
    assert window.balance_panel.fields["crossing"].text() == (
        f"{words} from Lark 41's reference point"
    )
    assert "origin at Lark 41's reference point." in window.balance_panel.note.text()
    labels = [it.text for it in window.board.items() if isinstance(it, Label)]
    assert f"line of action crosses Lark 41's centreline\nat x = {x}" in labels
