"""The fleet's reachable wrenches as half-spaces, and rays through them.

Each tug's reachable forces form a convex polygon (core.mechanics.tugsets); at its
point p (arm a = p - centroid) a force f has the wrench (f_x, f_y, a x f), so each tug's
wrench set is a flat polygon through the origin in force-and-moment space, and the
fleet's set W is their Minkowski sum: a convex polytope with support function
h(n) = sum_i h_i(n), h_i(n) = max over tug i's vertices of n . w.

Its facets are of two kinds. A face of W is the sum of the tugs' faces in the same
direction n; it is two-dimensional when one tug's whole polygon is a face (n along that
tug's plane normal) or when two tugs each give an edge (n perpendicular to both). So
the facet normals are among the plane normals and the cross products of pairs of edges
of different tugs, and a pair gives a facet exactly when, for both tugs, n projected on
the tug's force plane points out through that edge. The pair test depends on those two
tugs alone, so the facets of the fleet without one tug are the facets not made with
that tug's edges: with one tug lost the same half-spaces serve, less that tug's part of
the support. A tug with a fixed lead is a segment, its one edge faces both ways; with
only such tugs W is a zonotope and every pair gives a facet (both signs).

A ray start + s d leaves W at the least, over the half-spaces it leaves through
(n . d > 0), of (h(n) - n . start) / (n . d).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

_SLACK_TOL = 1e-9  # scaled units: how far outside a half-space still counts as inside
_DEN_TOL = 1e-10  # a ray this close to parallel to a facet does not leave through it
_CHUNK = 250_000  # elements of a (normals x rays) block worked at once


@dataclass(frozen=True, slots=True, eq=False)
class WrenchPolygons:
    """Each tug's reachable forces as a polygon, and its arm. n tugs.

    ``polygons[i]`` is (m_i, 2), counter-clockwise in (f_x, f_y); a fixed lead is the
    segment [0, f]; an empty polygon is a tug that gives nothing.
    """

    polygons: tuple[np.ndarray, ...]
    arms: np.ndarray  # (n, 2) m

    @property
    def n(self) -> int:
        return len(self.polygons)

    def scaled(self, factor: float, rows: np.ndarray | None = None) -> WrenchPolygons:
        """Polygons times ``factor`` (rows of the moment scaled by ``rows`` if given)."""
        return WrenchPolygons(tuple(p * factor for p in self.polygons), self.arms.copy())

    def without(self, i: int) -> WrenchPolygons:
        return WrenchPolygons(
            self.polygons[:i] + self.polygons[i + 1 :], np.delete(self.arms, i, axis=0)
        )

    def wrench(self, i: int, forces: np.ndarray) -> np.ndarray:
        """(3, m) wrenches of forces (m, 2) at tug i's point."""
        a = self.arms[i]
        f = np.asarray(forces, dtype=float).reshape(-1, 2)
        return np.vstack([f[:, 0], f[:, 1], a[0] * f[:, 1] - a[1] * f[:, 0]])

    def vertices(self) -> tuple[np.ndarray, np.ndarray]:
        """(3, K) every polygon vertex's wrench (the origin left out) and (K,) its tug."""
        ws, ts = [], []
        for i, poly in enumerate(self.polygons):
            far = poly[np.hypot(poly[:, 0], poly[:, 1]) > 0] if len(poly) else poly
            if len(far):
                ws.append(self.wrench(i, far))
                ts.append(np.full(len(far), i))
        if not ws:
            return np.zeros((3, 0)), np.zeros(0, dtype=int)
        return np.hstack(ws), np.concatenate(ts)


def _projected(normals: np.ndarray, arm: np.ndarray) -> np.ndarray:
    """(P, 2): each normal seen in one tug's force plane, n . w(f) = a(n) . f."""
    return np.column_stack(
        [normals[:, 0] - arm[1] * normals[:, 2], normals[:, 1] + arm[0] * normals[:, 2]]
    )


