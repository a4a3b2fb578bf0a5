"""Command line: parse options, call the engine, hand the result to a renderer.

Heavy modules (pint, rich, the engine, renderers) are imported inside the commands that need
them, so that a quick lookup starts fast.
"""

from __future__ import annotations

import os
import sys

import click

from .. import __version__
from ..errors import InputError, InputErrors, MachinecheckError
from ..report import FORMATS

EXIT_OK, EXIT_PROBLEM, EXIT_INPUT = 0, 1, 2

# One-off options -> the catalog/site key they fill, so errors can name the option.
MACHINE_OPTIONS = {
    "kind": "kind", "phases": "phases", "poles": "poles", "service_factor": "service_factor",
    "code_letter": "code_letter", "cooling": "cooling", "max_speed": "max_speed",
    "efficiency_class": "efficiency_class", "design_letter": "design_letter",
}
RATING_OPTIONS = {
    "power": "power", "voltage": "voltage", "connection": "connection", "current": "current",
    "frequency": "frequency", "speed": "speed", "efficiency": "efficiency",
    "power_factor": "power_factor", "locked_rotor_current": "locked_rotor_current",
}
SITE_OPTIONS = {
    "supply_voltage": "voltage", "supply_frequency": "frequency", "supply_phases": "phases",
    "standard": "standard", "supply_unbalance": "unbalance",
    "supply_voltage_range": "voltage_range", "altitude": "altitude", "ambient": "ambient",
    "supply_system": "system",
}
LOAD_OPTIONS = {"load_type": "type", "load_power": "power"}


def _fail(errors) -> None:
    for error in errors:
        click.echo(f"machinecheck: error: {error}", err=True)
    sys.exit(EXIT_INPUT)


def _report_errors(func):
    """Turn project errors into one line each on stderr and exit 2; never a traceback."""
    import functools

    @functools.wraps(func)
    def wrapper(*args, **kwargs):
        try:
            return func(*args, **kwargs)
        except InputErrors as exc:
            _fail(exc.errors)
        except MachinecheckError as exc:
            _fail([exc])
        except KeyboardInterrupt:
            click.echo("machinecheck: interrupted", err=True)
            sys.exit(130)
    return wrapper


def _show_version(ctx, _param, value) -> None:
    # the build is looked up only when asked: finding it costs ~4 ms, every run would pay it
    if value and not ctx.resilient_parsing:
        click.echo(f"machinecheck, version {__version__}")
        ctx.exit()


@click.group(context_settings={"help_option_names": ["-h", "--help"], "max_content_width": 100})
@click.option("--version", is_flag=True, expose_value=False, is_eager=True,
              callback=_show_version, help="Show the version and the build, and exit.")
def main():
    """Check motor and generator nameplates against site supplies.

    Run `machinecheck check` for the bundled demo fleet and sites.
    """


def _option_name(key: str | None, table: dict) -> str | None:
    if key is None:
        return None
    leaf = key.split(".")[-1].split("[")[0]
    for option, field in table.items():
        if field == leaf:
            return "--" + option.replace("_", "-")
    return key


def _oneoff_machine(values: dict):
    from ..inputs.catalog import catalog_from_data

    machine = {"id": "one-off"}
    for option, key in MACHINE_OPTIONS.items():
        if values.get(option) is not None:
            machine[key] = values[option]
    rating = {}
    for option, key in RATING_OPTIONS.items():
        value = values.get(option)
        if value not in (None, ()):
            rating[key] = list(value) if isinstance(value, tuple) else value
    for key in ("voltage", "current", "connection", "locked_rotor_current"):
        if key in rating and len(rating[key]) == 1:
            rating[key] = rating[key][0]
    machine["rating"] = [rating]
    load = {key: values[option] for option, key in LOAD_OPTIONS.items()
            if values.get(option) is not None}
    if load:
        machine["load"] = load
    table = {**MACHINE_OPTIONS, **RATING_OPTIONS, **LOAD_OPTIONS}
    try:
        return catalog_from_data({"machine": [machine]}, "command line").machines
    except InputErrors as exc:
        raise InputErrors([InputError(e.message, key=_option_name(e.key, table))
                           for e in exc.errors]) from None


