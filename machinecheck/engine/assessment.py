"""The records of one assessment: frozen, typed, built once and never changed.

A pair (machine, site) is described by four records, in the order the pipeline builds them:

- :class:`RatingChoice`: which rating set and connection fit the supply (:mod:`.rating`);
- :class:`Supply`: the supply as this machine sees it: the site's nominal supply voltage, the
  terminal voltage offered to the winding, and the tolerance it sits in (:mod:`.supply`);
- :class:`Running`: the machine at the site: speed, derates, output, operating point, load and
  currents (:mod:`.running`);
- the findings of the rules, and the verdict they give (:func:`verdict_of`).

Starting, protection and remedies records join :class:`Assessment` beside ``running`` when
those stages are built.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping
from dataclasses import dataclass
from types import MappingProxyType
from typing import TYPE_CHECKING, Literal

from ..model import Connection, Machine, Rating, Site
from ..physics.circuit import Circuit
from ..physics.efficiency import ClassCheck

if TYPE_CHECKING:
    from ..rules.regulation import RegulationFinding
    from .protection import Protection
    from .remedies.records import Remedy
    from .starting import Starting

Severity = Literal["info", "warning", "problem"]
Verdict = Literal["compatible", "conditional", "incompatible"]

SEVERITIES: tuple[Severity, ...] = ("info", "warning", "problem")
VERDICTS: tuple[Verdict, ...] = ("compatible", "conditional", "incompatible")


@dataclass(frozen=True, slots=True)
class Finding:
    """One thing a rule found: a stable code, how much it matters, and the text for people."""

    code: str
    severity: Severity
    message: str


def verdict_of(findings: Iterable[Finding]) -> Verdict:
    """The verdict the worst finding gives: problem -> incompatible, warning -> conditional."""
    verdict: Verdict = "compatible"
    for f in findings:
        if f.severity == "problem":
            return "incompatible"
        if f.severity == "warning":
            verdict = "conditional"
    return verdict


# ----------------------------------------------------------------------------- supply

@dataclass(frozen=True, slots=True)
class Tolerance:
    """Where the terminal voltage and frequency sit in the tolerance of the site's standard.

    ``basis`` is "rated", or "re-rated" when judged as flux at a new frequency. IEC gives a
    ``zone`` ("A", "B" or None outside); NEMA gives ``combined_variation`` (|dV| + |df|).
    ``worst_voltage_deviation`` and ``worst_frequency_deviation`` are the worst point over the
    site's measured voltage range and stated frequency variation, judged together.
    """

    standard: str
    basis: str
    voltage_deviation: float
    frequency_deviation: float
    within: bool
    zone: str | None
    combined_variation: float | None
    worst_voltage_deviation: float
    worst_frequency_deviation: float = 0.0


@dataclass(frozen=True, slots=True)
class Supply:
    """The site's supply as this machine sees it.

    ``supply_voltage_v`` is the site's nominal voltage; ``terminal_voltage_v`` the voltage
    offered to the winding (line-to-neutral for a single-phase machine connected so, named in
    ``terminal_note``). ``frequency_ratio`` is the site frequency over the chosen rating's;
    ``rerated`` is true when that is a change of nominal frequency rather than a deviation.
    """

    site: Site
    supply_voltage_v: float
    terminal_voltage_v: float
    terminal_note: str
    frequency_ratio: float
    rerated: bool
    phases_ok: bool
    tolerance: Tolerance


# ----------------------------------------------------------------------------- rating

@dataclass(frozen=True, slots=True)
class RatingChoice:
    """The rating set and connection used, the rated voltage it is judged against, and the
    flux ratio k = (V / V_rated) / (f / f_rated) it runs at."""

    rating: Rating
    connection: Connection
    rated_voltage_v: float
    flux_ratio: float
    poles: int


# ----------------------------------------------------------------------------- running

@dataclass(frozen=True, slots=True)
class Derates:
    """Output factors by name (in the order applied) and their product.

    ``unbalance`` is the supply's voltage unbalance when judged; ``site_error`` says why the
    altitude/ambient table could not be read (the factor is then read at its edge).
    """

    factors: tuple[tuple[str, float], ...]
    combined: float
    unbalance: float | None
    site_error: str | None

    def factor(self, name: str) -> float | None:
        """The factor called ``name``, or None when it was not applied."""
        return next((value for key, value in self.factors if key == name), None)


@dataclass(frozen=True, slots=True)
class OperatingPoint:
    """Where an induction motor runs on its load: by the slip rule, and by the equivalent
    circuit when one could be estimated (``basis`` says which gave the figures)."""

    basis: str
    rule_speed_rpm: float | None
    rule_rated_slip_rpm: float
    rule_torque_ratio: float | None
    slip_model_valid: bool
    circuit: Circuit | None
    circuit_unavailable: str | None
    stalled: bool
    speed_rpm: float | None
    slip: float | None
    load_torque_nm: float | None
    breakdown_torque_nm: float | None
    stall_torque_nm: float | None
    breakdown_margin: float | None
    current_a: float | None
    power_factor: float | None
    efficiency: float | None
    #: where the breakdown torque comes from: the datasheet's circuit or breakdown torque, or
    #: an estimate (a typical ratio for the design); None without a circuit
    breakdown_basis: str | None = None


@dataclass(frozen=True, slots=True)
class LoadAtSite:
    """The driven load at the site.

    ``power_w`` is drawn at the running speed (the flow, head and power ratios follow it,
    affinity laws; flow alone for a constant-torque load). ``demand_w`` is the load's power at
    the speed the site frequency sets with the rated slip (``demand_speed_rpm``: the load's
    rated speed times the frequency ratio): the load is judged on it against the available
    output, so that the few rpm a motor gains or loses with its voltage inside the zone are
    not taken for a change of load. ``fraction`` is ``demand_w`` over the available output,
    ``margin`` what is left of it (negative: overloaded).
    """

    type: str
    reference_speed_rpm: float
    speed_ratio: float
    power_w: float
    fraction: float | None
    flow_ratio: float | None
    head_ratio: float | None
    power_ratio: float | None
    demand_w: float = 0.0
    demand_speed_rpm: float = 0.0
    margin: float | None = None


@dataclass(frozen=True, slots=True)
class LockedRotorCurrent:
    """Locked-rotor current at the rated supply and at the site (scaled by the flux ratio)."""

    rated_low_a: float
    rated_high_a: float
    low_a: float
    high_a: float
    basis: str


@dataclass(frozen=True, slots=True)
class Currents:
    """Currents at the site.

    ``full_load_a`` is the current at the available output (``basis``: "nameplate", "formula"
    or "rated current"); ``load_a`` the current on the driven load (from the equivalent
    circuit, or the nameplate current scaled to the load); ``formula_a`` is
    P / (sqrt(3) V eta PF); ``code_a`` the NEC table current read at ``code_hp`` (from
    ``power_hp``), and ``conductor_a`` 125 % of it. The locked-rotor current moves to the
    starting record when that stage is built.
    """

    full_load_a: float | None
    basis: str | None
    load_a: float | None
    power_ratio: float | None
    formula_a: float | None
    nameplate_formula_ratio: float | None
    code_a: float | None
    code_hp: int | float | None
    power_hp: float | None
    conductor_a: float | None
    locked_rotor: LockedRotorCurrent | None
    #: which rule of NEC 430.6(A)(1) set the current for conductors and short-circuit
    #: protection (the table, or the nameplate and why); None when not judged (IEC sites)
    code_rule: str | None = None


@dataclass(frozen=True, slots=True)
class Running:
    """The machine at the site: speeds, derates, output, operating point, load and currents.

    ``operating`` is present for an induction motor whose speed could be worked out; ``load``
    when a driven load is given and the speed is known. Output figures are None when the
    machine cannot be connected to this supply.
    """

    synchronous_speed_rpm: float
    torque_capability: float
    derates: Derates
    rated_power_w: float
    available_power_w: float | None
    rated_apparent_power_va: float | None
    available_apparent_power_va: float | None
    expected_speed_rpm: float | None
    speed_band_rpm: float | None
    rated_flux_voltage_v: float
    uprated_power_w: float | None
    operating: OperatingPoint | None
    load: LoadAtSite | None
    currents: Currents
    service_factor: float
    service_factor_at_site: float
    star_delta_possible: bool | None
    #: the motor's IE class: the marked class, or when none is marked the class its plate
    #: efficiency reaches; the marked class is never replaced
    efficiency_class: str | None
    #: nominal minimum efficiency of the marked class, None when unmarked or not carried
    efficiency_class_minimum: float | None
    #: the marked class beside the class the plate efficiency reaches (None: out of scope)
    efficiency_check: ClassCheck | None = None
    #: why the machine cannot run at this site (wrong phases, supply outside the tolerance,
    #: stalled, frequency too far to re-rate); None when it can. Reports then show no running
    #: figures.
    not_running_reason: str | None = None


# ----------------------------------------------------------------------------- assessment

@dataclass(frozen=True, slots=True)
class Assessment:
    """Everything known about one machine on one site supply, and the verdict.

    ``working`` holds the explanation lines when they were asked for, else is empty.
    """

    machine: Machine
    site: Site
    choice: RatingChoice
    supply: Supply
    running: Running
    findings: tuple[Finding, ...]
    verdict: Verdict
    working: tuple[str, ...] = ()
    #: the start on this source and the protection settings (engine.starting,
    #: engine.protection); None when the pair gives no source, feeder or start
    starting: Starting | None = None
    protection: Protection | None = None
    #: candidate remedies, each re-checked (built for pairs that are not compatible)
    remedies: tuple[Remedy, ...] = ()
    #: the site region's efficiency rule for the machine; None without a region
    regulation: RegulationFinding | None = None

    # Flat read-only views, under the names the renderers read.
    @property
    def rating(self) -> Rating:
        return self.choice.rating

    @property
    def connection(self) -> Connection:
        return self.choice.connection

    @property
    def rated_voltage_v(self) -> float:
        return self.choice.rated_voltage_v

    @property
    def flux_ratio(self) -> float:
        return self.choice.flux_ratio

    @property
    def supply_voltage_v(self) -> float:
        """The terminal voltage offered to the winding (the renderers' older name)."""
        return self.supply.terminal_voltage_v

    @property
    def supply_voltage_note(self) -> str:
        return self.supply.terminal_note

    @property
    def rerated(self) -> bool:
        return self.supply.rerated

    @property
    def tolerance(self) -> Mapping[str, object]:
        """The tolerance record as a read-only mapping of its fields."""
        t = self.supply.tolerance
        return MappingProxyType({name: getattr(t, name) for name in Tolerance.__slots__})

    @property
    def synchronous_speed_rpm(self) -> float:
        return self.running.synchronous_speed_rpm

    @property
    def expected_speed_rpm(self) -> float | None:
        return self.running.expected_speed_rpm

    @property
    def speed_band_rpm(self) -> float | None:
        return self.running.speed_band_rpm

    @property
    def rated_power_w(self) -> float:
        return self.running.rated_power_w

    @property
    def available_power_w(self) -> float | None:
        return self.running.available_power_w

    @property
    def rated_apparent_power_va(self) -> float | None:
        return self.running.rated_apparent_power_va

    @property
    def available_apparent_power_va(self) -> float | None:
        return self.running.available_apparent_power_va

    @property
    def combined_factor(self) -> float:
        return self.running.derates.combined

    @property
    def load_power_w(self) -> float | None:
        return None if self.running.load is None else self.running.load.power_w

    @property
    def full_load_current_a(self) -> float | None:
        return self.running.currents.full_load_a

    @property
    def current_basis(self) -> str | None:
        return self.running.currents.basis

    @property
    def code_current_a(self) -> float | None:
        return self.running.currents.code_a

    @property
    def operating_current_a(self) -> float | None:
        return self.running.currents.load_a

    @property
    def operating_point_basis(self) -> str | None:
        op = self.running.operating
        return None if op is None else op.basis

    @property
    def breakdown_margin(self) -> float | None:
        op = self.running.operating
        return None if op is None else op.breakdown_margin

