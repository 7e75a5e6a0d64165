"""The tugs table's model: every tug of the plan, where it works in the stage shown.

Cells show the core's numbers (assigned pull, yaw moment) in the display units;
editing a cell writes a new project through the controller (one undo step).
"""

from __future__ import annotations

import traceback
from collections.abc import Callable
from dataclasses import dataclass, replace

from PySide6.QtCore import QAbstractTableModel, QModelIndex, Qt
from PySide6.QtGui import QColor

from app import formatting as fmt
from app.controller import Controller
from app.edits import sectors
from app.edits import tugs as tug_edits
from app.guard import guarded
from app.numbers import message, parse_value
from app.panels.model_cells import Index, holds
from core.errors import InputError, TowboardError
from core.mechanics.balance import TugShare
from core.mechanics.bodies import body_name_of_hull
from core.model import rules
from core.model.tugs import BOLLARD_PULL_NAME, BOLLARD_PULL_TITLE, Placement, Tug, setting_cell
from core.units import fmt as plain

NOT_PLACED = "not placed"
#: Where a tug works: its hull and point, or None when it is not placed.
Point = tuple[str, str] | None


@dataclass(frozen=True, slots=True)
class Column:
    key: str
    title: str  # "{force}" etc. are filled with the display unit
    editable: bool = False
    tip: str = ""


COLUMNS: tuple[Column, ...] = (
    Column("name", "Tug", True, "Name of the tug (particulars are the same in every stage)"),
    Column(
        "bp",
        f"{BOLLARD_PULL_TITLE} ({{force}})",
        True,
        f"Certified bollard pull ahead: the tug's {BOLLARD_PULL_NAME}",
    ),
    Column("astern_bp", "Astern pull ({force})", True, "Rated pull astern"),
    Column(
        "point", "Works at", True, "The line point or push point the tug works at in this stage"
    ),
    Column("mode", "Line / push", False, "On a line (pulls) or pushing"),
    Column("astern", "Astern", True, "The tug works astern (its astern pull applies)"),
    Column(
        "lead",
        "Lead (rel. °)",
        True,
        "Relative bearing of the tug's force on the hull, degrees clockwise from ahead",
    ),
    Column(
        "length",
        "Line ({length})",
        True,
        "Horizontal length of towline from the line point to the tug",
    ),
    Column(
        "sector_from",
        "Sector from (rel. °)",
        True,
        "Working sector: when the pulls are solved the tug may take any lead clockwise from "
        "this bearing to 'Sector to' (relative bearings of its force, as the lead). Empty: "
        "the lead is kept as set; type 'whole' for the whole circle",
    ),
    Column(
        "sector_to",
        "Sector to (rel. °)",
        True,
        "Where the working sector ends, clockwise from 'Sector from' (relative bearing of "
        "the tug's force); empty: no sector",
    ),
    Column(
        "push_pull",
        "Push-pull",
        True,
        "At a push point: the tug is made fast and can push or pull (else it only pushes)",
    ),
    Column("setting", "Setting %", True, "Percent of the tug's usable pull asked for"),
    Column("pull", "Assigned pull ({force})", False, "Setting × usable pull"),
    Column(
        "moment",
        "Yaw moment ({moment})",
        False,
        "This tug's moment about the centroid, + swings the bow to port",
    ),
    Column(
        "turns",
        "Turns the bow",
        False,
        "Which way this tug's own moment about the centroid swings the bow",
    ),
)
KEYS = [c.key for c in COLUMNS]


@dataclass(frozen=True, slots=True)
class Row:
    tug: Tug
    placement: Placement | None
    share: TugShare | None
    body: str | None


