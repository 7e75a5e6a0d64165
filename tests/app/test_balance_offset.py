"""The balance panel's line of action: a side is named only for an offset that reads
more than nothing."""

from __future__ import annotations

from app.controller import Controller
from app.panels.balance_panel import BalancePanel
from core.io.projectfile import load
from core.units import DisplayUnits
from tests.conftest import SAMPLES


def test_an_offset_that_reads_zero_names_no_side(qtbot) -> None:  # type: ignore[no-untyped-def]
    # The deck barge's tow out (stage 4): the tugs' pull lies on the centreline, its
    # worked offset a few 1e-11 m off it. The panel read "0.0 m, to the left of it looking
    # along the force", a side for nothing, where the report says "0.0 m from the
    # centroid; along the centreline".
    c = Controller(load(SAMPLES / "deck_barge_unberth.towboard"))
    panel = BalancePanel(c)
    qtbot.addWidget(panel)
    c.set_stage_index(3)
    panel.refresh()
    assert panel.fields["offset"].text() == "0.0 m, through the centroid"
    # in feet, the same; and a real offset (stage 1, 0.9 ft ahead of the centroid with the
    # net force to starboard) still names its side
    c.apply(c.project.with_units(DisplayUnits("kip", "kip*ft", "ft", "kn")), "units")
    panel.refresh()
    assert panel.fields["offset"].text() == "0.0 ft, through the centroid"
    c.set_stage_index(0)
    panel.refresh()
    assert panel.fields["offset"].text() == "0.9 ft, to the left of it looking along the force"
