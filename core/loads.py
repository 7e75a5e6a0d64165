"""The conditions of a stage applied to a body: loads in the body frame, and the balance with them.

The body's true heading comes from its pose in the stage. The board, the report and
the briefing all take the stage's loads from here, so they show the same numbers.
"""

from __future__ import annotations

from dataclasses import replace

import numpy as np

from core.balance import Balance, Load, analyse_layout, tug_layout
from core.bodies import Body, stage_body
from core.conditions import ConditionLoads, condition_loads
from core.notices import Notice
from core.plan import Project, Stage
from core.usable import fitting_suits


def body_conditions(stage: Stage, body: Body, *, strict: bool = False) -> ConditionLoads:
    """The stage's wind and current as loads on ``body`` at its pose's heading."""
    heading = stage.pose_of(body.name).heading_deg
    return condition_loads(body, stage.conditions, heading, strict=strict)


def loads_wrench(loads: tuple[Load, ...], centroid: tuple[float, float]) -> np.ndarray:
    """(3,): force ahead, force to port and moment about ``centroid`` of the loads."""
    out = np.zeros(3)
    for ld in loads:
        fx, fy = ld.force
        dx, dy = ld.point[0] - centroid[0], ld.point[1] - centroid[1]
        out += (fx, fy, dx * fy - dy * fx + ld.moment_nm)
    return out


def analyse_stage(project: Project, stage: Stage, body: str | None = None) -> Balance:
    """The balance of a body with its tugs *and* the stage's wind and current.

    Missing areas do not stop it: the load is left out and a notice says so.
    """
    b = stage_body(project, stage, body)
    cond = body_conditions(stage, b)
    bal = analyse_layout(stage, b, tug_layout(project, stage, b), project.units, cond.loads)
    extra = cond.notices + fitting_notices(project, stage, b)
    return replace(bal, notices=bal.notices + extra) if extra else bal


def fitting_notices(project: Project, stage: Stage, body: Body) -> tuple[Notice, ...]:
    """A tug made fast at a fitting whose SWL is below the tug's bollard pull (IMO rule)."""
    out = []
    members = {m.hull.name for m in body.members}
    for p in stage.placements:
        if p.hull not in members:
            continue
        fitting = body.fitting(p.hull, p.point)[1]
        tug = project.tug(p.tug)
        if fitting.kind != "line" or fitting.swl_n is None:
            continue
        if not fitting_suits(fitting.swl_n, tug.bollard_pull_n):
            u = project.units
            out.append(
                Notice(
                    "fitting_under_rated",
                    p.tug,
                    f"{p.tug}: bollard pull {u.show(tug.bollard_pull_n, 'force')} is above "
                    f"the SWL {u.show(fitting.swl_n, 'force')} of {p.point}; the fitting is "
                    "not rated for this tug",
                )
            )
    return tuple(out)
