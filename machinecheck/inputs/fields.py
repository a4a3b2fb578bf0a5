"""THE field table: every input quantity of a catalog or sites file, described once.

One :class:`Field` a key: its section, dimension (unit kind), allowed range, whether it is
required, its default, help text, CSV column and command-line option. Validation
(:mod:`.validate`), the JSON Schema (:mod:`.schema`), the CSV columns (:mod:`.csv_`), the inline
options of the command line (:func:`cli_options`) and ``docs/format.md`` all derive from it, so a
new field is one line here plus its use.

Ranges are limits of plausibility, wide enough for any real machine or supply: a value outside
them is a typing error (a unit slip, a decimal comma read as a thousands separator), not a
machine. Values are compared in the internal unit of their kind (W, V, A, Hz, rpm, m, degC,
fraction, N m, kg m2, ohm, ohm/m, mm2, s, per kWh).

``docs/format.md`` is generated: ``python -m machinecheck.inputs.fields --format-doc >
docs/format.md`` (a test checks the committed file is current).
"""

from __future__ import annotations

import sys
from dataclasses import dataclass
from typing import Any

from ..model import (
    FEEDER_MATERIALS,
    SOURCE_KINDS,
    STANDARDS,
    START_METHODS,
    SYSTEMS,
    TRIP_CLASSES,
)
from ..model import KINDS as MACHINE_KINDS
from ..physics.efficiency import CLASSES as EFFICIENCY_CLASSES
from ..physics.loads import LOAD_TYPES
from ..physics.starting import CODE_LETTERS

DESIGN_LETTERS = ("A", "B", "C", "D", "N", "H")
INSULATION_CLASSES = ("A", "E", "B", "F", "H", "N", "R")

#: Value kinds that are not quantities. Every other kind is a unit kind of :mod:`.units`.
TEXT, CHOICE, INTEGER, NUMBER, TABLE, TABLES = "text", "choice", "integer", "number", "table", \
    "tables"
#: A share of a rated value ("220 %") or a quantity of the named kind ("torque").
SHARE_OR_TORQUE = "share-or-torque"
#: A conductor size: mm2 or kcmil (area), or an AWG gauge ("2 AWG", "4/0 AWG").
CONDUCTOR_SIZE = "conductor-size"

SECTIONS = ("machine", "rating", "load", "circuit", "start", "feeder", "use",
            "site", "source", "limits", "tariff")
#: Where each section sits in a file.
SECTION_PATHS = {"machine": "[[machine]]", "rating": "[[machine.rating]]",
                 "load": "[machine.load]", "circuit": "[machine.circuit]",
                 "start": "[machine.start]", "feeder": "[machine.feeder]",
                 "use": "[machine.use]", "site": "[[site]]", "source": "[site.source]",
                 "limits": "[site.limits]", "tariff": "[site.tariff]"}
#: Prefix of CSV columns and command-line options for a section (None: no CSV column).
_COLUMN_PREFIX: dict[str, str | None] = {
    "machine": "", "rating": "", "load": "load_", "circuit": "circuit_", "start": "start_",
    "feeder": "feeder_", "use": "use_", "site": None, "source": None, "limits": None,
    "tariff": None}
_OPTION_PREFIX = {"machine": "", "rating": "", "load": "load-", "circuit": "circuit-",
                  "start": "start-", "feeder": "feeder-", "use": "use-", "site": "supply-",
                  "source": "source-", "limits": "limit-", "tariff": "tariff-"}


