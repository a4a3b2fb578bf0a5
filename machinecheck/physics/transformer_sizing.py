"""Sizing a transformer that brings a machine's terminals into zone A at the site.

The target terminal voltage keeps the machine's rated flux at the site frequency (V/f held):
V = V_rated x f_site / f_rated. The ratio is the supply voltage over that target; the kVA is the
machine's input kVA (times a margin the user sets for starting), rounded up to the next size
of a named standard series. A transformer built for 60 Hz and fed at its rated voltage on 50 Hz
runs at 6/5 of its rated flux: it must be fed at no more than 5/6 of its rated voltage.
"""

from __future__ import annotations

import math

from ..errors import DomainError
from .frequency import flux_ratio

#: IEC 60034-1 zone A voltage band of a motor, +-5 % of rated (IEC 60034-1:2022 §7.3).
ZONE_A_VOLTAGE = 0.05

#: Standard kVA series, ascending [VA].
#: "ieee-3ph" and "ieee-1ph": preferred continuous kVA ratings of IEEE Std C57.12.00
#: (three-phase and single-phase distribution and power transformers; from memory).
#: "iec-r10": IEC 60076-1 refers rated power to the R10 series of preferred numbers of ISO 3
#: (100, 125, 160, 200, 250, 315, 400, 500, 630, 800 and decades; from memory).
STANDARD_SERIES_VA: dict[str, tuple[float, ...]] = {
    "ieee-3ph": tuple(1000.0 * s for s in (15, 30, 45, 75, 112.5, 150, 225, 300, 500,
                                           750, 1000, 1500, 2000, 2500, 3750, 5000, 7500,
                                           10000)),
    "ieee-1ph": tuple(1000.0 * s for s in (1, 1.5, 2, 3, 5, 7.5, 10, 15, 25, 37.5, 50, 75, 100,
                                           167, 250, 333, 500)),
    "iec-r10": tuple(1000.0 * m * d for d in (1, 10, 100, 1000)
                     for m in (1.0, 1.25, 1.6, 2.0, 2.5, 3.15, 4.0, 5.0, 6.3, 8.0)),
}


def _positive(name: str, value: float) -> None:
    if not (value > 0 and math.isfinite(value)):
        raise DomainError(f"{name} must be positive, got {value!r}")


def target_terminal_voltage(rated_voltage_v: float, rated_frequency_hz: float,
                            site_frequency_hz: float) -> float:
    """Terminal voltage that keeps the rated flux at the site frequency [V].

    V = V_rated x f_site / f_rated. At the rated frequency this is the rated voltage.

    Parameters
    ----------
    rated_voltage_v : rated voltage of the connection used [V]
    rated_frequency_hz : rated frequency of that rating [Hz]
    site_frequency_hz : site frequency [Hz]

    Returns
    -------
    float : target terminal voltage [V]

    References
    ----------
    .. [1] NEMA MG 1 12.44.2 and any machines text on V/f, e.g. S. J. Chapman, *Electric
       Machinery Fundamentals*, 5th ed., sec. 6.9 (V/f held below base speed).
    """
    _positive("rated voltage", rated_voltage_v)
    _positive("rated frequency", rated_frequency_hz)
    _positive("site frequency", site_frequency_hz)
    return rated_voltage_v * site_frequency_hz / rated_frequency_hz


def zone_a_band(target_voltage_v: float) -> tuple[float, float]:
    """Lowest and highest terminal voltage inside zone A around ``target_voltage_v`` [V].

    References
    ----------
    .. [1] IEC 60034-1:2022 §7.3, Figure (zone A: +-5 % voltage at rated frequency +-2 %).
    """
    _positive("target voltage", target_voltage_v)
    return target_voltage_v * (1.0 - ZONE_A_VOLTAGE), target_voltage_v * (1.0 + ZONE_A_VOLTAGE)


def turns_ratio(supply_voltage_v: float, target_voltage_v: float) -> float:
    """Primary-to-secondary voltage ratio that gives ``target_voltage_v`` from the supply [-].

    a = V_supply / V_target (no-load; the transformer's regulation at load is left out).

    References
    ----------
    .. [1] Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 2.3 (ideal transformer).
    """
    _positive("supply voltage", supply_voltage_v)
    _positive("target voltage", target_voltage_v)
    return supply_voltage_v / target_voltage_v


def input_va(current_a: float, voltage_v: float, phases: int) -> float:
    """Apparent power the machine draws: sqrt(3) V I (three-phase) or V I (single-phase) [VA].

    Parameters
    ----------
    current_a : line current at the terminal voltage [A]
    voltage_v : terminal voltage, line-to-line for three-phase [V]
    phases : 1 or 3

    References
    ----------
    .. [1] Any circuits text; three-phase S = sqrt(3) V_LL I_L.
    """
    _positive("current", current_a)
    _positive("voltage", voltage_v)
    if phases == 3:
        return math.sqrt(3.0) * voltage_v * current_a
    if phases == 1:
        return voltage_v * current_a
    raise DomainError(f"phases must be 1 or 3, got {phases!r}")


