"""Try a substitute tug: what another vessel (or new particulars) does to every stage's
verdict, before it is put in the plan.

The planner picks the tug to replace, types the substitute's particulars and whether each
stage keeps the pull it asked of the old tug or its settings; "Check the plan" works out
every stage again (:func:`core.analysis.checks.substitute_tug`, which reads the one stage
result) and lists, per stage, the verdict now and with the substitute and what changes.
"Apply" puts the substitute in the plan as one undo step.
"""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QFont
from PySide6.QtWidgets import (
    QAbstractItemView,
    QButtonGroup,
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QPushButton,
    QRadioButton,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app import numbers
from app.controller import Controller
from app.guard import guarded
from app.paint import style
from app.panels.dialog_parts import error_label
from app.panels.tug_form import TugForm
from core.analysis.checks import StageCheck, Substitution, substitute_tug
from core.errors import TowboardError

MARKS = {"go": "✓ GO", "caution": "! CAUTION", "no-go": "✖ NO-GO"}
COLOURS = {"go": style.GO, "caution": style.CAUTION, "no-go": style.NO_GO}
COLUMNS = ("Stage", "Now", "With the substitute", "What changes")


def changes(before: StageCheck, after: StageCheck) -> list[str]:
    """What the substitute changes in a stage's verdict, in words: reasons it brings and
    reasons it clears."""
    was = [r.text for r in before.verdict.reasons]
    now = [r.text for r in after.verdict.reasons]
    out = [f"now: {t}" for t in now if t not in was]
    out += [f"no longer: {t}" for t in was if t not in now]
    return out


class SubstituteDialog(QDialog):
    """Pick a tug, type its substitute, check every stage, apply."""

    def __init__(
        self, controller: Controller, tug: str | None = None, parent: QWidget | None = None
    ) -> None:
        super().__init__(parent)
        self.controller = controller
        self.substitution: Substitution | None = None
        self.setWindowTitle("Try a substitute tug")
        self.setObjectName("substitute_dialog")
        names = [t.name for t in controller.project.tugs]
        self.replace = QComboBox()
        self.replace.addItems(names)
        if tug in names:
            self.replace.setCurrentText(tug)
        self.form = TugForm(controller.project.units)
        self.keep_pulls = QRadioButton("the pull it asked of the tug it replaces")
        self.keep_settings = QRadioButton("the settings as they are (the pulls follow the tug)")
        self.keep_pulls.setChecked(True)
        self._keep = QButtonGroup(self)
        for b in (self.keep_pulls, self.keep_settings):
            self._keep.addButton(b)
        self.check_button = QPushButton("Check the plan")
        self.check_button.setDefault(True)
        self.check_button.clicked.connect(self.check)
        self.table = QTableWidget(0, len(COLUMNS))
        self.table.setHorizontalHeaderLabels(list(COLUMNS))
        self.table.verticalHeader().setVisible(False)
        self.table.setEditTriggers(QAbstractItemView.EditTrigger.NoEditTriggers)
        self.table.setWordWrap(True)
        header = self.table.horizontalHeader()
        header.setSectionResizeMode(0, QHeaderView.ResizeMode.Interactive)
        header.resizeSection(0, 190)
        for col in (1, 2):
            header.setSectionResizeMode(col, QHeaderView.ResizeMode.ResizeToContents)
        header.setSectionResizeMode(len(COLUMNS) - 1, QHeaderView.ResizeMode.Stretch)
        self.table.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.summary = QLabel("Type the substitute's particulars, then check the plan.")
        self.summary.setWordWrap(True)
        self.error = error_label()
        self.buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Close)
        self.apply_button = self.buttons.addButton(
            "Apply to the plan", QDialogButtonBox.ButtonRole.ApplyRole
        )
        self.apply_button.setAutoDefault(False)
        self.apply_button.setEnabled(False)
        self.apply_button.clicked.connect(self.apply)
        self.buttons.rejected.connect(self.reject)
        self._lay_out()
        self.replace.currentTextChanged.connect(self._load)
        self.form.edited.connect(self._stale)
        self._keep.buttonClicked.connect(guarded(lambda _b: self._stale()))
        self._load(self.replace.currentText())
        self.resize(1100, 640)

    def _lay_out(self) -> None:
        top = QFormLayout()
        top.addRow("Replace", self.replace)
        sub = QGroupBox("The substitute")
        sl = QVBoxLayout(sub)
        sl.addWidget(self.form)
        keep = QGroupBox("Each stage keeps")
        kl = QVBoxLayout(keep)
        kl.addWidget(self.keep_pulls)
        kl.addWidget(self.keep_settings)
        left = QVBoxLayout()
        left.addLayout(top)
        left.addWidget(sub)
        left.addWidget(keep)
        left.addWidget(self.check_button)
        left.addStretch(1)
        right = QVBoxLayout()
        right.addWidget(self.table, 1)
        right.addWidget(self.summary)
        body = QHBoxLayout()
        body.addLayout(left, 2)
        body.addLayout(right, 5)
        layout = QVBoxLayout(self)
        layout.addLayout(body, 1)
        layout.addWidget(self.error)
        layout.addWidget(self.buttons)

    @guarded
    def _load(self, name: str) -> None:
        if name:
            self.form.load(self.controller.project.tug(name))
        self._stale()

    @guarded
    def _stale(self) -> None:
        """The inputs changed: what is listed no longer answers them."""
        self.substitution = None
        self.apply_button.setEnabled(False)
        if self.table.rowCount():
            self.summary.setText("Changed since the last check: check the plan again.")

    def keep(self) -> str:
        return "pulls" if self.keep_pulls.isChecked() else "settings"

    # -- checking -----------------------------------------------------------------------
    @guarded
    def check(self) -> Substitution | None:
        """Work every stage out with the substitute and list what changes."""
        old = self.replace.currentText()
        try:
            tug = self.form.tug()
            if tug.name != old and any(t.name == tug.name for t in self.controller.project.tugs):
                raise ValueError(f"tug name: {tug.name!r} is another tug of the plan")
            result = substitute_tug(self.controller.project, old, tug, self.keep())
        except (TowboardError, ValueError) as e:
            self.error.setText(f"Not checked: {numbers.message(e, self.controller.project.units)}")
            self.error.setVisible(True)
            return None
        self.error.setVisible(False)
        self.substitution = result
        self._show(result, old)
        self.apply_button.setEnabled(True)
        return result

    def _show(self, result: Substitution, old: str) -> None:
        self.table.setRowCount(0)
        for b, a in zip(result.before, result.after, strict=True):
            row = self.table.rowCount()
            self.table.insertRow(row)
            moved = b.verdict.status != a.verdict.status
            lines = changes(b, a)
            cells = (
                f"{b.index + 1}. {b.name}",
                MARKS[b.verdict.status],
                MARKS[a.verdict.status],
                "\n".join(lines) if lines else "no change",
            )
            for col, text in enumerate(cells):
                item = QTableWidgetItem(text)
                if col in (1, 2):
                    status = (b if col == 1 else a).verdict.status
                    item.setForeground(QBrush(COLOURS[status]))
                    if moved:
                        font = QFont(item.font())
                        font.setBold(True)
                        item.setFont(font)
                self.table.setItem(row, col, item)
        self.table.resizeRowsToContents()
        self.summary.setText(summary(result, old))

    # -- applying -----------------------------------------------------------------------
    @guarded
    def apply(self) -> None:
        """Put the checked substitute in the plan (one undo step) and close."""
        result = self.substitution
        if result is None or (
            result.before and result.before[0].result.project is not self.controller.project
        ):
            result = self.check()
            if result is None:
                return
        old = self.replace.currentText()
        text = f"Substitute {result.tug} for {old}" if result.tug != old else f"New {old}"
        self.controller.apply(result.project, text)
        self.accept()


def summary(result: Substitution, old: str) -> str:
    """One sentence on what the substitute does to the plan."""
    who = f"With {result.tug} for {old}" if result.tug != old else f"With {old}'s new particulars"
    moved = [
        (b, a)
        for b, a in zip(result.before, result.after, strict=True)
        if b.verdict.status != a.verdict.status
    ]
    if not moved:
        return f"{who}, no stage changes its verdict."
    parts = [f"stage {a.index + 1} {b.verdict.label} → {a.verdict.label}" for b, a in moved]
    return f"{who}: " + "; ".join(parts) + "."


def open_substitute_dialog(
    controller: Controller, tug: str | None = None, parent: QWidget | None = None
) -> SubstituteDialog:
    """Show the dialog (window-modal, without blocking) and return it."""
    dialog = SubstituteDialog(controller, tug, parent)
    dialog.setAttribute(Qt.WidgetAttribute.WA_DeleteOnClose)
    dialog.open()
    return dialog
