"""Whether a nameplate agrees with itself: speed, poles and frequency; current, power and
voltage; locked-rotor and rated current. The one place these checks live (the ranges of single
values live in the field table); the formulas are in :mod:`machinecheck.physics`.

Each disagreement is reported with the values that disagree and by how much.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Sequence

from ..errors import DomainError
from ..model import Rating
from ..physics import plate
from ..physics import speed as speed_physics
from ..physics.current import apparent_power_current
from .fields import field
from .validate import Reader


def _speed_key(r_index: int) -> tuple[str, tuple[str, int]]:
    return f"rating[{r_index + 1}].speed", ("rating", r_index)


def _implied_poles(r: Reader, rating: Rating, r_index: int, poles: int | None,
                   synchronous: bool, design_letter: str | None = None) -> int | None:
    """Poles implied by one rating's speed, or None after reporting why they cannot be."""
    key, sub = _speed_key(r_index)
    assert rating.speed_rpm is not None
    try:
        implied = speed_physics.poles_from_speed(rating.speed_rpm, rating.frequency_hz,
                                                 synchronous=synchronous,
                                                 design_letter=design_letter)
        most = field("machine", "poles").high
        if most is not None and implied > most:
            r.fail(f"rated speed {rating.speed_rpm:g} rpm at {rating.frequency_hz:g} Hz would "
                   f"mean {implied} poles (at most {most:g}): is a thousands separator or "
                   "decimal comma misread (1.460 for 1460 rpm)?", key, sub)
            return None
        return implied
    except DomainError as exc:
        if poles is not None and not synchronous:
            n_s = speed_physics.synchronous_speed(rating.frequency_hz, poles)
            if rating.speed_rpm >= n_s:
                r.fail(f"rated speed {rating.speed_rpm:g} rpm is at or above the synchronous "
                       f"speed {n_s:g} rpm of {poles} poles at {rating.frequency_hz:g} Hz",
                       key, sub)
                return None
        r.fail(str(exc), key, sub)
        return None


def check_poles(r: Reader, ratings: Sequence[Rating], poles: int | None,
                kind: str, design_letter: str | None = None) -> tuple[int | None, list[Rating]]:
    """Infer or check the poles of every rating set against its speed and frequency.

    Several ratings at one frequency with different speeds form a multispeed plate: their pole
    counts may differ (each rating then carries its own). Otherwise every rating must imply the
    same poles, and the machine's ``poles`` when given. Returns (machine poles, ratings with
    their poles), or (None, []) after reporting a problem.
    """
    synchronous = kind != "induction-motor"
    implied: list[int | None] = []
    for r_index, rating in enumerate(ratings):
        if rating.speed_rpm is None:
            implied.append(None)
            continue
        found = _implied_poles(r, rating, r_index, poles, synchronous, design_letter)
        if found is None:
            return None, []
        implied.append(found)
    given = [p for p in implied if p is not None]
    by_frequency: dict[float, set[int]] = {}
    for rating, p in zip(ratings, implied):
        if p is not None:
            by_frequency.setdefault(rating.frequency_hz, set()).add(p)
    multispeed = any(len(s) > 1 for s in by_frequency.values())
    for r_index, (rating, p) in enumerate(zip(ratings, implied)):
        key, sub = _speed_key(r_index)
        if p is None:
            if poles is None and len(set(given)) != 1:
                r.fail("give the rated 'speed' or the machine's 'poles'", key, sub)
                return None, []
            continue
        if poles is not None and p != poles and not multispeed:
            n_s = speed_physics.synchronous_speed(rating.frequency_hz, poles)
            r.fail(f"rated speed {rating.speed_rpm:g} rpm at {rating.frequency_hz:g} Hz means "
                   f"{p} poles, but poles = {poles} (synchronous {n_s:g} rpm)", key, sub)
            return None, []
        if poles is not None and multispeed:
            r.fail(f"a multispeed plate (ratings at {rating.frequency_hz:g} Hz with different "
                   "speeds) takes its poles from each rated speed: remove 'poles'", "poles")
            return None, []
        first = given[0]
        if p != first and not multispeed:
            r.fail(f"rated speed {rating.speed_rpm:g} rpm at {rating.frequency_hz:g} Hz means "
                   f"{p} poles, but rating[1] means {first} poles (a multispeed plate gives "
                   "its speeds at one frequency)", key, sub)
            return None, []
    machine_poles = poles if poles is not None else (given[0] if given else None)
    if machine_poles is None:
        r.fail("give the rated 'speed' or the machine's 'poles'", "rating[1].speed",
               ("rating", 0))
        return None, []
    out = [dataclasses.replace(rating, poles=p if p is not None else machine_poles)
           for rating, p in zip(ratings, implied)]
    return machine_poles, out


