"""The editors in the window: the fitting dialog, the tug editor, "Try a substitute tug…"
and the lashing of a group of hulls.

``install(window)`` adds "Edit tug…" and "Try a substitute tug…" to the Tugs menu and
"Lashing…" to the Edit menu (and to the board's menu on a lashed group), and opens an
editor on a double-click on the board (a line point, push point or tug), on the tugs
panel's "Edit…" and on the fittings table's "Edit…". The plan details dialog belongs to the
Plan menu (app/window/plan_ui.py).
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from PySide6.QtGui import QAction
from PySide6.QtWidgets import QMenu

from app.guard import guarded
from app.panels.fitting_dialog import FittingDialog, open_fitting_dialog
from app.panels.lashing_dialog import LashingDialog, open_lashing_dialog
from app.panels.tug_dialog import TugDialog, open_tug_dialog
from app.window.substitute_dialog import SubstituteDialog, open_substitute_dialog
from core.errors import TowboardError
from core.model.plan import LashedGroup

if TYPE_CHECKING:
    from app.window.main_window import MainWindow


class EditorsUi:
    """What the editors add to the main window (kept as ``window.editors``)."""

    def __init__(self, window: MainWindow) -> None:
        self.window = window
        self.controller = window.controller
        self.act_edit_tug = self._action(
            "&Edit tug…",
            lambda: self.edit_tug(),
            "Every particular of the selected tug: pulls, certificate, towline, radio",
        )
        self.act_substitute = self._action(
            "Try a &substitute tug…",
            lambda: self.try_substitute(),
            "What another tug (or new particulars) does to every stage's verdict",
        )
        tugs = window.menu("tugs")
        first = tugs.actions()[0] if tugs.actions() else None
        if first is None:
            tugs.addAction(self.act_edit_tug)
        else:
            tugs.insertAction(first, self.act_edit_tug)
        tugs.addSeparator()
        tugs.addAction(self.act_substitute)
        self.act_lashing = self._action(
            "&Lashing…",
            lambda: self.edit_lashing(),
            "Where each hull of the selected lashed group lies in the group's frame",
        )
        edit = window.menu("edit")
        edit.addSeparator()
        edit.addAction(self.act_lashing)
        window.board.menu_hooks.append(self._board_menu)
        window.tugs_panel.edit_requested.connect(self.edit_tug)
        hp = window.hull_panel
        hp.tool_requested.connect(window.board.set_tool)
        hp.fitting_selected.connect(
            guarded(lambda hull, name: window.board.select(("fitting", hull, name)))
        )
        hp.fitting_edit_requested.connect(self.edit_fitting)
        window.board.edit_requested.connect(self._edit_on_board)
        window.board.selection_changed.connect(self._board_selection)

    def _action(self, text: str, slot, tip: str) -> QAction:  # type: ignore[no-untyped-def]
        a = QAction(text, self.window)
        a.setStatusTip(tip)
        a.setToolTip(tip)
        a.triggered.connect(guarded(slot))
        return a

    def _say(self, text: str) -> None:
        self.window.statusBar().showMessage(text, 8000)

    @guarded
    def _board_selection(self) -> None:
        sel = self.window.board.selection
        if sel and sel[0] == "fitting":
            self.window.hull_panel.show_fitting(str(sel[1]), str(sel[2]))

    @guarded
    def _edit_on_board(self, hit: object) -> None:
        if not isinstance(hit, tuple) or not hit:
            return
        if hit[0] == "fitting":
            self.edit_fitting(str(hit[1]), str(hit[2]))
        elif hit[0] == "tug":
            self.edit_tug(str(hit[1]))

    def _board_menu(self, menu: QMenu, target: tuple[object, ...] | None) -> None:
        """On a lashed hull (or its group) the board's menu offers the lashing dialog."""
        if target is None or target[0] not in ("hull", "turn", "vertex") or len(target) < 2:
            return
        group = self._group_of(str(target[1]))
        if group is not None:
            menu.addAction(
                f"Lashing of {group.name}…", guarded(lambda: self.edit_lashing(group.name))
            )

    def _group_of(self, hull_or_body: str) -> LashedGroup | None:
        project = self.controller.project
        for g in project.groups:
            if g.name == hull_or_body:
                return g
        return project.group_of(hull_or_body)

    def _selected_group(self) -> str | None:
        """The group of the hull or body selected on the board; else the plan's only group."""
        sel = self.window.board.selection
        if sel and sel[0] in ("hull", "vertex", "turn") and len(sel) > 1:
            group = self._group_of(str(sel[1]))
            if group is not None:
                return group.name
        groups = self.controller.project.groups
        return groups[0].name if len(groups) == 1 else None

    def _selected_tug(self) -> str | None:
        return self.window.tugs_panel.current_tug() or self.window.board.selected_tug()

    # -- the editors ------------------------------------------------------------------------
    @guarded
    def edit_fitting(self, hull: str, name: str) -> FittingDialog | None:
        """Open the dialog of fitting ``name`` of ``hull``."""
        try:
            return open_fitting_dialog(self.controller, hull, name, self.window)
        except TowboardError as e:
            self._say(str(e))
            return None

    @guarded
    def edit_tug(self, name: str | None = None) -> TugDialog | None:
        """Open the tug editor of tug ``name`` (default: the tug selected in the table or on
        the board)."""
        name = name or self._selected_tug()
        if name is None:
            self._say("Select a tug in the table or on the board first.")
            return None
        try:
            return open_tug_dialog(self.controller, name, self.window)
        except TowboardError as e:
            self._say(str(e))
            return None

    @guarded
    def edit_lashing(self, group: str | None = None) -> LashingDialog | None:
        """Open the lashing dialog of ``group`` (default: the group of the hull selected on
        the board, or the plan's only group)."""
        if not self.controller.project.groups:
            self._say("No hulls are lashed: lash two hulls from the board's menu first.")
            return None
        group = group or self._selected_group()
        if group is None:
            self._say("Select a lashed hull on the board first.")
            return None
        try:
            return open_lashing_dialog(self.controller, group, self.window)
        except TowboardError as e:
            self._say(str(e))
            return None

    def try_substitute(self, name: str | None = None) -> SubstituteDialog | None:
        """Open "Try a substitute tug" on tug ``name`` (default: the selected tug)."""
        if not self.controller.project.tugs:
            self._say("The plan has no tug to replace yet.")
            return None
        return open_substitute_dialog(self.controller, name or self._selected_tug(), self.window)


def install(window: MainWindow) -> EditorsUi:
    ui = EditorsUi(window)
    window.editors = ui  # type: ignore[attr-defined]
    return ui
