"""CSV inventories: reading, conversion to TOML and back, the same results either way."""

import json

from click.testing import CliRunner

from machinecheck.cli.main import _demo_path, main
from machinecheck.inputs.catalog import load_catalog

ENV = {"NO_COLOR": "1", "COLUMNS": "120"}

# The bundled example inventory (invented machines), also shown in docs/format.md.
with open(_demo_path("inventory.csv"), encoding="utf-8") as _handle:
    INVENTORY = _handle.read()


def run(*args):
    return CliRunner().invoke(main, list(args), env=ENV)


def test_rows_with_one_id_make_a_multi_rating_plate(write):
    path = write("inventory.csv", INVENTORY)
    catalog = load_catalog(path)
    first, second = catalog.machines
    assert [r.frequency_hz for r in first.ratings] == [50.0, 60.0]
    assert [c.name for c in first.ratings[0].connections] == ["delta", "star"]
    assert first.ratings[0].connections[1].current_a == 16.4
    assert first.load.type == "centrifugal" and first.load.power_w == 12_000.0
    assert second.ratings[0].connections[0].voltage_v == 230.0  # bare numbers: default units
    assert second.ratings[0].speed_rpm == 1760.0
    assert second.description == "Conveyor drive, 10 hp"


def _results(*args):
    sites = ["--sites", _demo_path("sites.toml")] if args else []  # catalogs need their sites
    result = run("check", *args, *sites, "--format", "json")
    assert result.exit_code in (0, 1), result.output
    return json.loads(result.output)["results"]


def test_inventory_to_toml_gives_the_same_results(write, tmp_path):
    path = write("inventory.csv", INVENTORY)
    toml_path = tmp_path / "catalog.toml"
    converted = run("convert", path, "--to", "toml", "--output", str(toml_path))
    assert converted.exit_code == 0, converted.output
    assert _results(path) == _results(str(toml_path))


def test_demo_catalog_round_trips_through_csv(tmp_path):
    csv_path = tmp_path / "fleet.csv"
    toml_path = tmp_path / "fleet.toml"
    assert run("convert", _demo_path("fleet.toml"), "--to", "csv", "-o", str(csv_path)).exit_code == 0
    assert run("convert", str(csv_path), "--to", "toml", "-o", str(toml_path)).exit_code == 0
    demo = _results()
    assert _results(str(csv_path)) == demo
    assert _results(str(toml_path)) == demo


def test_convert_validates_first_and_writes_nothing_on_error(write, tmp_path):
    path = write("bad.csv", "id,frequency,voltage,power,speed\nM-1,50 Hz,400 V,11 kW,1500 rpm\n")
    out = tmp_path / "out.toml"
    result = run("convert", path, "--to", "toml", "-o", str(out))
    assert result.exit_code == 2
    assert "row 2" in result.output and "column 'speed'" in result.output
    assert not out.exists()


def test_convert_refuses_to_overwrite_its_source(write):
    path = write("inventory.csv", INVENTORY)
    result = run("convert", path, "--to", "csv", "-o", path)
    assert result.exit_code == 2
    assert "refusing to overwrite" in result.output
    with open(path, encoding="utf-8") as handle:
        assert handle.read() == INVENTORY


def test_toml_strings_are_escaped(write):
    from machinecheck.inputs.inventory import to_toml

    text = to_toml({"machine": [{"id": 'A "quoted" \\ id', "description": "tab\there\x7f",
                                 "rating": [{"frequency": 50, "voltage": ["400 V"]}]}]})
    from machinecheck.inputs.catalog import tomllib

    data = tomllib.loads(text)
    assert data["machine"][0]["id"] == 'A "quoted" \\ id'
    assert data["machine"][0]["description"] == "tab\there\x7f"


def test_validate_reads_inventories(write):
    result = run("validate", write("inventory.csv", INVENTORY))
    assert result.exit_code == 0
    assert "2 machines" in result.output


def test_semicolon_export_with_decimal_commas(write):
    # Spreadsheets set to a decimal comma write ";" between cells; lists then take "|".
    text = ("id;description;phases;frequency;voltage;connection;current;power;speed;"
            "power_factor;efficiency\r\n"
            "E-1;Pump, spare (invented);3;50 Hz;400 V|690 V;delta|star;28,4 A|16,4 A;15 kW;"
            "1465 rpm;0,84;92,1 %\r\n")
    m = load_catalog(write("export.csv", text)).machines[0]
    rating = m.ratings[0]
    assert [c.current_a for c in rating.connections] == [28.4, 16.4]
    assert [c.name for c in rating.connections] == ["delta", "star"]
    assert rating.power_factor == 0.84 and abs(rating.efficiency - 0.921) < 1e-12
    assert m.description == "Pump, spare (invented)"


def test_tab_separated_inventory(write):
    text = "id\tfrequency\tvoltage\tpower\tspeed\nT-1\t60 Hz\t230 V; 460 V\t10 hp\t1760 rpm\n"
    m = load_catalog(write("export.csv", text)).machines[0]
    assert [c.voltage_v for c in m.ratings[0].connections] == [230.0, 460.0]


def test_convert_to_csv_on_stdout_has_one_row_per_rating_set():
    import csv
    import io

    result = run("convert", _demo_path("fleet.toml"), "--to", "csv")
    assert result.exit_code == 0
    rows = list(csv.DictReader(io.StringIO(result.output)))
    machines = load_catalog(_demo_path("fleet.toml")).machines
    assert len(rows) == sum(len(m.ratings) for m in machines)
    assert [r["id"] for r in rows if r["description"]] == [m.id for m in machines]


def test_schema_and_convert_usage_errors_exit_2():
    assert run("schema", "fleet").exit_code == 2
    assert run("convert", _demo_path("fleet.toml"), "--to", "xlsx").exit_code == 2
