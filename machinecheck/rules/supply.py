"""Terminal voltage and frequency against the tolerance of the site's standard."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply, Tolerance
from ..model import Machine
from ..physics.constants import NEAR_LIMIT_COMBINED, NEAR_LIMIT_UNDERVOLTAGE
from ..physics.current import current_at_site
from ..physics.frequency import torque_capability
from ..physics.tolerance import is_normal_pairing


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    if not supply.phases_ok:
        return ()
    t = supply.tolerance
    if supply.rerated:
        # the flux rules judge the voltage of a re-rated machine; a stated frequency variation
        # of the new nominal is judged with it here, in the same zones
        if not supply.site.frequency_variation or t.zone == "A" or (
                t.standard == "NEMA" and t.within):
            return ()
        found_rerated = (_nema(choice, supply, t) if t.standard == "NEMA"
                         and not machine.is_generator else _iec(machine, choice, supply, t))
        return tuple(found_rerated)
    c = choice.connection
    found: list[Finding] = []
    if machine.phases == 3 and is_normal_pairing(supply.supply_voltage_v, c.voltage_v):
        found.append(Finding(
            "normal-pairing", "info",
            f"a {supply.supply_voltage_v:g} V system normally feeds {c.voltage_v:g} V motors "
            "(ANSI C84.1 utilization voltage): not a mismatch"))
    if t.standard == "NEMA" and not machine.is_generator:
        found += _nema(choice, supply, t)
    else:
        found += _iec(machine, choice, supply, t)
    return tuple(found)


def _where(choice: RatingChoice, supply: Supply, t: Tolerance) -> str:
    """The supply against the rating, for the messages."""
    dv, df = t.voltage_deviation, t.frequency_deviation
    worst = t.worst_voltage_deviation
    c = choice.connection
    rated = (f"{c.voltage_min_v:g}-{c.voltage_max_v:g} V" if c.is_range
             else f"{c.voltage_min_v:g} V")
    where = (f"{supply.terminal_voltage_v:.0f} V {supply.site.frequency_hz:g} Hz on a {rated} "
             f"{choice.rating.frequency_hz:g} Hz rating: dV {100 * dv:+.1f} %, "
             f"df {100 * df:+.1f} %")
    worst_f = t.worst_frequency_deviation
    if abs(worst - dv) > 1e-9 or abs(worst_f - df) > 1e-9:
        where += f" (worst end of the site's voltage range dV {100 * worst:+.1f} %"
        if supply.site.frequency_variation:
            where += (f" with its stated frequency variation "
                      f"+-{100 * supply.site.frequency_variation:g} %: df {100 * worst_f:+.1f} %")
        where += ")"
    return where


def _nema(choice: RatingChoice, supply: Supply, t: Tolerance) -> list[Finding]:
    combined = t.combined_variation
    assert combined is not None  # NEMA gives the combined variation
    if not t.within:
        return [Finding("outside-tolerance", "problem",
                        "outside NEMA MG 1 12.44 limits (+-10 % V, +-5 % f, |dV| + |df| <= 10 %): "
                        f"{_where(choice, supply, t)}")]
    worst = t.worst_voltage_deviation
    if combined > NEAR_LIMIT_COMBINED or worst < NEAR_LIMIT_UNDERVOLTAGE:
        torque = torque_capability(1.0 + worst)  # k = V / V_rated at rated frequency
        current = current_at_site(1.0, 1.0, 1.0 + worst)  # per unit of rated current
        return [Finding(
            "near-tolerance-limit", "warning",
            f"within NEMA MG 1 12.44 limits but near them ({100 * combined:.1f} % of 10 %): "
            f"{_where(choice, supply, t)}. Torque about {torque:.2f} of rated, current about "
            f"{current:.2f} x, higher temperature rise")]
    if combined > 0.0:
        return [Finding(
            "within-tolerance", "info",
            f"within NEMA MG 1 12.44 limits ({100 * combined:.1f} % of 10 %): "
            f"{_where(choice, supply, t)}")]
    return []


def _iec(machine: Machine, choice: RatingChoice, supply: Supply, t: Tolerance) -> list[Finding]:
    generator = machine.is_generator
    rated = "output" if generator else "torque"
    if t.zone == "A":
        if abs(t.voltage_deviation) > 1e-9 or abs(t.frequency_deviation) > 1e-9:
            return [Finding("tolerance-zone-a", "info",
                            f"IEC 60034-1 zone A (continuous rated {rated}): "
                            f"{_where(choice, supply, t)}")]
        return []
    if t.zone == "B":
        return [Finding("tolerance-zone-b", "warning",
                        f"IEC 60034-1 zone B: {_where(choice, supply, t)}. Rated {rated} "
                        "but not continuously; higher temperature rise; limit the time spent "
                        "there")]
    return [Finding("outside-tolerance", "problem",
                    f"outside IEC 60034-1 zone B (+-{8 if generator else 10} % V, -5/+3 % f): "
                    f"{_where(choice, supply, t)}")]
