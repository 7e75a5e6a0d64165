"""Site features from a table of points (a survey listing, a spreadsheet).

One point a row, with a first row of names: ``feature`` (or ``name``), ``kind``
(quay, dolphin, vessel or limit), ``x`` and ``y`` (easting and northing in the
table's units), and optionally ``closed`` (yes/no). Rows of one feature follow each
other; a feature whose last point repeats its first is closed. Dolphins and vessels
are always closed. Commas, semicolons or tabs separate the columns.
"""

from __future__ import annotations

import csv
import math

from core.errors import DrawingError
from core.io.drawing_units import MAX_DRAWING_COORDINATE, metres_per_unit, read_coordinate
from core.io.paths import shown_row
from core.io.site_import import ImportedSite, SiteFrame
from core.model.plan import SITE_FEATURE_KINDS, SiteFeature

_NAME_KEYS = ("feature", "name")
_YES = frozenset({"yes", "y", "true", "1", "closed"})
_NO = frozenset({"no", "n", "false", "0", "open", ""})


def _columns(header: list[str], source: str, line: int) -> dict[str, int]:
    keys = [h.strip().lower() for h in header]
    cols: dict[str, int] = {}
    for want in ("kind", "x", "y", "closed"):
        if want in keys:
            cols[want] = keys.index(want)
    name = next((k for k in _NAME_KEYS if k in keys), None)
    if name is not None:
        cols["feature"] = keys.index(name)
    missing = [w for w in ("feature", "kind", "x", "y") if w not in cols]
    if missing:
        raise DrawingError(
            source, f"the first row must name the columns; missing: {', '.join(missing)}", line=line
        )
    return cols


def import_site_points(
    text: str, source: str, units: str = "m", frame: SiteFrame | None = None
) -> ImportedSite:
    """The features of a table of points, in the site frame (see the module docstring)."""
    frame = frame or SiteFrame()
    k = metres_per_unit(units)
    rows = [
        (i, ln)
        for i, ln in enumerate(text.splitlines(), start=1)
        if ln.strip() and not ln.lstrip().startswith("#")
    ]
    if not rows:
        raise DrawingError(source, "holds no points")
    delim = next((d for d in ("\t", ";", ",") if d in rows[0][1]), ",")
    parsed = [(i, next(csv.reader([ln], delimiter=delim))) for i, ln in rows]
    cols = _columns(parsed[0][1], source, parsed[0][0])
    groups: list[tuple[int, str, str, bool | None, list[tuple[float, float]]]] = []
    for line, row in parsed[1:]:
        try:
            name = row[cols["feature"]].strip()
            kind = row[cols["kind"]].strip().lower()
            x = read_coordinate(float(row[cols["x"]]))
            y = read_coordinate(float(row[cols["y"]]))
            flag = row[cols["closed"]].strip().lower() if "closed" in cols else None
        except (IndexError, ValueError):
            raise DrawingError(
                source, f"is not a feature, kind, x and y: {shown_row(delim.join(row))}", line=line
            ) from None
        if not name:
            raise DrawingError(source, "the feature has no name", line=line)
        if kind not in SITE_FEATURE_KINDS:
            raise DrawingError(
                source, f"kind {kind!r} is not one of {', '.join(SITE_FEATURE_KINDS)}", line=line
            )
        if not (math.isfinite(x) and math.isfinite(y)):
            raise DrawingError(source, "x and y must be finite", line=line)
        if max(abs(x), abs(y)) > MAX_DRAWING_COORDINATE:
            raise DrawingError(
                source, f"x and y must be at most {MAX_DRAWING_COORDINATE:g} from zero", line=line
            )
        closed: bool | None = None
        if flag is not None:
            if flag not in _YES | _NO:
                raise DrawingError(source, f"closed must be yes or no, not {flag!r}", line=line)
            closed = flag in _YES
        if groups and groups[-1][1] == name:
            if groups[-1][2] != kind:
                raise DrawingError(source, f"{name} changes kind to {kind}", line=line)
            groups[-1][4].append((x, y))
        else:
            if any(g[1] == name for g in groups):
                raise DrawingError(source, f"{name} appears again after other features", line=line)
            groups.append((line, name, kind, closed, [(x, y)]))
    features: list[SiteFeature] = []
    for line, name, kind, closed, pts in groups:
        shut = closed if closed is not None else (len(pts) > 3 and pts[0] == pts[-1])
        shut = shut or kind in ("dolphin", "vessel")
        if shut and len(pts) > 1 and pts[0] == pts[-1]:
            pts = pts[:-1]
        site_pts = frame.to_site(pts, k)
        try:
            features.append(SiteFeature(name, kind, site_pts, closed=shut))  # type: ignore[arg-type]
        except (ValueError, TypeError) as e:
            raise DrawingError(source, str(e), line=line) from None
    return ImportedSite(source, tuple(features))
