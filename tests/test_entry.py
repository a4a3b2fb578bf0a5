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


def _run(monkeypatch, args):
    """entry.run() in-process: the status it leaves with, os._exit caught."""
    monkeypatch.setattr(sys, "argv", ["machinecheck", *args])

    class Left(Exception):
        pass

    def leave(code):
        raise Left(code)

    monkeypatch.setattr(entry.os, "_exit", leave)
    with pytest.raises(Left) as left:
        entry.run()
    return left.value.args[0]


def test_run_leaves_with_the_status_of_the_command(monkeypatch, capsys):
    assert _run(monkeypatch, ["speed", "--poles", "4", "--frequency", "50"]) == 0
    assert "1500" in capsys.readouterr().out  # n_s = 120 f / p: standards.md section 9 table
    assert _run(monkeypatch, ["speed", "--poles", "4"]) == 2  # click's usage error
    assert _run(monkeypatch, ["check"]) == 1  # the demo has incompatible pairs


def test_run_turns_a_message_exit_into_status_1(monkeypatch, capsys):
    def fail():
        raise SystemExit("no such thing")

    monkeypatch.setattr(entry, "main", fail)
    assert _run(monkeypatch, []) == 1
    assert capsys.readouterr().err == "no such thing\n"


def test_run_leaves_the_usual_way_when_a_stream_cannot_be_flushed(monkeypatch):
    class Closed:
        def write(self, text):
            return len(text)

        def flush(self):
            raise BrokenPipeError

    monkeypatch.setattr(entry, "main", lambda: None)
    monkeypatch.setattr(sys, "stdout", Closed())
    monkeypatch.setattr(entry.os, "_exit", None)  # must not be reached
    with pytest.raises(SystemExit) as left:
        entry.run()
    assert left.value.code == 0


def test_the_console_script_and_module_exit_with_the_status(tmp_path):
    import subprocess

    out = tmp_path / "report.json"
    done = subprocess.run([sys.executable, "-m", "machinecheck", "check", "--format", "json",
                           "--output", str(out)], capture_output=True, text=True)
    assert done.returncode == 1  # the demo has incompatible pairs
    assert "wrote" in done.stderr and out.read_text().endswith("]}\n")
    done = subprocess.run([sys.executable, "-m", "machinecheck", "speed", "--poles", "4",
                           "--frequency", "50"], capture_output=True, text=True)
    assert done.returncode == 0 and "1500" in done.stdout  # n_s = 120 f / p, as above
