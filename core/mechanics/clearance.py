"""Clearances: the least distance from each body to each site feature and to each other body.

Measured per stage in the site frame (x east, y north, m) between the bodies' plan
outlines placed by their poses, with the pair of nearest points so the board and the
briefing can show where the least distance occurs. A clearance below the stage's
minimum (or, where the stage sets none, the plan's clearance margin) is a warning.
"""

from __future__ import annotations

from dataclasses import dataclass

import shapely
import shapely.ops

from core.mechanics.site import PlacedBody, feature_geometry, placed_bodies
from core.model.plan import Project, Stage
from core.notices import Notice
from core.units import DisplayUnits

Point = tuple[float, float]


@dataclass(frozen=True, slots=True)
class Clearance:
    """The least distance between one body and one other thing in one stage.

    ``at_body`` and ``at_other`` are the nearest points (site frame, m); they coincide
    when the two touch or overlap. ``other_kind`` is the site feature's kind
    (quay, dolphin, vessel, limit) or ``"body"``.
    """

    stage: str
    body: str
    other: str
    other_kind: str
    distance_m: float
    at_body: Point
    at_other: Point
    margin_m: float
    outside_limit: bool = False  # the body is not inside a closed basin limit

    @property
    def below_margin(self) -> bool:
        return self.outside_limit or self.distance_m < self.margin_m

    @property
    def touching(self) -> bool:
        return self.distance_m <= 1e-9


def stage_margin(project: Project, stage: Stage) -> float:
    """The clearance that counts as enough in ``stage``, m."""
    m = stage.limits.min_clearance_m
    return project.clearance_margin_m if m is None else m


def _nearest(a: shapely.Geometry, b: shapely.Geometry) -> tuple[float, Point, Point]:
    pa, pb = shapely.ops.nearest_points(a, b)
    return float(a.distance(b)), (float(pa.x), float(pa.y)), (float(pb.x), float(pb.y))


def stage_clearances(
    project: Project, stage: Stage, bodies: tuple[PlacedBody, ...] | None = None
) -> tuple[Clearance, ...]:
    """Every body's clearance to every site feature, then to every other body (each pair once)."""
    placed = placed_bodies(project, stage) if bodies is None else bodies
    margin = stage_margin(project, stage)
    out: list[Clearance] = []
    for pb in placed:
        for f in project.site.features:
            d, at_b, at_o = _nearest(pb.polygon, feature_geometry(f))
            outside = (
                f.closed and f.kind == "limit" and not shapely.Polygon(f.points).covers(pb.polygon)
            )
            out.append(
                Clearance(stage.name, pb.name, f.name, f.kind, d, at_b, at_o, margin, outside)
            )
    for i, a in enumerate(placed):
        for b in placed[i + 1 :]:
            d, at_a, at_b = _nearest(a.polygon, b.polygon)
            out.append(Clearance(stage.name, a.name, b.name, "body", d, at_a, at_b, margin))
    return tuple(out)


def least_per_body(clearances: tuple[Clearance, ...]) -> dict[str, Clearance]:
    """The smallest clearance of each body (a body outside a basin limit counts first)."""
    best: dict[str, Clearance] = {}
    for c in clearances:
        for name in (c.body, c.other) if c.other_kind == "body" else (c.body,):
            old = best.get(name)
            key = (not c.outside_limit, c.distance_m)
            if old is None or key < (not old.outside_limit, old.distance_m):
                best[name] = c
    return best


def notable_clearances(clearances: tuple[Clearance, ...]) -> list[Clearance]:
    """The clearances worth drawing: each one below its margin, and each body's least.

    A body partly outside a basin limit has no meaningful pair of nearest points to
    the limit, so that one is said in words only (see :func:`clearance_notices`).
    """
    out = [c for c in clearances if c.below_margin and not c.outside_limit]
    for c in least_per_body(clearances).values():
        if c not in out and not c.outside_limit:
            out.append(c)
    return out


def clearance_notices(clearances: tuple[Clearance, ...], units: DisplayUnits) -> tuple[Notice, ...]:
    """A warning for each clearance below its margin, with the distance in display units."""
    out: list[Notice] = []
    for c in clearances:
        if not c.below_margin:
            continue
        what = "" if c.other_kind == "body" else f" ({c.other_kind})"
        subject = f"{c.body} / {c.other}"
        if c.outside_limit:
            msg = f"{c.body} lies partly outside the limit {c.other}"
        elif c.touching:
            msg = f"{c.body} touches or overlaps {c.other}{what}"
        else:
            gap, margin = units.show_against(c.distance_m, c.margin_m, "length")
            msg = f"{c.body} is {gap} from {c.other}{what}, below the {margin} clearance margin"
        out.append(Notice("low_clearance", subject, msg))
    return tuple(out)
