"""The balance of one body in one stage: each tug's force, the net force, the yaw
moment and the equivalent force with its line of action.

This is the drag path: :func:`tug_layout` turns placements into numpy arrays once,
and :func:`analyse` reduces them. Forces and moments are in the body frame (for a
single hull, the hull frame: x forward, y to port), N and N*m, moments positive
counter-clockwise seen from above.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, replace

import numpy as np
import shapely

from core.frames import angle_to_bearing, turning_words, walking_words
from core.mechanics.bodies import Body, stage_body
from core.mechanics.forces import (
    Equivalent,
    equivalent_of,
    moment_of,
    moments_about,
    negligible,
    transfer_moment,
)
from core.mechanics.leads import ends_on_hull, over_hull_allowance_m, over_hull_m
from core.mechanics.usable import STEEP_LINE_DEG, line_angle_rad
from core.model.capability import WAY_WORDS, CapabilityCurve, Way
from core.model.plan import Project, Stage
from core.model.tugs import Placement, setting_words, standing_by
from core.notices import Notice
from core.units import DisplayUnits

#: A line of action that crosses the centreline more than this many body lengths beyond
#: either end of the hull crosses it "far off the hull": the crossing is real but says
#: nothing a tug master can use, and near parallel it is mostly rounding (common
#: practice, no source).
FAR_CROSSING_LENGTHS = 1.0
#: A line of action that stays within this share of the body's length of the centreline
#: from one end of the hull to the other lies "along the centreline" (common practice,
#: no source: closer than a planner draws).
ALONG_SHARE = 0.01

#: Drawn distance from a push point to the pushing tug's centre, m.
PUSH_STANDOFF_M = 8.0


@dataclass(frozen=True, slots=True)
class Load:
    """A force on the body that is not a tug's (wind, current, a given load)."""

    name: str
    point: tuple[float, float]  # body frame, m
    force: tuple[float, float]  # N
    moment_nm: float = 0.0  # extra pure moment, N*m

    def moment_about(self, ref: tuple[float, float]) -> float:
        """The load's yaw moment about ``ref`` (its force's and its own pure moment), N*m."""
        return moment_of(self.point, self.force, ref) + self.moment_nm


#: The per-tug arrays of a :class:`TugLayout` (one row per tug; None where unused).
_ROW_ARRAYS = (
    "points",
    "directions",
    "positions",
    "is_push",
    "rated_n",
    "usable_n",
    "swl_n",
    "line_angle_rad",
    "pull_scale_n",
    "lead_frame_rad",
    "share_angle_rad",
    "headway_share",
    "over_allowance_m",
)


