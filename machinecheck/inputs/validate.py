"""Reading one table of input through the field table, collecting every problem with its place.

:class:`Problems` gathers the errors of one file (the first :data:`MAX_ERRORS` kept, the rest
counted); :class:`Reader` reads the keys of one machine or site by their :class:`~.fields.Field`:
type, unit, range and allowed words are checked here and nowhere else.
"""

from __future__ import annotations

import difflib
import math
import re
from collections.abc import Iterable
from functools import lru_cache
from typing import Any

from ..errors import InputError, InputErrors
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
    field,
    keys_of,
)
from .toml_ import Locator

MAX_ERRORS = 50

_AWG = re.compile(r"^\s*(\d{1,2}|[1-4]/0|0{1,4})\s*(AWG|awg)\s*$")


def closest(word: str, choices: Iterable[object]) -> list[str]:
    """The one choice nearest ``word`` (difflib, cutoff 0.6), or none: the hint of an error."""
    return difflib.get_close_matches(word, [str(c) for c in choices], n=1, cutoff=0.6)


class Problems:
    """The problems of one input: the first MAX_ERRORS kept, the rest counted."""

    def __init__(self, name: str) -> None:
        self.name = name
        self.errors: list[InputError] = []
        self.count = 0

    def add(self, error: InputError) -> None:
        self.count += 1
        if len(self.errors) < MAX_ERRORS:
            self.errors.append(error)

    def raise_any(self) -> None:
        """Raise InputErrors when there were problems (with the count of those not shown)."""
        if not self.count:
            return
        errors = list(self.errors)
        if self.count > len(errors):
            errors.append(InputError(f"{self.count - len(errors)} more problems not shown "
                                     f"(the first {len(errors)} are listed)", file=self.name))
        raise InputErrors(errors)


@lru_cache(maxsize=64)
def _choice_lookup(choices: tuple[object, ...]) -> dict[str, object]:
    """{CHOICE: choice}: the spelling to keep for each accepted value, read in any case."""
    return {str(c).upper(): c for c in choices}


class Reader:
    """Reads the keys of one item (a machine or site) and its sub-tables, by the field table.

    ``base`` is the locator path of the item, e.g. ("machine", 3); ``sub`` of a call the path
    of a sub-table below it, e.g. ("rating", 0); ``prefix`` the key-path prefix in messages,
    e.g. "rating[1].".
    """

    def __init__(self, name: str, locator: Locator, problems: Problems, item: str | None,
                 base: tuple[Any, ...], *, decimal_comma: bool = False) -> None:
        self.name = name
        self.locator = locator
        self.problems = problems
        self.item = item
        self.base = base
        self.decimal_comma = decimal_comma

    @property
    def count(self) -> int:
        return self.problems.count

    def fail(self, message: str, key: str | None = None, sub: tuple[Any, ...] = ()) -> None:
        path = self.base + tuple(sub) + ((key.split(".")[-1].split("[")[0],) if key else ())
        self.problems.add(InputError(message, file=self.name, line=self.locator.line(*path),
                                     item=self.item, key=key))

    def unknown_keys(self, table: dict[str, Any], section: str, prefix: str = "",
                     sub: tuple[Any, ...] = (), allowed: tuple[str, ...] | None = None) -> None:
        allowed = allowed if allowed is not None else keys_of(section)
        for key in table:
            if key not in allowed:
                close = closest(key, allowed)
                hint = f" (did you mean {close[0]!r}?)" if close else ""
                expected = "" if close else f"; allowed keys: {', '.join(allowed)}"
                self.fail(f"unknown key {units.shown(key)}{hint}{expected}", prefix + key, sub)

    def table(self, parent: dict[str, Any], section: str, key: str,
              prefix: str = "") -> dict[str, Any] | None:
        """A sub-table ([machine.start] ...), checked for unknown keys; None when absent."""
        raw = parent.get(key)
        if raw is None:
            return None
        if not isinstance(raw, dict):
            self.fail(f"{key} must be a table, written [{self.base[0]}.{key}]", prefix + key)
            return None
        self.unknown_keys(raw, section, f"{key}.", (key,))
        return raw

    # ------------------------------------------------------------------ one value by its field

    def get(self, table: dict[str, Any], section: str, key: str, *, prefix: str = "",
            sub: tuple[Any, ...] = (), value: Any = None) -> Any:
        """The value of ``key`` read by its field, its default when absent, None on error."""
        f = field(section, key)
        raw = table.get(key) if value is None else value
        where = prefix + key
        if raw is None:
            if f.required:
                self.fail(f"missing required key {key!r}: expected {_expected(f)}", where, sub)
            return f.default
        try:
            return self.convert(f, raw)
        except InputError as exc:
            self.fail(exc.message, where, sub)
            return None

    def convert(self, f: Field, raw: Any) -> Any:
        """One raw value to its model value, checked against the field (InputError if not)."""
        return convert(f, raw, decimal_comma=self.decimal_comma)


