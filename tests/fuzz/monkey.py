"""A monkey for the main window: seeded random clicks, drags, keys, menus, edits and dialogs.

``Monkey(window, seed, folder).run(n)`` does ``n`` random things a hostile user could do
to the real main window (``app.window.main_window.MainWindow``), with real mouse and key
events where the window takes them:

- clicks, double-clicks, right-clicks (and one of the menu's entries) and drags on the
  board with every tool, aimed at the board's items or anywhere;
- keys on the board: arrows (with Shift), Delete, Backspace, Escape, Enter, the tool
  letters, + and -, Page Up and Down, [ and ], Ctrl+Z and Ctrl+Shift+Z;
- undo and redo; every action reachable from the menu bar, except Quit;
- edits in every table (through the cell editor and Enter, or the model's setData) and in
  every field, box and button of the panels, with random and hostile values (empty,
  "nan", "1e400", "-5", huge, unicode, a lone surrogate...);
- every dialog answered at random: ``exec`` and Qt's static dialogs are replaced while the
  monkey runs (fields filled at random, then OK or Cancel); file dialogs get paths in
  ``folder`` (a plan saved earlier, a sample, a broken file, a missing one); a dialog
  left open by ``open()`` is answered on the next step.

Every ``check_every`` actions and at the end the window's plan must give its report
(``core.io.report``: the stage result of every stage) with finite numbers, and save and
load back equal. Errors that reached ``sys.excepthook`` (every guard sends a program
fault there) or ``sys.unraisablehook`` are faults; each is kept with the actions before it.

Run as a program it is one seed in this process (``benchmarks/monkey.py`` runs many in
subprocesses so that a crash is seen): ``python -m tests.fuzz.monkey --seed 3 --actions
5000 --trail trail.txt`` writes each action to ``trail.txt`` before doing it, so the last
lines name what was under way when a crash took the process down.
"""

from __future__ import annotations

import argparse
import faulthandler
import json
import math
import os
import random
import sys
import tempfile
import traceback
from collections.abc import Callable, Iterator
from contextlib import contextmanager
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, TextIO

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from PySide6.QtCore import QEvent, QPoint, QPointF, Qt, qInstallMessageHandler
from PySide6.QtGui import QAction, QContextMenuEvent, QMouseEvent
from PySide6.QtTest import QTest
from PySide6.QtWidgets import (
    QAbstractButton,
    QAbstractItemView,
    QAbstractSpinBox,
    QApplication,
    QCheckBox,
    QComboBox,
    QDialog,
    QDoubleSpinBox,
    QFileDialog,
    QInputDialog,
    QLineEdit,
    QListWidget,
    QMenu,
    QMessageBox,
    QPlainTextEdit,
    QSpinBox,
    QTabBar,
    QTextEdit,
    QWidget,
)

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = sorted((ROOT / "sample_projects").glob("*.towboard"))

#: Text a hostile user might type into any field or cell.
HOSTILE_TEXT = (
    "",
    " ",
    "nan",
    "NaN",
    "inf",
    "-inf",
    "1e400",
    "-1e400",
    "1e308",
    "-5",
    "0",
    "-0",
    "5e-324",
    "1e-300",
    "123456789012345678901234567890",
    "9" * 400,
    "abc",
    "1,5",
    "−3",
    "400 kN",
    "12 kn",
    "0x1F",
    "1e",
    "--1",
    "Åsgard — 名前 ⚓",
    "\u202eevil",
    "a\x00b",
    "tab\there",
    "line\nbreak",
    "\ud800",
    "x" * 5000,
)

#: Qt messages that say nothing about the program (the offscreen platform's limits).
BENIGN_QT = ("This plugin does not support", "edit: editing failed")
#: Qt messages that mean the program misused Qt: each is a fault.
FAULTY_QT = (
    "does not belong to this view",
    "Recursive repaint",
    "QPainter::begin",
    "Painter not active",
    "QObject::startTimer",
    "QObject::setParent",
    "QAbstractItemModel::endResetModel",
)

CTRL = Qt.KeyboardModifier.ControlModifier
SHIFT = Qt.KeyboardModifier.ShiftModifier
NONE = Qt.KeyboardModifier.NoModifier

