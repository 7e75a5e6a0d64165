"""Site features from a drawing or a table: the drawing's frame and joining them to the plan.

A site drawing or survey table has its own origin and its own "up". The site frame
is x east, y north, metres: :class:`SiteFrame` names the drawing point that becomes
the site's origin and the direction of true north in the drawing, as a bearing
clockwise from the drawing's +y axis (a plan seen from above, so a pure rotation).
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence
from dataclasses import dataclass, replace
from typing import Literal

import numpy as np

from core.errors import InputError
from core.model.plan import SITE_FEATURE_KINDS, Project, Site, SiteFeature, SiteFeatureKind
from core.notices import Notice

Pt = tuple[float, float]
Joining = Literal["add", "replace"]

KIND_WORDS: dict[str, str] = {
    "quay": "quay line",
    "dolphin": "dolphin",
    "vessel": "other vessel",
    "limit": "limit (basin, fairway edge)",
}

#: Words in a layer's name that suggest its kind (lower case, any part of the name).
_HINTS: tuple[tuple[str, SiteFeatureKind], ...] = (
    ("dolphin", "dolphin"),
    ("quay", "quay"),
    ("wharf", "quay"),
    ("berth", "quay"),
    ("pier", "quay"),
    ("jetty", "quay"),
    ("vessel", "vessel"),
    ("ship", "vessel"),
    ("moored", "vessel"),
    ("limit", "limit"),
    ("basin", "limit"),
    ("fairway", "limit"),
    ("channel", "limit"),
    ("dredg", "limit"),
)


def guess_kind(layer: str) -> SiteFeatureKind | None:
    """The feature kind a layer's name suggests, or None (left out unless chosen)."""
    name = layer.lower()
    return next((kind for word, kind in _HINTS if word in name), None)


@dataclass(frozen=True, slots=True)
class SiteFrame:
    """Where the site frame sits in a drawing.

    ``origin``: the drawing point (drawing units) that becomes the site's (0, 0).
    ``north_deg``: the direction of true north in the drawing, degrees clockwise from
    the drawing's +y axis (0 when the drawing is drawn north up).
    """

    origin: Pt = (0.0, 0.0)
    north_deg: float = 0.0

    def __post_init__(self) -> None:
        x, y = (float(v) for v in self.origin)
        if not (math.isfinite(x) and math.isfinite(y)):
            raise InputError("site origin", self.origin, "must be finite")
        if not math.isfinite(self.north_deg):
            raise InputError("north", self.north_deg, "must be finite")
        object.__setattr__(self, "origin", (x, y))

    def to_site(self, points: Sequence[Pt], metres_per_unit: float) -> tuple[Pt, ...]:
        """Drawing points -> site frame (x east, y north, m).

        A drawing direction at bearing b (clockwise from the drawing's +y) is the true
        bearing b - north_deg, so drawing vectors turn counter-clockwise by north_deg.
        """
        a = math.radians(self.north_deg)
        c, s = math.cos(a), math.sin(a)
        p = (np.asarray(points, dtype=float) - np.asarray(self.origin)) * metres_per_unit
        x = c * p[:, 0] - s * p[:, 1]
        y = s * p[:, 0] + c * p[:, 1]
        return tuple((float(u) + 0.0, float(v) + 0.0) for u, v in zip(x, y, strict=True))


@dataclass(frozen=True, slots=True)
class ImportedSite:
    """Site features read from a drawing or a table, in the site frame, with notices."""

    source: str
    features: tuple[SiteFeature, ...]
    notices: tuple[Notice, ...] = ()

    def counts(self) -> dict[str, int]:
        """Features by kind, in the order of the kinds."""
        out = {k: sum(1 for f in self.features if f.kind == k) for k in SITE_FEATURE_KINDS}
        return {k: n for k, n in out.items() if n}

    def words(self) -> str:
        """'3 quay lines, 4 dolphins' for a dialog or the command line."""
        parts = [
            f"{n} {KIND_WORDS[k].split(' (')[0]}{'s' if n != 1 else ''}"
            for k, n in self.counts().items()
        ]
        return ", ".join(parts) or "nothing"


def unique_names(features: Iterable[SiteFeature], taken: Iterable[str]) -> tuple[SiteFeature, ...]:
    """The features renamed where their name is taken (``Quay 1`` -> ``Quay 1 (2)``)."""
    used = set(taken)
    out: list[SiteFeature] = []
    for f in features:
        name, n = f.name, 2
        while name in used:
            name = f"{f.name} ({n})"
            n += 1
        used.add(name)
        out.append(f if name == f.name else replace(f, name=name))
    return tuple(out)


def with_site(project: Project, imported: ImportedSite, joining: Joining = "add") -> Project:
    """The project with the imported features added to its site, or replacing them."""
    if joining not in ("add", "replace"):
        raise InputError("site joining", joining, "must be 'add' or 'replace'")
    kept = project.site.features if joining == "add" else ()
    new = unique_names(imported.features, (f.name for f in kept))
    site = Site(project.site.name, (*kept, *new))
    return replace(project, site=site)
