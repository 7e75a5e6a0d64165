"""The tugs' efficiency table: the share of rated bollard pull a tug can give, by its
bollard pull and the sea state.

The efficiency of a tug falls as the sea gets up, more for a small tug than a large
one. The table is the user's data: its default values are placeholders with no source
(1.0 in sheltered water), to be replaced by figures the planner trusts. It is looked
up by the tug's rated bollard pull ahead and the stage's sea state, linearly between
rows and columns and held at the edges.
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np

from core.errors import InputError
from core.model import rules

TONNE_FORCE = 9806.65


def _default_pulls() -> tuple[float, ...]:
    return (20 * TONNE_FORCE, 50 * TONNE_FORCE, 100 * TONNE_FORCE)


def _default_values() -> tuple[tuple[float, ...], ...]:
    # Placeholders, no source: rows by bollard pull, columns by sea state 0, 2, 4, 6.
    return (
        (1.0, 0.9, 0.7, 0.45),
        (1.0, 0.93, 0.8, 0.6),
        (1.0, 0.95, 0.85, 0.7),
    )


_PULLS = rules.BOLLARD_PULL.named("bollard pulls")
_SEA_STATES = rules.SEA_STATE.named("sea states")


@dataclass(frozen=True, slots=True)
class EfficiencyTable:
    """Tug efficiency (0-1) by rated bollard pull (rows, N) and sea state (columns, 0-9)."""

    bollard_pulls_n: tuple[float, ...] = field(default_factory=_default_pulls)
    sea_states: tuple[float, ...] = (0.0, 2.0, 4.0, 6.0)
    values: tuple[tuple[float, ...], ...] = field(default_factory=_default_values)

    def __post_init__(self) -> None:
        for name, seq in (("bollard pulls", self.bollard_pulls_n), ("sea states", self.sea_states)):
            if len(seq) > rules.MAX_TABLE_SIZE:
                raise InputError(
                    f"efficiency table {name}", len(seq), f"must be at most {rules.MAX_TABLE_SIZE}"
                )
        bp = tuple(_PULLS.check(v, "efficiency table") for v in self.bollard_pulls_n)
        ss = tuple(_SEA_STATES.check(v, "efficiency table") for v in self.sea_states)
        vals = tuple(
            tuple(rules.EFFICIENCY.check(v, f"efficiency table row {i + 1}") for v in row)
            for i, row in enumerate(self.values)
        )
        _ascending("efficiency table bollard pulls", bp, low=0.0, strict_low=True)
        _ascending("efficiency table sea states", ss, low=0.0, high=9.0)
        if len(vals) != len(bp):
            raise InputError(
                "efficiency table", len(vals), f"must have {len(bp)} rows, one per bollard pull"
            )
        for i, row in enumerate(vals):
            if len(row) != len(ss):
                raise InputError(
                    f"efficiency table row {i + 1}",
                    len(row),
                    f"must have {len(ss)} values, one per sea state",
                )
            for j, v in enumerate(row):
                if not (math.isfinite(v) and 0.0 <= v <= 1.0):
                    raise InputError(
                        f"efficiency table row {i + 1}, sea state {ss[j]:g}", v, "must be 0 to 1"
                    )
        object.__setattr__(self, "bollard_pulls_n", bp)
        object.__setattr__(self, "sea_states", ss)
        object.__setattr__(self, "values", vals)

    def efficiency(self, bollard_pull_n: float, sea_state: float) -> float:
        """Bilinear interpolation in the table, held at its edges."""
        return float(self.efficiencies(np.array([bollard_pull_n]), sea_state)[0])

    def efficiencies(self, bollard_pulls_n: np.ndarray, sea_state: float) -> np.ndarray:
        """(n,) efficiencies for tugs of the given rated bollard pulls (n,), N."""
        by_sea = [float(np.interp(sea_state, self.sea_states, row)) for row in self.values]
        return np.interp(np.asarray(bollard_pulls_n, dtype=float), self.bollard_pulls_n, by_sea)


def _ascending(
    name: str,
    values: Sequence[float],
    *,
    low: float,
    high: float | None = None,
    strict_low: bool = False,
) -> None:
    if not values:
        raise InputError(name, values, "must have at least one value")
    for v in values:
        bad_low = v <= low if strict_low else v < low
        if not math.isfinite(v) or bad_low or (high is not None and v > high):
            span = f"above {low:g}" if strict_low else f"{low:g} or more"
            if high is not None:
                span = f"{low:g} to {high:g}"
            raise InputError(name, v, f"must be {span}")
    if any(b <= a for a, b in itertools.pairwise(values)):
        raise InputError(name, list(values), "must be in increasing order")
