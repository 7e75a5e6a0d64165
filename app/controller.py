"""The one controller of the window: the current project value, the stage shown, undo.

Everything on screen reads :class:`Controller` and writes back through it:

- ``controller.project`` is the current :class:`core.model.plan.Project` (a frozen value);
  ``controller.stage_index`` / ``controller.stage`` the stage on the board (None when
  the project has no stage).
- ``controller.apply(new_project, text, merge_key=None)`` records one undoable edit.
  Edits with the same ``merge_key`` pushed one after another in the same stage merge
  into one undo step (nudges, wheel steps of one tug). Each step remembers the stage
  shown when it was made: undoing or redoing it shows that stage again, and the status
  bar says so when it was another, so no edit changes a stage out of sight.
- ``controller.preview(new_project)`` shows a value live without recording it (a drag
  in progress); ``controller.commit_preview(text)`` records the whole drag as one
  undo step, ``controller.cancel_preview()`` puts the value from before the drag back.
- ``changed`` is emitted whenever the value (or the stage shown) differs from before;
  ``stage_changed(int)`` when another stage is shown; ``dirty_changed(bool)`` and
  ``path_changed`` for the title bar.
- ``controller.stage_result()`` is the one result of the stage shown
  (:func:`core.analysis.stage.stage_result`: balances, loads, fittings, solved pulls,
  tug lost check, hold limits, clearances and the verdict), worked out once per project
  value; every panel reads it and none works a stage figure out on its own.
- ``controller.results()`` / ``balances()`` are each body's tugs, loads and balance in
  the stage shown: the stage result's own, or during a drag the light part of it
  (:func:`core.analysis.stage.body_balance`, or the drag's fast path, which the tests
  hold equal to it).
- ``controller.follow(slot, owner, reads=None)`` is how a view listens: ``slot`` runs on
  every change, except during a drag's mouse moves when ``owner`` (a widget) is not on
  screen (a dock behind another's tab) or ``reads(controller)`` (what the view shows,
  as a tuple of values) is what it was; the drag's end is a change like any other, so
  every view is up to date when the mouse is let go.
"""

from __future__ import annotations

import time
import weakref
from collections.abc import Callable, Hashable
from dataclasses import dataclass, fields, replace
from pathlib import Path

from PySide6.QtCore import QObject, Signal
from PySide6.QtGui import QUndoCommand, QUndoStack
from PySide6.QtWidgets import QWidget

from app.collector import CollectorHold
from app.guard import guarded
from core.analysis.stage import StageResult, body_balance, stage_result
from core.mechanics.balance import Balance, Load, TugLayout, analyse_layout
from core.mechanics.bodies import Body, body_name_of_hull, body_of
from core.mechanics.loads import ConditionLoads
from core.model.integrity import broken_reference
from core.model.plan import Project, Stage


@dataclass(frozen=True, slots=True)
class BodyResult:
    """One body in the stage shown: the body, its tugs as arrays, and its balance."""

    body: Body
    layout: TugLayout
    loads: tuple[Load, ...]
    balance: Balance
    conditions: ConditionLoads | None = None  # the wind and current on it, and what is missing


@dataclass(frozen=True, slots=True)
class BodyParts:
    """What an edit filter reads of one body in a drag: the body, its tugs as arrays for
    the plan handed to the filter, and the wind and current on it. No balance: a filter
    may change the tugs' settings, and the balance is worked out after it, once."""

    body: Body
    layout: TugLayout
    loads: tuple[Load, ...]
    conditions: ConditionLoads | None = None

    @classmethod
    def of(cls, r: BodyResult) -> BodyParts:
        return cls(r.body, r.layout, r.loads, r.conditions)


_MERGE_IDS: dict[object, int] = {}


def _merge_id(key: object) -> int:
    """A stable small integer per merge key (QUndoCommand.id() must be an int)."""
    return _MERGE_IDS.setdefault(key, 1000 + len(_MERGE_IDS))


