"""The path from the site's source to the machine's terminals: the source and feeder as
impedances, and the running voltage drop that sets the terminal voltage.

Formulas are in :mod:`machinecheck.physics.source` and :mod:`machinecheck.physics.feeder`;
nothing is invented: no source or cable the user did not give.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..errors import DomainError
from ..model import Machine, Site
from ..physics import current as current_physics
from ..physics import feeder as feeder_physics
from ..physics import source as source_physics
from ..physics.supply_constants import ANNEX_G_REACTANCE_OHM_PER_M, RUNNING_DROP_LIMIT
from .assessment import RatingChoice

#: Conductor temperature at which a table cable's resistance is taken [degC]: the NEC table's
#: own 75 degC for AWG/kcmil sizes, 70 degC (PVC insulation at full load) for mm2 sizes
#: (common practice, no published source).
TABLE_TEMPERATURE_DEGC = {"NEC": 75.0, "IEC": 70.0}


@dataclass(frozen=True, slots=True)
class SourcePath:
    """The site's source as an impedance at the supply voltage [ohm], with its short-circuit
    power [VA] and a description for people."""

    kind: str
    impedance_ohm: complex
    short_circuit_power_va: float
    description: str


@dataclass(frozen=True, slots=True)
class FeederPath:
    """The cable from the bus to the terminals: one phase's impedance [ohm] and its basis.

    ``impedance_ohm`` is at the service temperature (drop, dip); ``cold_impedance_ohm`` with a
    table conductor's resistance at 20 degC, for the largest fault current (IEC 60909-0; a
    resistance given per length is used as given).
    """

    impedance_ohm: complex
    length_m: float
    parallel: int
    basis: str
    cold_impedance_ohm: complex = 0j


@dataclass(frozen=True, slots=True)
class RunningDrop:
    """Running voltage drop of the feeder at the nameplate current and power factor.

    ``bus_voltage_v`` is the voltage offered at the bus, ``terminal_voltage_v`` what reaches
    the terminals; ``drop`` = 1 - terminal / bus; ``limit`` the site's, or the common-practice
    default (``limit_is_default``).
    """

    feeder: FeederPath
    current_a: float
    power_factor: float
    bus_voltage_v: float
    terminal_voltage_v: float
    drop: float
    limit: float
    limit_is_default: bool


def source_path(site: Site, voltage_v: float) -> SourcePath | None:
    """The site's source referred to ``voltage_v`` (line to line), or None when none is given.

    utility: S_sc from the short-circuit power or the fault current; transformer: its own
    impedance z U^2 / S_T plus the upstream level when given; generator: X''_d U^2 / S_G.
    X/R defaults to a pure reactance when not given (the larger dip magnitude for the kVA
    form is the same; the angle matters only in the divider).
    """
    s = site.supply_source
    if s is None:
        return None
    xr = s.x_over_r if s.x_over_r is not None else math.inf
    if s.kind == "utility":
        s_sc = s.short_circuit_power_va
        if s_sc is None and s.fault_current_a is not None:
            s_sc = source_physics.short_circuit_power_from_current(s.fault_current_a, voltage_v)
        if s_sc is None:
            raise DomainError("a utility source needs its short_circuit_power or fault_current")
        z = source_physics.impedance_from_short_circuit_power(s_sc, voltage_v, xr)
        return SourcePath("utility", z, source_physics.short_circuit_power(z, voltage_v),
                          f"utility {s_sc / 1e6:.4g} MVA")
    if s.kind == "transformer":
        if s.rating_va is None or s.impedance is None:
            raise DomainError("a transformer source needs its rating and impedance")
        z = source_physics.transformer_impedance(s.rating_va, s.impedance, voltage_v, xr)
        upstream = ""
        if s.short_circuit_power_va is not None:
            z += source_physics.impedance_from_short_circuit_power(
                s.short_circuit_power_va, voltage_v, xr)
            upstream = f" on {s.short_circuit_power_va / 1e6:.4g} MVA upstream"
        return SourcePath("transformer", z, source_physics.short_circuit_power(z, voltage_v),
                          f"transformer {s.rating_va / 1e3:.4g} kVA {100 * s.impedance:.4g} %"
                          f"{upstream}")
    if s.rating_va is None or s.subtransient_reactance is None:
        raise DomainError("a generator source needs its rating and subtransient_reactance")
    z = source_physics.generator_impedance(s.rating_va, s.subtransient_reactance, voltage_v, xr)
    return SourcePath("generator", z, source_physics.short_circuit_power(z, voltage_v),
                      f"generator {s.rating_va / 1e3:.4g} kVA X''d "
                      f"{100 * s.subtransient_reactance:.4g} %")


def feeder_path(machine: Machine, site: Site) -> FeederPath | None:
    """The machine's feeder as one phase's impedance, or None when no feeder is given.

    R and X per length as given, else from the cable table at the table temperature
    (TABLE_TEMPERATURE_DEGC) and the site frequency; a given R with no X takes the table's X
    when the size is known, else the IEC 60364-5-52 Annex G default (said in the basis).
    """
    f = machine.feeder
    if f is None:
        return None
    size = f.size_marked
    table: feeder_physics.Conductor | None = None
    r_cold: float | None = None
    if size:
        nec = not feeder_physics.normalise_size(size).endswith("mm2")
        temperature = TABLE_TEMPERATURE_DEGC["NEC" if nec else "IEC"]
        table = feeder_physics.conductor(size, f.material, temperature, site.frequency_hz)
        r_cold = feeder_physics.conductor(size, f.material, 20.0,
                                          site.frequency_hz).resistance_ohm_per_m
    if f.resistance_ohm_per_m is not None:
        r = f.resistance_ohm_per_m
        if f.reactance_ohm_per_m is not None:
            x, basis = f.reactance_ohm_per_m, "R and X as given"
        elif table is not None:
            x, basis = table.reactance_ohm_per_m, f"R as given, X from {table.source}"
        else:
            x = ANNEX_G_REACTANCE_OHM_PER_M
            basis = "R as given, X 0.08 mohm/m (IEC 60364-5-52 Annex G default)"
    else:
        assert table is not None  # the catalog asks for a size or a resistance
        r = table.resistance_ohm_per_m
        x = f.reactance_ohm_per_m if f.reactance_ohm_per_m is not None \
            else table.reactance_ohm_per_m
        basis = (f"{size} {f.material} from {table.source} at {table.temperature_degc:g} degC"
                 + (", X 0.08 mohm/m (Annex G default)" if table.reactance_is_default else ""))
    z = feeder_physics.feeder_impedance(r, x, f.length_m, f.parallel)
    cold = z if f.resistance_ohm_per_m is not None or r_cold is None else \
        feeder_physics.feeder_impedance(r_cold, x, f.length_m, f.parallel)
    return FeederPath(z, f.length_m, f.parallel, basis, cold)


def terminal_drop(machine: Machine, site: Site, choice: RatingChoice,
                  bus_voltage_v: float) -> RunningDrop | None:
    """The feeder's running drop at the nameplate current and rated power factor.

    None without a feeder, for a generator, or when the plate lacks the current or the power
    factor (nothing is guessed). The current is the nameplate current moved to the bus voltage
    at the same load (I x U_rated / U), the design current of common practice.
    """
    if machine.is_generator or (machine.phases != 1 and site.phases != machine.phases):
        return None  # a generator's cable, or a machine that cannot be connected here
    feeder = feeder_path(machine, site)
    if feeder is None:
        return None
    c, rating = choice.connection, choice.rating
    if c.current_a is None or rating.power_factor is None:
        return None
    current = current_physics.current_at_site(c.current_a, choice.rated_voltage_v,
                                              bus_voltage_v)
    phases = 3 if machine.phases == 3 else 1
    terminal = feeder_physics.terminal_voltage(bus_voltage_v, current, rating.power_factor,
                                               feeder.impedance_ohm, phases)
    limits = site.limits
    limit = None if limits is None else limits.running_voltage_drop
    drop = math.inf if math.isnan(terminal) else 1.0 - terminal / bus_voltage_v
    return RunningDrop(feeder, current, rating.power_factor, bus_voltage_v,
                       0.0 if math.isnan(terminal) else terminal, drop,
                       RUNNING_DROP_LIMIT if limit is None else limit, limit is None)