def _oneoff_site(values: dict):
    from ..inputs.catalog import sites_from_data

    site = {"id": "supply"}
    for option, key in SITE_OPTIONS.items():
        if values.get(option) is not None:
            site[key] = values[option]
    try:
        return sites_from_data({"site": [site]}, "command line")
    except InputErrors as exc:
        raise InputErrors([InputError(e.message, key=_option_name(e.key, SITE_OPTIONS))
                           for e in exc.errors]) from None


def _demo_path(name: str) -> str:
    """The bundled demo file: inside an installed wheel, or the checkout's catalogs/ folder."""
    from pathlib import Path

    package = Path(__file__).resolve().parent.parent
    for folder in (package / "catalogs", package.parent / "catalogs"):
        if (folder / name).is_file():
            return str(folder / name)
    raise MachinecheckError(f"the bundled demo file {name} is missing from this installation")


def _machine_given(values) -> bool:
    return any(values.get(o) not in (None, ()) for o in
               (*MACHINE_OPTIONS, *RATING_OPTIONS, *LOAD_OPTIONS))


def _load_sites(sites_file, values, errors) -> list:
    """The sites of --sites (the demo's by default) or of the supply options; problems are
    added to ``errors``."""
    from ..inputs.catalog import load_sites

    if any(values.get(o) is not None for o in SITE_OPTIONS):
        if sites_file:
            raise InputError("give supply options or --sites, not both")
        try:
            return list(_oneoff_site(values))
        except InputErrors as exc:
            errors += exc.errors
            return []
    try:
        return list(load_sites(sites_file or _demo_path("sites.toml")))
    except InputErrors as exc:
        errors += exc.errors
    except InputError as exc:
        errors.append(exc)
    return []


def _load_inputs(catalogs, sites_file, values):
    from ..inputs.catalog import load_catalog

    machine_given = _machine_given(values)
    errors = []
    machines = []
    if machine_given:
        if catalogs:
            raise InputError("give machine options or CATALOG files, not both")
        try:
            machines = list(_oneoff_machine(values))
        except InputErrors as exc:
            errors += exc.errors
    else:
        for path in catalogs or [_demo_path("fleet.toml")]:
            try:
                machines += list(load_catalog(path).machines)
            except InputErrors as exc:
                errors += exc.errors
            except InputError as exc:
                errors.append(exc)
    sites = _load_sites(sites_file, values, errors)
    if errors:
        raise InputErrors(errors)
    seen = {}
    for m in machines:
        if m.id in seen:
            raise InputError(f"duplicate machine id across catalogs (also in {seen[m.id]})",
                             file=m.source, item=m.id, key="id")
        seen[m.id] = m.source
    return machines, sites


def _select(items, wanted, what):
    if not wanted:
        return items
    ids = {item.id for item in items}
    missing = [w for w in wanted if w not in ids]
    if missing:
        from ..inputs.catalog import closest

        hints = []
        for name in missing:
            close = closest(name, sorted(ids))
            hints.append(f"{name!r}" + (f" (did you mean {close[0]!r}?)" if close else ""))
        raise InputError(f"no {what} with id {', '.join(hints)}", key=f"--{what}")
    chosen = set(wanted)
    return [item for item in items if item.id in chosen]


