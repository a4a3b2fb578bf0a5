"""Connection to make, star-delta starting and locked-rotor current."""

from __future__ import annotations

import math

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    if not supply.phases_ok:
        return ()
    found: list[Finding] = []
    c, rating = choice.connection, choice.rating
    if len(rating.connections) > 1:
        others = ", ".join(f"{x.name or 'unnamed'} {x.voltage_min_v:g} V"
                           for x in rating.connections if x is not c)
        current = f", {c.current_a:.1f} A rated" if c.current_a else ""
        found.append(Finding(
            "connection", "info",
            f"connect {c.name or 'for'} {c.voltage_min_v:g} V{current} (not {others}); set "
            "overloads for this connection's current"))
    if running.star_delta_possible is True:
        found.append(Finding("star-delta", "info",
                             "star-delta starting possible: the delta voltage matches the "
                             "supply"))
    elif running.star_delta_possible is False:
        found.append(Finding("star-delta", "info",
                             "no star-delta starting on this supply: the running connection is "
                             "not delta at the supply voltage"))
    lrc = running.currents.locked_rotor
    if lrc is not None:
        low, high = lrc.low_a, lrc.high_a
        band = f"{low:.0f} A" if abs(high - low) < 0.5 else (
            f"{low:.0f}-{high:.0f} A" if high != math.inf else f"{low:.0f} A or more")
        found.append(Finding(
            "locked-rotor-current", "info",
            f"locked-rotor current at the site about {band} ({lrc.basis}, scaled by "
            f"k = {choice.flux_ratio:.3f}): size starters, generators and voltage dip for it"))
    return tuple(found)