@dataclass(frozen=True, slots=True)
class TugLayout:
    """Placements of the tugs working on one body, as arrays. n = number of tugs.

    A tug's usable pull at a lead is ``pull_scale_n`` (bollard pull x efficiency x
    towline-angle factor x headway factor) times its capability share for the way it
    works (``ways``, ``curves``) at the bearing of its pull off its own heading: fixed
    on a line (``share_angle_rad``: 0 ahead, pi astern), the lead itself at a push point
    (``share_angle_rad`` nan). A lead is an angle from ``lead_frame_rad``, the body-frame
    direction of lead 0 (the hull's ahead for a line, the inward normal for a push).
    """

    placements: tuple[Placement, ...]
    points: np.ndarray  # (n, 2) application points, body frame, m
    directions: np.ndarray  # (n, 2) unit direction of each tug's force on the body
    positions: np.ndarray  # (n, 2) where each tug is (line: end of the towline), m
    is_push: np.ndarray  # (n,) bool
    rated_n: np.ndarray  # (n,) rated pull at the lead as set: bollard pull x capability share, N
    usable_n: np.ndarray  # (n,) usable pull at the lead as set, N
    swl_n: np.ndarray  # (n,) fitting rating (TOW, else SWL), N; nan where none is given
    line_angle_rad: np.ndarray | None = None  # (n,) towline angle off the horizontal, rad
    pull_scale_n: np.ndarray | None = None  # (n,) usable pull before the capability share, N
    lead_frame_rad: np.ndarray | None = None  # (n,) body-frame angle of lead 0, rad
    share_angle_rad: np.ndarray | None = None  # (n,) capability angle on a line; nan: the lead
    ways: tuple[Way, ...] = ()  # (n,)
    curves: tuple[CapabilityCurve | None, ...] = ()  # (n,) None: cannot work that way
    headway_share: np.ndarray | None = None  # (n,) share of BP at the speed through the water
    speed_through_water_ms: float = 0.0  # a transit's planned speed (0 for other goals)
    #: the body's outline (body frame), which towlines must lead clear of
    outline: shapely.Polygon | shapely.MultiPolygon | None = None
    #: (n,) how far each tug's line may lie over the hull, m (core.mechanics.leads)
    over_allowance_m: np.ndarray | None = None

    @property
    def pulls_n(self) -> np.ndarray:
        """(n,) assigned pulls: setting x usable pull, N."""
        return np.array([p.setting for p in self.placements]) * self.usable_n

    def without(self, index: int) -> TugLayout:
        """The same layout with tug ``index`` taken out (the others' rows as they are)."""
        keep = np.arange(len(self.placements)) != index

        def cut(arr: np.ndarray | None) -> np.ndarray | None:
            return None if arr is None else arr[keep]

        fields: dict[str, object] = {name: cut(getattr(self, name)) for name in _ROW_ARRAYS}
        fields["placements"] = self.placements[:index] + self.placements[index + 1 :]
        fields["ways"] = self.ways[:index] + self.ways[index + 1 :]
        fields["curves"] = self.curves[:index] + self.curves[index + 1 :]
        return replace(self, **fields)  # type: ignore[arg-type]

    def shares(self, i: int, leads_rad: np.ndarray) -> np.ndarray:
        """(k,) tug ``i``'s capability share at leads (k,), rad (0 where it cannot work)."""
        curve = self.curves[i] if self.curves else None
        leads = np.asarray(leads_rad, dtype=float)
        if curve is None:
            return np.zeros_like(leads) if self.curves else np.ones_like(leads)
        fixed = self.share_angle_rad[i] if self.share_angle_rad is not None else 0.0
        angles = leads if math.isnan(fixed) else np.full_like(leads, fixed)
        return curve.at_angles(angles)

    def with_row(self, i: int, one: TugLayout) -> TugLayout:
        """This layout with tug ``i``'s row taken from the one-tug layout ``one`` (the
        drag path: one tug moved, every other row kept)."""

        def put(mine: np.ndarray | None, theirs: np.ndarray | None) -> np.ndarray | None:
            if mine is None or theirs is None:
                return mine if theirs is None else None
            out = mine.copy()
            out[i] = theirs[0]
            return out

        placements = list(self.placements)
        placements[i] = one.placements[0]
        arrays = {name: put(getattr(self, name), getattr(one, name)) for name in _ROW_ARRAYS}
        ways = list(self.ways)
        curves = list(self.curves)
        if ways and one.ways:
            ways[i] = one.ways[0]
        if curves and one.curves:
            curves[i] = one.curves[0]
        fields: dict[str, object] = dict(arrays)
        fields.update(placements=tuple(placements), ways=tuple(ways), curves=tuple(curves))
        return replace(self, **fields)  # type: ignore[arg-type]

    def unit_effects(self, centroid: tuple[float, float]) -> np.ndarray:
        """(3, n): force ahead, force abeam and moment about ``centroid`` per newton of pull."""
        m = moments_about(self.points, self.directions, centroid)
        return np.vstack([self.directions[:, 0], self.directions[:, 1], m])


def tug_direction(
    body: Body, placement: Placement
) -> tuple[tuple[float, float], tuple[float, float], bool]:
    """(application point, unit force direction, is_push) of a placement, body frame."""
    member, fitting = body.fitting(placement.hull, placement.point)
    point = member.to_body((fitting.x, fitting.y))
    if fitting.kind == "push":
        nx, ny = body.inward_normal(placement.hull, placement.point)
        c, s = math.cos(placement.lead_rad), math.sin(placement.lead_rad)
        return point, (c * nx - s * ny, s * nx + c * ny), True
    lead = placement.lead_rad
    return point, member.direction_to_body((math.cos(lead), math.sin(lead))), False