def required_va(load_va: float, margin: float = 1.0) -> float:
    """Transformer rating needed: the load's apparent power times a margin [VA].

    The margin (for starting, growth, harmonics) is the user's choice; 1.0 sizes on the running
    load only, and the starting dip must then be checked on the transformer's impedance.

    References
    ----------
    .. [1] Common practice, no published source (kVA >= motor input kVA, margin for starting).
    """
    _positive("load apparent power", load_va)
    if not (margin >= 1.0 and math.isfinite(margin)):
        raise DomainError(f"margin must be 1 or more, got {margin!r}")
    return load_va * margin


def next_standard_va(required_va_: float, series: str) -> float:
    """Smallest size of ``series`` at or above the need [VA]; NaN above the series' top.

    Parameters
    ----------
    required_va_ : rating needed [VA]
    series : a key of :data:`STANDARD_SERIES_VA` ("ieee-3ph", "ieee-1ph", "iec-r10")

    References
    ----------
    .. [1] IEEE Std C57.12.00, preferred kVA ratings (from memory).
    .. [2] IEC 60076-1:2011 and ISO 3 R10 preferred numbers (from memory).
    """
    sizes = STANDARD_SERIES_VA.get(series)
    if sizes is None:
        raise DomainError(f"series must be one of {', '.join(STANDARD_SERIES_VA)}, got {series!r}")
    _positive("required rating", required_va_)
    for size in sizes:
        if size >= required_va_ * (1.0 - 1e-9):
            return size
    return math.nan


def transformer_overflux(applied_voltage_v: float, rated_voltage_v: float,
                         applied_frequency_hz: float, rated_frequency_hz: float) -> float:
    """Core flux of a transformer relative to its rated flux, (V / V_r) / (f / f_r) [-].

    A 60 Hz transformer at its rated voltage on 50 Hz runs at 1.2 x rated flux: magnetising
    current and core loss rise steeply and it may overheat. Keep it at or below 1 by feeding
    no more than V_r x f / f_r (its kVA falls in the same proportion at rated current).

    References
    ----------
    .. [1] Flux ~ V / f: S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 2.10.
    .. [2] IEEE Std C57.12.00-2010, 4.1.6.1 (see :func:`within_rated_capability`).
    """
    return flux_ratio(applied_voltage_v, rated_voltage_v, applied_frequency_hz, rated_frequency_hz)


#: Largest V/Hz (and voltage) at which a transformer carries its rated kVA continuously, per
#: unit of rated (IEEE Std C57.12.00-2010, 4.1.6.1 a) 1)).
TRANSFORMER_VOLTS_PER_HERTZ_LIMIT = 1.05
#: Lowest frequency, per unit of rated, of that capability (IEEE Std C57.12.00-2010,
#: 4.1.6.1 a) 3)).
TRANSFORMER_MIN_FREQUENCY = 0.95


def within_rated_capability(applied_voltage_v: float, rated_voltage_v: float,
                            applied_frequency_hz: float, rated_frequency_hz: float) -> bool:
    """Whether a transformer may carry its rated kVA at this voltage and frequency.

    True when V / V_r <= 1.05, (V/f) / (V_r/f_r) <= 1.05 and f / f_r >= 0.95 (the standard
    also asks a load power factor of 0.8 or more). A 60 Hz unit on 50 Hz (f / f_r = 0.83) is
    outside it at any voltage: its rating at 50 Hz is the maker's to give.

    References
    ----------
    .. [1] IEEE Std C57.12.00-2010, 4.1.6.1 a): operation above rated voltage or below rated
       frequency (liquid-immersed transformers; dry-type units have the like clause in
       IEEE Std C57.12.01).
    """
    k = transformer_overflux(applied_voltage_v, rated_voltage_v, applied_frequency_hz,
                             rated_frequency_hz)
    eps = 1e-9
    return (applied_voltage_v / rated_voltage_v <= TRANSFORMER_VOLTS_PER_HERTZ_LIMIT + eps
            and k <= TRANSFORMER_VOLTS_PER_HERTZ_LIMIT + eps
            and applied_frequency_hz / rated_frequency_hz >= TRANSFORMER_MIN_FREQUENCY - eps)


def reduced_rating_va(rated_va: float, rated_frequency_hz: float, site_frequency_hz: float) -> float:
    """Rating of a transformer used at a lower frequency with its voltage cut to hold V/f [VA].

    S = S_r x min(1, f_site / f_r): rated current at the reduced voltage.

    References
    ----------
    .. [1] Common practice, no published source; follows from rated current at V/f held.
       Outside :func:`within_rated_capability` (below 95 % of rated frequency) the figure is an
       estimate for the maker to confirm.
    """
    _positive("rated apparent power", rated_va)
    _positive("rated frequency", rated_frequency_hz)
    _positive("site frequency", site_frequency_hz)
    return rated_va * min(1.0, site_frequency_hz / rated_frequency_hz)
