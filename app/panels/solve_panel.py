"""The solve pulls panel: the stage's goal, the solved pulls, each tug's use, the tug lost check.

The goal belongs to the stage: choosing a kind or typing a figure is an undoable edit of
the stage's goal ("no goal" shows the pulls as set, unchecked). Every figure shown is the
stage result's (core.analysis.stage): the pulls solved for the goal, the tug lost check
and the verdict's reasons for each tug; the panel says them in the display units.
"Solve pulls" sets every tug's setting (and, for a tug with a lead sector, its lead) to
the solved pulls in one undo step. With "solve live" on, the settings follow the solver
on every edit and every mouse move of a drag (the leads stay where the mouse puts them);
live solving needs a goal and changes nothing without one.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import QTimer, Signal
from PySide6.QtGui import QColor
from PySide6.QtWidgets import (
    QCheckBox,
    QComboBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QPushButton,
    QTableWidget,
    QVBoxLayout,
    QWidget,
)

from app.controller import BodyParts, Controller
from app.guard import guarded
from app.numbers import message, parse_value
from app.panels.body_choice import BodyChoice
from app.panels.dialog_parts import note_label
from app.panels.panel_field import PanelField
from app.panels.table_cells import Cell, fill
from core.analysis.stage import BodyResult as StageBody
from core.analysis.stage import StageResult
from core.errors import TowboardError
from core.model import rules
from core.model.goals import GOAL_KINDS, GOAL_WORDS, Goal
from core.model.plan import Project, Stage
from core.solve.pulls import PullsResult, TugLostCheck, pulls_problem, shortfall_words, solve_pulls
from core.units import label, percent

NO_GOAL = "none"
GOAL_TITLES = {
    NO_GOAL: "No goal: show the pulls as set",
    "hold": "Hold: stay put against wind and current",
    "walk": "Walk: move sideways, no swing",
    "swing": "Swing: turn on the spot, no net force",
    "transit": "Transit: ahead or astern, no swing",
    "force": "Given net force and yaw moment",
}
#: Which figures each goal kind uses: force ahead, force to port, yaw moment.
USES = {
    NO_GOAL: (False, False, False),
    "hold": (False, False, False),
    "walk": (False, True, False),
    "swing": (False, False, True),
    "transit": (True, False, False),
    "force": (True, True, True),
}
#: Short words for a tug's own reasons, shown beside the tug.
TUG_NOTES = {
    "setting_over": "over 100 %",
    "fitting_over_rating": "over fitting SWL",
    "fitting_under_rated": "fitting under-rated for its BP",
    "steep_line": "steep towline",
    "push_outward": "pushes outward",
    "pull_short": "cannot give the pull",
}
FAIL = QColor("#b71c1c")
OK = QColor("#1b5e20")


def solved_stage(
    project: Project,
    stage: Stage,
    goal: Goal,
    leads: bool = True,
    parts: BodyParts | None = None,
) -> tuple[Stage, PullsResult]:
    """``stage`` with every tug's setting (and, with ``leads``, solved lead) for ``goal``
    (the live path: the same problem and solver the stage result uses).

    Without ``leads`` each tug works at its lead as set: a working sector is left aside
    for the solve, since the settings are applied with the leads as they are (a solve
    over the sectors would give settings for leads of its own choosing).

    ``parts`` may lend the body, its layout for ``stage`` and its loads (a drag's fast
    path), so they are not worked out again."""
    layout = None if parts is None else parts.layout
    made = None if parts is None else parts.body
    loads = None if parts is None else parts.loads
    if leads:
        result = solve_pulls(
            pulls_problem(project, stage, goal=goal, loads=loads, layout=layout, made_body=made)
        )
        return result.applied_to(stage), result
    held = stage
    if any(p.lead_sector_rad is not None for p in stage.placements):
        fixed = {p.tug: p.with_sector(None) for p in stage.placements}
        held = replace(stage, placements=tuple(fixed.values()))
        if layout is not None:
            layout = replace(layout, placements=tuple(fixed[p.tug] for p in layout.placements))
    result = solve_pulls(
        pulls_problem(project, held, goal=goal, loads=loads, layout=layout, made_body=made)
    )
    solved = {
        p.tug: float(s)
        for p, s in zip(result.problem.placements, result.settings.tolist(), strict=True)
        if abs(p.setting - float(s)) > 1e-12
    }
    if not solved:
        return stage, result
    # one new stage for all the settings (a stage per tug was most of a live move's solve)
    placements = tuple(
        p.with_setting(solved[p.tug]) if p.tug in solved else p for p in stage.placements
    )
    return replace(stage, placements=placements), result


def _either(names: list[str]) -> str:
    """``Gannet``, ``Gannet or Tern``, ``Gannet, Tern or Puffin``: any one of them."""
    if len(names) <= 1:
        return names[0] if names else "a tug"
    return ", ".join(names[:-1]) + " or " + names[-1]


def tug_notes(result: StageResult) -> dict[str, list[str]]:
    """Short warnings per tug from the stage's verdict and its tug lost check."""
    notes: dict[str, list[str]] = {}
    tugs = {t.name for t in result.project.tugs}
    for r in result.verdict.reasons:
        words = TUG_NOTES.get(r.code)
        if words is not None and r.subject in tugs and words not in notes.get(r.subject, []):
            notes.setdefault(r.subject, []).append(words)
    for b in result.worked:
        for t in b.fitting_totals:
            if t.shared and t.over_rating:
                for tug in t.tugs:
                    notes.setdefault(tug, []).append(
                        f"{t.point} over its rating with {len(t.tugs)} tugs"
                    )
        check = b.tug_lost
        if check is not None and check.full.feasible:
            for case in check.cases:
                if not case.holds:
                    notes.setdefault(case.tug, []).append("goal fails without it")
    return notes


