"""The machine at the site: speed, re-rating, derates, operating point, load and currents.

Every figure comes from :mod:`machinecheck.physics`; this module only decides which apply.
"""

from __future__ import annotations

import math
from collections.abc import Callable

from ..errors import DomainError
from ..model import Machine, Rating
from ..physics import circuit as circuit_physics
from ..physics import current as current_physics
from ..physics import environment, frequency, loads, nec, starting, unbalance
from ..physics import speed as speed_physics
from ..physics.constants import (
    GENERATOR_POWER_FACTOR,
    RERATING_RANGE,
    SERVICE_FACTOR_FREQUENCY_BAND,
    SERVICE_FACTOR_MIN_DERATE,
    SERVICE_FACTOR_VOLTAGE_BAND,
    STAR_DELTA_FLUX_BAND,
    STAR_DELTA_RATIO_SLACK,
    UNBALANCE_LIMIT,
    hp_from_w,
    slip_tolerance,
    star_delta_ratio,
    synchronous_speed_rpm,
)
from ..physics.efficiency import ClassCheck, check_marked_class
from .assessment import (
    Currents,
    Derates,
    LoadAtSite,
    LockedRotorCurrent,
    OperatingPoint,
    RatingChoice,
    Running,
    Supply,
)

LoadTorque = Callable[[float], float]

#: The NEC full-load current table for a winding of so many phases.
TABLE_BY_PHASES = {1: "Table 430.248", 2: "Table 430.249", 3: "Table 430.250"}

#: Connection names read as delta and as star (lower case).
DELTA_NAMES = frozenset({"delta", "d", "Δ", "triangle", "dreieck", "low-delta"})
STAR_NAMES = frozenset({"star", "y", "wye", "Y", "yy", "high-star"})


def run(machine: Machine, choice: RatingChoice, supply: Supply) -> Running:
    """The machine at the site, from the chosen rating set and the supply it sees."""
    site, rating = supply.site, choice.rating
    n_s = speed_physics.synchronous_speed(site.frequency_hz, choice.poles)
    derates = _derates(machine, choice, supply)
    rated_power_w = rating.power_w or 0.0
    available_w: float | None = None
    available_va: float | None = None
    if supply.phases_ok and machine.is_generator:
        # the rated kVA is never raised (not even at a higher frequency); the derates lower it
        available_va = (rating.apparent_power_va or 0.0) * derates.combined
        available_w = available_va * (rating.power_factor or GENERATOR_POWER_FACTOR)
        prime_mover_w = _prime_mover_power(supply)
        if prime_mover_w is not None:
            available_w = min(available_w, prime_mover_w)
    elif supply.phases_ok:
        available_w = rated_power_w * derates.combined

    operating: OperatingPoint | None = None
    load: LoadAtSite | None = None
    speed_band: float | None = None
    if machine.is_generator:
        expected: float | None = n_s
        currents = _generator_currents(machine, supply, available_va)
    else:
        load_curve = _load_curve(machine, rating, choice.poles, available_w)
        expected = None
        if supply.phases_ok and machine.is_synchronous:
            expected = n_s
        elif supply.phases_ok and load_curve is not None:
            operating = _operating_point(machine, choice, supply, n_s, load_curve)
            if operating is not None and operating.speed_rpm is not None:
                expected = operating.speed_rpm
                speed_band = slip_tolerance(rated_power_w) * (n_s - expected)
        if machine.load is not None and load_curve is not None and expected is not None:
            load = _load_at_site(machine.load.type, load_curve, expected, available_w,
                                 supply.frequency_ratio)
        currents = _motor_currents(machine, choice, supply, available_w, load, operating)

    sf = rating.service_factor or machine.service_factor
    clean = (not supply.rerated
             and min((v for _, v in derates.factors), default=1.0) >= SERVICE_FACTOR_MIN_DERATE
             and abs(supply.tolerance.voltage_deviation) <= SERVICE_FACTOR_VOLTAGE_BAND
             and abs(supply.frequency_ratio - 1.0) <= SERVICE_FACTOR_FREQUENCY_BAND)
    class_check = _efficiency(machine, rating, choice.poles)
    minimum = None if class_check is None else class_check.marked_minimum
    return Running(
        synchronous_speed_rpm=n_s, torque_capability=frequency.torque_capability(choice.flux_ratio),
        derates=derates, rated_power_w=rated_power_w, available_power_w=available_w,
        rated_apparent_power_va=rating.apparent_power_va, available_apparent_power_va=available_va,
        expected_speed_rpm=expected, speed_band_rpm=speed_band,
        rated_flux_voltage_v=frequency.rated_flux_voltage(choice.rated_voltage_v,
                                                          supply.frequency_ratio),
        uprated_power_w=(frequency.uprated_output(rated_power_w, supply.frequency_ratio,
                                                  choice.flux_ratio)
                         if supply.frequency_ratio > 1.0 else None),
        operating=operating, load=load, currents=currents, service_factor=sf,
        service_factor_at_site=sf if clean else 1.0,
        star_delta_possible=_star_delta(machine, choice),
        efficiency_class=(machine.efficiency_class if class_check is None
                          else class_check.marked or class_check.computed),
        efficiency_class_minimum=None if minimum is None or math.isnan(minimum) else minimum,
        efficiency_check=class_check,
        not_running_reason=_not_running(machine, supply, operating))


