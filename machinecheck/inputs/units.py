"""Quantity strings to SI floats: one number grammar, one unit table, one pint registry.

Quantities arrive as strings with a unit ("75 kW", "1/2 hp", "1780 rpm", "45 °C", "93 %") or
as bare numbers. Inside the project every value is a plain float in the internal unit of its
kind (SI, with rpm for shaft speed and degC for temperature).

The grammar of a quantity, shared by files and command-line options:

- a number: ``1460``, ``-5``, ``0.86``, ``.5``, ``2e3``, or a fraction ``1/2``; a decimal
  comma (``0,75``) only where the caller declares decimal commas;
- then an optional unit, spelt as on nameplates (``kW``, ``hp``, ``r/min``, ``°C``, ``%``).

Refused: a non-finite number, more than :data:`MAX_DIGITS` characters of number, a number
written nonzero that underflows to 0 (``1e-400``), a bare
number where the kind has no default unit (power: kW or hp?), and unit text pint reads as
something else (``%%``). A tiny value that does not underflow (``1e-310``) is refused by the
range of its field (:mod:`.fields`) wherever 0 is not allowed.

Unit scales come from a static table, :mod:`machinecheck.inputs.unit_table`, generated from
pint by ``python -m machinecheck.inputs.units --write-table`` and checked against pint by
``tests/inputs/test_units.py``; a spelling not in the table is asked of pint (imported then,
and only then), and the answer kept in memory for the run.
"""

from __future__ import annotations

import math
import re
import sys
from dataclasses import dataclass
from typing import Any

from ..errors import InputError
from .unit_table import SCALES


@dataclass(frozen=True)
class Kind:
    """A dimension of input quantity.

    ``default`` is the unit a bare number is read in, or None where a bare number is ambiguous.
    """

    internal: str
    default: str | None
    pint_target: str
    example: str


#: kind name -> Kind. ``pint_target`` is the unit pint converts to (the internal unit).
KINDS: dict[str, Kind] = {
    "power": Kind("W", None, "W", "a power with its unit, such as '75 kW' or '100 hp'"),
    "apparent_power": Kind("VA", None, "VA", "an apparent power with its unit, such as '500 kVA'"),
    "voltage": Kind("V", "V", "V", "a voltage such as '400 V' or '4.16 kV'"),
    "current": Kind("A", "A", "A", "a current such as '62 A'"),
    "frequency": Kind("Hz", "Hz", "Hz", "a frequency such as '50 Hz'"),
    "speed": Kind("rpm", "rpm", "1/min", "a shaft speed such as '1460 rpm'"),
    "length": Kind("m", "m", "m", "a length such as '120 m' or '5400 ft'"),
    "temperature": Kind("degC", "degC", "degC", "a temperature such as '45 degC'"),
    "fraction": Kind("", "", "dimensionless", "a fraction such as 0.86 or '86 %'"),
    "percent": Kind("", "%", "dimensionless", "a percentage such as '1.2 %'"),
    "torque": Kind("N*m", "N*m", "N*m", "a torque such as '240 N m'"),
    "inertia": Kind("kg*m**2", "kg*m**2", "kg*m**2", "an inertia such as '0.8 kg m2'"),
    "resistance": Kind("ohm", "ohm", "ohm", "an impedance in ohm such as '0.12 ohm'"),
    "resistance_per_length": Kind("ohm/m", None, "ohm/m", "an impedance per length such as "
                                  "'0.62 ohm/km'"),
    "area": Kind("mm**2", None, "mm**2", "a conductor size such as '35 mm2' or '250 kcmil'"),
    "time": Kind("s", None, "s", "a time such as '6000 h'"),
    "energy_price": Kind("1/kWh", None, "1/kWh", "an energy price such as '0.12 /kWh'"),
    "dimensionless": Kind("", "", "dimensionless", "a number"),
}

