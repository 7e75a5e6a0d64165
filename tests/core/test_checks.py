"""Re-checking every stage: a substitute tug that makes a stage fail is flagged in that stage."""

from __future__ import annotations

from dataclasses import replace

import pytest

from core.analysis.checks import check_plan, check_stage, substitute_tug
from core.errors import InputError
from core.mechanics.site import quay
from core.model.goals import Goal
from core.model.plan import Site, Stage, StageLimits
from core.model.tugs import Tug
from tests.core.plan_builders import TF, line, two_tug_plan

KNOT = 1852 / 3600  # m/s (NIST SP 811, from memory)


def test_the_plan_as_built_passes():
    checks = check_plan(two_tug_plan())
    assert [c.name for c in checks] == ["Walk off", "Swing", "Transit"]
    assert not any(c.fails for c in checks)


def test_substitute_with_less_pull_keeping_the_pulls_fails_only_the_stage_that_needs_more():
    p = two_tug_plan()
    # Gannet (50 t) pulls 80 % = 40 t in "Walk off", 30 % = 15 t in "Swing", 40 % = 20 t in "Transit".
    sub = substitute_tug(p, "Gannet", Tug("Skua", 30 * TF, 28 * TF, "ASD"))
    assert [c.name for c in sub.now_failing] == ["Walk off"]
    walk = sub.after[0]
    (f,) = walk.failures
    assert f.code == "pull_short" and f.subject == "Skua"
    assert f.message == (
        "Skua: this stage needs 40.0 t where Gannet worked; Skua gives at most 30.0 t "
        "(short by 10.0 t)"
    )
    # the same pulls are kept where the substitute can give them: 15 t of 30 t is 50 %,
    # 20 t of 30 t is 67 %; where it cannot, it works at 100 %
    assert sub.project.stages[1].placement("Skua").setting == pytest.approx(0.5)
    assert sub.project.stages[2].placement("Skua").setting == pytest.approx(20 / 30)
    assert sub.project.stages[0].placement("Skua").setting == pytest.approx(1.0)
    skua = next(sh for sh in walk.balances[0].shares if sh.tug == "Skua")
    assert skua.pull_n == pytest.approx(30 * TF)
    assert sub.project.tugs[0].name == "Skua"
    assert "Gannet" not in {pl.tug for s in sub.project.stages for pl in s.placements}


def test_a_stronger_substitute_fails_nothing():
    sub = substitute_tug(two_tug_plan(), "Puffin", Tug("Puffin", 60 * TF))
    assert sub.now_failing == () and sub.failing == ()


def hold_plan():
    """Gannet pulls ahead from the bow and Puffin astern from the stern, 20 t each, on the
    centreline: net force and yaw moment are zero, so the goal 'hold' is met."""
    p = two_tug_plan()
    hold = Stage(
        "Hold in the fairway",
        "transit",
        placements=(
            line("Gannet", "Barge", "bow", 0.4, 0.0),  # 0.4 x 50 t = 20 t ahead
            line("Puffin", "Barge", "stern", 0.5, 180.0),  # 0.5 x 40 t = 20 t astern
        ),
        goal=Goal("hold"),
    )
    return replace(p, stages=(*p.stages, hold))


def test_goal_met_then_missed_when_a_substitute_keeps_the_setting():
    p = hold_plan()
    assert not check_stage(p, 3).fails
    sub = substitute_tug(p, "Puffin", Tug("Tern", 30 * TF, 30 * TF), keep="settings")
    assert [c.name for c in sub.now_failing] == ["Hold in the fairway"]
    (f,) = sub.after[3].failures
    assert f.code == "pulls_miss_goal"
    # 20 t ahead less 0.5 x 30 t = 15 t astern leaves 5 t ahead
    assert "net force 5.0 t ahead of it" in f.message
    # with no wind or current, tugs that do not pull hold it: re-solving meets the goal
    assert f.message.endswith("; Solve pulls would meet it (largest setting 0 %)")


def test_a_goal_the_substitute_cannot_meet_even_re_solved():
    p = two_tug_plan()
    walk = Stage(
        "Tow ahead",
        "transit",
        placements=(line("Gannet", "Barge", "bow", 0.6, 0.0),),  # 0.6 x 50 t = 30 t ahead
        goal=Goal("transit", fx_n=30 * TF),
    )
    p = replace(p, stages=(walk,))
    assert not check_stage(p, 0).fails
    sub = substitute_tug(p, "Gannet", Tug("Skua", 20 * TF), keep="settings")
    (f,) = sub.after[0].failures
    assert f.code == "goal_cannot_be_met"
    # at 100 % the substitute gives 20 t of the 30 t wanted: 10 t short, along the
    # centreline, so with no yaw moment missing
    assert f.message == (
        "Barge: the goal (transit) cannot be met with every tug: needs 10.0 t more ahead, "
        "with the yaw moment met"
    )


def test_conditions_over_the_stage_limit_and_low_clearance_are_no_go():
    p = two_tug_plan()
    s = replace(
        p.stages[2],
        conditions=replace(p.stages[2].conditions, wind_speed_ms=25 * KNOT),
        limits=StageLimits(max_wind_ms=20 * KNOT),
    )
    p = replace(p.with_stage(s, 2), site=Site("", (quay("Q", (-15, 40), (-15, 200)),)))
    c = check_stage(p, 2)
    assert c.fails
    codes = sorted(n.code for n in c.failures)
    assert codes == ["conditions_over_limit", "low_clearance"]
    assert any(
        "planned wind 25.0 kn mean at 10 m is above the stage's go / no-go limit 20.0 kn "
        "(mean at 10 m)" in n.message
        for n in c.failures
    )


def test_over_swl_fails_the_stage():
    p = two_tug_plan()
    hull = p.hulls[0]
    bow = replace(hull.fitting("port bow"), swl_n=30 * TF)
    p = p.with_hull(hull.with_fitting(bow))
    c = check_stage(p, 0)  # Gannet pulls 40 t on the 30 t port bow bitt
    assert [n.code for n in c.failures] == ["fitting_over_rating"]
    assert c.failures[0].message.startswith("Gannet: line tension 40.0 t is over the SWL 30.0 t")


def test_bad_keep_is_refused():
    with pytest.raises(InputError, match="must be 'pulls' or 'settings'"):
        substitute_tug(two_tug_plan(), "Gannet", Tug("X", 1e5), keep="both")


def test_no_margin_with_a_tug_lost_is_a_warning_of_the_stage():
    p = two_tug_plan()
    # Both tugs pull to port, 20 t each, to walk the barge 40 t to port: with either lost,
    # the other gives at most 50 t or 40 t on its own line, but the yaw moment cannot be
    # held at zero by one tug off-centre, so the goal fails with any single loss.
    walk = Stage(
        "Walk off",
        "unberth",
        placements=(
            line("Gannet", "Barge", "port bow", 0.4, 270.0),
            line("Puffin", "Barge", "port quarter", 0.5, 270.0),
        ),
        goal=Goal("walk", fy_n=40 * TF),
    )
    c = check_stage(replace(p, stages=(walk,)), 0)
    assert not c.fails
    (n,) = [n for n in c.warnings if n.code == "tug_lost_fails"]
    assert "not met with Gannet or Puffin lost" in n.message