def parse_value(section: str, key: str, raw: Any, *, decimal_comma: bool = False) -> Any:
    """One value read and checked by its field exactly as a file value is: for command-line
    options and lookups. An error names the field's command-line option (or its key).

    Examples: ``parse_value("rating", "power", "1/2 hp")`` -> 372.85 (W);
    ``parse_value("site", "voltage", "400 kV")`` raises InputError naming ``--supply-voltage``.
    """
    f = field(section, key)
    try:
        return convert(f, raw, decimal_comma=decimal_comma)
    except InputError as exc:
        raise InputError(exc.message, key=f"--{f.option}" if f.option else key) from None


def convert(f: Field, raw: Any, *, decimal_comma: bool = False) -> Any:
    """One raw value to its model value, checked against the field (InputError if not).

    A SHARE_OR_TORQUE value comes back as (value, is_share), a CONDUCTOR_SIZE as (mm2 or AWG
    gauge text, is_awg); every other kind as its model value.
    """
    if f.kind in (TABLE, TABLES):
        raise InputError(f"{f.key} must be a table")
    if f.kind == TEXT:
        return _text(f, raw)
    if f.kind == CHOICE:
        return _choice(f, raw)
    if f.kind in (INTEGER, NUMBER):
        return _number(f, raw)
    if f.kind == SHARE_OR_TORQUE:
        value, share = units.parse_share_or(raw, "torque")
        low, high = (f.share_low, f.share_high) if share else (f.low, f.high)
        _in_range(f, value, raw, low, high, share=share)
        return value, share
    if f.kind == CONDUCTOR_SIZE:
        if isinstance(raw, str) and _AWG.match(raw):
            return _AWG.match(raw).group(1), True  # type: ignore[union-attr]
        value = units.parse(raw, "area", decimal_comma=decimal_comma)
        _in_range(f, value, raw, f.low, f.high)
        return value, False
    if f.kind == "fraction" and isinstance(raw, (int, float)) and not isinstance(raw, bool) \
            and 1 < raw <= 100:
        raise InputError(f"{f.key.replace('_', ' ')} {raw!r} is above 1: write it as "
                         f"'{raw} %' or as {raw / 100:g}")
    value = units.parse(raw, f.kind, decimal_comma=decimal_comma)
    _in_range(f, value, raw, f.low, f.high)
    return value


def _expected(f: Field) -> str:
    if f.kind in units.KINDS:
        return units.KINDS[f.kind].example
    if f.kind in (CHOICE,) or (f.kind == INTEGER and f.choices):
        return "one of " + ", ".join(str(c) for c in f.choices)
    return f.help


def _text(f: Field, raw: Any) -> str:
    if not isinstance(raw, str):
        raise InputError(f"expected {_what(f)}, got {type(raw).__name__} {units.shown(raw)}")
    value = raw.strip()
    if f.key in ("cooling", "duty"):
        value = value.upper()
    if f.pattern is not None and not re.fullmatch(f.pattern, value, re.S):
        if f.key == "id":
            raise InputError("id must be 1 to 200 printable characters")
        raise InputError(f"expected {_what(f)}, got {units.shown(raw)}")
    return value


