"""Towboard's main window: the board in the middle, panels beside it, files and undo.

Hooks for other parts of the program (keep them when editing):

- ``window.menu(key)`` returns one of the menus: "file", "edit", "view", "board",
  "tugs", "plan", "solve", "help" (plan: stages and the briefing; solve: conditions,
  solving pulls, hold limits).
- ``window.add_file_action(action)`` puts an action (print preview, export PDF) in the
  File menu above Quit.
- ``window.add_panel(key, widget, title, area, tabify_with=None)`` docks a panel and
  lists it in the View menu; ``window.panels[key]`` are the docks
  ("balance", "hull", "units", "tugs").
- ``window.controller`` (app.controller.Controller), ``window.board`` (BoardScene),
  ``window.view`` (BoardView), ``window.stage_box`` (the stage chooser on the toolbar).
"""

from __future__ import annotations

import os
import sys
from pathlib import Path

from PySide6.QtCore import QRect, QSettings, Qt, QTimer
from PySide6.QtGui import QAction, QActionGroup, QCloseEvent, QKeySequence, QShowEvent
from PySide6.QtWidgets import (
    QApplication,
    QComboBox,
    QDockWidget,
    QFileDialog,
    QFrame,
    QInputDialog,
    QLabel,
    QMainWindow,
    QMenu,
    QMessageBox,
    QScrollArea,
    QTabBar,
    QToolBar,
    QVBoxLayout,
    QWidget,
)

from app.board.interaction import TOOL_INFO
from app.board.scene import BoardScene
from app.board.view import BoardView
from app.collector import freeze_at_start
from app.controller import Controller, ProjectCommand
from app.guard import REPORTER, guarded
from app.panels.balance_panel import BalancePanel
from app.panels.hull_panel import HullPanel
from app.panels.tugs_panel import TugsPanel
from app.panels.units_panel import UnitsPanel
from app.panels.verdict_view import VerdictView
from app.window.drawings_ui import install as install_drawings
from app.window.drift_ui import install as install_drift
from app.window.editors_ui import install as install_editors
from app.window.outline_dialog import OutlineDialog
from app.window.plan_ui import install as install_plan
from app.window.recovery import RecoveryWriter, find_orphans
from app.window.solve_ui import install as install_solve
from core.errors import ProjectFileError, TowboardError
from core.io.projectfile import SUFFIX, load, save
from core.io.report import CAUTION
from core.model.hull import Hull
from core.model.plan import Project, Stage
from core.units import label

SAMPLE = Path(__file__).resolve().parents[2] / "sample_projects" / "deck_barge_unberth.towboard"
FILE_FILTER = f"Towboard plans (*{SUFFIX});;All files (*)"
MAX_RECENT = 8

CAUTION_LINE = (
    "Planning aid only. Certified bollard pulls, fitting ratings, the master, the pilot "
    "and local port rules govern."
)


