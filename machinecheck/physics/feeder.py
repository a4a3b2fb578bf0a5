"""Feeder (cable) impedance and the running voltage drop from the site bus to the terminals.

Conductor data come from two tables shipped with the package: NFPA 70 Chapter 9 Table 9 (AWG
and kcmil, AC resistance and reactance at 75 degC, 60 Hz, three single conductors in conduit)
and IEC 60228 Table 2 (mm2, maximum DC resistance at 20 degC) with the reactance of
IEC 60364-5-52 Annex G where no other detail is given. Values are per metre of route, per
conductor ("ohm to neutral").
"""

from __future__ import annotations

import functools
import json
import math
import re
from dataclasses import dataclass
from importlib import resources
from typing import Any

from ..errors import DomainError
from .supply_constants import (
    ALPHA20_PER_K,
    ANNEX_G_REACTANCE_OHM_PER_M,
    ANNEX_G_RESISTIVITY_OHM_M,
    KFT_M,
    SQRT3,
)

MATERIALS = ("copper", "aluminium")
CONDUITS = ("pvc", "aluminium", "steel")


@dataclass(frozen=True, slots=True)
class Conductor:
    """AC resistance and reactance of one conductor per metre of route, and their source."""

    resistance_ohm_per_m: float
    reactance_ohm_per_m: float
    temperature_degc: float
    frequency_hz: float
    source: str
    reactance_is_default: bool = False


@functools.lru_cache(maxsize=4)
def load_table(name: str) -> dict[str, Any]:
    """A cable table from machinecheck/data/cables (``name`` without the .json)."""
    text = resources.files("machinecheck").joinpath(f"data/cables/{name}.json").read_text("utf-8")
    table: dict[str, Any] = json.loads(text)
    return table


def normalise_size(size: str) -> str:
    """The table key of a conductor size: '35 mm2', '2 AWG', '1/0 AWG', '250 kcmil'.

    Accepts 'mm2', 'mm^2', 'mm²', 'sq mm'; 'AWG'; 'kcmil', 'MCM'; '2/0', '00'.
    """
    text = size.strip().lower().replace("²", "2").replace("^", "")
    match = re.fullmatch(r"([0-9./]+)\s*(mm2|sq\s*mm|awg|kcmil|mcm)", text)
    if match is None:
        raise DomainError(f"conductor size {size!r}: expected e.g. '35 mm2', '2 AWG', "
                          "'1/0 AWG' or '250 kcmil'")
    number, unit = match.groups()
    if unit in ("mm2", "sq mm") or unit.startswith("sq"):
        return f"{float(number):g} mm2"
    if unit in ("kcmil", "mcm"):
        return f"{float(number):g} kcmil"
    aughts = {"00": "2/0", "000": "3/0", "0000": "4/0", "0": "1/0"}
    return f"{aughts.get(number, number)} AWG"


def _material(material: str) -> str:
    key = material.strip().lower().replace("aluminum", "aluminium")
    if key not in MATERIALS:
        raise DomainError(f"conductor material must be copper or aluminium, got {material!r}")
    return key


def resistance_at_temperature(resistance_ohm: float, from_degc: float, to_degc: float,
                              material: str) -> float:
    """Conductor resistance moved from one temperature to another [ohm].

    R2 = R1 (1 + a20 (t2 - 20)) / (1 + a20 (t1 - 20)), a20 = 0.00393 /K copper, 0.00403 /K
    aluminium. Valid over the conductor's service range (about -20 to 250 degC).

    References
    ----------
    .. [1] IEC 60287-1-1:2006, 2.1.1 and Table 1 (a20 by material).
    .. [2] NFPA 70 Chapter 9 Table 8, note 2: the same law referred to 75 degC, a75 = 0.00323
       copper and 0.00330 aluminium.
    """
    alpha = ALPHA20_PER_K[_material(material)]
    return resistance_ohm * (1.0 + alpha * (to_degc - 20.0)) / (1.0 + alpha * (from_degc - 20.0))


def reactance_at_frequency(reactance_ohm: float, from_hz: float, to_hz: float) -> float:
    """Inductive reactance moved to another frequency [ohm]: X2 = X1 f2 / f1 (60 -> 50 Hz: x 5/6).

    References
    ----------
    .. [1] X = 2 pi f L, the inductance per length being independent of frequency at power
       frequencies (any circuit-theory text).
    """
    if not (from_hz > 0 and to_hz > 0):
        raise DomainError("frequencies must be positive")
    return reactance_ohm * to_hz / from_hz


