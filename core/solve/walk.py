"""Where rays leave the fleet's wrench set, exactly, by walking from a triangle inside it.

The half-spaces of core.solve.polytope give every ray's exit at once, but their number
grows with the square of the polygons' edges: fine working sectors make that costly.
So the sweep is first made on coarse polygons (every vertex of which is a vertex of the
fine ones, so the coarse set lies inside the fine one), and each ray's answer is then
carried to the fine set by a walk over triangles:

A triangle of points of the set that the ray's line pierces lies inside the set, so the
ray leaves no earlier than where it crosses the triangle. Take the triangle's outward
normal n and the set's farthest point v in that direction (its support point: each
tug's farthest polygon vertex, summed). If v is no farther out than the triangle, the
triangle lies on a face of the set and the crossing is the exit. Otherwise the ray
leaves the tetrahedron of the triangle and v through one of its three new faces, which
becomes the triangle: the crossing moves out along the ray at every step, and since the
set has finitely many faces the walk ends (a simplex method on three rows, in pictures).
The first triangle comes from the coarse sweep's exit face.
"""

from __future__ import annotations

import numpy as np

from core.solve.polytope import Facets, WrenchPolygons

_GAP = 1e-12  # scaled units: a support point this close to the triangle's plane is on it
_MAX_STEPS = 200


class SupportTable:
    """The tugs' polygons ready for support look-ups, all tugs at once.

    Segments (a lead as set) are scored directly. Each polygon's outward edge normals
    have increasing angles counter-clockwise, vertex j lying between the normals of
    edges j - 1 and j, so its farthest vertex in any direction is found by a binary
    search; the angles of every polygon are kept in one sorted array, tug by tug (each
    tug's shifted by 8 rad past the one before), for one search for all tugs.
    """

    def __init__(self, shapes: WrenchPolygons) -> None:
        self.shapes = shapes
        seg, poly = [], []
        for i, p in enumerate(shapes.polygons):
            if len(p) >= 3:
                poly.append(i)
            elif len(p):
                seg.append(i)
        self.seg = np.array(seg, dtype=int)
        far = [shapes.polygons[i][np.argmax(np.hypot(*shapes.polygons[i].T))] for i in seg]
        self.seg_v = np.array(far).reshape(-1, 2)  # (S, 2)
        self.poly = np.array(poly, dtype=int)
        keys, verts, first, offset, size = [], [], [], [], []
        at = 0
        for t, i in enumerate(poly):
            p = shapes.polygons[i]
            e = np.roll(p, -1, axis=0) - p
            theta = np.arctan2(-e[:, 0], e[:, 1])  # outward normal (e_y, -e_x)
            k0 = int(np.argmin(theta))
            keys.append(np.roll(theta, -k0) + 8.0 * t)
            verts.append(p)
            first.append(k0)
            offset.append(at)
            size.append(len(p))
            at += len(p)
        self.keys = np.concatenate(keys) if keys else np.zeros(0)
        self.verts = np.vstack(verts) if verts else np.zeros((0, 2))
        self.first = np.array(first, dtype=int)
        self.offset = np.array(offset, dtype=int)
        self.size = np.array(size, dtype=int)


