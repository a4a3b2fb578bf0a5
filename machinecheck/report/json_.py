"""JSON renderer: the stable contract of docs/json.md."""

from __future__ import annotations

import json

from . import CAUTION
from .data import document


def render(assessments, *, explain: bool = False, **_) -> str:
    doc = document(assessments, explain=explain)
    doc["caution"] = CAUTION
    return json.dumps(doc, indent=1, ensure_ascii=False, allow_nan=False) + "\n"
