"""Every Qt override and every slot in app/ is guarded, and a guard turns an error into words.

An exception escaping a Python override of a Qt virtual, or a slot called from C++, can
end a PySide6 program; ``app.guard.guarded`` says it instead. These tests find every
override (by introspection: a method of an app class whose name a Qt base class also has)
and every callable handed to Qt (``.connect(...)``, ``addAction(text, callable)``,
``QTimer.singleShot``) by reading the source, so a new one cannot slip in unguarded.
"""

from __future__ import annotations

import ast
import importlib
import inspect
import pkgutil
import sys
from pathlib import Path

import pytest
from PySide6.QtCore import QRectF
from PySide6.QtWidgets import QWidget

import app
from app.guard import REPORTER, guarded, is_guarded, message_for
from core.errors import InputError

APP = Path(app.__file__).resolve().parent

#: Methods that share a Qt name but are only ever called from Python (never by Qt).
NOT_VIRTUAL: set[tuple[str, str]] = set()


def _app_modules() -> list[str]:
    names = ["app"]
    for info in pkgutil.walk_packages([str(APP)], prefix="app."):
        if not info.name.endswith("__main__"):  # running it would start the program
            names.append(info.name)
    return names


def _qt_overrides() -> list[tuple[str, str, object]]:
    """(class, method, function) for every method of an app class that a Qt base has too."""
    from shiboken6 import Shiboken

    found = []
    for name in _app_modules():
        module = importlib.import_module(name)
        for _, cls in inspect.getmembers(module, inspect.isclass):
            if cls.__module__ != name or not issubclass(cls, Shiboken.Object):
                continue
            qt_bases = [b for b in cls.__mro__ if b.__module__.startswith(("PySide6", "shiboken6"))]
            for attr, fn in vars(cls).items():
                if attr.startswith("__") or not callable(fn):
                    continue
                if (cls.__qualname__, attr) in NOT_VIRTUAL:
                    continue
                if any(hasattr(b, attr) for b in qt_bases):
                    found.append((f"{name}.{cls.__qualname__}", attr, fn))
    return found


def test_every_qt_override_in_app_is_guarded() -> None:
    overrides = _qt_overrides()
    # the finder finds: the board's scene overrides the mouse and the tables override data()
    names = {(c.rsplit(".", 1)[-1], m) for c, m, _ in overrides}
    assert ("BoardScene", "mousePressEvent") in names
    assert ("TugsModel", "setData") in names
    bare = [f"{c}.{m}" for c, m, fn in overrides if not is_guarded(fn)]
    assert bare == [], "Qt overrides without @guarded: " + ", ".join(bare)


# -- callables handed to Qt, read from the source ------------------------------------------


class _Defs(ast.NodeVisitor):
    """Every function defined in app/: name -> [(class or None, guarded?)]."""

    def __init__(self) -> None:
        self.by_name: dict[str, list[tuple[str | None, bool]]] = {}
        self.by_class: dict[tuple[str, str], bool] = {}
        self._cls: list[str] = []

    def visit_ClassDef(self, node: ast.ClassDef) -> None:
        self._cls.append(node.name)
        self.generic_visit(node)
        self._cls.pop()

    def visit_FunctionDef(self, node: ast.FunctionDef) -> None:
        ok = any(_is_guard_call(d) or _name_of(d) == "guarded" for d in node.decorator_list)
        cls = self._cls[-1] if self._cls else None
        self.by_name.setdefault(node.name, []).append((cls, ok))
        if cls is not None:
            self.by_class[(cls, node.name)] = ok
        saved, self._cls = self._cls, []  # a def inside a def belongs to no class
        self.generic_visit(node)
        self._cls = saved


def _name_of(node: ast.AST) -> str | None:
    if isinstance(node, ast.Name):
        return node.id
    if isinstance(node, ast.Attribute):
        return node.attr
    if isinstance(node, ast.Call):
        return _name_of(node.func)
    return None


def _is_guard_call(node: ast.AST) -> bool:
    return isinstance(node, ast.Call) and _name_of(node.func) == "guarded"


def _handed_to_qt(tree: ast.AST) -> list[tuple[ast.AST, str | None, int]]:
    """(callable expression, enclosing class, line) for each callable given to Qt."""
    out: list[tuple[ast.AST, str | None, int]] = []

    def walk(node: ast.AST, cls: str | None) -> None:
        for child in ast.iter_child_nodes(node):
            inner = child.name if isinstance(child, ast.ClassDef) else cls
            if isinstance(child, ast.Call) and isinstance(child.func, ast.Attribute):
                attr, args = child.func.attr, child.args
                if attr == "connect" and args:
                    out.append((args[0], inner, child.lineno))
                elif (attr == "addAction" and len(args) >= 2) or (
                    attr == "singleShot" and len(args) >= 2
                ):
                    out.append((args[-1], inner, child.lineno))
            walk(child, inner)

    walk(tree, None)
    return out