def supports(
    table: SupportTable | WrenchPolygons, normals: np.ndarray, lost: np.ndarray | None = None
) -> tuple[np.ndarray, np.ndarray]:
    """Support points (R, 3) of the fleet's set in each direction (R, 3), leaving out tug
    ``lost[r]`` for ray r (-1: none), and (R, n) the vertex each tug gives (-1: nothing)."""
    if isinstance(table, WrenchPolygons):
        table = SupportTable(table)
    shapes = table.shapes
    r = len(normals)
    total = np.zeros((r, 3))
    which = np.full((r, shapes.n), -1)
    for tugs, kind in ((table.seg, "seg"), (table.poly, "poly")):
        if not len(tugs):
            continue
        arms = shapes.arms[tugs]  # (T, 2)
        px = normals[:, :1] - arms[:, 1] * normals[:, 2:3]  # (R, T)
        py = normals[:, 1:2] + arms[:, 0] * normals[:, 2:3]
        if kind == "seg":
            fx = np.broadcast_to(table.seg_v[:, 0], px.shape)
            fy = np.broadcast_to(table.seg_v[:, 1], px.shape)
            k = np.ones(px.shape, dtype=int)
        else:
            key = np.arctan2(py, px) + 8.0 * np.arange(len(tugs))
            t = np.searchsorted(table.keys, key) - table.offset
            k = (table.first + t) % table.size
            v = table.verts[table.offset + k]  # (R, T, 2)
            fx, fy = v[..., 0], v[..., 1]
        gives = px * fx + py * fy > 0
        if lost is not None:
            gives &= lost[:, None] != tugs
        fx, fy = fx * gives, fy * gives
        total[:, 0] += fx.sum(axis=1)
        total[:, 1] += fy.sum(axis=1)
        total[:, 2] += (arms[:, 0] * fy - arms[:, 1] * fx).sum(axis=1)
        which[:, tugs] = np.where(gives, k, -1)
    return total, which


#: How far each line is moved sideways, as a share of the set's size.
NUDGE = 1e-9


def set_size(shapes: WrenchPolygons) -> float:
    """The largest coordinate of any tug's polygon (for :func:`nudge`)."""
    return max((float(np.abs(p).max()) for p in shapes.polygons if len(p)), default=1.0)


def nudge(rays: np.ndarray, size: float) -> np.ndarray:
    """(R, 3) small offsets square to each ray (R, 3), all made the same way, so that no
    line runs exactly through an edge or a corner of the set."""
    d = rays / np.maximum(np.sqrt(_dot(rays, rays)), 1e-300)[:, None]
    w = np.array([0.5773502691896257, 0.6123724356957945, 0.5400617248673217])
    side = w[None, :] - _dot(d, np.broadcast_to(w, d.shape))[:, None] * d
    other = _cross(d, side)
    off = 0.8 * side + 0.6 * other
    size_off = np.sqrt(_dot(off, off))
    return off / np.maximum(size_off, 1e-300)[:, None] * (NUDGE * size)


