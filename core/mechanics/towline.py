"""A tug's towline: its tension against its strength, its length, and girting.

The line's tension is its horizontal pull divided by the cosine of its angle off the
horizontal (core.mechanics.fittings.line_tension_n: a 3-4-5 line carries 1.25 times its
horizontal pull). It is warned about above the tug's chosen share of the towline's
minimum breaking load (core.model.tugs: 0.5 by default, common practice).
"""

from __future__ import annotations

from core.model.tugs import Tug
from core.notices import Notice
from core.units import DisplayUnits

#: A conventional tug on a line is warned about girting when the line leads more than
#: this far off its fore-and-aft line (either way, so within 90 - this of the beam) while
#: the tow has way on (common practice, no source: the risk grows towards the beam).
GIRTING_WARN_DEG = 60.0


def _percents_against(share: float, limit: float) -> tuple[str, str]:
    """A share and the share it is held against, as whole percents, with up to three
    decimals where whole percents would read them alike (40.3 % over 40 %: "40.3", "40.0")."""
    for digits in range(4):
        a, b = f"{share * 100:.{digits}f}", f"{limit * 100:.{digits}f}"
        if a != b:
            break
    return a, b


def towline_notices(
    tug: Tug, tension_n: float, line_length_m: float | None, units: DisplayUnits
) -> tuple[Notice, ...]:
    """Warnings about one tug's towline: tension above its warning share of the MBL, a
    line longer than the tug carries."""
    out = []
    warn, mbl = tug.towline_warn_tension_n, tug.towline_mbl_n
    if warn is not None and mbl is not None and tension_n > warn * (1 + 1e-9):
        share, above = _percents_against(tension_n / mbl, tug.towline_warn_fraction)
        out.append(
            Notice(
                "towline_tension",
                tug.name,
                f"{tug.name}: towline tension {units.show(tension_n, 'force')} is "
                f"{share} % of its MBL {units.show(mbl, 'force')} "
                f"(warned above {above} %, common practice)",
            )
        )
    carried = tug.towline_length_m
    if carried is not None and line_length_m is not None and line_length_m > carried * (1 + 1e-9):
        out.append(
            Notice(
                "towline_short",
                tug.name,
                "{}: the line is drawn {} long but the tug carries {}".format(
                    tug.name, *units.show_against(line_length_m, carried, "length")
                ),
            )
        )
    return tuple(out)


def girting_notice(tug: Tug, line_off_fore_and_aft_deg: float, headway: bool) -> Notice | None:
    """A girting warning for a conventional tug pulling on a line near its beam while the
    tow has way on (``line_off_fore_and_aft_deg``: the line's angle off the tug's
    fore-and-aft line, 0 to 180; common practice, no source)."""
    if not tug.kind.startswith("conventional") or not headway:
        return None
    off = abs(line_off_fore_and_aft_deg) % 360.0
    off = min(off, 360.0 - off)
    if off <= GIRTING_WARN_DEG or off >= 180.0 - GIRTING_WARN_DEG:
        return None
    return Notice(
        "girting",
        tug.name,
        f"{tug.name}: a conventional tug with its line {off:.0f} deg off its fore-and-aft "
        "line while the tow has way on is at risk of girting (common practice)",
    )
