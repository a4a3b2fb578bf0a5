"""Full-load currents of NFPA 70 (NEC) Tables 430.248, 430.249 and 430.250, for conductor
sizing, and the scope of NEC 430.6(A)(1) that decides when they apply."""

from __future__ import annotations

import bisect

from ..errors import DomainError
from .constants import CONDUCTOR_FACTOR, NEC_LOW_SPEED_RPM

# NFPA 70 (2008 and later) Table 430.250, three-phase induction motors, amperes.
_COLUMNS_3PH: tuple[float, ...] = (115.0, 200.0, 208.0, 230.0, 460.0, 575.0, 2300.0)
_N = None
_TABLE_3PH: dict[float, tuple[float | None, ...]] = {
    0.5: (4.4, 2.5, 2.4, 2.2, 1.1, 0.9, _N), 0.75: (6.4, 3.7, 3.5, 3.2, 1.6, 1.3, _N),
    1: (8.4, 4.8, 4.6, 4.2, 2.1, 1.7, _N), 1.5: (12.0, 6.9, 6.6, 6.0, 3.0, 2.4, _N),
    2: (13.6, 7.8, 7.5, 6.8, 3.4, 2.7, _N), 3: (_N, 11.0, 10.6, 9.6, 4.8, 3.9, _N),
    5: (_N, 17.5, 16.7, 15.2, 7.6, 6.1, _N), 7.5: (_N, 25.3, 24.2, 22, 11, 9, _N),
    10: (_N, 32.2, 30.8, 28, 14, 11, _N), 15: (_N, 48.3, 46.2, 42, 21, 17, _N),
    20: (_N, 62.1, 59.4, 54, 27, 22, _N), 25: (_N, 78.2, 74.8, 68, 34, 27, _N),
    30: (_N, 92, 88, 80, 40, 32, _N), 40: (_N, 120, 114, 104, 52, 41, _N),
    50: (_N, 150, 143, 130, 65, 52, _N), 60: (_N, 177, 169, 154, 77, 62, 16),
    75: (_N, 221, 211, 192, 96, 77, 20), 100: (_N, 285, 273, 248, 124, 99, 26),
    125: (_N, 359, 343, 312, 156, 125, 31), 150: (_N, 414, 396, 360, 180, 144, 37),
    200: (_N, 552, 528, 480, 240, 192, 49), 250: (_N, _N, _N, _N, 302, 242, 60),
    300: (_N, _N, _N, _N, 361, 289, 72), 350: (_N, _N, _N, _N, 414, 336, 83),
    400: (_N, _N, _N, _N, 477, 382, 95), 450: (_N, _N, _N, _N, 515, 412, 103),
    500: (_N, _N, _N, _N, 590, 472, 118),
}
# Same table, synchronous motors at unity power factor.
_COLUMNS_SYNC: tuple[float, ...] = (230.0, 460.0, 575.0, 2300.0)
_TABLE_SYNC: dict[float, tuple[float | None, ...]] = {
    25: (53, 26, 21, _N), 30: (63, 32, 26, _N), 40: (83, 41, 33, _N), 50: (104, 52, 42, _N),
    60: (123, 61, 49, 12), 75: (155, 78, 62, 15), 100: (202, 101, 81, 20),
    125: (253, 126, 101, 25), 150: (302, 151, 121, 30), 200: (400, 201, 161, 40),
}
# Table 430.248, single-phase motors.
_COLUMNS_1PH: tuple[float, ...] = (115.0, 200.0, 208.0, 230.0)
_TABLE_1PH: dict[float, tuple[float | None, ...]] = {
    1 / 6: (4.4, 2.5, 2.4, 2.2), 0.25: (5.8, 3.3, 3.2, 2.9), 1 / 3: (7.2, 4.1, 4.0, 3.6),
    0.5: (9.8, 5.6, 5.4, 4.9), 0.75: (13.8, 7.9, 7.6, 6.9), 1: (16, 9.2, 8.8, 8.0),
    1.5: (20, 11.5, 11.0, 10), 2: (24, 13.8, 13.2, 12), 3: (34, 19.6, 18.7, 17),
    5: (56, 32.2, 30.8, 28), 7.5: (80, 46.0, 44.0, 40), 10: (100, 57.5, 55.0, 50),
}
# Table 430.249, two-phase motors (four-wire); the common conductor of a three-wire two-phase
# system carries 1.41 times these values.
_COLUMNS_2PH: tuple[float, ...] = (115.0, 230.0, 460.0, 575.0, 2300.0)
_TABLE_2PH: dict[float, tuple[float | None, ...]] = {
    0.5: (4.0, 2.0, 1.0, 0.8, _N), 0.75: (4.8, 2.4, 1.2, 1.0, _N), 1: (6.4, 3.2, 1.6, 1.3, _N),
    1.5: (9.0, 4.5, 2.3, 1.8, _N), 2: (11.8, 5.9, 3.0, 2.4, _N), 3: (_N, 8.3, 4.2, 3.3, _N),
    5: (_N, 13.2, 6.6, 5.3, _N), 7.5: (_N, 19, 9.0, 8.0, _N), 10: (_N, 24, 12, 10, _N),
    15: (_N, 36, 18, 14, _N), 20: (_N, 47, 23, 19, _N), 25: (_N, 59, 29, 24, _N),
    30: (_N, 69, 35, 28, _N), 40: (_N, 90, 45, 36, _N), 50: (_N, 113, 56, 45, _N),
    60: (_N, 133, 67, 53, 14), 75: (_N, 166, 83, 66, 18), 100: (_N, 218, 109, 87, 23),
    125: (_N, 270, 135, 108, 28), 150: (_N, 312, 156, 125, 32), 200: (_N, 416, 208, 167, 43),
}
#: The edition of NFPA 70 whose table values are carried, and whose 430.6(A)(1) is applied.
TABLE_EDITION = "NFPA 70-2008"
SCOPE_EDITION = "NFPA 70-2023"