class TugsModel(QAbstractTableModel):
    """Rows are the plan's tugs; columns are :data:`COLUMNS`."""

    #: Extra columns others may add: (title, function of the row's TugShare -> text).
    extra: list[tuple[str, Callable[[TugShare | None], str]]]

    def __init__(self, controller: Controller) -> None:
        super().__init__()
        self.controller = controller
        self.extra = []
        self.rows: list[Row] = []
        self._units = controller.project.units
        self._build()
        controller.changed.connect(self.refresh)

    # -- rows -----------------------------------------------------------------------
    def _build(self) -> None:
        c = self.controller
        stage = c.stage
        placed = {p.tug: p for p in stage.placements} if stage is not None else {}
        shares: dict[str, tuple[TugShare, str]] = {}
        for body, b in c.balances().items():
            for s in b.shares:
                shares[s.tug] = (s, body)
        rows = []
        for t in c.project.tugs:
            got = shares.get(t.name)
            rows.append(
                Row(t, placed.get(t.name), got[0] if got else None, got[1] if got else None)
            )
        self.rows = rows

    @guarded
    def refresh(self) -> None:
        """Tell the table what changed: all rows when tugs came or went, else the rows that did.

        A drag changes one tug; the table is told just that, so it never measures every
        cell on every mouse move.
        """
        old = self.rows
        units = self._units
        self._build()
        self._units = self.controller.project.units
        if len(self.rows) != len(old):  # tugs came or went (a rename is one row's change:
            self.beginResetModel()  # a reset under a committing cell editor releases it
            self.endResetModel()  # while Qt's delegate is still filtering its key press)
            return
        if self._units != units:
            self.headerDataChanged.emit(Qt.Orientation.Horizontal, 0, self.columnCount() - 1)
        last = self.columnCount() - 1
        if self._units != units:
            changed = list(range(len(self.rows)))
        else:
            changed = [
                i for i, (a, b) in enumerate(zip(old, self.rows, strict=True)) if not _same(a, b)
            ]
        for first, end in _runs(changed):
            self.dataChanged.emit(self.index(first, 0), self.index(end, last))

    def row_of(self, tug: str) -> int:
        for i, r in enumerate(self.rows):
            if r.tug.name == tug:
                return i
        return -1

    # -- Qt model ---------------------------------------------------------------------
    @guarded(default=0)
    def rowCount(self, parent: Index = QModelIndex()) -> int:  # noqa: B008
        return 0 if parent.isValid() else len(self.rows)

    @guarded(default=0)
    def columnCount(self, parent: Index = QModelIndex()) -> int:  # noqa: B008
        return 0 if parent.isValid() else len(COLUMNS) + len(self.extra)

    @guarded
    def headerData(
        self, section: int, orientation: Qt.Orientation, role: int = Qt.ItemDataRole.DisplayRole
    ):  # type: ignore[no-untyped-def]
        if orientation != Qt.Orientation.Horizontal:
            return None
        if section >= len(COLUMNS):
            return (
                self.extra[section - len(COLUMNS)][0]
                if role == Qt.ItemDataRole.DisplayRole
                else None
            )
        col = COLUMNS[section]
        u = self.controller.project.units
        if role == Qt.ItemDataRole.DisplayRole:
            return col.title.format(
                force=fmt.unit_label(u, "force"),
                moment=fmt.unit_label(u, "moment"),
                length=fmt.unit_label(u, "length"),
            )
        if role == Qt.ItemDataRole.ToolTipRole:
            return col.tip
        return None

    @guarded(default=Qt.ItemFlag.NoItemFlags)
    def flags(self, index: Index) -> Qt.ItemFlag:
        base = Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable
        if not holds(self, index) or index.column() >= len(COLUMNS):
            return base
        col = COLUMNS[index.column()]
        row = self.rows[index.row()]
        if not col.editable:
            return base
        if col.key in ("astern",):
            return base | Qt.ItemFlag.ItemIsUserCheckable if row.placement else base
        if col.key == "push_pull":
            at_push = row.share is not None and row.share.mode != "line"
            return base | Qt.ItemFlag.ItemIsUserCheckable if at_push else base
        if col.key in ("sector_from", "sector_to") and (row.placement is None or not row.body):
            return base
        if col.key in ("lead", "setting") and row.placement is None:
            return base
        if col.key == "length" and (
            row.placement is None or (row.share and row.share.mode == "push")
        ):
            return base
        return base | Qt.ItemFlag.ItemIsEditable

    @guarded
    def data(self, index: Index, role: int = Qt.ItemDataRole.DisplayRole):  # type: ignore[no-untyped-def]
        try:
            return self._data(index, role)
        except Exception:  # nothing may escape into Qt: the cell shows nothing
            traceback.print_exc()
            return None

    def _data(self, index: Index, role: int):  # type: ignore[no-untyped-def]
        if not holds(self, index):
            return None
        row = self.rows[index.row()]
        if index.column() >= len(COLUMNS):
            if role == Qt.ItemDataRole.DisplayRole:
                return self.extra[index.column() - len(COLUMNS)][1](row.share)
            return None
        key = COLUMNS[index.column()].key
        if role == Qt.ItemDataRole.DisplayRole:
            return self._text(row, key)
        if role == Qt.ItemDataRole.EditRole:
            return self._edit_text(row, key)
        if role == Qt.ItemDataRole.CheckStateRole and key == "astern" and row.placement:
            return Qt.CheckState.Checked if row.placement.astern else Qt.CheckState.Unchecked
        if (
            role == Qt.ItemDataRole.CheckStateRole
            and key == "push_pull"
            and row.placement
            and row.share is not None
            and row.share.mode != "line"
        ):
            return Qt.CheckState.Checked if row.placement.push_pull else Qt.CheckState.Unchecked
        if role == Qt.ItemDataRole.TextAlignmentRole and key not in ("name", "point", "mode"):
            return int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
        if role == Qt.ItemDataRole.ForegroundRole and row.placement is None and key != "name":
            return QColor("#78909c")
        if (
            role == Qt.ItemDataRole.ForegroundRole
            and key == "setting"
            and row.placement
            and row.placement.setting > 1
        ):
            return QColor("#b71c1c")
        return None

    def _text(self, row: Row, key: str) -> str:
        u = self.controller.project.units
        t, p, s = row.tug, row.placement, row.share
        if key == "name":
            return t.name
        if key == "bp":
            return fmt.number(u, t.bollard_pull_n, "force")
        if key == "astern_bp":
            return fmt.number(u, t.astern_pull, "force")
        if key == "point":
            return NOT_PLACED if p is None else f"{p.hull}: {p.point}"
        if p is None or s is None:
            return "—" if key not in ("astern",) else ""
        if key == "mode":
            return s.mode
        if key == "astern":
            return ""
        if key == "lead":
            return fmt.bearing(s.lead_bearing_deg)[:-1]
        if key == "length":
            return fmt.number(u, p.line_length_m, "length") if s.mode == "line" else "—"
        if key in ("sector_from", "sector_to"):
            return self._sector_text(row, key)
        if key == "push_pull":
            return "" if s.mode != "line" else "—"
        if key == "setting":
            # the column's title says "%"; a tug standing by reads so alone, as in the
            # briefing's narrow column
            return setting_cell(s.setting).replace(" %", "", 1)
        if key == "pull":
            return fmt.number(u, s.pull_n, "force")
        if key == "moment":
            return plain(u.value(s.moment_centroid_nm, "moment"), u.digits("moment"), signed=True)
        if key == "turns":
            return turn_words(u.value(s.moment_centroid_nm, "moment"))
        return ""

    def _edit_text(self, row: Row, key: str) -> str:
        u = self.controller.project.units
        t, p, s = row.tug, row.placement, row.share
        if key == "bp":
            return f"{u.value(t.bollard_pull_n, 'force'):.6g}"
        if key == "astern_bp":
            return f"{u.value(t.astern_pull, 'force'):.6g}"
        if key == "lead" and s is not None:
            return f"{s.lead_bearing_deg:.6g}"
        if key == "length" and p is not None:
            return f"{u.value(p.line_length_m, 'length'):.6g}"
        if key == "setting" and p is not None:
            return f"{p.setting * 100:.6g}"
        if key in ("sector_from", "sector_to"):
            limits = self._sector(row)
            if limits is None:
                return ""
            if limits[2] >= 360.0 - 1e-9:
                return "whole"
            return f"{limits[0 if key == 'sector_from' else 1]:.6g}"
        return self._text(row, key)

    def _sector(self, row: Row) -> tuple[float, float, float] | None:
        """(from, to, width) of the row's working sector, degrees (None without one)."""
        if row.placement is None or row.body is None:
            return None
        body = self.controller.results()[row.body].body
        return sectors.sector_bearings(body, row.placement)

    def _sector_text(self, row: Row, key: str) -> str:
        limits = self._sector(row)
        if limits is None:
            return "lead as set" if key == "sector_from" else ""
        if limits[2] >= 360.0 - 1e-9:
            return "whole circle" if key == "sector_from" else ""
        return fmt.bearing(limits[0 if key == "sector_from" else 1])[:-1]

    # -- editing ----------------------------------------------------------------------
    @guarded(default=False)
    def setData(self, index: Index, value: object, role: int = Qt.ItemDataRole.EditRole) -> bool:
        if not holds(self, index) or index.column() >= len(COLUMNS):
            return False
        row = self.rows[index.row()]
        key = COLUMNS[index.column()].key
        try:
            new, text = self._edited(row, key, value, role)
        except (TowboardError, ValueError) as e:
            self.controller.message.emit(
                f"Not changed: {message(e, self.controller.project.units)}"
            )
            return False
        except Exception as e:  # nothing may escape into Qt
            traceback.print_exc()
            self.controller.message.emit(f"Not changed ({type(e).__name__}: {e})")
            return False
        if new is None:
            return False
        self.controller.apply(new, text)
        return True

    def _edited(self, row: Row, key: str, value: object, role: int):  # type: ignore[no-untyped-def]
        c = self.controller
        project = c.project
        u = project.units
        t, p = row.tug, row.placement
        if role == Qt.ItemDataRole.CheckStateRole and key in ("push_pull", "astern"):
            stage = c.stage
            if p is None or stage is None:  # a tug not placed: nothing to tick
                return None, ""
            on = value in (Qt.CheckState.Checked, Qt.CheckState.Checked.value, 2, True)
            if key == "push_pull":
                push = row.share is not None and row.share.mode != "line"
                new_p = sectors.with_push_pull(p, push, on)
                return c.with_stage(stage.with_placement(new_p)), f"{t.name} push-pull"
            return c.with_stage(
                stage.with_placement(replace(p, astern=bool(on)))
            ), f"{t.name} astern"
        if role != Qt.ItemDataRole.EditRole:
            return None, ""
        if key == "point":
            where = self.point_of_value(value)
            said = NOT_PLACED if where is None else f"{where[0]}: {where[1]}"
            return self._moved_to_point(row, where), f"{t.name} works at {said}"
        text = str(value).strip()
        if text == self._edit_text(row, key):
            return None, ""  # the editor closed unchanged: keep the value exactly
        if key == "name":
            if not text or text == t.name:
                return None, ""
            return tug_edits.renamed_tug(project, t.name, text), f"Rename {t.name}"
        if key in ("sector_from", "sector_to"):
            return self._sector_edited(row, key, text), f"Working sector of {t.name}"
        if key not in _RULES:
            return None, ""
        value = parse_value(text, _RULES[key], u, f"tug {t.name}")
        if key == "bp":
            return project.with_tug(replace(t, bollard_pull_n=value)), f"{t.name} bollard pull"
        if key == "astern_bp":
            return project.with_tug(replace(t, astern_pull_n=value)), f"{t.name} astern pull"
        stage = c.stage
        if p is None or stage is None:
            return None, ""
        if key == "setting":
            return c.with_stage(stage.with_placement(p.with_setting(value))), f"Setting of {t.name}"
        body = c.results()[row.body].body if row.body else None
        if key == "lead" and body is not None:
            return c.with_stage(
                stage.with_placement(tug_edits.lead_from_bearing(body, p, value))
            ), f"Lead of {t.name}"
        if key == "length":
            return c.with_stage(
                stage.with_placement(p.with_lead(p.lead_rad, value))
            ), f"Line of {t.name}"
        return None, ""

    def _sector_edited(self, row: Row, key: str, text: str):  # type: ignore[no-untyped-def]
        c = self.controller
        p, stage = row.placement, c.stage
        if p is None or stage is None or row.body is None:
            return None
        body = c.results()[row.body].body
        if not text:
            new = p.with_sector(None)
        elif text.lower() in sectors.WHOLE_WORDS:
            new = sectors.whole_circle(p)
        else:
            which = "from" if key == "sector_from" else "to"
            rule = rules.BEARING.named(f"sector {which}")
            value = parse_value(text, rule, c.project.units, f"tug {row.tug.name}")
            new = sectors.with_limit(body, p, which, value)
        return c.with_stage(stage.with_placement(new))

    def point_choices(self) -> list[tuple[str, Point]]:
        """The "Works at" list: each entry's words and its (hull, point), "not placed" first.

        The pair, not the words, says where the tug goes: a hull or point name may hold
        ": " itself.
        """
        out: list[tuple[str, Point]] = [(NOT_PLACED, None)]
        for h in self.controller.project.hulls:
            out += [(f"{h.name}: {f.name}", (h.name, f.name)) for f in h.fittings]
        return out

    def point_at(self, index: Index) -> Point:
        """Where the tug of ``index``'s row works in the stage shown (None: not placed)."""
        if not holds(self, index):
            return None
        p = self.rows[index.row()].placement
        return None if p is None else (p.hull, p.point)

    def point_of_value(self, value: object) -> Point:
        """The (hull, point) a "Works at" edit gives: the pair itself, or words of the list
        that name one entry and one only. Raises InputError for anything else."""
        if value is None:
            return None
        if isinstance(value, tuple) and len(value) == 2 and all(isinstance(v, str) for v in value):
            return (value[0], value[1])
        text = str(value).strip()
        found = [pair for words, pair in self.point_choices() if words == text]
        if len(found) == 1:
            return found[0]
        if found:
            raise InputError("works at", text, "names more than one point: choose it in the list")
        raise InputError("works at", text, "is not a line point or push point of the plan")

    def _moved_to_point(self, row: Row, where: Point):  # type: ignore[no-untyped-def]
        c = self.controller
        project, stage = c.ensure_stage(c.project)
        t, p = row.tug, row.placement
        if where is None:
            return None if p is None else c.with_stage(stage.without_placement(t.name), project)
        hull_name, point = where
        hull = project.hull(hull_name)
        fitting = hull.fitting(point)
        from core.mechanics.bodies import body_of

        body = body_of(project, body_name_of_hull(project, hull_name))
        lead = tug_edits.outward_lead(body, hull_name, point) if fitting.kind == "line" else 0.0
        if p is None:
            new = Placement(
                t.name, hull_name, point, setting=0.0, lead_rad=lead, line_length_m=30.0
            )
        else:
            old_kind = project.hull(p.hull).fitting(p.point).kind
            new = p.at_point(hull_name, point)
            if old_kind != fitting.kind:
                new = new.with_lead(lead)
        return c.with_stage(stage.with_placement(new), project)


