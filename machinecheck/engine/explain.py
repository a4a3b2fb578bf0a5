"""The working of one assessment, with numbers substituted, rendered from its records."""

from __future__ import annotations

from typing import TYPE_CHECKING

from ..model import Connection, Machine
from .assessment import Currents, OperatingPoint, RatingChoice, Running, Supply
from .protection import Protection
from .starting import Starting

if TYPE_CHECKING:
    from ..rules.regulation import RegulationFinding
    from .remedies.records import Remedy


def working(machine: Machine, choice: RatingChoice, supply: Supply,
            running: Running) -> tuple[str, ...]:
    """The lines of working, in the order the figures are built."""
    lines = (_choice(machine, choice, supply, running) + _tolerance(supply)
             + _derates(machine, choice, supply, running))
    if machine.is_generator:
        return tuple(lines + _generator(choice, supply, running))
    if supply.phases_ok:
        if machine.is_synchronous:
            lines.append(f"synchronous motor: runs at n_s = {running.synchronous_speed_rpm:.0f} "
                         "rpm")
        elif running.operating is not None:
            lines += _operating(running.operating, supply, running)
    load = running.load
    if load is not None and machine.load is not None:
        lines.append(f"load ({load.type}): speed ratio n / n_rated = "
                     f"{running.expected_speed_rpm:.0f} / {load.reference_speed_rpm:.0f} = "
                     f"{load.speed_ratio:.3f}; load power = {load.power_w / 1000:.2f} kW")
    return tuple(lines + _currents(machine, choice, supply, running.currents,
                                   running.available_power_w))


def _choice(machine: Machine, choice: RatingChoice, supply: Supply,
            running: Running) -> list[str]:
    r, c, site = choice.rating, choice.connection, supply.site
    return [
        f"rating set: {r.frequency_hz:g} Hz (of {len(machine.ratings)}); connection "
        f"{c.name or 'as stamped'} at {_volts(c)}; supply {supply.terminal_voltage_v:.0f} V "
        f"{supply.terminal_note}".rstrip(),
        f"synchronous speed n_s = 120 f / p = 120 x {site.frequency_hz:g} / {choice.poles} = "
        f"{running.synchronous_speed_rpm:.0f} rpm",
        f"flux ratio k = (V / V_rated) / (f / f_rated) = ({supply.terminal_voltage_v:.1f} / "
        f"{choice.rated_voltage_v:.1f}) / ({site.frequency_hz:g} / {r.frequency_hz:g}) = "
        f"{choice.flux_ratio:.3f}; torque capability k^2 = {running.torque_capability:.3f}"]


def _volts(c: Connection) -> str:
    if c.is_range:
        return f"{c.voltage_min_v:g}-{c.voltage_max_v:g} V"
    return f"{c.voltage_min_v:g} V"


def _tolerance(supply: Supply) -> list[str]:
    t = supply.tolerance
    df = 0.0 if supply.rerated else supply.frequency_ratio - 1.0
    where = "zone " + str(t.zone) if t.zone is not None else (
        "within" if t.within else "outside")
    return [f"tolerance ({t.standard}, {t.basis} point): dV = {100 * t.voltage_deviation:+.1f} %, "
            f"df = {100 * df:+.1f} % -> {where}"]


def _derates(machine: Machine, choice: RatingChoice, supply: Supply,
             running: Running) -> list[str]:
    d = running.derates
    text = " x ".join(f"{name} {value:.3f}" for name, value in d.factors)
    lines = [f"derating factors: {text} = {d.combined:.3f}"]
    if d.factor("frequency") is not None:
        lines.append("  frequency: min(1, (f / f_rated) x min(1, k)) = min(1, "
                     f"{supply.frequency_ratio:.3f} x {min(1.0, choice.flux_ratio):.3f})")
    available = running.available_power_w
    if available is not None and not machine.is_generator:
        lines.append(f"available output = {running.rated_power_w / 1000:.2f} kW x "
                     f"{d.combined:.3f} = {available / 1000:.2f} kW")
    return lines


