"""Fleet matrix: machines down, sites across, the verdict in each cell."""

from __future__ import annotations

from collections.abc import Iterable

from ..engine.assessment import Assessment, Verdict


def verdict_matrix(
        assessments: Iterable[Assessment],
) -> tuple[list[str], list[str], dict[tuple[str, str], Verdict]]:
    """Return (machine ids, site ids, {(machine, site): verdict}) in first-seen order."""
    cells: dict[tuple[str, str], Verdict] = {}
    machines: dict[str, None] = {}
    sites: dict[str, None] = {}
    for a in assessments:
        machines.setdefault(a.machine.id)
        sites.setdefault(a.site.id)
        cells[(a.machine.id, a.site.id)] = a.verdict
    return list(machines), list(sites), cells
