"""Quantity parsing: the number grammar, the static unit table, and the table against pint."""

import subprocess
import sys

import pytest

from machinecheck.errors import InputError
from machinecheck.inputs import units
from machinecheck.inputs.unit_table import SCALES


# 1 hp = 550 ft*lbf/s = 745.699872 W (NIST SP 811, B.8, from memory); 1 ft = 0.3048 m exactly
@pytest.mark.parametrize("text, kind, expected", [
    ("10 hp", "power", 7456.99872),
    ("1/2 hp", "power", 372.849936),
    ("4.16 kV", "voltage", 4160.0),
    ("5400 ft", "length", 1645.92),
    ("86 %", "fraction", 0.86),
    ("93 %", "fraction", 0.93),
    ("104 degF", "temperature", 40.0),
    ("45 °C", "temperature", 45.0),
    ("45 degC", "temperature", 45.0),
    ("1 MVA", "apparent_power", 1e6),
    ("1460 r/min", "speed", 1460.0),
    ("250 kcmil", "area", 126.677),   # 1 kcmil = 0.506707 mm2 (NIST SP 811, from memory)
    ("0.62 ohm/km", "resistance_per_length", 0.00062),
    ("6000 h", "time", 6000 * 3600.0),
    ("0.12 /kWh", "energy_price", 0.12),
    ("0.8 kg m2", "inertia", 0.8),
])
def test_conversions(text, kind, expected):
    assert units.parse(text, kind) == pytest.approx(expected, rel=1e-5)


def test_decimal_comma_only_where_declared():
    assert units.parse("0,75 kW", "power", decimal_comma=True) == 750.0
    with pytest.raises(InputError, match="has a comma: write a decimal point"):
        units.parse("0,75 kW", "power")


@pytest.mark.parametrize("value, kind, words", [
    ("93 %%", "fraction", "'%%' is not a unit"),
    ("inf V", "voltage", "expected a number"),
    (float("inf"), "voltage", "finite"),
    (float("nan"), "current", "finite"),
    ("1" * 5000 + " V", "voltage", "too long"),
    (10 ** 5000, "voltage", "too large"),
    ("1e-400 A", "current", "underflows to 0"),
    ("50", "power", "a bare number is ambiguous"),
    (50, "power", "a bare number is ambiguous"),
    ("500", "apparent_power", "a bare number is ambiguous"),
    ("10 bananas", "power", "unknown unit 'bananas'"),
    ("10 V", "power", "not a unit of power"),
    ("60 rpm", "frequency", "shaft speed, not a frequency"),
    ("1/0 hp", "power", "denominator 0"),
    (True, "voltage", "expected a voltage"),
], ids=lambda v: units.shown(v, 20) if not isinstance(v, str) or len(v) > 20 else v)
def test_refused(value, kind, words):
    with pytest.raises(InputError) as caught:
        units.parse(value, kind)
    assert isinstance(caught.value, ValueError)
    assert words in caught.value.message
    assert len(caught.value.message) < 400  # a huge value is shortened in the message


def test_messages_never_fail_on_huge_integers():
    assert "bits" in units.shown(10 ** 5000)


@pytest.mark.parametrize("kind", sorted(SCALES))
def test_static_table_agrees_with_pint(kind):
    for spelling, expression in units.SPELLINGS[kind].items():
        scale, offset = SCALES[kind][spelling]
        expected = units.pint_scale(expression, kind)
        assert not isinstance(expected, str), expected
        assert scale == pytest.approx(expected[0], rel=1e-12), spelling
        assert offset == pytest.approx(expected[1], rel=1e-12, abs=1e-12), spelling


def test_static_table_is_current():
    # regenerate with: python -m machinecheck.inputs.units --write-table
    from pathlib import Path

    path = Path(units.__file__).with_name("unit_table.py")
    assert path.read_text(encoding="utf-8") == units.generate_table()


def test_table_units_need_no_pint_and_no_home_folder(tmp_path):
    code = ("import sys; from machinecheck.inputs import units; "
            "print(units.parse('10 hp', 'power'), units.parse('45 °C', 'temperature'), "
            "'pint' in sys.modules)")
    env = {"PATH": "", "HOME": str(tmp_path), "PYTHONPATH": str(__import__('pathlib').Path(
        units.__file__).parents[2])}
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, env=env,
                         check=True).stdout.split()
    assert out == [repr(units.parse("10 hp", "power")), "45.0", "False"]
    assert list(tmp_path.iterdir()) == []  # nothing written in the home folder


def test_a_spelling_outside_the_table_is_asked_of_pint():
    assert units.parse("3 yd", "length") == pytest.approx(2.7432)  # 1 yd = 0.9144 m exactly
