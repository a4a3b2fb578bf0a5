"""Machine catalogs (TOML, CSV or Excel inventories) into the model.

Every problem becomes an :class:`~machinecheck.errors.InputError` naming the file, the line,
the machine id and the key path; all problems of one file are gathered (the first
:data:`~.validate.MAX_ERRORS` shown, the rest counted) and raised together as
:class:`~machinecheck.errors.InputErrors`. Values are read by the field table
(:mod:`.fields`), plates checked for consistency by :mod:`.plausibility`.
"""

from __future__ import annotations

import os
import re
from typing import Any

from ..errors import InputError, InputErrors
from ..model import Catalog, Circuit, Connection, Feeder, Load, Machine, Rating, Start, Use
from . import csv_, formats, plausibility
from .fields import field
from .sites import load_sites, sites_from_data
from .toml_ import Locator, parse_toml, read_text, tomllib
from .validate import MAX_ERRORS, Problems, Reader, closest

__all__ = ["MAX_ERRORS", "Locator", "catalog_from_data", "closest", "inventory_catalog",
           "load_catalog", "load_sites", "parse_toml", "read_text", "sites_from_data",
           "tomllib"]

_RANGE = re.compile(r"^\s*([0-9.]+)\s*(?:-|–|to)\s*([0-9.]+)\s*(.*?)\s*$")


def _as_list(value: Any) -> list[Any]:
    return list(value) if isinstance(value, list) else [value]


def load_catalog(path: str | os.PathLike[str], *, decimal_comma: bool | None = None) -> Catalog:
    """Read and validate a catalog: TOML, CSV or .xlsx, chosen by extension and content.

    ``decimal_comma`` declares decimal commas in a CSV (None: detected from a ``;`` separator).
    """
    name = os.fspath(path)
    chosen = formats.choose(name)
    try:
        if chosen.format == "TOML":
            text = read_text(name, "TOML")
            data = parse_toml(text, name)
            catalog = catalog_from_data(data, name, text)
        elif chosen.format == "XLSX":
            from . import xlsx

            catalog = inventory_catalog(*xlsx.read_workbook(name))
        else:
            catalog = inventory_catalog(*csv_.read_inventory(name, decimal_comma=decimal_comma))
    except InputErrors as exc:
        raise InputErrors(formats.note(chosen, exc.errors)) from None
    except InputError as exc:
        raise InputErrors(formats.note(chosen, [exc])) from None
    return Catalog(title=catalog.title, machines=catalog.machines, source=name,
                   reader=chosen.describe())


def inventory_catalog(data: dict[str, Any], locator: Locator, name: str,
                      decimal_comma: bool = False) -> Catalog:
    """Validate what a spreadsheet reader read into a Catalog; errors name row and column."""
    try:
        return catalog_from_data(data, name, locator=locator, decimal_comma=decimal_comma)
    except InputErrors as exc:
        raise InputErrors([csv_.as_cell_error(e) for e in exc.errors]) from None


def catalog_from_data(data: dict[str, Any], name: str, text: str | None = None,
                      locator: Locator | None = None, *, decimal_comma: bool = False) -> Catalog:
    """Validate parsed catalog data; raise InputErrors with every problem found."""
    locator = locator or Locator(text)
    problems = Problems(name)
    machines = []
    top = Reader(name, locator, problems, None, (), decimal_comma=decimal_comma)
    title = ""
    if "machine" not in data:
        if "site" in data:
            top.fail("this is a sites file (it has [[site]] tables), not a catalog: give it "
                     "with --sites")
        else:
            top.fail("no [[machine]] tables: a catalog lists machines as [[machine]] tables")
        problems.raise_any()
    top.unknown_keys(data, "", allowed=("catalog", "machine"))
    meta = data.get("catalog", {})
    if not isinstance(meta, dict):
        top.fail("[catalog] must be a table", "catalog")
    else:
        raw_title = meta.get("title", "")
        if not isinstance(raw_title, str):
            top.fail("expected a title text", "catalog.title", ("catalog",))
        else:
            title = raw_title.strip()
        top.unknown_keys(meta, "", "catalog.", ("catalog",), allowed=("title",))
    entries = data["machine"]
    if not isinstance(entries, list):
        top.fail("'machine' must be an array of tables, written [[machine]]", "machine")
        problems.raise_any()
    seen: dict[str, int] = {}
    for index, entry in enumerate(entries):
        machine = _machine(entry, index, name, locator, problems, seen, decimal_comma)
        if machine is not None:
            machines.append(machine)
    problems.raise_any()
    return Catalog(title=title, machines=tuple(machines), source=name)


