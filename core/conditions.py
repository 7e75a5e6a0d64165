"""Wind and current for a stage, and the loads they put on a body.

Wind is given as the true bearing it blows *from*; current as the true bearing it
sets *towards* (both common practice). Speeds are m/s in the core.

Loads follow the drag formula F = 1/2 rho C A V^2 on the projected area A normal to
the flow. Direction dependence is a longitudinal/lateral decomposition with separate
coefficients: for a flow at angle beta in the body frame (the direction it goes
towards, counter-clockwise from ahead),

    F_ahead = 1/2 rho C_head A_head V^2 cos(beta) |cos(beta)|
    F_port  = 1/2 rho C_beam A_beam V^2 sin(beta) |sin(beta)|

so head-on flow meets only the head-on area and beam-on flow only the side area. The
lateral component acts at the centre of the side projection (x) and the longitudinal
one at the centre of the end projection (y); a user-set centre of pressure (a
deckhouse aft, a crane forward) replaces both. The yaw moment is that point's offset
from the centroid crossed with the load.

The wind speed is the mean speed at ``wind_height_m``; it is brought to 10 m by the
power law U(z) = U10 (z / 10)^a (a = 0.12 over open sea, DNV-RP-C205, from memory;
1/7 is common practice over land) and multiplied by the gust factor for the load.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, fields
from typing import TYPE_CHECKING

import numpy as np

from core.errors import InputError
from core.notices import Notice

if TYPE_CHECKING:  # core.bodies imports core.plan, which imports this module
    from core.balance import Load
    from core.bodies import Body

#: Hoerner, Fluid-Dynamic Drag: beam-on cross-flow drag of a 2-D rectangular section
#: against B / (2T), via Leite et al. 1998 (read). Used for the beam-on current
#: coefficient when the user sets none; linear between points, held at the ends.
HOERNER_CROSS_FLOW: tuple[tuple[float, float], ...] = (
    (0.99, 0.828),
    (1.64, 0.691),
    (3.01, 0.587),
    (4.0, 0.559),
)

_OPTIONAL_POSITIVE = (
    "wind_coeff_head",
    "wind_coeff_beam",
    "current_coeff_head",
    "current_coeff_beam",
    "wind_area_head_m2",
    "wind_area_beam_m2",
    "current_area_head_m2",
    "current_area_beam_m2",
)


@dataclass(frozen=True, slots=True)
class Conditions:
    """Wind and current for one stage, with the coefficients used for their loads.

    Parameters
    ----------
    wind_speed_ms, wind_height_m:
        Mean wind speed, m/s, measured at ``wind_height_m`` above the water.
    wind_from_deg:
        True bearing the wind blows from.
    gust_factor:
        Ratio of the gust speed to the mean speed used for the load (1 = mean wind).
    wind_exponent:
        Power-law exponent for the height correction (0.12 open sea, DNV-RP-C205, from
        memory; 1/7 common practice).
    current_speed_ms, current_towards_deg:
        Current speed, m/s, and the true bearing it sets towards.
    air_density, water_density:
        kg/m^3. Defaults: 1.225 (ISO 2533 standard atmosphere at 15 C, from memory) and
        1025 (seawater, common practice; ITTC gives 1026.02 at 15 C).
    wind_coeff_head, wind_coeff_beam:
        Wind drag coefficients on the head-on and side areas. Defaults 0.8 and 1.2, in
        the box-barge ranges 0.6-1.0 and 1.0-1.3 (common practice).
    current_coeff_head:
        Current drag coefficient on the head-on underwater area; default 0.6 (a blunt
        box end, common practice, no source).
    current_coeff_beam:
        Current drag coefficient on the side underwater area; None takes Hoerner's
        2-D cross-flow value for the body's B / (2T).
    wind_area_*_m2, current_area_*_m2:
        Projected areas, m^2; None derives them from the outline and the freeboard
        (wind) or the draught (current).
    wind_centre_m, current_centre_m:
        A user-set centre of pressure (x, y) in the body frame, m; None uses the centre
        of each projection.
    sea_state:
        Sea state code 0-9 (Douglas), used to look up the tugs' efficiency.
    """

    wind_speed_ms: float = 0.0
    wind_height_m: float = 10.0
    wind_from_deg: float = 0.0
    gust_factor: float = 1.0
    current_speed_ms: float = 0.0
    current_towards_deg: float = 0.0
    air_density: float = 1.225
    water_density: float = 1025.0
    wind_exponent: float = 0.12
    wind_coeff_head: float = 0.8
    wind_coeff_beam: float = 1.2
    current_coeff_head: float = 0.6
    current_coeff_beam: float | None = None
    wind_area_head_m2: float | None = None
    wind_area_beam_m2: float | None = None
    current_area_head_m2: float | None = None
    current_area_beam_m2: float | None = None
    wind_centre_m: tuple[float, float] | None = field(default=None)
    current_centre_m: tuple[float, float] | None = field(default=None)
    sea_state: float = 0.0

    def __post_init__(self) -> None:
        for f in fields(self):
            v = getattr(self, f.name)
            if isinstance(v, bool):
                raise InputError(f"conditions {f.name}", v, "must be a number")
            if isinstance(v, float | int) and not math.isfinite(v):
                raise InputError(f"conditions {f.name}", v, "must be finite")
        for name in ("wind_speed_ms", "current_speed_ms"):
            if getattr(self, name) < 0:
                raise InputError(f"conditions {name}", getattr(self, name), "must not be negative")
        for name in ("wind_height_m", "air_density", "water_density"):
            if getattr(self, name) <= 0:
                raise InputError(f"conditions {name}", getattr(self, name), "must be positive")
        if self.gust_factor < 1:
            raise InputError("conditions gust_factor", self.gust_factor, "must be 1 or more")
        if not 0 <= self.wind_exponent <= 1:
            raise InputError("conditions wind_exponent", self.wind_exponent, "must be 0 to 1")
        for name in _OPTIONAL_POSITIVE:
            v = getattr(self, name)
            if v is not None and not (math.isfinite(v) and v > 0):
                raise InputError(f"conditions {name}", v, "must be positive")
        for name in ("wind_centre_m", "current_centre_m"):
            v = getattr(self, name)
            if v is not None:
                x, y = (float(c) for c in v)
                if not (math.isfinite(x) and math.isfinite(y)):
                    raise InputError(f"conditions {name}", v, "must be finite")
                object.__setattr__(self, name, (x, y))
        if not 0 <= self.sea_state <= 9:
            raise InputError("conditions sea_state", self.sea_state, "must be 0 to 9")

    @property
    def wind_speed_10m_ms(self) -> float:
        """Mean wind speed at 10 m by the power law, m/s."""
        return wind_at_10m(self.wind_speed_ms, self.wind_height_m, self.wind_exponent)

    @property
    def design_wind_ms(self) -> float:
        """The wind speed the load is computed with: 10 m mean times the gust factor."""
        return self.wind_speed_10m_ms * self.gust_factor


# -- formulas -------------------------------------------------------------------------


def wind_at_height(u10_ms: float, height_m: float, exponent: float) -> float:
    """Power law U(z) = U10 (z / 10)^a, m/s."""
    if not (math.isfinite(height_m) and height_m > 0):
        raise InputError("wind height", height_m, "must be a positive height")
    return u10_ms * (height_m / 10.0) ** exponent


def wind_at_10m(speed_ms: float, height_m: float, exponent: float) -> float:
    """A wind speed measured at ``height_m`` brought to 10 m by the power law, m/s."""
    if not (math.isfinite(height_m) and height_m > 0):
        raise InputError("wind height", height_m, "must be a positive height")
    return speed_ms / (height_m / 10.0) ** exponent


def dynamic_pressure(density: float, speed_ms: float) -> float:
    """q = 1/2 rho V^2, Pa."""
    return 0.5 * density * speed_ms * speed_ms


def drag_force(density: float, coefficient: float, area_m2: float, speed_ms: float) -> float:
    """F = 1/2 rho C A V^2, N."""
    return dynamic_pressure(density, speed_ms) * coefficient * area_m2


def hoerner_cross_flow(beam_over_twice_draught: float) -> float:
    """Beam-on 2-D cross-flow drag coefficient for a rectangular section (Hoerner)."""
    xs = [p[0] for p in HOERNER_CROSS_FLOW]
    ys = [p[1] for p in HOERNER_CROSS_FLOW]
    return float(np.interp(beam_over_twice_draught, xs, ys))


def flow_angle_rad(flow_towards_true_deg: float, heading_deg: float) -> float:
    """Body-frame angle (rad, counter-clockwise from ahead) of a flow going towards a true bearing."""
    rel = (flow_towards_true_deg - heading_deg) % 360.0  # relative bearing, clockwise
    return -math.radians(rel)


# -- projected areas ------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class Projection:
    """A body's projected areas above or below the water and their centres, body frame.

    ``head_m2`` is the area seen from ahead (flow along x), centred at y = ``head_y``;
    ``beam_m2`` the area seen from the side (flow along y), centred at x = ``beam_x``.
    """

    head_m2: float
    beam_m2: float
    head_y: float
    beam_x: float


def projection(body: Body, height: str) -> Projection | None:
    """Projected areas from each member's outline times its freeboard or draught.

    ``height`` is ``"freeboard"`` or ``"draught"``. Lashed members are summed without
    shielding (conservative). None when a member lacks the height.
    """
    head = beam = head_y = beam_x = 0.0
    for m in body.members:
        h = m.hull.freeboard_m if height == "freeboard" else m.hull.draught_m
        if h is None:
            return None
        pts = np.array([m.to_body(p) for p in m.hull.outline])  # (k, 2)
        x0, x1 = float(pts[:, 0].min()), float(pts[:, 0].max())
        y0, y1 = float(pts[:, 1].min()), float(pts[:, 1].max())
        a_head, a_beam = (y1 - y0) * h, (x1 - x0) * h
        head += a_head
        beam += a_beam
        head_y += a_head * 0.5 * (y0 + y1)
        beam_x += a_beam * 0.5 * (x0 + x1)
    return Projection(head, beam, head_y / head, beam_x / beam)


# -- loads ----------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class FlowModel:
    """Everything needed for one flow's load except its speed and angle (body frame).

    ``k_head`` and ``k_beam`` are 1/2 rho C A, N per (m/s)^2; ``point`` is where the
    load acts.
    """

    name: str
    k_head: float
    k_beam: float
    point: tuple[float, float]

    def force(self, speed_ms: float, angle_rad: float) -> tuple[float, float]:
        """Load (ahead, to port), N, for a flow of ``speed_ms`` going towards ``angle_rad``."""
        c, s = math.cos(angle_rad), math.sin(angle_rad)
        v2 = speed_ms * speed_ms
        return (self.k_head * v2 * c * abs(c), self.k_beam * v2 * s * abs(s))

    def wrenches(self, angles_rad: np.ndarray, centroid: tuple[float, float]) -> np.ndarray:
        """(3, k): force ahead, to port and moment about ``centroid`` at 1 m/s, per angle."""
        c, s = np.cos(angles_rad), np.sin(angles_rad)
        fx, fy = self.k_head * c * np.abs(c), self.k_beam * s * np.abs(s)
        dx, dy = self.point[0] - centroid[0], self.point[1] - centroid[1]
        return np.vstack([fx, fy, dx * fy - dy * fx])


def _area(given: float | None, derived: float | None, what: str, body: Body) -> float:
    if given is not None:
        return given
    if derived is None or derived <= 0:
        need = "freeboard" if what.startswith("wind") else "draught"
        raise InputError(
            f"{body.name}: {what}",
            derived,
            f"is unknown; enter the hull's {need} or the {what} in the conditions",
        )
    return derived


def wind_model(body: Body, c: Conditions) -> FlowModel:
    """The wind's load model for ``body`` under conditions ``c``."""
    proj = projection(body, "freeboard")
    a_head = _area(
        c.wind_area_head_m2, None if proj is None else proj.head_m2, "wind area head-on", body
    )
    a_beam = _area(
        c.wind_area_beam_m2, None if proj is None else proj.beam_m2, "wind area beam-on", body
    )
    point = c.wind_centre_m or _centre(proj, body)
    return FlowModel(
        "wind",
        0.5 * c.air_density * c.wind_coeff_head * a_head,
        0.5 * c.air_density * c.wind_coeff_beam * a_beam,
        point,
    )


