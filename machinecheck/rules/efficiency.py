"""Efficiency class: the marked class, the class the plate efficiency reaches, and the site's
minimum class.

The class marked on the plate is the motor's class. The class the plate efficiency reaches in
the IEC 60034-30-1 tables is a separate figure: where it disagrees with the marking it is a
finding of its own, worded as computed; where the tables carry no value for the rating, the
class cannot be confirmed from them (no warning is made of a missing value).
"""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine
from ..physics.efficiency import class_rank, meets_class, minimum_efficiency


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    if machine.kind != "induction-motor":
        return ()
    r = choice.rating
    found: list[Finding] = []
    where = f"IEC 60034-30-1, {r.frequency_hz:g} Hz, {choice.poles} poles"
    check = running.efficiency_check
    marked = machine.efficiency_class
    if check is not None and marked is not None and r.efficiency is not None:
        eff = f"plate efficiency {100 * r.efficiency:.1f} %"
        if check.meets_marked is False:
            found.append(Finding(
                "efficiency-below-class", "warning",
                f"{eff} is below the {marked} minimum "
                f"{100 * check.marked_minimum:.1f} % ({where}); the plate is marked {marked}"))
        elif check.meets_marked is None:
            found.append(Finding(
                "efficiency-class-unconfirmed", "info",
                f"marked {marked}: the class cannot be confirmed from the table (no {marked} "
                f"value carried for this rating, {where})"))
        if (check.meets_marked is not False and check.at_least is not None
                and class_rank(check.at_least) > class_rank(marked)):
            found.append(Finding(
                "efficiency-class-computed", "info",
                f"{eff} reaches {check.at_least} ({where}); the plate is marked {marked}, "
                "which stays its class"))
    required = supply.site.min_efficiency_class
    if required is None or machine.phases != 3:
        return tuple(found)  # the class tables used here are for three-phase motors
    found += _required(machine, choice, required, where)
    if supply.rerated:
        found.append(Finding(
            "efficiency-as-marked", "info",
            "efficiency and power factor hold only at the rated V/f: the class is judged at "
            f"{r.frequency_hz:g} Hz"))
    return tuple(found)


def _required(machine: Machine, choice: RatingChoice, required: str,
              where: str) -> list[Finding]:
    """The site's minimum class: judged on the marked class when there is one, else on the
    plate efficiency against the required class's minimum."""
    r = choice.rating
    marked = machine.efficiency_class
    if marked is not None:
        if class_rank(marked) < class_rank(required):
            return [Finding("efficiency-class-required", "problem",
                            f"the site requires {required}; this motor is marked {marked}")]
        return []
    if r.efficiency is None or not r.power_w:
        return [Finding("efficiency-class-unknown", "warning",
                        f"the site requires {required}; the plate gives no class or "
                        "efficiency to confirm it")]
    meets = meets_class(r.efficiency, required, r.power_w, choice.poles, r.frequency_hz)
    eff = f"plate efficiency {100 * r.efficiency:.1f} % (no class marked)"
    if meets is None:
        # a value the table does not carry is no fault of the motor: said, not warned
        return [Finding("efficiency-class-unconfirmed", "info",
                        f"the site requires {required}; {eff}: the class cannot be confirmed "
                        f"from the table, which carries no {required} value for this rating "
                        f"({where}); confirm it from the maker's declaration")]
    if not meets:
        minimum = minimum_efficiency(required, r.power_w, choice.poles, r.frequency_hz)
        return [Finding("efficiency-class-required", "problem",
                        f"the site requires {required}; {eff} is below the {required} "
                        f"minimum {100 * minimum:.1f} % ({where})")]
    return []
