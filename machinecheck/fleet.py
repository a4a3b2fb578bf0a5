"""Run the check engine over a fleet and render a streamed format (JSON, CSV) chunk by chunk.

Results are rendered and dropped as they are made, so memory stays flat however large the
fleet; on a machine with more than one core, large fleets are split over worker processes
(forked, so they share the validated catalog), and the chunks come back in input order.

When the report goes to a file, a large TOML catalog can go to the workers unparsed: its text is
cut before ``[[machine]]`` headers and each worker parses, validates and checks its own piece.
Anything a piece cannot settle alone (a syntax or validation error, a duplicate id, a table
that is not a machine) raises :class:`Redo`, and the caller loads the catalog whole, which
reports it exactly as usual; the output file is written atomically, so nothing is left of the
first attempt.
"""

from __future__ import annotations

import multiprocessing
import os
import re
import sys
from dataclasses import dataclass, field

from .engine.assessment import VERDICTS
from .report import renderer

try:
    import rtoml
except ImportError:  # pragma: no cover - a platform without its wheel: tomllib alone
    rtoml = None

#: Machines per chunk of work.
CHUNK_MACHINES = 100
#: Fewer pairs than this are checked in the calling process (workers cost ~50 ms to start).
PARALLEL_PAIRS = 6000

_JOB: tuple | None = None  # (machines, sites, fmt, explain, problems_only), read by workers
_TEXT_JOB: tuple | None = None  # (plans, sites, fmt, explain, problems_only), read by workers

#: A line that starts a machine table: the only places a catalog's text is cut.
_MACHINE_HEADER = re.compile(r"^\[\[[ \t]*machine[ \t]*\]\][ \t]*(#.*)?$", re.M)


class Redo(Exception):
    """A piece of a catalog needs the whole file to be judged: load it whole instead."""


@dataclass
class FilePlan:
    """A catalog's text and where it is cut: (start, stop, machines) per piece."""

    name: str
    text: str
    pieces: list

    @property
    def machines(self) -> int:
        return sum(count for _, _, count in self.pieces)


@dataclass
class Tally:
    """Verdict counts of every pair checked, and the number of pairs rendered."""

    counts: dict = field(default_factory=lambda: dict.fromkeys(VERDICTS, 0))
    shown: int = 0

    def add(self, counts: dict, shown: int) -> None:
        for verdict, number in counts.items():
            self.counts[verdict] += number
        self.shown += shown

    @classmethod
    def of(cls, results, problems_only: bool):
        """The tally of checked pairs, and the pairs to render."""
        tally = cls()
        for a in results:
            tally.counts[a.verdict] += 1
        shown = [a for a in results if a.verdict != "compatible"] if problems_only else results
        tally.shown = len(shown)
        return tally, shown


def _work(bounds):
    """Check machines[start:stop] against every site; return (text, counts, shown)."""
    machines, sites, fmt, explain, problems_only = _JOB
    start, stop = bounds
    return _checked(machines[start:stop], sites, fmt, explain, problems_only)


def _work_text(job):
    """Parse, validate and check one piece of a catalog's text; None when it needs the whole."""
    from .errors import MachinecheckError
    from .inputs.catalog import catalog_from_data

    plans, sites, fmt, explain, problems_only = _TEXT_JOB
    index, start, stop = job
    plan = plans[index]
    piece = plan.text[start:stop]
    data = parse_piece(piece)
    if data is None:
        return None
    allowed = ("catalog", "machine") if start == 0 else ("machine",)
    if not isinstance(data.get("machine"), list) or any(key not in allowed for key in data):
        return None
    try:
        machines = catalog_from_data(data, plan.name, piece).machines
    except MachinecheckError:
        return None
    return (*_checked(machines, sites, fmt, explain, problems_only),
            [m.id for m in machines])


#: What TOML 1.1 reads and TOML 1.0 (tomllib) does not: inline tables (1.1 lets them span
#: lines and end in a comma), a BOM, the \e and \x escapes, times without seconds.
_ESCAPE_1_1 = re.compile(r"\\[ex]")
_SHORT_TIME = re.compile(r"(?<![:\d])\d\d:\d\d(?![:\d])")


def _beyond_toml_1_0(text: str) -> bool:
    # substring tests first: the regular expressions run only on texts that could match
    return ("{" in text or "\ufeff" in text
            or ("\\" in text and _ESCAPE_1_1.search(text) is not None)
            or (":" in text and _SHORT_TIME.search(text) is not None))


def parse_piece(text: str) -> dict | None:
    """A piece of catalog as tomllib reads it, or None where tomllib finds an error.

    rtoml (TOML 1.1) parses about three times faster than tomllib (TOML 1.0), and the two
    agree on TOML 1.0 documents; a piece showing anything only 1.1 reads goes to tomllib, so a
    catalog is accepted here exactly when the whole load would accept it.
    """
    from .inputs.catalog import tomllib

    if rtoml is not None and not _beyond_toml_1_0(text):
        try:
            return rtoml.loads(text)
        except Exception:  # any complaint: the whole load names it in tomllib's words
            return None
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError:
        return None


def _checked(machines, sites, fmt, explain, problems_only):
    from .engine.pipeline import assess_all

    tally, shown = Tally.of(assess_all(machines, sites, explain=explain), problems_only)
    # bytes: a worker's text crosses the pipe and reaches the file without re-encoding
    return renderer(fmt).chunk_bytes(shown, explain=explain), tally.counts, tally.shown


