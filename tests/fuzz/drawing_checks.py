"""What every drawing or table to import, however hostile, must get from Towboard: a
refusal from the project's own error family (TowboardError, one line), or an import with
finite numbers that makes a plan (or joins a plan's site) which reports, saves and loads
back (tests/fuzz/checks.py ``carried_through``).

The whole road is driven as the window and ``towboard import-outline`` drive it: open,
the layers' summaries, the likely layer, the outline, a new plan; and the site from the
drawing's layers (each taking the kind its name suggests, or a kind in turn) joined to a
small plan.
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import replace
from pathlib import Path
from typing import Literal

from core.errors import TowboardError
from core.io.dxf_geometry import Drawing
from core.io.dxf_outline import import_outline, layer_summaries, likely_layer
from core.io.dxf_site import import_site
from core.io.offsets import import_offsets
from core.io.outline_import import ImportedOutline, new_plan
from core.io.paths import read_table
from core.io.projectfile import load
from core.io.site_import import ImportedSite, guess_kind, with_site
from core.io.site_points import import_site_points
from core.model.plan import SITE_FEATURE_KINDS, Project
from tests.fuzz.checks import NOT_FINITE, carried_through
from tests.fuzz.mutations import ROOT

Outcome = Literal["refused", "accepted"]
QUOTED = re.compile(r"'[^']*'|\"[^\"]*\"")


def refused(e: TowboardError) -> Outcome:
    message = str(e)
    assert message and "\n" not in message, f"not a one-line message: {message!r}"
    assert len(message) <= 500, f"a refusal of {len(message)} characters: {message[:200]!r}"
    return "refused"


@functools.cache
def site_plan() -> Project:
    """The pontoon sample cut to one stage with the pontoon posed and no tugs: a plan
    whose report is quick, with a body to measure clearances from."""
    p = load(ROOT / "sample_projects" / "pontoon_swing.towboard")
    stage = replace(p.stages[0], placements=(), goal=None, swing=None, kind="other")
    return replace(p, tugs=(), stages=(stage,))


def outline_is_finite(got: ImportedOutline) -> None:
    numbers = [got.area_m2, *got.centroid_m, got.length_m, got.beam_m, *got.reference_in_drawing]
    numbers += [c for p in got.outline for c in p]
    assert all(math.isfinite(x) for x in numbers), f"an imported outline with {numbers[:6]}"
    assert got.area_m2 > 0 and got.length_m > 0 and got.beam_m > 0
    for n in got.notices:
        found = NOT_FINITE.search(QUOTED.sub("", n.message))
        assert found is None, f"a notice prints {found.group()!r}: {n.message!r}"


def site_is_finite(got: ImportedSite) -> None:
    for f in got.features:
        assert all(math.isfinite(c) for p in f.points for c in p), f"{f.name}: {f.points[:3]}"
    for n in got.notices:
        assert NOT_FINITE.search(QUOTED.sub("", n.message)) is None, n.message


def plan_from_outline(got: ImportedOutline, tmp: Path) -> None:
    outline_is_finite(got)
    carried_through(new_plan(got, "Fuzz hull"), tmp)


def plan_with_site(got: ImportedSite, tmp: Path) -> None:
    site_is_finite(got)
    carried_through(with_site(site_plan(), got), tmp)


def drawing_outcome(data: bytes, tmp: Path) -> tuple[Outcome, Outcome]:
    """(the outline's outcome, the site's outcome) for a DXF file's bytes."""
    path = tmp / "fuzz.dxf"
    path.write_bytes(data)
    try:
        drawing = Drawing.open(path)
    except TowboardError as e:
        return refused(e), "refused"
    units = drawing.units or "m"
    try:
        summaries = layer_summaries(drawing, units)
        for s in summaries:
            assert NOT_FINITE.search(s.words()) is None, s.words()
            assert math.isfinite(s.largest_area_m2) and all(map(math.isfinite, s.largest_size_m))
        layer = likely_layer(summaries)
        if layer is None:
            layer = drawing.layers()[0] if drawing.layers() else "HULL"
        got = import_outline(drawing, layer, units)
    except TowboardError as e:
        outline = refused(e)
    else:
        plan_from_outline(got, tmp)
        outline = "accepted"
    kinds = {
        layer: guess_kind(layer) or SITE_FEATURE_KINDS[i % len(SITE_FEATURE_KINDS)]
        for i, layer in enumerate(drawing.layers())
    }
    try:
        site = import_site(drawing, kinds, units)
    except TowboardError as e:
        return outline, refused(e)
    plan_with_site(site, tmp)
    return outline, "accepted"


def table_outcome(what: str, data: bytes, tmp: Path) -> Outcome:
    """The outcome of a table of offsets (``what`` "offsets") or of site points."""
    path = tmp / f"fuzz-{what}.csv"
    path.write_bytes(data)
    try:
        text = read_table(path)
        if what == "offsets":
            got = import_offsets(text, path.name)
        else:
            site = import_site_points(text, path.name)
    except TowboardError as e:
        return refused(e)
    if what == "offsets":
        plan_from_outline(got, tmp)
    else:
        plan_with_site(site, tmp)
    return "accepted"
