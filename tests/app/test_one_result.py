"""Every view says the same of a stage: the balance panel, the stage list, the report JSON
and the briefing PDF read one stage result, so their figures and verdicts agree.

The samples are checked stage by stage, and generated plans (hypothesis) reach every
verdict. Each view is read back from what it shows: the panel's labels, the list's rows,
the JSON text, the PDF's text (pypdf).
"""

from __future__ import annotations

import json
import re
import unicodedata
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from PySide6.QtWidgets import QMessageBox

from app.controller import Controller
from app.formatting import signed
from app.panels.balance_panel import BalancePanel
from app.panels.stage_list import StageList
from app.panels.tugs_model import COLUMNS
from app.panels.verdict_view import VerdictView
from app.window.main_window import MainWindow
from core.analysis.stage import compute_stage_result
from core.io.projectfile import load
from core.io.report import report_json
from core.model.plan import Project
from tests.conftest import SAMPLES
from tests.plan_strategies import plans

MARK = {"go": "GO", "caution": "CAUTION", "no-go": "NO-GO"}


@pytest.fixture(scope="module")
def window(qapp, tmp_path_factory: pytest.TempPathFactory):  # type: ignore[no-untyped-def]
    import os

    folder = tmp_path_factory.mktemp("one-result")
    os.environ["TOWBOARD_RECOVERY_DIR"] = str(folder / "recovery")
    os.environ["TOWBOARD_SETTINGS_FILE"] = str(folder / "settings.ini")
    w = MainWindow()
    w.resize(1400, 900)
    yield w
    w.controller.undo_stack.clear()
    w.close()


def _pdf_text(project: Project, path: Path) -> str:
    from pypdf import PdfReader

    from app.briefing.document import write_pdf

    write_pdf(project, path)
    raw = "\n".join(page.extract_text() for page in PdfReader(str(path)).pages)
    return " ".join(unicodedata.normalize("NFKC", raw).split())


class Panels:
    """The views that say a stage's verdict and figures, without the board: the balance
    panel, the verdict line and the stage list, on one controller (fast enough for
    hundreds of generated plans)."""

    def __init__(self) -> None:
        self.controller = Controller()
        self.balance_panel = BalancePanel(self.controller)
        self.verdict_line = VerdictView(self.controller, brief=True)
        self.stage_list = StageList(self.controller)


@pytest.fixture(scope="module")
def panels(qapp):  # type: ignore[no-untyped-def]
    p = Panels()
    yield p
    p.controller.undo_stack.clear()


def _views_agree(w: MainWindow | Panels, project: Project, pdf: Path | None) -> None:
    """Show ``project`` and read every view back, stage by stage."""
    c = w.controller
    c.reset(project)
    stage_list = w.stage_list if isinstance(w, Panels) else w.plan_ui.stage_list  # type: ignore[attr-defined]
    stage_list.recheck()
    report = report_json(project)
    json.dumps(report, allow_nan=False)  # no non-finite number anywhere
    text = _pdf_text(project, pdf) if pdf is not None else ""
    u = project.units
    for i, stage in enumerate(project.stages):
        ref = compute_stage_result(project, i)  # from scratch, no cache
        status = ref.verdict.status
        # the report JSON
        rj = report["stages"][i]
        assert rj["verdict"]["status"] == status
        assert [r["text"] for r in rj["verdict"]["reasons"]] == [
            r.text for r in ref.verdict.reasons
        ]
        # the stage list
        row = stage_list.list.item(i).text()
        assert row.endswith(MARK[status]), (row, status)
        # the balance panel and the verdict line, on the stage shown
        c.set_stage_index(i)
        panel = w.balance_panel
        panel.verdict.refresh()
        assert panel.verdict.verdict is not None
        assert panel.verdict.verdict.status == status
        assert f">{MARK[status]}<" in panel.verdict.text()
        w.verdict_line.refresh()
        assert f">{MARK[status]}<" in w.verdict_line.text()
        main = ref.main
        if main is None:
            assert rj["balance"] is None
            continue
        net = u.show(main.balance.net_magnitude, "force")
        assert panel.fields["net"].text() == net
        assert u.show(rj["balance"]["net_force_N"]["magnitude"], "force") == net
        # the yaw moment about the centroid, to the same digits in the panel and on the board
        yaw = signed(u, rj["balance"]["yaw_moment_about_centroid_Nm"], "moment")
        assert yaw == signed(u, main.balance.equivalent.moment, "moment")
        assert panel.fields["moment_centroid"].text().startswith(f"{yaw} "), yaw
        if isinstance(w, MainWindow):
            board_label = w.board.bodies[main.balance.body].balance.moment_label
            if board_label.isVisible():
                assert board_label.text.startswith(f"yaw {yaw}\n"), (board_label.text, yaw)
            # each tug's share of it in the tugs table, to the unit's digits as well
            model = w.tugs_panel.model
            col = [c.key for c in COLUMNS].index("moment")
            cells = {
                model.index(r, 0).data(): model.index(r, col).data()
                for r in range(model.rowCount())
            }
            for sh in main.balance.shares:
                mine = signed(u, sh.moment_centroid_nm, "moment").rsplit(" ", 1)[0]
                assert cells[sh.tug] == mine, (sh.tug, cells[sh.tug], mine)
        # the briefing: the stage's verdict, its reasons and its net force in print
        if pdf is not None:
            assert re.search(rf"{re.escape(stage.name)}\b.*?{MARK[status]}", text), stage.name
            for r in ref.verdict.reasons:  # in print a reason starts with a capital
                assert " ".join(r.text.split())[:60].lower() in text.lower(), r.text
            assert net in text
            # the stage diagram labels the arc of a moment that shows, unless balanced
            if main.balance.equivalent.kind != "balanced" and yaw != signed(u, 0.0, "moment"):
                assert f"yaw {yaw}" in text, yaw


@pytest.mark.parametrize("sample", sorted(p.name for p in SAMPLES.glob("*.towboard")))
def test_every_view_of_every_sample_stage_agrees(window, sample: str, tmp_path: Path) -> None:  # type: ignore[no-untyped-def]
    _views_agree(window, load(SAMPLES / sample), tmp_path / "plan.pdf")


@settings(
    max_examples=200,
    deadline=None,
    suppress_health_check=[HealthCheck.function_scoped_fixture, HealthCheck.too_slow],
)
@given(project=plans())
def test_every_view_of_generated_plans_agrees(window, project: Project, monkeypatch) -> None:  # type: ignore[no-untyped-def]
    monkeypatch.setattr(QMessageBox, "question", lambda *a, **k: QMessageBox.StandardButton.Discard)
    _views_agree(window, project, None)


@settings(
    max_examples=25,
    deadline=None,
    suppress_health_check=[HealthCheck.function_scoped_fixture, HealthCheck.too_slow],
)
@given(project=plans(max_stages=2))
def test_generated_plans_print_what_the_window_shows(
    window, project: Project, tmp_path: Path, monkeypatch
) -> None:  # type: ignore[no-untyped-def]
    monkeypatch.setattr(QMessageBox, "question", lambda *a, **k: QMessageBox.StandardButton.Discard)
    _views_agree(window, project, tmp_path / "plan.pdf")
