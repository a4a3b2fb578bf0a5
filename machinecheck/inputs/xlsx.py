"""Excel workbooks (.xlsx) as inventories: the first sheet, read like a CSV file.

openpyxl is an optional dependency (``pip install machinecheck[xlsx]``); without it a
workbook is refused with a message saying so.
"""

from __future__ import annotations

import datetime
import os
from typing import Any

from ..errors import InputError
from .csv_ import rows_to_data
from .files import MAX_INPUT_BYTES
from .toml_ import Locator


def _cell_text(value: Any) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float) and value.is_integer() and abs(value) < 1e15:
        return str(int(value))
    if isinstance(value, (datetime.date, datetime.time)):
        return value.isoformat()
    return str(value)


def read_workbook(path: str | os.PathLike[str]) -> tuple[dict[str, Any], Locator, str]:
    """Read the first sheet of a workbook into catalog data (as :func:`.csv_.read_inventory`)."""
    name = os.fspath(path)
    try:
        import openpyxl
    except ImportError:
        raise InputError("is an Excel workbook, and reading one needs openpyxl: install it "
                         "with `pip install machinecheck[xlsx]`, or save the sheet as CSV",
                         file=name) from None
    try:
        if os.path.getsize(name) > MAX_INPUT_BYTES:
            raise InputError(f"is larger than the input limit of {MAX_INPUT_BYTES // 2 ** 20} "
                             "MiB", file=name)
        book = openpyxl.load_workbook(name, read_only=True, data_only=True)
    except InputError:
        raise
    except FileNotFoundError:
        raise InputError("no such file", file=name) from None
    except Exception as exc:  # openpyxl raises assorted errors on a damaged archive
        raise InputError(f"is not a readable .xlsx workbook ({type(exc).__name__})",
                         file=name) from None
    try:
        sheet = book.worksheets[0]
        rows = [[_cell_text(v) for v in row] for row in sheet.iter_rows(values_only=True)]
    finally:
        book.close()
    while rows and not any(c.strip() for c in rows[-1]):
        rows.pop()
    return rows_to_data(rows, name)
