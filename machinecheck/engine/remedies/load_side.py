"""Remedies on the load side and the replacement motor: pulley ratio, impeller trim, a new
motor specified for the site, and its energy figures."""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Iterator

from ...model import Connection, Load, Machine, Rating
from ...physics import efficiency as ie
from ...physics import energy as en
from ...physics import loads
from ...physics import speed_fix as sf
from ...physics.constants import hp_from_w, synchronous_speed_rpm
from ..assessment import Assessment
from .records import Energy
from .supply_side import Candidate

#: Largest single-phase motor offered as a replacement for a three-phase one: about 7.5 kW
#: (10 hp). Common practice, no published source: larger single-phase motors are rare and
#: the supply rarely carries their starting current.
SINGLE_PHASE_MAX_W = 7500.0

PUMP_SPEED_CAUTION = ("a pump run faster sees the head on its casing rise as the speed squared "
                      "and needs more NPSH: check both with the pump maker")
ENERGY_CAUTION = ("energy figures use full-load efficiencies (the plate's and the class "
                  "minimum): give part-load values for a figure at the actual load")
CLASS_CHANGE_CAUTION = ("a higher efficiency class usually means less slip, so a centrifugal "
                        "load turns a little faster and draws more power, and often a higher "
                        "inrush: re-check instantaneous-trip settings")


def referred_load(load: Load, factor: float) -> Load:
    """The load as the motor shaft sees it through a speed ratio ``factor`` (load speed over
    motor speed): torque and power at the motor's reference speed scale by factor^(e+1), e the
    load's torque exponent (torque ~ n^e); inertia by factor^2; the load's speed limit by
    1/factor."""
    scale = factor ** (loads.TORQUE_EXPONENT[load.type] + 1)
    return dataclasses.replace(
        load,
        power_w=None if load.power_w is None else load.power_w * scale,
        torque_nm=None if load.torque_nm is None else load.torque_nm * scale,
        max_speed_rpm=None if load.max_speed_rpm is None else load.max_speed_rpm / factor,
        breakaway_torque_nm=(None if load.breakaway_torque_nm is None
                             else load.breakaway_torque_nm * factor),
        breakaway_torque_pu=(None if load.breakaway_torque_pu is None
                             else load.breakaway_torque_pu * factor),
        inertia_kgm2=None if load.inertia_kgm2 is None else load.inertia_kgm2 * factor ** 2)


def _speeds(a: Assessment) -> tuple[float, float] | None:
    """(motor speed the load was set for, motor speed at the site) when both are known."""
    n_old = a.choice.rating.speed_rpm
    n_new = a.running.expected_speed_rpm
    if n_old is None or n_new is None or n_new <= 0.0:
        return None
    return n_old, n_new


def pulley(a: Assessment) -> Iterator[Candidate]:
    """The pulley (or gear) ratio restoring the load's speed after a change of frequency."""
    m, speeds = a.machine, _speeds(a)
    if m.load is None or speeds is None or not a.supply.rerated or m.is_generator:
        return
    n_old, n_new = speeds
    factor = sf.motor_pulley_factor(n_old, n_new)
    machine = dataclasses.replace(m, load=referred_load(m.load, factor))
    figures: list[tuple[str, float]] = [("motor_pulley_factor", factor),
                                        ("motor_speed_rpm", n_new), ("load_speed_rpm", n_old)]
    available, rated = a.running.available_power_w, a.running.rated_power_w
    load0 = a.running.load
    if available and rated and load0 is not None:
        p0 = load0.power_w / (load0.power_ratio or load0.speed_ratio ** (
            loads.TORQUE_EXPONENT[m.load.type] + 1))
        figures.append(("restored_loading", sf.restored_loading(p0, rated, available / rated)))
    yield ("pulley",
           f"change the motor pulley by x {factor:.3f} (or the driven pulley by x "
           f"{1 / factor:.3f}, or the gear ratio alike) so the load turns at its former "
           f"{n_old:.0f} rpm",
           tuple(figures), ("belt speed and belt rating change with the pulley: check them",),
           1, machine, a.site)