def way_of(placement: Placement, is_push: bool) -> Way:
    """How a tug works at its point: on a line, pushing, or push-pull (made fast)."""
    if not is_push:
        return "line"
    return "push_pull" if placement.push_pull else "push"


def lead_frame(body: Body, placement: Placement) -> float:
    """Body-frame angle (rad) of lead 0 for a placement: the hull's ahead at a line point,
    the inward normal at a push point."""
    member, fitting = body.fitting(placement.hull, placement.point)
    if fitting.kind == "push":
        nx, ny = body.inward_normal(placement.hull, placement.point)
        return math.atan2(ny, nx)
    return member.heading_rad


def transit_speed_ms(stage: Stage) -> float:
    """The stage's planned speed through the water, m/s: its transit goal's, else 0 (the
    tugs' headway tables are read at it)."""
    g = stage.goal
    return g.speed_ms if g is not None and g.kind == "transit" else 0.0


def over_allowances(body: Body, placements: tuple[Placement, ...]) -> np.ndarray:
    """(n,) how far each placement's towline may lie over the hull, m: by its hull's breadth
    (core.mechanics.leads.over_hull_allowance_m)."""
    allowed = {h: over_hull_allowance_m(body.breadth_of(h)) for h in {p.hull for p in placements}}
    return np.array([allowed[p.hull] for p in placements], dtype=float)


def tug_layout(project: Project, stage: Stage, body: Body) -> TugLayout:
    """Arrays of every tug placed on ``body`` in ``stage``, in placement order."""
    members = {m.hull.name for m in body.members}
    placed = tuple(p for p in stage.placements if p.hull in members)
    n = len(placed)
    points, dirs, pos = np.zeros((n, 2)), np.zeros((n, 2)), np.zeros((n, 2))
    push, swl = np.zeros(n, bool), np.full(n, np.nan)
    bp, angle, frame, fixed = np.zeros(n), np.zeros(n), np.zeros(n), np.full(n, np.nan)
    ways: list[Way] = []
    curves: list[CapabilityCurve | None] = []
    for i, p in enumerate(placed):
        tug = project.tug(p.tug)
        point, direction, is_push = tug_direction(body, p)
        points[i], dirs[i], push[i] = point, direction, is_push
        pos[i] = (
            np.subtract(point, np.multiply(direction, PUSH_STANDOFF_M))
            if is_push
            else np.add(point, np.multiply(direction, p.line_length_m))
        )
        bp[i] = tug.bollard_pull_n
        member, f = body.fitting(p.hull, p.point)
        frame[i] = lead_frame(body, p)
        way = way_of(p, is_push)
        ways.append(way)
        curves.append(tug.capability_curves.curve(way))
        if not is_push:
            angle[i] = line_angle_rad(
                member.hull.freeboard_m, tug.towing_point_height_m, p.line_length_m
            )
            # On a line the tug lies along its towline: ahead it pulls at 000 of its own
            # heading, astern at 180 (core.model.capability).
            fixed[i] = math.pi if p.astern else 0.0
        rating = f.towing_rating_n
        if rating is not None:
            swl[i] = rating
    # Usable pull: bollard pull x efficiency (sea state) x cos(towline angle) x headway
    # share (a transit's speed through the water) x the capability share at the lead; see
    # core.mechanics.usable, core.model.headway and core.model.capability.
    eff = project.tug_efficiency.efficiencies(bp, stage.conditions.sea_state)
    speed = transit_speed_ms(stage)
    headway = np.array([project.tug(p.tug).headway_share(speed) for p in placed])
    scale = bp * eff * np.cos(angle) * headway
    layout = TugLayout(
        placed, points, dirs, pos, push, bp.copy(), scale.copy(), swl, angle,
        scale, frame, fixed, tuple(ways), tuple(curves), headway, speed,
    )  # fmt: skip
    share = np.array([layout.shares(i, np.array([p.lead_rad]))[0] for i, p in enumerate(placed)])
    return replace(
        layout,
        rated_n=bp * share,
        usable_n=scale * share,
        outline=body.polygon,
        over_allowance_m=over_allowances(body, placed),
    )


