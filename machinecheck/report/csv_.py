"""CSV renderer: a header, one row per (machine, site) pair, the caution as the last row."""

from __future__ import annotations

import csv
import io

from ..report import CAUTION
from ..report.data import result_dict

COLUMNS = ("machine", "site", "verdict", "rating_frequency_hz", "rating_voltage_v", "connection",
           "synchronous_speed_rpm", "expected_speed_rpm", "rated_power_kw", "available_power_kw",
           "load_power_kw", "full_load_current_a", "operating_current_a", "flux_ratio",
           "combined_derating", "code_current_a", "finding_codes")
SEPARATOR = ""


def _safe(value):
    """Spreadsheet-safe cell: text that a spreadsheet would run as a formula is quoted."""
    if isinstance(value, str) and value[:1] in ("=", "+", "-", "@"):
        return "'" + value
    return "" if value is None else value


def head(**_) -> str:
    buffer = io.StringIO()
    csv.writer(buffer, lineterminator="\n").writerow(COLUMNS)
    return buffer.getvalue()


def chunk(assessments, **_) -> str:
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    for a in assessments:
        d = result_dict(a)
        codes = ";".join(f"{f['severity']}:{f['code']}" for f in d["findings"])
        writer.writerow([_safe(x) for x in (
            d["machine"], d["site"], d["verdict"], d["rating"]["frequency_hz"],
            d["rating"]["voltage_v"], d["rating"]["connection"], d["synchronous_speed_rpm"],
            d["expected_speed_rpm"], d["rated_power_kw"], d["available_power_kw"],
            d["load_power_kw"], d["full_load_current_a"], d["operating_current_a"],
            d["flux_ratio"], d["combined_derating"], d["code_current_a"], codes)])
    return buffer.getvalue()


def chunk_bytes(assessments, **options) -> bytes:
    return chunk(assessments, **options).encode()


def join(chunks) -> str:
    return "".join(chunks)


def tail(**_) -> str:
    """The caution as a last row, first cell, where a spreadsheet shows it."""
    buffer = io.StringIO()
    csv.writer(buffer, lineterminator="\n").writerow([CAUTION] + [""] * (len(COLUMNS) - 1))
    return buffer.getvalue()


def render(assessments, **_) -> str:
    return head() + chunk(assessments) + tail()
