"""A hull outline taken from a drawing or a table: placed in the hull frame, checked, measured.

Whatever the source (a DXF layer, a table of offsets), the points arrive in the
source's own units and axes. :func:`place_outline` checks them with shapely, drops
points that add nothing, turns them into the hull frame (x forward, y to port,
metres, origin at the chosen reference point) and measures the result with the same
:class:`core.model.hull.HullGeometry` every hull uses, so the area and centroid shown
before the outline is accepted are the hull's own.

A plan view is seen from above: with the bow along the drawing's +x, port is the
drawing's +y; with the bow along -x (the drawing's x runs aft), port is -y. A
drawing seen from below (a bottom plan) is mirrored: say so with ``from_below``.
"""

from __future__ import annotations

import math
import re
from collections.abc import Sequence
from dataclasses import dataclass
from typing import Literal

import numpy as np
import shapely

from core.errors import DrawingError, InputError, OutlineError
from core.model import rules
from core.model.hull import Hull, HullGeometry
from core.model.outlines import Outline, validate_outline
from core.model.plan import Project, Stage
from core.notices import Notice

Pt = tuple[float, float]
Bow = Literal["+x", "-x", "+y", "-y"]
Reference = Literal["aft", "forward", "middle", "origin", "point"]

BOWS: tuple[Bow, ...] = ("+x", "-x", "+y", "-y")
REFERENCES: tuple[Reference, ...] = ("aft", "forward", "middle", "origin", "point")
REFERENCE_WORDS = {
    "aft": "aft end, on the centreline",
    "forward": "forward end, on the centreline",
    "middle": "mid-length, on the centreline",
    "origin": "the drawing's origin (0, 0)",
    "point": "a point given in drawing coordinates",
}
#: Part of the flattening's chord error left to simplification (the rest to flattening),
#: so the outline stays within the chord error of the drawn curves.
SIMPLIFY_SHARE = 0.1
#: Hull lengths outside this range, m, are worth a second look at the units.
PLAUSIBLE_LENGTH_M = (2.0, 600.0)
#: Part of the area with no mirror image across the centreline that earns a warning.
ASYMMETRY_WARNING = 0.02

_UNIT_VECTORS: dict[str, Pt] = {
    "+x": (1.0, 0.0),
    "-x": (-1.0, 0.0),
    "+y": (0.0, 1.0),
    "-y": (0.0, -1.0),
}


@dataclass(frozen=True, slots=True)
class OutlinePlacement:
    """How a drawn outline sits in the hull frame.

    ``bow``: the drawing direction the bow points to. ``from_below``: the drawing is
    seen from below (port and starboard swap). ``reference``: the point that becomes
    the hull frame's origin: the aft or forward end or mid-length on the centreline
    (the middle of the outline's breadth), the drawing's origin, or ``point`` (drawing
    units) when ``reference`` is "point".
    """

    bow: Bow = "+x"
    from_below: bool = False
    reference: Reference = "aft"
    point: Pt = (0.0, 0.0)

    def __post_init__(self) -> None:
        if self.bow not in BOWS:
            raise InputError("bow direction", self.bow, f"is not one of {', '.join(BOWS)}")
        if self.reference not in REFERENCES:
            raise InputError(
                "reference point", self.reference, f"is not one of {', '.join(REFERENCES)}"
            )
        x, y = (float(v) for v in self.point)
        if not (math.isfinite(x) and math.isfinite(y)):
            raise InputError("reference point", self.point, "must be finite")
        object.__setattr__(self, "point", (x, y))

    def axes(self) -> tuple[Pt, Pt]:
        """The drawing directions of the hull's +x (forward) and +y (port), unit vectors."""
        u = _UNIT_VECTORS[self.bow]
        v = (-u[1], u[0])  # 90 degrees to the left of the bow, seen from above
        if self.from_below:
            v = (-v[0], -v[1])
        return u, v


@dataclass(frozen=True, slots=True)
class ImportedOutline:
    """An outline ready to become a hull, with what was measured and noticed on the way.

    ``outline`` is in the hull frame (m, counter-clockwise); ``area_m2``,
    ``centroid_m``, ``length_m`` and ``beam_m`` are its plane-area properties;
    ``reference_in_drawing`` is where the hull frame's origin lies in the drawing
    (drawing units); ``points_read`` and ``points_kept`` count the vertices before and
    after simplification.
    """

    outline: Outline
    area_m2: float
    centroid_m: Pt
    length_m: float
    beam_m: float
    source: str
    layer: str | None
    units: str
    chord_error_m: float
    points_read: int
    points_kept: int
    reference_in_drawing: Pt
    notices: tuple[Notice, ...] = ()

    def hull(self, name: str) -> Hull:
        """A new hull on this outline."""
        return Hull(name, self.outline)


def drawing_tolerances(
    chord_error_m: float, tolerance_m: float, metres_per_unit: float
) -> tuple[float, float]:
    """The chord error left to flattening and the join tolerance, in drawing units, from
    the two as given in metres; each is checked first by its rule, so a refusal shows the
    value the user gave.

    Raises RangeError naming the chord error or the join tolerance.
    """
    chord = rules.CHORD_ERROR.check(chord_error_m)
    tol = rules.JOIN_TOLERANCE.check(tolerance_m)
    return (1 - SIMPLIFY_SHARE) * chord / metres_per_unit, tol / metres_per_unit