def support_parts(normals: np.ndarray, shapes: WrenchPolygons) -> np.ndarray:
    """(P, n) each tug's support h_i(n) >= 0 for unit normals (P, 3)."""
    out = np.zeros((len(normals), shapes.n))
    seg_idx, seg_v = [], []
    for i, poly in enumerate(shapes.polygons):
        if len(poly) == 0:
            continue
        if len(poly) <= 2:  # a segment from the origin: one matmul for all of them below
            seg_idx.append(i)
            seg_v.append(poly[np.argmax(np.hypot(poly[:, 0], poly[:, 1]))])
            continue
        out[:, i] = np.maximum((_projected(normals, shapes.arms[i]) @ poly.T).max(axis=1), 0.0)
    if seg_idx:
        idx = np.array(seg_idx)
        v = np.array(seg_v)  # (s, 2) each segment's far end
        a = shapes.arms[idx]
        gens = np.column_stack([v[:, 0], v[:, 1], a[:, 0] * v[:, 1] - a[:, 1] * v[:, 0]])
        out[:, idx] = np.maximum(normals @ gens.T, 0.0)
    return out


@dataclass(frozen=True, slots=True, eq=False)
class Edges:
    """Every polygon edge (E edges): its wrench-space vector, its outward normal in its
    tug's force plane, its tug, its end vertices in that tug's polygon, and whether it
    faces both ways (a segment from the origin)."""

    vec: np.ndarray  # (E, 3)
    out: np.ndarray  # (E, 2)
    tug: np.ndarray  # (E,)
    start: np.ndarray  # (E,) vertex index of the edge's start in its tug's polygon
    end: np.ndarray  # (E,)
    two: np.ndarray  # (E,) bool


def edges_of(shapes: WrenchPolygons) -> Edges:
    """Every polygon's edges, tug by tug (a segment's one edge worked for all at once)."""
    vecs, outs, tugs, starts, ends, two = [], [], [], [], [], []
    polys = shapes.polygons
    segs = [i for i, poly in enumerate(polys) if len(poly) == 2]
    if segs:  # fixed leads: one edge each, from the origin to the far end
        idx = np.array(segs)
        pts = np.array([polys[i] for i in segs])  # (s, 2, 2)
        e = pts[:, 1] - pts[:, 0]
        size = np.hypot(e[:, 0], e[:, 1])
        keep = size > 1e-12 * np.maximum(size, 1e-300)
        e, idx = e[keep], idx[keep]
        a = shapes.arms[idx]
        vecs.append(np.column_stack([e[:, 0], e[:, 1], a[:, 0] * e[:, 1] - a[:, 1] * e[:, 0]]))
        outs.append(np.column_stack([e[:, 1], -e[:, 0]]))
        tugs.append(idx)
        starts.append(np.zeros(len(idx), dtype=int))
        ends.append(np.ones(len(idx), dtype=int))
        two.append(np.ones(len(idx), dtype=bool))
    for i, poly in enumerate(polys):
        m = len(poly)
        if m < 3:
            continue
        st, en = np.arange(m), (np.arange(m) + 1) % m
        sides = np.zeros(m, dtype=bool)
        e = poly[en] - poly[st]
        size = np.hypot(e[:, 0], e[:, 1])
        keep = size > 1e-12 * max(float(size.max()), 1e-300)
        e, st, en, sides = e[keep], st[keep], en[keep], sides[keep]
        vecs.append(shapes.wrench(i, e).T)
        outs.append(np.column_stack([e[:, 1], -e[:, 0]]))
        tugs.append(np.full(len(e), i))
        starts.append(st)
        ends.append(en)
        two.append(sides)
    if not vecs:
        z = np.zeros(0, dtype=int)
        return Edges(np.zeros((0, 3)), np.zeros((0, 2)), z, z, z, np.zeros(0, bool))
    tug = np.concatenate(tugs)
    order = np.argsort(tug, kind="stable")  # tug by tug, each tug's edges in turn
    return Edges(
        np.vstack(vecs)[order],
        np.vstack(outs)[order],
        tug[order],
        np.concatenate(starts)[order],
        np.concatenate(ends)[order],
        np.concatenate(two)[order],
    )


@dataclass(frozen=True, slots=True, eq=False)
class Facets:
    """Half-space normals of the fleet's wrench set and where each comes from: a pair of
    edges (``edge_a``, ``edge_b`` into ``edges``), a tug's whole polygon (``plane_tug``),
    or neither (-1 in all three: the directions out of a flat set)."""

    normals: np.ndarray  # (P, 3) unit
    edge_a: np.ndarray  # (P,)
    edge_b: np.ndarray  # (P,)
    plane_tug: np.ndarray  # (P,)
    edges: Edges

    def owners(self) -> np.ndarray:
        """(P, 3) the tugs each half-space is made with (-1 for none)."""
        ta = np.where(self.edge_a >= 0, self.edges.tug[np.maximum(self.edge_a, 0)], -1)
        tb = np.where(self.edge_b >= 0, self.edges.tug[np.maximum(self.edge_b, 0)], -1)
        return np.column_stack([ta, tb, self.plane_tug])