def nec_table9(size: str, material: str, conduit: str = "pvc") -> Conductor:
    """A conductor of NFPA 70 Chapter 9 Table 9, at 75 degC and 60 Hz, per metre.

    Parameters
    ----------
    size : AWG or kcmil size, e.g. '2 AWG', '4/0 AWG', '250 kcmil'
    material : 'copper' or 'aluminium'
    conduit : 'pvc', 'aluminium' or 'steel'

    References
    ----------
    .. [1] NFPA 70 (NEC 2011), Chapter 9, Table 9: AC resistance and reactance for 600 V
       cables, 3-phase, 60 Hz, 75 degC, three single conductors in conduit (ohm to neutral
       per 1000 ft; converted here at 304.8 m per 1000 ft).
    """
    table = load_table("nec_chapter9_table9")
    key = normalise_size(size)
    row = table["rows"].get(key)
    if row is None:
        raise DomainError(f"size {size!r} is not in NEC Chapter 9 Table 9 (14 AWG to 1000 kcmil)")
    conduit_key = conduit.strip().lower().replace("aluminum", "aluminium")
    if conduit_key not in CONDUITS:
        raise DomainError(f"conduit must be one of {', '.join(CONDUITS)}, got {conduit!r}")
    columns: list[str] = table["columns"]
    xl = row[columns.index("xl_steel" if conduit_key == "steel" else "xl_pvc_aluminium")]
    r = row[columns.index(f"r_{_material(material)}_{conduit_key}")]
    if r is None:
        raise DomainError(f"NEC Chapter 9 Table 9 gives no {material} value for {key}")
    return Conductor(r / KFT_M, xl / KFT_M, float(table["temperature_degc"]),
                     float(table["frequency_hz"]), "NEC Chapter 9 Table 9")


def iec60228(size: str, material: str) -> Conductor:
    """A class 2 conductor of IEC 60228 at 20 degC (DC resistance), with the Annex G reactance.

    The reactance is IEC 60364-5-52 Annex G's figure for when no other detail is known,
    0.08 mohm/m, flagged ``reactance_is_default``; frequency is taken as 50 Hz.

    References
    ----------
    .. [1] IEC 60228:2004, Table 2 (maximum DC resistance of class 2 conductors at 20 degC).
    .. [2] IEC 60364-5-52:2009, Annex G, G.52.1 (reactance 0.08 mohm/m).
    """
    table = load_table("iec60228_class2")
    key = normalise_size(size)
    row = table["rows"].get(key)
    if row is None:
        raise DomainError(f"size {size!r} is not in the IEC 60228 class 2 table "
                          "(1.5 mm2 to 300 mm2)")
    r = row[table["columns"].index("copper_plain" if _material(material) == "copper"
                                   else "aluminium")]
    if r is None:
        raise DomainError(f"IEC 60228 Table 2 gives no aluminium class 2 conductor of {key}")
    return Conductor(r / 1000.0, ANNEX_G_REACTANCE_OHM_PER_M, 20.0, 50.0, "IEC 60228 Table 2",
                     reactance_is_default=True)


def conductor(size: str, material: str, temperature_degc: float, frequency_hz: float,
              conduit: str = "pvc") -> Conductor:
    """Table conductor at a service temperature and frequency, per metre.

    mm2 sizes are read from IEC 60228, AWG and kcmil from NEC Chapter 9 Table 9; the
    resistance is moved to ``temperature_degc`` (e.g. 70 degC PVC, 90 degC XLPE, 75 degC the
    NEC column) and the reactance to ``frequency_hz``. The NEC AC resistance is moved by the
    DC temperature law (skin effect taken as unchanged: an approximation within about 1 % for
    sizes to 500 kcmil).

    Parameters
    ----------
    size : conductor size, e.g. '35 mm2', '2 AWG', '250 kcmil'
    material : 'copper' or 'aluminium'
    temperature_degc : conductor temperature in service [degC]
    frequency_hz : supply frequency [Hz]
    conduit : for NEC sizes: 'pvc', 'aluminium' or 'steel'

    References
    ----------
    .. [1] See :func:`nec_table9`, :func:`iec60228`, :func:`resistance_at_temperature`.
    """
    base = iec60228(size, material) if normalise_size(size).endswith("mm2") \
        else nec_table9(size, material, conduit)
    return Conductor(
        resistance_at_temperature(base.resistance_ohm_per_m, base.temperature_degc,
                                  temperature_degc, material),
        reactance_at_frequency(base.reactance_ohm_per_m, base.frequency_hz, frequency_hz),
        temperature_degc, frequency_hz, base.source, base.reactance_is_default)


def feeder_impedance(resistance_ohm_per_m: float, reactance_ohm_per_m: float, length_m: float,
                     parallel: int = 1) -> complex:
    """Impedance of one phase of a feeder [ohm]: Z = (R + jX) L / n for n parallel runs.

    Parameters
    ----------
    resistance_ohm_per_m : AC resistance of one conductor per metre [ohm/m]
    reactance_ohm_per_m : reactance per metre [ohm/m]
    length_m : route length [m]
    parallel : conductors in parallel per phase [-]

    References
    ----------
    .. [1] IEC 60364-5-52:2009, Annex G (R and X per length of a conductor).
    """
    if not (resistance_ohm_per_m >= 0 and reactance_ohm_per_m >= 0 and length_m >= 0):
        raise DomainError("feeder resistance, reactance and length must not be negative")
    if parallel < 1:
        raise DomainError(f"parallel runs must be at least 1, got {parallel!r}")
    return complex(resistance_ohm_per_m, reactance_ohm_per_m) * length_m / parallel


