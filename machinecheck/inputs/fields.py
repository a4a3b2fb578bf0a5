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

``docs/format.md`` is generated from this table: ``python -m machinecheck.inputs.formatdoc >
docs/format.md`` (a test checks the committed file is current).
"""

from __future__ import annotations

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


def range_text(f: Field) -> str:
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


def default_text(f: Field) -> str:
    if f.required:
        return "required"
    if f.default is None:
        return "none"
    if f.default == "":
        return '""'
    return f"`{f.default}`" if isinstance(f.default, str) else _num(float(f.default))  # type: ignore[arg-type]


def _help_line(f: Field) -> str:
    rng = range_text(f)
    return f"{f.help} [{rng}]" if rng and f.kind not in (TEXT,) else f.help
