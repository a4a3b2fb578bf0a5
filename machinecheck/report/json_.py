"""JSON renderer: the stable contract of docs/json.md.

One result per line, each encoded compactly: the C encoder is used (indenting falls back to
the pure-Python one, ten times slower on a large fleet) and the file stays readable by line.
"""

from __future__ import annotations

import json

from . import CAUTION
from .data import document


def render(assessments, *, explain: bool = False, **_) -> str:
    doc = document(assessments, explain=explain)
    encode = json.JSONEncoder(ensure_ascii=False, allow_nan=False).encode
    head = (f'{{"machinecheck": {encode(doc["machinecheck"])}, "caution": {encode(CAUTION)}, '
            '"results": [')
    body = ",\n".join(encode(result) for result in doc["results"])
    return head + ("\n" + body + "\n" if body else "") + "]}\n"