def current_model(body: Body, c: Conditions) -> FlowModel:
    """The current's load model for ``body`` under conditions ``c``."""
    proj = projection(body, "draught")
    a_head = _area(
        c.current_area_head_m2, None if proj is None else proj.head_m2, "current area head-on", body
    )
    a_beam = _area(
        c.current_area_beam_m2, None if proj is None else proj.beam_m2, "current area beam-on", body
    )
    c_beam = c.current_coeff_beam
    if c_beam is None:
        c_beam = hoerner_cross_flow(_beam_over_twice_draught(body))
    point = c.current_centre_m or _centre(proj, body)
    return FlowModel(
        "current",
        0.5 * c.water_density * c.current_coeff_head * a_head,
        0.5 * c.water_density * c_beam * a_beam,
        point,
    )


def _beam_over_twice_draught(body: Body) -> float:
    draughts = [m.hull.draught_m for m in body.members if m.hull.draught_m is not None]
    if not draughts:
        raise InputError(
            f"{body.name}: draught",
            None,
            "is unknown; enter the hull's draught or the current coefficient beam-on",
        )
    return body.beam / (2 * max(draughts))


def _centre(proj: Projection | None, body: Body) -> tuple[float, float]:
    if proj is None:  # areas entered by hand: the centre of the outline's extent
        x0, y0, x1, y1 = body.polygon.bounds
        return (0.5 * (x0 + x1), 0.5 * (y0 + y1))
    return (proj.beam_x, proj.head_y)


