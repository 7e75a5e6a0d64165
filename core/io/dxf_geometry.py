"""A DXF drawing's plan geometry: each layer's closed loops and open chains.

Coordinates stay in the drawing's own units and axes (x, y of the world coordinate
system; z dropped) until :mod:`core.io.dxf_outline` or :mod:`core.io.dxf_site`
places them. Only model space is read; blocks inserted there are read as if
exploded, an entity on layer 0 inside a block taking the layer of its insert, and an
insert placing its block as an array of rows and columns (a MINSERT) as every copy.

Curves are flattened to points on the curve, as few as keep every chord within
``chord_error`` (drawing units) of the arc it stands for: an arc of radius r and
angle a between two points has the sagitta r (1 - cos(a / 2)) (circle geometry).
Lines and arcs whose ends meet within ``tolerance`` are joined into chains; a chain
whose ends meet is a loop.

A drawing is input like any other: an entity whose points are not finite numbers,
lie farther than :data:`MAX_DRAWING_COORDINATE` from the origin, or would take more
than :data:`MAX_CURVE_POINTS` points to flatten is refused by a DrawingError naming
its layer, type and handle. A damaged file that ezdxf's recovering reader mends is
read, and what it mended is kept (``Drawing.repairs``) for the importers to say.
"""

from __future__ import annotations

import io
import itertools
import logging
import math
from collections import Counter
from collections.abc import Iterator, Sequence
from contextlib import contextmanager
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import ezdxf
import numpy as np
from ezdxf import recover
from ezdxf.document import Drawing as DxfDocument
from ezdxf.filemanagement import dxf_stream_info
from ezdxf.lldxf.tagger import binary_tags_loader
from scipy.spatial import cKDTree

from core.errors import DrawingError
from core.io.drawing_units import INSUNITS_SYMBOLS, MAX_DRAWING_COORDINATE, NEGLIGIBLE
from core.io.paths import read_source
from core.notices import Notice

Pt = tuple[float, float]

#: Entity types read as plan geometry.
READ_TYPES = ("LINE", "ARC", "CIRCLE", "LWPOLYLINE", "POLYLINE", "ELLIPSE", "SPLINE")
#: Types that annotate a drawing rather than draw it: not counted as skipped.
ANNOTATION_TYPES = frozenset(
    {"TEXT", "MTEXT", "DIMENSION", "LEADER", "MLEADER", "ATTRIB", "ATTDEF", "POINT", "VIEWPORT"}
)
MAX_BLOCK_DEPTH = 8
#: The most entities model space may hold with its blocks opened up: a small file of
#: blocks inserting each other ten times over, eight deep, would make 10^8 of them.
MAX_ENTITIES = 500_000
#: The most points one entity may be flattened into (as many as an outline may hold).
MAX_CURVE_POINTS = 200_000
#: What ezdxf raises on an entity it cannot make a curve of (a spline of one repeated fit
#: point ends in an IndexError, a damaged vertex list in a TypeError).
_EZDXF_FAILURES = (
    ezdxf.DXFError,
    ValueError,
    ArithmeticError,
    AttributeError,
    IndexError,
    KeyError,
    TypeError,
)
_SPLINE_FRAME_VERTEX = 16  # DXF vertex flag: a spline frame control point, not on the curve


@dataclass(frozen=True, slots=True)
class LayerShapes:
    """What one layer holds, in drawing units.

    ``loops`` are closed (first vertex not repeated), ``chains`` open; ``branches``
    are points where three or more ends met (the joining there is a guess);
    ``skipped`` counts the entities of types not read.
    """

    layer: str
    loops: tuple[tuple[Pt, ...], ...]
    chains: tuple[tuple[Pt, ...], ...]
    branches: tuple[Pt, ...]
    skipped: tuple[tuple[str, int], ...]

    def gap(self) -> tuple[float, Pt, Pt] | None:
        """The shortest distance between two open ends, and the two ends (None: no chain)."""
        ends = [c[0] for c in self.chains] + [c[-1] for c in self.chains]
        if len(ends) < 2:
            return None
        e = np.asarray(ends)
        d = np.hypot(e[:, None, 0] - e[None, :, 0], e[:, None, 1] - e[None, :, 1])
        np.fill_diagonal(d, np.inf)
        i, j = np.unravel_index(int(np.argmin(d)), d.shape)
        return float(d[i, j]), ends[int(i)], ends[int(j)]


