"""The start of a motor on its site's source: dip at the bus and the terminals, torque at the
dipped voltage against the breakaway torque, acceleration time, trip class, the smallest
adequate source, the generator's power and the available fault current. The source and feeder
impedances and the running drop come from :mod:`.supply_path`.

Every formula is in :mod:`machinecheck.physics` (source, feeder, dip, acceleration,
trip_class, fault); this module only decides which apply and keeps the figures in frozen
records. Without a site source the supply is stiff: no dip figures, "no source given".
Nothing is invented: no source, cable, inertia or power factor the user did not give.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass
from typing import Any

from ..errors import DomainError
from ..model import Machine, Site
from ..physics import acceleration as accel
from ..physics import circuit as circuit_physics
from ..physics import dip as dip_physics
from ..physics import fault as fault_physics
from ..physics import source as source_physics
from ..physics import speed as speed_physics
from ..physics import trip_class as trip_physics
from ..physics.protection import CAUTION
from ..physics.supply_constants import (
    BREAKAWAY_TORQUE_MARGIN,
    STARTING_DIP_LIMIT_TERMINALS,
)
from .assessment import RatingChoice, Running, Supply
from .supply_path import FeederPath, RunningDrop, SourcePath, feeder_path, source_path

#: End of the start: 95 % of the running speed (common practice takes 95-98 %; see
#: physics.acceleration.acceleration_time).
END_SPEED_SHARE = 0.95
#: Star-delta changeover: made at 95 % of the speed where the star torque meets the load,
#: and only when that speed is at least 75 % of synchronous (common practice, no published
#: source).
CHANGEOVER_SHARE = 0.95
CHANGEOVER_MIN_SPEED_SHARE = 0.75
NO_SOURCE = "no source given: the supply is taken as stiff (no dip figures)"


@dataclass(frozen=True, slots=True)
class Starting:
    """The start of one motor on one site, and the supply path it runs through.

    Dip figures are None without a source; acceleration figures are None with the reason in
    ``acceleration_unavailable``; trip figures are None without a trip class. Ratios are
    fractions; ``breakaway_margin`` is T_motor / T_breakaway - 1.
    """

    method: str
    source: SourcePath | None
    source_note: str
    feeder: FeederPath | None
    running_drop: RunningDrop | None
    current_factor: float
    torque_factor: float
    locked_rotor_current_a: float | None
    locked_rotor_power_factor: float | None
    starting_current_a: float | None
    starting_apparent_power_va: float | None
    dip_basis: str | None
    dip_bus: float | None
    dip_terminals: float | None
    dip_limit: float
    dip_limit_is_default: bool
    starting_voltage_v: float | None
    starting_torque_nm: float | None
    starting_torque_basis: str | None
    breakaway_torque_nm: float | None
    breakaway_margin: float | None
    will_start: bool | None
    acceleration_time_s: float | None
    stall_speed_rpm: float | None
    changeover_speed_rpm: float | None
    acceleration_unavailable: str | None
    trip_class: str | None
    trip_multiple: float | None
    trip_time_cold_s: float | None
    trip_time_hot_s: float | None
    minimum_source_va: float | None
    minimum_source_kind: str | None
    starting_active_power_w: float | None
    prime_mover_power_w: float | None
    fault_current_a: float | None
    voltage_factor: float | None
    notes: tuple[str, ...] = ()
    caution: str = CAUTION


# ----------------------------------------------------------------------------- the start

@dataclass(frozen=True, slots=True)
class _Motor:
    """What the start needs of the motor at the site."""

    rated_torque_nm: float
    rated_speed_rpm: float
    rated_locked_rotor_a: float
    locked_rotor_ohm: float              # |Z_LR| at the site frequency [ohm]
    locked_rotor_power_factor: float | None
    locked_rotor_torque_nm: float | None  # at rated voltage and frequency
    locked_rotor_torque_basis: str
    circuit: circuit_physics.Circuit | None


def _motor(machine: Machine, choice: RatingChoice, running: Running,
           frequency_hz: float) -> _Motor | None:
    rating, lrc = choice.rating, running.currents.locked_rotor
    if lrc is None or not rating.power_w or not rating.speed_rpm:
        return None
    rated_lr = lrc.rated_high_a if math.isfinite(lrc.rated_high_a) else lrc.rated_low_a
    t_rated = speed_physics.shaft_torque(rating.power_w, rating.speed_rpm)
    # at standstill the impedance is mostly leakage reactance, proportional to frequency
    z_lr = (choice.rated_voltage_v * frequency_hz / rating.frequency_hz
            / (math.sqrt(3.0) * rated_lr))
    op = running.operating
    c = None if op is None else op.circuit
    pf = t_lr = None
    basis = "not known"
    if c is not None:
        pf = circuit_physics.operating_point(c, choice.rated_voltage_v, frequency_hz, 1.0,
                                             rotational_loss_w=0.0).power_factor
        t_lr = circuit_physics.operating_point(c, choice.rated_voltage_v, rating.frequency_hz,
                                               1.0, rotational_loss_w=0.0).induced_torque_nm
        given = op is not None and op.breakdown_basis == "datasheet equivalent circuit"
        basis = "datasheet" if given else "estimate from the equivalent circuit"
    if rating.locked_rotor_torque_nm is not None:
        t_lr, basis = rating.locked_rotor_torque_nm, "datasheet"
    elif rating.locked_rotor_torque_pu is not None:
        t_lr, basis = rating.locked_rotor_torque_pu * t_rated, "datasheet"
    return _Motor(t_rated, rating.speed_rpm, rated_lr, z_lr, pf, t_lr, basis, c)


def build(machine: Machine, choice: RatingChoice, supply: Supply, running: Running,
          drop: RunningDrop | None) -> Starting | None:
    """The start of a motor on this site. None for a generator, or when the pair gives no
    supply path at all (no site source, no feeder and no start section)."""
    site = supply.site
    if machine.is_generator or (site.supply_source is None and machine.feeder is None
                                and machine.start is None):
        return None
    method = "direct-on-line" if machine.start is None else machine.start.method
    bus_v = supply.terminal_voltage_v if drop is None else drop.bus_voltage_v
    three_phase = machine.phases == 3 and site.phases == 3
    source = source_path(site, site.voltage_v) if three_phase else None
    feeder = drop.feeder if drop is not None else feeder_path(machine, site)
    limit = None if site.limits is None else site.limits.starting_dip
    notes: list[str] = []
    if source is not None and site.supply_source is not None \
            and site.supply_source.x_over_r is None:
        notes.append("source X/R not given: the source taken as a pure reactance")
    source_note = source.description if source is not None else (
        NO_SOURCE if site.supply_source is None
        else "the source is judged for three-phase motors on three-phase sites only")
    fault = c_factor = None
    if source is not None:
        c_factor = fault_physics.voltage_factor(site.voltage_v)
        fault = fault_physics.fault_current_at_motor(
            site.voltage_v, source.impedance_ohm,
            feeder.cold_impedance_ohm if feeder is not None else 0j, c_factor)
    blank = Starting(
        method=method, source=source, source_note=source_note, feeder=feeder,
        running_drop=drop, current_factor=1.0, torque_factor=1.0, locked_rotor_current_a=None,
        locked_rotor_power_factor=None, starting_current_a=None,
        starting_apparent_power_va=None, dip_basis=None, dip_bus=None, dip_terminals=None,
        dip_limit=STARTING_DIP_LIMIT_TERMINALS if limit is None else limit,
        dip_limit_is_default=limit is None, starting_voltage_v=None, starting_torque_nm=None,
        starting_torque_basis=None,
        breakaway_torque_nm=None, breakaway_margin=None, will_start=None,
        acceleration_time_s=None, stall_speed_rpm=None, changeover_speed_rpm=None,
        acceleration_unavailable=None, trip_class=None if machine.start is None
        else machine.start.trip_class, trip_multiple=None, trip_time_cold_s=None,
        trip_time_hot_s=None, minimum_source_va=None, minimum_source_kind=None,
        starting_active_power_w=None,
        prime_mover_power_w=None if site.supply_source is None
        else site.supply_source.prime_mover_power_w,
        fault_current_a=fault, voltage_factor=c_factor)
    motor = _motor(machine, choice, running, site.frequency_hz) \
        if machine.kind == "induction-motor" and three_phase else None
    if motor is None or running.not_running_reason is not None:
        reason = (running.not_running_reason
                  or "starting figures need a three-phase induction motor with its rated "
                     "output, speed and locked-rotor current (plate, Ia/In or code letter)")
        return _replace(blank, acceleration_unavailable=reason)
    return _start(machine, choice, supply, running, motor, blank, bus_v, notes)


def _replace(s: Starting, **changes: Any) -> Starting:
    return dataclasses.replace(s, **changes)


def _reduction(machine: Machine, choice: RatingChoice, motor: _Motor
               ) -> dip_physics.StartReduction:
    start = machine.start
    if start is None:
        return dip_physics.start_reduction("direct-on-line")
    current = choice.connection.current_a
    lr_ratio = motor.rated_locked_rotor_a / current if current else None
    t_ratio = (None if motor.locked_rotor_torque_nm is None
               else motor.locked_rotor_torque_nm / motor.rated_torque_nm)
    return dip_physics.start_reduction(start.method, tap=start.tap,
                                       current_limit_ratio=start.current_limit,
                                       locked_rotor_current_ratio=lr_ratio,
                                       locked_rotor_torque_ratio=t_ratio)


def _start(machine: Machine, choice: RatingChoice, supply: Supply, running: Running,
           motor: _Motor, blank: Starting, bus_v: float, notes: list[str]) -> Starting:
    site = supply.site
    try:
        red = _reduction(machine, choice, motor)
    except DomainError as exc:
        return _replace(blank, acceleration_unavailable=str(exc))
    if red.estimate:
        notes.append(f"{blank.method}: ideal current x {red.current_factor:.3g} and torque x "
                     f"{red.torque_factor:.3g} of a direct-on-line start (common practice)")
    # the motor at standstill seen from the line, after the starting method
    z_abs = motor.locked_rotor_ohm / red.current_factor
    pf = motor.locked_rotor_power_factor
    z_m = complex(z_abs * pf, z_abs * math.sqrt(1.0 - pf * pf)) if pf is not None \
        else complex(z_abs, 0.0)
    s_start = bus_v * bus_v / z_abs
    z_s = 0j if blank.source is None else blank.source.impedance_ohm
    z_f = 0j if blank.feeder is None else blank.feeder.impedance_ohm
    dip_bus = dip_t = None
    basis = None
    if blank.source is not None or blank.feeder is not None:
        if pf is not None:
            d = dip_physics.dip_divider(z_s, z_f, z_m)
            dip_bus, dip_t, basis = d.bus, d.terminals, "impedance divider"
        else:
            dip_bus = dip_physics.dip_from_powers(
                s_start, math.inf if blank.source is None
                else blank.source.short_circuit_power_va)
            dip_t = dip_physics.dip_from_powers(
                s_start, source_physics.short_circuit_power(z_s + z_f, bus_v))
            basis = "kVA form (no locked-rotor power factor known)"
        if blank.source is None:
            dip_bus = None  # a stiff bus: only the feeder dips
    v_start = bus_v * (1.0 - (dip_t or 0.0))
    i_start = v_start / (math.sqrt(3.0) * z_abs)
    f_ratio = site.frequency_hz / choice.rating.frequency_hz
    k_start = (v_start / choice.rated_voltage_v) / f_ratio
    torque = breakaway = margin = None
    if motor.locked_rotor_torque_nm is not None:
        torque = dip_physics.torque_at_voltage(motor.locked_rotor_torque_nm * red.torque_factor,
                                               k_start)
    breakaway = _breakaway(machine, motor)
    if torque is not None and breakaway is not None and breakaway > 0:
        margin = dip_physics.breakaway_margin(torque, breakaway)
    will_start: bool | None = None if margin is None else margin >= 0.0
    if motor.locked_rotor_torque_basis != "datasheet":
        will_start = None  # an estimated locked-rotor torque judges nothing
    if margin is not None and 0.0 <= margin < BREAKAWAY_TORQUE_MARGIN:
        notes.append(f"torque margin over breakaway below the {100 * BREAKAWAY_TORQUE_MARGIN:.0f}"
                     " % of common practice")
    accel_time, stall_rpm, changeover_rpm, unavailable = _accelerate(
        machine, choice, running, motor, red, v_start, site.frequency_hz, notes)
    if stall_rpm is not None and changeover_rpm is None and motor.locked_rotor_torque_basis == \
            "datasheet":
        will_start = False
    elif accel_time is not None and will_start is None and \
            motor.locked_rotor_torque_basis == "datasheet":
        will_start = True
    trip = _trip(machine, choice, running, i_start, accel_time)
    min_va, min_kind = _minimum_source(site, s_start, blank.dip_limit)
    p_start = None if pf is None else dip_physics.starting_active_power(s_start, pf)
    return _replace(
        blank, current_factor=red.current_factor, torque_factor=red.torque_factor,
        locked_rotor_current_a=bus_v / (math.sqrt(3.0) * motor.locked_rotor_ohm),
        locked_rotor_power_factor=pf, starting_current_a=i_start,
        starting_apparent_power_va=s_start, dip_basis=basis, dip_bus=dip_bus,
        dip_terminals=dip_t, starting_voltage_v=v_start, starting_torque_nm=torque,
        starting_torque_basis=None if torque is None else motor.locked_rotor_torque_basis,
        breakaway_torque_nm=breakaway, breakaway_margin=margin, will_start=will_start,
        acceleration_time_s=accel_time, stall_speed_rpm=stall_rpm,
        changeover_speed_rpm=changeover_rpm, acceleration_unavailable=unavailable,
        trip_multiple=trip[0], trip_time_cold_s=trip[1], trip_time_hot_s=trip[2],
        minimum_source_va=min_va, minimum_source_kind=min_kind,
        starting_active_power_w=p_start, notes=tuple(notes))


def _breakaway(machine: Machine, motor: _Motor) -> float | None:
    """The load's breakaway torque [N m]: as given, else a constant-torque load's own torque;
    None when unknown."""
    load = machine.load
    if load is None:
        return None
    if load.breakaway_torque_nm is not None:
        return load.breakaway_torque_nm
    if load.breakaway_torque_pu is not None:
        return load.breakaway_torque_pu * motor.rated_torque_nm
    if load.type == "constant-torque":
        return _load_reference(machine, motor.rated_speed_rpm)[0]
    return None


def _load_reference(machine: Machine, n_ref: float) -> tuple[float, float]:
    """(torque [N m], at speed [rpm]) of the driven load at the motor's rated speed."""
    load = machine.load
    assert load is not None
    if load.torque_nm is not None:
        return load.torque_nm, n_ref
    assert load.power_w is not None
    return speed_physics.shaft_torque(load.power_w, n_ref), n_ref


