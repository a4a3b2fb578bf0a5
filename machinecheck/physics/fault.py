"""Available three-phase fault current at the motor's equipment, from the source and feeder
impedances, plain (c = 1) or by IEC 60909-0 (voltage factor c and transformer correction K_T).

The result is compared with the equipment's short-circuit current rating (NFPA 70 110.10,
430.8) by the caller; this module only computes the current.
"""

from __future__ import annotations

from ..errors import DomainError
from .supply_constants import SQRT3

#: IEC 60909-0 Table 1, voltage factor c by edition and voltage level:
#: (c_max LV +6 % tolerance, c_max LV +10 % tolerance, c_min LV, c_max MV/HV, c_min MV/HV).
#: 2016 (LV 1.05/1.10, c_min 0.95; MV 1.10, 1.00) and 2001 the same, from memory: not re-read
#: in the standard's text. 1988 (from memory): LV c_max 1.00 for 230/400 V systems
#: and 1.05 for other LV systems, c_min 0.95; MV 1.10 / 1.00.
VOLTAGE_FACTORS: dict[str, tuple[float, float, float, float, float]] = {
    "2016": (1.05, 1.10, 0.95, 1.10, 1.00),
    "2001": (1.05, 1.10, 0.95, 1.10, 1.00),
}
VOLTAGE_FACTORS_1988_LV_230_400 = 1.00
EDITIONS = ("1988", "2001", "2016")
#: Upper limit of low voltage in IEC 60909-0 Table 1 [V].
LOW_VOLTAGE_LIMIT_V = 1000.0


def voltage_factor(nominal_voltage_v: float, *, maximum: bool = True,
                   voltage_tolerance: float = 0.10, edition: str = "2016") -> float:
    """IEC 60909-0 voltage factor c for the maximum or minimum short-circuit current [-].

    Parameters
    ----------
    nominal_voltage_v : nominal system voltage U_n, line to line [V]
    maximum : True for c_max (equipment ratings), False for c_min (protection sensitivity)
    voltage_tolerance : the system's upper voltage tolerance at LV [-]: 0.06 or 0.10
    edition : '1988', '2001' or '2016'

    References
    ----------
    .. [1] IEC 60909-0:2016, Table 1 (c_max 1.05 for LV systems with +6 % tolerance, 1.10 for
       +10 %; c_min 0.95; above 1 kV c_max 1.10, c_min 1.00).
    .. [2] IEC 60909-0:2001, Table 1; IEC 60909:1988, Table I (from memory: LV 230/400 V
       c_max 1.00, other LV 1.05).
    """
    if not nominal_voltage_v > 0:
        raise DomainError(f"nominal voltage must be positive, got {nominal_voltage_v!r}")
    if edition not in EDITIONS:
        raise DomainError(f"IEC 60909 edition must be one of {', '.join(EDITIONS)}, "
                          f"got {edition!r}")
    low = nominal_voltage_v <= LOW_VOLTAGE_LIMIT_V
    if edition == "1988":
        if not low:
            return 1.10 if maximum else 1.00
        if not maximum:
            return 0.95
        return VOLTAGE_FACTORS_1988_LV_230_400 if abs(nominal_voltage_v - 400.0) < 1.0 else 1.05
    lv6, lv10, lv_min, mv_max, mv_min = VOLTAGE_FACTORS[edition]
    if not low:
        return mv_max if maximum else mv_min
    if not maximum:
        return lv_min
    if voltage_tolerance <= 0.06:
        return lv6
    if voltage_tolerance <= 0.10:
        return lv10
    raise DomainError(f"IEC 60909 gives no c for an LV tolerance of {voltage_tolerance:.0%}")


def transformer_correction(reactance_pu: float, c_max: float) -> float:
    """Impedance correction factor K_T of a network transformer [-]:
    K_T = 0.95 c_max / (1 + 0.6 x_T).

    Parameters
    ----------
    reactance_pu : x_T = X_T / (U_rT^2 / S_rT), the transformer's relative reactance [-]
    c_max : voltage factor of the LV side [-]

    References
    ----------
    .. [1] IEC 60909-0:2016, 6.3.3 eq. (12a) (also 2001 eq. (12a)).
    """
    if not (reactance_pu >= 0 and c_max > 0):
        raise DomainError("reactance must not be negative and c must be positive")
    return 0.95 * c_max / (1.0 + 0.6 * reactance_pu)


def fault_current(voltage_v: float, impedance_ohm: complex, voltage_factor_: float = 1.0) -> float:
    """Initial symmetrical three-phase fault current [A]: I_k'' = c U_n / (sqrt(3) |Z_k|).

    Parameters
    ----------
    voltage_v : nominal line-to-line voltage at the fault [V]
    impedance_ohm : total positive-sequence impedance to the fault, per phase [ohm]
    voltage_factor_ : c [-]; 1.0 for the plain (infinite-bus style) figure

    References
    ----------
    .. [1] IEC 60909-0:2016, 7.1.1 eq. (29).
    """
    if not (voltage_v > 0 and voltage_factor_ > 0):
        raise DomainError("voltage and voltage factor must be positive")
    magnitude = abs(impedance_ohm)
    if magnitude == 0.0:
        raise DomainError("impedance to the fault must not be zero")
    return voltage_factor_ * voltage_v / (SQRT3 * magnitude)


def fault_current_at_motor(voltage_v: float, source_ohm: complex, feeder_ohm: complex,
                           voltage_factor_: float = 1.0) -> float:
    """Available fault current at the motor's equipment, through the feeder [A].

    I_k'' = c U_n / (sqrt(3) |Z_source + Z_feeder|); motor contribution left out.

    References
    ----------
    .. [1] IEC 60909-0:2016, 7.1.1 eq. (29); NFPA 70 110.10 and 430.8 (the equipment's
       short-circuit current rating to compare with).
    """
    return fault_current(voltage_v, source_ohm + feeder_ohm, voltage_factor_)
