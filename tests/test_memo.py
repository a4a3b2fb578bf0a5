"""The identity memo behind the per-pair caches: by identity, never by equality."""

from machinecheck.memo import IdentityMemo
from machinecheck.model import Connection


def test_an_equal_object_is_not_the_same_object():
    memo = IdentityMemo()
    a, b = Connection("delta", 400.0, 400.0), Connection("delta", 400.0, 400.0)
    assert a == b and a is not b
    assert memo.put(a, "for a") == "for a"
    assert memo.get(a) == "for a"
    assert memo.get(b) is None


def test_a_full_memo_starts_afresh():
    memo = IdentityMemo(limit=2)
    kept = [object() for _ in range(3)]
    for number, obj in enumerate(kept):
        memo.put(obj, number)
    assert memo.get(kept[0]) is None and memo.get(kept[2]) == 2
    memo.clear()
    assert memo.get(kept[2]) is None