def invalid_reason(poly: shapely.Polygon) -> tuple[str, Pt | None]:
    """Why shapely finds ``poly`` invalid, in words, and where (drawing units) if it says."""
    reason = shapely.is_valid_reason(poly)
    m = re.search(r"\[\s*([-+0-9.eE]+)\s+([-+0-9.eE]+)", reason)
    where = (float(m.group(1)) + 0.0, float(m.group(2)) + 0.0) if m else None  # no "-0"
    words = "crosses itself" if "intersection" in reason.lower() else reason.split("[")[0].lower()
    return words, where


def place_outline(
    points: Sequence[Pt],
    metres_per_unit: float,
    placement: OutlinePlacement,
    chord_error_m: float,
    *,
    source: str,
    layer: str | None,
    units: str,
    notices: Sequence[Notice] = (),
) -> ImportedOutline:
    """Check, simplify, place and measure a closed outline given in drawing units.

    Raises
    ------
    DrawingError
        The outline crosses itself or has no area (naming the layer and, where
        shapely says, the drawing point).
    RangeError
        The chord error is outside its rule (:data:`core.model.rules.CHORD_ERROR`).
    """
    chord_error_m = rules.CHORD_ERROR.check(chord_error_m)
    name = f"layer {layer}" if layer is not None else "the outline"
    if len(points) < 3:
        raise DrawingError(source, "the outline has fewer than three points", layer=layer)
    poly = shapely.Polygon(points)
    if not poly.is_valid:
        words, where = invalid_reason(poly)
        at = f" near ({where[0]:.6g}, {where[1]:.6g}) {units}" if where else ""
        raise DrawingError(source, f"the outline {words}{at}", layer=layer)
    if poly.area <= 0:
        raise DrawingError(source, "the outline has no area", layer=layer)
    tol = SIMPLIFY_SHARE * chord_error_m / metres_per_unit
    simple = shapely.simplify(poly, tol, preserve_topology=True)
    kept = np.asarray(simple.exterior.coords)[:-1]  # (n, 2) drawing units
    u, v = placement.axes()
    k = metres_per_unit
    raw = np.column_stack([k * (kept @ np.array(u)), k * (kept @ np.array(v))])  # (n, 2) m
    ref = _reference(raw, placement, k)
    try:
        outline = validate_outline((raw - np.asarray(ref)).tolist(), name)
    except OutlineError as e:
        raise DrawingError(source, str(e).removeprefix(f"{name}: "), layer=layer) from None
    g = HullGeometry(outline)
    in_drawing = (
        (ref[0] * u[0] + ref[1] * v[0]) / k + 0.0,
        (ref[0] * u[1] + ref[1] * v[1]) / k + 0.0,
    )
    found = list(notices) + _shape_notices(g, units)
    return ImportedOutline(
        outline,
        g.area,
        g.centroid,
        g.length,
        g.beam,
        source,
        layer,
        units,
        chord_error_m,
        len(points),
        len(outline),
        in_drawing,
        tuple(found),
    )


def _reference(raw: np.ndarray, placement: OutlinePlacement, k: float) -> Pt:
    """The chosen reference point in the unshifted hull frame (m). raw: (n, 2)."""
    x0, y0 = raw.min(axis=0)
    x1, y1 = raw.max(axis=0)
    mid_y = float(y0 + y1) / 2
    if placement.reference == "aft":
        return (float(x0), mid_y)
    if placement.reference == "forward":
        return (float(x1), mid_y)
    if placement.reference == "middle":
        return (float(x0 + x1) / 2, mid_y)
    if placement.reference == "origin":
        return (0.0, 0.0)
    u, v = placement.axes()
    p = placement.point
    return (k * (p[0] * u[0] + p[1] * u[1]), k * (p[0] * v[0] + p[1] * v[1]))


def _shape_notices(g: HullGeometry, units: str) -> list[Notice]:
    out: list[Notice] = []
    lo, hi = PLAUSIBLE_LENGTH_M
    if not lo <= g.length <= hi:
        out.append(
            Notice(
                "outline_size",
                "outline",
                f"The outline is {g.length:.6g} m long and {g.beam:.6g} m in beam: "
                f"check the drawing's units ({units}).",
            )
        )
    mirror = shapely.Polygon(g.vertices * np.array([1.0, -1.0]))
    if mirror.is_valid:
        odd = float(g.polygon.symmetric_difference(mirror).area) / (2 * g.area)
        if odd > ASYMMETRY_WARNING:
            out.append(
                Notice(
                    "outline_asymmetric",
                    "outline",
                    f"The outline is not symmetric about the centreline (y = 0): {odd * 100:.0f} % "
                    "of its area has no mirror image. Check the reference point and the axes.",
                    "caution",
                )
            )
    return out


def new_plan(imported: ImportedOutline, hull_name: str, plan_name: str | None = None) -> Project:
    """A new plan holding one hull on the imported outline and one empty stage."""
    hull = imported.hull(hull_name)
    return Project(name=plan_name or hull_name, hulls=(hull,), stages=(Stage("Stage 1"),))