def _what(f: Field) -> str:
    return {"id": "an id text", "cooling": "an IEC 60034-6 cooling code such as 'IC411'",
            "duty": "an IEC 60034-1 duty type S1 to S10",
            "currency": "a three-letter currency code such as 'EUR'"}.get(f.key, f"a {f.key} text")


def _choice(f: Field, raw: Any) -> object:
    if isinstance(raw, int) and not isinstance(raw, bool):
        raw = str(raw)
    if not isinstance(raw, str):
        raise InputError(f"expected one of {', '.join(str(c) for c in f.choices)}, got "
                         f"{type(raw).__name__} {units.shown(raw)}")
    lookup = _choice_lookup(f.choices)
    norm = raw.strip().upper()
    if f.key == "material" and norm == "ALUMINUM":
        norm = "ALUMINIUM"
    if norm not in lookup:
        close = closest(raw.strip(), f.choices)
        hint = f" (did you mean {close[0]!r}?)" if close else ""
        raise InputError(f"{units.shown(raw)} is not one of "
                         f"{', '.join(str(c) for c in f.choices)}{hint}")
    return lookup[norm]


def _number(f: Field, raw: Any) -> float | int:
    what = {"phases": "1, 2 or 3 phases", "poles": "an even number of poles, 2 or more",
            "service_factor": "a service factor from 1.0 to 2.0",
            "starting_current_ratio": "a locked-rotor current ratio Ia/In from 1 to 20",
            "wires": "3 or 4 wires"}.get(f.key, "an integer" if f.kind == INTEGER else "a number")
    if isinstance(raw, bool) or not isinstance(raw, (int, float)) or (
            f.kind == INTEGER and not isinstance(raw, int)):
        raise InputError(f"expected {what}, got {type(raw).__name__} {units.shown(raw)}")
    value = units.number_value(raw)
    if f.choices and raw not in f.choices:
        raise InputError(f"expected {what}, got {units.shown(raw)}")
    if (f.low is not None and value < f.low) or (f.high is not None and value > f.high):
        raise InputError(f"expected {what}, got {units.shown(raw)}" if f.kind == INTEGER or
                         f.key in ("service_factor", "starting_current_ratio") else
                         f"{units.shown(raw)} is outside the plausible range {f.low:g} to "
                         f"{f.high:g}")
    return raw if f.kind == INTEGER else value


def _in_range(f: Field, value: float, raw: Any, low: float | None, high: float | None, *,
              share: bool = False) -> None:
    if low is None or high is None:
        return
    below = value <= low if f.low_open and not share else value < low
    if not (below or value > high or math.isnan(value)):
        return
    label = f.key.replace("_", " ")
    if f.kind == "fraction" and not share and (value <= 0 or value > 1):
        raise InputError(f"{label} must be above 0 and at most 1 (100 %), got {units.shown(raw)}")
    if share or f.unit == "%" or f.kind == "fraction":
        raise InputError(f"{label} {units.shown(raw)} is outside the plausible range "
                         f"{100 * low:g} to {100 * high:g} %")
    unit = units.KINDS[f.kind].internal if f.kind in units.KINDS else f.unit
    shown_low, shown_high = low, high
    if f.kind == "time":
        shown_low, shown_high, unit = low / 3600, high / 3600, "h"
    elif f.kind == "resistance_per_length":
        shown_low, shown_high, unit = low * 1000, high * 1000, "ohm/km"
    elif f.kind == "area":
        unit = "mm2"
    above = "above " if f.low_open else ""
    raise InputError(f"{units.shown(raw)} is outside the plausible range {above}{shown_low:g} "
                     f"to {shown_high:g} {unit.replace('*', ' ')}".rstrip())
