"""CSV renderer: a header, one row per (machine, site) pair, the caution as the last row."""

from __future__ import annotations

import csv
import io
from collections.abc import Iterable
from typing import Any

from ..report import CAUTION
from ..report.data import result_dict

COLUMNS = ("machine", "site", "verdict", "rating_frequency_hz", "rating_voltage_v", "connection",
           "synchronous_speed_rpm", "expected_speed_rpm", "rated_power_kw", "available_power_kw",
           "load_power_kw", "full_load_current_a", "operating_current_a", "flux_ratio",
           "combined_derating", "code_current_a", "finding_codes")
SEPARATOR = ""


#: First characters with which a spreadsheet starts a formula (or, tab and carriage return,
#: which some spreadsheets skip before looking for one).
FORMULA_STARTS = ("=", "+", "-", "@", "\t", "\r")


def neutral_cell(value: object) -> object:
    """A CSV cell a spreadsheet shows as text, never runs as a formula.

    Text starting with one of :data:`FORMULA_STARTS` gets a leading apostrophe (the
    spreadsheets' own mark for "text"); numbers, None (an empty cell) and other text are kept.
    Every CSV the project writes passes its cells through this function.
    """
    if isinstance(value, str) and value.startswith(FORMULA_STARTS):
        return "'" + value
    return "" if value is None else value


def head(**_: Any) -> str:
    buffer = io.StringIO()
    csv.writer(buffer, lineterminator="\n").writerow(COLUMNS)
    return buffer.getvalue()


def chunk(assessments: Iterable[Any], **_: Any) -> str:
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    for a in assessments:
        d = result_dict(a)
        codes = ";".join(f"{f['severity']}:{f['code']}" for f in d["findings"])
        writer.writerow([neutral_cell(x) for x in (
            d["machine"], d["site"], d["verdict"], d["rating"]["frequency_hz"],
            d["rating"]["voltage_v"], d["rating"]["connection"], d["synchronous_speed_rpm"],
            d["expected_speed_rpm"], d["rated_power_kw"], d["available_power_kw"],
            d["load_power_kw"], d["full_load_current_a"], d["operating_current_a"],
            d["flux_ratio"], d["combined_derating"], d["code_current_a"], codes)])
    return buffer.getvalue()


def chunk_bytes(assessments: Iterable[Any], **options: Any) -> bytes:
    return chunk(assessments, **options).encode()


def join(chunks: Iterable[str]) -> str:
    return "".join(chunks)


def tail(**_: Any) -> str:
    """The caution as a last row, first cell, where a spreadsheet shows it."""
    buffer = io.StringIO()
    csv.writer(buffer, lineterminator="\n").writerow([CAUTION] + [""] * (len(COLUMNS) - 1))
    return buffer.getvalue()


def render(assessments: Iterable[Any], **_: Any) -> str:
    return head() + chunk(assessments) + tail()
