"""Output derating for altitude and coolant (ambient air) temperature."""

from __future__ import annotations

import bisect
from functools import lru_cache

from ..errors import DomainError

#: IEC 60034-1 rated site: altitude up to 1000 m, coolant up to 40 degC.
RATED_ALTITUDE_M = 1000.0
RATED_AMBIENT_DEGC = 40.0

_ALTITUDES = (1000.0, 1500.0, 2000.0, 2500.0, 3000.0, 3500.0, 4000.0)
_AMBIENTS = (30.0, 35.0, 40.0, 45.0, 50.0, 55.0, 60.0)
#: rows: altitude; columns: ambient. One motor maker's application table (common practice).
_FACTORS = (
    (1.06, 1.03, 1.00, 0.96, 0.92, 0.87, 0.82),
    (1.03, 1.00, 0.97, 0.93, 0.89, 0.84, 0.80),
    (1.00, 0.97, 0.94, 0.90, 0.86, 0.82, 0.77),
    (0.95, 0.93, 0.90, 0.86, 0.83, 0.78, 0.74),
    (0.91, 0.89, 0.86, 0.83, 0.79, 0.75, 0.71),
    (0.87, 0.84, 0.82, 0.79, 0.75, 0.71, 0.67),
    (0.82, 0.79, 0.77, 0.74, 0.71, 0.67, 0.63),
)
MAX_ALTITUDE_M = _ALTITUDES[-1]
MAX_AMBIENT_DEGC = _AMBIENTS[-1]


def _bracket(axis: tuple[float, ...], value: float) -> tuple[int, float]:
    i = min(max(bisect.bisect_right(axis, value) - 1, 0), len(axis) - 2)
    t = (value - axis[i]) / (axis[i + 1] - axis[i])
    return i, min(max(t, 0.0), 1.0)


@lru_cache(maxsize=1024)  # a fleet has few distinct site conditions
def site_derating(altitude_m: float, ambient_degc: float) -> float:
    """Output factor for a machine rated at 1000 m and 40 degC at another site [-].

    Bilinear interpolation in a maker's altitude x ambient table; below 1000 m the 1000 m row
    and below 30 degC the 30 degC column are used. Values above 1 (cool sites) are returned as
    the table gives them: the caller decides whether to credit them.

    Parameters
    ----------
    altitude_m : effective site altitude, relative to a 1000 m rating [m]
    ambient_degc : effective coolant temperature, relative to a 40 degC rating [degC]

    Raises
    ------
    DomainError : above 4000 m or 60 degC, where IEC 60034-1 leaves the rating to agreement.

    References
    ----------
    .. [1] IEC 60034-1 clause 6 / 8.10 (rated site 1000 m, 40 degC; outside: by agreement).
    .. [2] Factors: common practice, a motor maker's "reduction factors for ambient temperature
       and altitude" table (worked examples 50 degC at 2000 m -> 0.86; 55 degC at 3500 m -> 0.71).
    """
    if altitude_m > MAX_ALTITUDE_M + 1e-9:
        raise DomainError(f"altitude {altitude_m:.0f} m is above {MAX_ALTITUDE_M:.0f} m: a special "
                          "machine, rating by agreement with the manufacturer")
    if ambient_degc > MAX_AMBIENT_DEGC + 1e-9:
        raise DomainError(f"ambient {ambient_degc:.0f} degC is above {MAX_AMBIENT_DEGC:.0f} degC: "
                          "rating by agreement with the manufacturer")
    i, ti = _bracket(_ALTITUDES, altitude_m)
    j, tj = _bracket(_AMBIENTS, ambient_degc)
    low = _FACTORS[i][j] + (_FACTORS[i][j + 1] - _FACTORS[i][j]) * tj
    high = _FACTORS[i + 1][j] + (_FACTORS[i + 1][j + 1] - _FACTORS[i + 1][j]) * tj
    return low + (high - low) * ti
