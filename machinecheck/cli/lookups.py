"""Plant-floor lookups (speed, poles, current): option texts in, report lines out.

The line builders take the options' texts and return the lines; the click commands below print
them. Heavy modules (pint through the unit parser, physics) are imported on use, so a lookup
starts fast.
"""

from __future__ import annotations

from typing import Any

import click

from ..errors import InputError, MachinecheckError
from .output import write_stdout


def _number_or_text(text: Any) -> Any:
    try:
        return float(text)
    except (TypeError, ValueError):
        return text


def _value(text: Any, kind: str, option: str) -> float:
    from ..inputs import units

    try:
        return float(units.parse(_number_or_text(text), kind))
    except InputError as exc:
        raise InputError(exc.message, key=option) from None


def speed_lines(poles: int | None = None, frequency: str | None = None,
                rated_speed: str | None = None, rated_frequency: str | None = None) -> list[str]:
    """Synchronous speed, and the slip-adjusted speed at a new frequency."""
    from ..physics import speed as sp

    f = _value(frequency, "frequency", "--frequency")
    f_rated = _value(rated_frequency, "frequency", "--rated-frequency") if rated_frequency else f
    n_rated = _value(rated_speed, "speed", "--rated-speed") if rated_speed else None
    if poles is None:
        if n_rated is None:
            raise InputError("give --poles, or --rated-speed to infer them", key="--poles")
        try:
            poles = sp.poles_from_speed(n_rated, f_rated)
        except MachinecheckError as exc:
            raise InputError(str(exc), key="--rated-speed") from None
    try:
        n_s = sp.synchronous_speed(f, poles)
    except MachinecheckError as exc:
        raise InputError(str(exc), key="--poles") from None
    lines = [f"synchronous speed {n_s:.0f} rpm  ({poles} poles at {f:g} Hz: 120 x {f:g} / {poles})"]
    if n_rated is not None:
        n_s_rated = sp.synchronous_speed(f_rated, poles)
        slip_rpm = n_s_rated - n_rated
        if slip_rpm <= 0:
            raise InputError(f"rated speed {n_rated:g} rpm is not below synchronous "
                             f"{n_s_rated:g} rpm", key="--rated-speed")
        n = sp.running_speed(n_s, slip_rpm)
        lines.append(f"running speed     {n:.0f} rpm ±{0.2 * slip_rpm:.0f}  (rated torque, "
                     f"constant V/f: slip {slip_rpm:.0f} rpm kept; {100 * slip_rpm / n_s:.1f} % "
                     f"at {f:g} Hz)")
    return lines


def poles_lines(speed_text: str, frequency: str) -> list[str]:
    """Pole count, synchronous speed and slip from a nameplate speed."""
    from ..physics import speed as sp

    n = _value(speed_text, "speed", "--speed")
    f = _value(frequency, "frequency", "--frequency")
    try:
        p = sp.poles_from_speed(n, f)
    except MachinecheckError as exc:
        raise InputError(str(exc), key="--speed") from None
    n_s = sp.synchronous_speed(f, p)
    return [f"{p} poles  (synchronous {n_s:.0f} rpm at {f:g} Hz; slip {n_s - n:.0f} rpm = "
            f"{100 * sp.slip(n_s, n):.1f} %)"]


def current_lines(power: str, voltage: str, phases: str = "3", efficiency: str | None = None,
                  power_factor: str | None = None) -> list[str]:
    """Full-load current from output, voltage, efficiency and power factor."""
    from ..physics import current as cp

    volts = _value(voltage, "voltage", "--voltage")
    phase_count = int(phases)
    root = "sqrt(3) x " if phase_count == 3 else ""
    if isinstance(_number_or_text(power), str) and power.strip().lower().endswith("va"):
        apparent = _value(power, "apparent_power", "--power")
        amps = cp.apparent_power_current(apparent, volts, phase_count)
        return [f"{amps:.1f} A  (S / ({root}V) = {apparent:.0f} / ({root}{volts:g}))"]
    watts = _value(power, "power", "--power")
    missing = [name for name, v in (("--efficiency", efficiency),
                                    ("--power-factor", power_factor)) if v is None]
    if missing:
        raise InputError(f"give {' and '.join(missing)} from the nameplate (the current of a "
                         "shaft output depends on them)", key=missing[0])
    eta = _value(efficiency, "fraction", "--efficiency")
    pf = _value(power_factor, "fraction", "--power-factor")
    try:
        amps = cp.full_load_current(watts, volts, eta, pf, phase_count)
    except MachinecheckError as exc:
        raise InputError(str(exc), key="--efficiency") from None
    return [f"{amps:.1f} A  (P / ({root}V x eta x PF) = {watts:.0f} / ({root}{volts:g} x "
            f"{eta:g} x {pf:g}); {phase_count}-phase)"]


def _print(lines: list[str]) -> None:
    write_stdout([line + "\n" for line in lines])


@click.command()
@click.option("--poles", type=int, help="number of poles (or give --rated-speed)")
@click.option("--frequency", required=True, help="supply frequency, e.g. 50 or '50 Hz'")
@click.option("--rated-speed", "rated_speed", help="nameplate speed, e.g. '1175 rpm'")
@click.option("--rated-frequency", "rated_frequency", help="frequency of the nameplate speed")
def speed(poles: int | None, frequency: str, rated_speed: str | None,
          rated_frequency: str | None) -> None:
    """Synchronous speed, and the slip-adjusted speed at a new frequency."""
    _print(speed_lines(poles, frequency, rated_speed, rated_frequency))


@click.command()
@click.option("--speed", "speed_text", required=True, help="nameplate speed, e.g. '1460 rpm'")
@click.option("--frequency", required=True, help="rated frequency, e.g. '50 Hz'")
def poles(speed_text: str, frequency: str) -> None:
    """Pole count, synchronous speed and slip from a nameplate speed."""
    _print(poles_lines(speed_text, frequency))


@click.command()
@click.option("--power", required=True, help="rated output, e.g. '22 kW', '30 hp', or '500 kVA'")
@click.option("--voltage", required=True, help="line-to-line voltage, e.g. '400 V'")
@click.option("--phases", type=click.Choice(["1", "3"]), default="3", show_default=True)
@click.option("--efficiency", help="full-load efficiency, e.g. 0.92 or '92 %'")
@click.option("--power-factor", "power_factor", help="full-load power factor, e.g. 0.85")
def current(power: str, voltage: str, phases: str, efficiency: str | None,
            power_factor: str | None) -> None:
    """Full-load current from output, voltage, efficiency and power factor."""
    _print(current_lines(power, voltage, phases, efficiency, power_factor))
