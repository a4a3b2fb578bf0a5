"""Spreadsheet inventories (CSV) of nameplates, and conversion between CSV and TOML catalogs.

One row per rating set; rows with the same machine id form a multi-rating plate. Columns are
those of the field table (:func:`.fields.csv_columns`): named like the TOML keys (``id``,
``phases``, ``frequency``, ``voltage`` ...), the sub-tables with their section as prefix
(``load_type``, ``feeder_length``, ``start_method`` ...). A cell holding several values (one
per connection) separates them with ``;``. The rows become the same data a TOML catalog parses
to, and go through the same validation; errors name the row and column.

Encodings: UTF-8 with or without BOM, UTF-16 with BOM, cp1252 (:func:`.files.decode_any`).
Separators ``,``, ``;`` or tab, from the header line; a ``;`` file reads decimal commas.
"""

from __future__ import annotations

import csv
import io
import os
import re
from typing import Any

from ..errors import InputError
from .fields import CHOICE, TEXT, Field, csv_columns
from .files import decode_any, read_bytes
from .toml_ import Locator
from .validate import Problems, closest

#: CSV column -> its field.
COLUMN_FIELDS: dict[str, Field] = {f.column: f for f in csv_columns() if f.column}
COLUMNS = tuple(COLUMN_FIELDS)
MACHINE_COLUMNS = tuple(c for c, f in COLUMN_FIELDS.items() if f.section == "machine")
RATING_COLUMNS = tuple(c for c, f in COLUMN_FIELDS.items() if f.section == "rating")
#: Columns of the machine's sub-tables ([machine.load] ...) -> (section, key).
TABLE_COLUMNS = {c: (f.section, f.key) for c, f in COLUMN_FIELDS.items()
                 if f.section not in ("machine", "rating")}
LOAD_COLUMNS = {c: k for c, (s, k) in TABLE_COLUMNS.items() if s == "load"}
SUB_TABLES = ("load", "circuit", "start", "feeder", "use")
#: Columns whose cells stay text even when they look like numbers.
TEXT_COLUMNS = frozenset(c for c, f in COLUMN_FIELDS.items()
                         if f.kind in (TEXT, CHOICE) and f.key not in ("phases",))
LIST_COLUMNS = frozenset(c for c, f in COLUMN_FIELDS.items() if f.many)
LIST_SEPARATOR = ";"
#: Cell separators recognised from the header line, and the list separator each leaves free:
#: spreadsheets set to a decimal comma export with ";" between cells (and "0,86" is read as
#: 0.86 in such a file).
DELIMITERS = {",": ";", ";": "|", "\t": ";"}

_INT = re.compile(r"^[+-]?\d{1,30}$")
_DECIMAL_COMMA = re.compile(r"(?<=\d),(?=\d)")
_FLOAT = re.compile(r"^[+-]?(\d+\.\d*|\.\d+|\d+)([eE][+-]?\d+)?$")


def _column_name(raw: str) -> str:
    return raw.strip().lower().replace(" ", "_").replace("-", "_")


def _cell_value(column: str, text: str, separator: str = LIST_SEPARATOR,
                decimal_comma: bool = False) -> Any:
    if column in LIST_COLUMNS and separator in text:
        return [_cell_value(column, part.strip(), separator, decimal_comma)
                for part in text.split(separator) if part.strip()]
    if column in TEXT_COLUMNS:
        return text
    if decimal_comma:
        text = _DECIMAL_COMMA.sub(".", text)
    if _INT.match(text):
        return int(text)
    if _FLOAT.match(text) and len(text) <= 40:
        return float(text)
    return text


def read_inventory(path: str | os.PathLike[str], *,
                   decimal_comma: bool | None = None) -> tuple[dict[str, Any], Locator, str]:
    """Read a CSV inventory into catalog data; return (data, row locator, file name).

    ``decimal_comma``: True or False declares it; None detects it (a ``;``-separated file).
    """
    name = os.fspath(path)
    text, encoding = decode_any(read_bytes(name), name)
    if not text.strip():
        raise InputError("file is empty", file=name)
    header_line = text.lstrip("\ufeff").split("\n", 1)[0]
    delimiter = max(DELIMITERS, key=header_line.count)
    rows = _rows(text, delimiter, name, encoding)
    comma = delimiter == ";" if decimal_comma is None else decimal_comma
    return rows_to_data(rows, name, DELIMITERS[delimiter], comma)


