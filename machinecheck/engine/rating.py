"""Which rating set and connection of a machine fit a site's supply."""

from __future__ import annotations

import math

from ..model import Connection, Machine, Rating, Site
from ..physics.constants import is_nominal_change
from ..physics.frequency import flux_ratio
from .assessment import RatingChoice
from .supply import Offer, offers

#: Weight of the frequency change against the flux error when ranking candidates: a tie-break.
_FREQUENCY_WEIGHT = 0.001


def choose(machine: Machine, site: Site, poles: int | None = None) -> tuple[RatingChoice, Offer]:
    """The rating set, connection and offered voltage whose V/f is nearest the rated V/f.

    A rating set for the site's nominal frequency (50 or 60 Hz, whatever its variation) beats
    re-rating from another one; among the candidates the smallest |ln k| wins, the smaller
    frequency change breaking ties. The first candidate wins an exact tie. ``poles`` keeps the
    rating sets of one speed of a multispeed plate.
    """
    ratings = [r for r in machine.ratings if poles is None or r.poles == poles]
    candidates = [r for r in ratings if not is_nominal_change(site.frequency_hz, r.frequency_hz)]
    offered = offers(machine, site)
    best: tuple[float, Rating, Connection, Offer, float, float] | None = None
    for rating in candidates or ratings:
        f_ratio = site.frequency_hz / rating.frequency_hz
        for connection in rating.connections:
            for offer in offered:
                reference, k = _flux(rating, connection, offer.voltage_v, site)
                score = abs(math.log(k)) + _FREQUENCY_WEIGHT * abs(math.log(f_ratio))
                if best is None or score < best[0] - 1e-12:
                    best = (score, rating, connection, offer, reference, k)
    assert best is not None  # every rating has a connection and every site a voltage
    _, rating, connection, offer, reference, k = best
    poles = rating.poles or machine.poles  # a multispeed plate gives each rating set its poles
    assert poles is not None  # the catalog gives every machine its poles
    return RatingChoice(rating=rating, connection=connection, rated_voltage_v=reference,
                        flux_ratio=k, poles=poles), offer


def _flux(rating: Rating, connection: Connection, terminal_voltage_v: float,
          site: Site) -> tuple[float, float]:
    """(rated voltage, flux ratio) of a connection on ``terminal_voltage_v``: the rated
    voltage is the end of a stamped range nearest the voltage that keeps rated V/f."""
    f_ratio = site.frequency_hz / rating.frequency_hz
    reference = connection.reference_voltage(terminal_voltage_v / f_ratio)
    return reference, flux_ratio(terminal_voltage_v, reference, site.frequency_hz,
                                 rating.frequency_hz)
