"""Plan-view outlines: validation and the parametric shapes.

An outline is a closed polygon in the hull frame (x forward, y to port), given as
its vertices without repeating the first. Validation returns the vertices
counter-clockwise; clockwise input is reversed, never refused.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence

import numpy as np
import shapely

from core.errors import InputError, OutlineError
from core.model.rules import COORDINATE, MAX_OUTLINE_VERTICES

Vertex = tuple[float, float]
Outline = tuple[Vertex, ...]


def signed_area(vertices: np.ndarray) -> float:
    """Shoelace area of a closed polygon, positive when counter-clockwise. vertices: (n, 2)."""
    x, y = vertices[:, 0], vertices[:, 1]
    return 0.5 * float(np.dot(x, np.roll(y, -1)) - np.dot(np.roll(x, -1), y))


def validate_outline(points: Iterable[Sequence[float]], name: str = "outline") -> Outline:
    """Check an outline and return its vertices counter-clockwise.

    Raises
    ------
    OutlineError
        A vertex that is not a pair of finite numbers, one farther than
        :data:`core.model.rules.MAX_COORDINATE_M` from the origin, more than
        :data:`core.model.rules.MAX_OUTLINE_VERTICES` vertices, fewer than three distinct
        vertices, a self-crossing outline (naming the two edges), or zero area.
    """
    raw = _vertices(points, name)  # (n, 2), finite, within range
    # Drop repeats of the previous vertex and a closing repeat of the first.
    if len(raw):
        keep = np.ones(len(raw), dtype=bool)
        keep[1:] = np.any(raw[1:] != raw[:-1], axis=1)
        raw = raw[keep]
    if len(raw) > 1 and np.array_equal(raw[0], raw[-1]):
        raw = raw[:-1]
    distinct = _distinct_up_to_three(raw)
    if distinct < 3:
        raise OutlineError(f"needs at least three distinct vertices, has {distinct}", outline=name)
    v = raw + 0.0  # + 0.0 turns -0.0 into 0.0
    span = float(np.ptp(v, axis=0).max())
    centred = v - v.mean(axis=0)
    if np.linalg.svd(centred, compute_uv=False)[-1] <= 1e-9 * span * math.sqrt(len(v)):
        raise OutlineError("has zero area (all vertices on one line)", outline=name)
    crossing = first_crossing(v)
    if crossing is not None:
        i, j = crossing
        n = len(v)
        raise OutlineError(
            f"crosses itself: edge {i} (vertex {i} to {(i + 1) % n}) meets "
            f"edge {j} (vertex {j} to {(j + 1) % n})",
            outline=name,
            vertex=j,
            segments=(i, j),
        )
    area = signed_area(v)
    if abs(area) <= 1e-12 * span * span:
        raise OutlineError("has zero area (all vertices on one line)", outline=name)
    if area < 0:
        v = v[::-1]
    return tuple(map(tuple, v.tolist()))  # type: ignore[arg-type]


def _distinct_up_to_three(v: np.ndarray) -> int:
    """How many distinct vertices (n, 2) there are, counting no further than three."""
    if not len(v):
        return 0
    other = np.any(v != v[0], axis=1)
    if not other.any():
        return 1
    second = v[int(np.argmax(other))]
    return 3 if bool((other & np.any(v != second, axis=1)).any()) else 2


def _vertices(points: Iterable[Sequence[float]], name: str) -> np.ndarray:
    """(n, 2) the vertices as floats, each finite and within the coordinate range.

    Arrays and sequences of number pairs are converted at once; anything else (or a
    problem) is read vertex by vertex to name the first bad one.
    """
    if not isinstance(points, np.ndarray | list | tuple):
        points = list(points)
    if len(points) > MAX_OUTLINE_VERTICES:
        raise OutlineError(
            f"has more than {MAX_OUTLINE_VERTICES} vertices",
            outline=name,
            vertex=MAX_OUTLINE_VERTICES,
        )
    try:
        v = np.array(points, dtype=float)
    except (TypeError, ValueError, OverflowError):
        v = None
    if (
        v is not None
        and v.ndim == 2
        and v.shape[1] == 2
        and bool(np.isfinite(v).all())
        and float(np.abs(v).max(initial=0.0)) <= COORDINATE.high
    ):
        return v
    if v is not None and v.size == 0:
        return np.zeros((0, 2))
    for i, p in enumerate(points):  # find the first bad vertex and say what is wrong
        try:
            x, y = (float(c) for c in p)
        except (TypeError, ValueError, OverflowError):
            raise OutlineError(
                f"vertex {i} is not a pair of numbers: {_short(p)}", outline=name, vertex=i
            ) from None
        if not (math.isfinite(x) and math.isfinite(y)):
            raise OutlineError(f"vertex {i} is not finite: ({x}, {y})", outline=name, vertex=i)
        if not (COORDINATE.holds(x) and COORDINATE.holds(y)):
            raise OutlineError(
                f"vertex {i} ({x:g}, {y:g}) is farther than {COORDINATE.high:g} m from the origin",
                outline=name,
                vertex=i,
            )
    raise OutlineError("is not a list of (x, y) vertices", outline=name)  # a ragged array


def _short(value: object) -> str:
    text = repr(value)
    return text if len(text) <= 40 else f"{text[:37]}..."


def first_crossing(v: np.ndarray) -> tuple[int, int] | None:
    """The first pair of edges (i < j) of a closed polygon that touch where they should not.

    Non-adjacent edges must not touch at all; adjacent edges must not fold back
    onto each other. v: (n, 2) vertices; edge i runs from v[i] to v[i + 1].

    Only pairs of edges whose bounding boxes overlap can touch: a sweep line over the
    edges' boxes finds those pairs (:func:`box_pairs`), so an outline of n vertices costs
    about n log n, not n^2; each candidate pair is then tested exactly.
    """
    n = len(v)
    a, b = v, np.roll(v, -1, axis=0)  # (n, 2) edge starts and ends
    scale = float(np.abs(v).max()) or 1.0
    pad = 1e-12 * scale  # the tolerance the touch test allows, on every side of a box
    i_idx, j_idx = box_pairs(np.minimum(a, b) - pad, np.maximum(a, b) + pad)
    order = np.lexsort((j_idx, i_idx))  # first by i, then by j, as a scan of the pairs would
    bad = _touching(a, b, scale, i_idx[order], j_idx[order], n)
    hits = np.flatnonzero(bad)
    if hits.size == 0:
        return None
    k = int(order[hits[0]])
    return int(i_idx[k]), int(j_idx[k])


def box_pairs(lo: np.ndarray, hi: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Every pair (i < j) of boxes that overlap (touching counts), by a sweep line.

    lo, hi: (n, 2) lower and upper corners. The boxes are swept along whichever axis
    gives fewer candidate pairs (boxes whose spans overlap on that axis); the candidates
    are then kept where they overlap on the other axis too. Should the spans overlap
    wholesale on both axes (a comb of long parallel edges), shapely's STRtree finds the
    pairs instead, so the work stays near n log n plus the pairs found.
    """
    n = len(lo)
    best = None
    for axis in (0, 1):
        order = np.argsort(lo[:, axis], kind="stable")
        end = np.searchsorted(lo[order, axis], hi[order, axis], side="right")
        counts = end - np.arange(n) - 1  # boxes starting within this one's span, after it
        total = int(counts.sum())
        if best is None or total < best[0]:
            best = (total, axis, order, counts)
    assert best is not None
    total, axis, order, counts = best
    if total > 32 * n + 100_000:
        boxes = shapely.box(lo[:, 0], lo[:, 1], hi[:, 0], hi[:, 1])
        i, j = shapely.STRtree(boxes).query(boxes)  # envelopes of boxes meet = boxes meet
        keep = i < j
        return i[keep], j[keep]
    first = np.repeat(np.arange(n), counts)  # (total,) sorted positions
    starts = np.repeat(np.cumsum(counts) - counts, counts)
    second = first + 1 + (np.arange(total) - starts)
    i, j = order[first], order[second]
    other = 1 - axis
    keep = (lo[i, other] <= hi[j, other]) & (lo[j, other] <= hi[i, other])
    i, j = i[keep], j[keep]
    return np.minimum(i, j), np.maximum(i, j)