BOARD_KEYS: tuple[tuple[Qt.Key, Qt.KeyboardModifier], ...] = (
    *(
        (k, m)
        for k in (Qt.Key.Key_Left, Qt.Key.Key_Right, Qt.Key.Key_Up, Qt.Key.Key_Down)
        for m in (NONE, SHIFT)
    ),
    (Qt.Key.Key_Delete, NONE),
    (Qt.Key.Key_Backspace, NONE),
    (Qt.Key.Key_Escape, NONE),
    (Qt.Key.Key_Return, NONE),
    (Qt.Key.Key_Enter, NONE),
    (Qt.Key.Key_Plus, NONE),
    (Qt.Key.Key_Minus, NONE),
    (Qt.Key.Key_Equal, NONE),
    (Qt.Key.Key_PageUp, NONE),
    (Qt.Key.Key_PageDown, NONE),
    (Qt.Key.Key_BracketLeft, NONE),
    (Qt.Key.Key_BracketRight, SHIFT),
    *(
        (k, NONE)
        for k in (
            Qt.Key.Key_S,
            Qt.Key.Key_D,
            Qt.Key.Key_L,
            Qt.Key.Key_P,
            Qt.Key.Key_Q,
            Qt.Key.Key_O,
            Qt.Key.Key_V,
            Qt.Key.Key_B,
        )
    ),
    (Qt.Key.Key_Z, CTRL),
    (Qt.Key.Key_Z, CTRL | SHIFT),
    (Qt.Key.Key_Tab, NONE),
)


@dataclass
class Outcome:
    """What a run found: faults (uncaught errors) and failed checks, each with its actions."""

    seed: int
    actions: int = 0
    checks: int = 0
    faults: list[str] = field(default_factory=list)
    failed_checks: list[str] = field(default_factory=list)
    qt_warnings: dict[str, int] = field(default_factory=dict)

    @property
    def clean(self) -> bool:
        return not self.faults and not self.failed_checks

    def summary(self) -> str:
        head = (
            f"seed {self.seed}: {self.actions} actions, {self.checks} checks, "
            f"{len(self.faults)} faults, {len(self.failed_checks)} failed checks"
        )
        warned = [f"Qt said ({n}x): {m}" for m, n in self.qt_warnings.items()]
        return "\n\n".join([head, *self.faults, *self.failed_checks, *warned])


def _finite_problems(value: Any, path: str = "") -> Iterator[str]:
    """Paths in a JSON-like tree that hold a non-finite number."""
    if isinstance(value, float):
        if not math.isfinite(value):
            yield f"{path or '/'} = {value}"
    elif isinstance(value, dict):
        for k, v in value.items():
            yield from _finite_problems(v, f"{path}/{k}")
    elif isinstance(value, list | tuple):
        for i, v in enumerate(value):
            yield from _finite_problems(v, f"{path}/{i}")


def check_project(project: Any) -> list[str]:
    """What is wrong with a plan the window holds: its report, its save and load back."""
    from core.io.projectfile import dumps, loads
    from core.io.report import report_json, report_text

    problems: list[str] = []
    try:
        report = report_json(project)
        problems += [f"report: not finite: {p}" for p in _finite_problems(report)]
        json.dumps(report, allow_nan=False)
        report_text(project)
    except Exception:
        problems.append("report failed:\n" + traceback.format_exc(limit=-12))
    try:
        text = dumps(project)
        again = loads(text)
        if dumps(again) != text:
            problems.append("saved and loaded back, the plan saves to other text")
        if again != loads(dumps(again)):
            problems.append("the plan loaded back is not equal to itself loaded again")
    except Exception:
        problems.append("save and load back failed:\n" + traceback.format_exc(limit=-12))
    return problems


class Patches:
    """Attributes replaced while the monkey runs, put back by ``undo``."""

    def __init__(self) -> None:
        self._old: list[tuple[object, str, object]] = []

    def set(self, owner: object, name: str, value: object) -> None:
        self._old.append((owner, name, owner.__dict__.get(name, getattr(owner, name))))  # type: ignore[attr-defined]
        setattr(owner, name, value)

    def undo(self) -> None:
        while self._old:
            owner, name, value = self._old.pop()
            setattr(owner, name, value)


