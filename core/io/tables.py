"""The report's tables for a spreadsheet: every stage's tugs, and every stage's balance.

Both tables are read off the JSON report (:func:`core.io.report.report_json`), never
computed again, so a spreadsheet carries the same numbers as the report. Each column
names the report field it comes from (:data:`TUG_COLUMNS`, :data:`BALANCE_COLUMNS`),
with its unit in the heading. In SI the numbers are the report's exactly (written so
that they read back to the same float); in display units they are the report's
converted through core.units. Missing values are empty cells, yes/no fields ``yes`` or
``no``.
"""

from __future__ import annotations

import csv
import io
import os
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from core.io.projectfile import write_atomic
from core.units import DisplayUnits, Quantity, label

KeyPath = tuple[str | int, ...]


@dataclass(frozen=True, slots=True)
class Column:
    """One column: its heading (without unit), where it comes from, and its quantity."""

    heading: str
    path: KeyPath  # keys into the row's JSON object (a stage, or one tug of it)
    quantity: Quantity | None = None  # None: a number without a unit choice, or text
    unit: str = ""  # the SI unit, or a fixed unit such as "%" or "deg"

    def title(self, units: DisplayUnits | None) -> str:
        if self.quantity is not None and units is not None:
            return f"{self.heading} ({label(units.unit(self.quantity))})"
        return f"{self.heading} ({self.unit})" if self.unit else self.heading


STAGE_COLUMNS = (Column("Stage no.", ("_number",)), Column("Stage", ("stage",)))

#: One row a tug of a stage: the tug as set (the balance), the pull solved for the goal, and
#: the line's load on its fitting.
TUG_COLUMNS: tuple[Column, ...] = (
    *STAGE_COLUMNS,
    Column("Tug", ("tug",)),
    Column("Hull", ("hull",)),
    Column("Point", ("point",)),
    Column("Mode", ("mode",)),
    Column("Setting", ("setting_percent",), unit="%"),
    Column("Assigned pull", ("assigned_pull_N",), "force", "N"),
    Column("Usable pull", ("usable_pull_N",), "force", "N"),
    Column("Rated pull", ("rated_pull_N",), "force", "N"),
    Column("Share of rated pull", ("share_of_rated_pull",), unit="fraction"),
    Column("Force ahead", ("force_N", "ahead"), "force", "N"),
    Column("Force to port", ("force_N", "to_port"), "force", "N"),
    Column("Pulling towards, relative", ("force_bearing_deg",), unit="deg"),
    Column("Yaw moment about the centroid", ("yaw_moment_about_centroid_Nm",), "moment", "N*m"),
    Column("Tug x", ("tug_position_m", 0), "length", "m"),
    Column("Tug y", ("tug_position_m", 1), "length", "m"),
    Column("Solved pull", ("_solved", "pull_N"), "force", "N"),
    Column("Solved setting", ("_solved", "setting_percent"), unit="%"),
    Column("Fitting", ("_fitting", "fitting_type")),
    Column("Line angle below the horizontal", ("_fitting", "line_angle_deg"), unit="deg"),
    Column("Line tension", ("_fitting", "tension_N"), "force", "N"),
    Column("Fitting rating", ("_fitting", "rating_N"), "force", "N"),
    Column("Over the fitting's rating", ("_fitting", "over_rating")),
    Column(
        "Fitting's load from every tug at it", ("_fitting", "fitting_total_load_N"), "force", "N"
    ),
    Column("Fitting's load over its rating", ("_fitting", "fitting_total_over_rating")),
)

_B = ("balance",)
_EQ = ("balance", "equivalent")
_SOLVED = ("solve", "solved")
_HOLD = ("hold_limits",)

#: One row a stage: the verdict, the balance as set, the goal and the solved pulls, the tug
#: lost check, hold limits.
BALANCE_COLUMNS: tuple[Column, ...] = (
    *STAGE_COLUMNS,
    Column("Kind", ("kind",)),
    Column("Verdict", ("verdict", "status")),
    Column("Reasons", ("_reasons",)),
    Column("Body", (*_B, "body")),
    Column("Centroid x", (*_B, "centroid_m", 0), "length", "m"),
    Column("Centroid y", (*_B, "centroid_m", 1), "length", "m"),
    Column("Net force", (*_B, "net_force_N", "magnitude"), "force", "N"),
    Column("Net force ahead", (*_B, "net_force_N", "ahead"), "force", "N"),
    Column("Net force to port", (*_B, "net_force_N", "to_port"), "force", "N"),
    Column("Net force towards, relative", (*_B, "net_force_bearing_deg"), unit="deg"),
    Column("Net force in words", (*_B, "net_force_words")),
    Column("Yaw moment about the centroid", (*_B, "yaw_moment_about_centroid_Nm"), "moment", "N*m"),
    Column(
        "Yaw moment about the centre of gravity",
        (*_B, "yaw_moment_about_centre_of_gravity_Nm"),
        "moment",
        "N*m",
    ),
    Column("Turning", (*_B, "turning")),
    Column("Equivalent", (*_EQ, "kind")),
    Column("Line of action from the centroid", (*_EQ, "offset_from_centroid_m"), "length", "m"),
    Column("Line crosses the centreline at x", (*_EQ, "crosses_centreline_at_x_m"), "length", "m"),
    Column("Goal", ("goal", "kind")),
    Column("Goal met by the pulls as set", ("goal", "met_by_the_pulls_as_set")),
    Column("Goal met by the solved pulls", (*_SOLVED, "goal_met")),
    Column("Total solved pull", (*_SOLVED, "total_pull_N"), "force", "N"),
    Column("Largest setting", (*_SOLVED, "largest_setting"), unit="fraction"),
    Column("Goal met with any one tug lost", ("solve", "tug_lost", "passes")),
    Column("Loss that hurts most", ("solve", "tug_lost", "worst_loss")),
    Column("Lowest hold limit", (*_HOLD, "lowest_all_tugs", "speed_ms"), "speed", "m/s"),
    Column(
        "Lowest hold limit from, true", (*_HOLD, "lowest_all_tugs", "from_true_deg"), unit="deg"
    ),
    Column("Warnings", ("_warnings",)),
)


