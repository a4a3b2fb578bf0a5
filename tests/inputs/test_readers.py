"""The readers at the input edge: size cap, encodings, separators, quotes, many bad rows,
reader choice by content, Excel workbooks, hostile TOML."""

import os
import sys

import pytest
from click.testing import CliRunner

from machinecheck.cli.main import main
from machinecheck.errors import InputError, InputErrors
from machinecheck.inputs import files
from machinecheck.inputs.catalog import load_catalog, load_sites

HEADER = "id,phases,frequency,voltage,current,power,speed,efficiency\n"
ROW = "M-1,3,50 Hz,400 V,21 A,11 kW,1460 rpm,91 %\n"


def _errors(call, *args, **kwargs):
    with pytest.raises((InputError, InputErrors)) as caught:
        call(*args, **kwargs)
    assert isinstance(caught.value, ValueError)
    return str(caught.value)


# ----------------------------------------------------------------------------- size cap

@pytest.mark.skipif(not os.path.exists("/dev/zero"), reason="no /dev/zero on this platform")
def test_endless_input_stops_at_the_cap(monkeypatch):
    monkeypatch.setattr(files, "MAX_INPUT_BYTES", 4 * 2 ** 20)
    monkeypatch.setattr(files.read_bytes, "__defaults__", (4 * 2 ** 20,))
    text = _errors(load_sites, "/dev/zero")
    assert "/dev/zero" in text and "larger than the input limit of 4 MiB" in text


def test_cap_is_documented_and_generous():
    assert files.MAX_INPUT_BYTES == 64 * 2 ** 20
    from machinecheck.inputs.formatdoc import format_doc

    assert "larger than 64 MiB are refused" in format_doc()


def test_file_over_the_cap_is_refused(write):
    path = write("big.toml", "# " + "x" * 2000 + "\n")
    text = _errors(files.read_bytes, path, 1000)
    assert "big.toml" in text and "input limit" in text


# ----------------------------------------------------------------------------- encodings

@pytest.mark.parametrize("encoding, bom", [("utf-8", b""), ("utf-8", b"\xef\xbb\xbf"),
                                           ("cp1252", b""), ("utf-16-le", b"\xff\xfe"),
                                           ("utf-16-be", b"\xfe\xff")])
def test_csv_encodings_are_detected(write, encoding, bom):
    text = HEADER.replace(",efficiency", ",description,efficiency") + \
        "M-1,3,50 Hz,400 V,21 A,11 kW,1460 rpm,Pumpe Süd – Reserve,91 %\n"
    path = write("inv.csv", bom + text.encode(encoding), mode="wb")
    machine = load_catalog(path).machines[0]
    assert machine.description == "Pumpe Süd – Reserve"


def test_utf16_without_bom_is_named_not_called_binary(write):
    path = write("inv.csv", (HEADER + ROW).encode("utf-16-le"), mode="wb")
    text = _errors(load_catalog, path)
    assert "UTF-16 text without a byte-order mark" in text and "binary" not in text


def test_utf16_toml_is_named(write):
    path = write("cat.toml", b"\xff\xfe" + '[[machine]]\nid = "A"\n'.encode("utf-16-le"), mode="wb")
    text = _errors(load_catalog, path)
    assert "is UTF-16 text; TOML files must be UTF-8" in text and "binary" not in text


def test_undecodable_csv_names_the_encodings_and_line(write):
    path = write("inv.csv", (HEADER + ROW).encode() + b"M-2,3,50 Hz,\x81\x8d\xff\n", mode="wb")
    text = _errors(load_catalog, path)
    assert "neither UTF-8 nor Windows-1252 (cp1252)" in text and "inv.csv:3" in text


# ----------------------------------------------------------------------------- CSV layout

def test_semicolons_and_decimal_commas_detected(write):
    path = write("inv.csv", "id;frequency;voltage;current;power;speed;power_factor\n"
                            "M-1;50 Hz;400 V;21,5 A;11 kW;1460 rpm;0,86\n")
    rating = load_catalog(path).machines[0].ratings[0]
    assert rating.connections[0].current_a == 21.5 and rating.power_factor == 0.86


