"""The driven load at the site: overload, lost head or flow, higher demand."""

from __future__ import annotations

#: Fraction of head or flow that may be lost before the duty is in doubt.
DUTY_LOSS_WARN = 0.10


def check(a) -> None:
    m = a.machine
    if m.load is None or m.is_generator or not a.phases_ok:
        return
    if a.stalled:
        detail = ("" if a.breakdown_torque_nm is None else
                  f" ({a.stall_torque_nm:.0f} N m against a breakdown torque of "
                  f"{a.breakdown_torque_nm:.0f} N m)")
        a.add("load-overload", "problem",
              f"the load needs more torque than the motor can give at this supply{detail}: it "
              "would stall or not reach speed")
        return
    if a.load_fraction is None:
        return
    load_kw = a.load_power_w / 1000.0
    available_kw = a.available_power_w / 1000.0
    if a.load_fraction > 1.0 + 1e-9:
        remedy = ("run it from a drive at the original frequency, trim the impeller (affinity "
                  "laws in diameter) or change the pulley or gear ratio, or fit a larger motor"
                  if m.load.type == "centrifugal" else
                  "change the pulley or gear ratio, run it from a drive, or fit a larger motor")
        a.add("load-overload", "problem",
              f"the load draws {load_kw:.1f} kW, {100 * a.load_fraction:.0f} % of the "
              f"{available_kw:.1f} kW available: {remedy}")
    else:
        a.add("load-fraction", "info",
              f"the load draws {load_kw:.1f} kW, {100 * a.load_fraction:.0f} % of the "
              f"{available_kw:.1f} kW available")
    if a.head_ratio is not None and a.head_ratio < 1.0 - DUTY_LOSS_WARN:
        a.add("duty-shortfall", "warning",
              f"at {a.load_speed_ratio:.3f} x speed the pump or fan gives {a.flow_ratio:.3f} x "
              f"flow and {a.head_ratio:.3f} x head (affinity laws): the process duty may not be "
              "met. Remedies: a drive at the original frequency, a larger impeller, or a belt "
              "or gear change")
    elif a.flow_ratio is not None and a.flow_ratio < 1.0 - DUTY_LOSS_WARN:
        a.add("duty-shortfall", "warning",
              f"throughput falls to {a.flow_ratio:.3f} x at the lower speed: check the process")
    if a.load_speed_ratio is not None and a.load_speed_ratio > 1.02 and a.head_ratio:
        a.add("load-increase", "info",
              f"at {a.load_speed_ratio:.3f} x speed: flow x{a.flow_ratio:.3f}, head "
              f"x{a.head_ratio:.3f}, power x{a.load_speed_ratio ** 3:.3f} (affinity laws)")
