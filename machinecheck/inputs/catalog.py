"""Loading and validating machine catalogs and site files (TOML) into the model.

Every problem becomes an :class:`~machinecheck.errors.InputError` naming the file, the line,
the machine or site id and the key; all problems of one file are gathered (up to
:data:`MAX_ERRORS`) and raised together as :class:`~machinecheck.errors.InputErrors`.
"""

from __future__ import annotations

import functools
import math
import os
import re
import sys

from ..errors import DomainError, InputError, InputErrors
from ..model import KINDS, STANDARDS, SYSTEMS, Catalog, Connection, Load, Machine, Rating, Site
from ..physics import speed as speed_physics
from ..physics.efficiency import CLASSES as EFFICIENCY_CLASSES
from ..physics.loads import LOAD_TYPES
from ..physics.starting import CODE_LETTERS
from . import units

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover - exercised on Python 3.10 only
    import tomli as tomllib

MAX_ERRORS = 50

MACHINE_KEYS = ("id", "description", "kind", "phases", "poles", "service_factor",
                "insulation_class", "efficiency_class", "max_speed", "code_letter",
                "design_letter", "cooling", "duty", "rated_ambient", "rated_altitude",
                "prime_mover_speed", "rating", "load")
RATING_KEYS = ("frequency", "voltage", "connection", "current", "power", "speed",
               "power_factor", "efficiency", "service_factor", "locked_rotor_current",
               "starting_current_ratio")
LOAD_KEYS = ("type", "power", "torque", "max_speed")
SITE_KEYS = ("id", "name", "frequency", "voltage", "phases", "system", "standard",
             "voltage_range", "unbalance", "line_voltages", "altitude", "ambient",
             "min_efficiency_class")
DESIGN_LETTERS = ("A", "B", "C", "D", "N", "H")
INSULATION_CLASSES = ("A", "E", "B", "F", "H", "N", "R")
_CODE_LETTER_CHOICES = tuple(CODE_LETTERS)

# Limits beyond which a value is taken as a typing error rather than a machine.
LIMITS = {
    "frequency": (1.0, 1000.0), "voltage": (1.0, 50_000.0), "current": (0.001, 100_000.0),
    "power": (1.0, 2.0e9), "speed": (1.0, 100_000.0), "torque": (0.001, 1.0e8),
    "altitude": (-500.0, 6000.0), "ambient": (-60.0, 80.0), "rated_ambient": (-60.0, 80.0),
    "rated_altitude": (0.0, 6000.0), "starting_current_ratio": (1.0, 20.0),
}

_TOML_POSITION = re.compile(r"\(at line (\d+), column (\d+)\)")
_HEADER = re.compile(r"^\s*(\[\[?)\s*([A-Za-z0-9_.\-\"' ]+?)\s*\]\]?\s*(#.*)?$")
_KEY = re.compile(r"^\s*([A-Za-z0-9_\-]+)\s*=")
_ID_TEXT = re.compile(r"^[^\x00-\x1f\x7f]{1,200}$")
_RANGE = re.compile(r"^\s*([0-9.]+)\s*(?:-|–|to)\s*([0-9.]+)\s*(.*?)\s*$")


# ----------------------------------------------------------------------------- reading files

def read_text(path) -> str:
    """Read a UTF-8 text file; every failure becomes an InputError naming the file."""
    name = os.fspath(path)
    if os.path.isdir(name):
        raise InputError("is a directory, expected a file", file=name)
    try:
        with open(name, "rb") as handle:
            raw = handle.read()
    except FileNotFoundError:
        raise InputError("no such file", file=name) from None
    except PermissionError:
        raise InputError("cannot be read (permission denied)", file=name) from None
    except OSError as exc:
        raise InputError(f"cannot be read ({exc.strerror or exc})", file=name) from None
    if b"\x00" in raw:
        raise InputError("is a binary file, expected TOML or CSV text", file=name)
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        line = raw[: exc.start].count(b"\n") + 1
        raise InputError("is not UTF-8 text (save it as UTF-8)", file=name, line=line) from None
    return text