def _rad_s(rpm: float) -> float:
    return rpm * math.pi / 30.0


def _accelerate(machine: Machine, choice: RatingChoice, running: Running, motor: _Motor,
                red: dip_physics.StartReduction, v_start: float, frequency_hz: float,
                notes: list[str]
                ) -> tuple[float | None, float | None, float | None, str | None]:
    """(acceleration time [s], stall speed [rpm], star-delta changeover speed [rpm], why
    not computed). The run-up is taken at the voltage of the locked-rotor dip throughout
    (the dip recovers as the current falls: the time is on the long side)."""
    load, rating, c = machine.load, choice.rating, motor.circuit
    if c is None:
        return None, None, None, "no equivalent circuit: the motor's torque curve is unknown"
    if load is None:
        return None, None, None, "no driven load given"
    if rating.inertia_kgm2 is None or load.inertia_kgm2 is None:
        return None, None, None, "the motor's and the load's inertia are both needed"
    if load.type == "constant-power":
        return None, None, None, "a constant-power load has no defined torque at standstill"
    n_end = running.expected_speed_rpm
    if n_end is None:
        return None, None, None, "no running speed at the site"
    inertia = rating.inertia_kgm2 + load.inertia_kgm2
    t_ref, n_ref = _load_reference(machine, rating.speed_rpm or n_end)
    breakaway = _breakaway(machine, motor) or 0.0
    if load.type == "centrifugal":
        load_curve = accel.centrifugal_load(t_ref, _rad_s(n_ref), breakaway)
    else:
        load_curve = accel.constant_load(max(t_ref, breakaway))
    full = _motor_curve(motor, c, v_start, frequency_hz, choice)
    end = _rad_s(END_SPEED_SHARE * n_end)
    if red.estimate and machine.start is not None and machine.start.method == "drive":
        drive = accel.constant_load(motor.rated_torque_nm)
        result = accel.acceleration_time(inertia, drive, load_curve, end)
        notes.append("drive: rated torque held from standstill (common practice)")
        return _time(result), _stall(result), None, None
    method = "direct-on-line" if machine.start is None else machine.start.method
    first = accel.scaled_curve(full, red.torque_factor)
    result = accel.acceleration_time(inertia, first, load_curve, end)
    if method != "star-delta" or result.stall_speed_rad_s is None:
        return _time(result), _stall(result), None, None
    w_sync = 4.0 * math.pi * frequency_hz / choice.poles
    change = CHANGEOVER_SHARE * result.stall_speed_rad_s
    if change < CHANGEOVER_MIN_SPEED_SHARE * w_sync or change <= 0.0:
        notes.append("star-delta: the star torque meets the load below 75 % of synchronous "
                     "speed; the changeover to delta would come too early")
        return None, _stall(result), None, None
    star = accel.acceleration_time(inertia, first, load_curve, change)
    delta = accel.acceleration_time(inertia, full, load_curve, end, change)
    if delta.stall_speed_rad_s is not None:
        return None, _stall(delta), change * 30.0 / math.pi, None
    return star.time_s + delta.time_s, None, change * 30.0 / math.pi, None


