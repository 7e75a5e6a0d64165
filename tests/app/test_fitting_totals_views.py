"""The briefing's fittings table and the tugs' notes read the core's fitting totals."""

from __future__ import annotations

from app.briefing.layout import Table
from app.briefing.stage_tables import fittings_table
from app.panels.solve_panel import tug_notes
from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.model.goals import Goal
from tests.conftest import SAMPLES
from tests.core.plan_builders import TF
from tests.core.test_fitting_totals import _two_at_bow


def test_the_briefing_and_the_tug_notes_show_the_shared_fittings_total() -> None:
    # Two tugs at 40 t each on the 50 t TOW bow bitt: 80 t together, 160 % (hand
    # calculation in tests/core/test_fitting_totals.py).
    p = _two_at_bow((40 / 45, 40 / 45), goal=Goal("force", fx_n=80 * TF))
    r = stage_result(p, 0)
    assert r.main is not None
    (table,) = [b for b in fittings_table(p, r, r.main) if isinstance(b, Table)]
    assert [
        "A + B",
        "Barge: bow",
        "bitt",
        "together",
        "80.0 t",
        "TOW 50.0 t",
        "OVER its rating",
    ] in [list(row) for row in table.rows]
    notes = tug_notes(r)
    assert "bow over its rating with 2 tugs" in notes["A"]
    assert "bow over its rating with 2 tugs" in notes["B"]


def test_the_briefing_prints_a_small_fitting_load_with_the_settings_digits() -> None:
    # The deck barge's hold (stage 3): Gannet's 0.3 t on the 80 t SWL bow bitt is 0.4 %
    # of it (0.3 / 80, hand calculation), not "0 %": the core's words for the load's use.
    p = load(SAMPLES / "deck_barge_unberth.towboard")
    r = stage_result(p, 2)
    assert r.main is not None
    (table,) = [b for b in fittings_table(p, r, r.main) if isinstance(b, Table)]
    gannet = next(row for row in table.rows if row[0] == "Gannet")
    load_use = next(f for f in r.main.fittings if f.tug == "Gannet").use_words
    assert gannet[-1] == f"{load_use} of its SWL"
    assert gannet[-1] != "0 % of its SWL" and gannet[-1].endswith(" % of its SWL")
    assert 0.1 <= float(gannet[-1].split(" %")[0]) < 1