def parse_toml(text: str, name: str) -> dict:
    """Parse TOML text; a syntax error names the file and line."""
    if not text.strip():
        raise InputError("file is empty", file=name)
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        message = str(exc)
        match = _TOML_POSITION.search(message)
        line = int(match.group(1)) if match else None
        message = _TOML_POSITION.sub("", message).strip()
        raise InputError(f"TOML syntax error: {message}", file=name, line=line) from None


class Locator:
    """Finds the line of a table or key in TOML text; built only when an error needs it.

    ``index`` gives the lines ready-made ({path: line}), as a spreadsheet reader knows them.
    """

    def __init__(self, text: str | None, index: dict | None = None):
        self._text = "" if text is None and index is not None else text
        self._index = index

    def _build(self) -> dict:
        index: dict = {}
        counters: dict[str, int] = {}
        context: tuple = ()
        for number, line in enumerate((self._text or "").splitlines(), start=1):
            header = _HEADER.match(line)
            if header:
                name = header.group(2).replace('"', "").replace("'", "").replace(" ", "")
                parts = name.split(".")
                if header.group(1) == "[[":
                    if len(parts) == 1:
                        counters = {parts[0]: counters.get(parts[0], -1) + 1}
                        context = (parts[0], counters[parts[0]])
                    else:
                        base = (parts[0], counters.get(parts[0], 0))
                        sub = ".".join(parts[1:])
                        counters[sub] = counters.get(sub, -1) + 1
                        context = base + (sub, counters[sub])
                else:
                    if len(parts) == 1:
                        context = (parts[0],)
                    else:
                        context = (parts[0], counters.get(parts[0], 0), ".".join(parts[1:]))
                index.setdefault(context, number)
                continue
            key = _KEY.match(line)
            if key:
                index.setdefault(context + (key.group(1),), number)
                if len(context) == 2 and key.group(1) in ("rating", "load"):
                    index.setdefault(context + (key.group(1), 0), number)
        return index

    def line(self, *path) -> int | None:
        if self._text is None:
            return None
        if self._index is None:
            self._index = self._build()
        while path:
            found = self._index.get(tuple(path))
            if found is not None:
                return found
            path = path[:-1]
        return None


# ----------------------------------------------------------------------------- field readers