def _touching(
    a: np.ndarray, b: np.ndarray, scale: float, i_idx: np.ndarray, j_idx: np.ndarray, n: int
) -> np.ndarray:
    """(m,) whether edge i_idx[k] and edge j_idx[k] (i < j) touch where they should not."""
    d = b - a
    eps = 1e-12 * scale * scale

    def orient(p: np.ndarray, q: np.ndarray, r: np.ndarray) -> np.ndarray:
        val = (q[..., 0] - p[..., 0]) * (r[..., 1] - p[..., 1]) - (q[..., 1] - p[..., 1]) * (
            r[..., 0] - p[..., 0]
        )
        return np.where(np.abs(val) <= eps, 0.0, np.sign(val))

    def on_seg(p: np.ndarray, q: np.ndarray, r: np.ndarray) -> np.ndarray:
        # r lies within the bounding box of p-q (used only when collinear)
        return (
            (np.minimum(p[..., 0], q[..., 0]) - 1e-12 * scale <= r[..., 0])
            & (r[..., 0] <= np.maximum(p[..., 0], q[..., 0]) + 1e-12 * scale)
            & (np.minimum(p[..., 1], q[..., 1]) - 1e-12 * scale <= r[..., 1])
            & (r[..., 1] <= np.maximum(p[..., 1], q[..., 1]) + 1e-12 * scale)
        )

    adjacent = (j_idx == i_idx + 1) | ((i_idx == 0) & (j_idx == n - 1))
    bad = np.zeros(len(i_idx), dtype=bool)
    # Adjacent edges share a vertex; they are wrong only when they fold back (collinear, opposite).
    ai, aj = i_idx[adjacent], j_idx[adjacent]
    cross = d[ai, 0] * d[aj, 1] - d[ai, 1] * d[aj, 0]
    dot = np.einsum("ij,ij->i", d[ai], d[aj])
    bad[adjacent] = (np.abs(cross) <= eps) & (dot < 0)
    # Other edges must not touch at all.
    others = ~adjacent
    oi, oj = i_idx[others], j_idx[others]
    p1, p2, q1, q2 = a[oi], b[oi], a[oj], b[oj]
    o1, o2 = orient(p1, p2, q1), orient(p1, p2, q2)
    o3, o4 = orient(q1, q2, p1), orient(q1, q2, p2)
    bad[others] = ((o1 * o2 < 0) & (o3 * o4 < 0)) | (
        ((o1 == 0) & on_seg(p1, p2, q1))
        | ((o2 == 0) & on_seg(p1, p2, q2))
        | ((o3 == 0) & on_seg(q1, q2, p1))
        | ((o4 == 0) & on_seg(q1, q2, p2))
    )
    return bad


