"""The fleet runner: chunks checked by forked workers give exactly the document one process
writes, in input order; a worker that dies ends the run with a clear error, never a hang."""

import json
import os
import signal

import pytest
from click.testing import CliRunner

from machinecheck import fleet as runner
from machinecheck.cli.main import main
from machinecheck.cli.sources import demo_path
from machinecheck.errors import MachinecheckError
from machinecheck.inputs.catalog import load_catalog, load_sites

ENV = {"NO_COLOR": "1", "COLUMNS": "120"}


def run(*args):
    return CliRunner().invoke(main, list(args), env=ENV)


def _demo():
    return load_catalog(demo_path("fleet.toml")).machines, load_sites(demo_path("sites.toml"))


@pytest.fixture
def small_chunks(monkeypatch):
    """Chunks of 3 machines, and workers even for the 12-machine demo."""
    monkeypatch.setattr(runner, "CHUNK_MACHINES", 3)
    monkeypatch.setattr(runner, "PARALLEL_PAIRS", 0)
    monkeypatch.setattr(runner, "workers_available", lambda: 2)


@pytest.mark.skipif(not hasattr(os, "fork"), reason="the workers are forked; no fork here")
@pytest.mark.parametrize("fmt", ["json", "csv"])
@pytest.mark.parametrize("workers", [2, 3, 5])
def test_workers_give_the_serial_document_in_order(small_chunks, fmt, workers):
    machines, sites = _demo()
    outputs = []
    for count in (1, workers):
        tally = runner.Tally()
        text = b"".join(runner.stream(machines, sites, fmt, tally=tally, workers=count,
                                      problems_only=fmt == "csv"))
        outputs.append((text, tally.counts, tally.shown))
    assert outputs[0] == outputs[1]
    assert outputs[0][1]["incompatible"] > 0
    if fmt == "json":
        ids = [r["machine"] for r in json.loads(outputs[0][0])["results"]]
        assert ids[:: len(sites)] == [m.id for m in machines]  # input order, machine by machine


@pytest.mark.skipif(not hasattr(os, "fork"), reason="the workers are forked; no fork here")
def test_the_cli_file_written_by_workers_is_the_stdout_document(small_chunks, tmp_path):
    catalog, sites = demo_path("fleet.toml"), demo_path("sites.toml")
    out = tmp_path / "out.json"
    to_file = run("check", catalog, "--sites", sites, "-o", str(out))
    to_stdout = run("check", catalog, "--sites", sites, "--format", "json")
    assert to_file.exit_code == to_stdout.exit_code == 1
    assert out.read_text(encoding="utf-8") == to_stdout.stdout


def _dies(job, start, stop):
    os._exit(3)  # a worker ended abruptly (as by the out-of-memory killer)


def _killed_while_sending(job, start, stop):
    """Send half a message, then die: the parent must not wait for the rest."""
    import struct

    # a frame header promising 1 MB, a few bytes of it, then the end of the process
    os.write(_SENDER_FD[0], struct.pack("!i", 1 << 20) + b"partial")
    os.kill(os.getpid(), signal.SIGKILL)


_SENDER_FD = [None]


@pytest.mark.skipif(not hasattr(os, "fork"), reason="the workers are forked; no fork here")
def test_a_dead_worker_ends_the_run_with_a_clear_error(small_chunks, monkeypatch, tmp_path):
    monkeypatch.setattr(runner, "check_chunk", _dies)
    out = tmp_path / "out.json"
    result = run("check", demo_path("fleet.toml"), "--sites", demo_path("sites.toml"),
                 "-o", str(out))
    assert result.exit_code == 2
    assert "a worker process ended with status 3" in result.output
    assert "Traceback" not in result.output
    assert list(tmp_path.iterdir()) == []


@pytest.mark.skipif(not hasattr(os, "fork"), reason="the workers are forked; no fork here")
def test_a_worker_killed_while_sending_is_reported_not_waited_for(small_chunks, monkeypatch):
    original = runner._worker

    def worker(job, bounds, sender, others):
        _SENDER_FD[0] = sender.fileno()
        original(job, bounds, sender, others)

    monkeypatch.setattr(runner, "_worker", worker)
    monkeypatch.setattr(runner, "check_chunk", _killed_while_sending)
    machines, sites = _demo()
    with pytest.raises(MachinecheckError, match="was killed by SIGKILL"):
        b"".join(runner.stream(machines, sites, "json", tally=runner.Tally(), workers=2))


@pytest.mark.skipif(not hasattr(os, "fork"), reason="the workers are forked; no fork here")
def test_workers_are_ended_when_the_reader_stops_early(small_chunks, monkeypatch):
    started = []
    original = runner.Workers.__init__

    def remember(self, *args, **kwargs):
        original(self, *args, **kwargs)
        started.extend(self.processes)

    monkeypatch.setattr(runner.Workers, "__init__", remember)
    machines, sites = _demo()
    pieces = runner.stream(machines, sites, "json", tally=runner.Tally(), workers=2)
    next(pieces)
    next(pieces)
    pieces.close()  # as when the output fails or a signal arrives
    assert started and not any(p.is_alive() for p in started)


def test_small_fleets_stay_in_one_process(monkeypatch):
    monkeypatch.setattr(runner, "Workers", None)  # would fail if used
    machines, sites = _demo()
    text = b"".join(runner.stream(machines, sites, "json", tally=runner.Tally(), workers=8))
    assert len(json.loads(text)["results"]) == len(machines) * len(sites)


def _refuses(job, start, stop):
    raise MachinecheckError(f"chunk {start}-{stop} cannot be checked")


@pytest.mark.skipif(not hasattr(os, "fork"), reason="the workers are forked; no fork here")
def test_an_error_in_a_worker_is_raised_by_the_parent_as_one_process_would(small_chunks,
                                                                          monkeypatch):
    monkeypatch.setattr(runner, "check_chunk", _refuses)
    machines, sites = _demo()
    with pytest.raises(MachinecheckError, match="chunk 0-3 cannot be checked"):
        b"".join(runner.stream(machines, sites, "json", tally=runner.Tally(), workers=2))
