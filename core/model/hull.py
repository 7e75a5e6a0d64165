"""A floating body's hull: outline, particulars, fittings and plane-area properties.

Coordinates are in the hull frame: x forward, y to port, metres. By default the
origin (the reference point) is the aft end of the outline on the centreline.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from typing import Literal

import numpy as np
import shapely

from core.errors import InputError
from core.frames import angle_in_sector, wrap_pi
from core.model import rules
from core.model.outlines import Outline, validate_outline

FittingKind = Literal["line", "push"]
FITTING_TYPES = ("bitt", "bollard", "fairlead", "chock", "pushing pad")

#: How the drift preview estimates a hull's added mass (core.motion.added_mass):
#: "sections" integrates DNV-RP-C205's 2-D rectangle values along the length (barges,
#: pontoons, box-shaped modules); "ship" uses the Clarke, Gedling and Hine regressions
#: for ship-shaped hulls. Both take the surge added mass from Soding's estimate.
ADDED_MASS_METHODS = ("sections", "ship")
#: How near the outline a fitting is taken to lie on it: ON_OUTLINE_M, m, plus
#: ON_OUTLINE_REL times the outline's largest coordinate. The file keeps 12 significant
#: digits, so a point written at 20 km from the hull's origin (an outline drawn in a
#: site's or a chart's coordinates) moves by up to 5e-8 m: the allowance grows with the
#: coordinates (at least 20 times that rounding) and stays far under any drawing's.
ON_OUTLINE_M = 1e-9
ON_OUTLINE_REL = 1e-10


@dataclass(frozen=True, slots=True)
class Fitting:
    """A line point (a towline is made fast here) or a push point, on the outline.

    Parameters
    ----------
    fitting_type:
        Free text, usually one of :data:`FITTING_TYPES` (bitt, bollard, fairlead...).
    swl_n:
        Safe working load, N, where known (the rating marked for mooring and general use).
    tow_n:
        Safe towing load (TOW), N, where known: the rating for towing under IMO
        MSC.1/Circ.1175. A towline is checked against TOW, or against SWL where no TOW
        is given (:attr:`towing_rating_n`).
    permitted_lead_rad:
        The towline directions the fitting is rated for, (low, high): hull-frame angles of
        the line from the fitting towards the tug, counter-clockwise from low to high (the
        same frame as a placement's lead). None: any direction.
    """

    name: str
    kind: FittingKind
    x: float
    y: float
    fitting_type: str = "bitt"
    swl_n: float | None = None
    tow_n: float | None = None
    permitted_lead_rad: tuple[float, float] | None = None

    def __post_init__(self) -> None:
        rules.NAME.check(self.name, "fitting")
        subject = f"fitting {self.name}"
        if self.kind not in ("line", "push"):
            raise InputError(f"{subject}: kind", self.kind, "must be 'line' or 'push'")
        rules.LABEL.check(self.fitting_type, f"{subject}: type")
        rules.COORDINATE.check(self.x, f"{subject}: x")
        rules.COORDINATE.check(self.y, f"{subject}: y")
        rules.SWL.check_optional(self.swl_n, subject)
        rules.TOW.check_optional(self.tow_n, subject)
        if self.permitted_lead_rad is not None:
            if self.kind != "line":
                raise InputError(
                    f"fitting {self.name}: permitted line angles",
                    self.permitted_lead_rad,
                    "apply to line points only",
                )
            sector = self.permitted_lead_rad
            where = f"{subject}: permitted line angles"
            if not (isinstance(sector, tuple | list) and len(sector) == 2):
                raise InputError(where, sector, "must be two angles")
            lo, hi = rules.ANGLE.check(sector[0], where), rules.ANGLE.check(sector[1], where)
            if abs(wrap_pi(hi - lo)) < 1e-9:
                raise InputError(
                    f"fitting {self.name}: permitted line angles",
                    self.permitted_lead_rad,
                    "must span more than one direction",
                )
            object.__setattr__(self, "permitted_lead_rad", (wrap_pi(lo), wrap_pi(hi)))

    @property
    def towing_rating_n(self) -> float | None:
        """The rating a towline is checked against: TOW, else SWL, else None."""
        return self.tow_n if self.tow_n is not None else self.swl_n

    @property
    def rating_label(self) -> str:
        """What :attr:`towing_rating_n` is: "TOW" or "SWL" (or "" when no rating is given)."""
        return "TOW" if self.tow_n is not None else "SWL" if self.swl_n is not None else ""

    def permits_lead(self, lead_rad: float) -> bool:
        """Whether a towline leading at ``lead_rad`` (hull frame) is within the permitted
        line angles (always, where none are given)."""
        if self.permitted_lead_rad is None:
            return True
        return angle_in_sector(lead_rad, *self.permitted_lead_rad)

    def moved_to(self, x: float, y: float) -> Fitting:
        return replace(self, x=float(x), y=float(y))


@dataclass(frozen=True, slots=True)
class BoundaryPoint:
    """A point on the outline with its outward unit normal and arc length from vertex 0."""

    x: float
    y: float
    s: float
    edge: int
    normal: tuple[float, float]
    distance: float  # from the point that was asked about, m


class HullGeometry:
    """Plane-area properties and boundary queries of a validated outline (computed once)."""

    __slots__ = (
        "_cum",
        "_edge_len",
        "_unit",
        "area",
        "beam",
        "centroid",
        "i_xx",
        "i_xy",
        "i_yy",
        "length",
        "perimeter",
        "polygon",
        "vertices",
        "x_max",
        "x_min",
    )

    def __init__(self, outline: Outline) -> None:
        v = np.asarray(outline, dtype=float)  # (n, 2), counter-clockwise
        self.vertices = v
        self.polygon = shapely.Polygon(v)
        shapely.prepare(self.polygon)
        x, y = v[:, 0], v[:, 1]
        xn, yn = np.roll(x, -1), np.roll(y, -1)
        c = x * yn - xn * y  # (n,) shoelace terms
        a = 0.5 * c.sum()
        cx = ((x + xn) * c).sum() / (6 * a)
        cy = ((y + yn) * c).sum() / (6 * a)
        # Second moments about the origin, then moved to the centroid (parallel axis).
        ixx_o = ((y * y + y * yn + yn * yn) * c).sum() / 12  # integral of y^2 dA
        iyy_o = ((x * x + x * xn + xn * xn) * c).sum() / 12  # integral of x^2 dA
        ixy_o = ((x * yn + 2 * x * y + 2 * xn * yn + xn * y) * c).sum() / 24
        self.area = float(a)
        self.centroid = (float(cx), float(cy))
        self.i_xx = float(ixx_o - a * cy * cy)
        self.i_yy = float(iyy_o - a * cx * cx)
        self.i_xy = float(ixy_o - a * cx * cy)
        self.x_min, self.x_max = float(x.min()), float(x.max())
        self.length = self.x_max - self.x_min
        self.beam = float(y.max() - y.min())
        d = np.roll(v, -1, axis=0) - v  # (n, 2) edge vectors
        self._edge_len = np.hypot(d[:, 0], d[:, 1])
        self._unit = d / self._edge_len[:, None]
        self._cum = np.concatenate(([0.0], np.cumsum(self._edge_len)))
        self.perimeter = float(self._cum[-1])

    def _normal(self, edge: int, t: float) -> tuple[float, float]:
        """Outward normal of ``edge`` at parameter t; at a vertex, the mean of both edges'."""
        u = self._unit
        nx, ny = u[edge, 1], -u[edge, 0]  # counter-clockwise outline: outward is to the right
        n = len(u)
        other = edge + 1 if t >= 1 - 1e-9 else edge - 1 if t <= 1e-9 else None
        if other is not None:
            o = other % n
            nx, ny = nx + u[o, 1], ny - u[o, 0]
            norm = math.hypot(nx, ny)
            nx, ny = nx / norm, ny / norm
        return (float(nx), float(ny))

    def nearest(self, x: float, y: float) -> BoundaryPoint:
        """The point of the outline nearest (x, y)."""
        v, d = self.vertices, self._unit * self._edge_len[:, None]
        rel = np.array([x, y]) - v  # (n, 2)
        t = np.clip(np.einsum("ij,ij->i", rel, d) / (self._edge_len**2), 0.0, 1.0)
        foot = v + d * t[:, None]
        dist = np.hypot(foot[:, 0] - x, foot[:, 1] - y)
        k = int(np.argmin(dist))
        tk = float(t[k])
        return BoundaryPoint(
            x=float(foot[k, 0]),
            y=float(foot[k, 1]),
            s=float(self._cum[k] + tk * self._edge_len[k]),
            edge=k,
            normal=self._normal(k, tk),
            distance=float(dist[k]),
        )

    def point_at(self, s: float) -> BoundaryPoint:
        """The point at arc length ``s`` (m) from vertex 0, counter-clockwise, wrapping round."""
        s = s % self.perimeter
        k = int(np.searchsorted(self._cum, s, side="right") - 1)
        k = min(max(k, 0), len(self._edge_len) - 1)
        tk = (s - self._cum[k]) / self._edge_len[k]
        p = self.vertices[k] + self._unit[k] * (s - self._cum[k])
        return BoundaryPoint(float(p[0]), float(p[1]), float(s), k, self._normal(k, tk), 0.0)

    def contains(self, x: float, y: float) -> bool:
        return bool(self.polygon.contains(shapely.Point(x, y)))


@dataclass(frozen=True, slots=True)
class Hull:
    """One floating body's plan view and particulars, in the hull frame.

    Parameters
    ----------
    name:
        Unique within the project.
    outline:
        Vertices of the plan outline (any orientation; stored counter-clockwise).
    draught_m, freeboard_m:
        Mean draught and freeboard, m, where known (used for current and wind areas).
    displacement_kg:
        Displacement mass, kg, where known.
    cog:
        Centre of gravity (x, y), m, if it differs from the outline's centroid.
    fittings:
        Line points and push points; each is snapped onto the outline.
    yaw_gyradius_m:
        Radius of gyration in yaw about the centre of gravity, m, where known (the
        drift preview's yaw inertia); None treats the plan as a uniform plate.
    added_mass_method:
        One of :data:`ADDED_MASS_METHODS`: how the drift preview estimates added mass.
    """

    name: str
    outline: Outline
    draught_m: float | None = None
    freeboard_m: float | None = None
    displacement_kg: float | None = None
    cog: tuple[float, float] | None = None
    fittings: tuple[Fitting, ...] = ()
    yaw_gyradius_m: float | None = None
    added_mass_method: str = "sections"
    geometry: HullGeometry = field(init=False, repr=False, compare=False)
    _by_name: dict[str, Fitting] = field(init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        rules.NAME.check(self.name, "hull")
        subject = f"hull {self.name}"
        rules.DRAUGHT.check_optional(self.draught_m, subject)
        rules.FREEBOARD.check_optional(self.freeboard_m, subject)
        rules.DISPLACEMENT.check_optional(self.displacement_kg, subject)
        outline = validate_outline(self.outline, f"{subject} outline")
        object.__setattr__(self, "outline", outline)
        geometry = HullGeometry(outline)
        object.__setattr__(self, "geometry", geometry)
        rules.YAW_GYRADIUS.check_optional(self.yaw_gyradius_m, subject)
        if self.added_mass_method not in ADDED_MASS_METHODS:
            raise InputError(
                f"hull {self.name}: added mass method",
                self.added_mass_method,
                f"is not one of {', '.join(ADDED_MASS_METHODS)}",
            )
        if self.cog is not None:
            cog = self.cog
            if not (isinstance(cog, tuple | list) and len(cog) == 2):
                raise InputError(f"{subject}: centre of gravity", cog, "must be a point (x, y)")
            where = f"{subject}: centre of gravity"
            cog = (rules.COORDINATE.check(cog[0], where), rules.COORDINATE.check(cog[1], where))
            object.__setattr__(self, "cog", cog)
        seen: set[str] = set()
        for f in self.fittings:
            if f.name in seen:
                raise InputError(f"{subject}: fitting name", f.name, "is used twice")
            seen.add(f.name)
        reach = float(np.abs(np.asarray(outline)).max())
        on = ON_OUTLINE_M + ON_OUTLINE_REL * reach
        snapped = tuple(f.moved_to(*self._snap(f.x, f.y, on)) for f in self.fittings)
        object.__setattr__(self, "fittings", snapped)
        object.__setattr__(self, "_by_name", {f.name: f for f in snapped})

    def _snap(self, x: float, y: float, on: float) -> tuple[float, float]:
        p = self.geometry.nearest(x, y)
        # Within ``on`` m the point is on the outline already: a snapped point written
        # to the file's 12 significant digits lands a hair off a slanted edge, and snapping
        # it again on load would change its last digits at every save.
        return (p.x, p.y) if p.distance > on else (x, y)

    # -- derived values -------------------------------------------------------------
    @property
    def centroid(self) -> tuple[float, float]:
        return self.geometry.centroid

    @property
    def centre_of_gravity(self) -> tuple[float, float]:
        """The given centre of gravity, or the centroid when none is given."""
        return self.cog if self.cog is not None else self.geometry.centroid

    def fitting(self, name: str) -> Fitting:
        f = self._by_name.get(name)
        if f is None:
            raise InputError(f"hull {self.name}: fitting", name, "does not exist")
        return f

    # -- edits return new hulls -----------------------------------------------------
    def with_outline(self, outline: Outline) -> Hull:
        """The same hull on a new outline.

        When the new outline has as many vertices as the old (a vertex dragged), each
        fitting keeps its place along its edge, so it travels with the edge; otherwise it
        moves to the nearest point of the new outline.
        """
        new = validate_outline(outline, f"hull {self.name} outline")
        if len(new) != len(self.outline):
            return replace(self, outline=new)
        g, n = self.geometry, len(new)
        moved = []
        for f in self.fittings:
            p = g.nearest(f.x, f.y)
            t = (p.s - float(g._cum[p.edge])) / float(g._edge_len[p.edge])
            (ax, ay), (bx, by) = new[p.edge], new[(p.edge + 1) % n]
            moved.append(f.moved_to(ax + t * (bx - ax), ay + t * (by - ay)))
        return replace(self, outline=new, fittings=tuple(moved))

    def with_fitting(self, fitting: Fitting) -> Hull:
        """Add a fitting, or replace the one of the same name."""
        kept = tuple(f for f in self.fittings if f.name != fitting.name)
        if len(kept) == len(self.fittings):
            return replace(self, fittings=(*self.fittings, fitting))
        return replace(
            self, fittings=tuple(fitting if f.name == fitting.name else f for f in self.fittings)
        )

    def without_fitting(self, name: str) -> Hull:
        return replace(self, fittings=tuple(f for f in self.fittings if f.name != name))

    def shifted(self, dx: float, dy: float = 0.0) -> Hull:
        """The same hull with the reference point moved: every coordinate less (dx, dy)."""
        return replace(
            self,
            outline=tuple((x - dx, y - dy) for x, y in self.outline),
            cog=None if self.cog is None else (self.cog[0] - dx, self.cog[1] - dy),
            fittings=tuple(f.moved_to(f.x - dx, f.y - dy) for f in self.fittings),
        )
