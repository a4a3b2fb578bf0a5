"""The demo runs only when nothing at all is given, and says so; anything given but incomplete
is an error naming what is missing; the end of a run says what its exit status means."""

from __future__ import annotations

import pytest
from child import DEMO_FLEET, DEMO_SITES
from click.testing import CliRunner

from machinecheck.cli.check import attention_line, resolve_format
from machinecheck.cli.main import main
from machinecheck.errors import InputError

ONE_OFF_MACHINE = ["--power", "50 hp", "--voltage", "460 V", "--frequency", "60 Hz",
                   "--speed", "1775 rpm", "--efficiency", "0.93", "--power-factor", "0.85"]


def run(*args):
    return CliRunner().invoke(main, list(args), env={"NO_COLOR": "1"})


def test_the_demo_says_it_is_the_demo():
    result = run("check")
    assert result.exit_code == 1
    assert result.stdout.splitlines()[0] == ("machinecheck demo: an invented fleet checked "
                                             "against invented sites")


def test_a_users_check_is_not_called_a_demo():
    result = run("check", DEMO_FLEET, "--sites", DEMO_SITES)
    assert result.exit_code == 1
    assert "demo" not in result.stdout.splitlines()[0]


@pytest.mark.parametrize("args, needle", [
    ([DEMO_FLEET], "no sites to check against: give --sites FILE"),
    (["--sites", DEMO_SITES], "no machines to check: give CATALOG files"),
    (ONE_OFF_MACHINE, "no sites to check against"),
    (["--supply-voltage", "400 V", "--supply-frequency", "50 Hz"], "no machines to check"),
    ([*ONE_OFF_MACHINE, "--supply-voltage", "400 V"], "needs --supply-frequency as well"),
    ([*ONE_OFF_MACHINE, "--supply-frequency", "50 Hz"], "needs --supply-voltage as well"),
    ([DEMO_FLEET, *ONE_OFF_MACHINE, "--sites", DEMO_SITES], "not both"),
])
def test_what_is_missing_is_named_and_no_demo_data_is_mixed_in(args, needle):
    result = run("check", *args, "--format", "json")
    assert result.exit_code == 2
    assert needle in result.output
    assert "harrowgate" not in result.output and "P-101" not in result.output


@pytest.mark.parametrize("counts, strict, line", [
    ({"compatible": 4, "conditional": 0, "incompatible": 3}, False,
     "3 pairs need attention (3 incompatible): exit status 1."),
    ({"compatible": 4, "conditional": 0, "incompatible": 1}, False,
     "1 pair needs attention (1 incompatible): exit status 1."),
    ({"compatible": 4, "conditional": 2, "incompatible": 1}, True,
     "3 pairs need attention (1 incompatible, 2 conditional): exit status 1."),
    ({"compatible": 4, "conditional": 1, "incompatible": 0}, False,
     "No pair needs attention (1 pair conditional; --strict counts them): exit status 0."),
    ({"compatible": 4, "conditional": 0, "incompatible": 0}, False,
     "No pair needs attention: exit status 0."),
])
def test_the_exit_status_in_words(counts, strict, line):
    assert attention_line(counts, strict) == line


def test_a_table_run_ends_with_the_exit_status_in_words():
    result = run("check")
    assert result.stderr.strip().splitlines()[-1] == (
        "28 pairs need attention (28 incompatible): exit status 1.")


@pytest.mark.parametrize("fmt, output, chosen", [
    (None, None, "table"), (None, "-", "table"), (None, "r.JSON", "json"), (None, "r.md", "markdown"),
    (None, "r.htm", "html"), (None, "r.txt", "table"), (None, "r.csv", "csv"), ("csv", "r.out", "csv"),
    (None, "r.out", "table"), ("json", "-", "json"), ("html", "r.html", "html"),
])
def test_the_format_from_the_extension(fmt, output, chosen):
    assert resolve_format(fmt, output) == chosen


def test_a_contradicting_format_is_refused():
    with pytest.raises(InputError, match="contradicts"):
        resolve_format("csv", "report.json")


def test_the_plain_table_is_stable_and_one_finding_a_line():
    wide = CliRunner().invoke(main, ["check"], env={"NO_COLOR": "1", "COLUMNS": "200"})
    narrow = CliRunner().invoke(main, ["check"], env={"NO_COLOR": "1", "COLUMNS": "60"})
    assert wide.stdout == narrow.stdout  # no terminal: the environment does not change it
    assert max(len(line) for line in wide.stdout.splitlines() if line.startswith("|")) <= 100
    assert "K-111 at harrowgate (incompatible): " in wide.stdout
