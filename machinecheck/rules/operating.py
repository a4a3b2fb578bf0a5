"""The equivalent-circuit operating point: margin to breakdown, limits of the estimate."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine

#: Breakdown torque over load torque below which a stall on a voltage dip is a real risk. A
#: NEMA design B motor at rated load keeps about 1.6 at -10 % voltage (200 % breakdown x 0.81);
#: the threshold sits just below that (common practice, no published source).
BREAKDOWN_MARGIN_WARN = 1.5
#: Flux ratio above which the unsaturated circuit understates the magnetising current.
SATURATION_FLUX = 1.05


def torque_pair(smaller_nm: float, larger_nm: float) -> tuple[str, str]:
    """Two torques shown with the decimals needed for the smaller to read smaller (never
    "14 N m below 14 N m")."""
    digits = 0
    while digits < 3 and f"{smaller_nm:.{digits}f}" == f"{larger_nm:.{digits}f}":
        digits += 1
    return f"{smaller_nm:.{digits}f}", f"{larger_nm:.{digits}f}"


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    op = running.operating
    if machine.is_generator or not supply.phases_ok or op is None:
        return ()
    if op.circuit_unavailable is not None:
        return (Finding("circuit-unavailable", "info",
                        f"no equivalent-circuit estimate ({op.circuit_unavailable}): speed and "
                        "current come from the nameplate rules"),)
    if op.circuit is None:
        return ()
    if op.stalled:
        if machine.load is None:
            assert op.breakdown_torque_nm is not None and op.stall_torque_nm is not None
            low, high = torque_pair(op.breakdown_torque_nm, op.stall_torque_nm)
            return (Finding("motor-stall", "problem",
                            f"at this supply the breakdown torque ({low} N m) is below the "
                            f"full-load torque ({high} N m): loaded to its rating the motor "
                            f"would stall or not reach speed (breakdown torque: "
                            f"{op.breakdown_basis})"),)
        return ()
    found: list[Finding] = []
    if op.breakdown_margin is not None and op.breakdown_margin < BREAKDOWN_MARGIN_WARN:
        found.append(Finding(
            "breakdown-margin", "warning",
            f"breakdown torque is only {op.breakdown_margin:.2f} x the load torque at this "
            "supply: a voltage dip or load swing may stall the motor (breakdown torque: "
            f"{op.breakdown_basis})"))
    load_a = running.currents.load_a
    if choice.flux_ratio > SATURATION_FLUX and load_a is not None:
        found.append(Finding(
            "circuit-saturation", "info",
            f"at {choice.flux_ratio:.2f} x rated V/f the iron saturates; the circuit leaves "
            "this out, so the no-load and operating currents will be higher than the "
            f"{load_a:.1f} A shown"))
    return tuple(found)