def impeller_trim(a: Assessment) -> Iterator[Candidate]:
    """An impeller trim keeping a faster-running pump within the motor's output."""
    m, load = a.machine, a.running.load
    if (m.load is None or load is None or load.type != "centrifugal"
            or not a.running.available_power_w or load.reference_speed_rpm <= 0.0):
        return
    # judged, as the load rule judges it, at the speed the site frequency sets
    ratio = load.demand_speed_rpm / load.reference_speed_rpm
    if ratio <= 1.0:
        return
    p0 = load.demand_w / ratio ** 3
    limit = a.running.available_power_w / p0 * (1.0 - 1e-9)
    if limit >= ratio ** 3:
        return
    trim = sf.trim_to_motor(ratio, limit, min_flow_ratio=1.0)
    d = trim.diameter_ratio
    machine = dataclasses.replace(m, load=dataclasses.replace(
        m.load, power_w=None if m.load.power_w is None else m.load.power_w * d ** 3,
        torque_nm=None if m.load.torque_nm is None else m.load.torque_nm * d ** 3))
    cautions = [PUMP_SPEED_CAUTION]
    if not trim.within_trim_limit:
        cautions.append(f"a trim to {d:.2f} of the diameter is beyond {sf.TRIM_LIMIT:.2f}, where "
                        "the affinity laws stop being a fair estimate: ask the pump maker")
    if not trim.flow_met:
        cautions.append(f"no trim keeps both: at {d:.3f} the flow is {trim.flow_ratio:.2f} x the "
                        "former flow while the motor is fully loaded")
    yield ("impeller-trim",
           f"trim the impeller to {d:.3f} of its diameter: flow {trim.flow_ratio:.2f} x, head "
           f"{trim.head_ratio:.2f} x, power {trim.power_ratio:.2f} x the former duty",
           (("diameter_ratio", d), ("flow_ratio", trim.flow_ratio),
            ("head_ratio", trim.head_ratio), ("power_ratio", trim.power_ratio),
            ("acceptable", 1.0 if trim.acceptable else 0.0)),
           tuple(cautions), 1, machine, a.site)


def replacement_machine(a: Assessment, required_class: str | None) -> Machine | None:
    """A motor specified for the site: the present output (or the load's, if larger) at the
    site's voltage and frequency, the same poles, rated for the site's ambient and altitude,
    enclosure, cooling and service factor carried over. Its rated speed carries the present
    motor's slip (an estimate), its efficiency the class minimum (IEC 60034-30-1)."""
    m, r, site = a.machine, a.choice.rating, a.site
    if m.is_synchronous or r.power_w is None or r.speed_rpm is None:
        return None
    power = r.power_w
    if m.load is not None and m.load.power_w is not None:
        power = max(power, m.load.power_w)
    poles = a.choice.poles
    slip = 1.0 - r.speed_rpm / synchronous_speed_rpm(r.frequency_hz, poles)
    efficiency = r.efficiency
    if required_class is not None and required_class.upper() in ie.CLASSES:
        eta = ie.minimum_efficiency(required_class.upper(), power, poles, site.frequency_hz)
        if math.isfinite(eta):
            efficiency = eta
    phases = site.phases if m.phases == 3 else 1
    if phases < m.phases and power > SINGLE_PHASE_MAX_W:
        return None
    rating = Rating(frequency_hz=site.frequency_hz,
                    connections=(Connection(None, site.voltage_v, site.voltage_v),),
                    power_w=power, speed_rpm=synchronous_speed_rpm(site.frequency_hz, poles)
                    * (1.0 - slip), power_factor=r.power_factor, efficiency=efficiency,
                    service_factor=a.running.service_factor, poles=r.poles)
    load = m.load
    if load is not None:
        # a pulley keeps the load's former speed: the new reference speed meets the former
        # power; torque, speed limit and inertia are referred through the ratio
        factor = r.speed_rpm / rating_speed(rating)
        load = dataclasses.replace(
            referred_load(load, factor), power_w=load.power_w,
            torque_nm=None if load.torque_nm is None else load.torque_nm * factor)
    return dataclasses.replace(
        m, phases=phases, ratings=(rating,), efficiency_class=required_class, circuit=None,
        load=load, service_factor=a.running.service_factor,
        rated_ambient_degc=max(m.rated_ambient_degc, site.ambient_degc),
        rated_altitude_m=max(m.rated_altitude_m, site.altitude_m))


