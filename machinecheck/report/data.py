"""Assessment -> plain dict in output units: the one shape every renderer reads."""

from __future__ import annotations

import math
from collections.abc import Iterable
from typing import Any

from ..engine.assessment import SEVERITIES, VERDICTS, Assessment, Finding, Tolerance
from ..engine.remedies import Remedy
from ..rules.regulation import RegulationFinding


def _round(value: float | None, digits: int) -> float | None:
    """``value`` rounded to ``digits`` decimals for output; None stays None."""
    return None if value is None else round(float(value), digits)


def _kilo(value: float | None, digits: int) -> float | None:
    """A figure in W or VA shown in kW or kVA, rounded; None stays None."""
    return None if value is None else round(value / 1000.0, digits)


def _tolerance_dict(t: Tolerance) -> dict[str, Any]:
    """The "tolerance" part of a result."""
    return {"standard": t.standard, "basis": t.basis, "zone": t.zone, "within": t.within,
            "voltage_deviation": _round(t.voltage_deviation, 4),
            "frequency_deviation": _round(t.frequency_deviation, 4),
            "combined_variation": _round(t.combined_variation, 4)}


def result_dict(a: Assessment, *, explain: bool = False) -> dict[str, Any]:
    """The JSON contract of one (machine, site) result; see docs/json.md."""
    choice, supply, running = a.choice, a.supply, a.running
    currents, operating, load = running.currents, running.operating, running.load
    lrc = currents.locked_rotor
    data: dict[str, Any] = {
        "machine": a.machine.id,
        "site": a.site.id,
        "verdict": a.verdict,
        "rating": {"frequency_hz": _round(choice.rating.frequency_hz, 3),
                   "voltage_v": _round(choice.rated_voltage_v, 1),
                   "connection": choice.connection.name},
        "synchronous_speed_rpm": _round(running.synchronous_speed_rpm, 1),
        "expected_speed_rpm": _round(running.expected_speed_rpm, 1),
        "available_power_kw": _kilo(running.available_power_w, 2),
        "load_power_kw": None if load is None else _kilo(load.power_w, 2),
        "full_load_current_a": _round(currents.full_load_a, 1),
        "flux_ratio": _round(choice.flux_ratio, 4),
        "findings": [_finding(f) for f in a.findings],
        "rated_power_kw": _kilo(running.rated_power_w, 2),
        "supply_voltage_v": _round(supply.terminal_voltage_v, 1),
        "poles": choice.poles,
        "rerated": supply.rerated,
        "speed_tolerance_rpm": _round(running.speed_band_rpm, 1),
        "torque_capability": _round(running.torque_capability, 4),
        "tolerance": _tolerance_dict(supply.tolerance),
        "derating": {name: _round(value, 4) for name, value in running.derates.factors},
        "combined_derating": _round(running.derates.combined, 4),
        "service_factor_at_site": _round(running.service_factor_at_site, 2),
        "current_basis": currents.basis,
        "operating_current_a": _round(currents.load_a, 1),
        "operating_power_factor": None if operating is None else _round(operating.power_factor, 3),
        "operating_efficiency": None if operating is None else _round(operating.efficiency, 4),
        "breakdown_torque_margin": (None if operating is None
                                    else _round(operating.breakdown_margin, 2)),
        "operating_point_basis": None if operating is None else operating.basis,
        "breakdown_torque_basis": None if operating is None else operating.breakdown_basis,
        "rule_speed_rpm": None if operating is None else _round(operating.rule_speed_rpm, 1),
        "star_delta_possible": running.star_delta_possible,
        "locked_rotor_current_a": None if lrc is None else {
            "low": _round(lrc.low_a, 1),
            "high": None if lrc.high_a == math.inf else _round(lrc.high_a, 1),
            "basis": lrc.basis},
        "code_current_a": _round(currents.code_a, 2),
        "code_current_hp": currents.code_hp,
        "code_current_rule": currents.code_rule,
        "conductor_current_a": _round(currents.conductor_a, 2),
        "voltage_unbalance": _round(running.derates.unbalance, 4),
        "efficiency_class": running.efficiency_class,
        "load_fraction": None if load is None else _round(load.fraction, 4),
        "load_demand_kw": None if load is None else _kilo(load.demand_w, 2),
        "load_margin": None if load is None else _round(load.margin, 4),
        "flow_ratio": None if load is None else _round(load.flow_ratio, 4),
        "head_ratio": None if load is None else _round(load.head_ratio, 4),
    }
    if a.machine.is_generator:
        data["available_apparent_power_kva"] = _kilo(running.available_apparent_power_va, 2)
    data["not_running_reason"] = running.not_running_reason
    data["starting"] = starting_dict(a)
    data["protection"] = protection_dict(a)
    if running.not_running_reason is not None:
        for key in RUNNING_KEYS:
            if key in data:
                data[key] = None
    if explain:
        data["working"] = list(a.working)
    data["remedies"] = [remedy_dict(r) for r in a.remedies]
    data["regulation"] = None if a.regulation is None else regulation_dict(a.regulation)
    return data