#: Motor voltages each table column may be used for (NEC 430.248/430.250 headings).
_VOLTAGE_BANDS = ((110.0, 120.0, 115.0), (199.0, 201.0, 200.0), (207.0, 209.0, 208.0),
                  (220.0, 240.0, 230.0), (440.0, 480.0, 460.0), (550.0, 600.0, 575.0),
                  (2300.0, 2400.0, 2300.0))

#: Synchronous motor multipliers for leading power factor (Table 430.250 footnote): given for
#: unity, 0.9 and 0.8 power factor only; no other factor has one.
SYNC_PF_MULTIPLIER = {1.0: 1.0, 0.9: 1.1, 0.8: 1.25}
#: A rated power factor marked to two decimals matches a footnote value within this.
SYNC_PF_MATCH = 0.005
#: Conversion slack: kW ratings that are the metric twin of a hp size (7.5 kW = 10.06 hp).
HP_ROUNDING_SLACK = 0.01


# int | float: a whole size stays an int (100 hp is reported as 100), as the tables give it
_SIZES_1PH: list[int | float] = sorted(_TABLE_1PH)
_SIZES_3PH: list[int | float] = sorted(_TABLE_3PH)
_SIZES_2PH: list[int | float] = sorted(_TABLE_2PH)


def sync_multiplier(power_factor: float) -> float | None:
    """The Table 430.250 footnote multiplier for a synchronous motor's rated power factor:
    1.0 at unity, 1.1 at 0.9, 1.25 at 0.8; None for any other power factor (the table does
    not cover it and the nameplate current is used; nothing is rounded to a footnote value).

    References
    ----------
    .. [1] NFPA 70 (2008) Table 430.250, footnote to the synchronous-type columns.
    """
    for pf, multiplier in SYNC_PF_MULTIPLIER.items():
        if abs(power_factor - pf) <= SYNC_PF_MATCH:
            return multiplier
    return None


def nameplate_reason(synchronous_speed_rpm: float, multispeed: bool) -> str | None:
    """Why NEC 430.6(A)(1) sends a motor to its nameplate current, or None when the table
    current applies: built for low speed (less than 1200 rpm, read on the synchronous speed
    at the rated frequency: 8 poles and more at 60 Hz), or multispeed. High-torque motors are
    in the same exception; the plate data carry no mark of them.

    References
    ----------
    .. [1] NFPA 70 (2023) 430.6(A)(1), table values: "other than for motors built for low
       speeds (less than 1200 RPM) or high torques, and for multispeed motors".
    """
    if multispeed:
        return "multispeed motor"
    if synchronous_speed_rpm < NEC_LOW_SPEED_RPM - 1e-9:
        return (f"motor built for low speed ({synchronous_speed_rpm:.0f} rpm synchronous, less "
                f"than {NEC_LOW_SPEED_RPM:.0f} rpm)")
    return None


