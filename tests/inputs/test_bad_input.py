"""Every malformed input exits 2 with a one-line message naming file and key; no traceback.

The corpus in tests/corpus/ holds one bad file a case; its first line says what the error
message must contain. Files named site-* are given as --sites, the others as catalogs.
"""

import os

import pytest
from click.testing import CliRunner

from machinecheck.cli.main import _demo_path, main

CORPUS = os.path.join(os.path.dirname(__file__), "corpus")
FILES = sorted(f for f in os.listdir(CORPUS) if f.endswith(".toml"))


def run(*args):
    return CliRunner().invoke(main, list(args), env={"NO_COLOR": "1"})


def check_failure(result, *needles):
    assert result.exit_code == 2, result.output
    assert "Traceback" not in result.output
    assert result.exception is None or isinstance(result.exception, SystemExit)
    errors = [line for line in result.output.splitlines() if line.startswith("machinecheck: error:")]
    assert errors, result.output
    for needle in needles:
        assert needle in result.output, (needle, result.output)


def test_corpus_is_large_enough():
    assert len(FILES) >= 40


@pytest.mark.parametrize("name", FILES)
def test_corpus_file(name):
    path = os.path.join(CORPUS, name)
    with open(path, encoding="utf-8") as handle:
        expect = handle.readline().removeprefix("# expect:").strip()
    args = ["check", "--sites", path] if name.startswith("site-") else ["check", path]
    check_failure(run(*args), name, expect)


def test_several_problems_reported_in_one_run(write):
    path = write("many.toml", """
[[machine]]
id = "A"
poles = 3
[[machine.rating]]
frequency = "60 A"
voltage = "400 V"
power = "-1 kW"
speed = "1440 rpm"
[[machine]]
id = "A"
[[machine.rating]]
frequency = "50 Hz"
voltage = "400 V"
power = "4 kW"
speed = "1440 rpm"
""")
    result = run("check", path, "--sites", _demo_path("sites.toml"))
    check_failure(result, "poles", "rating[1].frequency", "rating[1].power", "duplicate id")
    assert len([x for x in result.output.splitlines() if x.startswith("machinecheck: error")]) == 4


def test_error_names_line_and_machine(write):
    path = write("where.toml", '[[machine]]\nid = "P-9"\n[[machine.rating]]\nfrequency = "50 Hz"\n'
                               'voltage = "400 V"\npower = "4 kW"\nspeed = "1440 rpm"\n'
                               'efficiency = 1.5\n')
    result = run("check", path)
    check_failure(result, "where.toml:8", "'P-9'", "rating[1].efficiency")


def test_empty_file(write):
    check_failure(run("check", write("empty.toml", "")), "empty.toml", "file is empty")


def test_binary_file(write):
    path = write("bin.toml", b"\x00\x01\x02PK\x03\x04", mode="wb")
    check_failure(run("check", path), "bin.toml", "binary file")


def test_non_utf8_file(write):
    path = write("latin.toml", '[[machine]]\nid = "Mot\xf6r"\n'.encode("latin-1"), mode="wb")
    check_failure(run("check", path), "latin.toml", "not UTF-8", ":2")


def test_missing_file(tmp_path):
    check_failure(run("check", str(tmp_path / "nope.toml")), "nope.toml", "no such file")


def test_directory_as_file(tmp_path):
    check_failure(run("check", str(tmp_path)), "is a directory")


def test_missing_sites_file(tmp_path):
    check_failure(run("check", "--sites", str(tmp_path / "gone.toml")), "gone.toml", "no such file")


def test_validate_uses_same_messages():
    path = os.path.join(CORPUS, "odd-poles.toml")
    check_failure(run("validate", path), "odd-poles.toml", "poles must be an even number")


