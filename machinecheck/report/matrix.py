"""Fleet matrix: machines down, sites across, the verdict in each cell."""

from __future__ import annotations


def verdict_matrix(assessments):
    """Return (machine ids, site ids, {(machine, site): verdict}) in first-seen order."""
    machines, sites, cells = [], [], {}
    for a in assessments:
        if a.machine.id not in cells.setdefault("_m", set()):
            cells["_m"].add(a.machine.id)
            machines.append(a.machine.id)
        if a.site.id not in cells.setdefault("_s", set()):
            cells["_s"].add(a.site.id)
            sites.append(a.site.id)
        cells[(a.machine.id, a.site.id)] = a.verdict
    return machines, sites, {k: v for k, v in cells.items() if isinstance(k, tuple)}
