"""Remedies for a pair that does not fit: each sized, applied to a changed copy of the machine
or site, and re-checked through the same pipeline.

:func:`build` is called by the pipeline for pairs whose verdict is not compatible; the re-check
it is given must not build remedies again. :func:`rank` orders them by the user's priority.
:func:`regulation_of` gives the site region's efficiency rule for a machine.
"""

from __future__ import annotations

import dataclasses
import datetime as dt
from collections.abc import Callable, Iterable, Iterator

from ...errors import MachinecheckError
from ...model import Machine, Site
from ...rules import regulation as reg
from ..assessment import VERDICTS, Assessment
from . import load_side, supply_side
from .records import KINDS, Energy, Remedy
from .supply_side import Candidate

__all__ = ["CHECKLIST", "KINDS", "PRIORITIES", "Energy", "Remedy", "build", "rank",
           "regulation_of"]

Recheck = Callable[[Machine, Site], Assessment]
PRIORITIES = ("changes", "running-cost")

#: Before energising a relocated machine: guidance, not a test procedure.
CHECKLIST = (
    "insulation resistance and polarisation index per IEEE Std 43-2013 (1 min and 10 min "
    "readings at the test voltage for the winding's rating, IR corrected to 40 degC; PI of "
    "2.0 or more for classes B, F and H, 1.5 for class A; IR at least 5 MOhm for random-wound "
    "windings and 100 MOhm for form-wound ones built after 1970, from memory): dry or "
    "recondition the winding when below",
    "connection for the new voltage: links and diagram in the terminal box checked against "
    "the plate",
    "rotation: bump-start uncoupled and check the direction before coupling the load",
    "bearings: grease or oil condition after storage and transport, shaft turns freely",
    "cooling: fan, air paths and filters clear; shaft fan speed changes with the frequency",
    "protection: overload set to the current at the new supply; de-energise and lock out, "
    "verify with the manufacturer and follow local codes and licensed practice",
)

_PACKS: dict[str, reg.Pack] = {}
#: Regulation findings by (region, facts): a fleet repeats the same plates many times.
_FOUND: dict[tuple[str, reg.MachineFacts], reg.RegulationFinding] = {}


def _pack(region: str) -> reg.Pack | None:
    key = region.strip().lower()
    if key not in reg.BUILTIN_REGIONS:
        return None
    if key not in _PACKS:
        _PACKS[key] = reg.builtin_pack(key)
    return _PACKS[key]


def regulation_of(machine: Machine, site: Site, power_w: float | None, poles: int,
                  today: dt.date | None = None) -> reg.RegulationFinding | None:
    """The site region's efficiency rule for the machine, judged as placed on that market on
    ``today`` (a new purchase, or a used machine imported into the market); the pack's text
    for a machine moved within the market is added. None without a region or an output."""
    if site.region is None or power_w is None or not power_w > 0 or machine.is_generator:
        return None
    pack = _pack(site.region)
    if pack is None:
        return None
    volts = max(c.voltage_max_v for r in machine.ratings for c in r.connections)
    facts = reg.MachineFacts(
        power_w=power_w, poles=poles, phases=machine.phases,
        rated_frequencies_hz=tuple(r.frequency_hz for r in machine.ratings),
        rated_voltage_v=volts, placing_date=today or dt.date.today(),
        efficiency_class=machine.efficiency_class)
    key = (pack.region, facts)
    if key not in _FOUND:
        if len(_FOUND) > 4096:
            _FOUND.clear()
        try:
            found = reg.assess(pack, facts)
        except MachinecheckError:
            return None
        _FOUND[key] = dataclasses.replace(found, message=(
            f"{found.message} (judged as placed on the market on "
            f"{facts.placing_date.isoformat()}: new, or used and imported; moved within the "
            f"market: {pack.used_moved})"))
    return _FOUND[key]


def _required_class(a: Assessment) -> tuple[str | None, str]:
    """The class a replacement must have: the region pack's, else the site's own minimum."""
    found = regulation_of(a.machine, a.site, a.choice.rating.power_w, a.choice.poles)
    if found is not None and found.required_class is not None:
        later = "".join(f"; {t.required_class} from {t.from_date}" for t in found.upcoming)
        return found.required_class, f"{found.region} rule from {found.applies_from}{later}"
    if a.site.min_efficiency_class is not None:
        return a.site.min_efficiency_class, "the site's required class"
    return None, "no region given"


