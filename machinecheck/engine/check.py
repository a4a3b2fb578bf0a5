"""The check engine: (machine, site) -> Assessment with verdict, figures and findings.

The engine picks the rating set and connection, computes every figure with the physics
functions, then asks each rule in :mod:`machinecheck.rules` for findings. It returns data and
never prints. Values are SI floats (W, V, A, Hz, rpm) as in the model.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass, field
from functools import lru_cache
from types import MappingProxyType

from ..errors import DomainError
from ..memo import IdentityMemo
from ..model import Connection, Machine, Rating, Site
from ..physics import circuit as circuit_physics
from ..physics import current as current_physics
from ..physics import environment, frequency, loads, nec, starting, tolerance, unbalance
from ..physics import speed as speed_physics
from ..physics.efficiency import efficiency_class_of, minimum_efficiency

SEVERITIES = ("info", "warning", "problem")
VERDICTS = ("compatible", "conditional", "incompatible")

#: Frequency band of each standard's tolerance (per unit); outside it the machine is re-rated.
FREQUENCY_BAND = {"IEC": (-0.05, 0.03), "NEMA": (-0.05, 0.05)}
#: Range of frequency ratios over which a re-rating from the plate is still meaningful.
RERATING_RANGE = (0.5, 1.5)

DELTA_NAMES = frozenset({"delta", "d", "Δ", "triangle", "dreieck", "low-delta"})
STAR_NAMES = frozenset({"star", "y", "wye", "Y", "yy", "high-star"})


@dataclass(slots=True)
class Finding:
    code: str
    severity: str
    message: str


@dataclass(slots=True)
class Assessment:
    """Everything known about one machine on one site supply."""

    machine: Machine
    site: Site
    rating: Rating
    connection: Connection
    supply_voltage_v: float
    supply_voltage_note: str
    rated_voltage_v: float
    phases_ok: bool
    rerated: bool
    frequency_ratio: float
    flux_ratio: float
    torque_capability: float
    synchronous_speed_rpm: float
    poles: int
    tolerance: Mapping
    factors: dict
    combined_factor: float
    rated_power_w: float
    available_power_w: float | None = None
    rated_apparent_power_va: float | None = None
    available_apparent_power_va: float | None = None
    expected_speed_rpm: float | None = None
    speed_band_rpm: float | None = None
    load_power_w: float | None = None
    load_fraction: float | None = None
    flow_ratio: float | None = None
    head_ratio: float | None = None
    load_speed_ratio: float | None = None
    stalled: bool = False
    full_load_current_a: float | None = None
    operating_current_a: float | None = None
    operating_power_factor: float | None = None
    operating_efficiency: float | None = None
    breakdown_margin: float | None = None
    breakdown_torque_nm: float | None = None
    stall_torque_nm: float | None = None
    operating_point_basis: str | None = None
    circuit: circuit_physics.Circuit | None = None
    circuit_unavailable: str | None = None
    rule_speed_rpm: float | None = None
    current_basis: str | None = None
    formula_current_a: float | None = None
    nameplate_formula_ratio: float | None = None
    locked_rotor_current_a: tuple[float, float] | None = None
    locked_rotor_basis: str | None = None
    code_current_a: float | None = None
    code_current_hp: int | float | None = None  # a whole table size stays an int
    service_factor: float = 1.0
    service_factor_at_site: float = 1.0
    star_delta_possible: bool | None = None
    efficiency_class: str | None = None
    efficiency_class_minimum: float | None = None
    unbalance: float | None = None
    site_derating_domain_error: str | None = None
    slip_model_valid: bool = True
    working: list[str] = field(default_factory=list)
    findings: list[Finding] = field(default_factory=list)
    verdict: str = "compatible"

    def add(self, code: str, severity: str, message: str) -> None:
        self.findings.append(Finding(code, severity, message))


# ----------------------------------------------------------------------------- choices

def supply_voltages(machine: Machine, site: Site) -> list[tuple[float, str]]:
    """Voltages the site offers this machine's winding, with a note of which they are."""
    if machine.phases == 3 or site.phases == 2:
        return [(site.voltage_v, "")]
    if site.phases == 3:
        offered = [(site.voltage_v, "line-to-line")]
        if site.system in (None, "wye"):
            offered.append((site.voltage_v / math.sqrt(3.0), "line-to-neutral"))
        return offered
    if site.system == "split-phase":
        return [(site.voltage_v, "line-to-line"), (site.voltage_v / 2.0, "line-to-neutral")]
    return [(site.voltage_v, "")]


