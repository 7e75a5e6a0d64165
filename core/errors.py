"""Errors raised by the core.

Every error derives from :class:`TowboardError` and also from ``ValueError`` (or
``TypeError``), and keeps the fields that say exactly what is wrong, so the window
and the command line can show it without a traceback.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass


class TowboardError(Exception):
    """Base of every error the core raises on purpose."""


class InputError(TowboardError, ValueError):
    """A value the user gave is impossible (negative speed, NaN, unknown name...).

    Parameters
    ----------
    field:
        Which input is wrong, as the user would name it (``"wind speed"``,
        ``"tugs[2].bollard_pull"``).
    value:
        The offending value.
    reason:
        Why it is wrong, in words.
    shown:
        The value as people read it, in their display unit (``"-5.0 kN"``); by default
        the value's ``repr``.
    """

    def __init__(self, field: str, value: object, reason: str, *, shown: str | None = None) -> None:
        self.field = field
        self.value = value
        self.reason = reason
        self.shown = repr(value) if shown is None else shown
        super().__init__(f"{field}: {self.shown} {reason}")


class OutlineError(TowboardError, ValueError):
    """A hull or site outline that cannot be a body's plan view.

    ``vertex`` is the 0-based index of the first offending vertex where one is to
    blame; ``segments`` names the pair of crossing edges (each edge ``i`` runs from
    vertex ``i`` to vertex ``i + 1``).
    """

    def __init__(
        self,
        message: str,
        *,
        outline: str = "outline",
        vertex: int | None = None,
        segments: tuple[int, int] | None = None,
    ) -> None:
        self.outline = outline
        self.vertex = vertex
        self.segments = segments
        super().__init__(f"{outline}: {message}")


@dataclass(frozen=True, slots=True)
class Problem:
    """One thing wrong in a project file: where (a field path) and why."""

    path: str
    reason: str

    def __str__(self) -> str:
        return f"{self.path}: {self.reason}" if self.path else self.reason


class ProjectFileError(TowboardError, ValueError):
    """A ``.towboard`` file that cannot be loaded; lists every problem found."""

    def __init__(self, source: str, problems: Sequence[Problem]) -> None:
        self.source = source
        self.problems = tuple(problems)
        first = str(self.problems[0]) if self.problems else "unreadable"
        more = len(self.problems) - 1
        tail = f" (and {more} more problem{'s' if more > 1 else ''})" if more > 0 else ""
        super().__init__(f"{source}: {first}{tail}")

    def details(self) -> str:
        """Every problem, one a line."""
        return "\n".join(str(p) for p in self.problems)


class FormatVersionError(ProjectFileError):
    """The file was written by a newer Towboard than this one."""


class DrawingError(TowboardError, ValueError):
    """A drawing (DXF) or a table of offsets or points that cannot give what was asked.

    ``source`` is the file; ``layer`` the drawing layer concerned (None for the whole
    file or for a table); ``line`` the 1-based line of a table, where one is to blame.
    """

    def __init__(
        self,
        source: str,
        message: str,
        *,
        layer: str | None = None,
        line: int | None = None,
    ) -> None:
        self.source = source
        self.layer = layer
        self.line = line
        self.reason = message
        where = f"layer {layer}: " if layer is not None else f"line {line}: " if line else ""
        super().__init__(f"{source}: {where}{message}")
