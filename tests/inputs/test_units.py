"""Quantity parsing: pint's conversions, and the on-disk cache of them between runs."""

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

from machinecheck.errors import InputError
from machinecheck.inputs import units


@pytest.fixture
def fresh(tmp_path, monkeypatch):
    """A process state with no conversions known yet, caching into ``tmp_path``."""
    monkeypatch.setenv("MACHINECHECK_CACHE", str(tmp_path))
    monkeypatch.setattr(units, "_stored_table", None)
    monkeypatch.setattr(units, "_conversions", {})
    monkeypatch.setattr(units, "_values", {})
    return Path(units.cache_path())


# 1 hp = 550 ft*lbf/s = 745.699872 W (NIST SP 811, B.8, from memory); 1 ft = 0.3048 m exactly
@pytest.mark.parametrize("text, kind, expected", [
    ("10 hp", "power", 7456.99872),
    ("4.16 kV", "voltage", 4160.0),
    ("5400 ft", "length", 1645.92),
    ("86 %", "fraction", 0.86),
    ("104 degF", "temperature", 40.0),
    ("1 MVA", "apparent_power", 1e6),
])
def test_pint_conversions(fresh, text, kind, expected):
    assert units.parse(text, kind) == pytest.approx(expected, rel=1e-9)


def test_default_units_need_no_pint(fresh):
    assert units.parse("75", "power") == 75000.0
    assert units.parse("75 kW", "power") == 75000.0
    assert not fresh.exists()  # nothing was asked of pint, so nothing was stored


def test_scales_are_kept_for_the_next_run(fresh):
    value = units.parse("10 hp", "power")
    stored = json.loads(fresh.read_text())
    assert stored["scales"]["power hp"] == [pytest.approx(745.6998715822701), 0.0]
    code = ("import sys; from machinecheck.inputs import units; "
            "print(units.parse('10 hp', 'power'), 'pint' in sys.modules)")
    env = {**os.environ, "MACHINECHECK_CACHE": str(fresh.parent)}
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, env=env,
                         check=True).stdout.split()
    assert float(out[0]) == value
    assert out[1] == "False"  # read from the cache, pint not imported


def test_each_pint_installation_has_its_own_file(fresh, monkeypatch):
    units.parse("10 hp", "power")
    monkeypatch.setattr(units, "_cache_key", lambda: "another pint|00000000")
    assert units.cache_path() != str(fresh)
    assert Path(units.cache_path()).parent == fresh.parent


def test_offset_units_round_trip_through_the_cache(fresh):
    first = units.parse("212 degF", "temperature")
    units._conversions.clear()
    units._values.clear()
    units._stored_table = None
    assert units.parse("212 degF", "temperature") == pytest.approx(first) == pytest.approx(100.0)


@pytest.mark.parametrize("damage", ["not json", '{"key": 1}', '[]',
                                    '{"key": "%s", "scales": {"power hp": [1e999, 0]}}'])
def test_damaged_or_stale_cache_is_ignored_and_rebuilt(fresh, damage):
    if "%s" in damage:
        damage = damage.replace("%s", units._cache_key().replace("\\", "\\\\"))
    fresh.write_text(damage)
    assert units.parse("10 hp", "power") == pytest.approx(7456.99872)
    assert json.loads(fresh.read_text())["scales"]["power hp"][0] == pytest.approx(745.69987158)


def test_stale_key_is_not_trusted(fresh):
    fresh.write_text(json.dumps({"key": "another pint", "scales": {"power hp": [1.0, 0.0]}}))
    assert units.parse("10 hp", "power") == pytest.approx(7456.99872)


def test_cache_can_be_turned_off(fresh, monkeypatch):
    monkeypatch.setenv("MACHINECHECK_CACHE", "")
    assert units.parse("10 hp", "power") == pytest.approx(7456.99872)
    assert units.cache_path() is None
    assert not fresh.exists()


def test_unwritable_cache_folder_is_no_error(fresh, monkeypatch, tmp_path):
    blocker = tmp_path / "a-file"
    blocker.write_text("")
    monkeypatch.setenv("MACHINECHECK_CACHE", str(blocker / "below"))
    assert units.parse("10 hp", "power") == pytest.approx(7456.99872)


def test_unknown_units_are_errors_and_not_stored(fresh):
    with pytest.raises(InputError, match="unknown unit"):
        units.parse("10 bananas", "power")
    with pytest.raises(InputError, match="not a unit of power"):
        units.parse("10 V", "power")
    assert not fresh.exists()
