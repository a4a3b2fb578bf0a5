"""Currents: the nameplate cross-check and the code current for conductors."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine

#: Disagreement between nameplate current and the P / (sqrt(3) V eta PF) figure that is flagged
#: (common practice, no published source).
NAMEPLATE_TOLERANCE = 0.10


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    if not supply.phases_ok or machine.is_generator:
        return ()
    found: list[Finding] = []
    currents = running.currents
    ratio = currents.nameplate_formula_ratio
    if ratio is not None and abs(ratio - 1.0) > NAMEPLATE_TOLERANCE:
        found.append(Finding(
            "current-mismatch", "warning",
            f"nameplate current {choice.connection.current_a:.1f} A is {ratio:.2f} x the "
            "P / (sqrt(3) V eta PF) figure: check the plate data (voltage, power, eta, PF)"))
    if currents.full_load_a is None:
        found.append(Finding(
            "current-unknown", "info",
            "no current on the plate and no efficiency and power factor to compute it"))
    if currents.code_a is not None and currents.code_hp is not None:
        found.append(Finding(
            "code-current", "info",
            f"code current {currents.code_a:g} A ({currents.code_hp:g} hp; "
            f"{currents.code_rule}) for conductors and short-circuit protection; "
            f"conductors at least {currents.conductor_a:.1f} A (430.22). Set "
            "overloads from the nameplate current"))
    elif currents.code_rule is not None:
        found.append(Finding(
            "code-current", "info",
            f"{currents.code_rule}: size conductors and short-circuit protection, and set "
            "overloads, from the nameplate current"))
    return tuple(found)
