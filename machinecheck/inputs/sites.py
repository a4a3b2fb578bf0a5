"""Sites files (TOML) into the model: the supply, its source, limits and tariff.

A site's ``voltage`` is line-to-line. ``"230/400 V"`` marks a four-wire system by its
line-to-neutral and line-to-line voltages (read as 400 V, ``wires = 4``), ``"120/240 V"`` a
split-phase one. A three-phase voltage that is also a common line-to-neutral voltage
(:data:`AMBIGUOUS_V`) is ambiguous unless ``wires`` or ``system = "delta"`` says which.
"""

from __future__ import annotations

import os
import re
from typing import Any

from ..model import Limits, Site, Source, Tariff
from ..physics.current import SQRT3
from .toml_ import Locator, parse_toml, read_text
from .validate import Problems, Reader

#: Line-to-neutral voltages of four-wire systems that are also line-to-line voltages of
#: three-wire ones, so a three-phase site giving one alone is ambiguous: IEC 60038 Table 1
#: (230/400, 277/480, 347/600, 120/208, 220/380, 240/415, 127/220 V systems) [IEC 60038].
AMBIGUOUS_V = (120.0, 127.0, 220.0, 230.0, 240.0, 277.0, 347.0)
_MATCH = 0.01  # within 1 % of one of them

_MARKED = re.compile(r"^\s*(\d+(?:\.\d+)?)\s*/\s*(\d+(?:\.\d+)?)\s*([A-Za-z].*)?$")
_RANGE = re.compile(r"^\s*([0-9.]+)\s*(?:-|–|to)\s*([0-9.]+)\s*(.*?)\s*$")

SYSTEM_PHASES = {"wye": 3, "delta": 3, "split-phase": 1, "quadrature": 2}


def load_sites(path: str | os.PathLike[str]) -> tuple[Site, ...]:
    """Read and validate a sites file (TOML)."""
    name = os.fspath(path)
    text = read_text(name, "TOML")
    data = parse_toml(text, name)
    return sites_from_data(data, name, text)


def sites_from_data(data: dict[str, Any], name: str, text: str | None = None) -> tuple[Site, ...]:
    """Validate parsed sites data; raise InputErrors with every problem found."""
    locator = Locator(text)
    problems = Problems(name)
    sites = []
    top = Reader(name, locator, problems, None, ())
    if "site" not in data:
        if "machine" in data:
            top.fail("this is a machine catalog (it has [[machine]] tables), not a sites "
                     "file: give it as a CATALOG argument")
        else:
            top.fail("no [[site]] tables: a sites file lists supplies as [[site]] tables")
        problems.raise_any()
    top.unknown_keys(data, "", allowed=("site",))
    entries = data["site"]
    if not isinstance(entries, list):
        top.fail("'site' must be an array of tables, written [[site]]", "site")
        problems.raise_any()
    seen: dict[str, int] = {}
    for index, entry in enumerate(entries):
        site = _site(entry, index, name, locator, problems, seen)
        if site is not None:
            sites.append(site)
    problems.raise_any()
    return tuple(sites)


def _voltage(r: Reader, raw: Any, phases: int) -> tuple[float | None, int | None]:
    """The line-to-line voltage, and the wires a marking such as '230/400 V' implies."""
    if isinstance(raw, str):
        marked = _MARKED.match(raw)
        if marked:
            low, high = float(marked.group(1)), float(marked.group(2))
            unit = marked.group(3) or "V"
            ratio = high / low if low > 0 else 0.0
            if abs(ratio - SQRT3) < 0.02 * SQRT3 and phases == 3:
                return r.get({}, "site", "voltage", value=f"{marked.group(2)} {unit}"), 4
            if abs(ratio - 2.0) < 0.02 and phases == 1:
                return r.get({}, "site", "voltage", value=f"{marked.group(2)} {unit}"), 3
            r.fail(f"{raw!r} is not a line-to-neutral/line-to-line pair of a "
                   f"{'three' if phases == 3 else 'single'}-phase system (such as "
                   f"{'230/400 V' if phases == 3 else '120/240 V'}): give the line-to-line "
                   "voltage", "voltage")
            return None, None
    return r.get({"voltage": raw}, "site", "voltage"), None