def in_frequency_band(frequency_deviation: float, standard: str) -> bool:
    low, high = FREQUENCY_BAND.get(standard, FREQUENCY_BAND["IEC"])
    return low - 1e-9 <= frequency_deviation <= high + 1e-9


def choose(machine: Machine, site: Site):
    """Pick (rating, connection, supply voltage, note, flux ratio, reference voltage).

    A rating set for the site frequency beats re-rating from another one; then the connection
    (and, for single-phase machines, the supply voltage) whose V/f is nearest the rated V/f.
    """
    ratings = machine.ratings
    offered = supply_voltages(machine, site)
    if len(ratings) == 1 and len(ratings[0].connections) == 1 and len(offered) == 1:
        # one rating, one connection, one supply voltage: nothing to choose between
        rating, (volts, note) = ratings[0], offered[0]
        connection = rating.connections[0]
        k, reference = _flux(connection, volts, site.frequency_hz / rating.frequency_hz)
        return rating, connection, volts, note, k, reference
    matching = [r for r in ratings
                if in_frequency_band(site.frequency_hz / r.frequency_hz - 1.0, site.standard)]
    candidates = matching or list(ratings)
    best: tuple | None = None
    for rating in candidates:
        f_ratio = site.frequency_hz / rating.frequency_hz
        for connection in rating.connections:
            for volts, note in offered:
                k, reference = _flux(connection, volts, f_ratio)
                score = abs(math.log(k)) + 0.001 * abs(math.log(f_ratio))
                if best is None or score < best[0] - 1e-12:
                    best = (score, rating, connection, volts, note, k, reference)
    assert best is not None  # every rating has a connection and every site a voltage
    _, rating, connection, volts, note, k, reference = best
    return rating, connection, volts, note, k, reference


def _flux(connection: Connection, volts: float, f_ratio: float) -> tuple[float, float]:
    """(flux ratio k, reference voltage) of a connection on ``volts`` at ``f_ratio`` x rated f."""
    reference = connection.reference_voltage(volts / f_ratio)
    return (volts / reference) / f_ratio, reference


# ----------------------------------------------------------------------------- engine

def assess(machine: Machine, site: Site, *, explain: bool = False) -> Assessment:
    """Check one machine against one site supply."""
    rating, connection, volts, note, k, reference = choose(machine, site)
    f_ratio = site.frequency_hz / rating.frequency_hz
    f_dev = f_ratio - 1.0
    rerated = not in_frequency_band(f_dev, site.standard)
    poles = machine.poles
    assert poles is not None  # the catalog gives every machine its poles
    n_s = speed_physics.synchronous_speed(site.frequency_hz, poles)
    phases_ok = machine.phases == 1 or site.phases == 3

    a = Assessment(
        machine=machine, site=site, rating=rating, connection=connection,
        supply_voltage_v=volts, supply_voltage_note=note, rated_voltage_v=reference,
        phases_ok=phases_ok, rerated=rerated, frequency_ratio=f_ratio, flux_ratio=k,
        torque_capability=frequency.torque_capability(k), synchronous_speed_rpm=n_s,
        poles=poles, tolerance={}, factors={}, combined_factor=1.0,
        rated_power_w=rating.power_w or 0.0,
        rated_apparent_power_va=rating.apparent_power_va)
    w = a.working if explain else None
    if w is not None:
        _explain_choice(a, w)

    _tolerance(a, w)
    _factors(a, w)
    if machine.is_generator:
        _generator(a, w)
    else:
        _motor_speed_and_load(a, w)
        _motor_current(a, w)
        _starting(a, w)
        _code_current(a, w)
        _efficiency(a)
    _service_factor(a)
    _star_delta(a)

    for rule in _rules():
        rule(a)
    a.verdict = verdict_of(a.findings)
    return a


def verdict_of(findings) -> str:
    """The verdict the worst finding gives: problem -> incompatible, warning -> conditional."""
    verdict = "compatible"
    for f in findings:
        if f.severity == "problem":
            return "incompatible"
        if f.severity == "warning":
            verdict = "conditional"
    return verdict


def _rules():
    global _RULES
    if _RULES is None:
        from ..rules import RULES  # rules import this module's names: bound on first use

        _RULES = RULES
    return _RULES


_RULES = None


