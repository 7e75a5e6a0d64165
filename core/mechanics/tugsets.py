"""The forces each tug can give from its point: a convex polygon per tug.

A tug with a working sector may take any lead within it and any pull up to its usable
pull for that lead (its capability share, :mod:`core.model.capability`). The forces it
can put on the body from its point are then the leads' rays scaled by the capability:
a sector of a disc when the capability is uniform. That set is cut into a polygon with
a vertex at least every :data:`SECTOR_STEP_DEG` degrees of lead (and at every bearing
where the capability changes slope), and the convex hull of it with the origin is taken
(a tug can always give less). The chords make the polygon slightly conservative for a
uniform capability: at most 1 - cos(step / 2), 0.06 % at 4 degrees. Where the
capability is not convex (or a sector is wider than 180 degrees) the hull also holds
forces the tug cannot give with one lead; :meth:`TugSets.outside` finds them.

Each tug's pull is also held within what its fitting's rating allows
(core.mechanics.fittings.pull_limits_n: rating x cos(line angle) on a line): the
polygon is cut off at that radius, so no solve proposes a pull whose line is over the
fitting's TOW or SWL.

A tug on a towline takes only the leads of its sector that run clear of the hull
(core.mechanics.leads.clear_arc: the longest unbroken run of them, and of a run wider
than half a turn the half turn about its middle, since a convex set spanning more would
hold forces along the leads cut), so that no solve proposes a lead the verdict would call
over the hull; a sector with none gives no set. :func:`used_arc` gives that part, and the
board draws it.

A tug without a sector keeps its lead as set: its set is the segment from nothing to
its usable pull along that lead. A push (not made fast) stays at most
:data:`MAX_PUSH_OFF_DEG` off square to the hull.

Each force f at a tug's point p has the wrench (f_x, f_y, (p - c) x f) about the
centroid c: the wrench sets are flat polygons in force-and-moment space, and the
fleet's is their Minkowski sum (core.solve.holdlimits).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core.mechanics.balance import TugLayout
from core.mechanics.fittings import pull_limits_n
from core.mechanics.leads import clear_arc

#: Largest step of lead between neighbouring vertices of a sector's polygon, degrees.
SECTOR_STEP_DEG = 4.0
#: A push stays within this angle of square to the hull, degrees (it cannot pull).
MAX_PUSH_OFF_DEG = 89.0
#: A usable force at or below this, N, is none (a tug whose efficiency or capability share
#: is a denormal number would otherwise make the solvers' scaling overflow).
NO_FORCE_N = 1e-3


def _star_hull(points: np.ndarray) -> tuple[np.ndarray, bool]:
    """The convex hull of the origin and ``points`` (m, 2), given in increasing angle
    round the origin (a star about it): (indices into ``points`` of the hull's vertices,
    counter-clockwise, with -1 for the origin; whether the origin is one of them).

    The origin is a vertex unless the points leave no gap of half a turn round it. Then
    reflex corners are cut off, a few at a time, until none is left (a star-shaped
    polygon's hull).
    """
    m = len(points)
    ang = np.arctan2(points[:, 1], points[:, 0])
    gaps = np.diff(np.concatenate([ang, ang[:1] + 2 * np.pi]))
    gaps = np.mod(gaps, 2 * np.pi)
    if m == 1:
        gaps = np.array([2 * np.pi])
    k = int(np.argmax(gaps))
    order = np.roll(np.arange(m), -(k + 1))  # start after the widest gap
    with_origin = bool(gaps[k] >= np.pi - 1e-12)
    idx = np.concatenate([[-1], order]) if with_origin else order
    pts = np.vstack([np.zeros((1, 2)), points])[idx + 1]
    scale = float(np.abs(points).max(initial=0.0)) or 1.0
    tol = 1e-12 * scale * scale
    keep = np.arange(len(idx))
    while len(keep) > 2:
        q = pts[keep]
        prev = np.concatenate([q[-1:], q[:-1]])
        nxt = np.concatenate([q[1:], q[:1]])
        turn = (q[:, 0] - prev[:, 0]) * (nxt[:, 1] - q[:, 1]) - (q[:, 1] - prev[:, 1]) * (
            nxt[:, 0] - q[:, 0]
        )
        reflex = turn <= tol
        if not reflex.any():
            break
        first = reflex & ~np.concatenate([reflex[-1:], reflex[:-1]])  # one of each run
        if not first.any():
            first = np.zeros_like(reflex)
            first[int(np.argmax(reflex))] = True
        keep = keep[~first]
    out = idx[keep]
    return out, bool((out == -1).any())


def _sector_leads(
    lo: float, hi: float, breaks: np.ndarray, step_rad: float, nest: int
) -> np.ndarray:
    """Leads across [lo, hi] at most ``step_rad`` apart, in a multiple of ``nest`` equal
    steps (so that the leads of ``step_rad * nest`` are among them), with the breaks
    inside it."""
    width = hi - lo
    if width <= 0.0:
        return np.array([lo])
    n = nest * max(1, math.ceil(width / (step_rad * nest) - 1e-9))
    leads = lo + width * (np.arange(n + 1) / n)
    if width >= 2 * math.pi - 1e-12:
        leads = leads[:-1]
    if len(breaks):
        k = np.floor((lo - breaks) / (2 * math.pi)) + 1  # shift each break just past lo
        inside = breaks + 2 * math.pi * k
        inside = np.concatenate([inside, inside + 2 * math.pi])
        inside = inside[(inside > lo) & (inside < hi)]
        leads = np.unique(np.concatenate([leads, inside]))
    return leads


def _push_allowed(leads: np.ndarray, lo: float, hi: float, limit: float) -> np.ndarray:
    """A push's leads within ``limit`` of square (its edges added where the sector holds
    them)."""
    edges = np.array([-limit, limit])
    for shift in (-2 * math.pi, 0.0, 2 * math.pi):
        e = edges + shift
        leads = np.concatenate([leads, e[(e >= lo) & (e <= hi)]])
    wrapped = np.remainder(leads + math.pi, 2 * math.pi) - math.pi
    return np.unique(leads[np.abs(wrapped) <= limit + 1e-12])


@dataclass(frozen=True, slots=True, eq=False)
class TugSets:
    """Each tug's reachable forces, conv(origin, vertices), body frame. n tugs, k vertices.

    ``polygons[i]`` is tug i's polygon counter-clockwise, (m_i, 2) in N, with the origin
    among its vertices where it is one (a sector narrower than a whole turn).
    """

    layout: TugLayout
    centroid: tuple[float, float]
    vertices: np.ndarray  # (k, 2) force at each vertex (the origin not listed), N
    vertex_tug: np.ndarray  # (k,) the tug of each vertex
    vertex_lead: np.ndarray  # (k,) the lead of each vertex, rad (placement frame)
    polygons: tuple[np.ndarray, ...]  # (n,) each (m_i, 2)
    sectors: np.ndarray  # (n,) bool: the tug has a working sector
    #: tugs on a line whose working sector holds no lead clear of the hull: no set
    no_clear_lead: tuple[int, ...] = ()

    @property
    def n(self) -> int:
        return len(self.layout.placements)

    @property
    def points(self) -> np.ndarray:
        """(n, 2) each tug's application point, body frame, m."""
        return self.layout.points

    def arms(self) -> np.ndarray:
        """(n, 2) each tug's point less the centroid, m."""
        return self.layout.points - np.asarray(self.centroid)

    def wrenches(self) -> np.ndarray:
        """(3, k) force ahead, to port and moment about the centroid at each vertex."""
        arm = self.arms()[self.vertex_tug]  # (k, 2)
        v = self.vertices
        return np.vstack([v[:, 0], v[:, 1], arm[:, 0] * v[:, 1] - arm[:, 1] * v[:, 0]])

    def gauge(self, i: int, force: np.ndarray) -> float:
        """How far out in tug i's polygon ``force`` (2,) lies: 1 on its edge, 0 at nothing;
        inf where the force is outside the polygon's cone."""
        poly = self.polygons[i]
        f = np.asarray(force, dtype=float)
        size = float(np.hypot(*f))
        if size == 0.0:
            return 0.0
        if len(poly) == 0:
            return math.inf
        if len(poly) <= 2:  # a segment from nothing: the lead as set
            v = poly[np.argmax(np.hypot(poly[:, 0], poly[:, 1]))]
            reach = float(v @ v)
            return float(f @ v) / reach if reach > 0 else math.inf
        edges = np.roll(poly, -1, axis=0) - poly  # (m, 2)
        normals = np.column_stack([edges[:, 1], -edges[:, 0]])  # outward (ccw polygon)
        h = np.einsum("ij,ij->i", normals, poly)
        scale = float(np.abs(h).max(initial=0.0))
        through = h <= 1e-12 * scale
        if np.any((normals[through] @ f) > 1e-9 * size * np.hypot(*normals[through].T)):
            return math.inf
        return float(((normals[~through] @ f) / h[~through]).max(initial=0.0))

    def capability_at(self, i: int, lead: float) -> float:
        """Tug i's usable pull at a lead (rad), N: its pull scale x capability share."""
        scale = self.layout.pull_scale_n
        base = float(scale[i]) if scale is not None else float(self.layout.usable_n[i])
        return base * float(self.layout.shares(i, np.array([lead]))[0])

    def outside(self, i: int, force: np.ndarray, lead: float, tol: float = 1e-6) -> bool:
        """True when ``force`` at ``lead`` is more than the tug can give with one lead
        (only possible where the polygon is the hull of a non-convex set)."""
        size = float(np.hypot(*force))
        p = self.layout.placements[i]
        width = p.sector_width_rad
        if p.lead_sector_rad is not None and width < 2 * math.pi - 1e-9:
            off = (lead - p.lead_sector_rad[0]) % (2 * math.pi)
            if off > width + 1e-6 and size > tol * max(self.capability_at(i, lead), 1.0):
                return True
        return size > self.capability_at(i, lead) * (1 + tol) + tol


