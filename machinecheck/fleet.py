"""Check a fleet and render a streamed format (JSON, CSV) chunk by chunk, in input order.

The catalog is parsed and validated once, in the calling process. The pairs are then checked
in chunks of :data:`CHUNK_MACHINES` machines: in the calling process for a small fleet, or, on a
machine with more than one core, by forked worker processes that share the parsed machines
(nothing is sent to them). Worker ``w`` of ``n`` takes chunks ``w, w + n, w + 2n ...`` and
sends each rendered chunk back through its own pipe, so the parent reads the chunks in input
order and writes them as they come: memory stays bounded however large the fleet.

Before forking, the parsed fleet is frozen out of the garbage collector's generations
(:func:`gc.freeze`, which exists for this): otherwise each worker's collections walk every
inherited object, copying the parent's pages into the worker one by one.

A worker that dies (killed, out of memory), even in the middle of sending a chunk, closes its
pipe: the parent sees the end of the pipe at once and stops with a clear error. When the
parent stops (an error, a signal), it ends every worker and waits for them.
"""

from __future__ import annotations

import contextlib
import gc
import multiprocessing
import os
import signal
import sys
from collections.abc import Callable, Generator, Iterator, Sequence
from dataclasses import dataclass, field
from multiprocessing.connection import Connection
from types import ModuleType
from typing import Any

from .engine.assessment import VERDICTS
from .errors import MachinecheckError
from .model import Machine, Site
from .report import renderer

#: Machines per chunk of work.
CHUNK_MACHINES = 100
#: Fewer pairs than this are checked in the calling process (starting workers costs ~50 ms).
PARALLEL_PAIRS = 6000
#: How long an ended worker is given to exit before it is killed [s].
WORKER_GRACE_S = 2.0

#: The signals that stop a run (the parent's handlers end the workers).
_STOP_SIGNALS = {signal.SIGTERM, signal.SIGHUP, signal.SIGINT}

#: One chunk's result: the rendered UTF-8 text, the verdict counts, the number of pairs shown.
ChunkResult = tuple[bytes, dict[str, int], int]


@dataclass(frozen=True)
class Job:
    """What every chunk is checked with (shared with forked workers, never sent)."""

    machines: Sequence[Machine]
    sites: Sequence[Site]
    fmt: str
    explain: bool = False
    problems_only: bool = False


@dataclass
class Tally:
    """Verdict counts of every pair checked, and the number of pairs rendered."""

    counts: dict[str, int] = field(default_factory=lambda: dict.fromkeys(VERDICTS, 0))
    shown: int = 0

    def add(self, counts: dict[str, int], shown: int) -> None:
        for verdict, number in counts.items():
            self.counts[verdict] += number
        self.shown += shown

    @classmethod
    def of(cls, results: Sequence[Any], problems_only: bool) -> tuple[Tally, list[Any]]:
        """The tally of checked pairs, and the pairs to render."""
        tally = cls()
        for a in results:
            tally.counts[a.verdict] += 1
        shown = [a for a in results if a.verdict != "compatible"] if problems_only else list(results)
        tally.shown = len(shown)
        return tally, shown


def check_chunk(job: Job, start: int, stop: int) -> ChunkResult:
    """Check machines[start:stop] against every site and render them."""
    from .engine.pipeline import assess_all

    results = assess_all(job.machines[start:stop], job.sites, explain=job.explain)
    tally, shown = Tally.of(results, job.problems_only)
    module = renderer(job.fmt)
    return module.chunk_bytes(shown, explain=job.explain), tally.counts, tally.shown


def workers_available() -> int:
    """Worker processes worth starting: the usable cores where fork exists, else 1."""
    try:
        cores = len(os.sched_getaffinity(0))
    except AttributeError:  # pragma: no cover - not Linux
        cores = os.cpu_count() or 1
    fork = sys.platform.startswith("linux") and "fork" in multiprocessing.get_all_start_methods()
    return cores if fork else 1


def _worker(job: Job, bounds: Sequence[tuple[int, int]], sender: Connection,
            others: Sequence[Connection]) -> None:
    """A forked worker: check its chunks in order and send each one back."""
    # born with the stop signals blocked (see Workers): the parent's handlers are replaced
    # before any can arrive
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # Ctrl-C: the parent stops the run
    for signum in (signal.SIGTERM, signal.SIGHUP):
        signal.signal(signum, signal.SIG_DFL)
    signal.pthread_sigmask(signal.SIG_UNBLOCK, _STOP_SIGNALS)
    for connection in others:  # so that the parent's death closes every pipe to it
        connection.close()
    try:
        for start, stop in bounds:
            sender.send(check_chunk(job, start, stop))
    except (BrokenPipeError, ConnectionResetError):  # the parent has gone: stop quietly
        pass
    except Exception as exc:  # the parent raises it, as the one process would have
        with contextlib.suppress(Exception):
            sender.send(exc)
    finally:
        sender.close()


