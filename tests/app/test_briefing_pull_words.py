"""The briefing names a tug's figures as the report does, and its conventions page says
exactly how each is worked out (F4 of the hand check)."""

from __future__ import annotations

from app.briefing.cover import conventions
from app.briefing.layout import Table, Text
from app.briefing.stage_page import stage_blocks
from core.analysis.stage import plan_results
from core.io.projectfile import load
from tests.conftest import SAMPLES


def test_the_tugs_table_says_share_of_rated_pull_and_the_glossary_says_how() -> None:
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    results = plan_results(project)
    tables = [b for b in stage_blocks(project, results[3], 60.0) if isinstance(b, Table)]
    tugs = next(t for t in tables if t.columns[0].title == "Tug" and len(t.columns) == 8)
    titles = [c.title for c in tugs.columns]
    assert titles[3:7] == ["Setting", "Assigned pull", "Usable pull", "Share of rated pull"]
    tern = next(r for r in tugs.rows if r[0] == "Tern")
    # hand check, Tern in stage 4: 25 941 N / 216 531 N usable = 12 %; / 240 590 N rated = 11 %
    assert (tern[3], tern[4], tern[6]) == ("12 %", "2.6 t", "11 %")

    words = " ".join(b.text for b in conventions(project) if isinstance(b, Text))
    assert "Use is" not in words
    # the bollard pull by its one name (CONVENTIONS.md), as the tugs table heads it
    assert (
        "Rated pull: the tug's rated bollard pull (BP) times its capability share at the lead"
        in words
    )
    assert (
        "Usable pull: rated pull × efficiency (sea state) × cos(towline angle to the "
        "horizontal; 1 for a push) × headway share"
    ) in words
    assert "Setting: assigned pull ÷ usable pull" in words
    assert "Share of rated pull: assigned pull ÷ rated pull." in words