class BadEntity(Exception):
    """An entity that cannot be read as plan geometry, and why (words to follow its name,
    as in "a SPLINE (handle 2F) cannot be drawn ..."); :meth:`Drawing.shapes` turns it
    into a DrawingError naming the file and the layer."""


@contextmanager
def _ezdxf_messages() -> Iterator[list[str]]:
    """ezdxf's log messages while reading, collected rather than printed to stderr (its
    recovering reader logs every value it mends)."""
    got: list[str] = []

    class Collect(logging.Handler):
        def emit(self, record: logging.LogRecord) -> None:
            got.append(record.getMessage())

    log = logging.getLogger("ezdxf")
    handler, propagate = Collect(logging.INFO), log.propagate
    log.addHandler(handler)
    log.propagate = False
    try:
        yield got
    finally:
        log.removeHandler(handler)
        log.propagate = propagate


class Drawing:
    """A DXF file opened for its plan geometry (an open file, not a value).

    ``repairs`` lists what ezdxf's recovering reader mended in a damaged file (empty
    for a file read as it is).
    """

    def __init__(self, source: str, doc: Any, repairs: Sequence[str] = ()) -> None:
        self.source = source
        self._doc = doc
        self.repairs = tuple(repairs)
        insunits = doc.header.get("$INSUNITS", 0)
        finite = isinstance(insunits, int | float) and math.isfinite(insunits)
        self.insunits = int(insunits) if finite else 0
        #: The drawing's units as one of ours ("mm", "m", ...), or None when it does not say.
        self.units: str | None = INSUNITS_SYMBOLS.get(self.insunits)
        self._entities: dict[str, list[Any]] = {}
        self._names: dict[str, str] = {}
        for layer in doc.layers:
            self._names.setdefault(layer.dxf.name.upper(), layer.dxf.name)
        count, array = _opened_up_count(doc)
        how = "blocks inserted many times within each other"
        if array is not None:
            name, rows, cols = array
            how += f" or in arrays; the largest: block {name!r}, {rows} x {cols} copies"
        too_many = DrawingError(
            source,
            f"holds more than {MAX_ENTITIES} entities in model space with its blocks "
            f"opened up ({how}); not read",
        )
        if count > MAX_ENTITIES:  # counted before anything is opened up
            raise too_many
        for count, (e, layer) in enumerate(_modelspace(doc), start=1):
            if count > MAX_ENTITIES:
                raise too_many
            name = self._names.setdefault(layer.upper(), layer)
            self._entities.setdefault(name, []).append(e)

    @classmethod
    def open(cls, path: str | Path) -> Drawing:
        """Read a DXF file (at most ``core.io.paths.MAX_SOURCE_BYTES``); raises DrawingError for a
        file that cannot be read, is too large, or is not a readable DXF."""
        p = Path(path)
        data = read_source(p)
        if data.startswith(b"AC10"):
            raise DrawingError(p.name, "is a DWG file; save it as DXF from the drawing program")
        # ezdxf's readers raise more than their documented errors on a damaged file (a
        # header cut short ends in StopIteration), so any failure of theirs is the file's.
        repairs: list[str] = []
        with _ezdxf_messages() as messages:
            try:
                doc = _read_dxf(data)
            except Exception:
                try:  # a damaged file: ezdxf's slower recovering reader mends what it can
                    doc, auditor = recover.read(io.BytesIO(data), errors="replace")
                except Exception as e:
                    raise DrawingError(
                        p.name, f"is not a readable DXF drawing ({_reason(e)})"
                    ) from None
                repairs = list(messages) + [f.message for f in auditor.fixes]
            drawing = cls(p.name, doc, repairs)
        return drawing

    def repair_notice(self) -> Notice | None:
        """A caution that the file was damaged and mended on reading (None: read as it is)."""
        if not self.repairs:
            return None
        n = len(self.repairs)
        first = " ".join(self.repairs[0].split())[:160]
        return Notice(
            "drawing_repaired",
            self.source,
            f"{self.source} is damaged and was read by mending it ({n} repair"
            f"{'s' if n > 1 else ''} reported; the first: {first}). "
            "Check the shapes against the drawing.",
            "caution",
        )

    def layers(self) -> tuple[str, ...]:
        """Layers that hold something in model space, in name order."""
        return tuple(sorted(self._entities, key=str.upper))

    def counts(self, layer: str) -> dict[str, int]:
        """Entities on ``layer`` by type."""
        return dict(Counter(e.dxftype() for e in self._entities[self.layer_name(layer)]))

    def layer_name(self, layer: str) -> str:
        """The layer's name as the drawing spells it (DXF layer names ignore case)."""
        name = self._names.get(layer.upper())
        if name is None or name not in self._entities:
            known = ", ".join(self.layers()) or "none"
            raise DrawingError(
                self.source,
                f"the drawing has no layer {layer!r} with anything on it (layers: {known})",
            )
        return name

    def shapes(self, layer: str, chord_error: float, tolerance: float) -> LayerShapes:
        """The loops and open chains of ``layer``; lengths in drawing units."""
        name = self.layer_name(layer)
        if not (math.isfinite(chord_error) and chord_error > 0):
            raise DrawingError(self.source, f"chord error {chord_error!r} must be positive")
        if not (math.isfinite(tolerance) and tolerance >= 0):
            raise DrawingError(
                self.source, f"join tolerance {tolerance!r} must be zero or positive"
            )
        loops: list[tuple[Pt, ...]] = []
        runs: list[list[Pt]] = []
        skipped: Counter[str] = Counter()
        for e in self._entities[name]:
            try:
                with _ezdxf_messages():
                    got = _flatten(e, chord_error)
            except BadEntity as bad:
                raise DrawingError(self.source, f"{_named(e)} {bad}", layer=name) from None
            if got is None:
                if e.dxftype() not in ANNOTATION_TYPES:
                    skipped[e.dxftype()] += 1
                continue
            pts, closed = got
            pts = _dedupe(pts)
            if closed or (len(pts) > 2 and _dist(pts[0], pts[-1]) <= tolerance):
                if len(pts) > 1 and _dist(pts[0], pts[-1]) <= tolerance:
                    pts = pts[:-1]
                if len(pts) >= 3:
                    loops.append(tuple(pts))
            elif len(pts) >= 2:
                runs.append(pts)
        more, chains, branches = join_runs(runs, tolerance)
        return LayerShapes(
            name,
            tuple(loops + more),
            tuple(chains),
            tuple(branches),
            tuple(sorted(skipped.items())),
        )