def with_placement_row(
    layout: TugLayout, project: Project, stage: Stage, body: Body, placement: Placement
) -> TugLayout:
    """``layout`` with one tug's row made again for ``placement`` (the drag path).

    The tug must already be in the layout; every other row is kept as it is, so a drag of
    one tug costs one row, and gives the arrays :func:`tug_layout` would give for the
    whole stage (tested).
    """
    i = next(k for k, p in enumerate(layout.placements) if p.tug == placement.tug)
    one = tug_layout(project, replace(stage, placements=(placement,)), body)
    return layout.with_row(i, one)


@dataclass(frozen=True, slots=True)
class TugShare:
    """One tug's part in the balance."""

    tug: str
    hull: str
    point: str
    mode: str  # "line" or "push"
    setting: float
    pull_n: float
    usable_n: float
    rated_n: float
    force: tuple[float, float]
    moment_centroid_nm: float
    lead_bearing_deg: float  # relative bearing of the force on the body
    position: tuple[float, float]

    @property
    def standing_by(self) -> bool:
        """Made fast and not pulling: a setting of exactly nothing (core.model.tugs)."""
        return standing_by(self.setting)

    @property
    def setting_words(self) -> str:
        """The setting as every view prints it: "60 %", "0.5 %", "0 %, standing by"."""
        return setting_words(self.setting)

    @property
    def share_of_rated(self) -> float:
        """Share of rated pull: the assigned pull as a fraction of the tug's rated pull at
        its lead (bollard pull x its capability share there, before efficiency, towline
        angle and headway); 0 for a tug that cannot work the way it is placed (no rated
        pull there, so no pull). Not the setting, which is over the usable pull."""
        if self.rated_n > 0:
            return self.pull_n / self.rated_n
        return 0.0 if self.pull_n <= 0 else math.inf