class Monkey:
    """Random actions on one main window, from one seed (see the module docstring)."""

    def __init__(
        self,
        window: Any,
        seed: int,
        folder: Path,
        trail: TextIO | None = None,
        keep: Path | None = None,
    ) -> None:
        self.w = window
        self.keep = keep  # where the plan of a failed check is saved
        self.seed = seed
        self.rng = random.Random(seed)
        self.folder = Path(folder)
        self.folder.mkdir(parents=True, exist_ok=True)
        self.trail = trail
        self.log: list[str] = []
        self.outcome = Outcome(seed)
        self._saved: list[Path] = []
        self.samples = copy_samples(self.folder / "samples")
        self._make_files()

    # -- the record ---------------------------------------------------------------------------
    def note(self, text: str) -> None:
        line = f"{len(self.log)}: {text}"
        self.log.append(line)
        if self.trail is not None:
            self.trail.write(line + "\n")
            self.trail.flush()

    def recent(self, n: int = 25) -> str:
        return "\n".join(self.log[-n:])

    def _fault_hook(self, kind: str) -> Callable[..., None]:
        def hook(*args: Any) -> None:
            if kind == "excepthook":
                etype, value, tb = args
                text = "".join(traceback.format_exception(etype, value, tb))
            else:  # unraisablehook
                u = args[0]
                text = f"{u.err_msg or 'unraisable'}: {u.object!r}\n" + "".join(
                    traceback.format_exception(u.exc_type, u.exc_value, u.exc_traceback)
                )
            self.outcome.faults.append(
                f"seed {self.seed}, fault after action {len(self.log) - 1}:\n{text}"
                f"actions before it:\n{self.recent()}"
            )
            if self.trail is not None:
                self.trail.write("FAULT " + text.replace("\n", "\n      ") + "\n")
                self.trail.flush()

        return hook

    def _qt_message(self, mode: Any, context: Any, text: str) -> None:
        """Qt's own warnings: a misuse Qt noticed (an editor released under its delegate,
        a painter on a dead device...) is a fault; harmless platform notes are dropped."""
        if any(text.startswith(b) for b in BENIGN_QT):
            return
        self.outcome.qt_warnings[text] = self.outcome.qt_warnings.get(text, 0) + 1
        if self.trail is not None:
            self.trail.write(f"QT {text}\n")
            self.trail.flush()
        if any(f in text for f in FAULTY_QT):
            self.outcome.faults.append(
                f"seed {self.seed}, Qt warned after action {len(self.log) - 1}: {text}\n"
                f"actions before it:\n{self.recent()}"
            )

    # -- files for the file dialogs ---------------------------------------------------------
    def _make_files(self) -> None:
        f = self.folder
        (f / "broken.towboard").write_text('{"format": "towboard", "stages": [', encoding="utf-8")
        (f / "empty.towboard").write_bytes(b"")
        (f / "not_json.towboard").write_bytes(b"\xff\xfe\x00garbage")
        (f / "outline.csv").write_text("x,y\n0,0\n60,0\n60,18\n0,18\n", encoding="utf-8")
        (f / "bad.csv").write_text("x,y\n0,nan\n1e400,2\n", encoding="utf-8")
        (f / "drawing.dxf").write_text("0\nSECTION\n2\nENTITIES\n0\nENDSEC\n0\nEOF\n")
        try:
            from tests.dxf_drawings import box_barge

            box_barge(f / "barge.dxf")
        except Exception:  # ezdxf missing: the other files will do
            pass

    def _open_path(self, *args: Any, **kwargs: Any) -> tuple[str, str]:
        f = self.folder
        choices = [
            "",
            str(f / "missing.towboard"),
            str(f / "broken.towboard"),
            str(f / "empty.towboard"),
            str(f / "not_json.towboard"),
            str(f / "outline.csv"),
            str(f / "bad.csv"),
            str(f / "drawing.dxf"),
            str(f / "barge.dxf"),
            str(f),
            *(str(p) for p in self.samples),
            *(str(p) for p in self._saved[-3:]),
        ]
        name = self.rng.choice(choices)
        self.note(f"  file dialog (open) -> {name!r}")
        return name, ""

    def _save_path(self, *args: Any, **kwargs: Any) -> tuple[str, str]:
        f = self.folder
        stem = self.rng.choice(["plan", "plan two", "Åsgard", "x" * 200, ".hidden"])
        suffix = self.rng.choice([".towboard", "", ".pdf", ".png", ".svg", ".csv", ".txt"])
        name = self.rng.choice(
            [
                "",
                str(f / f"{stem}{suffix}"),
                str(f / "no such folder" / f"{stem}{suffix}"),
                str(f),
                str(f / f"{stem}{suffix}"),
            ]
        )
        if name.endswith(".towboard"):
            self._saved.append(Path(name))
        self.note(f"  file dialog (save) -> {name!r}")
        return name, ""

    def _folder(self, *args: Any, **kwargs: Any) -> str:
        name = self.rng.choice(["", str(self.folder), str(self.folder / "missing")])
        self.note(f"  folder dialog -> {name!r}")
        return name

    # -- dialogs answered at random -----------------------------------------------------------
    def text(self) -> str:
        r = self.rng.random()
        if r < 0.45:
            return self.rng.choice(HOSTILE_TEXT)
        if r < 0.8:
            return f"{self.rng.uniform(-50, 400):.{self.rng.randrange(4)}f}"
        return self.rng.choice(["Tug A", "Quay", "Stage 9", "Alpha", "1", "100", "25", "0.5"])

    def fill(self, root: QWidget) -> None:
        """Random values in ``root``'s fields, boxes and check boxes (as a user would)."""
        widgets = [
            w
            for w in root.findChildren(QWidget)
            if w.isEnabled() and not isinstance(w.parent(), QAbstractSpinBox | QComboBox)
        ]
        self.rng.shuffle(widgets)
        for w in widgets[: self.rng.randrange(1, 8) if widgets else 0]:
            self._poke(w, in_dialog=True)

    def _poke(self, w: QWidget, in_dialog: bool = False) -> None:
        """One random change to one input widget."""
        rng = self.rng
        name = f"{type(w).__name__} {w.objectName() or w.toolTip()[:30]!r}"
        if isinstance(w, QLineEdit) and not w.isReadOnly():
            t = self.text()
            self.note(f"  type {t[:40]!r} into {name}")
            w.setFocus()
            w.setText(t)
            QTest.keyClick(w, Qt.Key.Key_Return)
            if rng.random() < 0.3:
                w.clearFocus()
        elif isinstance(w, QDoubleSpinBox | QSpinBox):
            if rng.random() < 0.5:
                v = rng.uniform(w.minimum(), w.maximum()) if rng.random() < 0.7 else w.maximum()
                self.note(f"  set {name} to {v}")
                w.setValue(v)  # type: ignore[arg-type]
            else:
                t = self.text()
                self.note(f"  type {t[:40]!r} into {name}")
                w.lineEdit().setText(t)
                QTest.keyClick(w, Qt.Key.Key_Return)
        elif isinstance(w, QComboBox) and w.count():
            if w.isEditable() and rng.random() < 0.3:
                t = self.text()
                self.note(f"  type {t[:40]!r} into {name}")
                w.setEditText(t)
                QTest.keyClick(w, Qt.Key.Key_Return)
            else:
                i = rng.randrange(w.count())
                self.note(f"  choose {w.itemText(i)[:30]!r} in {name}")
                w.setCurrentIndex(i)
        elif isinstance(w, QCheckBox):
            self.note(f"  click {name} {w.text()!r}")
            w.click()
        elif isinstance(w, QPlainTextEdit | QTextEdit) and not w.isReadOnly():
            t = self.text()
            self.note(f"  write {t[:40]!r} in {name}")
            w.setFocus()
            w.setPlainText(t)
            w.clearFocus()
        elif isinstance(w, QAbstractButton) and not in_dialog and w.isVisible():
            self.note(f"  press {name} {w.text()!r}")
            w.click()

    def answer(self, dialog: QDialog) -> int:
        """Fill ``dialog`` at random, then OK (most times) or Cancel; returns its result."""
        title = dialog.windowTitle()
        cls = type(dialog).__name__
        if cls in ("QPrintPreviewDialog", "QPrintDialog", "QPageSetupDialog"):
            self.note(f"  dialog {cls} {title!r}: cancel")
            return int(QDialog.DialogCode.Rejected)
        self.note(f"  dialog {cls} {title!r}")
        for _ in range(self.rng.randrange(3)):
            self.fill(dialog)
        if self.rng.random() < 0.7:
            self.note("  dialog: OK")
            dialog.accept()
        else:
            self.note("  dialog: Cancel")
            dialog.reject()
        result = dialog.result()
        if dialog.isVisible() and result != int(QDialog.DialogCode.Accepted):
            dialog.reject()  # a refused OK, then the user gives up
        return int(dialog.result())

    def _exec(self, dialog: QDialog) -> int:
        return self.answer(dialog)

    def _box_exec(self, box: QMessageBox) -> int:
        buttons = [b for b in QMessageBox.StandardButton if b and box.standardButtons() & b]
        choice = self.rng.choice(buttons) if buttons else QMessageBox.StandardButton.Ok
        self.note(f"  message {box.windowTitle()!r}: {choice.name}")
        return int(choice.value)

    def _question(self, parent: Any, title: str, text: str, buttons: Any = None, *a: Any) -> Any:
        sb = QMessageBox.StandardButton
        if buttons is None:
            buttons = sb.Yes | sb.No
        options = [b for b in sb if b and buttons & b]
        choice = self.rng.choice(options)
        self.note(f"  question {title!r}: {choice.name}")
        return choice

    def _message(self, parent: Any, title: str, text: str, *a: Any, **k: Any) -> Any:
        self.note(f"  message {title!r}: {text[:80]!r}")
        return QMessageBox.StandardButton.Ok

    def _get_double(self, parent: Any, title: str, label: str, value: float = 0.0,
                    lo: float = -2147483647.0, hi: float = 2147483647.0, *a: Any, **k: Any
                    ) -> tuple[float, bool]:  # fmt: skip
        v = self.rng.choice([value, lo, hi, self.rng.uniform(lo, hi), self.rng.uniform(-1, 361)])
        ok = self.rng.random() < 0.8
        self.note(f"  number asked {title!r}: {v} ok={ok}")
        return v, ok

    def _get_int(self, parent: Any, title: str, label: str, value: int = 0,
                 lo: int = -2147483647, hi: int = 2147483647, *a: Any, **k: Any
                 ) -> tuple[int, bool]:  # fmt: skip
        v = self.rng.choice([value, lo, hi, self.rng.randint(lo, hi)])
        ok = self.rng.random() < 0.8
        self.note(f"  whole number asked {title!r}: {v} ok={ok}")
        return v, ok

    def _get_text(self, parent: Any, title: str, label: str, *a: Any, **k: Any) -> tuple[str, bool]:
        t = self.text()
        ok = self.rng.random() < 0.8
        self.note(f"  text asked {title!r}: {t[:40]!r} ok={ok}")
        return t, ok

    def _get_item(self, parent: Any, title: str, label: str, items: list[str], *a: Any,
                  **k: Any) -> tuple[str, bool]:  # fmt: skip
        t = self.rng.choice(list(items) or [""]) if self.rng.random() < 0.8 else self.text()
        ok = self.rng.random() < 0.8
        self.note(f"  choice asked {title!r}: {t[:40]!r} ok={ok}")
        return t, ok

    @contextmanager
    def patched(self) -> Iterator[None]:
        """Dialogs answered by the monkey, and faults recorded, while the block runs."""
        p = Patches()
        for cls in _dialog_classes():
            p.set(cls, "exec", lambda d: self._exec(d))
        p.set(QMessageBox, "exec", lambda b: self._box_exec(b))
        p.set(QMessageBox, "question", staticmethod(self._question))
        for name in ("warning", "information", "critical", "about"):
            p.set(QMessageBox, name, staticmethod(self._message))
        p.set(QInputDialog, "getDouble", staticmethod(self._get_double))
        p.set(QInputDialog, "getInt", staticmethod(self._get_int))
        p.set(QInputDialog, "getText", staticmethod(self._get_text))
        p.set(QInputDialog, "getItem", staticmethod(self._get_item))
        p.set(QFileDialog, "getOpenFileName", staticmethod(self._open_path))
        p.set(QFileDialog, "getSaveFileName", staticmethod(self._save_path))
        p.set(QFileDialog, "getExistingDirectory", staticmethod(self._folder))
        p.set(QMenu, "exec", lambda m, *a: None)
        p.set(sys, "excepthook", self._fault_hook("excepthook"))
        p.set(sys, "unraisablehook", self._fault_hook("unraisablehook"))
        previous = qInstallMessageHandler(self._qt_message)
        try:
            yield
        finally:
            qInstallMessageHandler(previous)
            p.undo()

    # -- where to act ---------------------------------------------------------------------------
    @property
    def view(self) -> Any:
        return self.w.view

    def board_point(self) -> QPoint:
        """A viewport pixel: on one of the board's items most times, else anywhere."""
        vp = self.view.viewport()
        items = self.w.board.items()
        r = self.rng.random()
        if items and r < 0.7:
            item = self.rng.choice(items)
            rect = item.sceneBoundingRect()
            if rect.isValid() and math.isfinite(rect.width()):
                x = self.rng.uniform(rect.left(), rect.right())
                y = self.rng.uniform(rect.top(), rect.bottom())
                pt = self.view.mapFromScene(QPointF(x, y))
                if vp.rect().contains(pt):
                    return pt
        return QPoint(
            self.rng.randrange(max(vp.width(), 1)), self.rng.randrange(max(vp.height(), 1))
        )

    def _send_move(self, pt: QPoint, buttons: Qt.MouseButton, mods: Qt.KeyboardModifier) -> None:
        vp = self.view.viewport()
        ev = QMouseEvent(
            QEvent.Type.MouseMove,
            QPointF(pt),
            QPointF(vp.mapToGlobal(pt)),
            Qt.MouseButton.NoButton,
            buttons,
            mods,
        )
        QApplication.sendEvent(vp, ev)

    def _mods(self) -> Qt.KeyboardModifier:
        return self.rng.choice([NONE, NONE, NONE, SHIFT, CTRL])

    # -- the actions ------------------------------------------------------------------------------
    def act_tool(self) -> None:
        from app.board.interaction import TOOLS

        tool = self.rng.choice(TOOLS)
        self.note(f"tool {tool}")
        self.w.tool_actions[tool].trigger()

    def act_click(self) -> None:
        pt, mods = self.board_point(), self._mods()
        button = self.rng.choice([Qt.MouseButton.LeftButton] * 4 + [Qt.MouseButton.MiddleButton])
        self.note(
            f"click {button.name} at {pt.x()},{pt.y()} mods={mods.value} tool={self.w.board.tool}"
        )
        QTest.mouseClick(self.view.viewport(), button, mods, pt)

    def act_double_click(self) -> None:
        pt = self.board_point()
        self.note(f"double-click at {pt.x()},{pt.y()} tool={self.w.board.tool}")
        QTest.mouseDClick(self.view.viewport(), Qt.MouseButton.LeftButton, NONE, pt)

    def act_drag(self) -> None:
        a, b, mods = self.board_point(), self.board_point(), self._mods()
        steps = self.rng.randrange(1, 12)
        button = self.rng.choice([Qt.MouseButton.LeftButton] * 5 + [Qt.MouseButton.MiddleButton])
        self.note(
            f"drag {button.name} {a.x()},{a.y()} -> {b.x()},{b.y()} in {steps} mods={mods.value} "
            f"tool={self.w.board.tool}"
        )
        vp = self.view.viewport()
        QTest.mousePress(vp, button, mods, a)
        for i in range(1, steps + 1):
            t = i / steps
            pt = QPoint(round(a.x() + (b.x() - a.x()) * t), round(a.y() + (b.y() - a.y()) * t))
            self._send_move(pt, button, mods)
            if self.rng.random() < 0.1:  # a key in the middle of a drag
                QTest.keyClick(vp, self.rng.choice([Qt.Key.Key_Escape, Qt.Key.Key_Delete]))
        if self.rng.random() < 0.05:
            self.note("  (no release: the drag is left hanging)")
            return
        QTest.mouseRelease(vp, button, mods, b)

    def act_wheel(self) -> None:
        from PySide6.QtGui import QWheelEvent

        pt = self.board_point()
        delta = self.rng.choice([120, -120, 480, -960])
        self.note(f"wheel {delta} at {pt.x()},{pt.y()}")
        vp = self.view.viewport()
        ev = QWheelEvent(
            QPointF(pt),
            QPointF(vp.mapToGlobal(pt)),
            QPoint(0, 0),
            QPoint(0, delta),
            Qt.MouseButton.NoButton,
            self._mods(),
            Qt.ScrollPhase.NoScrollPhase,
            False,
        )
        QApplication.sendEvent(vp, ev)

    def act_context_menu(self) -> None:
        pt = self.board_point()
        self.note(f"right-click at {pt.x()},{pt.y()}")
        vp = self.view.viewport()
        self.w.board.last_menu = None
        ev = QContextMenuEvent(QContextMenuEvent.Reason.Mouse, pt, vp.mapToGlobal(pt))
        QApplication.sendEvent(vp, ev)
        menu = getattr(self.w.board, "last_menu", None)
        if menu is None:
            return
        actions = list(_menu_actions(menu))
        menu.hide()
        if actions and self.rng.random() < 0.85:
            a = self.rng.choice(actions)
            self.note(f"  menu entry {a.text()!r}")
            a.trigger()

    def act_key(self) -> None:
        key, mods = self.rng.choice(BOARD_KEYS)
        target = self.view.viewport() if self.rng.random() < 0.8 else self.view
        self.note(f"key {key.name} mods={mods.value} tool={self.w.board.tool}")
        self.view.setFocus()
        QTest.keyClick(target, key, mods)

    def act_undo_redo(self) -> None:
        stack = self.w.controller.undo_stack
        if self.rng.random() < 0.6:
            self.note(f"undo ({stack.undoText()!r})")
            stack.undo()
        else:
            self.note(f"redo ({stack.redoText()!r})")
            stack.redo()

    def menu_actions(self) -> list[QAction]:
        found = []
        for top in self.w.menuBar().actions():
            if top.menu() is not None:
                found += list(_menu_actions(top.menu()))
        return [a for a in found if a is not self.w.act_quit and "quit" not in a.text().lower()]

    def act_menu(self) -> None:
        actions = [a for a in self.menu_actions() if a.isEnabled()]
        if not actions:
            return
        a = self.rng.choice(actions)
        self.note(f"menu {a.text()!r}")
        a.trigger()

    def act_table(self) -> None:
        views = [
            v
            for v in self.w.findChildren(QAbstractItemView)
            if v.isVisible() and v.model() is not None and not isinstance(v, QListWidget)
        ]
        if not views:
            return
        view = self.rng.choice(views)
        model = view.model()
        rows, cols = model.rowCount(), model.columnCount()
        if not rows or not cols:
            return
        index = model.index(self.rng.randrange(rows), self.rng.randrange(cols))
        editable = bool(model.flags(index) & Qt.ItemFlag.ItemIsEditable)
        where = f"{type(model).__name__} row {index.row()} col {index.column()}"
        if not editable:
            self.note(f"select {where}")
            view.setCurrentIndex(index)
            return
        if self.rng.random() < 0.35:
            value = self.text()
            self.note(f"setData {where} = {value[:40]!r}")
            model.setData(index, value, Qt.ItemDataRole.EditRole)
            return
        self.note(f"edit {where}")
        view.setFocus()
        view.setCurrentIndex(index)
        view.edit(index)
        editor = _cell_editor(view)
        if editor is None:
            self.note("  (no editor opened)")
            return
        editor.setFocus()
        if isinstance(editor, QComboBox) and editor.count():
            i = self.rng.randrange(editor.count())
            self.note(f"  choose {editor.itemText(i)[:30]!r}")
            editor.setCurrentIndex(i)
        elif isinstance(editor, QLineEdit):
            t = self.text()
            self.note(f"  type {t[:40]!r}")
            editor.setText(t)
        elif isinstance(editor, QAbstractSpinBox):
            t = self.text()
            self.note(f"  type {t[:40]!r}")
            editor.lineEdit().setText(t) if hasattr(editor, "lineEdit") else None
        how = self.rng.choice(["enter", "enter", "tab", "escape", "click away"])
        self.note(f"  {how}")
        if how == "enter":
            QTest.keyClick(editor, Qt.Key.Key_Return)
        elif how == "tab":
            QTest.keyClick(editor, Qt.Key.Key_Tab)
        elif how == "escape":
            QTest.keyClick(editor, Qt.Key.Key_Escape)
        else:
            self.view.setFocus()

    def act_panel(self) -> None:
        """Touch one field, box or button of a visible panel."""
        inputs = (QLineEdit, QAbstractSpinBox, QComboBox, QAbstractButton, QPlainTextEdit)
        widgets = [
            w
            for dock in self.w.panels.values()
            for w in dock.findChildren(QWidget)
            if isinstance(w, inputs) and w.isVisible() and w.isEnabled() and not _in_item_view(w)
        ]
        widgets += [w for w in (self.w.stage_box,) if w.isEnabled()]
        if not widgets:
            return
        w = self.rng.choice(widgets)
        self.note(f"panel {type(w).__name__} {w.objectName()!r}")
        self._poke(w)

    def act_tab(self) -> None:
        bars = [b for b in self.w.findChildren(QTabBar) if b.isVisible() and b.count()]
        if bars:
            bar = self.rng.choice(bars)
            i = self.rng.randrange(bar.count())
            self.note(f"tab {bar.tabText(i)!r}")
            bar.setCurrentIndex(i)

    def act_list(self) -> None:
        lists = [x for x in self.w.findChildren(QListWidget) if x.isVisible() and x.count()]
        if lists:
            lw = self.rng.choice(lists)
            row = self.rng.randrange(lw.count())
            self.note(f"list row {row} of {lw.objectName()!r}")
            lw.setCurrentRow(row)
            if self.rng.random() < 0.2:
                item = lw.item(row)
                if item.flags() & Qt.ItemFlag.ItemIsEditable:
                    self.note("  rename it")
                    lw.editItem(item)
                    editor = QApplication.focusWidget()
                    if isinstance(editor, QLineEdit):
                        t = self.text()
                        self.note(f"  type {t[:40]!r}")
                        editor.setText(t)
                        QTest.keyClick(editor, Qt.Key.Key_Return)

    def answer_open_dialogs(self) -> None:
        """Dialogs shown with ``open()`` (window-modal, not blocking) are answered now."""
        for w in QApplication.topLevelWidgets():
            if isinstance(w, QDialog) and w.isVisible():
                self.answer(w)
                if w.isVisible():
                    w.reject()

    ACTIONS: tuple[tuple[str, float], ...] = (
        ("act_tool", 6),
        ("act_click", 18),
        ("act_double_click", 4),
        ("act_drag", 16),
        ("act_wheel", 2),
        ("act_context_menu", 6),
        ("act_key", 14),
        ("act_undo_redo", 6),
        ("act_menu", 7),
        ("act_table", 10),
        ("act_panel", 9),
        ("act_tab", 2),
        ("act_list", 2),
    )

    def reweigh(self, spec: str) -> None:
        """Weights as ``name=weight,...`` (the others keep theirs)."""
        given = {k: float(v) for k, v in (part.split("=") for part in spec.split(",") if part)}
        unknown = set(given) - {n for n, _ in self.ACTIONS}
        if unknown:
            raise ValueError(f"no such action: {', '.join(sorted(unknown))}")
        self.ACTIONS = tuple((n, given.get(n, w)) for n, w in self.ACTIONS)

    def step(self) -> None:
        names = [n for n, _ in self.ACTIONS]
        weights = [w for _, w in self.ACTIONS]
        name = self.rng.choices(names, weights)[0]
        try:
            getattr(self, name)()
        except Exception:
            # an error of the monkey itself (or one raised straight through Qt into it)
            self.outcome.faults.append(
                f"seed {self.seed}, error during action {len(self.log) - 1}:\n"
                f"{traceback.format_exc()}actions before it:\n{self.recent()}"
            )
        self.answer_open_dialogs()
        QApplication.processEvents()
        self.outcome.actions += 1

    def check(self) -> None:
        self.outcome.checks += 1
        project = self.w.controller.project
        problems = check_project(project)
        kept = ""
        if problems and self.keep is not None:
            kept = f"\nthe plan: {self._keep_plan(project)}"
        for problem in problems:
            self.outcome.failed_checks.append(
                f"seed {self.seed}, check after action {len(self.log) - 1}: {problem}{kept}\n"
                f"actions before it:\n{self.recent()}"
            )

    def _keep_plan(self, project: Any) -> str:
        from core.io.projectfile import dumps

        assert self.keep is not None
        path = self.keep / f"failed_seed{self.seed}_action{len(self.log) - 1}.towboard"
        try:
            path.write_text(dumps(project), encoding="utf-8")
        except Exception as e:
            return f"(not saved: {type(e).__name__}: {e})"
        return str(path)

    def run(self, n: int, check_every: int = 50) -> Outcome:
        with self.patched():
            for i in range(n):
                self.step()
                if (i + 1) % check_every == 0:
                    self.check()
            self.check()
        return self.outcome