@dataclass(frozen=True)
class Field:
    """One input key.

    Attributes
    ----------
    section : one of :data:`SECTIONS`
    key : the file key, as in docs/format.md
    kind : a unit kind of :mod:`.units`, or TEXT, CHOICE, INTEGER, NUMBER, TABLE, TABLES,
        SHARE_OR_TORQUE, CONDUCTOR_SIZE
    help : one line for docs, schema and ``--help``
    unit : the unit shown in the docs (the unit of ``low``/``high`` as written there)
    low, high : plausible range in the internal unit (inclusive unless ``low_open``)
    low_open : the low end itself is refused (a value must be above it)
    share_low, share_high : plausible range of a share (SHARE_OR_TORQUE), as a fraction
    required : the key must be given
    default : the value used when absent (shown in the docs), or None
    choices : allowed words or numbers (CHOICE, INTEGER)
    many : one value per connection: a list is accepted
    pattern : regular expression a TEXT value must match in full
    column : CSV column, or None when the key has none
    option : command-line option (without ``--``), or None when the key has none
    """

    section: str
    key: str
    kind: str
    help: str
    unit: str = ""
    low: float | None = None
    high: float | None = None
    low_open: bool = False
    share_low: float | None = None
    share_high: float | None = None
    required: bool = False
    default: object = None
    choices: tuple[object, ...] = ()
    many: bool = False
    pattern: str | None = None
    column: str | None = None
    option: str | None = None

    @property
    def path(self) -> str:
        """Where the key sits, e.g. ``[[machine.rating]] power``."""
        return f"{SECTION_PATHS[self.section]} {self.key}"


def _f(section: str, key: str, kind: str, help: str, *, column: bool = True,
       option: bool | str = True, **more: Any) -> Field:
    prefix = _COLUMN_PREFIX[section]
    column_name = None if prefix is None or not column or kind in (TABLE, TABLES) \
        else prefix + key
    if isinstance(option, str):
        option_name: str | None = option
    elif option and kind not in (TABLE, TABLES):
        option_name = _OPTION_PREFIX[section] + key.replace("_", "-")
    else:
        option_name = None
    return Field(section, key, kind, help, column=column_name, option=option_name, **more)


_SPEED: dict[str, Any] = {"unit": "rpm", "low": 1.0, "high": 100_000.0}
_POWER: dict[str, Any] = {"unit": "W", "low": 1.0, "high": 2.0e9}
_CURRENT: dict[str, Any] = {"unit": "A", "low": 0.001, "high": 100_000.0}
_VOLTAGE: dict[str, Any] = {"unit": "V", "low": 1.0, "high": 50_000.0}
_FREQUENCY: dict[str, Any] = {"unit": "Hz", "low": 1.0, "high": 1000.0}
_TORQUE: dict[str, Any] = {"low": 0.001, "high": 1.0e8}
_OHM: dict[str, Any] = {"unit": "ohm", "low": 0.0, "high": 1.0e5, "low_open": True}