@dataclass(frozen=True, slots=True)
class Balance:
    """Everything the board and the report say about one body in one stage."""

    stage: str
    body: str
    centroid: tuple[float, float]
    centre_of_gravity: tuple[float, float]
    equivalent: Equivalent  # about the centroid
    moment_cog_nm: float
    centreline_x: float | None  # where the line of action crosses y = 0, m
    chord: tuple[tuple[float, float], tuple[float, float]] | None  # enters, leaves the outline
    shares: tuple[TugShare, ...]
    loads: tuple[Load, ...]
    notices: tuple[Notice, ...]
    length_m: float = 0.0  # the body's length overall, m
    #: (force N, moment N*m) within which the net force and the yaw moment are negligible:
    #: core.mechanics.forces.negligible of the tugs' pulls and the loads. The equivalent,
    #: the words and every view read this one decision.
    tolerance: tuple[float, float] = (0.0, 0.0)
    ends_x: tuple[float, float] = (0.0, 0.0)  # the hull's aft and forward ends, body frame, m
    #: the body frame's line y = 0 in words (bodies.Body.centreline_words): a lashed
    #: group's is one member's centreline, named
    centreline: str = "the centreline"
    reference_point: str = (
        "the hull's reference point"  # the body frame's origin in words, likewise
    )

    @property
    def along_centreline(self) -> bool:
        """True when the line of action lies along the centreline over the whole hull
        (within :data:`ALONG_SHARE` of the length at both ends)."""
        eq = self.equivalent
        if eq.point is None or eq.direction is None:
            return False
        (px, py), (ux, uy) = eq.point, eq.direction
        if abs(ux) < 1e-12:
            return False
        near = ALONG_SHARE * max(self.length_m, 1.0)
        return all(abs(py + (x - px) * uy / ux) <= near for x in self.ends_x)

    @property
    def crossing_is_far(self) -> bool:
        """True when the line of action does not cross the centreline near the hull: no
        crossing, or one more than :data:`FAR_CROSSING_LENGTHS` lengths beyond an end."""
        if self.centreline_x is None:
            return True
        reach = FAR_CROSSING_LENGTHS * max(self.length_m, 1.0)
        aft, fwd = self.ends_x
        return not aft - reach <= self.centreline_x <= fwd + reach

    @property
    def crossing_shown(self) -> bool:
        """True when the crossing is worth marking and naming: near the hull, and the line
        not along the centreline (where every point of it is a crossing)."""
        return not self.crossing_is_far and not self.along_centreline

    @property
    def centreline_offset_m(self) -> float | None:
        """Where the line of action passes abeam the centroid, m to port of the centreline
        (None without a line of action or for a line square to the centreline)."""
        eq = self.equivalent
        if eq.point is None or eq.direction is None or abs(eq.direction[0]) < 1e-12:
            return None
        (px, py), (ux, uy) = eq.point, eq.direction
        return py + (self.centroid[0] - px) * uy / ux

    @property
    def walking(self) -> str:
        """Which way the net force moves the body, in words ("walks to port and moves ahead");
        a negligible net force (the one decision, :attr:`tolerance`) moves it nowhere."""
        if self.equivalent.kind != "force":
            return (
                "no net force" if self.net_magnitude == 0 else "no net force (within the tolerance)"
            )
        return walking_words(*self.equivalent.force, self.tolerance[0])

    @property
    def turning(self) -> str:
        """Which way the yaw moment turns the body, in words ("swings bow to port")."""
        return turning_judged(self.equivalent.moment, self.tolerance[1])

    @property
    def turning_about_cog(self) -> str:
        return turning_judged(self.moment_cog_nm, self.tolerance[1])

    def crossing_words(self, units: DisplayUnits) -> str:
        """Where the line of action lies against the centreline, in words for people (a
        lashed group's centreline named: :attr:`centreline`)."""
        cl = self.centreline
        if self.along_centreline:
            return f"along {cl}"
        if self.crossing_shown and self.centreline_x is not None:
            return f"crosses {cl} at x = {units.show(self.centreline_x, 'length')}"
        off = self.centreline_offset_m
        side = (
            ""
            if off is None
            else (
                f", {units.show(abs(off), 'length')} to {'port' if off > 0 else 'starboard'} of it"
            )
        )
        if self.centreline_x is None:
            return f"parallel to {cl}{side}"
        d = self.equivalent.direction
        if d is not None and abs(d[1]) > abs(d[0]):  # steeper than 45 deg to the centreline
            x = units.show(self.centreline_x, "length")
            return f"crosses {cl} far off the hull, at x = {x}"
        return f"nearly parallel to {cl}{side} (it crosses it far off the hull)"

    def equivalent_words(self, units: DisplayUnits) -> str:
        """The single equivalent force in words: a force on a line, a couple, or nothing."""
        eq = self.equivalent
        if eq.kind == "couple":
            return f"a couple of {units.show(abs(eq.moment), 'moment')}, no single line of action"
        if eq.kind == "balanced":
            return "balanced: no net force and no yaw moment"
        return (
            f"{units.show(eq.magnitude, 'force')} on a line "
            f"{units.show(abs(eq.offset_m or 0.0), 'length')} from the centroid; "
            f"{self.crossing_words(units)}"
        )

    @property
    def net_force(self) -> tuple[float, float]:
        return self.equivalent.force

    @property
    def net_magnitude(self) -> float:
        return self.equivalent.magnitude

    @property
    def net_bearing_deg(self) -> float | None:
        """Relative bearing of the net force, None when it is negligible."""
        if self.equivalent.kind != "force":
            return None
        return angle_to_bearing(math.atan2(self.net_force[1], self.net_force[0]))

    @property
    def moment_centroid_nm(self) -> float:
        return self.equivalent.moment

    def moment_about(self, point: tuple[float, float]) -> float:
        return self.equivalent.moment_about(point)


def _within(value: float, tolerance: float) -> str:
    """ " (within the tolerance)" for a negligible value that is more than rounding."""
    return " (within the tolerance)" if abs(value) > 1e-3 * tolerance else ""


def turning_judged(moment_nm: float, tolerance_nm: float) -> str:
    """Which way a yaw moment turns the body, judged against ``tolerance_nm`` (from
    core.mechanics.forces.negligible): "no swing (within the tolerance)" for a moment that
    is negligible yet more than rounding."""
    words = turning_words(moment_nm, tolerance_nm)
    return words + _within(moment_nm, tolerance_nm) if words == "no swing" else words


