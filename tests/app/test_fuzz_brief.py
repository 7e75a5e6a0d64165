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
    for tree in sample_trees():
        for _ in range(8):
            _kind, project = outcome(to_bytes(to_text(edge_numbers(tree, rnd, 2))), tmp_path)
            if project is not None:
                assert brief_is_finite(project, tmp_path) >= 1
                briefed += 1
                break
    assert briefed == len(sample_trees())  # one briefing per sample at least