def _machine(entry: Any, index: int, name: str, locator: Locator, problems: Problems,
             seen: dict[str, int], decimal_comma: bool) -> Machine | None:
    base = ("machine", index)
    if not isinstance(entry, dict):
        Reader(name, locator, problems, None, base).fail(
            f"machine #{index + 1} must be a table", "machine")
        return None
    before = problems.count
    raw_id = entry.get("id")
    item = raw_id if isinstance(raw_id, str) else f"machine #{index + 1}"
    r = Reader(name, locator, problems, item, base, decimal_comma=decimal_comma)
    machine_id = r.get(entry, "machine", "id")
    if machine_id is not None:
        if machine_id in seen:
            r.fail(f"duplicate id: machine #{seen[machine_id] + 1} already has it", "id")
        else:
            seen[machine_id] = index
    r.unknown_keys(entry, "machine")
    values = {f: r.get(entry, "machine", f) for f in (
        "kind", "phases", "poles", "service_factor", "description", "efficiency_class",
        "code_letter", "design_letter", "insulation_class", "cooling", "duty", "max_speed",
        "rated_ambient", "rated_altitude", "prime_mover_speed")}
    kind = values["kind"] or "induction-motor"
    phases = values["phases"] or 3
    poles = values["poles"]
    if poles is not None and poles % 2:
        r.fail(f"poles must be an even number (poles, not pole pairs), got {poles}", "poles")
        poles = None
    if values["prime_mover_speed"] is not None and kind != "synchronous-generator":
        r.fail("prime_mover_speed is for generators (kind = 'synchronous-generator')",
               "prime_mover_speed")

    ratings: list[Rating] = []
    raw_ratings = entry.get("rating")
    if raw_ratings is None:
        r.fail("missing required key 'rating': add at least one [[machine.rating]] table",
               "rating")
    elif not isinstance(raw_ratings, list) or not raw_ratings:
        r.fail("'rating' must be an array of tables, written [[machine.rating]]", "rating")
    else:
        for r_index, raw in enumerate(raw_ratings):
            rating = _rating(r, raw, r_index, kind)
            if rating is not None:
                ratings.append(rating)
    load = _load(r, entry, kind) if "load" in entry else None
    circuit = _circuit(r, entry)
    start = _start(r, entry)
    feeder = _feeder(r, entry)
    use = _use(r, entry)
    if problems.count > before:
        return None
    poles, ratings = plausibility.check_poles(r, ratings, poles, kind,
                                              values["design_letter"])
    if problems.count > before:
        return None
    for r_index, rating in enumerate(ratings):
        plausibility.check_currents(r, rating, r_index, phases, kind)
    if problems.count > before:
        return None
    return Machine(
        id=machine_id, kind=kind, phases=phases, ratings=tuple(ratings), poles=poles,
        description=values["description"], service_factor=values["service_factor"],
        insulation_class=values["insulation_class"],
        efficiency_class=values["efficiency_class"], max_speed_rpm=values["max_speed"],
        code_letter=values["code_letter"], design_letter=values["design_letter"],
        cooling=values["cooling"], duty=values["duty"],
        rated_ambient_degc=values["rated_ambient"], rated_altitude_m=values["rated_altitude"],
        prime_mover_speed_rpm=values["prime_mover_speed"], load=load, source=name,
        circuit=circuit, start=start, feeder=feeder, use=use)


def _voltages(r: Reader, raw: Any, key: str, sub: tuple[Any, ...]) -> list[tuple[float, float]] | None:
    """A rating's voltage: one value, a range string '380-415 V', or a list of either."""
    f = field("rating", "voltage")
    values = []
    for position, value in enumerate(_as_list(raw)):
        where = key if not isinstance(raw, list) else f"{key}[{position + 1}]"
        try:
            match = _RANGE.match(value) if isinstance(value, str) else None
            if match:
                unit = match.group(3) or "V"
                low = r.convert(f, f"{match.group(1)} {unit}")
                high = r.convert(f, f"{match.group(2)} {unit}")
                if not 0 < low < high:
                    r.fail(f"voltage range {value!r} must run from low to high", where, sub)
                    return None
                if high > 1.25 * low:
                    r.fail(f"voltage range {value!r} is wider than 25 %: is it two connections "
                           f"(write them as a list)?", where, sub)
                    return None
                values.append((low, high))
                continue
            volts = r.convert(f, value)
        except InputError as exc:
            r.fail(exc.message, where, sub)
            return None
        values.append((volts, volts))
    if not values:
        r.fail("voltage list is empty", key, sub)
        return None
    return values


