"""A key, a menu entry or undo that edits the plan while a drag is under way.

The monkey found this: a vertex taken with the mouse, Delete pressed before the button
was let go, and the next mouse move asked for a vertex the outline no longer had
(IndexError). An edit from elsewhere now ends the drag first: Delete and the editing keys
drop the drag (putting back the plan from before it) and then edit; undo works on what was
recorded, never on a half-finished drag; and a drag whose plan changed under it does no
more.
"""

from __future__ import annotations

import math

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

from tests.app.board.conftest import move_with_button, view_point


def _site(pose, p):  # type: ignore[no-untyped-def]
    from core.frames import true_to_site_angle

    a = true_to_site_angle(pose.heading_deg)
    c, s = math.cos(a), math.sin(a)
    return np.array([pose.x + c * p[0] - s * p[1], pose.y + s * p[0] + c * p[1]])


def _pose(window, body):  # type: ignore[no-untyped-def]
    from app.board.poses import pose_in

    return pose_in(window.controller.stage, body)


def test_delete_during_a_vertex_drag_deletes_the_vertex_and_ends_the_drag(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c, view = window.controller, window.view
    pose = _pose(window, "Kestrel 3")
    qtbot.mouseClick(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, (30.0, 3.0)))
    )
    hull = c.project.hull("Kestrel 3")
    last = len(hull.outline) - 1
    corner = hull.outline[last]
    qtbot.mousePress(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, corner))
    )
    assert window.board.selection == ("vertex", "Kestrel 3", last)
    away = (corner[0] - 3.0, corner[1] + 2.0)
    move_with_button(view, view_point(view, *_site(pose, away)))
    assert c.project.hull("Kestrel 3").outline[last] != corner  # the drag is under way
    view.setFocus()
    QTest.keyClick(view.viewport(), Qt.Key.Key_Delete)
    # the vertex went from the outline as it was before the drag; the drag is over
    expected = hull.outline[:last]
    assert c.project.hull("Kestrel 3").outline == expected
    assert not c.previewing and window.board.interaction.drag is None
    # the mouse goes on moving and is let go: nothing more happens, nothing is raised
    move_with_button(view, view_point(view, *_site(pose, (corner[0] - 6.0, corner[1]))))
    qtbot.mouseRelease(
        view.viewport(), Qt.MouseButton.LeftButton, pos=view_point(view, *_site(pose, away))
    )
    assert c.project.hull("Kestrel 3").outline == expected
    c.undo_stack.undo()  # one step puts the vertex back where it was before the drag
    assert c.project.hull("Kestrel 3").outline == hull.outline


def test_undo_during_a_tug_drag_undoes_the_last_edit_and_drops_the_drag(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c, view = window.controller, window.view
    before_step = c.project
    window.board.interaction.step_setting("Gannet", 0.05)
    stepped = c.project
    assert stepped != before_step
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    start = view_point(view, *_site(_pose(window, "Kestrel 3"), share.position))
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    assert window.board.selection == ("tug", "Gannet")
    move_with_button(view, start + start.__class__(40, -30))
    assert c.previewing and c.project != stepped
    window.act_undo.trigger()
    # undo works on what was recorded: the setting step is undone, the half drag is gone
    assert c.project == before_step
    assert not c.previewing
    move_with_button(view, start + start.__class__(80, -10))
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    assert c.project == before_step
    assert window.board.interaction.drag is None
    window.act_redo.trigger()  # and the step is there to redo, as recorded
    assert c.project == stepped
