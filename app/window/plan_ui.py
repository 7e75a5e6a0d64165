"""The plan in the window: the stage list, the site on the board, and the briefing's
print preview, printing and PDF export.

``install(window)`` plugs all of it into a MainWindow through its hooks (a dock,
actions in the File and Plan menus, a refresh hook of the board). The briefing is
painted by app.briefing.document.document on the printer or PDF writer, so the preview, the paper and
the PDF are the same pages as ``towboard brief``.
"""

from __future__ import annotations

from pathlib import Path
from typing import TYPE_CHECKING

from PySide6.QtCore import QLocale, Qt
from PySide6.QtGui import QAction, QActionGroup, QKeySequence
from PySide6.QtPrintSupport import (
    QPrintDialog,
    QPrinter,
    QPrintPreviewDialog,
    QPrintPreviewWidget,
)
from PySide6.QtWidgets import (
    QDialog,
    QFileDialog,
    QMessageBox,
    QToolBar,
)

from app.board.site_layer import SiteLayer
from app.board.swing_layer import SwingLayer
from app.briefing.document import page_layout, render, write_pdf
from app.guard import guarded
from app.panels.site_panel import SitePanel
from app.panels.stage_details import StageDetails
from app.panels.stage_list import StageList
from app.window.plan_details import PlanDetailsDialog, open_plan_details
from core.errors import TowboardError

if TYPE_CHECKING:
    from app.window.main_window import MainWindow


def default_paper() -> str:
    """US Letter where the locale measures in US units, else A4."""
    us = QLocale.MeasurementSystem.ImperialUSSystem
    return "letter" if QLocale.system().measurementSystem() == us else "a4"


