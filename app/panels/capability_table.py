"""A tug's capability as an editable table: one row per relative bearing, one column per
way of working (the usable share of the rated bollard pull there).

The table holds the three ways on common bearings: a curve given on other bearings is
read at the table's bearings, which keeps it exactly (the curves are straight between
their points). Every number typed is read by the one parser (app.numbers) and checked
by the core's rules (``rules.CAPABILITY_BEARING``, ``rules.CAPABILITY_SHARE``); a refusal
is emitted as words naming the field and the table keeps what it had.
"""

from __future__ import annotations

import math
import traceback
from dataclasses import dataclass

import numpy as np
from PySide6.QtCore import QAbstractTableModel, QModelIndex, Qt, Signal
from PySide6.QtGui import QColor

from app.guard import guarded
from app.numbers import message, parse_value
from app.panels.model_cells import Index, holds
from core.errors import InputError, TowboardError
from core.model import rules
from core.model.capability import WAY_WORDS, WAYS, Capability, CapabilityCurve, Way
from core.units import DisplayUnits, filed_bearing

#: What the share columns are called (the way's words and what the figure is).
SHARE_TITLE = "{way}\n(× BP)"


@dataclass
class Row:
    bearing_deg: float
    shares: dict[Way, float]


def rows_of(capability: Capability) -> list[Row]:
    """The capability on the union of its curves' bearings (ways it cannot do: zeros)."""
    curves = {w: capability.curve(w) for w in WAYS}
    bearings = sorted({b for c in curves.values() if c is not None for b in c.bearings_deg})
    at = np.asarray(bearings, dtype=float)
    values = {
        w: (c.at_bearings(at).tolist() if c is not None else [0.0] * len(bearings))
        for w, c in curves.items()
    }
    return [Row(b, {w: float(values[w][i]) for w in WAYS}) for i, b in enumerate(bearings)]


