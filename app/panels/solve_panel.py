"""The solve pulls panel: the goal, the solved pulls, each tug's use and the tug lost check.

"Solve pulls" fills in every tug's setting (and, for a tug with a lead sector, its lead)
for the goal as one undo step, and keeps the goal with the stage. With "solve live"
on, the settings follow the solver on every edit and every mouse move of a drag (the
leads stay where the mouse puts them). The figures are core.solve.pulls.pulls's; the panel says
them in the display units.
"""

from __future__ import annotations

import math
from dataclasses import replace

from PySide6.QtCore import Qt, QTimer, Signal
from PySide6.QtGui import QColor
from PySide6.QtWidgets import (
    QCheckBox,
    QComboBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QLineEdit,
    QPushButton,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from app.controller import BodyResult, Controller
from core.errors import InputError, TowboardError
from core.mechanics.balance import TugLayout
from core.mechanics.usable import fitting_suits
from core.model.goals import GOAL_KINDS, Goal
from core.model.plan import Project, Stage
from core.solve.pulls import PullsResult, TugLostCheck, pulls_problem, shortfall_words, solve_pulls
from core.solve.pulls import tug_lost_check as run_tug_lost_check
from core.units import label

GOAL_TITLES = {
    "hold": "Hold (stay put against the conditions)",
    "walk": "Walk (a net force, no swing)",
    "swing": "Swing (a yaw moment, no net force)",
    "force": "Given force and moment",
}
FAIL = QColor("#b71c1c")
OK = QColor("#1b5e20")


def solved_stage(
    project: Project,
    stage: Stage,
    goal: Goal,
    leads: bool = True,
    layout: TugLayout | None = None,
) -> tuple[Stage, PullsResult]:
    """``stage`` with every tug's setting (and, with ``leads``, solved lead) for ``goal``."""
    result = solve_pulls(pulls_problem(project, stage, goal=goal, layout=layout))
    if leads:
        return result.applied_to(stage), result
    out = stage
    for p, s in zip(result.problem.placements, result.utilisation, strict=True):
        if abs(p.setting - float(s)) > 1e-12:
            out = out.with_placement(replace(p, setting=float(s)))
    return out, result


class SolvePanel(QWidget):
    """Goal, solve button, live switch, per-tug use and the tug lost check."""

    #: The per-tug warnings changed: {tug: [short warning, ...]}.
    notes_changed = Signal(dict)

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.result: PullsResult | None = None
        self.check: TugLostCheck | None = None
        self.notes: dict[str, list[str]] = {}
        self.kind = QComboBox()
        for k in GOAL_KINDS:
            self.kind.addItem(GOAL_TITLES[k], k)
        self.kind.currentIndexChanged.connect(self._kind_changed)
        self.fx, self.fy, self.mz = QLineEdit("0"), QLineEdit("0"), QLineEdit("0")
        self.fx_label, self.fy_label, self.mz_label = QLabel(), QLabel(), QLabel()
        self.solve_button = QPushButton("Solve pulls")
        self.solve_button.setToolTip("Fill in every tug's setting for the goal (one undo step)")
        self.solve_button.clicked.connect(self.solve)
        self.live = QCheckBox("Solve live while editing and dragging")
        self.live.setToolTip(
            "The settings follow the solver on every change; the leads stay where you put them"
        )
        self.outcome = QLabel("—")
        self.outcome.setWordWrap(True)
        self.uses = QTableWidget(0, 5)
        self.uses.setHorizontalHeaderLabels(
            ["Tug", "Usable pull", "Pull", "Use of usable", "Checks"]
        )
        self.lost_title = QLabel("Tug lost check")
        self.lost_title.setWordWrap(True)
        self.lost = QTableWidget(0, 4)
        self.lost.setHorizontalHeaderLabels(["Tug lost", "Goal", "Largest use", "What is missing"])
        for t in (self.uses, self.lost):
            t.verticalHeader().setVisible(False)
            t.setEditTriggers(QTableWidget.EditTrigger.NoEditTriggers)
            t.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
            t.horizontalHeader().setStretchLastSection(True)
        goal_box = QGroupBox("Goal for this stage")
        form = QFormLayout(goal_box)
        form.addRow(self.kind)
        form.addRow(self.fx_label, self.fx)
        form.addRow(self.fy_label, self.fy)
        form.addRow(self.mz_label, self.mz)
        buttons = QHBoxLayout()
        buttons.addWidget(self.solve_button)
        buttons.addWidget(self.live, 1)
        form.addRow(buttons)
        layout = QVBoxLayout(self)
        layout.addWidget(goal_box)
        layout.addWidget(self.outcome)
        layout.addWidget(self.uses, 2)
        layout.addWidget(self.lost_title)
        layout.addWidget(self.lost, 2)
        note = QLabel(
            "Spreads the work: the least largest use of usable pull, then the least total pull. "
            "Usable pull = rated × efficiency (sea state) × towline angle."
        )
        note.setWordWrap(True)
        note.setStyleSheet("color: #455a64;")
        layout.addWidget(note)
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(150)
        self._timer.timeout.connect(self.recheck)
        self._shown_stage: object = None
        controller.changed.connect(self._changed)
        self._sync_goal()
        self.recheck()

    # -- the goal -------------------------------------------------------------------
    def _kind_changed(self) -> None:
        k = self.kind.currentData()
        self.fx.setEnabled(k in ("walk", "force"))
        self.fy.setEnabled(k in ("walk", "force"))
        self.mz.setEnabled(k in ("swing", "force"))
        self._timer.start()

    def _sync_goal(self) -> None:
        """Show the stage's own goal when another stage comes on the board."""
        c = self.controller
        u = c.project.units
        self.fx_label.setText(f"Force ahead + / astern − ({label(u.unit('force'))})")
        self.fy_label.setText(f"Force to port + / starboard − ({label(u.unit('force'))})")
        self.mz_label.setText(f"Yaw moment, + bow to port ({label(u.unit('moment'))})")
        stage = c.stage
        key = (c.stage_index, None if stage is None else stage.goal, u)
        if key == self._shown_stage:
            return
        self._shown_stage = key
        g = stage.goal if stage is not None and stage.goal is not None else None
        self.kind.blockSignals(True)
        self.kind.setCurrentIndex(GOAL_KINDS.index(g.kind) if g is not None else 0)
        self.kind.blockSignals(False)
        for w, v, q in (
            (self.fx, g.fx_n if g else 0.0, "force"),
            (self.fy, g.fy_n if g else 0.0, "force"),
            (self.mz, g.moment_nm if g else 0.0, "moment"),
        ):
            w.setText(f"{u.value(v, q):.6g}")  # type: ignore[arg-type]
        self._kind_changed()

    def goal(self) -> Goal:
        """The goal as set in the panel; raises InputError naming a bad field."""
        u = self.controller.project.units
        vals = []
        for w, what, q in (
            (self.fx, "force ahead", "force"),
            (self.fy, "force to port", "force"),
            (self.mz, "yaw moment", "moment"),
        ):
            text = w.text().strip().replace(",", ".") or "0"
            try:
                v = float(text)
            except ValueError:
                raise InputError(what, w.text(), "is not a number") from None
            if not math.isfinite(v):
                raise InputError(what, w.text(), "is not a finite number")
            vals.append(u.si(v, q))  # type: ignore[arg-type]
        return Goal(self.kind.currentData(), *vals)

    # -- solving --------------------------------------------------------------------
    def solve(self) -> None:
        """Fill in the settings for the goal and keep the goal with the stage (one undo step)."""
        c = self.controller
        stage = c.stage
        if stage is None or not stage.placements:
            c.message.emit("No tugs are placed in this stage.")
            return
        try:
            goal = self.goal()
            new_stage, result = solved_stage(c.project, replace(stage, goal=goal), goal)
        except TowboardError as e:
            c.message.emit(f"Pulls not solved: {e}")
            return
        c.apply(c.with_stage(new_stage), f"Solve pulls ({goal.kind})")
        if result.feasible:
            c.message.emit(f"Solved: largest use {result.max_utilisation * 100:.0f} %")
        else:
            c.message.emit(
                "Goal out of reach: the closest state is set; it "
                + shortfall_words(result.shortfall, c.project.units)
            )

    def live_filter(
        self, project: Project, results: dict[str, BodyResult] | None = None
    ) -> Project:
        """The project with the stage shown solved for the panel's goal (live mode).

        ``results`` (the drag's fast path) lend the main body's layout, so it is not
        worked out again."""
        c = self.controller
        if not project.stages:
            return project
        index = min(c.stage_index, len(project.stages) - 1)
        stage = project.stages[index]
        if not stage.placements:
            return project
        layout = None
        if results:
            r = results.get(c.main_body() or "")
            if r is not None:
                layout = r.layout
        try:
            new_stage, _ = solved_stage(project, stage, self.goal(), leads=False, layout=layout)
        except TowboardError:
            return project
        return project if new_stage is stage else project.with_stage(new_stage, index)

    # -- showing --------------------------------------------------------------------
    def _changed(self) -> None:
        self._sync_goal()
        if not self.controller.previewing:
            self._timer.start()

    def recheck(self) -> None:
        """Solve for the goal as the plan stands, run the tug lost check, collect warnings."""
        c = self.controller
        stage = c.stage
        self.result, self.check = None, None
        notes: dict[str, list[str]] = {}
        u = c.project.units
        if stage is None or not stage.placements or not c.project.hulls:
            self.outcome.setText("Place tugs to solve their pulls.")
            self._fill_uses()
            self._fill_lost()
            self._set_notes(notes)
            return
        for b in c.balances().values():
            for sh in b.shares:
                if sh.setting > 1 + 1e-9:
                    notes.setdefault(sh.tug, []).append("over 100 %")
            for n in b.notices:
                if n.code == "over_swl":
                    notes.setdefault(n.subject, []).append("over fitting SWL")
                elif n.code == "steep_line":
                    notes.setdefault(n.subject, []).append("steep towline")
        try:
            goal = self.goal()
            self.check = run_tug_lost_check(pulls_problem(c.project, stage, goal=goal))
            self.result = self.check.full
        except TowboardError as e:
            self.outcome.setText(f"Cannot solve: {e}")
            self._fill_uses()
            self._fill_lost()
            self._set_notes(notes)
            return
        for tug, swl, bp in _fittings(c.project, stage):
            if not fitting_suits(swl, bp):  # IMO MSC.1/Circ.1175: SWL S suits BP up to S
                notes.setdefault(tug, []).append("fitting under-rated for its BP")
        r = self.result
        if r.feasible:
            text = (
                f"The goal can be met: largest use {r.max_utilisation * 100:.0f} %, total pull "
                f"{u.show(r.total_pull_n, 'force')}."
            )
        else:
            text = f"The goal is out of reach: {shortfall_words(r.shortfall, u)}."
        if r.feasible and not _same_settings(stage, r):
            text += " The settings on the board differ: press Solve pulls to use these."
        self.outcome.setText(text)
        if r.feasible:
            for case in self.check.cases:
                if not case.holds:
                    notes.setdefault(case.tug, []).append("goal fails without it")
        self._fill_uses()
        self._fill_lost()
        self._set_notes(notes)

    def _set_notes(self, notes: dict[str, list[str]]) -> None:
        if notes != self.notes:
            self.notes = notes
            self.notes_changed.emit(notes)

    def _fill_uses(self) -> None:
        t = self.uses
        r = self.result
        u = self.controller.project.units
        shares = [sh for b in self.controller.balances().values() for sh in b.shares]
        t.setRowCount(len(shares))
        solved = {}
        if r is not None:
            solved = {p.tug: i for i, p in enumerate(r.problem.placements)}
        for row, sh in enumerate(shares):
            use = sh.pull_n / sh.usable_n if sh.usable_n > 0 else 0.0
            cells = [
                sh.tug,
                u.show(sh.usable_n, "force"),
                u.show(sh.pull_n, "force"),
                f"{use * 100:.0f} %",
                ", ".join(self.notes.get(sh.tug, [])),
            ]
            if r is not None and sh.tug in solved:
                i = solved[sh.tug]
                if abs(float(r.pulls_n[i]) - sh.pull_n) > 0.005 * max(sh.usable_n, 1.0):
                    cells[2] += f"  (solved {u.show(float(r.pulls_n[i]), 'force')})"
            for col, text in enumerate(cells):
                item = QTableWidgetItem(text)
                if col in (1, 2, 3):
                    item.setTextAlignment(
                        Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter
                    )
                if (col == 3 and use > 1 + 1e-9) or (col == 4 and cells[4]):
                    item.setForeground(FAIL)
                t.setItem(row, col, item)

    def _fill_lost(self) -> None:
        t = self.lost
        c = self.check
        u = self.controller.project.units
        if c is None:
            t.setRowCount(0)
            self.lost_title.setText("Tug lost check")
            return
        if not c.full.feasible:
            t.setRowCount(0)
            self.lost_title.setText(
                "Tug lost check: not meaningful, the goal is not met with every tug."
            )
            return
        worst = c.worst
        if c.passes:
            head = "Tug lost check: the goal still holds with any one tug lost."
        else:
            head = "Tug lost check FAILS: the goal does not hold with every single tug lost."
        if worst is not None:
            head += f" The loss that hurts most: {worst.tug}."
        self.lost_title.setText(head)
        self.lost_title.setStyleSheet(f"color: {(OK if c.passes else FAIL).name()};")
        t.setRowCount(len(c.cases))
        for row, case in enumerate(c.cases):
            missing = "—" if case.holds else shortfall_words(case.result.shortfall, u)
            cells = [
                case.tug,
                "holds" if case.holds else "fails",
                f"{case.worst_utilisation * 100:.0f} % ({case.worst_tug or '—'})",
                missing,
            ]
            for col, text in enumerate(cells):
                item = QTableWidgetItem(text)
                if not case.holds:
                    item.setForeground(FAIL)
                if worst is not None and case.tug == worst.tug:
                    f = item.font()
                    f.setBold(True)
                    item.setFont(f)
                t.setItem(row, col, item)


def _same_settings(stage: Stage, r: PullsResult) -> bool:
    placed = {p.tug: p.setting for p in stage.placements}
    return all(
        abs(placed.get(p.tug, -1.0) - float(s)) < 5e-3
        for p, s in zip(r.problem.placements, r.utilisation, strict=True)
    )


def _fittings(project: Project, stage: Stage) -> list[tuple[str, float, float]]:
    """(tug, fitting SWL, tug BP) for every tug on a line point with a rated fitting."""
    out = []
    hulls = {h.name: h for h in project.hulls}
    for p in stage.placements:
        h = hulls.get(p.hull)
        if h is None:
            continue
        try:
            f = h.fitting(p.point)
            bp = project.tug(p.tug).bollard_pull_n
        except TowboardError:
            continue
        if f.kind == "line" and f.swl_n is not None:
            out.append((p.tug, f.swl_n, bp))
    return out
