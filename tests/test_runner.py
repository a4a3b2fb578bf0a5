"""The fleet runner: pieces checked by workers give exactly the document one process writes,
and anything a piece cannot judge alone is reported as the whole load reports it."""

import pytest
from click.testing import CliRunner

from machinecheck import runner
from machinecheck.cli import _demo_path, main

ENV = {"NO_COLOR": "1", "COLUMNS": "120"}


def run(*args):
    return CliRunner().invoke(main, list(args), env=ENV)


@pytest.fixture
def small_pieces(monkeypatch):
    """Cut after every 3 machines and use workers even for the 12-machine demo."""
    monkeypatch.setattr(runner, "CHUNK_MACHINES", 3)
    monkeypatch.setattr(runner, "PARALLEL_PAIRS", 0)
    monkeypatch.setattr(runner, "workers_available", lambda: 2)


def _demo_text():
    with open(_demo_path("fleet.toml"), encoding="utf-8") as handle:
        return handle.read()


@pytest.mark.parametrize("fmt", ["json", "csv"])
def test_text_pieces_give_the_serial_document(small_pieces, tmp_path, fmt, monkeypatch):
    used = []
    original = runner.stream_files
    monkeypatch.setattr(runner, "stream_files", lambda *a, **k: used.append(1) or original(*a, **k))
    out = tmp_path / f"out.{fmt}"
    catalog = tmp_path / "fleet.toml"
    catalog.write_text(_demo_text(), encoding="utf-8")
    assert runner.plan_file(str(catalog), _demo_text()).machines == 12
    parallel = run("check", str(catalog), "--format", fmt, "-o", str(out))
    serial = run("check", str(catalog), "--format", fmt)  # stdout: loaded whole, one process
    assert parallel.exit_code == serial.exit_code == 1
    assert out.read_text(encoding="utf-8") == serial.output
    assert used == [1]  # the pieces path was taken


def _with_machine(text, index, replace_from, replace_to):
    parts = text.split("[[machine]]")
    parts[index + 1] = parts[index + 1].replace(replace_from, replace_to, 1)
    return "[[machine]]".join(parts)


@pytest.mark.parametrize(("change", "needle"), [
    (lambda t: _with_machine(t, 7, 'frequency = "50 Hz"', 'frequency = "50 A"'),
     "is not a unit of frequency"),
    (lambda t: _with_machine(t, 9, 'id = "K-111"', 'id = "P-101"'), "duplicate id"),
    (lambda t: _with_machine(t, 5, 'id = "H-610"', 'id = "H-610\n'), "TOML syntax error"),
    (lambda t: t + '\n[[site]]\nid = "x"\n', "unknown key 'site'"),
])
def test_a_problem_in_one_piece_is_reported_as_the_whole_load_reports_it(
        small_pieces, tmp_path, change, needle):
    catalog = tmp_path / "fleet.toml"
    catalog.write_text(change(_demo_text()), encoding="utf-8")
    out = tmp_path / "out.json"
    parallel = run("check", str(catalog), "--format", "json", "-o", str(out))
    serial = run("check", str(catalog), "--format", "json")
    assert parallel.exit_code == serial.exit_code == 2
    assert needle in parallel.output
    assert parallel.output == serial.output
    assert not out.exists()


def test_a_table_after_the_machines_falls_back_to_the_whole_load(small_pieces, tmp_path):
    catalog = tmp_path / "fleet.toml"
    head, _, rest = _demo_text().partition("[[machine]]")
    catalog.write_text("[[machine]]" + rest + head, encoding="utf-8")  # [catalog] moved last
    out = tmp_path / "out.json"
    result = run("check", str(catalog), "--format", "json", "-o", str(out))
    assert result.exit_code == 1
    assert out.read_text(encoding="utf-8") == run("check", "--format", "json").output


def test_multi_line_strings_are_never_cut():
    text = '[[machine]]\nid = "A"\ndescription = """\n[[machine]]\n"""\n[[machine]]\nid = "B"\n'
    assert runner.plan_file("x.toml", text) is None
    assert runner.plan_file("x.toml", text.replace('"""', '"')) is not None


def _dies(job):
    import os

    os._exit(3)  # a worker killed mid-run (as by the out-of-memory killer)


@pytest.mark.parametrize("to_file", [True, False])
def test_a_dead_worker_ends_the_run_cleanly(small_pieces, tmp_path, monkeypatch, to_file):
    monkeypatch.setattr(runner, "_work", _dies)
    monkeypatch.setattr(runner, "_work_text", _dies)
    catalog = tmp_path / "fleet.toml"
    catalog.write_text(_demo_text(), encoding="utf-8")
    out = tmp_path / "out.json"
    args = ["check", str(catalog), "--format", "json"] + (["-o", str(out)] if to_file else [])
    result = run(*args)
    assert result.exit_code == 2
    assert "worker process ended unexpectedly" in result.output
    assert "Traceback" not in result.output
    assert not out.exists()
