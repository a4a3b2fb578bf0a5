"""``machinecheck remedy``: every remedy for one machine on one site, ranked, with its cautions."""

from __future__ import annotations

import math

import click

from ..engine.assessment import Assessment
from ..engine.remedies import CHECKLIST, PRIORITIES, Remedy, rank
from .output import write_stdout
from .sources import load_inputs, select

REMEDY_CAUTION = ("Caution: sizes are estimates from nameplate data; verify with the "
                  "manufacturer, de-energise and lock out, and follow local codes and licensed "
                  "practice.")


def _figure(name: str, value: float) -> str:
    if not math.isfinite(value):
        return f"{name} n/a"
    return f"{name} {value:.6g}"


def _remedy_lines(number: int, r: Remedy) -> list[str]:
    head = f"{number}. {r.kind}: {r.action}"
    if r.verdict is not None:
        head += f"  -> re-checked: {r.verdict}"
    lines = [head]
    if r.figures:
        lines.append("   sizes: " + ", ".join(_figure(n, v) for n, v in r.figures))
    lines += [f"   left: {f.severity} {f.code}: {f.message}" for f in r.remaining]
    e = r.energy
    if e is not None:
        money = ""
        if e.annual_cost is not None:
            money = f", {abs(e.annual_cost):.0f} {e.currency or ''}/year".rstrip()
        if e.payback_years is not None:
            money += (", payback never (no saving)" if not math.isfinite(e.payback_years)
                      else f", simple payback {e.payback_years:.1f} years")
        verb = "saves" if e.power_saving_w >= 0.0 else "uses more:"
        lines.append(f"   energy: {verb} {abs(e.power_saving_w) / 1000:.3f} kW, "
                     f"{abs(e.annual_energy_j) / 3.6e6:.0f} kWh/year{money}"
                     + (f" ({e.missing})" if e.missing else ""))
    elif r.energy_missing:
        lines.append(f"   energy: {r.energy_missing}")
    lines += [f"   caution: {c}" for c in r.cautions]
    return lines


def remedy_lines(a: Assessment, priority: str) -> list[str]:
    """The report of one pair: its verdict, the regulation, the remedies ranked, the checklist."""
    lines = [f"{a.machine.id} on {a.site.id}: {a.verdict}"]
    g = a.regulation
    if g is not None:
        lines.append(f"efficiency rule: {g.status}: {g.message}")
    ranked = [r for r in rank(a.remedies, priority) if r.kind != "pre-energising-checklist"]
    if a.verdict == "compatible":
        lines.append("compatible as it is: no remedy needed")
    else:
        lines.append(f"remedies, ranked by {priority}:")
        for i, r in enumerate(ranked, 1):
            lines += _remedy_lines(i, r)
    lines.append("before energising a relocated machine:")
    lines += [f"  - {c}" for c in CHECKLIST]
    lines.append(REMEDY_CAUTION)
    return lines


@click.command()
@click.argument("machine_id", metavar="MACHINE")
@click.argument("catalogs", nargs=-1, type=click.Path(dir_okay=True))
@click.option("--site", "site_id", required=True, help="the site id")
@click.option("--sites", "sites_file", type=click.Path(), help="TOML file of site supplies")
@click.option("--priority", type=click.Choice(PRIORITIES), default="changes", show_default=True,
              help="rank by fewest changes or by lowest running cost")
def remedy(machine_id: str, catalogs: tuple[str, ...], site_id: str, sites_file: str | None,
           priority: str) -> None:
    """Every remedy for MACHINE on --site, sized, re-checked and ranked.

    MACHINE is looked up in the CATALOG files (the bundled demo when no files are given).
    """
    from ..engine import pipeline

    given = load_inputs(catalogs, sites_file, {})
    machine = select(given.machines, (machine_id,), "machine")[0]
    site = select(given.sites, (site_id,), "site")[0]
    lines = remedy_lines(pipeline.assess(machine, site), priority)
    if given.demo:
        lines.insert(0, "(the bundled demo fleet and sites: invented)")
    write_stdout(["\n".join(lines) + "\n"])