def assess_all(machines, sites, *, explain: bool = False, progress=None) -> list[Assessment]:
    """Check every machine against every site; ``progress`` is called once per machine."""
    results = []
    for machine in machines:
        for site in sites:
            results.append(assess(machine, site, explain=explain))
        if progress is not None:
            progress()
    return results


def _explain_choice(a: Assessment, w: list[str]) -> None:
    r, c = a.rating, a.connection
    sets = len(a.machine.ratings)
    w.append(f"rating set: {r.frequency_hz:g} Hz (of {sets}); connection "
             f"{c.name or 'as stamped'} at {_volts(c)}; supply {a.supply_voltage_v:.0f} V "
             f"{a.supply_voltage_note}".rstrip())
    w.append(f"synchronous speed n_s = 120 f / p = 120 x {a.site.frequency_hz:g} / {a.poles} = "
             f"{a.synchronous_speed_rpm:.0f} rpm")
    w.append(f"flux ratio k = (V / V_rated) / (f / f_rated) = ({a.supply_voltage_v:.1f} / "
             f"{a.rated_voltage_v:.1f}) / ({a.site.frequency_hz:g} / {r.frequency_hz:g}) = "
             f"{a.flux_ratio:.3f}; torque capability k^2 = {a.torque_capability:.3f}")


def _volts(c: Connection) -> str:
    if c.is_range:
        return f"{c.voltage_min_v:g}-{c.voltage_max_v:g} V"
    return f"{c.voltage_min_v:g} V"


def _tolerance(a: Assessment, w) -> None:
    site, c = a.site, a.connection
    a.tolerance = tolerance_figures(
        site.standard, a.machine.is_generator, a.rerated, a.supply_voltage_v, site.voltage_v,
        site.voltage_range_v, c.voltage_min_v, c.voltage_max_v, a.frequency_ratio, a.flux_ratio)
    if w is not None:
        result = a.tolerance
        df = 0.0 if a.rerated else a.frequency_ratio - 1.0
        where = "zone " + str(result.get("zone")) if result.get("zone") is not None else (
            "within" if result["within"] else "outside")
        w.append(f"tolerance ({site.standard}, {result['basis']} point): dV = "
                 f"{100 * result['voltage_deviation']:+.1f} %, df = {100 * df:+.1f} % -> {where}")


@lru_cache(maxsize=8192)  # a fleet meets few distinct supply and winding voltages
def tolerance_figures(standard: str, generator: bool, rerated: bool, supply_voltage_v: float,
                      site_voltage_v: float, site_voltage_range_v, rated_min_v: float,
                      rated_max_v: float, frequency_ratio: float, flux_ratio: float):
    """Where the supply sits in the tolerance of ``standard``: a read-only mapping, shared by
    every pair with these figures.

    Keys: standard, basis ("rated", or "re-rated" when judged as flux at the new frequency),
    voltage_deviation, frequency_deviation, within, zone (IEC) or combined_variation (NEMA),
    and worst_voltage_deviation over the site's voltage range.
    """
    if rerated:
        dv, df = flux_ratio - 1.0, 0.0
        basis = "re-rated"
    else:
        dv = tolerance.voltage_deviation(supply_voltage_v, rated_min_v, rated_max_v)
        df = frequency_ratio - 1.0
        basis = "rated"
    points = [(dv, df)]
    if site_voltage_range_v is not None and not rerated:
        scale = supply_voltage_v / site_voltage_v
        for end in site_voltage_range_v:
            points.append((tolerance.voltage_deviation(end * scale, rated_min_v, rated_max_v), df))
    elif site_voltage_range_v is not None:
        for end in site_voltage_range_v:
            points.append((flux_ratio * end / site_voltage_v - 1.0, df))
    result = {"standard": standard, "basis": basis, "voltage_deviation": dv,
              "frequency_deviation": frequency_ratio - 1.0}
    if standard == "NEMA" and not generator:
        checks = [tolerance.nema_variation(*p) for p in points]
        result["within"] = all(ok for ok, _ in checks)
        result["combined_variation"] = max(comb for _, comb in checks)
        result["zone"] = None
        worst = max(points, key=lambda p: abs(p[0]) + abs(p[1]))
    else:
        order = {"A": 0, "B": 1, None: 2}
        zones = [tolerance.iec_zone(*p, generator=generator) for p in points]
        worst_zone = max(zones, key=lambda z: order[z])
        result["zone"] = worst_zone
        result["within"] = worst_zone is not None
        worst = points[zones.index(worst_zone)]
    result["worst_voltage_deviation"] = worst[0]
    return MappingProxyType(result)


