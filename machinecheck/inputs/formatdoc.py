"""docs/format.md, generated from the field table.

    python -m machinecheck.inputs.formatdoc > docs/format.md

``tests/inputs/test_fields.py`` checks that the committed file is current.
"""

from __future__ import annotations

import sys

from .fields import FIELDS, SECTION_PATHS, default_text, range_text

_INTRO = """\
# Catalog, sites and inventory formats

<!-- Generated from machinecheck/inputs/fields.py by
     `python -m machinecheck.inputs.formatdoc > docs/format.md`; do not edit. -->

Catalogs and sites files are TOML; catalogs may also be CSV or Excel (.xlsx) inventories.

## Quantities

A quantity is a string with its unit (`"75 kW"`, `"100 hp"`, `"460 V"`, `"45 degC"`, `"93 %"`)
or a bare number in the default unit of its dimension. One grammar serves files and
command-line options:

- a number (`1460`, `0.86`, `2e3`), or a fraction (`"1/2 hp"`); a decimal comma (`"0,75 kW"`)
  only where decimal commas are declared or detected (semicolon-separated CSV);
- then the unit, as nameplates spell it: W, kW, MW, hp, CV/PS (metric horsepower); VA, kVA,
  MVA; V, kV; A, kA; Hz; rpm, r/min, min⁻¹; m, km, ft; degC, °C, degF, °F, K; %; N m, lb-ft;
  kg m2; ohm; ohm/km; mm2, kcmil; h.
- A bare number is read in the default unit: V, A, Hz, rpm, m, degC, N m, kg m2, ohm, and as a
  fraction for efficiencies and power factors (`0.86`). **Power has no default unit**: a bare
  number could be kW or hp, so `power = 50` is an error; write `"50 hp"` or `"37 kW"`.
- Refused: `inf`, `nan`, numbers over 40 characters, numbers that underflow to 0 (`1e-400`),
  unit text that is not a unit (`"93 %%"`), and any value outside the plausible range of its
  field (below; so `1e-310` wherever 0 is not allowed). Ranges are limits of plausibility: a
  value outside is a typing error, not a machine.

Every error names the file, the line (TOML) or row (CSV), the machine or site id and the key.
Inputs larger than 64 MiB are refused.

"""

_PLATE = """\
## Consistency of a nameplate

Besides each value's range, a rating set must agree with itself (a decimal comma read as a
thousands separator, `1.460` rpm for 1460 rpm, shows here):

- speed, poles and frequency: the rated speed must sit below the synchronous speed of the
  poles at the rated frequency, with a slip of at most 10 % (induction motors), or at it
  (synchronous machines);
- current, power and voltage: the efficiency × power factor implied by the rated current must
  lie between 0.15 and 1.0, and within 25 % of the stated efficiency × power factor;
- locked-rotor current: between 1 and 20 times the rated current.

The error says which values disagree and by how much. Several ratings at one frequency with
different speeds make a multispeed plate (one rating set per speed); their pole counts may
differ.

## Supply voltage

`voltage` of a site is line-to-line. Where the number alone is ambiguous, say which: a
three-phase site of 120, 127, 220, 230, 240, 277 or 347 V (the line-to-neutral voltages of
IEC 60038 and North American four-wire systems) with neither `wires` nor `system = "delta"` is
an error. Write `wires = 3` for a three-wire system of that line-to-line voltage, or give the
four-wire system as `voltage = "230/400 V"` (line-to-neutral/line-to-line; read as 400 V,
`wires = 4`).

"""

_CSV = """\
## Spreadsheet inventories (CSV, Excel)

`machinecheck check inventory.csv` and `machinecheck validate inventory.csv` read a CSV file
(or an `.xlsx` workbook, first sheet, with `pip install machinecheck[xlsx]`) of nameplates:

- encodings: UTF-8 with or without byte-order mark, UTF-16 with byte-order mark, and
  Windows-1252 (cp1252); the encoding is detected, and named when the text cannot be read;
- cells are separated by commas, or by semicolons or tabs when the header line has more of
  those; a semicolon file, as spreadsheets set to a decimal comma write it, reads decimal
  commas in figures (`0,86`, `28,4 A`);
- one rating set per row; rows with the same `id` form one machine with several rating sets
  (a dual-frequency or multispeed plate), in row order;
- columns are named like the keys (the column of each key is listed above); any subset, in
  any order, `id` required; empty header cells at the end of the header are ignored;
- a machine's own fields go on its first row; later rows may leave them blank or repeat them,
  but may not differ;
- several values in one cell, one per connection, are separated by `;` (`400 V; 690 V`), or
  by `|` in a semicolon-separated file (`400 V|690 V`);
- blank rows are skipped; at most 50 problems are listed, followed by the count of the rest.

A file whose name ends neither in `.toml`, `.csv` nor `.xlsx` (`.txt`, for example) is read by
its content, and the reader chosen is named in messages (`read as CSV`). `machinecheck convert
inventory.csv --to toml` writes the same catalog as TOML (validated first), and `machinecheck
convert fleet.toml --to csv` goes the other way. `catalogs/inventory.csv` is an example.

## JSON Schema

`machinecheck schema catalog` and `machinecheck schema sites` print a JSON Schema (draft
2020-12) of each format, for editors that validate TOML against a schema. It is generated from
the same field table: keys, types, allowed words and the shape of quantity strings; the
consistency checks stay with `machinecheck validate`.
"""


def format_doc() -> str:
    """docs/format.md, generated from the field table."""
    out = [_INTRO]
    current = None
    for f in FIELDS:
        if f.section != current:
            current = f.section
            out.append(f"\n## `{SECTION_PATHS[f.section]}`\n\n"
                       if f.section in ("machine", "site") else
                       f"\n### `{SECTION_PATHS[f.section]}`\n\n")
            out.append("| key | unit / values | default | CSV column | option | meaning |\n")
            out.append("|---|---|---|---|---|---|\n")
        column = f"`{f.column}`" if f.column else ""
        option = f"`--{f.option}`" if f.option else ""
        many = "; one per connection" if f.many else ""
        out.append(f"| `{f.key}` | {range_text(f)}{many} | {default_text(f)} | {column} | "
                   f"{option} | {f.help} |\n")
    out.append("\n")
    out.append(_PLATE)
    out.append(_CSV)
    return "".join(out)


if __name__ == "__main__":
    sys.stdout.write(format_doc())
