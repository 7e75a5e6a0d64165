"""The briefing's stage page prints a swing stage's headings and side, and each body's
moment against them, as the core's swing result says (core.analysis.swing)."""

from __future__ import annotations

from pathlib import Path

from app.briefing.layout import Text
from app.briefing.stage_page import stage_blocks
from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.model.goals import Goal
from tests.app.test_briefing import norm, pages_text
from tests.core.test_swing_sense import PORT_MOMENT, _plan, _solved

ROOT = Path(__file__).resolve().parents[2]
DECK_BARGE = ROOT / "sample_projects" / "deck_barge_unberth.towboard"


def _texts(project, index: int) -> list[str]:
    blocks = stage_blocks(project, stage_result(project, index), 80.0)
    return [b.text for b in blocks if isinstance(b, Text)]


def test_the_stage_page_prints_the_swing_and_its_sense(qapp) -> None:
    project = _solved(_plan(Goal("swing", moment_nm=PORT_MOMENT)))
    texts = _texts(project, 0)
    assert "Swing: swings bow to starboard 180° from 090.0° to 270.0°" in texts
    sense = (
        "Barge: the goal turns the bow to port (100.0 t·m about the centroid): AGAINST the swing"
    )
    assert sense in texts
    assert sense == stage_result(project, 0).main.swing.words(project.units)


def test_the_deck_barge_swing_stage_page_prints_its_swing(qapp) -> None:
    project = load(DECK_BARGE)
    i = next(k for k, s in enumerate(project.stages) if s.swing is not None)
    assert "Swing: swings bow to port 180° from 090.0° to 270.0°" in _texts(project, i)
    assert not any(t.startswith("Swing:") for t in _texts(project, 0))  # an unberth stage


def test_the_printed_briefing_has_the_swing(qapp, tmp_path) -> None:
    from app.briefing.document import write_pdf

    project = _solved(_plan(Goal("swing", moment_nm=PORT_MOMENT)))
    out = tmp_path / "swing.pdf"
    write_pdf(project, out)
    text = " ".join(pages_text(out))
    assert norm("Swing: swings bow to starboard 180° from 090.0° to 270.0°") in text
    assert norm("but the goal turns the bow to port") in text