def _time(result: accel.Acceleration) -> float | None:
    return None if math.isinf(result.time_s) else result.time_s


def _stall(result: accel.Acceleration) -> float | None:
    w = result.stall_speed_rad_s
    return None if w is None else w * 30.0 / math.pi


def _motor_curve(motor: _Motor, c: circuit_physics.Circuit, v_start: float,
                 frequency_hz: float, choice: RatingChoice) -> accel.TorqueCurve:
    """The motor's torque at ``v_start``: the equivalent circuit, with the datasheet's
    locked-rotor torque (scaled by k^2) joined linearly to the circuit's breakdown point."""
    circuit_curve = accel.circuit_curve(c, v_start, frequency_hz)
    rating = choice.rating
    given = rating.locked_rotor_torque_pu is not None or rating.locked_rotor_torque_nm is not None
    if not given or motor.locked_rotor_torque_nm is None:
        return circuit_curve
    _, s_max = circuit_physics.breakdown(c, v_start, frequency_hz)
    w_bd = (1.0 - s_max) * 4.0 * math.pi * frequency_hz / choice.poles
    k = (v_start / choice.rated_voltage_v) / (frequency_hz / choice.rating.frequency_hz)
    low = accel.curve_from_points([(0.0, motor.locked_rotor_torque_nm * k * k),
                                   (w_bd, circuit_curve(w_bd))])
    return lambda w: low(w) if w < w_bd else circuit_curve(w)


