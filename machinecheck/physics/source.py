"""Impedance of the site's source: utility supply, transformer, generator set.

Impedances are complex ohms per phase (star equivalent) referred to the voltage at which the
motor is supplied; short-circuit powers are three-phase [VA]. S_sc = U^2 / |Z| links the two.
"""

from __future__ import annotations

import math

from ..errors import DomainError
from .supply_constants import SQRT3


def _positive(name: str, value: float) -> None:
    if not (value > 0 and math.isfinite(value)):
        raise DomainError(f"{name} must be a positive finite number, got {value!r}")


def split_impedance(magnitude_ohm: float, x_over_r: float) -> complex:
    """Complex impedance from its magnitude and X/R ratio [ohm].

    R = |Z| / sqrt(1 + (X/R)^2); X = R (X/R). ``x_over_r = math.inf`` gives a pure reactance.

    Parameters
    ----------
    magnitude_ohm : |Z| [ohm]
    x_over_r : reactance-to-resistance ratio [-], positive (inf allowed)

    References
    ----------
    .. [1] IEEE Std 551-2006 (Violet Book), ch. 3: source impedance from short-circuit level
       and X/R.
    """
    if not magnitude_ohm >= 0:
        raise DomainError(f"impedance must not be negative, got {magnitude_ohm!r}")
    if not x_over_r > 0:
        raise DomainError(f"X/R must be positive, got {x_over_r!r}")
    if math.isinf(x_over_r):
        return complex(0.0, magnitude_ohm)
    r = magnitude_ohm / math.sqrt(1.0 + x_over_r * x_over_r)
    return complex(r, r * x_over_r)


def short_circuit_power_from_current(fault_current_a: float, voltage_v: float) -> float:
    """Three-phase short-circuit power from a fault current [VA]: S_sc = sqrt(3) U I_k.

    Parameters
    ----------
    fault_current_a : symmetrical three-phase fault current [A]
    voltage_v : line-to-line voltage at which the current is given [V]

    References
    ----------
    .. [1] IEC 60909-0:2016, 3.6 (initial symmetrical short-circuit power S_k'' = sqrt(3) U_n
       I_k'').
    """
    _positive("fault current", fault_current_a)
    _positive("voltage", voltage_v)
    return SQRT3 * voltage_v * fault_current_a


def impedance_from_short_circuit_power(short_circuit_power_va: float, voltage_v: float,
                                       x_over_r: float, voltage_factor: float = 1.0) -> complex:
    """Source impedance behind a short-circuit power [ohm]: |Z| = c U^2 / S_sc.

    Parameters
    ----------
    short_circuit_power_va : three-phase short-circuit power at the point [VA]
    voltage_v : line-to-line voltage the impedance is referred to [V]
    x_over_r : X/R ratio of the source [-] (``math.inf`` for a pure reactance)
    voltage_factor : IEC 60909 voltage factor c [-]; 1.0 for the plain U^2 / S form

    References
    ----------
    .. [1] IEC 60909-0:2016, 6.2 eq. (5): Z_Q = c U_nQ^2 / S_kQ'' for a network feeder.
    """
    _positive("short-circuit power", short_circuit_power_va)
    _positive("voltage", voltage_v)
    _positive("voltage factor", voltage_factor)
    return split_impedance(voltage_factor * voltage_v * voltage_v / short_circuit_power_va,
                           x_over_r)


def transformer_short_circuit_power(rating_va: float, impedance_pu: float,
                                    upstream_short_circuit_power_va: float = math.inf) -> float:
    """Short-circuit power at a transformer's secondary [VA].

    S_sc = S_T / z (infinite upstream); with a finite upstream level the impedances add:
    1 / S_sc = 1 / S_up + z / S_T (magnitudes, a first estimate that ignores the angles).

    Parameters
    ----------
    rating_va : transformer rating S_T [VA]
    impedance_pu : short-circuit impedance z = u_k / 100 [-], e.g. 0.0575
    upstream_short_circuit_power_va : short-circuit power at the primary [VA]; inf for a stiff
        supply

    References
    ----------
    .. [1] IEEE Std 141-1993 (Red Book), ch. 4: the per-unit method; a 1000 kVA, 5.75 %
       transformer on an infinite bus gives 17 391 kVA (arithmetic).
    """
    _positive("transformer rating", rating_va)
    _positive("transformer impedance", impedance_pu)
    if not upstream_short_circuit_power_va > 0:
        raise DomainError("upstream short-circuit power must be positive (inf for a stiff supply)")
    return 1.0 / (1.0 / upstream_short_circuit_power_va + impedance_pu / rating_va)


