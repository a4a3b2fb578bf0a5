"""50/60 Hz re-rating: flux, output, speed and service factor on another frequency."""

from __future__ import annotations

from ..engine.assessment import Finding, RatingChoice, Running, Supply
from ..model import Machine
from ..physics.constants import RERATING_RANGE

#: Flux-ratio thresholds (per unit) for a re-rated machine (common practice, no published
#: source; +10 % matches the IEC 60034-1 zone B voltage limit).
OVERFLUX_WARN, OVERFLUX_LIMIT = 1.05, 1.10
UNDERFLUX_WARN, UNDERFLUX_LIMIT = 0.95, 0.80


def check(machine: Machine, choice: RatingChoice, supply: Supply,
          running: Running) -> tuple[Finding, ...]:
    if not supply.phases_ok:
        return ()
    site, rating = supply.site, choice.rating
    ratio = supply.frequency_ratio
    found: list[Finding] = []
    if supply.rerated:
        low, high = RERATING_RANGE
        if not low <= ratio <= high:
            return (Finding("frequency-out-of-range", "problem",
                            f"{site.frequency_hz:g} Hz is {ratio:.2f} x the rated "
                            f"{rating.frequency_hz:g} Hz: too far for a re-rating from the "
                            "plate"),)
        ideal = running.rated_flux_voltage_v
        found.append(Finding(
            "frequency-change", "warning",
            f"rated {rating.frequency_hz:g} Hz, site {site.frequency_hz:g} Hz: re-rated from "
            f"the plate (no rating set for {site.frequency_hz:g} Hz). Flux k = "
            f"{choice.flux_ratio:.3f} ({supply.terminal_voltage_v:.0f} V against the "
            f"{ideal:.0f} V that would keep rated V/f)"))
        found += _flux(machine, choice, running)
        if not machine.is_generator:
            found += _output(machine, supply, running)
        found.append(_reminder(ratio))
    if not machine.is_generator:
        found += _speed(machine, supply, running)
    return tuple(found)


def _flux(machine: Machine, choice: RatingChoice, running: Running) -> list[Finding]:
    k = choice.flux_ratio
    generator = machine.is_generator
    if k > OVERFLUX_LIMIT:
        what = "overexcitation" if generator else "saturation, high magnetising current"
        return [Finding("overflux", "problem",
                        f"overfluxed {100 * (k - 1):+.1f} % (limit +10 %): {what} and "
                        f"overheating. Supply about {running.rated_flux_voltage_v:.0f} V (a "
                        "transformer or a drive), or use a machine rated for the site")]
    if k > OVERFLUX_WARN:
        return [Finding("overflux", "warning",
                        f"overfluxed {100 * (k - 1):+.1f} %: saturation, more magnetising "
                        "current and iron loss, more heating; derated")]
    if k < UNDERFLUX_LIMIT:
        return [Finding("underflux", "problem",
                        f"underfluxed to k = {k:.3f}: breakdown and locked-rotor torque fall to "
                        f"about {running.torque_capability:.2f} of rated; the machine may not "
                        "start or carry its load")]
    if k < UNDERFLUX_WARN and not generator:
        return [Finding("underflux", "warning",
                        f"underfluxed to k = {k:.3f}: breakdown and locked-rotor torque about "
                        f"{running.torque_capability:.2f} of rated (NEMA MG 1 12.44.2, torque ~ "
                        "V^2/f^2); check starting and peak load")]
    return []


def _output(machine: Machine, supply: Supply, running: Running) -> list[Finding]:
    found: list[Finding] = []
    ratio = supply.frequency_ratio
    rated_w = running.rated_power_w
    if running.uprated_power_w is not None and running.uprated_power_w > rated_w * 1.001:
        found.append(Finding(
            "uprating-possible", "info",
            f"at rated V/f the output could rise to about {running.uprated_power_w / 1000:.1f} "
            f"kW (x{ratio:.2f}) only with the manufacturer's confirmation; rated "
            f"{rated_w / 1000:.1f} kW is kept here"))
    cooling = running.derates.factor("cooling")
    if cooling is not None and cooling < 1.0:
        found.append(Finding(
            "cooling-derate", "info",
            f"shaft fan ({machine.cooling}) turns {100 * (1 - ratio):.0f} % slower: cooling "
            f"derate {cooling:.3f} (common practice, no published formula)"))
    return found


def _reminder(ratio: float) -> Finding:
    if ratio < 1.0:
        return Finding("other-equipment", "info",
                       "not checked: 60 Hz transformers, contactor coils and solenoids on the "
                       "skid run overfluxed at 50 Hz; check each item, and any Ex "
                       "certification, with its maker")
    return Finding("other-equipment", "info",
                   "not checked: the driven machine, couplings, belts and electronics at the "
                   "higher speed and frequency; check each item, and any Ex certification, "
                   "with its maker")


def _speed(machine: Machine, supply: Supply, running: Running) -> list[Finding]:
    found: list[Finding] = []
    limits = [(machine.max_speed_rpm, "the machine")]
    if machine.load is not None:
        limits.append((machine.load.max_speed_rpm, "the driven equipment"))
    top = running.synchronous_speed_rpm  # the speed approached at light load
    for limit, what in limits:
        if limit is not None and top > limit * 1.0001:
            found.append(Finding("max-speed-exceeded", "problem",
                                 f"up to {top:.0f} rpm exceeds the {limit:.0f} rpm limit of "
                                 f"{what}"))
    if supply.rerated and supply.frequency_ratio > 1.0:
        found.append(Finding(
            "speed-increase", "warning",
            f"runs {100 * (supply.frequency_ratio - 1):.0f} % faster (up to {top:.0f} rpm): "
            "check bearings, balance, fan, couplings and the driven machine at that speed"))
    op = running.operating
    if op is not None and not op.slip_model_valid and running.expected_speed_rpm is not None:
        found.append(Finding(
            "speed-model-limit", "info",
            "running speed estimated outside the linear slip region (k outside 0.8-1.2 or "
            "load above 1.5 x rated torque): treat it as a rough figure"))
    return found
