"""A tug layout cut by one row, or with one row made again, equals the layout made afresh.

The tug lost check removes a row (``TugLayout.without``) and a drag replaces one
(``with_placement_row``); both must give exactly the arrays :func:`tug_layout` gives for
the stage with that tug removed or moved, or the board and the stage result disagree.
"""

from __future__ import annotations

import dataclasses
from dataclasses import replace

import numpy as np
import pytest

from core.io.projectfile import load
from core.mechanics import balance
from core.mechanics.balance import TugLayout, tug_layout, with_placement_row
from core.mechanics.bodies import body_of
from core.mechanics.site import posed_bodies
from tests.conftest import SAMPLES

CASES = [
    (path, index)
    for path in sorted(SAMPLES.glob("*.towboard"))
    for index in range(len(load(path).stages))
]


def _same(a: TugLayout, b: TugLayout) -> None:
    assert a.placements == b.placements
    assert a.ways == b.ways and a.curves == b.curves
    for name in balance._ROW_ARRAYS:
        x, y = getattr(a, name), getattr(b, name)
        assert (x is None) == (y is None), name
        if x is not None:
            np.testing.assert_array_equal(x, y, err_msg=name)


def test_every_per_tug_array_is_cut_and_replaced() -> None:
    arrays = {f.name for f in dataclasses.fields(TugLayout) if "ndarray" in str(f.type)}
    assert arrays == set(balance._ROW_ARRAYS)


@pytest.mark.parametrize(("path", "index"), CASES, ids=lambda v: getattr(v, "stem", str(v)))
def test_rows_cut_and_remade_equal_a_fresh_layout(path, index) -> None:  # type: ignore[no-untyped-def]
    project = load(path)
    stage = project.stages[index]
    for name in posed_bodies(project, stage):
        body = body_of(project, name)
        layout = tug_layout(project, stage, body)
        for i, placement in enumerate(layout.placements):
            rest = tuple(p for p in stage.placements if p != placement)
            _same(layout.without(i), tug_layout(project, replace(stage, placements=rest), body))
            moved = placement.with_lead(placement.lead_rad + 0.3).with_setting(0.5)
            stage_moved = replace(
                stage,
                placements=tuple(moved if p == placement else p for p in stage.placements),
            )
            _same(
                with_placement_row(layout, project, stage_moved, body, moved),
                tug_layout(project, stage_moved, body),
            )


@pytest.mark.parametrize(("path", "index"), CASES, ids=lambda v: getattr(v, "stem", str(v)))
def test_a_drag_remakes_one_share_and_keeps_the_others(path, index) -> None:  # type: ignore[no-untyped-def]
    """The drag path's balance (one row made again, the other shares kept from the balance
    before) equals the balance worked out whole, and keeps the other tugs' share objects
    (the views compare them by identity first)."""
    project = load(path)
    stage = project.stages[index]
    for name in posed_bodies(project, stage):
        body = body_of(project, name)
        layout = tug_layout(project, stage, body)
        before = balance.analyse_layout(stage, body, layout, project.units)
        for i, placement in enumerate(layout.placements):
            moved = placement.with_lead(placement.lead_rad + 0.3)
            stage_moved = stage.with_placement(moved)
            row = with_placement_row(layout, project, stage_moved, body, moved)
            fast = balance.analyse_layout(
                stage_moved, body, row, project.units, before=before, changed_row=i
            )
            whole = balance.analyse_layout(stage_moved, body, row, project.units)
            assert fast == whole
            for k, share in enumerate(fast.shares):
                assert (share is before.shares[k]) == (k != i)


def test_a_share_is_made_again_when_its_setting_is_not_the_one_kept() -> None:
    """Rows that are not the ones ``before`` was worked out from (here another tug's
    setting changed too) are all made again, not taken from ``before``."""
    project = load(next(iter(sorted(SAMPLES.glob("*.towboard")))))
    stage = next(s for s in project.stages if len(s.placements) >= 2)
    body = body_of(project, next(iter(posed_bodies(project, stage))))
    layout = tug_layout(project, stage, body)
    before = balance.analyse_layout(stage, body, layout, project.units)
    first, second = layout.placements[0], layout.placements[1]
    changed = stage.with_placement(second.with_setting(1.0 - second.setting / 2))
    changed = changed.with_placement(first.with_lead(first.lead_rad + 0.2))
    moved = tug_layout(project, changed, body)
    fast = balance.analyse_layout(changed, body, moved, project.units, before=before, changed_row=0)
    assert fast == balance.analyse_layout(changed, body, moved, project.units)
    assert fast.shares[1].setting == moved.placements[1].setting != second.setting
    assert all(a is not b for a, b in zip(fast.shares, before.shares, strict=True))
