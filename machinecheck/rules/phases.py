"""Phase count: a three-phase machine needs three phases; single-phase machines on others."""

from __future__ import annotations


def check(a) -> None:
    m, site = a.machine, a.site
    if m.phases == 3 and site.phases == 1:
        a.add("phase-mismatch", "problem",
              "three-phase machine on a single-phase supply: it cannot be connected as is. "
              "Remedies: a drive with single-phase input (derate about 1/sqrt(3) to 1/2), a "
              "rotary phase converter (near-rated output), or a three-phase supply")
    elif m.phases == 3 and site.phases == 2:
        a.add("phase-mismatch", "problem",
              "three-phase machine on a two-phase (90 degree) supply: it cannot be connected as "
              "is. Remedy: a Scott-T transformer to derive three phases, or a drive")
    elif m.phases == 1:
        if a.supply_voltage_note:
            a.add("single-phase-connection", "info",
                  f"single-phase machine connected {a.supply_voltage_note} at "
                  f"{a.supply_voltage_v:.0f} V")
        if a.rerated:
            a.add("single-phase-frequency", "warning",
                  f"single-phase motor on {site.frequency_hz:g} Hz, rated "
                  f"{a.rating.frequency_hz:g} Hz: its capacitor and starting switch are tuned to "
                  "one frequency and it may not start or reach speed; ask the manufacturer")