@dataclass(frozen=True, slots=True)
class ConditionLoads:
    """The conditions of a stage seen from one body, and the loads they put on it.

    Bearings are relative (degrees clockwise from ahead): the wind's is where it blows
    from, the current's where it sets towards.
    """

    wind_from_rel_deg: float
    current_towards_rel_deg: float
    wind_speed_10m_ms: float
    design_wind_ms: float
    loads: tuple[Load, ...]  # wind and current, where they blow
    notices: tuple[Notice, ...] = ()


def _flow_load(body: Body, c: Conditions, heading_deg: float, which: str) -> Load | None:
    from core.balance import Load  # deferred: core.balance imports core.plan

    if which == "wind":
        if c.wind_speed_ms <= 0:
            return None
        wm = wind_model(body, c)
        angle = flow_angle_rad(c.wind_from_deg + 180.0, heading_deg)
        return Load("wind", wm.point, wm.force(c.design_wind_ms, angle))
    if c.current_speed_ms <= 0:
        return None
    cm = current_model(body, c)
    angle = flow_angle_rad(c.current_towards_deg, heading_deg)
    return Load("current", cm.point, cm.force(c.current_speed_ms, angle))


def condition_loads(
    body: Body, c: Conditions, heading_deg: float, *, strict: bool = True
) -> ConditionLoads:
    """Wind and current loads on ``body`` lying at true ``heading_deg``.

    With ``strict`` a load that is needed but whose area cannot be found raises
    InputError; otherwise that load is left out and a notice says why (for the board
    and the briefing, which must show something while data are missing).
    """
    loads: list[Load] = []
    notices: list[Notice] = []
    for which in ("wind", "current"):
        try:
            load = _flow_load(body, c, heading_deg, which)
        except InputError as e:
            if strict:
                raise
            notices.append(Notice(f"no_{which}_load", body.name, f"No {which} load: {e}"))
            continue
        if load is not None:
            loads.append(load)
    return ConditionLoads(
        wind_from_rel_deg=(c.wind_from_deg - heading_deg) % 360.0,
        current_towards_rel_deg=(c.current_towards_deg - heading_deg) % 360.0,
        wind_speed_10m_ms=c.wind_speed_10m_ms,
        design_wind_ms=c.design_wind_ms,
        loads=tuple(loads),
        notices=tuple(notices),
    )