def _drop_terms(current_a: float, power_factor: float, impedance_ohm: complex) -> tuple[float, float]:
    """(I (R cos + X sin), I (X cos - R sin)): in-phase and quadrature drop of one conductor."""
    if not 0.0 <= power_factor <= 1.0:
        raise DomainError(f"power factor must be within 0 to 1, got {power_factor!r}")
    if not current_a >= 0:
        raise DomainError(f"current must not be negative, got {current_a!r}")
    sin_phi = math.sqrt(1.0 - power_factor * power_factor)
    r, x = impedance_ohm.real, impedance_ohm.imag
    return (current_a * (r * power_factor + x * sin_phi),
            current_a * (x * power_factor - r * sin_phi))


def _phase_factor(phases: int) -> float:
    if phases == 3:
        return SQRT3
    if phases == 1:
        return 2.0
    raise DomainError(f"phases must be 1 or 3, got {phases!r}")


def voltage_drop(current_a: float, power_factor: float, impedance_ohm: complex,
                 phases: int = 3) -> float:
    """Running voltage drop of a feeder, the usual approximate form [V].

    Three-phase (line-to-line): dU = sqrt(3) I (R cos phi + X sin phi);
    single-phase (two wires, Z per conductor): dU = 2 I (R cos phi + X sin phi).
    Lagging power factor. Within about 1 % of the exact drop while it stays below ~10 %.

    Parameters
    ----------
    current_a : line current [A]
    power_factor : cos phi of the load, lagging [-]
    impedance_ohm : impedance of one conductor of the feeder [ohm]
    phases : 3 or 1

    References
    ----------
    .. [1] IEC 60364-5-52:2009, Annex G, G.52.1: u = b (rho1 L / S cos phi + lambda L sin phi) I_B.
    .. [2] NFPA 70 Chapter 9 Table 9, note 2 (effective Z = R cos theta + X sin theta).
    """
    in_phase, _ = _drop_terms(current_a, power_factor, impedance_ohm)
    return _phase_factor(phases) * in_phase


def terminal_voltage(supply_voltage_v: float, current_a: float, power_factor: float,
                     impedance_ohm: complex, phases: int = 3) -> float:
    """Voltage at the motor terminals for a load current at a power factor, exact phasor form [V].

    With the load's voltage V_r as reference, V_s = V_r + I e^{-j phi} Z k (k = 1 per phase,
    2 for a single-phase loop); writing I e^{-j phi} Z = a + jb,
    V_r = -a + sqrt(V_s^2 - b^2). Line-to-line for three-phase.

    Parameters
    ----------
    supply_voltage_v : voltage at the sending end (the site bus) [V]
    current_a : line current of the load [A]
    power_factor : lagging power factor of the load [-]
    impedance_ohm : impedance of one conductor [ohm]
    phases : 3 or 1

    Returns
    -------
    float : terminal voltage [V]; NaN when no steady state exists (the drop would exceed
        the supply, b > V_s)

    References
    ----------
    .. [1] J. D. Glover, M. S. Sarma, T. J. Overbye, *Power System Analysis and Design*,
       5th ed., sec. 5.1 (short line: V_S = V_R + Z I_R).
    """
    if not supply_voltage_v > 0:
        raise DomainError(f"supply voltage must be positive, got {supply_voltage_v!r}")
    a, b = _drop_terms(current_a, power_factor, impedance_ohm)
    if phases == 3:
        v_s = supply_voltage_v / SQRT3
    else:
        _phase_factor(phases)
        v_s, a, b = supply_voltage_v, 2.0 * a, 2.0 * b
    if abs(b) > v_s:
        return math.nan
    v_r = -a + math.sqrt(v_s * v_s - b * b)
    return v_r * SQRT3 if phases == 3 else v_r


def annex_g_voltage_drop(current_a: float, length_m: float, size_mm2: float, material: str,
                         power_factor: float, phases: int = 3) -> float:
    """Voltage drop by the formula and default data of IEC 60364-5-52 Annex G [V].

    u = b (rho1 L / S cos phi + lambda L sin phi) I_B, b = 1 three-phase (u then being the drop
    line to neutral), b = 2 single-phase; rho1 = 0.0225 ohm mm2/m copper, 0.036 aluminium;
    lambda = 0.08 mohm/m. The relative drop is u / U0 (U0 line to neutral).

    Parameters
    ----------
    current_a : design current I_B [A]
    length_m : route length L [m]
    size_mm2 : conductor cross-section S [mm2]
    material : 'copper' or 'aluminium'
    power_factor : cos phi [-]
    phases : 3 or 1

    References
    ----------
    .. [1] IEC 60364-5-52:2009, Annex G (informative), G.52.1.
    """
    if not size_mm2 > 0:
        raise DomainError(f"cross-section must be positive, got {size_mm2!r}")
    rho = ANNEX_G_RESISTIVITY_OHM_M[_material(material)]
    per_m = complex(rho / (size_mm2 * 1e-6), ANNEX_G_REACTANCE_OHM_PER_M)
    in_phase, _ = _drop_terms(current_a, power_factor, per_m * length_m)
    if phases == 3:
        return in_phase
    _phase_factor(phases)
    return 2.0 * in_phase
