"""Restoring the driven load after a 50 <-> 60 Hz move: pulley ratio and impeller trim.

After a frequency change the motor turns 5/6 or 6/5 as fast. A belt drive can restore the
load's speed by changing the pulley ratio (or a gearbox its ratio); the load then asks the same
power as before, while the motor may keep less (a 60 Hz motor on 50 Hz at V/f held gives about
5/6 of its output). A centrifugal pump moved to the faster supply can instead have its impeller
trimmed so that its power stays within the motor's output; the affinity laws in diameter then
give the flow and head left.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..errors import DomainError
from .loads import affinity

#: Trim beyond which the affinity laws in diameter are no longer a fair estimate and the pump
#: maker must be asked: diameters below about 0.85 of the original (common practice; pump
#: handbooks describe the diameter laws as approximate for small trims).
TRIM_LIMIT = 0.85


def _positive(name: str, value: float) -> None:
    if not (value > 0 and math.isfinite(value)):
        raise DomainError(f"{name} must be positive, got {value!r}")


def motor_pulley_factor(old_motor_speed_rpm: float, new_motor_speed_rpm: float) -> float:
    """Factor on the motor pulley diameter that keeps the load's speed [-].

    Belt speed is n D, so the load keeps its speed when D_new / D_old = n_old / n_new
    (equivalently the driven pulley x n_new / n_old, or a gear ratio changed by the same
    factor). 60 -> 50 Hz: about 1.2; 50 -> 60 Hz: about 5/6. Use the loaded speeds (slip
    included) where they are known.

    Parameters
    ----------
    old_motor_speed_rpm : motor speed on the old supply [rpm]
    new_motor_speed_rpm : motor speed on the new supply [rpm]

    References
    ----------
    .. [1] Belt drive kinematics, e.g. Shigley's *Mechanical Engineering Design*, ch. 17
       (speed ratio = pulley diameter ratio).
    """
    _positive("old motor speed", old_motor_speed_rpm)
    _positive("new motor speed", new_motor_speed_rpm)
    return old_motor_speed_rpm / new_motor_speed_rpm


def restored_loading(load_power_w: float, rated_output_w: float, output_factor: float) -> float:
    """Motor loading once the load's speed is restored, P_load / (P_rated x factor) [-].

    With the speed restored the load takes the power it took before; the motor keeps
    ``output_factor`` of its rating at the new supply (e.g. 5/6 for a 60 Hz motor on 50 Hz at
    V/f held, from :func:`machinecheck.physics.frequency.frequency_output_factor`). Above 1
    the restored load overloads the motor.

    Parameters
    ----------
    load_power_w : shaft power the load takes at its restored speed [W]
    rated_output_w : motor rated output [W]
    output_factor : share of the rating the motor keeps at the site [-]

    References
    ----------
    .. [1] Common practice for 50/60 Hz re-rating (output ~ f at constant torque), NEMA MG 1
       12.44.2.
    """
    _positive("load power", load_power_w)
    _positive("rated output", rated_output_w)
    _positive("output factor", output_factor)
    return load_power_w / (rated_output_w * output_factor)


@dataclass(frozen=True, slots=True)
class TrimResult:
    """An impeller trim at a new speed; ratios are to the old duty at the old speed [-]."""

    diameter_ratio: float
    flow_ratio: float
    head_ratio: float
    power_ratio: float
    within_trim_limit: bool
    flow_met: bool

    @property
    def acceptable(self) -> bool:
        """True when the trim stays within the affinity laws' range and the flow is met."""
        return self.within_trim_limit and self.flow_met


def trim_for_power(speed_ratio: float, power_limit_ratio: float) -> float:
    """Impeller diameter ratio that holds the pump's power to ``power_limit_ratio`` [-].

    P ~ n^3 D^3, so D / D0 = (P_limit / P0)^(1/3) / (n / n0), capped at 1 (no trim needed).

    Parameters
    ----------
    speed_ratio : new pump speed over old [-]
    power_limit_ratio : most power the motor can give, over the pump's old power [-]

    References
    ----------
    .. [1] I. J. Karassik et al., *Pump Handbook*, 4th ed., ch. 2 (affinity laws in speed and,
       approximately for small trims, in impeller diameter).
    """
    _positive("speed ratio", speed_ratio)
    _positive("power limit ratio", power_limit_ratio)
    return min(1.0, float(power_limit_ratio ** (1.0 / 3.0)) / speed_ratio)


def trimmed_duty(speed_ratio: float, diameter_ratio: float, *, min_flow_ratio: float,
                 trim_limit: float = TRIM_LIMIT) -> TrimResult:
    """Flow, head and power of a pump at a new speed with a trimmed impeller.

    Q ~ n D, H ~ n^2 D^2, P ~ n^3 D^3 (efficiency taken as unchanged). The trim is flagged
    when D / D0 < ``trim_limit`` (the laws no longer a fair estimate: ask the pump maker) or
    when the flow falls below ``min_flow_ratio`` of the old flow.

    Parameters
    ----------
    speed_ratio : new pump speed over old [-]
    diameter_ratio : trimmed over original impeller diameter, in (0, 1] [-]
    min_flow_ratio : least acceptable flow, over the old flow [-]
    trim_limit : smallest diameter ratio the estimate is trusted for [-]

    Returns
    -------
    TrimResult

    References
    ----------
    .. [1] Karassik et al., *Pump Handbook*, 4th ed., ch. 2. A pump run 20 % faster also sees
       1.44 x the head on its casing and a higher NPSH required: check both with the maker.
    """
    if not (0.0 < diameter_ratio <= 1.0):
        raise DomainError(f"diameter ratio must be in (0, 1], got {diameter_ratio!r}")
    _positive("minimum flow ratio", min_flow_ratio)
    q, h, p = affinity(speed_ratio)
    d = diameter_ratio
    flow = q * d
    return TrimResult(diameter_ratio=d, flow_ratio=flow, head_ratio=h * d * d,
                      power_ratio=p * d ** 3, within_trim_limit=d >= trim_limit - 1e-12,
                      flow_met=flow >= min_flow_ratio - 1e-12)


def trim_to_motor(speed_ratio: float, power_limit_ratio: float, *, min_flow_ratio: float,
                  trim_limit: float = TRIM_LIMIT) -> TrimResult:
    """The largest trim that keeps the pump within the motor, and whether it is acceptable.

    The diameter is :func:`trim_for_power`; any smaller impeller gives less flow, so when this
    one misses ``min_flow_ratio`` (or lies beyond ``trim_limit``) no trim keeps both the flow
    and the motor's loading acceptable: ``TrimResult.acceptable`` is then False.

    Parameters
    ----------
    speed_ratio : new pump speed over old [-]
    power_limit_ratio : most power the motor can give, over the pump's old power [-]
    min_flow_ratio : least acceptable flow, over the old flow [-]
    trim_limit : smallest diameter ratio the estimate is trusted for [-]

    References
    ----------
    .. [1] Karassik et al., *Pump Handbook*, 4th ed., ch. 2 (affinity laws).
    """
    diameter = trim_for_power(speed_ratio, power_limit_ratio)
    return trimmed_duty(speed_ratio, diameter, min_flow_ratio=min_flow_ratio, trim_limit=trim_limit)
