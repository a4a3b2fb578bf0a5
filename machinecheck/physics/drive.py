"""Variable-frequency drive: the current rating to choose, its derates, and the motor's V/f.

A drive is sized by the motor's current, not its kW: the drive's continuous output current,
after its derates for ambient, altitude and single-phase input, must reach the motor's
full-load current at the connection used. The drive's base point is the motor's own rated
voltage and frequency; a drive cannot put out more voltage than it is fed, so above the
frequency at which the motor's V/f reaches the input voltage the motor runs field-weakened,
at constant power and falling torque.

The insulation and duty of a motor on a drive (NEMA MG 1 Parts 30 and 31, IEC TS 60034-25,
IEC 60034-18-41) are a question for the plate or the maker; nothing here answers it.
"""

from __future__ import annotations

import math

from ..errors import DomainError

#: Drive current multiple for single-phase input to a three-phase drive: choose a drive rated
#: sqrt(3) to 2 x the motor current (it is derated to 50-58 % of its three-phase rating).
#: Common practice, no published source (drive makers' application guides).
SINGLE_PHASE_FACTOR_RANGE = (math.sqrt(3.0), 2.0)

#: Ambient above which a drive is derated, and the derate per kelvin (common practice).
DRIVE_RATED_AMBIENT_DEGC = 40.0
AMBIENT_DERATE_PER_K = 0.01
#: Altitude above which a drive is derated, and the derate per metre (1 % per 100 m).
DRIVE_RATED_ALTITUDE_M = 1000.0
ALTITUDE_DERATE_PER_M = 0.0001


def _positive(name: str, value: float) -> None:
    if not (value > 0 and math.isfinite(value)):
        raise DomainError(f"{name} must be positive, got {value!r}")


def ambient_derating(ambient_degc: float, *, per_k: float = AMBIENT_DERATE_PER_K,
                     rated_ambient_degc: float = DRIVE_RATED_AMBIENT_DEGC) -> float:
    """Fraction of its rated current a drive carries at ``ambient_degc`` [-].

    factor = 1 - per_k (T - T_rated) above T_rated, else 1. A datasheet's own figures replace
    the defaults (about 1 %/K above 40 deg C).

    Parameters
    ----------
    ambient_degc : air temperature at the drive [deg C]
    per_k : derate per kelvin above the rated ambient [1/K]
    rated_ambient_degc : ambient up to which the drive carries its rating [deg C]

    Returns
    -------
    float : current factor in (0, 1]

    Raises
    ------
    DomainError : when the derate would leave nothing (the drive cannot run there)

    References
    ----------
    .. [1] Common practice, no published source: drive makers' application guides give about
       1 % per deg C above 40 deg C.
    """
    if not math.isfinite(ambient_degc):
        raise DomainError(f"ambient must be finite, got {ambient_degc!r}")
    factor = 1.0 - per_k * max(0.0, ambient_degc - rated_ambient_degc)
    if factor <= 0.0:
        raise DomainError(f"no drive rating is left at {ambient_degc:g} deg C")
    return factor


def altitude_derating(altitude_m: float, *, per_m: float = ALTITUDE_DERATE_PER_M,
                      rated_altitude_m: float = DRIVE_RATED_ALTITUDE_M) -> float:
    """Fraction of its rated current a drive carries at ``altitude_m`` [-].

    factor = 1 - per_m (h - h_rated) above h_rated, else 1 (about 1 % per 100 m above 1000 m).

    References
    ----------
    .. [1] Common practice, no published source: drive makers' application guides give about
       1 % per 100 m above 1000 m.
    """
    if not math.isfinite(altitude_m):
        raise DomainError(f"altitude must be finite, got {altitude_m!r}")
    factor = 1.0 - per_m * max(0.0, altitude_m - rated_altitude_m)
    if factor <= 0.0:
        raise DomainError(f"no drive rating is left at {altitude_m:g} m")
    return factor


