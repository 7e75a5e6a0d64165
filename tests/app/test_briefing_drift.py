"""The drift preview in the printed briefing, read back from the PDF: the stage result's
drift (worst tug lost and lines let go: what is touched, when, how hard), and the caution."""

from __future__ import annotations

from pathlib import Path

import pytest

from core.analysis.stage import stage_result
from core.io.projectfile import load
from core.motion.drift import DRIFT_CAUTION
from core.motion.summary import time_words
from tests.app.test_briefing import norm, pages_text

ROOT = Path(__file__).resolve().parents[2]
TWIN = ROOT / "sample_projects" / "twin_barge_move.towboard"
KNOT = 1852.0 / 3600.0


@pytest.fixture(scope="module")
def twin_pdf(tmp_path_factory, qapp):  # type: ignore[no-untyped-def]
    from app.briefing.document import write_pdf

    project = load(TWIN)
    out = tmp_path_factory.mktemp("brief") / "twin.pdf"
    write_pdf(project, out, "a4")
    return project, pages_text(out)


def test_every_stage_prints_its_drift_preview(twin_pdf) -> None:  # type: ignore[no-untyped-def]
    project, texts = twin_pdf
    whole = " ".join(texts)
    assert whole.count("Drift preview ") >= len(project.stages)
    assert norm(DRIFT_CAUTION) in whole


def test_the_berth_prints_the_core_s_first_contact(twin_pdf) -> None:  # type: ignore[no-untyped-def]
    project, texts = twin_pdf
    sd = stage_result(project, 3).drift
    w = sd.worst
    assert w is not None and w.contact is not None
    drift_pages = [t for t in texts if "Drift preview " in t]
    assert len(drift_pages) == len(project.stages)  # one section a stage, in order
    page = drift_pages[3]
    assert f"Worst tug lost ({w.problem.scenario.tug})" in page
    assert f"{w.contact.other} (quay) after {time_words(w.contact.time_s)}" in page
    assert f"{w.contact.closing_speed_ms / KNOT:.2f} kn" in page
    assert f"none within {time_words(project.drift.horizon_s)}" in page  # lines let go
    for t in project.drift.times_s:
        assert f"At {t:g} s" in page
