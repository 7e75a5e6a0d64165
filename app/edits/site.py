"""Edits of the site: add, rename and delete features; close or open their outlines; move,
insert and delete their points.

Points are in the site frame (x east, y north, m). A feature is rebuilt through
core.model.plan.SiteFeature, so every rule of the core holds (a closed feature is a
simple polygon of three or more points, a line has two or more); what breaks one
raises the core's InputError / OutlineError for the caller to show.
"""

from __future__ import annotations

import math
from dataclasses import replace

from core.errors import InputError
from core.model.plan import Project, SiteFeature, SiteFeatureKind

Point = tuple[float, float]

#: The word a new feature of each kind is named with ("Quay 1", "Dolphin 2"...).
KIND_WORDS: dict[str, str] = {
    "quay": "Quay",
    "dolphin": "Dolphin",
    "vessel": "Moored vessel",
    "limit": "Basin limit",
}


def feature(project: Project, name: str) -> SiteFeature:
    for f in project.site.features:
        if f.name == name:
            return f
    raise InputError("site feature", name, "does not exist")


def next_name(project: Project, kind: SiteFeatureKind) -> str:
    """A free name for a new feature of ``kind``: "Quay 1", "Quay 2"..."""
    taken = {f.name for f in project.site.features}
    word = KIND_WORDS[kind]
    n = 1
    while f"{word} {n}" in taken:
        n += 1
    return f"{word} {n}"


def _with_features(project: Project, features: tuple[SiteFeature, ...]) -> Project:
    return replace(project, site=replace(project.site, features=features))


def added(project: Project, new: SiteFeature) -> Project:
    """``project`` with ``new`` in its site; a name already used is refused."""
    if any(f.name == new.name for f in project.site.features):
        raise InputError("site feature name", new.name, "is used twice")
    return _with_features(project, (*project.site.features, new))


def replaced(project: Project, name: str, new: SiteFeature) -> Project:
    """``project`` with the feature called ``name`` replaced by ``new`` (same place in the list)."""
    feature(project, name)  # raises for an unknown name
    if new.name != name and any(f.name == new.name for f in project.site.features):
        raise InputError("site feature name", new.name, "is used twice")
    return _with_features(
        project, tuple(new if f.name == name else f for f in project.site.features)
    )


def renamed(project: Project, old: str, new: str) -> Project:
    """The feature called ``old`` called ``new`` (trimmed; not empty, not taken)."""
    new = new.strip()
    if not new:
        raise InputError("site feature name", new, "must not be empty")
    return replaced(project, old, replace(feature(project, old), name=new))


def deleted(project: Project, name: str) -> Project:
    feature(project, name)
    return _with_features(project, tuple(f for f in project.site.features if f.name != name))


def closed_set(project: Project, name: str, closed: bool) -> Project:
    """The feature called ``name`` with its outline closed (an area: the last point joined
    to the first) or open (a line through its points). Closing is refused by the core's
    rule for an area (three or more points, not all on one line, not crossing itself)."""
    f = feature(project, name)
    if f.closed == closed:
        return project
    return replaced(project, name, SiteFeature(f.name, f.kind, f.points, closed))


def _rebuilt(f: SiteFeature, points: list[Point]) -> SiteFeature:
    return SiteFeature(f.name, f.kind, tuple(points), f.closed)


def moved_point(project: Project, name: str, index: int, p: Point) -> Project:
    """Point ``index`` of feature ``name`` moved to site point ``p``."""
    f = feature(project, name)
    if not (math.isfinite(p[0]) and math.isfinite(p[1])):
        raise InputError(f"site {name}: point {index}", p, "must be finite")
    pts = list(f.points)
    pts[index] = (float(p[0]), float(p[1]))
    return replaced(project, name, _rebuilt(f, pts))


def inserted_point(project: Project, name: str, segment: int, p: Point) -> Project:
    """A new point ``p`` on segment ``segment`` (from point ``segment`` to the next)."""
    f = feature(project, name)
    pts = list(f.points)
    pts.insert(segment + 1, (float(p[0]), float(p[1])))
    return replaced(project, name, _rebuilt(f, pts))


def deleted_point(project: Project, name: str, index: int) -> Project:
    """Point ``index`` of feature ``name`` taken out (a feature keeps what it needs)."""
    f = feature(project, name)
    need = 3 if f.closed else 2
    if len(f.points) <= need:
        shape = "an area" if f.closed else "a line"
        raise InputError(
            f"site {name}: points", len(f.points), f"are the fewest {shape} can have ({need})"
        )
    pts = [q for i, q in enumerate(f.points) if i != index]
    return replaced(project, name, _rebuilt(f, pts))


def nearest_segment(f: SiteFeature, p: Point) -> tuple[int, Point, float]:
    """(segment, foot point, distance m) of the segment of ``f`` nearest to ``p``."""
    pts = list(f.points)
    n = len(pts) if f.closed else len(pts) - 1
    best: tuple[int, Point, float] | None = None
    for i in range(n):
        (x0, y0), (x1, y1) = pts[i], pts[(i + 1) % len(pts)]
        dx, dy = x1 - x0, y1 - y0
        den = dx * dx + dy * dy
        t = 0.0 if den == 0 else min(max(((p[0] - x0) * dx + (p[1] - y0) * dy) / den, 0.0), 1.0)
        foot = (x0 + t * dx, y0 + t * dy)
        d = math.hypot(p[0] - foot[0], p[1] - foot[1])
        if best is None or d < best[2]:
            best = (i, foot, d)
    if best is None:
        raise InputError(f"site {f.name}: points", len(pts), "make no segment")
    return best
