"""Spreadsheet inventories: the names callers import, kept here (see :mod:`.csv_`)."""

from __future__ import annotations

import os

from ..model import Catalog
from .catalog import inventory_catalog, load_catalog
from .csv_ import COLUMNS, LOAD_COLUMNS, read_inventory, to_csv, to_toml

__all__ = ["COLUMNS", "LOAD_COLUMNS", "inventory_catalog", "load_inventory", "read_inventory",
           "to_csv", "to_toml"]


def load_inventory(path: str | os.PathLike[str]) -> Catalog:
    """Read and validate a CSV or .xlsx inventory into a Catalog; errors name row and column."""
    return load_catalog(path)
