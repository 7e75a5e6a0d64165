"""The tugs' force sets when every tug works at its lead as set (a live solve strips the
working sectors) are made for all tugs at once; they must be exactly the sets made tug by
tug, or the live solve and the stage result would solve different problems."""

from __future__ import annotations

from dataclasses import replace

import numpy as np
import pytest

from core.io.projectfile import load
from core.mechanics import tugsets
from core.mechanics.balance import tug_layout
from core.mechanics.bodies import body_of
from core.mechanics.site import posed_bodies
from tests.conftest import SAMPLES

CASES = [
    (path, index)
    for path in sorted(SAMPLES.glob("*.towboard"))
    for index in range(len(load(path).stages))
]


@pytest.mark.parametrize(("path", "index"), CASES, ids=lambda v: getattr(v, "stem", str(v)))
def test_sets_at_fixed_leads_are_the_sets_made_tug_by_tug(path, index) -> None:  # type: ignore[no-untyped-def]
    project = load(path)
    stage = project.stages[index]
    # every tug at its lead as set, and one with no usable pull (no set at all)
    fixed = tuple(p.with_sector(None) for p in stage.placements)
    stage = replace(stage, placements=fixed)
    for name in posed_bodies(project, stage):
        body = body_of(project, name)
        layout = tug_layout(project, stage, body)
        if not layout.placements:
            continue
        usable = layout.usable_n.copy()
        usable[0] = 0.0
        for lay in (layout, replace(layout, usable_n=usable)):
            fast = tugsets.tug_sets(lay, body.centroid)
            each = tugsets._each_tugs_sets(lay, body.centroid, tugsets.SECTOR_STEP_DEG, 1)
            assert not fast.sectors.any()
            for field in ("vertices", "vertex_tug", "vertex_lead", "sectors"):
                a, b = getattr(fast, field), getattr(each, field)
                assert a.dtype == b.dtype and a.shape == b.shape, field
                np.testing.assert_array_equal(a, b, err_msg=field)
            assert len(fast.polygons) == len(each.polygons)
            for a, b in zip(fast.polygons, each.polygons, strict=True):
                assert a.shape == b.shape
                np.testing.assert_array_equal(a, b)
