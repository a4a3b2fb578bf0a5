"""(machine, site) -> Assessment, in one readable pipeline.

1. choose the rating set and connection that fit the supply (:mod:`.rating`);
2. see the supply through them: terminal voltage, frequency ratio, tolerance (:mod:`.supply`);
3. run the machine at the site: speed, derates, output, load, currents (:mod:`.running`);
4. ask every rule for its findings (:mod:`machinecheck.rules`), and take the verdict from them;
5. when asked, write out the working from the same records (:mod:`.explain`).

Starting, protection and remedies join as stages between 3 and 4.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Callable, Iterable

from ..model import Machine, Site
from ..rules import RULES
from ..rules import protection as protection_rules
from ..rules import starting as starting_rules
from . import protection as protection_stage
from . import rating, running, supply
from . import remedies as remedy
from . import starting as starting_stage
from .assessment import VERDICTS, Assessment, Finding, verdict_of
from .explain import remedy_working, supply_path_working, working
from .supply_path import terminal_drop


def speeds(machine: Machine) -> tuple[int, ...]:
    """The pole counts of a multispeed plate's speeds, in plate order; () for one speed."""
    found: list[int] = []
    for r in machine.ratings:
        if r.poles is not None and r.poles not in found:
            found.append(r.poles)
    return tuple(found) if len(found) > 1 else ()


def assess(machine: Machine, site: Site, *, explain: bool = False,
           remedies: bool = True) -> Assessment:
    """Check one machine against one site supply.

    A multispeed plate is judged speed by speed, each on its own rating set; the result is
    the worst speed's, with a finding that gives the verdict of every speed. A pair that is
    not compatible carries its remedies (``remedies=False``: not built, as for the re-check
    of a remedy); a site with a region carries its efficiency rule.
    """
    a = _speeds(machine, site, explain)
    build = remedies and a.verdict != "compatible"
    if site.region is None and not build:
        return a
    a = dataclasses.replace(a, regulation=remedy.regulation_of(
        machine, site, a.choice.rating.power_w, a.choice.poles))
    if build:
        a = dataclasses.replace(a, remedies=remedy.build(a, _recheck))
    if explain:
        a = dataclasses.replace(a, working=a.working + remedy_working(a.remedies, a.regulation))
    return a


def _recheck(machine: Machine, site: Site) -> Assessment:
    """A remedy's re-check: the same pipeline, building no remedies of its own."""
    return assess(machine, site, remedies=False)


def _speeds(machine: Machine, site: Site, explain: bool) -> Assessment:
    """The assessment of one plate, speed by speed for a multispeed plate."""
    poles = speeds(machine)
    if not poles:
        return _assess(machine, site, None, explain)
    each = [_assess(machine, site, p, explain) for p in poles]
    worst = max(each, key=lambda a: VERDICTS.index(a.verdict))
    text = "; ".join(f"{a.choice.poles} poles ({a.running.synchronous_speed_rpm:.0f} rpm) "
                     f"{a.verdict}" for a in each)
    summary = Finding("multispeed", "info",
                      f"multispeed plate judged per speed: {text}; figures shown for "
                      f"{worst.choice.poles} poles")
    return dataclasses.replace(worst, findings=(summary, *worst.findings))


def _assess(machine: Machine, site: Site, poles: int | None, explain: bool) -> Assessment:
    """One machine (one speed of a multispeed plate when ``poles`` is given) on one site."""
    choice, offer = rating.choose(machine, site, poles)
    # a feeder: the tolerance is judged at the terminals, the flux ratio moved with the voltage
    drop = terminal_drop(machine, site, choice, offer.voltage_v)
    if drop is not None and drop.terminal_voltage_v > 0:
        choice = dataclasses.replace(
            choice, flux_ratio=choice.flux_ratio * drop.terminal_voltage_v / offer.voltage_v)
        offer = supply.Offer(drop.terminal_voltage_v, offer.note)
    seen = supply.see(machine, site, choice, offer)
    at_site = running.run(machine, choice, seen)
    start = starting_stage.build(machine, choice, seen, at_site, drop)
    protect = protection_stage.build(machine, choice, seen, at_site, start)
    found: list[Finding] = []
    for rule in RULES:
        found.extend(rule(machine, choice, seen, at_site))
    found.extend(starting_rules.check(seen, start))
    found.extend(protection_rules.check(protect))
    findings = tuple(found)
    return Assessment(
        machine=machine, site=site, choice=choice, supply=seen, running=at_site,
        findings=findings, verdict=verdict_of(findings),
        working=(working(machine, choice, seen, at_site) + supply_path_working(start, protect)
                 if explain else ()),
        starting=start, protection=protect)


def assess_all(machines: Iterable[Machine], sites: Iterable[Site], *, explain: bool = False,
               progress: Callable[[], object] | None = None) -> list[Assessment]:
    """Check every machine against every site; ``progress`` is called once per machine."""
    sites = tuple(sites)
    results = []
    for machine in machines:
        for site in sites:
            results.append(assess(machine, site, explain=explain))
        if progress is not None:
            progress()
    return results
