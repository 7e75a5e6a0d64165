"""Small invented plans built in code for the stage, site, clearance and check tests."""

from __future__ import annotations

import math
from dataclasses import replace

from core.model.hull import Fitting, Hull
from core.model.outlines import box_outline
from core.model.plan import BodyPose, GroupMember, LashedGroup, Project, Stage
from core.model.tugs import Placement, Tug

TF = 9806.65  # N per tonne-force (NIST SP 811, from memory; see REFERENCES.md)


def box_hull(name: str, length: float, beam: float, **kw: object) -> Hull:
    """A box barge from x = 0 to ``length``, with line points at the bow and stern centre
    and at the four corners, and push points at mid-length on either side."""
    h = beam / 2
    fittings = (
        Fitting("bow", "line", length, 0.0),
        Fitting("stern", "line", 0.0, 0.0),
        Fitting("port bow", "line", length, h),
        Fitting("stbd bow", "line", length, -h),
        Fitting("port quarter", "line", 0.0, h),
        Fitting("stbd quarter", "line", 0.0, -h),
        Fitting("port pad", "push", length / 2, h),
        Fitting("stbd pad", "push", length / 2, -h),
    )
    return Hull(name, box_outline(length, beam), fittings=fittings, **kw)  # type: ignore[arg-type]


def line(
    tug: str, hull: str, point: str, setting: float, bearing_deg: float, length: float = 30.0
) -> Placement:
    """A towline placement with its lead as a relative bearing (deg clockwise from ahead)."""
    return Placement(tug, hull, point, setting, -math.radians(bearing_deg), length)


def two_tug_plan() -> Project:
    """One 80 m x 20 m barge, two tugs of 50 t and 40 t, three stages."""
    hull = box_hull("Barge", 80.0, 20.0, displacement_kg=4.0e6, draught_m=3.0, freeboard_m=2.5)
    tugs = (Tug("Gannet", 50 * TF, 45 * TF, "ASD"), Tug("Puffin", 40 * TF, 35 * TF, "ASD"))
    s1 = Stage(
        "Walk off",
        "unberth",
        poses=(BodyPose("Barge", 0.0, 0.0, 90.0),),
        placements=(
            line("Gannet", "Barge", "port bow", 0.8, 270),
            line("Puffin", "Barge", "port quarter", 0.5, 270),
        ),
    )
    s2 = Stage(
        "Swing",
        "swing",
        poses=(BodyPose("Barge", 0.0, 40.0, 90.0),),
        placements=(
            line("Gannet", "Barge", "bow", 0.3, 270),
            line("Puffin", "Barge", "stern", 0.3, 90),
        ),
    )
    s3 = Stage(
        "Transit",
        "transit",
        poses=(BodyPose("Barge", 0.0, 40.0, 0.0),),
        placements=(line("Gannet", "Barge", "bow", 0.4, 0),),
    )
    return Project(name="Test plan", hulls=(hull,), tugs=tugs, stages=(s1, s2, s3))


def twin_group_project() -> Project:
    """Two box barges lashed side by side: A (60 x 18 m) and B (50 x 14 m) to starboard of A,
    turned end for end (heading 180 deg in the group frame)."""
    a = box_hull("A", 60.0, 18.0, displacement_kg=3.0e6, cog=(28.0, 0.5))
    b = box_hull("B", 50.0, 14.0, displacement_kg=1.5e6, cog=(24.0, 0.0))
    group = LashedGroup("Pair", (GroupMember("A"), GroupMember("B", 55.0, -16.0, math.pi)))
    return Project(name="Twin", hulls=(a, b), groups=(group,), tugs=(Tug("Gannet", 50 * TF),))


def twin_swing_in_wind(knots: float) -> Project:
    """The bundled twin_barge_move with its stage 2 (a swing of the lashed Lark pair) in a
    wind of ``knots`` at 10 m, from the stage's own direction."""
    from core.io.projectfile import load
    from tests.conftest import SAMPLES

    p = load(SAMPLES / "twin_barge_move.towboard")
    s = p.stages[1]
    return p.with_stage(
        replace(s, conditions=replace(s.conditions, wind_speed_ms=knots * 1852 / 3600)), 1
    )
