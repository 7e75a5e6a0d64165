"""The plan in the main window: stage list, site and clearances on the board, print and PDF."""

from __future__ import annotations

import unicodedata
from dataclasses import replace

import pypdf
import pytest
import shapely
from PySide6.QtCore import Qt
from PySide6.QtPrintSupport import QPrintDialog, QPrinter, QPrintPreviewDialog, QPrintPreviewWidget
from PySide6.QtWidgets import QDialog, QFileDialog, QMessageBox

from app.window.main_window import MainWindow
from core.io.projectfile import load
from core.mechanics.clearance import notable_clearances
from core.model.plan import BodyPose
from tests.conftest import SAMPLES

TWIN = SAMPLES / "twin_barge_move.towboard"


def norm(text: str) -> str:
    return " ".join(unicodedata.normalize("NFKC", text).split())


@pytest.fixture
def window(qtbot, tmp_path, monkeypatch):
    monkeypatch.setenv("TOWBOARD_SETTINGS_FILE", str(tmp_path / "settings.ini"))
    w = MainWindow(load(TWIN), TWIN)
    qtbot.addWidget(w)
    w.show()
    yield w
    w.controller.undo_stack.clear()


def action_texts(menu):
    return [a.text() for a in menu.actions()]


def test_the_window_has_the_stage_list_and_the_briefing_actions(window):
    assert "stages" in window.panels
    assert window.panels["stages"].widget() is window.plan_ui.stage_list
    files = action_texts(window.menu("file"))
    for text in ("Print Pre&view…", "&Print…", "&Export Briefing PDF…"):
        assert text in files
    assert files.index("&Export Briefing PDF…") < files.index("&Quit")
    plan = action_texts(window.menu("plan"))
    assert "&Add stage" in plan and "De&lete stage" in plan and "Briefing &paper" in plan


def test_selecting_a_stage_shows_it_on_the_board_with_its_clearances(window, qtbot):
    sl = window.plan_ui.stage_list
    rect = sl.list.visualItemRect(sl.list.item(3))
    qtbot.mouseClick(sl.list.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    stage = window.controller.project.stages[3]
    assert window.board.stage() is stage
    assert window.stage_box.currentIndex() == 3
    # clearances on the board: the core's, checked here against shapely directly
    site = window.plan_ui.site
    project = window.controller.project
    pair = window.board.bodies["Lark pair"]
    assert pair.body is not None
    quay = next(f for f in project.site.features if f.name == "Lay-by quay")
    least = min(site.clearances, key=lambda c: c.distance_m)
    assert least.other == "Lay-by quay"
    # The pair lies bows north with Lark 41's port side (group y = +11 m) towards the quay
    # at x = -200: its reference point at x = -183 puts that side at x = -194, 6 m off.
    assert least.distance_m == pytest.approx(6.0)
    outline = shapely.Polygon(
        [(-183.0 - y, 120.0 + x) for x, y in pair.body.polygon.exterior.coords]
    )
    assert least.distance_m == pytest.approx(outline.distance(shapely.LineString(quay.points)))
    texts = [lab.text for lab in site.clearance_labels]
    assert f"{project.units.show(least.distance_m, 'length')} to {least.other}" in texts
    assert len(site.clearance_labels) == len(notable_clearances(site.clearances))


def test_site_features_are_drawn_and_clearances_follow_a_moved_body(window):
    site = window.plan_ui.site
    names = {f.name for f, _, _ in site.features}
    assert names == {f.name for f in window.controller.project.site.features}
    roles = {item.data(0) for item in window.board.items()}
    assert ("site", "Northern Wren") in roles
    window.controller.set_stage_index(0)
    before = min(c.distance_m for c in site.clearances)
    assert before == pytest.approx(10.0)  # 10 m off the fitting-out quay (the sample's pose)
    stage = window.controller.project.stages[0]
    moved = replace(stage, poses=(BodyPose("Lark pair", 40.0, 37.0, 90.0),))  # 6 m closer
    window.controller.apply(window.controller.project.with_stage(moved, 0), "Move the pair")
    low = min(site.clearances, key=lambda c: c.distance_m)
    assert low.distance_m == pytest.approx(4.0) and low.below_margin  # under the 5 m minimum
    assert any("margin 5.0 m" in lab.text for lab in site.clearance_labels)
    window.controller.undo_stack.undo()
    assert min(c.distance_m for c in site.clearances) == pytest.approx(10.0)


def test_export_pdf(window, tmp_path, monkeypatch):
    out = tmp_path / "brief"  # no suffix given: .pdf is added
    monkeypatch.setattr(
        QFileDialog, "getSaveFileName", lambda *a, **k: (str(out), "PDF files (*.pdf)")
    )
    window.plan_ui.set_paper("letter")
    window.plan_ui.act_export.trigger()
    pdf = tmp_path / "brief.pdf"
    reader = pypdf.PdfReader(pdf)
    assert float(reader.pages[0].mediabox.width) == pytest.approx(612, abs=1)  # 8.5 in x 72
    text = norm(" ".join(p.extract_text() for p in reader.pages))
    for s in window.controller.project.stages:
        assert s.name in text
    assert window.statusBar().currentMessage().startswith(f"Briefing written to {pdf}")


def test_export_to_a_missing_folder_says_so_and_writes_nothing(window, tmp_path, monkeypatch):
    target = tmp_path / "nowhere" / "plan.pdf"
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *a, **k: (str(target), ""))
    said = []
    monkeypatch.setattr(QMessageBox, "warning", lambda parent, title, text: said.append(text))
    assert window.plan_ui.export_pdf() is None
    assert said and "does not exist" in said[0]
    assert not target.parent.exists()


