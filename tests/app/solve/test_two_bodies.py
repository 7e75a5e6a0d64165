"""The solve pulls and hold limits panels in a stage whose tugs work on two bodies: each
names the body it shows, shows the worst off by default, lets the user choose the other,
and shows the stage's verdict so that nothing said of one body stands for the stage."""

from __future__ import annotations

from pathlib import Path

from app.edits import bodies as body_edits
from core.analysis.stage import stage_result

TWIN = Path(__file__).resolve().parents[3] / "sample_projects" / "twin_barge_move.towboard"


def _unlashed_stage_3(window, qtbot):  # type: ignore[no-untyped-def]
    """The twin barge sample with the pair unlashed (the menu's own edit), stage 3 shown."""
    assert window.open_path(TWIN, ask=False)
    c = window.controller
    c.apply(body_edits.unlashed(c.project, "Lark pair"), "Unlash Lark pair")
    c.set_stage_index(2)
    qtbot.wait(1)
    return c, c.stage_result()


def test_the_solve_panel_shows_the_body_that_cannot_meet_the_goal(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    _c, r = _unlashed_stage_3(window, qtbot)
    # The stage's verdict, worked out by the core: Lark 42 cannot meet its transit goal.
    assert r.verdict.status == "no-go"
    assert [b.name for b in r.worked] == ["Lark 41", "Lark 42"]
    lark42 = r.body("Lark 42")
    assert lark42.solved is not None and not lark42.solved.feasible
    assert r.worst is lark42
    panel = window.solve_ui.solve_panel
    panel.recheck()
    assert panel.body_choice.isVisibleTo(panel)
    assert panel.body_choice.box.currentText() == "Lark 42"
    assert panel.body_choice.verdict.text() == f"Stage {r.verdict.headline()}"
    assert panel.outcome.text().startswith("Lark 42: the goal is out of reach")
    tugs = {p.tug for p in lark42.layout.placements}
    shown = {panel.uses.item(i, 0).text() for i in range(panel.uses.rowCount())}
    assert shown == tugs
    # choosing the other body shows its pulls, named, with the stage still NO-GO above them
    panel.body_choice.box.setCurrentIndex(panel.body_choice.box.findData("Lark 41"))
    assert panel.outcome.text().startswith("Lark 41: the goal can be met")
    assert panel.body_choice.verdict.text().startswith("Stage NO-GO: ")
    shown = {panel.uses.item(i, 0).text() for i in range(panel.uses.rowCount())}
    assert shown == {p.tug for p in r.body("Lark 41").layout.placements}


def test_the_hold_limits_panel_names_and_shows_the_worst_body(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    _c, r = _unlashed_stage_3(window, qtbot)
    hold = window.solve_ui.hold
    hold.update_now(coarse=False)
    lark42 = r.body("Lark 42")
    assert hold.body_choice.box.currentText() == "Lark 42"
    assert hold.limits is lark42.hold_limits
    assert hold.caption.text().startswith("Lark 42: From ")
    assert hold.body_choice.verdict.text() == f"Stage {r.verdict.headline()}"
    hold.body_choice.box.setCurrentIndex(hold.body_choice.box.findData("Lark 41"))
    assert hold.limits is r.body("Lark 41").hold_limits
    assert hold.caption.text().startswith("Lark 41: From ")


def test_one_body_shows_no_chooser_but_still_names_it(window, qtbot) -> None:  # type: ignore[no-untyped-def]
    assert window.open_path(TWIN, ask=False)
    c = window.controller
    c.set_stage_index(2)
    r = c.stage_result()
    assert len(r.worked) == 1
    panel = window.solve_ui.solve_panel
    panel.recheck()
    assert not panel.body_choice.isVisibleTo(panel)
    assert panel.outcome.text().startswith(f"{r.main.name}: ")
    hold = window.solve_ui.hold
    hold.update_now(coarse=False)
    assert hold.caption.text().startswith(f"{r.main.name}: ")
    assert stage_result(c.project, 2) is r
