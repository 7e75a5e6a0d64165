"""Planar force systems and their single equivalent force.

The statics of equivalent systems in the plane: forces add as vectors, moments add,
a force slides along its line of action without changing its effect, an equal and
opposite pair is a pure couple, and any system reduces to one force on one line of
action, or to a couple. Everything is vectorised over n forces with numpy; this is
the drag path.

Moments are z-components, positive counter-clockwise seen from above (in the hull
frame that swings the bow to port), N*m.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Literal

import numpy as np

#: The one rule for "negligible", read by the equivalent force, the words, the goal check
#: and the solvers: a net force is negligible when it is within this share of what the
#: stage deals in (the sum of the magnitudes of the tugs' pulls and of the loads), and a
#: yaw moment when within that force times the body's length. Half a percent: below what a
#: tug master can set or a planner can know of the conditions (common practice, no source).
#: A force within it with a moment beyond it is a couple (statics: a system whose
#: resultant is zero reduces to a couple, the same about every point); within both, the
#: system is balanced.
NEGLIGIBLE = 0.005
#: ... and never below this, N (about 0.1 t): finer than a tug master can set a pull, so a
#: stage in light conditions is not said to walk, or to miss its goal, by a few hundred
#: newtons (common practice, no source).
NEGLIGIBLE_FLOOR_N = 1000.0

EquivalentKind = Literal["force", "couple", "balanced"]


def negligible(
    scale_n: float, length_m: float, floor_n: float = NEGLIGIBLE_FLOOR_N
) -> tuple[float, float]:
    """(force N, moment N*m) within which a net force and a yaw moment are negligible.

    ``scale_n`` is what the stage deals in (the tugs' pulls and the loads, N) and
    ``length_m`` the body's length: :data:`NEGLIGIBLE` of the first, at least ``floor_n``,
    and that times the length for the moment.
    """
    tol_f = max(NEGLIGIBLE * max(scale_n, 0.0), floor_n)
    return tol_f, tol_f * max(length_m, 1.0)


def cross2(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """z-component of a x b for (..., 2) arrays."""
    return a[..., 0] * b[..., 1] - a[..., 1] * b[..., 0]


def moment_of(
    point: tuple[float, float], force: tuple[float, float], ref: tuple[float, float]
) -> float:
    """Moment about ``ref`` of one ``force`` applied at ``point``: (r - r_ref) x F, N*m."""
    return (point[0] - ref[0]) * force[1] - (point[1] - ref[1]) * force[0]


def moments_about(points: np.ndarray, forces: np.ndarray, ref: tuple[float, float]) -> np.ndarray:
    """Moment of each force about ``ref``. points, forces: (n, 2) -> (n,)."""
    return cross2(points - np.asarray(ref, dtype=float), forces)


def resultant(
    points: np.ndarray, forces: np.ndarray, ref: tuple[float, float]
) -> tuple[np.ndarray, float]:
    """Net force (2,) and net moment about ``ref`` of the system."""
    return forces.sum(axis=0), float(moments_about(points, forces, ref).sum())


def transfer_moment(
    moment_a: float, a: tuple[float, float], b: tuple[float, float], net: np.ndarray
) -> float:
    """Moment about B from the moment about A: M_B = M_A + (r_A - r_B) x R."""
    return float(moment_a + (a[0] - b[0]) * net[1] - (a[1] - b[1]) * net[0])


@dataclass(frozen=True, slots=True)
class Equivalent:
    """The single force equivalent to a system, about a named reference point.

    ``point`` is the foot of the perpendicular from ``ref`` to the line of action and
    ``direction`` its unit vector along the net force; both are None for a couple or
    a balanced system. ``offset_m`` is the signed perpendicular distance from ``ref``
    to the line (positive when the line passes to the right of ``ref`` looking along
    the force, so that ``moment = offset * |R|``).
    """

    kind: EquivalentKind
    force: tuple[float, float]
    moment: float
    ref: tuple[float, float]
    point: tuple[float, float] | None
    direction: tuple[float, float] | None
    offset_m: float | None

    @property
    def magnitude(self) -> float:
        return math.hypot(*self.force)

    def moment_about(self, p: tuple[float, float]) -> float:
        return transfer_moment(self.moment, self.ref, p, np.asarray(self.force))

    def crossing_x(self, y: float = 0.0) -> float | None:
        """x where the line of action crosses the line y = const (the centreline for 0)."""
        if self.point is None or self.direction is None or abs(self.direction[1]) < 1e-12:
            return None
        t = (y - self.point[1]) / self.direction[1]
        return self.point[0] + t * self.direction[0]


def equivalent(
    points: np.ndarray,
    forces: np.ndarray,
    ref: tuple[float, float],
    length_scale: float = 1.0,
) -> Equivalent:
    """Reduce forces (n, 2) at points (n, 2) to one force on one line, about ``ref``.

    The line of action is every r with (r - ref) x R = M_ref; its nearest point to
    ``ref`` is ref + M (R_y, -R_x) / |R|^2
    (computed through the unit direction, so a tiny |R| cannot underflow). Couples and
    balanced systems by :func:`negligible` of the sum of the force magnitudes, with no
    floor; ``length_scale`` (m, the body's length) sets the moment scale.
    """
    net, m = resultant(points, forces, ref)
    scale = float(np.hypot(forces[:, 0], forces[:, 1]).sum())
    return equivalent_of(net, m, ref, negligible(scale, length_scale, floor_n=0.0))


def equivalent_of(
    net: np.ndarray, moment: float, ref: tuple[float, float], tolerance: tuple[float, float]
) -> Equivalent:
    """The equivalent of a known net force and moment about ``ref``.

    ``tolerance`` is (force N, moment N*m) within which each is negligible
    (:func:`negligible`): a negligible force is no force, and has no line of action.
    """
    fx, fy = float(net[0]), float(net[1])
    r = math.hypot(fx, fy)
    tol_f, tol_m = tolerance
    if r <= tol_f:
        kind: EquivalentKind = "balanced" if abs(moment) <= tol_m else "couple"
        return Equivalent(kind, (fx, fy), moment, ref, None, None, None)
    ux, uy = fx / r, fy / r
    offset = moment / r
    point = (ref[0] + offset * uy, ref[1] - offset * ux)
    return Equivalent("force", (fx, fy), moment, ref, point, (ux, uy), offset)
