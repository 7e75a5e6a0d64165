"""The half-spaces of a fleet with every lead as set, worked out once for the tug lost check.

With every tug at its lead as set, the wrenches the fleet can give (force ahead, force to
port, moment about the centroid) fill a zonotope: the sum of the segments from nothing
to each tug's wrench at its usable pull. Its facet normals are among the cross products
of pairs of those wrenches (core.solve.polytope.zonotope_normals), and its support in a
direction n is the sum of the positive parts of n . g_i. With one tug lost, the facet
normals are the pairs without that tug and the support is the full one less that tug's
part. The tug lost check solves the goal n + 1 times; making the normals and the (P, n)
table of each tug's part once, instead of once per solve, turns n^4 work into n^3.

:meth:`FleetZonotope.without` gives, for one tug lost, exactly the normals (in the same
order) that ``zonotope_normals`` gives for the fleet without it, or None where that
function would take another road (a flat set, a tug giving nothing), so that the solve
then makes its own.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np


@dataclass(frozen=True, slots=True, eq=False)
class HalfSpaces:
    """The half-spaces n . x <= h of one fleet's zonotope (P of them), in its scaled rows."""

    normals: np.ndarray  # (P, 3) unit
    support: np.ndarray  # (P,) h
    rows: np.ndarray  # (P,) each half-space's row in the whole fleet's table
    columns: np.ndarray  # (k,) the whole fleet's columns this fleet keeps
    table: np.ndarray  # (P_all, k_all) n . g for the whole fleet, its scaled rows
    factor: float  # this fleet's scaled rows over the whole fleet's

    def across(self, j: int) -> np.ndarray:
        """(k,) n . g of each of this fleet's columns for half-space ``j``."""
        return self.table[self.rows[j], self.columns] * self.factor


class FleetZonotope:
    """The whole fleet's pair normals and each column's part on them (k columns).

    ``gen`` (3, k) are the columns' wrenches at full pull in the solver's scaled rows, for
    ``u_ref`` the pull those rows are scaled by.
    """

    def __init__(self, gen: np.ndarray, u_ref: float) -> None:
        self.u_ref = u_ref
        self.k = gen.shape[1]
        norms = np.linalg.norm(gen, axis=0)
        self.norms = norms
        big = max(float(norms.max(initial=0.0)), 1e-300)
        # the usual road of zonotope_normals: every column counts, at least four of them
        self.usable = self.k >= 4 and bool(np.all(norms > 1e-12 * big))
        if not self.usable:
            return
        i, j = np.triu_indices(self.k, 1)
        cr = np.cross(gen[:, i].T, gen[:, j].T)
        size = np.linalg.norm(cr, axis=1)
        keep = size > 1e-9 * norms[i] * norms[j]
        normals = cr[keep] / size[keep, None]
        self.normals = np.vstack([normals, -normals])  # (P, 3)
        self.first = np.concatenate([i[keep], i[keep]])  # (P,) the pair's columns
        self.second = np.concatenate([j[keep], j[keep]])
        self.table = self.normals @ gen  # (P, k)
        self.parts = np.maximum(self.table, 0.0)
        self.support = self.parts.sum(axis=1)  # (P,)
        mag = np.abs(self.table)
        top = np.argmax(mag, axis=1) if self.k else np.zeros(0, dtype=int)
        self.top_col = top
        self.top = mag[np.arange(len(mag)), top]
        masked = mag.copy()
        masked[np.arange(len(mag)), top] = -1.0
        self.runner_up = masked.max(axis=1)  # the largest but one per row

    def without(self, lost: int, u_ref: float) -> HalfSpaces | None:
        """The half-spaces of the fleet less column ``lost``, in rows scaled by ``u_ref``;
        None where zonotope_normals would not take its usual road for it."""
        if not self.usable:
            return None
        keep_cols = np.flatnonzero(np.arange(self.k) != lost)
        rest = self.norms[keep_cols]
        big = max(float(rest.max(initial=0.0)), 1e-300)
        rows = np.flatnonzero((self.first != lost) & (self.second != lost))
        if not len(rows):
            return None
        # zonotope_normals's check that the set is solid (some normal leaves a column)
        biggest = np.where(self.top_col[rows] == lost, self.runner_up[rows], self.top[rows])
        if not float(biggest.max()) > 1e-9 * big:
            return None
        factor = self.u_ref / u_ref
        support = (self.support[rows] - self.parts[rows, lost]) * factor
        return HalfSpaces(self.normals[rows], support, rows, keep_cols, self.table, factor)