def _rows(text: str, delimiter: str, name: str, encoding: str) -> list[list[str]]:
    reader = csv.reader(io.StringIO(text.lstrip("\ufeff"), newline=""), delimiter=delimiter,
                        strict=True)
    rows = []
    start = 1
    try:
        for row in reader:
            rows.append(row)
            start = reader.line_num + 1
    except csv.Error as exc:
        if "end of data" in str(exc) or "EOF" in str(exc):
            raise InputError(f"a quote opened in the row starting on line {start} is never "
                             "closed", file=name, line=start) from None
        raise InputError(f"CSV syntax error ({encoding}): {exc}", file=name,
                         line=reader.line_num) from None
    return rows


def rows_to_data(rows: list[list[str]], name: str, separator: str = LIST_SEPARATOR,
                 decimal_comma: bool = False) -> tuple[dict[str, Any], Locator, str]:
    """Rows of cells (the first the header) into catalog data, as a TOML catalog parses to."""
    problems = Problems(name)
    if not rows:
        raise InputError("file is empty", file=name)
    header_cells = list(rows[0])
    while header_cells and not header_cells[-1].strip():
        header_cells.pop()  # trailing empty header cells, as spreadsheets export them
    header = [_column_name(c) for c in header_cells]
    for position, column in enumerate(header):
        if column not in COLUMN_FIELDS:
            close = closest(column, COLUMNS)
            hint = f" (did you mean {close[0]!r}?)" if close else ""
            problems.add(InputError(f"unknown column{hint}; columns are named like the TOML "
                                    "keys (see docs/format.md)", file=name, line=1,
                                    column=header_cells[position].strip() or f"#{position + 1}"))
        elif header.index(column) != position:
            problems.add(InputError("column appears twice", file=name, line=1, column=column))
    if "id" not in header:
        problems.add(InputError("no 'id' column: each row names its machine", file=name,
                                line=1, column="id"))
    problems.raise_any()

    machines: list[dict[str, Any]] = []
    by_id: dict[str, int] = {}
    index: dict[tuple[Any, ...], int] = {}
    for number, row in enumerate(rows[1:], start=2):
        if not any(cell.strip() for cell in row):
            continue
        if len(row) > len(header) and any(cell.strip() for cell in row[len(header):]):
            problems.add(InputError(f"{len(row)} cells for {len(header)} columns (is a comma "
                                    "inside an unquoted cell?)", file=name, line=number,
                                    column=f"#{len(header) + 1}"))
            continue
        cells = {header[i]: row[i].strip() for i in range(min(len(row), len(header)))
                 if row[i].strip()}
        machine_id = cells.get("id")
        if machine_id is None:
            problems.add(InputError("row has no machine id", file=name, line=number,
                                    column="id"))
            continue
        if machine_id not in by_id:
            by_id[machine_id] = len(machines)
            machines.append({"id": machine_id, "rating": []})
            index[("machine", by_id[machine_id])] = number
            index[("machine", by_id[machine_id], "id")] = number
        m_index = by_id[machine_id]
        entry = machines[m_index]
        r_index = len(entry["rating"])
        rating: dict[str, Any] = {}
        entry["rating"].append(rating)
        index[("machine", m_index, "rating", r_index)] = number
        for column, text in cells.items():
            value = _cell_value(column, text, separator, decimal_comma)
            if column in RATING_COLUMNS:
                rating[column] = value
                index[("machine", m_index, "rating", r_index, column)] = number
            elif column in TABLE_COLUMNS:
                section, key = TABLE_COLUMNS[column]
                table = entry.setdefault(section, {})
                if key in table and table[key] != value:
                    problems.add(_conflict(name, number, column, machine_id, table[key],
                                           index[("machine", m_index, section, key)]))
                    continue
                table[key] = value
                index.setdefault(("machine", m_index, section), number)
                index.setdefault(("machine", m_index, section, key), number)
            elif column != "id":
                if column in entry and entry[column] != value:
                    problems.add(_conflict(name, number, column, machine_id, entry[column],
                                           index[("machine", m_index, column)]))
                    continue
                entry[column] = value
                index.setdefault(("machine", m_index, column), number)
    problems.raise_any()
    if not machines:
        raise InputError("no machine rows under the header", file=name, line=2, column="")
    return {"machine": machines}, Locator(None, index), name  # a field's path -> its row


