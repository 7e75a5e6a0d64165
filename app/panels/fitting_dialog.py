"""The fitting dialog: one line point or push point, every field (double-click it on the
board, or "Edit…" under the fittings table).

OK records the whole edit as one undo step through the same edit as the table
(:func:`app.edits.hulls.edited_fitting`); input the core refuses is named in the dialog,
which stays open with everything typed.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QComboBox,
    QDialog,
    QFormLayout,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QVBoxLayout,
    QWidget,
)

from app import formatting as fmt
from app import numbers
from app.controller import Controller
from app.edits import hulls as hull_edits
from app.guard import guarded
from app.panels import fitting_fields as ff
from app.panels.dialog_parts import NOTE_COLOUR, error_label, note_label, ok_cancel
from app.panels.fittings_model import say_if_snapped
from core.errors import TowboardError
from core.model import rules
from core.model.hull import FITTING_TYPES, Fitting

RATING_NOTE = (
    "TOW is the safe towing load (IMO MSC.1/Circ.1175). A towline is checked against TOW, "
    "else SWL: a fitting rated S suits tugs of bollard pull up to S. Permitted lines: the "
    "towline directions the fitting is rated for, relative bearings swept clockwise "
    "(empty: any)."
)


class FittingDialog(QDialog):
    """Edit fitting ``name`` of hull ``hull``; OK applies it through the controller."""

    def __init__(
        self, controller: Controller, hull: str, name: str, parent: QWidget | None = None
    ) -> None:
        super().__init__(parent)
        self.controller = controller
        self.hull_name = hull
        self.fitting_name = name
        self.setWindowTitle(f"Fitting {name} on {hull}")
        self.setObjectName("fitting_dialog")
        self.name = QLineEdit()
        self.kind = QComboBox()
        self.kind.addItems(list(ff.KIND_TEXT.values()))
        self.kind.currentTextChanged.connect(self._kind_changed)
        self.type = QComboBox()
        self.type.setEditable(True)
        self.type.addItems(list(FITTING_TYPES))
        self.pos_x, self.pos_y = QLineEdit(), QLineEdit()
        self.swl, self.tow = QLineEdit(), QLineEdit()
        for w in (self.swl, self.tow):
            w.setPlaceholderText("not given")
        self.lines_from, self.lines_to = QLineEdit(), QLineEdit()
        for w in (self.lines_from, self.lines_to):
            w.setPlaceholderText("any")
        self.note = note_label(RATING_NOTE)
        self.error = error_label()
        self.buttons = ok_cancel(self)
        self._lay_out()
        self.load(controller.project.hull(hull).fitting(name))
        self.resize(460, 0)

    def _lay_out(self) -> None:
        u = self.controller.project.units
        ln, fn = fmt.unit_label(u, "length"), fmt.unit_label(u, "force")
        form = QFormLayout()
        form.addRow("Name", self.name)
        form.addRow("Kind", self.kind)
        form.addRow("Type", self.type)
        pos = QHBoxLayout()
        for text, w in (("x", self.pos_x), ("y", self.pos_y)):
            pos.addWidget(QLabel(text))
            pos.addWidget(w, 1)
        form.addRow(f"Position ({ln})", pos)
        form.addRow(f"SWL ({fn})", self.swl)
        form.addRow(f"TOW ({fn})", self.tow)
        lines = QHBoxLayout()
        lines.addWidget(QLabel("from"))
        lines.addWidget(self.lines_from, 1)
        lines.addWidget(QLabel("to"))
        lines.addWidget(self.lines_to, 1)
        lines.addWidget(QLabel("° clockwise"))
        self.lines_label = QLabel("Permitted lines")
        form.addRow(self.lines_label, lines)
        frame = QLabel("Position: x forward, y to port, from the hull's reference point.")
        frame.setStyleSheet(f"color: {NOTE_COLOUR};")
        layout = QVBoxLayout(self)
        layout.addLayout(form)
        layout.addWidget(frame)
        layout.addWidget(self.note)
        layout.addWidget(self.error)
        layout.addWidget(self.buttons)

    def load(self, f: Fitting) -> None:
        """Fill every field from ``f`` in the display units."""
        u = self.controller.project.units
        self.name.setText(f.name)
        self.kind.setCurrentText(ff.KIND_TEXT[f.kind])
        self.type.setCurrentText(f.fitting_type)
        self.pos_x.setText(ff.edit_text(u, f.x, "length"))
        self.pos_y.setText(ff.edit_text(u, f.y, "length"))
        self.swl.setText(ff.edit_text(u, f.swl_n, "force"))
        self.tow.setText(ff.edit_text(u, f.tow_n, "force"))
        sector = ff.sector_bearings(f)
        self.lines_from.setText("" if sector is None else f"{sector[0]:.6g}")
        self.lines_to.setText("" if sector is None else f"{sector[1]:.6g}")
        self._loaded = {w: w.text() for w in self._numbers()}
        self._kind_changed(self.kind.currentText())

    def _numbers(self) -> tuple[QLineEdit, ...]:
        return (self.pos_x, self.pos_y, self.swl, self.tow, self.lines_from, self.lines_to)

    def _changed(self, edit: QLineEdit) -> bool:
        return edit.text() != self._loaded.get(edit)

    @guarded
    def _kind_changed(self, text: str) -> None:
        on = ff.KIND_OF_TEXT.get(text) == "line"
        for w in (self.lines_from, self.lines_to, self.lines_label):
            w.setEnabled(on)

    def fitting(self) -> Fitting:
        """The fitting as typed (raises on refused input)."""
        u = self.controller.project.units
        old = self.controller.project.hull(self.hull_name).fitting(self.fitting_name)
        kind = ff.KIND_OF_TEXT[self.kind.currentText()]
        # a field left as it was keeps its value exactly (no rounding through the text)
        sector = old.permitted_lead_rad if kind == "line" else None
        if kind == "line" and (self._changed(self.lines_from) or self._changed(self.lines_to)):
            sector = ff.sector_from_bearings(
                ff.parse_bearing(self.lines_from.text(), "permitted lines: from"),
                ff.parse_bearing(self.lines_to.text(), "permitted lines: to"),
            )
        x, y, swl, tow = old.x, old.y, old.swl_n, old.tow_n
        name = self.name.text().strip() or old.name  # a message names it as typed
        if self._changed(self.pos_x):
            x = ff.parse_length(u, self.pos_x.text(), "x", "position")
        if self._changed(self.pos_y):
            y = ff.parse_length(u, self.pos_y.text(), "y", "position")
        if self._changed(self.swl):
            swl = ff.parse_rating(u, self.swl.text(), rules.SWL, name)
        if self._changed(self.tow):
            tow = ff.parse_rating(u, self.tow.text(), rules.TOW, name)
        return replace(
            old,
            name=self.name.text().strip(),
            kind=kind,  # type: ignore[arg-type]
            fitting_type=self.type.currentText().strip(),
            x=x,
            y=y,
            swl_n=swl,
            tow_n=tow,
            permitted_lead_rad=sector,
        )

    @guarded
    def accept(self) -> None:
        c = self.controller
        try:
            new = self.fitting()
            project = hull_edits.edited_fitting(c.project, self.hull_name, self.fitting_name, new)
        except (TowboardError, ValueError) as e:
            self.error.setText(f"Not changed: {numbers.message(e, c.project.units)}")
            self.error.setVisible(True)
            return
        c.apply(project, f"Edit {self.fitting_name}")
        say_if_snapped(c, new, project.hull(self.hull_name).fitting(new.name))
        super().accept()


def open_fitting_dialog(
    controller: Controller, hull: str, name: str, parent: QWidget | None = None
) -> FittingDialog:
    """Show the fitting dialog (window-modal, without blocking) and return it."""
    dialog = FittingDialog(controller, hull, name, parent)
    dialog.setAttribute(Qt.WidgetAttribute.WA_DeleteOnClose)
    dialog.open()
    return dialog