class _Fields:
    """Validates one item's fields, collecting errors with their location."""

    def __init__(self, name, locator, errors, item, base):
        self.name = name
        self.locator = locator
        self.errors = errors
        self.item = item
        self.base = base  # locator path of the item, e.g. ("machine", 3)

    def fail(self, message, key=None, sub=()) -> None:
        path = self.base + tuple(sub) + ((key.split(".")[-1].split("[")[0],) if key else ())
        self.errors.append(InputError(message, file=self.name, line=self.locator.line(*path),
                                      item=self.item, key=key))
        if len(self.errors) >= MAX_ERRORS:
            raise _TooMany

    def unknown_keys(self, table: dict, allowed, prefix="", sub=()) -> None:
        if _key_set(allowed).issuperset(table):
            return
        for key in table:
            if key not in allowed:
                close = closest(key, allowed)
                hint = f" (did you mean {close[0]!r}?)" if close else ""
                expected = "" if close else f"; allowed keys: {', '.join(allowed)}"
                self.fail(f"unknown key {key!r}{hint}{expected}", prefix + key, sub)

    def quantity(self, table, key, kind, *, prefix="", sub=(), required=False, limit=None,
                 default=None):
        value = table.get(key)
        if value is None:
            if required:
                self.fail(f"missing required key {key!r}: expected {units.KINDS[kind][4]}",
                          prefix + key, sub)
            return default
        try:
            result = units.parse(value, kind)
        except InputError as exc:
            self.fail(exc.message, prefix + key, sub)
            return default
        low, high = LIMITS.get(limit or key, (None, None))
        if low is not None and not (low <= result <= high):
            internal = units.KINDS[kind][0]
            self.fail(f"{value!r} is outside the plausible range {low:g} to {high:g} "
                      f"{internal}", prefix + key, sub)
            return default
        return result

    def number(self, table, key, *, prefix="", sub=(), required=False, low=None, high=None,
               integer=False, default=None, what="a number"):
        value = table.get(key)
        if value is None:
            if required:
                self.fail(f"missing required key {key!r}: expected {what}", prefix + key, sub)
            return default
        if isinstance(value, bool) or not isinstance(value, (int, float)) or (
                integer and not isinstance(value, int)):
            self.fail(f"expected {what}, got {type(value).__name__} {value!r}", prefix + key, sub)
            return default
        if not math.isfinite(value):
            self.fail(f"expected a finite number, got {value!r}", prefix + key, sub)
            return default
        if (low is not None and value < low) or (high is not None and value > high):
            self.fail(f"expected {what}, got {value!r}", prefix + key, sub)
            return default
        return value

    def text(self, table, key, *, prefix="", sub=(), required=False, choices=None,
             default=None, upper=False, pattern=None, what="a text"):
        value = table.get(key)
        if value is None:
            if required:
                self.fail(f"missing required key {key!r}: expected {what}", prefix + key, sub)
            return default
        if not isinstance(value, str):
            self.fail(f"expected {what}, got {type(value).__name__} {value!r}", prefix + key, sub)
            return default
        norm = value.strip().upper() if upper else value.strip()
        if choices is not None:
            lookup = _choice_lookup(tuple(choices))
            if norm.upper() not in lookup:
                close = closest(norm, choices)
                hint = f" (did you mean {close[0]!r}?)" if close else ""
                self.fail(f"{value!r} is not one of {', '.join(choices)}{hint}", prefix + key, sub)
                return default
            return lookup[norm.upper()]
        if pattern is not None and not _compiled(pattern).fullmatch(norm):
            self.fail(f"expected {what}, got {value!r}", prefix + key, sub)
            return default
        return norm

    def fraction(self, table, key, *, prefix="", sub=(), what):
        value = table.get(key)
        if value is None:
            return None
        if isinstance(value, (int, float)) and not isinstance(value, bool) and 1 < value <= 100:
            self.fail(f"{what} {value!r} is above 1: write it as '{value} %' or as "
                      f"{value / 100:g}", prefix + key, sub)
            return None
        result = self.quantity(table, key, "fraction", prefix=prefix, sub=sub)
        if result is not None and not (0 < result <= 1):
            self.fail(f"{what} must be above 0 and at most 1 (100 %), got {value!r}",
                      prefix + key, sub)
            return None
        return result


class _TooMany(Exception):
    pass


def closest(word: str, choices) -> list[str]:
    """The one choice nearest ``word`` (difflib, cutoff 0.6), or none: the hint of an error.

    difflib is imported here, not with the module: only a misspelt input needs it.
    """
    import difflib

    return difflib.get_close_matches(word, list(choices), n=1, cutoff=0.6)


@functools.lru_cache(maxsize=64)
def _key_set(allowed: tuple) -> frozenset:
    return frozenset(allowed)


_compiled = functools.lru_cache(maxsize=64)(re.compile)


@functools.lru_cache(maxsize=64)
def _choice_lookup(choices: tuple) -> dict:
    """{CHOICE: choice}: the spelling to keep for each accepted value, read in any case."""
    return {c.upper(): c for c in choices}


def _as_list(value):
    return list(value) if isinstance(value, list) else [value]


# ----------------------------------------------------------------------------- catalog

def load_catalog(path) -> Catalog:
    """Read and validate a catalog file (TOML, or CSV by its ending)."""
    name = os.fspath(path)
    if name.lower().endswith(".csv"):
        from ..inputs.inventory import load_inventory

        return load_inventory(name)
    text = read_text(name)
    data = parse_toml(text, name)
    return catalog_from_data(data, name, text)