def _chord(body: Body, eq: Equivalent) -> tuple[tuple[float, float], tuple[float, float]] | None:
    if eq.point is None or eq.direction is None:
        return None
    reach = 4 * (body.length + body.beam)
    p, d = eq.point, eq.direction
    line = shapely.LineString(
        [(p[0] - reach * d[0], p[1] - reach * d[1]), (p[0] + reach * d[0], p[1] + reach * d[1])]
    )
    cut = body.polygon.intersection(line)
    if cut.is_empty:
        return None
    coords = np.asarray(shapely.get_coordinates(cut))
    t = (coords - np.asarray(p)) @ np.asarray(d)
    a, b = coords[int(np.argmin(t))], coords[int(np.argmax(t))]
    return ((float(a[0]), float(a[1])), (float(b[0]), float(b[1])))


def _over_hull_notices(layout: TugLayout, body: Body, units: DisplayUnits) -> list[Notice]:
    """A towline led over the hull, or a tug lying on it (core.mechanics.leads): no tug
    can take that lead."""
    lines = np.flatnonzero(~layout.is_push)
    if len(lines) == 0:
        return []
    over = over_hull_m(body.polygon, layout.points[lines], layout.positions[lines])
    allowance = layout.over_allowance_m
    if allowance is None:
        allowance = over_allowances(body, layout.placements)
    on_deck = ends_on_hull(body.polygon, layout.positions[lines])
    out = []
    for k in np.flatnonzero(on_deck | (over > 0.0)).tolist():  # most lines lead clear
        i = int(lines[k])
        p = layout.placements[i]
        if on_deck[k]:
            text = f"{p.tug}: at the end of its line from {p.point} the tug lies over the hull"
        elif over[k] > allowance[i]:
            text = (
                f"{p.tug}: the towline from {p.point} runs {units.show(float(over[k]), 'length')} "
                "over the hull"
            )
        else:
            continue
        out.append(Notice("line_over_hull", p.tug, text + "; lead it out over the side"))
    return out


def _notices(layout: TugLayout, pulls: np.ndarray, body: Body, units: DisplayUnits) -> list[Notice]:
    out: list[Notice] = _over_hull_notices(layout, body, units)
    seen: dict[tuple[str, str], str] = {}
    for i, p in enumerate(layout.placements):
        if p.setting > 1 + 1e-9:
            out.append(
                Notice(
                    "setting_over",
                    p.tug,
                    f"{p.tug}: setting {setting_words(p.setting)} is above 100 %",
                )
            )
        if layout.is_push[i]:
            inward = body.inward_normal(p.hull, p.point)
            if float(np.dot(layout.directions[i], inward)) <= 1e-9:
                out.append(
                    Notice(
                        "push_outward",
                        p.tug,
                        f"{p.tug}: push at {p.point} points out of the hull; a tug cannot push that way",
                    )
                )
        if layout.line_angle_rad is not None and not layout.is_push[i]:
            deg = math.degrees(layout.line_angle_rad[i])
            if deg > STEEP_LINE_DEG + 1e-9:
                out.append(
                    Notice(
                        "steep_line",
                        p.tug,
                        f"{p.tug}: towline at {p.point} runs {deg:.0f} deg off the horizontal; "
                        f"only {math.cos(layout.line_angle_rad[i]) * 100:.0f} % of the pull is "
                        "horizontal (lengthen the line)",
                    )
                )
        if layout.curves and layout.curves[i] is None:
            way = layout.ways[i]
            out.append(
                Notice(
                    "way_not_possible",
                    p.tug,
                    f"{p.tug} cannot work {WAY_WORDS[way]} (its capability has no such way); "
                    f"it gives no pull at {p.point}",
                )
            )
        key = (p.hull, p.point)
        if key in seen:
            out.append(
                Notice("shared_point", p.point, f"{seen[key]} and {p.tug} both work at {p.point}")
            )
        else:
            seen[key] = p.tug
    return out


