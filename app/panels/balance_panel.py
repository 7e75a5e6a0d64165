"""The balance panel: the stage's verdict and the core's numbers for the body shown.

Every figure comes from the stage result (its :class:`core.mechanics.balance.Balance`, and
the verdict with its reasons); the panel only formats it. The frame and the sign
convention are stated on the panel.
"""

from __future__ import annotations

from PySide6.QtCore import QSize, Qt
from PySide6.QtWidgets import QFormLayout, QFrame, QLabel, QScrollArea, QVBoxLayout, QWidget

from app import formatting as fmt
from app.controller import Controller
from app.guard import guarded
from app.panels.dialog_parts import NOTE_COLOUR
from app.panels.verdict_view import VerdictView
from core.mechanics.balance import Balance

FRAME_TEXT = (
    "Hull frame: x forward (ahead), y to port, origin at {origin}. "
    "Yaw moment positive counter-clockwise seen from above (bow to port). "
    "Bearings are relative, degrees clockwise from ahead (090 = starboard beam)."
)

#: Qt's largest widget size (QWIDGETSIZE_MAX): a label's size no longer held.
FREE = QSize(16_777_215, 16_777_215)

FIELDS = (
    ("body", "Body and stage"),
    ("net", "Net force"),
    ("net_bearing", "Net force towards (relative bearing)"),
    ("net_ahead", "Net force ahead (+) / astern (−)"),
    ("net_abeam", "Net force to port (+) / starboard (−)"),
    ("net_words", "So the body"),
    ("moment_centroid", "Yaw moment about the centroid"),
    ("moment_cog", "Yaw moment about the centre of gravity"),
    ("equivalent", "Equivalent force"),
    ("offset", "Its line of action from the centroid"),
    ("crossing", "Where its line of action lies"),
)