def _operating(op: OperatingPoint, supply: Supply, running: Running) -> list[str]:
    lines = []
    n_s = running.synchronous_speed_rpm
    v, f = supply.terminal_voltage_v, supply.site.frequency_hz
    if op.rule_speed_rpm is not None and op.rule_torque_ratio is not None:
        lines.append(f"slip rule: slip at rated = {op.rule_rated_slip_rpm:.1f} rpm; at the site "
                     f"slip = {op.rule_rated_slip_rpm:.1f} x T/T_rated {op.rule_torque_ratio:.3f} "
                     f"/ k^2 {running.torque_capability:.3f} = {n_s - op.rule_speed_rpm:.1f} rpm -> "
                     f"n = {op.rule_speed_rpm:.0f} rpm")
    c = op.circuit
    if c is None:
        return lines
    lines.append(f"equivalent circuit (per phase, star, at {c.frequency_hz:g} Hz): "
                 f"R1 {c.r1_ohm:.4g}, X1 {c.x1_ohm:.4g}, R2' {c.r2_ohm:.4g}, "
                 f"X2' {c.x2_ohm:.4g}, Xm {c.xm_ohm:.4g} ohm; rotational loss "
                 f"{c.rotational_loss_w:.0f} W; breakdown torque: {op.breakdown_basis}")
    if op.stalled:
        lines.append(f"  at {v:.0f} V {f:g} Hz: breakdown torque {op.breakdown_torque_nm:.1f} N m "
                     f"is below the {op.stall_torque_nm:.1f} N m asked of it: no stable running "
                     "point")
        return lines
    assert op.slip is not None and op.speed_rpm is not None and op.power_factor is not None
    margin = "" if op.breakdown_margin is None else f"; breakdown {op.breakdown_margin:.2f} x load"
    lines.append(f"  at {v:.0f} V {f:g} Hz and {op.load_torque_nm:.1f} N m: slip "
                 f"{100 * op.slip:.2f} % -> n = {op.speed_rpm:.0f} rpm, I = {op.current_a:.1f} A, "
                 f"PF {op.power_factor:.3f}, eta {op.efficiency:.3f}{margin}")
    return lines


def _currents(machine: Machine, choice: RatingChoice, supply: Supply, currents: Currents,
              available_w: float | None) -> list[str]:
    lines = []
    rating, c = choice.rating, choice.connection
    v = supply.terminal_voltage_v
    if currents.basis == "nameplate" and c.current_a:
        lines.append(f"current: I = I_rated x P / P_rated x V_rated / V = {c.current_a:.1f} x "
                     f"{currents.power_ratio:.3f} x {choice.rated_voltage_v:.0f} / {v:.0f} = "
                     f"{currents.full_load_a:.1f} A")
    if currents.formula_a is not None:
        root = "sqrt(3) x " if machine.phases == 3 else ""
        lines.append(f"current from ratings: I = P / ({root}V x eta x PF) = {available_w:.0f} / "
                     f"({root}{v:.0f} x {rating.efficiency:.3f} x {rating.power_factor:.2f}) = "
                     f"{currents.formula_a:.1f} A")
    lrc = currents.locked_rotor
    if lrc is not None:
        high = "" if lrc.rated_high_a == lrc.rated_low_a else f"-{lrc.rated_high_a:.0f}"
        lines.append(f"locked-rotor current ({lrc.basis}) at rated supply {lrc.rated_low_a:.0f}"
                     f"{high} A, x k {choice.flux_ratio:.3f} at the site")
    if currents.code_a is not None and currents.code_hp is not None:
        lines.append(f"NEC table current: {currents.power_hp:.2f} hp -> {currents.code_hp:g} hp "
                     f"-> {currents.code_a:g} A; conductors 125 % = "
                     f"{currents.conductor_a:.1f} A ({currents.code_rule})")
    elif currents.code_rule is not None:
        lines.append(f"NEC 430.6(A)(1): {currents.code_rule}")
    return lines


def _generator(choice: RatingChoice, supply: Supply, running: Running) -> list[str]:
    site = supply.site
    lines = [f"generator: shaft speed for {site.frequency_hz:g} Hz = 120 f / p = "
             f"{running.synchronous_speed_rpm:.0f} rpm; voltage at rated flux = "
             f"{choice.rated_voltage_v:.0f} x {supply.frequency_ratio:.3f} = "
             f"{running.rated_flux_voltage_v:.0f} V"]
    va = running.available_apparent_power_va
    if va is not None:
        lines.append(f"available = {(running.rated_apparent_power_va or 0.0) / 1000:.1f} kVA x "
                     f"{running.derates.combined:.3f} = {va / 1000:.1f} kVA; "
                     f"I = S / (sqrt(3) V) = {running.currents.full_load_a:.1f} A")
    return lines


