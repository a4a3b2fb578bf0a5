"""Where a report may be written: regular files atomically, devices and FIFOs in place, `-` to
standard output, and nothing else replaced. Real child processes, real FIFOs and devices."""

from __future__ import annotations

import json
import os
import stat
import threading

import pytest
from child import DEMO_FLEET, DEMO_SITES, leftovers, run

from machinecheck.cli import output

HAS_FIFO = hasattr(os, "mkfifo")
HAS_DEV_NULL = os.path.exists("/dev/null") and stat.S_ISCHR(os.stat("/dev/null").st_mode)


def _unchanged(path: str, before: os.stat_result) -> None:
    after = os.lstat(path)
    assert (after.st_ino, after.st_mode, after.st_size) == (before.st_ino, before.st_mode,
                                                           before.st_size)


@pytest.mark.skipif(not HAS_DEV_NULL, reason="no /dev/null character device here")
def test_dev_null_is_written_in_place_not_replaced():
    before = os.lstat("/dev/null")
    result = run("check", "--format", "json", "-o", "/dev/null")
    assert result.returncode == 1, result.stderr
    assert "wrote 48 pairs to /dev/null" in result.stderr
    _unchanged("/dev/null", before)
    assert stat.S_ISCHR(os.lstat("/dev/null").st_mode)


@pytest.mark.skipif(not HAS_DEV_NULL, reason="no /dev/null character device here")
def test_a_symlink_to_a_device_stays_a_symlink(tmp_path):
    link = tmp_path / "sink"
    link.symlink_to("/dev/null")
    result = run("check", "--format", "csv", "-o", str(link))
    assert result.returncode == 1, result.stderr
    assert link.is_symlink() and os.readlink(link) == "/dev/null"
    assert leftovers(str(tmp_path)) == []


@pytest.mark.skipif(not HAS_FIFO, reason="no named pipes on this platform")
@pytest.mark.parametrize("via_link", [False, True])
def test_a_fifo_receives_the_report_and_stays_a_fifo(tmp_path, via_link):
    fifo = tmp_path / "pipe"
    os.mkfifo(fifo)
    target = fifo
    if via_link:
        target = tmp_path / "link"
        target.symlink_to(fifo)
    received: list[bytes] = []
    reader = threading.Thread(target=lambda: received.append(fifo.read_bytes()))
    reader.start()
    result = run("check", "--format", "json", "-o", str(target))
    reader.join(30)
    assert result.returncode == 1, result.stderr
    assert len(json.loads(received[0])["results"]) == 48
    assert stat.S_ISFIFO(os.lstat(fifo).st_mode)
    assert leftovers(str(tmp_path)) == []


def test_dash_is_standard_output(tmp_path):
    result = run("check", "--format", "json", "-o", "-", cwd=str(tmp_path))
    assert result.returncode == 1, result.stderr
    assert len(json.loads(result.stdout)["results"]) == 48
    assert os.listdir(tmp_path) == []  # no file named "-"


def test_a_regular_file_is_replaced_atomically_keeping_its_mode(tmp_path):
    target = tmp_path / "report.json"
    target.write_text("old")
    os.chmod(target, 0o640)
    result = run("check", "-o", str(target))
    assert result.returncode == 1, result.stderr
    assert len(json.loads(target.read_text())["results"]) == 48
    assert stat.S_IMODE(os.stat(target).st_mode) == 0o640
    assert leftovers(str(tmp_path)) == []


@pytest.mark.parametrize("make, needle", [
    (lambda p: p.mkdir(), "is a directory"),
    (lambda p: p.symlink_to(p.parent / "nowhere" / "x"), "symbolic link to nothing"),
    (lambda p: p.symlink_to(p.parent / "real.json"), "symbolic link to the regular file"),
])
def test_what_is_not_a_regular_file_or_device_is_refused(tmp_path, make, needle):
    (tmp_path / "real.json").write_text("keep")
    target = tmp_path / "report.json"
    make(target)
    before = os.lstat(target)
    result = run("check", "-o", str(target))
    assert result.returncode == 2
    assert needle in result.stderr and "Traceback" not in result.stderr
    assert len(result.stderr.strip().splitlines()) == 1
    _unchanged(str(target), before)
    assert (tmp_path / "real.json").read_text() == "keep"
    assert not (tmp_path / "nowhere").exists()
    assert leftovers(str(tmp_path)) == []


def test_a_missing_folder_is_not_created(tmp_path):
    result = run("check", "-o", str(tmp_path / "new" / "report.json"))
    assert result.returncode == 2
    assert "does not exist" in result.stderr
    assert os.listdir(tmp_path) == []


def test_an_input_file_is_never_the_output(tmp_path):
    catalog = tmp_path / "fleet.toml"
    with open(DEMO_FLEET, encoding="utf-8") as handle:
        catalog.write_text(handle.read(), encoding="utf-8")
    before = catalog.read_bytes()
    result = run("check", str(catalog), "--sites", DEMO_SITES, "-o", str(catalog),
                 "--format", "table")
    assert result.returncode == 2
    assert "is an input file" in result.stderr
    assert catalog.read_bytes() == before


def test_an_error_while_writing_leaves_the_old_file_and_no_temporary(tmp_path):
    target = tmp_path / "report.json"
    target.write_text("old")

    def pieces():
        yield b"new start"
        raise OSError(28, "No space left on device")

    with pytest.raises(output.OutputError, match="no space left"):
        output.write_report(pieces(), str(target))
    assert target.read_text() == "old"
    assert leftovers(str(tmp_path)) == []


@pytest.mark.parametrize("extension, fmt, first", [
    (".json", "json", "{"), (".csv", "csv", "machine,site"), (".md", "markdown", "# "),
    (".html", "html", "<!DOCTYPE html>"), (".txt", "table", "machinecheck demo"),
])
def test_the_extension_names_the_format(tmp_path, extension, fmt, first):
    target = tmp_path / f"report{extension}"
    result = run("check", "-o", str(target))
    assert result.returncode == 1, result.stderr
    assert target.read_text(encoding="utf-8").startswith(first)
    assert run("check", "--format", fmt, "-o", str(tmp_path / f"again{extension}")).returncode == 1


def test_a_format_contradicting_the_extension_is_refused(tmp_path):
    result = run("check", "--format", "json", "-o", str(tmp_path / "report.html"))
    assert result.returncode == 2
    assert "contradicts the file name" in result.stderr
    assert os.listdir(tmp_path) == []


@pytest.mark.skipif(not os.path.exists("/dev/stdout"), reason="no /dev/stdout here")
def test_dev_stdout_redirected_to_a_file_is_written_as_standard_output(tmp_path):
    redirected = tmp_path / "log.txt"
    redirected.write_text("first line\n")
    before = os.lstat("/dev/stdout")
    with open(redirected, "a") as handle:  # as `>> log.txt`
        result = run("check", "--format", "json", "-o", "/dev/stdout", stdout=handle)
    assert result.returncode == 1, result.stderr
    first, document = redirected.read_text().split("\n", 1)
    assert first == "first line" and len(json.loads(document)["results"]) == 48
    _unchanged("/dev/stdout", before)