def write_output(text, path: str, inputs) -> None:
    """Write ``text`` (a string, or pieces as strings or UTF-8 bytes) to ``path`` atomically.

    Never onto an input file; nothing is left behind on error or Ctrl-C.
    """
    import contextlib

    target = os.path.abspath(path)
    folder = os.path.dirname(target) or "."
    if os.path.isdir(target):
        raise InputError("is a directory, expected an output file name", file=path)
    if not os.path.isdir(folder):
        raise InputError(f"folder {folder!r} does not exist", file=path)
    for source in inputs:
        if source and os.path.exists(source) and os.path.exists(target) and os.path.samefile(
                source, target):
            raise InputError("refusing to overwrite an input file with the output", file=path)
    handle, temporary = _new_file(folder)
    try:
        with os.fdopen(handle, "wb") as stream:
            for piece in [text] if isinstance(text, str) else text:
                stream.write(piece if isinstance(piece, bytes) else piece.encode("utf-8"))
        if os.path.exists(target):
            os.chmod(temporary, os.stat(target).st_mode & 0o7777)
        else:
            umask = os.umask(0)
            os.umask(umask)
            os.chmod(temporary, 0o666 & ~umask)
        os.replace(temporary, target)
    except BaseException:  # also Ctrl-C: leave no partial file behind
        with contextlib.suppress(OSError):
            os.unlink(temporary)
        raise


def _new_file(folder: str) -> tuple[int, str]:
    """A new hidden file in ``folder``, opened for writing by this user only: (fd, path).

    As tempfile.mkstemp, without importing tempfile (and random, shutil) into every run.
    """
    for _ in range(100):
        path = os.path.join(folder, f".machinecheck-{os.getpid()}-{os.urandom(4).hex()}.tmp")
        try:
            return os.open(path, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600), path
        except FileExistsError:
            continue
    raise InputError("could not create a temporary file beside the output", file=folder)


def _machine_options(func):
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


@main.command()
@click.argument("catalogs", nargs=-1, type=click.Path(dir_okay=True))
@click.option("--sites", "sites_file", type=click.Path(), help="TOML file of site supplies")
@click.option("--site", "site_ids", multiple=True, help="only this site id (repeatable)")
@click.option("--machine", "machine_ids", multiple=True, help="only this machine id (repeatable)")
@click.option("--format", "fmt", default="table", show_default=True,
              type=click.Choice(FORMATS))
@click.option("--output", "-o", type=click.Path(), help="write the report to this file")
@click.option("--problems-only", is_flag=True, help="keep only pairs that are not compatible")
@click.option("--explain", is_flag=True, help="show the working with numbers substituted")
@click.option("--matrix", is_flag=True, help="add a machines x sites verdict matrix")
@click.option("--strict", is_flag=True, help="exit 1 on conditional pairs too")
@_machine_options
@_report_errors
def check(catalogs, sites_file, site_ids, machine_ids, fmt, output, problems_only, explain,
          matrix, strict, **values):
    """Check every machine in CATALOG files against every site (the demo when none given).

    A one-off machine and supply can be given with the options below instead of files.
    Exit status: 0 every pair fits, 1 a pair is incompatible, 2 bad input.
    """
    import gc

    # A fleet check allocates many short-lived objects and few cycles: collect less often, and
    # keep the loaded catalog out of the collector's scans (and its pages unshared by workers).
    gc.set_threshold(50_000, 20, 20)
    if (output and fmt in STREAMED_FORMATS and catalogs and not machine_ids
            and not _machine_given(values)):
        done = _from_texts(catalogs, sites_file, site_ids, values, fmt, output, explain,
                           problems_only, strict)
        if done is not None:
            sys.exit(done)
    machines, sites = _load_inputs(catalogs, sites_file, values)
    gc.freeze()
    machines = _select(machines, machine_ids, "machine")
    sites = _select(sites, site_ids, "site")
    inputs = ([m.source for m in machines] + [s.source for s in sites] + list(catalogs)
              + ([sites_file] if sites_file else []))
    with _progress(len(machines), len(machines) * len(sites) > 2000) as bar:
        if fmt in STREAMED_FORMATS:
            tally, text = _streamed(machines, sites, fmt, explain, problems_only, bar)
        else:
            tally, text = _rendered(machines, sites, fmt, explain, problems_only, matrix, bar,
                                    to_terminal=output is None)
        if output:
            write_output(text, output, inputs)
        else:
            for piece in text:
                click.echo(piece, nl=False)
    sys.exit(_finish(tally, output, strict))


