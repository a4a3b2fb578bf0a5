"""Run machinecheck as a real child process, as a user's shell would."""

from __future__ import annotations

import os
import subprocess
import sys

import machinecheck

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
#: Where the package under test is imported from: the child runs the same one.
PACKAGE_PARENT = os.path.dirname(os.path.dirname(os.path.abspath(machinecheck.__file__)))
DEMO_FLEET = os.path.join(ROOT, "catalogs", "fleet.toml")
DEMO_SITES = os.path.join(ROOT, "catalogs", "sites.toml")

#: A child whose chunks each take 0.2 s, in chunks of one machine, with workers even for the
#: demo: a fleet check long enough to be interrupted while its workers run.
SLOW_CHECK = (
    "import time\n"
    "from machinecheck import fleet\n"
    "checked = fleet.check_chunk\n"
    "def slow(*args):\n"
    "    time.sleep(0.2)\n"
    "    return checked(*args)\n"
    "fleet.check_chunk = slow\n"
    "fleet.CHUNK_MACHINES = 1\n"
    "fleet.PARALLEL_PAIRS = 0\n"
    "fleet.workers_available = lambda: 2\n"
    "from machinecheck.cli import main\n"
    "main(prog_name='machinecheck')\n"
)


def environment(**extra: str) -> dict[str, str]:
    env = {**os.environ, "NO_COLOR": "1", "PYTHONPATH": PACKAGE_PARENT, "MACHINECHECK_CACHE": ""}
    env.pop("COLUMNS", None)
    env.update(extra)
    return env


def command(*args: str, slow: bool = False) -> list[str]:
    if slow:
        return [sys.executable, "-c", SLOW_CHECK, *args]
    return [sys.executable, "-m", "machinecheck", *args]


def run(*args: str, env: dict[str, str] | None = None, timeout: float = 60,
        **popen: object) -> subprocess.CompletedProcess[str]:
    """Run a command to its end; stdout and stderr as text (unless given otherwise)."""
    options: dict[str, object] = {"stdout": subprocess.PIPE, "stderr": subprocess.PIPE,
                                  "text": True}
    options.update(popen)
    return subprocess.run(command(*args), env=env or environment(), timeout=timeout,
                          check=False, **options)  # type: ignore[call-overload]


def children(pid: int) -> list[int]:
    """The direct children of a process (Linux /proc)."""
    try:
        with open(f"/proc/{pid}/task/{pid}/children") as handle:
            return [int(x) for x in handle.read().split()]
    except OSError:
        return []


def alive(pid: int) -> bool:
    """Whether a process still runs (a zombie counts as ended)."""
    try:
        with open(f"/proc/{pid}/status") as handle:
            for line in handle:
                if line.startswith("State:"):
                    return "Z" not in line.split()[1]
    except OSError:
        return False
    return False


def leftovers(folder: str) -> list[str]:
    return sorted(name for name in os.listdir(folder) if name.startswith(".machinecheck-"))
