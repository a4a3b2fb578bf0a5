"""Project exceptions.

Bad input raises :class:`InputError`, which carries where the problem is (file, line, machine or
site id, key path) so the command line can print one clear line. Several problems found in one
file travel together in :class:`InputErrors`. A physics function given a value outside its
domain raises :class:`DomainError`. All subclass :class:`MachinecheckError` (a ``ValueError``).
"""

from __future__ import annotations

from collections.abc import Iterable


class MachinecheckError(ValueError):
    """Base class of every error machinecheck raises on purpose."""


class DomainError(MachinecheckError):
    """A physics function was given a value outside the domain of its method."""


class InputError(MachinecheckError):
    """One problem in user input, with its location.

    Parameters
    ----------
    message : what is wrong and what was expected
    file : path of the input file, or None for command-line values
    line : 1-based line (TOML) or row (CSV) where known
    item : machine or site id where known
    key : key path inside the item ("rating[2].voltage"), or the command-line option
    column : CSV column name where the input is a spreadsheet
    """

    def __init__(self, message: str, *, file: str | None = None, line: int | None = None,
                 item: str | None = None, key: str | None = None,
                 column: str | None = None) -> None:
        super().__init__(message)
        self.message = message
        self.file = file
        self.line = line
        self.item = item
        self.key = key
        self.column = column

    def located(self, **where: str | int | None) -> InputError:
        """Return a copy with missing location fields filled from ``where``."""
        fields = {n: getattr(self, n) for n in ("file", "line", "item", "key", "column")}
        for name, value in where.items():
            if fields.get(name) is None:
                fields[name] = value
        return InputError(self.message, **fields)

    def __str__(self) -> str:
        parts = []
        if self.file is not None:
            place = str(self.file)
            if self.line is not None:
                place += f":{self.line}" if self.column is None else f": row {self.line}"
            parts.append(place)
        elif self.line is not None:
            parts.append(f"line {self.line}")
        if self.item is not None:
            parts.append(f"{self.item!r}")
        if self.column:
            parts.append(f"column {self.column!r}")
        elif self.key is not None:
            parts.append(f"{self.key}")
        where = ": ".join(parts)
        return f"{where}: {self.message}" if where else self.message


class InputErrors(MachinecheckError):
    """Every problem found in one input, reported together."""

    def __init__(self, errors: Iterable[InputError]) -> None:
        self.errors = list(errors)
        super().__init__("\n".join(str(e) for e in self.errors))