def _dialog_classes() -> list[type]:
    """QDialog and Qt's dialogs with an ``exec`` of their own (the print dialog...)."""
    from PySide6 import QtPrintSupport, QtWidgets

    found: list[type] = [QDialog]
    for module in (QtWidgets, QtPrintSupport):
        for name in dir(module):
            cls = getattr(module, name)
            if (
                isinstance(cls, type)
                and issubclass(cls, QDialog)
                and cls not in (QDialog, QMessageBox)
                and "exec" in vars(cls)
            ):
                found.append(cls)
    return found


def _cell_editor(view: QAbstractItemView) -> QWidget | None:
    """The cell editor open in ``view`` (a child of its viewport), or None."""
    focus = QApplication.focusWidget()
    if focus is not None and focus is not view and view.viewport().isAncestorOf(focus):
        return focus
    kinds = (QLineEdit, QComboBox, QAbstractSpinBox)
    for w in view.viewport().findChildren(QWidget):
        if isinstance(w, kinds) and w.isVisible() and w.parentWidget() is view.viewport():
            return w
    return None


def _in_item_view(w: QWidget) -> bool:
    """True for a cell editor or a spin box's or combo box's own line edit."""
    parent = w.parentWidget()
    while parent is not None:
        if isinstance(parent, QAbstractItemView | QAbstractSpinBox | QComboBox):
            return True
        parent = parent.parentWidget()
    return False


