"""Assessment -> plain dict in output units: the one shape every renderer reads."""

from __future__ import annotations

import math
from types import MappingProxyType

from ..engine.check import SEVERITIES, VERDICTS
from ..memo import IdentityMemo


def _r(value, digits):
    """``value`` rounded to ``digits`` decimals, exactly as round(value, digits); None stays None.

    round(x * 10**d) / 10**d is the same float except where x * 10**d lies near a half, so
    only those go to round(x, d): half the time at thirty figures a pair.
    """
    if value is None:
        return None
    scale = _SCALES[digits]
    scaled = value * scale
    if -1e15 < scaled < 1e15:
        whole = round(scaled)
        if whole and 0.5 - abs(scaled - whole) > 1e-6:  # zero keeps its sign through round()
            return whole / scale
    return round(float(value), digits)


_SCALES = {digits: 10.0 ** digits for digits in range(6)}


class _Rounded(dict):
    """value -> _r(value, digits), remembered: the figures a fleet repeats (frequencies,
    voltages, synchronous speeds, flux ratios, deratings) are rounded once, then looked up."""

    __slots__ = ("digits",)

    def __init__(self, digits: int):
        super().__init__()
        self.digits = digits

    def __missing__(self, value):
        result = _r(value, self.digits)
        if value and value == value:  # not None; zero keeps its sign; NaN never matches
            if len(self) >= 20_000:
                self.clear()
            self[value] = result
        return result


_R1, _R2, _R3, _R4 = (_Rounded(digits) for digits in (1, 2, 3, 4))


#: tolerance mapping -> its output dict: the engine shares one mapping between every pair with
#: the same figures, so most pairs find theirs here.
_TOLERANCE_DICTS = IdentityMemo()


def _tolerance_dict(t) -> dict:
    """The "tolerance" part of a result (shared between results: read it, do not change it)."""
    out = _TOLERANCE_DICTS.get(t)
    if out is not None:
        return out
    out = {"standard": t.get("standard"), "basis": t.get("basis"), "zone": t.get("zone"),
           "within": t.get("within"), "voltage_deviation": _r(t.get("voltage_deviation"), 4),
           "frequency_deviation": _r(t.get("frequency_deviation"), 4),
           "combined_variation": _r(t.get("combined_variation"), 4)}
    if type(t) is MappingProxyType:  # read-only, so its output cannot go stale
        _TOLERANCE_DICTS.put(t, out)
    return out


def result_dict(a, *, explain: bool = False) -> dict:
    """The JSON contract of one (machine, site) result; see docs/json.md.

    Parts of it may be shared between results (the tolerance): treat it as read-only.
    """
    r = _r
    c = a.connection
    lrc = a.locked_rotor_current_a
    code_current = a.code_current_a
    available, load = a.available_power_w, a.load_power_w
    data = {
        "machine": a.machine.id,
        "site": a.site.id,
        "verdict": a.verdict,
        "rating": {"frequency_hz": _R3[a.rating.frequency_hz],
                   "voltage_v": _R1[a.rated_voltage_v],
                   "connection": c.name},
        "synchronous_speed_rpm": _R1[a.synchronous_speed_rpm],
        "expected_speed_rpm": r(a.expected_speed_rpm, 1),
        "available_power_kw": None if available is None else r(available / 1000.0, 2),
        "load_power_kw": None if load is None else r(load / 1000.0, 2),
        "full_load_current_a": r(a.full_load_current_a, 1),
        "flux_ratio": _R4[a.flux_ratio],
        "findings": [{"code": f.code, "severity": f.severity, "message": f.message}
                     for f in a.findings],
        "rated_power_kw": _R2[a.rated_power_w / 1000.0],
        "supply_voltage_v": _R1[a.supply_voltage_v],
        "poles": a.poles,
        "rerated": a.rerated,
        "speed_tolerance_rpm": r(a.speed_band_rpm, 1),
        "torque_capability": _R4[a.torque_capability],
        "tolerance": _tolerance_dict(a.tolerance),
        "derating": {name: _R4[value] for name, value in a.factors.items()},
        "combined_derating": _R4[a.combined_factor],
        "service_factor_at_site": _R2[a.service_factor_at_site],
        "current_basis": a.current_basis,
        "operating_current_a": r(a.operating_current_a, 1),
        "operating_power_factor": r(a.operating_power_factor, 3),
        "operating_efficiency": r(a.operating_efficiency, 4),
        "breakdown_torque_margin": r(a.breakdown_margin, 2),
        "operating_point_basis": a.operating_point_basis,
        "rule_speed_rpm": r(a.rule_speed_rpm, 1),
        "star_delta_possible": a.star_delta_possible,
        "locked_rotor_current_a": None if lrc is None else {
            "low": r(lrc[0], 1), "high": None if lrc[1] == math.inf else r(lrc[1], 1),
            "basis": a.locked_rotor_basis},
        "code_current_a": None if code_current is None else _R2[code_current],
        "code_current_hp": a.code_current_hp,
        "conductor_current_a": None if code_current is None else _R2[1.25 * code_current],
        "voltage_unbalance": None if a.unbalance is None else _R4[a.unbalance],
        "efficiency_class": a.efficiency_class,
        "load_fraction": r(a.load_fraction, 4),
        "flow_ratio": r(a.flow_ratio, 4),
        "head_ratio": r(a.head_ratio, 4),
    }
    if a.machine.is_generator:
        apparent = a.available_apparent_power_va
        data["available_apparent_power_kva"] = (
            None if apparent is None else r(apparent / 1000.0, 2))
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
