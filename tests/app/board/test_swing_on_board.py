"""A swing stage's headings: typed in the stage details, set from the board, drawn on it."""

from __future__ import annotations

import math

import pytest
import shapely
from PySide6.QtCore import Qt
from PySide6.QtGui import QContextMenuEvent
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication
from shapely import affinity

from core.mechanics.bodies import body_of
from core.mechanics.site import body_pose, place_body
from core.model.swing import Swing
from tests.app.board.conftest import view_point


def _type(field, text: str) -> None:  # type: ignore[no-untyped-def]
    field.setFocus()
    field.selectAll()
    QTest.keyClick(field, Qt.Key.Key_Delete)
    QTest.keyClicks(field, text)
    QTest.keyClick(field, Qt.Key.Key_Return)
    field.clearFocus()
    QApplication.processEvents()


def test_the_swing_fields_follow_the_stage_both_ways(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    form = window.plan_ui.stage_details
    c.set_stage_index(0)  # an unberth stage with no swing: no swing fields
    assert not form.swing_box.isVisibleTo(window)
    c.set_stage_index(1)
    assert form.swing_box.isVisibleTo(window)
    assert (form.swing_start.text(), form.swing_end.text()) == ("090.0", "270.0")
    assert form.swing_side.currentData() == "port"
    assert form.swing_turn.text() == "a turn of 180°"
    assert form.swing_turn.toolTip() == "swings bow to port 180° from 090.0° to 270.0°"
    _type(form.swing_end, "0")
    assert c.stage.swing == Swing(90.0, 0.0, "port")
    assert form.swing_turn.text() == "a turn of 90°"
    form.swing_side.setCurrentIndex(form.swing_side.findData("starboard"))
    assert c.stage.swing == Swing(90.0, 0.0, "starboard")
    assert form.swing_turn.toolTip().startswith("swings bow to starboard 270°")
    said: list[str] = []
    c.message.connect(said.append)
    _type(form.swing_end, "90")  # the same as the start: refused, the plan's value shown
    assert c.stage.swing == Swing(90.0, 0.0, "starboard")
    assert "must differ from the start heading" in said[-1]
    assert form.swing_end.text() == "000.0"
    # both cleared: no swing; one given alone waits for the other
    _type(form.swing_start, "")
    assert c.stage.swing == Swing(90.0, 0.0, "starboard")
    assert "both" in said[-1]
    _type(form.swing_end, "")
    assert c.stage.swing is None
    c.undo_stack.undo()
    assert c.stage.swing == Swing(90.0, 0.0, "starboard")
    assert form.swing_end.text() == "000.0"  # the model back in the fields


def _ring(path) -> shapely.Polygon:  # type: ignore[no-untyped-def]
    poly = path.toFillPolygon()
    return shapely.Polygon([(p.x(), p.y()) for p in poly])


def test_the_swing_is_drawn_at_its_start_and_end_headings(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    c.set_stage_index(1)  # the sample swings 090 -> 270 to port
    layer = window.plan_ui.swing
    project, stage = c.project, c.stage
    pose = body_pose(project, stage, "Kestrel 3")
    body = body_of(project, "Kestrel 3")
    placed = place_body(body, pose).polygon
    centroid = place_body(body, pose).placing.point(body.centroid)
    for ghost, heading in zip(layer.ghosts, (90.0, 270.0), strict=True):
        assert ghost.isVisible()
        # the body turned about its centroid, by shapely (clockwise is a negative angle there)
        expected = affinity.rotate(placed, -(heading - pose.heading_deg), origin=centroid)
        assert _ring(ghost.path()).symmetric_difference(expected).area == pytest.approx(
            0.0, abs=1e-3
        )
    # the arrow ends on the end heading's side of the centroid, having swept counter-clockwise
    _shaft, head = layer.arc.parts()
    tip = head.at(0)
    end = math.atan2(tip.y() - centroid[1], tip.x() - centroid[0])
    assert math.degrees(end) % 360 == pytest.approx((90.0 - 270.0) % 360, abs=0.5)
    assert layer.words.text == "swings bow to port 180°"
    # a stage with no swing draws none
    c.set_stage_index(0)
    assert not any(item.isVisible() for item in layer.items())


def test_the_swing_is_set_from_where_the_body_lies(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    view = window.view
    c.set_stage_index(1)
    view.fit_to_hull()
    pose = window.board.pose("Kestrel 3")
    a = math.pi / 2 - math.radians(pose.heading_deg)
    x, y = 20.0, 5.0
    at = (pose.x + math.cos(a) * x - math.sin(a) * y, pose.y + math.sin(a) * x + math.cos(a) * y)

    def menu():  # type: ignore[no-untyped-def]
        pt = view_point(view, *at)
        ev = QContextMenuEvent(QContextMenuEvent.Reason.Mouse, pt, view.viewport().mapToGlobal(pt))
        QApplication.sendEvent(view.viewport(), ev)
        return window.board.last_menu

    m = menu()
    texts = [x.text() for x in m.actions()]
    m.close()
    assert "Lie at the swing's end (270.0°)" in texts
    next(x for x in m.actions() if x.text() == "Lie at the swing's end (270.0°)").trigger()
    assert window.board.pose("Kestrel 3").heading_deg == pytest.approx(270.0)
    QTest.keyClick(view.viewport(), Qt.Key.Key_BracketRight, Qt.KeyboardModifier.ShiftModifier)
    m = menu()
    next(x for x in m.actions() if x.text() == "Swing ends on this heading (280.0°)").trigger()
    m.close()
    assert c.stage.swing == Swing(90.0, 280.0, "port")