def _layer_of(e: Any) -> str:
    """The entity's layer; "0" for one of a type ezdxf does not know (a damaged name), which
    has no layer to ask for, and for a layer name that is not text."""
    try:
        layer = e.dxf.get("layer", "0")
    except _EZDXF_FAILURES:
        return "0"
    return layer if isinstance(layer, str) else "0"


def _grid(e: Any) -> tuple[int, int]:
    """The rows and columns of copies an INSERT places: a MINSERT's array, 1 x 1 for a
    plain insert. Along a direction whose spacing is 0 every copy lies on the first, so
    it places one (as ezdxf's ``Insert.mcount`` counts); a count below 1, or not a whole
    number, is read as 1."""

    def one_way(count_key: str, spacing_key: str) -> int:
        try:
            count = e.dxf.get(count_key, 1)
            spacing = e.dxf.get(spacing_key, 0.0)
        except _EZDXF_FAILURES:
            return 1
        if not isinstance(count, int) or isinstance(count, bool) or count < 1:
            return 1
        if not isinstance(spacing, int | float) or spacing == 0:
            return 1
        return count

    return one_way("row_count", "row_spacing"), one_way("column_count", "column_spacing")


def _opened_up_count(doc: Any) -> tuple[int, tuple[str, int, int] | None]:
    """How many entities :func:`_modelspace` would give, from the block definitions alone
    (opening blocks up with ezdxf takes a fraction of a millisecond an entity), and the
    insert placing the most copies as an array (block name, rows, columns), if any."""
    memo: dict[tuple[str, int], int] = {}
    largest: list[tuple[str, int, int]] = []

    def count(entities: Any, depth: int) -> int:
        total = 0
        for e in entities:
            if e.dxftype() == "INSERT" and depth < MAX_BLOCK_DEPTH:
                name = str(e.dxf.get("name", ""))
                rows, cols = _grid(e)
                if rows * cols > 1 and (not largest or rows * cols > largest[0][1] * largest[0][2]):
                    largest[:] = [(name, rows, cols)]
                total += rows * cols * block(name, depth + 1)
            else:
                total += 1
        return total

    def block(name: str, depth: int) -> int:
        key = (name.upper(), depth)
        if key not in memo:
            memo[key] = 1  # a block inside itself counts once while it is being counted
            layout = doc.blocks.get(name)
            memo[key] = 1 if layout is None else count(layout, depth)
        return memo[key]

    return count(doc.modelspace(), 0), (largest[0] if largest else None)