def remedy_dict(r: Remedy) -> dict[str, Any]:
    """One remedy as JSON; see docs/json.md."""
    e = r.energy
    return {"kind": r.kind, "action": r.action, "verdict": r.verdict, "changes": r.changes,
            "running_cost_rank": r.running_cost_rank,
            "figures": {name: None if not math.isfinite(value) else _round(value, 4)
                        for name, value in r.figures},
            "cautions": list(r.cautions),
            "remaining": [{"code": f.code, "severity": f.severity} for f in r.remaining],
            "energy": None if e is None else {
                "power_saving_kw": _kilo(e.power_saving_w, 3),
                "annual_energy_kwh": _round(e.annual_energy_j / 3.6e6, 0),
                "efficiency_old": _round(e.efficiency_old, 4),
                "efficiency_new": _round(e.efficiency_new, 4),
                "annual_cost": _round(e.annual_cost, 2), "currency": e.currency,
                "payback_years": (None if e.payback_years is None
                                  or not math.isfinite(e.payback_years)
                                  else _round(e.payback_years, 2)),
                "missing": e.missing},
            "energy_missing": r.energy_missing}


def regulation_dict(g: RegulationFinding) -> dict[str, Any]:
    """The site region's efficiency rule for the machine, as JSON."""
    return {"region": g.region, "status": g.status, "required_class": g.required_class,
            "applies_from": None if g.applies_from is None else g.applies_from.isoformat(),
            "clause": None if g.tier is None else g.tier.clause, "message": g.message,
            "source": g.source,
            "upcoming": [{"from": t.from_date.isoformat(), "required_class": t.required_class,
                          "clause": t.clause} for t in g.upcoming]}


#: The figures of a machine running at the site: None in the result when it cannot run there
#: (``not_running_reason`` says why).
RUNNING_KEYS = ("expected_speed_rpm", "available_power_kw", "load_power_kw",
                "full_load_current_a", "speed_tolerance_rpm", "service_factor_at_site",
                "operating_current_a", "operating_power_factor", "operating_efficiency",
                "breakdown_torque_margin", "rule_speed_rpm", "load_fraction", "flow_ratio",
                "head_ratio", "load_demand_kw", "load_margin", "available_apparent_power_kva")


def _finding(f: Finding) -> dict[str, str]:
    return {"code": f.code, "severity": f.severity, "message": f.message}


def worst_first(assessments: Iterable[Assessment]) -> list[Assessment]:
    """Sort pairs worst verdict first, keeping input order within a verdict."""
    return sorted(assessments, key=lambda a: -VERDICTS.index(a.verdict))


def summary_counts(assessments: Iterable[Assessment]) -> dict[str, dict[str, int]]:
    """{site id: {verdict: count}} in first-seen site order."""
    counts: dict[str, dict[str, int]] = {}
    for a in assessments:
        per = counts.setdefault(a.site.id, {v: 0 for v in VERDICTS})
        per[a.verdict] += 1
    return counts


def driving_findings(a: Assessment) -> list[Finding]:
    """The findings that drove the verdict (warnings and problems), worst first."""
    chosen = [f for f in a.findings if f.severity != "info"]
    return sorted(chosen, key=lambda f: -SEVERITIES.index(f.severity))


def by_site(assessments: Iterable[Assessment]) -> dict[str, list[Assessment]]:
    """{site id: [assessments]} in first-seen site order."""
    groups: dict[str, list[Assessment]] = {}
    for a in assessments:
        groups.setdefault(a.site.id, []).append(a)
    return groups


def number(value: float | None, fmt: str) -> str:
    """A figure formatted for a report cell, "-" when unknown."""
    return "-" if value is None else format(value, fmt)


def output_text(a: Assessment) -> str:
    """Available over rated output, kW ("-" when the machine cannot run here)."""
    available = a.running.available_power_w
    if available is None or a.running.not_running_reason is not None:
        return "-"
    return f"{available / 1000:.1f} / {a.running.rated_power_w / 1000:.1f}"


#: Columns of the per-site table of the markdown and HTML reports; :func:`site_row` fills them.
SITE_COLUMNS = ("machine", "verdict", "n_s rpm", "speed rpm", "output kW", "FLC A", "load A",
                "flux k")


def site_row(a: Assessment) -> list[str]:
    """The cells of one pair in the per-site table (texts, not yet escaped)."""
    running = a.running
    runs = running.not_running_reason is None
    return [a.machine.id, a.verdict, f"{running.synchronous_speed_rpm:.0f}",
            number(running.expected_speed_rpm if runs else None, ".0f"), output_text(a),
            number(running.currents.full_load_a if runs else None, ".1f"),
            number(running.currents.load_a if runs else None, ".1f"),
            f"{a.choice.flux_ratio:.3f}"]