def tug_sets(
    layout: TugLayout,
    centroid: tuple[float, float],
    *,
    step_deg: float = SECTOR_STEP_DEG,
    nest: int = 1,
    limits_n: np.ndarray | None = None,
) -> TugSets:
    """Every tug's polygon of reachable forces, from its layout row and its sector.

    Leads are at most ``step_deg`` apart, in multiples of ``nest`` steps: the polygons
    of ``step_deg * nest`` (and ``nest`` 1) then have every vertex among these ones, so
    they lie inside them (core.solve.walk starts from them). ``limits_n`` (n,) caps each
    tug's pull, N: by default what its fitting's rating allows it alone."""
    frame = layout.lead_frame_rad
    scale = layout.pull_scale_n
    limits = pull_limits_n(layout) if limits_n is None else np.asarray(limits_n, dtype=float)
    if frame is None or scale is None or all(p.lead_sector_rad is None for p in layout.placements):
        return _fixed_sets(layout, centroid, limits)
    return _each_tugs_sets(layout, centroid, step_deg, nest, limits)


def _fixed_sets(
    layout: TugLayout, centroid: tuple[float, float], limits: np.ndarray | None = None
) -> TugSets:
    """:func:`tug_sets` when every tug works at its lead as set (a live solve's case), all
    tugs at once: each set is the segment from the origin to the tug's pull (none below
    :data:`NO_FORCE_N`)."""
    n = len(layout.placements)
    if limits is None:
        limits = pull_limits_n(layout)
    reach = np.minimum(layout.usable_n, limits)  # (n,)
    pulls = layout.directions * reach[:, None]  # (n, 2)
    working = reach > NO_FORCE_N
    idx = np.flatnonzero(working)
    segments = np.zeros((n, 2, 2))
    segments[:, 1] = pulls
    leads = np.array([p.lead_rad for p in layout.placements], dtype=float)
    return TugSets(
        layout=layout,
        centroid=centroid,
        vertices=pulls[idx],
        vertex_tug=idx,
        vertex_lead=leads[idx],
        polygons=tuple(segments[i] if working[i] else np.zeros((0, 2)) for i in range(n)),
        sectors=np.zeros(n, dtype=bool),
    )


