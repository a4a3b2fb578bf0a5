"""The start and the supply path: will it start, the dip, the overload against the run-up, the
running drop and the terminal voltage."""

from __future__ import annotations

from ..engine.assessment import Finding, Supply
from ..engine.starting import Starting
from ..physics.supply_constants import BREAKAWAY_TORQUE_MARGIN


def check(supply: Supply, s: Starting | None) -> tuple[Finding, ...]:
    """Findings of the start: "will not start", "dip exceeds limit", "overload trips before
    acceleration ends", "terminal voltage out of zone", and the running drop."""
    if s is None:
        return ()
    found: list[Finding] = []
    found += _drop(supply, s)
    found += _will_start(s)
    found += _dip(s)
    found += _trip(s)
    found += _generator(s)
    return tuple(found)


def _pct(x: float) -> str:
    return f"{100 * x:.1f} %"


def _drop(supply: Supply, s: Starting) -> list[Finding]:
    d = s.running_drop
    if d is None:
        return []
    found: list[Finding] = []
    source = "default, common practice" if d.limit_is_default else "site limit"
    if d.terminal_voltage_v <= 0:
        return [Finding("terminal-voltage-out-of-zone", "problem",
                        f"the feeder cannot carry {d.current_a:.0f} A: no steady terminal "
                        "voltage (the drop exceeds the supply)")]
    if d.drop > d.limit:
        found.append(Finding("voltage-drop-exceeds-limit", "warning",
                             f"running voltage drop in the feeder {_pct(d.drop)} at "
                             f"{d.current_a:.0f} A exceeds {_pct(d.limit)} ({source})"))
    if supply.phases_ok and not supply.tolerance.within:
        found.append(Finding("terminal-voltage-out-of-zone", "problem",
                             f"terminal voltage {d.terminal_voltage_v:.0f} V after the feeder's "
                             f"{_pct(d.drop)} drop from {d.bus_voltage_v:.0f} V is outside the "
                             "tolerance of the site's standard"))
    return found


def _will_start(s: Starting) -> list[Finding]:
    if s.will_start is False:
        if s.breakaway_margin is not None and s.breakaway_margin < 0:
            why = (f"starting torque {s.starting_torque_nm:.0f} N m at "
                   f"{s.starting_voltage_v:.0f} V is below the load's breakaway torque "
                   f"{s.breakaway_torque_nm:.0f} N m")
        else:
            why = (f"the motor's torque meets the load's at {s.stall_speed_rpm:.0f} rpm during "
                   "the run-up")
        return [Finding("will-not-start", "problem", f"will not start ({s.method}): {why}")]
    m = s.breakaway_margin
    if s.starting_torque_basis != "datasheet":
        if m is not None and m < BREAKAWAY_TORQUE_MARGIN or s.stall_speed_rpm is not None:
            return [Finding("start-torque-estimate", "info",
                            "the estimated torque curve (no datasheet locked-rotor torque) "
                            "leaves little or no margin to start this load: ask the maker for "
                            "the locked-rotor torque")]
        return []
    if m is not None and m < BREAKAWAY_TORQUE_MARGIN:
        return [Finding("start-torque-margin", "warning",
                        f"starting torque only {_pct(m)} above the load's breakaway torque; "
                        f"common practice asks {100 * BREAKAWAY_TORQUE_MARGIN:.0f} %")]
    return []


def _dip(s: Starting) -> list[Finding]:
    if s.dip_terminals is None or s.dip_terminals <= s.dip_limit:
        return []
    source = "default, common practice" if s.dip_limit_is_default else "site limit"
    smallest = ""
    if s.minimum_source_va is not None and s.minimum_source_kind is not None:
        smallest = (f"; the smallest {s.minimum_source_kind} for this start is about "
                    f"{s.minimum_source_va / 1e3:.0f} kVA")
    return [Finding("dip-exceeds-limit", "warning",
                    f"dip exceeds limit: {_pct(s.dip_terminals)} at the terminals starting "
                    f"{s.method} on {s.source_note} (limit {_pct(s.dip_limit)}, {source})"
                    f"{smallest}")]


def _trip(s: Starting) -> list[Finding]:
    t, cold, hot = s.acceleration_time_s, s.trip_time_cold_s, s.trip_time_hot_s
    if t is None or cold is None or hot is None:
        return []
    if cold <= t:
        return [Finding("overload-trips-before-acceleration-ends", "problem",
                        f"overload trips before acceleration ends: class {s.trip_class} may "
                        f"trip in {cold:.1f} s from cold at {s.trip_multiple:.1f} x setting; "
                        f"the run-up takes {t:.1f} s")]
    if hot <= t:
        return [Finding("overload-trips-hot-start", "warning",
                        f"a hot restart may trip: class {s.trip_class} from the running state "
                        f"may trip in {hot:.1f} s; the run-up takes {t:.1f} s")]
    return []


def _generator(s: Starting) -> list[Finding]:
    p, pm = s.starting_active_power_w, s.prime_mover_power_w
    if p is None or pm is None or s.source is None or s.source.kind != "generator":
        return []
    if p > pm:
        return [Finding("prime-mover-starting-power", "warning",
                        f"the start draws {p / 1e3:.0f} kW at standstill, above the prime "
                        f"mover's {pm / 1e3:.0f} kW: the set's frequency will sag")]
    return []
