"""The one place that writes a report.

- ``-`` (or no ``--output``) is standard output, and so is a name of it (``/dev/stdout``).
  Shown on a terminal, the text is made visible first
  (:func:`machinecheck.report.text.visible_lines`); a pipe or a redirected file gets the raw
  document.
- A regular file (or a new name in an existing folder) is written atomically: a private
  temporary file in the same folder, renamed over the target when complete. On any error or
  signal the temporary file is removed and the target is as it was.
- A character device or a FIFO, or a symbolic link to one (``/dev/stdout``, ``/dev/null``, a
  named pipe), is written in place: it is opened for writing, never replaced.
- Anything else (a directory, a block device, a socket, a link to a regular file or to nothing)
  is refused: it is never replaced, and no folder is created or entered that the user did not
  name.
"""

from __future__ import annotations

import contextlib
import errno
import os
import stat
import sys
from collections.abc import Iterable, Iterator

from ..errors import MachinecheckError
from ..report.text import ASCII_FALLBACK, visible_lines

#: Pieces of a report: text, or text already encoded as UTF-8.
Pieces = Iterable[str | bytes]

STDOUT = "-"
STANDARD_OUTPUT = "standard output"
TEMPORARY_PREFIX = ".machinecheck-"


class OutputError(MachinecheckError):
    """The report cannot be written where asked: one line naming the target and what to do."""

    def __init__(self, target: str, message: str):
        super().__init__(f"{target}: {message}")
        self.target = target


def _reason(exc: OSError) -> str:
    """What an operating-system error means for the person running the command."""
    reasons = {
        errno.ENOSPC: "no space left on the device; free some space or write elsewhere",
        errno.EDQUOT: "disk quota exceeded; free some space or write elsewhere",
        errno.EROFS: "the file system is read-only; write elsewhere",
        errno.EACCES: "permission denied; write to a folder you may write to",
        errno.EPERM: "operation not permitted; write to a folder you may write to",
        errno.ENAMETOOLONG: "the file name is too long; choose a shorter name",
        errno.EISDIR: "is a directory; give a file name",
        errno.ENOTDIR: "a part of the path is not a folder",
        errno.EIO: "input/output error on the device",
        errno.EBADF: "the stream is closed",
    }
    return reasons.get(exc.errno or 0, exc.strerror or str(exc))


def describe(exc: OSError, target: str) -> OutputError:
    """An operating-system error while writing ``target`` as an :class:`OutputError`."""
    return OutputError(target, _reason(exc))


def _encoded(pieces: Pieces) -> Iterator[bytes]:
    for piece in pieces:
        yield piece if isinstance(piece, bytes) else piece.encode("utf-8")


def write_report(pieces: Pieces, target: str | None, inputs: Iterable[str | None] = (), *,
                 sanitised: bool = False) -> None:
    """Write the report made of ``pieces`` to ``target`` (None or ``-``: standard output).

    ``sanitised``: the renderer has already made every user string visible (the terminal
    table, whose colours must reach the terminal).
    """
    if target is None or target == STDOUT or _is_stdout(target):
        write_stdout(pieces, sanitised=sanitised)
        return
    kind = _target_kind(target, [i for i in inputs if i])
    if kind == "special":
        _write_in_place(pieces, target)
    else:
        _write_atomically(pieces, target)


def write_stdout(pieces: Pieces, *, sanitised: bool = False) -> None:
    """Write text to standard output: made visible on a terminal, raw to a pipe or a file."""
    stream = sys.stdout
    if stream is None:
        raise OutputError(STANDARD_OUTPUT, "is closed; give --output FILE")
    terminal = stream.isatty() and not sanitised
    try:
        for piece in pieces:
            text = piece.decode("utf-8") if isinstance(piece, bytes) else piece
            stream.write(visible_lines(text) if terminal else text)
        stream.flush()
    except BrokenPipeError:
        raise  # the reader has gone: the command ends quietly
    except OSError as exc:
        raise describe(exc, STANDARD_OUTPUT) from None


def _is_stdout(target: str) -> bool:
    """Whether ``target`` names this process's standard output (``/dev/stdout``, ``/dev/fd/1``):
    written as ``-``, so a redirection's file is neither replaced nor rewound."""
    if sys.stdout is None:
        return False
    try:
        ours, named = os.fstat(sys.stdout.fileno()), os.stat(target)
    except (OSError, ValueError):
        return False
    return (ours.st_dev, ours.st_ino) == (named.st_dev, named.st_ino)


