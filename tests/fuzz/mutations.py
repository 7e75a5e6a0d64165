"""Hostile variations of the sample project files, for the fuzz test and benchmarks/fuzz_files.py.

A mutation takes a sample's JSON tree (or its bytes) and a random source and returns a
damaged copy: a value swapped for something nasty (a null, a huge or tiny number, a
5000-digit integer, a lone surrogate, a list where a name is expected, deep nesting), a
key dropped or added, a list entry repeated or dropped, or bytes flipped, cut or
inserted. The random source is a ``random.Random`` or anything with the same
``random``/``randrange``/``choice`` methods, so hypothesis can drive it too.
"""

from __future__ import annotations

import copy
import functools
import json
import random
from pathlib import Path
from typing import Any, Protocol

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = sorted((ROOT / "sample_projects").glob("*.towboard"))


class Source(Protocol):
    def random(self) -> float: ...
    def randrange(self, n: int) -> int: ...


def choice(rnd: Source, seq: list[Any] | tuple[Any, ...]) -> Any:
    return seq[rnd.randrange(len(seq))]


def nested(depth: int) -> Any:
    value: Any = 1
    for _ in range(depth):
        value = [value]
    return value


def nasty_values() -> list[Any]:
    """Values hostile to a loader, one of each kind."""
    return [
        None,
        True,
        False,
        0,
        -1,
        -0.0,
        1e-300,
        5e-324,
        -5e-324,
        1e300,
        -1e300,
        1e200,
        10**30,
        10**400,  # too large for a float
        -(10**400),
        2**63,
        3.5,
        100.0001,
        360.5,
        float("nan"),
        float("inf"),
        "",
        " ",
        "x",
        "12",
        "\ud800",  # a lone surrogate
        "a\x00b",
        "a\nb",
        "\u202e",
        "x" * 5000,
        [],
        [1],
        [1, 2, 3],
        ["a", "b"],
        [None, None],
        [1e308, 1e308],
        [[0, 0], [1, 0]],
        {},
        {"name": "x"},
        nested(50),
        DEEP,
    ]


#: Numbers at the edges of the rules' ranges in the file's units (kN, kn, m, deg, %).
EDGE_VALUES = [
    0,
    0.0,
    1e-300,
    1e-9,
    0.5,
    1,
    3,
    9,
    20,
    50,
    89.999,
    100,
    200,
    359.999,
    360,
    500,
    1100,
    5000,
    9806.65,
    49033.25,
    36000,
    99999.9,
    100000,
]

#: Stands for a value nested 100,000 lists deep (too deep for json.dumps to write).
DEEP = "@@deep@@"


def paths(tree: Any, prefix: tuple[Any, ...] = ()) -> list[tuple[Any, ...]]:
    """Every path (a tuple of keys and indices) in a JSON tree, the root excluded."""
    out: list[tuple[Any, ...]] = []
    if isinstance(tree, dict):
        for k, v in tree.items():
            out.append((*prefix, k))
            out += paths(v, (*prefix, k))
    elif isinstance(tree, list):
        for i, v in enumerate(tree):
            out.append((*prefix, i))
            out += paths(v, (*prefix, i))
    return out


def _parent(tree: Any, path: tuple[Any, ...]) -> Any:
    node = tree
    for k in path[:-1]:
        node = node[k]
    return node


def number_paths(tree: Any) -> list[tuple[Any, ...]]:
    """The paths of every number in a JSON tree."""
    return [
        p
        for p in paths(tree)
        if isinstance(v := _parent(tree, p)[p[-1]], int | float) and not isinstance(v, bool)
    ]


def edge_numbers(tree: Any, rnd: Source, count: int = 1) -> Any:
    """A copy of ``tree`` with ``count`` numbers moved to the edges of their ranges."""
    tree = copy.deepcopy(tree)
    ps = number_paths(tree)
    for _ in range(count):
        path = choice(rnd, ps)
        sign = choice(rnd, [1, 1, -1, 1 + 1e-12, 0.999, 1e-6])
        _parent(tree, path)[path[-1]] = choice(rnd, EDGE_VALUES) * sign
    return tree