def facets(shapes: WrenchPolygons) -> Facets:
    """The half-spaces holding every facet of the fleet's wrench set, and of the set with
    any one tug lost (while it stays solid), with where each comes from."""
    ed = edges_of(shapes)
    vec, out, tug, two = ed.vec, ed.out, ed.tug, ed.two
    plane, plane_tug = _plane_normals(shapes)
    parts = [plane]
    ea = [np.full(len(plane), -1)]
    eb = [np.full(len(plane), -1)]
    pt = [plane_tug]
    if len(vec) >= 2:
        i, j = np.triu_indices(len(vec), 1)
        other = tug[i] != tug[j]
        i, j = i[other], j[other]
        cr = np.cross(vec[i], vec[j])
        size = np.linalg.norm(cr, axis=1)
        scale = np.linalg.norm(vec[i], axis=1) * np.linalg.norm(vec[j], axis=1)
        ok = size > 1e-9 * scale
        i, j, cr, size = i[ok], j[ok], cr[ok], size[ok]
        cr /= size[:, None]
        ti = _side(cr, shapes.arms[tug[i]], out[i])
        tj = _side(cr, shapes.arms[tug[j]], out[j])
        plus = (two[i] | (ti >= 0)) & (two[j] | (tj >= 0))
        minus = (two[i] | (ti <= 0)) & (two[j] | (tj <= 0))
        parts += [cr[plus], -cr[minus]]
        ea += [i[plus], i[minus]]
        eb += [j[plus], j[minus]]
        pt += [np.full(int(plus.sum()), -1), np.full(int(minus.sum()), -1)]
    if _rank(vec) < 3:  # a flat set: add the directions out of its span
        extra = zonotope_normals(vec.T)
        parts.append(extra)
        for lst in (ea, eb, pt):
            lst.append(np.full(len(extra), -1))
    return Facets(
        np.vstack(parts),
        np.concatenate(ea).astype(int),
        np.concatenate(eb).astype(int),
        np.concatenate(pt).astype(int),
        ed,
    )


def facet_normals(shapes: WrenchPolygons) -> np.ndarray:
    """(P, 3) unit normals holding every facet normal of the fleet's wrench set, and of
    the set with any one tug lost (while it stays solid)."""
    return facets(shapes).normals


def _side(normals: np.ndarray, arms: np.ndarray, outward: np.ndarray) -> np.ndarray:
    """(P,) sign of how each normal, seen in its tug's force plane, leaves through the edge
    with outward normal ``outward``: + out through it, - the other way, 0 along the plane
    normal (the whole polygon is the face: either way)."""
    a = np.column_stack(
        [
            normals[:, 0] - arms[:, 1] * normals[:, 2],
            normals[:, 1] + arms[:, 0] * normals[:, 2],
        ]
    )
    t = np.einsum("ij,ij->i", a, outward)
    size = np.linalg.norm(a, axis=1) * np.linalg.norm(outward, axis=1)
    return np.where(np.abs(t) <= 1e-9 * np.maximum(size, 1e-300), 0.0, np.sign(t))


def _plane_normals(shapes: WrenchPolygons) -> tuple[np.ndarray, np.ndarray]:
    """(2 q, 3) both normals of each tug's force plane whose polygon is two-dimensional,
    and (2 q,) their tugs."""
    rows, tugs = [], []
    for i, (poly, a) in enumerate(zip(shapes.polygons, shapes.arms, strict=True)):
        if len(poly) >= 3:
            rows.append((a[1], -a[0], 1.0))
            tugs.append(i)
    if not rows:
        return np.zeros((0, 3)), np.zeros(0, dtype=int)
    n = np.array(rows)
    n /= np.linalg.norm(n, axis=1)[:, None]
    t = np.array(tugs)
    return np.vstack([n, -n]), np.concatenate([t, t])


def _rank(vectors: np.ndarray) -> int:
    if len(vectors) == 0:
        return 0
    sv = np.linalg.svd(vectors, compute_uv=False)
    return int((sv > 1e-9 * max(float(sv[0]), 1e-300)).sum())


