"""Drawings in and out of the window: File > Import outline…, Import site…, Export
picture…, Export tables….

``install(window)`` adds the four actions to the File menu through the window's hook
and keeps itself as ``window.drawings_ui``. An import is one undoable edit; a file
that cannot be read, or an outline that does not close, is said in a message and the
plan is left as it was. Pictures and tables are written whole or not at all.
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path
from typing import TYPE_CHECKING

from PySide6.QtGui import QAction
from PySide6.QtWidgets import QDialog, QFileDialog, QMessageBox

from app.drawings.pictures import write_picture
from app.guard import guarded
from app.window.export_dialogs import PictureDialog, TablesDialog
from app.window.outline_import_dialog import OutlineImportDialog
from app.window.site_import_dialog import SiteImportDialog
from core.errors import TowboardError
from core.io.outline_import import ImportedOutline
from core.io.report import report_json
from core.io.site_import import with_site
from core.io.tables import TABLES, write_csv
from core.model.plan import Project

if TYPE_CHECKING:
    from app.window.main_window import MainWindow

DRAWING_FILTER = (
    "DXF drawings and CSV tables (*.dxf *.csv);;DXF drawings (*.dxf);;CSV tables (*.csv)"
)


def with_imported_hull(project: Project, got: ImportedOutline, name: str, new: bool) -> Project:
    """The plan with a new hull on the outline, or hull ``name`` on it (its fittings kept,
    each moved to the nearest point of the new outline)."""
    if new:
        return project.with_hull(got.hull(name))
    old = project.hull(name)
    return project.with_hull(replace(old, outline=got.outline))


class DrawingsUi:
    """The import and export actions of the main window."""

    def __init__(self, window: MainWindow) -> None:
        self.window = window
        self.controller = window.controller
        self.last_dialog: QDialog | None = None
        sep = QAction(window)
        sep.setSeparator(True)
        window.add_file_action(sep)
        self.act_import_outline = self._action(
            "Import &outline…",
            self.import_outline,
            "A hull outline from a DXF drawing or a CSV of offsets",
        )
        self.act_import_site = self._action(
            "Import s&ite…",
            self.import_site,
            "Quays, dolphins, vessels and limits from a DXF or a CSV",
        )
        self.act_export_picture = self._action(
            "Export pi&cture…", self.export_picture, "The board or the stage diagram as SVG or PNG"
        )
        self.act_export_tables = self._action(
            "Export &tables…",
            self.export_tables,
            "The tug table and the balance of every stage as CSV",
        )
        for a in (
            self.act_import_outline,
            self.act_import_site,
            self.act_export_picture,
            self.act_export_tables,
        ):
            window.add_file_action(a)

    def _action(self, text: str, slot, tip: str) -> QAction:  # type: ignore[no-untyped-def]
        a = QAction(text, self.window)
        a.setStatusTip(tip)
        a.setToolTip(tip)
        a.triggered.connect(guarded(slot))
        return a

    def _folder(self) -> str:
        path = self.controller.path
        return str(path.parent) if path is not None else ""

    def _base(self) -> Path:
        path = self.controller.path
        if path is not None:
            return path.with_suffix("")
        return Path.home() / self.controller.project.name

    def _refuse(self, title: str, e: Exception) -> None:
        QMessageBox.warning(
            self.window, title, f"{str(e).splitlines()[0]}\n\nThe plan is unchanged."
        )

    # -- imports -----------------------------------------------------------------------------
    def import_outline(self) -> None:
        name, _ = QFileDialog.getOpenFileName(
            self.window, "Import outline", self._folder(), DRAWING_FILTER
        )
        if name:
            self.import_outline_from(Path(name))

    def import_outline_from(self, path: Path) -> bool:
        c = self.controller
        try:
            dialog = OutlineImportDialog(path, c.project, self.window)
        except TowboardError as e:
            self._refuse("Outline not imported", e)
            return False
        self.last_dialog = dialog
        if dialog.exec() != QDialog.DialogCode.Accepted or dialog.imported is None:
            return False
        hull, new = dialog.target_hull()
        try:
            project, _stage = c.ensure_stage(c.project)
            project = with_imported_hull(project, dialog.imported, hull, new)
        except TowboardError as e:
            self._refuse("Outline not imported", e)
            return False
        verb = "Import" if new else "New outline of"
        c.apply(project, f"{verb} {hull} from {path.name}")
        self.window.board.select(("hull", hull))
        self.window.view.fit_to_hull()
        return True

    def import_site(self) -> None:
        name, _ = QFileDialog.getOpenFileName(
            self.window, "Import site", self._folder(), DRAWING_FILTER
        )
        if name:
            self.import_site_from(Path(name))

    def import_site_from(self, path: Path) -> bool:
        c = self.controller
        try:
            dialog = SiteImportDialog(path, c.project, c.stage_index, self.window)
        except TowboardError as e:
            self._refuse("Site not imported", e)
            return False
        self.last_dialog = dialog
        if dialog.exec() != QDialog.DialogCode.Accepted or dialog.imported is None:
            return False
        got = dialog.imported
        c.apply(with_site(c.project, got, dialog.joining()), f"Import site from {path.name}")
        c.message.emit(f"Site from {path.name}: {got.words()}")
        return True

    # -- exports -------------------------------------------------------------------------------
    def shown_area(self) -> tuple[float, float, float, float] | None:
        """The site box the board shows now (m), or None."""
        view = self.window.view
        r = view.mapToScene(view.viewport().rect()).boundingRect()
        if r.width() <= 0 or r.height() <= 0:
            return None
        return (r.left(), r.top(), r.right(), r.bottom())

    def export_picture(self) -> list[Path]:
        c = self.controller
        if not c.project.stages:
            QMessageBox.information(self.window, "Export picture", "The plan has no stage to draw.")
            return []
        dialog = PictureDialog(
            c.project, c.stage_index, self._base(), self.shown_area(), self.window
        )
        self.last_dialog = dialog
        if dialog.exec() != QDialog.DialogCode.Accepted:
            return []
        written: list[Path] = []
        try:
            for path, spec in dialog.jobs():
                write_picture(c.project, path, spec)
                written.append(path)
        except (TowboardError, OSError) as e:
            QMessageBox.warning(self.window, "Picture not written", str(e).splitlines()[0])
            return written
        c.message.emit(f"Wrote {', '.join(p.name for p in written)}")
        return written

    def export_tables(self) -> list[Path]:
        c = self.controller
        dialog = TablesDialog(c.project, self._base(), self.window)
        self.last_dialog = dialog
        if dialog.exec() != QDialog.DialogCode.Accepted:
            return []
        report = report_json(c.project)
        units = c.project.units if dialog.in_display_units() else None
        written: list[Path] = []
        try:
            for path, table in dialog.jobs():
                write_csv(path, TABLES[table](report, units))
                written.append(path)
        except (TowboardError, OSError) as e:
            QMessageBox.warning(self.window, "Tables not written", str(e).splitlines()[0])
            return written
        c.message.emit(f"Wrote {', '.join(p.name for p in written)}")
        return written


def install(window: MainWindow) -> DrawingsUi:
    ui = DrawingsUi(window)
    window.drawings_ui = ui  # type: ignore[attr-defined]
    return ui
