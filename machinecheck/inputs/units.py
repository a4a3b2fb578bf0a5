"""The one unit registry of machinecheck, and fast parsing of quantity strings to SI floats.

Quantities arrive as strings with a unit ("75 kW", "100 hp", "1780 rpm", "45 degC") or as bare
numbers in the documented default unit of their kind. Inside the project every value is a plain
float in the internal unit of its kind (SI, with rpm for shaft speed and degC for temperature).

pint is the only source of unit definitions, but importing it and building its registry costs
a few tenths of a second and parsing a string costs ~150 us, so: the number is split from the
unit with a regular expression, each distinct (unit, kind) pair is converted by pint once and its
scale and offset cached, and a bare number or the kind's default unit never builds the registry
at all. The scales pint gave are also kept on disk (see :func:`cache_path`), keyed by the
installed pint and by this module's unit tables, so later runs read "hp" or "kV" without
importing pint; pint's own registry cache is used likewise.
"""

from __future__ import annotations

import contextlib
import functools
import json
import math
import os
import re
import zlib

from ..errors import InputError

#: kind -> (internal unit, default unit for bare numbers, scale of the default unit to internal,
#: a reference unit of the same dimension for pint checks, what to say in errors)
KINDS = {
    "power": ("W", "kW", 1000.0, "W", "a power such as '75 kW' or '100 hp'"),
    "apparent_power": ("VA", "kVA", 1000.0, "VA", "an apparent power such as '500 kVA'"),
    "voltage": ("V", "V", 1.0, "V", "a voltage such as '400 V' or '4.16 kV'"),
    "current": ("A", "A", 1.0, "A", "a current such as '62 A'"),
    "frequency": ("Hz", "Hz", 1.0, "Hz", "a frequency such as '50 Hz'"),
    "speed": ("rpm", "rpm", 1.0, "rpm", "a shaft speed such as '1460 rpm'"),
    "length": ("m", "m", 1.0, "m", "an altitude such as '1650 m' or '5400 ft'"),
    "temperature": ("degC", "degC", 1.0, "degC", "a temperature such as '45 degC'"),
    "fraction": ("", "", 1.0, "", "a fraction such as 0.86 or '86 %'"),
    "percent": ("", "%", 0.01, "", "a percentage such as '1.2 %'"),
    "torque": ("N*m", "N*m", 1.0, "N*m", "a torque such as '240 N*m'"),
}

# Spellings found on nameplates that pint does not read, or reads as something else ("PS" would
# be a petasiemens, "KW" a kelvin-watt).
_ALIASES = {
    "r/min": "rpm", "rev/min": "rpm", "RPM": "rpm", "Rpm": "rpm", "min-1": "1/min",
    "min^-1": "1/min", "min⁻¹": "1/min", "1/min": "1/min", "%": "percent", "°C": "degC",
    "℃": "degC", "°F": "degF", "C": "degC", "F": "degF", "CV": "metric_horsepower",
    "cv": "metric_horsepower", "PS": "metric_horsepower", "HP": "hp", "Hp": "hp", "KW": "kW",
    "Kw": "kW", "kw": "kW", "KV": "kV", "kv": "kV", "v": "V", "a": "A", "HZ": "Hz", "hz": "Hz",
    "KVA": "kVA", "kva": "kVA", "MVA": "MVA", "Nm": "N*m", "N.m": "N*m", "N m": "N*m",
    "lb-ft": "lbf*ft", "lbft": "lbf*ft", "lb ft": "lbf*ft", "lbf ft": "lbf*ft",
}

_NUMBER = re.compile(r"\s*([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")

_registry = None
_conversions: dict[tuple[str, str], tuple[float, float] | str] = {}


def registry():
    """Return the project's pint UnitRegistry, building it on first use."""
    global _registry
    if _registry is None:
        import pint

        try:
            _registry = pint.UnitRegistry(cache_folder=":auto:")
        except Exception:  # an unwritable cache folder must not stop the tool
            _registry = pint.UnitRegistry()
    return _registry


