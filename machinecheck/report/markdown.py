"""Markdown renderer: a heading and a table per site, findings as lists, the caution last."""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any

from ..report import CAUTION
from ..report.data import SITE_COLUMNS, by_site, driving_findings, site_row, summary_counts, worst_first
from ..report.matrix import verdict_matrix


def cell(text: object) -> str:
    """Table-cell text: pipes escaped, line breaks and control characters removed."""
    cleaned = "".join(ch if ch.isprintable() else " " for ch in str(text))
    return cleaned.replace("\\", "\\\\").replace("|", "\\|")


#: Title of the report, and of the demo's.
TITLE = "machinecheck report"
DEMO_TITLE = "machinecheck demo report: an invented fleet against invented sites"


def render(assessments: Sequence[Any], *, explain: bool = False, matrix: bool = False,
           demo: bool = False, **_: Any) -> str:
    out = [f"# {DEMO_TITLE if demo else TITLE}", ""]
    counts = summary_counts(assessments)
    out += ["| site | compatible | conditional | incompatible |", "|---|---:|---:|---:|"]
    out += [f"| {cell(s)} | {c['compatible']} | {c['conditional']} | {c['incompatible']} |"
            for s, c in counts.items()]
    out.append("")
    if matrix:
        machines, sites, cells = verdict_matrix(assessments)
        out += ["## Fleet matrix", "", "| machine | " + " | ".join(cell(s) for s in sites) + " |",
                "|---|" + "---|" * len(sites)]
        out += ["| " + cell(m) + " | " + " | ".join(cells.get((m, s), "") for s in sites) + " |"
                for m in machines]
        out.append("")
    for site_id, group in by_site(assessments).items():
        s = group[0].site
        out += [f"## {cell(site_id)}: {cell(s.name)} ({s.voltage_v:g} V {s.frequency_hz:g} Hz, "
                f"{s.phases} ph, {s.standard})", "",
                "| " + " | ".join(SITE_COLUMNS) + " |", "|---|---|" + "---:|" * 6]
        ordered = worst_first(group)
        out += ["| " + " | ".join(cell(x) for x in site_row(a)) + " |" for a in ordered]
        out.append("")
        for a in ordered:
            found = driving_findings(a)
            if not found and not explain:
                continue
            out.append(f"### {cell(a.machine.id)} at {cell(site_id)}: {a.verdict}")
            out.append("")
            out += [f"- **{f.severity}** `{f.code}`: {cell(f.message)}" for f in found]
            if explain:
                out += ["", "Working:", ""] + [f"    {line}" for line in a.working]
            out.append("")
    out += ["---", "", f"*{CAUTION}*", ""]
    return "\n".join(out)
