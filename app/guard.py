"""One guard for every Qt override and every slot: an error becomes a message, never a crash.

With PySide6 an exception that escapes a Python override of a Qt virtual (``paint``,
``mousePressEvent``, ``data``, ``setData``...) or a slot called from C++ has nowhere to
go: Qt carries on with a default-constructed return value at best, and may end the
program at worst. Every such method in ``app/`` is therefore wrapped by :func:`guarded`
(``tests/app/test_guards.py`` finds the ones that are not):

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF: ...

    button.clicked.connect(guarded(lambda: self.step(+1), what="step the setting"))

What happens to an error:

- a :class:`core.errors.TowboardError` (input refused by the core) is said as it is,
  ``"Not done: <the reason>"``;
- anything else is a fault of the program: its traceback goes to ``sys.excepthook`` (the
  terminal, or the test that is running) and the user reads what was being done and what
  went wrong, and that the plan is unchanged.

Edits are whole project values handed to the controller in one step, so a method that
fails part-way has not changed the plan; ``on_error`` lets a method drop what it had
under way (a drag's preview) before the message is given.

The words go to :data:`REPORTER` (``said``, queued, so a message is never shown from
inside a paint or an event filter); the main window puts them in its status bar.
"""

from __future__ import annotations

import contextlib
import functools
import inspect
import re
import sys
from collections.abc import Callable
from typing import Any, TypeVar

from PySide6.QtCore import QObject, Qt, Signal

from core.errors import TowboardError

F = TypeVar("F", bound=Callable[..., Any])

#: The attribute a guarded function carries (read by the test that finds unguarded ones).
MARK = "__towboard_guarded__"

#: What a Qt method name is about, in words, for the message.
_DOING = {
    "paint": "drawing",
    "paintEvent": "drawing",
    "drawBackground": "drawing the board's background",
    "drawForeground": "drawing over the board",
    "boundingRect": "measuring",
    "shape": "measuring",
    "sizeHint": "sizing",
    "mousePressEvent": "a mouse press on",
    "mouseMoveEvent": "a mouse move on",
    "mouseReleaseEvent": "a mouse release on",
    "mouseDoubleClickEvent": "a double-click on",
    "wheelEvent": "the mouse wheel on",
    "keyPressEvent": "a key on",
    "contextMenuEvent": "the menu of",
    "focusOutEvent": "leaving",
    "data": "showing a cell of",
    "headerData": "showing a heading of",
    "flags": "reading a cell of",
    "setData": "changing a cell of",
    "rowCount": "counting the rows of",
    "columnCount": "counting the columns of",
    "createEditor": "opening a cell editor in",
    "setEditorData": "filling a cell editor in",
    "setModelData": "taking a cell editor's value in",
    "accept": "taking the values of",
    "redo": "redoing",
    "undo": "undoing",
}


class Reporter(QObject):
    """Where guarded errors are said: ``said(text)`` reaches its receivers queued."""

    said = Signal(str)

    def connect_to(self, receiver: Callable[[str], object]) -> None:
        """Deliver each message to ``receiver`` from the event loop (never re-entrantly)."""
        self.said.connect(receiver, Qt.ConnectionType.QueuedConnection)


REPORTER = Reporter()


def _words(name: str) -> str:
    """``TugsPanel`` -> ``tugs panel``; ``add_tug`` -> ``add tug``."""
    spaced = re.sub(r"(?<=[a-z0-9])(?=[A-Z])", " ", name.strip("_")).replace("_", " ")
    return spaced.lower().strip() or name


def describe(fn: Callable[..., Any]) -> str:
    """What calling ``fn`` is doing, in words (from its name and its class's)."""
    parts = getattr(fn, "__qualname__", getattr(fn, "__name__", "")).split(".")
    parts = [p for p in parts if p != "<locals>"]
    method = parts[-1] if parts else ""
    owner = _words(parts[-2]) if len(parts) > 1 else ""
    if method == "<lambda>":
        return f"an action in the {owner}" if owner else "an action"
    if method in _DOING:
        return f"{_DOING[method]} the {owner}".strip() if owner else _DOING[method]
    return f"{_words(method)} ({owner})" if owner else _words(method)


def message_for(what: str, error: BaseException) -> str:
    """The status bar's words for ``error`` raised while ``what``."""
    if isinstance(error, TowboardError):
        return f"Not done: {error}"
    text = str(error) or "no details"
    return (
        f"Something went wrong ({what}): {type(error).__name__}: {text}. "
        "The plan is unchanged; please report this."
    )


def report(what: str, error: BaseException) -> None:
    """Say ``error`` (raised while ``what``); a program fault goes to ``sys.excepthook`` too."""
    if not isinstance(error, TowboardError):
        with contextlib.suppress(Exception):  # a broken hook must not make the guard crash
            sys.excepthook(type(error), error, error.__traceback__)
    with contextlib.suppress(Exception):
        REPORTER.said.emit(message_for(what, error))


