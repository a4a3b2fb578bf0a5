"""``machinecheck check``: every machine against every site, rendered in the chosen format."""

from __future__ import annotations

import contextlib
import os
import sys
from collections.abc import Callable
from typing import Any

import click

from ..report import FORMATS
from .guard import EXIT_OK, EXIT_PROBLEM, say
from .output import STDOUT, write_report
from .sources import Inputs, load_inputs, select

#: The report format a file name's extension stands for.
EXTENSIONS = {".txt": "table", ".json": "json", ".csv": "csv", ".md": "markdown",
              ".markdown": "markdown", ".html": "html", ".htm": "html"}
#: Formats written chunk by chunk as the pairs are checked (in parallel on a large fleet).
STREAMED_FORMATS = ("json", "csv")
#: Pairs above which a progress bar is shown on a terminal.
PROGRESS_PAIRS = 2000


def resolve_format(fmt: str | None, output: str | None) -> str:
    """The format asked for, or the one the output file's extension names; a clash is refused."""
    from ..errors import InputError

    implied = None
    if output and output != STDOUT:
        implied = EXTENSIONS.get(os.path.splitext(output)[1].lower())
    if fmt and implied and fmt != implied:
        raise InputError(f"--format {fmt} contradicts the file name {output!r}, which says "
                         f"{implied}; change one of them", key="--format")
    return fmt or implied or "table"


def pairs(count: int) -> str:
    return f"{count} pair" if count == 1 else f"{count} pairs"


def attention_line(counts: dict[str, int], strict: bool) -> str:
    """What the exit status means, in words."""
    incompatible, conditional = counts["incompatible"], counts["conditional"]
    failing = incompatible + (conditional if strict else 0)
    if failing:
        parts = [f"{incompatible} incompatible"] + ([f"{conditional} conditional"] if strict else [])
        verb = "needs" if failing == 1 else "need"
        return f"{pairs(failing)} {verb} attention ({', '.join(parts)}): exit status 1."
    note = (f" ({pairs(conditional)} conditional; --strict counts them)"
            if conditional and not strict else "")
    return f"No pair needs attention{note}: exit status 0."


def _machine_options(func: Callable[..., Any]) -> Callable[..., Any]:
    options = [
        click.option("--kind", help="induction-motor, synchronous-motor or synchronous-generator"),
        click.option("--phases", type=int, help="machine phases, 1 or 3 (default 3)"),
        click.option("--poles", type=int, help="number of poles (inferred from --speed if absent)"),
        click.option("--power", help="rated output, e.g. '50 hp', '37 kW', '500 kVA'"),
        click.option("--voltage", multiple=True, help="rated voltage; repeat for each connection"),
        click.option("--connection", multiple=True, help="connection name per --voltage (delta, star...)"),
        click.option("--current", multiple=True, help="rated current per --voltage"),
        click.option("--frequency", help="rated frequency, e.g. '60 Hz'"),
        click.option("--speed", help="rated full-load speed, e.g. '1775 rpm'"),
        click.option("--efficiency", help="rated efficiency, e.g. 0.941 or '94.1 %'"),
        click.option("--power-factor", "power_factor", help="rated power factor, e.g. 0.86"),
        click.option("--service-factor", "service_factor", type=float, help="NEMA service factor"),
        click.option("--code-letter", "code_letter", help="NEMA locked-rotor code letter"),
        click.option("--design-letter", "design_letter", help="NEMA design letter A-D, IEC N/H"),
        click.option("--locked-rotor-current", "locked_rotor_current", multiple=True,
                     help="locked-rotor current per --voltage"),
        click.option("--cooling", help="IEC 60034-6 cooling code (default IC411)"),
        click.option("--max-speed", "max_speed", help="speed limit of machine or driven equipment"),
        click.option("--efficiency-class", "efficiency_class", help="claimed IE class"),
        click.option("--load-type", "load_type", help="centrifugal, constant-torque, constant-power"),
        click.option("--load-power", "load_power", help="load power at the rated speed"),
        click.option("--supply-voltage", "supply_voltage", help="site voltage, e.g. '400 V'"),
        click.option("--supply-frequency", "supply_frequency", help="site frequency, e.g. '50 Hz'"),
        click.option("--supply-phases", "supply_phases", type=int, help="site phases, 1, 2 or 3"),
        click.option("--supply-system", "supply_system", help="wye, delta, split-phase, quadrature"),
        click.option("--standard", help="tolerance rules: IEC or NEMA"),
        click.option("--supply-unbalance", "supply_unbalance", help="voltage unbalance, e.g. '1.5 %'"),
        click.option("--supply-voltage-range", "supply_voltage_range",
                     help="measured band, e.g. '380-420 V'"),
        click.option("--altitude", help="site altitude, e.g. '1800 m'"),
        click.option("--ambient", help="site ambient, e.g. '45 degC'"),
    ]
    for option in reversed(options):
        func = option(func)
    return func


