"""What a check runs on: catalog files, a sites file, one-off options, or the demo.

The demo runs only when nothing at all is given. Catalogs without sites, sites without
machines, or one-off options that leave a machine or a supply incomplete are errors naming what
is missing: a user's check never mixes in the invented demo data.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING, Any, TypeVar

from ..errors import InputError, InputErrors, MachinecheckError

if TYPE_CHECKING:  # the model is imported by the readers when a check needs it
    from ..model import Machine, Site

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

#: The options without which a one-off supply cannot be checked.
SUPPLY_REQUIRED = ("supply_voltage", "supply_frequency")

DEMO_FILES = ("fleet.toml", "sites.toml")


@dataclass(frozen=True)
class Inputs:
    """The machines and sites of a check, where they came from, and whether it is the demo."""

    machines: tuple[Machine, ...]
    sites: tuple[Site, ...]
    files: tuple[str, ...]
    demo: bool = False


def demo_path(name: str) -> str:
    """The bundled demo file: inside an installed wheel, or the checkout's catalogs/ folder."""
    package = Path(__file__).resolve().parent.parent
    for folder in (package / "catalogs", package.parent / "catalogs"):
        if (folder / name).is_file():
            return str(folder / name)
    raise MachinecheckError(f"the bundled demo file {name} is missing from this installation")


def _given(values: Mapping[str, Any], options: Iterable[str]) -> list[str]:
    return [o for o in options if values.get(o) not in (None, ())]


def option_flag(option: str) -> str:
    return "--" + option.replace("_", "-")


def _option_name(key: str | None, table: Mapping[str, str]) -> str | None:
    if key is None:
        return None
    leaf = key.split(".")[-1].split("[")[0]
    for option, name in table.items():
        if name == leaf:
            return option_flag(option)
    return key


def oneoff_machine(values: Mapping[str, Any]) -> tuple[Machine, ...]:
    from ..inputs.catalog import catalog_from_data

    machine: dict[str, Any] = {"id": "one-off"}
    for option, key in MACHINE_OPTIONS.items():
        if values.get(option) is not None:
            machine[key] = values[option]
    rating: dict[str, Any] = {}
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
        return tuple(catalog_from_data({"machine": [machine]}, "command line").machines)
    except InputErrors as exc:
        raise InputErrors([InputError(e.message, key=_option_name(e.key, table))
                           for e in exc.errors]) from None


def oneoff_site(values: Mapping[str, Any]) -> tuple[Site, ...]:
    from ..inputs.catalog import sites_from_data

    missing = [option_flag(o) for o in SUPPLY_REQUIRED if values.get(o) is None]
    if missing:
        raise InputError(f"the one-off supply needs {' and '.join(missing)} as well")
    site = {"id": "supply"}
    for option, key in SITE_OPTIONS.items():
        if values.get(option) is not None:
            site[key] = values[option]
    try:
        return tuple(sites_from_data({"site": [site]}, "command line"))
    except InputErrors as exc:
        raise InputErrors([InputError(e.message, key=_option_name(e.key, SITE_OPTIONS))
                           for e in exc.errors]) from None


def _collect(load: Any, path: str, errors: list[InputError]) -> Any:
    try:
        return load(path)
    except InputErrors as exc:
        errors += exc.errors
    except InputError as exc:
        errors.append(exc)
    return None


def load_inputs(catalogs: Sequence[str], sites_file: str | None,
                values: Mapping[str, Any]) -> Inputs:
    """The machines and sites to check; every problem found is raised together."""
    from ..inputs.catalog import load_catalog, load_sites

    machine_options = _given(values, (*MACHINE_OPTIONS, *RATING_OPTIONS, *LOAD_OPTIONS))
    site_options = _given(values, SITE_OPTIONS)
    if not (catalogs or sites_file or machine_options or site_options):
        return _demo()
    if catalogs and machine_options:
        raise InputError(f"give CATALOG files or machine options ({option_flag(machine_options[0])} "
                         "...), not both")
    if sites_file and site_options:
        raise InputError(f"give --sites or supply options ({option_flag(site_options[0])} ...), "
                         "not both")
    errors: list[InputError] = []
    machines: list[Machine] = []
    if machine_options:
        try:
            machines += oneoff_machine(values)
        except InputErrors as exc:
            errors += exc.errors
    for path in catalogs:
        catalog = _collect(load_catalog, path, errors)
        if catalog is not None:
            machines += catalog.machines
    sites: tuple[Site, ...] = ()
    if site_options:
        try:
            sites = oneoff_site(values)
        except InputErrors as exc:
            errors += exc.errors
        except InputError as exc:
            errors.append(exc)
    elif sites_file:
        sites = tuple(_collect(load_sites, sites_file, errors) or ())
    # what is missing is said after the problems of what was given
    if not (catalogs or machine_options):
        errors.append(InputError("no machines to check: give CATALOG files, or the one-off "
                                 "machine options (--power, --voltage, --frequency, --speed ...)"))
    if not (sites_file or site_options):
        errors.append(InputError("no sites to check against: give --sites FILE, or the one-off "
                                 "supply options (--supply-voltage and --supply-frequency ...)"))
    if errors:
        raise InputErrors(errors)
    _no_duplicates(machines)
    files = (*catalogs, *([sites_file] if sites_file else []))
    return Inputs(tuple(machines), sites, files)


def _demo() -> Inputs:
    from ..inputs.catalog import load_catalog, load_sites

    fleet, sites = (demo_path(name) for name in DEMO_FILES)
    return Inputs(tuple(load_catalog(fleet).machines), tuple(load_sites(sites)), (fleet, sites),
                  demo=True)


def _no_duplicates(machines: Iterable[Machine]) -> None:
    seen: dict[str, str | None] = {}
    for m in machines:
        if m.id in seen:
            raise InputError(f"duplicate machine id across catalogs (also in {seen[m.id]})",
                             file=m.source, item=m.id, key="id")
        seen[m.id] = m.source


Item = TypeVar("Item", "Machine", "Site")


def select(items: Sequence[Item], wanted: Sequence[str], what: str) -> tuple[Item, ...]:
    """The items whose ids are ``wanted`` (all when none); an unknown id is an error."""
    if not wanted:
        return tuple(items)
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
    return tuple(item for item in items if item.id in chosen)
