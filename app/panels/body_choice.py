"""Which body a panel shows, in a stage whose tugs work on more than one.

A panel that shows one body's part of the stage result (the solved pulls, the hold limits)
names that body, and where the stage has more than one worked body lets the user choose
it: by default the worst off (core.analysis.stage.StageResult.worst), a choice kept while
the stage shown and its bodies stay the same. With more than one body the panel also
shows the stage's verdict in one line, so nothing it says of one body stands for the stage.
"""

from __future__ import annotations

from PySide6.QtCore import Signal
from PySide6.QtWidgets import QComboBox, QHBoxLayout, QLabel, QVBoxLayout, QWidget

from app.guard import guarded
from app.paint import style
from core.analysis.stage import BodyResult, StageResult

COLOURS = {"go": style.GO, "caution": style.CAUTION, "no-go": style.NO_GO}


class BodyChoice(QWidget):
    """A chooser of the body shown (hidden with one body) and the stage's verdict line."""

    #: The user chose another body.
    chosen = Signal()

    def __init__(self, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.box = QComboBox()
        self.box.setObjectName("body_choice")
        self.box.setToolTip("The tugs work on more than one body here: the body shown")
        self.box.currentIndexChanged.connect(guarded(self._picked))
        self.verdict = QLabel("")
        self.verdict.setWordWrap(True)
        self.verdict.setObjectName("stage_verdict")
        row = QHBoxLayout()
        row.setContentsMargins(0, 0, 0, 0)
        row.addWidget(QLabel("Body"))
        row.addWidget(self.box, 1)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(0, 0, 0, 0)
        layout.addWidget(self.verdict)
        layout.addLayout(row)
        self._key: object = None  # the stage and its worked bodies the choice is for
        self._choice: str | None = None
        self.setVisible(False)

    def _picked(self, _index: int) -> None:
        name = self.box.currentData()
        if name is not None and name != self._choice:
            self._choice = name
            self.chosen.emit()

    def body(self, result: StageResult | None) -> BodyResult | None:
        """The body to show of ``result``: the one chosen, else the worst off."""
        worked = () if result is None else result.worked
        if result is None or len(worked) < 2:
            self.setVisible(False)
            self._key = None
            return None if result is None else result.main
        names = tuple(b.name for b in worked)
        key = (result.index, names)
        if key != self._key:
            self._key = key
            worst = result.worst
            self._choice = worst.name if worst is not None else names[0]
            self.box.blockSignals(True)
            self.box.clear()
            for n in names:
                self.box.addItem(n, n)
            self.box.blockSignals(False)
        self.box.blockSignals(True)
        self.box.setCurrentIndex(max(self.box.findData(self._choice), 0))
        self.box.blockSignals(False)
        v = result.verdict
        self.verdict.setText(f"Stage {v.headline()}")
        self.verdict.setStyleSheet(f"color: {COLOURS[v.status].name()};")
        self.setVisible(True)
        return result.body(self._choice) if self._choice in names else worked[0]

    def name(self) -> str | None:
        """The body chosen, when there is a choice."""
        return self._choice if self._key is not None else None
