"""Driven loads: how torque, power, flow and head follow the shaft speed."""

from __future__ import annotations

import math
from collections.abc import Callable

from ..errors import DomainError

LOAD_TYPES = ("centrifugal", "constant-torque", "constant-power")
#: Load torque goes as (n / n0) ** exponent.
TORQUE_EXPONENT = {"centrifugal": 2, "constant-torque": 0, "constant-power": -1}


def _exponent(load_type: str) -> int:
    exponent = TORQUE_EXPONENT.get(load_type)
    if exponent is None:
        raise DomainError(f"load type must be one of {', '.join(LOAD_TYPES)}, got {load_type!r}")
    return exponent


def torque_ratio(load_type: str, speed_ratio: float) -> float:
    """Load torque relative to its value at the reference speed [-].

    centrifugal: (n / n0)**2; constant-torque: 1; constant-power: n0 / n.

    References
    ----------
    .. [1] Pump and fan affinity laws (torque ~ n^2), e.g. Karassik et al., *Pump Handbook*,
       ch. 2; constant-torque and constant-power loads: common practice.
    """
    exponent = _exponent(load_type)
    if not speed_ratio > 0:
        raise DomainError(f"speed ratio must be positive, got {speed_ratio!r}")
    return float(speed_ratio ** exponent)


def torque_curve(load_type: str, torque_nm: float,
                 reference_speed_rpm: float) -> Callable[[float], float]:
    """The load's torque as a function of shaft speed: n [rpm] -> T [N m].

    ``torque_nm`` is the torque at ``reference_speed_rpm``; the curve follows
    :func:`torque_ratio` (a solver's hot loop calls it, so it is one multiplication). A
    constant-power load asks infinite torque at standstill.
    """
    exponent = _exponent(load_type)
    if exponent == 2:
        scale = torque_nm / (reference_speed_rpm * reference_speed_rpm)
        return lambda n: scale * n * n
    if exponent == 0:
        return lambda n: torque_nm
    power = torque_nm * reference_speed_rpm
    return lambda n: power / n if n > 0 else math.inf


def constant_power_reference(power_w: float) -> tuple[float, float]:
    """A constant-power load of ``power_w`` as (torque [N m], at speed [rpm]) for
    :func:`torque_curve`: the torque it would ask at 1 rpm, T = P x 30 / pi.

    References
    ----------
    .. [1] Definition of mechanical power, P = T * omega, omega = 2 pi n / 60.
    """
    return power_w * 30.0 / math.pi, 1.0


def power_ratio(load_type: str, speed_ratio: float) -> float:
    """Load power relative to its value at the reference speed [-] (torque ratio x speed ratio).

    References
    ----------
    .. [1] Affinity laws: P ~ n^3 (60 -> 50 Hz: x 0.579; 50 -> 60 Hz: x 1.728).
    """
    return torque_ratio(load_type, speed_ratio) * speed_ratio


def affinity(speed_ratio: float) -> tuple[float, float, float]:
    """Flow, head and power ratios of a centrifugal pump or fan, same impeller [-].

    Q ~ n, H ~ n^2, P ~ n^3, efficiency taken as unchanged.

    References
    ----------
    .. [1] Affinity laws, e.g. Karassik et al., *Pump Handbook*, ch. 2. Worked case (affinity
       tutorial): 1750 -> 1450 rpm gives 0.8286 / 0.6865 / 0.5689.
    """
    if not speed_ratio > 0:
        raise DomainError(f"speed ratio must be positive, got {speed_ratio!r}")
    return speed_ratio, speed_ratio ** 2, speed_ratio ** 3


def impeller_trim(head_ratio_wanted: float, speed_ratio: float) -> float:
    """Impeller diameter ratio restoring the original head at a new speed [-].

    At constant flow coefficient, H ~ (n D)^2, so D_new / D_old = sqrt(H_wanted) / (n / n0).

    References
    ----------
    .. [1] Affinity laws in diameter (common practice; confirm with the pump maker, trims above
       ~10-15 % do not follow them).
    """
    if not (speed_ratio > 0 and head_ratio_wanted > 0):
        raise DomainError("ratios must be positive")
    return float(head_ratio_wanted ** 0.5) / speed_ratio