def _kept_shares(
    before: Balance | None, row: int | None, placements: tuple[Placement, ...]
) -> tuple[TugShare, ...] | None:
    """``before``'s shares when they can stand for every row but ``row`` (same tugs in the
    same order with the same settings: the rows the drag path kept), else None."""
    if before is None or row is None or not 0 <= row < len(placements):
        return None
    kept = before.shares
    if len(kept) != len(placements):
        return None
    same = all(
        k == row or (s.tug == p.tug and s.setting == p.setting)
        for k, (s, p) in enumerate(zip(kept, placements, strict=True))
    )
    return kept if same else None


def _ends_x(body: Body) -> tuple[float, float]:
    """The aft and forward ends of the body along its x axis, m."""
    x0, _, x1, _ = body.polygon.bounds
    return float(x0), float(x1)


def analyse_layout(
    stage: Stage,
    body: Body,
    layout: TugLayout,
    units: DisplayUnits,
    loads: Sequence[Load] = (),
    before: Balance | None = None,
    changed_row: int | None = None,
) -> Balance:
    """Reduce a tug layout (and any other loads) to the body's balance.

    The drag path (one tug moved, :func:`with_placement_row`) passes ``before``, the
    balance of the layout it came from, and ``changed_row``, the one row made again: the
    other tugs' shares are ``before``'s own objects (their rows are the same, so are their
    shares), and only that row's share is made again. The sums are always worked out
    whole.
    """
    pulls = layout.pulls_n
    forces = layout.directions * pulls[:, None]  # (n, 2)
    c = body.centroid
    tug_m = moments_about(layout.points, forces, c)  # (n,)
    net = forces.sum(axis=0)
    moment = float(tug_m.sum())
    scale = float(np.abs(pulls).sum())
    for ld in loads:
        net = net + np.asarray(ld.force)
        moment += ld.moment_about(c)
        scale += math.hypot(*ld.force)
    tolerance = negligible(scale, body.length)
    eq = equivalent_of(net, moment, c, tolerance)
    cog = body.centre_of_gravity
    # plain floats once for all tugs (the same values float() of each element gives)
    pull_l, usable_l, rated_l = pulls.tolist(), layout.usable_n.tolist(), layout.rated_n.tolist()
    force_l, moment_l = forces.tolist(), tug_m.tolist()
    dirs, pos_l, push_l = (
        layout.directions.tolist(),
        layout.positions.tolist(),
        layout.is_push.tolist(),
    )

    def share(i: int, p: Placement) -> TugShare:
        return TugShare(
            tug=p.tug,
            hull=p.hull,
            point=p.point,
            mode="push" if push_l[i] else "line",
            setting=p.setting,
            pull_n=pull_l[i],
            usable_n=usable_l[i],
            rated_n=rated_l[i],
            force=(force_l[i][0], force_l[i][1]),
            moment_centroid_nm=moment_l[i],
            lead_bearing_deg=angle_to_bearing(math.atan2(dirs[i][1], dirs[i][0])),
            position=(pos_l[i][0], pos_l[i][1]),
        )

    placements = layout.placements
    kept = _kept_shares(before, changed_row, placements)
    if kept is not None and changed_row is not None:
        k = changed_row
        shares = (*kept[:k], share(k, placements[k]), *kept[k + 1 :])
    else:
        shares = tuple(share(i, p) for i, p in enumerate(placements))
    return Balance(
        stage=stage.name,
        body=body.name,
        centroid=c,
        centre_of_gravity=cog,
        equivalent=eq,
        moment_cog_nm=transfer_moment(moment, c, cog, net),
        centreline_x=eq.crossing_x(0.0),
        chord=_chord(body, eq),
        shares=shares,
        loads=tuple(loads),
        notices=tuple(_notices(layout, pulls, body, units)),
        length_m=body.length,
        tolerance=tolerance,
        ends_x=_ends_x(body),
        centreline=body.centreline_words,
        reference_point=body.reference_words,
    )


def analyse(
    project: Project, stage: Stage, body: str | None = None, loads: Sequence[Load] = ()
) -> Balance:
    """The balance of ``body`` (default: the body the stage's first tug works on)."""
    b = stage_body(project, stage, body)
    return analyse_layout(stage, b, tug_layout(project, stage, b), project.units, loads)
