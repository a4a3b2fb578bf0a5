"""IEC 60034-30-1 efficiency classes (IE1-IE4) of line-operated induction motors."""

from __future__ import annotations

import bisect
import functools
import math

from ..errors import DomainError

CLASSES = ("IE1", "IE2", "IE3", "IE4")

# 50 Hz: eta_N [%] = A x^3 + B x^2 + C x + D, x = log10(P_N / 1 kW), rounded to 0.1 %.
# 0.75-200 kW coefficients per (class, poles). IE2-IE4: UK SI 2021/745 Sch. 16 Table 28
# (mirroring EU 2019/1781 Annex I); IE1: from memory, reproduces the IEC 60034-30 table.
_COEF_HIGH = {
    ("IE1", 2): (0.5234, -5.0499, 17.4180, 74.3171), ("IE1", 4): (0.5234, -5.0499, 17.4180, 74.3171),
    ("IE1", 6): (0.0786, -3.5838, 17.2918, 72.2320),
    ("IE2", 2): (0.2972, -3.3454, 13.0651, 79.077), ("IE2", 4): (0.0278, -1.9247, 10.4395, 80.9761),
    ("IE2", 6): (0.0148, -2.4978, 13.247, 77.5603), ("IE2", 8): (2.1311, -12.029, 26.719, 69.735),
    ("IE3", 2): (0.3569, -3.3076, 11.6108, 82.2503), ("IE3", 4): (0.0773, -1.8951, 9.2984, 83.7025),
    ("IE3", 6): (0.1252, -2.613, 11.9963, 80.4769), ("IE3", 8): (0.7189, -5.1678, 15.705, 77.074),
    ("IE4", 2): (0.34, -3.0479, 10.293, 84.8208), ("IE4", 4): (0.2412, -2.3608, 8.446, 86.8321),
    ("IE4", 6): (0.3598, -3.2107, 10.7933, 84.107), ("IE4", 8): (0.6556, -4.7229, 13.977, 80.247),
}
# 0.12-0.55 kW coefficients (same sources, Table 27).
_COEF_LOW = {
    ("IE2", 2): (22.4864, 27.7603, 37.8091, 82.458), ("IE2", 4): (17.2751, 23.978, 35.5822, 84.9935),
    ("IE2", 6): (-15.9218, -30.258, 16.6861, 79.1838), ("IE2", 8): (6.4855, 9.4748, 36.852, 70.762),
    ("IE3", 2): (6.8532, 6.2006, 25.1317, 84.0392), ("IE3", 4): (7.6356, 4.8236, 21.0903, 86.0998),
    ("IE3", 6): (-17.361, -44.538, -3.0554, 79.1318), ("IE3", 8): (-0.5896, -25.526, 4.2884, 75.831),
    ("IE4", 2): (-8.8538, -20.3352, 8.9002, 85.0641), ("IE4", 4): (8.432, 2.6888, 14.6236, 87.6153),
    ("IE4", 6): (-13.0355, -36.9497, -4.3621, 82.0009), ("IE4", 8): (-4.9735, -21.453, 2.6653, 79.055),
}

# 60 Hz nominal minimum efficiencies [%], keyed by rated kW. IE2 = EPAct enclosed levels
# (10 CFR 431.25(a)); IE3 = NEMA Premium enclosed levels (10 CFR 431.25 Table 1). IE1 and IE4
# 4-pole: from memory, low confidence.
_KW_60 = (0.75, 1.1, 1.5, 2.2, 3.7, 5.5, 7.5, 11, 15, 18.5, 22, 30, 37, 45, 55, 75, 90, 110, 150)
_TABLE_60 = {
    ("IE2", 2): (75.5, 82.5, 84.0, 85.5, 87.5, 88.5, 89.5, 90.2, 90.2, 91.0, 91.0, 91.7, 92.4,
                 93.0, 93.0, 93.6, 94.5, 94.5, 95.0),
    ("IE2", 4): (82.5, 84.0, 84.0, 87.5, 87.5, 89.5, 89.5, 91.0, 91.0, 92.4, 92.4, 93.0, 93.0,
                 93.6, 94.1, 94.5, 94.5, 95.0, 95.0),
    ("IE2", 6): (80.0, 85.5, 86.5, 87.5, 87.5, 89.5, 89.5, 90.2, 90.2, 91.7, 91.7, 93.0, 93.0,
                 93.6, 93.6, 94.1, 94.1, 95.0, 95.0),
    ("IE3", 2): (77.0, 84.0, 85.5, 86.5, 88.5, 89.5, 90.2, 91.0, 91.0, 91.7, 91.7, 92.4, 93.0,
                 93.6, 93.6, 94.1, 95.0, 95.0, 95.4),
    ("IE3", 4): (85.5, 86.5, 86.5, 89.5, 89.5, 91.7, 91.7, 92.4, 93.0, 93.6, 93.6, 94.1, 94.5,
                 95.0, 95.4, 95.4, 95.4, 95.8, 96.2),
    ("IE3", 6): (82.5, 87.5, 88.5, 89.5, 89.5, 91.0, 91.0, 91.7, 91.7, 93.0, 93.0, 94.1, 94.1,
                 94.5, 94.5, 95.0, 95.0, 95.8, 95.8),
    ("IE1", 4): (78.0, 79.0, 81.5, 83.0, 85.0, 86.0, 87.0, 87.5, 88.5, 89.5, 89.5, 90.2, 91.0,
                 91.0, 91.7, 92.4, 93.0, 93.0, 93.6),
    ("IE4", 4): (86.5, 89.5, 89.5, 91.0, 91.0, 92.4, 92.4, 93.6, 94.1, 94.5, 94.5, 95.0, 95.4,
                 95.4, 95.8, 96.2, 96.2, 96.2, 96.5),
}

