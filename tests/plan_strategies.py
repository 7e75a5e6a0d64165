"""Hypothesis strategies for whole plans: a box barge, a few tugs, one to three stages.

The plans are invented and small, but they reach every verdict: missing freeboards with a
wind set, fittings rated below the pull, settings above what the goal needs, goals the
fleet cannot meet, stages with no goal, quays closer than the margin.
"""

from __future__ import annotations

import math

from hypothesis import strategies as st

from core.mechanics.site import quay
from core.model.conditions import Conditions
from core.model.goals import Goal
from core.model.hull import Fitting, Hull
from core.model.outlines import box_outline
from core.model.plan import BodyPose, Project, Site, Stage, StageLimits
from core.model.tugs import Placement, Tug

TF = 9806.65  # N per tonne-force (NIST SP 811; see shared REFERENCES.md)
KNOT = 1852 / 3600  # m/s (NIST SP 811)

#: (name, kind, x as a fraction of the length, y as a fraction of the half beam)
POINTS = (
    ("bow", "line", 1.0, 0.0),
    ("stern", "line", 0.0, 0.0),
    ("port bow", "line", 1.0, 1.0),
    ("stbd bow", "line", 1.0, -1.0),
    ("port quarter", "line", 0.0, 1.0),
    ("stbd quarter", "line", 0.0, -1.0),
    ("port pad", "push", 0.5, 1.0),
    ("stbd pad", "push", 0.5, -1.0),
)


@st.composite
def hulls(draw: st.DrawFn) -> Hull:
    length = draw(st.floats(30.0, 150.0))
    beam = draw(st.floats(8.0, 40.0))
    swl = draw(st.sampled_from([None, 20 * TF, 60 * TF, 200 * TF]))
    fittings = tuple(
        Fitting(n, k, fx * length, fy * beam / 2, swl_n=swl if k == "line" else None)
        for n, k, fx, fy in POINTS
    )
    freeboard = draw(st.one_of(st.none(), st.floats(0.5, 8.0)))
    draught = draw(st.one_of(st.none(), st.floats(0.5, 6.0)))
    return Hull(
        "Barge",
        box_outline(length, beam),
        fittings=fittings,
        freeboard_m=freeboard,
        draught_m=draught,
    )


@st.composite
def goals(draw: st.DrawFn) -> Goal | None:
    kind = draw(st.sampled_from([None, "hold", "walk", "swing", "transit", "force"]))
    f = draw(st.floats(-40 * TF, 40 * TF))
    m = draw(st.floats(-2000 * TF, 2000 * TF))
    return {
        None: None,
        "hold": Goal("hold"),
        "walk": Goal("walk", fy_n=f),
        "swing": Goal("swing", moment_nm=m),
        "transit": Goal("transit", fx_n=f),
        "force": Goal("force", f / 2, -f / 3, m / 2),
    }[kind]


@st.composite
def stages(draw: st.DrawFn, tugs: tuple[Tug, ...], n: int) -> Stage:
    chosen = draw(st.permutations([p[0] for p in POINTS]))
    placements = []
    for tug, point in zip(tugs, chosen, strict=False):
        kind = next(p[1] for p in POINTS if p[0] == point)
        setting = draw(st.floats(0.0, 1.0))
        if kind == "push":
            lead = math.radians(draw(st.floats(-60.0, 60.0)))
            placements.append(Placement(tug.name, "Barge", point, setting, lead))
        else:
            lead = math.radians(draw(st.floats(-180.0, 180.0)))
            length = draw(st.floats(8.0, 80.0))
            placements.append(Placement(tug.name, "Barge", point, setting, lead, length))
    conditions = Conditions(
        wind_speed_ms=draw(st.sampled_from([0.0, 10 * KNOT, 25 * KNOT])),
        wind_from_deg=draw(st.floats(0.0, 359.0)),
        current_speed_ms=draw(st.sampled_from([0.0, 0.5 * KNOT, 1.5 * KNOT])),
        current_towards_deg=draw(st.floats(0.0, 359.0)),
    )
    limit = draw(st.sampled_from([None, 15 * KNOT]))
    return Stage(
        f"Stage {n + 1}",
        draw(st.sampled_from(["unberth", "hold", "swing", "transit", "berth", "other"])),
        poses=(BodyPose("Barge", 0.0, draw(st.floats(-80.0, 0.0)), draw(st.floats(0.0, 359.0))),),
        placements=tuple(placements),
        conditions=conditions,
        goal=draw(goals()),
        limits=StageLimits(max_wind_ms=limit),
    )


@st.composite
def plans(draw: st.DrawFn, max_stages: int = 3) -> Project:
    hull = draw(hulls())
    n_tugs = draw(st.integers(0, 4))
    tugs = tuple(
        Tug(f"Tug {k + 1}", draw(st.floats(15.0, 80.0)) * TF, towing_point_height_m=4.0)
        for k in range(n_tugs)
    )
    n_stages = draw(st.integers(1, max_stages))
    site = Site("Test basin", (quay("Quay", (-200.0, 60.0), (300.0, 60.0)),))
    return Project(
        name="Generated plan",
        hulls=(hull,),
        tugs=tugs,
        site=site,
        stages=tuple(draw(stages(tugs, k)) for k in range(n_stages)),
    )