def _site(entry: Any, index: int, name: str, locator: Locator, problems: Problems,
          seen: dict[str, int]) -> Site | None:
    base = ("site", index)
    if not isinstance(entry, dict):
        Reader(name, locator, problems, None, base).fail(f"site #{index + 1} must be a table")
        return None
    before = problems.count
    raw_id = entry.get("id")
    item = raw_id if isinstance(raw_id, str) else f"site #{index + 1}"
    r = Reader(name, locator, problems, item, base)
    site_id = r.get(entry, "site", "id")
    if site_id is not None:
        if site_id in seen:
            r.fail(f"duplicate id: site #{seen[site_id] + 1} already has it", "id")
        else:
            seen[site_id] = index
    r.unknown_keys(entry, "site")
    got = {k: r.get(entry, "site", k) for k in (
        "name", "frequency", "frequency_variation", "phases", "system", "wires", "standard",
        "region", "unbalance", "altitude", "ambient", "min_efficiency_class")}
    phases = got["phases"]
    voltage, marked_wires = (None, None)
    if entry.get("voltage") is None:
        r.get(entry, "site", "voltage")  # reports the missing key
    else:
        voltage, marked_wires = _voltage(r, entry["voltage"], phases or 3)
    wires = got["wires"]
    if marked_wires is not None:
        if wires is not None and wires != marked_wires:
            r.fail(f"voltage {entry['voltage']!r} marks a {marked_wires}-wire system, but "
                   f"wires = {wires}", "wires")
        wires = marked_wires
    system = got["system"]
    frequency = got["frequency"]
    standard = got["standard"]
    if standard is None and "standard" not in entry and frequency is not None:
        standard = "NEMA" if abs(frequency - 60.0) < 3.0 else "IEC"
    voltage_range = _voltage_range(r, entry, voltage)
    line_voltages = _line_voltages(r, entry)
    if phases is not None and system is not None and SYSTEM_PHASES[system] != phases:
        r.fail(f"system {system!r} needs phases = {SYSTEM_PHASES[system]}, got {phases}",
               "system")
    if wires is not None and phases is not None and phases != 3 and not (
            phases == 1 and wires == 3):
        r.fail(f"wires = {wires} is for three-phase supplies (or 3 for split-phase), got "
               f"phases = {phases}", "wires")
    if (phases == 3 and voltage is not None and wires is None and system != "delta"
            and any(abs(voltage - v) <= _MATCH * v for v in AMBIGUOUS_V)):
        r.fail(f"{voltage:g} V three-phase is ambiguous: is it the line-to-line voltage of a "
               f"three-wire system (add wires = 3), or the line-to-neutral voltage of a "
               f"{voltage:g}/{voltage * SQRT3:.0f} V four-wire system (write voltage = "
               f"'{voltage:g}/{voltage * SQRT3:.0f} V')?", "voltage")
    supply_source = _source(r, entry)
    limits = _limits(r, entry)
    tariff = _tariff(r, entry)
    if problems.count > before or voltage is None:
        return None
    return Site(id=site_id, name=got["name"], frequency_hz=frequency, voltage_v=voltage,
                phases=phases, system=system, standard=standard, voltage_range_v=voltage_range,
                unbalance=got["unbalance"], line_voltages_v=line_voltages,
                altitude_m=got["altitude"], ambient_degc=got["ambient"],
                min_efficiency_class=got["min_efficiency_class"], source=name,
                frequency_variation=got["frequency_variation"], wires=wires,
                region=got["region"], supply_source=supply_source, limits=limits,
                tariff=tariff)


def _voltage_range(r: Reader, entry: dict[str, Any],
                   voltage: float | None) -> tuple[float, float] | None:
    raw = entry.get("voltage_range")
    if raw is None:
        return None
    if isinstance(raw, str) and _RANGE.match(raw):
        match = _RANGE.match(raw)
        assert match is not None
        unit = match.group(3) or "V"
        raw = [f"{match.group(1)} {unit}", f"{match.group(2)} {unit}"]
    if not isinstance(raw, list) or len(raw) != 2:
        r.fail("voltage_range must be two voltages, e.g. ['380 V', '420 V']", "voltage_range")
        return None
    before = r.count
    low, high = (r.get({}, "site", "voltage_range", value=v) for v in raw)
    if r.count > before:
        return None
    if not 0 < low <= high:
        r.fail(f"voltage_range must run from low to high, got {raw!r}", "voltage_range")
    elif voltage is not None and not low <= voltage <= high:
        r.fail(f"nominal voltage {voltage:g} V lies outside voltage_range {low:g}-{high:g} V",
               "voltage_range")
    else:
        return (low, high)
    return None