MIN_KW, MAX_KW = 0.12, 1000.0


def _check_class(efficiency_class: str) -> str:
    name = efficiency_class.upper()
    if name not in CLASSES:
        raise DomainError(f"efficiency class must be one of {', '.join(CLASSES)}, got "
                          f"{efficiency_class!r}")
    return name


@functools.lru_cache(maxsize=4096)
def minimum_efficiency(efficiency_class: str, power_kw: float, poles: int,
                       frequency_hz: float) -> float | None:
    """Nominal minimum full-load efficiency of an IE class [-], or None where not tabulated.

    50 Hz: the interpolation formula eta = A x^3 + B x^2 + C x + D (x = log10 P/kW), rounded to
    0.1 %, held at the 200 kW value up to 1000 kW. 60 Hz: the table, with the midpoint rule (a
    rating at or above the midpoint between two table ratings takes the higher one).

    Parameters
    ----------
    efficiency_class : "IE1".."IE4"
    power_kw : rated output [kW]
    poles : 2, 4, 6 or 8
    frequency_hz : 50 or 60 [Hz]

    References
    ----------
    .. [1] IEC 60034-30-1:2014, tables of nominal efficiency limits; 50 Hz formula and 60 Hz
       midpoint rule as in UK SI 2021/745 Sch. 16 Tables 27-28 and para 5 (EU 2019/1781).
       Check values: IE3 4-pole 50 Hz 1 kW -> 83.7 %; IE2 2-pole 50 Hz 200 kW -> 95.0 %.
    """
    name = _check_class(efficiency_class)
    if not (MIN_KW - 1e-9 <= power_kw <= MAX_KW):
        return None
    if abs(frequency_hz - 50.0) < 1.0:
        p = min(power_kw, 200.0)
        coef = (_COEF_HIGH if p >= 0.75 - 1e-9 else _COEF_LOW).get((name, poles))
        if coef is None:
            return None
        x = math.log10(p)
        a, b, c, d = coef
        return round(a * x ** 3 + b * x ** 2 + c * x + d, 1) / 100.0
    if abs(frequency_hz - 60.0) < 1.0:
        values = _TABLE_60.get((name, poles))
        if values is None or not (_KW_60[0] - 1e-9 <= power_kw <= _KW_60[-1] + 1e-9):
            return None
        i = bisect.bisect_left(_KW_60, power_kw - 1e-9)
        if _KW_60[i] - power_kw > 1e-9:  # between two ratings: the midpoint rule
            midpoint = (_KW_60[i - 1] + _KW_60[i]) / 2.0
            i = i if power_kw >= midpoint else i - 1
        return values[i] / 100.0
    raise DomainError(f"efficiency classes are defined at 50 and 60 Hz, got {frequency_hz:g} Hz")


@functools.lru_cache(maxsize=4096)  # the same rating set meets every site
def efficiency_class_of(efficiency: float, power_kw: float, poles: int,
                        frequency_hz: float) -> str | None:
    """Highest IE class whose minimum the efficiency meets; None below IE1 or out of scope.

    References
    ----------
    .. [1] IEC 60034-30-1:2014 (as :func:`minimum_efficiency`).
    """
    achieved = None
    for name in CLASSES:
        limit = minimum_efficiency(name, power_kw, poles, frequency_hz)
        if limit is None:
            continue
        if efficiency + 1e-9 >= limit:
            achieved = name
    return achieved


def class_rank(efficiency_class: str) -> int:
    """Order of a class: IE1 -> 1 ... IE4 -> 4."""
    return CLASSES.index(_check_class(efficiency_class)) + 1
