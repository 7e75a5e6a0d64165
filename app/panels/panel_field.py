"""The one kind of line a side panel edits a figure in.

A panel writes its field's text with ``setText`` (what the plan holds, formatted) and
listens to :attr:`PanelField.committed`: Enter, or leaving the field after typing,
commits what was typed, as ``editingFinished`` does; Enter on the text as shown commits
nothing. Escape puts back the text the
panel last showed (or last committed) and commits nothing, not even when the field is
left afterwards (Qt would say ``editingFinished`` again for the text put back, and a
figure written to six digits read back would be an edit of its own).
"""

from __future__ import annotations

from PySide6.QtCore import QEvent, Qt, Signal
from PySide6.QtGui import QKeyEvent
from PySide6.QtWidgets import QLineEdit, QWidget

from app.guard import guarded


class PanelField(QLineEdit):
    """A panel's field: Enter or leaving it commits; Escape drops the typing."""

    #: What was typed is to be read and applied (Enter, or the field left after typing).
    committed = Signal()

    def __init__(self, text: str = "", parent: QWidget | None = None) -> None:
        super().__init__(text, parent)
        self._shown = text
        self._dropped = False
        self.editingFinished.connect(self._finished)
        self.textEdited.connect(self._typed)

    @guarded
    def setText(self, text: str | None) -> None:
        """Show ``text`` (the panel's value): what Escape puts back."""
        super().setText(text)
        self._shown = self.text()
        self._dropped = False

    def drop_typing(self) -> bool:
        """Put back the text shown before the typing; True when there was typing."""
        if self.text() == self._shown:
            return False
        super().setText(self._shown)
        self._dropped = True
        return True

    @guarded
    def _typed(self, _text: str) -> None:
        self._dropped = False

    @guarded
    def _finished(self) -> None:
        if self._dropped:  # left (or Enter) after Escape: nothing to apply
            self._dropped = False
            return
        if self.text() == self._shown:
            # Enter on the text as shown: the value it stands for is kept exactly (a
            # 6.5 m depth shown as 21.3255 ft, read back, is 6.500002 m)
            return
        self._shown = self.text()
        self.committed.emit()

    @guarded(default=False)
    def event(self, e: QEvent) -> bool:
        # Escape may be a window shortcut (the board's "cancel"): while there is typing
        # to drop, the field takes the key first.
        if (
            e.type() == QEvent.Type.ShortcutOverride
            and isinstance(e, QKeyEvent)
            and e.key() == Qt.Key.Key_Escape
            and self.text() != self._shown
        ):
            e.accept()
            return True
        return super().event(e)

    @guarded
    def keyPressEvent(self, e: QKeyEvent) -> None:
        if e.key() == Qt.Key.Key_Escape and self.drop_typing():
            e.accept()
            return
        super().keyPressEvent(e)
