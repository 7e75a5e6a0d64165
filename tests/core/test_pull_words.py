"""Each of a tug's figures has one name in every view (F4 of the hand check, where "use"
meant three things): rated pull, usable pull, setting and share of rated pull, checked
against the hand check's figures for Tern in the deck barge's tow out (stage 4)."""

from __future__ import annotations

import math

import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.io.report import report_json, report_text
from core.io.tables import tug_table
from tests.conftest import SAMPLES

TOW_OUT = 3  # stage 4: Tern pushing 30 deg off square at 2 kn through the water

# Hand calculation (the hand check of the sample):
#   bollard pull 32 t = 32 x 9806.65 N = 313 812.8 N
#   push capability share 30 deg off square: 1 - 0.35 x 30/45 = 0.76667
#   rated pull = 313 812.8 x 0.76667 = 240 590 N
#   usable pull = rated x efficiency 1.0 (sea state 0) x cos 0 (a push) x headway 0.9
#                 (2 kn) = 216 531 N
#   assigned pull 25 941 N = 2.65 t: setting 25 941 / 216 531 = 12.0 %,
#   share of rated pull 25 941 / 240 590 = 10.8 %
RATED_N = 313_812.8 * (1 - 0.35 * 30 / 45)
USABLE_N = RATED_N * 1.0 * math.cos(0.0) * 0.9
PULL_N = 25_941.0


def _tern():  # type: ignore[no-untyped-def]
    project = load(SAMPLES / "deck_barge_unberth.towboard")
    result = stage_result(project, TOW_OUT)
    return project, next(s for s in result.main.balance.shares if s.tug == "Tern")


def test_the_core_works_each_figure_as_the_hand_check_does() -> None:
    _, tern = _tern()
    assert tern.rated_n == pytest.approx(RATED_N, rel=1e-4)  # 240 590 N
    assert tern.usable_n == pytest.approx(USABLE_N, rel=1e-4)  # 216 531 N
    assert tern.pull_n == pytest.approx(PULL_N, rel=1e-4)
    assert tern.setting == pytest.approx(PULL_N / USABLE_N, rel=1e-4)  # 12.0 %
    assert tern.share_of_rated == pytest.approx(PULL_N / RATED_N, rel=1e-4)  # 10.8 %


def test_the_report_and_csv_name_each_figure_once() -> None:
    project, _ = _tern()
    text = report_text(project).split("Stage 4:")[1]
    header = next(ln for ln in text.splitlines() if ln.lstrip().startswith("Tug "))
    assert header.rstrip().endswith("Share of rated pull")
    assert " Use" not in header
    row = next(ln for ln in text.splitlines() if ln.startswith("  Tern ") and " push " in ln)
    assert " 12 % " in row and row.rstrip().endswith(" 11 %")  # setting, share of rated
    assert "largest setting 22 %" in text  # Gannet's setting, the solve's largest
    assert "largest use" not in report_text(project)

    rows = tug_table(report_json(project))
    head = rows[0]
    assert "Share of rated pull (fraction)" in head
    assert not any("Use" in h for h in head)
    tern_row = next(
        r for r in rows[1:] if r[head.index("Stage no.")] == "4" and r[head.index("Tug")] == "Tern"
    )
    assert float(tern_row[head.index("Share of rated pull (fraction)")]) == pytest.approx(
        PULL_N / RATED_N, rel=1e-4
    )
