"""Spreadsheet inventories (CSV) of nameplates, and conversion between CSV and TOML catalogs.

One row per rating set; rows with the same machine id form a multi-rating plate. Columns are
named like the TOML keys (``id``, ``phases``, ``frequency``, ``voltage`` ...); the driven load
uses ``load_type``, ``load_power``, ``load_torque`` and ``load_max_speed``. A cell holding
several values (one per connection) separates them with ``;``. The rows become the same data a
TOML catalog parses to, and go through the same validation; errors name the row and column.
"""

from __future__ import annotations

import csv
import io
import re

from ..errors import InputError, InputErrors
from ..inputs.catalog import MACHINE_KEYS, RATING_KEYS, Locator, catalog_from_data, closest, read_text

#: Machine-level columns (the same on every row of one machine).
MACHINE_COLUMNS = tuple(k for k in MACHINE_KEYS if k not in ("rating", "load", "service_factor"))
#: Rating-set columns (one rating set per row). service_factor is per rating set here.
RATING_COLUMNS = RATING_KEYS
#: Driven-load columns and the [machine.load] keys they fill.
LOAD_COLUMNS = {"load_type": "type", "load_power": "power", "load_torque": "torque",
                "load_max_speed": "max_speed"}
COLUMNS = MACHINE_COLUMNS + RATING_COLUMNS + tuple(LOAD_COLUMNS)
#: Columns whose cells stay text even when they look like numbers.
TEXT_COLUMNS = frozenset({"id", "description", "kind", "insulation_class", "efficiency_class",
                          "code_letter", "design_letter", "cooling", "duty", "connection",
                          "load_type"})
LIST_COLUMNS = frozenset({"voltage", "connection", "current", "locked_rotor_current"})
LIST_SEPARATOR = ";"
#: Cell separators recognised from the header line, and the list separator each leaves free:
#: spreadsheets set to a decimal comma export with ";" between cells (and "0,86" is read as
#: 0.86 in such a file).
DELIMITERS = {",": ";", ";": "|", "\t": ";"}

_INT = re.compile(r"^[+-]?\d+$")
_DECIMAL_COMMA = re.compile(r"(?<=\d),(?=\d)")
_FLOAT = re.compile(r"^[+-]?(\d+\.\d*|\.\d+|\d+)([eE][+-]?\d+)?$")


def _column_name(raw: str) -> str:
    return raw.strip().lower().replace(" ", "_").replace("-", "_")


def _cell_value(column: str, text: str, separator: str = LIST_SEPARATOR,
                decimal_comma: bool = False):
    if column in LIST_COLUMNS and separator in text:
        return [_cell_value(column, part.strip(), separator, decimal_comma)
                for part in text.split(separator) if part.strip()]
    if column in TEXT_COLUMNS:
        return text
    if decimal_comma:
        text = _DECIMAL_COMMA.sub(".", text)
    if _INT.match(text):
        return int(text)
    if _FLOAT.match(text):
        return float(text)
    return text