def catalog_from_data(data: dict, name: str, text: str | None = None, locator=None) -> Catalog:
    """Validate parsed catalog data; raise InputErrors with every problem found."""
    locator = locator or Locator(text)
    errors: list[InputError] = []
    machines = []
    top = _Fields(name, locator, errors, None, ())
    try:
        if "machine" not in data:
            if "site" in data:
                top.fail("this is a sites file (it has [[site]] tables), not a catalog: give it "
                         "with --sites")
            else:
                top.fail("no [[machine]] tables: a catalog lists machines as [[machine]] tables")
            raise _TooMany
        top.unknown_keys(data, ("catalog", "machine"))
        meta = data.get("catalog", {})
        title = ""
        if not isinstance(meta, dict):
            top.fail("[catalog] must be a table", "catalog")
        else:
            title = top.text(meta, "title", prefix="catalog.", sub=("catalog",), default="",
                             what="a title text") or ""
            top.unknown_keys(meta, ("title",), "catalog.", ("catalog",))
        entries = data["machine"]
        if not isinstance(entries, list):
            top.fail("'machine' must be an array of tables, written [[machine]]", "machine")
            raise _TooMany
        seen: dict[str, int] = {}
        for index, entry in enumerate(entries):
            machine = _machine(entry, index, name, locator, errors, seen)
            if machine is not None:
                machines.append(machine)
    except _TooMany:
        pass
    if errors:
        if len(errors) >= MAX_ERRORS:
            errors.append(InputError(f"stopped after {MAX_ERRORS} problems", file=name))
        raise InputErrors(errors)
    return Catalog(title=title, machines=tuple(machines), source=name)


def _machine(entry, index, name, locator, errors, seen) -> Machine | None:
    base = ("machine", index)
    if not isinstance(entry, dict):
        _Fields(name, locator, errors, None, base).fail(
            f"machine #{index + 1} must be a table", "machine")
        return None
    before = len(errors)
    raw_id = entry.get("id")
    item = raw_id if isinstance(raw_id, str) else f"machine #{index + 1}"
    f = _Fields(name, locator, errors, item, base)
    machine_id = f.text(entry, "id", required=True, what="an id text")
    if machine_id is not None:
        if not _ID_TEXT.match(machine_id):
            f.fail("id must be 1 to 200 printable characters", "id")
        elif machine_id in seen:
            f.fail(f"duplicate id: machine #{seen[machine_id] + 1} already has it", "id")
        else:
            seen[machine_id] = index
    f.unknown_keys(entry, MACHINE_KEYS)
    kind = f.text(entry, "kind", choices=KINDS, default="induction-motor", what="a kind")
    phases = f.number(entry, "phases", integer=True, default=3, what="1 or 3 phases")
    if phases not in (1, 3):
        if phases is not None and "phases" in entry and isinstance(entry["phases"], int):
            f.fail(f"a machine has 1 or 3 phases, got {phases!r}", "phases")
        phases = 3
    poles = f.number(entry, "poles", integer=True, low=2, high=200,
                     what="an even number of poles, 2 or more")
    if poles is not None and poles % 2:
        f.fail(f"poles must be an even number (poles, not pole pairs), got {poles}", "poles")
        poles = None
    service_factor = f.number(entry, "service_factor", low=1.0, high=2.0, default=1.0,
                              what="a service factor from 1.0 to 2.0")
    description = f.text(entry, "description", default="", what="a description text")
    efficiency_class = f.text(entry, "efficiency_class", choices=EFFICIENCY_CLASSES,
                              what="an IE class")
    code_letter = f.text(entry, "code_letter", choices=_CODE_LETTER_CHOICES,
                         what="a NEMA code letter")
    design_letter = f.text(entry, "design_letter", choices=DESIGN_LETTERS,
                           what="a design letter")
    insulation = f.text(entry, "insulation_class", choices=INSULATION_CLASSES,
                        what="an insulation class")
    cooling = f.text(entry, "cooling", upper=True, default="IC411", pattern=r"IC[0-9A-Z]{2,8}",
                     what="an IEC 60034-6 cooling code such as 'IC411'")
    duty = f.text(entry, "duty", upper=True, default="S1",
                  pattern=r"S(10|[1-9])\b.{0,40}", what="an IEC 60034-1 duty type S1 to S10")
    max_speed = f.quantity(entry, "max_speed", "speed", limit="speed")
    rated_ambient = f.quantity(entry, "rated_ambient", "temperature", default=40.0)
    rated_altitude = f.quantity(entry, "rated_altitude", "length", default=1000.0)
    prime_mover_speed = f.quantity(entry, "prime_mover_speed", "speed", limit="speed")
    if prime_mover_speed is not None and kind != "synchronous-generator":
        f.fail("prime_mover_speed is for generators (kind = 'synchronous-generator')",
               "prime_mover_speed")

    ratings = []
    raw_ratings = entry.get("rating")
    if raw_ratings is None:
        f.fail("missing required key 'rating': add at least one [[machine.rating]] table",
               "rating")
    elif not isinstance(raw_ratings, list) or not raw_ratings:
        f.fail("'rating' must be an array of tables, written [[machine.rating]]", "rating")
    else:
        for r_index, raw in enumerate(raw_ratings):
            rating = _rating(f, raw, r_index, kind, phases)
            if rating is not None:
                ratings.append(rating)
    load = None
    if "load" in entry:
        load = _load(f, entry["load"], kind)

    if len(errors) > before:
        return None
    poles = _check_poles(f, ratings, poles, kind)
    if len(errors) > before:
        return None
    return Machine(
        id=machine_id, kind=kind, phases=phases, ratings=tuple(ratings), poles=poles,
        description=description, service_factor=service_factor,
        insulation_class=insulation, efficiency_class=efficiency_class,
        max_speed_rpm=max_speed, code_letter=code_letter, design_letter=design_letter,
        cooling=cooling, duty=duty, rated_ambient_degc=rated_ambient,
        rated_altitude_m=rated_altitude, prime_mover_speed_rpm=prime_mover_speed, load=load,
        source=name)


