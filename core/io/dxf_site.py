"""Site features from a DXF drawing: layers mapped to feature kinds.

Each chosen layer gives features of one kind: every closed loop on it becomes a
closed feature (a dolphin, a moored vessel, a pier's outline, a basin limit) and
every open chain an open one (a quay face, a fairway edge). Dolphins and vessels
are areas, so open lines on their layers are left out with a notice. Features are
named after their layer and numbered.
"""

from __future__ import annotations

from collections.abc import Mapping

import shapely

from core.errors import DrawingError, InputError
from core.io.drawing_units import metres_per_unit
from core.io.dxf_geometry import Drawing
from core.io.dxf_outline import CHORD_ERROR_M, JOIN_TOLERANCE_M
from core.io.outline_import import SIMPLIFY_SHARE, drawing_tolerances, invalid_reason
from core.io.site_import import ImportedSite, SiteFrame
from core.model.plan import SITE_FEATURE_KINDS, SiteFeature
from core.notices import Notice

AREA_KINDS = frozenset({"dolphin", "vessel"})


def import_site(
    drawing: Drawing,
    layer_kinds: Mapping[str, str],
    units: str,
    frame: SiteFrame | None = None,
    chord_error_m: float = CHORD_ERROR_M,
    tolerance_m: float = JOIN_TOLERANCE_M,
) -> ImportedSite:
    """The features of the layers in ``layer_kinds`` (layer -> kind), in the site frame.

    Raises
    ------
    DrawingError
        A layer that does not exist, holds nothing of its kind, or has a closed shape
        that crosses itself (naming the layer and the drawing point).
    """
    if not layer_kinds:
        raise DrawingError(drawing.source, "no layer is chosen for the site")
    frame = frame or SiteFrame()
    k = metres_per_unit(units)
    chord_du, join_du = drawing_tolerances(chord_error_m, tolerance_m, k)
    tol = SIMPLIFY_SHARE * chord_error_m / k
    features: list[SiteFeature] = []
    repaired = drawing.repair_notice()
    notices: list[Notice] = [repaired] if repaired else []
    for layer, kind in layer_kinds.items():
        if kind not in SITE_FEATURE_KINDS:
            raise InputError(
                f"layer {layer}: kind", kind, f"is not one of {', '.join(SITE_FEATURE_KINDS)}"
            )
        s = drawing.shapes(layer, chord_du, join_du)
        n = 0
        for loop in s.loops:
            poly = shapely.Polygon(loop)
            if not poly.is_valid:
                words, where = invalid_reason(poly)
                at = f" near ({where[0]:.6g}, {where[1]:.6g}) {units}" if where else ""
                raise DrawingError(drawing.source, f"a closed shape {words}{at}", layer=s.layer)
            pts = list(shapely.simplify(poly, tol, preserve_topology=True).exterior.coords)[:-1]
            n += 1
            features.append(SiteFeature(f"{s.layer} {n}", kind, frame.to_site(pts, k), closed=True))  # type: ignore[arg-type]
        open_chains = s.chains
        if open_chains and kind in AREA_KINDS:
            notices.append(
                Notice(
                    "open_lines_left_out",
                    s.layer,
                    f"Layer {s.layer}: {len(open_chains)} open line(s) left out; "
                    f"a {kind} is a closed shape.",
                    "caution",
                )
            )
            open_chains = ()
        for chain in open_chains:
            line = shapely.simplify(shapely.LineString(chain), tol, preserve_topology=False)
            pts = list(line.coords)
            n += 1
            features.append(SiteFeature(f"{s.layer} {n}", kind, frame.to_site(pts, k)))  # type: ignore[arg-type]
        if n == 0:
            what = "closed shapes" if kind in AREA_KINDS else "lines or shapes"
            raise DrawingError(drawing.source, f"holds no {what} for a {kind}", layer=s.layer)
    return ImportedSite(drawing.source, tuple(features), tuple(notices))
