"""Acceleration time of a motor and its load: t = integral of J d(omega) / (T_motor - T_load).

Torque curves are callables from shaft speed [rad/s] to torque [N m]: the motor's from the
equivalent circuit (:mod:`.circuit`) or from datasheet points, the load's from its type or
points. The time is integrated over speed by adaptive Simpson quadrature; the speed range is
first swept for a point where the accelerating torque is not positive (the drive stalls there
and never reaches the end speed).
"""

from __future__ import annotations

import bisect
import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass

from ..errors import DomainError
from .circuit import Circuit, operating_point

TorqueCurve = Callable[[float], float]

#: Speed points swept for a stall before integrating [-]: a dip of the accelerating torque
#: narrower than 1/400 of the speed range can escape the sweep.
STALL_SWEEP_POINTS = 400


@dataclass(frozen=True, slots=True)
class Acceleration:
    """Result of :func:`acceleration_time`: time [s] (inf when it stalls), the speed at which
    the accelerating torque first fails [rad/s] or None, and the end speed [rad/s]."""

    time_s: float
    stall_speed_rad_s: float | None
    end_speed_rad_s: float


def _simpson(f: Callable[[float], float], a: float, b: float, fa: float, fm: float, fb: float,
             whole: float, tolerance: float, depth: int) -> float:
    m = 0.5 * (a + b)
    lm, rm = 0.5 * (a + m), 0.5 * (m + b)
    flm, frm = f(lm), f(rm)
    left = (m - a) / 6.0 * (fa + 4.0 * flm + fm)
    right = (b - m) / 6.0 * (fm + 4.0 * frm + fb)
    if depth <= 0 or abs(left + right - whole) <= 15.0 * tolerance:
        return left + right + (left + right - whole) / 15.0
    return (_simpson(f, a, m, fa, flm, fm, left, 0.5 * tolerance, depth - 1)
            + _simpson(f, m, b, fm, frm, fb, right, 0.5 * tolerance, depth - 1))


def acceleration_time(inertia_kgm2: float, motor_torque: TorqueCurve, load_torque: TorqueCurve,
                      end_speed_rad_s: float, start_speed_rad_s: float = 0.0, *,
                      relative_tolerance: float = 1e-7) -> Acceleration:
    """Time to accelerate from ``start_speed_rad_s`` to ``end_speed_rad_s`` [s].

    t = integral_{w0}^{w1} J / (T_m(w) - T_L(w)) dw, from J dw/dt = T_m - T_L.

    Parameters
    ----------
    inertia_kgm2 : total inertia on the motor shaft, motor plus load referred to it [kg m2]
    motor_torque : motor torque curve, speed [rad/s] -> [N m] (at the voltage of the start)
    load_torque : load torque curve, speed [rad/s] -> [N m] (plus friction if wanted)
    end_speed_rad_s : speed at which the start is taken as done [rad/s]; it must lie below the
        speed where the two curves meet (there the time grows without bound): common practice
        takes 95-98 % of the operating speed, or the speed of the motor's rated point
    start_speed_rad_s : initial speed [rad/s]
    relative_tolerance : quadrature tolerance relative to a first estimate [-]

    Returns
    -------
    Acceleration : time inf and the stall speed when T_m - T_L <= 0 somewhere on the way

    References
    ----------
    .. [1] IEEE Std 3002.7-2018, Recommended Practice for Conducting Motor-Starting Studies in
       Industrial and Commercial Power Systems: acceleration time from the accelerating torque
       and the inertia.
    .. [2] A. E. Fitzgerald, C. Kingsley, S. D. Umans, *Electric Machinery*, 6th ed., ch. 6
       (J dw/dt = T_mech - T_load).
    """
    if not inertia_kgm2 > 0:
        raise DomainError(f"inertia must be positive, got {inertia_kgm2!r}")
    if not 0.0 <= start_speed_rad_s < end_speed_rad_s:
        raise DomainError("end speed must be above the start speed, both not negative")

    def net(w: float) -> float:
        return motor_torque(w) - load_torque(w)

    span = end_speed_rad_s - start_speed_rad_s
    previous_w, previous_net = start_speed_rad_s, net(start_speed_rad_s)
    if previous_net <= 0.0:
        return Acceleration(math.inf, start_speed_rad_s, end_speed_rad_s)
    for i in range(1, STALL_SWEEP_POINTS + 1):
        w = start_speed_rad_s + span * i / STALL_SWEEP_POINTS
        value = net(w)
        if value <= 0.0:  # linear estimate of the crossing
            stall = previous_w + (w - previous_w) * previous_net / (previous_net - value)
            return Acceleration(math.inf, stall, end_speed_rad_s)
        previous_w, previous_net = w, value

    def integrand(w: float) -> float:
        return inertia_kgm2 / net(w)

    fa, fb = integrand(start_speed_rad_s), integrand(end_speed_rad_s)
    mid = 0.5 * (start_speed_rad_s + end_speed_rad_s)
    fm = integrand(mid)
    whole = span / 6.0 * (fa + 4.0 * fm + fb)
    time = _simpson(integrand, start_speed_rad_s, end_speed_rad_s, fa, fm, fb, whole,
                    relative_tolerance * abs(whole), 40)
    return Acceleration(time, None, end_speed_rad_s)


