"""The machinecheck data model: frozen dataclasses holding SI floats only.

Units by suffix: _w watts, _va volt-amperes, _v volts, _a amperes, _hz hertz, _rpm revolutions
per minute, _m metres, _degc degrees Celsius, _nm newton-metres, _s seconds, _ohm ohms,
_kgm2 kilogram square metres, _mm2 square millimetres, _ohm_per_m ohms per metre; ratios and
shares of a rated value (_pu) are plain fractions.
"""

from __future__ import annotations

from dataclasses import dataclass, field

KINDS = ("induction-motor", "synchronous-motor", "synchronous-generator")
STANDARDS = ("IEC", "NEMA")
SYSTEMS = ("wye", "delta", "split-phase", "quadrature")
START_METHODS = ("direct-on-line", "star-delta", "autotransformer", "soft-starter", "drive")
TRIP_CLASSES = ("5", "10A", "10", "20", "30")
FEEDER_MATERIALS = ("copper", "aluminium")
SOURCE_KINDS = ("utility", "transformer", "generator")


@dataclass(frozen=True, slots=True)
class Connection:
    """One way of connecting a winding: its voltage (or stamped range) and current."""

    name: str | None
    voltage_min_v: float
    voltage_max_v: float
    current_a: float | None = None

    @property
    def voltage_v(self) -> float:
        """Nominal voltage: the stamped value, or the middle of a stamped range."""
        return (self.voltage_min_v + self.voltage_max_v) / 2.0

    @property
    def is_range(self) -> bool:
        return self.voltage_max_v > self.voltage_min_v

    def reference_voltage(self, wanted_v: float) -> float:
        """The rated voltage of this connection closest to ``wanted_v`` (clamped into a range)."""
        return min(max(wanted_v, self.voltage_min_v), self.voltage_max_v)


@dataclass(frozen=True, slots=True)
class Rating:
    """One nameplate rating set: a frequency with its connections and outputs."""

    frequency_hz: float
    connections: tuple[Connection, ...]
    power_w: float | None = None            # shaft output (motors); real output (generators)
    apparent_power_va: float | None = None  # generators
    speed_rpm: float | None = None
    power_factor: float | None = None
    efficiency: float | None = None
    service_factor: float | None = None
    locked_rotor_current_a: tuple[float, ...] | None = None  # one per connection, or one
    starting_current_ratio: float | None = None
    line: int | None = None
    # datasheet torques: a share of rated torque (_pu) or a torque (_nm), at most one of each
    locked_rotor_torque_pu: float | None = None
    locked_rotor_torque_nm: float | None = None
    breakdown_torque_pu: float | None = None
    breakdown_torque_nm: float | None = None
    inertia_kgm2: float | None = None
    #: poles of this rating set (a multispeed plate has one set per speed); None if unknown
    poles: int | None = None


@dataclass(frozen=True, slots=True)
class Load:
    """The driven equipment. ``power_w`` or ``torque_nm`` is drawn at the rated speed."""

    type: str
    power_w: float | None = None
    torque_nm: float | None = None
    max_speed_rpm: float | None = None
    breakaway_torque_pu: float | None = None  # share of the motor's rated torque
    breakaway_torque_nm: float | None = None
    inertia_kgm2: float | None = None         # referred to the motor shaft


@dataclass(frozen=True, slots=True)
class Circuit:
    """Equivalent-circuit parameters from a datasheet, ohm per phase (referred to the stator)."""

    r1_ohm: float | None = None
    r2_ohm: float | None = None
    x1_ohm: float | None = None
    x2_ohm: float | None = None
    xm_ohm: float | None = None


@dataclass(frozen=True, slots=True)
class Start:
    """How the machine is started."""

    method: str = "direct-on-line"
    tap: float | None = None            # autotransformer tap, fraction of line voltage
    current_limit: float | None = None  # soft starter, multiple of full-load current
    trip_class: str | None = None       # overload relay class, IEC 60947-4-1


