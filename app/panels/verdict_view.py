"""The stage's verdict on screen: GO, CAUTION or NO-GO in its colour, with every reason.

:class:`VerdictView` reads the verdict of the stage shown from the one stage result
(``controller.stage_result()``) shortly after each change, never during a drag's mouse
moves, and never works anything out itself. Until it has read it, it says so: "updating"
after the verdict of the stage shown, or "working out" when another stage or plan is
shown (a verdict of the plan as it was is never shown as the plan's).

"Updating" is drawn over the verdict, faded, and is not part of the label's text: a
change of text lays out the panel again (the label asks for another height), and on the
first move of every drag that cost the window about 5 ms, a third of the move.
"""

from __future__ import annotations

from html import escape

from PySide6.QtCore import QRectF, Qt, QTimer
from PySide6.QtGui import QColor, QFont, QPainter
from PySide6.QtWidgets import QLabel, QWidget

from app.controller import Controller
from app.guard import guarded
from core.analysis.verdict import Verdict

#: Colours of the verdicts (chosen for contrast on white, in print and on screen).
COLOURS = {"go": QColor("#1e6b35"), "caution": QColor("#8a5a00"), "no-go": QColor("#b3261e")}
#: Delay after the last change before the verdict is read again, ms.
DELAY_MS = 120
#: What is drawn over a verdict that is no longer the plan's until it is read again.
UPDATING = "updating…"
_FADE = QColor(255, 255, 255, 150)
_MARK_BG = QColor("#eef2f5")
_MARK_TEXT = QColor("#455a64")


def verdict_html(verdict: Verdict, reasons: bool = True, limit: int = 8) -> str:
    """The verdict as rich text: the status in its colour, then each reason."""
    colour = COLOURS[verdict.status].name()
    head = f"<b style='color:{colour}'>{verdict.label}</b>"
    if not verdict.reasons:
        return head + " — within every limit checked"
    if not reasons:
        first = escape(verdict.reasons[0].text)
        more = len(verdict.reasons) - 1
        return head + f" — {first}" + (f" (and {more} more)" if more else "")
    items = []
    for r in verdict.reasons[:limit]:
        c = COLOURS[r.status].name()
        items.append(f"<li><span style='color:{c}'>{r.status.upper()}</span> {escape(r.text)}</li>")
    more = len(verdict.reasons) - limit
    if more > 0:
        items.append(f"<li>… and {more} more (see the stage list)</li>")
    return head + "<ul style='margin-left:-24px'>" + "".join(items) + "</ul>"


class VerdictView(QLabel):
    """A label showing the verdict of the stage (``brief``: the headline above the board,
    without the list of reasons). Both wrap, so a long reason never widens the window."""

    def __init__(
        self, controller: Controller, brief: bool = False, parent: QWidget | None = None
    ) -> None:
        super().__init__(parent)
        self.controller = controller
        self.brief = brief
        self.verdict: Verdict | None = None
        #: The plan (its number among those opened) and stage the verdict shown is of.
        self._of: tuple[int, int] | None = None
        #: The verdict shown is not the plan's (since a change); for which plan and stage
        #: it says so.
        self._stale = False
        self._stale_for: tuple[int, int] | None = None
        #: "Updating" is drawn over the verdict shown (see the module's words).
        self.updating = False
        self.setObjectName("verdict_brief" if brief else "verdict")
        self.setTextFormat(Qt.TextFormat.RichText)
        self.setWordWrap(True)
        if brief:  # two lines at most, so the board below keeps its size as stages change
            lines = 2 * self.fontMetrics().lineSpacing()
            self.setFixedHeight(lines + 8)  # the 3 px padding above and below, and the rule
            self.setAlignment(Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop)
        self.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(DELAY_MS)
        self._timer.timeout.connect(self.refresh)
        controller.changed.connect(self._changed)
        self.refresh()

    @guarded
    def _changed(self) -> None:
        self._mark_stale()
        if self.controller.previewing:
            # a refresh due from before the drag would work out the stage result of a
            # plan the mouse is still moving: the drag's end brings it up to date
            self._timer.stop()
            return
        self._timer.start()

    def _mark_stale(self) -> None:
        """Say the verdict shown is no longer the plan's, until it is read again."""
        c = self.controller
        now = (c.plans_opened, c.stage_index)
        if self.verdict is None or (self._stale and self._stale_for == now):
            return
        if not self._stale and self._of == now:
            self.updating = True
            self.update()
        else:  # another stage or plan is shown: nothing of the verdict shown holds
            self.updating = False
            prefix = f"Stage {c.stage_index + 1}: " if self.brief else ""
            self.setText(prefix + "<i style='color:#607d8b'>working the verdict out…</i>")
            self.setToolTip("")
        self._stale, self._stale_for = True, now

    @guarded
    def refresh(self) -> None:
        self._timer.stop()
        self._stale = False
        if self.updating:
            self.updating = False
            self.update()
        r = self.controller.stage_result()
        self.verdict = None if r is None else r.verdict
        if r is None:
            self.setText("No stage.")
            self.setToolTip("")
            return
        self._of = (self.controller.plans_opened, r.index)
        prefix = f"Stage {r.index + 1}: " if self.brief else ""
        self.setText(prefix + verdict_html(r.verdict, reasons=not self.brief))
        self.setToolTip("\n".join(f"{x.status.upper()}: {x.text}" for x in r.verdict.reasons))

    def says(self) -> str:
        """The words shown, "updating" included (rich text)."""
        return self.text() + (f" <i>({UPDATING})</i>" if self.updating else "")

    @guarded
    def paintEvent(self, event) -> None:  # type: ignore[no-untyped-def]
        super().paintEvent(event)
        if not self.updating:
            return
        p = QPainter(self)
        p.setRenderHint(QPainter.RenderHint.Antialiasing)
        p.fillRect(self.rect(), _FADE)  # the verdict faded: not the plan's now
        font = QFont(self.font())
        font.setItalic(True)
        p.setFont(font)
        fm = p.fontMetrics()
        inner = self.contentsRect()
        w, h = fm.horizontalAdvance(UPDATING) + 12, fm.height() + 4
        box = QRectF(inner.right() - w - 2, inner.top() + 2, w, h)
        p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(_MARK_BG)
        p.drawRoundedRect(box, 3, 3)
        p.setPen(_MARK_TEXT)
        p.drawText(box, Qt.AlignmentFlag.AlignCenter, UPDATING)
        p.end()
