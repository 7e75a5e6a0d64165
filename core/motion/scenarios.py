"""Drift problems from a plan: a stage's body, its tugs as set, its wind and current, and
the site round it, for each scenario (pulls as set, a tug lost, the worst tug lost, all
lines let go).

:func:`drift_setup` works out once what every scenario of a stage shares (the body's
inertia and drag, the wind, the obstacles, each tug's pull as a force and a moment about
the centre of gravity); :meth:`DriftSetup.problem` makes the problem of one scenario.
:func:`drift` solves one scenario; for "worst tug lost" it solves the loss of each tug
and keeps the worst: the soonest contact, else the furthest drift at the horizon.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from functools import lru_cache

import numpy as np

from core.errors import InputError
from core.frames import true_to_site_angle
from core.mechanics.balance import TugLayout, tug_layout
from core.mechanics.bodies import Body, Member, stage_body
from core.mechanics.loads import current_model, wind_model
from core.mechanics.site import Placing, body_pose
from core.model.conditions import Conditions
from core.model.drift import DriftSettings
from core.model.plan import Project, Stage
from core.motion.contact import member_outlines, site_obstacles
from core.motion.drift import DriftProblem, DriftResult, DriftScenario, solve_drift
from core.motion.dynamics import Motion, Strip, WaterDrag
from core.motion.inertia import Inertia, body_inertia
from core.notices import Notice


@lru_cache(maxsize=64)
def _inertia(members: tuple[tuple[object, ...], ...], name: str, rho: float) -> Inertia:
    body = Body(name, tuple(Member(*m) for m in members))  # type: ignore[arg-type]
    return body_inertia(body, rho)


def inertia_of(body: Body, water_density: float) -> Inertia:
    """:func:`core.motion.inertia.body_inertia`, remembered for bodies met before."""
    key = tuple((m.hull, m.x, m.y, m.heading_rad) for m in body.members)
    return _inertia(key, body.name, water_density)


def water_drag(body: Body, c: Conditions, cog: tuple[float, float]) -> WaterDrag:
    """The water's drag on ``body`` from the current load's own coefficients and areas.

    The side's 1/2 rho C A is shared among the members by their side areas, each spread
    evenly over its length (x measured from ``cog``); a user-set current centre moves the
    whole spread so its centre lies there.
    """
    cm = current_model(body, c)
    spans = []
    for m in body.members:
        pts = np.array([m.to_body(p) for p in m.hull.outline])
        x0, x1 = float(pts[:, 0].min()), float(pts[:, 0].max())
        spans.append((x0, x1, (x1 - x0) * (m.hull.draught_m or 1.0)))
    total = sum(a for _, _, a in spans)
    centre = sum(0.5 * (x0 + x1) * a for x0, x1, a in spans) / total
    shift = cm.point[0] - centre if c.current_centre_m is not None else 0.0
    gx, gy = cog
    strips = tuple(
        Strip(x0 + shift - gx, x1 + shift - gx, cm.k_beam * a / total / (x1 - x0))
        for x0, x1, a in spans
    )
    return WaterDrag(cm.k_head, cm.point[1] - gy, strips, cm.travel_m)


def wind_velocity(c: Conditions) -> tuple[float, float]:
    """The design wind's site velocity (where it blows towards), m/s."""
    if c.wind_speed_ms <= 0:
        return (0.0, 0.0)
    a = true_to_site_angle(c.wind_from_deg + 180.0)
    return (c.design_wind_ms * math.cos(a), c.design_wind_ms * math.sin(a))


def current_velocity(c: Conditions) -> tuple[float, float]:
    """The current's site velocity, m/s."""
    a = true_to_site_angle(c.current_towards_deg)
    return (c.current_speed_ms * math.cos(a), c.current_speed_ms * math.sin(a))


