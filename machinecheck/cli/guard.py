"""How a command ends: one clear line and exit 2 for what goes wrong, never a traceback.

- Project errors (bad input, an output that cannot be written) print one line each on standard
  error, made visible (a catalog's escape sequences never reach the terminal), and exit 2.
- SIGTERM, SIGHUP and SIGINT raise :class:`Stopped` in the main thread, so every ``finally``
  runs (temporary files removed, worker processes ended); the exit status is 128 + the signal
  number (143, 129, 130), as shells report a process ended by that signal.
- A closed pipe on standard output (``machinecheck speed ... | head -c1``) ends the command
  quietly with the status of SIGPIPE (141).
- An operating-system error on standard output (``/dev/full``, a closed stream) is one line and
  exit 2; what was left in the buffer is dropped so that the interpreter's last flush is silent.
- Standard output and error spell in plain ASCII what their encoding cannot show.
"""

from __future__ import annotations

import errno
import os
import signal
import sys
from collections.abc import Iterable
from types import FrameType

import click

from ..errors import InputError, InputErrors, MachinecheckError
from ..report.text import visible
from .output import STANDARD_OUTPUT, OutputError, describe, plain_ascii_fallback

EXIT_OK, EXIT_PROBLEM, EXIT_INPUT = 0, 1, 2
EXIT_BROKEN_PIPE = 128 + 13

#: The signals that end a command cleanly.
STOP_SIGNALS = tuple(getattr(signal, name) for name in ("SIGTERM", "SIGHUP", "SIGINT")
                     if hasattr(signal, name))


class Stopped(BaseException):
    """A signal asked the command to stop; unwinds like KeyboardInterrupt."""

    def __init__(self, signum: int):
        super().__init__(signum)
        self.signum = signum


def _raise_stopped(signum: int, _frame: FrameType | None) -> None:
    raise Stopped(signum)


def say(line: str) -> None:
    """One line on standard error (nothing when standard error is closed)."""
    stream = sys.stderr
    if stream is None:
        return
    try:
        stream.write(line + "\n")
        stream.flush()
    except (OSError, ValueError):
        pass


def fail(errors: Iterable[object]) -> None:
    """Print each error as one visible line and exit 2."""
    for error in errors:
        say(f"machinecheck: error: {visible(error)}")
    raise SystemExit(EXIT_INPUT)


def _silence_stdout() -> None:
    """Point standard output at /dev/null, so the interpreter's final flush cannot fail."""
    try:
        descriptor = sys.stdout.fileno() if sys.stdout is not None else -1
    except (OSError, ValueError):  # an in-memory stream (tests): nothing to silence
        return
    if descriptor < 0:
        return
    try:
        null = os.open(os.devnull, os.O_WRONLY)
        os.dup2(null, descriptor)
        os.close(null)
    except OSError:
        pass


def _stdout_failed(exc: OSError) -> int:
    _silence_stdout()
    if exc.errno == errno.EPIPE:
        return EXIT_BROKEN_PIPE
    say(f"machinecheck: error: {describe(exc, STANDARD_OUTPUT)}")
    return EXIT_INPUT


def _finish_stdout() -> None:
    if sys.stdout is None:
        return
    try:
        sys.stdout.flush()
    except OSError as exc:
        raise SystemExit(_stdout_failed(exc)) from None


def run_guarded(ctx: click.Context, group: click.Group) -> object:
    """Run the group's command under the rules above (called from the group's ``invoke``)."""
    previous = {}
    try:
        for signum in STOP_SIGNALS:
            previous[signum] = signal.signal(signum, _raise_stopped)
    except ValueError:  # not the main thread: signals stay as they are
        pass
    plain_ascii_fallback()
    try:
        return _run(ctx, group)
    finally:
        for signum, handler in previous.items():
            signal.signal(signum, handler)


def _run(ctx: click.Context, group: click.Group) -> object:
    try:
        result = click.Group.invoke(group, ctx)
        _finish_stdout()
        return result
    except InputErrors as exc:
        fail(exc.errors)
    except MachinecheckError as exc:
        if isinstance(exc, OutputError) and exc.target == STANDARD_OUTPUT:
            _silence_stdout()
        fail([exc])
    except Stopped as exc:
        say(f"machinecheck: stopped by {signal.Signals(exc.signum).name}")
        raise SystemExit(128 + exc.signum) from None
    except KeyboardInterrupt:
        say("machinecheck: stopped by SIGINT")
        raise SystemExit(128 + signal.SIGINT) from None
    except BrokenPipeError as exc:
        raise SystemExit(_stdout_failed(exc)) from None
    except OSError as exc:
        name = os.fsdecode(exc.filename) if exc.filename is not None else "a file or stream"
        fail([describe(exc, name)])
    except SystemExit:
        _finish_stdout()
        raise
    except (RecursionError, MemoryError) as exc:
        what = "too deeply nested" if isinstance(exc, RecursionError) else "too large"
        fail([InputError(f"the input is {what} to process; split it or simplify it")])
    return None
