"""Supply-path lookups: ``dip`` (source + motor -> dip and the smallest source), ``drop``
(cable + current -> voltage drop) and ``protect`` (motor -> NEC Article 430 settings).

The line builders take the options' texts and return the lines, each ending with the caution;
the click commands below print them.
"""

from __future__ import annotations

import math

import click

from ..errors import InputError, MachinecheckError
from .lookups import _print, _value

SQRT3 = math.sqrt(3.0)


def _caution() -> str:
    from ..physics.protection import CAUTION

    return f"caution: {CAUTION}"




def dip_lines(kind: str, rating: str | None, impedance: str | None,
              short_circuit_power: str | None, voltage: str, locked_rotor_current: str,
              method: str = "direct-on-line", tap: str | None = None,
              limit: str | None = None) -> list[str]:
    """Dip of a motor start on a transformer, generator or utility source (kVA form)."""
    from ..physics import dip as dp
    from ..physics import source as so
    from ..physics.supply_constants import STARTING_DIP_LIMIT_TERMINALS

    volts = _value(voltage, "voltage", "--voltage")
    i_lr = _value(locked_rotor_current, "current", "--locked-rotor-current")
    try:
        if kind == "utility":
            if short_circuit_power is None:
                raise InputError("a utility source needs --short-circuit-power",
                                 key="--short-circuit-power")
            s_sc = _value(short_circuit_power, "apparent_power", "--short-circuit-power")
            what = f"utility {s_sc / 1e6:.4g} MVA"
        else:
            missing = [o for o, v in (("--rating", rating), ("--impedance", impedance))
                       if v is None]
            if missing:
                raise InputError(f"a {kind} source needs {' and '.join(missing)}",
                                 key=missing[0])
            assert rating is not None and impedance is not None
            s_rated = _value(rating, "apparent_power", "--rating")
            z = _value(impedance, "percent", "--impedance")
            if kind == "transformer":
                upstream = (math.inf if short_circuit_power is None else
                            _value(short_circuit_power, "apparent_power", "--short-circuit-power"))
                s_sc = so.transformer_short_circuit_power(s_rated, z, upstream)
            else:
                s_sc = so.generator_short_circuit_power(s_rated, z)
            what = f"{kind} {s_rated / 1e3:.4g} kVA, {100 * z:.4g} %"
        k = None if tap is None else _value(tap, "percent", "--tap")
        reduction = dp.start_reduction(method, tap=k)
        s_start = dp.locked_rotor_apparent_power(volts, i_lr) * reduction.current_factor
        d = dp.dip_from_powers(s_start, s_sc)
    except MachinecheckError as exc:
        raise InputError(str(exc), key="--method") from None
    lines = [f"source            {what}: S_sc = {s_sc / 1e3:.0f} kVA",
             f"starting kVA      {s_start / 1e3:.1f} kVA  (sqrt(3) x {volts:g} V x {i_lr:g} A "
             f"x {reduction.current_factor:.3g}, {method})",
             f"dip               {100 * d:.1f} %  (S_start / (S_start + S_sc), kVA form)"]
    d_max = STARTING_DIP_LIMIT_TERMINALS if limit is None else _value(limit, "percent",
                                                                      "--limit")
    label = " (default, common practice)" if limit is None else ""
    if kind == "transformer":
        assert impedance is not None
        z = _value(impedance, "percent", "--impedance")
        upstream = (math.inf if short_circuit_power is None else
                    _value(short_circuit_power, "apparent_power", "--short-circuit-power"))
        smallest = dp.minimum_transformer_rating(s_start, z, d_max, upstream)
        lines.append(f"smallest source   {smallest / 1e3:.0f} kVA transformer at {100 * z:.4g} % "
                     f"for a {100 * d_max:g} % dip{label}")
    elif kind == "generator":
        assert impedance is not None
        x = _value(impedance, "percent", "--impedance")
        smallest = dp.minimum_generator_rating(s_start, x, d_max)
        lines.append(f"smallest source   {smallest / 1e3:.0f} kVA generator at X''d "
                     f"{100 * x:.4g} % for a {100 * d_max:g} % dip{label}")
    return lines + [_caution()]


