"""Locked-rotor (starting) current from the NEMA code letter or a stated ratio."""

from __future__ import annotations

import math

from ..errors import DomainError

#: NEMA MG 1 10.37.2 / NFPA 70 Table 430.7(B): locked-rotor kVA per hp, [low, high).
CODE_LETTERS = {
    "A": (0.0, 3.15), "B": (3.15, 3.55), "C": (3.55, 4.0), "D": (4.0, 4.5), "E": (4.5, 5.0),
    "F": (5.0, 5.6), "G": (5.6, 6.3), "H": (6.3, 7.1), "J": (7.1, 8.0), "K": (8.0, 9.0),
    "L": (9.0, 10.0), "M": (10.0, 11.2), "N": (11.2, 12.5), "P": (12.5, 14.0),
    "R": (14.0, 16.0), "S": (16.0, 18.0), "T": (18.0, 20.0), "U": (20.0, 22.4),
    "V": (22.4, math.inf),
}


def code_letter_band(letter: str) -> tuple[float, float]:
    """Locked-rotor kVA/hp band of a code letter, low inclusive, high exclusive.

    References
    ----------
    .. [1] NEMA MG 1 10.37.2; NFPA 70 Table 430.7(B). Letters I, O and Q are not used.
    """
    band = CODE_LETTERS.get(letter.upper())
    if band is None:
        raise DomainError(f"unknown code letter {letter!r}: expected one of "
                          f"{', '.join(CODE_LETTERS)}")
    return band


def code_letter_for(kva_per_hp: float) -> str:
    """Code letter of a locked-rotor kVA/hp figure (3.14 -> A, 3.15 -> B).

    References
    ----------
    .. [1] NEMA MG 1 10.37.2 (each band includes its lower figure, not its upper one).
    """
    if kva_per_hp < 0:
        raise DomainError(f"kVA/hp must not be negative, got {kva_per_hp!r}")
    for letter, (low, high) in CODE_LETTERS.items():
        if low <= kva_per_hp < high:
            return letter
    return "V"


def locked_rotor_current_from_code(letter: str, power_hp: float, voltage_v: float,
                                   phases: int = 3) -> tuple[float, float]:
    """Locked-rotor current band at rated voltage and frequency from the code letter [A].

    I_LR = (kVA/hp) * hp * 1000 / (k V), k = sqrt(3) three-phase, 1 single-phase.

    Returns
    -------
    (low, high) : the band's currents; high is infinite for letter V.

    References
    ----------
    .. [1] NEMA MG 1 10.37.2; EASA handbook formula kVA/hp = V I_LR k / (1000 hp).
       Worked value: 10 hp, 460 V, code G -> 70.3 A to 79.1 A.
    """
    if not (power_hp > 0 and voltage_v > 0):
        raise DomainError("power and voltage must be positive")
    low, high = code_letter_band(letter)
    k = math.sqrt(3.0) if phases == 3 else 1.0
    scale = power_hp * 1000.0 / (k * voltage_v)
    return low * scale, high * scale


def locked_rotor_current_at_site(locked_rotor_current_a: float, flux_ratio_: float) -> float:
    """Locked-rotor current at the site supply, ~ I_LR * k [A].

    At standstill the impedance is mostly leakage reactance (~ f), so I_LR ~ V / f: a 60 Hz
    motor on 50 Hz at full voltage draws about 120 % of its locked-rotor current.

    References
    ----------
    .. [1] Common practice (practice notes Q22; shared/reference standards.md 6.2 table).
    """
    if not flux_ratio_ > 0:
        raise DomainError(f"flux ratio must be positive, got {flux_ratio_!r}")
    return locked_rotor_current_a * flux_ratio_