def check_currents(r: Reader, rating: Rating, r_index: int, phases: int, kind: str) -> None:
    """Current against power and voltage, and locked-rotor against rated current."""
    sub = ("rating", r_index)
    prefix = f"rating[{r_index + 1}]."
    low, high = plate.IMPLIED_EFFICIENCY_POWER_FACTOR
    for c_index, connection in enumerate(rating.connections):
        current = connection.current_a
        if current is None:
            continue
        ends = sorted({connection.voltage_min_v, connection.voltage_max_v})
        if kind == "synchronous-generator":
            if rating.apparent_power_va is None:
                continue
            expected = [apparent_power_current(rating.apparent_power_va, v, phases) for v in ends]
            apart = min((plate.relative_difference(current, e) for e in expected), key=abs)
            if abs(apart) > plate.STATED_PRODUCT_TOLERANCE:
                r.fail(f"rated current {current:g} A disagrees with {rating.apparent_power_va / 1e3:g}"
                       f" kVA at {_volts(ends)}, which means {_amps(expected)} "
                       f"({100 * apart:+.0f} %): check current, power and voltage",
                       prefix + "current", sub)
            continue
        if rating.power_w is None:
            continue
        products = [plate.implied_efficiency_power_factor(rating.power_w, v, current, phases)
                    for v in ends]
        if not any(low <= p <= high for p in products):
            r.fail(f"rated current {current:g} A at {_volts(ends)} for "
                   f"{rating.power_w / 1e3:g} kW implies efficiency x power factor "
                   f"{_products(products)}, outside the plausible {low:g} to {high:g}: check "
                   "current, power and voltage", prefix + "current", sub)
            continue
        if rating.efficiency is not None and rating.power_factor is not None:
            stated = rating.efficiency * rating.power_factor
            apart = min((plate.relative_difference(p, stated) for p in products), key=abs)
            if abs(apart) > plate.STATED_PRODUCT_TOLERANCE:
                r.fail(f"rated current {current:g} A at {_volts(ends)} for "
                       f"{rating.power_w / 1e3:g} kW implies efficiency x power factor "
                       f"{_products(products)}, but efficiency {100 * rating.efficiency:g} % x "
                       f"power factor {rating.power_factor:g} = {stated:.3f} ({100 * apart:+.0f} "
                       f"%, more than {100 * plate.STATED_PRODUCT_TOLERANCE:g} % apart): check "
                       "current, power, voltage, efficiency and power factor",
                       prefix + "current", sub)
        lrc = rating.locked_rotor_current_a
        if lrc:
            locked = lrc[c_index] if len(lrc) > c_index else lrc[0]
            ratio = locked / current
            low_r, high_r = plate.LOCKED_ROTOR_RATIO
            if not low_r < ratio <= high_r:
                r.fail(f"locked-rotor current {locked:g} A is {ratio:.2g} times the rated "
                       f"current {current:g} A, outside the plausible {low_r:g} to {high_r:g}",
                       prefix + "locked_rotor_current", sub)


def _volts(ends: list[float]) -> str:
    return "-".join(f"{v:g}" for v in ends) + " V"


def _amps(values: list[float]) -> str:
    return " to ".join(f"{v:.3g} A" for v in values)


def _products(values: list[float]) -> str:
    return " to ".join(f"{v:.3g}" for v in values)