def _factors(a: Assessment, w) -> None:
    m, site = a.machine, a.site
    factors = {}
    if a.rerated and not m.is_generator:
        factors["frequency"] = frequency.frequency_output_factor(a.frequency_ratio, a.flux_ratio)
        factors["overflux"] = frequency.overflux_derating(a.flux_ratio)
        factors["cooling"] = frequency.cooling_derating(a.frequency_ratio, m.cooling)
    if m.is_generator:
        # rated current is the thermal limit: kVA follows the terminal voltage
        factors["voltage"] = min(1.0, a.supply_voltage_v / a.rated_voltage_v)
    if m.phases == 3 and site.phases == 3 and not m.is_generator:
        u = site.unbalance
        if u is None and site.line_voltages_v is not None:
            u = unbalance.voltage_unbalance(site.line_voltages_v)
        a.unbalance = u
        if u is not None:
            factors["unbalance"] = unbalance.unbalance_derating(min(u, unbalance.UNBALANCE_LIMIT))
    altitude = site.altitude_m - (m.rated_altitude_m - environment.RATED_ALTITUDE_M)
    ambient = site.ambient_degc - (m.rated_ambient_degc - environment.RATED_AMBIENT_DEGC)
    try:
        site_factor = environment.site_derating(altitude, ambient)
    except DomainError as exc:
        a.site_derating_domain_error = str(exc)
        site_factor = environment.site_derating(min(altitude, environment.MAX_ALTITUDE_M),
                                                min(ambient, environment.MAX_AMBIENT_DEGC))
    factors["site"] = min(1.0, site_factor)
    a.factors = factors
    combined = 1.0
    for value in factors.values():
        combined *= value
    a.combined_factor = combined
    if a.phases_ok:
        if m.is_generator:
            a.available_apparent_power_va = (a.rated_apparent_power_va or 0.0) * combined
            a.available_power_w = a.available_apparent_power_va * (a.rating.power_factor or 0.8)
        else:
            a.available_power_w = a.rated_power_w * combined
    if w is not None:
        text = " x ".join(f"{name} {value:.3f}" for name, value in factors.items())
        w.append(f"derating factors: {text} = {combined:.3f}")
        if "frequency" in factors:
            w.append(f"  frequency: min(1, (f / f_rated) x min(1, k)) = min(1, "
                     f"{a.frequency_ratio:.3f} x {min(1.0, a.flux_ratio):.3f})")
        if a.available_power_w is not None and not m.is_generator:
            w.append(f"available output = {a.rated_power_w / 1000:.2f} kW x {combined:.3f} = "
                     f"{a.available_power_w / 1000:.2f} kW")


def _rated_torque(a: Assessment) -> float | None:
    rating = a.rating
    if not rating.power_w:
        return None
    speed = rating.speed_rpm or 120.0 * rating.frequency_hz / a.poles
    return speed_physics.shaft_torque(rating.power_w, speed)