def workers_available() -> int:
    try:
        cores = len(os.sched_getaffinity(0))
    except AttributeError:  # pragma: no cover - not Linux
        cores = os.cpu_count() or 1
    fork = sys.platform.startswith("linux") and "fork" in multiprocessing.get_all_start_methods()
    return cores if fork else 1


class _Workers:
    """Forked worker processes mapping a function over jobs, results in job order.

    A worker that dies (killed, out of memory) ends the run with a clear error, not a hang.
    """

    def __init__(self, workers: int, jobs: int):
        from concurrent.futures import ProcessPoolExecutor

        # import what the workers run before forking, so each does not import it again
        from . import rules  # noqa: F401
        from .engine import pipeline  # noqa: F401
        from .inputs import catalog  # noqa: F401

        self._executor = ProcessPoolExecutor(min(workers, jobs),
                                             mp_context=multiprocessing.get_context("fork"))

    def map(self, function, jobs):
        from concurrent.futures.process import BrokenProcessPool

        from .errors import MachinecheckError

        try:
            yield from self._executor.map(function, jobs)
        except BrokenProcessPool:
            raise MachinecheckError("a worker process ended unexpectedly (out of memory?): "
                                    "the report was not finished; try again, or split the catalog") from None

    def close(self) -> None:
        self._executor.shutdown(wait=True, cancel_futures=True)


def _emit(module, results, sizes, tally: Tally, progress, on_result=None):
    """Yield the document, UTF-8, from ordered chunk results; ``tally`` is filled as they come."""
    yield module.head().encode()
    separator = module.SEPARATOR.encode()
    first = True
    for size, result in zip(sizes, results):
        if on_result is not None:
            on_result(result)
        text, counts, shown = result[:3]
        tally.add(counts, shown)
        if progress is not None:
            progress(size)
        if not text:
            continue
        if separator:
            yield b"\n" if first else separator
        first = False
        yield text
    if separator and not first:
        yield b"\n"
    yield module.tail().encode()


def stream(machines, sites, fmt, *, explain=False, problems_only=False, tally: Tally,
           progress=None, workers: int | None = None):
    """Yield the report in pieces of UTF-8; ``tally`` is filled as the pieces are made."""
    global _JOB
    bounds = [(i, min(i + CHUNK_MACHINES, len(machines)))
              for i in range(0, len(machines), CHUNK_MACHINES)]
    workers = workers_available() if workers is None else workers
    parallel = workers > 1 and len(machines) * len(sites) >= PARALLEL_PAIRS and len(bounds) > 1
    _JOB = (machines, sites, fmt, explain, problems_only)
    pool = None
    try:
        if parallel:
            pool = _Workers(workers, len(bounds))
            results = pool.map(_work, bounds)
        else:
            results = map(_work, bounds)
        yield from _emit(renderer(fmt), results, [b - a for a, b in bounds], tally, progress)
    finally:
        if pool is not None:
            pool.close()
        _JOB = None


def machine_header_starts(text: str) -> list[int]:
    """Offsets of the lines that start a machine table (as ``_MACHINE_HEADER`` finds them).

    Only lines that begin with "[[" are tried, and a plain header needs no expression: str.find
    skips the rest several times faster than the expression scanning every line.
    """
    match, plain = _MACHINE_HEADER.match, text.startswith
    starts = [0] if match(text, 0) else []
    at = text.find("\n[[")
    while at >= 0:
        if plain("[[machine]]\n", at + 1) or match(text, at + 1):
            starts.append(at + 1)
        at = text.find("\n[[", at + 3)
    return starts


def plan_file(name: str, text: str) -> FilePlan | None:
    """Where to cut a TOML catalog into pieces of about CHUNK_MACHINES machines; None if unsafe.

    Cutting is safe when no multi-line string could hold a line that looks like a header.
    """
    if '"""' in text or "'''" in text:
        return None
    starts = machine_header_starts(text)
    if len(starts) < 2:
        return None
    firsts = range(0, len(starts), CHUNK_MACHINES)  # index of each piece's first machine
    cuts = [0] + [starts[i] for i in firsts[1:]] + [len(text)]
    return FilePlan(name=name, text=text, pieces=[
        (cuts[n], cuts[n + 1], min(CHUNK_MACHINES, len(starts) - i)) for n, i in enumerate(firsts)])


def stream_files(plans, sites, fmt, *, explain=False, problems_only=False, tally: Tally,
                 progress=None, workers: int):
    """As :func:`stream`, from catalog texts cut by :func:`plan_file`; raises Redo."""
    global _TEXT_JOB
    jobs = [(i, start, stop) for i, plan in enumerate(plans) for start, stop, _ in plan.pieces]
    sizes = [count for plan in plans for _, _, count in plan.pieces]
    seen: set = set()

    def check_piece(result):
        if result is None or not seen.isdisjoint(result[3]):
            raise Redo  # a piece's problem, or an id another piece has: the whole load names it
        seen.update(result[3])

    _TEXT_JOB = (plans, sites, fmt, explain, problems_only)
    pool = _Workers(workers, len(jobs))
    try:
        yield from _emit(renderer(fmt), pool.map(_work_text, jobs), sizes, tally, progress,
                         on_result=check_piece)
    finally:
        pool.close()
        _TEXT_JOB = None
