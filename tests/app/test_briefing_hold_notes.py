"""The briefing's hold limit notes: a limit of 0 said as not held, the tug whose loss
leaves the goal unmet even in calm named, and which curve lies beyond the outer ring
(REVIEW.md F1 and F9)."""

from __future__ import annotations

from pathlib import Path

import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from tests.app.test_briefing import pages_text

ROOT = Path(__file__).resolve().parents[2]


@pytest.fixture(scope="module")
def deck_barge_text(tmp_path_factory, qapp):  # type: ignore[no-untyped-def]
    from app.briefing.document import write_pdf

    project = load(ROOT / "sample_projects" / "deck_barge_unberth.towboard")
    out = tmp_path_factory.mktemp("brief") / "deck.pdf"
    write_pdf(project, out, "a4")
    return project, " ".join(pages_text(out))


def test_the_walk_with_a_tug_lost_is_said_as_not_held(deck_barge_text) -> None:  # type: ignore[no-untyped-def]
    project, text = deck_barge_text
    lim = stage_result(project, 0).main.hold_limits
    # REVIEW.md F1: with Gannet (or Puffin) lost the walk is not met in calm
    assert set(lim.calm_fails) == {"Gannet", "Puffin"}
    assert "Lowest with the worst tug lost: none" not in text
    # 0 from every direction: no one direction named as the lowest
    assert "Lowest with the worst tug lost: 0 from every direction." in text
    assert "Lowest with the worst tug lost: 0.0 kn (not held) from" not in text
    # and with all tugs every direction is above the 60 kn shown: none named either
    assert "Lowest with all tugs: above 60.0 kn from every direction." in text
    assert lim.calm_words() + "." in text


def test_the_outer_ring_note_names_its_curve(deck_barge_text) -> None:  # type: ignore[no-untyped-def]
    _, text = deck_barge_text
    assert "From 360 directions the limit is beyond" not in text
    # stage 1: every all-tugs limit is above the ring, the worst-lost curve is 0
    assert "are drawn on it: from 360 directions for all tugs." in text