class Workers:
    """Forked workers over the chunks of a job; :meth:`results` yields them in chunk order."""

    def __init__(self, job: Job, bounds: Sequence[tuple[int, int]], workers: int):
        # import what the workers run before forking, so that none imports it again
        from .engine import pipeline  # noqa: F401

        renderer(job.fmt)
        context = multiprocessing.get_context("fork")
        # the parsed fleet moves out of the collector's reach: a worker's collections then
        # never walk (and so never copy) the pages it shares with the parent (see gc.freeze)
        gc.freeze()
        for std in (sys.stdout, sys.stderr):  # a child must not write the parent's buffer again
            if std is not None:
                std.flush()
        self.count = min(workers, len(bounds))
        self.bounds = bounds
        self.readers: list[Connection] = []
        self.processes: list[Any] = []
        try:
            for index in range(self.count):
                reader, sender = context.Pipe(duplex=False)
                process = context.Process(
                    target=_worker, name=f"machinecheck-worker-{index}", daemon=True,
                    args=(job, bounds[index::self.count], sender, list(self.readers)))
                # a stop signal between the fork and the worker's own handlers would run the
                # parent's handler in the worker: blocked until the worker has replaced them
                mask = signal.pthread_sigmask(signal.SIG_BLOCK, _STOP_SIGNALS)
                try:
                    process.start()
                finally:
                    signal.pthread_sigmask(signal.SIG_SETMASK, mask)
                sender.close()
                self.readers.append(reader)
                self.processes.append(process)
        except BaseException:
            self.close()
            raise

    def results(self) -> Iterator[ChunkResult]:
        for index in range(len(self.bounds)):
            worker = index % self.count
            try:
                result: ChunkResult | Exception = self.readers[worker].recv()
            except (EOFError, OSError):
                raise self._died(worker) from None
            if isinstance(result, Exception):
                raise result
            yield result

    def _died(self, worker: int) -> MachinecheckError:
        process = self.processes[worker]
        process.join(WORKER_GRACE_S)
        code = process.exitcode
        how = (f"was killed by {signal.Signals(-code).name}" if code is not None and code < 0
               else f"ended with status {code}" if code is not None else "closed its pipe")
        return MachinecheckError(f"a worker process {how} before sending all its results (out "
                                 "of memory?); the report was not finished; try again, or split "
                                 "the catalog")

    def close(self) -> None:
        """End every worker still running and wait for it."""
        gc.unfreeze()
        for reader in self.readers:
            reader.close()
        for process in self.processes:
            if process.is_alive():
                process.terminate()
        for process in self.processes:
            process.join(WORKER_GRACE_S)
            if process.is_alive():
                process.kill()
                process.join()


def _emit(module: ModuleType, results: Iterator[ChunkResult], sizes: Sequence[int],
          tally: Tally, progress: Callable[[int], object] | None) -> Iterator[bytes]:
    """The document, UTF-8, from ordered chunk results; ``tally`` is filled as they come."""
    yield module.head().encode()
    separator = module.SEPARATOR.encode()
    first = True
    for size, (text, counts, shown) in zip(sizes, results):
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


def stream(machines: Sequence[Machine], sites: Sequence[Site], fmt: str, *, explain: bool = False,
           problems_only: bool = False, tally: Tally,
           progress: Callable[[int], object] | None = None,
           workers: int | None = None) -> Generator[bytes, None, None]:
    """Yield the report in pieces of UTF-8; ``tally`` is filled as the pieces are made."""
    job = Job(machines, sites, fmt, explain, problems_only)
    bounds = [(i, min(i + CHUNK_MACHINES, len(machines)))
              for i in range(0, len(machines), CHUNK_MACHINES)]
    workers = workers_available() if workers is None else workers
    parallel = workers > 1 and len(machines) * len(sites) >= PARALLEL_PAIRS and len(bounds) > 1
    pool = Workers(job, bounds, workers) if parallel else None
    try:
        results = (pool.results() if pool is not None
                   else (check_chunk(job, start, stop) for start, stop in bounds))
        yield from _emit(renderer(fmt), results, [b - a for a, b in bounds], tally, progress)
    finally:
        if pool is not None:
            pool.close()