def drop_lines(current: str, length: str, size: str, voltage: str,
               power_factor: str = "0.85", material: str = "copper", phases: str = "3",
               parallel: int = 1, frequency: str = "50 Hz",
               temperature: str | None = None) -> list[str]:
    """Voltage drop of a cable from the built-in tables."""
    from ..physics import feeder as fd

    amps = _value(current, "current", "--current")
    metres = _value(length, "length", "--length")
    volts = _value(voltage, "voltage", "--voltage")
    pf = _value(power_factor, "fraction", "--power-factor")
    hz = _value(frequency, "frequency", "--frequency")
    try:
        nec = not fd.normalise_size(size).endswith("mm2")
        degc = (75.0 if nec else 70.0) if temperature is None else _value(
            temperature, "temperature", "--temperature")
        c = fd.conductor(size, material, degc, hz)
        z = fd.feeder_impedance(c.resistance_ohm_per_m, c.reactance_ohm_per_m, metres, parallel)
        n = int(phases)
        du = fd.voltage_drop(amps, pf, z, n)
        u_term = fd.terminal_voltage(volts, amps, pf, z, n)
    except MachinecheckError as exc:
        raise InputError(str(exc), key="--size") from None
    x_note = ", X 0.08 mohm/m (IEC 60364-5-52 Annex G default)" if c.reactance_is_default else ""
    return [f"cable             {size} {material}, {metres:g} m, {parallel} run(s): "
            f"{c.source} at {degc:g} degC, {hz:g} Hz{x_note}",
            f"impedance         R {z.real * 1e3:.2f} + jX {z.imag * 1e3:.2f} mohm per phase",
            f"voltage drop      {du:.2f} V = {100 * du / volts:.2f} % at {amps:g} A, PF {pf:g}  "
            f"({'sqrt(3)' if n == 3 else '2'} x I x (R cos + X sin))",
            f"terminal voltage  {u_term:.1f} V from {volts:g} V (exact phasor form)",
            _caution()]


def protect_lines(power: str, voltage: str, current: str, service_factor: str | None = None,
                  phases: str = "3", edition: str = "2023", star_delta: bool = False,
                  motor_type: str = "squirrel-cage") -> list[str]:
    """NEC Article 430 settings of one motor."""
    from ..physics import nec
    from ..physics import protection as pr
    from ..physics.constants import hp_from_w

    watts = _value(power, "power", "--power")
    volts = _value(voltage, "voltage", "--voltage")
    amps = _value(current, "current", "--current")
    sf = None if service_factor is None else float(service_factor)
    n = int(phases)
    found = nec.table_current(hp_from_w(watts), volts, n)
    if found is None:
        raise InputError(f"NEC tables give no full-load current for {hp_from_w(watts):.2f} hp at "
                         f"{volts:g} V", key="--power")
    table_a, hp = found
    try:
        lines = [f"code current      {table_a:g} A  ({hp:g} hp, {volts:g} V: NEC table, "
                 f"{nec.TABLE_EDITION} values; sizes conductors, devices, disconnect)"]
        cond = pr.conductor_ampacity(table_a, edition=edition)
        lines.append(f"conductors        >= {cond.current_a:.1f} A  ({cond.clause}, 125 %)")
        if star_delta:
            lead = pr.conductor_ampacity(table_a, star_delta_motor_leads=True, edition=edition)
            lines.append(f"motor leads       >= {lead.current_a:.1f} A  ({lead.clause}, "
                         "58 % x 125 %)")
        over = pr.overload_maximum_trip(amps, service_factor=sf, temperature_rise_degc=None,
                                        edition=edition)
        over_c = pr.overload_maximum_trip(amps, service_factor=sf, temperature_rise_degc=None,
                                          will_not_start=True, edition=edition)
        share = 1.0 / SQRT3 if star_delta else 1.0
        where = " in the phase windings (x 1/sqrt(3))" if star_delta else ""
        dial = pr.overload_dial_setting(amps, star_delta=star_delta)
        lines += [f"overload maximum  {over.current_a * share:.1f} A{where}  ({over.clause}; "
                  f"{over.note}); {over_c.current_a * share:.1f} A if it will not start "
                  f"({over_c.clause})",
                  f"overload dial     {dial.current_a:.1f} A  ({dial.note}; common practice, "
                  "per the relay maker's instructions)"]
        for device in pr.DEVICES:
            r = pr.short_circuit_device_maximum(table_a, device, motor_type, edition)
            lines.append(f"{device:<27} {r.percent:g} % -> {r.computed_a:.1f} A, at most "
                         f"{r.permitted_a:g} A  ({r.clause})")
        disc = pr.disconnect_minimum_rating(table_a, edition)
        lines.append(f"disconnect        >= {disc.current_a:.1f} A  ({disc.clause}, 115 %)")
    except MachinecheckError as exc:
        raise InputError(str(exc), key="--edition") from None
    return lines + [_caution()]