@click.command()
@click.argument("catalogs", nargs=-1, type=click.Path(dir_okay=True))
@click.option("--sites", "sites_file", type=click.Path(), help="TOML file of site supplies")
@click.option("--site", "site_ids", multiple=True, help="only this site id (repeatable)")
@click.option("--machine", "machine_ids", multiple=True, help="only this machine id (repeatable)")
@click.option("--format", "fmt", type=click.Choice(FORMATS),
              help="report format [default: from the --output extension, else table]")
@click.option("--output", "-o", type=click.Path(),
              help="write the report to this file ('-' for standard output); .txt .json .csv .md "
                   ".html choose the format")
@click.option("--problems-only", is_flag=True, help="keep only pairs that are not compatible")
@click.option("--explain", is_flag=True, help="show the working with numbers substituted")
@click.option("--matrix", is_flag=True, help="add a machines x sites verdict matrix")
@click.option("--strict", is_flag=True, help="exit 1 on conditional pairs too")
@_machine_options
def check(catalogs: tuple[str, ...], sites_file: str | None, site_ids: tuple[str, ...],
          machine_ids: tuple[str, ...], fmt: str | None, output: str | None,
          problems_only: bool, explain: bool, matrix: bool, strict: bool,
          **values: Any) -> None:
    """Check every machine in CATALOG files against every site of --sites.

    A one-off machine and supply can be given with the options below instead of files. With
    no input at all, the bundled demo (invented fleet and sites) is checked.
    Exit status: 0 every pair fits, 1 a pair needs attention, 2 bad input.
    """
    fmt = resolve_format(fmt, output)
    given = load_inputs(catalogs, sites_file, values)
    machines = select(given.machines, machine_ids, "machine")
    sites = select(given.sites, site_ids, "site")
    # the files read (each once: a fleet's machines share their catalog's name)
    inputs = list(dict.fromkeys([*given.files, *(m.source for m in machines),
                                 *(s.source for s in sites)]))
    to_terminal = output in (None, STDOUT) and sys.stdout is not None and sys.stdout.isatty()
    with _progress(len(machines), len(machines) * len(sites) > PROGRESS_PAIRS) as bar:
        from ..fleet import Tally

        tally = Tally()
        if fmt in STREAMED_FORMATS:
            from ..fleet import stream

            pieces = stream(machines, sites, fmt, explain=explain, problems_only=problems_only,
                            tally=tally, progress=None if bar is None else bar.update)
            with contextlib.closing(pieces):
                write_report(pieces, output, inputs)
        else:
            text = _rendered(given, machines, sites, fmt, explain, problems_only, matrix, tally,
                             bar, to_terminal=to_terminal)
            write_report([text], output, inputs, sanitised=fmt == "table")
    if output not in (None, STDOUT):
        say(f"machinecheck: wrote {pairs(tally.shown)} to {output}")
    if fmt == "table" or output not in (None, STDOUT):
        say(attention_line(tally.counts, strict))
    failing = tally.counts["incompatible"] + (tally.counts["conditional"] if strict else 0)
    sys.exit(EXIT_PROBLEM if failing else EXIT_OK)


def _progress(machines: int, large: bool) -> Any:
    """A progress bar on stderr for a large check when stderr is a terminal, else nothing."""
    if large and sys.stderr is not None and sys.stderr.isatty():
        return click.progressbar(length=machines, label="checking", file=sys.stderr)
    return contextlib.nullcontext()


def _rendered(given: Inputs, machines: tuple[Any, ...], sites: tuple[Any, ...], fmt: str,
              explain: bool, problems_only: bool, matrix: bool, tally: Any, bar: Any, *,
              to_terminal: bool) -> str:
    """A format that sorts and groups (table, markdown, html): every pair kept, then rendered."""
    import shutil

    from ..engine.pipeline import assess_all
    from ..fleet import Tally
    from ..report import renderer

    progress = None if bar is None else (lambda: bar.update(1))
    counted, shown = Tally.of(assess_all(machines, sites, explain=explain, progress=progress),
                              problems_only)
    tally.add(counted.counts, counted.shown)
    width = shutil.get_terminal_size().columns if to_terminal else None
    color = to_terminal and "NO_COLOR" not in os.environ
    return str(renderer(fmt).render(shown, explain=explain, matrix=matrix, sites=sites,
                                    machines=machines, width=width, color=color,
                                    demo=given.demo))