def _not_running(machine: Machine, supply: Supply,
                 operating: OperatingPoint | None) -> str | None:
    """Why the machine cannot run at this site, or None when it can."""
    site = supply.site
    if not supply.phases_ok:
        return (f"a {machine.phases}-phase machine cannot be connected to a {site.phases}-phase "
                "supply")
    low, high = RERATING_RANGE
    if supply.rerated and not low <= supply.frequency_ratio <= high:
        return (f"{site.frequency_hz:g} Hz is too far from the rated frequency to re-rate "
                "the machine")
    t = supply.tolerance
    if not t.within:
        where = ("NEMA MG 1 12.44 limits" if t.standard == "NEMA" and not machine.is_generator
                 else "IEC 60034-1 zone B")
        return f"the supply is outside {where}"
    if operating is not None and operating.stalled:
        return "the motor stalls: the torque asked of it is above its breakdown torque"
    return None


def _prime_mover_power(supply: Supply) -> float | None:
    """The prime mover's power stated for the site's generator source, or None."""
    source = supply.site.supply_source
    return None if source is None else source.prime_mover_power_w


# ----------------------------------------------------------------------------- derates

def _derates(machine: Machine, choice: RatingChoice, supply: Supply) -> Derates:
    """Output factors: re-rating (frequency, overflux, cooling), a generator's terminal
    voltage, voltage unbalance, and altitude with ambient."""
    site = supply.site
    factors: list[tuple[str, float]] = []
    if supply.rerated and machine.is_generator:
        # a generator's fan turns with its shaft: slower at the lower frequency
        factors.append(("cooling", frequency.cooling_derating(supply.frequency_ratio,
                                                              machine.cooling)))
    if supply.rerated and not machine.is_generator:
        factors += [
            ("frequency", frequency.frequency_output_factor(supply.frequency_ratio,
                                                            choice.flux_ratio)),
            ("overflux", frequency.overflux_derating(choice.flux_ratio)),
            ("cooling", frequency.cooling_derating(supply.frequency_ratio, machine.cooling))]
    if machine.is_generator:
        # rated current is the thermal limit: kVA follows the terminal voltage
        factors.append(("voltage", min(1.0, supply.terminal_voltage_v / choice.rated_voltage_v)))
    u: float | None = None
    if machine.phases == 3 and site.phases == 3 and not machine.is_generator:
        u = site.unbalance
        if u is None and site.line_voltages_v is not None:
            u = unbalance.voltage_unbalance(site.line_voltages_v)
        if u is not None:
            factors.append(("unbalance", unbalance.unbalance_derating(min(u, UNBALANCE_LIMIT))))
    altitude = site.altitude_m - (machine.rated_altitude_m - environment.RATED_ALTITUDE_M)
    ambient = site.ambient_degc - (machine.rated_ambient_degc - environment.RATED_AMBIENT_DEGC)
    site_error: str | None = None
    try:
        site_factor = environment.site_derating(altitude, ambient)
    except DomainError as exc:
        site_error = str(exc)
        site_factor = environment.site_derating(min(altitude, environment.MAX_ALTITUDE_M),
                                                min(ambient, environment.MAX_AMBIENT_DEGC))
    factors.append(("site", min(1.0, site_factor)))
    combined = 1.0
    for _, value in factors:
        combined *= value
    return Derates(factors=tuple(factors), combined=combined, unbalance=u, site_error=site_error)