#: Whole quantity strings already parsed ("50 Hz", "400 V" recur across a fleet), bounded.
_values: dict[tuple[str, str], float] = {}
_VALUES_LIMIT = 200_000


def _conversion(unit: str, kind: str) -> tuple[float, float] | str:
    """Scale and offset taking ``unit`` to the internal unit of ``kind``, or an error text."""
    key = (unit, kind)
    cached = _conversions.get(key)
    if cached is not None:
        return cached
    internal, default, default_scale, _, _ = KINDS[kind]
    if unit == default:
        result: tuple[float, float] | str = (default_scale, 0.0)
    elif unit == internal and kind != "percent":
        result = (1.0, 0.0)
    else:
        name = f"{kind} {unit}"
        stored = _stored().get(name)
        if stored is not None:
            result = (float(stored[0]), float(stored[1]))
        else:
            result = _pint_conversion(_ALIASES.get(unit, unit), kind)
            if not isinstance(result, str):
                _store(name, result)
    _conversions[key] = result
    return result


# ----------------------------------------------------------------------------- on-disk cache

_CACHE_FORMAT = 1
_stored_table: dict | None = None


def cache_path() -> str | None:
    """The file keeping pint's scales between runs, or None when caching is off.

    ``MACHINECHECK_CACHE`` names the folder ("" turns the cache off); otherwise it is
    ``$XDG_CACHE_HOME/machinecheck`` or ``~/.cache/machinecheck``. Each pint installation has
    its own file, so environments beside each other do not overwrite each other's.
    """
    folder = os.environ.get("MACHINECHECK_CACHE")
    if folder is None:
        base = os.environ.get("XDG_CACHE_HOME") or os.path.join(os.path.expanduser("~"), ".cache")
        folder = os.path.join(base, "machinecheck")
    if not folder:
        return None
    return os.path.join(folder, f"unit-scales-{zlib.crc32(_cache_key().encode()):08x}.json")


@functools.lru_cache(maxsize=1)
def _cache_key() -> str:
    """What the stored scales depend on: the installed pint, and this module's tables."""
    import importlib.util

    spec = importlib.util.find_spec("pint")
    try:
        stat = os.stat(spec.origin) if spec is not None and spec.origin else None
    except OSError:
        stat = None
    pint_id = f"{spec.origin}:{stat.st_mtime_ns}:{stat.st_size}" if stat else "no pint"
    code = _pint_conversion.__code__
    tables = json.dumps([_CACHE_FORMAT, KINDS, _ALIASES], sort_keys=True)
    checksum = zlib.crc32(tables.encode() + code.co_code + repr(code.co_consts).encode())
    return f"{pint_id}|{checksum:08x}"


def _stored() -> dict:
    """The scales kept on disk by earlier runs for the installed pint ({} if none or stale)."""
    global _stored_table
    if _stored_table is None:
        _stored_table = {}
        path = cache_path()
        if path is not None:
            try:
                with open(path, encoding="utf-8") as handle:
                    data = json.load(handle)
                if data.get("key") == _cache_key() and isinstance(data.get("scales"), dict):
                    _stored_table = {name: value for name, value in data["scales"].items()
                                     if _is_scale(value)}
            except (OSError, ValueError, AttributeError):
                pass  # a missing, unreadable or damaged cache is rebuilt from pint
    return _stored_table


def _is_scale(value) -> bool:
    return (isinstance(value, list) and len(value) == 2
            and all(type(x) in (int, float) and math.isfinite(x) for x in value))


def _store(name: str, scale: tuple[float, float]) -> None:
    """Keep one scale pint gave; written whole and atomically; failures are ignored."""
    table = _stored()
    table[name] = list(scale)
    path = cache_path()
    if path is None:
        return
    temporary = f"{path}.{os.getpid()}.tmp"
    try:
        os.makedirs(os.path.dirname(path), exist_ok=True)
        with open(temporary, "w", encoding="utf-8") as handle:
            json.dump({"key": _cache_key(), "scales": table}, handle)
        os.replace(temporary, path)
    except OSError:
        with contextlib.suppress(OSError):
            os.unlink(temporary)