def _each_tugs_sets(
    layout: TugLayout,
    centroid: tuple[float, float],
    step_deg: float,
    nest: int,
    limits: np.ndarray | None = None,
) -> TugSets:
    """:func:`tug_sets` tug by tug (some tug has a working sector)."""
    if limits is None:
        limits = pull_limits_n(layout)
    step = math.radians(step_deg)
    limit = math.radians(MAX_PUSH_OFF_DEG)
    verts: list[np.ndarray] = []
    tugs: list[np.ndarray] = []
    leads_out: list[np.ndarray] = []
    polys: list[np.ndarray] = []
    sectors = np.zeros(len(layout.placements), dtype=bool)
    no_clear: list[int] = []
    frame = layout.lead_frame_rad
    scale = layout.pull_scale_n
    for i, p in enumerate(layout.placements):
        if p.lead_sector_rad is None or frame is None or scale is None:
            reach = min(float(layout.usable_n[i]), float(limits[i]))
            v = layout.directions[i] * reach
            if reach > NO_FORCE_N:
                verts.append(v[None, :])
                tugs.append(np.array([i]))
                leads_out.append(np.array([p.lead_rad]))
                polys.append(np.vstack([np.zeros(2), v]))
            else:
                polys.append(np.zeros((0, 2)))
            continue
        sectors[i] = True
        arc = used_arc(layout, i)  # a towline's leads clear of the hull
        if arc is None:
            polys.append(np.zeros((0, 2)))
            no_clear.append(i)
            continue
        lo, hi = arc
        curve = layout.curves[i] if layout.curves else None
        on_line = layout.share_angle_rad is not None and not math.isnan(layout.share_angle_rad[i])
        breaks = (
            np.zeros(0) if curve is None or on_line else -np.radians(np.asarray(curve.bearings_deg))
        )
        leads = _sector_leads(lo, hi, breaks, step, nest)
        if layout.ways and layout.ways[i] == "push":
            leads = _push_allowed(leads, lo, hi, limit)
        r = scale[i] * layout.shares(i, leads) if len(leads) else np.zeros(0)
        r = np.minimum(r, limits[i])  # the fitting's rating (the chords stay within it)
        angles = frame[i] + leads
        pts = np.column_stack([r * np.cos(angles), r * np.sin(angles)])
        keep = r > max(1e-12 * float(scale[i]), NO_FORCE_N)
        pts, leads = pts[keep], leads[keep]
        if not len(pts):
            polys.append(np.zeros((0, 2)))
            continue
        hull, _ = _star_hull(pts)
        polys.append(np.vstack([np.zeros((1, 2)), pts])[hull + 1])
        idx = hull[hull >= 0]
        verts.append(pts[idx])
        tugs.append(np.full(len(idx), i))
        leads_out.append(leads[idx])
    return TugSets(
        layout=layout,
        centroid=centroid,
        vertices=np.vstack(verts) if verts else np.zeros((0, 2)),
        vertex_tug=np.concatenate(tugs) if tugs else np.zeros(0, dtype=int),
        vertex_lead=np.concatenate(leads_out) if leads_out else np.zeros(0),
        polygons=tuple(polys),
        sectors=sectors,
        no_clear_lead=tuple(no_clear),
    )