# ----------------------------------------------------------------------------- speed and load

def _load_curve(machine: Machine, rating: Rating, poles: int,
                available_w: float | None) -> tuple[str, float, float] | None:
    """(load type, torque [N m], at speed [rpm]) of the driven load; with no load given, the
    motor is taken to deliver its available output at any speed."""
    load = machine.load
    if load is not None:
        n_ref = rating.speed_rpm or synchronous_speed_rpm(rating.frequency_hz, poles)
        if load.torque_nm is not None:
            return load.type, load.torque_nm, n_ref
        assert load.power_w is not None  # the catalog gives one of the two
        return load.type, speed_physics.shaft_torque(load.power_w, n_ref), n_ref
    if available_w:
        return ("constant-power", *loads.constant_power_reference(available_w))
    return None


def _operating_point(machine: Machine, choice: RatingChoice, supply: Supply, n_s: float,
                     curve: tuple[str, float, float]) -> OperatingPoint | None:
    """Running speed of an induction motor: the slip rule, and the equivalent circuit when
    the plate allows an estimate. None when the plate lacks speed or output."""
    rating = choice.rating
    if rating.speed_rpm is None or not rating.power_w:
        return None
    t_rated = speed_physics.shaft_torque(rating.power_w, rating.speed_rpm)
    load_type, t0, n0 = curve
    load_torque = loads.torque_curve(load_type, t0, n0)
    rated_slip = synchronous_speed_rpm(rating.frequency_hz, choice.poles) - rating.speed_rpm
    k = choice.flux_ratio
    n_rule = speed_physics.slip_rule_speed(n_s, rated_slip, t_rated, k, t0,
                                           loads.TORQUE_EXPONENT[load_type], n0)
    tau = None if n_rule is None else load_torque(n_rule) / t_rated
    circuit, unavailable, breakdown_basis = _estimate_circuit(machine, choice)
    speed, stalled, valid = n_rule, n_rule is None, True
    slip = load_nm = breakdown_nm = stall_nm = margin = current = pf = eta = None
    if circuit is None:
        valid = speed_physics.slip_rule_valid(k, tau)
    else:
        v, f = supply.terminal_voltage_v, supply.site.frequency_hz
        op = circuit_physics.solve(circuit, v, f, load_torque)
        if op is None:
            speed, stalled = None, True
            breakdown_nm, s_max = circuit_physics.breakdown(circuit, v, f)
            stall_nm = load_torque(speed_physics.speed_at_slip(n_s, s_max))
        else:
            speed, stalled, slip = op.speed_rpm, False, op.slip
            load_nm = load_torque(op.speed_rpm)
            breakdown_nm = op.breakdown_torque_nm
            margin = breakdown_nm / load_nm if load_nm > 0 else None
            current, pf, eta = op.current_a, op.power_factor, op.efficiency
    return OperatingPoint(
        basis="slip rule" if circuit is None else "equivalent circuit", rule_speed_rpm=n_rule,
        rule_rated_slip_rpm=rated_slip, rule_torque_ratio=tau, slip_model_valid=valid,
        circuit=circuit, circuit_unavailable=unavailable, stalled=stalled, speed_rpm=speed,
        slip=slip, load_torque_nm=load_nm, breakdown_torque_nm=breakdown_nm,
        stall_torque_nm=stall_nm, breakdown_margin=margin, current_a=current, power_factor=pf,
        efficiency=eta, breakdown_basis=breakdown_basis)


