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
        found += _output(machine, supply, running)
    va, w = running.available_apparent_power_va, running.available_power_w
    if va is not None and w is not None:
        found.append(Finding(
            "generator-output", "info",
            f"available about {va / 1000:.0f} kVA / {w / 1000:.0f} kW at "
            f"{site.voltage_v:.0f} V, {running.currents.full_load_a:.0f} A (rated current "
            "held; the derates shown included)"))
    return tuple(found)


def _output(machine: Machine, supply: Supply, running: Running) -> list[Finding]:
    """A generator's output at another nominal frequency: the rated kVA is kept (never
    raised without the prime mover's power), the fan's cooling derate is in the figures."""
    found: list[Finding] = []
    ratio = supply.frequency_ratio
    cooling = running.derates.factor("cooling")
    if cooling is not None and cooling < 1.0:
        found.append(Finding(
            "generator-cooling", "warning",
            f"shaft fan ({machine.cooling}) turns {100 * (1 - ratio):.0f} % slower: output "
            f"derated by the cooling factor {cooling:.3f} (common practice, no published "
            "formula); confirm with the maker"))
    if ratio > 1.0:
        source = supply.site.supply_source
        prime_mover_w = None if source is None else source.prime_mover_power_w
        w = running.available_power_w
        if prime_mover_w is None:
            found.append(Finding(
                "generator-prime-mover-power", "warning",
                "rated kVA kept, not raised for the higher speed: no prime-mover power is "
                "given to carry more, and the cooling at the higher speed is the maker's to "
                "confirm"))
        elif w is not None and w >= prime_mover_w - 1e-6:
            found.append(Finding(
                "generator-prime-mover-power", "info",
                f"real output limited to the prime mover's {prime_mover_w / 1000:.0f} kW"))
    return found
