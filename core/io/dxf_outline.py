"""A hull outline from a DXF drawing: the layers that hold one, and the outline of one layer.

The outline is the largest closed loop on the chosen layer: a closed LWPOLYLINE or
POLYLINE, a circle, a closed spline or ellipse, or LINE and ARC entities (and open
polylines) whose ends meet within the join tolerance. Arcs and bulges are flattened
so that no chord lies farther than the chord error from its arc; both tolerances are
given in metres and turned into drawing units with the drawing's units.
"""

from __future__ import annotations

from dataclasses import dataclass

import shapely

from core.errors import DrawingError
from core.io.drawing_units import metres_per_unit
from core.io.dxf_geometry import Drawing, LayerShapes, Pt
from core.io.outline_import import (
    ImportedOutline,
    OutlinePlacement,
    drawing_tolerances,
    place_outline,
)
from core.notices import Notice

#: Defaults, m: a chord may stray 10 mm from its arc; ends 5 mm apart are joined.
CHORD_ERROR_M = 0.01
JOIN_TOLERANCE_M = 0.005


@dataclass(frozen=True, slots=True)
class LayerSummary:
    """What a layer offers as an outline: closed loops, open chains, the largest loop."""

    layer: str
    loops: int
    chains: int
    largest_area_m2: float  # 0 when the layer has no loop
    largest_size_m: tuple[float, float]  # extent of the largest loop along drawing x and y
    entities: dict[str, int]

    def words(self) -> str:
        """One line for a list of layers."""
        if self.loops:
            w, h = self.largest_size_m
            more = f"; {self.loops - 1} more" if self.loops > 1 else ""
            return (
                f"{self.layer}: closed outline {w:.1f} m × {h:.1f} m, "
                f"{self.largest_area_m2:.1f} m²{more}"
            )
        if self.chains:
            return f"{self.layer}: {self.chains} open line{'s' if self.chains > 1 else ''}, no closed outline"
        kinds = ", ".join(f"{n} {t}" for t, n in sorted(self.entities.items()))
        return f"{self.layer}: no outline ({kinds})"


def _shapes(
    drawing: Drawing, layer: str, units: str, chord_error_m: float, tolerance_m: float
) -> LayerShapes:
    chord, tol = drawing_tolerances(chord_error_m, tolerance_m, metres_per_unit(units))
    return drawing.shapes(layer, chord, tol)


def _largest(loops: tuple[tuple[Pt, ...], ...]) -> tuple[int, float]:
    areas = [abs(shapely.Polygon(lp).area) if len(lp) >= 3 else 0.0 for lp in loops]
    i = max(range(len(areas)), key=areas.__getitem__)
    return i, areas[i]


def layer_summaries(
    drawing: Drawing,
    units: str,
    chord_error_m: float = CHORD_ERROR_M,
    tolerance_m: float = JOIN_TOLERANCE_M,
) -> tuple[LayerSummary, ...]:
    """Every layer with something on it, with its loops counted (sizes in metres)."""
    k = metres_per_unit(units)
    out: list[LayerSummary] = []
    for layer in drawing.layers():
        s = _shapes(drawing, layer, units, chord_error_m, tolerance_m)
        area, size = 0.0, (0.0, 0.0)
        if s.loops:
            i, a = _largest(s.loops)
            x0, y0, x1, y1 = shapely.Polygon(s.loops[i]).bounds
            area, size = a * k * k, ((x1 - x0) * k, (y1 - y0) * k)
        out.append(
            LayerSummary(layer, len(s.loops), len(s.chains), area, size, drawing.counts(layer))
        )
    return tuple(out)


def likely_layer(summaries: tuple[LayerSummary, ...]) -> str | None:
    """The layer whose largest closed loop is the largest of all (None if none has one)."""
    best = max(summaries, key=lambda s: s.largest_area_m2, default=None)
    return best.layer if best is not None and best.loops else None


def no_outline(drawing: Drawing, s: LayerShapes, units: str) -> DrawingError:
    """The error for a layer without a closed loop, saying what it has instead."""
    gap = s.gap()
    if gap is not None:
        d, a, b = gap
        return DrawingError(
            drawing.source,
            f"the lines do not close into an outline: the nearest open ends are {d:.6g} {units} "
            f"apart, at ({a[0]:.6g}, {a[1]:.6g}) and ({b[0]:.6g}, {b[1]:.6g})",
            layer=s.layer,
        )
    kinds = ", ".join(f"{n} {t}" for t, n in sorted(drawing.counts(s.layer).items()))
    return DrawingError(drawing.source, f"has no closed outline (it holds {kinds})", layer=s.layer)


def import_outline(
    drawing: Drawing,
    layer: str,
    units: str,
    placement: OutlinePlacement | None = None,
    chord_error_m: float = CHORD_ERROR_M,
    tolerance_m: float = JOIN_TOLERANCE_M,
) -> ImportedOutline:
    """The outline on ``layer``, in the hull frame (see :mod:`core.io.outline_import`).

    Raises
    ------
    DrawingError
        The layer does not exist, has no closed loop (naming the nearest open ends when
        lines stop short), or its outline crosses itself.
    """
    s = _shapes(drawing, layer, units, chord_error_m, tolerance_m)
    if not s.loops:
        raise no_outline(drawing, s, units)
    i, _area = _largest(s.loops)
    repaired = drawing.repair_notice()
    notices: list[Notice] = [repaired] if repaired else []
    if len(s.loops) > 1:
        notices.append(
            Notice(
                "other_loops",
                s.layer,
                f"Layer {s.layer} has {len(s.loops)} closed loops; the largest is the outline.",
                "caution",
            )
        )
    for x, y in s.branches[:3]:
        notices.append(
            Notice(
                "lines_branch",
                s.layer,
                f"Three or more line ends meet at ({x:.6g}, {y:.6g}) {units} on layer {s.layer}: "
                "check the outline follows the hull there.",
            )
        )
    if s.skipped:
        kinds = ", ".join(f"{n} {t}" for t, n in s.skipped)
        notices.append(
            Notice("not_read", s.layer, f"Not read on layer {s.layer}: {kinds}.", "caution")
        )
    return place_outline(
        s.loops[i],
        metres_per_unit(units),
        placement or OutlinePlacement(),
        chord_error_m,
        source=drawing.source,
        layer=s.layer,
        units=units,
        notices=notices,
    )
