"""The plan's particulars for the briefing: tugs, bodies, hulls and fittings with ratings.

Every figure is the plan's own, as entered, in the display units.
"""

from __future__ import annotations

from app.briefing.layout import Block, Column, Table, heading
from core.frames import angle_to_bearing
from core.mechanics.bodies import body_of
from core.model.hull import Fitting
from core.model.plan import Project
from core.model.tugs import BOLLARD_PULL_TITLE
from core.units import DisplayUnits, fmt


def _or_dash(v: str) -> str:
    return v.strip() or "-"


def tug_blocks(project: Project) -> list[Block]:
    """The tugs: particulars, then towlines and how to reach them."""
    u = project.units

    def length(v: float | None) -> str:
        return "-" if v is None else u.show(v, "length")

    out: list[Block] = [heading("Tugs", 1)]
    out.append(
        Table(
            [
                Column("Tug", 1.1),
                Column("Type", 1.5),
                Column(BOLLARD_PULL_TITLE, 0.9, "right"),
                Column("Astern pull", 0.9, "right"),
                Column("BP certificate", 1.0),
                Column("Towing point height", 1.0, "right"),
                Column("Role", 2.3),
            ],
            [
                [
                    t.name,
                    _or_dash(t.tug_type),
                    u.show(t.bollard_pull_n, "force"),
                    u.show(t.astern_pull, "force"),
                    _or_dash(t.certificate_date),
                    length(t.towing_point_height_m),
                    _or_dash(t.role),
                ]
                for t in project.tugs
            ],
        )
    )
    out.append(
        Table(
            [
                Column("Tug", 1.1),
                Column("Towline length", 1.1, "right"),
                Column("Towline MBL", 1.1, "right"),
                Column("Call sign", 1.2),
                Column("Working channel", 1.4),
            ],
            [
                [
                    t.name,
                    length(t.towline_length_m),
                    "-" if t.towline_mbl_n is None else u.show(t.towline_mbl_n, "force"),
                    _or_dash(t.call_sign),
                    _or_dash(t.working_channel),
                ]
                for t in project.tugs
            ],
        )
    )
    return out


def permitted_leads(f: Fitting) -> str:
    """The towline directions a fitting is rated for, as relative bearings clockwise."""
    if f.permitted_lead_rad is None:
        return "any"
    low, high = f.permitted_lead_rad
    # counter-clockwise from low to high is clockwise from high's bearing to low's
    return f"{angle_to_bearing(high):03.0f}° to {angle_to_bearing(low):03.0f}°"


def _rating(u: DisplayUnits, v: float | None) -> str:
    return "not given" if v is None else u.show(v, "force")


def particulars(project: Project) -> list[Block]:
    u = project.units
    out: list[Block] = tug_blocks(project)
    out.append(heading("Bodies, hulls and fittings", 1))
    rows = []
    for name in project.body_names():
        b = body_of(project, name)
        disp = [m.hull.displacement_kg for m in b.members]
        known = [d for d in disp if d is not None]
        total = "-" if len(known) < len(disp) else f"{sum(known) / 1000:,.0f} t".replace(",", " ")
        rows.append(
            [
                name,
                " + ".join(m.hull.name for m in b.members),
                u.show(b.length, "length"),
                u.show(b.beam, "length"),
                f"{fmt(u.value(b.centroid[0], 'length'))}, {fmt(u.value(b.centroid[1], 'length'))}",
                f"{fmt(u.value(b.centre_of_gravity[0], 'length'))}, "
                f"{fmt(u.value(b.centre_of_gravity[1], 'length'))}",
                total,
            ]
        )
    out.append(
        Table(
            [
                Column("Body", 1.4),
                Column("Made of", 1.8),
                Column("Length", 0.9, "right"),
                Column("Beam", 0.9, "right"),
                Column(f"Centroid x, y ({u.unit('length')})", 1.4, "right"),
                Column(f"CoG x, y ({u.unit('length')})", 1.4, "right"),
                Column("Displacement (mass)", 1.2, "right"),
            ],
            rows,
        )
    )
    out.append(
        Table(
            [
                Column("Hull", 1.4),
                Column("Length", 0.9, "right"),
                Column("Beam", 0.9, "right"),
                Column("Draught", 0.9, "right"),
                Column("Freeboard", 0.9, "right"),
                Column("Displacement (mass)", 1.2, "right"),
            ],
            [
                [
                    h.name,
                    u.show(h.geometry.length, "length"),
                    u.show(h.geometry.beam, "length"),
                    "-" if h.draught_m is None else u.show(h.draught_m, "length"),
                    "-" if h.freeboard_m is None else u.show(h.freeboard_m, "length"),
                    "-"
                    if h.displacement_kg is None
                    else f"{h.displacement_kg / 1000:,.0f} t".replace(",", " "),
                ]
                for h in project.hulls
            ],
        )
    )
    frows = [
        [
            h.name,
            f.name,
            "line point" if f.kind == "line" else "push point",
            f.fitting_type,
            f"{fmt(u.value(f.x, 'length'))}, {fmt(u.value(f.y, 'length'))}",
            _rating(u, f.swl_n),
            _rating(u, f.tow_n),
            permitted_leads(f) if f.kind == "line" else "-",
        ]
        for h in project.hulls
        for f in h.fittings
    ]
    out.append(heading("Fittings and their ratings", 2))
    out.append(
        Table(
            [
                Column("Hull", 1.0),
                Column("Fitting", 1.6),
                Column("Kind", 0.9),
                Column("Type", 1.0),
                Column(f"x, y ({u.unit('length')})", 1.0, "right"),
                Column("SWL", 0.8, "right"),
                Column("TOW", 0.8, "right"),
                Column("Line leads rated (rel.)", 1.3, "right"),
            ],
            frows,
        )
    )
    return out