def curve_from_points(points: Sequence[tuple[float, float]]) -> TorqueCurve:
    """Torque curve through datasheet points, linear between them.

    Parameters
    ----------
    points : (speed [rad/s], torque [N m]) pairs, speeds strictly increasing; e.g. locked
        rotor at 0, pull-up, breakdown, rated, and zero at synchronous speed

    Returns
    -------
    callable : speed -> torque; DomainError outside the points' speed range

    References
    ----------
    .. [1] IEEE Std 3002.7-2018: motor and load torque curves given as points (common practice
       of motor-starting studies).
    """
    if len(points) < 2:
        raise DomainError("a torque curve needs at least two points")
    speeds = [float(s) for s, _ in points]
    torques = [float(t) for _, t in points]
    if any(b <= a for a, b in zip(speeds, speeds[1:])):
        raise DomainError("torque curve speeds must increase strictly")
    low, high = speeds[0], speeds[-1]

    def curve(w: float) -> float:
        if not low <= w <= high:
            raise DomainError(f"speed {w:.4g} rad/s is outside the torque curve's points "
                              f"({low:.4g} to {high:.4g} rad/s)")
        i = min(max(bisect.bisect_right(speeds, w) - 1, 0), len(speeds) - 2)
        share = (w - speeds[i]) / (speeds[i + 1] - speeds[i])
        return torques[i] + share * (torques[i + 1] - torques[i])

    return curve


def circuit_curve(c: Circuit, voltage_v: float, frequency_hz: float) -> TorqueCurve:
    """Induced (air-gap) torque of the equivalent circuit against shaft speed [N m].

    T_ind(s) from the T-circuit at slip s = 1 - w / w_sync (Chapman sec. 7.5); zero at and
    above synchronous speed. The rotational loss is left to the load side.

    Parameters
    ----------
    c : equivalent circuit (:func:`.circuit.estimate` or given)
    voltage_v : line-to-line voltage at the terminals during the start [V]
    frequency_hz : supply frequency [Hz]

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, 4th ed., sec. 7.5 and Example 7-5.
    """
    if not (voltage_v > 0 and frequency_hz > 0):
        raise DomainError("voltage and frequency must be positive")
    w_sync = 4.0 * math.pi * frequency_hz / c.poles

    def curve(w: float) -> float:
        slip = 1.0 - w / w_sync
        if slip <= 0.0:
            return 0.0
        return operating_point(c, voltage_v, frequency_hz, min(slip, 1.0),
                               rotational_loss_w=0.0).induced_torque_nm

    return curve


def scaled_curve(curve: TorqueCurve, factor: float) -> TorqueCurve:
    """A torque curve times a constant, e.g. (U / U_r)^2 at a dipped voltage or a starting
    method's torque factor [-]."""
    if not factor >= 0:
        raise DomainError(f"factor must not be negative, got {factor!r}")
    return lambda w: factor * curve(w)


def centrifugal_load(rated_torque_nm: float, rated_speed_rad_s: float,
                     breakaway_torque_nm: float = 0.0) -> TorqueCurve:
    """Fan or pump torque: T = T_0 + (T_r - T_0) (w / w_r)^2 [N m].

    Parameters
    ----------
    rated_torque_nm : load torque at ``rated_speed_rad_s`` [N m]
    rated_speed_rad_s : reference speed [rad/s]
    breakaway_torque_nm : torque at standstill T_0 [N m] (friction, seal drag)

    References
    ----------
    .. [1] Affinity laws (torque ~ speed squared), e.g. Karassik et al., *Pump Handbook*,
       ch. 2; the standstill term: IEEE Std 3002.7-2018 load models (common practice).
    """
    if not (rated_torque_nm >= 0 and rated_speed_rad_s > 0 and breakaway_torque_nm >= 0):
        raise DomainError("load torques must not be negative and the speed must be positive")
    k = (rated_torque_nm - breakaway_torque_nm) / (rated_speed_rad_s * rated_speed_rad_s)
    return lambda w: breakaway_torque_nm + k * w * w


def constant_load(torque_nm: float) -> TorqueCurve:
    """Constant-torque load (conveyor, positive-displacement pump) [N m]."""
    if not torque_nm >= 0:
        raise DomainError(f"load torque must not be negative, got {torque_nm!r}")
    return lambda w: torque_nm
