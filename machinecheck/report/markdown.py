"""Markdown renderer: a heading and a table per site, findings as lists, the caution last."""

from __future__ import annotations

from . import CAUTION
from .data import by_site, driving_findings, number, output_text, summary_counts, worst_first
from .matrix import verdict_matrix


def cell(text) -> str:
    """Table-cell text: pipes escaped, line breaks and control characters removed."""
    cleaned = "".join(ch if ch.isprintable() else " " for ch in str(text))
    return cleaned.replace("\\", "\\\\").replace("|", "\\|")



def render(assessments, *, explain=False, matrix=False, **_) -> str:
    out = ["# machinecheck report", ""]
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
                "| machine | verdict | n_s rpm | speed rpm | output kW | FLC A | load A | flux k |",
                "|---|---|---:|---:|---:|---:|---:|---:|"]
        ordered = worst_first(group)
        for a in ordered:
            power = output_text(a)
            out.append(f"| {cell(a.machine.id)} | {a.verdict} | {a.synchronous_speed_rpm:.0f} | "
                       f"{number(a.expected_speed_rpm, '.0f')} | {power} | "
                       f"{number(a.full_load_current_a, '.1f')} | "
                       f"{number(a.operating_current_a, '.1f')} | {a.flux_ratio:.3f} |")
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