def read_inventory(path) -> tuple[dict, Locator, str]:
    """Read a CSV inventory into catalog data; return (data, row locator, file name)."""
    name = str(path)
    text = read_text(name)
    if not text.strip():
        raise InputError("file is empty", file=name)
    header_line = text.lstrip("\ufeff").split("\n", 1)[0]
    delimiter = max(DELIMITERS, key=header_line.count)
    separator = DELIMITERS[delimiter]
    reader = csv.reader(io.StringIO(text, newline=""), delimiter=delimiter)
    errors: list[InputError] = []
    try:
        rows = list(reader)
    except csv.Error as exc:
        raise InputError(f"CSV syntax error: {exc}", file=name, line=reader.line_num,
                         column="") from None
    header = [_column_name(c) for c in rows[0]]
    for position, column in enumerate(header):
        if column not in COLUMNS:
            close = closest(column, COLUMNS)
            hint = f" (did you mean {close[0]!r}?)" if close else ""
            errors.append(InputError(f"unknown column{hint}; columns are named like the TOML "
                                     "keys (see docs/format.md)", file=name, line=1,
                                     column=rows[0][position].strip() or f"#{position + 1}"))
        elif header.index(column) != position:
            errors.append(InputError("column appears twice", file=name, line=1, column=column))
    if "id" not in header:
        errors.append(InputError("no 'id' column: each row names its machine", file=name,
                                 line=1, column="id"))
    if errors:
        raise InputErrors(errors)

    machines: list[dict] = []
    by_id: dict[str, int] = {}
    index: dict = {}
    for number, row in enumerate(rows[1:], start=2):
        if not any(cell.strip() for cell in row):
            continue
        if len(row) > len(header):
            errors.append(InputError(f"{len(row)} cells for {len(header)} columns (is a comma "
                                     "inside an unquoted cell?)", file=name, line=number,
                                     column=f"#{len(header) + 1}"))
            continue
        cells = {header[i]: row[i].strip() for i in range(len(row)) if row[i].strip()}
        machine_id = cells.get("id")
        if machine_id is None:
            errors.append(InputError("row has no machine id", file=name, line=number,
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
        rating: dict = {}
        entry["rating"].append(rating)
        index[("machine", m_index, "rating", r_index)] = number
        for column, text in cells.items():
            value = _cell_value(column, text, separator, delimiter == ";")
            if column in RATING_COLUMNS:
                rating[column] = value
                index[("machine", m_index, "rating", r_index, column)] = number
            elif column in LOAD_COLUMNS:
                load = entry.setdefault("load", {})
                key = LOAD_COLUMNS[column]
                if key in load and load[key] != value:
                    errors.append(_conflict(name, number, column, machine_id, load[key],
                                            index[("machine", m_index, "load", key)]))
                    continue
                load[key] = value
                index.setdefault(("machine", m_index, "load"), number)
                index.setdefault(("machine", m_index, "load", key), number)
            elif column != "id":
                if column in entry and entry[column] != value:
                    errors.append(_conflict(name, number, column, machine_id, entry[column],
                                            index[("machine", m_index, column)]))
                    continue
                entry[column] = value
                index.setdefault(("machine", m_index, column), number)
    if errors:
        raise InputErrors(errors)
    if not machines:
        raise InputError("no machine rows under the header", file=name, line=2, column="")
    return {"machine": machines}, Locator(None, index), name  # a field's path -> its row


def _conflict(name, number, column, machine_id, earlier, row) -> InputError:
    return InputError(f"differs from row {row} ({earlier!r}): a machine's own fields must agree "
                      "on all its rows (leave them blank after the first)", file=name,
                      line=number, item=machine_id, column=column)


def _key_to_column(key: str | None) -> str | None:
    if key is None:
        return None
    parts = key.split(".")
    last = parts[-1].split("[")[0]
    if parts[0] == "load" and len(parts) > 1:
        return "load_" + last
    if last in ("rating", "load"):
        return None
    return last


def load_inventory(path):
    """Read and validate a CSV inventory into a Catalog; errors name row and column."""
    return inventory_catalog(*read_inventory(path))


def inventory_catalog(data: dict, locator, name: str):
    """Validate what :func:`read_inventory` read into a Catalog; errors name row and column."""
    try:
        return catalog_from_data(data, name, locator=locator)
    except InputErrors as exc:
        raise InputErrors([_as_cell_error(e) for e in exc.errors]) from None


def _as_cell_error(error: InputError) -> InputError:
    column = _key_to_column(error.key) or ""
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


def _toml_value(value) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return repr(value)
    if isinstance(value, list):
        return "[" + ", ".join(_toml_value(v) for v in value) + "]"
    return _toml_string(str(value))


def to_toml(data: dict, *, title: str | None = None) -> str:
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
                if key not in ("rating", "load") and value is not None]
        for rating in entry.get("rating", []):
            out.append("  [[machine.rating]]")
            out += [f"  {key} = {_toml_value(value)}" for key, value in rating.items()
                    if value is not None]
        if entry.get("load") is not None:
            out.append("  [machine.load]")
            out += [f"  {key} = {_toml_value(value)}" for key, value in entry["load"].items()
                    if value is not None]
        out.append("")
    return "\n".join(out)


def _csv_cell(value) -> str:
    if isinstance(value, list):
        return f"{LIST_SEPARATOR} ".join(_csv_cell(v) for v in value)
    if isinstance(value, bool):
        return "true" if value else "false"
    return str(value)


def to_csv(data: dict) -> str:
    """Catalog data written as a CSV inventory, one row per rating set."""
    rows = []
    used: list[str] = []
    for entry in data["machine"]:
        machine_cells = {k: v for k, v in entry.items() if k in MACHINE_COLUMNS and v is not None}
        load_cells = {c: entry["load"][k] for c, k in LOAD_COLUMNS.items()
                      if entry.get("load", {}).get(k) is not None}
        for position, rating in enumerate(entry.get("rating", [])):
            row = {"id": entry.get("id")}
            if position == 0:
                row.update(machine_cells)
                row.update(load_cells)
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
