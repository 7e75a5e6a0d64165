"""Stage list edits, and that each stage's results come from its own value only."""

from __future__ import annotations

from dataclasses import replace

import pytest

from core.analysis.checks import check_plan
from core.errors import InputError
from core.mechanics.balance import analyse
from core.model.stages import (
    add_stage,
    copy_name,
    delete_stage,
    duplicate_stage,
    move_stage,
    rename_stage,
    stage_index,
    unique_stage_name,
)
from tests.core.plan_builders import two_tug_plan


def names(project):
    return [s.name for s in project.stages]


def test_add_stage_appends_with_the_previous_poses_and_no_tugs():
    p = two_tug_plan()
    q, i = add_stage(p)
    assert i == 3 and names(q) == ["Walk off", "Swing", "Transit", "Stage 4"]
    assert q.stages[3].poses == p.stages[2].poses
    assert q.stages[3].placements == ()
    assert p.stages == two_tug_plan().stages  # the old value is untouched


def test_add_stage_after_an_index_and_with_a_taken_name():
    p = two_tug_plan()
    q, i = add_stage(p, after=0, name="Swing", kind="swing")
    assert i == 1 and names(q) == ["Walk off", "Swing (2)", "Swing", "Transit"]
    assert q.stages[1].poses == p.stages[0].poses


def test_add_stage_to_an_empty_plan():
    p = replace(two_tug_plan(), stages=())
    q, i = add_stage(p, name="Unberth", kind="unberth")
    assert i == 0 and names(q) == ["Unberth"] and q.stages[0].poses == ()


def test_duplicate_gives_a_unique_name_and_an_equal_copy_after_the_original():
    p = two_tug_plan()
    q, i = duplicate_stage(p, 1)
    assert i == 2 and names(q) == ["Walk off", "Swing", "Swing (copy)", "Transit"]
    assert replace(q.stages[2], name="Swing") == p.stages[1]
    r, j = duplicate_stage(q, 1)
    assert names(r)[j] == "Swing (copy 2)"
    s, k = duplicate_stage(r, 3)  # a copy of a copy is not "(copy) (copy)"
    assert names(s)[k] == "Swing (copy 3)"


def test_copy_name_and_unique_name():
    p = two_tug_plan()
    assert copy_name(p, "Walk off") == "Walk off (copy)"
    assert unique_stage_name(p, "Transit") == "Transit (2)"
    assert unique_stage_name(p, "Transit", ignore=2) == "Transit"
    assert unique_stage_name(p, "  ") == "Stage"


def test_move_stage_reorders():
    p = two_tug_plan()
    assert names(move_stage(p, 0, 2)) == ["Swing", "Transit", "Walk off"]
    assert names(move_stage(p, 2, 0)) == ["Transit", "Walk off", "Swing"]
    assert names(move_stage(p, 1, 1)) == names(p)


def test_rename_stage_must_be_unique_and_not_empty():
    p = two_tug_plan()
    assert names(rename_stage(p, 1, "  Swing to head out ")) == [
        "Walk off",
        "Swing to head out",
        "Transit",
    ]
    assert names(rename_stage(p, 1, "Swing")) == names(p)  # its own name is fine
    with pytest.raises(InputError, match="is already the name of stage 1"):
        rename_stage(p, 1, "Walk off")
    with pytest.raises(InputError, match="must not be empty"):
        rename_stage(p, 1, "   ")


def test_delete_stage_and_bad_indices():
    p = two_tug_plan()
    assert names(delete_stage(p, 1)) == ["Walk off", "Transit"]
    for bad in (3, -1):
        with pytest.raises(InputError, match="must be a stage number from 1 to 3"):
            delete_stage(p, bad)
    with pytest.raises(InputError, match="must be a stage number"):
        move_stage(p, 0, 7)
    empty = replace(p, stages=())
    with pytest.raises(InputError, match="is not a stage of this plan"):
        duplicate_stage(empty, 0)
    assert stage_index(p, "Transit") == 2
    with pytest.raises(InputError, match="does not exist"):
        stage_index(p, "Berth")


def test_a_copied_then_changed_stage_never_keeps_the_original_results():
    p = two_tug_plan()
    before = check_plan(p)
    q, i = duplicate_stage(p, 0)
    copy = q.stages[i]
    # The copy starts with the same results as its original...
    assert analyse(q, copy).net_force == analyse(p, p.stages[0]).net_force
    # ...and after a change its results follow its own value, the original's do not move.
    changed = copy.with_placement(copy.placement("Gannet").with_setting(0.2))
    q = q.with_stage(changed, i)
    checks = check_plan(q)
    orig_b, copy_b = checks[0].balances[0], checks[i].balances[0]
    assert orig_b == before[0].balances[0]
    gannet = next(sh for sh in copy_b.shares if sh.tug == "Gannet")
    assert gannet.pull_n == pytest.approx(
        0.2 * 50 * 9806.65
    )  # 20 % of 50 t (tonne-force, NIST SP 811)
    assert copy_b.net_force != orig_b.net_force
    assert copy_b == analyse(q, changed)  # exactly what a fresh analysis of the copy gives
    # A stage holds no results at all, so nothing could go stale in it.
    slots = type(copy).__slots__
    assert not [f for f in slots for w in ("result", "balance", "cache", "check") if w in f]
