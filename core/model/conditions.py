"""Wind and current for a stage: the values the planner gives.

Wind is given as the true bearing it blows *from*; current as the true bearing it
sets *towards* (both common practice). Speeds are m/s in the core. The loads these
put on a body are worked out in :mod:`core.mechanics.loads`.

The wind speed is the mean speed at ``wind_height_m``; it is brought to 10 m by the
power law U(z) = U10 (z / 10)^a (a = 0.12 over open sea, DNV-RP-C205, from memory;
1/7 is common practice over land) and multiplied by the gust factor for the load.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from core.errors import InputError
from core.model import rules

#: Under-keel clearance below which a stage is warned about, m (common practice, no
#: source: port rules state their own, often as a share of the draught; set yours).
UKC_MARGIN_M = 0.5

#: Hughes' centre of pressure head-on, as a share of the length from the leading end
#: (Trans. INA 1930, from memory; see core.mechanics.loads).
HUGHES_HEAD_ON = 0.291

#: Each field's rule (core.model.rules), with the label it is shown under.
_RULES: dict[str, rules.Range] = {
    "wind_speed_ms": rules.WIND_SPEED,
    "wind_height_m": rules.WIND_HEIGHT,
    "wind_from_deg": rules.DIRECTION.named("wind direction (from)"),
    "gust_factor": rules.GUST_FACTOR,
    "current_speed_ms": rules.CURRENT_SPEED,
    "current_towards_deg": rules.DIRECTION.named("current direction (towards)"),
    "air_density": rules.AIR_DENSITY,
    "water_density": rules.WATER_DENSITY,
    "wind_exponent": rules.WIND_EXPONENT,
    "wind_coeff_head": rules.COEFFICIENT.named("wind coefficient head-on"),
    "wind_coeff_beam": rules.COEFFICIENT.named("wind coefficient beam-on"),
    "current_coeff_head": rules.COEFFICIENT.named("current coefficient head-on"),
    "current_coeff_beam": rules.COEFFICIENT.named("current coefficient beam-on"),
    "wind_area_head_m2": rules.AREA.named("wind area head-on"),
    "wind_area_beam_m2": rules.AREA.named("wind area beam-on"),
    "current_area_head_m2": rules.AREA.named("current area head-on"),
    "current_area_beam_m2": rules.AREA.named("current area beam-on"),
    "sea_state": rules.SEA_STATE,
    "wind_centre_head_on": rules.CENTRE_HEAD_ON.named("wind centre of pressure head-on"),
    "current_centre_head_on": rules.CENTRE_HEAD_ON.named("current centre of pressure head-on"),
    "water_depth_m": rules.WATER_DEPTH,
    "ukc_margin_m": rules.UKC_MARGIN,
}
#: Fields that may be None (worked out from the body instead).
OPTIONAL = frozenset(
    {
        "current_coeff_beam",
        "wind_area_head_m2",
        "wind_area_beam_m2",
        "current_area_head_m2",
        "current_area_beam_m2",
        "wind_centre_m",
        "current_centre_m",
        "water_depth_m",
    }
)


def rule(name: str) -> rules.Range:
    """The rule of the conditions field ``name`` (for the window and the file)."""
    return _RULES[name]


@dataclass(frozen=True, slots=True)
class Conditions:
    """Wind and current for one stage, with the coefficients used for their loads.

    Parameters
    ----------
    wind_speed_ms, wind_height_m:
        Mean wind speed, m/s, measured at ``wind_height_m`` above the water.
    wind_from_deg:
        True bearing the wind blows from.
    gust_factor:
        Ratio of the gust speed to the mean speed used for the load (1 = mean wind).
    wind_exponent:
        Power-law exponent for the height correction (0.12 open sea, DNV-RP-C205, from
        memory; 1/7 common practice).
    current_speed_ms, current_towards_deg:
        Current speed, m/s, and the true bearing it sets towards.
    air_density, water_density:
        kg/m^3. Defaults: 1.225 (ISO 2533 standard atmosphere at 15 C, from memory) and
        1025 (seawater, common practice; ITTC gives 1026.02 at 15 C).
    wind_coeff_head, wind_coeff_beam:
        Wind drag coefficients on the head-on and side areas. Defaults 0.8 and 1.2, in
        the box-barge ranges 0.6-1.0 and 1.0-1.3 (common practice).
    current_coeff_head:
        Current drag coefficient on the head-on underwater area; default 0.6 (a blunt
        box end, common practice, no source).
    current_coeff_beam:
        Current drag coefficient on the side underwater area; None takes Hoerner's
        2-D cross-flow value for the body's B / (2T).
    wind_area_*_m2, current_area_*_m2:
        Projected areas, m^2; None derives them from the outline and the freeboard
        (wind) or the draught (current).
    wind_centre_m, current_centre_m:
        A user-set centre of pressure (x, y) in the body frame, m; None uses the centre
        of each projection (moving with the angle, see ``pressure_centre``).
    pressure_centre:
        ``"moving"`` (default): the lateral load's centre of pressure moves from the
        centre of the side projection beam-on towards the leading end as the flow turns
        head-on (Hughes, from memory; core.mechanics.loads), which turns a body lying
        oblique to the flow; ``"fixed"``: it stays at the centre of the side projection.
    wind_centre_head_on, current_centre_head_on:
        Where that centre lies head-on, as a share of the length from the leading end;
        default 0.291 (Hughes, Trans. INA 1930, from memory); 0.5 means no travel.
    water_depth_m:
        Depth of water where the body lies in this stage, m; None is deep water. It
        raises the sideways current load (UFC 4-159-03's depth factor,
        core.mechanics.depth) and gives the under-keel clearance.
    ukc_margin_m:
        Under-keel clearance below which the stage is warned about, m (default
        :data:`UKC_MARGIN_M`, common practice, no source).
    sea_state:
        Sea state code 0-9 (Douglas), used to look up the tugs' efficiency.
    """

    wind_speed_ms: float = 0.0
    wind_height_m: float = 10.0
    wind_from_deg: float = 0.0
    gust_factor: float = 1.0
    current_speed_ms: float = 0.0
    current_towards_deg: float = 0.0
    air_density: float = 1.225
    water_density: float = 1025.0
    wind_exponent: float = 0.12
    wind_coeff_head: float = 0.8
    wind_coeff_beam: float = 1.2
    current_coeff_head: float = 0.6
    current_coeff_beam: float | None = None
    wind_area_head_m2: float | None = None
    wind_area_beam_m2: float | None = None
    current_area_head_m2: float | None = None
    current_area_beam_m2: float | None = None
    wind_centre_m: tuple[float, float] | None = field(default=None)
    current_centre_m: tuple[float, float] | None = field(default=None)
    sea_state: float = 0.0
    pressure_centre: str = "moving"
    wind_centre_head_on: float = HUGHES_HEAD_ON
    current_centre_head_on: float = HUGHES_HEAD_ON
    water_depth_m: float | None = None
    ukc_margin_m: float = UKC_MARGIN_M

    def __post_init__(self) -> None:
        rules.PRESSURE_CENTRE.check(self.pressure_centre, "conditions")
        for name, r in _RULES.items():
            value = getattr(self, name)
            if value is None and name in OPTIONAL:
                continue
            r.check(value, "conditions")
        for name in ("wind_centre_m", "current_centre_m"):
            v = getattr(self, name)
            if v is not None:
                if not (isinstance(v, tuple | list) and len(v) == 2):
                    raise InputError(f"conditions: {name}", v, "must be a point (x, y)")
                where = f"conditions: {name}"
                xy = (rules.COORDINATE.check(v[0], where), rules.COORDINATE.check(v[1], where))
                object.__setattr__(self, name, xy)

    @property
    def wind_speed_10m_ms(self) -> float:
        """Mean wind speed at 10 m by the power law, m/s."""
        return wind_at_10m(self.wind_speed_ms, self.wind_height_m, self.wind_exponent)

    @property
    def design_wind_ms(self) -> float:
        """The wind speed the load is computed with: 10 m mean times the gust factor."""
        return self.wind_speed_10m_ms * self.gust_factor


def wind_at_height(u10_ms: float, height_m: float, exponent: float) -> float:
    """Power law U(z) = U10 (z / 10)^a, m/s."""
    rules.WIND_HEIGHT.check(height_m)
    return u10_ms * (height_m / 10.0) ** exponent


def wind_at_10m(speed_ms: float, height_m: float, exponent: float) -> float:
    """A wind speed measured at ``height_m`` brought to 10 m by the power law, m/s."""
    rules.WIND_HEIGHT.check(height_m)
    return speed_ms / (height_m / 10.0) ** exponent
