"""The one TOML reader: text to plain data, with the line of every table and key on demand.

tomllib (tomli on Python 3.10) parses; its errors, and the failures of a hostile input (nesting
deeper than :data:`MAX_DEPTH`, an integer beyond Python's digit limit, exhausted memory or
recursion), become one :class:`~machinecheck.errors.InputError` naming the file and line.
"""

from __future__ import annotations

import os
import re
import sys
from typing import Any

from ..errors import InputError
from .files import decode_utf8, read_bytes

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover - exercised on Python 3.10 only
    import tomli as tomllib  # type: ignore[import-not-found, no-redef, unused-ignore]

__all__ = ["MAX_DEPTH", "Locator", "parse_toml", "read_text", "tomllib"]

#: Deepest nesting of arrays and inline tables accepted (a catalog needs 4).
MAX_DEPTH = 32

_TOML_POSITION = re.compile(r"\(at line (\d+), column (\d+)\)")
_HEADER = re.compile(r"^\s*(\[\[?)\s*([A-Za-z0-9_.\-\"' ]+?)\s*\]\]?\s*(#.*)?$")
_KEY = re.compile(r"^\s*([A-Za-z0-9_\-]+)\s*=")


def read_text(path: str | os.PathLike[str], what: str = "TOML or CSV") -> str:
    """Read a UTF-8 text file (size-capped); every failure is an InputError naming the file."""
    name = os.fspath(path)
    return decode_utf8(read_bytes(name), name, what)


def _too_deep(text: str) -> int | None:
    """The line where brackets nest deeper than MAX_DEPTH, or None (a quick over-estimate:
    brackets inside strings count too, so only a pathological file is looked at closely)."""
    if text.count("[") + text.count("{") <= MAX_DEPTH:
        return None
    depth = 0
    line = 1
    in_string: str | None = None
    for ch in text:
        if ch == "\n":
            line += 1
            if in_string in ('"', "'", "#"):
                in_string = None
        elif in_string is not None:
            if ch == in_string and ch != "#":
                in_string = None
        elif ch in "\"'":
            in_string = ch
        elif ch == "#":
            in_string = "#"  # a comment, to the end of the line
        elif ch in "[{":
            depth += 1
            if depth > MAX_DEPTH:
                return line
        elif ch in "]}":
            depth = max(0, depth - 1)
    return None


def parse_toml(text: str, name: str) -> dict[str, Any]:
    """Parse TOML text; a syntax error names the file and line."""
    if not text.strip():
        raise InputError("file is empty", file=name)
    deep = _too_deep(text)
    if deep is not None:
        raise InputError(f"arrays or tables nest deeper than {MAX_DEPTH} levels", file=name,
                         line=deep)
    try:
        data: dict[str, Any] = tomllib.loads(text)
        return data
    except tomllib.TOMLDecodeError as exc:
        message = str(exc)
        match = _TOML_POSITION.search(message)
        line = int(match.group(1)) if match else None
        message = _TOML_POSITION.sub("", message).strip()
        raise InputError(f"TOML syntax error: {message}", file=name, line=line) from None
    except RecursionError:
        raise InputError("TOML nests too deeply to read", file=name) from None
    except MemoryError:
        raise InputError("is too large to read into memory", file=name) from None
    except ValueError as exc:  # an integer beyond the 4300-digit conversion limit
        raise InputError(f"a number is too long to read ({exc})", file=name) from None


Path = tuple[Any, ...]


class Locator:
    """Finds the line of a table or key in TOML text; built only when an error needs it.

    ``index`` gives the lines ready-made ({path: line}), as a spreadsheet reader knows them.
    """

    def __init__(self, text: str | None, index: dict[Path, int] | None = None):
        self._text = "" if text is None and index is not None else text
        self._index = index

    def _build(self) -> dict[Path, int]:
        index: dict[Path, int] = {}
        counters: dict[str, int] = {}
        context: Path = ()
        for number, line in enumerate((self._text or "").splitlines(), start=1):
            header = _HEADER.match(line)
            if header:
                name = header.group(2).replace('"', "").replace("'", "").replace(" ", "")
                parts = name.split(".")
                if header.group(1) == "[[":
                    if len(parts) == 1:
                        counters = {parts[0]: counters.get(parts[0], -1) + 1}
                        context = (parts[0], counters[parts[0]])
                    else:
                        base = (parts[0], counters.get(parts[0], 0))
                        sub = ".".join(parts[1:])
                        counters[sub] = counters.get(sub, -1) + 1
                        context = (*base, sub, counters[sub])
                elif len(parts) == 1:
                    context = (parts[0],)
                else:
                    context = (parts[0], counters.get(parts[0], 0), ".".join(parts[1:]))
                index.setdefault(context, number)
                continue
            key = _KEY.match(line)
            if key:
                index.setdefault((*context, key.group(1)), number)
                if len(context) == 2 and key.group(1) in ("rating", "load"):
                    index.setdefault((*context, key.group(1), 0), number)
        return index

    def line(self, *path: Any) -> int | None:
        if self._text is None:
            return None
        if self._index is None:
            self._index = self._build()
        while path:
            found = self._index.get(tuple(path))
            if found is not None:
                return found
            path = path[:-1]
        return None
