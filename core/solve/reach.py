"""How far one ray from nothing reaches in the fleet's wrench set: the solve's first step.

Solve pulls asks for the largest s with s * target a wrench the tugs can give together
(core.solve.pulls). That is one ray from the origin (every tug can give nothing), cut
with the Minkowski sum of the tugs' polygons. For a single ray the walk of
core.solve.walk is done here with plain floats, which for one ray is several times
quicker than numpy's arrays:

1. A first triangle: three support points of the set whose shadows on the plane square
   to the ray hold the ray's own shadow (the origin), found as in the two-dimensional
   GJK test (Gilbert, Johnson and Keerthi, 1988): each new support point is taken in the
   direction from the current simplex's nearest point towards the origin.
2. The walk: the triangle's outward normal, the support point in it, and the face of
   the tetrahedron the ray leaves through, until the support point lies on the
   triangle's plane (core.solve.walk says why this ends at the exit face).
"""

from __future__ import annotations

import bisect
import math

import numpy as np

from core.solve.polytope import WrenchPolygons
from core.solve.walk import nudge

Vec = tuple[float, float, float]
_GAP = 1e-12
_MAX_STEPS = 300


def _sub(a: Vec, b: Vec) -> Vec:
    return (a[0] - b[0], a[1] - b[1], a[2] - b[2])


def _dot(a: Vec, b: Vec) -> float:
    return a[0] * b[0] + a[1] * b[1] + a[2] * b[2]


def _cross(a: Vec, b: Vec) -> Vec:
    return (a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0])


class Reach:
    """The fleet's support mapping in plain floats, and the exit of rays from ``start``
    (default the origin) with the set seen from there."""

    def __init__(self, shapes: WrenchPolygons, start: Vec = (0.0, 0.0, 0.0)) -> None:
        self.start = start
        self._w: Vec = (0.0, 0.0, 0.0)
        #: per tug (in the shapes' order): arm x, arm y, vertices, sorted normal angles,
        #: first vertex; None for a tug that gives nothing
        self.tugs: list[tuple[float, float, list[tuple[float, float]], list[float], int] | None]
        self.tugs = [
            _tug_entry(poly, arm) for poly, arm in zip(shapes.polygons, shapes.arms, strict=True)
        ]

    def without(self, i: int) -> Reach:
        """The same fleet with tug ``i`` lost."""
        out = Reach.__new__(Reach)
        out.start = self.start
        out._w = (0.0, 0.0, 0.0)
        out.tugs = self.tugs[:i] + self.tugs[i + 1 :]
        return out

    def _size(self) -> float:
        """The largest force component of any tug's set: the scale of the nudge."""
        return max(
            (abs(v) for t in self.tugs if t is not None for xy in t[2] for v in xy), default=1.0
        )

    def support(self, n: Vec) -> Vec:
        """The set's farthest point in direction ``n``, less the (nudged) start."""
        w = self._w
        sx, sy, sz = -self.start[0] - w[0], -self.start[1] - w[1], -self.start[2] - w[2]
        for entry in self.tugs:
            if entry is None:
                continue
            ax, ay, verts, angles, k0 = entry
            px = n[0] - ay * n[2]
            py = n[1] + ax * n[2]
            if angles:
                t = bisect.bisect_left(angles, math.atan2(py, px))
                fx, fy = verts[(k0 + t) % len(verts)]
            else:
                fx, fy = verts[0]
            if px * fx + py * fy > 0:
                sx += fx
                sy += fy
                sz += ax * fy - ay * fx
        return (sx, sy, sz)

    def _first_triangle(self, d: Vec) -> tuple[Vec, Vec, Vec] | None:
        """Three support points whose shadows along ``d`` hold the origin's (2-D GJK)."""
        # a basis of the plane square to d
        k = min(range(3), key=lambda i: abs(d[i]))
        axis = (1.0 if k == 0 else 0.0, 1.0 if k == 1 else 0.0, 1.0 if k == 2 else 0.0)
        e1 = _cross(d, axis)
        size = math.sqrt(_dot(e1, e1))
        if not size > 1e-300:  # no direction (or not a number): nothing to walk along
            return None
        e1 = (e1[0] / size, e1[1] / size, e1[2] / size)
        e2 = _cross(d, e1)
        size = math.sqrt(_dot(e2, e2))
        e2 = (e2[0] / size, e2[1] / size, e2[2] / size)

        def point(u: tuple[float, float]) -> tuple[Vec, tuple[float, float]]:
            n = (
                u[0] * e1[0] + u[1] * e2[0],
                u[0] * e1[1] + u[1] * e2[1],
                u[0] * e1[2] + u[1] * e2[2],
            )
            p = self.support(n)
            return p, (_dot(p, e1), _dot(p, e2))

        simplex: list[tuple[Vec, tuple[float, float]]] = []
        u = (1.0, 0.0)
        for _ in range(64):
            p, q = point(u)
            if q[0] * u[0] + q[1] * u[1] <= 1e-12 * (abs(q[0]) + abs(q[1]) + 1e-300):
                return None  # the origin's shadow is not inside the set's
            simplex.append((p, q))
            if len(simplex) == 1:
                u = (-q[0], -q[1])
                if u == (0.0, 0.0):
                    u = (0.0, 1.0)
                continue
            if len(simplex) == 2:
                (_, a), (_, b) = simplex
                ex, ey = b[0] - a[0], b[1] - a[1]
                nx, ny = -ey, ex
                if nx * -a[0] + ny * -a[1] < 0:
                    nx, ny = -nx, -ny
                u = (nx, ny)
                continue
            (_, a), (_, b), (_, c) = simplex
            area = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
            if abs(area) <= 1e-300:
                simplex.pop(0)
                continue
            # drop the vertex opposite an edge the origin lies beyond, or stop inside
            out = None
            for i in range(3):
                p0, p1 = simplex[(i + 1) % 3][1], simplex[(i + 2) % 3][1]
                side = (p1[0] - p0[0]) * (-p0[1]) - (p1[1] - p0[1]) * (-p0[0])
                if side * area < -1e-15 * abs(area):
                    out = i
                    break
            if out is None:
                return simplex[0][0], simplex[1][0], simplex[2][0]
            p0, p1 = simplex[(out + 1) % 3][1], simplex[(out + 2) % 3][1]
            ex, ey = p1[0] - p0[0], p1[1] - p0[1]
            nx, ny = (ey, -ex) if area > 0 else (-ey, ex)
            simplex.pop(out)
            u = (nx, ny)
        return None

    def exit(self, d: Vec) -> tuple[float, Vec] | None:
        """Largest s with s d in the set, and the unit normal of the face there; None
        where no first triangle is found (a flat set, or the origin on its edge)."""
        # a line through an edge or a corner leaves the walk no way on: it is moved a hair
        # sideways, and the answer read off the face it ends on for the line as given
        w = nudge(np.array([d]), self._size())[0]
        self._w = (float(w[0]), float(w[1]), float(w[2]))
        tri = self._first_triangle(d)
        if tri is None:
            return None
        a, b, c = tri
        s, n = math.nan, (0.0, 0.0, 0.0)
        for _ in range(_MAX_STEPS):
            n = _cross(_sub(b, a), _sub(c, a))
            size = math.sqrt(_dot(n, n))
            if size <= 1e-300:
                return None
            n = (n[0] / size, n[1] / size, n[2] / size)
            nd = _dot(n, d)
            if nd < 0:
                n, nd = (-n[0], -n[1], -n[2]), -nd
            if nd <= 1e-15:
                return None
            s = (_dot(n, a) + _dot(n, self._w)) / nd  # the line as given (a is nudged)
            v = self.support(n)
            if _dot(n, _sub(v, a)) <= _GAP * (1.0 + max(abs(a[0]), abs(a[1]), abs(a[2]))):
                return s, n
            # the line leaves the tetrahedron through the face it crosses farthest out
            best, pick = -math.inf, None
            for tri_new in ((v, b, c), (a, v, c), (a, b, v)):
                got = _barycentric(tri_new, d)
                if got is None or min(got[0]) < -1e-9:
                    continue
                if got[1] > best:
                    best, pick = got[1], tri_new
            if pick is None:
                return None
            a, b, c = pick
        return None


