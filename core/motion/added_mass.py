"""Added mass of a floating body moving slowly in the horizontal plane.

A body that drifts drags water along with it; the water's share of the inertia is the
added mass, in surge (A11, kg), sway (A22, kg) and yaw (A66, kg*m^2). At the low
frequencies of a drift the free surface acts as a rigid wall, so a section of draught
T behaves as half of a "double body" of depth 2T.

Two published methods, chosen per hull (``Hull.added_mass_method``):

- **"sections"** (barges, pontoons, box-shaped modules): the 2-D added mass of a
  rectangle from DNV-RP-C205, Appendix A (Table A-1, from memory): a rectangle with
  sides 2a across the motion and 2b along it has A' = C_A rho pi a^2 per unit length.
  For sway, a = T (the double body's half-depth) and b = B(x) / 2 (the local half
  beam), so A22'(x) = 1/2 C_A(2T / B) rho pi T^2 (half of the double body). Integrated
  along the length (strip theory): A22 = int A22' dx, A66 = int A22' (x - x_G)^2 dx.
- **"ship"** (ship-shaped hulls): the regressions of Clarke, Gedling and Hine (RINA,
  1983, read as transcribed), with S = pi (T / L)^2:
  Yv' = -S (1 + 0.16 Cb B/T - 5.1 (B/L)^2), Nr' = -S (1/12 + 0.017 Cb B/T - 0.33 B/L),
  A22 = -Yv' (1/2 rho L^3), A66 = -Nr' (1/2 rho L^5), about midships. They were fitted
  to ships (B/L up to about 0.2); outside :data:`SHIP_MAX_BEAM_RATIO` the sections
  method is used instead, with a notice.

Surge, both methods: Soding (1982, read as transcribed), A11 = 2.7 rho V^(5/3) / L^2
(usually under a fifth of the mass).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
import shapely

from core.errors import InputError
from core.mechanics.bodies import Body

#: DNV-RP-C205 Appendix A, 2-D added mass coefficient C_A of a rectangle (A' = C_A rho pi
#: a^2; sides 2a across the motion, 2b along it) against a / b (from memory; the flat
#: plate, a / b -> infinity, is exactly 1 from potential flow).
DNV_RECTANGLE_CA: tuple[tuple[float, float], ...] = (
    (0.1, 2.23),
    (0.2, 1.98),
    (0.5, 1.70),
    (1.0, 1.51),
    (2.0, 1.36),
    (5.0, 1.21),
    (10.0, 1.14),
)
#: C_A of a flat plate moving broadside (a / b -> infinity): exact, potential flow.
FLAT_PLATE_CA = 1.0

#: The ship regressions are used up to this beam / length (fitted to ships, B/L <= ~0.2).
SHIP_MAX_BEAM_RATIO = 0.25

#: Stations along the length for the strip integration.
STATIONS = 48


def rectangle_coefficient(a_over_b: float) -> float:
    """DNV-RP-C205's C_A for a rectangle with sides 2a (across the motion) and 2b (along).

    Linear in log(a/b) between the table's rows; beyond a / b = 10 it runs linearly in
    b / a to the flat plate's 1.0; below a / b = 0.1 it is held at the last row.
    """
    if not (math.isfinite(a_over_b) and a_over_b > 0):
        raise InputError("section aspect a/b", a_over_b, "must be a positive number")
    ratios = [r for r, _ in DNV_RECTANGLE_CA]
    values = [c for _, c in DNV_RECTANGLE_CA]
    if a_over_b >= ratios[-1]:
        # between a/b = 10 (b/a = 0.1) and the flat plate (b/a = 0)
        return FLAT_PLATE_CA + (values[-1] - FLAT_PLATE_CA) * (ratios[-1] / a_over_b)
    return float(np.interp(math.log(a_over_b), np.log(ratios), values))


def sway_added_mass_per_length(beam_m: float, draught_m: float, water_density: float) -> float:
    """A22' of a rectangular section of beam B and draught T, kg per metre of length.

    Half of the double body (depth 2T) moving across: a = T, b = B / 2, so
    A22' = 1/2 C_A(2T / B) rho pi T^2.
    """
    if beam_m <= 0 or draught_m <= 0:
        return 0.0
    c_a = rectangle_coefficient(2.0 * draught_m / beam_m)
    return 0.5 * c_a * water_density * math.pi * draught_m**2


def soding_surge(volume_m3: float, length_m: float, water_density: float) -> float:
    """Surge added mass A11 = 2.7 rho V^(5/3) / L^2, kg (Soding 1982)."""
    return 2.7 * water_density * volume_m3 ** (5.0 / 3.0) / length_m**2


def clarke_sway_yaw(
    length_m: float, beam_m: float, draught_m: float, block: float, water_density: float
) -> tuple[float, float]:
    """(A22 kg, A66 kg*m^2 about midships) from Clarke, Gedling and Hine (1983)."""
    s = math.pi * (draught_m / length_m) ** 2
    yv = s * (1.0 + 0.16 * block * beam_m / draught_m - 5.1 * (beam_m / length_m) ** 2)
    nr = s * (1.0 / 12.0 + 0.017 * block * beam_m / draught_m - 0.33 * beam_m / length_m)
    return yv * 0.5 * water_density * length_m**3, nr * 0.5 * water_density * length_m**5


@dataclass(frozen=True, slots=True)
class Sections:
    """The body cut across at stations along x (body frame): beam and draught at each.

    ``x`` (k,) station positions, m; ``dx`` the station spacing, m; ``beam`` (k,) the
    body's breadth at each station (the extent across all members there), m;
    ``draught`` (k,) the deepest member there, m (0 where nothing floats).
    """

    x: np.ndarray
    dx: float
    beam: np.ndarray
    draught: np.ndarray


def body_sections(body: Body, stations: int = STATIONS) -> Sections:
    """Cut ``body`` at ``stations`` equally spaced stations (midpoints) along its length.

    Raises InputError when a member has no draught (the added mass needs it).
    """
    x0, x1 = body.x_min, body.x_max
    dx = (x1 - x0) / stations
    xs = x0 + dx * (np.arange(stations) + 0.5)
    _, y0, _, y1 = body.polygon.bounds
    cuts = shapely.linestrings(
        np.stack(
            [
                np.column_stack([xs, np.full_like(xs, y0 - 1.0)]),
                np.column_stack([xs, np.full_like(xs, y1 + 1.0)]),
            ],
            axis=1,
        )
    )
    low = np.full(stations, np.inf)
    high = np.full(stations, -np.inf)
    draught = np.zeros(stations)
    for m in body.members:
        t = m.hull.draught_m
        if t is None:
            raise InputError(
                f"hull {m.hull.name}: draught",
                None,
                "is unknown; the drift preview needs it for the added mass",
            )
        poly = shapely.Polygon([m.to_body(p) for p in m.hull.outline])
        b = shapely.bounds(shapely.intersection(cuts, poly))  # (k, 4), nan where empty
        hit = ~np.isnan(b[:, 1])
        low[hit] = np.minimum(low[hit], b[hit, 1])
        high[hit] = np.maximum(high[hit], b[hit, 3])
        draught[hit] = np.maximum(draught[hit], t)
    beam = np.where(np.isfinite(low), high - low, 0.0)
    return Sections(xs, dx, beam, draught)


def sections_added_mass(
    sections: Sections, x_g: float, water_density: float
) -> tuple[float, float]:
    """(A22 kg, A66 kg*m^2 about x = ``x_g``) by strip integration of DNV's 2-D values."""
    per_length = np.array(
        [
            sway_added_mass_per_length(float(b), float(t), water_density)
            for b, t in zip(sections.beam, sections.draught, strict=True)
        ]
    )
    dx = sections.dx
    a22 = float(per_length.sum() * dx)
    # Each station's A22' is constant over its width: int (x - x_G)^2 dx over it is exact.
    a66 = float((per_length * ((sections.x - x_g) ** 2 + dx * dx / 12.0)).sum() * dx)
    return a22, a66
