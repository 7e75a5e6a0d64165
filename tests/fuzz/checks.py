"""What every file, however hostile, must get from Towboard: either a refusal from the
project's own error family (TowboardError, one line naming the field) or a plan that
reports, saves and loads back with finite numbers (and briefs, where asked)."""

from __future__ import annotations

import json
import re
from pathlib import Path
from typing import Literal

from core.errors import TowboardError
from core.io.projectfile import dumps, load, load_bytes, save
from core.io.report import report_json, report_text
from core.model.plan import Project

#: A number that is not one: nan or inf as a word of the text.
NOT_FINITE = re.compile(r"(?<![A-Za-z])(nan|-?inf(inity)?)(?![A-Za-z])", re.IGNORECASE)


def outcome(data: bytes, tmp: Path) -> tuple[Literal["refused", "accepted"], Project | None]:
    """Load ``data`` as a .towboard file and, if it loads, report and save it.

    Raises AssertionError (or lets any other exception through) when the file is neither
    refused cleanly nor carried through with finite numbers.
    """
    try:
        project = load_bytes(data, "fuzz.towboard")
    except TowboardError as e:
        message = str(e)
        assert message and "\n" not in message, f"not a one-line message: {message!r}"
        return "refused", None
    carried_through(project, tmp)
    return "accepted", project


def carried_through(project: Project, tmp: Path) -> None:
    """The report (JSON and text) has finite numbers; save -> load gives the same file."""
    json.dumps(report_json(project), allow_nan=False)  # ValueError on nan or inf
    text = report_text(project)
    found = NOT_FINITE.search(text)
    assert found is None, f"the report prints {found.group()!r}"
    out = save(project, tmp / "fuzz.towboard")
    assert dumps(load(out)) == dumps(project)


def brief_is_finite(project: Project, tmp: Path) -> int:
    """Write the briefing PDF and check its text for nan and inf; returns the page count."""
    from pypdf import PdfReader

    from app.briefing.document import write_pdf

    out = tmp / "fuzz.pdf"
    pages = write_pdf(project, out)
    for i, page in enumerate(PdfReader(out).pages):
        found = NOT_FINITE.search(page.extract_text() or "")
        assert found is None, f"page {i + 1} of the briefing prints {found.group()!r}"
    return pages