class SolvePanel(QWidget):
    """The stage's goal, solve button, live switch, per-tug use and the tug lost check."""

    #: The per-tug warnings changed: {tug: [short warning, ...]}.
    notes_changed = Signal(dict)

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.result: PullsResult | None = None
        self.check: TugLostCheck | None = None
        self.notes: dict[str, list[str]] = {}
        self.kind = QComboBox()
        self.kind.setObjectName("goal_kind")
        for k in (NO_GOAL, *GOAL_KINDS):
            self.kind.addItem(GOAL_TITLES[k], k)
        self.kind.currentIndexChanged.connect(self._kind_chosen)
        self.fx, self.fy, self.mz = PanelField("0"), PanelField("0"), PanelField("0")
        for w, name in ((self.fx, "goal_fx"), (self.fy, "goal_fy"), (self.mz, "goal_mz")):
            w.setObjectName(name)
            w.committed.connect(self._figures_edited)
        self.fx_label, self.fy_label, self.mz_label = QLabel(), QLabel(), QLabel()
        #: A transit's planned speed through the water (each tug's headway table is read at it).
        self.speed = PanelField("0")
        self.speed.setObjectName("goal_speed")
        self.speed.setToolTip(
            "Planned speed through the water: each tug's usable pull is read from its "
            "headway table at this speed (Tugs > Edit tug…)"
        )
        self.speed.committed.connect(self._figures_edited)
        self.speed_label = QLabel()
        self.solve_button = QPushButton("Solve pulls")
        self.solve_button.setToolTip(
            "Set every tug's setting to the pulls solved for the goal (one undo step)"
        )
        self.solve_button.clicked.connect(self.solve)
        self.live = QCheckBox("Solve live while editing and dragging")
        self.live.setToolTip(
            "The settings follow the solver on every change (needs a goal); "
            "the leads stay where you put them"
        )
        #: In a stage with more than one worked body: the body shown and the stage's verdict.
        self.body_choice = BodyChoice()
        self.body_choice.chosen.connect(self.recheck)
        self.outcome = QLabel("—")
        self.outcome.setWordWrap(True)
        self.outcome.setObjectName("solve_outcome")
        self.uses = QTableWidget(0, 5)
        self.uses.setHorizontalHeaderLabels(["Tug", "Usable pull", "Pull", "Setting", "Checks"])
        self.lost_title = QLabel("Tug lost check")
        self.lost_title.setWordWrap(True)
        self.lost = QTableWidget(0, 4)
        self.lost.setHorizontalHeaderLabels(
            ["Tug lost", "Goal", "Largest setting", "What is missing"]
        )
        for t in (self.uses, self.lost):
            t.verticalHeader().setVisible(False)
            t.setEditTriggers(QTableWidget.EditTrigger.NoEditTriggers)
            t.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
            t.horizontalHeader().setStretchLastSection(True)
        goal_box = QGroupBox("Goal of this stage")
        form = QFormLayout(goal_box)
        form.addRow(self.kind)
        form.addRow(self.fx_label, self.fx)
        form.addRow(self.fy_label, self.fy)
        form.addRow(self.mz_label, self.mz)
        form.addRow(self.speed_label, self.speed)
        buttons = QHBoxLayout()
        buttons.addWidget(self.solve_button)
        buttons.addWidget(self.live, 1)
        form.addRow(buttons)
        layout = QVBoxLayout(self)
        layout.addWidget(goal_box)
        layout.addWidget(self.body_choice)
        layout.addWidget(self.outcome)
        layout.addWidget(self.uses, 2)
        layout.addWidget(self.lost_title)
        layout.addWidget(self.lost, 2)
        note = note_label(
            "Spreads the work: the least largest setting (pull over usable pull), then the least total pull. "
            "Usable pull = rated × efficiency (sea state) × towline angle × headway share "
            "(a transit's speed through the water)."
        )
        layout.addWidget(note)
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(150)
        self._timer.timeout.connect(self.recheck)
        self._shown_goal: object = None
        controller.follow(self._changed, self)
        self._sync_goal()
        self.recheck()

    # -- the goal (the stage's own) -------------------------------------------------
    def _enable_figures(self, kind: str) -> None:
        for w, on in zip((self.fx, self.fy, self.mz), USES[kind], strict=True):
            w.setEnabled(on)
        self.speed.setEnabled(kind == "transit")

    def _sync_goal(self) -> None:
        """Show the goal of the stage on the board (without echoing it back)."""
        c = self.controller
        u = c.project.units
        self.fx_label.setText(f"Force ahead + / astern − ({label(u.unit('force'))})")
        self.fy_label.setText(f"Force to port + / starboard − ({label(u.unit('force'))})")
        self.mz_label.setText(f"Yaw moment, + bow to port ({label(u.unit('moment'))})")
        self.speed_label.setText(f"Speed through the water ({label(u.unit('speed'))})")
        stage = c.stage
        g = None if stage is None else stage.goal
        key = (c.stage_index, g, u)
        if key == self._shown_goal:
            return
        self._shown_goal = key
        kind = NO_GOAL if g is None else g.kind
        self.kind.blockSignals(True)
        self.kind.setCurrentIndex(self.kind.findData(kind))
        self.kind.blockSignals(False)
        for w, v, q in (
            (self.fx, g.fx_n if g else 0.0, "force"),
            (self.fy, g.fy_n if g else 0.0, "force"),
            (self.mz, g.moment_nm if g else 0.0, "moment"),
        ):
            w.setText(f"{u.value(v, q):.6g}")  # type: ignore[arg-type]
        self.speed.setText(f"{u.value(g.speed_ms if g else 0.0, 'speed'):.6g}")
        self._enable_figures(kind)

    def goal(self) -> Goal | None:
        """The goal as the panel shows it (None: no goal); raises InputError naming a bad
        field, in the display units."""
        kind = self.kind.currentData()
        if kind == NO_GOAL:
            return None
        u = self.controller.project.units
        vals = []
        for w, rule, used in zip(
            (self.fx, self.fy, self.mz),
            (rules.GOAL_FORCE_AHEAD, rules.GOAL_FORCE_TO_PORT, rules.GOAL_MOMENT),
            USES[kind],
            strict=True,
        ):
            vals.append(parse_value(w.text() or "0", rule, u, "goal") if used else 0.0)
        speed = 0.0
        if kind == "transit":
            speed = parse_value(self.speed.text() or "0", rules.TRANSIT_SPEED, u, "goal")
        fx, fy, mz = vals
        return Goal(kind, fx, fy, mz, speed_ms=speed)

    @guarded
    def _kind_chosen(self) -> None:
        self._enable_figures(self.kind.currentData())
        self._set_goal()

    @guarded
    def _figures_edited(self) -> None:
        self._set_goal()

    def _set_goal(self) -> None:
        c = self.controller
        stage = c.stage
        if stage is None:
            return
        try:
            goal = self.goal()
        except TowboardError as e:
            c.message.emit(f"Goal not changed: {message(e, c.project.units)}")
            self._shown_goal = None
            self._sync_goal()
            return
        if goal == stage.goal:
            return
        what = "no goal" if goal is None else GOAL_WORDS[goal.kind].split(":")[0]
        c.apply(c.with_stage(replace(stage, goal=goal)), f"Set the goal: {what}")

    # -- solving --------------------------------------------------------------------
    @guarded
    def solve(self) -> None:
        """Set the settings to the pulls solved for the stage's goal (one undo step)."""
        c = self.controller
        stage = c.stage
        if stage is None or not stage.placements:
            c.message.emit("No tugs are placed in this stage.")
            return
        if stage.goal is None:
            c.message.emit(
                "This stage has no goal: choose hold, walk, swing, transit or a given force first."
            )
            return
        r = c.stage_result()
        solved = [b.solved for b in (r.worked if r is not None else ()) if b.solved is not None]
        if not solved:
            notes = [n for b in (r.worked if r is not None else ()) for n in b.notes]
            c.message.emit("Pulls not solved: " + ("; ".join(notes) or "nothing to solve"))
            return
        new = stage
        for s in solved:
            new = s.applied_to(new)
        c.apply(c.with_stage(new), f"Solve pulls ({stage.goal.kind})")
        worst = max(s.largest_setting for s in solved)
        if all(s.feasible for s in solved):
            c.message.emit(f"Solved: largest setting {percent(worst)} %")
        else:
            missing = next(s for s in solved if not s.feasible)
            c.message.emit(
                "Goal out of reach: the closest state is set; it "
                + shortfall_words(missing.shortfall, c.project.units)
            )

    def live_filter(self, project: Project, parts: dict[str, BodyParts] | None = None) -> Project:
        """The project with the stage shown solved for its goal (live mode; no goal, no change).

        ``parts`` (the drag's fast path) lend the main body, its layout and its loads, so
        they are not worked out again."""
        c = self.controller
        if not project.stages:
            return project
        index = min(c.stage_index, len(project.stages) - 1)
        stage = project.stages[index]
        if not stage.placements or stage.goal is None:
            return project
        lent = None if not parts else parts.get(c.main_body() or "")
        try:
            new_stage, _ = solved_stage(project, stage, stage.goal, leads=False, parts=lent)
        except TowboardError:
            return project
        return project if new_stage is stage else project.with_stage(new_stage, index)

    # -- showing --------------------------------------------------------------------
    @guarded
    def _changed(self) -> None:
        self._sync_goal()
        if not self.controller.previewing:
            self._timer.start()

    @guarded
    def recheck(self) -> None:
        """Show the stage result: the solved pulls, the tug lost check, each tug's notes."""
        c = self.controller
        r = c.stage_result()
        main = self.body_choice.body(r)  # the body chosen (the worst off), or the only one
        self.result = None if main is None else main.solved
        self.check = None if main is None else main.tug_lost
        self._set_notes(tug_notes(r) if r is not None else {})
        self.outcome.setText(self._outcome_text(main))
        self._fill_uses(main)
        self._fill_lost(main)

    def _outcome_text(self, main: StageBody | None) -> str:
        c = self.controller
        stage = c.stage
        if stage is None or main is None or not stage.placements:
            return "Place tugs to solve their pulls."
        if stage.goal is None:
            return "No goal set: the pulls as set are shown, not checked. Choose a goal above."
        r = self.result
        if r is None:
            return f"{main.name}: cannot solve: " + "; ".join(main.notes)
        u = c.project.units
        if r.feasible:
            text = (
                f"{main.name}: the goal can be met: largest setting {percent(r.largest_setting)} %, "
                f"total pull {u.show(r.total_pull_n, 'force')}."
            )
        else:
            text = f"{main.name}: the goal is out of reach: {shortfall_words(r.shortfall, u)}."
        if main.goal_met_as_set is False and r.feasible:
            text += " The pulls as set miss it: press Solve pulls to use these."
        return text

    def _set_notes(self, notes: dict[str, list[str]]) -> None:
        if notes != self.notes:
            self.notes = notes
            self.notes_changed.emit(notes)

    def _fill_uses(self, main: StageBody | None) -> None:
        r = self.result
        u = self.controller.project.units
        shares = [] if main is None else list(main.balance.shares)
        solved = {} if r is None else {p.tug: i for i, p in enumerate(r.problem.placements)}
        rows = []
        for sh in shares:
            pull = u.show(sh.pull_n, "force")
            if r is not None and sh.tug in solved:
                i = solved[sh.tug]
                if abs(float(r.pulls_n[i]) - sh.pull_n) > 0.005 * max(sh.usable_n, 1.0):
                    pull += f"  (solved {u.show(float(r.pulls_n[i]), 'force')})"
            notes = ", ".join(self.notes.get(sh.tug, []))
            rows.append(
                [
                    Cell(sh.tug),
                    Cell(u.show(sh.usable_n, "force"), right=True),
                    Cell(pull, right=True),
                    Cell(sh.setting_words, True, FAIL if sh.setting > 1 + 1e-9 else None),
                    Cell(notes, color=FAIL if notes else None),
                ]
            )
        fill(self.uses, rows)

    def _fill_lost(self, main: StageBody | None) -> None:
        t = self.lost
        c = self.check
        u = self.controller.project.units
        self.lost_title.setStyleSheet("")
        if c is None:
            t.setRowCount(0)
            self.lost_title.setText(
                "Tug lost check: needs a goal."
                if main is not None and main.goal is None
                else "Tug lost check"
            )
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
            failing = [case.tug for case in c.cases if not case.holds]
            head = f"Tug lost check FAILS: the goal is not held if {_either(failing)} is lost."
        if worst is not None:
            head += f" The loss that hurts most: {worst.tug}."
        self.lost_title.setText(head)
        self.lost_title.setStyleSheet(f"color: {(OK if c.passes else FAIL).name()};")
        rows = []
        for case in c.cases:
            missing = "—" if case.holds else shortfall_words(case.result.shortfall, u)
            texts = [
                case.tug,
                "holds" if case.holds else "fails",
                f"{percent(case.largest_setting)} % ({case.worst_tug or '—'})",
                missing,
            ]
            colour = None if case.holds else FAIL
            bold = worst is not None and case.tug == worst.tug
            rows.append([Cell(text, color=colour, bold=bold) for text in texts])
        fill(t, rows)
