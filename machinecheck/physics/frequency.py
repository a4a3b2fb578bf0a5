"""Flux (V/f) ratio, torque capability and output when a machine runs at another frequency."""

from __future__ import annotations

import math

from ..errors import DomainError


def flux_ratio(voltage_v: float, rated_voltage_v: float, frequency_hz: float,
               rated_frequency_hz: float) -> float:
    """Air-gap flux at the site relative to rated, k = (V / V_rated) / (f / f_rated) [-].

    Stator resistance drop neglected. 400 V 50 Hz and 480 V 60 Hz give the same flux (k = 1);
    a 460 V 60 Hz winding on 400 V 50 Hz gives k = 1.043.

    References
    ----------
    .. [1] NEMA MG 1 12.44.2; flux proportional to V/f, e.g. Chapman, *Electric Machinery
       Fundamentals*, sec. 6.9 (variable-frequency speed control).
    """
    if not (0 < voltage_v < math.inf and 0 < rated_voltage_v < math.inf
            and 0 < frequency_hz < math.inf and 0 < rated_frequency_hz < math.inf):
        values = (voltage_v, rated_voltage_v, frequency_hz, rated_frequency_hz)
        raise DomainError(f"voltages and frequencies must be positive, got {values!r}")
    return (voltage_v / rated_voltage_v) / (frequency_hz / rated_frequency_hz)


def rated_flux_voltage(rated_voltage_v: float, frequency_ratio: float) -> float:
    """Voltage that keeps rated V/f at another frequency, V_rated x f / f_rated [V].

    References
    ----------
    .. [1] NEMA MG 1 12.44.2; flux proportional to V/f (Chapman, sec. 6.9).
    """
    return rated_voltage_v * frequency_ratio


def uprated_output(rated_power_w: float, frequency_ratio: float, flux_ratio_: float) -> float:
    """Output a machine could give at a higher frequency with rated flux, P x f / f_rated
    (limited by the flux actually reached) [W]; to be confirmed by the manufacturer.

    P_up = P_rated x min(f / f_rated x min(1, k), f / f_rated)

    References
    ----------
    .. [1] Torque at rated flux is unchanged, so power rises with speed: Chapman, sec. 6.9.
    """
    return rated_power_w * min(frequency_ratio * min(1.0, flux_ratio_), frequency_ratio)


def torque_capability(flux_ratio_: float) -> float:
    """Breakdown and locked-rotor torque relative to rated-supply values, ~ k**2 [-].

    References
    ----------
    .. [1] NEMA MG 1 12.44.2: torque at any speed approximately proportional to V^2 / f^2.
    """
    if not flux_ratio_ > 0:
        raise DomainError(f"flux ratio must be positive, got {flux_ratio_!r}")
    return flux_ratio_ ** 2


def frequency_output_factor(frequency_ratio: float, flux_ratio_: float) -> float:
    """Output at another frequency relative to rated, at rated current.

    Torque at rated current follows the flux, capped at rated torque (min(1, k)); power is
    torque times speed (x f_site / f_rated). The result is capped at 1: an uprating on a
    frequency rise needs the manufacturer's confirmation.

        factor = min(1, (f_site / f_rated) * min(1, k))

    References
    ----------
    .. [1] Common practice for 50/60 Hz re-rating: a 60 Hz motor on 50 Hz at constant V/f gives
       at most 5/6 of its output; a 50 Hz motor on 60 Hz at the same voltage gives about its
       rated kW at 83 % torque (practice notes Q3, Q4; NEMA MG 1 12.44.2).
    """
    if not (frequency_ratio > 0 and flux_ratio_ > 0):
        raise DomainError("frequency and flux ratios must be positive")
    return min(1.0, frequency_ratio * min(1.0, flux_ratio_))


#: Output lost per unit of overflux when re-rated (common practice, calibrated to one motor
#: maker's table of 460 V 60 Hz TEFC motors on 380/400/415 V 50 Hz: 0.80/0.75/0.70).
OVERFLUX_DERATE_SLOPE = 1.5


def overflux_derating(flux_ratio_: float) -> float:
    """Extra output factor for a re-rated machine run above rated flux [-].

    factor = 1 - 1.5 (k - 1) for k > 1, else 1. Saturation raises magnetising current and iron
    loss, so less load current is left within the thermal limit.

    References
    ----------
    .. [1] Common practice, no published formula: fitted to a motor maker's 60 Hz-on-50 Hz
       derating table (shared/reference practice notes Q3).
    """
    if not flux_ratio_ > 0:
        raise DomainError(f"flux ratio must be positive, got {flux_ratio_!r}")
    if flux_ratio_ <= 1.0:
        return 1.0
    return max(0.0, 1.0 - OVERFLUX_DERATE_SLOPE * (flux_ratio_ - 1.0))


#: Exponent of the speed ratio for the cooling loss of a shaft-mounted fan (common practice).
SHAFT_FAN_EXPONENT = 0.25

#: IEC 60034-6 cooling codes whose fan turns with the shaft on an enclosed machine.
SHAFT_FAN_ENCLOSED = frozenset({"IC411", "IC511", "IC611", "IC81W", "IC4A1A1", "IC5A1A1",
                                "IC6A1A1"})


def cooling_derating(speed_ratio: float, cooling_code: str) -> float:
    """Output factor for the weaker cooling of a shaft fan at a lower speed [-].

    factor = (n_site / n_rated) ** 0.25 for enclosed, shaft-fan-cooled machines (IC411 and
    kin) when the speed falls; 1 otherwise (open machines, separately driven fans IC416, non-
    ventilated IC410, or a speed rise, which is not credited).

    References
    ----------
    .. [1] IEC 60034-6 (cooling method codes). The factor is common practice, no published
       formula: chosen so that with :func:`frequency_output_factor` a TEFC 460 V 60 Hz motor on
       380 V 50 Hz keeps about 0.80 of its rating, as one maker's application table gives.
    """
    if not speed_ratio > 0:
        raise DomainError(f"speed ratio must be positive, got {speed_ratio!r}")
    if speed_ratio >= 1.0 or cooling_code.upper() not in SHAFT_FAN_ENCLOSED:
        return 1.0
    return float(speed_ratio ** SHAFT_FAN_EXPONENT)