def test_user_text_printed_literally(write):
    # markup brackets in ids and site names do not restyle the report
    path = write("odd.toml", '[[machine]]\nid = "[red]X[/]"\ndescription = "[/]"\n'
                             '[[machine.rating]]\nfrequency = "50 Hz"\nvoltage = "400 V"\n'
                             'power = "4 kW"\nspeed = "1440 rpm"\n')
    result = run("check", path, "--sites", _demo_path("sites.toml"), "--site", "harrowgate")
    assert result.exit_code in (0, 1)
    assert "[red]X[/]" in result.output


def test_control_characters_in_id_escaped(write):
    path = write("ctl.toml", '[[machine]]\nid = "X\\u001b[2J"\n[[machine.rating]]\n'
                             'frequency = "50 Hz"\nvoltage = "400 V"\npower = "4 kW"\n'
                             'speed = "1440 rpm"\n')
    result = run("check", path)
    check_failure(result, "printable", "\\x1b")
    assert "\x1b" not in result.output


def test_very_long_id_rejected(write):
    path = write("long.toml", f'[[machine]]\nid = "{"M" * 5000}"\n')
    result = run("check", path)
    check_failure(result, "1 to 200 printable characters")
    assert max(len(line) for line in result.output.splitlines()) < 6000


def test_interrupt_leaves_no_output(tmp_path, monkeypatch):
    import machinecheck.engine.pipeline as engine

    def interrupted(*args, **kwargs):
        raise KeyboardInterrupt
    monkeypatch.setattr(engine, "assess_all", interrupted)
    out = tmp_path / "report.json"
    result = run("check", "--format", "json", "--output", str(out))
    assert result.exit_code == 130
    assert list(tmp_path.iterdir()) == []


# Spreadsheet inventories: the same validation, with row and column named.
INVENTORY_HEADER = "id,phases,frequency,voltage,current,power,speed,efficiency\n"


@pytest.mark.parametrize(("body", "needles"), [
    ("M-1,3,50 Hz,400 V,20 A,11 kW,1460 rpm,91 %\nM-1,3,60 Hz,460 V,18 A,11 kW,17.6 rpm,91 %\n",
     ("row 3", "'M-1'", "column 'speed'", "pole")),
    ("M-1,3,50 Hz,400 V,20 A,11 kW,1460 rpm,91\n", ("row 2", "column 'efficiency'", "91 %")),
    ("M-1,3,50 Hz,400 V,20 A,eleven kW,1460 rpm,91 %\n", ("row 2", "column 'power'")),
    ("M-1,3,50 Hz,400 V,20 A,11 kW,1460 rpm,91 %\nM-1,1,60 Hz,460 V,18 A,11 kW,1760 rpm,91 %\n",
     ("row 3", "column 'phases'", "differs from row 2")),
    (",3,50 Hz,400 V,20 A,11 kW,1460 rpm,91 %\n", ("row 2", "column 'id'", "no machine id")),
    ("M-1,3,50 Hz,400 V,20 A,11 kW,1460 rpm,91 %,extra\n", ("row 2", "9 cells for 8 columns")),
    ("M-1,3,50 Hz,400 V; 690 V,20 A,11 kW,1460 rpm,91 %\n",
     ("row 2", "column 'current'", "1 currents for 2 voltages")),
])
def test_inventory_errors_name_row_and_column(write, body, needles):
    path = write("inventory.csv", INVENTORY_HEADER + body)
    check_failure(run("check", path), "inventory.csv", *needles)


@pytest.mark.parametrize(("text", "needles"), [
    ("id,frequncy,voltage\nM-1,50 Hz,400 V\n", ("row 1", "column 'frequncy'", "'frequency'")),
    ("description,frequency\nx,50 Hz\n", ("row 1", "no 'id' column")),
    ("id,voltage,voltage\nM-1,400 V,400 V\n", ("column 'voltage'", "twice")),
    ("id,frequency\n", ("row 2", "no machine rows")),
    ("", ("file is empty",)),
])
def test_inventory_layout_errors(write, text, needles):
    path = write("inventory.csv", text)
    check_failure(run("check", path), "inventory.csv", *needles)