def _modelspace(doc: Any) -> Iterator[tuple[Any, str]]:
    """Every entity of model space with its layer, blocks opened up."""

    def walk(entities: Any, inherited: str | None, depth: int) -> Iterator[tuple[Any, str]]:
        for e in entities:
            layer = _layer_of(e)
            if inherited is not None and layer == "0":
                layer = inherited
            if e.dxftype() == "INSERT" and depth < MAX_BLOCK_DEPTH:
                try:
                    inner = [x for copy in _copies(e) for x in copy.virtual_entities()]
                except (*_EZDXF_FAILURES, RecursionError):
                    yield e, layer
                    continue
                yield from walk(inner, layer, depth + 1)
            else:
                yield e, layer

    yield from walk(doc.modelspace(), None, 0)


def _copies(e: Any) -> list[Any]:
    """The plain inserts an INSERT stands for: itself, or each copy of a MINSERT's array
    (ezdxf's ``Insert.multi_insert``, of :func:`_grid`'s rows and columns: counted before,
    so never more than the entity limit allows)."""
    rows, cols = _grid(e)
    if rows * cols == 1:
        return [e]  # a plain insert (ezdxf opens up the first copy of an array only)
    grid = e.copy()
    grid.dxf.row_count, grid.dxf.column_count = rows, cols
    return list(grid.multi_insert())


# -- flattening ---------------------------------------------------------------------------


def arc_segments(radius: float, sweep_rad: float, chord_error: float) -> int:
    """Chords needed so that none strays more than ``chord_error`` from the arc.

    A chord over the angle a sits r (1 - cos(a / 2)) inside the arc at its middle, so
    a <= 2 acos(1 - e / r); at least one chord for each quarter turn.

    Raises BadEntity for a radius or angle that is not finite, or an arc that would take
    more than :data:`MAX_CURVE_POINTS` chords.
    """
    if not (math.isfinite(radius) and math.isfinite(sweep_rad)):
        raise BadEntity("has an arc whose radius or angle is not a finite number")
    sweep = abs(sweep_rad)
    if radius <= 0 or sweep == 0:
        return 1
    step = 2.0 * math.acos(max(-1.0, 1.0 - chord_error / radius))
    step = min(step, math.pi / 2)
    if step * MAX_CURVE_POINTS < sweep:  # (a step of 0 too: a radius far beyond the chord error)
        raise BadEntity(
            f"has an arc of radius {radius:.6g} that would take more than "
            f"{MAX_CURVE_POINTS} points to draw within the chord error"
        )
    return max(1, math.ceil(sweep / step - 1e-9))