class BalancePanel(QWidget):
    """Net force, yaw moments, the equivalent force and the warnings, for one body."""

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        outer = QVBoxLayout(self)
        outer.setContentsMargins(0, 0, 0, 0)
        scroll = QScrollArea()  # a short panel scrolls; it never squeezes a line
        scroll.setWidgetResizable(True)
        scroll.setFrameShape(QFrame.Shape.NoFrame)
        outer.addWidget(scroll)
        inner = QWidget()
        scroll.setWidget(inner)
        layout = QVBoxLayout(inner)
        self.verdict = VerdictView(controller)
        layout.addWidget(self.verdict)
        form = QFormLayout()
        form.setLabelAlignment(Qt.AlignmentFlag.AlignLeft)
        # each value under its label: a narrow panel never cuts a number off
        form.setRowWrapPolicy(QFormLayout.RowWrapPolicy.WrapAllRows)
        form.setVerticalSpacing(2)
        self.fields: dict[str, QLabel] = {}
        for key, text in FIELDS:
            lab = QLabel("—")
            lab.setWordWrap(True)
            lab.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
            lab.setObjectName(f"balance_{key}")
            lab.setStyleSheet("font-weight: bold; padding-left: 10px; padding-bottom: 3px;")
            self.fields[key] = lab
            form.addRow(text, lab)
        layout.addLayout(form)
        self.stale = QLabel("")
        self.stale.setStyleSheet("color: #b71c1c; font-weight: bold;")
        self.stale.setWordWrap(True)
        self.stale.setVisible(False)
        layout.addWidget(self.stale)
        self.warnings = QLabel("")
        self.warnings.setWordWrap(True)
        self.warnings.setStyleSheet("color: #b71c1c;")
        self.warnings.setObjectName("balance_warnings")
        layout.addWidget(self.warnings)
        self.note = note = QLabel(FRAME_TEXT.format(origin="the hull's reference point"))
        note.setWordWrap(True)
        note.setStyleSheet(f"color: {NOTE_COLOUR}; font-size: 9pt;")
        layout.addWidget(note)
        layout.addStretch(1)
        self.balance: Balance | None = None
        self._selectable = True
        self._held = False  # the figures keep their sizes (see _hold_sizes)
        controller.follow(self.refresh, self)
        self.refresh()

    def set_stale(self, why: str | None) -> None:
        self.stale.setText(f"Stale: {why}" if why else "")
        self.stale.setVisible(bool(why))

    def _set_selectable(self, on: bool) -> None:
        """Let the figures be selected with the mouse (for copying), or not.

        A selectable label keeps a text document that is laid out again on every change
        of its text: during a drag, when the figures change on every mouse move and
        nobody selects them, that was most of what the panel cost (3 ms a move with 24
        tugs). The drag's end, a change like any other, makes them selectable again.
        """
        if on == self._selectable:
            return
        self._selectable = on
        flags = (
            Qt.TextInteractionFlag.TextSelectableByMouse
            if on
            else Qt.TextInteractionFlag.NoTextInteraction
        )
        for lab in self.fields.values():
            lab.setTextInteractionFlags(flags)

    def _hold_sizes(self, on: bool) -> None:
        """Keep every figure at the size it has (``on``), or let the layout size it again.

        A label whose text changes asks its layout to work out the whole panel again (its
        word-wrapped lines may have changed): during a drag, when the figures change on
        every mouse move, that was a layout pass on every move. Held at their sizes they
        only repaint; a figure that needs more lines than it has is let go (see
        :meth:`_set`), and the drag's end lets them all go.
        """
        if on == self._held:
            return
        self._held = on
        for lab in self.fields.values():
            if on:
                lab.setFixedSize(lab.size())
            else:
                lab.setMinimumSize(0, 0)
                lab.setMaximumSize(FREE)

    def _set(self, key: str, text: str) -> None:
        """Show ``text`` in figure ``key`` (a held figure that needs more room is let go)."""
        lab = self.fields[key]
        if lab.text() == text:
            return
        lab.setText(text)
        held = self._held and lab.maximumHeight() == lab.minimumHeight()
        if held and lab.heightForWidth(lab.width()) > lab.height():
            lab.setMinimumSize(0, 0)
            lab.setMaximumSize(FREE)

    @guarded
    def refresh(self) -> None:
        previewing = self.controller.previewing
        self._set_selectable(not previewing)
        self._hold_sizes(previewing and self.isVisible())
        b = self.controller.balance()
        self.balance = b
        u = self.controller.project.units
        # a lashed group's frame is one member's: the core names it (Balance.reference_point)
        note = FRAME_TEXT.format(
            origin="the hull's reference point" if b is None else b.reference_point
        )
        if note != self.note.text():
            self.note.setText(note)
        if b is None:
            for key in self.fields:
                self._set(key, "—")
            self.warnings.setText("")
            return
        eq = b.equivalent
        self._set("body", f"{b.body}, stage “{b.stage}”")
        self._set("net", fmt.value(u, eq.magnitude, "force"))
        self._set("net_bearing", fmt.bearing(b.net_bearing_deg))
        self._set("net_ahead", fmt.signed(u, eq.force[0], "force"))
        self._set("net_abeam", fmt.signed(u, eq.force[1], "force"))
        self._set("net_words", b.walking)
        self._set("moment_centroid", f"{fmt.signed(u, eq.moment, 'moment')}  {b.turning}")
        self._set(
            "moment_cog", f"{fmt.signed(u, b.moment_cog_nm, 'moment')}  {b.turning_about_cog}"
        )
        if eq.kind != "force":
            self._set("equivalent", b.equivalent_words(u))
            self._set("offset", "—")
            self._set("crossing", "—")
        else:
            self._set("equivalent", fmt.value(u, eq.magnitude, "force"))
            off = eq.offset_m or 0.0
            shown = fmt.value(u, abs(off), "length")
            if float(fmt.number(u, abs(off), "length")) == 0:  # no side for what reads 0.0
                where = "through the centroid"
            else:
                where = f"to the {'right' if off > 0 else 'left'} of it looking along the force"
            self._set("offset", f"{shown}, {where}")
            self._set(
                "crossing",
                b.crossing_words(u) + (f" from {b.reference_point}" if b.crossing_shown else ""),
            )
        # While a drag is in progress the verdict waits; the balance's own warnings follow it.
        notices = [n.message for n in b.notices] if self.controller.previewing else []
        self.warnings.setText("\n".join(f"⚠ {m}" for m in notices))
