"""Parts every editing dialog and panel has: the line that says what is wrong, a muted
note of what a field means, and OK / Cancel."""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtWidgets import QDialog, QDialogButtonBox, QLabel, QWidget

from app.guard import guarded

#: Colour of a refusal's words (dark red, readable on the light dialog background).
ERROR_COLOUR = "#b71c1c"
#: Colour of a note beside the fields (what they mean, what is not checked).
NOTE_COLOUR = "#455a64"


def error_label() -> QLabel:
    """A hidden, word-wrapped label for a refusal, named "error" (tests find it by name)."""
    lab = QLabel("")
    lab.setObjectName("error")
    lab.setWordWrap(True)
    lab.setStyleSheet(f"color: {ERROR_COLOUR};")
    lab.setVisible(False)
    return lab


def note_label(text: str) -> QLabel:
    """A word-wrapped note in the muted colour: what the fields beside it mean."""
    lab = QLabel(text)
    lab.setWordWrap(True)
    lab.setStyleSheet(f"color: {NOTE_COLOUR};")
    return lab


def ok_cancel(
    dialog: QDialog,
    *,
    accept: Callable[[], object] | None = None,
    ok_text: str | None = None,
    parent: QWidget | None = None,
) -> QDialogButtonBox:
    """OK and Cancel for ``dialog``: OK calls ``accept`` (default ``dialog.accept``),
    labelled ``ok_text`` when given; Cancel rejects."""
    buttons = QDialogButtonBox(
        QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel, parent
    )
    if ok_text is not None:
        buttons.button(QDialogButtonBox.StandardButton.Ok).setText(ok_text)
    buttons.accepted.connect(guarded(accept or dialog.accept))
    buttons.rejected.connect(dialog.reject)
    return buttons