FIELDS: tuple[Field, ...] = (
    # ---------------------------------------------------------------- [[machine]]
    _f("machine", "id", TEXT, "tag of the machine, unique in the catalog", required=True,
       option=False, pattern=r"[^\x00-\x1f\x7f]{1,200}"),
    _f("machine", "description", TEXT, "free text", default="", option=False),
    _f("machine", "kind", CHOICE, "machine type", default="induction-motor",
       choices=MACHINE_KINDS),
    _f("machine", "phases", INTEGER, "phases of the winding (2: two-phase, NEC 430.249)",
       default=3, choices=(1, 2, 3)),
    _f("machine", "poles", INTEGER, "number of poles (not pairs); inferred from the rated "
       "speed when absent", low=2, high=200),
    _f("machine", "service_factor", NUMBER, "NEMA service factor (used only at rated voltage "
       "and frequency, MG 1 14.37); CSV: the rating column", default=1.0, low=1.0, high=2.0,
       column=False),
    _f("machine", "insulation_class", CHOICE, "insulation class, for the record",
       choices=INSULATION_CLASSES, option=False),
    _f("machine", "efficiency_class", CHOICE, "marked IEC 60034-30-1 class",
       choices=EFFICIENCY_CLASSES),
    _f("machine", "max_speed", "speed", "mechanical speed limit of the machine", **_SPEED),
    _f("machine", "code_letter", CHOICE, "NEMA locked-rotor kVA/hp code letter (MG 1 "
       "10.37.2)", choices=tuple(CODE_LETTERS)),
    _f("machine", "design_letter", CHOICE, "NEMA design or IEC N/H", choices=DESIGN_LETTERS),
    _f("machine", "cooling", TEXT, "IEC 60034-6 cooling code; a shaft fan (IC411 and kin) "
       "cools less at a lower speed", default="IC411", pattern=r"IC[0-9A-Z]{2,8}"),
    _f("machine", "duty", TEXT, "IEC 60034-1 duty type S1 to S10", default="S1",
       pattern=r"S(10|[1-9])\b.{0,40}", option=False),
    _f("machine", "rated_ambient", "temperature", "rated coolant temperature when the plate "
       "states another", unit="degC", default=40.0, low=-60.0, high=80.0, option=False),
    _f("machine", "rated_altitude", "length", "rated altitude when the plate states another",
       unit="m", default=1000.0, low=0.0, high=6000.0, option=False),
    _f("machine", "prime_mover_speed", "speed", "generators: engine or turbine rated speed",
       option=False, **_SPEED),
    _f("machine", "rating", TABLES, "the rating sets, one per frequency or speed",
       required=True),
    _f("machine", "load", TABLE, "the driven equipment"),
    _f("machine", "circuit", TABLE, "equivalent-circuit parameters, ohm per phase"),
    _f("machine", "start", TABLE, "how the machine is started (default direct-on-line)"),
    _f("machine", "feeder", TABLE, "cable from the site bus to the machine"),
    _f("machine", "use", TABLE, "running hours and load, for energy figures"),
    # ---------------------------------------------------------------- [[machine.rating]]
    _f("rating", "frequency", "frequency", "rated frequency of this set", required=True,
       **_FREQUENCY),
    _f("rating", "voltage", "voltage", "rated voltage: one per connection, or a range "
       "'380-415 V'", required=True, many=True, **_VOLTAGE),
    _f("rating", "connection", TEXT, "connection names per voltage: delta/star, low/high, "
       "parallel/series", many=True, pattern=r".{1,40}"),
    _f("rating", "current", "current", "rated current, one per connection", many=True,
       **_CURRENT),
    _f("rating", "power", "power", "rated output with its unit (kW or hp); generators kVA or "
       "kW", required=True, **_POWER),
    _f("rating", "speed", "speed", "rated full-load speed (required for induction motors "
       "unless poles is given)", **_SPEED),
    _f("rating", "power_factor", "fraction", "rated power factor (generators: 0.8 when "
       "absent)", low=0.1, high=1.0),
    _f("rating", "efficiency", "fraction", "rated efficiency", low=0.1, high=0.995),
    _f("rating", "service_factor", NUMBER, "service factor when it differs per set",
       low=1.0, high=2.0, option=False),
    _f("rating", "locked_rotor_current", "current", "locked-rotor current, one per "
       "connection", many=True, **_CURRENT),
    _f("rating", "starting_current_ratio", NUMBER, "locked-rotor current ratio Ia/In",
       low=1.0, high=20.0),
    _f("rating", "locked_rotor_torque", SHARE_OR_TORQUE, "locked-rotor torque: % of rated "
       "torque, or N m", unit="N m", share_low=0.1, share_high=6.0, **_TORQUE),
    _f("rating", "breakdown_torque", SHARE_OR_TORQUE, "breakdown torque: % of rated torque, "
       "or N m", unit="N m", share_low=1.0, share_high=6.0, **_TORQUE),
    _f("rating", "inertia", "inertia", "rotor inertia", unit="kg m2", low=0.0, high=1.0e6,
       low_open=True),
    # ---------------------------------------------------------------- [machine.load]
    _f("load", "type", CHOICE, "how torque follows speed", required=True, choices=LOAD_TYPES),
    _f("load", "power", "power", "power drawn at the rated speed of the rating set used",
       **_POWER),
    _f("load", "torque", "torque", "torque at the rated speed (instead of power)",
       unit="N m", **_TORQUE),
    _f("load", "max_speed", "speed", "speed limit of the driven equipment", **_SPEED),
    _f("load", "breakaway_torque", SHARE_OR_TORQUE, "torque to start the load turning: % of "
       "the motor's rated torque, or N m", unit="N m", share_low=0.0, share_high=3.0,
       **_TORQUE),
    _f("load", "inertia", "inertia", "load inertia referred to the motor shaft",
       unit="kg m2", low=0.0, high=1.0e7, low_open=True),
    # ---------------------------------------------------------------- [machine.circuit]
    _f("circuit", "r1", "resistance", "stator resistance per phase", **_OHM),
    _f("circuit", "r2", "resistance", "rotor resistance per phase, referred to the stator",
       **_OHM),
    _f("circuit", "x1", "resistance", "stator leakage reactance per phase", **_OHM),
    _f("circuit", "x2", "resistance", "rotor leakage reactance per phase, referred to the "
       "stator", **_OHM),
    _f("circuit", "xm", "resistance", "magnetising reactance per phase", **_OHM),
    # ---------------------------------------------------------------- [machine.start]
    _f("start", "method", CHOICE, "starting method", default="direct-on-line",
       choices=START_METHODS),
    _f("start", "tap", "percent", "autotransformer tap, % of line voltage", unit="%",
       low=0.2, high=0.95),
    _f("start", "current_limit", "percent", "soft-starter current limit, % of full-load "
       "current", unit="%", low=1.0, high=10.0),
    _f("start", "trip_class", CHOICE, "overload relay trip class (IEC 60947-4-1)",
       choices=TRIP_CLASSES),
    # ---------------------------------------------------------------- [machine.feeder]
    _f("feeder", "length", "length", "cable length from the site bus to the machine",
       unit="m", low=0.1, high=100_000.0, required=True),
    _f("feeder", "size", CONDUCTOR_SIZE, "conductor size: mm2, kcmil or AWG", unit="mm2",
       low=0.2, high=2000.0),
    _f("feeder", "material", CHOICE, "conductor material", default="copper",
       choices=FEEDER_MATERIALS),
    _f("feeder", "parallel", INTEGER, "conductors in parallel per phase", default=1,
       low=1, high=20),
    _f("feeder", "resistance", "resistance_per_length", "AC resistance per length at "
       "operating temperature (overrides the built-in table)", unit="ohm/m", low=1e-6,
       high=0.1),
    _f("feeder", "reactance", "resistance_per_length", "reactance per length",
       unit="ohm/m", low=1e-6, high=0.01),
    # ---------------------------------------------------------------- [machine.use]
    _f("use", "hours", "time", "running time per year", unit="s", low=0.0,
       high=8784 * 3600.0),
    _f("use", "load_factor", "fraction", "average load, share of the rated output",
       low=0.01, high=1.5),
    _f("use", "replacement_price", NUMBER, "price of a replacement, in the site tariff's "
       "currency", low=0.0, high=1e9),
    # ---------------------------------------------------------------- [[site]]
    _f("site", "id", TEXT, "site tag, unique in the file", required=True, option=False,
       pattern=r"[^\x00-\x1f\x7f]{1,200}"),
    _f("site", "name", TEXT, "site name", default="", option=False),
    _f("site", "frequency", "frequency", "nominal supply frequency", required=True,
       **_FREQUENCY),
    _f("site", "frequency_variation", "percent", "stated frequency variation (island grids, "
       "generator sets), e.g. '4 %'", unit="%", low=0.0, high=0.2),
    _f("site", "voltage", "voltage", "nominal supply voltage, line-to-line ('230/400 V' marks "
       "line-to-neutral/line-to-line of a four-wire system)", required=True, **_VOLTAGE),
    _f("site", "phases", INTEGER, "supply phases", default=3, choices=(1, 2, 3)),
    _f("site", "system", CHOICE, "supply system; wye offers line-to-neutral to single-phase "
       "machines", choices=SYSTEMS),
    _f("site", "wires", INTEGER, "conductors of a three-phase supply, 3 or 4 (with neutral); "
       "required where the voltage alone is ambiguous", choices=(3, 4)),
    _f("site", "standard", CHOICE, "tolerance rules (default NEMA at 60 Hz, IEC otherwise)",
       choices=STANDARDS, option="standard"),
    _f("site", "region", TEXT, "selects an efficiency regulation pack", pattern=r"[A-Za-z]"
       r"[A-Za-z0-9-]{1,15}"),
    _f("site", "voltage_range", "voltage", "measured or declared band, two voltages or "
       "'380-420 V'; the worst end is judged", **_VOLTAGE),
    _f("site", "unbalance", "percent", "voltage unbalance", unit="%", low=0.0, high=0.5),
    _f("site", "line_voltages", "voltage", "three line voltages; unbalance by the NEMA "
       "definition", many=True, option=False, **_VOLTAGE),
    _f("site", "altitude", "length", "site altitude", unit="m", default=0.0, low=-500.0,
       high=6000.0, option="altitude"),
    _f("site", "ambient", "temperature", "coolant (ambient air) temperature", unit="degC",
       default=40.0, low=-60.0, high=80.0, option="ambient"),
    _f("site", "min_efficiency_class", CHOICE, "site rule for three-phase induction motors",
       choices=EFFICIENCY_CLASSES, option="min-efficiency-class"),
    _f("site", "source", TABLE, "the supply source (absent: a stiff supply)"),
    _f("site", "limits", TABLE, "voltage-drop limits (absent: common-practice defaults)"),
    _f("site", "tariff", TABLE, "energy price, for energy cost"),
    # ---------------------------------------------------------------- [site.source]
    _f("source", "kind", CHOICE, "supply source", required=True, choices=SOURCE_KINDS),
    _f("source", "rating", "apparent_power", "transformer or generator rating", unit="VA",
       low=1e3, high=1e10),
    _f("source", "impedance", "percent", "transformer impedance", unit="%", low=0.005,
       high=0.5),
    _f("source", "x_over_r", NUMBER, "X/R ratio of the source", low=0.1, high=100.0),
    _f("source", "short_circuit_power", "apparent_power", "utility short-circuit power, or "
       "upstream of the transformer", unit="VA", low=1e5, high=1e12),
    _f("source", "fault_current", "current", "utility prospective fault current (instead of "
       "short_circuit_power)", unit="A", low=10.0, high=1e6),
    _f("source", "subtransient_reactance", "percent", "generator subtransient reactance "
       "X''d", unit="%", low=0.02, high=0.6),
    _f("source", "transient_reactance", "percent", "generator transient reactance X'd",
       unit="%", low=0.05, high=1.0),
    _f("source", "prime_mover_power", "power", "generator prime mover rating", **_POWER),
    # ---------------------------------------------------------------- [site.limits]
    _f("limits", "running_voltage_drop", "percent", "largest voltage drop while running",
       unit="%", low=0.001, high=0.3),
    _f("limits", "starting_dip", "percent", "largest voltage dip while starting", unit="%",
       low=0.001, high=0.6),
    # ---------------------------------------------------------------- [site.tariff]
    _f("tariff", "energy", "energy_price", "energy price per kWh, e.g. '0.12 /kWh'",
       unit="/kWh", low=0.0, high=100.0, low_open=True),
    _f("tariff", "currency", TEXT, "currency code, e.g. EUR", pattern=r"[A-Z]{3}"),
)

