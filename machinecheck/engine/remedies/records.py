"""The records of a remedy: what to change, its sizes, its cautions, and the re-checked verdict.

Every remedy is applied to a changed copy of the machine or the site and checked again by the
same pipeline, so ``verdict`` and ``remaining`` are the engine's own answer with the remedy in
place. Cost drivers are given in neutral terms (kVA, current, ratio); no prices, no vendors.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..assessment import Finding, Verdict

#: Kinds of remedy, in the order they are built.
KINDS = ("reconnection", "transformer", "buck-boost", "drive", "pulley", "impeller-trim",
         "replacement", "no-complete-fix", "pre-energising-checklist")

#: Extra running losses a remedy brings, ranked 0 (none) to 3 (a drive's conversion losses);
#: a replacement that saves energy ranks -1, one that loses some 1. Common practice, no published source: the
#: ordering of a series transformer (its full rating in the path) above a buck-boost unit (only
#: the correction's share) follows from where the power passes through a core.
RUNNING_COST_RANK = {"reconnection": 0, "pulley": 0, "impeller-trim": 0, "buck-boost": 1,
                     "transformer": 2, "drive": 3, "replacement": 0,
                     "no-complete-fix": 9, "pre-energising-checklist": 9}


@dataclass(frozen=True, slots=True)
class Energy:
    """Energy and cost of a replacement at the user's running hours and load factor.

    ``power_saving_w`` = P x LF x (1/eta_old - 1/eta_new); the cost and payback are None when
    the tariff or price is not given (``missing`` names the input).
    """

    power_saving_w: float
    annual_energy_j: float
    efficiency_old: float
    efficiency_new: float
    annual_cost: float | None
    currency: str | None
    payback_years: float | None
    missing: str | None


@dataclass(frozen=True, slots=True)
class Remedy:
    """One candidate remedy for a pair, sized and re-checked.

    ``figures`` are (name, value) pairs with the unit in the name's suffix (``_va``, ``_a``,
    ``_v``, ``_hz``, ``_w``) or a plain ratio. ``changes`` counts the things changed on site
    (for the "fewest changes" ranking). ``verdict`` is the re-checked verdict (None for the
    checklist and for a note that no remedy is complete); ``remaining`` the warnings and
    problems left with the remedy in place. ``energy_missing`` says which input is missing when
    a replacement carries no energy figures.
    """

    kind: str
    action: str
    figures: tuple[tuple[str, float], ...]
    cautions: tuple[str, ...]
    changes: int
    verdict: Verdict | None
    remaining: tuple[Finding, ...] = ()
    energy: Energy | None = None
    energy_missing: str | None = None

    @property
    def running_cost_rank(self) -> int:
        """Extra running losses, ranked (see :data:`RUNNING_COST_RANK`)."""
        if self.energy is not None and self.energy.power_saving_w > 0.0:
            return -1
        if self.energy is not None and self.energy.power_saving_w < 0.0:
            return 1
        return RUNNING_COST_RANK[self.kind]

    def figure(self, name: str) -> float | None:
        """The figure called ``name``, or None."""
        return next((value for key, value in self.figures if key == name), None)
