"""The engine's records of one pair, for calling a rule directly."""

from helpers import machine, site

from machinecheck.engine import rating, running, supply
from machinecheck.engine.assessment import Finding


def records(plate, supply_fields, **machine_fields):
    """(machine, choice, supply, running) for a plate (rating dict) on a site (site fields)."""
    m = machine(plate, **machine_fields)
    s = site(**supply_fields)
    choice, offer = rating.choose(m, s)
    seen = supply.see(m, s, choice, offer)
    return m, choice, seen, running.run(m, choice, seen)


def by_code(findings: tuple[Finding, ...]) -> dict[str, Finding]:
    """The findings by code (each rule gives a code at most once)."""
    codes = [f.code for f in findings]
    assert len(codes) == len(set(codes)), codes
    return {f.code: f for f in findings}
