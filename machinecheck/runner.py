"""Run the check engine over a fleet and render a streamed format (JSON, CSV) chunk by chunk.

Results are rendered and dropped as they are made, so memory stays flat however large the
fleet; on a machine with more than one core, large fleets are split over worker processes
(forked, so they share the validated catalog), and the chunks come back in input order.
"""

from __future__ import annotations

import importlib
import multiprocessing
import os
import sys
from dataclasses import dataclass, field

#: Machines per chunk of work.
CHUNK_MACHINES = 400
#: Fewer pairs than this are checked in the calling process (workers cost ~50 ms to start).
PARALLEL_PAIRS = 6000

_JOB: tuple | None = None  # (machines, sites, fmt, explain, problems_only), read by workers


@dataclass
class Tally:
    """Verdict counts of every pair checked, and the number of pairs rendered."""

    counts: dict = field(default_factory=lambda: {"compatible": 0, "conditional": 0,
                                                  "incompatible": 0})
    shown: int = 0

    def add(self, counts: dict, shown: int) -> None:
        for verdict, number in counts.items():
            self.counts[verdict] += number
        self.shown += shown


def renderer(fmt: str):
    return importlib.import_module(f".report.{ {'json': 'json_', 'csv': 'csv_'}[fmt] }",
                                   __package__)


def _work(bounds):
    """Check machines[start:stop] against every site; return (text, counts, shown)."""
    from .check import assess_all

    machines, sites, fmt, explain, problems_only = _JOB
    start, stop = bounds
    results = assess_all(machines[start:stop], sites, explain=explain)
    counts = {"compatible": 0, "conditional": 0, "incompatible": 0}
    for a in results:
        counts[a.verdict] += 1
    shown = [a for a in results if a.verdict != "compatible"] if problems_only else results
    return renderer(fmt).chunk(shown, explain=explain), counts, len(shown)


def workers_available() -> int:
    try:
        cores = len(os.sched_getaffinity(0))
    except AttributeError:  # pragma: no cover - not Linux
        cores = os.cpu_count() or 1
    fork = sys.platform.startswith("linux") and "fork" in multiprocessing.get_all_start_methods()
    return cores if fork else 1


def stream(machines, sites, fmt, *, explain=False, problems_only=False, tally: Tally,
           progress=None, workers: int | None = None):
    """Yield the report text in pieces; ``tally`` is filled as the pieces are made."""
    global _JOB
    module = renderer(fmt)
    bounds = [(i, min(i + CHUNK_MACHINES, len(machines)))
              for i in range(0, len(machines), CHUNK_MACHINES)]
    workers = workers_available() if workers is None else workers
    parallel = workers > 1 and len(machines) * len(sites) >= PARALLEL_PAIRS and len(bounds) > 1
    _JOB = (machines, sites, fmt, explain, problems_only)
    yield module.head()
    pool = None
    try:
        if parallel:
            pool = multiprocessing.get_context("fork").Pool(min(workers, len(bounds)))
            pieces = pool.imap(_work, bounds)
        else:
            pieces = map(_work, bounds)
        first = True
        for (start, stop), (text, counts, shown) in zip(bounds, pieces):
            tally.add(counts, shown)
            if progress is not None:
                progress(stop - start)
            if not text:
                continue
            if module.SEPARATOR and first:
                yield "\n"
            elif module.SEPARATOR:
                yield module.SEPARATOR
            first = False
            yield text
        if module.SEPARATOR and not first:
            yield "\n"
        yield module.tail()
    finally:
        if pool is not None:
            pool.terminate()
            pool.join()
        _JOB = None