#: Spellings read per kind, and what pint is asked for each. Spellings found on nameplates
#: that pint does not read, or reads as something else ("PS" would be a petasiemens, "KW" a
#: kelvin-watt, "C" a coulomb), are mapped to what they mean. The static table holds them all.
SPELLINGS: dict[str, dict[str, str]] = {
    "power": {"W": "W", "kW": "kW", "MW": "MW", "kw": "kW", "KW": "kW", "Kw": "kW",
              "hp": "hp", "HP": "hp", "Hp": "hp", "CV": "metric_horsepower",
              "cv": "metric_horsepower", "PS": "metric_horsepower"},
    "apparent_power": {"VA": "VA", "kVA": "kVA", "MVA": "MVA", "KVA": "kVA", "kva": "kVA"},
    "voltage": {"V": "V", "v": "V", "kV": "kV", "KV": "kV", "kv": "kV"},
    "current": {"A": "A", "a": "A", "kA": "kA", "mA": "mA"},
    "frequency": {"Hz": "Hz", "HZ": "Hz", "hz": "Hz"},
    "speed": {"rpm": "1/min", "RPM": "1/min", "Rpm": "1/min", "r/min": "1/min",
              "rev/min": "1/min", "1/min": "1/min", "/min": "1/min", "min-1": "1/min",
              "min^-1": "1/min", "min⁻¹": "1/min", "rad/s": "rad/s"},
    "length": {"m": "m", "km": "km", "ft": "ft"},
    "temperature": {"degC": "degC", "°C": "degC", "℃": "degC", "C": "degC", "degF": "degF",
                    "°F": "degF", "F": "degF", "K": "K"},
    "fraction": {"%": "percent", "percent": "percent"},
    "percent": {"%": "percent", "percent": "percent"},
    "torque": {"N*m": "N*m", "Nm": "N*m", "N.m": "N*m", "N m": "N*m", "N·m": "N*m",
               "kN*m": "kN*m", "kNm": "kN*m", "kN m": "kN*m", "lbf*ft": "lbf*ft",
               "lb-ft": "lbf*ft", "lbft": "lbf*ft", "lb ft": "lbf*ft", "lbf ft": "lbf*ft"},
    "inertia": {"kg*m**2": "kg*m**2", "kg m2": "kg*m**2", "kg*m2": "kg*m**2",
                "kgm2": "kg*m**2", "kg m^2": "kg*m**2", "kg*m^2": "kg*m**2",
                "kg m²": "kg*m**2", "kg·m²": "kg*m**2", "lb ft2": "lb*ft**2",
                "lb*ft**2": "lb*ft**2", "lb-ft2": "lb*ft**2"},
    "resistance": {"ohm": "ohm", "Ω": "ohm", "mohm": "mohm", "mΩ": "mohm"},
    "resistance_per_length": {"ohm/km": "ohm/km", "Ω/km": "ohm/km", "ohm/m": "ohm/m",
                              "mohm/m": "mohm/m", "ohm/kft": "ohm/kft",
                              "ohm/1000ft": "ohm/kft", "ohm/1000 ft": "ohm/kft"},
    "area": {"mm2": "mm**2", "mm²": "mm**2", "mm^2": "mm**2", "mm**2": "mm**2",
             "kcmil": "kcmil", "MCM": "kcmil", "kcm": "kcmil"},
    "time": {"h": "hour", "hour": "hour", "hours": "hour", "s": "s", "min": "min", "d": "day"},
    "energy_price": {"/kWh": "1/kWh", "per kWh": "1/kWh", "/MWh": "1/MWh", "/Wh": "1/Wh"},
    "dimensionless": {},
}

MAX_DIGITS = 40


_QUANTITY = re.compile(
    r"\s*(?P<number>[-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?)"
    r"(?:\s*/\s*(?P<denominator>\d+(?:\.\d+)?)(?![\d.]))?\s*(?P<unit>.*?)\s*$", re.S)
_UNIT_TEXT = re.compile(r"^[A-Za-z°℃µΩ/][A-Za-z0-9°℃µΩ⁻¹²·*/^. _-]*$")

_asked: dict[tuple[str, str], tuple[float, float] | str] = {}


_pint_registry: Any = None


