"""Synchronous speed, pole count, slip and the running speed at another supply."""

from __future__ import annotations

import math

from ..errors import DomainError
from .constants import MAX_RATED_SLIP, MAX_RATED_SLIP_DESIGN_D, synchronous_speed_rpm


def synchronous_speed(frequency_hz: float, poles: int) -> float:
    """Synchronous speed of the rotating field.

    n_s = 120 f / p

    Parameters
    ----------
    frequency_hz : supply frequency [Hz]
    poles : number of poles (not pole pairs), even and positive [-]

    Returns
    -------
    float : synchronous speed [rpm]

    References
    ----------
    .. [1] IEC 60034-1, definitions; NEMA MG 1 Part 1. Any machines text, e.g. S. J. Chapman,
       *Electric Machinery Fundamentals*, ch. 4 (n_sync = 120 f_e / P).
    """
    if not (isinstance(poles, int) and poles > 0 and poles % 2 == 0):
        raise DomainError(f"poles must be a positive even number, got {poles!r}")
    if not (frequency_hz > 0 and math.isfinite(frequency_hz)):
        raise DomainError(f"frequency must be positive, got {frequency_hz!r} Hz")
    return synchronous_speed_rpm(frequency_hz, poles)


def poles_from_speed(rated_speed_rpm: float, frequency_hz: float, *,
                     max_slip: float | None = None, synchronous: bool = False,
                     design_letter: str | None = None) -> int:
    """Pole count implied by a rated speed: the smallest synchronous speed above it.

    Parameters
    ----------
    rated_speed_rpm : nameplate full-load speed [rpm]
    frequency_hz : rated frequency of that speed [Hz]
    max_slip : largest plausible full-load slip [-]; by default 10 %, or 13 % for a NEMA
        Design D (high-slip) motor
    synchronous : True for synchronous machines, whose rated speed equals n_s exactly
    design_letter : NEMA design letter, when marked ("D" allows a 5-13 % slip)

    Returns
    -------
    int : number of poles

    Raises
    ------
    DomainError : when the implied slip is <= 0 (induction) or above ``max_slip``, or a
        synchronous speed is not 120 f / p for an even p.

    References
    ----------
    .. [1] Common practice (p = even number giving the next synchronous speed above the rated
       speed); e.g. 1450 rpm at 50 Hz -> 4 poles, 1170 rpm at 60 Hz -> 6 poles.
    """
    if not (rated_speed_rpm > 0 and math.isfinite(rated_speed_rpm)):
        raise DomainError(f"rated speed must be positive, got {rated_speed_rpm!r} rpm")
    if not (frequency_hz > 0 and math.isfinite(frequency_hz)):
        raise DomainError(f"frequency must be positive, got {frequency_hz!r} Hz")
    ratio = 120.0 * frequency_hz / rated_speed_rpm
    if synchronous:
        poles = round(ratio / 2) * 2
        n_s = synchronous_speed_rpm(frequency_hz, poles) if poles >= 2 else 0.0
        if poles < 2 or abs(n_s - rated_speed_rpm) > 0.005 * rated_speed_rpm:
            raise DomainError(
                f"{rated_speed_rpm:g} rpm is not a synchronous speed at {frequency_hz:g} Hz "
                f"(120 f / p for an even p)")
        return poles
    poles = 2 * math.floor(ratio / 2 + 1e-12)
    if poles < 2:
        raise DomainError(
            f"{rated_speed_rpm:g} rpm is at or above the 2-pole synchronous speed "
            f"{60 * frequency_hz:g} rpm at {frequency_hz:g} Hz")
    n_s = synchronous_speed_rpm(frequency_hz, poles)
    s = (n_s - rated_speed_rpm) / n_s
    if s <= 0:
        raise DomainError(
            f"{rated_speed_rpm:g} rpm gives no slip below {n_s:g} rpm synchronous at {frequency_hz:g} Hz")
    if max_slip is None:
        design_d = (design_letter or "").strip().upper() == "D"
        max_slip = MAX_RATED_SLIP_DESIGN_D if design_d else MAX_RATED_SLIP
    if s > max_slip + 1e-12:
        raise DomainError(
            f"{rated_speed_rpm:g} rpm implies {100 * s:.1f} % slip below {n_s:g} rpm "
            f"({poles} poles at {frequency_hz:g} Hz), above {100 * max_slip:.0f} %: check speed, "
            f"frequency or poles")
    return poles


def slip(synchronous_speed_rpm: float, speed_rpm: float) -> float:
    """Per-unit slip s = (n_s - n) / n_s [-].

    References
    ----------
    .. [1] IEC 60034-1 definitions; Chapman, *Electric Machinery Fundamentals*, eq. (6-4).
    """
    if not synchronous_speed_rpm > 0:
        raise DomainError(f"synchronous speed must be positive, got {synchronous_speed_rpm!r}")
    return (synchronous_speed_rpm - speed_rpm) / synchronous_speed_rpm