def _trip(machine: Machine, choice: RatingChoice, running: Running, i_start: float,
          accel_time: float | None) -> tuple[float | None, float | None, float | None]:
    """(starting current per unit of the relay setting, shortest trip time cold and hot [s])
    for the IEC 60947-4-1 class given; the relay set to the nameplate current (IEC practice),
    in the phase windings at 1/sqrt(3) of it for star-delta."""
    start, current = machine.start, choice.connection.current_a
    if start is None or start.trip_class is None or not current:
        return None, None, None
    setting = current / math.sqrt(3.0) if start.method == "star-delta" else current
    multiple = i_start / setting
    if multiple <= trip_physics.PICKUP_NO_TRIP:
        return multiple, math.inf, math.inf
    load_a = running.currents.load_a
    preload = min(1.0, load_a / current) if load_a else 1.0
    cold = trip_physics.minimum_trip_time(start.trip_class, multiple)
    hot = trip_physics.minimum_trip_time(start.trip_class, multiple, preload_ratio=preload)
    return multiple, cold, hot


def _minimum_source(site: Site, s_start: float, limit: float) -> tuple[float | None, str | None]:
    """The smallest transformer or generator of the site's kind (its impedance kept) that
    keeps the kVA-form dip within the limit [VA]; None for a utility supply or no source."""
    s = site.supply_source
    if s is None:
        return None, None
    if s.kind == "transformer" and s.impedance is not None:
        upstream = math.inf if s.short_circuit_power_va is None else s.short_circuit_power_va
        return dip_physics.minimum_transformer_rating(s_start, s.impedance, limit,
                                                      upstream), "transformer"
    if s.kind == "generator" and s.subtransient_reactance is not None:
        return dip_physics.minimum_generator_rating(s_start, s.subtransient_reactance,
                                                    limit), "generator"
    return None, None
