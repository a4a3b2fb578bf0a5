"""Per-phase equivalent circuit of a three-phase induction motor: estimate and operating point.

The circuit is the textbook T-circuit referred to the stator, star-equivalent per phase:
R1 + jX1 in series with the magnetising reactance jXm in parallel with the rotor branch
R2/s + jX2. Core loss is lumped with friction and windage as the rotational loss, as in the
textbook worked examples. Reactances are given at the rated frequency and scale with frequency.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass
from functools import lru_cache

from ..errors import DomainError
from .constants import synchronous_speed_rpm

#: Share of X1 in the locked-rotor reactance X1 + X2 by NEMA design letter (IEEE Std 112,
#: empirical distribution; from memory). IEC design N is taken as NEMA B and H as C.
STATOR_LEAKAGE_SHARE = {"A": 0.5, "B": 0.4, "C": 0.3, "D": 0.5, "N": 0.4, "H": 0.3,
                        "wound-rotor": 0.5}
#: Design assumed when the plate states none: most general-purpose motors are NEMA B / IEC N.
DEFAULT_DESIGN = "B"
#: Breakdown to rated torque ratio the leakage reactance is fitted to, by design letter: typical
#: catalogue figures (common practice, no published source; NEMA MG 1 12.39 sets minima of
#: about 200 % and more for designs A and B, from memory). Locked-rotor current is not used:
#: deep-bar and double-cage rotors make the standstill reactance smaller than the running one.
BREAKDOWN_RATIO = {"A": 2.5, "B": 2.5, "C": 2.2, "D": 2.75, "N": 2.5, "H": 2.2,
                   "wound-rotor": 2.5}
#: Share of the full-load losses taken as rotational (core, friction, windage, stray), the rest
#: being copper loss (common practice, no published source; typical loss breakdowns put core,
#: friction, windage and stray together at 35-55 % of the losses).
ROTATIONAL_LOSS_SHARE = 0.4
#: Largest disagreement between sqrt(3) V I PF eta and the rated output before the plate current
#: is left out of the fit (the reference recipe rejects plates off by more than about 5 %).
PLATE_CONSISTENCY = 0.05


@dataclass(frozen=True, slots=True)
class Circuit:
    """Per-phase (star-equivalent) circuit parameters at ``frequency_hz``.

    Resistances and reactances in ohms; ``rotational_loss_w`` is the total (three-phase)
    rotational loss at ``rated_speed_rpm``, scaled with the square of speed elsewhere.
    """

    r1_ohm: float
    x1_ohm: float
    r2_ohm: float
    x2_ohm: float
    xm_ohm: float
    frequency_hz: float
    poles: int
    rotational_loss_w: float
    rated_speed_rpm: float
    current_fitted: bool = True


@dataclass(slots=True)  # not frozen: made once a pair, and a frozen init costs three times as much
class OperatingPoint:
    """Steady state of the circuit at one slip; powers three-phase [W], torques [N m]."""

    slip: float
    speed_rpm: float
    current_a: float
    power_factor: float
    input_power_w: float
    air_gap_power_w: float
    converted_power_w: float
    output_power_w: float
    induced_torque_nm: float
    shaft_torque_nm: float
    efficiency: float
    breakdown_torque_nm: float
    breakdown_slip: float


def _design(design: str | None) -> str:
    if design is None:
        return DEFAULT_DESIGN
    key = design.strip()
    key = key.upper() if len(key) == 1 else key.lower()
    return key if key in STATOR_LEAKAGE_SHARE else DEFAULT_DESIGN


def typical_breakdown_ratio(design: str | None) -> tuple[float, str]:
    """(typical breakdown over rated torque, the design it is taken for) when the datasheet
    gives no breakdown torque: an estimate (common practice, see :data:`BREAKDOWN_RATIO`)."""
    key = _design(design)
    return BREAKDOWN_RATIO[key], key


def _branches(z_in: complex, r1: float, x_lr: float, share: float,
              slip: float) -> tuple[float, float, float, float] | None:
    """(x1, x2, r2, xm) for a locked-rotor reactance, or None when no circuit fits it."""
    x1, x2 = share * x_lr, (1.0 - share) * x_lr
    y = 1.0 / (z_in - complex(r1, x1))
    g, b = y.real, -y.imag
    disc = 1.0 - 4.0 * g * g * x2 * x2
    if g <= 0.0 or disc <= 0.0:
        return None
    r = (1.0 + math.sqrt(disc)) / (2.0 * g)  # the rotor branch carries all of G
    b_m = b - x2 / (r * r + x2 * x2)
    if b_m <= 0.0:
        return None
    return x1, x2, r * slip, 1.0 / b_m


@lru_cache(maxsize=4096)
def estimate(power_w: float, voltage_v: float, frequency_hz: float, poles: int,
             speed_rpm: float, current_a: float | None = None,
             power_factor: float | None = None, efficiency: float | None = None,
             design: str | None = None, breakdown_ratio: float | None = None) -> Circuit:
    """Estimate the equivalent circuit from a three-phase nameplate rating set.

    Parameters
    ----------
    power_w : rated output [W]
    voltage_v : rated line-to-line voltage of the connection [V]
    frequency_hz : rated frequency [Hz]
    poles : number of poles [-]
    speed_rpm : rated full-load speed [rpm]
    current_a : rated line current [A], optional
    power_factor : rated power factor [-], optional
    efficiency : rated efficiency [-], optional; two of current, power factor and efficiency
        are needed
    design : NEMA design letter (A-D) or IEC design (N, H), optional; sets the leakage split
        and the breakdown torque the leakage is fitted to
    breakdown_ratio : breakdown torque over rated torque from the datasheet [-], optional;
        without it the design's typical ratio (:data:`BREAKDOWN_RATIO`) is an estimate

    Returns
    -------
    Circuit : parameters that reproduce the rated point exactly (speed, output, efficiency,
        power factor, and the current when the plate is self-consistent within 5 %)

    Raises
    ------
    DomainError : when the plate lacks the figures, or they cannot belong to an induction
        motor (efficiency above 1 - slip, slip outside 0-50 %, power factor not below 1)

    Notes
    -----
    1. P_in = P_out / eta (or sqrt(3) V I PF); S = sqrt(3) V I (or P_in / PF); Z_in =
       V_ph / I_ph at angle arccos(P_in / S).
    2. Losses L = P_in - P_out split: rotational P_rot = 0.4 L (common practice), rotor copper
       loss s P_ag with P_ag = P_in - P_scl, the rest stator copper loss P_scl = 3 I^2 R1.
    3. For a trial locked-rotor reactance X1 + X2, split by design letter (IEEE Std 112
       empirical distribution), the parallel branch Z_in - R1 - jX1 has admittance G - jB; the
       rotor branch carries all of G, so R2/s solves G = r / (r^2 + X2^2) (larger root) and
       1/Xm = B - X2 / (r^2 + X2^2).
    4. X1 + X2 is solved for (secant steps on its logarithm, kept in a bracket) until the
       breakdown torque is the design's typical multiple of the rated torque (or as near as a
       circuit allows).

    References
    ----------
    .. [1] IEEE Std 112-2017, Standard Test Procedure for Polyphase Induction Motors and
       Generators: empirical distribution of locked-rotor reactance (X1/X2 by design letter).
    .. [2] S. J. Chapman, *Electric Machinery Fundamentals*, 4th ed., ch. 7: the equivalent
       circuit, power flow with rotational losses, and the determination of circuit parameters.
    .. [3] S. Lee, ..., P. Sen et al., "Estimation of Induction Motor Equivalent Circuit
       Parameters from Nameplate Data", NAPS 2012: estimating the circuit from nameplate only.
    """
    if not (power_w > 0 and voltage_v > 0 and frequency_hz > 0 and speed_rpm > 0):
        raise DomainError("needs rated output, voltage, frequency and speed")
    n_s = synchronous_speed_rpm(frequency_hz, poles)
    slip = (n_s - speed_rpm) / n_s
    if not 0.0 < slip < 0.5:
        raise DomainError(f"rated slip {100 * slip:.1f} % is not that of a loaded induction motor")
    root3v = math.sqrt(3.0) * voltage_v
    if efficiency is not None:
        p_in = power_w / efficiency
    elif current_a and power_factor:
        p_in = root3v * current_a * power_factor
    else:
        raise DomainError("needs two of efficiency, power factor and current")
    current_fitted = bool(current_a)
    if current_a:
        s_in = root3v * current_a
        if power_factor and abs(p_in / s_in / power_factor - 1.0) > PLATE_CONSISTENCY:
            s_in, current_fitted = p_in / power_factor, False
    elif power_factor:
        s_in = p_in / power_factor
    else:
        raise DomainError("needs two of efficiency, power factor and current")
    if s_in <= p_in * (1.0 + 1e-6):
        raise DomainError("power factor must be below 1 for an induction motor")
    if power_w >= (1.0 - slip) * p_in:
        raise DomainError(f"efficiency {100 * power_w / p_in:.1f} % is not possible at "
                          f"{100 * slip:.1f} % slip (at most 1 - slip)")

    v_ph = voltage_v / math.sqrt(3.0)
    i_ph = s_in / (3.0 * v_ph)
    z_in = complex(p_in, math.sqrt(s_in * s_in - p_in * p_in)) / (3.0 * i_ph * i_ph)

    losses = p_in - power_w
    after_rotor = (losses - slip * p_in) / (1.0 - slip)
    p_scl = max((losses * (1.0 - ROTATIONAL_LOSS_SHARE) - slip * p_in) / (1.0 - slip),
                0.25 * after_rotor)
    p_rot = losses - p_scl - slip * (p_in - p_scl)
    r1 = p_scl / (3.0 * i_ph * i_ph)

    key = _design(design)
    share = STATOR_LEAKAGE_SHARE[key]
    ratio = BREAKDOWN_RATIO[key] if breakdown_ratio is None else breakdown_ratio
    target = ratio * power_w / (speed_rpm * math.pi / 30.0)
    w_sync = 4.0 * math.pi * frequency_hz / poles

    def excess(x_lr: float) -> tuple[float | None, tuple[float, float, float, float] | None]:
        """(log T_max / target, branches) for a trial leakage, or (None, None) if infeasible."""
        fit = _branches(z_in, r1, x_lr, share, slip)
        if fit is None:
            return None, None
        x1, x2, _, xm = fit
        v_th, r_th, x_th = _thevenin(r1, x1, xm, v_ph)
        return math.log(_peak(v_th, r_th, x_th + x2, w_sync)[0] / target), fit

    # T_max falls as the leakage grows, nearly as 1 / X: in u = log X the excess is close to a
    # straight line (slope about -0.8 where the fits land, at X ~ 0.16-0.23 |Z_in|), so secant
    # steps from a first step of that slope converge in a few trials; a step that leaves the
    # bracket, or lands where no circuit fits, is bisected instead.
    lo, hi = math.log(1e-6 * abs(z_in)), math.log(abs(z_in))
    best = None
    u = math.log(0.2 * abs(z_in))  # a typical locked-rotor reactance, per unit of |Z_in|
    previous = None
    for _ in range(80):
        f_u, fit = excess(math.exp(u))
        if f_u is None:
            hi = u
        else:
            best = fit
            if abs(f_u) < 1e-7:
                break
            if f_u > 0.0:
                lo = u
            else:
                hi = u
        if hi - lo < 1e-10:
            break
        if f_u is None:
            step = 0.5 * (lo + hi)
        elif previous is not None and previous[1] != f_u:
            step = u - f_u * (u - previous[0]) / (f_u - previous[1])
        else:
            step = u + 1.25 * f_u
        if f_u is not None:
            previous = (u, f_u)
        u = step if lo < step < hi else 0.5 * (lo + hi)
    if best is None:  # no trial fitted: the least leakage is the last resort
        best = excess(1e-6 * abs(z_in))[1]
    if best is None:
        raise DomainError("the plate figures do not fit an induction-motor circuit")
    x1, x2, r2, xm = best
    return Circuit(r1_ohm=r1, x1_ohm=x1, r2_ohm=r2, x2_ohm=x2, xm_ohm=xm,
                   frequency_hz=frequency_hz, poles=poles, rotational_loss_w=p_rot,
                   rated_speed_rpm=speed_rpm, current_fitted=current_fitted)


def from_parameters(r1_ohm: float, r2_ohm: float, x1_ohm: float, x2_ohm: float, xm_ohm: float,
                    frequency_hz: float, poles: int, power_w: float, speed_rpm: float,
                    voltage_v: float) -> Circuit:
    """A circuit from datasheet parameters (per phase, star equivalent, at the rated
    frequency), its rotational loss taken as the converted power at the rated slip less the
    rated output (none when the parameters give less).

    Parameters
    ----------
    r1_ohm, r2_ohm, x1_ohm, x2_ohm, xm_ohm : stator and referred rotor resistance and leakage
        reactance, magnetising reactance [ohm]
    frequency_hz : rated frequency the reactances hold at [Hz]
    poles : number of poles [-]
    power_w : rated output [W]
    speed_rpm : rated speed [rpm]
    voltage_v : rated line-to-line voltage [V]

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, 4th ed., sec. 7.4-7.5 (power flow:
       P_out = P_conv - P_rot).
    """
    values = (r1_ohm, r2_ohm, x1_ohm, x2_ohm, xm_ohm)
    if not all(v > 0 and math.isfinite(v) for v in values):
        raise DomainError("equivalent-circuit parameters must be positive")
    n_s = synchronous_speed_rpm(frequency_hz, poles)
    slip = (n_s - speed_rpm) / n_s
    if not 0.0 < slip < 0.5:
        raise DomainError(f"rated slip {100 * slip:.1f} % is not that of a loaded induction motor")
    bare = Circuit(r1_ohm=r1_ohm, x1_ohm=x1_ohm, r2_ohm=r2_ohm, x2_ohm=x2_ohm, xm_ohm=xm_ohm,
                   frequency_hz=frequency_hz, poles=poles, rotational_loss_w=0.0,
                   rated_speed_rpm=speed_rpm, current_fitted=False)
    converted = operating_point(bare, voltage_v, frequency_hz, slip).converted_power_w
    return Circuit(r1_ohm=r1_ohm, x1_ohm=x1_ohm, r2_ohm=r2_ohm, x2_ohm=x2_ohm, xm_ohm=xm_ohm,
                   frequency_hz=frequency_hz, poles=poles,
                   rotational_loss_w=max(0.0, converted - power_w), rated_speed_rpm=speed_rpm,
                   current_fitted=False)


def _thevenin(r1: float, x1: float, xm: float, v_ph: float) -> tuple[float, float, float]:
    """(V_th, R_th, X_th) of the stator and magnetising branches, seen from the rotor."""
    v_th = v_ph * xm / math.sqrt(r1 * r1 + (x1 + xm) ** 2)
    z_th = complex(0.0, xm) * complex(r1, x1) / complex(r1, x1 + xm)
    return v_th, z_th.real, z_th.imag


def _torque_terms(c: Circuit, voltage_v: float,
                  frequency_hz: float) -> tuple[float, float, float, float]:
    """(V_th, R_th, X_th + X2, w_sync) of the circuit on a supply."""
    f_ratio = frequency_hz / c.frequency_hz
    v_th, r_th, x_th = _thevenin(c.r1_ohm, c.x1_ohm * f_ratio, c.xm_ohm * f_ratio,
                                 voltage_v / math.sqrt(3.0))
    return v_th, r_th, x_th + c.x2_ohm * f_ratio, 4.0 * math.pi * frequency_hz / c.poles


def _peak(v_th: float, r_th: float, x_total: float, w_sync: float) -> tuple[float, float]:
    """(T_max, sqrt(R_th^2 + (X_th + X2)^2)) from the Thevenin terms."""
    root = math.sqrt(r_th * r_th + x_total * x_total)
    return 3.0 * v_th * v_th / (2.0 * w_sync * (r_th + root)), root


def breakdown(c: Circuit, voltage_v: float, frequency_hz: float) -> tuple[float, float]:
    """Breakdown (pull-out) torque and the slip at which it occurs.

    s_max = R2 / sqrt(R_th^2 + (X_th + X2)^2);
    T_max = 3 V_th^2 / (2 w_sync (R_th + sqrt(R_th^2 + (X_th + X2)^2)))

    Parameters
    ----------
    c : the circuit
    voltage_v : line-to-line supply voltage [V]
    frequency_hz : supply frequency [Hz]

    Returns
    -------
    (float, float) : breakdown torque [N m] and breakdown slip [-]

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, 4th ed., sec. 7.6 (maximum torque
       from the Thevenin equivalent).
    """
    t_max, root = _peak(*_torque_terms(c, voltage_v, frequency_hz))
    return t_max, c.r2_ohm / root


def rotational_loss(c: Circuit, speed_rpm: float) -> float:
    """Rotational loss at ``speed_rpm`` [W], scaled as speed squared from the rated speed.

    A middle course between friction (~n), windage (~n^3) and core loss at constant V/f (~f^1.5);
    common practice, no published source.
    """
    return c.rotational_loss_w * (speed_rpm / c.rated_speed_rpm) ** 2


def operating_point(c: Circuit, voltage_v: float, frequency_hz: float, slip: float, *,
                    rotational_loss_w: float | None = None,
                    breakdown_point: tuple[float, float] | None = None) -> OperatingPoint:
    """The circuit's steady state at a given slip.

    I1 = V_ph / Z_in; P_in = 3 V_ph I1 cos(phi); P_ag = P_in - 3 I1^2 R1;
    P_conv = (1 - s) P_ag; P_out = P_conv - P_rot; T_ind = P_ag / w_sync; T_load = P_out / w_m.

    Parameters
    ----------
    c : the circuit
    voltage_v : line-to-line supply voltage [V]
    frequency_hz : supply frequency [Hz]
    slip : per-unit slip, 0 < s <= 1 [-]
    rotational_loss_w : rotational loss at this speed [W]; by default scaled from the rated
        speed by :func:`rotational_loss`
    breakdown_point : :func:`breakdown` on this supply, when the caller has it already

    Returns
    -------
    OperatingPoint

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, 4th ed., sec. 7.4-7.5 and
       Example 7-5 (power flow and torque of a 460 V, 25 hp, four-pole motor).
    """
    if not 0.0 < slip <= 1.0:
        raise DomainError(f"slip must be in (0, 1], got {slip!r}")
    f_ratio = frequency_hz / c.frequency_hz
    v_ph = voltage_v / math.sqrt(3.0)
    z_rotor = complex(c.r2_ohm / slip, c.x2_ohm * f_ratio)
    z_m = complex(0.0, c.xm_ohm * f_ratio)
    z_in = complex(c.r1_ohm, c.x1_ohm * f_ratio) + z_m * z_rotor / (z_m + z_rotor)
    z_abs = abs(z_in)
    i1 = v_ph / z_abs
    pf = z_in.real / z_abs
    p_in = 3.0 * v_ph * i1 * pf
    p_ag = p_in - 3.0 * i1 * i1 * c.r1_ohm
    p_conv = (1.0 - slip) * p_ag
    n_s = synchronous_speed_rpm(frequency_hz, c.poles)
    speed = (1.0 - slip) * n_s
    if rotational_loss_w is None:
        rotational_loss_w = rotational_loss(c, speed)
    p_out = p_conv - rotational_loss_w
    w_sync = n_s * math.pi / 30.0
    w_m = speed * math.pi / 30.0
    t_max, s_max = breakdown_point or breakdown(c, voltage_v, frequency_hz)
    # positional, in field order: a pair makes one, and keywords cost a third more
    return OperatingPoint(slip, speed, i1, pf, p_in, p_ag, p_conv, p_out, p_ag / w_sync,
                          p_out / w_m if w_m > 0 else 0.0, p_out / p_in if p_in > 0 else 0.0,
                          t_max, s_max)


#: Slips tried on the stable branch before a load is taken to stall the motor.
_STALL_SCAN = 48


def solve(c: Circuit, voltage_v: float, frequency_hz: float,
          load_torque: Callable[[float], float]) -> OperatingPoint | None:
    """Operating point where the shaft torque meets the load on the stable branch.

    Solves T_ind(s) = T_load(n) + P_rot(n) / w_m for 0 < s <= s_max, using
    T_ind = 3 V_th^2 (R2/s) / (w_sync ((R_th + R2/s)^2 + (X_th + X2)^2)): by iterating the slip
    at which T_ind meets the torque asked at the last slip (inverting T_ind exactly), with
    secant steps, and by bracketed regula falsi (Illinois) where that does not settle.

    Parameters
    ----------
    c : the circuit
    voltage_v : line-to-line supply voltage [V]
    frequency_hz : supply frequency [Hz]
    load_torque : callable, shaft speed [rpm] -> load torque [N m]

    Returns
    -------
    OperatingPoint, or None when the load needs more than the breakdown torque (the motor
    stalls or does not reach speed)

    References
    ----------
    .. [1] S. J. Chapman, *Electric Machinery Fundamentals*, 4th ed., sec. 7.5 (induced torque
       from the Thevenin equivalent).
    """
    v_th, r_th, x_total, w_sync = _torque_terms(c, voltage_v, frequency_hz)
    x2sq = x_total * x_total
    n_s = synchronous_speed_rpm(frequency_hz, c.poles)
    k = 3.0 * v_th * v_th / w_sync
    r2 = c.r2_ohm
    p_rot, n_rot = c.rotational_loss_w, c.rated_speed_rpm

    rotational = p_rot / (n_rot * n_rot) * (30.0 / math.pi)

    def asked(s: float) -> float:
        """Load torque plus rotational torque P_rot (n / n_rated)^2 / w_m at slip s."""
        n = (1.0 - s) * n_s
        return load_torque(n) + rotational * n

    def induced(s: float) -> float:
        r = r2 / s
        return k * r / ((r_th + r) ** 2 + x2sq)

    def excess(s: float) -> float:
        return induced(s) - asked(s)

    def slip_for(t: float) -> float | None:
        """Slip on the stable branch where T_ind = t: the larger root r = R2/s of
        t r^2 + (2 t R_th - k) r + t (R_th^2 + X^2) = 0; None above the breakdown torque."""
        b = k - 2.0 * t * r_th
        disc = b * b - 4.0 * t * t * (r_th * r_th + x2sq)
        return 2.0 * t * r2 / (b + math.sqrt(disc)) if t > 0.0 and disc >= 0.0 else None

    t_max, root = _peak(v_th, r_th, x_total, w_sync)
    peak = (t_max, r2 / root)
    hi = min(peak[1], 1.0)
    f_hi = excess(hi)
    if f_hi < 0.0:
        # a load whose torque rises as the speed falls (constant power) can exceed the
        # breakdown torque at the breakdown slip and still meet the motor at a smaller slip:
        # look for a slip on the stable branch with torque to spare before calling a stall
        for i in range(1, _STALL_SCAN + 1):
            trial = hi * (1e-4 / hi) ** (i / _STALL_SCAN) if hi > 1e-4 else hi
            if excess(trial) >= 0.0:
                hi, f_hi = trial, excess(trial)
                break
        else:
            return None
    lo = 1e-6
    asked_lo = asked(lo)
    f_lo = induced(lo) - asked_lo
    if f_lo >= 0.0:
        return operating_point(c, voltage_v, frequency_hz, lo, breakdown_point=peak)
    # The load torque changes little with slip near synchronous speed, so s = slip_for(asked(s))
    # is a strong contraction (the answer is ~30x nearer than s); secant steps on its residual
    # settle it in a few loads, to 1e-8 of the slip as the bracketed method below.
    s, s_before, residual_before = slip_for(asked_lo), None, None
    for _ in range(12):
        if s is None or not lo < s < hi:
            break
        target = slip_for(asked(s))
        if target is None:
            break
        residual = target - s
        if abs(residual) <= 1e-8 * s:
            return operating_point(c, voltage_v, frequency_hz, target, breakdown_point=peak)
        step = target
        if s_before is not None and residual_before is not None and residual != residual_before:
            step = s - residual * (s - s_before) / (residual - residual_before)
        s_before, residual_before = s, residual
        s = step
    # otherwise (a load torque that jumps or climbs too steeply): bracketed regula falsi
    # narrow the bracket around the small-slip estimate s ~ T R2 / k (T_ind ~ k s / R2)
    guess = -f_lo * r2 / k
    tolerance = -1e-8 * f_lo  # of the torque asked for: speed exact to ~1e-8 of the slip
    for trial in (guess, 1.5 * guess):
        if not lo < trial < hi:
            break
        f_trial = excess(trial)
        if f_trial < 0.0:
            lo, f_lo = trial, f_trial
        else:
            hi, f_hi = trial, f_trial
            break
    side = 0
    s = lo
    for _ in range(100):
        s = (lo * f_hi - hi * f_lo) / (f_hi - f_lo)
        f_s = excess(s)
        if abs(f_s) < tolerance or hi - lo < 1e-12:
            break
        if f_s < 0.0:
            lo, f_lo = s, f_s
            if side == -1:
                f_hi *= 0.5
            side = -1
        else:
            hi, f_hi = s, f_s
            if side == 1:
                f_lo *= 0.5
            side = 1
    return operating_point(c, voltage_v, frequency_hz, s, breakdown_point=peak)
