"""Remedies on the supply side: reconnection, transformer, buck-boost and drive.

Each builder returns the remedy's sizes and cautions and the changed machine and site it is
re-checked on; :mod:`.` feeds them back through the pipeline.
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Iterator

from ...model import Machine, Rating, Site, Start
from ...physics import buck_boost as bb
from ...physics import drive as vfd
from ...physics import transformer_sizing as ts
from ..assessment import Assessment

#: A candidate before its re-check: kind, action, figures, cautions, changes, machine, site.
Candidate = tuple[str, str, tuple[tuple[str, float], ...], tuple[str, ...], int, Machine, Site]

AUTOTRANSFORMER_CAUTIONS = (
    "autotransformer: NEC 210.9 (branch circuits) and 215.11 (feeders) limit circuits derived "
    "from autotransformers; NEC 450.4 for autotransformers of 600 V and less; the grounded "
    "conductor stays common to input and output",
)
DRIVE_DUTY_CAUTION = (
    "the plate does not say whether the motor is rated for drive duty: ask the maker "
    "(insulation and bearing currents: NEMA MG 1 Parts 30 and 31, IEC TS 60034-25, "
    "IEC 60034-18-41)")


def single_connection(machine: Machine, rating: Rating, index: int) -> Machine:
    """The machine with one rating set and one of its connections only."""
    lrc = rating.locked_rotor_current_a
    if lrc is not None and len(lrc) == len(rating.connections) and len(lrc) > 1:
        lrc = (lrc[index],)
    kept = dataclasses.replace(rating, connections=(rating.connections[index],),
                               locked_rotor_current_a=lrc)
    return dataclasses.replace(machine, ratings=(kept,))


def scaled_site(site: Site, factor: float) -> Site:
    """The site with every voltage scaled by ``factor`` (a transformer's ratio, inverted)."""
    rng = site.voltage_range_v
    lines = site.line_voltages_v
    return dataclasses.replace(
        site, voltage_v=site.voltage_v * factor,
        voltage_range_v=None if rng is None else (rng[0] * factor, rng[1] * factor),
        line_voltages_v=None if lines is None else (lines[0] * factor, lines[1] * factor,
                                                    lines[2] * factor))


def reconnection(a: Assessment) -> Iterator[Candidate]:
    """The plate's connection the engine chose, stated as a remedy, when the plate has others."""
    connections = [c for r in a.machine.ratings for c in r.connections]
    if len(connections) < 2:
        return
    c = a.choice.connection
    name = c.name or "as stamped"
    yield ("reconnection",
           f"connect the winding {name} for {a.choice.rated_voltage_v:.0f} V "
           f"({a.choice.rating.frequency_hz:g} Hz rating set)",
           (("rated_voltage_v", a.choice.rated_voltage_v),
            ("terminal_voltage_v", a.supply.terminal_voltage_v)),
           ("check the connection diagram inside the terminal box before changing links",), 1,
           a.machine, a.site)


def bus_target_v(a: Assessment) -> float:
    """Site bus voltage that puts the rated V/f on the winding (feeder and line-to-neutral
    connection kept as they are)."""
    target = ts.target_terminal_voltage(a.choice.rated_voltage_v, a.choice.rating.frequency_hz,
                                        a.site.frequency_hz)
    return target * a.site.voltage_v / a.supply.terminal_voltage_v


def _phases_fit(a: Assessment) -> bool:
    return a.machine.phases == a.site.phases or a.machine.phases == 1


def _overflux_caution(site: Site) -> tuple[str, ...]:
    if site.frequency_hz >= 55.0:
        return ()
    k = ts.transformer_overflux(1.0, 1.0, site.frequency_hz, 60.0)
    return (f"a transformer built for 60 Hz and fed at its rated voltage on {site.frequency_hz:g} "
            f"Hz runs at {k:.2f} x its rated flux (IEEE Std C57.12.00-2010, 4.1.6.1): use one "
            f"rated for {site.frequency_hz:g} Hz, or feed a relocated 60 Hz unit at no more than "
            f"{1 / k:.2f} of its rated voltage, its rating then falling to the same share",)


def transformer(a: Assessment) -> Iterator[Candidate]:
    """A two-winding transformer putting the rated V/f on the terminals (zone A)."""
    if not _phases_fit(a) or a.supply.terminal_voltage_v <= 0.0:
        return
    target_bus = bus_target_v(a)
    if abs(target_bus / a.site.voltage_v - 1.0) < 0.01:
        return
    ratio = ts.turns_ratio(a.site.voltage_v, target_bus)
    site = scaled_site(a.site, 1.0 / ratio)
    target = ts.target_terminal_voltage(a.choice.rated_voltage_v, a.choice.rating.frequency_hz,
                                        a.site.frequency_hz)
    low, high = ts.zone_a_band(target)
    cautions = ("kVA on the running input only: check the starting dip on the transformer's "
                "impedance, or size with a margin for starting",
                *_overflux_caution(a.site))
    yield ("transformer",
           f"transformer {a.site.voltage_v:.0f} V : {target_bus:.0f} V (ratio {ratio:.3f}) giving "
           f"{target:.0f} V at the terminals (rated V/f at {a.site.frequency_hz:g} Hz; zone A "
           f"{low:.0f}-{high:.0f} V)",
           (("ratio", ratio), ("primary_voltage_v", a.site.voltage_v),
            ("secondary_voltage_v", target_bus), ("terminal_voltage_v", target)),
           cautions, 1, a.machine, site)


def buck_boost(a: Assessment) -> Iterator[Candidate]:
    """Buck-boost units (autotransformer) correcting the voltage to the rated V/f."""
    if not _phases_fit(a):
        return
    target_bus = bus_target_v(a)
    if abs(target_bus / a.site.voltage_v - 1.0) < 0.01:
        return
    if a.machine.phases == 1:
        connection = "single-phase"
    elif a.site.system == "wye" and a.site.wires == 4:
        connection = "wye"
    else:
        connection = "open-delta"
    try:
        w = bb.choose_winding(a.site.voltage_v, target_bus, connection)
    except ValueError:
        return
    if abs(w.output_v / target_bus - 1.0) > ts.ZONE_A_VOLTAGE:
        return
    site = scaled_site(a.site, w.output_v / a.site.voltage_v)
    units = bb.UNITS[connection]
    cautions = list(AUTOTRANSFORMER_CAUTIONS)
    if connection == "wye":
        cautions.append("a wye bank needs the supply's neutral connected to the units")
    yield ("buck-boost",
           f"{units} buck-boost unit{'s' if units > 1 else ''} ({connection}), "
           f"{w.primary_v:g} V primary, {w.secondary_v:g} V series winding, "
           f"{'boosting' if w.boost else 'bucking'} {a.site.voltage_v:.0f} V to {w.output_v:.0f} V",
           (("units", float(units)), ("primary_voltage_v", w.primary_v),
            ("series_winding_v", w.secondary_v), ("output_voltage_v", w.output_v),
            ("correction_v", bb.correction_voltage(a.site.voltage_v, w.output_v))),
           tuple(cautions), 1, a.machine, site)


def buck_boost_unit_va(current_a: float, series_winding_v: float, connection_units: int
                       ) -> tuple[float, float]:
    """Rating each unit needs, and the catalogued unit at or above it [VA]."""
    connection = {1: "single-phase", 2: "open-delta", 3: "wye"}[connection_units]
    need = bb.unit_va(current_a, series_winding_v, connection)
    return need, bb.next_standard_unit_va(need)


def drive(a: Assessment) -> Iterator[Candidate]:
    """A variable-frequency drive fed from the site, set to the motor's own V/f."""
    m = a.machine
    if m.is_synchronous or m.phases != 3:
        return
    v_in = a.site.voltage_v
    best: tuple[float, float, int, Rating] | None = None
    for rating in m.ratings:
        for i, c in enumerate(rating.connections):
            v_rated = c.reference_voltage(v_in)
            power = vfd.kept_output(rating.frequency_hz, v_rated, rating.frequency_hz, v_in)[1]
            key = (power, -abs(v_rated - v_in), i, rating)
            if best is None or key[:2] > best[:2]:
                best = key
    if best is None:
        return
    _, _, index, rating = best
    c = rating.connections[index]
    v_rated = c.reference_voltage(v_in)
    f_rated = rating.frequency_hz
    f_fw = vfd.field_weakening_frequency_hz(v_rated, f_rated, v_in)
    f_out = min(f_rated, f_fw)
    v_out = v_rated * f_out / f_rated
    torque, power = vfd.kept_output(f_rated, v_rated, f_rated, v_in)
    single = a.site.phases == 1
    figures: list[tuple[str, float]] = [
        ("base_voltage_v", v_rated), ("base_frequency_hz", f_rated),
        ("volts_per_hertz", vfd.volts_per_hertz(v_rated, f_rated)),
        ("field_weakening_frequency_hz", f_fw), ("output_voltage_v", v_out),
        ("output_frequency_hz", f_out), ("power_kept", power), ("torque_kept", torque)]
    if c.current_a is not None:
        low, high = vfd.required_drive_current_a(c.current_a, ambient_degc=a.site.ambient_degc,
                                                 altitude_m=a.site.altitude_m,
                                                 single_phase_input=single)
        figures += [("motor_current_a", c.current_a), ("drive_current_a", low),
                    ("drive_current_high_a", high)]
    cautions = [DRIVE_DUTY_CAUTION,
                "drive derates: about 1 %/degC above 40 degC and 1 %/100 m above 1000 m unless "
                "the drive's datasheet says otherwise (common practice)"]
    if single:
        cautions.append("three-phase drive on a single-phase supply: rated about sqrt(3) to 2 x "
                        "the motor current (derated to 50-58 %), per the drive maker")
    if f_fw < f_rated * (1.0 - 1e-6):
        cautions.append(f"the drive cannot put out more than its {v_in:.0f} V input: the motor "
                        f"runs field-weakened above {f_fw:.1f} Hz (torque falls as 1/f)")
    if c.current_a is None:
        cautions.append("the plate gives no current for this connection: size the drive on "
                        "the motor's full-load current from the maker")
    site = dataclasses.replace(
        a.site, frequency_hz=f_out, voltage_v=v_out, phases=3, system=None, wires=None,
        voltage_range_v=None, unbalance=None, line_voltages_v=None, frequency_variation=None,
        supply_source=None)
    start = dataclasses.replace(m.start or Start(), method="drive")
    machine = dataclasses.replace(single_connection(m, rating, index), start=start)
    conn = f" connected {c.name}" if c.name else ""
    yield ("drive",
           f"variable-frequency drive{' (single-phase input)' if single else ''}, base "
           f"{v_rated:.0f} V {f_rated:g} Hz{conn}, output {v_out:.0f} V {f_out:.1f} Hz",
           tuple(figures), tuple(cautions), 1, machine, site)


def transformer_kva(current_a: float, voltage_v: float, phases: int, standard: str
                    ) -> tuple[float, float]:
    """Transformer rating needed on the running input, and the standard size at or above [VA]."""
    need = ts.required_va(ts.input_va(current_a, voltage_v, phases))
    if standard == "NEMA":
        series = "ieee-3ph" if phases == 3 else "ieee-1ph"
    else:
        series = "iec-r10"
    size = ts.next_standard_va(need, series)
    return need, size if math.isfinite(size) else need
