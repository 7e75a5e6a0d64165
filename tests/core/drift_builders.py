"""Small drift problems built in code for the drift tests: a 60 m x 20 m box whose centre
of gravity is the body frame's origin, with inertia and forces chosen per test."""

from __future__ import annotations

import numpy as np

from core.mechanics.site import Placing
from core.motion.contact import Obstacle
from core.motion.drift import DriftProblem, DriftScenario
from core.motion.dynamics import Motion
from core.motion.inertia import Inertia

LENGTH, BEAM = 60.0, 20.0
BOX = np.array([[-30.0, -10.0], [30.0, -10.0], [30.0, 10.0], [-30.0, 10.0]])

#: m = 3000 t; Iz = m (L^2 + B^2) / 12; added masses of the right order for such a box.
INERTIA = Inertia(
    mass_kg=3.0e6,
    yaw_inertia_kgm2=3.0e6 * (LENGTH**2 + BEAM**2) / 12.0,
    surge_added_kg=4.0e5,
    sway_added_kg=1.2e6,
    yaw_added_kgm2=1.2e6 * LENGTH**2 / 12.0,
    cog=(0.0, 0.0),
)

AT_ORIGIN = Placing(0.0, 0.0, 0.0)


def problem(
    motion: Motion,
    *,
    start: Placing = AT_ORIGIN,
    obstacles: tuple[Obstacle, ...] = (),
    horizon_s: float = 120.0,
    times_s: tuple[float, ...] = (30.0, 60.0, 120.0),
    velocity: tuple[float, float, float] = (0.0, 0.0, 0.0),
    outline: np.ndarray = BOX,
) -> DriftProblem:
    return DriftProblem(
        stage="test",
        body="box",
        scenario=DriftScenario("as_set"),
        motion=motion,
        start=start,
        outlines=(outline,),
        centroid=(0.0, 0.0),
        obstacles=obstacles,
        horizon_s=horizon_s,
        times_s=times_s,
        start_velocity=velocity,
    )
