"""Generators: shaft speed, prime mover, voltage and output at the site frequency."""

from __future__ import annotations


def check(a) -> None:
    m, site = a.machine, a.site
    if not m.is_generator or not a.phases_ok:
        return
    n = a.synchronous_speed_rpm
    a.add("generator-speed", "info",
          f"shaft speed for {site.frequency_hz:g} Hz with {a.poles} poles: {n:.0f} rpm")
    pm = m.prime_mover_speed_rpm
    if pm is not None and abs(pm / n - 1.0) > 0.01:
        change = "lower" if n < pm else "higher"
        a.add("prime-mover-speed", "warning" if n < pm else "problem",
              f"the prime mover is rated {pm:.0f} rpm but {n:.0f} rpm is needed: run it "
              f"{change}; an engine gives about {min(1.0, n / pm):.2f} of its power at the lower "
              "speed" if n < pm else
              f"the prime mover is rated {pm:.0f} rpm but {n:.0f} rpm is needed: it cannot be "
              "run faster than rated without the maker's approval")
    if a.rerated:
        limit = a.rated_voltage_v * a.frequency_ratio
        a.add("generator-conversion", "warning",
              f"{a.rating.frequency_hz:g} Hz generator on {site.frequency_hz:g} Hz: reset the "
              f"governor to {n:.0f} rpm, the voltage regulator (output at rated flux about "
              f"{limit:.0f} V) and its under-frequency roll-off, and the overspeed trip")
    if a.available_apparent_power_va is not None:
        a.add("generator-output", "info",
              f"available about {a.available_apparent_power_va / 1000:.0f} kVA / "
              f"{a.available_power_w / 1000:.0f} kW at {site.voltage_v:.0f} V, "
              f"{a.full_load_current_a:.0f} A (rated current held; fan slower at lower speed: "
              "the maker may ask for less)")