def plain_ascii_fallback() -> None:
    """Let standard output and error spell in ASCII what their encoding cannot encode."""
    for stream in (sys.stdout, sys.stderr):
        if stream is not None and hasattr(stream, "reconfigure"):
            with contextlib.suppress(ValueError, OSError):
                stream.reconfigure(errors=ASCII_FALLBACK)


def _target_kind(target: str, inputs: list[str]) -> str:
    """"special" (write in place) or "regular" (write atomically); refuse anything else."""
    try:
        link = os.lstat(target)
    except FileNotFoundError:
        folder = os.path.dirname(os.path.abspath(target))
        if not os.path.isdir(folder):
            raise OutputError(target, f"folder {folder!r} does not exist; create it first, or "
                                      "give a file in an existing folder") from None
        return "regular"
    except OSError as exc:
        raise describe(exc, target) from None
    try:
        status = os.stat(target)
    except FileNotFoundError:
        raise OutputError(target, "is a symbolic link to nothing; give a file name") from None
    except OSError as exc:
        raise describe(exc, target) from None
    if stat.S_ISCHR(status.st_mode) or stat.S_ISFIFO(status.st_mode):
        return "special"
    if stat.S_ISDIR(status.st_mode):
        raise OutputError(target, "is a directory; give a file name")
    if not stat.S_ISREG(status.st_mode):
        raise OutputError(target, "is neither a regular file nor a character device nor a "
                                  "named pipe; refusing to write to it")
    if stat.S_ISLNK(link.st_mode):
        raise OutputError(target, f"is a symbolic link to the regular file "
                                  f"{os.path.realpath(target)!r}; give that path itself")
    for source in inputs:
        with contextlib.suppress(OSError):
            if os.path.samefile(source, target):
                raise OutputError(target, "is an input file; refusing to overwrite it with "
                                          "the report")
    return "regular"


def _write_in_place(pieces: Pieces, target: str) -> None:
    """Write to a character device or a FIFO as it is (no truncation, no replacement)."""
    try:
        handle = os.open(target, os.O_WRONLY | getattr(os, "O_NOCTTY", 0))
    except OSError as exc:
        raise describe(exc, target) from None
    try:
        with os.fdopen(handle, "wb") as stream:
            for data in _encoded(pieces):
                stream.write(data)
    except OSError as exc:
        raise describe(exc, target) from None


def _write_atomically(pieces: Pieces, target: str) -> None:
    """Write a temporary file beside ``target``, then rename it over ``target``."""
    folder = os.path.dirname(os.path.abspath(target))
    handle, temporary = new_temporary(folder, target)
    try:
        with os.fdopen(handle, "wb") as stream:
            for data in _encoded(pieces):
                stream.write(data)
        _copy_mode(target, temporary)
        # the target may have changed since it was looked at: still never replace a non-file
        with contextlib.suppress(FileNotFoundError):
            if not stat.S_ISREG(os.lstat(target).st_mode):
                raise OutputError(target, "changed into something that is not a regular file "
                                          "while the report was written; nothing was written")
        os.replace(temporary, target)
    except OSError as exc:
        _remove(temporary)
        raise describe(exc, target) from None
    except BaseException:  # an error, Ctrl-C or a signal: leave no partial file behind
        _remove(temporary)
        raise


def _copy_mode(target: str, temporary: str) -> None:
    """The report keeps the mode of the file it replaces; a new one gets the usual 0666-umask."""
    try:
        mode = os.stat(target).st_mode & 0o7777
    except FileNotFoundError:
        umask = os.umask(0)
        os.umask(umask)
        mode = 0o666 & ~umask
    os.chmod(temporary, mode)


def _remove(path: str) -> None:
    with contextlib.suppress(OSError):
        os.unlink(path)


def new_temporary(folder: str, target: str) -> tuple[int, str]:
    """A new hidden file in ``folder``, readable and writable by this user only: (fd, path)."""
    for _ in range(100):
        path = os.path.join(folder, f"{TEMPORARY_PREFIX}{os.getpid()}-{os.urandom(4).hex()}.tmp")
        try:
            return os.open(path, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600), path
        except FileExistsError:
            continue
        except OSError as exc:
            raise describe(exc, target) from None
    raise OutputError(target, "could not create a temporary file beside it")
