"""Conditions, solve pulls, live solving, checks and the hold limits plot in the window."""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest
from PySide6.QtCore import QPointF, Qt
from PySide6.QtGui import QColor, QImage, QPainter
from PySide6.QtWidgets import QMessageBox

from app.board.conditions_layer import draw_conditions_card
from app.panels.conditions import EfficiencyDialog
from app.panels.hold_plot import ALL_TUGS
from core.analysis.stage import balance_of
from core.errors import InputError
from core.io.report_parts import conditions_lines
from core.mechanics.bodies import body_of
from core.mechanics.loads import body_conditions, load_words
from core.model.goals import Goal
from core.solve.holdlimits import hold_limits, hold_limits_problem, limit_words
from core.solve.pulls import pulls_problem, solve_pulls, tug_lost_check
from core.units import DisplayUnits
from tests.app.board.conftest import move_with_button, view_point
from tests.core.plan_builders import twin_swing_in_wind

KNOT = 1852 / 3600


def _type(qtbot, edit, text: str) -> None:  # type: ignore[no-untyped-def]
    edit.setFocus()
    edit.selectAll()
    if text:
        qtbot.keyClicks(edit, text)  # replaces the selection
    else:
        qtbot.keyClick(edit, Qt.Key.Key_Delete)
    qtbot.keyClick(edit, Qt.Key.Key_Return)
    edit.clearFocus()


# -- the conditions panel -------------------------------------------------------------


