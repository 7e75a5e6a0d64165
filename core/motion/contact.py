"""Contact between a drifting body and the site: quays, dolphins, moored vessels, basin
limits and the other bodies of the stage (held where they lie).

The body's outline is carried as each member's outline relative to the centre of
gravity G (body frame); a state [X, Y, psi, ...] places it in the site. The gap to an
obstacle is shapely's distance between the placed outline and the obstacle. Most of the
time everything is far away, so a cheap lower bound comes first: the distance from G to
the obstacle less the body's reach (the furthest point of its outline from G). Only
obstacles within reach are measured exactly.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
import shapely

from core.mechanics.bodies import Body
from core.mechanics.site import feature_geometry, placed_bodies
from core.model.plan import Project, Stage

#: The body touches an obstacle when the gap closes to this, m.
CONTACT_M = 1e-3
#: An obstacle already this close at the start is "alongside": it is reported as such
#: and not counted as a contact (the body lies against it).
ALONGSIDE_M = 1e-2


@dataclass(frozen=True, slots=True)
class Obstacle:
    """Something in the site the drifting body may touch (site frame geometry)."""

    name: str
    kind: str  # quay, dolphin, vessel, limit or body
    geometry: shapely.Geometry


def site_obstacles(project: Project, stage: Stage, body: str) -> tuple[Obstacle, ...]:
    """Every site feature, and every other body posed in ``stage`` where it lies."""
    out = [Obstacle(f.name, f.kind, feature_geometry(f)) for f in project.site.features]
    out += [
        Obstacle(pb.name, "body", pb.polygon)
        for pb in placed_bodies(project, stage)
        if pb.name != body
    ]
    return tuple(out)


def member_outlines(body: Body, cog: tuple[float, float]) -> tuple[np.ndarray, ...]:
    """Each member's outline in the body frame relative to ``cog``: (n_i, 2) arrays."""
    g = np.asarray(cog, dtype=float)
    return tuple(
        np.array([m.to_body(p) for p in m.hull.outline], dtype=float) - g for m in body.members
    )


def _segments(geometry: shapely.Geometry) -> np.ndarray:
    """(m, 2, 2) the straight pieces of a geometry's boundary (or of the line itself)."""
    parts = []
    lines = shapely.get_parts(
        shapely.boundary(geometry) if shapely.get_dimensions(geometry) == 2 else geometry
    )
    for line in lines:
        for ring in shapely.get_parts(line):
            c = shapely.get_coordinates(ring)
            parts.append(np.stack([c[:-1], c[1:]], axis=1))
    return np.concatenate(parts) if parts else np.zeros((0, 2, 2))


class Clearances:
    """Gaps between a body's outline, placed by states, and a set of obstacles."""

    def __init__(self, outlines: tuple[np.ndarray, ...], obstacles: tuple[Obstacle, ...]) -> None:
        self.outlines = outlines
        self.obstacles = obstacles
        self.reach = max(float(np.hypot(o[:, 0], o[:, 1]).max()) for o in outlines)
        self._geoms = np.array([o.geometry for o in obstacles], dtype=object)
        segs = [_segments(o.geometry) for o in obstacles]
        self._owner = np.concatenate(
            [np.full(len(s), j) for j, s in enumerate(segs)] + [np.zeros(0, int)]
        ).astype(int)
        flat = np.concatenate([*segs, np.zeros((0, 2, 2))])
        self._a = flat[:, 0]  # (m, 2) segment starts
        self._d = flat[:, 1] - flat[:, 0]  # (m, 2)
        self._dd = np.maximum(np.einsum("ij,ij->i", self._d, self._d), 1e-300)
        self._starts = np.searchsorted(self._owner, np.arange(len(obstacles)))
        # The members' polygons, moved in place for one state at a time (the event's path);
        # one by one, as the members' outlines may have different numbers of vertices.
        self._moving = np.array(
            [shapely.polygons(np.vstack([o, o[:1]])) for o in outlines], dtype=object
        )
        self._ring = np.vstack([np.vstack([o, o[:1]]) for o in outlines])

    def bounds(self, centres: np.ndarray) -> np.ndarray:
        """(k, n_obstacles) lower bounds of the gaps: distance from G (k, 2) less the reach.

        A lower bound moves no faster than G itself, which is what makes it cheap to
        follow along a track.
        """
        centres = np.atleast_2d(centres)
        if not len(self.obstacles):
            return np.zeros((len(centres), 0))
        rel = centres[:, None, :] - self._a[None, :, :]  # (k, m, 2)
        t = np.clip(np.einsum("kmj,mj->km", rel, self._d) / self._dd, 0.0, 1.0)
        off = rel - t[:, :, None] * self._d[None, :, :]
        dist = np.hypot(off[..., 0], off[..., 1])  # (k, m)
        return np.minimum.reduceat(dist, self._starts, axis=1) - self.reach

    def placed(self, states: np.ndarray) -> list[np.ndarray]:
        """Per member, (k, n_i, 2) site coordinates of its outline for states (k, >= 3)."""
        x, y, psi = states[:, 0], states[:, 1], states[:, 2]
        c, s = np.cos(psi)[:, None], np.sin(psi)[:, None]
        out = []
        for o in self.outlines:
            px = x[:, None] + c * o[:, 0] - s * o[:, 1]
            py = y[:, None] + s * o[:, 0] + c * o[:, 1]
            out.append(np.stack([px, py], axis=-1))
        return out

    def distances(self, states: np.ndarray, which: np.ndarray | None = None) -> np.ndarray:
        """(k, n) exact least distance from the outline to each obstacle (or to those
        ``which`` indexes), m."""
        states = np.atleast_2d(states)
        geoms = self._geoms if which is None else self._geoms[which]
        best = np.full((len(states), len(geoms)), np.inf)
        if not len(geoms):
            return best
        for coords in self.placed(states):
            polys = shapely.polygons(coords)
            best = np.minimum(best, shapely.distance(polys[:, None], geoms[None, :]))
        return best

    def least(self, state: np.ndarray) -> float:
        """The gap to the nearest obstacle for one state, m: exact for obstacles within
        reach, the lower bound for the others (inf with no obstacle)."""
        if not len(self.obstacles):
            return math.inf
        lb = self.bounds(np.asarray(state[:2], dtype=float))[0]
        near = lb <= 0.0
        if not near.any():
            return float(lb.min())
        x, y, psi = float(state[0]), float(state[1]), float(state[2])
        c, s = math.cos(psi), math.sin(psi)
        r = self._ring
        moved = np.column_stack([x + c * r[:, 0] - s * r[:, 1], y + s * r[:, 0] + c * r[:, 1]])
        shapely.set_coordinates(self._moving, moved)
        exact = float(shapely.distance(self._moving[:, None], self._geoms[near][None, :]).min())
        return min(exact, float(lb[~near].min(initial=math.inf)))

    def nearest(self, state: np.ndarray, k: int) -> tuple[tuple[float, float], tuple[float, float]]:
        """(point on the body, point on obstacle ``k``) nearest each other, site frame."""
        pairs = []
        for coords in self.placed(np.atleast_2d(state)):
            line = shapely.shortest_line(shapely.polygons(coords[0]), self._geoms[k])
            (ax, ay), (bx, by) = shapely.get_coordinates(line)
            pairs.append(
                (math.hypot(bx - ax, by - ay), (float(ax), float(ay)), (float(bx), float(by)))
            )
        _, at_body, at_other = min(pairs, key=lambda p: p[0])
        return at_body, at_other
