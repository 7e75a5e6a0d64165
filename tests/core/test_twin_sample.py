"""The invented multi-stage sample: a site, two lashed barges, four tugs, four stages."""

from __future__ import annotations

import subprocess
import sys

import pytest
import shapely

from core.analysis.checks import check_plan
from core.io.projectfile import load
from core.mechanics.bodies import body_of
from core.mechanics.site import placed_bodies
from tests.conftest import ROOT, SAMPLES

PATH = SAMPLES / "twin_barge_move.towboard"


@pytest.fixture(scope="module")
def plan():
    return load(PATH)


def test_the_sample_has_a_site_a_lashed_pair_tugs_and_four_stages(plan):
    kinds = {f.kind for f in plan.site.features}
    assert kinds == {"quay", "dolphin", "vessel", "limit"}
    assert len(plan.groups) == 1 and len(plan.groups[0].members) == 2
    assert 3 <= len(plan.tugs) <= 4
    assert [s.kind for s in plan.stages] == ["unberth", "swing", "transit", "berth"]
    for s in plan.stages:
        assert s.poses and s.placements and s.notes
        assert s.limits.max_wind_ms is not None and s.limits.min_clearance_m is not None


def test_the_pair_is_one_body_in_every_stage_and_inside_the_basin(plan):
    body = body_of(plan, plan.groups[0].name)
    assert body.polygon.geom_type == "Polygon"  # the two barges touch along their sides
    basin = next(f for f in plan.site.features if f.kind == "limit" and f.closed)
    for s in plan.stages:
        (pb,) = placed_bodies(plan, s)
        assert pb.name == body.name
        assert shapely.Polygon(basin.points).covers(pb.polygon)


def test_every_stage_is_checked_without_failures(plan):
    checks = check_plan(plan)
    assert [c.fails for c in checks] == [False] * 4
    for c in checks:
        assert c.clearances and min(x.distance_m for x in c.clearances) > 0


def test_the_command_line_reports_it():
    done = subprocess.run(
        [sys.executable, "-m", "app", "report", str(PATH)],
        cwd=ROOT,
        capture_output=True,
        text=True,
        timeout=120,
    )
    assert done.returncode == 0, done.stderr
    assert "Stage 4: Berth: port side to the lay-by quay [berth]" in done.stdout