def test_typing_the_wind_speed_edits_the_stage_as_one_undo_step(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    panel = window.solve_ui.conditions
    # The sample's first stage has 12 kn of wind; the panel shows it in knots.
    assert panel.edits["wind_speed_ms"].text() == "12"
    steps = c.undo_stack.count()
    _type(qtbot, panel.edits["wind_speed_ms"], "20")
    assert c.stage.conditions.wind_speed_ms == pytest.approx(20 * KNOT)
    assert c.undo_stack.count() == steps + 1
    c.undo_stack.undo()
    assert c.stage.conditions.wind_speed_ms == pytest.approx(12 * KNOT)
    assert panel.edits["wind_speed_ms"].text() == "12"


def test_a_bad_number_is_refused_and_said(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    before = c.project
    panel = window.solve_ui.conditions
    with qtbot.waitSignal(c.message, timeout=2000) as sig:
        _type(qtbot, panel.edits["gust_factor"], "lots")
    assert "is not a number" in sig.args[0]
    assert c.project is before
    with qtbot.waitSignal(c.message, timeout=2000) as sig:
        _type(qtbot, panel.edits["gust_factor"], "0.5")
    assert "gust factor: 0.5 must be at least 1" in sig.args[0]
    assert c.project is before


def test_an_area_is_entered_and_cleared_back_to_auto(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    e = window.solve_ui.conditions.edits["wind_area_beam_m2"]
    # Blank: the outline's length times the freeboard (84 m x 2.9 m for the sample's hull).
    assert e.text() == ""
    assert "243.6" in e.placeholderText()
    _type(qtbot, e, "500")
    assert c.stage.conditions.wind_area_beam_m2 == pytest.approx(500.0)
    _type(qtbot, e, "")
    assert c.stage.conditions.wind_area_beam_m2 is None


def test_the_centre_of_pressure_choice_edits_the_stage_and_follows_it(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    box = window.solve_ui.conditions.centre_choice
    assert box.currentData() == "moving" == c.stage.conditions.pressure_centre
    # Choose "fixed" with real key presses on the focused combo box.
    box.setFocus()
    qtbot.keyClick(box, Qt.Key.Key_Down)
    assert c.stage.conditions.pressure_centre == "fixed"
    c.undo_stack.undo()
    assert c.stage.conditions.pressure_centre == "moving"
    assert box.currentData() == "moving"
    stage = c.stage
    c.apply(
        c.with_stage(replace(stage, conditions=replace(stage.conditions, pressure_centre="fixed"))),
        "fixed centre",
    )
    assert box.currentData() == "fixed"


def test_the_wind_and_current_are_loads_in_the_balance(window) -> None:  # type: ignore[no-untyped-def]
    c = window.controller
    b = c.balance()
    ref = balance_of(c.project, c.stage, b.body)
    assert [ld.name for ld in b.loads] == ["wind", "current"]
    assert b.net_force == pytest.approx(ref.net_force, rel=1e-12)
    assert b.moment_centroid_nm == pytest.approx(ref.moment_centroid_nm, rel=1e-12)
    u = c.project.units
    assert window.balance_panel.fields["net"].text() == u.show(ref.net_magnitude, "force")


def test_the_panel_says_what_the_body_feels(window) -> None:  # type: ignore[no-untyped-def]
    text = window.solve_ui.conditions.effect.text()
    c = window.controller
    cl = body_conditions(c.stage, body_of(c.project, "Kestrel 3"))
    assert f"Wind from {cl.wind_from_rel_deg:03.0f}° relative" in text
    assert "Wind load" in text and "Current load" in text


def test_the_panel_words_each_load_as_the_report_does(window) -> None:  # type: ignore[no-untyped-def]
    # The sample's swing stage in 40 kn: the wind load's own moment turns the pair (see
    # tests/core/test_report_conditions.py), though it is within the whole balance's
    # negligible moment; the panel says so with its sign, in the report's words.
    c = window.controller
    c.reset(twin_swing_in_wind(40.0))
    c.set_stage_index(1)
    text = window.solve_ui.conditions.effect.text().splitlines()
    br = c.stage_result().body("Lark pair")
    report = conditions_lines(c.stage, br, c.project.units)
    for ld in br.conditions.loads:
        words = load_words(ld, br.body, c.project.units)
        assert f"{ld.name.capitalize()} load {words}" in text
        assert any(line.endswith(words) for line in report)
    wind = next(line for line in text if line.startswith("Wind load"))
    assert "t·m about the centroid, swings bow to starboard" in wind
    assert ", -1" in wind  # the moment's sign, as the report prints it


def test_the_efficiency_table_dialog_builds_and_refuses(qtbot, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    from core.model.efficiency import EfficiencyTable

    u = DisplayUnits()
    dlg = EfficiencyDialog(EfficiencyTable(), u)
    qtbot.addWidget(dlg)
    dlg.pulls.setText("30, 60")
    dlg.seas.setText("0, 4")
    dlg._reshape()
    dlg.grid.item(1, 1).setText("0.75")
    table = dlg.build()
    assert table.bollard_pulls_n == pytest.approx((30 * 9806.65, 60 * 9806.65))
    assert table.sea_states == (0.0, 4.0)
    assert table.values[1][1] == pytest.approx(0.75)
    said = []
    monkeypatch.setattr(QMessageBox, "warning", lambda *a: said.append(a[2]))
    dlg.grid.item(0, 1).setText("1.4")
    dlg._accept()
    assert dlg.table is None
    assert said and "efficiency table row 1: efficiency: 1.4 must be at most 1" in said[0]


# -- solving ----------------------------------------------------------------------------


def _choose_goal(qtbot, panel, kind: str) -> None:  # type: ignore[no-untyped-def]
    """Pick a goal kind in the combo box with the keyboard, as a person would."""
    box = panel.kind
    box.setFocus()
    while box.currentData() != kind:
        qtbot.keyClick(box, Qt.Key.Key_Down)
        assert box.currentIndex() < box.count()


def test_solve_pulls_without_a_goal_asks_for_one(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    panel = holding.solve_ui.solve_panel
    before = c.project
    assert c.stage.goal is None
    with qtbot.waitSignal(c.message, timeout=2000) as sig:
        qtbot.mouseClick(panel.solve_button, Qt.MouseButton.LeftButton)
    assert "no goal" in sig.args[0]
    assert c.project is before
    panel.recheck()
    assert panel.outcome.text().startswith("No goal set: the pulls as set")


def test_solve_pulls_fills_every_setting_in_one_undo_step(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    panel = holding.solve_ui.solve_panel
    _choose_goal(qtbot, panel, "hold")
    assert c.stage.goal == Goal("hold")  # choosing the goal is an edit of the stage
    before = c.project
    steps = c.undo_stack.count()
    qtbot.mouseClick(panel.solve_button, Qt.MouseButton.LeftButton)
    assert c.undo_stack.count() == steps + 1
    stage = c.stage
    assert stage.goal == Goal("hold")
    ref = solve_pulls(pulls_problem(before, before.stages[0], goal=Goal("hold")))
    assert ref.feasible
    settings = [stage.placement(p.tug).setting for p in ref.problem.placements]
    assert settings == pytest.approx(list(ref.settings), abs=1e-12)
    # The stage now holds: tugs plus conditions sum to nothing, on the board's balance.
    b = c.balance()
    tol = 1e-6 * 30 * 9806.65
    assert np.abs(b.net_force).max() <= tol
    assert abs(b.moment_centroid_nm) <= tol * 80
    c.undo_stack.undo()
    assert c.project == before


def test_a_walk_goal_typed_in_the_display_units(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    panel = holding.solve_ui.solve_panel
    _choose_goal(qtbot, panel, "walk")
    assert not panel.fx.isEnabled() and not panel.mz.isEnabled()  # a walk is sideways only
    _type(qtbot, panel.fy, "10")  # 10 t to port on top of holding the wind
    assert c.stage.goal == Goal("walk", 0.0, 10 * 9806.65, 0.0)
    panel.solve()
    assert c.stage.goal == Goal("walk", 0.0, 10 * 9806.65, 0.0)
    b = c.balance()
    assert b.net_force == pytest.approx((0.0, 10 * 9806.65), abs=1e-3)


def test_an_impossible_goal_sets_the_closest_state_and_says_what_is_missing(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    panel = holding.solve_ui.solve_panel
    _choose_goal(qtbot, panel, "walk")
    _type(qtbot, panel.fy, "-50")  # 50 t to starboard: nothing pulls that way
    with qtbot.waitSignal(c.message, timeout=2000) as sig:
        panel.solve()
    assert "out of reach" in sig.args[0] and "more to starboard" in sig.args[0]
    panel.recheck()
    assert "out of reach" in panel.outcome.text()


def test_live_solving_follows_a_drag(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    ui = holding.solve_ui
    _choose_goal(qtbot, ui.solve_panel, "hold")  # live solving needs a goal
    ui.solve_panel.live.setChecked(True)
    assert ui.act_live.isChecked()
    view = holding.view
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    from app.board.poses import pose_in, to_site

    start = view_point(view, *to_site(pose_in(c.stage, "Barge"), share.position))
    steps = c.undo_stack.count()
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    for k in range(1, 8):
        move_with_button(view, start + QPointF(-8 * k, -5 * k).toPoint())
        stage = c.stage
        ref = solve_pulls(pulls_problem(c.project, stage, goal=Goal("hold")))
        for p, s in zip(ref.problem.placements, ref.settings, strict=True):
            assert stage.placement(p.tug).setting == pytest.approx(float(s), abs=1e-9)
        # The board's balance (patched on the drag's fast path) is the core's for this value.
        b, core_b = c.balance(), balance_of(c.project, stage, "Barge")
        assert b.net_force == pytest.approx(core_b.net_force, rel=1e-9, abs=1e-6)
        assert b.moment_centroid_nm == pytest.approx(core_b.moment_centroid_nm, rel=1e-9, abs=1e-4)
        assert [sh.pull_n for sh in b.shares] == pytest.approx([sh.pull_n for sh in core_b.shares])
    qtbot.mouseRelease(
        view.viewport(), Qt.MouseButton.LeftButton, pos=start + QPointF(-56, -35).toPoint()
    )
    assert c.undo_stack.count() == steps + 1  # the whole drag, solved settings and all
    ui.solve_panel.live.setChecked(False)
    assert c.edit_filters == []


@pytest.mark.parametrize("live", [False, True])
def test_a_drag_works_each_moves_balance_out_once(holding, qtbot, monkeypatch, live) -> None:  # type: ignore[no-untyped-def]
    """A tug drag's move works the balance out once, for the plan shown: with live
    solving, for the solved settings (it was also worked out for the settings before
    solving, and thrown away), else for the one moved row."""
    import app.board.interaction as interaction
    import app.controller as controller
    from app.board.poses import pose_in, to_site
    from core.mechanics import balance

    c = holding.controller
    ui = holding.solve_ui
    _choose_goal(qtbot, ui.solve_panel, "hold")
    ui.solve_panel.live.setChecked(live)
    worked: list[bool] = []
    real = balance.analyse_layout

    def counted(*a, **k):  # type: ignore[no-untyped-def]
        worked.append("changed_row" in k)
        return real(*a, **k)

    for module in (balance, controller, interaction):  # wherever the board may call it
        monkeypatch.setattr(module, "analyse_layout", counted, raising=False)
    share = next(s for s in c.balance().shares if s.tug == "Gannet")
    start = view_point(holding.view, *to_site(pose_in(c.stage, "Barge"), share.position))
    qtbot.mousePress(holding.view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    for k in range(1, 6):
        worked.clear()
        move_with_button(holding.view, start + QPointF(-8 * k, -5 * k).toPoint())
        assert worked == [not live]  # once; the one row's update without live solving
        b, core_b = c.balance(), balance_of(c.project, c.stage, "Barge")
        assert b.net_force == pytest.approx(core_b.net_force, rel=1e-9, abs=1e-6)
        assert b.moment_centroid_nm == pytest.approx(core_b.moment_centroid_nm, rel=1e-9, abs=1e-4)
    qtbot.mouseRelease(holding.view.viewport(), Qt.MouseButton.LeftButton, pos=start)


def test_live_solving_in_a_drag_keeps_working_sectors_at_their_leads(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    """The pontoon sample's tugs have working sectors. Live solving sets the settings for
    the leads as they are (the dragged one where the mouse puts it), so the pulls meet the
    goal on every move; it once solved over the sectors, applied only the settings to the
    leads as set, and the stage read "the pulls as set miss the goal" all through a drag."""
    from app.board.poses import pose_in, to_site
    from core.analysis.stage import stage_result

    root = Path(__file__).resolve().parents[3]
    assert window.open_path(root / "sample_projects" / "pontoon_swing.towboard", ask=False)
    c = window.controller
    c.set_stage_index(1)  # holding off the berth, every tug with a working sector
    assert all(p.lead_sector_rad is not None for p in c.stage.placements)
    window.solve_ui.set_live(True)
    share = max(c.balance().shares, key=lambda s: s.pull_n)
    view = window.view
    window.view.fit_to_hull()
    start = view_point(view, *to_site(pose_in(c.stage, share.hull), share.position))
    qtbot.mousePress(view.viewport(), Qt.MouseButton.LeftButton, pos=start)
    leads_seen = set()
    for k in range(1, 6):
        move_with_button(view, start + QPointF(6 * k, 9 * k).toPoint())
        stage = c.stage
        leads_seen.add(round(stage.placement(share.tug).lead_rad, 6))
        fixed = replace(stage, placements=tuple(p.with_sector(None) for p in stage.placements))
        ref = solve_pulls(pulls_problem(c.project, fixed, goal=stage.goal))
        assert ref.feasible
        for p, s in zip(ref.problem.placements, ref.settings, strict=True):
            assert stage.placement(p.tug).setting == pytest.approx(float(s), abs=1e-9)
        codes = [r.code for r in stage_result(c.project, c.stage_index).verdict.reasons]
        assert "pulls_miss_goal" not in codes
        assert stage.placement(share.tug).lead_sector_rad is not None  # the sector is kept
    qtbot.mouseRelease(
        view.viewport(), Qt.MouseButton.LeftButton, pos=start + QPointF(30, 45).toPoint()
    )
    assert len(leads_seen) > 1  # the drag turned the lead
    window.solve_ui.set_live(False)


def test_checks_flag_a_tug_over_its_fitting_on_the_board_and_the_table(holding) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    stage = c.stage
    hull = c.project.hull("Barge")
    weak = hull.with_fitting(replace(hull.fitting("bow"), swl_n=5 * 9806.65))
    project = c.project.with_hull(weak)
    tern = stage.placement("Tern").with_setting(1.0)  # 20 t on a 5 t fitting
    c.apply(project.with_stage(stage.with_placement(tern), c.stage_index), "over")
    panel = holding.solve_ui.solve_panel
    panel.recheck()
    assert "over fitting SWL" in panel.notes["Tern"]
    assert "over fitting SWL" in holding.board.tug_notes["Tern"]
    model = holding.tugs_panel.model
    col = model.columnCount() - 1
    row = model.row_of("Tern")
    assert "over fitting SWL" in model.data(model.index(row, col))


def test_a_setting_over_100_percent_cannot_be_made(holding) -> None:  # type: ignore[no-untyped-def]
    stage = holding.controller.stage
    with pytest.raises(InputError, match=r"tug Tern: setting: 120\.0 % must be at most 100 %"):
        stage.placement("Tern").with_setting(1.2)


def test_tug_lost_table_is_the_cores_check(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    panel = holding.solve_ui.solve_panel
    _choose_goal(qtbot, panel, "hold")
    panel.recheck()
    ref = tug_lost_check(pulls_problem(c.project, c.stage, goal=Goal("hold")))
    assert ref.full.feasible
    rows = {panel.lost.item(r, 0).text(): panel.lost.item(r, 1).text() for r in range(4)}
    assert rows == {case.tug: "holds" if case.holds else "fails" for case in ref.cases}
    assert ("FAILS" in panel.lost_title.text()) is (not ref.passes)
    assert ref.worst is not None and ref.worst.tug in panel.lost_title.text()
    for case in ref.cases:
        assert ("goal fails without it" in panel.notes.get(case.tug, [])) is (not case.holds)


def test_losing_the_big_tug_fails_and_is_flagged(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    # A 36 m/s wind from the port beam pushes 0.5 * 1.225 * 1.2 * (80 * 4) * 36^2 = 31 t to
    # starboard at the centroid. Without the bow or the quarter tug, the pair cannot pull
    # to port without swinging the barge, and the 25 t pusher amidships is not enough.
    c = holding.controller
    from dataclasses import replace

    stage = c.stage
    c.apply(
        c.with_stage(replace(stage, conditions=replace(stage.conditions, wind_speed_ms=36.0))),
        "gale",
    )
    panel = holding.solve_ui.solve_panel
    _choose_goal(qtbot, panel, "hold")
    panel.recheck()
    assert panel.check is not None and panel.check.full.feasible
    assert "FAILS" in panel.lost_title.text()
    # the headline names the tugs whose loss fails the goal: any one, not all of them lost
    failing = [case.tug for case in panel.check.cases if not case.holds]
    assert failing[:2] == ["Gannet", "Puffin"] and "Skua" not in failing
    words = ", ".join(failing[:-1]) + " or " + failing[-1]
    assert f"the goal is not held if {words} is lost" in panel.lost_title.text()
    for tug in ("Gannet", "Puffin"):
        assert "goal fails without it" in holding.board.tug_notes[tug]
    assert "Skua" not in holding.board.tug_notes or "fails" not in holding.board.tug_notes["Skua"]


def test_the_tables_set_only_the_cells_that_changed(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    """A recheck with nothing changed sets no cell; a changed setting sets the cells that
    say it, and the table's columns still fit what they show (sized once, after)."""
    c = holding.controller
    panel = holding.solve_ui.solve_panel
    _choose_goal(qtbot, panel, "hold")
    panel.recheck()
    changes: list[int] = []
    for table in (panel.uses, panel.lost):
        table.model().dataChanged.connect(lambda *_: changes.append(1))
    items = [panel.uses.item(r, 0) for r in range(panel.uses.rowCount())]
    panel.recheck()
    assert changes == []
    stage = c.stage
    tern = stage.placement("Tern")
    c.apply(c.with_stage(stage.with_placement(tern.with_setting(0.9))), "Tern harder")
    panel.recheck()
    row = next(r for r in range(panel.uses.rowCount()) if panel.uses.item(r, 0).text() == "Tern")
    assert panel.uses.item(row, 3).text() == "90 %"
    assert 0 < len(changes) < panel.uses.rowCount() * panel.uses.columnCount()
    assert [panel.uses.item(r, 0) for r in range(panel.uses.rowCount())] == items  # kept
    header = panel.uses.horizontalHeader()
    assert header.sectionSize(2) >= panel.uses.sizeHintForColumn(2)


# -- the hold limits plot -----------------------------------------------------------------


def test_the_plot_shows_the_cores_hold_limits(holding, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    hold = holding.solve_ui.hold
    hold.update_now(coarse=False)
    c = holding.controller
    ref = hold_limits(hold_limits_problem(c.project, c.stage, "Barge"))
    assert hold.limits is not None
    assert hold.limits.all_tugs_ms == pytest.approx(ref.all_tugs_ms, rel=1e-12)
    assert hold.limits.worst_lost_ms == pytest.approx(ref.worst_lost_ms, rel=1e-12)
    # From the port beam (the planned wind's direction) the caption gives the core's number,
    # in the core's words for it ("above 60.0 kn" beyond its sensible range, issue 12).
    v = limit_words(float(ref.all_tugs_ms[270]), c.project.units)
    assert f"From 270°T: {v} with all tugs" in hold.caption.text()
    hold.plot.resize(420, 440)
    img = hold.plot.grab().toImage()
    path = tmp_path / "hold.png"
    assert img.save(str(path))
    blue = sum(
        1
        for x in range(0, img.width(), 2)
        for y in range(0, img.height(), 2)
        if _near(img.pixelColor(x, y), ALL_TUGS)
    )
    assert blue > 50  # the all-tugs curve is drawn


def test_the_plot_waits_for_the_drag_unless_live(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    hold = holding.solve_ui.hold
    hold.update_now(coarse=False)
    shown = hold.limits
    stage = c.stage
    p = stage.placement("Gannet")
    c.preview(c.with_stage(stage.with_placement(p.with_lead(p.lead_rad + 0.2))))
    assert hold.limits is shown  # no sweep on the mouse moves of a drag
    c.cancel_preview()


def test_the_plot_follows_a_drag_at_five_degrees(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c = holding.controller
    holding.solve_ui.set_live(True)
    holding.show()
    stage = c.stage
    p = stage.placement("Gannet")
    hold = holding.solve_ui.hold
    c.preview(c.with_stage(stage.with_placement(p.with_lead(p.lead_rad + 0.2))))
    qtbot.waitUntil(lambda: hold.drag_sweeps > 0)  # once the event loop goes idle
    assert hold.limits is not None
    assert len(hold.limits.problem.directions_deg) == 72
    assert hold.plot.coarse
    c.commit_preview("turn")
    qtbot.waitUntil(
        lambda: hold.limits is not None and len(hold.limits.problem.directions_deg) == 360
    )


def _live_plot(holding, qtbot):  # type: ignore[no-untyped-def]
    """Live solving on, the window shown and the hold plot settled: the controller, the
    plot's panel, and a move of the drag (Gannet's lead turned by ``by`` rad from where it
    was)."""
    c = holding.controller
    holding.solve_ui.set_live(True)
    holding.show()
    hold = holding.solve_ui.hold
    qtbot.waitUntil(lambda: not hold._timer.isActive())
    stage = c.stage
    p = stage.placement("Gannet")

    def turn(by: float) -> None:
        c.preview(c.with_stage(stage.with_placement(p.with_lead(p.lead_rad + by))))

    return c, hold, turn


def test_the_plot_sweeps_between_the_moves_of_a_drag_and_shows_the_final_limits(
    holding, qtbot
) -> None:  # type: ignore[no-untyped-def]
    """Moves that come faster than the plot's turn share one sweep, run once the event
    loop goes idle (not inside a move); the drag's end shows the stage result's limits."""
    from app.panels import hold_plot

    c, hold, turn = _live_plot(holding, qtbot)
    for k in range(1, 6):  # five moves handled one after another, the loop not idle
        turn(0.05 * k)
    assert hold.drag_sweeps == 0
    qtbot.waitUntil(lambda: hold.drag_sweeps == 1)
    shown = hold.limits
    assert shown is not None and len(shown.problem.directions_deg) == 72
    turn(0.4)
    qtbot.wait(round(hold_plot.FOLLOW_EVERY_S * 500))  # within its turn: the plot waits
    assert hold.drag_sweeps == 1 and hold.limits is shown
    qtbot.waitUntil(lambda: hold.drag_sweeps == 2)
    # a costly sweep (a large fleet) waits for the mouse to rest
    hold._sweep_cost = 2 * hold_plot.COSTLY_S
    for k in range(3):
        turn(0.5 + 0.05 * k)
        qtbot.wait(round(hold_plot.REST_S * 300))
    assert hold.drag_sweeps == 2
    qtbot.waitUntil(lambda: hold.drag_sweeps == 3)
    c.commit_preview("turn")
    qtbot.waitUntil(lambda: hold.limits is not None and not hold.plot.coarse)
    main = c.stage_result().main
    assert hold.limits is main.hold_limits  # the final figures are the stage result's


def test_a_drag_sweep_is_worked_in_steps_and_shown_whole(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    """The plot's sweep in a live drag runs a step at a time between the event loop's
    turns; the plot keeps what it showed until the sweep is whole, then shows the same
    curves as a sweep in one go; the drag's end shows what a direct sweep gives."""
    from core.solve.holdlimits import live_hold_limits

    c, hold, turn = _live_plot(holding, qtbot)
    shown = hold.limits
    turn(0.2)
    hold._follow_drag()  # its turn has come: the sweep starts, nothing is shown yet
    assert hold._job is not None and hold.limits is shown
    hold._step()
    hold._step()
    assert hold._job is not None and hold.limits is shown and hold.drag_sweeps == 0
    qtbot.waitUntil(lambda: hold.drag_sweeps >= 1)
    problem = hold_limits_problem(
        c.project, c.stage, "Barge", directions_deg=np.arange(0.0, 360.0, 5.0)
    )
    ref, ref_dirs, ref_worst = live_hold_limits(problem, lost_step=2)
    assert hold.plot.coarse and hold.limits is not shown
    assert hold.limits.all_tugs_ms == pytest.approx(ref.all_tugs_ms, rel=1e-12)
    assert hold.plot.lost_curve is not None
    assert list(hold.plot.lost_curve[0]) == list(ref_dirs)
    assert hold.plot.lost_curve[1] == pytest.approx(ref_worst, rel=1e-12)
    c.commit_preview("turn")
    qtbot.waitUntil(lambda: hold.limits is not None and not hold.plot.coarse)
    assert hold._job is None
    direct = hold_limits(hold_limits_problem(c.project, c.stage, "Barge"))
    assert hold.limits.all_tugs_ms == pytest.approx(direct.all_tugs_ms, rel=1e-12)
    assert hold.limits.worst_lost_ms == pytest.approx(direct.worst_lost_ms, rel=1e-12)


def test_a_sweep_step_waits_for_room_between_the_moves(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    """A piece of a drag's sweep runs between moves only when it can end before the next
    move is due; held back, its turn comes again after that move, and it runs when the
    mouse rests or the sweep has waited long enough (a mouse faster than the board)."""
    from app.panels import hold_plot

    c, hold, turn = _live_plot(holding, qtbot)
    turn(0.2)
    hold._follow_drag()
    assert hold._job is not None
    hold._move_gap = 1.0  # the next move is due in a second (however slow this machine)
    hold._piece_cost["step"] = 10.0  # a step longer than that
    hold._step()
    assert hold._held == "step" and hold._job is not None and hold.drag_sweeps == 0
    turn(0.25)  # the next move: the step's turn comes after it
    assert hold._held is None
    qtbot.waitUntil(lambda: hold.drag_sweeps >= 1)  # the mouse rests: the steps run
    # moves that never leave room: the sweep still ends, once it has waited STARVED_S
    hold._piece_cost["step"] = 10.0
    turn(0.3)
    started = hold.drag_sweeps
    for k in range(round(4 * hold_plot.STARVED_S / 0.004)):
        if hold.drag_sweeps > started:
            break
        turn(0.3 + 0.001 * k)
        qtbot.wait(4)
    assert hold.drag_sweeps > started
    c.cancel_preview()


def test_a_finished_sweep_is_shown_when_there_is_room_for_the_plots_paint(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    """The sweep's last step keeps its result; showing it (and the plot's paint that
    follows) is a piece of its own, which waits for room between moves like a step."""
    c, hold, turn = _live_plot(holding, qtbot)
    shown = hold.limits
    turn(0.2)
    hold._follow_drag()
    job = hold._job
    while job.result is None:
        hold._step()
    assert hold.limits is shown and hold.drag_sweeps == 0  # worked out, not shown yet
    hold._move_gap = 1.0  # the next move is due in a second (however slow this machine)
    hold._piece_cost["show"] = 10.0  # showing takes longer than that
    hold._step()
    assert hold._held == "step" and hold.limits is shown
    qtbot.waitUntil(lambda: hold.drag_sweeps == 1)  # the mouse rests: shown
    assert hold.limits is job.result[0] and hold._job is None
    qtbot.waitUntil(lambda: hold.plot.painted_in > 0)
    c.cancel_preview()


def test_moves_made_while_a_sweep_is_under_way_are_swept_once_it_ends(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    """A sweep in steps is for the plan as it was when it began; when the mouse moved on
    meanwhile, the plot sweeps again once that one ends (no further move needed), so a
    mouse at rest is shown where it rests."""
    from core.solve.holdlimits import live_hold_limits

    c, hold, turn = _live_plot(holding, qtbot)
    turn(0.2)
    hold._follow_drag()
    assert hold._job is not None
    turn(0.4)
    qtbot.waitUntil(lambda: hold.drag_sweeps >= 2)  # the second with no move after it
    problem = hold_limits_problem(
        c.project, c.stage, "Barge", directions_deg=np.arange(0.0, 360.0, 5.0)
    )
    ref, _, _ = live_hold_limits(problem, lost_step=0)
    assert hold.limits.all_tugs_ms == pytest.approx(ref.all_tugs_ms, rel=1e-12)
    c.cancel_preview()


def test_a_drag_sweep_under_way_is_dropped_when_the_drag_ends(holding, qtbot) -> None:  # type: ignore[no-untyped-def]
    c, hold, turn = _live_plot(holding, qtbot)
    turn(0.2)
    hold._follow_drag()
    assert hold._job is not None
    c.cancel_preview()
    assert hold._job is None
    qtbot.waitUntil(lambda: hold.limits is not None and not hold.plot.coarse)
    qtbot.wait(50)
    assert hold.drag_sweeps == 0 and not hold.plot.coarse
    assert hold.limits is c.stage_result().main.hold_limits


def test_no_wind_area_says_why_instead_of_a_plot(window) -> None:  # type: ignore[no-untyped-def]
    from dataclasses import replace

    c = window.controller
    hull = c.project.hull("Kestrel 3")
    c.apply(c.project.with_hull(replace(hull, freeboard_m=None)), "no freeboard")
    hold = window.solve_ui.hold
    hold.update_now(coarse=False)
    assert hold.limits is None
    assert "freeboard" in hold.plot.message


# -- the board's card -------------------------------------------------------------------


def test_the_conditions_card_says_wind_and_current() -> None:
    from core.model.conditions import Conditions

    img = QImage(300, 220, QImage.Format.Format_ARGB32)
    img.fill(QColor("white"))
    p = QPainter(img)
    c = Conditions(wind_speed_ms=10 * KNOT, wind_from_deg=200.0, current_speed_ms=KNOT)
    rect = draw_conditions_card(p, QPointF(290, 10), c, DisplayUnits())
    p.end()
    assert rect.width() > 100
    dark = sum(
        1
        for x in range(int(rect.left()), int(rect.right()))
        for y in range(int(rect.top()), int(rect.bottom()))
        if img.pixelColor(x, y).lightness() < 120
    )
    assert dark > 200
    from app.board.conditions_layer import card_lines

    texts = [t for t, _ in card_lines(c, DisplayUnits())]
    assert texts == ["Wind 10.0 kn from 200°T", "Current 1.0 kn to 000°T"]


def test_window_screenshot_with_the_new_panels(holding, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    for key in ("conditions", "solve", "hold_limits"):
        assert key in holding.panels
    img = holding.grab().toImage()
    path = tmp_path / "window.png"
    assert img.save(str(path))
    colours = {
        img.pixelColor(x, y).rgb()
        for x in range(0, img.width(), 25)
        for y in range(0, img.height(), 25)
    }
    assert len(colours) > 20


def _near(a: QColor, b: QColor, tol: int = 40) -> bool:
    return abs(a.red() - b.red()) + abs(a.green() - b.green()) + abs(a.blue() - b.blue()) < tol
