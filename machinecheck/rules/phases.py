"""Phase count: a three-phase machine needs three phases; single-phase machines on others."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    site = supply.site
    if machine.phases == 3 and site.phases == 1:
        return (Finding(
            "phase-mismatch", "problem",
            "three-phase machine on a single-phase supply: it cannot be connected as is. "
            "Remedies: a drive with single-phase input (derate about 1/sqrt(3) to 1/2), a "
            "rotary phase converter (near-rated output), or a three-phase supply"),)
    if machine.phases == 3 and site.phases == 2:
        return (Finding(
            "phase-mismatch", "problem",
            "three-phase machine on a two-phase (90 degree) supply: it cannot be connected as "
            "is. Remedy: a Scott-T transformer to derive three phases, or a drive"),)
    if machine.phases == 2 and site.phases != 2:
        return (Finding(
            "phase-mismatch", "problem",
            f"two-phase (90 degree) machine on a {site.phases}-phase supply: it cannot be "
            "connected as is. Remedy: a Scott-T transformer from three phases, or a drive"),)
    found: list[Finding] = []
    if machine.phases == 1:
        if supply.terminal_note:
            found.append(Finding(
                "single-phase-connection", "info",
                f"single-phase machine connected {supply.terminal_note} at "
                f"{supply.terminal_voltage_v:.0f} V"))
        if supply.rerated:
            found.append(Finding(
                "single-phase-frequency", "warning",
                f"single-phase motor on {site.frequency_hz:g} Hz, rated "
                f"{choice.rating.frequency_hz:g} Hz: its capacitor and starting switch are "
                "tuned to one frequency and it may not start or reach speed; ask the "
                "manufacturer"))
    return tuple(found)
