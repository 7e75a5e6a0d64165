"""A stage's planned wind against its go / no-go wind limit, in the limit's own measure.

The limit is a **mean wind speed at 10 m**: marine operations commonly state their
weather limits so, and forecasts give the wind so (common practice, no source). The
planned wind is brought to 10 m by the stage's height law (core.model.conditions) and
compared mean with mean; above the limit the stage is no-go. The gusts the load is
worked with (the 10 m mean times the gust factor) are compared too: above the limit
while the mean is not, they make a caution.
"""

from __future__ import annotations

from dataclasses import dataclass

from core.model.conditions import wind_at_height
from core.model.plan import Stage

#: What the stage's wind limit is measured in, and its name on every view.
WIND_LIMIT_MEASURE = "mean at 10 m"
WIND_LIMIT_LABEL = f"Max wind ({WIND_LIMIT_MEASURE})"

#: A planned speed this much over the limit (relative) is over it: the rounding of a value
#: typed in knots and read back in m/s is not.
_OVER = 1e-9


@dataclass(frozen=True, slots=True)
class WindAgainstLimit:
    """The stage's wind limit and the planned wind in its measure, m/s."""

    limit_ms: float  # mean at 10 m
    mean_10m_ms: float  # the planned mean wind brought to 10 m
    gust_10m_ms: float  # the planned mean at 10 m times the gust factor (the load's wind)
    limit_as_given_ms: float  # the limit at the height the stage's wind is given at

    @property
    def over(self) -> bool:
        """The planned mean wind at 10 m is above the limit (no-go)."""
        return self.mean_10m_ms > self.limit_ms * (1 + _OVER)

    @property
    def gusts_over(self) -> bool:
        """The mean is within the limit but the gusts the load is worked with are not."""
        return not self.over and self.gust_10m_ms > self.limit_ms * (1 + _OVER)


def wind_limit_as_given(stage: Stage) -> float | None:
    """The stage's wind limit in the measure its wind is given in (the mean at its
    stated height), for a plot drawn in that measure, m/s; None without a limit."""
    w = wind_against_limit(stage)
    return None if w is None else w.limit_as_given_ms


def wind_against_limit(stage: Stage) -> WindAgainstLimit | None:
    """The stage's planned wind against its wind limit; None without a limit."""
    limit = stage.limits.max_wind_ms
    if limit is None:
        return None
    c = stage.conditions
    return WindAgainstLimit(
        limit_ms=limit,
        mean_10m_ms=c.wind_speed_10m_ms,
        gust_10m_ms=c.design_wind_ms,
        limit_as_given_ms=wind_at_height(limit, c.wind_height_m, c.wind_exponent),
    )