def mutate_tree(tree: Any, rnd: Source, count: int = 1) -> Any:
    """A copy of ``tree`` with ``count`` random structural mutations."""
    tree = copy.deepcopy(tree)
    for _ in range(count):
        ps = paths(tree)
        if not ps:
            return tree
        path = choice(rnd, ps)
        parent, key = _parent(tree, path), path[-1]
        op = rnd.randrange(10)
        v = parent[key]
        if op >= 8 and isinstance(v, int | float) and not isinstance(v, bool):
            # a number at or near the edge of what a plan may hold: often accepted
            parent[key] = choice(rnd, EDGE_VALUES) * choice(rnd, [1, 1, -1, 1 + 1e-12, 0.999])
        elif op <= 2:  # swap in a nasty value
            parent[key] = choice(rnd, nasty_values())
        elif op == 3:  # scale a number wildly
            v = parent[key]
            if isinstance(v, int | float) and not isinstance(v, bool):
                parent[key] = v * choice(rnd, [-1, 0, 1e-12, 1e3, 1e12, 1e300])
            else:
                parent[key] = choice(rnd, nasty_values())
        elif op == 4:  # drop the key or entry
            del parent[key]
        elif op == 5:  # add an unknown key or repeat an entry
            if isinstance(parent, dict):
                parent[choice(rnd, ["extra", "\ud800", "name", ""])] = choice(rnd, nasty_values())
            else:
                parent.insert(key, copy.deepcopy(parent[key]))
        elif op == 6:  # copy another subtree here
            other = choice(rnd, ps)
            parent[key] = copy.deepcopy(_parent(tree, other)[other[-1]])
        else:  # a name or text replaced by another type or a duplicate name
            parent[key] = choice(rnd, [["Barge"], {"hull": 1}, 7, None, "Tug 1", "Stage 1"])
    return tree


def to_text(tree: Any) -> str:
    """JSON text of a mutated tree; non-finite floats written as Python's json does."""
    text = json.dumps(tree, ensure_ascii=False, allow_nan=True)
    return text.replace(f'"{DEEP}"', "[" * 100_000 + "]" * 100_000)


def to_bytes(text: str) -> bytes:
    return text.encode("utf-8", errors="surrogatepass")


#: Bytes a plan file's mutation inserts: JSON's own, and two that start bad UTF-8.
JSON_BYTES = (*b'{}[]",:0123456789.-eE\\ntfu', 255, 195)


def mutate_bytes(
    data: bytes,
    rnd: Source,
    count: int = 1,
    inserts: tuple[int, ...] = JSON_BYTES,
    longest_cut: int = 1,
    longest_repeat: int = 64,
) -> bytes:
    """``data`` with ``count`` random byte flips, insertions (of ``inserts``), deletions
    (of up to ``longest_cut`` bytes), a cut, or a run of up to ``longest_repeat`` bytes
    repeated."""
    b = bytearray(data)
    for _ in range(count):
        if not b:
            break
        i = rnd.randrange(len(b))
        op = rnd.randrange(5)
        if op == 0:
            b[i] = rnd.randrange(256)
        elif op == 1:
            b.insert(i, choice(rnd, list(inserts)))
        elif op == 2:
            del b[i : i + (1 + rnd.randrange(longest_cut) if longest_cut > 1 else 1)]
        elif op == 3:
            del b[i:]
        else:
            j = rnd.randrange(len(b))
            b[i:i] = b[j : j + rnd.randrange(longest_repeat)]
    return bytes(b)


@functools.cache
def sample_trees() -> tuple[Any, ...]:
    """The samples' JSON trees (mutations copy them, never change them)."""
    return tuple(json.loads(p.read_text(encoding="utf-8")) for p in SAMPLES)


def random_case(rnd: random.Random) -> bytes:
    """One hostile file: a mutated tree, mutated bytes, or both."""
    tree = choice(rnd, list(sample_trees()))
    kind = rnd.randrange(4)
    if kind == 3:
        return to_bytes(to_text(edge_numbers(tree, rnd, 1 + rnd.randrange(6))))
    if kind == 0:
        return to_bytes(to_text(mutate_tree(tree, rnd, 1 + rnd.randrange(3))))
    text = to_bytes(to_text(tree) if kind == 1 else to_text(mutate_tree(tree, rnd)))
    return mutate_bytes(text, rnd, 1 + rnd.randrange(4))