def arc_points(
    centre: Pt, radius: float, start_rad: float, sweep_rad: float, chord_error: float
) -> list[Pt]:
    """Points on an arc from ``start_rad`` through the signed ``sweep_rad``, both ends included."""
    n = arc_segments(radius, sweep_rad, chord_error)
    t = start_rad + sweep_rad * np.arange(n + 1) / n
    return [
        (centre[0] + radius * math.cos(a), centre[1] + radius * math.sin(a)) for a in t.tolist()
    ]


def bulge_points(p0: Pt, p1: Pt, bulge: float, chord_error: float) -> list[Pt]:
    """The points after ``p0`` up to ``p1`` of a polyline segment with ``bulge``.

    The bulge is tan(a / 4) for the arc's included angle a, positive when the arc runs
    counter-clockwise from p0 to p1 (DXF reference, LWPOLYLINE group code 42).
    """
    dx, dy = p1[0] - p0[0], p1[1] - p0[1]
    c = math.hypot(dx, dy)
    if abs(bulge) < 1e-12 or c == 0:
        return [p1]
    theta = 4.0 * math.atan(bulge)
    radius = c / (2.0 * abs(math.sin(theta / 2.0)))
    h = (c / 2.0) / math.tan(theta / 2.0)  # from the chord's middle to the centre, leftwards
    cx, cy = (p0[0] + p1[0]) / 2 - dy / c * h, (p0[1] + p1[1]) / 2 + dx / c * h
    start = math.atan2(p0[1] - cy, p0[0] - cx)
    pts = arc_points((cx, cy), radius, start, theta, chord_error)[1:]
    pts[-1] = p1
    return pts


def polyline_points(
    vertices: Sequence[Pt], bulges: Sequence[float], closed: bool, chord_error: float
) -> list[Pt]:
    """A polyline with bulges as points; closed ones end on their first vertex again."""
    n = len(vertices)
    if n == 0:
        return []
    out: list[Pt] = [vertices[0]]
    last = n if closed else n - 1
    for i in range(last):
        out += bulge_points(vertices[i], vertices[(i + 1) % n], bulges[i], chord_error)
    return out


def _flat_ocs(e: Any) -> Any | None:
    """The entity's object coordinate system if its plane is the plan (extrusion +-z)."""
    ocs = e.ocs()
    uz = ocs.uz
    return ocs if abs(abs(uz.z) - 1.0) < 1e-9 else None


def _to_wcs(ocs: Any, pts: Sequence[Pt], z: float = 0.0) -> list[Pt]:
    return [(float(v.x), float(v.y)) for v in ocs.points_to_wcs([(x, y, z) for x, y in pts])]


def _flatten(e: Any, chord_error: float) -> tuple[list[Pt], bool] | None:
    """(points in drawing units, closed) for a plan entity; None for one not read.

    Raises BadEntity for an entity whose points are not finite or lie too far out, or
    that would take too many points.
    """
    got = _flatten_points(e, chord_error)
    if got is not None:
        a = np.asarray(got[0], dtype=float).reshape(-1, 2)  # (n, 2)
        if (np.abs(a) < NEGLIGIBLE).any():  # read as zero (see core.io.drawing_units)
            a[np.abs(a) < NEGLIGIBLE] = 0.0
            got = ([(float(x), float(y)) for x, y in a.tolist()], got[1])
        if not np.isfinite(a).all():
            raise BadEntity("has a point that is not a finite number")
        if len(a) and float(np.abs(a).max()) > MAX_DRAWING_COORDINATE:
            raise BadEntity(
                f"has a point farther than {MAX_DRAWING_COORDINATE:g} drawing units from the origin"
            )
    return got