BOARD_HELP = """Tools (the key works when the board has the focus): S select / drag, D draw outline,
L add line point, P add push point; the site: Q quay, O dolphin, V moored vessel, B basin
limit. Esc goes back to select. While drawing, each side's length is shown beside it.

Select / drag: drag a body to move it; the knob ahead of a selected body's bow turns it
about its centroid (Shift: in steps of 5°). Drag a tug to change its line's lead and length
(a pushing tug swings round its push point); drag a line point or push point along the
hull; with the hull selected, drag a vertex. Double-click the hull's edge to insert a
vertex; double-click a line point, push point or tug to edit it. Delete removes the
selected vertex or point, or lets go the selected tug.

Working sectors: a faint wedge at a tug's point shows where it may lie when the pulls are
solved. Select the tug and drag the knob at the end of either edge to move that limit
(whole degrees; Shift: 5°); the tugs table's Sector columns take the limits typed.

Keys: arrow keys nudge the selection (a body or tug 1 m, a vertex or point 0.5 m; Shift:
ten times as far); [ and ] turn the selected body 1° to port or starboard (Shift: 10°).
A selected tug: + and − change its setting by 1 %, Page Up and Page Down by 10 %, the wheel
over it by 5 % a notch (always within 0 to 100 %).

View: drag empty water or use the middle button to pan; the wheel zooms round the cursor.
Another stage is fitted to the board unless you zoomed or panned; Fit to hull (Ctrl+0) and
Fit to site (Ctrl+Shift+0) fit again. Snap to grid (Ctrl+G) puts drawn and dragged points
on the grid; View > Grid step sets its step in the display length unit.

Draw outline: click the vertices, then click the first one again (or press Enter) to close;
Backspace takes the last vertex back, Esc stops. Add line point / push point: click the hull's
edge; the point snaps onto it.

The site: a quay is its points clicked in turn (Enter or a double-click ends it); a dolphin
its centre and a point on its edge; a moored vessel its stern and bow on the centreline and
a point on its side; a basin limit its points, closed by clicking the first again (Enter
leaves it an open line). Click a feature to select it: drag it, or drag a point's handle;
double-click its line to add a point; Delete removes the point or the feature; right-click
to rename it.

Right-click anything on the board for what can be done to it: a tug's setting, working
sector, push-pull or let go, a body's heading, lash or unlash hulls, rename or delete a site feature.

A drag is one undo step; nudges or steps of the same item in a row are one undo step too."""


def new_project() -> Project:
    """An empty plan with one stage, ready for a hull to be drawn."""
    return Project(name="Untitled plan", stages=(Stage("Stage 1"),))


#: The toolbar's word for each board tool (the menus say it in full).
TOOL_SHORT = {
    "select": "Select",
    "draw": "Outline",
    "line_point": "Line point",
    "push_point": "Push point",
    "quay": "Quay",
    "dolphin": "Dolphin",
    "vessel": "Vessel",
    "limit": "Limit",
}


def settings() -> QSettings:
    """The program's settings (``$TOWBOARD_SETTINGS_FILE`` makes them an ini file, for tests)."""
    path = os.environ.get("TOWBOARD_SETTINGS_FILE")
    if path:
        return QSettings(path, QSettings.Format.IniFormat)
    return QSettings("Towboard", "Towboard")