_BY_KEY = {(f.section, f.key): f for f in FIELDS}


def field(section: str, key: str) -> Field:
    """The field of ``key`` in ``section``; KeyError when there is none."""
    return _BY_KEY[(section, key)]


def fields_of(section: str) -> tuple[Field, ...]:
    """The fields of one section, in table order."""
    return tuple(f for f in FIELDS if f.section == section)


def keys_of(section: str) -> tuple[str, ...]:
    """The keys allowed in one section, in table order."""
    return tuple(f.key for f in FIELDS if f.section == section)


def csv_columns() -> tuple[Field, ...]:
    """Fields with a CSV column, in table order (machine, rating, then the sub-tables)."""
    return tuple(f for f in FIELDS if f.column is not None)


@dataclass(frozen=True)
class CliOption:
    """An inline command-line option built from a field (for click or any parser).

    ``name`` is the option as typed (``--load-power``); ``dest`` the Python name
    (``load_power``); ``multiple`` says it may be repeated (one value per connection);
    ``choices`` are the allowed words, or empty; the value is passed as text and validated
    through the field table like a file value.
    """

    name: str
    dest: str
    section: str
    key: str
    help: str
    multiple: bool
    choices: tuple[str, ...]
    required: bool


def cli_options(*sections: str) -> tuple[CliOption, ...]:
    """The inline options of the given sections (all with an option when none are named)."""
    wanted = sections or SECTIONS
    out = []
    for f in FIELDS:
        if f.option is None or f.section not in wanted:
            continue
        out.append(CliOption(name="--" + f.option, dest=f.option.replace("-", "_"),
                             section=f.section, key=f.key, help=_help_line(f),
                             multiple=f.many, choices=tuple(str(c) for c in f.choices),
                             required=f.required))
    return tuple(out)