def _tug_entry(
    poly: np.ndarray, arm: np.ndarray
) -> tuple[float, float, list[tuple[float, float]], list[float], int] | None:
    if not len(poly):
        return None
    ax, ay = float(arm[0]), float(arm[1])
    if len(poly) < 3:
        far = poly[int(np.argmax(np.hypot(poly[:, 0], poly[:, 1])))]
        return (ax, ay, [(float(far[0]), float(far[1]))], [], 0)
    e = np.roll(poly, -1, axis=0) - poly
    theta = np.arctan2(-e[:, 0], e[:, 1])  # outward normal (e_y, -e_x) of each edge
    k0 = int(np.argmin(theta))
    verts = [(float(x), float(y)) for x, y in poly.tolist()]
    return (ax, ay, verts, np.roll(theta, -k0).tolist(), k0)


def _barycentric(
    tri: tuple[Vec, Vec, Vec], d: Vec
) -> tuple[tuple[float, float, float], float] | None:
    """Barycentric coordinates of where the line s d crosses the triangle's plane, and s."""
    p0, p1, p2 = tri
    e1, e2 = _sub(p1, p0), _sub(p2, p0)
    h = _cross(d, e2)
    a = _dot(e1, h)
    if abs(a) <= 1e-14 * math.sqrt(_dot(e1, e1) * _dot(e2, e2) * _dot(d, d)) or a == 0.0:
        return None
    f = 1.0 / a
    sv = (-p0[0], -p0[1], -p0[2])
    u = f * _dot(sv, h)
    q = _cross(sv, e1)
    v = f * _dot(d, q)
    return (1.0 - u - v, u, v), f * _dot(e2, q)


class SegmentsReach(Reach):
    """The same walk for a set made of segments from the origin, one per column of
    ``gen`` (3, k): a zonotope, whose support point in a direction is the sum of the
    columns that point into it. Each step costs one product with ``gen``, where finding
    the exit among the zonotope's facets (a pair of columns each) costs k^3."""

    def __init__(self, gen: np.ndarray) -> None:
        self.start = (0.0, 0.0, 0.0)
        self._w = (0.0, 0.0, 0.0)
        self.tugs = []
        self.gen = np.asarray(gen, dtype=float)
        self._rows = self.gen.T.copy()  # (k, 3): one product a step

    def _size(self) -> float:
        return float(np.abs(self.gen).max(initial=0.0)) or 1.0

    def support(self, n: Vec) -> Vec:
        out = self._rows @ np.array(n) > 0
        p = self.gen[:, out].sum(axis=1)
        w = self._w
        return (float(p[0]) - w[0], float(p[1]) - w[1], float(p[2]) - w[2])
