"""A tug's particulars as a form: used by the tug editor and by "Try a substitute tug…".

Pulls and the towline's MBL are typed in the display force unit, heights and lengths in
the display length unit. A field left as it was loaded keeps its value exactly (no
rounding through the text); everything else goes through the core's rules for a tug.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Signal
from PySide6.QtWidgets import QComboBox, QFormLayout, QLabel, QLineEdit, QWidget

from app import formatting as fmt
from app import numbers
from app.guard import guarded
from app.panels.dialog_parts import NOTE_COLOUR
from core.errors import InputError
from core.model import rules
from core.model.tugs import TENSION_WARN_FRACTION, Tug
from core.units import DisplayUnits, Quantity

#: Offered in the type list; any other word may be typed.
TUG_TYPES = ("ASD", "tractor", "conventional single screw", "conventional twin screw")


class TugForm(QWidget):
    """Every particular of one tug; :meth:`tug` reads them back as a Tug."""

    #: Emitted when any field is edited (the substitute dialog re-checks the plan).
    edited = Signal()

    def __init__(self, units: DisplayUnits, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.units = units
        self.name = QLineEdit()
        self.type = QComboBox()
        self.type.setEditable(True)
        self.type.addItems(list(TUG_TYPES))
        self.role = QLineEdit()
        self.role.setPlaceholderText("e.g. centre lead forward; pushing starboard quarter")
        self.bollard_pull, self.astern_pull = QLineEdit(), QLineEdit()
        self.certificate = QLineEdit()
        self.certificate.setPlaceholderText("date of the bollard pull certificate")
        self.towing_point_height = QLineEdit()
        self.towline_length, self.towline_mbl = QLineEdit(), QLineEdit()
        for w in (self.towing_point_height, self.towline_length, self.towline_mbl):
            w.setPlaceholderText("not given")
        self.warn_share = QLineEdit()
        self.warn_share.setToolTip(
            "The towline's tension is warned about above this share of its MBL "
            f"({rules.TOWLINE_WARN_SHARE.span()}; {TENSION_WARN_FRACTION:g} is common "
            "practice, no source)"
        )
        self.mbl_ratio = QLabel("")
        self.mbl_ratio.setStyleSheet(f"color: {NOTE_COLOUR};")
        self.call_sign, self.channel = QLineEdit(), QLineEdit()
        self.channel.setPlaceholderText("e.g. VHF 71")
        self._loaded: dict[QLineEdit, str] = {}
        self._old: Tug | None = None
        f, ln = fmt.unit_label(units, "force"), fmt.unit_label(units, "length")
        form = QFormLayout(self)
        form.setContentsMargins(0, 0, 0, 0)
        form.addRow("Name", self.name)
        form.addRow("Type", self.type)
        form.addRow("Role", self.role)
        form.addRow(f"Rated bollard pull ({f})", self.bollard_pull)
        form.addRow(f"Astern pull ({f})", self.astern_pull)
        form.addRow("Certificate date", self.certificate)
        form.addRow(f"Towing point height ({ln})", self.towing_point_height)
        form.addRow(f"Towline length ({ln})", self.towline_length)
        form.addRow(f"Towline MBL ({f})", self.towline_mbl)
        form.addRow("", self.mbl_ratio)
        form.addRow("Towline warning (share of MBL)", self.warn_share)
        form.addRow("Call sign", self.call_sign)
        form.addRow("Working channel", self.channel)
        for w in self._lines():
            w.textEdited.connect(self._edited)
        self.type.currentTextChanged.connect(self._edited)

    def _lines(self) -> tuple[QLineEdit, ...]:
        return (
            self.name,
            self.role,
            self.bollard_pull,
            self.astern_pull,
            self.certificate,
            self.towing_point_height,
            self.towline_length,
            self.towline_mbl,
            self.warn_share,
            self.call_sign,
            self.channel,
        )

    @guarded
    def _edited(self, *_args: object) -> None:
        self._show_ratio()
        self.edited.emit()

    def _text(self, value_si: float | None, quantity: Quantity) -> str:
        return "" if value_si is None else f"{self.units.value(value_si, quantity):.6g}"

    def load(self, tug: Tug) -> None:
        """Fill every field from ``tug``."""
        self._old = tug
        self.name.setText(tug.name)
        self.type.setCurrentText(tug.tug_type)
        self.role.setText(tug.role)
        self.bollard_pull.setText(self._text(tug.bollard_pull_n, "force"))
        self.astern_pull.setText(self._text(tug.astern_pull_n, "force"))
        default = self.units.show(tug.with_astern_pull(None).astern_pull, "force")
        self.astern_pull.setPlaceholderText(f"not given: {default} for its type")
        self.certificate.setText(tug.certificate_date)
        self.towing_point_height.setText(self._text(tug.towing_point_height_m, "length"))
        self.towline_length.setText(self._text(tug.towline_length_m, "length"))
        self.towline_mbl.setText(self._text(tug.towline_mbl_n, "force"))
        self.warn_share.setText(f"{tug.towline_warn_fraction:.6g}")
        self.call_sign.setText(tug.call_sign)
        self.channel.setText(tug.working_channel)
        self._loaded = {w: w.text() for w in self._lines()}
        self._show_ratio()

    def _number(
        self, edit: QLineEdit, old: float | None, rule: rules.Range, name: str
    ) -> float | None:
        """The field's value, SI, checked by the core's ``rule``; the old value exactly when
        the field was not touched."""
        if self._old is not None and edit.text() == self._loaded.get(edit):
            return old
        return numbers.parse_optional(edit.text(), rule, self.units, f"tug {name}")

    def tug(self) -> Tug:
        """The tug as typed (raises InputError naming the field on refused input)."""
        old = self._old or Tug("Tug", rules.BOLLARD_PULL.low)
        name = self.name.text().strip()
        bp = self._number(self.bollard_pull, old.bollard_pull_n, rules.BOLLARD_PULL, name)
        if bp is None:
            raise InputError(f"tug {name}: bollard pull", "", "must be given")
        warn = self._number(
            self.warn_share, old.towline_warn_fraction, rules.TOWLINE_WARN_SHARE, name
        )
        if warn is None:
            raise InputError(f"tug {name}: towline warning share of MBL", "", "must be given")
        return replace(
            old,
            name=name,
            bollard_pull_n=bp,
            astern_pull_n=self._number(
                self.astern_pull, old.astern_pull_n, rules.ASTERN_PULL, name
            ),
            tug_type=self.type.currentText().strip(),
            role=self.role.text().strip(),
            towing_point_height_m=self._number(
                self.towing_point_height, old.towing_point_height_m, rules.TOWING_POINT_HEIGHT, name
            ),
            certificate_date=self.certificate.text().strip(),
            towline_length_m=self._number(
                self.towline_length, old.towline_length_m, rules.TOWLINE_LENGTH, name
            ),
            towline_mbl_n=self._number(
                self.towline_mbl, old.towline_mbl_n, rules.TOWLINE_MBL, name
            ),
            towline_warn_fraction=warn,
            call_sign=self.call_sign.text().strip(),
            working_channel=self.channel.text().strip(),
        )

    def _show_ratio(self) -> None:
        """The towline's MBL as a multiple of the bollard pull (a figure, not a check)."""
        try:
            bp = numbers.parse_number(self.bollard_pull.text())
            mbl = numbers.parse_number(self.towline_mbl.text())
        except InputError:
            self.mbl_ratio.setText("")
            return
        if bp <= 0:
            self.mbl_ratio.setText("")
            return
        self.mbl_ratio.setText(f"MBL is {mbl / bp:.1f} × the rated bollard pull")
