"""Generators: shaft speed, prime mover, voltage and output at the site frequency."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine

#: Prime-mover speed within this fraction of the speed needed is taken as matching.
PRIME_MOVER_SLACK = 0.01


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    if not machine.is_generator or not supply.phases_ok:
        return ()
    site = supply.site
    n = running.synchronous_speed_rpm
    found = [Finding("generator-speed", "info",
                     f"shaft speed for {site.frequency_hz:g} Hz with {choice.poles} poles: "
                     f"{n:.0f} rpm")]
    pm = machine.prime_mover_speed_rpm
    if pm is not None and abs(pm / n - 1.0) > PRIME_MOVER_SLACK:
        if n < pm:
            found.append(Finding(
                "prime-mover-speed", "warning",
                f"the prime mover is rated {pm:.0f} rpm but {n:.0f} rpm is needed: run it "
                f"lower; an engine gives about {min(1.0, n / pm):.2f} of its power at the "
                "lower speed"))
        else:
            found.append(Finding(
                "prime-mover-speed", "problem",
                f"the prime mover is rated {pm:.0f} rpm but {n:.0f} rpm is needed: it cannot "
                "be run faster than rated without the maker's approval"))
    if supply.rerated:
        found.append(Finding(
            "generator-conversion", "warning",
            f"{choice.rating.frequency_hz:g} Hz generator on {site.frequency_hz:g} Hz: reset "
            f"the governor to {n:.0f} rpm, the voltage regulator (output at rated flux about "
            f"{running.rated_flux_voltage_v:.0f} V) and its under-frequency roll-off, and the "
            "overspeed trip"))
    va, w = running.available_apparent_power_va, running.available_power_w
    if va is not None and w is not None:
        found.append(Finding(
            "generator-output", "info",
            f"available about {va / 1000:.0f} kVA / {w / 1000:.0f} kW at "
            f"{site.voltage_v:.0f} V, {running.currents.full_load_a:.0f} A (rated current "
            "held; fan slower at lower speed: the maker may ask for less)"))
    return tuple(found)
