"""Plant-floor lookups (speed, poles, current): option texts in, report lines out.

Kept free of click so that :mod:`machinecheck.entry` can answer a plain lookup without
importing the command-line framework; the click commands in :mod:`machinecheck.cli` call the
same functions, so both give the same lines.
"""

from __future__ import annotations

from ..errors import InputError, MachinecheckError


def _number_or_text(text):
    try:
        return float(text)
    except (TypeError, ValueError):
        return text


def _value(text, kind, option):
    from ..inputs import units

    try:
        return units.parse(_number_or_text(text), kind)
    except InputError as exc:
        raise InputError(exc.message, key=option) from None


def speed_lines(poles=None, frequency=None, rated_speed=None, rated_frequency=None) -> list[str]:
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


def poles_lines(speed_text, frequency) -> list[str]:
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


def current_lines(power, voltage, phases="3", efficiency=None, power_factor=None) -> list[str]:
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