class CapabilityModel(QAbstractTableModel):
    """Rows of (bearing, share per way); ``ways`` are the ways the tug can work."""

    #: The table's values changed (by an edit, a new or removed row, or a load).
    changed = Signal()
    #: An entry was refused: the words naming the field and why.
    refused = Signal(str)

    def __init__(self, units: DisplayUnits) -> None:
        super().__init__()
        self.units = units
        self.rows: list[Row] = []
        self.ways: set[Way] = set(WAYS)

    # -- values -----------------------------------------------------------------------
    def load(self, capability: Capability) -> None:
        self.beginResetModel()
        self.rows = rows_of(capability)
        self.ways = {w for w in WAYS if capability.curve(w) is not None}
        self.endResetModel()
        self.changed.emit()

    def curves(self) -> dict[Way, CapabilityCurve | None]:
        """Each way's curve as the table holds it (None for a way the tug cannot work);
        raises InputError (the core's) when the rows break a rule."""
        if not self.rows:
            raise InputError("capability", None, "needs at least one bearing", shown="the table")
        bearings = tuple(r.bearing_deg for r in self.rows)
        return {
            w: (
                CapabilityCurve(bearings, tuple(r.shares[w] for r in self.rows))
                if w in self.ways
                else None
            )
            for w in WAYS
        }

    def set_way(self, way: Way, on: bool) -> None:
        """Let the tug work ``way`` or not (its column keeps its figures meanwhile);
        raises InputError when no way would be left."""
        ways = set(self.ways) | {way} if on else set(self.ways) - {way}
        if not ways:
            raise InputError(
                "capability", None, "must be able to work at least one way", shown="the tug"
            )
        self.ways = ways
        col = 1 + WAYS.index(way)
        self.dataChanged.emit(self.index(0, col), self.index(max(len(self.rows) - 1, 0), col))
        self.changed.emit()

    def add_row(self) -> int:
        """A new bearing in the middle of the widest gap, its shares read off the curves
        there (the capability is the same until a figure is typed); returns its row."""
        b = [r.bearing_deg for r in self.rows]
        if not b:
            new = Row(0.0, {w: 1.0 for w in WAYS})
        else:
            gaps = np.diff(np.append(b, b[0] + 360.0))
            k = int(np.argmax(gaps))
            bearing = (b[k] + gaps[k] / 2.0) % 360.0
            if gaps[k] < 0.02:
                raise InputError(
                    "capability", None, "has no room between the others", shown="a new bearing"
                )
            bearing = round(bearing, 1) if gaps[k] > 0.2 else filed_bearing(bearing)
            shares = {}
            for w in WAYS:
                curve = CapabilityCurve(tuple(b), tuple(r.shares[w] for r in self.rows))
                shares[w] = round(curve.at_bearing(bearing), 4)
            new = Row(bearing, shares)
        self.beginResetModel()
        self.rows.append(new)
        self.rows.sort(key=lambda r: r.bearing_deg)
        self.endResetModel()
        self.changed.emit()
        return self.rows.index(new)

    def remove_row(self, row: int) -> None:
        if not 0 <= row < len(self.rows):
            raise InputError("capability", None, "is selected to remove", shown="no bearing")
        if len(self.rows) == 1:
            raise InputError(
                "capability", None, "cannot be removed: one is needed", shown="the last bearing"
            )
        self.beginRemoveRows(QModelIndex(), row, row)
        del self.rows[row]
        self.endRemoveRows()
        self.changed.emit()

    # -- the Qt model -----------------------------------------------------------------
    @guarded(default=0)
    def rowCount(self, parent: Index = QModelIndex()) -> int:  # noqa: B008
        return 0 if parent.isValid() else len(self.rows)

    @guarded(default=0)
    def columnCount(self, parent: Index = QModelIndex()) -> int:  # noqa: B008
        return 0 if parent.isValid() else 1 + len(WAYS)

    @guarded
    def headerData(  # type: ignore[no-untyped-def]
        self, section: int, orientation: Qt.Orientation, role: int = Qt.ItemDataRole.DisplayRole
    ):
        try:
            if orientation != Qt.Orientation.Horizontal:
                return None
            if role == Qt.ItemDataRole.DisplayRole:
                if section == 0:
                    return "Bearing\n(rel. °)"
                return SHARE_TITLE.format(way=WAY_WORDS[WAYS[section - 1]])
            if role == Qt.ItemDataRole.ToolTipRole:
                if section == 0:
                    return (
                        "Direction of the tug's pull relative to its own heading, degrees "
                        "clockwise from ahead (000 over the bow, 180 astern)"
                    )
                return (
                    f"Usable share of the rated bollard pull {WAY_WORDS[WAYS[section - 1]]} "
                    f"at that bearing ({rules.CAPABILITY_SHARE.span()}); straight lines between"
                )
        except Exception:  # nothing may escape into Qt
            traceback.print_exc()
        return None

    @guarded(default=Qt.ItemFlag.NoItemFlags)
    def flags(self, index: Index) -> Qt.ItemFlag:
        base = Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable
        if not holds(self, index):
            return base
        if index.column() == 0 or WAYS[index.column() - 1] in self.ways:
            return base | Qt.ItemFlag.ItemIsEditable
        return Qt.ItemFlag.ItemIsSelectable

    @guarded
    def data(self, index: Index, role: int = Qt.ItemDataRole.DisplayRole):  # type: ignore[no-untyped-def]
        try:
            return self._data(index, role)
        except Exception:  # nothing may escape into Qt
            traceback.print_exc()
            return None

    def _data(self, index: Index, role: int):  # type: ignore[no-untyped-def]
        if not holds(self, index):
            return None
        row, col = self.rows[index.row()], index.column()
        way = None if col == 0 else WAYS[col - 1]
        if role == Qt.ItemDataRole.DisplayRole:
            if way is None:
                return f"{row.bearing_deg:05.1f}"
            return f"{row.shares[way]:.2f}" if way in self.ways else "—"
        if role == Qt.ItemDataRole.EditRole:
            return f"{row.bearing_deg:.6g}" if way is None else f"{row.shares[way]:.6g}"
        if role == Qt.ItemDataRole.TextAlignmentRole:
            return int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
        if role == Qt.ItemDataRole.ForegroundRole and way is not None and way not in self.ways:
            return QColor("#9aa3ad")
        return None

    @guarded(default=False)
    def setData(self, index: Index, value: object, role: int = Qt.ItemDataRole.EditRole) -> bool:
        if role != Qt.ItemDataRole.EditRole or not holds(self, index):
            return False
        try:
            self._set(index.row(), index.column(), str(value))
        except (TowboardError, ValueError) as e:
            self.refused.emit(f"Not changed: {message(e, self.units)}")
            return False
        except Exception as e:  # nothing may escape into Qt
            traceback.print_exc()
            self.refused.emit(f"Not changed ({type(e).__name__}: {e})")
            return False
        return True

    def _set(self, r: int, col: int, text: str) -> None:
        row = self.rows[r]
        if col == 0:
            # as the file will hold it: one that rounds to 360 there is 0
            v = filed_bearing(parse_value(text, rules.CAPABILITY_BEARING, self.units))
            if any(
                abs(o.bearing_deg - v) < 1e-9 or abs(abs(o.bearing_deg - v) - 360) < 1e-9
                for o in self.rows
                if o is not row
            ):
                raise InputError(
                    "capability bearing", v, "is in the table already", shown=f"{v:g}°"
                )
            if math.isclose(v, row.bearing_deg, abs_tol=0.0):
                return
            self.beginResetModel()
            row.bearing_deg = v
            self.rows.sort(key=lambda x: x.bearing_deg)
            self.endResetModel()
        else:
            way = WAYS[col - 1]
            share = parse_value(text, rules.CAPABILITY_SHARE, self.units, f"{WAY_WORDS[way]}")
            if share == row.shares[way]:
                return
            row.shares[way] = share
            self.dataChanged.emit(self.index(r, col), self.index(r, col))
        self.changed.emit()