@dataclass(frozen=True, slots=True, eq=False)
class DriftSetup:
    """What every drift scenario of one body in one stage shares.

    ``tug_wrenches`` (n, 3): each tug's (force ahead, force to port, moment about G) as
    set, body frame, in the order of ``layout.placements``; ``base`` the problem with
    every pull as set.
    """

    body: Body
    layout: TugLayout
    tug_wrenches: np.ndarray
    base: DriftProblem

    @property
    def tugs(self) -> tuple[str, ...]:
        return tuple(p.tug for p in self.layout.placements)

    def problem(self, scenario: DriftScenario) -> DriftProblem:
        """The problem of ``scenario`` ("worst tug lost" needs its tug named)."""
        keep = np.ones(len(self.tugs), bool)
        if scenario.kind == "let_go":
            keep[:] = False
        elif scenario.kind in ("tug_lost", "worst_tug_lost"):
            if scenario.tug not in self.tugs:
                raise InputError(
                    "tug lost", scenario.tug, f"does not work on {self.body.name} in this stage"
                )
            keep[self.tugs.index(scenario.tug)] = False
        wrench = self.tug_wrenches[keep].sum(axis=0) if keep.any() else np.zeros(3)
        motion = replace(
            self.base.motion, tug=(float(wrench[0]), float(wrench[1]), float(wrench[2]))
        )
        return replace(self.base, scenario=scenario, motion=motion)


def drift_setup(
    project: Project,
    stage: Stage,
    body: str | None = None,
    *,
    layout: TugLayout | None = None,
    settings: DriftSettings | None = None,
) -> DriftSetup:
    """Work out what the drift scenarios of ``body`` (default: the stage's main body) share.

    Raises InputError where the body's mass or drag cannot be had (no displacement and
    no draught, no draught for the added mass, no current area). A wind load whose area
    is unknown is left out, with a notice.
    """
    b = stage_body(project, stage, body)
    if layout is None:
        layout = tug_layout(project, stage, b)
    c = stage.conditions
    inertia = inertia_of(b, c.water_density)
    gx, gy = inertia.cog
    forces = layout.directions * layout.pulls_n[:, None]  # (n, 2)
    arms = layout.points - np.array([gx, gy])  # (n, 2)
    moments = arms[:, 0] * forces[:, 1] - arms[:, 1] * forces[:, 0]
    wrenches = np.column_stack([forces, moments])  # (n, 3)
    notices: list[Notice] = []
    wind = None
    if c.wind_speed_ms > 0:
        try:
            wind = wind_model(b, c)
        except InputError as e:
            notices.append(Notice("no_wind_load", b.name, f"Drift without the wind: {e}"))
    motion = Motion(
        inertia=inertia,
        tug=tuple(float(v) for v in wrenches.sum(axis=0)) if len(wrenches) else (0.0, 0.0, 0.0),  # type: ignore[arg-type]
        wind=wind,
        wind_velocity=wind_velocity(c),
        water=water_drag(b, c, (gx, gy)),
        current_velocity=current_velocity(c),
    )
    s = settings or project.drift
    base = DriftProblem(
        stage=stage.name,
        body=b.name,
        scenario=DriftScenario("as_set"),
        motion=motion,
        start=Placing.of(body_pose(project, stage, b.name)),
        outlines=member_outlines(b, (gx, gy)),
        centroid=b.centroid,
        obstacles=site_obstacles(project, stage, b.name),
        horizon_s=s.horizon_s,
        times_s=s.times_s,
        notices=tuple(notices),
    )
    return DriftSetup(b, layout, wrenches, base)


def tug_lost_drifts(setup: DriftSetup) -> tuple[DriftResult, ...]:
    """The drift with each tug lost in turn (the others as set)."""
    return tuple(solve_drift(setup.problem(DriftScenario("tug_lost", t))) for t in setup.tugs)


def worst_of(results: tuple[DriftResult, ...]) -> DriftResult | None:
    """The worst drift: the soonest contact; if none touches, the furthest drift."""
    if not results:
        return None
    touching = [r for r in results if r.contact is not None]
    if touching:
        return min(touching, key=lambda r: r.contact.time_s if r.contact else math.inf)
    return max(results, key=lambda r: r.excursion_m())


def as_worst(result: DriftResult) -> DriftResult:
    """``result`` relabelled as the worst tug lost."""
    tug = result.problem.scenario.tug
    problem = result.problem.with_scenario(DriftScenario("worst_tug_lost", tug))
    return replace(result, problem=problem)


def drift(
    project: Project,
    stage: Stage,
    scenario: DriftScenario,
    body: str | None = None,
    *,
    setup: DriftSetup | None = None,
) -> DriftResult | None:
    """The drift of ``scenario``; None for "worst tug lost" when no tug works on the body."""
    s = setup or drift_setup(project, stage, body)
    if scenario.kind == "worst_tug_lost" and scenario.tug is None:
        worst = worst_of(tug_lost_drifts(s))
        return None if worst is None else as_worst(worst)
    return solve_drift(s.problem(scenario))