def standard_hp(power_hp: float, phases: int = 3) -> int | float:
    """The table horsepower to use: the next standard size at or above the rating.

    kW-only plates are converted (1 hp = 0.7457 kW) and rounded up; a rating within 1 % above a
    size (7.5 kW = 10.06 hp) is taken as that size, its metric twin.

    References
    ----------
    .. [1] NEC 430.6(A)(1) and 430.7(A)(7); rounding up is field practice (practice notes
       Q11: 5 kW -> 6.7 hp -> 7.5 hp); the 1 % slack is common practice, no published source.
    """
    sizes = {1: _SIZES_1PH, 2: _SIZES_2PH}.get(phases, _SIZES_3PH)
    if not power_hp > 0:
        raise DomainError(f"power must be positive, got {power_hp!r} hp")
    i = bisect.bisect_left(sizes, power_hp / (1.0 + HP_ROUNDING_SLACK))
    if i >= len(sizes):
        raise DomainError(f"{power_hp:.1f} hp is above the largest table size "
                          f"{sizes[-1]:g} hp")
    return sizes[i]


def table_column(motor_voltage_v: float) -> float | None:
    """Table voltage column for a motor rated ``motor_voltage_v``, or None when none applies."""
    for low, high, column in _VOLTAGE_BANDS:
        if low <= motor_voltage_v <= high:
            return column
    return None


def table_current(power_hp: float, motor_voltage_v: float, phases: int = 3,
                  synchronous: bool = False, power_factor: float = 1.0) -> tuple[float, int | float] | None:
    """NEC table full-load current for a motor, and the standard hp it was read at.

    Parameters
    ----------
    power_hp : rated output [hp] (converted from kW where the plate gives kW)
    motor_voltage_v : motor nameplate voltage of the connection used [V]
    phases : 1, 2 (Table 430.249) or 3
    synchronous : synchronous motor (unity PF column, x1.1 at 0.9 PF, x1.25 at 0.8 PF leading)
    power_factor : rated leading power factor of a synchronous motor [-]

    Returns
    -------
    (current_a, table_hp) or None when the table has no value for this voltage or size, or
    a synchronous motor's power factor is none of the footnote's (see :func:`sync_multiplier`).

    References
    ----------
    .. [1] NFPA 70 Table 430.250 (three-phase), Table 430.249 (two-phase) and Table 430.248
       (single-phase), NEC 2008 values (numbering unchanged since NEC 2002).
    """
    column = table_column(motor_voltage_v)
    if column is None:
        return None
    multiplier = sync_multiplier(power_factor) if synchronous else 1.0
    if multiplier is None:
        return None
    if phases == 1:
        table, columns = _TABLE_1PH, _COLUMNS_1PH
    elif phases == 2:
        table, columns = _TABLE_2PH, _COLUMNS_2PH
    elif synchronous:
        table, columns = _TABLE_SYNC, _COLUMNS_SYNC
    else:
        table, columns = _TABLE_3PH, _COLUMNS_3PH
    if column not in columns:
        return None
    try:
        hp = standard_hp(power_hp, phases)
    except DomainError:
        return None
    if hp not in table:
        return None
    value = table[hp][columns.index(column)]
    if value is None:
        return None
    return float(value) * multiplier, hp


def conductor_current(table_current_a: float) -> float:
    """Current the branch-circuit conductors of one continuous-duty motor carry, 125 % [A].

    Parameters
    ----------
    table_current_a : full-load current from Table 430.250/430.248 [A]

    References
    ----------
    .. [1] NFPA 70 (NEC) 430.22: conductors at least 125 % of the motor's full-load current
       rating as determined by 430.6(A)(1).
    """
    return CONDUCTOR_FACTOR * table_current_a
