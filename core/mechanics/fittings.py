"""What each tug puts on the fitting it works at: the line's tension against the rating.

A towline from a fitting on a high deck runs down to the tug's towing point; the tug's
pull on the body is the line's horizontal part, so the fitting (and the line) carry the
tension T = H / cos(angle below the horizontal) (geometry: a 3-4-5 line at 36.87 degrees
carries 1.25 H). A push point carries the push itself. The rating compared is the
fitting's towing rating: its TOW (safe towing load) where given, else its SWL.

Separately, IMO MSC.1/Circ.1175 (2005) sizes a towing fitting for the tug that will use
it: design load 1.25 x the intended maximum towing load, SWL at most 80 % of that, so a
fitting of SWL S suits tugs of bollard pull up to S (:func:`core.mechanics.usable.fitting_suits`).

Several tugs may work at one fitting: the fitting then carries all their lines at once,
and :func:`fitting_totals` works out that load once for every view and the verdict.
What the ratings allow each tug's horizontal pull is :func:`pull_limits_n`, which the
solvers read through the tugs' sets (core.mechanics.tugsets).
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from core.mechanics.balance import TugLayout
from core.mechanics.bodies import Body
from core.mechanics.usable import fitting_suits
from core.model.plan import Project
from core.units import percent_words

#: A load within this fraction above the rating still counts as at the rating (rounding).
RATING_TOL = 1e-9


def line_tension_n(horizontal_n: float, angle_rad: float) -> float:
    """Tension of a line whose horizontal part is ``horizontal_n``, at ``angle_rad`` off the
    horizontal: T = H / cos(angle), N."""
    c = math.cos(angle_rad)
    if c <= 0:
        return math.inf if horizontal_n > 0 else 0.0
    return horizontal_n / c


@dataclass(frozen=True, slots=True)
class FittingLoad:
    """One tug's load on the fitting it works at, in one stage.

    ``load_n`` is the line's tension for a line point and the push for a push point, N;
    ``pull_n`` the horizontal pull on the body. ``rating_n`` is the fitting's towing
    rating (TOW, else SWL; ``rating_label`` says which), None where none is given.
    ``suits_tug`` is the IMO sizing rule (rating at least the tug's bollard pull) for line
    points with a rating, else None.
    """

    tug: str
    hull: str
    point: str
    mode: str  # "line" or "push"
    fitting_type: str
    pull_n: float
    line_angle_rad: float
    load_n: float
    rating_n: float | None
    rating_label: str  # "TOW", "SWL" or "" (no rating)
    bollard_pull_n: float
    suits_tug: bool | None
    lead_rad: float = 0.0  # the towline's lead, hull frame (line points)
    permitted_lead_rad: tuple[float, float] | None = None  # the fitting's rated leads
    lead_permitted: bool = True  # the lead is within the permitted line angles (or none given)

    @property
    def tension_n(self) -> float | None:
        """The line's tension, N (None at a push point)."""
        return self.load_n if self.mode == "line" else None

    @property
    def over_rating(self) -> bool:
        return _over(self.load_n, self.rating_n)

    @property
    def use_of_rating(self) -> float | None:
        """Load as a fraction of the rating (None without a rating)."""
        return None if self.rating_n is None else self.load_n / self.rating_n

    @property
    def use_words(self) -> str | None:
        """The load's use of its rating as every view prints it ("0.4 %", "60 %"), by the
        settings' percent rule (None without a rating)."""
        use = self.use_of_rating
        return None if use is None else percent_words(use)


def _over(load_n: float, rating_n: float | None) -> bool:
    return rating_n is not None and load_n > rating_n * (1 + RATING_TOL)


@dataclass(frozen=True, slots=True)
class FittingTotal:
    """The load on one fitting from every tug working at it, in one stage.

    ``load_n`` is the resultant of the lines' tensions (or the pushes) at the fitting:
    their horizontal parts added as vectors, and the vertical parts of the lines (a line
    from a high deck down to the tug pulls the fitting down as well as out) added, N.
    That is the force the fitting and its seating carry, so it is what is held against
    the one TOW or SWL; for one tug it is that tug's own load. Two lines pulling the same
    way add up in full; lines spread apart load the fitting less than the sum of their
    tensions (``sum_n``, never less than ``load_n``).
    """

    hull: str
    point: str
    fitting_type: str
    mode: str  # "line" or "push"
    tugs: tuple[str, ...]
    load_n: float
    sum_n: float  # the tensions (or pushes) added as numbers, N
    rating_n: float | None
    rating_label: str

    @property
    def shared(self) -> bool:
        """More than one tug works at the fitting."""
        return len(self.tugs) > 1

    @property
    def over_rating(self) -> bool:
        return _over(self.load_n, self.rating_n)

    @property
    def use_of_rating(self) -> float | None:
        """Load as a fraction of the rating (None without a rating)."""
        return None if self.rating_n is None else self.load_n / self.rating_n

    @property
    def use_words(self) -> str | None:
        """The load's use of its rating as every view prints it ("0.4 %", "60 %"), by the
        settings' percent rule (None without a rating)."""
        use = self.use_of_rating
        return None if use is None else percent_words(use)


def fitting_totals(loads: Sequence[FittingLoad], layout: TugLayout) -> tuple[FittingTotal, ...]:
    """Each fitting's load from all the tugs at it (``loads`` in placement order, as
    :func:`fitting_loads` gives them), in the order the fittings are first used."""
    groups: dict[tuple[str, str], list[int]] = {}
    for i, f in enumerate(loads):
        groups.setdefault((f.hull, f.point), []).append(i)
    out = []
    for idx in groups.values():
        first = loads[idx[0]]
        horizontal = np.zeros(2)
        vertical = 0.0
        for i in idx:
            f = loads[i]
            horizontal += f.pull_n * layout.directions[i]
            vertical += f.load_n * math.sin(f.line_angle_rad) if f.mode == "line" else 0.0
        out.append(
            FittingTotal(
                hull=first.hull,
                point=first.point,
                fitting_type=first.fitting_type,
                mode=first.mode,
                tugs=tuple(loads[i].tug for i in idx),
                load_n=math.hypot(float(np.hypot(*horizontal)), vertical),
                sum_n=sum(loads[i].load_n for i in idx),
                rating_n=first.rating_n,
                rating_label=first.rating_label,
            )
        )
    return tuple(out)


def pull_limits_n(layout: TugLayout, *, split_shared: bool = False) -> np.ndarray:
    """(n,) the largest horizontal pull each tug may give before its load on its fitting
    passes the rating, N: rating x cos(line angle) on a line (its tension T = H / cos(angle)
    is then the rating), the rating itself for a push; inf where no rating is given.

    These bound each tug alone; several tugs at one fitting are held to its rating
    together by the solver's own constraint (:func:`shared_fittings`). ``split_shared``
    instead shares the rating out among them in proportion to their usable pulls, so that
    each tug's set stays its own (the hold limits' sweep needs that): never more than the
    fitting takes, possibly less than the solver finds.
    """
    n = len(layout.placements)
    rating = np.asarray(layout.swl_n, dtype=float)
    per_n = tension_per_pull(layout)
    share = np.ones(n)
    if split_shared:
        most = layout.usable_n if layout.pull_scale_n is None else layout.pull_scale_n
        most = np.maximum(most, layout.usable_n)  # (n,) the most each can pull, N
        for idx in shared_fittings(layout).values():
            if float((most[idx] * per_n[idx]).sum()) <= float(rating[idx[0]]) * (1 + 1e-9):
                continue  # together they cannot pass it
            usable = most[idx]
            total = float(usable.sum())
            share[idx] = usable / total if total > 0 else 1.0 / len(idx)
    limit = np.divide(rating * share, per_n, out=np.zeros(n), where=np.isfinite(per_n))
    return np.where(np.isnan(rating), np.inf, limit)


def tension_per_pull(layout: TugLayout) -> np.ndarray:
    """(n,) the load each tug puts on its fitting per newton of horizontal pull: 1 /
    cos(line angle) on a line, 1 for a push (inf for a vertical line)."""
    n = len(layout.placements)
    angle = np.zeros(n) if layout.line_angle_rad is None else layout.line_angle_rad
    cos = np.where(layout.is_push, 1.0, np.cos(angle))
    return np.divide(1.0, cos, out=np.full(n, np.inf), where=cos > 1e-12)


def shared_fittings(layout: TugLayout) -> dict[tuple[str, str], np.ndarray]:
    """The rated fittings that more than one tug works at: (hull, point) -> the tugs'
    indices into the layout."""
    groups: dict[tuple[str, str], list[int]] = {}
    for i, p in enumerate(layout.placements):
        if not math.isnan(float(layout.swl_n[i])):
            groups.setdefault((p.hull, p.point), []).append(i)
    return {k: np.array(v) for k, v in groups.items() if len(v) > 1}


def fitting_loads(project: Project, body: Body, layout: TugLayout) -> tuple[FittingLoad, ...]:
    """Each placed tug's load on its fitting, in placement order."""
    pulls = layout.pulls_n
    angles = layout.line_angle_rad
    out = []
    for i, p in enumerate(layout.placements):
        fitting = body.fitting(p.hull, p.point)[1]
        tug = project.tug(p.tug)
        push = bool(layout.is_push[i])
        angle = 0.0 if push or angles is None else float(angles[i])
        pull = float(pulls[i])
        rating = fitting.towing_rating_n
        out.append(
            FittingLoad(
                tug=p.tug,
                hull=p.hull,
                point=p.point,
                mode="push" if push else "line",
                fitting_type=fitting.fitting_type,
                pull_n=pull,
                line_angle_rad=angle,
                load_n=pull if push else line_tension_n(pull, angle),
                rating_n=rating,
                rating_label=fitting.rating_label,
                bollard_pull_n=tug.bollard_pull_n,
                suits_tug=None
                if push or rating is None
                else fitting_suits(rating, tug.bollard_pull_n),
                lead_rad=p.lead_rad,
                permitted_lead_rad=None if push else fitting.permitted_lead_rad,
                lead_permitted=push or fitting.permits_lead(p.lead_rad),
            )
        )
    return tuple(out)
