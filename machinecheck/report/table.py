"""Terminal renderer: a rich table per site, a summary line and the caution.

On a terminal the tables take its width. Without one (a pipe, a file) the layout is plain and
stable whatever the environment says: ASCII borders, a fixed width of :data:`PLAIN_WIDTH`,
and each pair's findings listed under the table, one per line, after the machine's id.
"""

from __future__ import annotations

import io
import os
from collections.abc import Sequence
from typing import Any

from ..report import CAUTION
from ..report.data import by_site, driving_findings, number, output_text, summary_counts, worst_first
from ..report.matrix import verdict_matrix
from ..report.text import visible

#: Terminal width under which findings are listed below each site's table.
NARROW_WIDTH = 100
#: Width of the plain layout (no terminal).
PLAIN_WIDTH = 100
#: First line of the demo's report.
DEMO_TITLE = "machinecheck demo: an invented fleet checked against invented sites"

_STYLE = {"compatible": "green", "conditional": "yellow", "incompatible": "bold red"}
_MARK = {"compatible": "compatible", "conditional": "conditional",
         "incompatible": "incompatible"}


def _safe(text: object, limit: int = 400) -> str:
    """User text shown literally: control and escape characters made visible, long text cut."""
    cleaned = visible(text, keep_newlines=True)
    return cleaned if len(cleaned) <= limit else cleaned[: limit - 1] + "…"


def render(assessments: Sequence[Any], *, explain: bool = False, matrix: bool = False,
           width: int | None = None, color: bool | None = None, demo: bool = False,
           **_: Any) -> str:
    """The report as text; ``width`` None: the plain layout (no terminal)."""
    from rich import box
    from rich.console import Console
    from rich.padding import Padding
    from rich.table import Table
    from rich.text import Text

    buffer = io.StringIO()
    plain = width is None
    no_color = plain or color is False or "NO_COLOR" in os.environ
    console = Console(file=buffer, width=PLAIN_WIDTH if plain else width, markup=False,
                      highlight=False, no_color=no_color,
                      force_terminal=not no_color and color is True, emoji=False)
    frame = box.ASCII if plain else box.HEAVY_HEAD
    if demo:
        console.print(Text(DEMO_TITLE, style="bold"))
    # below this width the findings read better under the table than in a narrow column
    beside = console.width >= NARROW_WIDTH and not plain
    for group in by_site(assessments).values():
        s = group[0].site
        title = (f"{_safe(s.id)} - {_safe(s.name)}: " if s.name else f"{_safe(s.id)}: ")
        title += (f"{s.voltage_v:g} V {s.frequency_hz:g} Hz, {s.phases} phase"
                  f"{'s' if s.phases > 1 else ''}, {s.standard}")
        if plain:  # the site's line whole, however narrow its table
            console.print(Text(title), soft_wrap=True)
        table = Table(title=None if plain else title, title_justify="left", show_lines=beside,
                      expand=False, box=frame)
        table.add_column("machine", overflow="fold", max_width=16)
        table.add_column("verdict", no_wrap=True, min_width=12)
        table.add_column("n_s rpm", justify="right")
        table.add_column("speed rpm", justify="right")
        table.add_column("output kW", justify="right")
        table.add_column("FLC A", justify="right")
        table.add_column("load A", justify="right")
        if beside:
            table.add_column("findings", overflow="fold", ratio=1)
        below = []
        for a in worst_first(group):
            found = driving_findings(a)
            lines = [f"{'✗' if f.severity == 'problem' else '!'} {f.message}" for f in found]
            if not lines:
                lines = [f.message for f in a.findings if f.code == "connection"] or ["fits as rated"]
            speed = number(a.expected_speed_rpm, ".0f")
            if a.speed_band_rpm is not None and a.expected_speed_rpm is not None:
                speed += f" ±{a.speed_band_rpm:.0f}"
            output = output_text(a)
            if (a.machine.is_generator and a.available_apparent_power_va is not None
                    and a.rated_apparent_power_va is not None):
                output = (f"{a.available_apparent_power_va / 1000:.0f} / "
                          f"{a.rated_apparent_power_va / 1000:.0f} kVA")
            row: list[Text | str] = [
                Text(_safe(a.machine.id)), Text(_MARK[a.verdict], style=_STYLE[a.verdict]),
                f"{a.synchronous_speed_rpm:.0f}", speed, output,
                number(a.full_load_current_a, ".1f"), number(a.operating_current_a, ".1f")]
            if beside:
                row.append(Text(_safe("\n".join(lines), 4000)))
            else:
                below.append((a, lines))
            table.add_row(*row)
        console.print(table)
        for a, lines in below:
            if plain:  # one line a finding, each naming its pair: grep finds them all
                for line in lines:
                    console.print(Text(f"{_safe(a.machine.id)} at {_safe(s.id)} ({a.verdict}): "
                                       f"{_safe(line, 4000)}"), overflow="ignore", crop=False,
                                  soft_wrap=True)
                continue
            console.print(Text(f"{_safe(a.machine.id)} ({a.verdict}):", style="bold"))
            for line in lines:
                console.print(Padding(Text(_safe(line, 4000)), (0, 0, 0, 2)))
        if explain:
            for a in worst_first(group):
                console.print(Text(f"working for {_safe(a.machine.id)} at {_safe(s.id)}:",
                                   style="bold"))
                for line in a.working:
                    console.print(Text(f"  {_safe(line, 4000)}"))
    if matrix:
        machines, site_ids, cells = verdict_matrix(assessments)
        grid = Table(title="fleet matrix: machines down, sites across", title_justify="left",
                     box=frame)
        grid.add_column("machine")
        for site_id in site_ids:
            grid.add_column(Text(_safe(site_id)))
        for machine_id in machines:
            row = [Text(_safe(machine_id))]
            for site_id in site_ids:
                verdict = cells.get((machine_id, site_id))
                row.append(Text(verdict or "", style=_STYLE.get(verdict or "", "")))
            grid.add_row(*row)
        console.print(grid)
    counts = summary_counts(assessments)
    total = {v: sum(c[v] for c in counts.values()) for v in _MARK}
    console.print(Text(
        f"{len(assessments)} pairs: {total['compatible']} compatible, {total['conditional']} "
        f"conditional, {total['incompatible']} incompatible. Output is available / rated; speed "
        "and load current at full available load (or at the driven load), the speed with the "
        "slip tolerance; FLC is the full-load current at the site."))
    console.print(Text(CAUTION, style="dim"))
    return buffer.getvalue()