def _motor_speed_and_load(a: Assessment, w) -> None:
    m, rating = a.machine, a.rating
    n_s = a.synchronous_speed_rpm
    n_s_rated = 120.0 * rating.frequency_hz / a.poles
    n_ref = rating.speed_rpm or n_s_rated  # the load's figures are given at this speed
    t_rated = _rated_torque(a)
    load = m.load
    if load is not None:
        t0 = load.torque_nm if load.torque_nm is not None else speed_physics.shaft_torque(
            load.power_w, n_ref)  # type: ignore[arg-type]  # the catalog gives one of the two
        curve = (load.type, t0, n_ref)
    elif a.available_power_w:
        # no load given: the motor is taken to deliver its available output at any speed
        curve = ("constant-power", a.available_power_w * 30.0 / math.pi, 1.0)
    else:
        curve = None
    load_torque = None if curve is None else loads.torque_curve(*curve)

    if not a.phases_ok:
        return
    if m.is_synchronous:
        a.expected_speed_rpm = n_s
        if w is not None:
            w.append(f"synchronous motor: runs at n_s = {n_s:.0f} rpm")
    elif rating.speed_rpm is not None and t_rated and load_torque is not None:
        n_rule, tau = _rule_speed(a, curve, load_torque, t_rated, w)
        a.rule_speed_rpm = n_rule
        circuit = a.circuit = _estimate_circuit(a)
        if circuit is None:
            a.operating_point_basis = "slip rule"
            a.slip_model_valid = (0.8 <= a.flux_ratio <= 1.2) and (tau is None or tau <= 1.5)
            n = n_rule
            a.stalled = n is None
        else:
            a.operating_point_basis = "equivalent circuit"
            n = _circuit_point(a, circuit, load_torque, w)
        if n is not None:
            a.expected_speed_rpm = n
            a.speed_band_rpm = 0.2 * (n_s - n)  # NEMA MG 1 / IEC 60034-1: slip +-20 %
    if load is not None and load_torque is not None and a.expected_speed_rpm is not None:
        n = a.expected_speed_rpm
        ratio = n / n_ref
        a.load_speed_ratio = ratio
        a.load_power_w = load_torque(n) * n * math.pi / 30.0
        if a.available_power_w:
            a.load_fraction = a.load_power_w / a.available_power_w
        if load.type == "centrifugal":
            a.flow_ratio, a.head_ratio, _ = loads.affinity(ratio)
        elif load.type == "constant-torque":
            a.flow_ratio = ratio
        if w is not None:
            w.append(f"load ({load.type}): speed ratio n / n_rated = {n:.0f} / {n_ref:.0f} = "
                     f"{ratio:.3f}; load power = {a.load_power_w / 1000:.2f} kW")


def _rule_speed(a: Assessment, curve, load_torque, t_rated: float, w):
    """Running speed by the linear slip rule (the cross-check): (speed or None, T / T_rated)."""
    rating = a.rating
    n_s = a.synchronous_speed_rpm
    slip_rated = 120.0 * rating.frequency_hz / a.poles - rating.speed_rpm  # type: ignore[operator]  # the caller checked it
    k = a.flux_ratio
    load_type, t0, n0 = curve
    n = speed_physics.slip_rule_speed(n_s, slip_rated, t_rated, k, t0,
                                      loads.TORQUE_EXPONENT[load_type], n0)
    if n is None:
        return None, None
    tau = load_torque(n) / t_rated
    if w is not None:
        w.append(f"slip rule: slip at rated = {slip_rated:.1f} rpm; at the site slip = "
                 f"{slip_rated:.1f} x T/T_rated {tau:.3f} / k^2 {k * k:.3f} = {n_s - n:.1f} rpm -> "
                 f"n = {n:.0f} rpm")
    return n, tau


def _estimate_circuit(a: Assessment):
    """The rating set's equivalent circuit, or None with the reason kept in the Assessment."""
    m, rating, c = a.machine, a.rating, a.connection
    if m.kind != "induction-motor" or m.phases != 3:
        return None  # the estimate covers three-phase induction motors; the rules serve the rest
    current = c.current_a
    if c.is_range and current is not None and a.rated_voltage_v != c.voltage_v:
        current = current * c.voltage_v / a.rated_voltage_v
    try:
        # positional: the cache's key is built several times faster than with keywords
        return circuit_physics.estimate(
            rating.power_w, a.rated_voltage_v, rating.frequency_hz, a.poles, rating.speed_rpm,
            current, rating.power_factor, rating.efficiency, m.design_letter)
    except DomainError as exc:
        a.circuit_unavailable = str(exc)
        return None