def _positive(name: str, value: float) -> float:
    value = float(value)
    if not math.isfinite(value) or value <= 0:
        raise InputError(name, value, "must be a positive finite number")
    return value


def box_outline(length_m: float, beam_m: float) -> Outline:
    """A box barge: rectangle from the aft end (x = 0) to the bow, centred on the centreline."""
    length_m, beam_m = _positive("length", length_m), _positive("beam", beam_m)
    h = beam_m / 2
    return ((0.0, -h), (length_m, -h), (length_m, h), (0.0, h))


def raked_outline(
    length_m: float,
    beam_m: float,
    bow_rake_m: float = 0.0,
    stern_rake_m: float = 0.0,
    end_beam_fraction: float = 0.7,
) -> Outline:
    """A barge whose raked ends narrow in plan over the rake lengths.

    The parallel body keeps the full beam; over ``bow_rake_m`` (and ``stern_rake_m``)
    the sides run straight in to an end of ``end_beam_fraction`` of the beam.
    A rake length of zero gives a square end.
    """
    length_m, beam_m = _positive("length", length_m), _positive("beam", beam_m)
    bow_rake_m, stern_rake_m = float(bow_rake_m), float(stern_rake_m)
    for field, value in (("bow rake", bow_rake_m), ("stern rake", stern_rake_m)):
        if not math.isfinite(value) or value < 0:
            raise InputError(field, value, "must be zero or a positive length")
    if bow_rake_m + stern_rake_m >= length_m:
        raise InputError(
            "bow rake + stern rake",
            bow_rake_m + stern_rake_m,
            f"must be less than the length {length_m}",
        )
    if not 0 < end_beam_fraction <= 1:
        raise InputError("end beam fraction", end_beam_fraction, "must be above 0 and at most 1")
    h, e = beam_m / 2, beam_m / 2 * end_beam_fraction
    pts: list[Vertex] = []
    pts += [(0.0, -e), (stern_rake_m, -h)] if stern_rake_m > 0 else [(0.0, -h)]
    pts += [(length_m - bow_rake_m, -h), (length_m, -e)] if bow_rake_m > 0 else [(length_m, -h)]
    pts += [(length_m, e), (length_m - bow_rake_m, h)] if bow_rake_m > 0 else [(length_m, h)]
    pts += [(stern_rake_m, h), (0.0, e)] if stern_rake_m > 0 else [(0.0, h)]
    return validate_outline(pts, "raked outline")