def _pint_conversion(unit: str, kind: str) -> tuple[float, float] | str:
    import pint

    ureg = registry()
    internal = KINDS[kind][0]
    try:
        parsed = ureg.parse_units(unit)
    except (pint.errors.PintError, AttributeError, TypeError, ValueError, SyntaxError):
        return f"unknown unit {unit!r}"
    except Exception:  # pint's tokenizer raises assorted errors on garbage
        return f"unknown unit {unit!r}"
    root_text = str(ureg.get_root_units(parsed)[1])
    angular = "radian" in root_text or "revolution" in str(parsed)
    if kind == "speed" and not angular:
        target = ureg.parse_units("1/min")  # min^-1 on a plate means revolutions per minute
    elif kind == "frequency" and angular:
        return f"{unit!r} is a shaft speed, not a frequency"
    else:
        target = ureg.parse_units(internal) if internal else ureg.dimensionless
    if parsed.dimensionality != target.dimensionality:
        return f"{unit!r} is not a unit of {kind.replace('_', ' ')}"
    try:
        zero = ureg.Quantity(0.0, parsed).to(target).magnitude
        one = ureg.Quantity(1.0, parsed).to(target).magnitude
    except pint.errors.PintError:
        return f"{unit!r} cannot be converted to {internal or 'a ratio'}"
    return (float(one - zero), float(zero))


def split_number(text: str) -> tuple[float, str] | None:
    """Split '75 kW' into (75.0, 'kW'); None when the text does not start with a number."""
    match = _NUMBER.match(text)
    if match is None:
        return None
    return float(match.group(1)), match.group(2)


def parse(value, kind: str) -> float:
    """Parse a quantity (string with unit, or bare number in the default unit) to an SI float.

    Parameters
    ----------
    value : str, int or float
        "75 kW", "60Hz", "45 degC", or a bare number in the default unit of ``kind``.
    kind : str
        One of :data:`KINDS`.

    Returns
    -------
    float
        The value in the internal unit of ``kind`` (W, VA, V, A, Hz, rpm, m, degC, ratio, N*m).

    Raises
    ------
    InputError
        For text that is not a number with a unit of this kind, or a non-finite number.
    """
    if type(value) is str:
        known = _values.get((value, kind))
        if known is not None:
            return known
    _, default, default_scale, _, expected = KINDS[kind]
    if isinstance(value, bool):
        raise InputError(f"expected {expected}, got {value!r}")
    if isinstance(value, (int, float)):
        number = float(value) * default_scale
        if not math.isfinite(number):
            raise InputError(f"expected a finite number, got {value!r}")
        return number
    if not isinstance(value, str):
        raise InputError(f"expected {expected}, got {type(value).__name__} {value!r}")
    split = split_number(value)
    if split is None:
        raise InputError(f"expected {expected}, got {value!r}")
    number, unit = split
    conversion = _conversion(unit or default, kind)  # "60" means the default unit, as 60 does
    if isinstance(conversion, str):
        raise InputError(f"{conversion}: expected {expected}, got {value!r}")
    scale, offset = conversion
    result = number * scale + offset
    if not math.isfinite(result):
        raise InputError(f"expected a finite number, got {value!r}")
    if len(_values) >= _VALUES_LIMIT:
        _values.clear()
    _values[(value, kind)] = result
    return result


def to_unit(value_si: float, kind: str, unit: str) -> float:
    """Convert an internal-unit float of ``kind`` to ``unit`` (for output)."""
    conversion = _conversion(unit, kind)
    if isinstance(conversion, str):
        raise InputError(conversion)
    scale, offset = conversion
    return (value_si - offset) / scale


KW_PER_HP = 0.745699872  # mechanical horsepower, 550 ft*lbf/s (pint's definition)


def kw_to_hp(power_kw: float) -> float:
    """Mechanical horsepower from kilowatts (1 hp = 745.7 W)."""
    return power_kw / KW_PER_HP
