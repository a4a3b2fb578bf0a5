"""JSON Schema of the file formats: valid schemas, the demo files pass, broken files fail."""

import json

import jsonschema
import pytest
from click.testing import CliRunner

from machinecheck.cli.main import _demo_path, main
from machinecheck.inputs.catalog import tomllib
from machinecheck.inputs.schema import catalog_schema, sites_schema


def _validator(schema):
    jsonschema.Draft202012Validator.check_schema(schema)
    return jsonschema.Draft202012Validator(schema)


def _demo(name):
    with open(_demo_path(name), "rb") as handle:
        return tomllib.load(handle)


def test_demo_catalog_and_sites_validate():
    assert list(_validator(catalog_schema()).iter_errors(_demo("fleet.toml"))) == []
    assert list(_validator(sites_schema()).iter_errors(_demo("sites.toml"))) == []


@pytest.mark.parametrize("breakage", [
    lambda d: d["machine"][0].update(volts="400 V"),                  # unknown key
    lambda d: d["machine"][0].update(phases=4),                        # not 1, 2 or 3
    lambda d: d["machine"][0]["rating"][0].pop("frequency"),           # required key
    lambda d: d["machine"][0]["rating"][0].update(power="lots"),      # not a quantity
    lambda d: d["machine"][0].update(kind="steam-engine"),             # unknown kind
    lambda d: d["machine"][0].update(poles=5),                         # odd poles
    lambda d: d["machine"][0]["rating"][0].update(power_factor=1.5),  # above 1
])
def test_broken_catalog_is_rejected(breakage):
    data = _demo("fleet.toml")
    breakage(data)
    assert list(_validator(catalog_schema()).iter_errors(data))


def test_broken_sites_file_is_rejected():
    data = _demo("sites.toml")
    data["site"][0]["line_voltages"] = ["400 V", "401 V"]
    assert list(_validator(sites_schema()).iter_errors(data))


@pytest.mark.parametrize(("which", "title"), [("catalog", "machine catalog"),
                                              ("sites", "site supplies")])
def test_schema_command_prints_json(which, title):
    result = CliRunner().invoke(main, ["schema", which])
    assert result.exit_code == 0
    assert title in json.loads(result.output)["title"]