def _many(r: Reader, raw: dict[str, Any], key: str, prefix: str,
          sub: tuple[Any, ...]) -> list[float] | None:
    f = field("rating", key)
    out = []
    for position, value in enumerate(_as_list(raw[key])):
        try:
            out.append(r.convert(f, value))
        except InputError as exc:
            where = prefix + key + (f"[{position + 1}]" if isinstance(raw[key], list) else "")
            r.fail(exc.message, where, sub)
            return None
    return out


def _rating(r: Reader, raw: Any, r_index: int, kind: str) -> Rating | None:
    sub = ("rating", r_index)
    prefix = f"rating[{r_index + 1}]."
    if not isinstance(raw, dict):
        r.fail("each rating must be a table", f"rating[{r_index + 1}]", sub)
        return None
    before = r.count
    r.unknown_keys(raw, "rating", prefix, sub)
    frequency = r.get(raw, "rating", "frequency", prefix=prefix, sub=sub)
    voltages = None
    if raw.get("voltage") is None:
        r.fail("missing required key 'voltage': expected a voltage such as '400 V', a list "
               "such as ['230 V', '460 V'] or a range such as '380-415 V'", prefix + "voltage", sub)
    else:
        voltages = _voltages(r, raw["voltage"], prefix + "voltage", sub)
    n = len(voltages) if voltages else None
    names = raw.get("connection")
    if names is not None:
        names = _as_list(names)
        if not all(isinstance(x, str) and x.strip() for x in names):
            r.fail("connection names must be texts such as 'delta' or 'high'",
                   prefix + "connection", sub)
            names = None
        elif n is not None and len(names) != n:
            r.fail(f"{len(names)} connection names for {n} voltages: give one per voltage",
                   prefix + "connection", sub)
            names = None
    currents = None
    if raw.get("current") is not None:
        currents = _many(r, raw, "current", prefix, sub)
        if currents is not None and n is not None and len(currents) != n:
            r.fail(f"{len(currents)} currents for {n} voltages: give one per voltage",
                   prefix + "current", sub)
            currents = None
    power = apparent = None
    raw_power = raw.get("power")
    generator = kind == "synchronous-generator"
    if raw_power is None:
        r.fail("missing required key 'power': expected " + (
            "an apparent power such as '500 kVA' or a power such as '400 kW'" if generator
            else "a power with its unit, such as '75 kW' or '100 hp'"), prefix + "power", sub)
    elif generator and isinstance(raw_power, str) and re.search(r"VA\s*$", raw_power, re.I):
        try:
            from . import units

            apparent = units.parse(raw_power, "apparent_power")
            low, high = field("rating", "power").low, field("rating", "power").high
            assert low is not None and high is not None
            if not low <= apparent <= high:
                raise InputError(f"{raw_power!r} is outside the plausible range {low:g} to "
                                 f"{high:g} VA")
        except InputError as exc:
            r.fail(exc.message, prefix + "power", sub)
    else:
        power = r.get(raw, "rating", "power", prefix=prefix, sub=sub)
    get = {k: r.get(raw, "rating", k, prefix=prefix, sub=sub) for k in (
        "speed", "power_factor", "efficiency", "service_factor", "starting_current_ratio",
        "locked_rotor_torque", "breakdown_torque", "inertia")}
    lrc = None
    if raw.get("locked_rotor_current") is not None:
        count = len(_as_list(raw["locked_rotor_current"]))
        if n is not None and count not in (1, n) or (n and n > 1 and count == 1):
            r.fail(f"give one locked-rotor current per voltage ({n})",
                   prefix + "locked_rotor_current", sub)
        else:
            parsed = _many(r, raw, "locked_rotor_current", prefix, sub)
            lrc = tuple(parsed) if parsed is not None else None
    if r.count > before or voltages is None:
        return None
    power_factor = get["power_factor"]
    if generator and apparent is None and power is not None:
        apparent = power / (power_factor or 0.8)
    if generator and power is None and apparent is not None:
        power = apparent * (power_factor or 0.8)
    connections = tuple(
        Connection(name=(names[i].strip() if names else None), voltage_min_v=v[0],
                   voltage_max_v=v[1], current_a=(currents[i] if currents else None))
        for i, v in enumerate(voltages))
    lrt = get["locked_rotor_torque"]
    bdt = get["breakdown_torque"]
    return Rating(frequency_hz=frequency, connections=connections, power_w=power,
                  apparent_power_va=apparent, speed_rpm=get["speed"], power_factor=power_factor,
                  efficiency=get["efficiency"], service_factor=get["service_factor"],
                  locked_rotor_current_a=lrc,
                  starting_current_ratio=get["starting_current_ratio"],
                  locked_rotor_torque_pu=lrt[0] if lrt and lrt[1] else None,
                  locked_rotor_torque_nm=lrt[0] if lrt and not lrt[1] else None,
                  breakdown_torque_pu=bdt[0] if bdt and bdt[1] else None,
                  breakdown_torque_nm=bdt[0] if bdt and not bdt[1] else None,
                  inertia_kgm2=get["inertia"])