def replacement(a: Assessment, required_class: str | None, class_source: str
                ) -> Iterator[Candidate]:
    """The replacement specification as a procurement line."""
    new = replacement_machine(a, required_class)
    if new is None:
        return
    r = new.ratings[0]
    assert r.power_w is not None and r.speed_rpm is not None
    site = a.site
    klass = (f"{required_class} ({class_source})" if required_class
             else "as the user's policy (no region or required class given)")
    old_speed = a.choice.rating.speed_rpm or r.speed_rpm
    line = (f"motor {r.power_w / 1000:.2f} kW ({hp_from_w(r.power_w):.1f} hp) or the next "
            f"catalogued size above, {a.choice.poles} poles, {site.voltage_v:.0f} V "
            f"{site.frequency_hz:g} Hz {'3' if new.phases == 3 else '1'}-phase, efficiency class "
            f"{klass}, frame family, enclosure and cooling {m_cooling(a)} as "
            f"the present motor, service factor {new.service_factor:g}, rated for "
            f"{new.rated_ambient_degc:.0f} degC and {new.rated_altitude_m:.0f} m")
    cautions = [CLASS_CHANGE_CAUTION]
    if abs(r.speed_rpm / old_speed - 1.0) > 0.02 and a.machine.load is not None:
        cautions.append(f"the new motor turns about {r.speed_rpm:.0f} rpm against the former "
                        f"{old_speed:.0f} rpm: change the pulley by x {old_speed / r.speed_rpm:.3f} "
                        "to keep the load's speed (figures re-checked with the load's speed kept)")
    cautions.append("rated speed estimated from the present motor's slip, efficiency from the "
                    "class minimum: estimates until a datasheet is chosen")
    yield ("replacement", line,
           (("power_w", r.power_w), ("power_hp", hp_from_w(r.power_w)),
            ("poles", float(a.choice.poles)), ("voltage_v", site.voltage_v),
            ("frequency_hz", site.frequency_hz), ("efficiency", r.efficiency or math.nan)),
           tuple(cautions), 2, new, site)


def m_cooling(a: Assessment) -> str:
    """The cooling code carried over."""
    return a.machine.cooling


def energy(a: Assessment, efficiency_new: float | None) -> tuple[Energy | None, str | None]:
    """Energy, cost and payback of the replacement; (None, the missing input) without them."""
    use, r = a.machine.use, a.choice.rating
    missing = []
    if use is None or use.time_per_year_s is None:
        missing.append("running hours (machine.use.hours)")
    if use is None or use.load_factor is None:
        missing.append("load factor (machine.use.load_factor)")
    if r.efficiency is None:
        missing.append("the present motor's efficiency (plate)")
    if efficiency_new is None or not math.isfinite(efficiency_new):
        missing.append("the replacement's efficiency (no class required)")
    if missing or use is None or r.power_w is None:
        return None, "no energy figures: missing " + ", ".join(missing or ["rated output"])
    assert use.time_per_year_s is not None and use.load_factor is not None
    assert r.efficiency is not None and efficiency_new is not None
    saving = en.power_saving_w(r.power_w, use.load_factor, r.efficiency, efficiency_new)
    energy_j = en.annual_energy_j(saving, use.time_per_year_s)
    tariff = a.site.tariff
    cost = payback = None
    notes = []
    if tariff is None or tariff.energy_per_kwh is None:
        notes.append("tariff (site.tariff.energy)")
    else:
        cost = en.energy_cost(energy_j, tariff.energy_per_kwh)
        if use.replacement_price is None:
            notes.append("price (machine.use.replacement_price)")
        else:
            payback = en.simple_payback_years(use.replacement_price, cost)
    return Energy(power_saving_w=saving, annual_energy_j=energy_j, efficiency_old=r.efficiency,
                  efficiency_new=efficiency_new, annual_cost=cost,
                  currency=None if tariff is None else tariff.currency, payback_years=payback,
                  missing=("no cost or payback: missing " + ", ".join(notes)) if notes else None
                  ), None


def rating_speed(rating: Rating) -> float:
    """The rated speed of a rating built here (always given) [rpm]."""
    assert rating.speed_rpm is not None
    return rating.speed_rpm
