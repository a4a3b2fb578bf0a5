"""Site conditions: voltage unbalance, altitude and ambient temperature."""

from __future__ import annotations

from ..physics.unbalance import UNBALANCE_LIMIT, unbalance_heating


def check(a) -> None:
    u = a.unbalance
    if u is not None and a.phases_ok:
        if u > UNBALANCE_LIMIT + 1e-12:
            a.add("voltage-unbalance", "problem",
                  f"voltage unbalance {100 * u:.2f} % is above 5 %: NEMA MG 1 advises against "
                  "operation; correct the supply first")
        elif u > 0.01 + 1e-12:
            a.add("voltage-unbalance", "warning",
                  f"voltage unbalance {100 * u:.2f} %: derate to {a.factors['unbalance']:.2f} "
                  f"(NEMA MG 1 Figure 14-1); about {100 * unbalance_heating(u):.0f} % more "
                  "temperature rise at full load; current unbalance 6-10 x higher")
        elif u > 0:
            a.add("voltage-unbalance", "info",
                  f"voltage unbalance {100 * u:.2f} % (1 % or less needs no derating)")
    if a.site_derating_domain_error is not None:
        a.add("site-conditions", "problem", f"{a.site_derating_domain_error}")
    elif a.factors.get("site", 1.0) < 0.9995:
        s = a.site
        a.add("site-conditions", "warning",
              f"site at {s.altitude_m:.0f} m and {s.ambient_degc:.0f} degC against a rating for "
              f"{a.machine.rated_altitude_m:.0f} m and {a.machine.rated_ambient_degc:.0f} degC: "
              f"derate to {a.factors['site']:.2f} (common practice table)")