@click.command()
@click.option("--source", "kind", type=click.Choice(["transformer", "generator", "utility"]),
              required=True, help="kind of source")
@click.option("--rating", help="transformer or generator rating, e.g. '1000 kVA'")
@click.option("--impedance", help="transformer impedance or generator X''d, e.g. '5.75 %'")
@click.option("--short-circuit-power", "short_circuit_power",
              help="utility short-circuit power, or upstream of a transformer, e.g. '250 MVA'")
@click.option("--voltage", required=True, help="motor voltage, e.g. '460 V'")
@click.option("--locked-rotor-current", "locked_rotor_current", required=True,
              help="locked-rotor current at that voltage, e.g. '410 A'")
@click.option("--method", type=click.Choice(["direct-on-line", "star-delta", "autotransformer"]),
              default="direct-on-line", show_default=True)
@click.option("--tap", help="autotransformer tap, e.g. '65 %'")
@click.option("--limit", help="allowed dip (default 15 %, common practice)")
def dip(kind: str, rating: str | None, impedance: str | None, short_circuit_power: str | None,
        voltage: str, locked_rotor_current: str, method: str, tap: str | None,
        limit: str | None) -> None:
    """Voltage dip of a motor start, and the smallest source that keeps it within a limit."""
    _print(dip_lines(kind, rating, impedance, short_circuit_power, voltage,
                     locked_rotor_current, method, tap, limit))


@click.command()
@click.option("--current", required=True, help="line current, e.g. '62 A'")
@click.option("--length", required=True, help="route length, e.g. '120 m'")
@click.option("--size", required=True, help="conductor size: '35 mm2', '2 AWG', '250 kcmil'")
@click.option("--voltage", required=True, help="supply voltage, line to line, e.g. '400 V'")
@click.option("--power-factor", "power_factor", default="0.85", show_default=True)
@click.option("--material", type=click.Choice(["copper", "aluminium"]), default="copper",
              show_default=True)
@click.option("--phases", type=click.Choice(["1", "3"]), default="3", show_default=True)
@click.option("--parallel", type=click.IntRange(1, 20), default=1, show_default=True)
@click.option("--frequency", default="50 Hz", show_default=True)
@click.option("--temperature", help="conductor temperature (default 75 degC NEC sizes, "
              "70 degC mm2 sizes)")
def drop(current: str, length: str, size: str, voltage: str, power_factor: str, material: str,
         phases: str, parallel: int, frequency: str, temperature: str | None) -> None:
    """Running voltage drop of a cable and the voltage at its far end."""
    _print(drop_lines(current, length, size, voltage, power_factor, material, phases, parallel,
                      frequency, temperature))


@click.command()
@click.option("--power", required=True, help="rated output, e.g. '50 hp' or '37 kW'")
@click.option("--voltage", required=True, help="motor voltage, e.g. '460 V'")
@click.option("--current", required=True, help="nameplate current, e.g. '58 A'")
@click.option("--service-factor", "service_factor", help="marked service factor, e.g. 1.15")
@click.option("--phases", type=click.Choice(["1", "3"]), default="3", show_default=True)
@click.option("--edition", type=click.Choice(["2011", "2014", "2017", "2020", "2023"]),
              default="2023", show_default=True, help="NEC edition")
@click.option("--star-delta", "star_delta", is_flag=True, help="star-delta starter")
@click.option("--motor-type", "motor_type", default="squirrel-cage", show_default=True,
              type=click.Choice(["squirrel-cage", "design-b-energy-efficient",
                                 "design-b-premium-efficiency", "synchronous", "wound-rotor",
                                 "single-phase"]))
def protect(power: str, voltage: str, current: str, service_factor: str | None, phases: str,
            edition: str, star_delta: bool, motor_type: str) -> None:
    """NEC Article 430 conductor, overload, short-circuit and disconnect figures."""
    _print(protect_lines(power, voltage, current, service_factor, phases, edition, star_delta,
                         motor_type))