def _qt_builtin(expr: ast.AST) -> bool:
    """``x.emit`` (a signal relays a signal) is Qt's own."""
    return isinstance(expr, ast.Attribute) and expr.attr == "emit"


def test_every_callable_handed_to_qt_is_guarded() -> None:
    files = sorted(APP.rglob("*.py"))
    trees = {f: ast.parse(f.read_text(encoding="utf-8")) for f in files}
    defs = _Defs()
    for tree in trees.values():
        defs.visit(tree)
    bare: list[str] = []
    seen = 0
    for f, tree in trees.items():
        for expr, cls, line in _handed_to_qt(tree):
            seen += 1
            where = f"{f.relative_to(APP.parent)}:{line}"
            if f.name == "guard.py":  # the guard's own messages to the status bar
                continue
            if _is_guard_call(expr) or _qt_builtin(expr):
                continue
            if isinstance(expr, ast.Lambda | ast.Name | ast.Call):
                bare.append(f"{where} ({ast.unparse(expr)[:40]})")
                continue
            if not isinstance(expr, ast.Attribute):
                bare.append(f"{where} ({ast.unparse(expr)[:40]})")
                continue
            name = expr.attr
            own = isinstance(expr.value, ast.Name) and expr.value.id == "self"
            if own and cls is not None and (cls, name) in defs.by_class:
                if not defs.by_class[(cls, name)]:
                    bare.append(f"{where} (self.{name})")
                continue
            # another object's method: every def of that name in app/ must be guarded
            # (a name app/ never defines is Qt's own slot, such as accept or setChecked)
            if any(not ok for _, ok in defs.by_name.get(name, [])):
                bare.append(f"{where} ({ast.unparse(expr)[:40]})")
    assert seen > 100  # the reader finds the program's connections
    assert bare == [], "callables given to Qt without a guard:\n" + "\n".join(bare)


# -- what a guard does --------------------------------------------------------------------


class _Broken(QWidget):
    @guarded(default=QRectF)
    def rect_of(self) -> QRectF:
        raise ZeroDivisionError("float division by zero")

    @guarded(default=False)
    def refuse(self) -> bool:
        raise InputError("bollard pull", -5.0, "must be positive")


def test_a_fault_is_said_in_words_sent_to_the_hook_and_returns_the_default(
    qtbot, monkeypatch
) -> None:
    hooked: list[BaseException] = []
    monkeypatch.setattr(sys, "excepthook", lambda t, e, tb: hooked.append(e))
    said: list[str] = []
    REPORTER.said.connect(said.append)
    try:
        w = _Broken()
        qtbot.addWidget(w)
        assert w.rect_of() == QRectF()
        assert w.refuse() is False
    finally:
        REPORTER.said.disconnect(said.append)
    # the fault reaches the hook (a test or the terminal sees it); the refusal does not
    assert [type(e) for e in hooked] == [ZeroDivisionError]
    assert said[0].startswith("Something went wrong (rect of (broken)): ZeroDivisionError")
    assert "plan is unchanged" in said[0]
    assert said[1].startswith("Not done: ") and "bollard pull" in said[1]


def test_on_error_drops_the_work_under_way(monkeypatch) -> None:
    monkeypatch.setattr(sys, "excepthook", lambda *a: None)
    dropped: list[int] = []

    @guarded(on_error=lambda n: dropped.append(n), default=-1)
    def step(n: int) -> int:
        raise RuntimeError("boom")

    assert step(7) == -1
    assert dropped == [7]


def test_message_for_a_fault_names_what_was_being_done() -> None:
    text = message_for("changing a cell of the tugs model", KeyError("Alpha"))
    assert "changing a cell of the tugs model" in text and "KeyError" in text


@pytest.mark.parametrize("slot_args", [(), (True,)])
def test_a_guarded_slot_takes_the_arguments_it_names(qtbot, slot_args) -> None:
    """PySide6 reads the wrapped signature: a no-argument slot on clicked(bool) still works."""
    from PySide6.QtWidgets import QPushButton

    calls: list[tuple[object, ...]] = []

    class Button(QPushButton):
        @guarded
        def none(self) -> None:
            calls.append(())

        @guarded
        def one(self, checked: bool) -> None:
            calls.append((checked,))

    b = Button()
    qtbot.addWidget(b)
    b.setCheckable(True)
    b.clicked.connect(b.one if slot_args else b.none)
    b.click()
    assert calls == ([(True,)] if slot_args else [()])