def _estimate_circuit(machine: Machine, choice: RatingChoice
                      ) -> tuple[circuit_physics.Circuit | None, str | None, str | None]:
    """(the rating set's equivalent circuit, or None with the reason when it has one, and
    where its breakdown torque comes from): the datasheet's circuit when all five parameters
    are given, else the nameplate estimate fitted to the datasheet's breakdown torque, or to a
    typical one for the design (an estimate)."""
    rating, c = choice.rating, choice.connection
    if machine.kind != "induction-motor" or machine.phases != 3:
        return None, None, None  # the estimate covers three-phase induction motors
    assert rating.power_w is not None and rating.speed_rpm is not None  # the caller checked
    given = machine.circuit
    params = () if given is None else tuple(
        v for v in (given.r1_ohm, given.r2_ohm, given.x1_ohm, given.x2_ohm, given.xm_ohm)
        if v is not None)
    try:
        if len(params) == 5:
            r1, r2, x1, x2, xm = params
            return circuit_physics.from_parameters(
                r1, r2, x1, x2, xm, rating.frequency_hz, choice.poles, rating.power_w,
                rating.speed_rpm, choice.rated_voltage_v), None, "datasheet equivalent circuit"
        current = c.current_a
        if c.is_range and current is not None and choice.rated_voltage_v != c.voltage_v:
            current = current_physics.current_at_site(current, c.voltage_v,
                                                      choice.rated_voltage_v)
        ratio = _breakdown_ratio(rating)
        design = machine.design_letter
        if ratio is None:
            typical, taken = circuit_physics.typical_breakdown_ratio(design)
            basis = (f"estimate: typical breakdown torque {typical:g} x rated for design "
                     f"{taken}; ask the maker for the torque curve")
        else:
            basis = f"datasheet breakdown torque {ratio:.2f} x rated"
        return circuit_physics.estimate(
            rating.power_w, choice.rated_voltage_v, rating.frequency_hz, choice.poles,
            rating.speed_rpm, current, rating.power_factor, rating.efficiency,
            design, breakdown_ratio=ratio), None, basis
    except DomainError as exc:
        return None, str(exc), None


def _breakdown_ratio(rating: Rating) -> float | None:
    """The datasheet's breakdown torque over the rated torque, when it gives one."""
    if rating.breakdown_torque_pu is not None:
        return rating.breakdown_torque_pu
    if rating.breakdown_torque_nm is not None and rating.power_w and rating.speed_rpm:
        return rating.breakdown_torque_nm / speed_physics.shaft_torque(rating.power_w,
                                                                       rating.speed_rpm)
    return None


def _load_at_site(load_type: str, curve: tuple[str, float, float], speed_rpm: float,
                  available_w: float | None, frequency_ratio: float) -> LoadAtSite:
    """The driven load at the running speed (affinity laws for pumps and fans), and its demand
    at the speed the site frequency sets, judged against the available output."""
    _, t0, n_ref = curve
    torque = loads.torque_curve(*curve)
    ratio = speed_rpm / n_ref
    power = speed_physics.shaft_power(torque(speed_rpm), speed_rpm)
    demand_speed = n_ref * frequency_ratio
    demand = speed_physics.shaft_power(torque(demand_speed), demand_speed)
    flow = head = power_ratio = None
    if load_type == "centrifugal":
        flow, head, power_ratio = loads.affinity(ratio)
    elif load_type == "constant-torque":
        flow = ratio
    fraction = demand / available_w if available_w else None
    return LoadAtSite(type=load_type, reference_speed_rpm=n_ref, speed_ratio=ratio,
                      power_w=power, fraction=fraction, flow_ratio=flow, head_ratio=head,
                      power_ratio=power_ratio, demand_w=demand, demand_speed_rpm=demand_speed,
                      margin=None if fraction is None else 1.0 - fraction)