def _candidates(a: Assessment, required: str | None, source: str) -> Iterator[Candidate]:
    yield from supply_side.reconnection(a)
    yield from supply_side.transformer(a)
    yield from supply_side.buck_boost(a)
    yield from supply_side.drive(a)
    yield from load_side.pulley(a)
    yield from load_side.impeller_trim(a)
    yield from load_side.replacement(a, required, source)


def _sized(kind: str, figures: tuple[tuple[str, float], ...], after: Assessment,
           a: Assessment) -> tuple[tuple[str, float], ...]:
    """Add the ratings that need the re-checked current: transformer kVA, buck-boost unit VA."""
    current = after.running.currents.full_load_a
    if current is None or current <= 0.0:
        return figures
    found = dict(figures)
    if kind == "transformer":
        need, size = supply_side.transformer_kva(current, found["terminal_voltage_v"],
                                                 a.machine.phases, a.site.standard)
        return (*figures, ("current_a", current), ("required_va", need), ("rating_va", size))
    if kind == "buck-boost":
        need, size = supply_side.buck_boost_unit_va(current, found["series_winding_v"],
                                                    int(found["units"]))
        return (*figures, ("current_a", current), ("unit_required_va", need),
                ("unit_rating_va", size))
    return figures


def build(a: Assessment, recheck: Recheck) -> tuple[Remedy, ...]:
    """Every candidate remedy for the pair, re-checked, plus the checklist for a relocated
    machine; a note says so when no remedy makes the pair compatible."""
    required, source = _required_class(a)
    found: list[Remedy] = []
    for kind, action, figures, cautions, changes, machine, site in _candidates(a, required,
                                                                                source):
        try:
            after = a if (machine is a.machine and site is a.site) else recheck(machine, site)
            figures = _sized(kind, figures, after, a)
        except MachinecheckError:
            continue
        energy = missing = None
        if kind == "replacement":
            energy, missing = load_side.energy(a, after.choice.rating.efficiency)
            if energy is not None:
                cautions = (*cautions, load_side.ENERGY_CAUTION)
        remaining = tuple(f for f in after.findings if f.severity != "info"
                          and not (kind == "pulley" and f.code == "duty-shortfall"))
        verdict = after.verdict
        if kind == "pulley" and after.verdict == "conditional" and not any(
                f.severity != "info" for f in remaining):
            verdict = "compatible"
        found.append(Remedy(kind, action, figures, cautions, changes, verdict, remaining,
                            energy, missing))
    if not any(r.verdict == "compatible" for r in found):
        found.append(_no_complete_fix(found))
    found.append(Remedy("pre-energising-checklist", "before energising the machine at this "
                        "site", (), CHECKLIST, 0, None))
    return tuple(found)


def _no_complete_fix(found: Iterable[Remedy]) -> Remedy:
    """Why no remedy makes the pair compatible: what is left under each."""
    left = []
    for r in found:
        codes = sorted({f.code for f in r.remaining})
        left.append(f"{r.kind}: {', '.join(codes) or 'not re-checkable'}")
    why = "; ".join(left) if left else "no remedy applies to this machine and supply"
    return Remedy("no-complete-fix", f"no single remedy makes this pair compatible; left after "
                  f"each: {why}", (), (), 0, None)


def rank(remedies: Iterable[Remedy], priority: str = "changes") -> list[Remedy]:
    """Remedies best first: re-checked verdict, then fewest changes or lowest running cost;
    the note and the checklist last."""
    if priority not in PRIORITIES:
        raise ValueError(f"priority must be one of {', '.join(PRIORITIES)}, got {priority!r}")

    def key(r: Remedy) -> tuple[int, int, int]:
        v = len(VERDICTS) if r.verdict is None else VERDICTS.index(r.verdict)
        if priority == "changes":
            return v, r.changes, r.running_cost_rank
        return v, r.running_cost_rank, r.changes

    return sorted(remedies, key=key)
