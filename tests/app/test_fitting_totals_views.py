"""The briefing's fittings table and the tugs' notes read the core's fitting totals."""

from __future__ import annotations

from app.briefing.layout import Table
from app.briefing.stage_tables import fittings_table
from app.panels.solve_panel import tug_notes
from core.analysis.stage import stage_result
from core.model.goals import Goal
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
