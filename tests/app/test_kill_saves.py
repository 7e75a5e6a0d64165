"""Killed at random while editing and saving: every file on disk loads, and the work of all
but the last second is offered back (a few rounds here; benchmarks/kill_saves.py runs
hundreds)."""

from __future__ import annotations

import random
from pathlib import Path

import pytest

from tests.app.killing import LOSS_LIMIT_S, kill_round

pytestmark = pytest.mark.slow


def test_a_session_killed_at_random_loses_at_most_a_second(tmp_path: Path, qapp) -> None:  # type: ignore[no-untyped-def]
    rnd = random.Random(20261201)
    rounds = [kill_round(tmp_path / "session", rnd) for _ in range(4)]
    assert sum(r.edits for r in rounds) > 10  # the child did edit
    assert any(r.recovered for r in rounds)  # and some work came back from a recovery file
    assert all(r.lost_s <= LOSS_LIMIT_S for r in rounds)
