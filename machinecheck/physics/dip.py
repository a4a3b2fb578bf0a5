"""Motor starting on a weak supply: starting kVA, voltage dip, torque at the dipped voltage,
and the smallest transformer or generator set that keeps the dip within a limit.

Two forms of the dip are given and named apart:

* the kVA (magnitude) form, dip = S_start / (S_start + S_sc): the source and the motor's
  locked-rotor impedance taken in phase, a first estimate that slightly overstates the dip
  when their angles differ;
* the impedance divider with complex source, feeder and motor impedances, where R and X are
  known.

Some guides use the cruder dip = S_start / S_sc, which is larger; it is not used here.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..errors import DomainError
from .supply_constants import SQRT3

START_METHODS = ("direct-on-line", "star-delta", "autotransformer", "primary-reactor",
                 "soft-starter", "drive")


@dataclass(frozen=True, slots=True)
class StartReduction:
    """Line current and torque of a starting method relative to a direct-on-line start at the
    same supply voltage [-]. ``estimate`` marks the ideal figures of common practice."""

    current_factor: float
    torque_factor: float
    estimate: bool = True


@dataclass(frozen=True, slots=True)
class Dip:
    """Voltage dip at the source bus and at the motor terminals, per unit of the pre-start
    voltage [-]."""

    bus: float
    terminals: float


def locked_rotor_apparent_power(voltage_v: float, locked_rotor_current_a: float,
                                phases: int = 3) -> float:
    """Locked-rotor (starting) apparent power at rated voltage [VA]: sqrt(3) U I_LR, or U I_LR.

    Parameters
    ----------
    voltage_v : rated line-to-line voltage [V]
    locked_rotor_current_a : locked-rotor line current at that voltage [A]
    phases : 3 or 1

    References
    ----------
    .. [1] NEMA MG 1 10.37.2 (code letter: kVA/hp = sqrt(3) U I_LR / (1000 hp)); NFPA 70
       Table 430.7(B).
    """
    if not (voltage_v > 0 and locked_rotor_current_a > 0):
        raise DomainError("voltage and locked-rotor current must be positive")
    if phases not in (1, 3):
        raise DomainError(f"phases must be 1 or 3, got {phases!r}")
    return (SQRT3 if phases == 3 else 1.0) * voltage_v * locked_rotor_current_a


def start_reduction(method: str, *, tap: float | None = None,
                    current_limit_ratio: float | None = None,
                    locked_rotor_current_ratio: float | None = None,
                    locked_rotor_torque_ratio: float | None = None) -> StartReduction:
    """Starting line current and torque relative to direct on line, by starting method [-].

    direct-on-line: 1, 1. star-delta: 1/3, 1/3. autotransformer at tap k: k^2, k^2.
    primary resistor or reactor leaving a voltage fraction k: k, k^2. soft starter limiting the
    current to I_lim: I_lim / I_LR, (I_lim / I_LR)^2. drive: about rated current, rated torque:
    I_r / I_LR and T_r / T_LR.

    Parameters
    ----------
    method : one of START_METHODS
    tap : autotransformer tap, or voltage fraction of a primary reactor [-], 0 < k <= 1
    current_limit_ratio : soft starter's current limit per unit of rated current [-]
    locked_rotor_current_ratio : I_LR / I_r [-] (soft starter, drive)
    locked_rotor_torque_ratio : T_LR / T_r [-] (drive)

    Returns
    -------
    StartReduction : ideal factors (magnetising current and the starter's own losses left out)

    References
    ----------
    .. [1] IEEE Std 3002.7-2018, Recommended Practice for Conducting Motor-Starting Studies,
       clause on reduced-voltage starting methods (current and torque by method).
    .. [2] Common practice (ideal factors; the soft-starter torque (I/I_LR)^2 and the drive's
       rated current and torque are typical, not guaranteed).
    """
    key = method.strip().lower()
    if key == "direct-on-line":
        return StartReduction(1.0, 1.0, estimate=False)
    if key == "star-delta":
        return StartReduction(1.0 / 3.0, 1.0 / 3.0)
    if key in ("autotransformer", "primary-reactor"):
        if tap is None or not 0.0 < tap <= 1.0:
            raise DomainError(f"{key} start needs a tap (voltage fraction) within 0 to 1, "
                              f"got {tap!r}")
        return StartReduction(tap * tap if key == "autotransformer" else tap, tap * tap)
    if key == "soft-starter":
        if current_limit_ratio is None or locked_rotor_current_ratio is None:
            raise DomainError("soft-starter start needs the current limit and the "
                              "locked-rotor current, each per unit of rated current")
        if not 0.0 < current_limit_ratio <= locked_rotor_current_ratio:
            raise DomainError("soft-starter current limit must be positive and not above the "
                              "locked-rotor current")
        ratio = current_limit_ratio / locked_rotor_current_ratio
        return StartReduction(ratio, ratio * ratio)
    if key == "drive":
        if locked_rotor_current_ratio is None or locked_rotor_torque_ratio is None:
            raise DomainError("drive start needs the locked-rotor current and torque, each per "
                              "unit of rated")
        if not (locked_rotor_current_ratio > 0 and locked_rotor_torque_ratio > 0):
            raise DomainError("locked-rotor current and torque ratios must be positive")
        return StartReduction(1.0 / locked_rotor_current_ratio, 1.0 / locked_rotor_torque_ratio)
    raise DomainError(f"starting method must be one of {', '.join(START_METHODS)}, "
                      f"got {method!r}")


def dip_from_powers(starting_va: float, short_circuit_power_va: float) -> float:
    """Voltage dip, kVA (magnitude) form [-]: dip = S_start / (S_start + S_sc).

    The source (S_sc) and the motor at standstill (S_start at rated voltage) form a divider;
    taking both impedances in phase gives this first estimate.

    Parameters
    ----------
    starting_va : starting apparent power at rated voltage, after the starting method [VA]
    short_circuit_power_va : short-circuit power of the source at the point [VA]; inf for a
        stiff supply

    References
    ----------
    .. [1] IEEE Std 399-1997 (Brown Book), ch. 9, the impedance (voltage-divider) method.
    """
    if not (starting_va > 0 and short_circuit_power_va > 0):
        raise DomainError("starting power and short-circuit power must be positive")
    if math.isinf(short_circuit_power_va):
        return 0.0
    return starting_va / (starting_va + short_circuit_power_va)


def generator_dip(rating_va: float, subtransient_reactance_pu: float,
                  starting_va: float) -> float:
    """Voltage dip of a generator set starting a motor [-], subtransient estimate.

    dip = x''_d S_start / (S_G + x''_d S_start), the kVA form with S_sc = S_G / x''_d;
    regulator recovery is left out (common practice for the initial dip).

    Parameters
    ----------
    rating_va : generator rating [VA]
    subtransient_reactance_pu : x''_d on the generator base [-]
    starting_va : starting kVA of the motor [VA]

    References
    ----------
    .. [1] IEEE Std 399-1997 (Brown Book), ch. 9: generator represented by X''_d.
    """
    if not (rating_va > 0 and subtransient_reactance_pu > 0):
        raise DomainError("generator rating and subtransient reactance must be positive")
    return dip_from_powers(starting_va, rating_va / subtransient_reactance_pu)


def locked_rotor_impedance(voltage_v: float, locked_rotor_current_a: float,
                           locked_rotor_power_factor: float) -> complex:
    """Motor's standstill impedance per phase (star equivalent) [ohm].

    |Z_LR| = U / (sqrt(3) I_LR) at angle arccos(PF_LR).

    References
    ----------
    .. [1] IEEE Std 399-1997 (Brown Book), ch. 9: the motor as a constant impedance at
       locked rotor.
    """
    if not (voltage_v > 0 and locked_rotor_current_a > 0):
        raise DomainError("voltage and locked-rotor current must be positive")
    if not 0.0 < locked_rotor_power_factor <= 1.0:
        raise DomainError(f"locked-rotor power factor must be within 0 to 1, "
                          f"got {locked_rotor_power_factor!r}")
    magnitude = voltage_v / (SQRT3 * locked_rotor_current_a)
    sin_phi = math.sqrt(1.0 - locked_rotor_power_factor ** 2)
    return complex(magnitude * locked_rotor_power_factor, magnitude * sin_phi)


def dip_divider(source_ohm: complex, feeder_ohm: complex, motor_ohm: complex) -> Dip:
    """Voltage dip at the bus and at the terminals by the complex impedance divider [-].

    With the source voltage E behind Z_s (pre-start bus voltage = E, no other load):
    V_bus = E (Z_f + Z_m) / (Z_s + Z_f + Z_m), V_term = E Z_m / (Z_s + Z_f + Z_m);
    the dips are 1 - |V| / E. The terminal dip includes the feeder's drop.

    Parameters
    ----------
    source_ohm : source impedance per phase [ohm]
    feeder_ohm : feeder impedance per phase [ohm]
    motor_ohm : motor's starting impedance per phase, after the starting method [ohm]

    References
    ----------
    .. [1] IEEE Std 399-1997 (Brown Book), ch. 9, impedance method.
    """
    if abs(motor_ohm) == 0.0:
        raise DomainError("motor impedance must not be zero")
    total = source_ohm + feeder_ohm + motor_ohm
    return Dip(1.0 - abs((feeder_ohm + motor_ohm) / total), 1.0 - abs(motor_ohm / total))


def torque_at_voltage(torque_nm: float, voltage_ratio: float) -> float:
    """Induction-motor torque at a reduced voltage [N m]: T = T_rated_voltage (U / U_r)^2.

    Valid at a given slip with the motor unsaturated (at standstill the leakage paths saturate
    and the torque falls a little less than U^2 at high currents: conservative).

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, 4th ed., sec. 7.5 (T_ind
       proportional to V_TH^2).
    """
    if not voltage_ratio >= 0:
        raise DomainError(f"voltage ratio must not be negative, got {voltage_ratio!r}")
    return torque_nm * voltage_ratio * voltage_ratio


def breakaway_margin(motor_torque_nm: float, load_breakaway_torque_nm: float) -> float:
    """Margin of the motor's starting torque over the load's breakaway torque [-]:
    T_motor / T_breakaway - 1 (common practice asks 10 % or more).

    References
    ----------
    .. [1] Common practice, no published source (supply_constants.BREAKAWAY_TORQUE_MARGIN).
    """
    if not load_breakaway_torque_nm > 0:
        raise DomainError("breakaway torque must be positive")
    return motor_torque_nm / load_breakaway_torque_nm - 1.0


def _required_short_circuit_power(starting_va: float, dip_limit: float) -> float:
    if not starting_va > 0:
        raise DomainError("starting power must be positive")
    if not 0.0 < dip_limit < 1.0:
        raise DomainError(f"dip limit must be within 0 to 1, got {dip_limit!r}")
    return starting_va * (1.0 - dip_limit) / dip_limit


def minimum_transformer_rating(starting_va: float, impedance_pu: float, dip_limit: float,
                               upstream_short_circuit_power_va: float = math.inf) -> float:
    """Smallest transformer rating that keeps the kVA-form dip within a limit [VA].

    dip <= d needs S_sc >= S_start (1 - d) / d; with 1 / S_sc = 1 / S_up + z / S_T this gives
    S_T >= z / (1 / S_sc,req - 1 / S_up). inf when the upstream level alone is too weak.

    Parameters
    ----------
    starting_va : starting kVA after the starting method [VA]
    impedance_pu : transformer impedance u_k / 100 [-]
    dip_limit : allowed dip per unit [-], e.g. 0.15
    upstream_short_circuit_power_va : short-circuit power at the primary [VA]

    References
    ----------
    .. [1] IEEE Std 399-1997 ch. 9 divider inverted for the source (arithmetic).
    """
    if not impedance_pu > 0:
        raise DomainError("transformer impedance must be positive")
    needed = _required_short_circuit_power(starting_va, dip_limit)
    spare = 1.0 / needed - 1.0 / upstream_short_circuit_power_va
    return impedance_pu / spare if spare > 0 else math.inf


def minimum_generator_rating(starting_va: float, subtransient_reactance_pu: float,
                             dip_limit: float) -> float:
    """Smallest generator rating for a given x''_d that keeps the dip within a limit [VA].

    S_G >= x''_d S_start (1 - d) / d (from :func:`generator_dip`).

    References
    ----------
    .. [1] IEEE Std 399-1997 ch. 9 divider inverted for the source (arithmetic).
    """
    if not subtransient_reactance_pu > 0:
        raise DomainError("subtransient reactance must be positive")
    return subtransient_reactance_pu * _required_short_circuit_power(starting_va, dip_limit)


def starting_active_power(starting_va: float, starting_power_factor: float) -> float:
    """Active power drawn at standstill [W]: P = S_start cos phi_LR.

    The generator's prime mover must deliver it (plus the running load) without stalling;
    compare with the prime mover's rating.

    References
    ----------
    .. [1] IEEE Std 3002.7-2018, motor-starting studies: the real power of the starting
       motor loads the prime mover.
    """
    if not (starting_va > 0 and 0.0 < starting_power_factor <= 1.0):
        raise DomainError("starting power must be positive and its power factor within 0 to 1")
    return starting_va * starting_power_factor
