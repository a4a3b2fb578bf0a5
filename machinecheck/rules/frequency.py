"""50/60 Hz re-rating: flux, output, speed and service factor on another frequency."""

from __future__ import annotations

from ..engine.check import RERATING_RANGE

#: Flux-ratio thresholds (per unit) for a re-rated machine.
OVERFLUX_WARN, OVERFLUX_LIMIT = 1.05, 1.10
UNDERFLUX_WARN, UNDERFLUX_LIMIT = 0.95, 0.80


def check(a) -> None:
    m, site, r = a.machine, a.site, a.rating
    if not a.phases_ok:
        return
    low, high = RERATING_RANGE
    if a.rerated:
        if not low <= a.frequency_ratio <= high:
            a.add("frequency-out-of-range", "problem",
                  f"{site.frequency_hz:g} Hz is {a.frequency_ratio:.2f} x the rated "
                  f"{r.frequency_hz:g} Hz: too far for a re-rating from the plate")
            return
        ideal = a.rated_voltage_v * a.frequency_ratio
        a.add("frequency-change", "warning",
              f"rated {r.frequency_hz:g} Hz, site {site.frequency_hz:g} Hz: re-rated from the "
              f"plate (no rating set for {site.frequency_hz:g} Hz). Flux k = {a.flux_ratio:.3f} "
              f"({a.supply_voltage_v:.0f} V against the {ideal:.0f} V that would keep rated V/f)")
        _flux(a, ideal)
        if not m.is_generator:
            _output(a)
        _reminders(a)
    if not m.is_generator:
        _speed(a)


def _flux(a, ideal) -> None:
    k = a.flux_ratio
    generator = a.machine.is_generator
    if k > OVERFLUX_LIMIT:
        what = "overexcitation" if generator else "saturation, high magnetising current"
        a.add("overflux", "problem",
              f"overfluxed {100 * (k - 1):+.1f} % (limit +10 %): {what} and overheating. Supply "
              f"about {ideal:.0f} V (a transformer or a drive), or use a machine rated for the site")
    elif k > OVERFLUX_WARN:
        a.add("overflux", "warning",
              f"overfluxed {100 * (k - 1):+.1f} %: saturation, more magnetising current and iron "
              "loss, more heating; derated")
    elif k < UNDERFLUX_LIMIT:
        a.add("underflux", "problem",
              f"underfluxed to k = {k:.3f}: breakdown and locked-rotor torque fall to about "
              f"{k * k:.2f} of rated; the machine may not start or carry its load")
    elif k < UNDERFLUX_WARN and not generator:
        a.add("underflux", "warning",
              f"underfluxed to k = {k:.3f}: breakdown and locked-rotor torque about {k * k:.2f} "
              "of rated (NEMA MG 1 12.44.2, torque ~ V^2/f^2); check starting and peak load")


def _output(a) -> None:
    f = a.factors
    if a.frequency_ratio > 1.0:
        possible = a.rated_power_w * min(a.frequency_ratio * min(1.0, a.flux_ratio),
                                         a.frequency_ratio)
        if possible > a.rated_power_w * 1.001:
            a.add("uprating-possible", "info",
                  f"at rated V/f the output could rise to about {possible / 1000:.1f} kW "
                  f"(x{a.frequency_ratio:.2f}) only with the manufacturer's confirmation; rated "
                  f"{a.rated_power_w / 1000:.1f} kW is kept here")
    if f.get("cooling", 1.0) < 1.0:
        a.add("cooling-derate", "info",
              f"shaft fan ({a.machine.cooling}) turns {100 * (1 - a.frequency_ratio):.0f} % slower:"
              f" cooling derate {f['cooling']:.3f} (common practice, no published formula)")


def _reminders(a) -> None:
    if a.frequency_ratio < 1.0:
        a.add("other-equipment", "info",
              "not checked: 60 Hz transformers, contactor coils and solenoids on the skid run "
              "overfluxed at 50 Hz; check each item, and any Ex certification, with its maker")
    else:
        a.add("other-equipment", "info",
              "not checked: the driven machine, couplings, belts and electronics at the higher "
              "speed and frequency; check each item, and any Ex certification, with its maker")


def _speed(a) -> None:
    m = a.machine
    limits = [(m.max_speed_rpm, "the machine")]
    if m.load is not None:
        limits.append((m.load.max_speed_rpm, "the driven equipment"))
    top = a.synchronous_speed_rpm  # the speed approached at light load
    for limit, what in limits:
        if limit is not None and top > limit * 1.0001:
            a.add("max-speed-exceeded", "problem",
                  f"up to {top:.0f} rpm exceeds the {limit:.0f} rpm limit of {what}")
    if a.rerated and a.frequency_ratio > 1.0:
        a.add("speed-increase", "warning",
              f"runs {100 * (a.frequency_ratio - 1):.0f} % faster (up to {top:.0f} rpm): check "
              "bearings, balance, fan, couplings and the driven machine at that speed")
    if not a.slip_model_valid and a.expected_speed_rpm is not None:
        a.add("speed-model-limit", "info",
              "running speed estimated outside the linear slip region (k outside 0.8-1.2 or "
              "load above 1.5 x rated torque): treat it as a rough figure")
