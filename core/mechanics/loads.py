"""The loads that wind and current put on a body, in the body frame.

Loads follow the drag formula F = 1/2 rho C A V^2 on the projected area A normal to
the flow. Direction dependence is a longitudinal/lateral decomposition with separate
coefficients: for a flow at angle beta in the body frame (the direction it goes
towards, counter-clockwise from ahead),

    F_ahead = 1/2 rho C_head A_head V^2 cos(beta) |cos(beta)|
    F_port  = 1/2 rho C_beam A_beam V^2 sin(beta) |sin(beta)|

so head-on flow meets only the head-on area and beam-on flow only the side area. The
longitudinal component acts at the centre of the end projection (y). The lateral one
acts on the side projection at a centre of pressure that moves with the angle of
incidence (``Conditions.pressure_centre == "moving"``, the default): at the centre of
the side projection beam-on, moving towards the end the flow comes from as the flow
turns towards head-on, linearly with the angle,

    x from the leading end = L (a + (1/2 - a) phi / 90 deg),   phi in [0, 90 deg]

where phi is the angle between the flow and the body's length (0 head-on or stern-on)
and a the centre's place head-on as a share of the length from the leading end.
a = 0.291 is Hughes' (Trans. INA 1930) figure for the wind on ships, whose straight line
x/L = 0.291 + 0.0023 theta from the bow, theta the wind's angle off the bow in degrees,
passes 0.498 L at the beam (from memory); the line above is Hughes' made exactly
symmetric, so a body symmetric end for end has its centre amidships beam-on. UFC
4-159-03 (2005) section 4-5.4 (read) puts the current's yaw moment in the same linear
form, e/L = a + b theta, with a and b by hull type. The same travel, with its own a, is
used for the current. A body held at an oblique angle to the flow thus feels the moment
that turns it beam-on to the flow (the lateral load acts on the upstream half), as a
flat plate does and as a drifting hull does.

With ``pressure_centre == "fixed"`` the lateral load acts at the centre of the side
projection (no yaw moment from a symmetric body), and a user-set centre of pressure (a
deckhouse aft, a crane forward) replaces both centres and their travel. The yaw moment
is the point's offset from the centroid crossed with the load.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core.errors import InputError
from core.mechanics.balance import Load, turning_judged
from core.mechanics.bodies import Body
from core.mechanics.depth import depth_factor
from core.mechanics.forces import negligible
from core.model.conditions import Conditions
from core.model.plan import Stage
from core.notices import Notice
from core.units import DisplayUnits, fmt, label

#: Hoerner, Fluid-Dynamic Drag: beam-on cross-flow drag of a 2-D rectangular section
#: against B / (2T), via Leite et al. 1998 (read). Used for the beam-on current
#: coefficient when the user sets none; linear between points, held at the ends.
HOERNER_CROSS_FLOW: tuple[tuple[float, float], ...] = (
    (0.99, 0.828),
    (1.64, 0.691),
    (3.01, 0.587),
    (4.0, 0.559),
)


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


def centre_shift(flow_x: float, flow_y: float, travel_m: float) -> float:
    """How far forward (m; negative: aft) the lateral load's centre lies from its beam-on
    place for a flow going towards (``flow_x``, ``flow_y``) in the body frame.

    ``travel_m`` is the shift head-on, (1/2 - a) L; the shift falls linearly with the
    angle phi between the flow and the body's length to nothing beam-on, towards the end
    the flow comes from (the bow when the flow goes aft, ``flow_x`` < 0).
    """
    if travel_m == 0.0 or (flow_x == 0.0 and flow_y == 0.0):
        return 0.0
    phi = math.atan2(abs(flow_y), abs(flow_x))  # 0 head-on or stern-on, pi/2 beam-on
    shift = travel_m * (1.0 - phi / (0.5 * math.pi))
    return shift if flow_x < 0.0 else -shift


def centre_shifts(angles_rad: np.ndarray, travel_m: float) -> np.ndarray:
    """(k,) :func:`centre_shift` for flows going towards ``angles_rad``."""
    c, s = np.cos(angles_rad), np.sin(angles_rad)
    if travel_m == 0.0:
        return np.zeros_like(c)
    phi = np.arctan2(np.abs(s), np.abs(c))
    shift = travel_m * (1.0 - phi / (0.5 * np.pi))
    return np.where(c < 0.0, shift, -shift)


@dataclass(frozen=True, slots=True)
class FlowModel:
    """Everything needed for one flow's load except its speed and angle (body frame).

    ``k_head`` and ``k_beam`` are 1/2 rho C A, N per (m/s)^2; ``point`` is where the
    load acts beam-on (the centre of the side projection, and of the end projection
    across); ``travel_m`` how far the lateral load's centre moves from there towards the
    leading end head-on, m (0: a fixed centre; see the module's notes).
    """

    name: str
    k_head: float
    k_beam: float
    point: tuple[float, float]
    travel_m: float = 0.0

    def force(self, speed_ms: float, angle_rad: float) -> tuple[float, float]:
        """Load (ahead, to port), N, for a flow of ``speed_ms`` going towards ``angle_rad``."""
        c, s = math.cos(angle_rad), math.sin(angle_rad)
        v2 = speed_ms * speed_ms
        return (self.k_head * v2 * c * abs(c), self.k_beam * v2 * s * abs(s))

    def point_at(self, angle_rad: float) -> tuple[float, float]:
        """Where the load of a flow going towards ``angle_rad`` acts, body frame, m."""
        dx = centre_shift(math.cos(angle_rad), math.sin(angle_rad), self.travel_m)
        return (self.point[0] + dx, self.point[1])

    def wrenches(self, angles_rad: np.ndarray, centroid: tuple[float, float]) -> np.ndarray:
        """(3, k): force ahead, to port and moment about ``centroid`` at 1 m/s, per angle."""
        c, s = np.cos(angles_rad), np.sin(angles_rad)
        fx, fy = self.k_head * c * np.abs(c), self.k_beam * s * np.abs(s)
        px = self.point[0] + centre_shifts(angles_rad, self.travel_m)
        moment = (px - centroid[0]) * fy - (self.point[1] - centroid[1]) * fx
        return np.vstack([fx, fy, moment])


def _area(given: float | None, derived: float | None, what: str, body: Body) -> float:
    if given is not None:
        return given
    if derived is None or derived <= 0:
        need = "freeboard" if what.startswith("wind") else "draught"
        raise InputError(
            f"{body.name}: {what}",
            derived,
            f"enter the hull's {need} or the {what} in the conditions",
            shown="not known;",
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
        _travel(body, c, c.wind_centre_m, c.wind_centre_head_on),
    )


def current_model(body: Body, c: Conditions) -> FlowModel:
    """The current's load model for ``body`` under conditions ``c``; in the stage's water
    depth its beam-on coefficient grows by the depth factor (core.mechanics.depth)."""
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
    c_beam *= depth_factor(body, c.water_depth_m)
    point = c.current_centre_m or _centre(proj, body)
    return FlowModel(
        "current",
        0.5 * c.water_density * c.current_coeff_head * a_head,
        0.5 * c.water_density * c_beam * a_beam,
        point,
        _travel(body, c, c.current_centre_m, c.current_centre_head_on),
    )


def _travel(
    body: Body, c: Conditions, user_centre: tuple[float, float] | None, head_on: float
) -> float:
    """The lateral load's travel head-on, (1/2 - a) L, m; 0 for a fixed or user-set centre."""
    if user_centre is not None or c.pressure_centre != "moving":
        return 0.0
    return (0.5 - head_on) * body.length


def _beam_over_twice_draught(body: Body) -> float:
    draughts = [m.hull.draught_m for m in body.members if m.hull.draught_m is not None]
    if not draughts:
        raise InputError(
            f"{body.name}: draught",
            None,
            "enter the hull's draught or the current coefficient beam-on",
            shown="not known;",
        )
    return body.beam / (2 * max(draughts))


def _centre(proj: Projection | None, body: Body) -> tuple[float, float]:
    if proj is None:  # areas entered by hand: the centre of the outline's extent
        x0, y0, x1, y1 = body.polygon.bounds
        return (0.5 * (x0 + x1), 0.5 * (y0 + y1))
    return (proj.beam_x, proj.head_y)


def missing_inputs(body: Body, c: Conditions, which: str) -> tuple[str, ...]:
    """What the planner must enter before the ``which`` ("wind" or "current") load on
    ``body`` can be worked out, in words ("the freeboard of Barge 1"); empty when nothing
    is missing."""
    if which == "wind":
        if c.wind_area_head_m2 is not None and c.wind_area_beam_m2 is not None:
            return ()
        return tuple(
            f"the freeboard of {m.hull.name}" for m in body.members if m.hull.freeboard_m is None
        )
    areas_given = c.current_area_head_m2 is not None and c.current_area_beam_m2 is not None
    if areas_given and c.current_coeff_beam is not None:
        return ()
    return tuple(f"the draught of {m.hull.name}" for m in body.members if m.hull.draught_m is None)


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

    if which == "wind":
        if c.wind_speed_ms <= 0:
            return None
        wm = wind_model(body, c)
        angle = flow_angle_rad(c.wind_from_deg + 180.0, heading_deg)
        return Load("wind", wm.point_at(angle), wm.force(c.design_wind_ms, angle))
    if c.current_speed_ms <= 0:
        return None
    cm = current_model(body, c)
    angle = flow_angle_rad(c.current_towards_deg, heading_deg)
    return Load("current", cm.point_at(angle), cm.force(c.current_speed_ms, angle))


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
        except InputError:
            if strict:
                raise
            need = " and ".join(missing_inputs(body, c, which)) or f"the {which} areas"
            notices.append(
                Notice(
                    f"no_{which}_load",
                    body.name,
                    f"the {which} load on {body.name} cannot be worked out: "
                    f"enter {need} to include the {which}",
                )
            )
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


def body_conditions(stage: Stage, body: Body, *, strict: bool = False) -> ConditionLoads:
    """The stage's wind and current as loads on ``body`` at its pose's heading."""
    heading = stage.pose_of(body.name).heading_deg
    return condition_loads(body, stage.conditions, heading, strict=strict)


def loads_wrench(loads: tuple[Load, ...], centroid: tuple[float, float]) -> np.ndarray:
    """(3,): force ahead, force to port and moment about ``centroid`` of the loads."""
    out = np.zeros(3)
    for ld in loads:
        out += (ld.force[0], ld.force[1], ld.moment_about(centroid))
    return out


def load_turning(load: Load, body: Body) -> str:
    """Which way ``load`` alone turns ``body``, in words. The load is judged on itself by
    the one negligible rule (core.mechanics.forces.negligible of the load's own force and
    the body's length), not against the stage's balance, whose tugs may be far stronger."""
    tol = negligible(math.hypot(*load.force), body.length)[1]
    return turning_judged(load.moment_about(body.centroid), tol)


def load_words(load: Load, body: Body, units: DisplayUnits) -> str:
    """A wind or current load on ``body`` in words, the same in every view: its size, its
    parts ahead and to port, its signed yaw moment about the centroid and which way that
    turns the body, e.g. ``"1.4 t (ahead +1.3, to port +0.5 t), -6.2 t·m about the
    centroid, swings bow to starboard"``."""
    fx, fy = load.force
    m = load.moment_about(body.centroid)
    return (
        f"{units.show(math.hypot(fx, fy), 'force')} (ahead {fmt(units.value(fx, 'force'), signed=True)}, "
        f"to port {fmt(units.value(fy, 'force'), signed=True)} {label(units.unit('force'))}), "
        f"{fmt(units.value(m, 'moment'), signed=True)} {label(units.unit('moment'))} about the "
        f"centroid, {load_turning(load, body)}"
    )
