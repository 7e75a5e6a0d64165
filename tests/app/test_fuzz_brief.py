"""Files with numbers moved to the edges of their ranges that load also brief: the PDF
prints no nan and no infinity."""

from __future__ import annotations

import random
from pathlib import Path

from tests.fuzz.checks import brief_is_finite, outcome
from tests.fuzz.mutations import edge_numbers, sample_trees, to_bytes, to_text


def test_edge_files_that_load_brief_with_finite_numbers(tmp_path: Path, qapp) -> None:  # type: ignore[no-untyped-def]
    rnd = random.Random(4)
    briefed = 0
    # Many numbers have narrow ranges (shares, ordered table rows): an edge value is often
    # refused, so each sample gets up to 40 tries at a file that loads.
    for tree in sample_trees():
        for _ in range(40):
            _kind, project = outcome(to_bytes(to_text(edge_numbers(tree, rnd, 2))), tmp_path)
            if project is not None:
                assert brief_is_finite(project, tmp_path) >= 1
                briefed += 1
                break
    assert briefed == len(sample_trees())  # one briefing per sample at least


def test_a_lashed_group_whose_hulls_do_not_touch_briefs(tmp_path: Path, qapp) -> None:  # type: ignore[no-untyped-def]
    """Hulls lashed with a gap between them (fenders, spacers) are one body whose outline
    is in two parts; the stage diagrams and the overview draw both (a crash found by the
    fuzz test)."""
    import json

    from core.io.projectfile import loads
    from core.mechanics.bodies import body_of
    from tests.conftest import SAMPLES

    data = json.loads((SAMPLES / "twin_barge_move.towboard").read_text(encoding="utf-8"))
    member = data["groups"][0]["members"][1]
    member["position_m"] = [member["position_m"][0], member["position_m"][1] - 30.0]  # a gap
    project = loads(json.dumps(data))
    body = body_of(project, "Lark pair")
    assert body.polygon.geom_type == "MultiPolygon"  # the case this test is about
    assert brief_is_finite(project, tmp_path) >= 1
