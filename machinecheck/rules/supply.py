"""Supply voltage and frequency against the tolerance of the site's standard."""

from __future__ import annotations

from ..physics.tolerance import is_normal_pairing


def check(a) -> None:
    if a.rerated or not a.phases_ok:
        return
    t = a.tolerance
    c = a.connection
    if a.machine.phases == 3 and is_normal_pairing(a.site.voltage_v, c.voltage_v):
        a.add("normal-pairing", "info",
              f"a {a.site.voltage_v:g} V system normally feeds {c.voltage_v:g} V motors "
              "(ANSI C84.1 utilization voltage): not a mismatch")
    if t["standard"] == "NEMA" and not a.machine.is_generator:
        _nema(a, t)
    else:
        _iec(a, t)


def _where(a, t) -> str:
    """The supply against the rating, for the messages (made only when one is given)."""
    dv, df = t["voltage_deviation"], t["frequency_deviation"]
    worst = t["worst_voltage_deviation"]
    c = a.connection
    rated = (f"{c.voltage_min_v:g}-{c.voltage_max_v:g} V" if c.is_range
             else f"{c.voltage_min_v:g} V")
    where = (f"{a.supply_voltage_v:.0f} V {a.site.frequency_hz:g} Hz on a {rated} "
             f"{a.rating.frequency_hz:g} Hz rating: dV {100 * dv:+.1f} %, df {100 * df:+.1f} %")
    if a.site.voltage_range_v is not None and abs(worst - dv) > 1e-9:
        where += f" (worst end of the site's voltage range dV {100 * worst:+.1f} %)"
    return where


def _nema(a, t) -> None:
    combined = t["combined_variation"]
    if not t["within"]:
        a.add("outside-tolerance", "problem",
              "outside NEMA MG 1 12.44 limits (+-10 % V, +-5 % f, |dV| + |df| <= 10 %): "
              f"{_where(a, t)}")
        return
    worst = t["worst_voltage_deviation"]
    if combined > 0.08 or worst < -0.075:
        torque = (1.0 + worst) ** 2
        current = 1.0 / (1.0 + worst)
        a.add("near-tolerance-limit", "warning",
              f"within NEMA MG 1 12.44 limits but near them ({100 * combined:.1f} % of 10 %): "
              f"{_where(a, t)}. Torque about {torque:.2f} of rated, current about "
              f"{current:.2f} x, higher temperature rise")
    elif combined > 0.0:
        a.add("within-tolerance", "info",
              f"within NEMA MG 1 12.44 limits ({100 * combined:.1f} % of 10 %): {_where(a, t)}")


def _iec(a, t) -> None:
    zone = t["zone"]
    generator = a.machine.is_generator
    if zone == "A":
        if abs(t["voltage_deviation"]) > 1e-9 or abs(t["frequency_deviation"]) > 1e-9:
            a.add("tolerance-zone-a", "info",
                  f"IEC 60034-1 zone A (continuous rated {'output' if generator else 'torque'}"
                  f"): {_where(a, t)}")
    elif zone == "B":
        a.add("tolerance-zone-b", "warning",
              f"IEC 60034-1 zone B: {_where(a, t)}. Rated {'output' if generator else 'torque'} "
              "but not continuously; higher temperature rise; limit the time spent there")
    else:
        a.add("outside-tolerance", "problem",
              f"outside IEC 60034-1 zone B (+-{8 if generator else 10} % V, -5/+3 % f): "
              f"{_where(a, t)}")
