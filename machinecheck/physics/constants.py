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

#: Per-unit frequency deviation each standard's running tolerance covers, (low, high); a larger
#: deviation is a change of nominal frequency and the machine is re-rated (IEC 60034-1 7.3
#: zone B: -5 %/+3 %; NEMA MG 1 12.44: +-5 %).
FREQUENCY_BAND = {"IEC": (-0.05, 0.03), "NEMA": (-0.05, 0.05)}
#: Frequency ratios over which re-rating from the plate is still meaningful (common practice,
#: no published source).
RERATING_RANGE = (0.5, 1.5)

#: NEMA MG 1 12.44: within the limits but near them above this combined variation (8 of 10 %)
#: or below this voltage deviation (-7.5 %) (common practice, no published source).
NEAR_LIMIT_COMBINED = 0.08
NEAR_LIMIT_UNDERVOLTAGE = -0.075

#: Slip tolerance of induction motors: +-20 % of the rated slip (IEC 60034-1 Table 20 item 9,
#: for 1 kW and above; NEMA MG 1 12.46 likewise; clause numbers from memory).
SLIP_TOLERANCE = 0.20

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
