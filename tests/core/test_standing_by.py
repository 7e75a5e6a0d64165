"""A tug is standing by only at a setting of exactly nothing: any pull the stage counts
is work, and a small setting is printed with the digits it needs (F2 of the hand check:
a 0.5 % setting printed "0 %, standing by" while the stage's GO rested on its pull)."""

from __future__ import annotations

import pytest

from core.analysis.stage import plan_results, stage_result
from core.io.projectfile import load
from core.io.report import report_text
from core.model.tugs import setting_cell, setting_words, standing_by
from core.units import percent
from tests.conftest import SAMPLES

DECK = SAMPLES / "deck_barge_unberth.towboard"
HOLD = 2  # stage 3, hold while the dredger clears the entrance: Gannet at 0.5 %


@pytest.mark.parametrize(
    ("fraction", "text"),
    [
        (0.0, "0"),
        (0.005, "0.5"),  # the sample's Gannet: 0.5 %, not "0"
        (0.0004, "0.04"),
        (0.00000001, "under 0.001"),
        (0.0064, "0.6"),
        (0.0096, "1"),  # rounds up to a whole percent
        (0.22, "22"),
        (1.0, "100"),
        # never over 100 for a value under it, nor 100 or less for one over it
        (1.003, "100.3"),  # an over-limit setting, not "100"
        (0.997, "99.7"),  # under the limit, not "100"
        (1.0004, "100.04"),
        (1.000004, "just over 100"),
        (0.999996, "just under 100"),
        (1.0 + 1e-12, "100"),  # within the checks' 1e-9: at the limit
        (1.05, "105"),
    ],
)
def test_a_percent_reads_0_only_for_nothing(fraction: float, text: str) -> None:
    # hand written: fraction x 100, whole percents, a small one to its first digit, and
    # one near 100 to the digit that keeps it on its own side of 100
    assert percent(fraction) == text


def test_standing_by_is_a_setting_of_exactly_nothing() -> None:
    assert standing_by(0.0)
    assert not standing_by(0.005)
    assert not standing_by(1e-9)
    assert setting_words(0.0) == "0 %, standing by"
    assert setting_words(0.005) == "0.5 %"
    assert setting_words(0.6) == "60 %"
    # a narrow column's words: the setting of nothing said by "standing by" alone
    assert setting_cell(0.0) == "standing by"
    assert setting_cell(0.005) == "0.5 %"
    assert setting_cell(0.6) == "60 %"


def test_the_sample_tug_whose_pull_the_hold_needs_is_not_standing_by() -> None:
    project = load(DECK)
    result = stage_result(project, HOLD)
    gannet = next(s for s in result.main.balance.shares if s.tug == "Gannet")
    assert gannet.setting == pytest.approx(0.005)
    # GO but for the caution that the tugs hold the 20 kn limit only from some directions
    assert [r.code for r in result.verdict.reasons] == ["wind_limit_not_held_all_round"]
    # the review's check that its pull matters: set to nothing, the hold is NO-GO
    stage = project.stages[HOLD]
    idle = project.with_stage(
        stage.with_placement(stage.placement("Gannet").with_setting(0.0)), HOLD
    )
    assert plan_results(idle)[HOLD].verdict.status == "no-go"

    assert not gannet.standing_by
    assert not stage.placement("Gannet").standing_by
    assert gannet.setting_words == "0.5 %"
    text = report_text(project).split("Stage 3:")[1].split("Stage 4:")[0]
    row = next(ln for ln in text.splitlines() if ln.startswith("  Gannet ") and " line " in ln)
    assert " 0.5 % " in row and "standing by" not in row


def test_a_solved_pull_standing_by_keeps_its_columns_and_gives_no_direction() -> None:
    # The sample's unberth (stage 1): the walk is solved with Tern at nothing. Its row
    # says "standing by" where the others' "setting" starts, and no bearing: a tug that
    # pulls nothing pulls towards nowhere.
    text = report_text(load(DECK)).split("Stage 1:")[1].split("Stage 2:")[0]
    solved = text.split("  Solved pulls")[1].split("  Tug lost check")[0].splitlines()[1:]
    rows = {ln.split()[0]: ln for ln in solved}
    assert rows["Tern"] == "    Tern               0.0 t  standing by"
    working = rows["Gannet"]
    assert working.index("setting") == rows["Tern"].index("standing by")
    assert "pulling towards" in working and "pulling towards" not in rows["Tern"]