def required_drive_current_a(motor_current_a: float, *, ambient_degc: float,
                             altitude_m: float, single_phase_input: bool) -> tuple[float, float]:
    """Three-phase rated output current the drive must have [A], as a (low, high) range.

    I_drive = I_motor / (k_ambient k_altitude) x m, with m = 1 for three-phase input and
    m from sqrt(3) to 2 for single-phase input (so low < high only then).

    Parameters
    ----------
    motor_current_a : motor full-load current at the connection used [A]
    ambient_degc : air temperature at the drive [deg C]
    altitude_m : site altitude [m]
    single_phase_input : True when a three-phase drive is fed from a single-phase supply

    Returns
    -------
    tuple[float, float] : least and most conservative drive ratings [A]

    References
    ----------
    .. [1] Common practice, no published source (drive makers' application guides): size by
       current; single-phase input: sqrt(3) to 2 x; ambient and altitude as above.
    """
    _positive("motor current", motor_current_a)
    base = motor_current_a / (ambient_derating(ambient_degc) * altitude_derating(altitude_m))
    if not single_phase_input:
        return base, base
    low, high = SINGLE_PHASE_FACTOR_RANGE
    return base * low, base * high


def volts_per_hertz(rated_voltage_v: float, rated_frequency_hz: float) -> float:
    """The motor's own V/f, to be set as the drive's base voltage over base frequency [V/Hz].

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 6.9 (constant V/f
       below base speed).
    """
    _positive("rated voltage", rated_voltage_v)
    _positive("rated frequency", rated_frequency_hz)
    return rated_voltage_v / rated_frequency_hz


def field_weakening_frequency_hz(rated_voltage_v: float, rated_frequency_hz: float,
                                 max_output_voltage_v: float) -> float:
    """Frequency above which the drive's output voltage is capped [Hz].

    f_fw = f_rated x V_max / V_rated, where V_max is the most the drive can put out (its input
    voltage). A 460 V 60 Hz motor on a drive fed at 400 V weakens above 52.2 Hz. When
    V_max >= V_rated the motor reaches its rated frequency at full flux (f_fw >= f_rated).

    Parameters
    ----------
    rated_voltage_v : motor rated voltage [V]
    rated_frequency_hz : motor rated frequency [Hz]
    max_output_voltage_v : most the drive can put out, about its input voltage [V]

    References
    ----------
    .. [1] Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 6.9: above base speed the
       voltage is held and the flux falls as 1/f.
    """
    _positive("maximum output voltage", max_output_voltage_v)
    return max_output_voltage_v / volts_per_hertz(rated_voltage_v, rated_frequency_hz)


def kept_output(frequency_hz: float, rated_voltage_v: float, rated_frequency_hz: float,
                max_output_voltage_v: float) -> tuple[float, float]:
    """Torque and power the motor keeps at ``frequency_hz`` on the drive, per unit of rated.

    At rated current: torque = min(1, f_fw / f), power = torque x f / f_rated, both capped at
    1 (f_fw from :func:`field_weakening_frequency_hz`). Cooling at low speed (shaft fan) and
    the breakdown torque, which falls as (f_fw / f)^2 in field weakening, are further limits
    not counted here.

    Parameters
    ----------
    frequency_hz : output frequency [Hz]
    rated_voltage_v : motor rated voltage [V]
    rated_frequency_hz : motor rated frequency [Hz]
    max_output_voltage_v : most the drive can put out [V]

    Returns
    -------
    tuple[float, float] : (torque, power) per unit of the motor's rated torque and output

    References
    ----------
    .. [1] Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 6.9 (constant torque below
       base speed, constant power above).
    """
    _positive("frequency", frequency_hz)
    f_fw = field_weakening_frequency_hz(rated_voltage_v, rated_frequency_hz, max_output_voltage_v)
    torque = min(1.0, f_fw / frequency_hz)
    power = min(1.0, torque * frequency_hz / rated_frequency_hz)
    return torque, power