class ProjectCommand(QUndoCommand):
    """Swap one project value for another (redo is safe when already applied).

    ``stage`` is the index of the stage shown when the edit was made: undo and redo show
    it (the stages are then as they were when the edit was made, the stack being undone
    in order), and edits of two stages never merge.
    """

    def __init__(
        self,
        controller: Controller,
        old: Project,
        new: Project,
        text: str,
        merge_key: object | None = None,
    ) -> None:
        super().__init__(text)
        self._controller = controller
        self.old = old
        self.new = new
        self.merge_key = merge_key
        self.stage = controller.stage_index

    @guarded
    def redo(self) -> None:
        self._controller._set_recorded(self.new, self.stage, f"Redone: {self.text()}")

    @guarded
    def undo(self) -> None:
        self._controller._set_recorded(self.old, self.stage, f"Undone: {self.text()}")

    @guarded(default=-1)
    def id(self) -> int:
        return -1 if self.merge_key is None else _merge_id((self.stage, self.merge_key))

    @guarded(default=False)
    def mergeWith(self, other: QUndoCommand) -> bool:
        if not isinstance(other, ProjectCommand) or other.merge_key != self.merge_key:
            return False
        if self.merge_key is None or other.stage != self.stage:
            return False
        self.new = other.new
        return True


def on_screen(widget: QWidget) -> bool:
    """Whether any of ``widget`` can be seen (a dock behind another's tab is "visible" to
    Qt but kept off screen, so its visible region is empty)."""
    return widget.isVisible() and not widget.visibleRegion().isEmpty()


class _Follower(QObject):
    """Runs one view's slot on the controller's changes (see :meth:`Controller.follow`).

    A child of the view's owner, so the connection goes when the view goes.
    """

    def __init__(
        self,
        controller: Controller,
        slot: Callable[[], object],
        owner: QObject,
        reads: Callable[[Controller], Hashable] | None,
    ) -> None:
        super().__init__(owner)
        self._controller = controller
        self._slot = slot
        self._widget = owner if isinstance(owner, QWidget) else None
        self._reads = reads
        self._shown: Hashable = None
        self._behind = False  # a change was left out while the view was off screen
        controller.changed.connect(self.changed)

    @guarded(what="bringing a view up to date")
    def changed(self) -> None:
        c = self._controller
        if c.previewing:
            if self._widget is not None and not on_screen(self._widget):
                self._behind = True
                return
            unchanged = self._reads is not None and self._reads(c) == self._shown
            if unchanged and not self._behind:
                return
        self._behind = False
        if self._reads is not None:
            self._shown = self._reads(c)
        self._slot()