def _circuit_point(a: Assessment, circuit: circuit_physics.Circuit, load_torque, w):
    """Solve the circuit at the site; fills the operating figures and returns the speed."""
    site = a.site
    op = circuit_physics.solve(circuit, a.supply_voltage_v, site.frequency_hz, load_torque)
    if w is not None:
        w.append(f"equivalent circuit (per phase, star, at {circuit.frequency_hz:g} Hz): "
                 f"R1 {circuit.r1_ohm:.4g}, X1 {circuit.x1_ohm:.4g}, R2' {circuit.r2_ohm:.4g}, "
                 f"X2' {circuit.x2_ohm:.4g}, Xm {circuit.xm_ohm:.4g} ohm; rotational loss "
                 f"{circuit.rotational_loss_w:.0f} W")
    if op is None:
        a.stalled = True
        a.breakdown_torque_nm, s_max = circuit_physics.breakdown(
            circuit, a.supply_voltage_v, site.frequency_hz)
        a.stall_torque_nm = load_torque((1.0 - s_max) * a.synchronous_speed_rpm)
        if w is not None:
            w.append(f"  at {a.supply_voltage_v:.0f} V {site.frequency_hz:g} Hz: breakdown torque "
                     f"{a.breakdown_torque_nm:.1f} N m is below the {a.stall_torque_nm:.1f} N m "
                     "asked of it: no stable running point")
        return None
    a.breakdown_torque_nm = op.breakdown_torque_nm
    load = load_torque(op.speed_rpm)
    a.operating_current_a = op.current_a
    a.operating_power_factor = op.power_factor
    a.operating_efficiency = op.efficiency
    a.breakdown_margin = op.breakdown_torque_nm / load if load > 0 else None
    if w is not None:
        margin = "" if a.breakdown_margin is None else f"; breakdown {a.breakdown_margin:.2f} x load"
        w.append(f"  at {a.supply_voltage_v:.0f} V {site.frequency_hz:g} Hz and {load:.1f} N m: "
                 f"slip {100 * op.slip:.2f} % -> n = {op.speed_rpm:.0f} rpm, I = "
                 f"{op.current_a:.1f} A, PF {op.power_factor:.3f}, eta {op.efficiency:.3f}{margin}")
    return op.speed_rpm


def _motor_current(a: Assessment, w) -> None:
    m, rating, c = a.machine, a.rating, a.connection
    if not a.phases_ok:
        return
    phases = m.phases
    eta, pf = rating.efficiency, rating.power_factor
    output = a.available_power_w
    if output is None:
        return
    power_ratio = output / rating.power_w if rating.power_w else 1.0
    if a.load_power_w is not None and c.current_a and a.operating_current_a is None:
        a.operating_current_a = current_physics.current_at_site(
            c.current_a, a.rated_voltage_v, a.supply_voltage_v,
            a.load_power_w / rating.power_w)  # type: ignore[operator]  # a motor has its output
    if eta and pf and rating.power_w:
        a.formula_current_a = current_physics.full_load_current(
            output, a.supply_voltage_v, eta, pf, phases)
        if c.current_a:
            rated_formula = current_physics.full_load_current(
                rating.power_w, c.voltage_v, eta, pf, phases)
            a.nameplate_formula_ratio = c.current_a / rated_formula
    if c.current_a:
        a.full_load_current_a = current_physics.current_at_site(
            c.current_a, a.rated_voltage_v, a.supply_voltage_v, power_ratio)
        a.current_basis = "nameplate"
        if w is not None:
            w.append(f"current: I = I_rated x P / P_rated x V_rated / V = {c.current_a:.1f} x "
                     f"{power_ratio:.3f} x {a.rated_voltage_v:.0f} / {a.supply_voltage_v:.0f} = "
                     f"{a.full_load_current_a:.1f} A")
    elif a.formula_current_a is not None:
        a.full_load_current_a = a.formula_current_a
        a.current_basis = "formula"
    if w is not None and a.formula_current_a is not None:
        root = "sqrt(3) x " if phases == 3 else ""
        w.append(f"current from ratings: I = P / ({root}V x eta x PF) = {output:.0f} / ({root}"
                 f"{a.supply_voltage_v:.0f} x {eta:.3f} x {pf:.2f}) = {a.formula_current_a:.1f} A")


def _starting(a: Assessment, w) -> None:
    rating, c, m = a.rating, a.connection, a.machine
    index = rating.connections.index(c)
    rated = None
    if rating.locked_rotor_current_a is not None:
        value = rating.locked_rotor_current_a[min(index, len(rating.locked_rotor_current_a) - 1)]
        rated, basis = (value, value), "nameplate locked-rotor current"
    elif rating.starting_current_ratio is not None and c.current_a:
        value = rating.starting_current_ratio * c.current_a
        rated, basis = (value, value), f"Ia/In {rating.starting_current_ratio:g}"
    elif m.code_letter is not None and rating.power_w:
        hp = rating.power_w / 745.6998715822701
        rated = starting.locked_rotor_current_from_code(m.code_letter, hp, c.voltage_v, m.phases)
        basis = f"code letter {m.code_letter}"
    if rated is None:
        return
    k = a.flux_ratio
    low, high = (starting.locked_rotor_current_at_site(x, k) for x in rated)
    a.locked_rotor_current_a = (low, high)
    a.locked_rotor_basis = basis
    if w is not None:
        w.append(f"locked-rotor current ({basis}) at rated supply {rated[0]:.0f}"
                 f"{'' if rated[1] == rated[0] else f'-{rated[1]:.0f}'} A, x k {k:.3f} at the site")