def _load(r: Reader, entry: dict[str, Any], kind: str) -> Load | None:
    raw = entry["load"]
    if not isinstance(raw, dict):
        r.fail("load must be a table, written [machine.load]", "load")
        return None
    if kind == "synchronous-generator":
        r.fail("a generator drives no load: remove [machine.load]", "load")
        return None
    sub = ("load",)
    before = r.count
    r.unknown_keys(raw, "load", "load.", sub)
    got = {k: r.get(raw, "load", k, prefix="load.", sub=sub) for k in (
        "type", "power", "torque", "max_speed", "breakaway_torque", "inertia")}
    if "power" not in raw and "torque" not in raw:
        r.fail("give the load's 'power' (or 'torque') at the rated speed", "load.power", sub)
    elif "power" in raw and "torque" in raw:
        r.fail("give the load's 'power' or its 'torque', not both", "load.torque", sub)
    if r.count > before:
        return None
    breakaway = got["breakaway_torque"]
    return Load(type=got["type"], power_w=got["power"], torque_nm=got["torque"],
                max_speed_rpm=got["max_speed"],
                breakaway_torque_pu=breakaway[0] if breakaway and breakaway[1] else None,
                breakaway_torque_nm=breakaway[0] if breakaway and not breakaway[1] else None,
                inertia_kgm2=got["inertia"])


def _section(r: Reader, entry: dict[str, Any], section: str,
             keys: tuple[str, ...]) -> dict[str, Any] | None:
    raw = r.table(entry, section, section)
    if raw is None:
        return None
    before = r.count
    got = {k: r.get(raw, section, k, prefix=f"{section}.", sub=(section,)) for k in keys}
    return got if r.count == before else None


def _circuit(r: Reader, entry: dict[str, Any]) -> Circuit | None:
    got = _section(r, entry, "circuit", ("r1", "r2", "x1", "x2", "xm"))
    if got is None:
        return None
    return Circuit(r1_ohm=got["r1"], r2_ohm=got["r2"], x1_ohm=got["x1"], x2_ohm=got["x2"],
                   xm_ohm=got["xm"])


def _start(r: Reader, entry: dict[str, Any]) -> Start | None:
    got = _section(r, entry, "start", ("method", "tap", "current_limit", "trip_class"))
    if got is None:
        return None
    method = got["method"]
    if got["tap"] is not None and method != "autotransformer":
        r.fail("'tap' is for method = 'autotransformer'", "start.tap", ("start",))
        return None
    if got["current_limit"] is not None and method != "soft-starter":
        r.fail("'current_limit' is for method = 'soft-starter'", "start.current_limit",
               ("start",))
        return None
    return Start(method=method, tap=got["tap"], current_limit=got["current_limit"],
                 trip_class=got["trip_class"])


def _feeder(r: Reader, entry: dict[str, Any]) -> Feeder | None:
    got = _section(r, entry, "feeder", ("length", "size", "material", "parallel",
                                        "resistance", "reactance"))
    if got is None:
        return None
    size = got["size"]
    if size is None and got["resistance"] is None:
        r.fail("give the conductor 'size' (or its 'resistance' per length)", "feeder.size",
               ("feeder",))
        return None
    return Feeder(length_m=got["length"],
                  size_mm2=size[0] if size and not size[1] else None,
                  size_awg=size[0] if size and size[1] else None,
                  size_marked=str(entry["feeder"].get("size", "")).strip() or None,
                  material=got["material"], parallel=got["parallel"],
                  resistance_ohm_per_m=got["resistance"], reactance_ohm_per_m=got["reactance"])


def _use(r: Reader, entry: dict[str, Any]) -> Use | None:
    got = _section(r, entry, "use", ("hours", "load_factor", "replacement_price"))
    if got is None:
        return None
    return Use(time_per_year_s=got["hours"], load_factor=got["load_factor"],
               replacement_price=got["replacement_price"])