def option_table(*sections: str) -> dict[str, tuple[str, str]]:
    """{option dest: (section, key)}: where a command-line value goes, and which option an
    error about a key names."""
    return {o.dest: (o.section, o.key) for o in cli_options(*sections)}


# ----------------------------------------------------------------------------- documentation

def _range_text(f: Field) -> str:
    if f.kind in (CHOICE,) or (f.kind == INTEGER and f.choices):
        return ", ".join(f"`{c}`" for c in f.choices)
    if f.kind in (TEXT, TABLE, TABLES):
        return {TABLE: "table", TABLES: "array of tables"}.get(f.kind, "text")
    parts = []
    if f.kind == SHARE_OR_TORQUE:
        parts.append(f"{_num(100 * (f.share_low or 0))}-{_num(100 * (f.share_high or 0))} %, "
                     f"or N m")
    elif f.low is not None and f.high is not None:
        low, high, unit = _shown_range(f)
        above = "above " if f.low_open else ""
        parts.append(f"{above}{low} to {high} {unit}".strip())
    return "; ".join(parts)


def _shown_range(f: Field) -> tuple[str, str, str]:
    assert f.low is not None and f.high is not None
    if f.unit == "%" or f.kind == "fraction":
        return _num(100 * f.low), _num(100 * f.high), "%"
    if f.kind == "time":
        return _num(f.low / 3600), _num(f.high / 3600), "h"
    if f.kind == "resistance_per_length":
        return _num(f.low * 1000), _num(f.high * 1000), "ohm/km"
    return _num(f.low), _num(f.high), f.unit