def _voltages(f, raw, key, sub):
    """Parse a rating's voltage: one value, a range string, or a list of either."""
    values = []
    for position, value in enumerate(_as_list(raw)):
        where = key if not isinstance(raw, list) else f"{key}[{position + 1}]"
        if isinstance(value, str):
            match = _RANGE.match(value)
            if match and match.group(3):
                low = units.parse(f"{match.group(1)} {match.group(3)}", "voltage")
                high = units.parse(f"{match.group(2)} {match.group(3)}", "voltage")
                if not 0 < low < high:
                    f.fail(f"voltage range {value!r} must run from low to high", where, sub)
                    return None
                if high > 1.25 * low:
                    f.fail(f"voltage range {value!r} is wider than 25 %: is it two connections "
                           f"(write them as a list)?", where, sub)
                    return None
                values.append((low, high))
                continue
        try:
            volts = units.parse(value, "voltage")
        except InputError as exc:
            f.fail(exc.message, where, sub)
            return None
        low_limit, high_limit = LIMITS["voltage"]
        if not low_limit <= volts <= high_limit:
            f.fail(f"{value!r} is outside the plausible range {low_limit:g} to "
                   f"{high_limit:g} V", where, sub)
            return None
        values.append((volts, volts))
    if not values:
        f.fail("voltage list is empty", key, sub)
        return None
    return values