def _same(a: Row, b: Row) -> bool:
    """Whether two rows show the same; by identity first (a drag keeps every other tug's
    values as they were, so comparing 200 rows field by field on every move is spared)."""
    return (
        (a.tug is b.tug or a.tug == b.tug)
        and (a.placement is b.placement or a.placement == b.placement)
        and (a.share is b.share or a.share == b.share)
        and a.body == b.body
    )


def turn_words(moment: float) -> str:
    """The sense of a tug's yaw moment in words, from the moment as shown (display unit,
    to the unit): "bow to port" (counter-clockwise seen from above, positive), "bow to
    starboard", or "none" when it shows as 0."""
    if round(moment) == 0:
        return "none"
    return "bow to port" if moment > 0 else "bow to starboard"


def _runs(rows: list[int]) -> list[tuple[int, int]]:
    """Consecutive runs of row numbers, as (first, last)."""
    out: list[tuple[int, int]] = []
    for r in rows:
        if out and r == out[-1][1] + 1:
            out[-1] = (out[-1][0], r)
        else:
            out.append((r, r))
    return out


#: The rule (core.model.rules) of each editable numeric column.
_RULES: dict[str, rules.Range] = {
    "bp": rules.BOLLARD_PULL,
    "astern_bp": rules.ASTERN_PULL,
    "setting": rules.SETTING,
    "lead": rules.BEARING.named("lead"),
    "length": rules.LINE_LENGTH,
}
