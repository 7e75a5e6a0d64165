"""Water depth: the shallow-water factor on the current's sideways load, and the
under-keel clearance.

Near the bottom the water that would pass under the keel is blocked and the sideways
current load on a deep-draught body grows several times. UFC 4-159-03 (2005), Mooring
Design, section 4-5 (read) gives the transverse current drag coefficient of a moored
ship or barge against the draught over the depth T/d:

    C_yc = C0 + (C1 - C0) (T/d)^K,   C0 = 0.22 chi,   chi = L^2 A_m / (B V),
    C1 = 3.2,   K = 2,

C0 the deep-water value and C1 the value with the keel on the bottom. Towboard keeps
its own beam-on coefficient (the user's, or Hoerner's cross-flow value) for deep water
and multiplies it by C_yc / C0, the growth the source gives from deep water to the
stage's depth; a factor below 1 (chi above 14.5, C0 above C1: a body far more slender
than the source's ships) is taken as 1, so depth never lowers a load (our choice,
conservative).

The bodies are taken wall-sided (vertical sides, flat bottom): the midship section is
A_m = B T and the displaced volume V = A_wp T with A_wp the plan area, so
chi = L^2 / A_wp (L / B for a box).

The head-on (longitudinal) coefficient is left as it is: the source's depth factor is
for the transverse coefficient; water meeting a body end-on flows round its sides as
well as under it, so the bottom blocks far less of it (set a larger head-on coefficient
by hand for a body nearly aground end-on).

The under-keel clearance is the depth less the deepest draught; below the stage's
margin it is a caution, at or below nothing the body is aground (a no-go).
"""

from __future__ import annotations

from dataclasses import dataclass

from core.mechanics.bodies import Body
from core.model.conditions import Conditions
from core.notices import Notice
from core.units import DisplayUnits

#: UFC 4-159-03 (2005) section 4-5 (read): C0 = 0.22 chi, the value on the bottom C1 and
#: the exponent K of T/d.
C0_PER_CHI = 0.22
C1_ON_BOTTOM = 3.2
K_DEPTH = 2.0


def body_draught(body: Body) -> float | None:
    """The deepest draught of the body's hulls, m (None when none is given)."""
    draughts = [m.hull.draught_m for m in body.members if m.hull.draught_m is not None]
    return max(draughts) if draughts else None


def chi_of(body: Body) -> float:
    """chi = L^2 A_m / (B V) of a wall-sided body: L^2 / A_wp (plan area A_wp)."""
    return body.length**2 / float(body.polygon.area)


def ufc_transverse_coefficient(chi: float, draught_over_depth: float) -> float:
    """UFC 4-159-03's C_yc = C0 + (C1 - C0) (T/d)^K, T/d held within [0, 1]."""
    ratio = min(max(draught_over_depth, 0.0), 1.0)
    c0 = C0_PER_CHI * chi
    return c0 + (C1_ON_BOTTOM - c0) * ratio**K_DEPTH


def depth_factor(body: Body, depth_m: float | None) -> float:
    """The sideways current load's growth from deep water to ``depth_m``, at least 1
    (1 without a depth or a draught)."""
    draught = body_draught(body)
    if depth_m is None or draught is None:
        return 1.0
    chi = chi_of(body)
    deep = ufc_transverse_coefficient(chi, 0.0)
    return max(ufc_transverse_coefficient(chi, draught / depth_m) / deep, 1.0)


@dataclass(frozen=True, slots=True)
class DepthCheck:
    """A body's depth figures in one stage, m, and what they warn of."""

    depth_m: float
    draught_m: float | None
    margin_m: float
    factor: float  # the sideways current load's depth factor
    notices: tuple[Notice, ...] = ()

    @property
    def clearance_m(self) -> float | None:
        """Under-keel clearance: depth less the deepest draught, m (None without one)."""
        return None if self.draught_m is None else self.depth_m - self.draught_m

    @property
    def depth_over_draught(self) -> float | None:
        return None if not self.draught_m else self.depth_m / self.draught_m


def depth_check(body: Body, c: Conditions, units: DisplayUnits) -> DepthCheck | None:
    """The under-keel clearance of ``body`` and the current's depth factor (None when the
    stage gives no depth: deep water)."""
    if c.water_depth_m is None:
        return None
    depth, margin = c.water_depth_m, c.ukc_margin_m
    draught = body_draught(body)
    notices: list[Notice] = []
    if draught is None:
        notices.append(
            Notice(
                "ukc_unknown",
                body.name,
                f"{body.name}: the under-keel clearance cannot be checked: enter the draught "
                f"of {' and '.join(m.hull.name for m in body.members)}",
            )
        )
    elif depth <= draught:
        notices.append(
            Notice(
                "aground",
                body.name,
                f"{body.name}: water depth {units.show(depth, 'length')} is not more than its "
                f"draught {units.show(draught, 'length')}: it would be aground",
            )
        )
    elif depth - draught < margin:
        ukc, least = units.show_against(depth - draught, margin, "length")
        notices.append(
            Notice(
                "low_under_keel",
                body.name,
                f"{body.name}: under-keel clearance {ukc} is below the margin {least} (depth "
                f"{units.show(depth, 'length')}, draught {units.show(draught, 'length')})",
                "caution",
            )
        )
    return DepthCheck(depth, draught, margin, depth_factor(body, depth), tuple(notices))
