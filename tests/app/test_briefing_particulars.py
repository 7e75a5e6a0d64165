"""The plan's particulars on paper: every tug field, every fitting rating, the history."""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

from core.io.projectfile import load
from core.model.plan import Revision
from tests.app.test_briefing import pages_text

ROOT = Path(__file__).resolve().parents[2]


def test_tug_particulars_fitting_ratings_and_history_are_printed(qapp, tmp_path) -> None:  # type: ignore[no-untyped-def]
    from app.briefing.document import write_pdf

    project = load(ROOT / "sample_projects" / "twin_barge_move.towboard")
    rowan = replace(
        project.tug("Rowan"),
        certificate_date="2026-05-14",
        towline_length_m=220.0,
        towline_mbl_n=1.6e6,
        call_sign="MRWN7",
        working_channel="VHF 14",
    )
    hull = project.hulls[0]
    bitt = hull.fitting("Bow centre bitt")
    # rated for lines leading from 045 to 135 relative (hull-frame angles -135 .. -45 deg)
    rated = replace(bitt, tow_n=700e3, permitted_lead_rad=(-math.radians(135), -math.radians(45)))
    hull = replace(hull, fittings=tuple(rated if f is bitt else f for f in hull.fittings))
    history = (Revision("A", "2027-01-10", "J. Amadi", "first issue"),)
    plan = replace(
        project.with_tug(rowan),
        hulls=(hull, *project.hulls[1:]),
        history=history,
    )
    out = tmp_path / "plan.pdf"
    write_pdf(plan, out)
    text = " ".join(pages_text(out))
    u = plan.units
    assert "2026-05-14" in text and "MRWN7" in text and "VHF 14" in text
    assert f"Rowan {u.show(220.0, 'length')} {u.show(1.6e6, 'force')} MRWN7 VHF 14" in text
    assert f"{u.show(700e3, 'force')} 045° to 135°" in text
    assert "Revision history" in text and "A 2027-01-10 J. Amadi first issue" in text
