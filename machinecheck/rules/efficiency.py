"""Efficiency class: the claimed class, and the site's minimum class."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine
from ..physics.efficiency import class_rank


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    if machine.kind != "induction-motor":
        return ()
    r = choice.rating
    found: list[Finding] = []
    minimum = running.efficiency_class_minimum
    if (machine.efficiency_class and minimum is not None and r.efficiency is not None
            and r.efficiency + 1e-9 < minimum):
        found.append(Finding(
            "efficiency-below-class", "warning",
            f"plate efficiency {100 * r.efficiency:.1f} % is below the "
            f"{machine.efficiency_class} minimum {100 * minimum:.1f} % (IEC 60034-30-1, "
            f"{r.frequency_hz:g} Hz, {choice.poles} poles)"))
    required = supply.site.min_efficiency_class
    if required is None or machine.phases != 3:
        return tuple(found)  # the class tables used here are for three-phase motors
    achieved = running.efficiency_class or machine.efficiency_class
    if achieved is None:
        found.append(Finding(
            "efficiency-class-unknown", "warning",
            f"the site requires {required}; the plate gives no class or efficiency to confirm "
            "it"))
    elif class_rank(achieved) < class_rank(required):
        found.append(Finding(
            "efficiency-class-required", "problem",
            f"the site requires {required}; this motor is {achieved} (IEC 60034-30-1 at its "
            "rated frequency, as marked)"))
    if supply.rerated:
        found.append(Finding(
            "efficiency-as-marked", "info",
            "efficiency and power factor hold only at the rated V/f: the class is as marked "
            f"at {r.frequency_hz:g} Hz"))
    return tuple(found)