def test_decimal_comma_declared_in_a_comma_file(write):
    path = write("inv.csv", 'id,frequency,voltage,current,power,speed\n'
                            'M-1,50 Hz,400 V,"21,5 A",11 kW,1460 rpm\n')
    assert "column 'current'" in _errors(load_catalog, path)
    machine = load_catalog(path, decimal_comma=True).machines[0]
    assert machine.ratings[0].connections[0].current_a == 21.5


def test_trailing_empty_header_cells_are_ignored(write):
    path = write("inv.csv", HEADER.rstrip("\n") + ",,,\n" + ROW.rstrip("\n") + ",,,\n")
    assert load_catalog(path).machines[0].id == "M-1"


def test_unclosed_quote_names_its_line(write):
    path = write("inv.csv", HEADER + ROW + 'M-2,3,"50 Hz,400 V,21 A,11 kW,1460 rpm,91 %\n' + ROW)
    text = _errors(load_catalog, path)
    assert "inv.csv:3" in text and "quote opened in the row starting on line 3" in text


def test_ten_thousand_bad_rows_give_fifty_lines_and_a_count(write):
    rows = "".join(f"M-{i},3,50 Hz,400 V,21 A,11 kW,1460 rpm,191 %\n" for i in range(10_000))
    sites = write("sites.toml", '[[site]]\nid = "S"\nfrequency = "50 Hz"\nvoltage = "400 V"\nphases = 3\n'
                  'standard = "IEC"\n')
    result = CliRunner().invoke(main, ["check", write("inv.csv", HEADER + rows), "--sites", sites])
    assert result.exit_code == 2
    lines = [x for x in result.output.splitlines() if x.startswith("machinecheck: error:")]
    assert len(lines) == 51
    assert "9950 more problems not shown" in lines[-1]


# ----------------------------------------------------------------------------- reader choice

def test_txt_csv_is_read_by_content_and_says_so(write):
    path = write("plates.txt", HEADER + ROW)
    catalog = load_catalog(path)
    assert catalog.machines[0].id == "M-1"
    assert catalog.reader == "CSV (chosen by its content)"
    bad = write("bad.txt", HEADER + ROW.replace("91 %", "191 %"))
    assert "(read as CSV (chosen by its content))" in _errors(load_catalog, bad)


def test_txt_toml_is_read_by_content(write):
    path = write("plates.txt", '[[machine]]\nid = "A"\n[[machine.rating]]\nfrequency = "50 Hz"\n'
                               'voltage = "400 V"\npower = "4 kW"\nspeed = "1440 rpm"\n')
    assert load_catalog(path).reader == "TOML (chosen by its content)"
    assert load_catalog(path).machines[0].id == "A"


def test_unrecognisable_txt_asks_for_an_extension(write):
    text = _errors(load_catalog, write("notes.txt", "just some words\n"))
    assert "cannot tell whether this .txt file is TOML or CSV" in text


# ----------------------------------------------------------------------------- Excel

def test_xlsx_inventory_is_read(tmp_path):
    openpyxl = pytest.importorskip("openpyxl")
    book = openpyxl.Workbook()
    sheet = book.active
    sheet.append(["id", "phases", "frequency", "voltage", "current", "power", "speed",
                  "power_factor", None])
    sheet.append(["X-1", 3, "50 Hz", "400 V", 21, "11 kW", 1460, 0.86, None])
    path = tmp_path / "plates.xlsx"
    book.save(path)
    machine = load_catalog(path).machines[0]
    assert machine.ratings[0].speed_rpm == 1460.0 and machine.ratings[0].power_factor == 0.86


def test_xlsx_errors_name_row_and_column(tmp_path):
    openpyxl = pytest.importorskip("openpyxl")
    book = openpyxl.Workbook()
    book.active.append(["id", "frequency", "voltage", "power", "speed"])
    book.active.append(["X-1", "50 Hz", "400 V", 11, 1460])
    path = tmp_path / "plates.xlsx"
    book.save(path)
    text = _errors(load_catalog, path)
    assert "plates.xlsx: row 2" in text and "column 'power'" in text and "ambiguous" in text