def lookup(obj: Any, path: KeyPath) -> Any:
    """The value at ``path`` in nested dicts and lists; None where the path stops."""
    for key in path:
        if isinstance(obj, dict) and isinstance(key, str):
            obj = obj.get(key)
        elif isinstance(obj, list) and isinstance(key, int) and -len(obj) <= key < len(obj):
            obj = obj[key]
        else:
            return None
    return obj


def cell(value: Any, quantity: Quantity | None, units: DisplayUnits | None) -> str:
    """A value as a cell: floats so they read back exactly (SI) or converted (display)."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, int) and quantity is None:
        return str(value)
    if isinstance(value, int | float):
        v = float(value)
        if quantity is not None and units is not None:
            v = units.value(v, quantity)
        return repr(v + 0.0)  # + 0.0: never "-0.0"
    return str(value)


def _joined(items: Any, key: str) -> str | None:
    """The ``key`` of each object in a list, joined with " | " (None for none)."""
    texts = [str(x.get(key, "")) for x in items or [] if isinstance(x, dict)]
    return " | ".join(texts) or None


def stage_rows(report: dict[str, Any]) -> list[dict[str, Any]]:
    """Each stage's JSON with its number, and its verdict's reasons and its warnings joined."""
    rows = []
    for i, s in enumerate(report.get("stages", []), start=1):
        rows.append(
            {
                **s,
                "_number": i,
                "_reasons": _joined(lookup(s, ("verdict", "reasons")), "text"),
                "_warnings": _joined(lookup(s, ("balance", "warnings")), "message"),
            }
        )
    return rows


def tug_rows(report: dict[str, Any]) -> list[dict[str, Any]]:
    """One object a tug of a stage: the balance's tug, with the stage, its solved pull and
    the load on its fitting."""
    rows = []
    for s in stage_rows(report):
        solved = {t.get("tug"): t for t in lookup(s, ("solve", "solved", "tugs")) or []}
        fittings = {f.get("tug"): f for f in s.get("fittings") or [] if isinstance(f, dict)}
        for t in lookup(s, ("balance", "tugs")) or []:
            rows.append(
                {
                    **t,
                    "_number": s["_number"],
                    "stage": s["stage"],
                    "_solved": solved.get(t["tug"]),
                    "_fitting": fittings.get(t["tug"]),
                }
            )
    return rows


def table(
    rows: Sequence[dict[str, Any]], columns: Sequence[Column], units: DisplayUnits | None = None
) -> list[list[str]]:
    """Heading row and one row of cells per object."""
    out = [[c.title(units) for c in columns]]
    for r in rows:
        out.append([cell(lookup(r, c.path), c.quantity, units) for c in columns])
    return out


def tug_table(report: dict[str, Any], units: DisplayUnits | None = None) -> list[list[str]]:
    """The tugs of every stage; SI (the report's numbers) unless ``units`` are given."""
    return table(tug_rows(report), TUG_COLUMNS, units)


def balance_table(report: dict[str, Any], units: DisplayUnits | None = None) -> list[list[str]]:
    """The balance of every stage; SI (the report's numbers) unless ``units`` are given."""
    return table(stage_rows(report), BALANCE_COLUMNS, units)


TABLES = {"tugs": tug_table, "balance": balance_table}


def csv_text(rows: Sequence[Sequence[str]]) -> str:
    """CSV text (comma separated, quoted where needed, one row a line)."""
    buf = io.StringIO()
    csv.writer(buf, lineterminator="\n").writerows(rows)
    return buf.getvalue()


def write_csv(path: str | os.PathLike[str], rows: Sequence[Sequence[str]]) -> Path:
    """Write a table atomically as UTF-8 with a byte-order mark (so spreadsheets read
    "t·m" and "²" right); raises OSError when it cannot be written."""
    p = Path(path)
    write_atomic(p, csv_text(rows).encode("utf-8-sig"))
    return p