def _line_voltages(r: Reader, entry: dict[str, Any]) -> tuple[float, float, float] | None:
    raw = entry.get("line_voltages")
    if raw is None:
        return None
    if "unbalance" in entry:
        r.fail("give 'unbalance' or 'line_voltages', not both", "line_voltages")
        return None
    if not isinstance(raw, list) or len(raw) != 3:
        r.fail("line_voltages must be three voltages, e.g. ['460 V', '467 V', '450 V']",
               "line_voltages")
        return None
    before = r.count
    values = [r.get({}, "site", "line_voltages", value=v) for v in raw]
    if r.count > before:
        return None
    return (values[0], values[1], values[2])


def _section(r: Reader, entry: dict[str, Any], section: str,
             keys: tuple[str, ...]) -> dict[str, Any] | None:
    raw = r.table(entry, section, section)
    if raw is None:
        return None
    before = r.count
    got = {k: r.get(raw, section, k, prefix=f"{section}.", sub=(section,)) for k in keys}
    return got if r.count == before else None


_SOURCE_NEEDS = {"transformer": ("rating", "impedance"), "generator": ("rating",
                                                                       "subtransient_reactance"),
                 "utility": ()}
_SOURCE_ONLY = {"impedance": ("transformer",), "subtransient_reactance": ("generator",),
                "transient_reactance": ("generator",), "prime_mover_power": ("generator",),
                "rating": ("transformer", "generator"), "fault_current": ("utility",)}


def _source(r: Reader, entry: dict[str, Any]) -> Source | None:
    keys = ("kind", "rating", "impedance", "x_over_r", "short_circuit_power", "fault_current",
            "subtransient_reactance", "transient_reactance", "prime_mover_power")
    got = _section(r, entry, "source", keys)
    if got is None:
        return None
    kind = got["kind"]
    raw = entry["source"]
    for key in _SOURCE_NEEDS[kind]:
        if key not in raw:
            r.fail(f"a {kind} source needs '{key}'", f"source.{key}", ("source",))
    for key, kinds in _SOURCE_ONLY.items():
        if key in raw and kind not in kinds:
            r.fail(f"'{key}' is for a {' or '.join(kinds)} source, not a {kind}",
                   f"source.{key}", ("source",))
    if kind == "utility" and "short_circuit_power" in raw and "fault_current" in raw:
        r.fail("give 'short_circuit_power' or 'fault_current', not both",
               "source.fault_current", ("source",))
    if kind == "utility" and not ("short_circuit_power" in raw or "fault_current" in raw):
        r.fail("a utility source needs 'short_circuit_power' or 'fault_current'",
               "source.short_circuit_power", ("source",))
    return Source(kind=kind, rating_va=got["rating"], impedance=got["impedance"],
                  x_over_r=got["x_over_r"], short_circuit_power_va=got["short_circuit_power"],
                  fault_current_a=got["fault_current"],
                  subtransient_reactance=got["subtransient_reactance"],
                  transient_reactance=got["transient_reactance"],
                  prime_mover_power_w=got["prime_mover_power"])


def _limits(r: Reader, entry: dict[str, Any]) -> Limits | None:
    got = _section(r, entry, "limits", ("running_voltage_drop", "starting_dip"))
    if got is None:
        return None
    return Limits(running_voltage_drop=got["running_voltage_drop"],
                  starting_dip=got["starting_dip"])


def _tariff(r: Reader, entry: dict[str, Any]) -> Tariff | None:
    got = _section(r, entry, "tariff", ("energy", "currency"))
    if got is None:
        return None
    return Tariff(energy_per_kwh=got["energy"], currency=got["currency"])
