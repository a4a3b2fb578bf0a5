"""Motor branch-circuit settings of NFPA 70 (National Electrical Code) Article 430, keyed by
the code edition, and the IEC practice for overload relays.

Which current sizes what (430.6(A)): the code tables' full-load current (Tables 430.247 to
430.250) sizes the conductors, the short-circuit and ground-fault device and the disconnect;
the nameplate current sizes the overload. The overload's *maximum trip current* the code allows
is kept apart from the *dial setting* of an adjustable relay, which is commonly the nameplate
current (manufacturers' instructions; common practice).

Every figure here is a limit of the code or a common setting, not a design: protection must be
set by a qualified person to the local code and the manufacturer's instructions.
"""

from __future__ import annotations

import bisect
import functools
import json
from dataclasses import dataclass
from importlib import resources
from typing import Any

from ..errors import DomainError
from .supply_constants import SQRT3

EDITIONS = ("2011", "2014", "2017", "2020", "2023")
DEVICES = ("non-time-delay-fuse", "dual-element-fuse", "instantaneous-trip-breaker",
           "inverse-time-breaker")
MOTOR_TYPES = ("single-phase", "squirrel-cage", "design-b-energy-efficient",
               "design-b-premium-efficiency", "synchronous", "wound-rotor", "dc-constant-voltage")
#: 430.22: conductors for one continuous-duty motor at 125 % of the table current.
CONDUCTOR_FACTOR = 1.25
#: 430.22(C): conductors between a star-delta controller and the motor on 58 % of the table
#: current (the phase current, 1/sqrt(3), rounded as the code rounds it).
STAR_DELTA_CONDUCTOR_SHARE = 0.58
#: 430.110(A): disconnect ampere rating at least 115 % of the table current.
DISCONNECT_FACTOR = 1.15
#: 430.32(A)(1) and 430.32(C): overload maximum trip current, % of nameplate current.
OVERLOAD_MAX = {"general": (1.25, 1.15), "will-not-start": (1.40, 1.30)}
CAUTION = ("Verify with the manufacturer; de-energise and lock out before work; settings "
           "must be made by a qualified person to the local code and licensed practice.")


@dataclass(frozen=True, slots=True)
class Setting:
    """A current figure [A], the clause it comes from, and a note (e.g. 'common practice')."""

    current_a: float
    clause: str
    note: str = ""


@dataclass(frozen=True, slots=True)
class DeviceRating:
    """Maximum rating of a branch short-circuit and ground-fault device.

    ``computed_a`` is the table percentage of the full-load current; ``permitted_a`` is what
    the code allows to be installed (the next standard rating above a computed value that is
    not one, for fuses and fixed breakers).
    """

    percent: float
    computed_a: float
    permitted_a: float
    clause: str


@functools.lru_cache(maxsize=4)
def _load(name: str) -> dict[str, Any]:
    text = resources.files("machinecheck").joinpath(f"data/nec/{name}.json").read_text("utf-8")
    data: dict[str, Any] = json.loads(text)
    return data


def _edition(edition: str | int) -> str:
    key = str(edition).strip()
    if key not in EDITIONS:
        raise DomainError(f"NEC edition must be one of {', '.join(EDITIONS)}, got {edition!r}")
    return key


def _positive(name: str, value: float) -> None:
    if not value > 0:
        raise DomainError(f"{name} must be positive, got {value!r}")


def table_430_52_name(edition: str | int) -> str:
    """Name of the maximum-rating table in an edition: 'Table 430.52' up to 2020,
    'Table 430.52(C)(1)' in 2023.

    References
    ----------
    .. [1] NFPA 70 (2011 to 2023 editions), 430.52.
    """
    name: str = _load("table_430_52")["editions"][_edition(edition)]
    return name


def conductor_ampacity(table_current_a: float, *, star_delta_motor_leads: bool = False,
                       edition: str | int = "2023") -> Setting:
    """Minimum ampacity of a single motor's branch-circuit conductors [A].

    125 % of the table full-load current; for the conductors between a star-delta controller
    and the motor, 125 % of 58 % of it (about 72.5 %).

    Parameters
    ----------
    table_current_a : full-load current of Tables 430.247 to 430.250 [A]
    star_delta_motor_leads : the six leads between a star-delta controller and the motor
    edition : NEC edition

    References
    ----------
    .. [1] NFPA 70, 430.22 and 430.22(C) (2011 to 2023 editions), with 430.6(A)(1).
    """
    _positive("table current", table_current_a)
    ed = _edition(edition)
    if star_delta_motor_leads:
        return Setting(CONDUCTOR_FACTOR * STAR_DELTA_CONDUCTOR_SHARE * table_current_a,
                       f"NEC {ed} 430.22(C)")
    return Setting(CONDUCTOR_FACTOR * table_current_a, f"NEC {ed} 430.22")


