"""The tug editor: every particular of one tug (Tugs > Edit tug…, the tugs panel's
"Edit…", or a double-click on the tug on the board).

OK records the edit as one undo step; a renamed tug keeps its placements in every stage.
Input the core refuses is named in the dialog, which stays open with everything typed.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QDialog,
    QGroupBox,
    QHBoxLayout,
    QVBoxLayout,
    QWidget,
)

from app import numbers
from app.controller import Controller
from app.edits import tugs as tug_edits
from app.guard import guarded
from app.panels.capability_editor import CapabilityEditor
from app.panels.dialog_parts import error_label, note_label, ok_cancel
from app.panels.headway_editor import HeadwayEditor
from app.panels.tug_form import TugForm
from core.errors import TowboardError
from core.model.capability import Capability

CERTIFICATE_NOTE = (
    "Certified bollard pull governs: enter the figures and date of the tug's current certificate."
)


class TugDialog(QDialog):
    """Edit tug ``name``; OK applies it through the controller."""

    def __init__(self, controller: Controller, name: str, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.tug_name = name
        self.setWindowTitle(f"Tug {name}")
        self.setObjectName("tug_dialog")
        self.form = TugForm(controller.project.units)
        self.form.load(controller.project.tug(name))
        note = note_label(CERTIFICATE_NOTE)
        #: The tug's capability: polar diagram and table (app.panels.capability_editor).
        self.capability = QGroupBox("Capability: usable share of the bollard pull by direction")
        cap = QVBoxLayout(self.capability)
        self.capability_editor = CapabilityEditor(controller.project.units)
        self.capability_editor.load(controller.project.tug(name).capability_curves)
        self.capability_editor.defaults_of = self._type_defaults
        self.form.edited.connect(self._form_edited)
        cap.addWidget(self.capability_editor)
        self.error = error_label()
        self.buttons = ok_cancel(self)
        left = QVBoxLayout()
        left.addWidget(self.form)
        left.addWidget(note)
        self.headway = HeadwayEditor(controller.project.units)
        self.headway.load(controller.project.tug(name).headway)
        left.addWidget(self.headway)
        left.addStretch(1)
        body = QHBoxLayout()
        body.addLayout(left, 1)
        body.addWidget(self.capability, 1)
        layout = QVBoxLayout(self)
        layout.addLayout(body)
        layout.addWidget(self.error)
        layout.addWidget(self.buttons)

    def _type_defaults(self) -> Capability | None:
        """The placeholder capability of the type and astern pull the form holds now."""
        try:
            return replace(self.form.tug(), capability=None).capability_curves
        except (TowboardError, ValueError):
            return None

    @guarded
    def _form_edited(self) -> None:
        self.capability_editor.follow_defaults(self._type_defaults())

    @guarded
    def accept(self) -> None:
        c = self.controller
        try:
            tug = replace(self.form.tug(), capability=self.capability_editor.capability())
            tug = self.headway.applied_to(tug)
            new = tug_edits.edited_tug(c.project, self.tug_name, tug)
        except (TowboardError, ValueError) as e:
            self.error.setText(f"Not changed: {numbers.message(e, c.project.units)}")
            self.error.setVisible(True)
            return
        c.apply(new, f"Edit {self.tug_name}")
        super().accept()


def open_tug_dialog(controller: Controller, name: str, parent: QWidget | None = None) -> TugDialog:
    """Show the tug editor (window-modal, without blocking) and return it."""
    dialog = TugDialog(controller, name, parent)
    dialog.setAttribute(Qt.WidgetAttribute.WA_DeleteOnClose)
    dialog.open()
    return dialog