def _make_default(default: object) -> object:
    return default() if isinstance(default, type) else default


def guarded(
    fn: F | None = None,
    *,
    default: object = None,
    what: str | None = None,
    on_error: Callable[..., object] | None = None,
) -> Any:
    """Wrap ``fn`` so that no exception leaves it: it is said and ``default`` is returned.

    Parameters
    ----------
    fn
        The method, slot or lambda (``@guarded`` or ``guarded(fn)``).
    default
        What to return after an error: a value, or a class to call for a fresh one
        (``QRectF``, ``QPainterPath``, ``QSize``).
    what
        What the call does, in words, for the message (default: from the names).
    on_error
        Called with the same arguments after an error, to drop work under way (its own
        errors are ignored).
    """

    def wrap(f: F) -> F:
        if inspect.isbuiltin(f) or inspect.ismethoddescriptor(f):
            return f  # Qt's own C++ slot: no Python error can come out of it
        if getattr(f, MARK, False) and default is None and on_error is None and what is None:
            return f
        doing = what or describe(f)

        def fail(args: tuple[Any, ...], kwargs: dict[str, Any], e: Exception) -> object:
            if on_error is not None:
                with contextlib.suppress(Exception):
                    on_error(*args, **kwargs)
            report(doing, e)
            return _make_default(default)

        guard = _same_signature(f, fail)
        functools.update_wrapper(guard, f)
        setattr(guard, MARK, True)
        return guard  # type: ignore[return-value]

    if fn is not None:
        return wrap(fn)
    return wrap


def _same_signature(
    f: Callable[..., Any], fail: Callable[[tuple[Any, ...], dict[str, Any], Exception], object]
) -> Callable[..., Any]:
    """A function with ``f``'s very parameters that calls ``f`` and hands an error to ``fail``.

    PySide6 passes a slot as many of a signal's arguments as the slot's code names (none
    to a ``*args`` function), so the guard must name the same parameters as ``f``.
    """
    try:
        params = list(inspect.signature(f).parameters.values())
    except (TypeError, ValueError):  # a builtin without a signature: take what comes
        params = [
            inspect.Parameter("args", inspect.Parameter.VAR_POSITIONAL),
            inspect.Parameter("kwargs", inspect.Parameter.VAR_KEYWORD),
        ]
    env: dict[str, Any] = {"_guarded_fn_": f, "_guarded_fail_": fail}
    head: list[str] = []
    pos: list[str] = []
    kw: list[str] = []
    star, starstar = "", ""
    slash_done = True
    for i, p in enumerate(params):
        text = p.name
        if p.default is not inspect.Parameter.empty:
            env[f"_guarded_d{i}_"] = p.default
            text += f"=_guarded_d{i}_"
        if p.kind is p.POSITIONAL_ONLY:
            head.append(text)
            pos.append(p.name)
            slash_done = False
            continue
        if not slash_done:
            head.append("/")
            slash_done = True
        if p.kind is p.POSITIONAL_OR_KEYWORD:
            head.append(text)
            pos.append(p.name)
        elif p.kind is p.VAR_POSITIONAL:
            head.append(f"*{p.name}")
            star = p.name
        elif p.kind is p.KEYWORD_ONLY:
            if not star:
                head.append("*")
                star = "-"
            head.append(text)
            kw.append(p.name)
        else:
            head.append(f"**{p.name}")
            starstar = p.name
    if not slash_done:
        head.append("/")
    spread = [*pos, f"*{star}"] if star not in ("", "-") else pos
    args = "(" + "".join(f"{n}, " for n in spread) + ")"
    kwargs = "{" + ", ".join(f"{n!r}: {n}" for n in kw) + "}"
    if starstar:
        kwargs = f"{{**{kwargs}, **{starstar}}}"
    call = ", ".join([*spread, *(f"{n}={n}" for n in kw), *([f"**{starstar}"] if starstar else [])])
    # the call is written out (no tuple or dict made on the way in: paint() is hot)
    source = (
        f"def guard({', '.join(head)}):\n"
        "    try:\n"
        f"        return _guarded_fn_({call})\n"
        "    except Exception as _guarded_e_:\n"
        f"        return _guarded_fail_({args}, {kwargs}, _guarded_e_)\n"
    )
    exec(source, env)
    return env["guard"]  # type: ignore[no-any-return]


def is_guarded(fn: object) -> bool:
    """True when ``fn`` (a function or bound method) was wrapped by :func:`guarded`."""
    target = getattr(fn, "__func__", fn)
    return bool(getattr(target, MARK, False))
