"""Values remembered for objects by identity, for the per-pair hot paths.

The engine meets the same rating, connection and tolerance objects at every site; what is
derived from them alone (connection names, message texts, output dicts) is worked out once.
Keyed by id() with the object kept beside its value, so an id reused after the object is gone
never returns another object's value; the memo starts afresh when it reaches its limit.
"""

from __future__ import annotations


class IdentityMemo:
    """obj -> value, by identity: ``get`` is None until ``put``."""

    __slots__ = ("_kept", "_limit")

    def __init__(self, limit: int = 10_000):
        self._kept: dict[int, tuple] = {}
        self._limit = limit

    def get(self, obj):
        kept = self._kept.get(id(obj))
        return kept[1] if kept is not None and kept[0] is obj else None

    def put(self, obj, value):
        """Remember ``value`` for ``obj``, and return it."""
        if len(self._kept) >= self._limit:
            self._kept.clear()
        self._kept[id(obj)] = (obj, value)
        return value

    def clear(self) -> None:
        self._kept.clear()
