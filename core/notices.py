"""Warnings as data: what the board shows beside a number and the briefing prints."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

Level = Literal["warning", "caution"]


@dataclass(frozen=True, slots=True)
class Notice:
    """One warning about a result.

    ``code`` is stable for programs (``"setting_over"``, ``"over_swl"``, ...);
    ``subject`` names what it is about (a tug, a fitting, a stage); ``message`` is the
    sentence shown to people, with values in the display units.
    """

    code: str
    subject: str
    message: str
    level: Level = "warning"

    def __str__(self) -> str:
        return self.message
