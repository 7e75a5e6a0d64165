"""The drift preview in the window: the Drift switch and the scenario on the toolbar, the
ghosts and track on the board, the Drift panel with its numbers and inputs, and the
caution under the board while the ghosts are shown.

``install(window)`` plugs it into a MainWindow through its hooks (the toolbar, the Board
menu, a dock, the board's refresh hooks) and keeps it as ``window.drift_ui``.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from PySide6.QtGui import QAction
from PySide6.QtWidgets import QComboBox, QLabel

from app.board.drift_layer import DriftLayer
from app.guard import guarded
from app.panels.drift_panel import DriftPanel
from core.motion.drift import DriftScenario

if TYPE_CHECKING:
    from app.window.main_window import MainWindow

#: Under the board while the ghosts are shown (the whole text is the panel's).
DRIFT_CAUTION_LINE = (
    "Drift ghosts: a simple estimate in calm water with the other tugs as set; "
    "the master and the pilot decide."
)


class DriftUi:
    """What the drift preview adds to the main window."""

    def __init__(self, window: MainWindow) -> None:
        self.window = window
        self.controller = window.controller
        self.layer = DriftLayer(window.board)
        self.panel = DriftPanel(self.controller)
        window.add_panel("drift", self.panel, "Drift", tabify_with="balance")
        window.panels["balance"].raise_()
        self.act_drift = QAction("Drift", window)
        self.act_drift.setCheckable(True)
        self.act_drift.setStatusTip(
            "Show where the body drifts if a tug is lost or the lines are let go: "
            "ghost outlines at the drift times, the centroid's track and the first contact"
        )
        self.act_drift.toggled.connect(self.set_enabled)
        self.scenario_box = QComboBox()
        self.scenario_box.setObjectName("drift_scenario")
        self.scenario_box.setToolTip("What happens to the tugs in the drift preview")
        self.scenario_box.currentIndexChanged.connect(self._scenario_chosen)
        tb = window.toolbar
        tb.addSeparator()
        tb.addAction(self.act_drift)
        tb.addWidget(self.scenario_box)
        window.menu("board").addSeparator()
        window.menu("board").addAction(self.act_drift)
        self._base_caution = window.caution.text()
        self.layer.updated.connect(self._show)
        #: The placed tugs the scenarios offered were made for (see _fill_scenarios).
        self._filled_for: tuple[str, ...] | None = None
        self.controller.changed.connect(self._fill_scenarios)
        self._fill_scenarios()

    # -- the switch and the scenario -----------------------------------------------------
    @guarded
    def set_enabled(self, on: bool) -> None:
        if self.act_drift.isChecked() != on:
            self.act_drift.setChecked(on)
            return
        caution: QLabel = self.window.caution
        caution.setText(
            f"{self._base_caution}   ⚠ {DRIFT_CAUTION_LINE}" if on else self._base_caution
        )
        self.layer.set_enabled(on)
        self._show()

    def scenarios(self) -> list[DriftScenario]:
        """The scenarios offered for the stage shown: worst tug lost, each tug lost,
        all lines let go, pulls as set."""
        stage = self.controller.stage
        tugs = [p.tug for p in stage.placements] if stage is not None else []
        return [
            DriftScenario("worst_tug_lost"),
            *(DriftScenario("tug_lost", t) for t in tugs),
            DriftScenario("let_go"),
            DriftScenario("as_set"),
        ]

    @guarded
    def _fill_scenarios(self) -> None:
        stage = self.controller.stage
        tugs = tuple(p.tug for p in stage.placements) if stage is not None else ()
        if tugs == self._filled_for:
            return  # the same tugs (a drag's move): the same scenarios, nothing to read
        box = self.scenario_box
        wanted = self.scenarios()
        words = [s.words()[0].upper() + s.words()[1:] for s in wanted]
        current = self.layer.scenario
        box.blockSignals(True)
        box.clear()
        for w, s in zip(words, wanted, strict=True):
            box.addItem(w, s)
        keep = wanted.index(current) if current in wanted else 0
        box.setCurrentIndex(keep)
        box.blockSignals(False)
        self.layer.set_scenario(wanted[keep])
        self._filled_for = tugs

    @guarded
    def _scenario_chosen(self, index: int) -> None:
        s = self.scenario_box.itemData(index)
        if isinstance(s, DriftScenario):
            self.layer.set_scenario(s)

    def set_scenario(self, scenario: DriftScenario) -> None:
        """Choose ``scenario`` (as from the toolbar)."""
        i = self.scenarios().index(scenario)
        self.scenario_box.setCurrentIndex(i)

    @guarded
    def _show(self) -> None:
        self.panel.show_result(
            self.layer.result,
            self.layer.note,
            enabled=self.layer.enabled,
            pending=self.layer.pending,
        )


def install(window: MainWindow) -> DriftUi:
    ui = DriftUi(window)
    window.drift_ui = ui  # type: ignore[attr-defined]
    return ui
