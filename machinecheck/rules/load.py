"""The driven load at the site: overload, lost head or flow, higher demand."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine
from .operating import torque_pair

#: Fraction of head or flow that may be lost before the duty is in doubt (common practice, no
#: published source).
DUTY_LOSS_WARN = 0.10
#: Speed ratio above which a pump or fan's higher demand is noted.
SPEED_RISE_NOTE = 1.02


def percent_text(share: float) -> str:
    """A share as a percentage with the decimals needed for the sentence to hold: a share
    just above or below a whole 100 % (or 0 %) is never shown as exactly that."""
    digits = 0
    while digits < 3 and share != 0.0 and round(100 * share, digits) in (0.0, 100.0) \
            and abs(100 * share - round(100 * share)) > 1e-9:
        digits += 1
    return f"{100 * share:.{digits}f} %"


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    if machine.load is None or machine.is_generator or not supply.phases_ok:
        return ()
    op = running.operating
    if op is not None and op.stalled:
        detail = ""
        if op.breakdown_torque_nm is not None and op.stall_torque_nm is not None:
            breakdown, needed = torque_pair(op.breakdown_torque_nm, op.stall_torque_nm)
            detail = (f" ({needed} N m against a breakdown torque of {breakdown} N m; "
                      f"{op.breakdown_basis})")
        return (Finding("load-overload", "problem",
                        f"the load needs more torque than the motor can give at this supply"
                        f"{detail}: it would stall or not reach speed"),)
    load = running.load
    if load is None or load.fraction is None or running.available_power_w is None:
        return ()
    found: list[Finding] = []
    demand_kw = load.demand_w / 1000.0
    available_kw = running.available_power_w / 1000.0
    share = percent_text(load.fraction)
    needs = (f"the load needs {demand_kw:.2f} kW at {load.demand_speed_rpm:.0f} rpm, {share} "
             f"of the {available_kw:.2f} kW available at this site")
    if load.fraction > 1.0 + 1e-9:
        remedy = ("run it from a drive at the original frequency, trim the impeller (affinity "
                  "laws in diameter) or change the pulley or gear ratio, or fit a larger motor"
                  if machine.load.type == "centrifugal" else
                  "change the pulley or gear ratio, run it from a drive, or fit a larger motor")
        found.append(Finding("load-overload", "problem",
                             f"{needs}: overloaded by {percent_text(load.fraction - 1.0)}; "
                             f"{remedy}"))
    else:
        found.append(Finding("load-fraction", "info",
                             f"{needs}: {percent_text(1.0 - load.fraction)} margin left"))
    if load.head_ratio is not None and load.head_ratio < 1.0 - DUTY_LOSS_WARN:
        found.append(Finding(
            "duty-shortfall", "warning",
            f"at {load.speed_ratio:.3f} x speed the pump or fan gives {load.flow_ratio:.3f} x "
            f"flow and {load.head_ratio:.3f} x head (affinity laws): the process duty may not "
            "be met. Remedies: a drive at the original frequency, a larger impeller, or a belt "
            "or gear change"))
    elif load.flow_ratio is not None and load.flow_ratio < 1.0 - DUTY_LOSS_WARN:
        found.append(Finding(
            "duty-shortfall", "warning",
            f"throughput falls to {load.flow_ratio:.3f} x at the lower speed: check the process"))
    if load.speed_ratio > SPEED_RISE_NOTE and load.head_ratio:
        found.append(Finding(
            "load-increase", "info",
            f"at {load.speed_ratio:.3f} x speed: flow x{load.flow_ratio:.3f}, head "
            f"x{load.head_ratio:.3f}, power x{load.power_ratio:.3f} "
            "(affinity laws)"))
    return tuple(found)
