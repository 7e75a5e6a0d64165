"""The drift preview of one stage: the worst tug lost and all lines let go, each with its
first contact (what, when, how hard) or how far the body drifts in the look ahead; and
the words and rows the views print.

:func:`summarise` works it out from a stage's :class:`~core.motion.scenarios.DriftSetup`;
:func:`core.analysis.drift.stage_drift` does so once per stage result, which is what the
report, the briefing, the board and the command line read.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core.frames import site_angle_to_true
from core.motion.drift import DriftResult, DriftScenario, solve_drift
from core.motion.scenarios import DriftSetup, as_worst, tug_lost_drifts, worst_of
from core.notices import Notice
from core.units import DisplayUnits


@dataclass(frozen=True, slots=True, eq=False)
class StageDrift:
    """The drift preview of one stage.

    ``tug_lost`` holds the drift with each tug lost in turn (the others as set),
    ``worst`` the one of them that touches soonest (else drifts furthest), ``let_go``
    the drift with every line let go. ``reason`` says why there is nothing (no hull, no
    draught...), else "".
    """

    index: int
    stage: str
    body: str | None
    let_go: DriftResult | None = None
    tug_lost: tuple[DriftResult, ...] = ()
    worst: DriftResult | None = None
    setup: DriftSetup | None = None
    reason: str = ""

    @property
    def notices(self) -> tuple[Notice, ...]:
        """Each notice of the drifts once (what was estimated, what was left out)."""
        seen: dict[tuple[str, str], Notice] = {}
        for r in (self.let_go, self.worst, *self.tug_lost):
            if r is not None:
                for n in r.notices:
                    seen.setdefault((n.code, n.subject), n)
        return tuple(seen.values())

    def result(self, scenario: DriftScenario) -> DriftResult | None:
        """The drift of ``scenario`` from what was worked out (pulls as set: None)."""
        if scenario.kind == "let_go":
            return self.let_go
        if scenario.kind == "worst_tug_lost":
            return self.worst
        if scenario.kind == "tug_lost":
            return next((r for r in self.tug_lost if r.problem.scenario.tug == scenario.tug), None)
        return None


def summarise(setup: DriftSetup, index: int, stage: str) -> StageDrift:
    """Lines let go, and each tug lost in turn with the worst of them, for ``setup``."""
    let_go = solve_drift(setup.problem(DriftScenario("let_go")))
    each = tug_lost_drifts(setup)
    worst = worst_of(each)
    return StageDrift(
        index,
        stage,
        setup.body.name,
        let_go,
        each,
        None if worst is None else as_worst(worst),
        setup,
    )


# -- words ---------------------------------------------------------------------------------


def time_words(seconds: float) -> str:
    """A time for people: "45 s", "3 min 20 s", "10 min"."""
    s = max(0, round(seconds))
    if s < 120:
        return f"{s} s"
    return f"{s // 60} min" if s % 60 == 0 else f"{s // 60} min {s % 60:02d} s"


def contact_words(r: DriftResult, units: DisplayUnits) -> str:
    """The first contact in words, or that there is none within the look ahead."""
    c = r.contact
    if c is None:
        return (
            f"no contact within {time_words(r.problem.horizon_s)} "
            f"(drifts {units.show(r.excursion_m(), 'length', 0)} at most)"
        )
    kind = "" if c.other_kind == "body" else f" ({c.other_kind})"
    return (
        f"touches {c.other}{kind} after {time_words(c.time_s)}, "
        f"closing at {units.show(c.closing_speed_ms, 'speed', 2)}"
    )


def outcome_words(r: DriftResult, units: DisplayUnits) -> str:
    """The scenario, then what happens."""
    along = f"; lies alongside {', '.join(r.alongside)} at the start" if r.alongside else ""
    return f"{r.problem.scenario.words()}: {contact_words(r, units)}{along}"


@dataclass(frozen=True, slots=True)
class GhostRow:
    """Where the body is at one ghost time (or at contact), for tables."""

    time_s: float
    moved_m: float  # the centroid's distance from where it started
    heading_deg: float  # true
    speed_ms: float  # over the ground
    turn_deg_min: float  # positive: the bow swings to port
    at_contact: bool = False


def ghost_rows(r: DriftResult) -> list[GhostRow]:
    """A row per ghost time reached, and one at the contact."""
    states = list(zip(r.ghost_times, r.ghost_states, strict=True))
    if r.contact is not None:
        states.append((r.end_s, r.states[-1]))
    if not states:
        return []
    ys = np.array([y for _, y in states])
    start = r.centroid_track()[0]
    cent = r.centroid_track(ys)
    speed = r.speed_ms(ys)
    return [
        GhostRow(
            float(t),
            float(math.hypot(*(cent[k] - start))),
            site_angle_to_true(float(ys[k, 2])),
            float(speed[k]),
            math.degrees(float(ys[k, 5])) * 60.0,
            r.contact is not None and k == len(states) - 1,
        )
        for k, (t, _) in enumerate(states)
    ]


def ghost_groups(r: DriftResult, apart: float = 0.12) -> list[list[int]]:
    """The ghost times in runs whose centroids lie within ``apart`` of the body's size of
    the run's first: one label each ("30, 60 s") where ghosts lie almost on each other."""
    if not r.ghost_times:
        return []
    cents = r.centroid_track(r.ghost_states)
    size = 2.0 * max(float(np.hypot(o[:, 0], o[:, 1]).max()) for o in r.problem.outlines)
    groups: list[list[int]] = []
    for k in range(len(r.ghost_times)):
        if groups and np.hypot(*(cents[k] - cents[groups[-1][0]])) < apart * size:
            groups[-1].append(k)
        else:
            groups.append([k])
    return groups


def group_words(r: DriftResult, group: list[int]) -> str:
    """ "30, 60 s" for a run of ghost times."""
    return ", ".join(f"{r.ghost_times[i]:g}" for i in group) + " s"