def registry() -> Any:
    """The project's one pint UnitRegistry (built on first use; no cache on disk)."""
    global _pint_registry
    if _pint_registry is None:
        import pint

        _pint_registry = pint.UnitRegistry()
    return _pint_registry


def pint_scale(unit: str, kind: str) -> tuple[float, float] | str:
    """Scale and offset taking ``unit`` (a pint expression) to the internal unit of ``kind``.

    Returns an error text when pint does not know the unit or it has another dimension.
    """
    import pint

    ureg = registry()
    try:
        parsed = ureg.parse_units(unit)
    except Exception:  # pint's tokenizer raises assorted errors on garbage
        return f"unknown unit {shown(unit)}"
    target_text = KINDS[kind].pint_target
    angular = "radian" in str(ureg.get_root_units(parsed)[1])
    target = ureg.parse_units(target_text)
    if kind == "speed" and angular:
        target = ureg.parse_units("revolution/min")
    elif kind == "frequency" and angular:
        return f"{unit!r} is a shaft speed, not a frequency"
    if parsed.dimensionality != target.dimensionality:
        return f"{shown(unit)} is not a unit of {kind.replace('_', ' ')}"
    try:
        zero = ureg.Quantity(0.0, parsed).to(target).magnitude
        one = ureg.Quantity(1.0, parsed).to(target).magnitude
    except pint.errors.PintError:
        return f"{unit!r} cannot be converted to {KINDS[kind].internal or 'a ratio'}"
    return (float(one - zero), float(zero))


def _scale(unit: str, kind: str) -> tuple[float, float] | str:
    known = SCALES[kind].get(unit)
    if known is not None:
        return known
    if not unit and not KINDS[kind].internal:
        return (1.0, 0.0)  # a bare ratio
    key = (unit, kind)
    asked = _asked.get(key)
    if asked is None:
        if "%" in unit or not _UNIT_TEXT.match(unit):
            asked = f"{shown(unit)} is not a unit"
        else:
            asked = pint_scale(unit, kind)
        _asked[key] = asked
    return asked


def shown(value: object, limit: int = 60) -> str:
    """``repr(value)`` for a message, shortened to ``limit`` characters (never fails)."""
    if isinstance(value, int) and not isinstance(value, bool) and value.bit_length() > 200:
        return f"<an integer of {value.bit_length()} bits>"
    text = repr(value)
    if len(text) <= limit:
        return text
    return text[: limit - 3] + "..."


def _finite(number: float, text: object) -> float:
    if not math.isfinite(number):
        raise InputError(f"expected a finite number, got {shown(text)}")
    return number


def number_value(value: object) -> float:
    """A bare TOML/CSV number as a float: refuses bool, huge integers, inf, nan, underflow."""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise InputError(f"expected a number, got {type(value).__name__} {shown(value)}")
    if isinstance(value, int):
        if value.bit_length() > 1000:
            raise InputError(f"the integer with {value.bit_length()} bits is too large "
                             "to be a quantity")
        return _finite(float(value), value)
    return _finite(value, value)


def split(text: str, *, decimal_comma: bool = False) -> tuple[float, str, str]:
    """Split a quantity text into (number, unit text, number text) by the grammar above.

    Raises
    ------
    InputError
        For text that does not start with a number, a decimal comma not declared, too many
        digits, or a number that is not finite or underflows.
    """
    match = _QUANTITY.match(text)
    if match is None:
        raise InputError("expected a number")
    number_text = match.group("number")
    if len(number_text) > MAX_DIGITS:
        raise InputError(f"a number of {len(number_text)} characters is too long "
                         f"(at most {MAX_DIGITS})")
    if "," in number_text:
        if not decimal_comma:
            raise InputError(f"{shown(number_text)} has a comma: write a decimal point "
                             f"({number_text.replace(',', '.')}), or declare decimal commas")
        number_text = number_text.replace(",", ".")
    number = float(number_text)
    denominator = match.group("denominator")
    if denominator is not None:
        divisor = float(denominator)
        if divisor == 0.0:
            raise InputError("a fraction with denominator 0")
        number /= divisor
    if number == 0.0 and re.search(r"[1-9]", number_text.split("e")[0].split("E")[0]):
        raise InputError(f"{shown(text)} underflows to 0")
    return _finite(number, text), match.group("unit"), number_text