def _rating(f, raw, r_index, kind, phases) -> Rating | None:
    sub = ("rating", r_index)
    prefix = f"rating[{r_index + 1}]."
    if not isinstance(raw, dict):
        f.fail("each rating must be a table", f"rating[{r_index + 1}]", sub)
        return None
    before = len(f.errors)
    f.unknown_keys(raw, RATING_KEYS, prefix, sub)
    frequency = f.quantity(raw, "frequency", "frequency", prefix=prefix, sub=sub, required=True)
    voltages = None
    if raw.get("voltage") is None:
        f.fail("missing required key 'voltage': expected a voltage such as '400 V', a list "
               "such as ['230 V', '460 V'] or a range such as '380-415 V'", prefix + "voltage", sub)
    else:
        voltages = _voltages(f, raw["voltage"], prefix + "voltage", sub)
    n = len(voltages) if voltages else None
    names = raw.get("connection")
    if names is not None:
        names = _as_list(names)
        if not all(isinstance(x, str) and x.strip() for x in names):
            f.fail("connection names must be texts such as 'delta' or 'high'",
                   prefix + "connection", sub)
            names = None
        elif n is not None and len(names) != n:
            f.fail(f"{len(names)} connection names for {n} voltages: give one per voltage",
                   prefix + "connection", sub)
            names = None
    currents = None
    if raw.get("current") is not None:
        currents = []
        for position, value in enumerate(_as_list(raw["current"])):
            try:
                amps = units.parse(value, "current")
            except InputError as exc:
                f.fail(exc.message, prefix + f"current[{position + 1}]", sub)
                currents = None
                break
            if not LIMITS["current"][0] <= amps <= LIMITS["current"][1]:
                f.fail(f"{value!r} is outside the plausible range", prefix + "current", sub)
                currents = None
                break
            currents.append(amps)
        if currents is not None and n is not None and len(currents) != n:
            f.fail(f"{len(currents)} currents for {n} voltages: give one per voltage",
                   prefix + "current", sub)
            currents = None
    power = apparent = None
    raw_power = raw.get("power")
    generator = kind == "synchronous-generator"
    if raw_power is None:
        f.fail("missing required key 'power': expected " + (
            "an apparent power such as '500 kVA' or a power such as '400 kW'" if generator
            else "a power such as '75 kW' or '100 hp'"), prefix + "power", sub)
    elif generator and isinstance(raw_power, str) and re.search(r"VA\s*$", raw_power, re.I):
        apparent = f.quantity(raw, "power", "apparent_power", prefix=prefix, sub=sub,
                              limit="power")
    else:
        power = f.quantity(raw, "power", "power", prefix=prefix, sub=sub)
    speed = f.quantity(raw, "speed", "speed", prefix=prefix, sub=sub)
    power_factor = f.fraction(raw, "power_factor", prefix=prefix, sub=sub, what="power factor")
    efficiency = f.fraction(raw, "efficiency", prefix=prefix, sub=sub, what="efficiency")
    service_factor = f.number(raw, "service_factor", prefix=prefix, sub=sub, low=1.0, high=2.0,
                              what="a service factor from 1.0 to 2.0")
    ratio = f.number(raw, "starting_current_ratio", prefix=prefix, sub=sub, low=1.0, high=20.0,
                     what="a locked-rotor current ratio Ia/In from 1 to 20")
    lrc = None
    if raw.get("locked_rotor_current") is not None:
        lrc_values = _as_list(raw["locked_rotor_current"])
        if n is not None and len(lrc_values) not in (1, n) or (n and n > 1 and len(lrc_values) == 1):
            f.fail(f"give one locked-rotor current per voltage ({n})",
                   prefix + "locked_rotor_current", sub)
        else:
            parsed = []
            for value in lrc_values:
                try:
                    parsed.append(units.parse(value, "current"))
                except InputError as exc:
                    f.fail(exc.message, prefix + "locked_rotor_current", sub)
                    break
            else:
                lrc = tuple(parsed)
    if len(f.errors) > before or voltages is None:
        return None
    if generator and apparent is None and power is not None:
        apparent = power / (power_factor or 0.8)
    if generator and power is None and apparent is not None:
        power = apparent * (power_factor or 0.8)
    connections = tuple(
        Connection(name=(names[i].strip() if names else None), voltage_min_v=v[0],
                   voltage_max_v=v[1], current_a=(currents[i] if currents else None))
        for i, v in enumerate(voltages))
    return Rating(frequency_hz=frequency, connections=connections, power_w=power,
                  apparent_power_va=apparent, speed_rpm=speed, power_factor=power_factor,
                  efficiency=efficiency, service_factor=service_factor,
                  locked_rotor_current_a=lrc, starting_current_ratio=ratio)


