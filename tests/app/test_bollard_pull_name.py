"""A tug's certified bollard pull has one name wherever it is shown, the project's
"rated bollard pull (BP)" (CONVENTIONS.md, names table), never "Rated BP" beside texts
that call it otherwise."""

from __future__ import annotations

from app.briefing.cover import PULL_WORDS
from app.briefing.layout import Table
from app.briefing.particulars import tug_blocks
from app.panels.tugs_model import COLUMNS
from core.io.projectfile import load
from core.model.tugs import BOLLARD_PULL_NAME
from tests.conftest import SAMPLES


def test_the_briefing_and_the_window_name_the_bollard_pull_alike() -> None:
    assert BOLLARD_PULL_NAME == "rated bollard pull (BP)"  # CONVENTIONS.md's names table
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    (tugs,) = [
        b
        for b in tug_blocks(project)
        if isinstance(b, Table) and b.columns[0].title == "Tug" and len(b.columns) > 5
    ]
    titles = [c.title for c in tugs.columns]
    assert "Rated bollard pull (BP)" in titles and "Rated BP" not in titles
    bp = next(c for c in COLUMNS if c.key == "bp")
    assert bp.title == "Rated bollard pull (BP) ({force})"
    # the briefing's definition of rated pull names the same figure in the same words
    assert any(BOLLARD_PULL_NAME in w for w in PULL_WORDS)
