"""Buck-boost (autotransformer) connection: output voltage, correction and the kVA to buy.

A buck-boost unit is a small two-winding transformer (primary rated V_p, secondary rated V_s)
connected as an autotransformer: the secondary is put in series with the line so that it adds
to (boost) or takes from (buck) the supply voltage. Only the series winding's share of the
power passes through the core, so the unit's own rating is the correction voltage times the
load current, a small fraction of the load's kVA.

Three-phase loads use two units in open delta (three-wire supply) or three units in wye (needs
the supply's neutral). The cautions the code attaches to autotransformers go with every
remedy built from these figures: NFPA 70 210.9 and 215.11 (branch circuits and feeders derived
from autotransformers), 450.4 (autotransformers of 600 V and less); a wye bank needs the
neutral, and a grounded system keeps its grounded conductor common to input and output.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..errors import DomainError

CONNECTIONS = ("single-phase", "open-delta", "wye")

#: Units used per connection.
UNITS = {"single-phase": 1, "open-delta": 2, "wye": 3}

#: Unit ratings commonly catalogued for buck-boost transformers [VA] (common practice, no
#: published standard: manufacturers' neutral selection tables list 50 VA to 10 kVA units).
STANDARD_UNIT_VA = (50.0, 100.0, 150.0, 250.0, 500.0, 750.0, 1000.0, 1500.0, 2000.0, 3000.0,
                    5000.0, 7500.0, 10000.0)


def _positive(name: str, value: float) -> None:
    if not (value > 0 and math.isfinite(value)):
        raise DomainError(f"{name} must be positive, got {value!r}")


def _connection(connection: str) -> str:
    if connection not in CONNECTIONS:
        raise DomainError(f"connection must be one of {', '.join(CONNECTIONS)}, got {connection!r}")
    return connection


def output_voltage(input_voltage_v: float, primary_rated_v: float, secondary_rated_v: float, *,
                   boost: bool) -> float:
    """Output voltage of a two-winding unit connected as a buck or boost autotransformer.

    The primary sits across the input and the secondary is in series with the line, adding
    to it (boost) or, with its leads reversed, taking from it (buck):
        V_out = V_in (1 + V_s / V_p)   (boost)
        V_out = V_in (1 - V_s / V_p)   (buck)
    (A buck unit can also be wired with the input across both windings and the load across
    the primary, V_out = V_in V_p / (V_p + V_s); that variant is not modelled here.)

    The same expressions hold for the line-to-line voltage of an open-delta or wye bank whose
    primaries are connected line-to-line (open delta) or line-to-neutral (wye) at their rated
    voltage. Ideal transformer: the units' regulation (a few per cent at full load) is left out.

    Parameters
    ----------
    input_voltage_v : supply voltage applied to the connection [V]
    primary_rated_v : rated voltage of the winding connected across the supply [V]
    secondary_rated_v : rated voltage of the series winding [V]
    boost : True for a boost connection, False for buck

    Returns
    -------
    float : output voltage [V]

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 2.9 (the
       autotransformer: V_H / V_L = (N_C + N_SE) / N_C).
    .. [2] Common practice (a transformer maker's published answer): a 120/12 V unit gives
       132 V, or 108 V with the secondary leads reversed.
    """
    _positive("input voltage", input_voltage_v)
    _positive("primary rated voltage", primary_rated_v)
    _positive("secondary rated voltage", secondary_rated_v)
    if not secondary_rated_v < primary_rated_v:
        raise DomainError("the series winding's voltage must be below the primary's")
    sign = 1.0 if boost else -1.0
    return input_voltage_v * (1.0 + sign * secondary_rated_v / primary_rated_v)


def correction_voltage(supply_voltage_v: float, target_voltage_v: float) -> float:
    """Correction the series winding must give, V_corr = V_target - V_supply [V].

    Positive for a boost, negative for a buck (line-to-line for three-phase connections).

    References
    ----------
    .. [1] Manufacturers' buck-boost selection guides (common practice, no published source).
    """
    _positive("supply voltage", supply_voltage_v)
    _positive("target voltage", target_voltage_v)
    return target_voltage_v - supply_voltage_v


def unit_va(load_current_a: float, series_winding_v: float, connection: str) -> float:
    """Rating each unit must have: the series winding's voltage times the current it carries.

    single-phase : S_unit = V_s I
    open-delta   : S_unit = V_s I (two units; each series winding carries the line current
                   and adds V_s to a line-to-line voltage)
    wye          : S_unit = V_s I (three units; each adds V_s to a line-to-neutral voltage,
                   so a line-to-line correction dV needs V_s = dV / sqrt(3))

    ``series_winding_v`` is the rated secondary voltage of the unit chosen (the trade sizes on
    the rated voltage, not the correction actually obtained, so the winding is not overloaded
    at full current).

    Parameters
    ----------
    load_current_a : load line current [A]
    series_winding_v : rated voltage of the series (secondary) winding [V]
    connection : "single-phase", "open-delta" or "wye"

    Returns
    -------
    float : rating of one unit [VA]

    References
    ----------
    .. [1] Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 2.9: the series winding
       carries the full load current at its own voltage.
    .. [2] Manufacturers' buck-boost selection guides (common practice, no published source).
    """
    _connection(connection)
    _positive("load current", load_current_a)
    _positive("series winding voltage", abs(series_winding_v))
    return abs(series_winding_v) * load_current_a


def load_va_capacity(unit_rating_va: float, output_voltage_v: float, series_winding_v: float,
                     connection: str) -> float:
    """Load a bank of units of ``unit_rating_va`` can feed at ``output_voltage_v`` [VA].

    The series winding limits the current to I = S_unit / V_s; the load then takes
        single-phase : S_load = V_out I = S_unit V_out / V_s
        open-delta, wye : S_load = sqrt(3) V_out,LL I = sqrt(3) S_unit V_out,LL / V_s

    Parameters
    ----------
    unit_rating_va : rating of one unit [VA]
    output_voltage_v : output voltage, line-to-line for three-phase [V]
    series_winding_v : rated secondary (series) voltage of one unit [V]
    connection : "single-phase", "open-delta" or "wye"

    Returns
    -------
    float : load apparent power the bank can carry [VA]

    References
    ----------
    .. [1] Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 2.9 and its worked
       example of a 100 VA 120/12 V unit connected to boost 120 V to 132 V: 1100 VA.
    """
    _connection(connection)
    _positive("unit rating", unit_rating_va)
    _positive("output voltage", output_voltage_v)
    _positive("series winding voltage", series_winding_v)
    current_a = unit_rating_va / series_winding_v
    if connection == "single-phase":
        return output_voltage_v * current_a
    return math.sqrt(3.0) * output_voltage_v * current_a


def next_standard_unit_va(required_va: float, sizes: tuple[float, ...] = STANDARD_UNIT_VA) -> float:
    """Smallest catalogued unit rating at or above ``required_va`` [VA]; NaN above the list.

    References
    ----------
    .. [1] Common practice, no published source (:data:`STANDARD_UNIT_VA`).
    """
    _positive("required rating", required_va)
    for size in sorted(sizes):
        if size >= required_va * (1.0 - 1e-9):
            return size
    return math.nan


#: Winding sets of common buck-boost units: (primary voltages, secondary voltages) [V]; each
#: pair of windings can be connected in series or in parallel (common practice, no published
#: standard: 120 x 240 V primaries with 12/24 or 16/32 V secondaries, 240 x 480 V with 24/48 V).
STANDARD_WINDINGS: tuple[tuple[tuple[float, float], tuple[float, float]], ...] = (
    ((120.0, 240.0), (12.0, 24.0)),
    ((120.0, 240.0), (16.0, 32.0)),
    ((240.0, 480.0), (24.0, 48.0)),
)


#: Most a primary may be fed, per unit of its rated voltage, at rated current: 105 %
#: (IEEE Std C57.12.00-2010, 4.1.6.1 a) 1)), so 120.1 V on a 208Y/120 system takes a 120 V
#: primary.
PRIMARY_OVERVOLTAGE = 1.05


@dataclass(frozen=True, slots=True)
class Winding:
    """A buck-boost connection: the unit's windings as connected and what it gives."""

    primary_v: float
    secondary_v: float
    boost: bool
    output_v: float


def primary_applied_voltage(supply_voltage_v: float, connection: str) -> float:
    """Voltage across each unit's primary [V]: line-to-line, or line-to-neutral in wye.

    References
    ----------
    .. [1] Manufacturers' buck-boost connection diagrams (common practice): single units and
       open-delta banks sit across the line voltage, wye banks across the phase voltage.
    """
    _connection(connection)
    _positive("supply voltage", supply_voltage_v)
    return supply_voltage_v / math.sqrt(3.0) if connection == "wye" else supply_voltage_v


def choose_winding(supply_voltage_v: float, target_voltage_v: float, connection: str,
                   windings: tuple[tuple[tuple[float, float], tuple[float, float]], ...]
                   = STANDARD_WINDINGS) -> Winding:
    """The connection of catalogued windings whose output comes closest to the target.

    Every primary rated for the voltage applied across it (up to 105 % of its rating) is tried with every
    secondary, boosting when the target is above the supply and bucking when below; the
    output is :func:`output_voltage` of the line (line-to-line) voltage.

    Parameters
    ----------
    supply_voltage_v : supply voltage, line-to-line for three-phase [V]
    target_voltage_v : voltage wanted at the load [V]
    connection : "single-phase", "open-delta" or "wye"
    windings : winding sets to choose from, see :data:`STANDARD_WINDINGS`

    Returns
    -------
    Winding

    Raises
    ------
    DomainError : when no primary is rated for the voltage across it

    References
    ----------
    .. [1] Manufacturers' buck-boost selection tables (common practice, no published source);
       Chapman, *Electric Machinery Fundamentals*, 5th ed., sec. 2.9.
    """
    applied = primary_applied_voltage(supply_voltage_v, connection)
    boost = target_voltage_v >= supply_voltage_v
    best: Winding | None = None
    for primaries, secondaries in windings:
        for primary in primaries:
            if primary * PRIMARY_OVERVOLTAGE < applied * (1.0 - 1e-9):
                continue
            for secondary in secondaries:
                if secondary >= primary:
                    continue
                out = output_voltage(supply_voltage_v, primary, secondary, boost=boost)
                if best is None or abs(out - target_voltage_v) < abs(best.output_v - target_voltage_v):
                    best = Winding(primary, secondary, boost, out)
    if best is None:
        raise DomainError(f"no catalogued winding is rated for {applied:.0f} V across its primary")
    return best
