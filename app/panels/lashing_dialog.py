"""The lashing dialog: where each hull of a lashed group lies in the group's frame.

The group's frame is its first hull's (x forward, y to port, from that hull's reference
point), so the first hull lies at 0, 0, 0 and is not offered; each other hull has its
position x, y in the display length unit and its heading as a relative bearing (degrees
clockwise from the first hull's ahead), as the .towboard file keeps them
(``groups[].members[]``). OK records the edit as one undo step through
:func:`app.edits.bodies.relashed`; input the core refuses is named in the dialog, which
stays open with everything typed.
"""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QDialog, QGridLayout, QLabel, QLineEdit, QVBoxLayout, QWidget

from app import formatting as fmt
from app import numbers
from app.controller import Controller
from app.edits import bodies as body_edits
from app.guard import guarded
from app.panels import fitting_fields as ff
from app.panels.dialog_parts import NOTE_COLOUR, error_label, note_label, ok_cancel
from core.errors import InputError, TowboardError
from core.frames import angle_to_bearing, bearing_to_angle
from core.model import rules
from core.model.plan import LashedGroup

#: Columns of a member's row: its position across and along, and its heading.
COLUMNS = ("x", "y", "heading")


class LashingDialog(QDialog):
    """Edit the offsets of the hulls of lashed group ``group``; OK applies them."""

    def __init__(self, controller: Controller, group: str, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.group_name = group
        g = self._group()
        self.setWindowTitle(f"Lashing of {group}")
        self.setObjectName("lashing_dialog")
        #: hull -> its fields x, y, heading (every member but the first)
        self.fields: dict[str, dict[str, QLineEdit]] = {
            m.hull: {c: QLineEdit() for c in COLUMNS} for m in g.members[1:]
        }
        self.error = error_label()
        self.buttons = ok_cancel(self)
        self._lay_out(g)
        self.load()
        self._fit(480)

    def _fit(self, width: int) -> None:
        """Tall enough for every row at ``width`` (the wrapped notes ask for their height
        only for a width, which a dialog's minimum size does not follow)."""
        self.resize(width, max(self.height(), self.heightForWidth(width), self.sizeHint().height()))

    def _group(self) -> LashedGroup:
        for g in self.controller.project.groups:
            if g.name == self.group_name:
                return g
        raise InputError("lashed group", self.group_name, "does not exist")

    def _lay_out(self, g: LashedGroup) -> None:
        u = self.controller.project.units
        first = g.members[0].hull
        frame = QLabel(
            f"Each hull's place in {first}'s frame: x forward, y to port, from {first}'s "
            f"reference point; heading in degrees clockwise from {first}'s ahead."
        )
        frame.setWordWrap(True)
        frame.setStyleSheet(f"color: {NOTE_COLOUR};")
        grid = QGridLayout()
        ln = fmt.unit_label(u, "length")
        for col, text in enumerate(("Hull", f"x ({ln})", f"y ({ln})", "Heading (°)")):
            head = QLabel(f"<b>{text}</b>")
            grid.addWidget(head, 0, col)
        grid.addWidget(QLabel(first), 1, 0)
        owner = QLabel("owns the frame: lies at 0, 0, 0°")
        owner.setStyleSheet(f"color: {NOTE_COLOUR};")
        grid.addWidget(owner, 1, 1, 1, 3)
        span = rules.COORDINATE.span(u)
        for row, (hull, edits) in enumerate(self.fields.items(), start=2):
            grid.addWidget(QLabel(hull), row, 0)
            for col, key in enumerate(COLUMNS, start=1):
                edit = edits[key]
                edit.setObjectName(f"{hull}: {key}")
                edit.setAlignment(Qt.AlignmentFlag.AlignRight)
                edit.setToolTip(
                    span if key != "heading" else f"degrees clockwise from {first}'s ahead"
                )
                grid.addWidget(edit, row, col)
        for col in (1, 2, 3):
            grid.setColumnStretch(col, 1)
        note = note_label(
            "The first hull stays where it lies in every stage; a hull moves by the change of "
            "its offset. Overlapping hulls are not checked here."
        )
        layout = QVBoxLayout(self)
        layout.addWidget(frame)
        layout.addLayout(grid)
        layout.addWidget(note)
        layout.addWidget(self.error)
        layout.addWidget(self.buttons)

    def load(self) -> None:
        """Fill every field from the group in the plan, in the display units."""
        u = self.controller.project.units
        for m in self._group().members[1:]:
            edits = self.fields.get(m.hull)
            if edits is None:
                continue
            edits["x"].setText(ff.edit_text(u, m.x, "length"))
            edits["y"].setText(ff.edit_text(u, m.y, "length"))
            edits["heading"].setText(f"{angle_to_bearing(m.heading_rad):.6g}")
        self._loaded = {e: e.text() for row in self.fields.values() for e in row.values()}

    def _changed(self, edit: QLineEdit) -> bool:
        return edit.text() != self._loaded.get(edit)

    def offsets(self) -> dict[str, tuple[float, float, float]]:
        """Each member's offset as typed, (x m, y m, heading rad CCW); raises on refused
        input. A field left as it was keeps its value exactly (no rounding through text)."""
        u = self.controller.project.units
        out: dict[str, tuple[float, float, float]] = {}
        members = {m.hull: m for m in self._group().members}
        for hull, edits in self.fields.items():
            m = members.get(hull)
            if m is None:
                raise InputError(
                    f"lashed group {self.group_name}", hull, "is no longer lashed in it"
                )
            x, y, a = m.x, m.y, m.heading_rad
            if self._changed(edits["x"]):
                x = ff.parse_length(u, edits["x"].text(), "x", hull)
            if self._changed(edits["y"]):
                y = ff.parse_length(u, edits["y"].text(), "y", hull)
            if self._changed(edits["heading"]):
                text = edits["heading"].text()
                if not text.strip():
                    raise InputError(f"{hull}: heading", "", "must be given")
                a = bearing_to_angle(numbers.parse_value(text, rules.HEADING, u, hull))
            out[hull] = (x, y, a)
        return out

    @guarded
    def accept(self) -> None:
        c = self.controller
        try:
            project = body_edits.relashed(c.project, self.group_name, self.offsets())
            if project is not c.project:
                c.apply(project, f"Lashing of {self.group_name}")
        except TowboardError as e:
            self.error.setText(f"Not changed: {numbers.message(e, c.project.units)}")
            self.error.setVisible(True)
            self._fit(self.width())
            return
        super().accept()


def open_lashing_dialog(
    controller: Controller, group: str, parent: QWidget | None = None
) -> LashingDialog:
    """Show the lashing dialog of ``group`` (window-modal, without blocking) and return it."""
    dialog = LashingDialog(controller, group, parent)
    dialog.setAttribute(Qt.WidgetAttribute.WA_DeleteOnClose)
    dialog.open()
    return dialog