def running_speed(synchronous_speed_rpm: float, rated_slip_rpm: float, *,
                  torque_ratio: float = 1.0, flux_ratio: float = 1.0) -> float:
    """Running speed of an induction motor in the low-slip region.

    In the linear part of the torque-slip curve, torque is proportional to slip frequency and to
    the square of the air-gap flux, so the slip in rpm at the site is

        slip_rpm = rated_slip_rpm * (T / T_rated) / k**2,   n = n_s - slip_rpm

    At constant V/f (k = 1) and rated torque the slip in rpm is unchanged by a frequency change.

    Parameters
    ----------
    synchronous_speed_rpm : synchronous speed at the site frequency [rpm]
    rated_slip_rpm : n_s - n_rated on the rated supply [rpm]
    torque_ratio : load torque over rated torque [-]
    flux_ratio : V/f at the site over rated V/f, k [-]

    Returns
    -------
    float : shaft speed [rpm]

    References
    ----------
    .. [1] NEMA MG 1 12.44.2 (torque approximately proportional to V^2 / f^2).
    .. [2] Chapman, *Electric Machinery Fundamentals*, sec. 6.5 (torque ~ slip at low slip).
    """
    if not flux_ratio > 0:
        raise DomainError(f"flux ratio must be positive, got {flux_ratio!r}")
    if torque_ratio < 0:
        raise DomainError(f"torque ratio must not be negative, got {torque_ratio!r}")
    return synchronous_speed_rpm - rated_slip_rpm * torque_ratio / flux_ratio ** 2


def slip_rule_speed(synchronous_speed_rpm: float, rated_slip_rpm: float, rated_torque_nm: float,
                    flux_ratio: float, load_torque_nm: float, load_exponent: int,
                    reference_speed_rpm: float) -> float | None:
    """Speed at which the linear slip rule (:func:`running_speed`) meets the load, or None.

    The load's torque goes as T = T0 (n / n0)**e (e = 2 centrifugal, 0 constant torque, -1
    constant power), and the rule is n = n_s - c T(n) with c = slip_rated / (T_rated k**2):

        e = 0:   n = n_s - c T0
        e = 2:   c a n**2 + n - n_s = 0, a = T0 / n0**2  ->  n = 2 n_s / (1 + sqrt(1 + 4 c a n_s))
        e = -1:  n**2 - n_s n + c b = 0, b = T0 n0       ->  n = (n_s + sqrt(n_s**2 - 4 c b)) / 2

    taking the root on the stable side of the torque-speed curve. None when there is no such
    speed, or it lies at or below half the synchronous speed: far outside the low-slip region
    the rule describes, the motor is taken as stalled.

    Parameters
    ----------
    synchronous_speed_rpm : synchronous speed at the site frequency [rpm]
    rated_slip_rpm : n_s - n_rated on the rated supply [rpm]
    rated_torque_nm : rated shaft torque [N m]
    flux_ratio : V/f at the site over rated V/f, k [-]
    load_torque_nm : load torque T0 at the reference speed [N m]
    load_exponent : e above [-]
    reference_speed_rpm : the speed n0 at which the load asks T0 [rpm]

    References
    ----------
    .. [1] As :func:`running_speed`; the quadratics are elementary algebra.
    """
    if not flux_ratio > 0:
        raise DomainError(f"flux ratio must be positive, got {flux_ratio!r}")
    if not (rated_torque_nm > 0 and reference_speed_rpm > 0):
        raise DomainError("rated torque and reference speed must be positive")
    if load_torque_nm < 0:
        raise DomainError(f"load torque must not be negative, got {load_torque_nm!r}")
    n_s = synchronous_speed_rpm
    c = rated_slip_rpm / (rated_torque_nm * flux_ratio * flux_ratio)
    if load_exponent == 0:
        n = n_s - c * load_torque_nm
    elif load_exponent == 2:
        ca = c * load_torque_nm / (reference_speed_rpm * reference_speed_rpm)
        n = 2.0 * n_s / (1.0 + math.sqrt(1.0 + 4.0 * ca * n_s))
    elif load_exponent == -1:
        disc = n_s * n_s - 4.0 * c * load_torque_nm * reference_speed_rpm
        if disc < 0.0:
            return None
        n = 0.5 * (n_s + math.sqrt(disc))
    else:
        raise DomainError(f"load torque exponent must be 2, 0 or -1, got {load_exponent!r}")
    return n if n > 0.5 * n_s else None


def shaft_torque(power_w: float, speed_rpm: float) -> float:
    """Shaft torque T = P / omega [N*m] from power [W] and speed [rpm].

    References
    ----------
    .. [1] Definition of mechanical power, P = T * omega (T [N*m] = 9550 P [kW] / n [rpm]).
    """
    if not speed_rpm > 0:
        raise DomainError(f"speed must be positive, got {speed_rpm!r} rpm")
    return power_w / (speed_rpm * math.pi / 30.0)


def shaft_power(torque_nm: float, speed_rpm: float) -> float:
    """Shaft power P = T * omega [W] from torque [N*m] and speed [rpm].

    References
    ----------
    .. [1] Definition of mechanical power, P = T * omega, omega = 2 pi n / 60.
    """
    return torque_nm * speed_rpm * math.pi / 30.0


#: The linear slip rule holds for flux ratios in this range and loads up to this multiple of
#: rated torque (common practice, no published source).
SLIP_RULE_FLUX_RANGE = (0.8, 1.2)
SLIP_RULE_MAX_TORQUE_RATIO = 1.5


def slip_rule_valid(flux_ratio_: float, torque_ratio: float | None) -> bool:
    """Whether :func:`slip_rule_speed` is inside the region where slip is linear in torque.

    Parameters
    ----------
    flux_ratio_ : k = (V / V_rated) / (f / f_rated) [-]
    torque_ratio : load torque over rated torque at the running speed [-], None when unknown
    """
    low, high = SLIP_RULE_FLUX_RANGE
    return (low <= flux_ratio_ <= high) and (
        torque_ratio is None or torque_ratio <= SLIP_RULE_MAX_TORQUE_RATIO)


def speed_at_slip(synchronous_speed_rpm_: float, slip_: float) -> float:
    """Rotor speed n = (1 - s) n_s [rpm] at per-unit slip s.

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, ch. 7 (definition of slip).
    """
    return (1.0 - slip_) * synchronous_speed_rpm_
