"""Site conditions: voltage unbalance, altitude and ambient temperature."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine
from ..physics.constants import UNBALANCE_KNEE, UNBALANCE_LIMIT
from ..physics.unbalance import unbalance_heating


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    found: list[Finding] = []
    derates = running.derates
    u = derates.unbalance
    if u is not None and supply.phases_ok:
        if u > UNBALANCE_LIMIT + 1e-12:
            found.append(Finding(
                "voltage-unbalance", "problem",
                f"voltage unbalance {100 * u:.2f} % is above 5 %: NEMA MG 1 advises against "
                "operation; correct the supply first"))
        elif u > UNBALANCE_KNEE + 1e-12:
            found.append(Finding(
                "voltage-unbalance", "warning",
                f"voltage unbalance {100 * u:.2f} %: derate to {derates.factor('unbalance'):.2f} "
                f"(NEMA MG 1 Figure 14-1); about {100 * unbalance_heating(u):.0f} % more "
                "temperature rise at full load; current unbalance 6-10 x higher"))
        elif u > 0:
            found.append(Finding(
                "voltage-unbalance", "info",
                f"voltage unbalance {100 * u:.2f} % (1 % or less needs no derating)"))
    site_factor = derates.factor("site")
    if derates.site_error is not None:
        found.append(Finding("site-conditions", "problem", derates.site_error))
    elif site_factor is not None and site_factor < 0.9995:
        s = supply.site
        found.append(Finding(
            "site-conditions", "warning",
            f"site at {s.altitude_m:.0f} m and {s.ambient_degc:.0f} degC against a rating for "
            f"{machine.rated_altitude_m:.0f} m and {machine.rated_ambient_degc:.0f} degC: "
            f"derate to {site_factor:.2f} (common practice table)"))
    return tuple(found)