def transformer_impedance(rating_va: float, impedance_pu: float, voltage_v: float,
                          x_over_r: float) -> complex:
    """Transformer short-circuit impedance referred to ``voltage_v`` [ohm]: Z = z U^2 / S_T.

    Parameters
    ----------
    rating_va : rating S_T [VA]
    impedance_pu : u_k / 100 [-]
    voltage_v : line-to-line voltage of the side the impedance is referred to [V]
    x_over_r : X/R of the transformer [-] (``math.inf`` for a pure reactance)

    References
    ----------
    .. [1] IEC 60909-0:2016, 6.3.1 eq. (7): Z_T = u_kr U_rT^2 / (100 % S_rT).
    """
    _positive("transformer rating", rating_va)
    _positive("transformer impedance", impedance_pu)
    _positive("voltage", voltage_v)
    return split_impedance(impedance_pu * voltage_v * voltage_v / rating_va, x_over_r)


def generator_short_circuit_power(rating_va: float, subtransient_reactance_pu: float) -> float:
    """Generator set's subtransient short-circuit power [VA]: S_sc = S_G / x''_d.

    The usual first estimate of the source a motor start sees; the voltage regulator's
    recovery is not modelled (common practice).

    Parameters
    ----------
    rating_va : generator rating S_G [VA]
    subtransient_reactance_pu : X''_d on the generator's own base [-], e.g. 0.15

    References
    ----------
    .. [1] IEEE Std 399-1997 (Brown Book), ch. 9 (motor-starting studies): the generator
       represented by its subtransient reactance behind the internal voltage.
    """
    _positive("generator rating", rating_va)
    _positive("subtransient reactance", subtransient_reactance_pu)
    return rating_va / subtransient_reactance_pu


def generator_impedance(rating_va: float, subtransient_reactance_pu: float, voltage_v: float,
                        x_over_r: float) -> complex:
    """Generator's subtransient impedance referred to ``voltage_v`` [ohm]: X''_d U^2 / S_G.

    Parameters
    ----------
    rating_va : generator rating [VA]
    subtransient_reactance_pu : X''_d [-]
    voltage_v : line-to-line voltage [V]
    x_over_r : X''_d / R_G [-] (``math.inf`` for a pure reactance)

    References
    ----------
    .. [1] IEC 60909-0:2016, 6.6.1: Z_G = R_G + j X''_d with X''_d = x''_d U_rG^2 / S_rG.
    """
    _positive("voltage", voltage_v)
    _positive("generator rating", rating_va)
    _positive("subtransient reactance", subtransient_reactance_pu)
    reactance = subtransient_reactance_pu * voltage_v * voltage_v / rating_va
    if math.isinf(x_over_r):
        return complex(0.0, reactance)
    if not x_over_r > 0:
        raise DomainError(f"X/R must be positive, got {x_over_r!r}")
    return complex(reactance / x_over_r, reactance)


def short_circuit_power(impedance_ohm: complex, voltage_v: float) -> float:
    """Three-phase short-circuit power behind an impedance [VA]: S_sc = U^2 / |Z|.

    References
    ----------
    .. [1] IEC 60909-0:2016, 3.6 with I_k'' = U / (sqrt(3) |Z|) and c = 1.
    """
    _positive("voltage", voltage_v)
    magnitude = abs(impedance_ohm)
    if magnitude == 0.0:
        return math.inf
    return voltage_v * voltage_v / magnitude