def _progress(machines: int, large: bool):
    """A progress bar on stderr for a large check when stderr is a terminal, else nothing."""
    import contextlib

    if large and sys.stderr.isatty():
        return click.progressbar(length=machines, label="checking", file=sys.stderr)
    return contextlib.nullcontext()


def _finish(tally, output, strict) -> int:
    """Say where the report went; the exit status of the check."""
    if output:
        click.echo(f"wrote {tally.shown} results to {output}", err=True)
    failing = tally.counts["incompatible"] + (tally.counts["conditional"] if strict else 0)
    return EXIT_PROBLEM if failing else EXIT_OK


STREAMED_FORMATS = ("json", "csv")


def _from_texts(catalogs, sites_file, site_ids, values, fmt, output, explain, problems_only,
                strict):
    """A large TOML fleet to a file: workers parse, validate and check pieces of the text.

    Returns the exit status, or None when this path does not apply or a piece needs the whole
    catalog (an error, a duplicate id ...): the caller then loads everything as usual.
    """
    from .. import fleet as runner
    from ..inputs.catalog import read_text

    workers = runner.workers_available()
    if workers < 2 or any(c.lower().endswith(".csv") for c in catalogs):
        return None
    errors: list = []
    try:
        sites = _load_sites(sites_file, values, errors)
        plans = [runner.plan_file(c, read_text(c)) for c in catalogs]
    except MachinecheckError:
        return None  # the usual load reports it
    if errors or any(p is None for p in plans):
        return None
    sites = _select(sites, site_ids, "site")
    machines = sum(p.machines for p in plans)
    if machines * len(sites) < runner.PARALLEL_PAIRS:
        return None
    tally = runner.Tally()
    try:
        with _progress(machines, True) as bar:
            write_output(runner.stream_files(plans, sites, fmt, explain=explain,
                                             problems_only=problems_only, tally=tally,
                                             progress=None if bar is None else bar.update,
                                             workers=workers),
                         output, [*catalogs, sites_file, *(s.source for s in sites)])
    except runner.Redo:
        return None
    return _finish(tally, output, strict)


def _streamed(machines, sites, fmt, explain, problems_only, bar):
    """A streamed format: checked and written in chunks (in parallel on a large fleet)."""
    from ..fleet import Tally, stream

    tally = Tally()
    return tally, stream(machines, sites, fmt, explain=explain, problems_only=problems_only,
                         tally=tally, progress=None if bar is None else bar.update)


def _rendered(machines, sites, fmt, explain, problems_only, matrix, bar, *, to_terminal):
    """A format that sorts and groups (table, markdown, html): every pair kept, then rendered."""
    from ..engine.pipeline import assess_all
    from ..fleet import Tally

    progress = None if bar is None else (lambda: bar.update(1))
    tally, shown = Tally.of(assess_all(machines, sites, explain=explain, progress=progress),
                            problems_only)
    return tally, [render(fmt, shown, explain=explain, matrix=matrix, sites=sites,
                          machines=machines, to_terminal=to_terminal)]


def render(fmt, results, *, explain=False, matrix=False, sites=(), machines=(), to_terminal=True):
    import shutil

    from ..report import renderer

    module = renderer(fmt)
    width = shutil.get_terminal_size((100, 24)).columns
    color = None
    if fmt == "table":
        color = bool(to_terminal and sys.stdout.isatty() and "NO_COLOR" not in os.environ)
    return module.render(results, explain=explain, matrix=matrix, sites=sites, machines=machines,
                         width=width, color=color)


# ----------------------------------------------------------------------------- lookups

@main.command()
@click.option("--poles", type=int, help="number of poles (or give --rated-speed)")
@click.option("--frequency", required=True, help="supply frequency, e.g. 50 or '50 Hz'")
@click.option("--rated-speed", "rated_speed", help="nameplate speed, e.g. '1175 rpm'")
@click.option("--rated-frequency", "rated_frequency", help="frequency of the nameplate speed")
@_report_errors
def speed(poles, frequency, rated_speed, rated_frequency):
    """Synchronous speed, and the slip-adjusted speed at a new frequency."""
    from ..cli.lookups import speed_lines

    _echo_lines(speed_lines(poles, frequency, rated_speed, rated_frequency))