def _load(f, raw, kind) -> Load | None:
    sub = ("load",)
    if not isinstance(raw, dict):
        f.fail("load must be a table, written [machine.load]", "load")
        return None
    if kind == "synchronous-generator":
        f.fail("a generator drives no load: remove [machine.load]", "load")
        return None
    before = len(f.errors)
    f.unknown_keys(raw, LOAD_KEYS, "load.", sub)
    load_type = f.text(raw, "type", prefix="load.", sub=sub, required=True, choices=LOAD_TYPES,
                       what="a load type")
    power = f.quantity(raw, "power", "power", prefix="load.", sub=sub)
    torque = f.quantity(raw, "torque", "torque", prefix="load.", sub=sub)
    max_speed = f.quantity(raw, "max_speed", "speed", prefix="load.", sub=sub, limit="speed")
    if "power" not in raw and "torque" not in raw:
        f.fail("give the load's 'power' (or 'torque') at the rated speed", "load.power", sub)
    elif "power" in raw and "torque" in raw:
        f.fail("give the load's 'power' or its 'torque', not both", "load.torque", sub)
    if len(f.errors) > before:
        return None
    return Load(type=load_type, power_w=power, torque_nm=torque, max_speed_rpm=max_speed)


def _check_poles(f, ratings, poles, kind):
    """Infer or check the pole count against every rating's speed."""
    synchronous = kind != "induction-motor"
    for r_index, rating in enumerate(ratings):
        sub = ("rating", r_index)
        key = f"rating[{r_index + 1}].speed"
        if rating.speed_rpm is None:
            if poles is None:
                f.fail("give the rated 'speed' or the machine's 'poles'", key, sub)
                return None
            continue
        try:
            implied = speed_physics.poles_from_speed(rating.speed_rpm, rating.frequency_hz,
                                                     synchronous=synchronous)
        except DomainError as exc:
            if poles is not None and not synchronous:
                n_s = 120.0 * rating.frequency_hz / poles
                if rating.speed_rpm >= n_s:
                    f.fail(f"rated speed {rating.speed_rpm:g} rpm is at or above the synchronous "
                           f"speed {n_s:g} rpm of {poles} poles at {rating.frequency_hz:g} Hz",
                           key, sub)
                    return None
            f.fail(str(exc), key, sub)
            return None
        if poles is None:
            poles = implied
        elif implied != poles:
            n_s = 120.0 * rating.frequency_hz / poles
            f.fail(f"rated speed {rating.speed_rpm:g} rpm at {rating.frequency_hz:g} Hz means "
                   f"{implied} poles, but poles = {poles} (synchronous {n_s:g} rpm)", key, sub)
            return None
    return poles


# ----------------------------------------------------------------------------- sites

def load_sites(path) -> tuple[Site, ...]:
    """Read and validate a sites file (TOML)."""
    name = os.fspath(path)
    text = read_text(name)
    data = parse_toml(text, name)
    return sites_from_data(data, name, text)


def sites_from_data(data: dict, name: str, text: str | None = None) -> tuple[Site, ...]:
    locator = Locator(text)
    errors: list[InputError] = []
    sites = []
    top = _Fields(name, locator, errors, None, ())
    try:
        if "site" not in data:
            if "machine" in data:
                top.fail("this is a machine catalog (it has [[machine]] tables), not a sites "
                         "file: give it as a CATALOG argument")
            else:
                top.fail("no [[site]] tables: a sites file lists supplies as [[site]] tables")
            raise _TooMany
        top.unknown_keys(data, ("site",))
        entries = data["site"]
        if not isinstance(entries, list):
            top.fail("'site' must be an array of tables, written [[site]]", "site")
            raise _TooMany
        seen: dict[str, int] = {}
        for index, entry in enumerate(entries):
            site = _site(entry, index, name, locator, errors, seen)
            if site is not None:
                sites.append(site)
    except _TooMany:
        pass
    if errors:
        raise InputErrors(errors)
    return tuple(sites)


