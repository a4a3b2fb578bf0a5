"""The equivalent-circuit operating point: margin to breakdown, limits of the estimate."""

from __future__ import annotations

#: Breakdown torque over load torque below which a stall on a voltage dip is a real risk. A
#: NEMA design B motor at rated load keeps about 1.6 at -10 % voltage (200 % breakdown x 0.81);
#: the threshold sits just below that (common practice, no published source).
BREAKDOWN_MARGIN_WARN = 1.5
#: Flux ratio above which the unsaturated circuit understates the magnetising current.
SATURATION_FLUX = 1.05


def check(a) -> None:
    m = a.machine
    if m.is_generator or not a.phases_ok:
        return
    if a.circuit_unavailable is not None:
        a.add("circuit-unavailable", "info",
              f"no equivalent-circuit estimate ({a.circuit_unavailable}): speed and current "
              "come from the nameplate rules")
        return
    if a.circuit is None:
        return
    if a.stalled:
        if m.load is None:
            a.add("motor-stall", "problem",
                  f"at this supply the breakdown torque ({a.breakdown_torque_nm:.0f} N m) is below "
                  f"the full-load torque ({a.stall_torque_nm:.0f} N m): loaded to its rating the "
                  "motor would stall or not reach speed")
        return
    if a.breakdown_margin is not None and a.breakdown_margin < BREAKDOWN_MARGIN_WARN:
        a.add("breakdown-margin", "warning",
              f"breakdown torque is only {a.breakdown_margin:.2f} x the load torque at this "
              "supply: a voltage dip or load swing may stall the motor (estimated from a "
              "typical breakdown torque for the design; ask the maker for the torque curve)")
    if a.flux_ratio > SATURATION_FLUX and a.operating_current_a is not None:
        a.add("circuit-saturation", "info",
              f"at {a.flux_ratio:.2f} x rated V/f the iron saturates; the circuit leaves this "
              "out, so the no-load and operating currents will be higher than the "
              f"{a.operating_current_a:.1f} A shown")