def _code_current(a: Assessment, w) -> None:
    m, rating, site = a.machine, a.rating, a.site
    if site.standard != "NEMA" or not rating.power_w or not a.phases_ok:
        return
    hp = rating.power_w / 745.6998715822701
    synchronous = m.kind == "synchronous-motor"
    # only a synchronous motor's table current depends on its power factor: leaving it out
    # otherwise lets the cache serve every induction motor of a size and voltage
    power_factor = (rating.power_factor or 1.0) if synchronous else 1.0
    found = None
    for volts in (a.connection.voltage_v, site.voltage_v):
        found = nec.table_current(hp, volts, m.phases, synchronous, power_factor)  # cache key
        if found:
            break
    if found:
        a.code_current_a, a.code_current_hp = found
        if w is not None:
            w.append(f"NEC table current: {hp:.2f} hp -> {a.code_current_hp:g} hp -> "
                     f"{a.code_current_a:g} A; conductors 125 % = "
                     f"{nec.CONDUCTOR_FACTOR * a.code_current_a:.1f} A")


def _efficiency(a: Assessment) -> None:
    rating, m = a.rating, a.machine
    if m.kind != "induction-motor" or not rating.power_w or m.phases != 3:
        return
    f = rating.frequency_hz
    if not (abs(f - 50) < 1 or abs(f - 60) < 1):
        return
    if rating.efficiency is not None:
        a.efficiency_class = efficiency_class_of(rating.efficiency, rating.power_w, a.poles, f)
    if m.efficiency_class is not None:
        a.efficiency_class_minimum = minimum_efficiency(m.efficiency_class, rating.power_w,
                                                        a.poles, f)


def _service_factor(a: Assessment) -> None:
    sf = a.rating.service_factor or a.machine.service_factor
    a.service_factor = sf
    clean = (not a.rerated and min(a.factors.values(), default=1.0) >= 0.999
             and abs(a.tolerance.get("voltage_deviation", 0.0)) <= 0.05
             and abs(a.frequency_ratio - 1.0) <= 0.01)
    a.service_factor_at_site = sf if clean else 1.0


_STAR_DELTA = IdentityMemo(100_000)  # rating -> (delta, star): names read once a rating


def _star_delta_pair(rating: Rating):
    cached = _STAR_DELTA.get(rating)
    if cached is not None:
        return cached
    names = {(c.name or "").strip().lower(): c for c in rating.connections}
    delta = next((c for n, c in names.items() if n in DELTA_NAMES), None)
    star = next((c for n, c in names.items() if n in STAR_NAMES), None)
    return _STAR_DELTA.put(rating, (delta, star))


def _star_delta(a: Assessment) -> None:
    delta, star = _star_delta_pair(a.rating)
    if delta is None or star is None or a.machine.phases != 3:
        a.star_delta_possible = None
        return
    a.star_delta_possible = (a.connection is delta and abs(a.flux_ratio - 1.0) <= 0.10
                             and abs(star.voltage_v / delta.voltage_v - math.sqrt(3.0)) < 0.1)


def _generator(a: Assessment, w) -> None:
    site = a.site
    a.expected_speed_rpm = a.synchronous_speed_rpm
    if a.available_apparent_power_va is not None:
        a.full_load_current_a = current_physics.apparent_power_current(
            a.available_apparent_power_va, a.supply_voltage_v, min(a.machine.phases, site.phases))
        a.current_basis = "rated current"
    if w is not None:
        w.append(f"generator: shaft speed for {site.frequency_hz:g} Hz = 120 f / p = "
                 f"{a.synchronous_speed_rpm:.0f} rpm; voltage at rated flux = "
                 f"{a.rated_voltage_v:.0f} x {a.frequency_ratio:.3f} = "
                 f"{a.rated_voltage_v * a.frequency_ratio:.0f} V")
        if a.available_apparent_power_va is not None:
            rated_va: float = a.rated_apparent_power_va  # type: ignore[assignment]  # as available
            w.append(f"available = {rated_va / 1000:.1f} kVA x "
                     f"{a.combined_factor:.3f} = {a.available_apparent_power_va / 1000:.1f} kVA; "
                     f"I = S / (sqrt(3) V) = {a.full_load_current_a:.1f} A")
