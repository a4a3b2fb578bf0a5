"""Voltage unbalance (NEMA definition) and the motor derating it calls for."""

from __future__ import annotations

import math
from collections.abc import Iterable

from ..errors import DomainError
from .constants import UNBALANCE_LIMIT


def voltage_unbalance(line_voltages_v: Iterable[float]) -> float:
    """Percent unbalance per NEMA: largest deviation from the average over the average [-].

    Not (Vmax - Vmin) / Vavg, which about doubles the figure.

    Parameters
    ----------
    line_voltages_v : the three line-to-line voltages [V]

    Returns
    -------
    float : unbalance as a fraction (0.0196 for 1.96 %)

    References
    ----------
    .. [1] NEMA MG 1 14.36 / Part 14 definition of percent voltage unbalance. Worked values:
       462/463/455 V -> 1.09 %; 460/467/450 V -> 1.96 %; 400/395/388 V -> 1.61 %.
    """
    values = [float(v) for v in line_voltages_v]
    if len(values) != 3:
        raise DomainError(f"three line voltages are needed, got {len(values)}")
    if not all(v > 0 and math.isfinite(v) for v in values):
        raise DomainError(f"line voltages must be positive, got {values!r}")
    average = sum(values) / 3.0
    return max(abs(v - average) for v in values) / average


#: (unbalance, derating factor) read from the NEMA MG 1 curve (Figure 14-1).
UNBALANCE_DERATING = ((0.0, 1.0), (0.01, 1.0), (0.015, 0.97), (0.02, 0.95), (0.025, 0.93),
                      (0.03, 0.89), (0.035, 0.85), (0.04, 0.82), (0.045, 0.78), (0.05, 0.76))


def unbalance_derating(unbalance: float) -> float:
    """Output factor for a three-phase motor on an unbalanced supply [-].

    Linear interpolation of the NEMA MG 1 curve: 1.0 up to 1 %, 0.95 at 2 %, 0.89 at 3 %,
    0.82 at 4 %, 0.76 at 5 %.

    Raises
    ------
    DomainError : above 5 %, where the curve ends and operation is not recommended.

    References
    ----------
    .. [1] NEMA MG 1 Part 14, "operation on unbalanced voltages", Figure 14-1 (medium motors);
       values as read by one published transcription of the curve (read by eye, +-0.02).
    """
    if not (0.0 <= unbalance <= UNBALANCE_LIMIT + 1e-12):
        raise DomainError(f"unbalance must be within 0-5 % for the derating curve, got "
                          f"{100 * unbalance:.2f} %")
    for (u0, f0), (u1, f1) in zip(UNBALANCE_DERATING, UNBALANCE_DERATING[1:]):
        if unbalance <= u1:
            return f0 + (f1 - f0) * (unbalance - u0) / (u1 - u0)
    return UNBALANCE_DERATING[-1][1]


def unbalance_heating(unbalance: float) -> float:
    """Extra winding temperature rise, per unit of the rise, ~ 2 (100 u)**2 percent [-].

    References
    ----------
    .. [1] NEMA MG 1 commentary rule of thumb (from memory): 3 % unbalance -> about 18 % more
       temperature rise.
    """
    return 2.0 * (100.0 * unbalance) ** 2 / 100.0
