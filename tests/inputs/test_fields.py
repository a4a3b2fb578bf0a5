"""The field table: one description per key, from which docs, schema, CSV columns, options and
range checks all come."""

import math
import subprocess
import sys
from pathlib import Path

import pytest

from machinecheck.errors import InputError, InputErrors
from machinecheck.inputs import csv_, fields, schema
from machinecheck.inputs.catalog import catalog_from_data, sites_from_data
from machinecheck.inputs.formatdoc import format_doc
from machinecheck.inputs.validate import Reader

ROOT = Path(__file__).resolve().parents[2]


def test_format_doc_is_current():
    # regenerate with: python -m machinecheck.inputs.formatdoc > docs/format.md
    assert (ROOT / "docs" / "format.md").read_text(encoding="utf-8") == format_doc()


def test_format_doc_command_prints_the_doc():
    out = subprocess.run([sys.executable, "-m", "machinecheck.inputs.formatdoc"], cwd=ROOT,
                         capture_output=True, text=True, check=True,
                         env={"PYTHONPATH": str(ROOT), "PATH": ""}).stdout
    assert out == format_doc()


def test_every_key_is_documented_once():
    doc = format_doc()
    for f in fields.FIELDS:
        assert f.help, f
        assert f"| `{f.key}` |" in doc, f
    keys = [(f.section, f.key) for f in fields.FIELDS]
    assert len(keys) == len(set(keys))


def test_csv_columns_and_options_are_unique():
    columns = [f.column for f in fields.FIELDS if f.column]
    options = [f.option for f in fields.FIELDS if f.option]
    assert len(columns) == len(set(columns))
    assert len(options) == len(set(options))
    assert tuple(columns) == csv_.COLUMNS
    assert "feeder_length" in columns and "load_breakaway_torque" in columns


def test_cli_options_built_from_the_table():
    options = {o.name: o for o in fields.cli_options("site")}
    assert options["--supply-voltage"].key == "voltage"
    assert options["--supply-wires"].choices == ("3", "4")
    assert options["--altitude"].dest == "altitude"
    load = {o.name: o for o in fields.cli_options("load")}
    assert set(load) >= {"--load-type", "--load-power", "--load-inertia"}
    rating = {o.name: o for o in fields.cli_options("rating")}
    assert rating["--voltage"].multiple and not rating["--power"].multiple
    assert "[1 to 2e+09 W]" in rating["--power"].help
    assert fields.option_table("machine")["service_factor"] == ("machine", "service_factor")


def test_schema_is_generated_from_the_table():
    machine = schema.catalog_schema()["properties"]["machine"]["items"]
    assert set(machine["properties"]) == set(fields.keys_of("machine"))
    rating = machine["properties"]["rating"]["items"]
    assert set(rating["properties"]) == set(fields.keys_of("rating"))
    site = schema.sites_schema()["properties"]["site"]["items"]
    assert set(site["properties"]["source"]["properties"]) == set(fields.keys_of("source"))
    # power has no default unit: a bare number is not a power
    assert rating["properties"]["power"]["type"] == "string"


def _reader():
    from machinecheck.inputs.toml_ import Locator
    from machinecheck.inputs.validate import Problems

    return Reader("t", Locator(None), Problems("t"), None, ())


QUANTITIES = [f for f in fields.FIELDS if f.low is not None and f.high is not None
              and f.kind not in (fields.INTEGER, fields.NUMBER, fields.SHARE_OR_TORQUE,
                                 fields.CONDUCTOR_SIZE)]


@pytest.mark.parametrize("f", QUANTITIES, ids=lambda f: f"{f.section}.{f.key}")
def test_every_quantity_field_refuses_values_beyond_its_range(f):
    reader = _reader()
    from machinecheck.inputs import units

    kind = units.KINDS[f.kind]
    unit = {"fraction": "", "percent": " %"}.get(f.kind)
    if unit is None:
        unit = " " + next(s for s, (scale, offset) in units.SCALES[f.kind].items()
                          if scale == 1.0 and offset == 0.0)
    factor = 100.0 if f.kind == "percent" else 1.0
    above = f"{f.high * factor * 1.5 + 1:.6g}{unit}"
    with pytest.raises(InputError, match="plausible range|at most 1"):
        reader.convert(f, above)
    assert kind is not None
    inside = f"{(f.low + f.high) / 2 * factor:.6g}{unit}"
    assert math.isfinite(reader.convert(f, inside))