class PlanUi:
    """What the plan adds to the main window (kept as ``window.plan_ui``)."""

    def __init__(self, window: MainWindow) -> None:
        self.window = window
        self.controller = window.controller
        self.stage_list = StageList(self.controller)
        self.stage_details = StageDetails(self.controller)
        self.site_panel = SitePanel(self.controller)
        left = Qt.DockWidgetArea.LeftDockWidgetArea
        window.add_panel("stages", self.stage_list, "Stages", left)
        window.add_panel("stage", self.stage_details, "Stage", left, scroll=True)
        window.add_panel("site", self.site_panel, "Site", left, tabify_with="stage")
        window.panels["stage"].raise_()
        self.site = SiteLayer(window.board)
        self.swing = SwingLayer(window.board)
        self.paper = default_paper()
        K = QKeySequence.StandardKey
        self.act_preview = self._action(
            "Print Pre&view…", self.preview, tip="See the briefing's pages"
        )
        self.act_print = self._action("&Print…", self.print_briefing, K.Print, "Print the briefing")
        self.act_export = self._action(
            "&Export Briefing PDF…", self.export_pdf, "Ctrl+Shift+E", "Write the briefing as a PDF"
        )
        for a in (self.act_preview, self.act_print, self.act_export):
            window.add_file_action(a)
        plan = window.menu("plan")
        self.act_details = self._action(
            "Plan &details…",
            self.plan_details,
            tip="Name, revision, date, sign-off, revision history and notes of the plan",
        )
        plan.addAction(self.act_details)
        plan.addSeparator()
        sl = self.stage_list
        for text, slot in (
            ("&Add stage", sl.add),
            ("&Duplicate stage", sl.duplicate),
            ("Move stage &up", lambda: sl.move(-1)),
            ("Move stage do&wn", lambda: sl.move(1)),
            ("&Rename stage", sl.rename),
            ("De&lete stage", sl.delete),
        ):
            plan.addAction(self._action(text, slot))
        plan.addAction(self._action("Add site &feature…", self.site_panel.add))
        plan.addSeparator()
        paper_menu = plan.addMenu("Briefing &paper")
        group = QActionGroup(window)
        self.paper_actions: dict[str, QAction] = {}
        for key, text in (("a4", "A4"), ("letter", "US Letter")):
            a = self._action(text, lambda _=False, k=key: self.set_paper(k))
            a.setCheckable(True)
            a.setChecked(key == self.paper)
            group.addAction(a)
            paper_menu.addAction(a)
            self.paper_actions[key] = a
        plan.addActions([self.act_preview, self.act_print, self.act_export])

    def _action(self, text: str, slot, shortcut=None, tip: str = "") -> QAction:  # type: ignore[no-untyped-def]
        a = QAction(text, self.window)
        if shortcut is not None:
            a.setShortcut(QKeySequence(shortcut))
        if tip:
            a.setStatusTip(tip)
        a.triggered.connect(guarded(slot))
        return a

    def plan_details(self) -> PlanDetailsDialog:
        """Open the plan details dialog (the briefing's title block)."""
        return open_plan_details(self.controller, self.window)

    def set_paper(self, paper: str) -> None:
        page_layout(paper)  # refuses an unknown paper
        self.paper = paper
        self.paper_actions[paper].setChecked(True)

    # -- printing ------------------------------------------------------------------------
    def printer(self) -> QPrinter:
        """A printer set to the briefing's paper, drawing on the whole sheet."""
        p = QPrinter(QPrinter.PrinterMode.HighResolution)
        p.setFullPage(True)
        p.setPageLayout(page_layout(self.paper))
        p.setDocName(f"{self.controller.project.name} briefing")
        return p

    def paint(self, printer: QPrinter) -> int:
        """Paint the briefing of the current plan on ``printer``; the page count."""
        return render(printer, self.controller.project)

    def preview(self) -> None:
        printer = self.printer()
        dialog = QPrintPreviewDialog(printer, self.window)
        dialog.setWindowTitle("Briefing: print preview")
        dialog.paintRequested.connect(self._paint_safely)
        dialog.resize(900, 1000)
        self._add_details_button(dialog)
        self.last_dialog, self._preview_printer = dialog, printer  # the dialog paints on it
        dialog.exec()

    def _add_details_button(self, dialog: QPrintPreviewDialog) -> None:
        """A "Plan details…" button on the preview's toolbar; the pages follow the edit."""
        bar = dialog.findChild(QToolBar)
        pages = dialog.findChild(QPrintPreviewWidget)
        if bar is None or pages is None:
            return
        act = QAction("Plan details…", dialog)
        act.setToolTip("Edit the title block the cover prints: name, revision, sign-off, notes")
        act.setObjectName("preview_plan_details")

        def edit() -> None:
            details = open_plan_details(self.controller, dialog)
            details.accepted.connect(pages.updatePreview)

        act.triggered.connect(guarded(edit))
        bar.addSeparator()
        bar.addAction(act)

    def print_briefing(self) -> None:
        printer = self.printer()
        dialog = QPrintDialog(printer, self.window)
        dialog.setWindowTitle("Print the briefing")
        if dialog.exec() == QDialog.DialogCode.Accepted:
            self._paint_safely(printer)

    @guarded
    def _paint_safely(self, printer: QPrinter) -> None:
        try:
            n = self.paint(printer)
        except (TowboardError, OSError) as e:
            QMessageBox.warning(self.window, "Briefing not printed", str(e).splitlines()[0])
            return
        self.controller.message.emit(f"Briefing: {n} pages")

    def export_pdf(self) -> Path | None:
        c = self.controller
        start = c.path.with_suffix(".pdf") if c.path is not None else Path("briefing.pdf")
        name, _ = QFileDialog.getSaveFileName(
            self.window, "Export the briefing as PDF", str(start), "PDF files (*.pdf)"
        )
        if not name:
            return None
        path = Path(name)
        if path.suffix.lower() != ".pdf":
            path = path.with_suffix(".pdf")
        try:
            n = write_pdf(c.project, path, self.paper, plan_path=c.path)
        except (TowboardError, OSError) as e:
            QMessageBox.warning(self.window, "Briefing not written", str(e).splitlines()[0])
            return None
        c.message.emit(f"Briefing written to {path} ({n} pages, {self.paper})")
        return path


def install(window: MainWindow) -> PlanUi:
    ui = PlanUi(window)
    window.plan_ui = ui  # type: ignore[attr-defined]
    return ui
