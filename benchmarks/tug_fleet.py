"""An invented plan with many tugs for the solve and hold limits benchmarks.

A 120 m x 32 m box barge (freeboard 6 m, draught 4 m) carrying a tall module
(wind areas 3600 m^2 beam-on, 1000 m^2 head-on) with ``n`` tugs spread round the hull: every other one on a line point with its line leading out from the hull,
the others on push points. Fictional tugs and barge.
"""

from __future__ import annotations

import math

from core.model.conditions import Conditions
from core.model.hull import Fitting, Hull
from core.model.outlines import box_outline
from core.model.plan import BodyPose, Project, Stage
from core.model.tugs import Placement, Tug

TF = 9806.65
KNOT = 1852.0 / 3600.0


def fleet_project(
    n: int = 12, wind_kn: float = 20.0, current_kn: float = 0.8, sectors: bool = False
) -> Project:
    """``sectors``: ASD tugs with working sectors: each line 90 degrees about its lead,
    every other push +-60 degrees, the rest made fast (push-pull) all round."""
    length, beam = 120.0, 32.0
    outline = box_outline(length, beam)
    hull0 = Hull("Brannock 7", outline, draught_m=4.0, freeboard_m=6.0)
    geo = hull0.geometry
    fittings, tugs, placements = [], [], []
    for i in range(n):
        s = (i + 0.5) / n * geo.perimeter
        bp = geo.point_at(s)
        push = i % 2 == 1
        name = f"{'pad' if push else 'bitt'} {i + 1}"
        fittings.append(Fitting(name, "push" if push else "line", bp.x, bp.y))
        tug = f"Tug {i + 1:02d}"
        tugs.append(
            Tug(
                tug,
                (20 + 20 * ((i * 7) % 5) / 4) * TF,
                tug_type="ASD" if sectors else "",
                towing_point_height_m=4.0,
            )
        )
        out = math.atan2(bp.normal[1], bp.normal[0])
        lead = 0.0 if push else out + math.radians(25.0 * (-1) ** (i // 2))
        sector, made_fast = None, False
        if sectors and not push:
            sector = (lead - math.radians(45.0), lead + math.radians(45.0))
        elif sectors and i % 4 == 1:
            sector = (-math.radians(60.0), math.radians(60.0))
        elif sectors:
            sector, made_fast = (-math.pi, math.pi), True
        placements.append(
            Placement(tug, "Brannock 7", name, 0.5, lead, 60.0, False, sector, made_fast)
        )
    hull = Hull("Brannock 7", outline, draught_m=4.0, freeboard_m=6.0, fittings=tuple(fittings))
    stage = Stage(
        "Hold off the berth",
        "berth",
        poses=(BodyPose("Brannock 7", 0.0, 0.0, 30.0),),
        placements=tuple(placements),
        conditions=Conditions(
            wind_speed_ms=wind_kn * KNOT,
            wind_from_deg=250.0,
            current_speed_ms=current_kn * KNOT,
            current_towards_deg=100.0,
            wind_area_beam_m2=3600.0,
            wind_area_head_m2=1000.0,
        ),
    )
    return Project(name="Fleet benchmark", hulls=(hull,), tugs=tuple(tugs), stages=(stage,))