def test_export_never_writes_over_the_plan_it_was_opened_from(window, tmp_path, monkeypatch):
    # a plan kept under a .pdf name: the export's suggested name is the plan itself
    plan = tmp_path / "plan.pdf"
    plan.write_bytes((SAMPLES / "pontoon_swing.towboard").read_bytes())
    assert window.open_path(plan, ask=False)
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *a, **k: (str(plan), ""))
    said = []
    monkeypatch.setattr(QMessageBox, "warning", lambda parent, title, text: said.append(text))
    assert window.plan_ui.export_pdf() is None
    assert said == [f"briefing file: '{plan}' is the plan itself; give the briefing its own name"]
    assert load(plan).name == window.controller.project.name
    assert not [p for p in tmp_path.iterdir() if "pdf" in p.name and p != plan]  # no temporary


def test_print_preview_shows_every_page(window, monkeypatch):
    seen = {}

    def fake_exec(dialog):
        dialog.show()
        preview = dialog.findChild(QPrintPreviewWidget)
        preview.updatePreview()
        seen["pages"] = preview.pageCount()
        dialog.close()
        return 0

    monkeypatch.setattr(QPrintPreviewDialog, "exec", fake_exec)
    window.plan_ui.act_preview.trigger()
    from app.briefing.document import Document, content_of

    printer = window.plan_ui.printer()
    expected = len(Document(content_of(window.controller.project), printer).pages)
    assert seen["pages"] == expected >= 8


def test_print_sends_the_briefing_to_the_printer(window, tmp_path, monkeypatch):
    out = tmp_path / "printed.pdf"
    make = window.plan_ui.printer

    def pdf_printer():
        p = make()
        p.setOutputFormat(QPrinter.OutputFormat.PdfFormat)
        p.setOutputFileName(str(out))
        return p

    window.plan_ui.set_paper("a4")
    monkeypatch.setattr(window.plan_ui, "printer", pdf_printer)
    monkeypatch.setattr(QPrintDialog, "exec", lambda self: QDialog.DialogCode.Accepted)
    window.plan_ui.act_print.trigger()
    reader = pypdf.PdfReader(out)
    n = len(reader.pages)
    assert f"page {n} of {n}" in norm(reader.pages[-1].extract_text())
    assert float(reader.pages[0].mediabox.height) == pytest.approx(842, abs=1)  # A4, 297 mm


def test_the_briefing_numbers_are_the_boards(window):
    from core.analysis.checks import check_plan

    project = window.controller.project
    u = project.units
    for check in check_plan(project):
        board = window.controller.results_for(check.index)
        for b in check.balances:
            shown = board[b.body].balance
            assert u.show(shown.net_magnitude, "force") == u.show(b.net_magnitude, "force")
            assert shown.net_force == pytest.approx(b.net_force, rel=1e-12, abs=1e-9)
            assert shown.moment_centroid_nm == pytest.approx(
                b.moment_centroid_nm, rel=1e-12, abs=1e-6
            )
            assert [(s.tug, u.show(s.pull_n, "force")) for s in shown.shares] == [
                (s.tug, u.show(s.pull_n, "force")) for s in b.shares
            ]
            assert [ld.name for ld in shown.loads] == [ld.name for ld in b.loads]
