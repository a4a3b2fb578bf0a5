"""JSON Schemas of the catalog and sites file formats, generated from the field table.

The schemas describe the shape (keys, types, allowed words, quantity strings); machinecheck's
own validation adds the range and consistency checks (plausible values, poles against speed
...). Allowed words are given in their canonical spelling, which machinecheck also accepts in
any case.
"""

from __future__ import annotations

from typing import Any

from . import units
from .fields import (
    CHOICE,
    CONDUCTOR_SIZE,
    INTEGER,
    NUMBER,
    SHARE_OR_TORQUE,
    TABLE,
    TABLES,
    TEXT,
    Field,
    fields_of,
)

DRAFT = "https://json-schema.org/draft/2020-12/schema"
_NUMBER = r"[-+]?([0-9]+([.,][0-9]*)?|[.,][0-9]+)([eE][-+]?[0-9]+)?(\s*/\s*[0-9]+)?"
#: A number with a unit ("75 kW"), or a bare number in a string ("400").
_QUANTITY = rf"^\s*{_NUMBER}\s*[^\s0-9].*$|^\s*{_NUMBER}\s*$"
_WITH_UNIT = rf"^\s*{_NUMBER}\s*[^\s0-9].*$"
_RANGE = r"^\s*[0-9.]+\s*(-|–|to)\s*[0-9.]+\s*\S*.*$"
_MARKED = r"^\s*[0-9.]+\s*/\s*[0-9.]+\s*[A-Za-z]*\s*$"

Schema = dict[str, Any]


def _value(f: Field) -> Schema:
    """The schema of one value of a field (before ``many``)."""
    if f.kind == TEXT:
        out: Schema = {"type": "string"}
        if f.key == "id":
            out.update(minLength=1, maxLength=200)
        return out
    if f.kind == CHOICE:
        words: list[Any] = [str(c) for c in f.choices]
        words += [int(c) for c in words if c.isdigit()]
        return {"enum": words}
    if f.kind == INTEGER:
        out = {"type": "integer"}
        if f.choices:
            out["enum"] = list(f.choices)
        if f.low is not None:
            out["minimum"] = f.low
        if f.high is not None:
            out["maximum"] = f.high
        if f.key == "poles":
            out["multipleOf"] = 2
        return out
    if f.kind == NUMBER:
        return {"type": "number", "minimum": f.low, "maximum": f.high}
    if f.kind in (SHARE_OR_TORQUE, CONDUCTOR_SIZE):
        return {"type": "string", "pattern": _WITH_UNIT}
    if f.kind == "fraction":
        return {"anyOf": [{"type": "number", "exclusiveMinimum": 0, "maximum": 1},
                          {"type": "string", "pattern": _QUANTITY}]}
    string: Schema = {"type": "string", "pattern": _QUANTITY}
    if units.KINDS[f.kind].default is None:
        return {"type": "string", "pattern": _WITH_UNIT}
    return {"anyOf": [{"type": "number"}, string]}


def _property(f: Field) -> Schema:
    if f.kind == TABLE:
        return _object(f.key)
    if f.kind == TABLES:
        return {"type": "array", "minItems": 1, "items": _object(f.key)}
    item = _value(f)
    if f.section == "rating" and f.key == "voltage":
        item = {"anyOf": [item, {"type": "string", "pattern": _RANGE}]}
    if f.section == "site" and f.key == "voltage":
        item = {"anyOf": [item, {"type": "string", "pattern": _MARKED}]}
    if f.section == "site" and f.key == "voltage_range":
        return {"description": f.help,
                "anyOf": [{"type": "array", "items": item, "minItems": 2, "maxItems": 2},
                          {"type": "string", "pattern": _RANGE}]}
    if f.section == "site" and f.key == "line_voltages":
        return {"description": f.help, "type": "array", "items": item, "minItems": 3,
                "maxItems": 3}
    if f.many:
        item = {"anyOf": [item, {"type": "array", "items": item, "minItems": 1}]}
    return {"description": f.help, **item}


def _object(section: str) -> Schema:
    fields = fields_of(section)
    return {"type": "object", "additionalProperties": False,
            "required": [f.key for f in fields if f.required],
            "properties": {f.key: _property(f) for f in fields}}


def catalog_schema() -> Schema:
    """JSON Schema of a machine catalog (see docs/format.md)."""
    return {
        "$schema": DRAFT, "$id": "machinecheck:catalog", "title": "machinecheck machine catalog",
        "type": "object", "additionalProperties": False, "required": ["machine"],
        "properties": {
            "catalog": {"type": "object", "additionalProperties": False,
                        "properties": {"title": {"type": "string"}}},
            "machine": {"type": "array", "items": _object("machine")},
        },
    }


def sites_schema() -> Schema:
    """JSON Schema of a sites file (see docs/format.md)."""
    return {
        "$schema": DRAFT, "$id": "machinecheck:sites", "title": "machinecheck site supplies",
        "type": "object", "additionalProperties": False, "required": ["site"],
        "properties": {"site": {"type": "array", "items": _object("site")}},
    }
