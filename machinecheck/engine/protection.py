"""Protection settings of one motor: NFPA 70 Article 430 by edition, or IEC practice.

The figures come from :mod:`machinecheck.physics.protection`; this module picks the currents
they are read from (the code table's current for conductors, devices and the disconnect; the
nameplate current for the overload, NEC 430.6(A)) and keeps the overload's code maximum apart
from the dial setting. Every result carries the caution.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..model import Machine
from ..physics import protection as nec_physics
from ..physics.protection import CAUTION, DeviceRating, Setting
from .assessment import RatingChoice, Running, Supply
from .starting import Starting

#: The NEC edition the settings are keyed to when the input names none: the latest the
#: tables carry (said in every output).
DEFAULT_EDITION = "2023"


@dataclass(frozen=True, slots=True)
class Protection:
    """Protection settings of one motor at one site.

    ``code`` is "NEC" (NEMA sites) or "IEC"; NEC figures are None on IEC sites. ``devices``
    pairs each device type of Table 430.52 with its maximum rating. The trip class against the
    acceleration time is in :class:`~.starting.Starting`.
    """

    code: str
    edition: str | None
    edition_note: str | None
    table_current_a: float | None
    nameplate_current_a: float
    conductor_ampacity: Setting | None
    motor_lead_ampacity: Setting | None
    overload_maximum: Setting | None
    overload_maximum_will_not_start: Setting | None
    overload_dial: Setting
    devices: tuple[tuple[str, DeviceRating], ...]
    disconnect: Setting | None
    trip_class: str | None
    caution: str = CAUTION


def _motor_type(machine: Machine) -> str:
    if machine.phases == 1:
        return "single-phase"
    if machine.kind == "synchronous-motor":
        return "synchronous"
    if machine.design_letter is not None and machine.design_letter.upper() == "B" \
            and machine.efficiency_class in ("IE3", "IE4", "IE5"):
        return "design-b-energy-efficient"
    return "squirrel-cage"


def build(machine: Machine, choice: RatingChoice, supply: Supply, running: Running,
          starting: Starting | None) -> Protection | None:
    """The protection settings, or None for a generator, a machine without a nameplate
    current, or a pair with no supply path (``starting`` None)."""
    current = choice.connection.current_a
    if machine.is_generator or starting is None or not current:
        return None
    star_delta = starting.method == "star-delta"
    dial = nec_physics.overload_dial_setting(current, star_delta=star_delta)
    trip = starting.trip_class
    if supply.site.standard != "NEMA":
        iec_dial = Setting(dial.current_a, "IEC practice",
                           "relay set to the rated current" + (
                               " / sqrt(3) in the phase windings" if star_delta else ""))
        return Protection("IEC", None, None, None, current, None, None, None, None, iec_dial,
                          (), None, trip)
    edition = DEFAULT_EDITION
    note = f"NEC {edition}: no edition given, the latest the tables carry"
    table = running.currents.code_a
    sf = choice.rating.service_factor or machine.service_factor
    over = nec_physics.overload_maximum_trip(current, service_factor=sf,
                                             temperature_rise_degc=None, edition=edition)
    over_c = nec_physics.overload_maximum_trip(current, service_factor=sf,
                                               temperature_rise_degc=None, will_not_start=True,
                                               edition=edition)
    if star_delta:
        over = Setting(over.current_a / math.sqrt(3.0), over.clause,
                       over.note + "; relay in the phase windings: x 1/sqrt(3)")
        over_c = Setting(over_c.current_a / math.sqrt(3.0), over_c.clause,
                         over_c.note + "; relay in the phase windings: x 1/sqrt(3)")
    conductor = lead = disconnect = None
    devices: tuple[tuple[str, DeviceRating], ...] = ()
    if table is not None:
        conductor = nec_physics.conductor_ampacity(table, edition=edition)
        if star_delta:
            lead = nec_physics.conductor_ampacity(table, star_delta_motor_leads=True,
                                                  edition=edition)
        kind = _motor_type(machine)
        devices = tuple((d, nec_physics.short_circuit_device_maximum(table, d, kind, edition))
                        for d in nec_physics.DEVICES)
        disconnect = nec_physics.disconnect_minimum_rating(table, edition)
    return Protection("NEC", edition, note, table, current, conductor, lead, over, over_c,
                      dial, devices, disconnect, trip)
