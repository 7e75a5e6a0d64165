"""The fittings table's model: one hull's line points and push points, every field editable.

Name, kind, type, position (hull frame, display length unit), SWL and TOW (display force
unit) and the permitted line angles. Editing a cell writes a new project through the
controller (one undo step) by :func:`app.edits.hulls.edited_fitting`.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

from PySide6.QtCore import Qt
from PySide6.QtGui import QColor

from app import formatting as fmt
from app import numbers
from app.controller import Controller
from app.edits import hulls as hull_edits
from app.guard import guarded
from app.panels import fitting_fields as ff
from app.panels.hull_rows import HullRowsModel
from app.panels.model_cells import Index, holds
from core.errors import TowboardError
from core.model import rules
from core.model.hull import Fitting, Hull


@dataclass(frozen=True, slots=True)
class Column:
    key: str
    title: str  # "{force}", "{length}" are filled with the display unit
    tip: str


COLUMNS: tuple[Column, ...] = (
    Column("name", "Name", "Name of the fitting; tugs working there follow a rename"),
    Column("kind", "Kind", "Line point (a towline is made fast) or push point"),
    Column("type", "Type", "Bitt, bollard, fairlead, chock, pushing pad, or your own word"),
    Column("x", "x ({length})", "Forward of the reference point (hull frame)"),
    Column("y", "y ({length})", "To port of the centreline (hull frame)"),
    Column("swl", "SWL ({force})", "Safe working load marked on the fitting"),
    Column(
        "tow",
        "TOW ({force})",
        "Safe towing load (IMO MSC.1/Circ.1175). A towline is checked against TOW, else "
        "SWL; a fitting rated S suits tugs of bollard pull up to S",
    ),
    Column(
        "lines",
        "Permitted lines",
        "Towline directions the fitting is rated for: relative bearings swept clockwise, "
        "e.g. 300 to 060; empty or 'any' for every direction",
    ),
)
KEYS = [c.key for c in COLUMNS]


class FittingsModel(HullRowsModel):
    """Rows are the fittings of the hull ``hull_name()`` returns."""

    COLUMN_COUNT = len(COLUMNS)
    rows: tuple[Fitting, ...]

    def rows_of(self, hull: Hull) -> tuple[Fitting, ...]:
        return hull.fittings

    def row_of(self, name: str) -> int:
        return next((i for i, f in enumerate(self.rows) if f.name == name), -1)

    # -- Qt model ---------------------------------------------------------------------

    @guarded
    def headerData(
        self, section: int, orientation: Qt.Orientation, role: int = Qt.ItemDataRole.DisplayRole
    ):  # type: ignore[no-untyped-def]
        if orientation != Qt.Orientation.Horizontal or not 0 <= section < len(COLUMNS):
            return None
        col = COLUMNS[section]
        if role == Qt.ItemDataRole.DisplayRole:
            u = self.controller.project.units
            return col.title.format(
                force=fmt.unit_label(u, "force"), length=fmt.unit_label(u, "length")
            )
        if role == Qt.ItemDataRole.ToolTipRole:
            return col.tip
        return None

    @guarded(default=Qt.ItemFlag.NoItemFlags)
    def flags(self, index: Index) -> Qt.ItemFlag:
        base = Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable
        if not holds(self, index):
            return base
        f = self.rows[index.row()]
        if COLUMNS[index.column()].key == "lines" and f.kind != "line":
            return base
        return base | Qt.ItemFlag.ItemIsEditable

    @guarded
    def data(self, index: Index, role: int = Qt.ItemDataRole.DisplayRole):  # type: ignore[no-untyped-def]
        if not holds(self, index):
            return None
        f = self.rows[index.row()]
        key = COLUMNS[index.column()].key
        if role in (Qt.ItemDataRole.DisplayRole, Qt.ItemDataRole.EditRole):
            return self._text(f, key, role == Qt.ItemDataRole.EditRole)
        if role == Qt.ItemDataRole.ToolTipRole:
            return fmt.fitting_summary(self.controller.project.units, f)
        if role == Qt.ItemDataRole.TextAlignmentRole and key in ("x", "y", "swl", "tow"):
            return int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
        unrated = f.swl_n is None and f.tow_n is None
        if role == Qt.ItemDataRole.ForegroundRole and key in ("swl", "tow") and unrated:
            return QColor("#78909c")
        return None

    def _text(self, f: Fitting, key: str, editing: bool) -> str:
        u = self.controller.project.units
        if key == "name":
            return f.name
        if key == "kind":
            return ff.KIND_TEXT[f.kind]
        if key == "type":
            return f.fitting_type
        if key in ("x", "y"):
            v = f.x if key == "x" else f.y
            return ff.edit_text(u, v, "length") if editing else fmt.number(u, v, "length", 2)
        if key in ("swl", "tow"):
            rating = f.swl_n if key == "swl" else f.tow_n
            if rating is None:
                return "" if editing else "not given"
            return ff.edit_text(u, rating, "force") if editing else fmt.number(u, rating, "force")
        if key == "lines":
            text = ff.sector_text(f)
            return "" if editing and text == "any" else text
        return ""

    # -- editing ----------------------------------------------------------------------
    @guarded(default=False)
    def setData(self, index: Index, value: object, role: int = Qt.ItemDataRole.EditRole) -> bool:
        if role != Qt.ItemDataRole.EditRole or not holds(self, index):
            return False
        try:
            f = self.rows[index.row()]
            key = COLUMNS[index.column()].key
            if str(value).strip() == self._text(f, key, True):
                return False  # the editor closed unchanged: keep the value exactly
            new = self.edited(f, key, str(value))
            if new is None or new == f:
                return False
            h = self.hull()
            if h is None:
                return False
            c = self.controller
            project = hull_edits.edited_fitting(c.project, h.name, f.name, new)
            c.apply(project, f"{COLUMNS[index.column()].title.split(' (')[0]} of {f.name}")
            say_if_snapped(c, new, project.hull(h.name).fitting(new.name))
        except (TowboardError, ValueError) as e:
            u = self.controller.project.units
            self.controller.message.emit(f"Not changed: {numbers.message(e, u)}")
            return False
        return True

    def edited(self, f: Fitting, key: str, text: str) -> Fitting | None:
        """``f`` with the field ``key`` as typed (raises on refused input)."""
        u = self.controller.project.units
        text = text.strip()
        if key == "name":
            return replace(f, name=text) if text else None
        if key == "kind":
            kind = ff.KIND_OF_TEXT.get(text, text)
            if kind not in ("line", "push"):
                raise ValueError(f"kind: {text!r} is not a line point or a push point")
            lines = f.permitted_lead_rad if kind == "line" else None
            return replace(f, kind=kind, permitted_lead_rad=lines)  # type: ignore[arg-type]
        if key == "type":
            return replace(f, fitting_type=text)
        if key in ("x", "y"):
            v = ff.parse_length(u, text, key, f.name)
            return f.moved_to(v, f.y) if key == "x" else f.moved_to(f.x, v)
        if key == "swl":
            return replace(f, swl_n=ff.parse_rating(u, text, rules.SWL, f.name))
        if key == "tow":
            return replace(f, tow_n=ff.parse_rating(u, text, rules.TOW, f.name))
        if key == "lines":
            return replace(f, permitted_lead_rad=ff.parse_sector(text))
        return None


def say_if_snapped(controller: Controller, typed: Fitting, placed: Fitting) -> None:
    """Tell the user when a typed position was moved onto the outline."""
    off = ((typed.x - placed.x) ** 2 + (typed.y - placed.y) ** 2) ** 0.5
    if off > 1e-3:
        u = controller.project.units
        controller.message.emit(
            f"{placed.name} moved onto the outline at x {u.show(placed.x, 'length', 2)}, "
            f"y {u.show(placed.y, 'length', 2)} ({u.show(off, 'length', 2)} from where typed)"
        )
