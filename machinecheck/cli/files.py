"""File commands: ``validate``, ``convert`` and ``schema``."""

from __future__ import annotations

import click

from ..errors import InputError, InputErrors
from .guard import fail, say
from .output import write_report, write_stdout


@click.command()
@click.argument("files", nargs=-1, required=True, type=click.Path(dir_okay=True))
def validate(files: tuple[str, ...]) -> None:
    """Validate catalog, inventory and site files; report every problem."""
    from ..inputs.catalog import catalog_from_data, load_catalog, parse_toml, read_text, sites_from_data

    errors: list[InputError] = []
    lines = []
    for path in files:
        try:
            if path.lower().endswith(".csv"):
                count = len(load_catalog(path).machines)
                lines.append(f"ok: {path}: {count} machines\n")
                continue
            text = read_text(path)
            data = parse_toml(text, path)
            if "site" in data and "machine" not in data:
                count = len(sites_from_data(data, path, text))
                lines.append(f"ok: {path}: {count} sites\n")
            else:
                count = len(catalog_from_data(data, path, text).machines)
                lines.append(f"ok: {path}: {count} machines\n")
        except InputErrors as exc:
            errors += exc.errors
        except InputError as exc:
            errors.append(exc)
    write_stdout(lines)
    if errors:
        fail(errors)


@click.command()
@click.argument("source", type=click.Path(dir_okay=True))
@click.option("--to", "target", required=True, type=click.Choice(["toml", "csv"]),
              help="format to write")
@click.option("--output", "-o", type=click.Path(),
              help="write to this file (default, or '-': standard output)")
def convert(source: str, target: str, output: str | None) -> None:
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
    write_report([result], output, [source])
    if output not in (None, "-"):
        say(f"machinecheck: wrote {len(data['machine'])} machines to {output}")


@click.command()
@click.argument("which", type=click.Choice(["catalog", "sites"]))
def schema(which: str) -> None:
    """Print the JSON Schema of the catalog or sites file format (for editors)."""
    import json

    from ..inputs.schema import catalog_schema, sites_schema

    document = catalog_schema() if which == "catalog" else sites_schema()
    write_stdout([json.dumps(document, indent=2) + "\n"])
