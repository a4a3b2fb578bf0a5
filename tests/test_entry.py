"""The command entry: plain lookups answered without click give exactly the click output."""

import sys

import pytest
from click.testing import CliRunner

from machinecheck import entry
from machinecheck.cli import main as click_main

LOOKUPS = [
    ["speed", "--poles", "4", "--frequency", "50"],
    ["speed", "--frequency=60", "--rated-speed", "1460 rpm", "--rated-frequency", "50 Hz"],
    ["poles", "--speed", "1460 rpm", "--frequency", "50 Hz"],
    ["current", "--power", "22 kW", "--voltage", "400 V", "--efficiency", "0.92",
     "--power-factor", "0.85"],
    ["current", "--power", "500 kVA", "--voltage", "400", "--phases", "3"],
]
LEFT_TO_CLICK = [
    ["speed", "--help"],
    ["speed", "--poles", "four", "--frequency", "50"],
    ["speed", "--pole", "4", "--frequency", "50"],
    ["speed", "--poles", "4"],
    ["speed", "--poles", "5", "--frequency", "50"],
    ["current", "--power", "22 kW", "--voltage", "400 V"],
    ["current", "--power", "22 kW", "--voltage", "400 V", "--phases", "2"],
    ["poles", "--speed", "1500 rpm", "--frequency", "50 Hz"],
]


def _entry(monkeypatch, capsys, args):
    monkeypatch.setattr(sys, "argv", ["machinecheck", *args])
    code = 0
    try:
        entry.main()
    except SystemExit as exc:
        code = exc.code or 0
    captured = capsys.readouterr()
    return code, captured.out, captured.err


@pytest.mark.parametrize("args", LOOKUPS)
def test_plain_lookups_skip_click_and_match_it(monkeypatch, capsys, args):
    assert entry.plain_options(args[0], args[1:]) is not None
    monkeypatch.setattr("machinecheck.cli.main", None)  # must not be reached
    code, out, _ = _entry(monkeypatch, capsys, args)
    expected = CliRunner().invoke(click_main, args, prog_name="machinecheck")
    assert code == expected.exit_code == 0
    assert out == expected.output


@pytest.mark.parametrize("args", LEFT_TO_CLICK)
def test_anything_else_goes_to_click(monkeypatch, capsys, args):
    code, out, err = _entry(monkeypatch, capsys, args)
    expected = CliRunner().invoke(click_main, args, prog_name="machinecheck")
    assert code == expected.exit_code
    assert (out + err).strip() == expected.output.strip()
