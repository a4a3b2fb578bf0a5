"""JSON renderer: the stable contract of docs/json.md.

One result per line, each encoded compactly: the C encoder is used (indenting falls back to
the pure-Python one, ten times slower on a large fleet) and the file stays readable by line.
The document is built from parts (head, chunks of results, tail) so a large fleet can be
written as it is checked.
"""

from __future__ import annotations

import json

from .. import __version__
from . import CAUTION
from .data import result_dict

_encode = json.JSONEncoder(ensure_ascii=False, allow_nan=False).encode
SEPARATOR = ",\n"


def head(**_) -> str:
    return (f'{{"machinecheck": {_encode(__version__)}, "caution": {_encode(CAUTION)}, '
            '"results": [')


def chunk(assessments, *, explain: bool = False, **_) -> str:
    """The results of some pairs, one per line, without a trailing separator."""
    return SEPARATOR.join(_encode(result_dict(a, explain=explain)) for a in assessments)


def join(chunks) -> str:
    body = SEPARATOR.join(c for c in chunks if c)
    return "\n" + body + "\n" if body else ""


def tail(**_) -> str:
    return "]}\n"


def render(assessments, *, explain: bool = False, **_) -> str:
    return head() + join([chunk(assessments, explain=explain)]) + tail()