def overload_maximum_trip(nameplate_current_a: float, *, service_factor: float | None,
                          temperature_rise_degc: float | None, will_not_start: bool = False,
                          edition: str | int = "2023") -> Setting:
    """Largest trip current the code allows a separate overload device to have [A].

    125 % of the nameplate current for a marked service factor of 1.15 or more or a marked
    temperature rise of 40 degC or less, 115 % for all others (430.32(A)(1)); where that does
    not let the motor start or carry its load, 140 % and 130 % (430.32(C)).

    Parameters
    ----------
    nameplate_current_a : motor nameplate full-load current [A] (430.6(A)(2))
    service_factor : marked service factor [-], None when not marked
    temperature_rise_degc : marked temperature rise [K], None when not marked
    will_not_start : the 430.32(C) case
    edition : NEC edition

    References
    ----------
    .. [1] NFPA 70, 430.32(A)(1) and 430.32(C) (2011 to 2023 editions).
    """
    _positive("nameplate current", nameplate_current_a)
    ed = _edition(edition)
    high = (service_factor is not None and service_factor >= 1.15) or \
        (temperature_rise_degc is not None and temperature_rise_degc <= 40.0)
    key = "will-not-start" if will_not_start else "general"
    factor = OVERLOAD_MAX[key][0 if high else 1]
    clause = "430.32(C)" if will_not_start else "430.32(A)(1)"
    return Setting(factor * nameplate_current_a, f"NEC {ed} {clause}",
                   f"{round(100 * factor)} % of nameplate current; a maximum, not a dial setting")


def overload_dial_setting(nameplate_current_a: float, *, star_delta: bool = False) -> Setting:
    """The usual dial setting of an adjustable overload relay [A]: the nameplate current, or
    1/sqrt(3) of it for a relay in the phase windings of a star-delta starter.

    Common practice and manufacturers' instructions, not a code figure; IEC practice likewise
    sets the relay to the rated current.

    References
    ----------
    .. [1] Common practice (relay makers' instructions); IEC 60947-4-1:2009, 5.7 (current
       setting).
    """
    _positive("nameplate current", nameplate_current_a)
    if star_delta:
        return Setting(nameplate_current_a / SQRT3, "common practice",
                       "relay in the phase windings: line current / sqrt(3)")
    return Setting(nameplate_current_a, "common practice", "dial set to the nameplate current")


@functools.lru_cache(maxsize=2)
def standard_ratings(fuse: bool) -> tuple[float, ...]:
    """Standard ampere ratings of 240.6(A), with the fuse-only ratings when ``fuse``."""
    data = _load("standard_ampere_ratings")
    values = list(data["standard"]) + (list(data["fuses_additional"]) if fuse else [])
    return tuple(sorted(float(v) for v in values))


def next_standard_rating(current_a: float, *, fuse: bool) -> float:
    """The standard rating at or above ``current_a`` [A] (NEC 240.6(A)).

    Raises DomainError above the largest standard rating (6000 A).

    References
    ----------
    .. [1] NFPA 70, 240.6(A) (standard ampere ratings; fuses add 1, 3, 6, 10 and 601 A).
    """
    _positive("current", current_a)
    ratings = standard_ratings(fuse)
    i = bisect.bisect_left(ratings, current_a * (1.0 - 1e-12))
    if i >= len(ratings):
        raise DomainError(f"{current_a:.0f} A is above the largest standard rating")
    return ratings[i]


def short_circuit_device_maximum(table_current_a: float, device: str,
                                 motor_type: str = "squirrel-cage",
                                 edition: str | int = "2023") -> DeviceRating:
    """Maximum rating of the motor branch short-circuit and ground-fault protective device.

    computed = percentage of Table 430.52 x table full-load current; permitted = the next
    standard rating (240.6(A)) where the computed value is not one, for fuses and inverse-time
    breakers (430.52 Exception No. 1); an instantaneous-trip breaker is adjustable and is set,
    not rounded to a standard size.

    Parameters
    ----------
    table_current_a : full-load current of Tables 430.247 to 430.250 [A]
    device : one of DEVICES
    motor_type : one of MOTOR_TYPES ('squirrel-cage' is 'other than Design B energy-efficient';
        'design-b-premium-efficiency' from the 2023 edition only)
    edition : NEC edition: '2011', '2014', '2017', '2020' or '2023'

    References
    ----------
    .. [1] NFPA 70 (2011 to 2020) Table 430.52 and 430.52(C)(1) Exception No. 1; NFPA 70-2023
       Table 430.52(C)(1). Percentages: non-time-delay fuse 300, dual-element fuse 175,
       instantaneous-trip breaker 800 (1100 Design B energy-efficient, and from 2023 Design B
       premium efficiency), inverse-time breaker 250; wound rotor 150/150/800/150.
    """
    _positive("table current", table_current_a)
    data = _load("table_430_52")
    if device not in DEVICES:
        raise DomainError(f"device must be one of {', '.join(DEVICES)}, got {device!r}")
    if motor_type not in MOTOR_TYPES:
        raise DomainError(f"motor type must be one of {', '.join(MOTOR_TYPES)}, "
                          f"got {motor_type!r}")
    ed = _edition(edition)
    if motor_type == "design-b-premium-efficiency" and int(ed) < int(data["premium_efficiency_from"]):
        raise DomainError(f"NEC {ed} Table 430.52 names no Design B premium-efficiency row "
                          "(added in 2023); its energy-efficient row is the one to read")
    percent = float(data["motor_types"][motor_type][DEVICES.index(device)])
    computed = percent / 100.0 * table_current_a
    clause = f"NEC {ed} {data['editions'][ed]}"
    if device == "instantaneous-trip-breaker":
        return DeviceRating(percent, computed, computed, clause)
    permitted = next_standard_rating(computed, fuse=device.endswith("fuse"))
    return DeviceRating(percent, computed, permitted, clause)


def disconnect_minimum_rating(table_current_a: float, edition: str | int = "2023") -> Setting:
    """Minimum ampere rating of the motor's disconnecting means [A]: 115 % of the table current.

    References
    ----------
    .. [1] NFPA 70, 430.110(A) (2011 to 2023 editions).
    """
    _positive("table current", table_current_a)
    return Setting(DISCONNECT_FACTOR * table_current_a, f"NEC {_edition(edition)} 430.110(A)")
