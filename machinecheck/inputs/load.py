"""Any input file: a catalog (TOML, CSV, .xlsx) or a sites file (TOML), told apart by content."""

from __future__ import annotations

import os

from ..model import Catalog, Site
from .catalog import load_catalog, sites_from_data
from .formats import choose
from .toml_ import parse_toml, read_text


def load_file(path: str | os.PathLike[str]) -> Catalog | tuple[Site, ...]:
    """Read and validate a catalog or a sites file (for ``validate``): a TOML file with
    [[site]] tables and no [[machine]] tables is a sites file; anything else a catalog."""
    name = os.fspath(path)
    if choose(name).format == "TOML":
        text = read_text(name, "TOML")
        data = parse_toml(text, name)
        if "site" in data and "machine" not in data:
            return sites_from_data(data, name, text)
    return load_catalog(name)
