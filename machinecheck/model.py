"""The machinecheck data model: frozen dataclasses holding SI floats only.

Units by suffix: _w watts, _va volt-amperes, _v volts, _a amperes, _hz hertz, _rpm revolutions
per minute, _m metres, _degc degrees Celsius, _nm newton-metres; ratios are plain fractions.
"""

from __future__ import annotations

from dataclasses import dataclass, field

KINDS = ("induction-motor", "synchronous-motor", "synchronous-generator")
STANDARDS = ("IEC", "NEMA")
SYSTEMS = ("wye", "delta", "split-phase", "quadrature")


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


@dataclass(frozen=True, slots=True)
class Load:
    """The driven equipment. ``power_w`` or ``torque_nm`` is drawn at the rated speed."""

    type: str
    power_w: float | None = None
    torque_nm: float | None = None
    max_speed_rpm: float | None = None


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


@dataclass(frozen=True, slots=True)
class Catalog:
    title: str
    machines: tuple[Machine, ...]
    source: str | None = None
