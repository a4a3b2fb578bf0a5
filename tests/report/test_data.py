"""The figures of the result dict: rounding as Python's round(), at a lower cost."""

import math
import random

import pytest

from machinecheck.report.data import _r, _Rounded


def _values():
    rng = random.Random(11)
    yield from (rng.uniform(-5000, 5000) for _ in range(20000))
    yield from (k * 0.005 for k in range(-20000, 20000))  # decimal ties such as 17.945
    yield from (k * 0.00005 for k in range(20000))
    yield from (hp * 0.7456998715822701 for hp in range(1, 3000))  # kW of hp plates
    yield from (0.0, -0.0, 1e-300, 5e14, -5e14, 1e15, 1e200, -1e200, 7, 1490)


@pytest.mark.parametrize("digits", [0, 1, 2, 3, 4, 5])
def test_rounding_is_python_round(digits):
    for value in _values():
        got = _r(value, digits)
        assert got == round(float(value), digits), (value, digits)
        assert type(got) is float
        assert math.copysign(1.0, got) == math.copysign(1.0, round(float(value), digits))


def test_unknown_stays_unknown():
    assert _r(None, 2) is None


@pytest.mark.parametrize("digits", [1, 2, 4])
def test_remembered_rounding_is_the_same_rounding(digits):
    # asked twice, in either order of a zero's signs, an int and its float, NaN and None
    memo = _Rounded(digits)
    values = [*list(_values())[::50], -0.0, 0.0, -0.0, 7, 7.0, 1490.0, 1490, math.nan, None]
    for value in values + values[::-1]:
        got, want = memo[value], _r(value, digits)
        if want is None or math.isnan(want):
            assert got is None if want is None else math.isnan(got)
            continue
        assert got == want and type(got) is type(want)
        assert math.copysign(1.0, got) == math.copysign(1.0, want)
