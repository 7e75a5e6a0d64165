"""The self-crossing check by sweep line agrees with shapely's own (GEOS) simplicity test
and finds exactly the overlapping boxes a brute-force comparison finds."""

from __future__ import annotations

import numpy as np
import shapely
from hypothesis import given, settings
from hypothesis import strategies as st

from core.model.outlines import box_pairs, first_crossing


def _dedupe(pts: list[tuple[int, int]]) -> list[tuple[int, int]]:
    out: list[tuple[int, int]] = []
    for p in pts:
        if not out or p != out[-1]:
            out.append(p)
    while len(out) > 1 and out[0] == out[-1]:
        out.pop()
    return out


grid_polygons = st.lists(
    st.tuples(st.integers(-4, 4), st.integers(-4, 4)), min_size=3, max_size=14
).map(_dedupe)


@settings(max_examples=400, deadline=None)
@given(grid_polygons)
def test_a_crossing_is_found_exactly_when_shapely_says_the_ring_is_not_simple(
    pts: list[tuple[int, int]],
) -> None:
    if len(pts) < 3:
        return
    v = np.asarray(pts, dtype=float)
    ring = shapely.LinearRing(v)  # the reference: GEOS's simplicity test (exact on a grid)
    found = first_crossing(v)
    assert (found is None) == bool(shapely.is_simple(ring)), (pts, found)
    if found is not None:
        i, j = found
        n = len(v)
        e1 = shapely.LineString([v[i], v[(i + 1) % n]])
        e2 = shapely.LineString([v[j], v[(j + 1) % n]])
        assert e1.intersects(e2)  # the two edges named do meet


boxes = st.lists(
    st.tuples(st.floats(-50, 50), st.floats(-50, 50), st.floats(0, 30), st.floats(0, 30)),
    min_size=1,
    max_size=60,
)


def _brute(lo: np.ndarray, hi: np.ndarray) -> set[tuple[int, int]]:
    n = len(lo)
    return {
        (i, j)
        for i in range(n)
        for j in range(i + 1, n)
        if (lo[i] <= hi[j]).all() and (lo[j] <= hi[i]).all()
    }


@settings(max_examples=200, deadline=None)
@given(boxes)
def test_box_pairs_finds_every_overlapping_pair_and_no_other(
    spec: list[tuple[float, float, float, float]],
) -> None:
    a = np.asarray(spec)
    lo, hi = a[:, :2], a[:, :2] + a[:, 2:]
    i, j = box_pairs(lo, hi)
    assert set(zip(i.tolist(), j.tolist(), strict=True)) == _brute(lo, hi)


def test_box_pairs_falls_back_to_a_tree_for_a_comb() -> None:
    """Long edges overlapping on both axes at once (a comb of diagonals) take the STRtree
    road; the pairs are the same."""
    n = 700  # n (n - 1) / 2 candidate pairs on either axis: past the sweep's budget
    t = np.arange(n, dtype=float)
    lo = np.c_[t * 0.01, t * 0.01]
    hi = np.c_[1000 - t * 0.01, 1000 - t * 0.01]  # every box overlaps every other
    i, j = box_pairs(lo, hi)
    assert len(i) == n * (n - 1) // 2
    assert set(zip(i.tolist(), j.tolist(), strict=True)) == _brute(lo, hi)
