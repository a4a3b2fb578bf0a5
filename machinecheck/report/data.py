"""Assessment -> plain dict in output units: the one shape every renderer reads."""

from __future__ import annotations

from ..check import SEVERITIES, VERDICTS


def _r(value, digits):
    return None if value is None else round(float(value), digits)


def result_dict(a, *, explain: bool = False) -> dict:
    """The JSON contract of one (machine, site) result; see docs/json.md."""
    c = a.connection
    lrc = a.locked_rotor_current_a
    t = a.tolerance
    data = {
        "machine": a.machine.id,
        "site": a.site.id,
        "verdict": a.verdict,
        "rating": {"frequency_hz": _r(a.rating.frequency_hz, 3),
                   "voltage_v": _r(a.rated_voltage_v, 1),
                   "connection": c.name},
        "synchronous_speed_rpm": _r(a.synchronous_speed_rpm, 1),
        "expected_speed_rpm": _r(a.expected_speed_rpm, 1),
        "available_power_kw": _r(None if a.available_power_w is None
                                 else a.available_power_w / 1000.0, 2),
        "load_power_kw": _r(None if a.load_power_w is None else a.load_power_w / 1000.0, 2),
        "full_load_current_a": _r(a.full_load_current_a, 1),
        "flux_ratio": _r(a.flux_ratio, 4),
        "findings": [{"code": f.code, "severity": f.severity, "message": f.message}
                     for f in a.findings],
        "rated_power_kw": _r(a.rated_power_w / 1000.0, 2),
        "supply_voltage_v": _r(a.supply_voltage_v, 1),
        "poles": a.poles,
        "rerated": a.rerated,
        "speed_tolerance_rpm": _r(a.speed_band_rpm, 1),
        "torque_capability": _r(a.torque_capability, 4),
        "tolerance": {"standard": t.get("standard"), "basis": t.get("basis"),
                      "zone": t.get("zone"), "within": t.get("within"),
                      "voltage_deviation": _r(t.get("voltage_deviation"), 4),
                      "frequency_deviation": _r(t.get("frequency_deviation"), 4),
                      "combined_variation": _r(t.get("combined_variation"), 4)},
        "derating": {name: _r(value, 4) for name, value in a.factors.items()},
        "combined_derating": _r(a.combined_factor, 4),
        "service_factor_at_site": _r(a.service_factor_at_site, 2),
        "current_basis": a.current_basis,
        "operating_current_a": _r(a.operating_current_a, 1),
        "operating_power_factor": _r(a.operating_power_factor, 3),
        "operating_efficiency": _r(a.operating_efficiency, 4),
        "breakdown_torque_margin": _r(a.breakdown_margin, 2),
        "operating_point_basis": a.operating_point_basis,
        "rule_speed_rpm": _r(a.rule_speed_rpm, 1),
        "star_delta_possible": a.star_delta_possible,
        "locked_rotor_current_a": None if lrc is None else {
            "low": _r(lrc[0], 1), "high": None if lrc[1] == float("inf") else _r(lrc[1], 1),
            "basis": a.locked_rotor_basis},
        "code_current_a": _r(a.code_current_a, 2),
        "code_current_hp": a.code_current_hp,
        "conductor_current_a": _r(None if a.code_current_a is None else 1.25 * a.code_current_a, 2),
        "voltage_unbalance": _r(a.unbalance, 4),
        "efficiency_class": a.efficiency_class,
        "load_fraction": _r(a.load_fraction, 4),
        "flow_ratio": _r(a.flow_ratio, 4),
        "head_ratio": _r(a.head_ratio, 4),
    }
    if a.machine.is_generator:
        data["available_apparent_power_kva"] = _r(
            None if a.available_apparent_power_va is None else a.available_apparent_power_va / 1000, 2)
    if explain:
        data["working"] = list(a.working)
    return data


def worst_first(assessments):
    """Sort pairs worst verdict first, keeping input order within a verdict."""
    return sorted(assessments, key=lambda a: -VERDICTS.index(a.verdict))


def summary_counts(assessments) -> dict:
    """{site id: {verdict: count}} in first-seen site order."""
    counts: dict[str, dict[str, int]] = {}
    for a in assessments:
        per = counts.setdefault(a.site.id, {v: 0 for v in VERDICTS})
        per[a.verdict] += 1
    return counts


def driving_findings(a):
    """The findings that drove the verdict (warnings and problems), worst first."""
    chosen = [f for f in a.findings if f.severity != "info"]
    return sorted(chosen, key=lambda f: -SEVERITIES.index(f.severity))


def by_site(assessments) -> dict:
    """{site id: [assessments]} in first-seen site order."""
    groups: dict[str, list] = {}
    for a in assessments:
        groups.setdefault(a.site.id, []).append(a)
    return groups


def number(value, fmt: str) -> str:
    """A figure formatted for a report cell, "-" when unknown."""
    return "-" if value is None else format(value, fmt)


def output_text(a) -> str:
    """Available over rated output, kW ("-" when the machine cannot run here)."""
    if a.available_power_w is None:
        return "-"
    return f"{a.available_power_w / 1000:.1f} / {a.rated_power_w / 1000:.1f}"


#: Columns of the per-site table of the markdown and HTML reports; :func:`site_row` fills them.
SITE_COLUMNS = ("machine", "verdict", "n_s rpm", "speed rpm", "output kW", "FLC A", "load A",
                "flux k")


def site_row(a) -> list[str]:
    """The cells of one pair in the per-site table (texts, not yet escaped)."""
    return [a.machine.id, a.verdict, f"{a.synchronous_speed_rpm:.0f}",
            number(a.expected_speed_rpm, ".0f"), output_text(a),
            number(a.full_load_current_a, ".1f"), number(a.operating_current_a, ".1f"),
            f"{a.flux_ratio:.3f}"]
