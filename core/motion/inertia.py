"""A body's inertia in the horizontal plane: rigid-body mass and yaw inertia, and the
added mass of the water it drags along (:mod:`core.motion.added_mass`).

Everything is about the body's centre of gravity, in the body frame (x forward, y to
port). The mass is each member's displacement; where a hull has none it is estimated
as water density x plan area x draught (a wall-sided hull), with a notice. The yaw
inertia is each member's mass times the square of its yaw radius of gyration where one
is given, else that of a uniform plate of the member's outline (radius of gyration
sqrt((L^2 + B^2) / 12) for a box), moved to the body's centre of gravity by the
parallel-axis rule.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from core.errors import InputError
from core.mechanics.bodies import Body, Member
from core.motion.added_mass import (
    SHIP_MAX_BEAM_RATIO,
    body_sections,
    clarke_sway_yaw,
    sections_added_mass,
    soding_surge,
)
from core.notices import Notice

SECTIONS_WORDS = "2-D sections (DNV-RP-C205) along the length, surge by Soding"
SHIP_WORDS = "ship regressions (Clarke, Gedling and Hine 1983), surge by Soding"


@dataclass(frozen=True, slots=True)
class Inertia:
    """Mass and added mass of a body, about its centre of gravity ``cog`` (body frame, m).

    ``mass_kg`` and ``yaw_inertia_kgm2`` are the rigid body's; ``surge_added_kg``,
    ``sway_added_kg`` and ``yaw_added_kgm2`` the water's. ``method`` says in words how
    the added mass was estimated; ``notices`` what was estimated or replaced.
    """

    mass_kg: float
    yaw_inertia_kgm2: float
    surge_added_kg: float
    sway_added_kg: float
    yaw_added_kgm2: float
    cog: tuple[float, float]
    method: str = SECTIONS_WORDS
    notices: tuple[Notice, ...] = ()

    def __post_init__(self) -> None:
        for name in ("mass_kg", "yaw_inertia_kgm2"):
            v = getattr(self, name)
            if not (math.isfinite(v) and v > 0):
                raise InputError(f"inertia {name}", v, "must be positive")
        for name in ("surge_added_kg", "sway_added_kg", "yaw_added_kgm2"):
            v = getattr(self, name)
            if not (math.isfinite(v) and v >= 0):
                raise InputError(f"inertia {name}", v, "must be zero or positive")

    @property
    def surge_kg(self) -> float:
        """m + A11: the mass that resists a push ahead, kg."""
        return self.mass_kg + self.surge_added_kg

    @property
    def sway_kg(self) -> float:
        """m + A22: the mass that resists a push abeam, kg."""
        return self.mass_kg + self.sway_added_kg

    @property
    def yaw_kgm2(self) -> float:
        """Iz + A66: the inertia that resists a turning moment, kg*m^2."""
        return self.yaw_inertia_kgm2 + self.yaw_added_kgm2

    @property
    def gyradius_m(self) -> float:
        """The rigid body's yaw radius of gyration, m."""
        return math.sqrt(self.yaw_inertia_kgm2 / self.mass_kg)


def member_mass(member: Member, water_density: float) -> tuple[float, Notice | None]:
    """A member hull's mass, kg: its displacement, else estimated from area x draught."""
    h = member.hull
    if h.displacement_kg is not None:
        return h.displacement_kg, None
    if h.draught_m is None:
        raise InputError(
            f"hull {h.name}: displacement",
            None,
            "is unknown; enter the displacement or the draught for the drift preview",
        )
    mass = water_density * h.geometry.area * h.draught_m
    return mass, Notice(
        "mass_estimated",
        h.name,
        f"{h.name}: no displacement given; the drift preview takes {mass / 1000:.0f} t "
        "(plan area x draught x water density, a wall-sided hull)",
        "caution",
    )


def _plate_inertia(member: Member, mass: float) -> float:
    """Yaw inertia of the member about its own centre of gravity, kg*m^2."""
    h = member.hull
    if h.yaw_gyradius_m is not None:
        return mass * h.yaw_gyradius_m**2
    g = h.geometry
    cx, cy = g.centroid
    gx, gy = h.centre_of_gravity
    return mass * ((g.i_xx + g.i_yy) / g.area + (cx - gx) ** 2 + (cy - gy) ** 2)


def body_inertia(body: Body, water_density: float) -> Inertia:
    """The inertia of ``body`` about its centre of gravity in water of ``water_density``.

    Raises InputError where a member has neither displacement nor draught, or no
    draught (the added mass needs it).
    """
    notices: list[Notice] = []
    gx, gy = body.centre_of_gravity
    mass = iz = 0.0
    for m in body.members:
        mi, note = member_mass(m, water_density)
        if note is not None:
            notices.append(note)
        px, py = m.to_body(m.hull.centre_of_gravity)
        mass += mi
        iz += _plate_inertia(m, mi) + mi * ((px - gx) ** 2 + (py - gy) ** 2)
    a11 = soding_surge(mass / water_density, body.length, water_density)
    a22, a66, method = _sway_yaw(body, mass, water_density, notices)
    return Inertia(mass, iz, a11, a22, a66, (gx, gy), method, tuple(notices))


def _sway_yaw(
    body: Body, mass: float, rho: float, notices: list[Notice]
) -> tuple[float, float, str]:
    gx = body.centre_of_gravity[0]
    hull = body.members[0].hull
    if not body.is_group and hull.added_mass_method == "ship":
        length, beam, draught = body.length, body.beam, hull.draught_m
        if draught is None:
            raise InputError(
                f"hull {hull.name}: draught",
                None,
                "is unknown; the drift preview needs it for the added mass",
            )
        block = mass / rho / (length * beam * draught)
        a22, a66_mid = clarke_sway_yaw(length, beam, draught, block, rho)
        if beam / length <= SHIP_MAX_BEAM_RATIO and a22 > 0 and a66_mid > 0:
            x_mid = 0.5 * (body.x_min + body.x_max)
            return a22, a66_mid + a22 * (gx - x_mid) ** 2, SHIP_WORDS
        notices.append(
            Notice(
                "ship_added_mass_out_of_range",
                hull.name,
                f"{hull.name}: the ship regressions do not fit B/L = {beam / length:.2f} "
                "(ships up to about 0.2); the drift preview uses 2-D sections",
                "caution",
            )
        )
    elif body.is_group and any(m.hull.added_mass_method == "ship" for m in body.members):
        notices.append(
            Notice(
                "ship_added_mass_group",
                body.name,
                f"{body.name}: a lashed group's added mass is taken from 2-D sections "
                "across the whole group",
                "caution",
            )
        )
    a22, a66 = sections_added_mass(body_sections(body), gx, rho)
    return a22, a66, SECTIONS_WORDS
