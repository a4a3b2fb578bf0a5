"""Efficiency class: the claimed class, and the site's minimum class."""

from __future__ import annotations

from ..physics.efficiency import class_rank


def check(a) -> None:
    m, site, r = a.machine, a.site, a.rating
    if m.kind != "induction-motor":
        return
    minimum = a.efficiency_class_minimum
    if (m.efficiency_class and minimum is not None and r.efficiency is not None
            and r.efficiency + 1e-9 < minimum):
        a.add("efficiency-below-class", "warning",
              f"plate efficiency {100 * r.efficiency:.1f} % is below the "
              f"{m.efficiency_class} minimum {100 * minimum:.1f} % (IEC 60034-30-1, "
              f"{r.frequency_hz:g} Hz, {a.poles} poles)")
    required = site.min_efficiency_class
    if required is None or m.phases != 3:
        return  # the class tables used here are for three-phase motors
    achieved = a.efficiency_class or m.efficiency_class
    if achieved is None:
        a.add("efficiency-class-unknown", "warning",
              f"the site requires {required}; the plate gives no class or efficiency to confirm it")
    elif class_rank(achieved) < class_rank(required):
        a.add("efficiency-class-required", "problem",
              f"the site requires {required}; this motor is {achieved} (IEC 60034-30-1 at its "
              "rated frequency, as marked)")
    if a.rerated:
        a.add("efficiency-as-marked", "info",
              "efficiency and power factor hold only at the rated V/f: the class is as marked "
              f"at {r.frequency_hz:g} Hz")