def supply_path_working(s: Starting | None, p: Protection | None) -> tuple[str, ...]:
    """The working of the supply path, the start and the protection settings."""
    if s is None:
        return ()
    lines = [f"source: {s.source_note}"]
    if s.source is not None:
        z = s.source.impedance_ohm
        lines.append(f"  Z_source = {z.real * 1e3:.2f} + j{z.imag * 1e3:.2f} mohm; "
                     f"S_sc = {s.source.short_circuit_power_va / 1e6:.2f} MVA")
    if s.feeder is not None:
        z = s.feeder.impedance_ohm
        lines.append(f"feeder: {s.feeder.length_m:g} m, {s.feeder.parallel} run(s), "
                     f"{s.feeder.basis}: Z = {z.real * 1e3:.2f} + j{z.imag * 1e3:.2f} mohm")
    d = s.running_drop
    if d is not None:
        lines.append(f"running drop at {d.current_a:.1f} A, PF {d.power_factor:.2f}: "
                     f"{d.bus_voltage_v:.0f} V at the bus -> terminal voltage "
                     f"{d.terminal_voltage_v:.1f} V ({100 * d.drop:.2f} %; limit "
                     f"{100 * d.limit:g} %{' default, common practice' if d.limit_is_default else ''})")
    if s.starting_current_a is not None:
        lines.append(f"start {s.method}: current x {s.current_factor:.3g}, torque x "
                     f"{s.torque_factor:.3g}; locked-rotor {s.locked_rotor_current_a:.0f} A at the "
                     f"bus voltage -> {s.starting_current_a:.0f} A at {s.starting_voltage_v:.0f} V")
    if s.dip_terminals is not None:
        bus = "stiff" if s.dip_bus is None else f"{100 * s.dip_bus:.1f} %"
        lines.append(f"dip ({s.dip_basis}): bus {bus}, terminals {100 * s.dip_terminals:.1f} % "
                     f"(limit {100 * s.dip_limit:g} %"
                     f"{', default, common practice' if s.dip_limit_is_default else ''})")
    if s.starting_torque_nm is not None:
        extra = "" if s.breakaway_torque_nm is None else (
            f" against breakaway {s.breakaway_torque_nm:.0f} N m (margin "
            f"{100 * (s.breakaway_margin or 0.0):+.0f} %)")
        lines.append(f"starting torque at the dipped voltage {s.starting_torque_nm:.0f} N m"
                     f"{extra}")
    if s.acceleration_time_s is not None:
        change = "" if s.changeover_speed_rpm is None else (
            f", star to delta at {s.changeover_speed_rpm:.0f} rpm")
        lines.append(f"acceleration time t = integral J dw / (T_m - T_L) = "
                     f"{s.acceleration_time_s:.2f} s{change}")
    elif s.stall_speed_rpm is not None:
        lines.append(f"acceleration: the torques meet at {s.stall_speed_rpm:.0f} rpm (stall)")
    elif s.acceleration_unavailable:
        lines.append(f"acceleration not computed: {s.acceleration_unavailable}")
    if s.trip_time_cold_s is not None and s.trip_multiple is not None:
        lines.append(f"overload class {s.trip_class} at {s.trip_multiple:.2f} x setting: "
                     f"shortest trip {s.trip_time_cold_s:.1f} s cold, "
                     f"{s.trip_time_hot_s:.1f} s hot (IEC 60947-4-1 lower limit, I^2 t)")
    if s.minimum_source_va is not None:
        lines.append(f"smallest {s.minimum_source_kind} for the dip limit: "
                     f"{s.minimum_source_va / 1e3:.0f} kVA (kVA form at the bus)")
    if s.starting_active_power_w is not None:
        lines.append(f"starting active power {s.starting_active_power_w / 1e3:.1f} kW")
    if s.fault_current_a is not None:
        lines.append(f"available fault current at the motor {s.fault_current_a / 1e3:.2f} kA "
                     f"(IEC 60909-0, c = {s.voltage_factor:g}, cable at 20 degC; motor "
                     "contribution left out)")
    lines += [f"  note: {n}" for n in s.notes]
    if p is not None:
        lines += _protection_working(p)
    lines.append(f"caution: {s.caution}")
    return tuple(lines)


def _protection_working(p: Protection) -> list[str]:
    lines = [f"protection ({p.edition_note or 'IEC practice'}): overload dial "
             f"{p.overload_dial.current_a:.1f} A ({p.overload_dial.note})"]
    for setting in (p.overload_maximum, p.conductor_ampacity, p.motor_lead_ampacity,
                    p.disconnect):
        if setting is not None:
            lines.append(f"  {setting.clause}: {setting.current_a:.1f} A {setting.note}".rstrip())
    for device, rating in p.devices:
        lines.append(f"  {rating.clause} {device}: {rating.percent:g} % -> "
                     f"{rating.computed_a:.1f} A, permitted {rating.permitted_a:g} A")
    return lines
def remedy_working(remedies: tuple[Remedy, ...],
                   regulation: RegulationFinding | None) -> tuple[str, ...]:
    """The working of the remedies and the region's efficiency rule, from their records."""
    lines: list[str] = []
    for r in remedies:
        if r.verdict is None:
            continue
        figures = ", ".join(f"{name} = {value:.4g}" for name, value in r.figures)
        lines.append(f"remedy {r.kind}: {r.action}; {figures}; re-checked through the same "
                     f"pipeline: {r.verdict}")
        e = r.energy
        if e is not None:
            lines.append(f"energy: dP = P x LF x (1/eta_old - 1/eta_new) with eta "
                         f"{e.efficiency_old:.3f} -> {e.efficiency_new:.3f} = "
                         f"{e.power_saving_w / 1000:.3f} kW; a year: "
                         f"{e.annual_energy_j / 3.6e6:.0f} kWh")
    if regulation is not None:
        lines.append(f"efficiency rule ({regulation.region}): {regulation.status}")
    return tuple(lines)