def _ka(value: float | None, digits: int = 2) -> float | None:
    return None if value is None else round(value / 1000.0, digits)


def _time(value: float | None) -> float | None:
    """A time in s for output; an infinite time (no trip) is None."""
    return None if value is None or math.isinf(value) else round(value, 2)


def starting_dict(a: Assessment) -> dict[str, Any] | None:
    """The "starting" part of a result (docs/json.md); None when the pair gives no source,
    feeder or start."""
    s = a.starting
    if s is None:
        return None
    d = s.running_drop
    return {
        "method": s.method,
        "source": None if s.source is None else {
            "kind": s.source.kind, "description": s.source.description,
            "short_circuit_power_kva": _kilo(s.source.short_circuit_power_va, 0)},
        "source_note": s.source_note,
        "feeder": None if s.feeder is None else {
            "length_m": _round(s.feeder.length_m, 1), "parallel": s.feeder.parallel,
            "resistance_ohm": _round(s.feeder.impedance_ohm.real, 5),
            "reactance_ohm": _round(s.feeder.impedance_ohm.imag, 5), "basis": s.feeder.basis},
        "running_voltage_drop": None if d is None else _round(d.drop, 4),
        "running_voltage_drop_limit": None if d is None else _round(d.limit, 4),
        "running_voltage_drop_limit_default": None if d is None else d.limit_is_default,
        "terminal_voltage_v": None if d is None else _round(d.terminal_voltage_v, 1),
        "current_factor": _round(s.current_factor, 4),
        "torque_factor": _round(s.torque_factor, 4),
        "locked_rotor_current_a": _round(s.locked_rotor_current_a, 1),
        "starting_current_a": _round(s.starting_current_a, 1),
        "starting_kva": _kilo(s.starting_apparent_power_va, 1),
        "dip_basis": s.dip_basis,
        "dip_bus": _round(s.dip_bus, 4),
        "dip_terminals": _round(s.dip_terminals, 4),
        "dip_limit": _round(s.dip_limit, 4),
        "dip_limit_default": s.dip_limit_is_default,
        "starting_voltage_v": _round(s.starting_voltage_v, 1),
        "starting_torque_nm": _round(s.starting_torque_nm, 1),
        "starting_torque_basis": s.starting_torque_basis,
        "breakaway_torque_nm": _round(s.breakaway_torque_nm, 1),
        "breakaway_margin": _round(s.breakaway_margin, 3),
        "will_start": s.will_start,
        "acceleration_time_s": _time(s.acceleration_time_s),
        "stall_speed_rpm": _round(s.stall_speed_rpm, 0),
        "changeover_speed_rpm": _round(s.changeover_speed_rpm, 0),
        "acceleration_unavailable": s.acceleration_unavailable,
        "trip_class": s.trip_class,
        "trip_multiple": _round(s.trip_multiple, 2),
        "trip_time_cold_s": _time(s.trip_time_cold_s),
        "trip_time_hot_s": _time(s.trip_time_hot_s),
        "minimum_source_kva": _kilo(s.minimum_source_va, 0),
        "minimum_source_kind": s.minimum_source_kind,
        "starting_power_kw": _kilo(s.starting_active_power_w, 1),
        "prime_mover_power_kw": _kilo(s.prime_mover_power_w, 1),
        "fault_current_ka": _ka(s.fault_current_a),
        "voltage_factor": s.voltage_factor,
        "notes": list(s.notes),
        "caution": s.caution,
    }


def protection_dict(a: Assessment) -> dict[str, Any] | None:
    """The "protection" part of a result (docs/json.md); None with no starting record, for a
    generator, or without a nameplate current."""
    p = a.protection
    if p is None:
        return None

    def setting(x: Any) -> dict[str, Any] | None:
        return None if x is None else {"current_a": _round(x.current_a, 1), "clause": x.clause,
                                       "note": x.note}

    return {
        "code": p.code, "edition": p.edition, "edition_note": p.edition_note,
        "code_current_a": _round(p.table_current_a, 2),
        "nameplate_current_a": _round(p.nameplate_current_a, 2),
        "conductor_ampacity": setting(p.conductor_ampacity),
        "motor_lead_ampacity": setting(p.motor_lead_ampacity),
        "overload_maximum": setting(p.overload_maximum),
        "overload_maximum_will_not_start": setting(p.overload_maximum_will_not_start),
        "overload_dial": setting(p.overload_dial),
        "short_circuit_devices": [
            {"device": name, "percent": r.percent, "computed_a": _round(r.computed_a, 1),
             "permitted_a": _round(r.permitted_a, 1), "clause": r.clause}
            for name, r in p.devices],
        "disconnect": setting(p.disconnect),
        "trip_class": p.trip_class,
        "caution": p.caution,
    }