def _menu_actions(menu: QMenu) -> Iterator[QAction]:
    for a in menu.actions():
        if a.isSeparator():
            continue
        if a.menu() is not None:
            yield from _menu_actions(a.menu())
        else:
            yield a


def copy_samples(folder: Path) -> list[Path]:
    """The samples copied to ``folder`` (the monkey saves and exports beside what it opens)."""
    folder.mkdir(parents=True, exist_ok=True)
    copies = []
    for p in SAMPLES:
        copy = folder / p.name
        copy.write_bytes(p.read_bytes())
        copies.append(copy)
    return copies


def new_window(sample: Path | None) -> Any:
    """A shown main window on ``sample`` (or a new plan); open a copy, never the original."""
    from app.window.main_window import MainWindow

    w = MainWindow()
    w.resize(1400, 900)
    w.show()
    if sample is not None and not w.open_path(sample, ask=False):
        raise RuntimeError(f"the sample {sample} did not open")
    w.view.fit_to_hull()
    QApplication.processEvents()
    return w


def main(argv: list[str] | None = None) -> int:
    """One seed in this process; exit 0 clean, 1 with faults (printed as JSON on stdout)."""
    p = argparse.ArgumentParser(description="Random actions on the main window.")
    p.add_argument("--seed", type=int, default=1)
    p.add_argument("--actions", type=int, default=500)
    p.add_argument("--check-every", type=int, default=50)
    p.add_argument("--trail", type=Path, help="each action written here before it is done")
    p.add_argument("--sample", type=int, default=None, help="which sample (default: by seed)")
    p.add_argument(
        "--weights",
        default="",
        help="change how often an action comes, e.g. act_table=40,act_list=10",
    )
    args = p.parse_args(argv)
    if args.trail is not None:
        args.trail = args.trail.resolve()  # before the run moves into its own folder
    faulthandler.enable()
    import app.window.main_window

    with tempfile.TemporaryDirectory(prefix="towboard-monkey-") as tmp:
        os.environ["TOWBOARD_RECOVERY_DIR"] = str(Path(tmp) / "recovery")
        os.environ["TOWBOARD_SETTINGS_FILE"] = str(Path(tmp) / "settings.ini")
        os.chdir(tmp)  # a relative path typed in a dialog lands here, not in the repository
        app = QApplication.instance() or QApplication(sys.argv[:1])
        choice = args.sample if args.sample is not None else args.seed
        sample = copy_samples(Path(tmp) / "opened")[choice % len(SAMPLES)]
        trail = open(args.trail, "w", encoding="utf-8") if args.trail else None  # noqa: SIM115
        try:
            w = new_window(sample)
            keep = args.trail.resolve().parent if args.trail else None
            monkey = Monkey(w, args.seed, Path(tmp) / "files", trail, keep)
            if args.weights:
                monkey.reweigh(args.weights)
            outcome = monkey.run(args.actions, args.check_every)
            w.controller.undo_stack.setClean()
            w.close()
            app.processEvents()
        finally:
            if trail is not None:
                trail.close()
    print(
        json.dumps(
            {
                "seed": outcome.seed,
                "actions": outcome.actions,
                "checks": outcome.checks,
                "faults": outcome.faults,
                "failed_checks": outcome.failed_checks,
                "qt_warnings": outcome.qt_warnings,
            }
        )
    )
    return 0 if outcome.clean else 1


if __name__ == "__main__":
    sys.exit(main())