@main.command()
@click.option("--speed", "speed_text", required=True, help="nameplate speed, e.g. '1460 rpm'")
@click.option("--frequency", required=True, help="rated frequency, e.g. '50 Hz'")
@_report_errors
def poles(speed_text, frequency):
    """Pole count, synchronous speed and slip from a nameplate speed."""
    from ..cli.lookups import poles_lines

    _echo_lines(poles_lines(speed_text, frequency))


@main.command()
@click.option("--power", required=True, help="rated output, e.g. '22 kW', '30 hp', or '500 kVA'")
@click.option("--voltage", required=True, help="line-to-line voltage, e.g. '400 V'")
@click.option("--phases", type=click.Choice(["1", "3"]), default="3", show_default=True)
@click.option("--efficiency", help="full-load efficiency, e.g. 0.92 or '92 %'")
@click.option("--power-factor", "power_factor", help="full-load power factor, e.g. 0.85")
@_report_errors
def current(power, voltage, phases, efficiency, power_factor):
    """Full-load current from output, voltage, efficiency and power factor."""
    from ..cli.lookups import current_lines

    _echo_lines(current_lines(power, voltage, phases, efficiency, power_factor))


def _echo_lines(lines) -> None:
    for line in lines:
        click.echo(line)


@main.command()
@click.argument("files", nargs=-1, required=True, type=click.Path(dir_okay=True))
@_report_errors
def validate(files):
    """Validate catalog, inventory and site files; report every problem."""
    from ..inputs.catalog import catalog_from_data, load_catalog, parse_toml, read_text, sites_from_data

    errors = []
    for path in files:
        try:
            if path.lower().endswith(".csv"):
                count = len(load_catalog(path).machines)
                click.echo(f"ok: {path}: {count} machines")
                continue
            text = read_text(path)
            data = parse_toml(text, path)
            if "site" in data and "machine" not in data:
                count = len(sites_from_data(data, path, text))
                click.echo(f"ok: {path}: {count} sites")
            else:
                count = len(catalog_from_data(data, path, text).machines)
                click.echo(f"ok: {path}: {count} machines")
        except InputErrors as exc:
            errors += exc.errors
        except InputError as exc:
            errors.append(exc)
    if errors:
        _fail(errors)


@main.command()
@click.argument("source", type=click.Path(dir_okay=True))
@click.option("--to", "target", required=True, type=click.Choice(["toml", "csv"]),
              help="format to write")
@click.option("--output", "-o", type=click.Path(), help="write to this file (default stdout)")
@_report_errors
def convert(source, target, output):
    """Convert a catalog between a CSV inventory and TOML (validated first)."""
    from ..inputs.catalog import catalog_from_data, parse_toml, read_text
    from ..inputs.inventory import inventory_catalog, read_inventory, to_csv, to_toml

    if source.lower().endswith(".csv"):
        data, locator, name = read_inventory(source)
        inventory_catalog(data, locator, name)
    else:
        text = read_text(source)
        data = parse_toml(text, source)
        catalog_from_data(data, source, text)
    result = to_toml(data) if target == "toml" else to_csv(data)
    if output:
        write_output(result, output, [source])
        click.echo(f"wrote {len(data['machine'])} machines to {output}", err=True)
    else:
        click.echo(result, nl=False)


@main.command()
@click.argument("which", type=click.Choice(["catalog", "sites"]))
@_report_errors
def schema(which):
    """Print the JSON Schema of the catalog or sites file format (for editors)."""
    import json

    from ..inputs.schema import catalog_schema, sites_schema

    click.echo(json.dumps(catalog_schema() if which == "catalog" else sites_schema(), indent=2))


if __name__ == "__main__":  # pragma: no cover
    main()