def _conflict(name: str, number: int, column: str, machine_id: str, earlier: Any,
              row: int) -> InputError:
    return InputError(f"differs from row {row} ({earlier!r}): a machine's own fields must agree "
                      "on all its rows (leave them blank after the first)", file=name,
                      line=number, item=machine_id, column=column)


def key_to_column(key: str | None) -> str | None:
    """The CSV column of an error's key path ("load.power" -> "load_power")."""
    if key is None:
        return None
    parts = key.split(".")
    last = parts[-1].split("[")[0]
    if parts[0] in SUB_TABLES and len(parts) > 1:
        return f"{parts[0]}_{last}"
    if last in ("rating",) or last in SUB_TABLES:
        return None
    return last


def as_cell_error(error: InputError) -> InputError:
    """An error of the catalog validation, located by row and column."""
    column = key_to_column(error.key) or ""
    if error.line is None and error.key is None:
        column = None  # type: ignore[assignment]
    return InputError(error.message, file=error.file, line=error.line, item=error.item,
                      key=error.key, column=column)


# ----------------------------------------------------------------------------- conversion

def _toml_string(text: str) -> str:
    out = ['"']
    for ch in text:
        if ch in ('"', "\\"):
            out.append("\\" + ch)
        elif ch == "\n":
            out.append("\\n")
        elif ch == "\t":
            out.append("\\t")
        elif ord(ch) < 0x20 or ord(ch) == 0x7F:
            out.append(f"\\u{ord(ch):04x}")
        else:
            out.append(ch)
    out.append('"')
    return "".join(out)


def _toml_value(value: Any) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return repr(value)
    if isinstance(value, list):
        return "[" + ", ".join(_toml_value(v) for v in value) + "]"
    return _toml_string(str(value))


def to_toml(data: dict[str, Any], *, title: str | None = None) -> str:
    """Catalog data (as parsed from TOML or read from CSV) written as a TOML catalog."""
    out = []
    meta = dict(data.get("catalog", {}))
    if title is not None:
        meta["title"] = title
    if meta:
        out.append("[catalog]")
        out += [f"{key} = {_toml_value(value)}" for key, value in meta.items()]
        out.append("")
    for entry in data["machine"]:
        out.append("[[machine]]")
        out += [f"{key} = {_toml_value(value)}" for key, value in entry.items()
                if key != "rating" and key not in SUB_TABLES and value is not None]
        for rating in entry.get("rating", []):
            out.append("  [[machine.rating]]")
            out += [f"  {key} = {_toml_value(value)}" for key, value in rating.items()
                    if value is not None]
        for section in SUB_TABLES:
            if isinstance(entry.get(section), dict):
                out.append(f"  [machine.{section}]")
                out += [f"  {key} = {_toml_value(value)}"
                        for key, value in entry[section].items() if value is not None]
        out.append("")
    return "\n".join(out)


def _csv_cell(value: Any) -> str:
    if isinstance(value, list):
        return f"{LIST_SEPARATOR} ".join(_csv_cell(v) for v in value)
    if isinstance(value, bool):
        return "true" if value else "false"
    return str(value)


def to_csv(data: dict[str, Any]) -> str:
    """Catalog data written as a CSV inventory, one row per rating set."""
    rows = []
    used: list[str] = []
    for entry in data["machine"]:
        machine_cells = {k: v for k, v in entry.items() if k in MACHINE_COLUMNS and v is not None}
        table_cells = {c: entry[s][k] for c, (s, k) in TABLE_COLUMNS.items()
                       if isinstance(entry.get(s), dict) and entry[s].get(k) is not None}
        for position, rating in enumerate(entry.get("rating", [])):
            row = {"id": entry.get("id")}
            if position == 0:
                row.update(machine_cells)
                row.update(table_cells)
            row.update((k, v) for k, v in rating.items() if v is not None)
            if entry.get("service_factor") is not None and rating.get("service_factor") is None:
                row["service_factor"] = entry["service_factor"]
            rows.append(row)
            used += [k for k in row if k not in used]
    columns = [c for c in COLUMNS if c in used]
    buffer = io.StringIO()
    # RFC 4180 line ends: a cell holding a carriage return is then quoted too
    writer = csv.writer(buffer, lineterminator="\r\n")
    writer.writerow(columns)
    for row in rows:
        writer.writerow([_csv_cell(row[c]) if c in row else "" for c in columns])
    return buffer.getvalue()