#: Exponent of the half-breadth curve y = B/2 * (1 - xi^p)^q over the bow, xi = 0 at the
#: shoulder and 1 at the stem; larger q is finer.
BOW_SHAPES: dict[str, tuple[float, float]] = {
    "fine": (2.0, 1.0),
    "normal": (2.0, 0.7),
    "full": (2.0, 0.5),
}
STERN_SHAPES = ("transom", "round")


def ship_outline(
    length_m: float,
    beam_m: float,
    parallel_length_m: float,
    bow_shape: str = "normal",
    stern_shape: str = "transom",
    points_per_end: int = 16,
) -> Outline:
    """A ship-shaped outline: a parallel body at full beam, a bow and a stern.

    Of the length outside the parallel body, 60 % is fore-body and 40 % after-body.
    ``bow_shape`` is fine, normal or full; ``stern_shape`` is transom (a flat stern of
    60 % of the beam) or round.
    """
    length_m, beam_m = _positive("length", length_m), _positive("beam", beam_m)
    if not math.isfinite(parallel_length_m) or not 0 <= parallel_length_m < length_m:
        raise InputError(
            "parallel body length", parallel_length_m, f"must be from 0 to below {length_m}"
        )
    if bow_shape not in BOW_SHAPES:
        raise InputError("bow shape", bow_shape, f"is not one of {', '.join(BOW_SHAPES)}")
    if stern_shape not in STERN_SHAPES:
        raise InputError("stern shape", stern_shape, f"is not one of {', '.join(STERN_SHAPES)}")
    h = beam_m / 2
    rest = length_m - parallel_length_m
    x_aft_shoulder = 0.4 * rest
    x_fwd_shoulder = x_aft_shoulder + parallel_length_m
    fore = length_m - x_fwd_shoulder
    p, q = BOW_SHAPES[bow_shape]
    xi = np.linspace(0.0, 1.0, points_per_end + 1)
    bow_y = h * (1.0 - xi**p) ** q
    bow = [(x_fwd_shoulder + fore * t, float(yy)) for t, yy in zip(xi, bow_y, strict=True)]
    # Stern from the aft shoulder (xi = 0) to x = 0 (xi = 1).
    if stern_shape == "transom":
        w = 0.6 * h
        stern_y = w + (h - w) * (1.0 - xi**2)
    else:
        stern_y = h * np.sqrt(np.clip(1.0 - xi**2, 0.0, None))
    stern = [(x_aft_shoulder * (1.0 - t), float(yy)) for t, yy in zip(xi, stern_y, strict=True)]
    # Starboard side aft -> forward, stem, port side forward -> aft.
    starboard = [(x, -y) for x, y in reversed(stern)] + [(x, -y) for x, y in bow]
    port = [(x, y) for x, y in reversed(bow)] + list(stern)
    pts = starboard[:-1] + port  # the stem point (y = 0) once
    if stern_shape == "round":
        pts = pts[:-1]  # the stern point (0, 0) is the first vertex already
    return validate_outline(pts, "ship outline")
