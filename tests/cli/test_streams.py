"""Standard output that is closed, full, a closed pipe or unable to encode: one clear line and
exit 2 (a closed pipe: quietly), never a traceback. Files that cannot be written: likewise."""

from __future__ import annotations

import os
import subprocess

import pytest
from child import command, environment, leftovers, run

from machinecheck.report.text import ASCII_SPELLING

HAS_DEV_FULL = os.path.exists("/dev/full")
LOOKUP = ("speed", "--poles", "4", "--frequency", "50", "--rated-speed", "1440")


def _one_line(stderr: str, needle: str) -> None:
    lines = stderr.strip().splitlines()
    assert len(lines) == 1 and needle in lines[0], stderr
    assert "Traceback" not in stderr


@pytest.mark.skipif(not HAS_DEV_FULL, reason="no /dev/full here")
@pytest.mark.parametrize("args", [LOOKUP, ("check", "--format", "json")])
def test_dev_full_as_standard_output(args):
    with open("/dev/full", "w") as full:
        result = run(*args, stdout=full)
    assert result.returncode == 2
    _one_line(result.stderr, "standard output: no space left on the device")


@pytest.mark.skipif(not HAS_DEV_FULL, reason="no /dev/full here")
def test_dev_full_as_output_file():
    result = run("check", "--format", "csv", "-o", "/dev/full")
    assert result.returncode == 2
    _one_line(result.stderr, "/dev/full: no space left on the device")


@pytest.mark.parametrize("args", [LOOKUP, ("check",)])
def test_closed_standard_output(args):
    proc = subprocess.run(command(*args), env=environment(), stdout=subprocess.DEVNULL,
                          stderr=subprocess.PIPE, text=True, timeout=60,
                          preexec_fn=lambda: os.close(1))
    assert proc.returncode == 2
    _one_line(proc.stderr, "standard output: is closed")


@pytest.mark.parametrize("args", [LOOKUP, ("check", "--format", "json")])
def test_a_closed_pipe_ends_quietly(args):
    read_end, write_end = os.pipe()
    os.close(read_end)  # the reader has gone before the first byte, as with `| head -c0`
    try:
        result = run(*args, stdout=write_end)
    finally:
        os.close(write_end)
    assert result.returncode == 141
    assert result.stderr == ""


@pytest.mark.parametrize("encoding", ["ascii", "cp1252", "latin-1"])
def test_a_console_without_unicode_gets_plain_ascii(encoding):
    result = run(*LOOKUP, env=environment(PYTHONIOENCODING=encoding), text=False)
    assert result.returncode == 0, result.stderr
    try:
        plus_minus = "±".encode(encoding)  # cp1252 and latin-1 have it
    except UnicodeEncodeError:
        plus_minus = b"+/-"
    assert b"1440 rpm " + plus_minus + b"12" in result.stdout
    table = run("check", env=environment(PYTHONIOENCODING=encoding), text=False)
    assert table.returncode == 1 and b"Traceback" not in table.stderr
    table.stdout.decode(encoding)  # every byte is in the console's encoding
    assert b"x the site requires IE3" in table.stdout  # the cross mark spelt as x


def test_ascii_spellings_are_ascii():
    assert all(spelling.isascii() for spelling in ASCII_SPELLING.values())


def test_an_overlong_file_name(tmp_path):
    result = run("check", "-o", str(tmp_path / ("r" * 300 + ".json")))
    assert result.returncode == 2
    _one_line(result.stderr, "the file name is too long")
    assert os.listdir(tmp_path) == []


@pytest.mark.skipif(os.geteuid() == 0 if hasattr(os, "geteuid") else True,
                    reason="permissions do not bind the superuser (or no POSIX permissions)")
def test_a_read_only_folder(tmp_path):
    folder = tmp_path / "locked"
    folder.mkdir()
    (folder / "report.json").write_text("old")
    folder.chmod(0o555)
    try:
        result = run("check", "-o", str(folder / "report.json"))
    finally:
        folder.chmod(0o755)
    assert result.returncode == 2
    _one_line(result.stderr, "permission denied")
    assert (folder / "report.json").read_text() == "old"
    assert leftovers(str(folder)) == []


def test_a_fifo_in_the_state_folders_never_blocks(tmp_path):
    """No state file is opened: FIFOs at every place one could live do not block a run."""
    from machinecheck.inputs import units

    if hasattr(units, "cache_path"):
        pytest.skip("this build still keeps a unit cache in the home folder")
    home = tmp_path / "home"
    for folder in (home / ".cache" / "machinecheck", home / ".config" / "machinecheck"):
        folder.mkdir(parents=True)
        for name in ("units.json", "state", "cache"):
            os.mkfifo(folder / name)
    env = environment(HOME=str(home), XDG_CACHE_HOME=str(home / ".cache"),
                      XDG_CONFIG_HOME=str(home / ".config"))
    env.pop("MACHINECHECK_CACHE")
    assert run("check", env=env, timeout=30).returncode == 1
    assert run(*LOOKUP, env=env, timeout=30).returncode == 0


def test_a_closed_standard_output_does_not_stop_a_report_to_a_file(tmp_path):
    target = tmp_path / "report.json"
    proc = subprocess.run(command("check", "-o", str(target)), env=environment(),
                          stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True,
                          timeout=60, preexec_fn=lambda: os.close(1))
    assert proc.returncode == 1, proc.stderr
    assert target.read_text(encoding="utf-8").startswith("{")


def test_deeply_nested_input_is_one_line_not_a_traceback(tmp_path):
    deep = tmp_path / "deep.toml"
    deep.write_text("a = " + "[" * 5000 + "1" + "]" * 5000 + "\n")
    result = run("validate", str(deep))
    assert result.returncode == 2
    assert len(result.stderr.strip().splitlines()) == 1 and "Traceback" not in result.stderr
    assert "nested" in result.stderr