def test_new_sections_are_read_into_the_model():
    m = catalog_from_data({"machine": [{
        "id": "P", "rating": [{"frequency": "50 Hz", "voltage": "400 V", "power": "11 kW",
                               "speed": "1460 rpm", "locked_rotor_torque": "220 %",
                               "breakdown_torque": "310 N m", "inertia": "0.05 kg m2"}],
        "load": {"type": "centrifugal", "power": "9 kW", "breakaway_torque": "30 %",
                 "inertia": "0.8 kg m2"},
        "circuit": {"r1": 0.12, "r2": "0.10 ohm", "x1": 0.35, "x2": 0.45, "xm": 12.0},
        "start": {"method": "autotransformer", "tap": "65 %", "trip_class": 20},
        "feeder": {"length": "120 m", "size": "2 AWG", "material": "aluminum", "parallel": 2,
                   "resistance": "0.62 ohm/km"},
        "use": {"hours": "6000 h", "load_factor": "75 %", "replacement_price": 1850}}]},
        "t").machines[0]
    rating = m.ratings[0]
    assert rating.locked_rotor_torque_pu == pytest.approx(2.2)
    assert rating.breakdown_torque_nm == 310.0 and rating.breakdown_torque_pu is None
    assert rating.inertia_kgm2 == 0.05 and rating.poles == 4
    assert m.load.breakaway_torque_pu == pytest.approx(0.3) and m.load.inertia_kgm2 == 0.8
    assert m.circuit.r2_ohm == 0.10 and m.circuit.xm_ohm == 12.0
    assert (m.start.method, m.start.tap, m.start.trip_class) == ("autotransformer", 0.65, "20")
    assert m.feeder.size_awg == "2" and m.feeder.size_mm2 is None
    assert m.feeder.size_marked == "2 AWG"
    assert m.feeder.material == "aluminium" and m.feeder.parallel == 2
    assert m.feeder.resistance_ohm_per_m == pytest.approx(0.00062)
    assert m.use.time_per_year_s == 6000 * 3600 and m.use.load_factor == 0.75


def test_site_sections_are_read_into_the_model():
    s = sites_from_data({"site": [{
        "id": "S", "frequency": "50 Hz", "frequency_variation": "4 %", "voltage": "230/400 V",
        "region": "EU",
        "source": {"kind": "generator", "rating": "500 kVA", "subtransient_reactance": "15 %",
                   "transient_reactance": "25 %", "prime_mover_power": "440 kW"},
        "limits": {"running_voltage_drop": "5 %", "starting_dip": "15 %"},
        "tariff": {"energy": "0.12 /kWh", "currency": "EUR"}}]}, "t")[0]
    assert (s.voltage_v, s.wires, s.frequency_variation) == (400.0, 4, pytest.approx(0.04))
    assert s.supply_source.rating_va == 500e3 and s.supply_source.prime_mover_power_w == 440e3
    assert s.limits.starting_dip == pytest.approx(0.15)
    assert s.tariff.energy_per_kwh == 0.12 and s.tariff.currency == "EUR"


@pytest.mark.parametrize("section, table, words", [
    ("start", {"method": "star-delta", "tap": "65 %"}, "'tap' is for method = 'autotransformer'"),
    ("feeder", {"length": "50 m"}, "give the conductor 'size'"),
    ("feeder", {"length": "50 m", "size": "35 mm2", "material": "gold"}, "is not one of"),
    ("circuit", {"r1": -0.1}, "circuit.r1"),
    ("use", {"hours": "9000 h"}, "outside the plausible range 0 to 8784 h"),
])
def test_sub_table_errors_name_the_key(section, table, words):
    data = {"machine": [{"id": "P", "rating": [{"frequency": "50 Hz", "voltage": "400 V",
                                               "power": "11 kW", "speed": "1460 rpm"}],
                         section: table}]}
    with pytest.raises(InputErrors) as caught:
        catalog_from_data(data, "t")
    assert isinstance(caught.value, ValueError)
    assert words in str(caught.value)
    assert "'P'" in str(caught.value)


def test_one_value_for_the_command_line_is_checked_by_its_field():
    from machinecheck.inputs.validate import parse_value

    assert parse_value("rating", "power", "1/2 hp") == pytest.approx(372.85, rel=1e-4)
    assert parse_value("rating", "power", "0,75 kW", decimal_comma=True) == 750.0
    assert parse_value("site", "ambient", "45 °C") == 45.0
    with pytest.raises(InputError) as caught:
        parse_value("site", "voltage", "400 kV")
    assert caught.value.key == "--supply-voltage"
    with pytest.raises(InputError, match="finite"):
        parse_value("rating", "speed", float("inf"))
