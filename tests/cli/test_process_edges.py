"""A fleet check stopped by a signal or by a dead worker: temporary file removed, workers ended,
the target untouched, a conventional exit status, one line and no traceback. Real child
processes; each run is slowed (0.2 s a chunk) so it can be interrupted while the workers run."""

from __future__ import annotations

import os
import signal
import subprocess
import sys
import time

import pytest
from child import DEMO_FLEET, DEMO_SITES, alive, children, command, environment, leftovers

pytestmark = pytest.mark.skipif(
    not (sys.platform.startswith("linux") and hasattr(os, "fork")),
    reason="forked workers and /proc are Linux features")


def _start(tmp_path):
    target = tmp_path / "report.json"
    target.write_text("the previous report")
    proc = subprocess.Popen(command("check", DEMO_FLEET, "--sites", DEMO_SITES, "-o", str(target),
                                    slow=True),
                            env=environment(), stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                            text=True)
    deadline = time.monotonic() + 30
    workers: list[int] = []
    while time.monotonic() < deadline:
        workers = children(proc.pid)
        if leftovers(str(tmp_path)) and len(workers) == 2:
            return proc, target, workers
        time.sleep(0.02)
    proc.kill()
    pytest.fail("the check never reached its workers")


@pytest.mark.parametrize("name, status", [("SIGTERM", 143), ("SIGHUP", 129), ("SIGINT", 130)])
def test_a_signal_ends_the_run_cleanly(tmp_path, name, status):
    proc, target, workers = _start(tmp_path)
    proc.send_signal(getattr(signal, name))
    _, stderr = proc.communicate(timeout=20)
    assert proc.returncode == status
    assert stderr.strip() == f"machinecheck: stopped by {name}"
    assert target.read_text() == "the previous report"
    assert leftovers(str(tmp_path)) == []
    assert not any(alive(pid) for pid in workers)


def test_a_worker_killed_mid_run_is_reported_within_seconds(tmp_path):
    proc, target, workers = _start(tmp_path)
    started = time.monotonic()
    os.kill(workers[0], signal.SIGKILL)
    _, stderr = proc.communicate(timeout=20)
    assert time.monotonic() - started < 10
    assert proc.returncode == 2
    lines = stderr.strip().splitlines()
    assert len(lines) == 1 and "was killed by SIGKILL" in lines[0], stderr
    assert target.read_text() == "the previous report"
    assert leftovers(str(tmp_path)) == []
    assert not any(alive(pid) for pid in workers)