def test_xlsx_without_openpyxl_says_how_to_install(tmp_path, monkeypatch):
    path = tmp_path / "plates.xlsx"
    path.write_bytes(b"PK\x03\x04")
    monkeypatch.setitem(sys.modules, "openpyxl", None)
    text = _errors(load_catalog, path)
    assert "needs openpyxl" in text and "pip install machinecheck[xlsx]" in text


# ----------------------------------------------------------------------------- TOML

def test_range_in_kilovolts_names_file_line_machine_and_field(write):
    path = write("cat.toml", '[[machine]]\nid = "P-9"\n[[machine.rating]]\nfrequency = "50 Hz"\n'
                             'voltage = "380-415 kV"\npower = "11 kW"\nspeed = "1460 rpm"\n')
    text = _errors(load_catalog, path)
    assert "cat.toml:5: 'P-9': rating[1].voltage: '380 kV' is outside the plausible range" in text


def test_range_with_unknown_unit_names_everything(write):
    path = write("cat.toml", '[[machine]]\nid = "P-9"\n[[machine.rating]]\nfrequency = "50 Hz"\n'
                             'voltage = "380-415 bananas"\npower = "11 kW"\nspeed = "1460 rpm"\n')
    text = _errors(load_catalog, path)
    assert "cat.toml:5: 'P-9': rating[1].voltage: unknown unit 'bananas'" in text


def test_range_without_unit_reads_volts(write):
    path = write("cat.toml", '[[machine]]\nid = "P-9"\n[[machine.rating]]\nfrequency = "50 Hz"\n'
                             'voltage = "380-415"\npower = "11 kW"\nspeed = "1460 rpm"\n')
    connection = load_catalog(path).machines[0].ratings[0].connections[0]
    assert (connection.voltage_min_v, connection.voltage_max_v) == (380.0, 415.0)


@pytest.mark.parametrize("depth", [40, 5000, 200_000])
def test_deep_nesting_is_refused_with_its_line(write, depth):
    # written here, not in the corpus: other readers of the corpus must not meet it
    path = write("deep.toml", '[[machine]]\nid = "A"\nx = ' + "[" * depth + "]" * depth + "\n")
    text = _errors(load_catalog, path)
    assert "deep.toml:3" in text and "nest deeper than 32 levels" in text


def test_deep_nesting_inside_strings_and_comments_is_no_nesting():
    from machinecheck.inputs.toml_ import parse_toml

    text = '# ' + "[" * 100 + '\na = "' + "[" * 100 + '"\n'
    assert parse_toml(text, "t")["a"] == "[" * 100


def test_integer_beyond_the_digit_limit_is_refused(write):
    # written here, not in the corpus: other readers of the corpus must not meet it
    path = write("huge.toml", '[[machine]]\nid = "A"\n[[machine.rating]]\nfrequency = "50 Hz"\n'
                              f'voltage = {"4" * 5000}\npower = "4 kW"\nspeed = "1440 rpm"\n')
    text = _errors(load_catalog, path)
    assert "huge.toml" in text and "a number is too long to read" in text


def test_integer_within_the_digit_limit_but_huge_is_refused(write):
    path = write("huge.toml", '[[machine]]\nid = "A"\n[[machine.rating]]\nfrequency = "50 Hz"\n'
                              f'voltage = {"4" * 400}\npower = "4 kW"\nspeed = "1440 rpm"\n')
    text = _errors(load_catalog, path)
    assert "huge.toml:5: 'A': rating[1].voltage: the integer with" in text and "too large" in text


def test_thousands_separator_in_a_decimal_comma_export_is_refused(write):
    # "1.460" meaning 1460 rpm reads as 1.46 rpm: it would need thousands of poles
    path = write("inv.csv", "id;frequency;voltage;power;speed\nM-1;50 Hz;400 V;11 kW;1.460\n")
    text = _errors(load_catalog, path)
    assert "inv.csv: row 2: 'M-1': column 'speed'" in text
    assert "would mean 4108 poles (at most 200)" in text