def _num(value: float) -> str:
    return f"{value:g}"


def _default_text(f: Field) -> str:
    if f.required:
        return "required"
    if f.default is None:
        return "none"
    if f.default == "":
        return '""'
    return f"`{f.default}`" if isinstance(f.default, str) else _num(float(f.default))  # type: ignore[arg-type]


def _help_line(f: Field) -> str:
    rng = _range_text(f)
    return f"{f.help} [{rng}]" if rng and f.kind not in (TEXT,) else f.help


_INTRO = """\
# Catalog, sites and inventory formats

<!-- Generated from machinecheck/inputs/fields.py by
     `python -m machinecheck.inputs.fields --format-doc > docs/format.md`; do not edit. -->

Catalogs and sites files are TOML; catalogs may also be CSV or Excel (.xlsx) inventories.

## Quantities

A quantity is a string with its unit (`"75 kW"`, `"100 hp"`, `"460 V"`, `"45 degC"`, `"93 %"`)
or a bare number in the default unit of its dimension. One grammar serves files and
command-line options:

- a number (`1460`, `0.86`, `2e3`), or a fraction (`"1/2 hp"`); a decimal comma (`"0,75 kW"`)
  only where decimal commas are declared or detected (semicolon-separated CSV);
- then the unit, as nameplates spell it: W, kW, MW, hp, CV/PS (metric horsepower); VA, kVA,
  MVA; V, kV; A, kA; Hz; rpm, r/min, min⁻¹; m, km, ft; degC, °C, degF, °F, K; %; N m, lb-ft;
  kg m2; ohm; ohm/km; mm2, kcmil; h.
- A bare number is read in the default unit: V, A, Hz, rpm, m, degC, N m, kg m2, ohm, and as a
  fraction for efficiencies and power factors (`0.86`). **Power has no default unit**: a bare
  number could be kW or hp, so `power = 50` is an error; write `"50 hp"` or `"37 kW"`.
- Refused: `inf`, `nan`, numbers over 40 characters, values that underflow (`1e-310`), unit
  text that is not a unit (`"93 %%"`), and any value outside the plausible range of its field
  (below). Ranges are limits of plausibility: a value outside is a typing error, not a machine.

Every error names the file, the line (TOML) or row (CSV), the machine or site id and the key.
Inputs larger than 64 MiB are refused.

"""

