"""Line current of a machine from its power, voltage, efficiency and power factor."""

from __future__ import annotations

import math

from ..errors import DomainError

SQRT3 = math.sqrt(3.0)


def _phase_factor(phases: int) -> float:
    if phases == 3:
        return SQRT3
    if phases == 1:
        return 1.0
    if phases == 2:
        return 2.0  # two-phase: two windings each carrying half the power at phase voltage
    raise DomainError(f"phases must be 1, 2 or 3, got {phases!r}")


def full_load_current(power_w: float, voltage_v: float, efficiency: float,
                      power_factor: float, phases: int = 3) -> float:
    """Full-load line current of a motor from its shaft output.

    I = P_out / (sqrt(3) V_LL eta PF) three-phase;  I = P_out / (V eta PF) single-phase.

    Parameters
    ----------
    power_w : rated shaft output [W]
    voltage_v : line-to-line voltage (the winding voltage for single-phase) [V]
    efficiency : full-load efficiency, 0 < eta <= 1 [-]
    power_factor : full-load power factor, 0 < PF <= 1 [-]
    phases : 1, 2 or 3

    Returns
    -------
    float : line current [A]

    References
    ----------
    .. [1] Any power-systems text; the relation behind NFPA 70 Table 430.250 estimates.
       Worked value (common practice): 22 kW, 400 V, eta 0.92, PF 0.85 -> 40.6 A.
    """
    for name, value in (("efficiency", efficiency), ("power factor", power_factor)):
        if not (0 < value <= 1):
            raise DomainError(f"{name} must be in (0, 1], got {value!r}")
    if not voltage_v > 0:
        raise DomainError(f"voltage must be positive, got {voltage_v!r} V")
    if power_w < 0:
        raise DomainError(f"power must not be negative, got {power_w!r} W")
    return power_w / (_phase_factor(phases) * voltage_v * efficiency * power_factor)


def apparent_power_current(apparent_power_va: float, voltage_v: float, phases: int = 3) -> float:
    """Line current from apparent power: I = S / (sqrt(3) V_LL) three-phase, S / V single-phase.

    References
    ----------
    .. [1] Definition of three-phase apparent power, S = sqrt(3) V_LL I_L.
       Worked value: 500 kVA at 400 V -> 721.7 A.
    """
    if not voltage_v > 0:
        raise DomainError(f"voltage must be positive, got {voltage_v!r} V")
    return apparent_power_va / (_phase_factor(phases) * voltage_v)


def current_at_site(rated_current_a: float, rated_voltage_v: float, site_voltage_v: float,
                    power_ratio: float = 1.0) -> float:
    """Line current at another voltage for a given output, to first order.

    I_site = I_rated * (P / P_rated) * (V_rated / V_site): the input kVA follows the output.
    Near rated flux only: overfluxing raises the magnetising current above this estimate.

    References
    ----------
    .. [1] Common practice (I ~ I_rated V_rated / V at the same load), e.g. NEMA MG 1 12.44
       commentary: a 230 V motor at 208 V draws about 10 % more current.
    """
    if not (site_voltage_v > 0 and rated_voltage_v > 0):
        raise DomainError("voltages must be positive")
    return rated_current_a * power_ratio * rated_voltage_v / site_voltage_v