def _cross(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Row-wise cross products of (R, 3) arrays."""
    return np.column_stack(
        [
            a[:, 1] * b[:, 2] - a[:, 2] * b[:, 1],
            a[:, 2] * b[:, 0] - a[:, 0] * b[:, 2],
            a[:, 0] * b[:, 1] - a[:, 1] * b[:, 0],
        ]
    )


def _dot(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    return a[:, 0] * b[:, 0] + a[:, 1] * b[:, 1] + a[:, 2] * b[:, 2]


def _crossing(
    p0: np.ndarray, p1: np.ndarray, p2: np.ndarray, start: np.ndarray, d: np.ndarray
) -> tuple[np.ndarray, np.ndarray]:
    """Where each line start + s d crosses the plane of triangle (p0, p1, p2): (s (R,),
    barycentric coordinates (R, 3)); nan where the line runs along the plane."""
    # Triangles of a hostile plan can be tiny or huge: what overflows is a line along
    # the plane as far as the walk is concerned (nan), not a warning.
    with np.errstate(over="ignore", invalid="ignore", divide="ignore"):
        e1, e2 = p1 - p0, p2 - p0
        h = _cross(d, e2)
        a = _dot(e1, h)
        scale = np.sqrt(_dot(e1, e1) * _dot(e2, e2) * _dot(d, d))
        bad = ~(np.abs(a) > 1e-14 * np.maximum(scale, 1e-300))
        f = 1.0 / np.where(bad, 1.0, a)
        f[bad | ~np.isfinite(f)] = np.nan
        sv = start - p0
        u = f * _dot(sv, h)
        q = _cross(sv, e1)
        v = f * _dot(d, q)
        s = f * _dot(e2, q)
        bary = np.column_stack([1.0 - u - v, u, v])
    lost = ~(np.isfinite(s) & np.isfinite(bary).all(axis=1))
    s[lost] = np.nan
    bary[lost] = np.nan
    return s, bary


def walk(
    shapes: WrenchPolygons,
    start: np.ndarray,
    rays: np.ndarray,
    triangles: np.ndarray,
    lost: np.ndarray | None = None,
    shift: np.ndarray | None = None,
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Carry each ray's crossing of its triangle out to the set's face.

    start, rays: (R, 3); triangles: (R, 3, 3) points of the set whose planes the rays'
    lines cross inside them (moved by ``shift``, default :func:`nudge`'s). Returns (s (R,)
    where each ray leaves, unit normal (R, 3)
    of the face it leaves through, done (R,) False where the walk had to stop early:
    there s is still a point inside the set, a lower bound).
    """
    table = SupportTable(shapes)
    tri = triangles.copy()
    r = len(rays)
    s = np.full(r, np.nan)
    normal = np.zeros((r, 3))
    done = np.zeros(r, dtype=bool)
    active = np.flatnonzero(np.isfinite(tri).all(axis=(1, 2)))
    # A line through an edge or a corner of a triangle leaves the walk no way on: each line
    # is moved a hair sideways (square to itself, the same way for every ray), and the
    # answer is read off the face it ends on for the line as given.
    if shift is None:
        shift = nudge(rays, float(np.abs(triangles[np.isfinite(triangles)]).max(initial=1.0)))
    moved = start + shift
    for _ in range(_MAX_STEPS):
        if not len(active):
            break
        a, b, c = tri[active, 0], tri[active, 1], tri[active, 2]
        d, st = rays[active], moved[active]
        n = _cross(b - a, c - a)
        size = np.sqrt(_dot(n, n))
        ab = b - a
        flat = size <= 1e-14 * np.maximum(_dot(ab, ab), 1e-300)
        n = n / np.where(flat, 1.0, size)[:, None]
        n *= np.where(_dot(n, d) < 0, -1.0, 1.0)[:, None]
        s_now, _ = _crossing(a, b, c, st, d)
        # where the line as given crosses the triangle's plane (the nudged one is inside)
        nd = _dot(n, d)
        s_given = np.where(nd > 0, _dot(n, a - start[active]) / np.where(nd > 0, nd, 1.0), np.nan)
        s[active] = np.where(np.isfinite(s_given), s_given, s[active])
        normal[active] = n
        v, _ = supports(table, n, None if lost is None else lost[active])
        gap = _dot(n, v - a)
        on_face = gap <= _GAP * (1.0 + np.abs(a).max(axis=1))
        stop = flat | on_face | ~np.isfinite(s_now)
        done[active[on_face & ~flat]] = True
        go = ~stop
        if not go.any():
            break
        idx = active[go]
        a, b, c, v, d, st = a[go], b[go], c[go], v[go], d[go], st[go]
        m = len(idx)
        # the three faces of the tetrahedron (a, b, c, v) that hold v, stacked
        p0 = np.concatenate([v, a, a])
        p1 = np.concatenate([b, v, b])
        p2 = np.concatenate([c, c, v])
        sk, bary = _crossing(p0, p1, p2, np.tile(st, (3, 1)), np.tile(d, (3, 1)))
        # the line leaves the tetrahedron through the face it crosses farthest out (a
        # line through an edge crosses two faces there: the farther one is the way on)
        holds = np.isfinite(sk) & (bary.min(axis=1) >= -1e-9)
        score = np.where(holds, sk, -np.inf).reshape(3, m)
        pick = score.argmax(axis=0)
        ok = np.isfinite(score[pick, np.arange(m)])
        rows = pick * m + np.arange(m)
        new = np.stack([p0[rows], p1[rows], p2[rows]], axis=1)
        tri[idx[ok]] = new[ok]
        active = idx[ok]
    return s, normal, done


def facet_triangles(
    coarse: WrenchPolygons,
    fac: Facets,
    facet: np.ndarray,
    start: np.ndarray,
    rays: np.ndarray,
    s: np.ndarray,
    lost: np.ndarray | None = None,
    shift: np.ndarray | None = None,
) -> tuple[np.ndarray, np.ndarray]:
    """A triangle on each ray's exit face of the coarse set that holds the exit point:
    (R, 3, 3) and (R,) ok (False where the face cannot be made: there the coarse answer
    stands). With ``shift`` (R, 3), the triangle holds where the line moved by it (the
    walk's nudge) crosses the face instead; see :func:`nudged_triangles`."""
    r = len(rays)
    tri = np.zeros((r, 3, 3))
    ok = np.zeros(r, dtype=bool)
    has = (facet >= 0) & np.isfinite(s)
    if not has.any():
        return tri, ok
    rows = np.flatnonzero(has)
    f = facet[rows]
    n = fac.normals[f]
    lost_r = None if lost is None else lost[rows]
    total, which = supports(SupportTable(coarse), n, lost_r)
    x = start[rows] + s[rows, None] * rays[rows]
    if shift is not None:  # where the moved line crosses the face's plane
        w, d = shift[rows], rays[rows]
        along = _dot(n, w) / np.where(np.abs(_dot(n, d)) > 0, _dot(n, d), 1.0)
        x = x + w - along[:, None] * d
    ea, eb = fac.edge_a[f], fac.edge_b[f]
    pair = (ea >= 0) & (eb >= 0)
    if pair.any():
        sub = _pair_triangles(coarse, fac, rows[pair], ea[pair], eb[pair], total[pair],
                              which[pair], x[pair], None if lost_r is None else lost_r[pair])  # fmt: skip
        tri[rows[pair]], ok[rows[pair]] = sub
    pt = fac.plane_tug[f]
    plane = pt >= 0
    if plane.any():
        sub = _plane_triangles(coarse, pt[plane], total[plane], which[plane], x[plane])
        tri[rows[plane]], ok[rows[plane]] = sub
    for j in np.flatnonzero(~ok[rows]):  # ties and the rest: the face worked out in full
        got = face_triangle(coarse, n[j], x[j], -1 if lost_r is None else int(lost_r[j]))
        if got is not None:
            tri[rows[j]], ok[rows[j]] = got, True
    return tri, ok


def nudged_triangles(
    coarse: WrenchPolygons,
    fac: Facets,
    facet: np.ndarray,
    start: np.ndarray,
    rays: np.ndarray,
    s: np.ndarray,
    lost: np.ndarray | None,
    size: float,
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """:func:`facet_triangles` for lines moved a hair sideways (:func:`nudge`), each moved
    the way that keeps its crossing on its face (an exit on an edge of the coarse set
    would, moved the wrong way, leave the face): (triangles, ok, the shift used (R, 3))."""
    w = nudge(rays, size)
    other = _cross(rays / np.maximum(np.sqrt(_dot(rays, rays)), 1e-300)[:, None], w)
    tri = np.zeros((len(rays), 3, 3))
    ok = np.zeros(len(rays), dtype=bool)
    used = w.copy()
    for k, shift in enumerate((w, -w, other, -other)):
        todo = np.flatnonzero(~ok) if k else np.arange(len(rays))
        if not len(todo):
            break
        t, good = facet_triangles(
            coarse, fac, facet[todo], start[todo], rays[todo], s[todo],
            None if lost is None else lost[todo], shift[todo],
        )  # fmt: skip
        tri[todo[good]], ok[todo[good]], used[todo[good]] = t[good], True, shift[todo[good]]
    return tri, ok, used


def face_triangle(
    shapes: WrenchPolygons, normal: np.ndarray, x: np.ndarray, lost: int = -1
) -> np.ndarray | None:
    """A triangle (3, 3) on the set's face in direction ``normal`` holding the point ``x``
    of that face: each tug's farthest vertices (one, an edge's two, or its whole
    polygon), their sums, the hull of those in the face's plane, and the fan triangle
    that holds ``x``. None when the face cannot be made (too many ties, or ``x`` not on
    it)."""
    choices: list[np.ndarray] = []
    count = 1
    for i, poly in enumerate(shapes.polygons):
        if i == lost or not len(poly):
            continue
        ax, ay = shapes.arms[i]
        a = np.array([normal[0] - ay * normal[2], normal[1] + ax * normal[2]])
        scores = poly @ a
        best = max(float(scores.max()), 0.0)
        tol = 1e-9 * max(float(np.abs(poly).max()), 1e-300) * max(float(np.hypot(*a)), 1.0)
        near = poly[scores >= best - tol]
        if best <= tol:  # nothing, or the tug's vertices along the face from nothing
            near = np.vstack([np.zeros((1, 2)), near]) if len(near) else np.zeros((1, 2))
        choices.append(shapes.wrench(i, near).T)  # (c, 3)
        count *= len(near)
        if count > 4096:
            return None
    points = np.zeros((1, 3))
    for c in choices:
        points = (points[:, None, :] + c[None, :, :]).reshape(-1, 3)
    # the face's plane: a basis square to the normal
    u = np.cross(normal, [1.0, 0.0, 0.0] if abs(normal[0]) < 0.9 else [0.0, 1.0, 0.0])
    u /= np.linalg.norm(u)
    v = np.cross(normal, u)
    q = np.column_stack([points @ u, points @ v])
    p = np.array([x @ u, x @ v])
    if len(q) < 3:
        return None
    idx = _hull2(q)
    if len(idx) < 3:
        return None
    h = q[idx]
    for j in range(1, len(h) - 1):
        m = np.column_stack([h[j] - h[0], h[j + 1] - h[0]])
        if abs(np.linalg.det(m)) <= 1e-300:
            continue
        w = np.linalg.solve(m, p - h[0])
        if w.min() >= -1e-12 and w.sum() <= 1 + 1e-12:
            return points[[idx[0], idx[j], idx[j + 1]]]
    return None


def _hull2(q: np.ndarray) -> np.ndarray:
    """Indices of the 2-D convex hull of q (m, 2), counter-clockwise (monotone chain)."""
    order = np.lexsort((q[:, 1], q[:, 0]))
    scale = float(np.abs(q).max(initial=0.0)) or 1.0
    tol = 1e-12 * scale * scale

    def turn(o: int, a: int, b: int) -> float:
        return float(
            (q[a, 0] - q[o, 0]) * (q[b, 1] - q[o, 1]) - (q[a, 1] - q[o, 1]) * (q[b, 0] - q[o, 0])
        )

    lower: list[int] = []
    for k in order:
        while len(lower) >= 2 and turn(lower[-2], lower[-1], int(k)) <= tol:
            lower.pop()
        lower.append(int(k))
    upper: list[int] = []
    for k in order[::-1]:
        while len(upper) >= 2 and turn(upper[-2], upper[-1], int(k)) <= tol:
            upper.pop()
        upper.append(int(k))
    return np.array(lower[:-1] + upper[:-1], dtype=int)


def _vertex_wrench(shapes: WrenchPolygons, tug: np.ndarray, idx: np.ndarray) -> np.ndarray:
    """(R, 3) wrench of vertex idx[r] of tug tug[r]'s polygon (0 where idx is -1)."""
    out = np.zeros((len(tug), 3))
    for i in np.unique(tug):
        sel = (tug == i) & (idx >= 0)
        if not sel.any():
            continue
        f = shapes.polygons[i][idx[sel]]
        out[sel] = shapes.wrench(int(i), f).T
    return out


def _pair_triangles(
    coarse: WrenchPolygons,
    fac: Facets,
    rows: np.ndarray,
    ea: np.ndarray,
    eb: np.ndarray,
    total: np.ndarray,
    which: np.ndarray,
    x: np.ndarray,
    lost: np.ndarray | None,
) -> tuple[np.ndarray, np.ndarray]:
    ed = fac.edges
    ti, tk = ed.tug[ea], ed.tug[eb]
    r = np.arange(len(rows))
    vi = _vertex_wrench(coarse, ti, which[r, ti])
    vk = _vertex_wrench(coarse, tk, which[r, tk])
    si = _vertex_wrench(coarse, ti, ed.start[ea])
    sk = _vertex_wrench(coarse, tk, ed.start[eb])
    base = total - vi - vk + si + sk
    e1, e2 = ed.vec[ea], ed.vec[eb]
    y = x - base
    g11 = np.einsum("ij,ij->i", e1, e1)
    g12 = np.einsum("ij,ij->i", e1, e2)
    g22 = np.einsum("ij,ij->i", e2, e2)
    b1 = np.einsum("ij,ij->i", e1, y)
    b2 = np.einsum("ij,ij->i", e2, y)
    det = g11 * g22 - g12 * g12
    good = det > 1e-14 * g11 * g22
    with np.errstate(divide="ignore", invalid="ignore"):
        al = np.where(good, (g22 * b1 - g12 * b2) / np.where(good, det, 1.0), np.nan)
        be = np.where(good, (g11 * b2 - g12 * b1) / np.where(good, det, 1.0), np.nan)
    miss = np.linalg.norm(y - al[:, None] * e1 - be[:, None] * e2, axis=1)
    size = np.sqrt(g11) + np.sqrt(g22) + np.linalg.norm(y, axis=1)
    eps = 1e-12
    ok = good & (al >= -eps) & (al <= 1 + eps) & (be >= -eps) & (be <= 1 + eps)
    ok &= miss <= 1e-7 * np.maximum(size, 1e-300)
    if lost is not None:
        ok &= (ti != lost) & (tk != lost)
    low = (al + be <= 1.0)[:, None]
    p0 = np.where(low, base, base + e1 + e2)
    tri = np.stack([p0, base + e1, base + e2], axis=1)
    return tri, ok


def _plane_triangles(
    coarse: WrenchPolygons, tug: np.ndarray, total: np.ndarray, which: np.ndarray, x: np.ndarray
) -> tuple[np.ndarray, np.ndarray]:
    tri = np.zeros((len(tug), 3, 3))
    ok = np.zeros(len(tug), dtype=bool)
    for i in np.unique(tug):
        sel = np.flatnonzero(tug == i)
        poly = coarse.polygons[i]
        mine = _vertex_wrench(coarse, np.full(len(sel), i), which[sel, i])
        base = total[sel] - mine
        f = (x[sel] - base)[:, :2]  # the point in tug i's force plane
        p0 = poly[0]
        for j in range(1, len(poly) - 1):
            p1, p2 = poly[j], poly[j + 1]
            m = np.array([[p1[0] - p0[0], p2[0] - p0[0]], [p1[1] - p0[1], p2[1] - p0[1]]])
            if abs(np.linalg.det(m)) <= 1e-14:
                continue
            uv = np.linalg.solve(m, (f - p0).T).T  # (k, 2)
            inside = (uv >= -1e-12).all(axis=1) & (uv.sum(axis=1) <= 1 + 1e-12) & ~ok[sel]
            if not inside.any():
                continue
            corners = coarse.wrench(int(i), np.vstack([p0, p1, p2])).T  # (3, 3)
            rows = sel[inside]
            tri[rows] = base[inside][:, None, :] + corners[None, :, :]
            ok[rows] = True
    return tri, ok