def parse(value: object, kind: str, *, decimal_comma: bool = False) -> float:
    """Parse a quantity (string with unit, or bare number) to an internal-unit float.

    Parameters
    ----------
    value : str, int or float
        "75 kW", "60Hz", "45 °C", "1/2 hp", or a bare number in the default unit of ``kind``.
    kind : str
        One of :data:`KINDS`.
    decimal_comma : bool
        Whether a comma in the number is a decimal comma (declared by the caller).

    Returns
    -------
    float
        The value in the internal unit of ``kind`` (W, VA, V, A, Hz, rpm, m, degC, ratio, N*m,
        kg*m**2, ohm, ohm/m, mm**2, s, per kWh).

    Raises
    ------
    InputError
        For text that is not a number with a unit of this kind, a bare number where the unit
        is ambiguous, or a number refused by :func:`split`.
    """
    spec = KINDS[kind]
    if isinstance(value, bool) or not isinstance(value, (int, float, str)):
        raise InputError(f"expected {spec.example}, got {type(value).__name__} {shown(value)}")
    if not isinstance(value, str):
        number = number_value(value)
        unit = ""
        given: object = value
    else:
        try:
            number, unit, _ = split(value, decimal_comma=decimal_comma)
        except InputError as exc:
            raise InputError(f"{exc.message}: expected {spec.example}, got {shown(value)}") from None
        given = value
    if not unit:
        if spec.default is None:
            raise InputError(f"{shown(given)} has no unit, and a bare number is ambiguous here: "
                             f"expected {spec.example}")
        unit = spec.default
    conversion = _scale(unit, kind)
    if isinstance(conversion, str):
        raise InputError(f"{conversion}: expected {spec.example}, got {shown(given)}")
    scale, offset = conversion
    return _finite(number * scale + offset, given)


def parse_share_or(value: object, kind: str) -> tuple[float, bool]:
    """A value given either as a share ("220 %", of a rated value) or as a quantity of ``kind``.

    Returns (value, is_share): a share as a fraction (2.2), or the quantity in internal units.
    """
    if isinstance(value, str) and value.strip().endswith(("%", "percent")):
        return parse(value, "percent"), True
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        raise InputError(f"{shown(value)} has no unit: write a share of the rated value such as "
                         f"'220 %', or {KINDS[kind].example}")
    return parse(value, kind), False


def generate_table() -> str:
    """Python source of :mod:`machinecheck.inputs.unit_table`, every scale asked of pint."""
    import pint

    lines = ['"""Unit scales: (scale, offset) to the internal unit of each kind.',
             "",
             "Generated from pint by `python -m machinecheck.inputs.units --write-table`; do not",
             f"edit. pint {pint.__version__}. Checked against pint by tests/inputs/test_units.py.",
             '"""', "",
             "SCALES: dict[str, dict[str, tuple[float, float]]] = {"]
    for kind, spellings in SPELLINGS.items():
        lines.append(f"    {kind!r}: {{")
        for spelling, expression in spellings.items():
            result = pint_scale(expression, kind)
            if isinstance(result, str):
                raise ValueError(f"{kind} {spelling}: {result}")
            lines.append(f"        {spelling!r}: ({result[0]!r}, {result[1]!r}),")
        lines.append("    },")
    lines.append("}")
    return "\n".join(lines) + "\n"


def main(argv: list[str]) -> int:
    """``--write-table`` rewrites unit_table.py from pint; ``--print-table`` prints it."""
    import os

    text = generate_table()
    if argv == ["--write-table"]:
        path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "unit_table.py")
        with open(path, "w", encoding="utf-8") as handle:
            handle.write(text)
        return 0
    if argv == ["--print-table"]:
        sys.stdout.write(text)
        return 0
    sys.stderr.write("usage: python -m machinecheck.inputs.units --write-table|--print-table\n")
    return 2


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
