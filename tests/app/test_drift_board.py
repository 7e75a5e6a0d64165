"""The drift preview in the window: the switch and scenario on the toolbar, the ghosts and
track on the board, the panel's numbers and inputs, live while a tug is dragged."""

from __future__ import annotations

import math

import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtWidgets import QGraphicsPathItem

from app.board.drift_layer import DRAG_PAUSE_MS
from core.analysis.stage import stage_result
from core.mechanics.site import Placing, body_pose
from core.motion.drift import DriftScenario
from core.motion.scenarios import drift, drift_setup
from core.motion.summary import ghost_rows, outcome_words
from tests.app.board.conftest import (  # noqa: F401  (fixtures)
    dialogs,
    isolated,
    move_with_button,
    view_point,
    window,
)
from tests.app.editors.conftest import retype_and_enter
from tests.conftest import SAMPLES

TWIN = SAMPLES / "twin_barge_move.towboard"


@pytest.fixture
def twin(window):  # type: ignore[no-untyped-def]  # noqa: F811
    assert window.open_path(TWIN, ask=False)
    window.view.fit_to_hull()
    return window


def _ghost_paths(layer) -> list[QGraphicsPathItem]:  # type: ignore[no-untyped-def]
    return [i for i in layer.items if isinstance(i, QGraphicsPathItem)]


def test_off_until_switched_on(twin) -> None:  # type: ignore[no-untyped-def]
    ui = twin.drift_ui
    assert not ui.layer.enabled and ui.layer.items == []
    assert "Drift preview is off" in ui.panel.outcome.text()
    assert "Drift ghosts" not in twin.caution.text()


def test_worst_tug_lost_is_the_stage_results_own(twin) -> None:  # type: ignore[no-untyped-def]
    c = twin.controller
    c.set_stage_index(3)
    ui = twin.drift_ui
    ui.act_drift.setChecked(True)
    sd = stage_result(c.project, 3).drift
    assert ui.layer.result is sd.worst  # one computation, read by the board
    w = sd.worst
    assert w is not None and w.contact is not None
    text = outcome_words(w, c.project.units)
    assert ui.panel.outcome.text() == text[0].upper() + text[1:]
    assert ui.panel.table.rowCount() == len(ghost_rows(w))
    assert "Drift ghosts: a simple estimate" in twin.caution.text()
    ui.act_drift.setChecked(False)
    assert ui.layer.items == [] and "Drift ghosts" not in twin.caution.text()


def test_each_scenario_on_the_toolbar(twin) -> None:  # type: ignore[no-untyped-def]
    c = twin.controller
    c.set_stage_index(1)  # the swing: three tugs placed
    ui = twin.drift_ui
    box = ui.scenario_box
    names = [box.itemText(i) for i in range(box.count())]
    tugs = [p.tug for p in c.stage.placements]
    assert names == [
        "Worst tug lost",
        *(f"{t} lost" for t in tugs),
        "All lines let go",
        "Pulls as set",
    ]
    ui.act_drift.setChecked(True)
    box.setCurrentIndex(names.index("All lines let go"))
    sd = stage_result(c.project, 1).drift
    r = ui.layer.result
    assert r is sd.let_go and r is not None
    # a ghost per drift time, each member's outline, all on the board
    assert len(r.ghost_times) == len(c.project.drift.times_s)
    members = len(r.problem.outlines)
    track = 1
    assert len(_ghost_paths(ui.layer)) == track + members * len(r.ghost_times)
    box.setCurrentIndex(names.index(f"{tugs[0]} lost"))
    assert ui.layer.result is sd.result(DriftScenario("tug_lost", tugs[0]))
    box.setCurrentIndex(names.index("Pulls as set"))
    expected = drift(c.project, c.stage, DriftScenario("as_set"))
    got = ui.layer.result
    assert got is not None and expected is not None
    assert got.ghost_states == pytest.approx(expected.ghost_states)