class Controller(QObject):
    """Owns the project value, the stage shown, the file path and the undo stack."""

    changed = Signal()
    stage_changed = Signal(int)
    dirty_changed = Signal(bool)
    path_changed = Signal()
    #: A message for the status bar (for example why an edit was refused).
    message = Signal(str)

    def __init__(self, project: Project | None = None, parent: QObject | None = None) -> None:
        super().__init__(parent)
        self._project = project if project is not None else Project()
        self._stage_index = 0
        self._path: Path | None = None
        #: The plan as recorded while a drag previews another (see _preview_base).
        self._recorded_under_preview: Project | None = None
        #: Python's cycle collector is held off while a drag previews (app.collector).
        self._collector_hold = CollectorHold()
        weakref.finalize(self, self._collector_hold.let_go)  # a window closed mid-drag
        #: When the preview shown was asked for (perf_counter seconds): a drag's move as it
        #: began, before live solving and the views (what paces work between the moves).
        self.previewed_at = 0.0
        #: How many times the window started afresh on a plan (file new / open): a view
        #: keeping something of the plan shown knows by it that another plan came.
        self.plans_opened = 0
        self._results: dict[str, BodyResult] | None = None
        self._results_override: dict[str, BodyResult] | None = None
        self._all_but_placements: tuple[Project, int, tuple[object, ...]] | None = None
        #: Callables ``(project, parts) -> project`` run on every edit and preview before
        #: it is shown (live solving fills in the settings); ``parts`` are the bodies'
        #: :class:`BodyParts` for ``project`` when the caller has them (a drag), else None.
        #: The same object back means no change.
        self.edit_filters: list[Callable[[Project, dict[str, BodyParts] | None], Project]] = []
        self.undo_stack = QUndoStack(self)
        self.undo_stack.cleanChanged.connect(self._clean_changed)

    @guarded
    def _clean_changed(self, clean: bool) -> None:
        self.dirty_changed.emit(not clean)

    # -- reading ------------------------------------------------------------------
    @property
    def project(self) -> Project:
        return self._project

    @property
    def stage_index(self) -> int:
        return self._stage_index

    @property
    def stage(self) -> Stage | None:
        stages = self._project.stages
        if not stages:
            return None
        return stages[min(self._stage_index, len(stages) - 1)]

    @property
    def path(self) -> Path | None:
        return self._path

    @property
    def dirty(self) -> bool:
        return not self.undo_stack.isClean()

    @property
    def previewing(self) -> bool:
        return self._preview_base is not None

    @property
    def _preview_base(self) -> Project | None:
        """The plan as recorded while a drag previews another, else None. Every way a
        preview begins or ends goes through here, and so does the collector's hold."""
        return self._recorded_under_preview

    @_preview_base.setter
    def _preview_base(self, base: Project | None) -> None:
        self._recorded_under_preview = base
        if base is None:
            self._collector_hold.let_go()
        else:
            self._collector_hold.hold()

    # -- views that listen -------------------------------------------------------------
    def follow(
        self,
        slot: Callable[[], object],
        owner: QObject,
        reads: Callable[[Controller], Hashable] | None = None,
    ) -> None:
        """Run ``slot`` on every change; during a drag's mouse moves only when it shows.

        ``owner`` is the view (its lifetime bounds the connection); while a drag previews,
        a widget ``owner`` that is not on screen is left alone, and so is a view whose
        ``reads(controller)`` (what it shows, compared with ==) is as it was. Each is
        brought up to date by the drag's end, which is a change like any other.
        """
        _Follower(self, slot, owner, reads)

    def all_but_placements(self) -> tuple[object, ...]:
        """The plan less the tugs' placements in the stage shown, and that stage's index:
        what a view reads that no tug drag changes (for ``follow``'s ``reads``). Values
        compare by identity first, so comparing two costs a few pointer comparisons; it
        is made once per plan and stage shown (every such view reads it on every change)."""
        p = self._project
        i = self._stage_index
        kept = self._all_but_placements
        if kept is not None and kept[0] is p and kept[1] == i:
            return kept[2]
        parts: list[object] = [i]
        parts += [getattr(p, name) for name in _fields_of(p) if name != "stages"]
        for k, s in enumerate(p.stages):
            if k == i:
                parts.append(
                    tuple(getattr(s, name) for name in _fields_of(s) if name != "placements")
                )
            else:
                parts.append(s)
        out = tuple(parts)
        self._all_but_placements = (p, i, out)
        return out

    # -- the stage's result ---------------------------------------------------------
    def stage_result(self) -> StageResult | None:
        """The one result of the stage shown (None when the plan has no stage)."""
        stages = self._project.stages
        if not stages:
            return None
        return stage_result(self._project, min(self._stage_index, len(stages) - 1))

    def results(self) -> dict[str, BodyResult]:
        """Each body of the stage shown, by body name, with its balance (computed once)."""
        if self._results_override is not None:
            return self._results_override
        if self._results is None:
            self._results = self._compute_results()
        return self._results

    def balances(self) -> dict[str, Balance]:
        """The balance of each body in the stage shown, by body name."""
        return {name: r.balance for name, r in self.results().items()}

    def _compute_results(self) -> dict[str, BodyResult]:
        stage = self.stage
        if stage is None:
            return {}
        if self.previewing:  # a drag in progress: the light part of the stage result
            return {
                name: _light(self._project, stage, body_of(self._project, name))
                for name in self._project.body_names()
            }
        return results_of(self.stage_result())

    def results_for(self, index: int) -> dict[str, BodyResult]:
        """Every body's result in stage ``index`` (any stage, not only the one shown)."""
        if not 0 <= index < len(self._project.stages):
            return {}
        return results_of(stage_result(self._project, index))

    def balance(self, body: str | None = None) -> Balance | None:
        """The balance of ``body`` (default: the main body of the stage shown)."""
        b = self.balances()
        name = body if body is not None else self.main_body()
        return b.get(name) if name is not None else None

    def main_body(self) -> str | None:
        """The body the stage's first tug works on, else the first body."""
        names = self._project.body_names()
        if not names:
            return None
        stage = self.stage
        if stage is not None and stage.placements:
            try:
                return body_name_of_hull(self._project, stage.placements[0].hull)
            except ValueError:
                pass
        return names[0]

    # -- writing ------------------------------------------------------------------
    def _set_recorded(self, project: Project, stage: int, said: str) -> None:
        """Undo or redo put ``project`` in place, showing stage ``stage`` (the one shown
        when the edit was made; when another was shown, the status bar says ``said`` in
        that stage). A drag's preview under way is dropped (undo works on what
        was recorded, never on a half-finished drag)."""
        self._preview_base = None
        self._results_override = None
        stage = max(0, min(stage, len(project.stages) - 1))
        if not project.stages or stage == self._stage_index:
            self._set_project(project)
            return
        self._project = project
        self.set_stage_index(stage)  # clears the results and says the stage changed
        name = project.stages[stage].name
        self.message.emit(f"{said} (in stage {stage + 1} “{name}”, now shown)")

    def _set_project(self, project: Project, results: dict[str, BodyResult] | None = None) -> None:
        if project is self._project and results is None:
            return
        self._project = project
        self._results = None
        self._results_override = results
        if self._stage_index >= max(len(project.stages), 1):
            self._stage_index = max(len(project.stages) - 1, 0)
            self.stage_changed.emit(self._stage_index)
        self.changed.emit()

    def _filtered(self, new: Project, parts: dict[str, BodyParts] | None = None) -> Project:
        for f in self.edit_filters:
            new = f(new, parts)
        return new

    def _with_settings(
        self, parts: dict[str, BodyParts], project: Project
    ) -> dict[str, BodyResult] | None:
        """Each body's result for ``project`` from its ``parts`` for a plan that differs
        from it only in tug settings (else None).

        A tug's pull is its setting times its usable pull, so the layouts keep every array
        and only the balances are reduced again (the drag path stays fast).
        """
        stage = project.stages[min(self._stage_index, len(project.stages) - 1)]
        placed = {p.tug: p for p in stage.placements}
        out: dict[str, BodyResult] = {}
        for name, r in parts.items():
            new = []
            for p in r.layout.placements:
                q = placed.get(p.tug)
                if q is None or not (q is p or _same_but_setting(q, p)):
                    return None
                new.append(q)
            layout = replace(r.layout, placements=tuple(new))
            balance = analyse_layout(stage, r.body, layout, project.units, r.loads)
            out[name] = BodyResult(r.body, layout, r.loads, balance, r.conditions)
        return out

    def invalidate(self) -> None:
        """Work the results out again and tell every widget."""
        self._results = None
        self.changed.emit()

    def apply(self, new: Project, text: str, merge_key: object | None = None) -> None:
        """Record an edit to ``new`` as one undo step (merging with the same key).

        An edit whose names name nothing in the plan (made from a view of a plan that
        has since been replaced) is refused with an :class:`InputError`; nothing changes.
        """
        new = self._filtered(new)
        self._refuse_broken(new)
        if self._preview_base is not None:
            base, self._preview_base = self._preview_base, None
            self._results_override = None
            self._project = base  # the command's redo puts ``new`` in place
            self._results = None
            if new == base:
                self.changed.emit()
                return
        if new == self._project:
            return
        self.undo_stack.push(ProjectCommand(self, self._project, new, text, merge_key))

    def _refuse_broken(self, new: Project) -> None:
        problem = broken_reference(new, self._project)
        if problem is not None:
            raise problem

    def preview(self, new: Project) -> None:
        """Show ``new`` live (a drag in progress) without recording it."""
        self.previewed_at = time.perf_counter()
        new = self._filtered(new)
        self._refuse_broken(new)
        self._show_preview(new, None)

    def preview_moved_tug(self, new: Project, body: str, layout: TugLayout, row: int) -> None:
        """Show a tug drag's move: ``new`` is the plan shown with one tug of ``body``
        moved, ``layout`` that body's tugs as arrays for it with only row ``row`` made
        again (core.mechanics.balance.with_placement_row; the fast path).

        The balance is worked out once: for the plan the edit filters give when they
        change the settings (live solving), else for the one row.
        """
        self.previewed_at = time.perf_counter()
        results = self.results()
        r = results[body]
        parts = {n: BodyParts.of(x) for n, x in results.items()}
        parts[body] = BodyParts(r.body, layout, r.loads, r.conditions)
        filtered = self._filtered(new, parts)
        self._refuse_broken(filtered)
        out: dict[str, BodyResult] | None
        if filtered is not new:
            out = self._with_settings(parts, filtered)
            new = filtered
        else:
            stage = new.stages[min(self._stage_index, len(new.stages) - 1)]
            balance = analyse_layout(
                stage, r.body, layout, new.units, r.loads, before=r.balance, changed_row=row
            )
            out = dict(results)
            out[body] = BodyResult(r.body, layout, r.loads, balance, r.conditions)
        self._show_preview(new, out)

    def _show_preview(self, new: Project, results: dict[str, BodyResult] | None) -> None:
        if self._preview_base is None:
            self._preview_base = self._project
        self._set_project(new, results)

    def commit_preview(self, text: str, merge_key: object | None = None) -> None:
        """Record the previewed value (the whole drag) as one undo step."""
        if self._preview_base is None:
            return
        base, new = self._preview_base, self._project
        self._preview_base = None
        self._results_override = None
        self._results = None
        if new == base:
            self.changed.emit()
            return
        self._project = base
        self.undo_stack.push(ProjectCommand(self, base, new, text, merge_key))

    def cancel_preview(self) -> None:
        """Put back the value from before the preview."""
        if self._preview_base is None:
            return
        base, self._preview_base = self._preview_base, None
        self._results_override = None
        self._set_project(base)

    @guarded
    def set_stage_index(self, index: int) -> None:
        n = len(self._project.stages)
        index = max(0, min(index, n - 1)) if n else 0
        if index == self._stage_index:
            return
        self._stage_index = index
        self._results = None
        self._results_override = None
        self.stage_changed.emit(index)
        self.changed.emit()

    def reset(self, project: Project, path: Path | None = None) -> None:
        """Start afresh on ``project`` (file new / open): clears undo and marks clean."""
        self._preview_base = None
        self._results_override = None
        self.plans_opened += 1
        self.undo_stack.clear()
        self._path = path
        self._stage_index = 0
        self._project = project
        self._results = None
        self.undo_stack.setClean()
        self.path_changed.emit()
        self.stage_changed.emit(0)
        self.changed.emit()
        self.dirty_changed.emit(False)

    def mark_saved(self, path: Path) -> None:
        self._path = path
        self.undo_stack.setClean()
        self.path_changed.emit()

    # -- helpers for edits ------------------------------------------------------------
    def with_stage(self, stage: Stage, project: Project | None = None) -> Project:
        """``project`` (default: current) with the stage shown replaced by ``stage``."""
        p = self._project if project is None else project
        if not p.stages:
            return replace(p, stages=(stage,))
        return p.with_stage(stage, min(self._stage_index, len(p.stages) - 1))

    def ensure_stage(self, project: Project) -> tuple[Project, Stage]:
        """``project`` with at least one stage, and the stage shown."""
        if project.stages:
            return project, project.stages[min(self._stage_index, len(project.stages) - 1)]
        stage = Stage("Stage 1")
        return replace(project, stages=(stage,)), stage


_FIELDS: dict[type, tuple[str, ...]] = {}


def _fields_of(value: object) -> tuple[str, ...]:
    """The names of a dataclass value's public fields (worked out once per class)."""
    cls = type(value)
    names = _FIELDS.get(cls)
    if names is None:
        names = _FIELDS[cls] = tuple(f.name for f in fields(cls) if f.name[0] != "_")  # type: ignore[arg-type]
    return names


def _same_but_setting(a: object, b: object) -> bool:
    """Whether two placements are the same but for their settings."""
    return type(a) is type(b) and all(
        getattr(a, name) == getattr(b, name) for name in _fields_of(a) if name != "setting"
    )


def results_of(result: StageResult | None) -> dict[str, BodyResult]:
    """The board's view of a stage result: each body's tugs, loads and balance."""
    if result is None:
        return {}
    return {
        b.name: BodyResult(b.body, b.layout, b.loads, b.balance, b.conditions)
        for b in result.bodies
    }


def _light(project: Project, stage: Stage, body: Body) -> BodyResult:
    layout, cond, balance = body_balance(project, stage, body)
    return BodyResult(body, layout, cond.loads, balance, cond)