class MainWindow(QMainWindow):
    """The board, its panels, the menus and the file handling."""

    def __init__(self, project: Project | None = None, path: Path | None = None) -> None:
        super().__init__()
        self.controller = Controller(project if project is not None else new_project(), self)
        if path is not None:
            self.controller.mark_saved(path)
        self.board = BoardScene(self.controller)
        self.view = BoardView(self.board)
        self.panels: dict[str, QDockWidget] = {}
        self._menus: dict[str, QMenu] = {}
        self._build_central()
        self._build_panels()
        self._build_actions()
        self._build_menus()
        self._build_toolbar()
        self._restore_grid()
        self._connect()
        install_plan(self)  # the stage list, the site on the board, print and PDF
        install_solve(self)  # conditions, solve pulls, tug lost check, hold limits
        install_drawings(self)  # File > Import outline / site, Export picture / tables
        install_drift(self)  # the drift preview: ghosts on the board, its panel
        install_editors(self)  # the fitting dialog, the tug editor, a substitute tug
        self.recovery = RecoveryWriter(self.controller)
        self._docks_arranged = False
        self.resize(1400, 900)
        self._update_title()

    # -- layout -----------------------------------------------------------------------
    def _build_central(self) -> None:
        central = QWidget()
        layout = QVBoxLayout(central)
        layout.setContentsMargins(0, 0, 0, 0)
        layout.setSpacing(0)
        # the stage's verdict in one line above the board (the stage result's own)
        self.verdict_line = VerdictView(self.controller, brief=True)
        self.verdict_line.setStyleSheet(
            "QLabel#verdict_brief { padding: 3px 8px; border-bottom: 1px solid #c9d6e0; }"
        )
        layout.addWidget(self.verdict_line)
        layout.addWidget(self.view, 1)
        self.caution = QLabel(f"⚠ {CAUTION_LINE}")
        self.caution.setObjectName("caution")
        self.caution.setToolTip(CAUTION)
        self.caution.setWordWrap(True)
        self.caution.setStyleSheet(
            "QLabel#caution { background: #fff4d6; color: #5d4a1f; padding: 4px 8px;"
            " border-top: 1px solid #e0c98a; }"
        )
        layout.addWidget(self.caution)
        self.setCentralWidget(central)

    def add_panel(
        self,
        key: str,
        widget: QWidget,
        title: str,
        area: Qt.DockWidgetArea = Qt.DockWidgetArea.RightDockWidgetArea,
        tabify_with: str | None = None,
        scroll: bool = False,
    ) -> QDockWidget:
        """Dock ``widget`` as a panel called ``title``; listed in the View menu. With
        ``scroll`` a tall panel scrolls in a short dock instead of setting the window's
        least height."""
        dock = QDockWidget(title, self)
        dock.setObjectName(f"panel_{key}")
        dock.setWidget(scrolled(widget) if scroll else widget)
        self.addDockWidget(area, dock)
        if tabify_with is not None and tabify_with in self.panels:
            self.tabifyDockWidget(self.panels[tabify_with], dock)
        self.panels[key] = dock
        dock.dockLocationChanged.connect(
            guarded(lambda *_: QTimer.singleShot(0, self._tidy_tab_bars))
        )
        if "view" in self._menus:
            self._menus["view"].addAction(dock.toggleViewAction())
        return dock

    def _build_panels(self) -> None:
        c = self.controller
        self.balance_panel = BalancePanel(c)
        self.hull_panel = HullPanel(c)
        self.units_panel = UnitsPanel(c)
        self.tugs_panel = TugsPanel(c)
        self.add_panel("balance", self.balance_panel, "Balance")
        self.add_panel("hull", self.hull_panel, "Hull", tabify_with="balance", scroll=True)
        self.add_panel("units", self.units_panel, "Units", tabify_with="balance")
        self.panels["balance"].raise_()
        self.add_panel("tugs", self.tugs_panel, "Tugs", Qt.DockWidgetArea.BottomDockWidgetArea)

    def _action(self, text: str, slot, shortcut=None, tip: str = "") -> QAction:  # type: ignore[no-untyped-def]
        a = QAction(text, self)
        if shortcut is not None:
            a.setShortcut(QKeySequence(shortcut))
        if tip:
            a.setStatusTip(tip)
            a.setToolTip(tip)
        a.triggered.connect(guarded(slot))
        return a

    def _build_actions(self) -> None:
        K = QKeySequence.StandardKey
        self.act_new = self._action("&New", self.file_new, K.New, "Start a new plan")
        self.act_open = self._action("&Open…", self.file_open, K.Open, "Open a .towboard file")
        self.act_save = self._action("&Save", self.file_save, K.Save, "Save the plan")
        self.act_save_as = self._action(
            "Save &As…", self.file_save_as, K.SaveAs, "Save under a new name"
        )
        self.act_quit = self._action("&Quit", self.close, K.Quit)
        self.act_undo = self.controller.undo_stack.createUndoAction(self, "&Undo")
        self.act_undo.setShortcut(QKeySequence(K.Undo))
        self.act_redo = self.controller.undo_stack.createRedoAction(self, "&Redo")
        self.act_redo.setShortcut(QKeySequence(K.Redo))
        stack = self.controller.undo_stack
        for signal in (stack.indexChanged, stack.undoTextChanged, stack.redoTextChanged):
            signal.connect(self._undo_words)
        self.controller.stage_changed.connect(self._undo_words)
        self.act_delete = self._action(
            "&Delete",
            self.board.interaction.delete_selection,
            K.Delete,
            "Delete the selected vertex or point, or let go the selected tug",
        )
        self.act_delete.setShortcutContext(Qt.ShortcutContext.WidgetWithChildrenShortcut)
        self.view.addAction(self.act_delete)
        self.act_fit = self._action(
            "&Fit to hull", self.view.fit_to_hull, "Ctrl+0", "Zoom to the bodies (Ctrl+0)"
        )
        self.act_fit_site = self._action(
            "Fit to &site",
            self.view.fit_to_site,
            "Ctrl+Shift+0",
            "Zoom to the whole site and every body (Ctrl+Shift+0)",
        )
        self.act_snap = self._action(
            "S&nap to grid",
            self._snap_toggled,
            "Ctrl+G",
            "Points drawn or dragged snap to the grid (Ctrl+G)",
        )
        self.act_snap.setCheckable(True)
        self.act_grid_step = self._action(
            "&Grid step…", self.ask_grid_step, tip="The grid's step in the display length unit"
        )
        self.act_zoom_in = self._action("Zoom &in", lambda: self.view.zoom(1.25), K.ZoomIn)
        self.act_zoom_out = self._action("Zoom &out", lambda: self.view.zoom(0.8), K.ZoomOut)
        self.act_generate = self._action(
            "Outline from &dimensions…",
            self.generate_outline,
            tip="Make an outline from length, beam and shape",
        )
        self.tool_actions: dict[str, QAction] = {}
        group = QActionGroup(self)
        for key, (text, shortcut, tip) in TOOL_INFO.items():
            a = self._action(
                text, lambda _=False, k=key: self.board.set_tool(k), shortcut, f"{tip} ({shortcut})"
            )
            a.setToolTip(f"{text} ({shortcut})")
            a.setIconText(TOOL_SHORT.get(key, text))  # the toolbar's shorter word
            # a letter works on the board, so typing in a table or a field never changes tool
            a.setShortcutContext(Qt.ShortcutContext.WidgetWithChildrenShortcut)
            self.view.addAction(a)
            a.setCheckable(True)
            group.addAction(a)
            self.tool_actions[key] = a
        self.tool_actions["select"].setChecked(True)
        self.act_add_tug = self._action("&Add tug", self.tugs_panel.add_tug)
        self.act_dup_tug = self._action("&Duplicate tug", self.tugs_panel.duplicate_tug)
        self.act_remove_tug = self._action("&Remove tug", self.tugs_panel.remove_tug)

    def menu(self, key: str) -> QMenu:
        """One of the window's menus by key (see the module docstring)."""
        return self._menus[key]

    def add_file_action(self, action: QAction) -> None:
        """Put ``action`` in the File menu, above Quit."""
        self._menus["file"].insertAction(self._file_tail, action)

    def _build_menus(self) -> None:
        bar = self.menuBar()
        for key, title in (
            ("file", "&File"),
            ("edit", "&Edit"),
            ("view", "&View"),
            ("board", "&Board"),
            ("tugs", "&Tugs"),
            ("plan", "&Plan"),
            ("solve", "&Solve"),
            ("help", "&Help"),
        ):
            self._menus[key] = bar.addMenu(title)
        f = self._menus["file"]
        f.addActions([self.act_new, self.act_open])
        self.recent_menu = f.addMenu("Open &Recent")
        f.addSeparator()
        f.addActions([self.act_save, self.act_save_as])
        self._file_tail = f.addSeparator()
        f.addAction(self.act_quit)
        e = self._menus["edit"]
        e.addActions([self.act_undo, self.act_redo])
        e.addSeparator()
        e.addAction(self.act_delete)
        v = self._menus["view"]
        v.addActions([self.act_fit, self.act_fit_site, self.act_zoom_in, self.act_zoom_out])
        v.addSeparator()
        v.addActions([self.act_snap, self.act_grid_step])
        v.addSeparator()
        for dock in self.panels.values():
            v.addAction(dock.toggleViewAction())
        b = self._menus["board"]
        for key, a in self.tool_actions.items():
            if key == "quay":
                b.addSeparator()  # the site's tools after the hull's
            b.addAction(a)
        b.addSeparator()
        b.addAction(self.act_generate)
        self._menus["tugs"].addActions([self.act_add_tug, self.act_dup_tug, self.act_remove_tug])
        self._menus["help"].addAction(self._action("Mouse and keys on the board", self._board_help))
        self._menus["help"].addAction(self._action("About Towboard", self._about))
        self._rebuild_recent()

    def _build_toolbar(self) -> None:
        tb = QToolBar("Board")
        tb.setObjectName("toolbar_board")
        self.addToolBar(tb)
        tb.addActions([self.act_undo, self.act_redo])
        tb.addSeparator()
        for key, a in self.tool_actions.items():
            if key == "quay":
                tb.addSeparator()  # the site's tools after the hull's
            tb.addAction(a)
        tb.addAction(self.act_generate)
        tb.addSeparator()
        tb.addActions([self.act_fit, self.act_fit_site, self.act_snap])
        tb.addSeparator()
        tb.addWidget(QLabel(" Stage "))
        self.stage_box = QComboBox()
        self.stage_box.setMinimumContentsLength(28)
        self.stage_box.currentIndexChanged.connect(self.controller.set_stage_index)
        tb.addWidget(self.stage_box)
        self.toolbar = tb

    def _connect(self) -> None:
        c = self.controller
        c.changed.connect(self._update_title)
        c.changed.connect(self._sync_stage_box)
        c.dirty_changed.connect(guarded(lambda _d: self._update_title()))
        c.path_changed.connect(self._update_title)
        c.message.connect(self.say)
        REPORTER.connect_to(self.say)  # an error caught by a guard, in words
        self.board.selection_changed.connect(self._board_selection)
        self.board.tool_changed.connect(self._tool_changed)
        self.board.refresh_hooks.append(lambda s: self.balance_panel.set_stale(s.stale))
        self.tugs_panel.tug_selected.connect(guarded(lambda name: self.board.select(("tug", name))))
        self.hull_panel.generate_requested.connect(self.generate_outline)
        self._sync_stage_box()

    # -- keeping things in step -----------------------------------------------------------
    @guarded
    def _update_title(self) -> None:
        c = self.controller
        where = c.path.name if c.path is not None else "not saved"
        self.setWindowTitle(f"{c.project.name} — {where}[*] — Towboard")
        self.setWindowModified(c.dirty)

    @guarded
    def _sync_stage_box(self) -> None:
        names = [f"{i + 1}. {s.name}" for i, s in enumerate(self.controller.project.stages)]
        box = self.stage_box
        box.blockSignals(True)
        if [box.itemText(i) for i in range(box.count())] != names:
            box.clear()
            box.addItems(names)
        box.setCurrentIndex(min(self.controller.stage_index, len(names) - 1))
        box.blockSignals(False)

    @guarded
    def _undo_words(self, *_args: object) -> None:
        """Undo and Redo in the Edit menu name the stage of a step made in another stage
        than the one shown (undoing it shows that stage)."""
        stack = self.controller.undo_stack
        for action, index, verb in (
            (self.act_undo, stack.index() - 1, "Undo"),
            (self.act_redo, stack.index(), "Redo"),
        ):
            command = stack.command(index) if 0 <= index < stack.count() else None
            if not isinstance(command, ProjectCommand):
                continue
            words = f"&{verb} {command.text()}"
            if command.stage != self.controller.stage_index:
                words += f" (stage {command.stage + 1})"
            action.setText(words)

    @guarded
    def say(self, text: str, msecs: int = 8000) -> None:
        """Show ``text`` in the status bar (a refusal, or an error caught by a guard)."""
        self.statusBar().showMessage(text, msecs)

    @guarded
    def _board_selection(self) -> None:
        self.tugs_panel.select_tug(self.board.selected_tug())
        hull = self.board.selected_hull()
        if hull is not None:
            self.hull_panel.show_hull(hull)

    def _restore_grid(self) -> None:
        """The grid step and snapping as the user left them (program settings)."""
        s = settings()
        try:
            step = float(s.value("board/grid_step", 1.0))  # type: ignore[arg-type]
        except (TypeError, ValueError):
            step = 1.0
        snap = str(s.value("board/snap", "false")).lower() in ("true", "1")
        try:
            self.board.set_grid(step=step, snap=snap)
        except ValueError:
            self.board.set_grid(step=1.0, snap=snap)
        self.act_snap.blockSignals(True)
        self.act_snap.setChecked(snap)
        self.act_snap.blockSignals(False)

    def _save_grid(self) -> None:
        s = settings()
        s.setValue("board/grid_step", self.board.grid_step)
        s.setValue("board/snap", "true" if self.board.snap_on else "false")

    def _snap_toggled(self, on: bool) -> None:
        self.board.set_grid(snap=on)
        self._save_grid()
        u = self.controller.project.units
        state = "on" if on else "off"
        self.statusBar().showMessage(
            f"Snap to grid {state} (step {self.board.grid_step:g} {label(u.unit('length'))})", 5000
        )

    def ask_grid_step(self) -> None:
        """Ask for the grid step in the display length unit."""
        u = self.controller.project.units
        unit = label(u.unit("length"))
        value, ok = QInputDialog.getDouble(
            self, "Grid step", f"Grid step ({unit}):", self.board.grid_step, 0.01, 1000.0, 2
        )
        if ok:
            self.board.set_grid(step=value)
            self._save_grid()
            self.statusBar().showMessage(f"Grid step {value:g} {unit}", 5000)

    @guarded
    def _tool_changed(self, tool: str) -> None:
        a = self.tool_actions.get(tool)
        if a is not None and not a.isChecked():
            a.setChecked(True)

    # -- outline from dimensions ------------------------------------------------------------
    @guarded
    def generate_outline(self) -> None:
        c = self.controller
        target = self.board.selected_hull() or self.hull_panel.current
        hull = next((h for h in c.project.hulls if h.name == target), None)
        size = (hull.geometry.length, hull.geometry.beam) if hull else (80.0, 24.0)
        dlg = OutlineDialog(self, *size, units=c.project.units)
        if dlg.exec() != OutlineDialog.DialogCode.Accepted:
            return
        try:
            outline = dlg.outline()
            if hull is not None:
                c.apply(
                    c.project.with_hull(hull.with_outline(outline)), f"New outline of {hull.name}"
                )
            else:
                names = {h.name for h in c.project.hulls}
                n = 1
                while f"Hull {n}" in names:
                    n += 1
                project, _stage = c.ensure_stage(c.project)
                c.apply(project.with_hull(Hull(f"Hull {n}", outline)), f"Add Hull {n}")
        except TowboardError as e:
            QMessageBox.warning(self, "Outline not made", str(e))
            return
        self.view.fit_to_hull()

    # -- files --------------------------------------------------------------------------
    def maybe_discard(self) -> bool:
        """True when the current plan may be replaced (saved, or the user said so).

        A field with typing in it is committed first, as leaving it would: the question
        then sees that edit, and nothing typed is lost or applied to the next plan.
        """
        self.commit_typing()
        if not self.controller.dirty:
            return True
        answer = QMessageBox.question(
            self,
            "Unsaved changes",
            f"Save the changes to “{self.controller.project.name}” first?",
            QMessageBox.StandardButton.Save
            | QMessageBox.StandardButton.Discard
            | QMessageBox.StandardButton.Cancel,
            QMessageBox.StandardButton.Save,
        )
        if answer == QMessageBox.StandardButton.Save:
            return self.file_save()
        return answer == QMessageBox.StandardButton.Discard

    def commit_typing(self) -> None:
        """Commit what is typed in the focused field of this window (its docks too, even
        floating) by taking the focus from it: the field's own "left" commits it."""
        focus = QApplication.focusWidget()
        w: QWidget | None = focus
        while w is not None and w is not self:
            w = w.parentWidget()
        if focus is not None and w is self:
            focus.clearFocus()

    def file_new(self) -> None:
        if self.maybe_discard():
            self.controller.reset(new_project())
            self.view.fit_to_hull()

    def file_open(self) -> None:
        if not self.maybe_discard():
            return
        start = str(self.controller.path.parent) if self.controller.path else ""
        name, _ = QFileDialog.getOpenFileName(self, "Open plan", start, FILE_FILTER)
        if name:
            self.open_path(Path(name), ask=False)

    def open_path(self, path: Path, ask: bool = True) -> bool:
        """Open ``path``; on failure show the file's problems and keep the current plan."""
        if ask and not self.maybe_discard():
            return False
        try:
            project = load(path)
        except ProjectFileError as e:
            self.show_load_error(e)
            return False
        self.controller.reset(project, Path(path))
        self.add_recent(Path(path))
        self.board.select(None)
        self.view.fit_to_hull()
        return True

    def show_load_error(self, e: ProjectFileError) -> None:
        box = QMessageBox(self)
        box.setIcon(QMessageBox.Icon.Warning)
        box.setWindowTitle("Cannot open the plan")
        box.setText(f"{Path(e.source).name} cannot be opened; the plan on screen is unchanged.")
        box.setInformativeText(e.details())
        box.exec()

    def file_save(self) -> bool:
        if self.controller.path is None:
            return self.file_save_as()
        return self._save_to(self.controller.path)

    def file_save_as(self) -> bool:
        start = str(self.controller.path or Path.home() / f"{self.controller.project.name}{SUFFIX}")
        name, _ = QFileDialog.getSaveFileName(self, "Save plan as", start, FILE_FILTER)
        if not name:
            return False
        path = Path(name)
        if path.suffix != SUFFIX:
            path = path.with_name(path.name + SUFFIX)
        return self._save_to(path)

    def _save_to(self, path: Path) -> bool:
        try:
            save(self.controller.project, path)
        except ProjectFileError as e:
            QMessageBox.warning(self, "Not saved", f"{e}\n\n{e.details()}")
            return False
        self.controller.mark_saved(path)
        self.add_recent(path)
        self.statusBar().showMessage(f"Saved {path}", 5000)
        return True

    def recent_files(self) -> list[str]:
        value = settings().value("recent_files", [])
        if isinstance(value, str):  # one file comes back from an ini file as a string
            return [value]
        if isinstance(value, list | tuple):
            return [str(v) for v in value]
        return []  # nothing stored, or a value of another kind: no recent files

    def add_recent(self, path: Path) -> None:
        s = settings()
        files = [str(path.resolve())] + [f for f in self.recent_files() if f != str(path.resolve())]
        s.setValue("recent_files", files[:MAX_RECENT])
        s.sync()
        self._rebuild_recent()

    def _rebuild_recent(self) -> None:
        # Opening a recent file comes here from inside its entry's own signal: the old
        # entries go when the event loop comes round (QMenu.clear would delete that entry
        # under Qt's menu, which goes on using it after the signal).
        for old in self.recent_menu.actions():
            self.recent_menu.removeAction(old)
            old.deleteLater()
        files = self.recent_files()
        for f in files:
            a = self.recent_menu.addAction(Path(f).name)
            a.setToolTip(f)
            a.triggered.connect(guarded(lambda _=False, f=f: self.open_path(Path(f))))
        self.recent_menu.setEnabled(bool(files))

    # -- recovery ------------------------------------------------------------------------
    def offer_recovery(self) -> bool:
        """If a crashed session left a plan behind, offer to restore it. True if restored."""
        orphans = find_orphans(self.recovery.folder)
        if not orphans:
            return False
        newest = orphans[0]
        where = newest.source or "a plan that was not saved"
        answer = QMessageBox.question(
            self,
            "Restore unsaved work?",
            f"Towboard closed without saving changes to {where}. Restore them?",
            QMessageBox.StandardButton.Yes | QMessageBox.StandardButton.No,
            QMessageBox.StandardButton.Yes,
        )
        restored = False
        if answer == QMessageBox.StandardButton.Yes:
            try:
                project = newest.project()
            except ProjectFileError as e:
                self.show_load_error(e)
            else:
                source = Path(newest.source) if newest.source else None
                self.controller.reset(project, source)
                self.controller.undo_stack.resetClean()  # restored work is unsaved work
                self._update_title()
                self.view.fit_to_hull()
                restored = True
        for o in orphans:
            o.discard()
        return restored

    @guarded
    def showEvent(self, event: QShowEvent) -> None:
        super().showEvent(event)
        if not self._docks_arranged:  # sizes set before the first show are not kept
            self._docks_arranged = True
            self.arrange_docks()

    def arrange_docks(self) -> None:
        """Give the panels their working sizes for the window's size: the side panels
        wide enough for their words, the board the rest."""
        w, h = self.width(), self.height()
        side = [self.panels[k] for k in ("stages", "balance") if k in self.panels]
        widths = [min(300, max(220, w // 6)), min(440, max(300, w // 4))][: len(side)]
        self.resizeDocks(side, widths, Qt.Orientation.Horizontal)
        tall = [self.panels[k] for k in ("tugs", "hold_limits") if k in self.panels]
        heights = [min(240, max(150, h // 4)), min(420, max(240, h * 2 // 5))][: len(tall)]
        self.resizeDocks(tall, heights, Qt.Orientation.Vertical)
        self._tidy_tab_bars()

    @guarded
    def _tidy_tab_bars(self) -> None:
        """After panels are tabbed together or moved (Qt makes or reuses tab bars)."""
        self._hide_stray_tab_bars()
        self._whole_tab_names()

    def _whole_tab_names(self) -> None:
        """Each panel's tab shows its whole name ("Conditions", not "Condi…"); tabs that
        do not fit scroll rather than each being cut to a letter or two. Qt makes a new
        bar when panels are tabbed together, so this runs again when a panel moves."""
        for bar in self.findChildren(QTabBar, options=Qt.FindChildOption.FindDirectChildrenOnly):
            bar.setElideMode(Qt.TextElideMode.ElideNone)
            bar.setUsesScrollButtons(True)

    def _hide_stray_tab_bars(self) -> None:
        """Hide the tab bars Qt leaves behind when docks are tabbed before the window is
        shown (Qt 6.11: a second group of tabbed docks leaves a copy of its first bar,
        drawn over the panel above it). A bar in use sits against an edge of the dock
        it shows; a stray one does not, and Qt never touches it again."""
        docks = [d for d in self.panels.values() if d.isVisible()]
        for bar in self.findChildren(QTabBar, options=Qt.FindChildOption.FindDirectChildrenOnly):
            if bar.isVisible() and not any(_touches(bar.geometry(), d.geometry()) for d in docks):
                bar.hide()

    @guarded
    def closeEvent(self, event: QCloseEvent) -> None:
        if self.maybe_discard():
            self.recovery.close()
            event.accept()
        else:
            event.ignore()

    def _board_help(self) -> None:
        QMessageBox.information(self, "Mouse and keys on the board", BOARD_HELP)

    def _about(self) -> None:
        QMessageBox.about(
            self,
            "About Towboard",
            "Towboard plans moves of floating bodies with several tugs.\n\n" + CAUTION,
        )


def _touches(bar: QRect, dock: QRect) -> bool:
    """True when tab bar ``bar`` lies along the top or bottom edge of ``dock``."""
    overlap = min(bar.right(), dock.right()) - max(bar.left(), dock.left())
    near = min(abs(bar.top() - dock.bottom() - 1), abs(bar.bottom() + 1 - dock.top()))
    return overlap > 0 and near <= 2


def scrolled(panel: QWidget) -> QScrollArea:
    """``panel`` in a scroll area: a short dock scrolls it and never squeezes a field."""
    scroll = QScrollArea()
    scroll.setWidgetResizable(True)
    scroll.setFrameShape(QFrame.Shape.NoFrame)
    scroll.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
    scroll.setWidget(panel)
    return scroll


#: The windows ``run`` opened (kept referenced while the program runs).
OPEN_WINDOWS: list[MainWindow] = []


def run(file: str | None = None) -> int:
    """Open the window on ``file`` (default: the bundled sample) and run until it closes."""
    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setApplicationName("Towboard")
    app.setOrganizationName("Towboard")
    window = MainWindow()
    OPEN_WINDOWS.append(window)
    window.show()
    if not window.offer_recovery():
        target = Path(file) if file else SAMPLE
        if not window.open_path(target, ask=False) and file is None:
            window.controller.reset(new_project())
    freeze_at_start()
    return app.exec()