def test_the_scenarios_follow_the_tugs_placed_and_nothing_else(twin, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    # every change of the plan (each move of a drag) once made a scenario per tug and read
    # the whole list back from the box: with 200 tugs, a millisecond or more a move
    c = twin.controller
    c.set_stage_index(1)
    box = twin.drift_ui.scenario_box
    made = []
    original = DriftScenario.words
    monkeypatch.setattr(DriftScenario, "words", lambda s: made.append(s) or original(s))
    stage = c.stage
    p = stage.placements[0]
    c.apply(c.with_stage(stage.with_placement(p.with_setting(1.0 - p.setting))), "edit")
    assert made == []  # the same tugs: nothing made again
    c.apply(c.project.without_tug(p.tug), "remove")
    names = [box.itemText(i) for i in range(box.count())]
    assert f"{p.tug} lost" not in names
    assert names[1:-2] == [f"{q.tug} lost" for q in c.stage.placements]
    c.undo_stack.undo()
    assert [box.itemText(i) for i in range(box.count())][1:-2] == [
        f"{q.tug} lost" for q in c.stage.placements
    ]


def test_ghosts_lie_where_the_core_puts_the_body(twin) -> None:  # type: ignore[no-untyped-def]
    c = twin.controller
    c.set_stage_index(1)
    ui = twin.drift_ui
    ui.act_drift.setChecked(True)
    ui.set_scenario(DriftScenario("let_go"))
    r = ui.layer.result
    first = r.outlines_at(r.ghost_states[0])[0]
    paths = _ghost_paths(ui.layer)
    drawn = paths[1].path()  # after the track: the first member at the first time
    assert drawn.elementCount() == len(first) + 1
    for k, (x, y) in enumerate(first):
        e = drawn.elementAt(k)
        assert (e.x, e.y) == pytest.approx((x, y), abs=1e-6)


def test_dragging_a_tug_updates_the_ghosts_after_a_pause(twin, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = twin.controller
    c.set_stage_index(3)
    ui = twin.drift_ui
    ui.act_drift.setChecked(True)
    ui.set_scenario(DriftScenario("as_set"))
    before = ui.layer.result
    view = twin.view
    pose = body_pose(c.project, c.stage, "Lark pair")
    share = next(s for s in c.balance("Lark pair").shares if s.tug == "Sedge")
    start = Placing.of(pose).point(share.position)
    start_px = view_point(view, *start)
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start_px)
    assert twin.board.selection == ("tug", "Sedge")
    for k in range(1, 6):
        px = start_px + QPointF(0, 12 * k).toPoint()
        move_with_button(view, px)
        assert ui.layer.pending  # waits for the drag to pause
    qtbot.wait(DRAG_PAUSE_MS * 3)
    qtbot.waitUntil(lambda: not ui.layer.pending, timeout=5000)
    assert c.previewing
    # the ghosts now are the drift of the value being dragged, from the core
    setup = drift_setup(c.project, c.stage, "Lark pair")
    expected = drift(c.project, c.stage, DriftScenario("as_set"), setup=setup)
    got = ui.layer.result
    assert got is not None and expected is not None and got is not before
    assert got.ghost_states == pytest.approx(expected.ghost_states, rel=1e-9, abs=1e-9)
    qtbot.mouseRelease(view.viewport(), Qt.MouseButton.LeftButton, pos=px)
    assert not c.previewing and not ui.layer.pending


def test_panel_inputs_write_back_and_undo(twin, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = twin.controller
    p = twin.drift_ui.panel
    before = c.project
    retype_and_enter(qtbot, p.times, "20, 45,90")
    assert c.project.drift.times_s == (20.0, 45.0, 90.0)
    retype_and_enter(qtbot, p.horizon, "300")
    assert c.project.drift.horizon_s == 300.0
    p.hulls.item(0, 1).setText("22.5")
    assert c.project.hulls[0].yaw_gyradius_m == pytest.approx(22.5)
    box = p.hulls.cellWidget(1, 2)
    box.setCurrentIndex(1)
    assert c.project.hulls[1].added_mass_method == "ship"
    for _ in range(4):
        c.undo_stack.undo()
    assert c.project == before


def test_bad_panel_input_is_refused_in_words(twin, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = twin.controller
    p = twin.drift_ui.panel
    before = c.project
    with qtbot.waitSignal(c.message) as msg:
        retype_and_enter(qtbot, p.times, "60, 30")
    assert "must be in increasing order" in msg.args[0]
    with qtbot.waitSignal(c.message) as msg:
        p.hulls.item(0, 1).setText("-4")
    assert "yaw radius of gyration" in msg.args[0] and "must be positive" in msg.args[0]
    assert c.project == before
    # typed with real keys, the refused figures stay in the field being typed in, to be
    # put right (nothing lost); the plan keeps its own
    assert p.times.text() == "60, 30"
    assert c.project.drift.times_s == (30.0, 60.0, 120.0)


def test_a_stage_that_cannot_drift_says_why(twin) -> None:  # type: ignore[no-untyped-def]
    from dataclasses import replace

    c = twin.controller
    p = c.project
    c.apply(p.with_hull(replace(p.hulls[0], draught_m=None, displacement_kg=None)), "no draught")
    ui = twin.drift_ui
    ui.act_drift.setChecked(True)
    assert ui.layer.result is None and ui.layer.items == []
    assert ui.panel.outcome.text().startswith("No drift to show: drift not worked out:")
    assert math.isfinite(len(ui.panel.outcome.text()))