def _site(entry, index, name, locator, errors, seen) -> Site | None:
    base = ("site", index)
    if not isinstance(entry, dict):
        _Fields(name, locator, errors, None, base).fail(f"site #{index + 1} must be a table")
        return None
    before = len(errors)
    raw_id = entry.get("id")
    item = raw_id if isinstance(raw_id, str) else f"site #{index + 1}"
    f = _Fields(name, locator, errors, item, base)
    site_id = f.text(entry, "id", required=True, what="an id text")
    if site_id is not None:
        if not _ID_TEXT.match(site_id):
            f.fail("id must be 1 to 200 printable characters", "id")
        elif site_id in seen:
            f.fail(f"duplicate id: site #{seen[site_id] + 1} already has it", "id")
        else:
            seen[site_id] = index
    f.unknown_keys(entry, SITE_KEYS)
    site_name = f.text(entry, "name", default="", what="a name text")
    frequency = f.quantity(entry, "frequency", "frequency", required=True)
    voltage = f.quantity(entry, "voltage", "voltage", required=True)
    phases = f.number(entry, "phases", integer=True, default=3, what="1, 2 or 3 phases")
    if phases not in (1, 2, 3):
        f.fail(f"a supply has 1, 2 or 3 phases, got {phases!r}", "phases")
    system = f.text(entry, "system", choices=SYSTEMS, what="a system")
    standard = f.text(entry, "standard", choices=STANDARDS, upper=True, what="a standard")
    if standard is None and "standard" not in entry and frequency is not None:
        standard = "NEMA" if abs(frequency - 60.0) < 3.0 else "IEC"
    voltage_range = None
    if entry.get("voltage_range") is not None:
        raw = entry["voltage_range"]
        if isinstance(raw, str) and _RANGE.match(raw):
            match = _RANGE.match(raw)
            raw = [f"{match.group(1)} {match.group(3)}", f"{match.group(2)} {match.group(3)}"]
        if not isinstance(raw, list) or len(raw) != 2:
            f.fail("voltage_range must be two voltages, e.g. ['380 V', '420 V']", "voltage_range")
        else:
            try:
                low, high = (units.parse(v, "voltage") for v in raw)
            except InputError as exc:
                f.fail(exc.message, "voltage_range")
            else:
                if not 0 < low <= high:
                    f.fail(f"voltage_range must run from low to high, got {raw!r}", "voltage_range")
                elif voltage is not None and not low <= voltage <= high:
                    f.fail(f"nominal voltage {voltage:g} V lies outside voltage_range "
                           f"{low:g}-{high:g} V", "voltage_range")
                else:
                    voltage_range = (low, high)
    unbalance = f.quantity(entry, "unbalance", "percent")
    if unbalance is not None and not 0 <= unbalance <= 0.5:
        f.fail(f"unbalance must be between 0 and 50 %, got {entry['unbalance']!r}", "unbalance")
    line_voltages = None
    if entry.get("line_voltages") is not None:
        raw = entry["line_voltages"]
        if "unbalance" in entry:
            f.fail("give 'unbalance' or 'line_voltages', not both", "line_voltages")
        elif not isinstance(raw, list) or len(raw) != 3:
            f.fail("line_voltages must be three voltages, e.g. ['460 V', '467 V', '450 V']",
                   "line_voltages")
        else:
            try:
                line_voltages = tuple(units.parse(v, "voltage") for v in raw)
            except InputError as exc:
                f.fail(exc.message, "line_voltages")
            else:
                if not all(v > 0 for v in line_voltages):
                    f.fail("line voltages must be positive", "line_voltages")
                    line_voltages = None
    altitude = f.quantity(entry, "altitude", "length", default=0.0)
    ambient = f.quantity(entry, "ambient", "temperature", default=40.0)
    min_class = f.text(entry, "min_efficiency_class", choices=EFFICIENCY_CLASSES,
                       what="an IE class")
    if phases in (1, 2, 3) and system is not None:
        wanted = {"wye": 3, "delta": 3, "split-phase": 1, "quadrature": 2}[system]
        if wanted != phases:
            f.fail(f"system {system!r} needs phases = {wanted}, got {phases}", "system")
    if len(errors) > before:
        return None
    return Site(id=site_id, name=site_name, frequency_hz=frequency, voltage_v=voltage,
                phases=phases, system=system, standard=standard, voltage_range_v=voltage_range,
                unbalance=unbalance, line_voltages_v=line_voltages, altitude_m=altitude,
                ambient_degc=ambient, min_efficiency_class=min_class, source=name)