# ----------------------------------------------------------------------------- currents

def _motor_currents(machine: Machine, choice: RatingChoice, supply: Supply,
                    available_w: float | None, load: LoadAtSite | None,
                    operating: OperatingPoint | None) -> Currents:
    """Full-load, load, formula, code and locked-rotor currents of a motor at the site."""
    rating, c = choice.rating, choice.connection
    v = supply.terminal_voltage_v
    load_a = None if operating is None else operating.current_a
    full = basis = power_ratio = formula = plate_ratio = None
    if available_w is not None:
        power_ratio = available_w / rating.power_w if rating.power_w else 1.0
        if load is not None and c.current_a and load_a is None:
            assert rating.power_w  # a load power needs a rated output
            load_a = current_physics.current_at_site(c.current_a, choice.rated_voltage_v, v,
                                                     load.power_w / rating.power_w)
        eta, pf = rating.efficiency, rating.power_factor
        if eta and pf and rating.power_w:
            formula = current_physics.full_load_current(available_w, v, eta, pf, machine.phases)
            if c.current_a:
                plate_ratio = c.current_a / current_physics.full_load_current(
                    rating.power_w, c.voltage_v, eta, pf, machine.phases)
        if c.current_a:
            full = current_physics.current_at_site(c.current_a, choice.rated_voltage_v, v,
                                                   power_ratio)
            basis = "nameplate"
        elif formula is not None:
            full, basis = formula, "formula"
    code_a, code_hp, power_hp, code_rule = _code_current(machine, choice, supply)
    return Currents(
        full_load_a=full, basis=basis, load_a=load_a, power_ratio=power_ratio, formula_a=formula,
        nameplate_formula_ratio=plate_ratio, code_a=code_a, code_hp=code_hp, power_hp=power_hp,
        conductor_a=None if code_a is None else nec.conductor_current(code_a),
        locked_rotor=_locked_rotor(machine, choice), code_rule=code_rule)


def _code_current(machine: Machine, choice: RatingChoice, supply: Supply
                  ) -> tuple[float | None, int | float | None, float | None, str | None]:
    """(table current, table hp, rated hp, the rule applied) on a NEMA site, by the scope of
    NEC 430.6(A)(1): the table current except for low-speed and multispeed motors, and
    synchronous motors whose power factor has no footnote multiplier."""
    rating, c, site = choice.rating, choice.connection, supply.site
    if site.standard != "NEMA" or not rating.power_w or not supply.phases_ok:
        return None, None, None, None
    power_hp = hp_from_w(rating.power_w)
    table = TABLE_BY_PHASES.get(machine.phases, "Table 430.250")
    scope = f"[{nec.SCOPE_EDITION}] 430.6(A)(1)"
    multispeed = len({r.poles for r in machine.ratings if r.poles is not None}) > 1
    reason = nec.nameplate_reason(
        synchronous_speed_rpm(rating.frequency_hz, choice.poles), multispeed)
    if reason is not None:
        return None, None, power_hp, f"nameplate current: {reason} ({scope})"
    synchronous = machine.kind == "synchronous-motor"
    power_factor = 1.0
    if synchronous:
        if rating.power_factor is None:
            return None, None, power_hp, (
                "nameplate current: no rated power factor to choose the Table 430.250 "
                f"synchronous-motor multiplier ({scope})")
        if nec.sync_multiplier(rating.power_factor) is None:
            return None, None, power_hp, (
                f"nameplate current: rated power factor {rating.power_factor:g} has no "
                "Table 430.250 multiplier (given for unity, 0.9 and 0.8 only; not rounded to "
                f"one) ({scope})")
        power_factor = rating.power_factor
    for volts in (c.voltage_v, site.voltage_v):
        found = nec.table_current(power_hp, volts, machine.phases, synchronous, power_factor)
        if found:
            return found[0], found[1], power_hp, (
                f"table current: {table} ([{nec.TABLE_EDITION}] values), {scope}")
    return None, None, power_hp, (
        f"nameplate current: {table} has no value for {power_hp:.1f} hp at "
        f"{c.voltage_v:g} V ({scope})")


