"""Consistency of one nameplate rating set: what its figures imply about each other."""

from __future__ import annotations

from ..errors import DomainError
from .current import full_load_current

#: Plausible band of the efficiency x power factor a motor's rated current implies. The
#: product is at most 1 by definition; a 0.12 kW motor of 45 % efficiency and 0.6 power factor
#: (small single-phase and shaded-pole machines go lower still) gives 0.27, so 0.15 leaves room.
#: Common practice, no published source.
IMPLIED_EFFICIENCY_POWER_FACTOR = (0.15, 1.0)
#: Largest relative disagreement between the implied product and the stated efficiency x power
#: factor before a plate is refused: plates round current to 2-3 figures and state efficiency
#: at rated load, so a few percent is normal and the assessment warns of a smaller mismatch;
#: 40 % means a wrong figure (a unit slip, a misread digit). Common practice, no published
#: source.
STATED_PRODUCT_TOLERANCE = 0.40
#: Plausible ratio of locked-rotor to rated current. IEC 60034-12 and NEMA MG 1 code letters
#: give about 4 to 10 for ordinary motors; 1 is the physical floor (locked rotor draws more
#: than full load) and 20 the same ceiling the starting_current_ratio field uses.
LOCKED_ROTOR_RATIO = (1.0, 20.0)


def implied_efficiency_power_factor(power_w: float, voltage_v: float, current_a: float,
                                    phases: int = 3) -> float:
    """Efficiency x power factor implied by a motor's rated output, voltage and current.

    eta PF = P_out / (k V I), k = sqrt(3) three-phase, 1 single-phase, 2 two-phase: the
    full-load current relation of :func:`machinecheck.physics.current.full_load_current`
    solved for the product.

    Parameters
    ----------
    power_w : rated shaft output [W]
    voltage_v : rated line-to-line voltage (winding voltage for single-phase) [V]
    current_a : rated line current at that voltage [A]
    phases : 1, 2 or 3

    Returns
    -------
    float : efficiency x power factor [-]; between 0 and 1 for a consistent plate

    References
    ----------
    .. [1] Any power-systems text: three-phase input power P_in = sqrt(3) V_LL I PF and
       P_out = eta P_in; the relation behind NFPA 70 Table 430.250 estimates.
    """
    if not current_a > 0:
        raise DomainError(f"current must be positive, got {current_a!r} A")
    return full_load_current(power_w, voltage_v, 1.0, 1.0, phases) / current_a


def relative_difference(value: float, reference: float) -> float:
    """(value - reference) / reference [-]; how far a figure lies from the one it should match."""
    if reference == 0:
        raise DomainError("reference must not be zero")
    return (value - reference) / reference
