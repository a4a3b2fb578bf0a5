"""User text never drives the terminal: control and escape sequences from a catalog are shown
as visible escapes in error lines, the table, --explain and documents shown on a terminal;
files keep the raw value, escaped as their format requires; CSV cells never run as formulas."""

from __future__ import annotations

import csv
import io
import json
import os
import subprocess

import pytest
from child import DEMO_SITES, command, environment
from click.testing import CliRunner

from machinecheck.cli.main import main
from machinecheck.report.csv_ import neutral_cell
from machinecheck.report.text import visible

ESC, CSI8 = "\x1b", "\x9b"  # escape, and the 8-bit control sequence introducer
CATALOG = """[[machine]]
id = "M-1"
description = "d\\u001b]0;retitled\\u0007"
[[machine.rating]]
frequency = "50 Hz"
voltage = ["400 V", "690 V"]
connection = ["=1+2\\u001b[2J", "@star\\u009b"]
power = "4 kW"
speed = "1440 rpm"
current = ["8 A", "4.6 A"]
"""


def _run(*args):
    return CliRunner().invoke(main, list(args), env={"NO_COLOR": "1"})


@pytest.fixture
def catalog(write):
    return write("injected.toml", CATALOG)


def _no_raw_controls(text: str) -> None:
    assert ESC not in text and CSI8 not in text and "\x07" not in text


def test_an_unknown_key_with_an_escape_is_shown_escaped(write):
    path = write("key.toml", CATALOG.replace('description', '"odd\\u001b[2Jkey" = 1\ndescription'))
    result = _run("check", path, "--sites", DEMO_SITES)
    assert result.exit_code == 2
    _no_raw_controls(result.output)
    assert "unknown key 'odd\\x1b[2Jkey'" in result.output


@pytest.mark.parametrize("extra", [[], ["--explain"], ["--format", "markdown"]])
def test_the_table_and_the_working_show_escapes_visibly(catalog, extra):
    result = _run("check", catalog, "--sites", DEMO_SITES, "--site", "harrowgate", *extra)
    assert result.exit_code == 0, result.output
    _no_raw_controls(result.output)
    if extra == ["--explain"]:
        assert "connection =1+2\\x1b[2J at 400 V" in result.output


def _on_a_terminal(args, env=None):
    """Run with standard output on a pseudo-terminal; what the terminal received."""
    main_fd, terminal_fd = os.openpty()
    try:
        proc = subprocess.Popen(command(*args), env=environment(**(env or {})), stdout=terminal_fd,
                                stderr=subprocess.DEVNULL)
        os.close(terminal_fd)  # read while it writes: a terminal's buffer is small
        received = b""
        while True:
            try:
                data = os.read(main_fd, 65536)
            except OSError:  # the terminal's other end is closed: all read
                break
            if not data:
                break
            received += data
        proc.wait(60)
    finally:
        os.close(main_fd)
    return proc.returncode, received.decode("utf-8", "replace")


@pytest.mark.skipif(not hasattr(os, "openpty"), reason="no pseudo-terminals on this platform")
@pytest.mark.parametrize("fmt, seen", [
    ("json", "\\u001b[2J"),  # JSON's own escape
    ("csv", "\\x1b[2J"),  # raw in a CSV file, made visible on the terminal
    ("html", "=1+2 [2J"),  # the HTML renderer blanks controls
])
def test_documents_shown_on_a_terminal_are_made_visible(catalog, fmt, seen):
    code, shown = _on_a_terminal(["check", catalog, "--sites", DEMO_SITES, "--site", "harrowgate",
                                  "--format", fmt])
    assert code == 0
    _no_raw_controls(shown)
    assert seen in shown


def test_files_keep_the_raw_values(catalog, tmp_path):
    out = tmp_path / "report.json"
    assert _run("check", catalog, "--sites", DEMO_SITES, "-o", str(out)).exit_code in (0, 1)
    connections = {r["rating"]["connection"] for r in json.loads(out.read_text())["results"]}
    assert connections <= {"=1+2\x1b[2J", "@star\x9b"} and connections


def test_csv_cells_never_start_a_formula(catalog, tmp_path):
    out = tmp_path / "report.csv"
    assert _run("check", catalog, "--sites", DEMO_SITES, "-o", str(out)).exit_code in (0, 1)
    with open(out, newline="", encoding="utf-8") as handle:
        rows = list(csv.DictReader(handle))[:-1]  # the caution row last
    assert {r["connection"] for r in rows} <= {"'=1+2\x1b[2J", "'@star\x9b"}
    for row in rows:
        for value in row.values():
            assert not value.startswith(("=", "+", "@", "\t", "\r")), value
            assert not value.startswith("-") or value.replace(".", "", 1).lstrip("-").isdigit()


@pytest.mark.parametrize("value, cell", [
    ("=SUM(A1:A9)", "'=SUM(A1:A9)"), ("+1", "'+1"), ("-1+1", "'-1+1"), ("@cmd", "'@cmd"),
    ("\t=x", "'\t=x"), ("\r=x", "'\r=x"), ("plain", "plain"), ("a=b", "a=b"), (None, ""),
    (-4.5, -4.5), (0, 0),
])
def test_neutral_cell(value, cell):
    assert neutral_cell(value) == cell


def test_neutral_cells_read_back_as_text_by_a_csv_reader():
    buffer = io.StringIO()
    csv.writer(buffer).writerow([neutral_cell("=1+1"), neutral_cell("ok")])
    assert next(csv.reader(io.StringIO(buffer.getvalue()))) == ["'=1+1", "ok"]


@pytest.mark.parametrize("text, shown", [
    ("plain ± text", "plain ± text"), ("a\x1b[2Jb", "a\\x1b[2Jb"), ("bell\x07", "bell\\x07"),
    ("csi\x9b", "csi\\x9b"), ("bidi\u202e", "bidi\\u202e"), ("cr\rlf\n", "cr\\x0dlf\\x0a"),
    ("tab\tkept", "tab\tkept"),
])
def test_visible(text, shown):
    assert visible(text) == shown


@pytest.mark.skipif(not hasattr(os, "openpty"), reason="no pseudo-terminals on this platform")
def test_an_8_bit_control_json_leaves_raw_is_made_visible_on_a_terminal(write):
    path = write("csi.toml", CATALOG.replace('["=1+2\\u001b[2J", "@star\\u009b"]',
                                             '["star\\u009b2J", "delta"]'))
    code, shown = _on_a_terminal(["check", path, "--sites", DEMO_SITES, "--site", "harrowgate",
                                  "--format", "json"])
    assert code == 0
    _no_raw_controls(shown)
    assert '"connection":"star\\x9b2J"' in shown


@pytest.mark.skipif(not hasattr(os, "openpty"), reason="no pseudo-terminals on this platform")
def test_the_table_takes_the_terminals_width():
    code, shown = _on_a_terminal(["check"], env={"COLUMNS": "72"})
    assert code == 1
    lines = shown.splitlines()
    assert max(len(line) for line in lines) <= 72
    assert any("━" in line or "─" in line for line in lines)  # a terminal's table, not the plain one


def test_a_usage_error_shows_the_users_text_visibly():
    result = _run("check", "--format", "x\x1b[2J")
    assert result.exit_code == 2
    _no_raw_controls(result.output)
    assert "'x\\x1b[2J' is not one of" in result.output