@dataclass(frozen=True, slots=True)
class Feeder:
    """The cable from the site bus to the machine. Size in mm2, or an AWG gauge as marked."""

    length_m: float
    size_mm2: float | None = None
    size_awg: str | None = None          # "2", "1/0" ... (converted by the cable table)
    size_marked: str | None = None       # the size as written ("250 kcmil", "2 AWG", "35 mm2")
    material: str = "copper"
    parallel: int = 1
    resistance_ohm_per_m: float | None = None
    reactance_ohm_per_m: float | None = None


@dataclass(frozen=True, slots=True)
class Use:
    """Running hours and load for energy figures."""

    time_per_year_s: float | None = None
    load_factor: float | None = None
    replacement_price: float | None = None  # in the site tariff's currency


@dataclass(frozen=True, slots=True)
class Machine:
    id: str
    kind: str
    phases: int
    ratings: tuple[Rating, ...]
    poles: int | None = None
    description: str = ""
    service_factor: float = 1.0
    insulation_class: str | None = None
    efficiency_class: str | None = None
    max_speed_rpm: float | None = None
    code_letter: str | None = None
    design_letter: str | None = None
    cooling: str = "IC411"
    duty: str = "S1"
    rated_ambient_degc: float = 40.0
    rated_altitude_m: float = 1000.0
    prime_mover_speed_rpm: float | None = None
    load: Load | None = None
    source: str | None = field(default=None, compare=False)
    line: int | None = field(default=None, compare=False)
    circuit: Circuit | None = None
    start: Start | None = None
    feeder: Feeder | None = None
    use: Use | None = None
    # derived from kind once: the engine asks them a dozen times a pair
    is_generator: bool = field(init=False, compare=False, repr=False)
    is_synchronous: bool = field(init=False, compare=False, repr=False)

    def __post_init__(self) -> None:
        object.__setattr__(self, "is_generator", self.kind == "synchronous-generator")
        object.__setattr__(self, "is_synchronous", self.kind != "induction-motor")


@dataclass(frozen=True, slots=True)
class Site:
    id: str
    frequency_hz: float
    voltage_v: float
    phases: int
    standard: str
    name: str = ""
    system: str | None = None
    voltage_range_v: tuple[float, float] | None = None
    unbalance: float | None = None
    line_voltages_v: tuple[float, float, float] | None = None
    altitude_m: float = 0.0
    ambient_degc: float = 40.0
    min_efficiency_class: str | None = None
    source: str | None = field(default=None, compare=False)
    line: int | None = field(default=None, compare=False)
    frequency_variation: float | None = None  # stated variation, fraction of nominal
    wires: int | None = None                  # 3 or 4 (with neutral), three-phase
    region: str | None = None
    supply_source: Source | None = None       # [site.source]; None: a stiff supply
    limits: Limits | None = None
    tariff: Tariff | None = None


@dataclass(frozen=True, slots=True)
class Source:
    """The supply source of a site ([site.source]); shares are fractions (5.75 % = 0.0575)."""

    kind: str
    rating_va: float | None = None
    impedance: float | None = None
    x_over_r: float | None = None
    short_circuit_power_va: float | None = None
    fault_current_a: float | None = None
    subtransient_reactance: float | None = None
    transient_reactance: float | None = None
    prime_mover_power_w: float | None = None


@dataclass(frozen=True, slots=True)
class Limits:
    """Voltage-drop limits of a site, fractions of the supply voltage."""

    running_voltage_drop: float | None = None
    starting_dip: float | None = None


@dataclass(frozen=True, slots=True)
class Tariff:
    """Energy price per kWh, in ``currency``."""

    energy_per_kwh: float | None = None
    currency: str | None = None


@dataclass(frozen=True, slots=True)
class Catalog:
    title: str
    machines: tuple[Machine, ...]
    source: str | None = None
    reader: str | None = None  # "TOML", "CSV", "XLSX": how the file was read (and why)