_PLATE = """\
## Consistency of a nameplate

Besides each value's range, a rating set must agree with itself (a decimal comma read as a
thousands separator, `1.460` rpm for 1460 rpm, shows here):

- speed, poles and frequency: the rated speed must sit below the synchronous speed of the
  poles at the rated frequency, with a slip of at most 10 % (induction motors), or at it
  (synchronous machines);
- current, power and voltage: the efficiency × power factor implied by the rated current must
  lie between 0.15 and 1.0, and within 25 % of the stated efficiency × power factor;
- locked-rotor current: between 1 and 20 times the rated current.

The error says which values disagree and by how much. Several ratings at one frequency with
different speeds make a multispeed plate (one rating set per speed); their pole counts may
differ.

## Supply voltage

`voltage` of a site is line-to-line. Where the number alone is ambiguous, say which: a
three-phase site of 120, 127, 220, 230, 240, 277 or 347 V (the line-to-neutral voltages of
IEC 60038 and North American four-wire systems) with neither `wires` nor `system = "delta"` is
an error. Write `wires = 3` for a three-wire system of that line-to-line voltage, or give the
four-wire system as `voltage = "230/400 V"` (line-to-neutral/line-to-line; read as 400 V,
`wires = 4`).

"""

_CSV = """\
## Spreadsheet inventories (CSV, Excel)

`machinecheck check inventory.csv` and `machinecheck validate inventory.csv` read a CSV file
(or an `.xlsx` workbook, first sheet, with `pip install machinecheck[xlsx]`) of nameplates:

- encodings: UTF-8 with or without byte-order mark, UTF-16 with byte-order mark, and
  Windows-1252 (cp1252); the encoding is detected, and named when the text cannot be read;
- cells are separated by commas, or by semicolons or tabs when the header line has more of
  those; a semicolon file, as spreadsheets set to a decimal comma write it, reads decimal
  commas in figures (`0,86`, `28,4 A`);
- one rating set per row; rows with the same `id` form one machine with several rating sets
  (a dual-frequency or multispeed plate), in row order;
- columns are named like the keys (the column of each key is listed above); any subset, in
  any order, `id` required; empty header cells at the end of the header are ignored;
- a machine's own fields go on its first row; later rows may leave them blank or repeat them,
  but may not differ;
- several values in one cell, one per connection, are separated by `;` (`400 V; 690 V`), or
  by `|` in a semicolon-separated file (`400 V|690 V`);
- blank rows are skipped; at most 50 problems are listed, followed by the count of the rest.

A file whose name ends neither in `.toml`, `.csv` nor `.xlsx` (`.txt`, for example) is read by
its content, and the reader chosen is named in messages (`read as CSV`). `machinecheck convert
inventory.csv --to toml` writes the same catalog as TOML (validated first), and `machinecheck
convert fleet.toml --to csv` goes the other way. `catalogs/inventory.csv` is an example.

## JSON Schema

`machinecheck schema catalog` and `machinecheck schema sites` print a JSON Schema (draft
2020-12) of each format, for editors that validate TOML against a schema. It is generated from
the same field table: keys, types, allowed words and the shape of quantity strings; the
consistency checks stay with `machinecheck validate`.
"""


def format_doc() -> str:
    """docs/format.md, generated from the field table."""
    out = [_INTRO]
    current = None
    for f in FIELDS:
        if f.section != current:
            current = f.section
            out.append(f"\n## `{SECTION_PATHS[f.section]}`\n\n"
                       if f.section in ("machine", "site") else
                       f"\n### `{SECTION_PATHS[f.section]}`\n\n")
            out.append("| key | unit / values | default | CSV column | option | meaning |\n")
            out.append("|---|---|---|---|---|---|\n")
        column = f"`{f.column}`" if f.column else ""
        option = f"`--{f.option}`" if f.option else ""
        many = "; one per connection" if f.many else ""
        out.append(f"| `{f.key}` | {_range_text(f)}{many} | {_default_text(f)} | {column} | "
                   f"{option} | {f.help} |\n")
    out.append("\n")
    out.append(_PLATE)
    out.append(_CSV)
    return "".join(out)


def main(argv: list[str]) -> int:
    """``--format-doc`` prints docs/format.md."""
    if argv == ["--format-doc"]:
        sys.stdout.write(format_doc())
        return 0
    sys.stderr.write("usage: python -m machinecheck.inputs.fields --format-doc\n")
    return 2


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
