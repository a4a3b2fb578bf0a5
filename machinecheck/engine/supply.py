"""The supply as a machine sees it: the voltages a site offers a winding, and the tolerance
zone the terminal voltage and frequency fall in.

"Supply voltage" is the site's nominal voltage, always line-to-line; "terminal voltage" is the
voltage at the machine's terminals (line-to-neutral for a single-phase machine connected so,
which needs a neutral: a four-wire three-phase site or a three-wire split-phase one).
The feeder between them joins here when it is modelled.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..model import Machine, Site
from ..physics import tolerance as tolerance_physics
from ..physics.constants import is_nominal_change, line_to_neutral_v, split_phase_half_v
from .assessment import RatingChoice, Supply, Tolerance

#: IEC zones from best to worst (None: outside zone B).
_ZONE_ORDER = {"A": 0, "B": 1, None: 2}


@dataclass(frozen=True, slots=True)
class Offer:
    """A voltage the site offers a winding, with a note of which it is ("line-to-neutral")."""

    voltage_v: float
    note: str


def offers(machine: Machine, site: Site) -> tuple[Offer, ...]:
    """Voltages the site offers this machine's winding, the line-to-line voltage first.

    The site voltage is line-to-line. A line-to-neutral voltage is offered to a single-phase
    machine only where the site has a neutral: four wires on a three-phase site, or the
    centre tap of a split-phase (three-wire) site. Nothing is guessed when the site is silent.
    """
    if machine.phases != 1 or site.phases == 2:
        return (Offer(site.voltage_v, ""),)
    if site.phases == 3:
        if site.wires == 4:
            return (Offer(site.voltage_v, "line-to-line"),
                    Offer(line_to_neutral_v(site.voltage_v), "line-to-neutral"))
        return (Offer(site.voltage_v, "line-to-line"),)
    if site.system == "split-phase" and site.wires in (None, 3):
        # a split-phase system is a centre-tapped three-wire system by its name
        return (Offer(site.voltage_v, "line-to-line"),
                Offer(split_phase_half_v(site.voltage_v), "line-to-neutral"))
    return (Offer(site.voltage_v, ""),)


def frequency_variation_points(site: Site) -> tuple[float, ...]:
    """Per-unit frequency deviations from the site's nominal to judge: 0, and the ends of the
    site's stated variation (50 Hz +-4 % -> -0.04, 0, +0.04)."""
    v = site.frequency_variation
    return (0.0,) if not v else (-v, 0.0, v)


def see(machine: Machine, site: Site, choice: RatingChoice, offer: Offer) -> Supply:
    """The supply this machine sees through the chosen rating set and connection."""
    frequency_ratio = site.frequency_hz / choice.rating.frequency_hz
    rerated = is_nominal_change(site.frequency_hz, choice.rating.frequency_hz)
    return Supply(
        site=site, supply_voltage_v=site.voltage_v, terminal_voltage_v=offer.voltage_v,
        terminal_note=offer.note, frequency_ratio=frequency_ratio, rerated=rerated,
        phases_ok=machine.phases == 1 or site.phases == machine.phases,
        tolerance=judge_tolerance(machine, site, choice, offer.voltage_v, frequency_ratio,
                                  rerated))


def judge_tolerance(machine: Machine, site: Site, choice: RatingChoice, terminal_voltage_v: float,
                    frequency_ratio: float, rerated: bool) -> Tolerance:
    """Where the terminal voltage sits in the tolerance of the site's standard.

    At a change of nominal frequency the voltage is judged as flux (k - 1) at the new
    frequency. The site's measured voltage range, when given, is judged at both ends and the
    worst point kept.
    """
    c = choice.connection
    flux_ratio = choice.flux_ratio
    if rerated:
        dv, df, basis = flux_ratio - 1.0, 0.0, "re-rated"
    else:
        dv = tolerance_physics.voltage_deviation(terminal_voltage_v, c.voltage_min_v,
                                                 c.voltage_max_v)
        df, basis = frequency_ratio - 1.0, "rated"
    voltages = [dv]
    if site.voltage_range_v is not None and not rerated:
        scale = terminal_voltage_v / site.voltage_v
        voltages += [tolerance_physics.voltage_deviation(end * scale, c.voltage_min_v,
                                                         c.voltage_max_v)
                     for end in site.voltage_range_v]
    elif site.voltage_range_v is not None:
        voltages += [flux_ratio * end / site.voltage_v - 1.0 for end in site.voltage_range_v]
    # the stated frequency variation is judged together with every voltage point: the zones
    # are combined voltage-frequency regions, not two separate limits
    frequencies = [(1.0 + df) * (1.0 + x) - 1.0 for x in frequency_variation_points(site)]
    points = [(dv, df)] + [(u, f) for u in voltages for f in frequencies
                           if (u, f) != (dv, df)]
    generator = machine.is_generator
    if site.standard == "NEMA" and not generator:
        checks = [tolerance_physics.nema_variation(*p) for p in points]
        return Tolerance(
            standard=site.standard, basis=basis, voltage_deviation=dv,
            frequency_deviation=frequency_ratio - 1.0, within=all(ok for ok, _ in checks),
            zone=None, combined_variation=max(combined for _, combined in checks),
            worst_voltage_deviation=max(points, key=lambda p: abs(p[0]) + abs(p[1]))[0],
            worst_frequency_deviation=max(points, key=lambda p: abs(p[0]) + abs(p[1]))[1])
    zones = [tolerance_physics.iec_zone(*p, generator=generator) for p in points]
    worst_zone = max(zones, key=lambda z: _ZONE_ORDER[z])
    return Tolerance(
        standard=site.standard, basis=basis, voltage_deviation=dv,
        frequency_deviation=frequency_ratio - 1.0, within=worst_zone is not None,
        zone=worst_zone, combined_variation=None,
        worst_voltage_deviation=points[zones.index(worst_zone)][0],
        worst_frequency_deviation=points[zones.index(worst_zone)][1])
