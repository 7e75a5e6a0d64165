"""The editors in the window: the fitting dialog, the tug editor and "Try a substitute tug…".

``install(window)`` adds "Edit tug…" and "Try a substitute tug…" to the Tugs menu, and opens
an editor on a double-click on the board (a line point, push point or tug), on the tugs
panel's "Edit…" and on the fittings table's "Edit…". The plan details dialog belongs to the
Plan menu (app/window/plan_ui.py).
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from PySide6.QtGui import QAction

from app.guard import guarded
from app.panels.fitting_dialog import FittingDialog, open_fitting_dialog
from app.panels.tug_dialog import TugDialog, open_tug_dialog
from app.window.substitute_dialog import SubstituteDialog, open_substitute_dialog
from core.errors import TowboardError

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
