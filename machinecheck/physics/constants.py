"""Trade constants and the small conversions built on them, each with its source.

Every other module reads these names; none writes the numbers again.
"""

from __future__ import annotations

import math

#: One mechanical horsepower, 550 ft lbf/s = 550 x 0.3048 m x 4.4482216152605 N per s [W].
#: The metric horsepower (735.5 W) is a different unit and is not used for NEMA ratings.
W_PER_HP = 745.6998715822701
#: The same horsepower in kilowatts [kW/hp].
KW_PER_HP = W_PER_HP / 1000.0

#: Conductors of a single motor are sized for 125 % of its full-load current (NEC 430.22).
CONDUCTOR_FACTOR = 1.25

#: Voltage unbalance up to this fraction needs no derating (NEMA MG 1 Figure 14-1) [-].
UNBALANCE_KNEE = 0.01
#: Voltage unbalance above which operation is not recommended (NEMA MG 1 14.36) [-].
UNBALANCE_LIMIT = 0.05

#: Nominal supply frequencies [Hz]. A machine is re-rated only for a change of nominal
#: frequency (50 <-> 60 Hz); a site off its nominal (47 Hz, 52 Hz on a 50 Hz system) is a
#: variation judged in the voltage-frequency tolerance (IEC 60034-1:2022 §7.3 zones A/B; NEMA
#: MG 1-2016 §12.44).
NOMINAL_FREQUENCIES_HZ = (50.0, 60.0)
#: A frequency within this fraction of a nominal one belongs to that nominal (halfway between
#: 50 and 60 Hz is 55 Hz = 50 x 1.10 = 60 x 0.917; common practice, no published source).
NOMINAL_FREQUENCY_REACH = 0.08
#: Frequency ratios over which re-rating from the plate is still meaningful (common practice,
#: no published source).
RERATING_RANGE = (0.5, 1.5)

#: NEMA MG 1 12.44: within the limits but near them above this combined variation (8 of 10 %)
#: or below this voltage deviation (-7.5 %) (common practice, no published source).
NEAR_LIMIT_COMBINED = 0.08
NEAR_LIMIT_UNDERVOLTAGE = -0.075

#: Slip tolerance of induction motors, share of the rated slip: +-30 % below 1 kW, +-20 % at and
#: above 1 kW (IEC 60034-1:2022 tolerance table, "slip" row; the same +-20 % in NEMA MG 1-2016
#: §12.46 likewise, clause number from memory).
SLIP_TOLERANCE_SMALL = 0.30
SLIP_TOLERANCE = 0.20
#: Rated output [W] at and above which the smaller slip tolerance applies.
SLIP_TOLERANCE_THRESHOLD_W = 1000.0

#: Largest full-load slip of a general-purpose induction motor, and of a NEMA Design D (high
#: slip) motor, whose full-load slip is 5-13 % (NEMA MG 1-2016 §1.19.1.4, clause number from
#: memory).
MAX_RATED_SLIP = 0.10
MAX_RATED_SLIP_DESIGN_D = 0.13

#: Low-speed motors for NEC 430.6(A)(1): built for less than 1200 rpm, read on the synchronous
#: speed at the rated frequency (8 poles and more at 60 Hz, 6 and more at 50 Hz) [rpm]
#: ([NFPA 70-2023] 430.6(A)(1)).
NEC_LOW_SPEED_RPM = 1200.0
#: Power factor taken for a generator's real output when the plate gives none (the usual
#: rating basis of synchronous generators, common practice).
GENERATOR_POWER_FACTOR = 0.8

#: Service factor is usable only on a clean supply: no derate below this factor, voltage within
#: +-5 % and frequency within +-1 % of rated (common practice reading of NEMA MG 1 14.37, from
#: memory).
SERVICE_FACTOR_MIN_DERATE = 0.999
SERVICE_FACTOR_VOLTAGE_BAND = 0.05
SERVICE_FACTOR_FREQUENCY_BAND = 0.01

#: Star-delta starting needs a delta connection within this of the supply's flux (per unit).
STAR_DELTA_FLUX_BAND = 0.10
#: A star and a delta voltage of one winding differ by sqrt(3) within this.
STAR_DELTA_RATIO_SLACK = 0.1


def synchronous_speed_rpm(frequency_hz: float, poles: int) -> float:
    """Synchronous speed n_s = 120 f / p [rpm], with no checks (the model checked the inputs).

    References
    ----------
    .. [1] IEC 60034-1, definitions; S. J. Chapman, *Electric Machinery Fundamentals*, ch. 4.
    """
    return 120.0 * frequency_hz / poles


def hp_from_w(power_w: float) -> float:
    """Mechanical horsepower from watts [hp]."""
    return power_w / W_PER_HP


def line_to_neutral_v(line_voltage_v: float) -> float:
    """Line-to-neutral voltage of a balanced three-phase wye system, V_LL / sqrt(3) [V]."""
    return line_voltage_v / math.sqrt(3.0)


def split_phase_half_v(line_voltage_v: float) -> float:
    """Line-to-neutral voltage of a split-phase (centre-tapped) system, V_LL / 2 [V]."""
    return line_voltage_v / 2.0


def star_delta_ratio() -> float:
    """Star voltage over delta voltage of one winding, sqrt(3) [-]."""
    return math.sqrt(3.0)


def slip_tolerance(power_w: float) -> float:
    """Tolerance on the rated slip as a share of it [-]: 0.30 below 1 kW, 0.20 from 1 kW.

    References
    ----------
    .. [1] IEC 60034-1:2022, tolerance table on declared values, slip.
    """
    return SLIP_TOLERANCE_SMALL if power_w < SLIP_TOLERANCE_THRESHOLD_W else SLIP_TOLERANCE


def nominal_frequency_hz(frequency_hz: float) -> float | None:
    """The nominal frequency (50 or 60 Hz) a frequency belongs to, or None for another one."""
    for nominal in NOMINAL_FREQUENCIES_HZ:
        if abs(frequency_hz / nominal - 1.0) <= NOMINAL_FREQUENCY_REACH + 1e-12:
            return nominal
    return None


def is_nominal_change(site_frequency_hz: float, rated_frequency_hz: float) -> bool:
    """True when a site frequency is another nominal than the rated one (50 <-> 60 Hz): the
    machine is then re-rated; an off-nominal value of the same system is a variation.

    A frequency that belongs to neither 50 nor 60 Hz (25 Hz, 400 Hz) is a change of nominal
    when it lies beyond :data:`NOMINAL_FREQUENCY_REACH` of the rated frequency.
    """
    site = nominal_frequency_hz(site_frequency_hz)
    rated = nominal_frequency_hz(rated_frequency_hz)
    if site is not None and rated is not None:
        return site != rated
    return abs(site_frequency_hz / rated_frequency_hz - 1.0) > NOMINAL_FREQUENCY_REACH + 1e-12