def zonotope_normals(gens: np.ndarray) -> np.ndarray:
    """(P, 3) unit normals that include every facet normal of the zonotope of ``gens`` (3, n).

    Cross products of every pair of generators; when the generators span less than
    three dimensions, also the directions out of their span and the crosses with them.
    """
    norms = np.linalg.norm(gens, axis=0)
    big = max(float(norms.max(initial=0.0)), 1e-300)
    g = gens[:, norms > 1e-12 * big].T  # (q, 3)
    if len(g) >= 3:  # the usual case first: the pairs' normals, if the set is solid
        i, j = np.triu_indices(len(g), 1)
        cr = np.cross(g[i], g[j])
        size = np.linalg.norm(cr, axis=1)
        kept = norms[norms > 1e-12 * big]
        keep = size > 1e-9 * kept[i] * kept[j]
        if keep.any():
            normals = cr[keep] / size[keep, None]
            if float(np.abs(normals @ g.T).max()) > 1e-9 * big:
                return np.vstack([normals, -normals])
    if len(g):
        u, sv, _ = np.linalg.svd(g.T)
        rank = int((sv > 1e-9 * sv[0]).sum())
    else:
        u, rank = np.eye(3), 0
    comp = u[:, rank:].T  # (3 - rank, 3) directions out of the span
    vecs = np.vstack([g, comp])
    i, j = np.triu_indices(len(vecs), 1)
    cr = np.cross(vecs[i], vecs[j])
    size = np.linalg.norm(cr, axis=1)
    scale = np.linalg.norm(vecs[i], axis=1) * np.linalg.norm(vecs[j], axis=1)
    keep = size > 1e-9 * scale
    normals = np.vstack([cr[keep] / size[keep, None], comp])
    return np.vstack([normals, -normals])


@dataclass(frozen=True, slots=True)
class Exit:
    """Where rays start + s d (s >= 0) are inside the half-spaces: s_out the largest, s_in
    the smallest (both (D,); 0 where none is), ``inside`` whether the start is, and
    ``facet`` (D,) the half-space each ray leaves through (-1 where none)."""

    s_out: np.ndarray
    s_in: np.ndarray
    inside: bool
    facet: np.ndarray


def least_exit(
    numer: np.ndarray, normals: np.ndarray, rays: np.ndarray
) -> tuple[np.ndarray, np.ndarray]:
    """(D,) the least of numer_p / (n_p . d) over the half-spaces each ray leaves through
    (n_p . d above rounding), and (D,) which one (-1 where none: there inf), in blocks of
    normals so that memory stays small."""
    d = rays.shape[1]
    tol = _DEN_TOL * np.linalg.norm(rays, axis=0)  # (D,)
    s = np.full(d, np.inf)
    facet = np.full(d, -1)
    cols = np.arange(d)
    for blk in _blocks(len(normals), d):
        den = normals[blk] @ rays  # (b, D)
        ratio = np.full(den.shape, np.inf)
        np.divide(numer[blk, None], den, out=ratio, where=den > tol)
        k = ratio.argmin(axis=0)
        best = ratio[k, cols]
        better = best < s
        s[better] = best[better]
        facet[better] = k[better] + blk.start
    return s, facet


