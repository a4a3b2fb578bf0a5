"""Which reader a catalog file gets: TOML, CSV or Excel, by extension and then by content.

``.toml``, ``.csv``/``.tsv`` and ``.xlsx`` choose by extension. Any other name (``.txt``, no
extension) is read by its content: a zip archive is a workbook, a file with ``[[machine]]``
tables or ``key = value`` lines is TOML, a header line of separated names is CSV. The reader
chosen is named in every error message of that file, and in :attr:`Catalog.reader`.
"""

from __future__ import annotations

import os
import re
from dataclasses import dataclass

from ..errors import InputError
from .files import read_bytes

_TOML_LINE = re.compile(rb"^\s*(\[\[?\s*[A-Za-z]|[A-Za-z0-9_\-]+\s*=)", re.M)
_BY_EXTENSION = {".toml": "TOML", ".csv": "CSV", ".tsv": "CSV", ".xlsx": "XLSX"}
_SNIFF = 64 * 1024


@dataclass(frozen=True)
class Choice:
    format: str      # "TOML", "CSV" or "XLSX"
    by_content: bool

    def describe(self) -> str:
        how = "by its content" if self.by_content else "by its extension"
        return f"{self.format} (chosen {how})"


def choose(name: str) -> Choice:
    """The reader for a catalog file."""
    extension = os.path.splitext(name)[1].lower()
    if extension in _BY_EXTENSION:
        return Choice(_BY_EXTENSION[extension], False)
    head = read_bytes(name)[:_SNIFF]
    if head.startswith(b"PK\x03\x04"):
        return Choice("XLSX", True)
    if _TOML_LINE.search(head.lstrip(b"\xef\xbb\xbf")):
        return Choice("TOML", True)
    first = head.split(b"\n", 1)[0]
    if any(sep in first for sep in (b",", b";", b"\t")) or first.startswith((b"\xff\xfe",
                                                                             b"\xfe\xff")):
        return Choice("CSV", True)
    raise InputError(f"cannot tell whether this {extension or 'extension-less'} file is TOML or "
                     "CSV: name it .toml or .csv", file=name)


def note(choice: Choice, errors: list[InputError]) -> list[InputError]:
    """The errors of a file whose reader was chosen by content, with the choice said once."""
    if not choice.by_content or not errors:
        return errors
    first = errors[0]
    return [InputError(f"{first.message} (read as {choice.describe()})", file=first.file,
                       line=first.line, item=first.item, key=first.key,
                       column=first.column), *errors[1:]]