def _locked_rotor(machine: Machine, choice: RatingChoice) -> LockedRotorCurrent | None:
    """Locked-rotor current from the plate, the starting-current ratio or the code letter,
    scaled to the site by the flux ratio."""
    rating, c = choice.rating, choice.connection
    if rating.locked_rotor_current_a is not None:
        index = min(rating.connections.index(c), len(rating.locked_rotor_current_a) - 1)
        value = rating.locked_rotor_current_a[index]
        rated, basis = (value, value), "nameplate locked-rotor current"
    elif rating.starting_current_ratio is not None and c.current_a:
        value = rating.starting_current_ratio * c.current_a
        rated, basis = (value, value), f"Ia/In {rating.starting_current_ratio:g}"
    elif machine.code_letter is not None and rating.power_w:
        rated = starting.locked_rotor_current_from_code(
            machine.code_letter, hp_from_w(rating.power_w), c.voltage_v, machine.phases)
        basis = f"code letter {machine.code_letter}"
    else:
        return None
    k = choice.flux_ratio
    return LockedRotorCurrent(
        rated_low_a=rated[0], rated_high_a=rated[1],
        low_a=starting.locked_rotor_current_at_site(rated[0], k),
        high_a=starting.locked_rotor_current_at_site(rated[1], k), basis=basis)


def _generator_currents(machine: Machine, supply: Supply, available_va: float | None) -> Currents:
    """A generator's line current at its available apparent power (rated current held)."""
    full = None if available_va is None else current_physics.apparent_power_current(
        available_va, supply.terminal_voltage_v, min(machine.phases, supply.site.phases))
    return Currents(
        full_load_a=full, basis=None if full is None else "rated current", load_a=None,
        power_ratio=None, formula_a=None, nameplate_formula_ratio=None, code_a=None,
        code_hp=None, power_hp=None, conductor_a=None, locked_rotor=None)


# ----------------------------------------------------------------------------- plate facts

def _efficiency(machine: Machine, rating: Rating, poles: int) -> ClassCheck | None:
    """The marked IE class beside the class the plate efficiency reaches, or None when the
    IEC 60034-30-1 tables do not cover the machine (not a three-phase induction motor, not
    50/60 Hz)."""
    if machine.kind != "induction-motor" or not rating.power_w or machine.phases != 3:
        return None
    f = rating.frequency_hz
    if not (abs(f - 50) < 1 or abs(f - 60) < 1):
        return None
    return check_marked_class(machine.efficiency_class, rating.efficiency, rating.power_w,
                              poles, f)


def _star_delta(machine: Machine, choice: RatingChoice) -> bool | None:
    """Whether star-delta starting fits: None when the plate has no star and delta pair."""
    connections = choice.rating.connections
    if len(connections) < 2 or machine.phases != 3:
        return None  # a star and a delta connection are two connections
    names = {(c.name or "").strip().lower(): c for c in connections}
    delta = next((c for n, c in names.items() if n in DELTA_NAMES), None)
    star = next((c for n, c in names.items() if n in STAR_NAMES), None)
    if delta is None or star is None:
        return None
    return (choice.connection is delta and abs(choice.flux_ratio - 1.0) <= STAR_DELTA_FLUX_BAND
            and abs(star.voltage_v / delta.voltage_v - star_delta_ratio()) < STAR_DELTA_RATIO_SLACK)
