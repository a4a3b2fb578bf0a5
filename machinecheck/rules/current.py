"""Currents: the nameplate cross-check and the code current for conductors."""

from __future__ import annotations

from ..physics.nec import CONDUCTOR_FACTOR

#: Disagreement between nameplate current and the P / (sqrt(3) V eta PF) estimate that is flagged.
NAMEPLATE_TOLERANCE = 0.10


def check(a) -> None:
    if not a.phases_ok or a.machine.is_generator:
        return
    ratio = a.nameplate_formula_ratio
    if ratio is not None and abs(ratio - 1.0) > NAMEPLATE_TOLERANCE:
        a.add("current-mismatch", "warning",
              f"nameplate current {a.connection.current_a:.1f} A is {ratio:.2f} x the "
              "P / (sqrt(3) V eta PF) figure: check the plate data (voltage, power, eta, PF)")
    if a.full_load_current_a is None:
        a.add("current-unknown", "info",
              "no current on the plate and no efficiency and power factor to compute it")
    if a.code_current_a is not None:
        a.add("code-current", "info",
              f"NFPA 70 Table 430.250/430.248 current {a.code_current_a:g} A "
              f"({a.code_current_hp:g} hp) for conductors and short-circuit protection; "
              f"conductors at least {CONDUCTOR_FACTOR * a.code_current_a:.1f} A (430.22). Set "
              "overloads from the nameplate current")
