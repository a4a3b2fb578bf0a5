"""Energy and cost of replacing a motor by a more efficient one, and the simple payback.

Standard energy-audit arithmetic: the same shaft power P x LF is delivered by both motors, so
the input power differs by P x LF x (1/eta_old - 1/eta_new). No prices are built in: the
tariff, its currency and the replacement price are the user's.
"""

from __future__ import annotations

import math

from ..errors import DomainError

#: Joules in a kilowatt-hour (exact).
J_PER_KWH = 3.6e6
#: Seconds in an hour (exact).
S_PER_H = 3600.0


def _efficiency(name: str, value: float) -> None:
    if not (0.0 < value <= 1.0):
        raise DomainError(f"{name} must be in (0, 1], got {value!r}")


def power_saving_w(output_w: float, load_factor: float, efficiency_old: float,
                   efficiency_new: float) -> float:
    """Input power saved at the same shaft load [W].

    dP = P x LF x (1 / eta_old - 1 / eta_new); negative when the new motor is less efficient.
    The efficiencies are those at the actual load (plate part-load values or the equivalent
    circuit), not necessarily the full-load plate figures.

    Parameters
    ----------
    output_w : rated output of the motor [W]
    load_factor : shaft load over rated output, in (0, 1.5] [-]
    efficiency_old : efficiency of the present motor at that load [-]
    efficiency_new : efficiency of the replacement at that load [-]

    Returns
    -------
    float : input power saved [W]

    References
    ----------
    .. [1] Standard energy-audit arithmetic, e.g. U.S. DOE, *Premium Efficiency Motor Selection
       and Application Guide* (2014), savings formula (from memory).
    """
    if not (output_w > 0 and math.isfinite(output_w)):
        raise DomainError(f"output must be positive, got {output_w!r}")
    if not (0.0 < load_factor <= 1.5):
        raise DomainError(f"load factor must be in (0, 1.5], got {load_factor!r}")
    _efficiency("old efficiency", efficiency_old)
    _efficiency("new efficiency", efficiency_new)
    return output_w * load_factor * (1.0 / efficiency_old - 1.0 / efficiency_new)


def annual_energy_j(power_w: float, running_time_s: float) -> float:
    """Energy over a year's running time, E = P t [J] (divide by :data:`J_PER_KWH` for kWh).

    Parameters
    ----------
    power_w : power, e.g. the saving from :func:`power_saving_w` [W]
    running_time_s : running time per year, at most 8784 h [s]

    References
    ----------
    .. [1] Standard energy-audit arithmetic.
    """
    if not math.isfinite(power_w):
        raise DomainError(f"power must be finite, got {power_w!r}")
    if not (0.0 <= running_time_s <= 8784.0 * S_PER_H):
        raise DomainError(f"running time must be within a year (0-8784 h), got {running_time_s!r} s")
    return power_w * running_time_s


def energy_cost(energy_j: float, tariff_per_kwh: float) -> float:
    """Cost of ``energy_j`` at the user's tariff, in the tariff's currency.

    Parameters
    ----------
    energy_j : energy [J]
    tariff_per_kwh : price of a kWh in the user's currency [currency/kWh]

    References
    ----------
    .. [1] Standard energy-audit arithmetic.
    """
    if not (tariff_per_kwh >= 0 and math.isfinite(tariff_per_kwh)):
        raise DomainError(f"tariff must be zero or positive, got {tariff_per_kwh!r}")
    return energy_j / J_PER_KWH * tariff_per_kwh


def simple_payback_years(price: float, annual_saving: float) -> float:
    """Simple payback, price / annual saving [years]; infinite when nothing is saved.

    No discounting, no price rise, no maintenance difference.

    Parameters
    ----------
    price : the replacement's price, in the tariff's currency
    annual_saving : the yearly cost saving, same currency

    References
    ----------
    .. [1] Standard energy-audit arithmetic.
    """
    if not (price >= 0 and math.isfinite(price)):
        raise DomainError(f"price must be zero or positive, got {price!r}")
    if not math.isfinite(annual_saving):
        raise DomainError(f"annual saving must be finite, got {annual_saving!r}")
    if annual_saving <= 0.0:
        return math.inf
    return price / annual_saving