def _named(e: Any) -> str:
    """'the LINE (handle 2F)' for a message."""
    handle = e.dxf.get("handle")
    return f"the {e.dxftype()}" + (f" (handle {handle})" if handle else "")


def _curve_points(e: Any, chord_error: float) -> list[Pt]:
    """An ellipse's or spline's points by ezdxf's flattening, bounded: its subdivision
    recurses without end on a degenerate curve (a NaN distance is never small enough)
    and takes ever more points on one far larger than the chord error."""
    try:
        got = list(itertools.islice(e.flattening(chord_error), MAX_CURVE_POINTS + 1))
    except RecursionError:
        raise BadEntity("cannot be drawn: its defining points are degenerate") from None
    if len(got) > MAX_CURVE_POINTS:
        raise BadEntity(
            f"would take more than {MAX_CURVE_POINTS} points to draw within the chord error"
        )
    return [(float(v.x), float(v.y)) for v in got]


def _flatten_points(e: Any, chord_error: float) -> tuple[list[Pt], bool] | None:
    kind = e.dxftype()
    try:
        if kind == "LINE":
            s, t = e.dxf.start, e.dxf.end
            return [(float(s.x), float(s.y)), (float(t.x), float(t.y))], False
        if kind in ("ARC", "CIRCLE"):
            ocs = _flat_ocs(e)
            if ocs is None:
                return None
            c, r = e.dxf.center, float(e.dxf.radius)
            if kind == "CIRCLE":
                pts = arc_points((c.x, c.y), r, 0.0, 2 * math.pi, chord_error)[:-1]
                return _to_wcs(ocs, pts, c.z), True
            a0 = math.radians(e.dxf.start_angle)
            sweep = math.radians((e.dxf.end_angle - e.dxf.start_angle) % 360.0) or 2 * math.pi
            return _to_wcs(ocs, arc_points((c.x, c.y), r, a0, sweep, chord_error), c.z), False
        if kind == "LWPOLYLINE":
            ocs = _flat_ocs(e)
            if ocs is None:
                return None
            xyb = list(e.get_points("xyb"))
            verts = [(float(x), float(y)) for x, y, _b in xyb]
            bulges = [float(b) for _x, _y, b in xyb]
            pts = polyline_points(verts, bulges, bool(e.closed), chord_error)
            return _to_wcs(ocs, pts, float(e.dxf.elevation)), bool(e.closed)
        if kind == "POLYLINE":
            return _polyline(e, chord_error)
        if kind in ("ELLIPSE", "SPLINE"):
            pts = _curve_points(e, chord_error)
            closed = len(pts) > 2 and _dist(pts[0], pts[-1]) <= 1e-9 * (1 + _extent(pts))
            if kind == "SPLINE":
                closed = closed or bool(e.closed)
            if closed and len(pts) > 1 and _dist(pts[0], pts[-1]) <= 1e-9 * (1 + _extent(pts)):
                pts = pts[:-1]
            return pts, closed
    except _EZDXF_FAILURES:  # a damaged entity ezdxf cannot make a curve of: not read
        return None
    return None


def _polyline(e: Any, chord_error: float) -> tuple[list[Pt], bool] | None:
    if e.is_2d_polyline:
        ocs = _flat_ocs(e)
        if ocs is None:
            return None
        vs = [v for v in e.vertices if not (v.dxf.flags & _SPLINE_FRAME_VERTEX)]
        verts = [(float(v.dxf.location.x), float(v.dxf.location.y)) for v in vs]
        bulges = [float(v.dxf.get("bulge", 0.0)) for v in vs]
        z = float(e.dxf.elevation.z) if e.dxf.hasattr("elevation") else 0.0
        pts = polyline_points(verts, bulges, e.is_closed, chord_error)
        return _to_wcs(ocs, pts, z), bool(e.is_closed)
    if e.is_3d_polyline:
        pts = [(float(v.dxf.location.x), float(v.dxf.location.y)) for v in e.vertices]
        if e.is_closed and pts:
            pts.append(pts[0])
        return pts, bool(e.is_closed)
    return None  # polyface and polygon meshes are not plan outlines


