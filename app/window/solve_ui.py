"""Conditions and solving in the window: the conditions panel, wind and current on the
board, solve pulls (and live solving), each tug's use and checks, the hold limits plot.

``install(window)`` plugs all of it into a MainWindow through its hooks: the
controller's load providers (the stage's wind and current become loads in every
balance), its edit filters (live solving), docks, actions in the Solve menu, the
board's foreground (the wind and current card) and tug notes, and extra columns of the tugs table.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from PySide6.QtCore import Qt
from PySide6.QtGui import QAction, QKeySequence

from app.board.conditions_layer import ConditionsCard
from app.guard import guarded
from app.panels.conditions import ConditionsPanel
from app.panels.hold_plot import HoldLimitsPanel
from app.panels.solve_panel import SolvePanel
from core.mechanics.balance import TugShare
from core.units import percent

if TYPE_CHECKING:
    from app.window.main_window import MainWindow


class SolveUi:
    """What conditions and solving add to the main window (kept as ``window.solve_ui``)."""

    def __init__(self, window: MainWindow) -> None:
        self.window = window
        c = self.controller = window.controller
        self.conditions = ConditionsPanel(c)
        self.solve_panel = SolvePanel(c)
        self.hold = HoldLimitsPanel(c)
        window.add_panel("conditions", self.conditions, "Conditions", tabify_with="balance")
        window.add_panel(
            "solve", self.solve_panel, "Solve pulls", tabify_with="balance", scroll=True
        )
        window.add_panel(
            "hold_limits", self.hold, "Hold limits", Qt.DockWidgetArea.RightDockWidgetArea
        )
        window.panels["balance"].raise_()
        self.card = ConditionsCard(window.view)
        self.solve_panel.notes_changed.connect(self._notes)
        self.solve_panel.live.toggled.connect(self.set_live)
        model = window.tugs_panel.model
        model.extra.append(("Share of rated pull %", _share_of_rated_text))
        model.extra.append(("Checks", self._check_text))
        model.refresh()
        menu = window.menu("solve")
        self.act_solve = QAction("&Solve pulls", window)
        self.act_solve.setShortcut(QKeySequence("F9"))
        self.act_solve.setStatusTip("Fill in every tug's setting for the stage's goal")
        self.act_solve.triggered.connect(self.solve_panel.solve)
        self.act_live = QAction("Solve &live", window)
        self.act_live.setCheckable(True)
        self.act_live.setStatusTip("Settings follow the solver on every edit and drag")
        self.act_live.toggled.connect(self.solve_panel.live.setChecked)
        self.act_efficiency = QAction("Tug &efficiency table…", window)
        self.act_efficiency.triggered.connect(self.conditions.edit_efficiency)
        menu.addActions([self.act_solve, self.act_live])
        menu.addSeparator()
        menu.addAction(self.act_efficiency)
        menu.addSeparator()
        for key in ("conditions", "solve", "hold_limits"):
            menu.addAction(window.panels[key].toggleViewAction())
        window.toolbar.addSeparator()
        window.toolbar.addActions([self.act_solve, self.act_live])

    @guarded
    def set_live(self, on: bool) -> None:
        self.hold.follow_drag = on
        filters = self.controller.edit_filters
        f = self.solve_panel.live_filter
        if on and f not in filters:
            filters.append(f)
            stage = self.controller.stage
            if stage is not None and stage.goal is None:
                self.controller.message.emit(
                    "Live solving waits for a goal: choose one in the Solve pulls panel."
                )
            self.controller.apply(f(self.controller.project), "Solve pulls (live)")
        elif not on and f in filters:
            filters.remove(f)
        if self.act_live.isChecked() != on:
            self.act_live.setChecked(on)

    @guarded
    def _notes(self, notes: dict[str, list[str]]) -> None:
        self.window.board.set_tug_notes({t: "⚠ " + ", ".join(v) for t, v in notes.items() if v})
        self.window.tugs_panel.model.refresh()

    def _check_text(self, share: TugShare | None) -> str:
        if share is None:
            return ""
        return ", ".join(self.solve_panel.notes.get(share.tug, []))


def _share_of_rated_text(share: TugShare | None) -> str:
    """Share of rated pull: assigned pull over the rated pull at the lead (bollard pull x
    capability share); the setting is over the usable pull, which efficiency, the towline
    angle and headway make smaller."""
    if share is None or share.rated_n <= 0:
        return ""
    return f"{percent(share.share_of_rated)}"


def install(window: MainWindow) -> SolveUi:
    ui = SolveUi(window)
    window.solve_ui = ui  # type: ignore[attr-defined]
    return ui
