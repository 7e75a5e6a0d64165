"""Hostile files: hypothesis swaps values of the samples' JSON for arbitrary JSON (nulls,
huge and tiny numbers, long integers, lone surrogates, lists, objects, deep nesting) and
damages their bytes. Every file is refused by the project's own error family with one
line, or loads, reports and saves with finite numbers. benchmarks/fuzz_files.py runs
10,000 and more."""

from __future__ import annotations

import copy
import json
import tempfile
import warnings
from pathlib import Path
from typing import Any

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from tests.fuzz.checks import outcome
from tests.fuzz.mutations import DEEP, paths, sample_trees, to_bytes, to_text

numbers = st.one_of(
    st.integers(),
    st.integers(min_value=-(10**400), max_value=10**400),
    st.floats(allow_nan=True, allow_infinity=True),
    st.sampled_from([0, 1e-300, 5e-324, 1e300, 100.0, 360.0, 9806.65, 1e5]),
)
texts = st.one_of(st.text(max_size=30), st.sampled_from(["", " ", "\ud800", "a\x00", "x" * 300]))
json_values = st.recursive(
    st.one_of(st.none(), st.booleans(), numbers, texts, st.just(DEEP)),
    lambda inner: st.one_of(st.lists(inner, max_size=4), st.dictionaries(texts, inner, max_size=4)),
    max_leaves=8,
)
SAMPLES = sample_trees()


def _edited(tree: Any, path: tuple[Any, ...], value: Any | None, drop: bool) -> Any:
    """A copy of ``tree`` with the entry at ``path`` set to ``value``, or dropped."""
    tree = copy.deepcopy(tree)
    node = tree
    for k in path[:-1]:
        node = node[k]
    if drop:
        del node[path[-1]]
    else:
        node[path[-1]] = value
    return tree


@st.composite
def swapped_files(draw: st.DrawFn) -> bytes:
    """A sample with one to three values swapped for arbitrary JSON, or entries dropped."""
    tree = draw(st.sampled_from(SAMPLES))
    for _ in range(draw(st.integers(1, 3))):
        path = draw(st.sampled_from(paths(tree)))
        drop = draw(st.integers(0, 3)) == 0
        tree = _edited(tree, path, None if drop else draw(json_values), drop)
    return to_bytes(to_text(tree))


@st.composite
def damaged_bytes(draw: st.DrawFn) -> bytes:
    """A sample's bytes with a few flipped, cut, inserted or repeated."""
    data = bytearray(to_bytes(json.dumps(draw(st.sampled_from(SAMPLES)), ensure_ascii=False)))
    for _ in range(draw(st.integers(1, 4))):
        i = draw(st.integers(0, len(data) - 1))
        op = draw(st.integers(0, 3))
        if op == 0:
            data[i] = draw(st.integers(0, 255))
        elif op == 1:
            data[i:i] = draw(st.binary(min_size=1, max_size=8))
        elif op == 2:
            del data[i : i + draw(st.integers(1, 16))]
        else:
            del data[i:]
        if not data:
            break
    return bytes(data)


FUZZ = settings(
    max_examples=150,
    deadline=None,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large],
)


@FUZZ
@given(swapped_files())
def test_a_file_with_values_swapped_is_refused_cleanly_or_carried_through(data: bytes) -> None:
    with tempfile.TemporaryDirectory() as tmp:
        outcome(data, Path(tmp))


@FUZZ
@given(damaged_bytes())
def test_a_file_with_damaged_bytes_is_refused_cleanly_or_carried_through(data: bytes) -> None:
    with tempfile.TemporaryDirectory() as tmp:
        outcome(data, Path(tmp))


def test_numbers_at_the_edges_of_their_ranges_are_mostly_carried_through(tmp_path: Path) -> None:
    """Seeded moves of numbers to the edges of the rules' ranges: many such files load, and
    every one that does reports and saves with finite numbers."""
    import random

    from tests.fuzz.mutations import edge_numbers

    rnd = random.Random(9)
    results = [
        outcome(to_bytes(to_text(edge_numbers(tree, rnd, 1))), tmp_path)[0]
        for tree in SAMPLES
        for _ in range(6)
    ]
    assert results.count("accepted") >= len(results) // 4, results


FOUND = Path(__file__).resolve().parents[1] / "fuzz" / "found"


@pytest.mark.parametrize("name", sorted(p.name for p in FOUND.glob("*.towboard")))
def test_files_the_long_fuzz_run_found_are_carried_through(name: str, tmp_path: Path) -> None:
    """Files from benchmarks/fuzz_files.py (seed 7) that once failed, kept as they were:
    near_zero_sector: a lead sector from 3.6e-10 deg changed its digits on every save;
    long_astern_pull: a bollard pull of 500.00000000050005 kN (17 digits) moved the
    placeholder capability's shares (astern / bollard pull) on the first save;
    pads_for_a_tug_that_cannot_push: a conventional tug's own capability taken out, so its
    type's placeholder (no pushing) applies at a pushing pad: no rated pull there, and its
    use printed as inf (found by the suite's hypothesis test);
    tiny_coefficients: a head-on wind coefficient and a capability share of 1e-300 made
    the hold limits walk divide by a near-zero (an overflow warning, an error here as in
    the long run)."""
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        assert outcome((FOUND / name).read_bytes(), tmp_path)[0] == "accepted"


def _tiny_efficiency(d: dict[str, Any]) -> None:
    eff = d["tug_efficiency"]["efficiency"]
    eff[:] = [[5e-324] * len(row) for row in eff]


def _tiny_capability(d: dict[str, Any]) -> None:
    for tug in d["tugs"]:
        tug["capability"] = {
            "placeholder": False,
            "source": "fuzz",
            "bearing_deg_and_share": {
                "line": [[0.0, 5e-324], [180.0, 1e-300]],
                "push": [[0.0, 5e-324]],
                "push_pull": [[0.0, 1e-300]],
            },
        }


@pytest.mark.parametrize("damage", [_tiny_efficiency, _tiny_capability])
def test_denormal_shares_give_no_pull_not_a_crash(damage: Any, tmp_path: Path) -> None:
    """Efficiencies or capability shares of 5e-324 (allowed: the rules run from 0) make
    pulls of 1e-318 N, which once overflowed the hold limits' scaling (an SVD that did
    not converge, a traceback from `towboard report`). Such a force is none: the plan
    reports and saves with finite numbers."""
    d = json.loads((FOUND.parents[2] / "sample_projects" / "twin_barge_move.towboard").read_text())
    damage(d)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        kind, project = outcome(json.dumps(d).encode(), tmp_path)
    assert kind == "accepted"
    assert project is not None