def _blocks(p: int, d: int) -> list[slice]:
    step = max(1, _CHUNK // max(d, 1))
    return [slice(a, min(a + step, p)) for a in range(0, p, step)]


def ray_exit(normals: np.ndarray, support: np.ndarray, start: np.ndarray, rays: np.ndarray) -> Exit:
    """Exit of the rays (3, D) from start (3,) through the half-spaces n . x <= h, in
    blocks of normals so that memory stays small."""
    slack = support - normals @ start  # (P,)
    slack[np.abs(slack) < 1e-13] = 0.0  # rounding on faces through the start
    inside = bool(slack.min(initial=0.0) >= -_SLACK_TOL)
    d = rays.shape[1]
    s_out, facet = least_exit(np.maximum(slack, 0.0), normals, rays)
    if inside:
        return Exit(s_out, np.zeros(d), True, facet)
    # outside: where each ray gets in (the largest entry), or that it never does
    tol = _DEN_TOL * np.linalg.norm(rays, axis=0)  # (D,)
    s_in = np.zeros(d)
    stuck = np.zeros(d, dtype=bool)
    for blk in _blocks(len(normals), d):
        den = normals[blk] @ rays  # (b, D)
        sl = slack[blk, None]
        enters = den < -tol
        with np.errstate(divide="ignore", invalid="ignore"):
            s_in = np.maximum(
                s_in, np.where(enters, sl / np.where(enters, den, -1.0), 0.0).max(axis=0)
            )
        stuck |= ((np.abs(den) <= tol) & (sl < -_SLACK_TOL)).any(axis=0)
    never = stuck | (s_in > s_out * (1 + 1e-9) + _SLACK_TOL)
    return Exit(
        np.where(never, 0.0, s_out),
        np.where(never, 0.0, s_in),
        False,
        np.where(never, -1, facet),
    )


def _slack(normals: np.ndarray, parts: np.ndarray, start: np.ndarray) -> np.ndarray:
    """(P,) how far each half-space of the whole fleet lies out from the start."""
    slack = parts.sum(axis=1) - normals @ start
    slack[np.abs(slack) < 1e-13] = 0.0
    return slack


def worst_lost_exit(
    normals: np.ndarray,
    parts: np.ndarray,
    start: np.ndarray,
    rays: np.ndarray,
    lost: Sequence[int] | np.ndarray,
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The rays' exit with the worst one of the tugs ``lost`` lost (columns of ``parts``
    (P, n)), for a start inside every set with one of them lost: (D,) the least exit over
    those tugs, (D,) the tug whose loss gives it and (D,) the half-space it leaves
    through (-1 where none: there the exit is infinite and the tug the first listed).

    With tug i lost, half-space p bounds the exit at (slack_p - part_pi) / (n_p . d); the
    least of that over the tugs takes the largest part, so the worst case is one cut of
    the rays with the half-spaces less their largest parts: P D work for every tug at once
    (the exit of each tug on its own would be P D m).
    """
    tugs = np.asarray(lost, dtype=int)
    sub = parts[:, tugs]
    low = _rounded(_slack(normals, parts, start) - sub.max(axis=1, initial=0.0))
    s, facet = least_exit(low, normals, rays)
    d = rays.shape[1]
    who = np.full(d, tugs[0] if len(tugs) else 0)
    has = facet >= 0
    who[has] = tugs[sub[facet[has]].argmax(axis=1)]
    return np.maximum(s, 0.0), who, facet


def clean_faces(
    normals: np.ndarray,
    parts: np.ndarray,
    start: np.ndarray,
    rays: np.ndarray,
    facet: np.ndarray,
    lost: np.ndarray,
    owners: np.ndarray,
) -> np.ndarray:
    """(D,) each ray's exit half-space with tug ``lost[r]`` lost (a column of ``parts``
    and a tug of ``owners`` (P, 3)), swapped where it is made with that tug for an equal
    one that is not: a face of the smaller set."""
    out = facet.copy()
    has = facet >= 0
    dirty = np.flatnonzero(has & (owners[np.maximum(facet, 0)] == lost[:, None]).any(axis=1))
    if not len(dirty):
        return out
    slack = _slack(normals, parts, start)
    tol = _DEN_TOL * np.linalg.norm(rays, axis=0)
    for t in np.unique(lost[dirty]):
        rows = dirty[lost[dirty] == t]
        out[rows] = _clean_rows(
            normals, slack - parts[:, t], rays[:, rows], tol[rows], facet[rows], t, owners
        )
    return out


def _clean_rows(
    normals: np.ndarray,
    slack: np.ndarray,
    rays: np.ndarray,
    tol: np.ndarray,
    facet: np.ndarray,
    tug: int,
    owners: np.ndarray,
) -> np.ndarray:
    """(k,) for rays (3, k) leaving through ``facet`` (k,) of the set with ``tug`` lost
    (``slack`` (P,) its slack), an equal half-space not made with that tug where there is
    one (else the same), a few rays at a time so that memory stays small."""
    out = facet.copy()
    clean = ~(owners == tug).any(axis=1)
    num = _rounded(slack)[:, None]
    step = max(1, _CHUNK // max(len(normals), 1))
    for a in range(0, rays.shape[1], step):
        cols = slice(a, a + step)
        den = normals @ rays[:, cols]  # (P, k)
        vals = np.full(den.shape, np.inf)
        np.divide(num, den, out=vals, where=den > tol[cols])
        best = vals[facet[cols], np.arange(den.shape[1])]
        near = clean[:, None] & (vals <= best * (1 + 1e-9) + 1e-12)
        ok = near.any(axis=0)
        pick = np.where(near, vals, np.inf).argmin(axis=0)
        out[cols] = np.where(ok, pick, facet[cols])
    return out


def exits_below(
    normals: np.ndarray,
    parts: np.ndarray,
    start: np.ndarray,
    rays: np.ndarray,
    lost: Sequence[int] | np.ndarray,
    bound: np.ndarray,
    owners: np.ndarray,
) -> tuple[np.ndarray, np.ndarray]:
    """(len(lost), D) the rays' exit with each listed tug lost where it lies below
    ``bound`` (D,) (inf elsewhere), for a start inside every such set: the same
    half-spaces, less that tug's part of the support; and (len(lost), D) the half-space
    each leaves through (-1 where none), preferring among equals one not made with the
    lost tug (``owners`` (P, 3): the tugs each half-space is made with, -1 for none),
    which is a face of the smaller set.

    Only the half-spaces that could come below the bound are looked at: one can give no
    less than its slack less the largest lost tug's part on it, over n . d.
    """
    tugs = np.asarray(lost, dtype=int)
    d = rays.shape[1]
    if not len(tugs):
        return np.zeros((0, d)), np.zeros((0, d), dtype=int)
    slack = _slack(normals, parts, start)
    sub = parts[:, tugs]  # (P, m)
    tol = _DEN_TOL * np.linalg.norm(rays, axis=0)
    out = np.full((d, len(tugs)), np.inf)
    which = np.full((d, len(tugs)), -1)
    low = slack - sub.max(axis=1)  # (P,) no lost tug takes more than this off
    for blk in _blocks(len(normals), d):
        den = normals[blk] @ rays
        leaves = den > tol
        with np.errstate(divide="ignore", invalid="ignore"):
            lb = np.where(leaves, low[blk, None] / np.where(leaves, den, 1.0), np.inf)
        p_idx, d_idx = np.nonzero((lb <= bound[None, :] * (1 + 1e-12) + 1e-15) & leaves)
        if not len(p_idx):
            continue
        vals = _rounded(slack[blk][p_idx, None] - sub[blk][p_idx]) / den[p_idx, d_idx][:, None]
        order = np.argsort(d_idx, kind="stable")
        d_sorted = d_idx[order]
        starts = np.flatnonzero(np.r_[True, d_sorted[1:] != d_sorted[:-1]])
        ranked = vals[order]
        mins = np.minimum.reduceat(ranked, starts, axis=0)
        rows = d_sorted[starts]
        better = mins < out[rows]
        out[rows] = np.where(better, mins, out[rows])
        # the first row of each group that reaches the group's least, among equals one
        # not made with the lost tug
        group = np.repeat(np.arange(len(starts)), np.diff(np.r_[starts, len(ranked)]))
        near = ranked <= mins[group] * (1 + 1e-9) + 1e-12
        own = owners[blk][p_idx[order]]  # (N, 3)
        made = (own[:, :, None] == tugs[None, None, :]).any(axis=1)  # (N, m)
        clean = near & ~made
        has_clean = np.maximum.reduceat(clean.astype(int), starts, axis=0) > 0
        near = np.where(has_clean[group], clean, near)
        at = np.where(near, np.arange(len(ranked))[:, None], len(ranked))
        arg = np.minimum.reduceat(at, starts, axis=0)
        facet = p_idx[order][arg] + blk.start
        which[rows] = np.where(better, facet, which[rows])
    over = out >= bound[:, None]  # only exits below the bound are sought
    out[over] = np.inf
    which[over] = -1
    _clean_ties(which, owners, tugs, normals, slack, sub, rays, tol)
    return np.maximum(out, 0.0).T, which.T


def _clean_ties(
    which: np.ndarray,
    owners: np.ndarray,
    tugs: np.ndarray,
    normals: np.ndarray,
    slack: np.ndarray,
    sub: np.ndarray,
    rays: np.ndarray,
    tol: np.ndarray,
) -> None:
    """Where the half-space a ray leaves through (with tug ``tugs[c]`` lost) is made with
    that tug, look for an equal one that is not (a face of the smaller set)."""
    d_idx, c_idx = np.nonzero(which >= 0)
    made = (owners[which[d_idx, c_idx]] == tugs[c_idx][:, None]).any(axis=1)
    d_idx, c_idx = d_idx[made], c_idx[made]
    for c in np.unique(c_idx):
        rows = d_idx[c_idx == c]
        which[rows, c] = _clean_rows(
            normals, slack - sub[:, c], rays[:, rows], tol[rows], which[rows, c], tugs[c], owners
        )


def _rounded(slack: np.ndarray) -> np.ndarray:
    """Slack with rounding on faces through the start set to zero."""
    return np.where(np.abs(slack) < 1e-13, 0.0, slack)