def _dist(a: Pt, b: Pt) -> float:
    return math.hypot(a[0] - b[0], a[1] - b[1])


def _extent(pts: Sequence[Pt]) -> float:
    a = np.asarray(pts)
    return float(np.ptp(a, axis=0).max()) if len(a) else 0.0


def _dedupe(pts: list[Pt]) -> list[Pt]:
    """Without repeats of the previous point (zero-length chords)."""
    out: list[Pt] = []
    for p in pts:
        if not out or p != out[-1]:
            out.append(p)
    return out


# -- joining ------------------------------------------------------------------------------


def join_runs(
    runs: Sequence[Sequence[Pt]], tolerance: float
) -> tuple[list[tuple[Pt, ...]], list[tuple[Pt, ...]], list[Pt]]:
    """Join open runs whose ends meet within ``tolerance``: (loops, open chains, branch points).

    From each run not yet used, the chain grows at its end by the nearest free end
    of another run within the tolerance (turned round if need be), closing into a loop
    as soon as its end comes back to its start; then it grows at its start the same way.
    Where three or more ends meet, the nearest is taken and the point is reported.
    """
    n = len(runs)
    if n == 0:
        return [], [], []
    ends = np.array([r[0] for r in runs] + [r[-1] for r in runs], dtype=float)  # (2n, 2)
    tree = cKDTree(ends)
    used = np.zeros(n, dtype=bool)
    branches: list[Pt] = []
    for k, near in enumerate(tree.query_ball_point(ends, tolerance)):
        if len({j % n for j in near} - {k % n}) >= 2:
            p = (float(ends[k, 0]), float(ends[k, 1]))
            if all(_dist(p, b) > tolerance for b in branches):
                branches.append(p)

    def grow(pts: list[Pt]) -> bool:
        """Extend ``pts`` at its end; True when it closed into a loop."""
        while True:
            if len(pts) >= 3 and _dist(pts[-1], pts[0]) <= tolerance:
                return True
            best, best_d = -1, math.inf
            for j in tree.query_ball_point(pts[-1], tolerance):
                if used[j % n]:
                    continue
                d = _dist(pts[-1], (ends[j, 0], ends[j, 1]))
                if d < best_d:
                    best, best_d = j, d
            if best < 0:
                return False
            r = best % n
            used[r] = True
            seg = list(runs[r]) if best < n else list(reversed(runs[r]))
            pts.extend(seg[1:])

    loops: list[tuple[Pt, ...]] = []
    chains: list[tuple[Pt, ...]] = []
    for i in range(n):
        if used[i]:
            continue
        used[i] = True
        pts = list(runs[i])
        closed = grow(pts)
        if not closed:
            pts.reverse()
            closed = grow(pts)
            pts.reverse()  # back to the way the first run was drawn
        if closed:
            loop = _dedupe(pts[:-1])
            if len(loop) >= 3:
                loops.append(tuple(loop))
        else:
            chains.append(tuple(pts))
    return loops, chains, branches


_BINARY_DXF = b"AutoCAD Binary DXF\r\n\x1a\x00"


def _read_dxf(data: bytes) -> Any:
    """An ezdxf document from a DXF file's bytes, binary or text, as ``ezdxf.readfile``
    reads a file: a text file's encoding is the one its header names."""
    if data.startswith(_BINARY_DXF):
        return DxfDocument.load(binary_tags_loader(data, errors="replace"))
    info = dxf_stream_info(io.StringIO(data.decode("utf-8", errors="ignore")))
    return ezdxf.read(io.StringIO(data.decode(info.encoding, errors="replace")))


def _reason(e: Exception) -> str:
    """ezdxf's complaint in one line, or the kind of failure when it says nothing."""
    text = str(e).strip().splitlines()
    return text[0] if text else f"{type(e).__name__} while reading"
