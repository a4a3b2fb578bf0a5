"""Voltage and frequency variation allowed by IEC 60034-1 (zones A and B) and NEMA MG 1 12.44."""

from __future__ import annotations

import math

from ..errors import DomainError

_EPS = 1e-9  # boundary points belong to the zone


def voltage_deviation(voltage_v: float, rated_min_v: float, rated_max_v: float | None = None) -> float:
    """Per-unit voltage deviation from a rated voltage or rated voltage range [-].

    Inside a stamped range (e.g. 380-415 V) the deviation is 0; outside it is measured from the
    nearer end, so the tolerance zones extend outward from the ends of the range.

    References
    ----------
    .. [1] IEC 60034-1 clause 7.3 (rated voltage range: zones applied beyond its limits).
    """
    rated_max_v = rated_min_v if rated_max_v is None else rated_max_v
    if not (0 < rated_min_v <= rated_max_v):
        raise DomainError(f"rated voltage range must be positive and ordered, got "
                          f"{rated_min_v!r}-{rated_max_v!r} V")
    if voltage_v > rated_max_v:
        return voltage_v / rated_max_v - 1.0
    if voltage_v < rated_min_v:
        return voltage_v / rated_min_v - 1.0
    return 0.0


#: (voltage half-width, frequency low, frequency high, cut-corner width) per zone, per unit.
IEC_MOTOR_ZONES = {"A": (0.05, -0.02, 0.02, 0.05), "B": (0.10, -0.05, 0.03, 0.10)}
#: Generators: zone A as motors; zone B +-8 % voltage (from memory, low confidence).
IEC_GENERATOR_ZONES = {"A": (0.05, -0.02, 0.02, 0.05), "B": (0.08, -0.05, 0.03, 0.08)}


def iec_zone(voltage_deviation_pu: float, frequency_deviation_pu: float, *,
             generator: bool = False) -> str | None:
    """IEC 60034-1 zone of an operating point: "A", "B" or None (outside zone B).

    Both zones are hexagons in the (f, U) plane: rectangles whose over-flux (high U, low f) and
    under-flux (low U, high f) corners are cut by 45 degree lines. A point is in zone A iff
    |dU| <= 0.05, |df| <= 0.02 and |dU - df| <= 0.05; in zone B iff |dU| <= 0.10,
    -0.05 <= df <= +0.03 and |dU - df| <= 0.10.

    Parameters
    ----------
    voltage_deviation_pu : (U - U_N) / U_N [-]
    frequency_deviation_pu : (f - f_N) / f_N [-]
    generator : use the generator zone B (+-8 % voltage)

    References
    ----------
    .. [1] IEC 60034-1:2022, clause 7.3 and its figure of voltage and frequency limits for
       motors (zone vertices as in shared/reference/standards.md 1.1; the exact cut-corner
       placement at f = 1.00 is from memory).
    """
    zones = IEC_GENERATOR_ZONES if generator else IEC_MOTOR_ZONES
    du, df = voltage_deviation_pu, frequency_deviation_pu
    for name in ("A", "B"):
        dv, flo, fhi, cut = zones[name]
        if (abs(du) <= dv + _EPS and flo - _EPS <= df <= fhi + _EPS
                and abs(du - df) <= cut + _EPS):
            return name
    return None


#: NEMA MG 1 12.44.1 limits for induction motors, per unit.
NEMA_VOLTAGE_LIMIT = 0.10
NEMA_FREQUENCY_LIMIT = 0.05
NEMA_COMBINED_LIMIT = 0.10