def used_arc(layout: TugLayout, i: int) -> tuple[float, float] | None:
    """The leads of tug ``i``'s working sector that Solve and the hold limits take, (lo, hi)
    in rad from its lead 0 (``layout.lead_frame_rad[i]``), lo <= hi: for a towline the part
    clear of the hull (core.mechanics.leads.clear_arc, a run wider than half a turn cut to
    the half turn about its middle), for a push the whole sector; None when no lead runs
    clear (the tug is left out: notice ``no_clear_lead``). The board draws this arc.

    Tug ``i`` must have a working sector and the layout its lead frames.
    """
    p = layout.placements[i]
    frame = layout.lead_frame_rad
    if p.lead_sector_rad is None or frame is None:
        raise ValueError(f"{p.tug} has no working sector in this layout")
    sector = p.lead_sector_rad
    if layout.is_push[i] or layout.outline is None or layout.over_allowance_m is None:
        return sector
    point = (float(layout.points[i, 0]), float(layout.points[i, 1]))
    arc = clear_arc(
        layout.outline,
        point,
        float(frame[i]),
        float(p.line_length_m),
        float(layout.over_allowance_m[i]),
        sector,
    )
    if arc is None or arc == sector or arc[1] - arc[0] <= math.pi:
        return arc
    # More than half a turn is left, and leads were cut: the polygon, being convex, would
    # hold forces along the cut leads (a chord across the gap passes by the origin). The
    # half turn about the middle of what is left is kept: no force along a cut lead.
    mid = 0.5 * (arc[0] + arc[1])
    return (mid - 0.5 * math.pi, mid + 0.5 * math.pi)