def nema_variation(voltage_deviation_pu: float, frequency_deviation_pu: float) -> tuple[bool, float]:
    """NEMA MG 1 12.44.1 running-variation check.

    Within limits iff |dV| <= 10 %, |df| <= 5 % and |dV| + |df| <= 10 %.

    Returns
    -------
    (within, combined) : whether the point is allowed, and |dV| + |df| [-]

    References
    ----------
    .. [1] NEMA MG 1-2016, 12.44.1 (NEMA Condensed MG 1-2011 9.9.1). EASA worked case:
       dV = -5.1 %, df = +1.6 % -> 6.7 % <= 10 %, acceptable.
    """
    dv, df = abs(voltage_deviation_pu), abs(frequency_deviation_pu)
    combined = dv + df
    within = (dv <= NEMA_VOLTAGE_LIMIT + _EPS and df <= NEMA_FREQUENCY_LIMIT + _EPS
              and combined <= NEMA_COMBINED_LIMIT + _EPS)
    return within, combined


#: Nominal system voltage -> standard motor nameplate (utilization) voltage, 60 Hz.
NEMA_UTILIZATION = {120.0: 115.0, 208.0: 200.0, 240.0: 230.0, 480.0: 460.0, 600.0: 575.0,
                    2400.0: 2300.0, 4160.0: 4000.0, 4800.0: 4600.0, 6900.0: 6600.0,
                    13800.0: 13200.0}


def is_normal_pairing(system_voltage_v: float, motor_voltage_v: float) -> bool:
    """True when a nominal system voltage normally feeds motors of this nameplate voltage.

    References
    ----------
    .. [1] ANSI C84.1 / NEMA MG 1 system vs utilization voltages: 208 -> 200, 240 -> 230,
       480 -> 460, 600 -> 575, 2400 -> 2300, 4160 -> 4000 V (4800/6900/13800 from memory).
    """
    for system, motor in NEMA_UTILIZATION.items():
        if abs(system_voltage_v - system) < 0.5 and abs(motor_voltage_v - motor) < 0.5:
            return True
    return False


def _polygon(constraints: list[tuple[float, float, float]]) -> list[tuple[float, float]]:
    """Vertices (df, dU) of the convex region a*df + b*dU <= c, counter-clockwise."""
    points = []
    for i, (a1, b1, c1) in enumerate(constraints):
        for a2, b2, c2 in constraints[i + 1:]:
            det = a1 * b2 - a2 * b1
            if abs(det) < 1e-12:
                continue
            x = (c1 * b2 - c2 * b1) / det
            y = (a1 * c2 - a2 * c1) / det
            if all(a * x + b * y <= c + 1e-9 for a, b, c in constraints):
                point = (round(x, 9) + 0.0, round(y, 9) + 0.0)
                if point not in points:
                    points.append(point)
    cx = sum(p[0] for p in points) / len(points)
    cy = sum(p[1] for p in points) / len(points)
    return sorted(points, key=lambda p: math.atan2(p[1] - cy, p[0] - cx))


def iec_zone_outline(name: str, *, generator: bool = False) -> list[tuple[float, float]]:
    """Corners (df, dU) per unit of IEC 60034-1 zone ``name`` ("A" or "B"), for drawing.

    The same hexagon that :func:`iec_zone` tests: |dU| <= dv, flo <= df <= fhi,
    |dU - df| <= cut.

    References
    ----------
    .. [1] IEC 60034-1:2022, clause 7.3, figure of voltage and frequency limits.
    """
    dv, flo, fhi, cut = (IEC_GENERATOR_ZONES if generator else IEC_MOTOR_ZONES)[name]
    return _polygon([(0, 1, dv), (0, -1, dv), (1, 0, fhi), (-1, 0, -flo),
                     (-1, 1, cut), (1, -1, cut)])


def nema_outline() -> list[tuple[float, float]]:
    """Corners (df, dV) per unit of the NEMA MG 1 12.44.1 running-variation region.

    References
    ----------
    .. [1] NEMA MG 1-2016, 12.44.1: |dV| <= 10 %, |df| <= 5 %, |dV| + |df| <= 10 %.
    """
    v, f, s = NEMA_VOLTAGE_LIMIT, NEMA_FREQUENCY_LIMIT, NEMA_COMBINED_LIMIT
    return _polygon([(0, 1, v), (0, -1, v), (1, 0, f), (-1, 0, f),
                     (1, 1, s), (1, -1, s), (-1, 1, s), (-1, -1, s)])
