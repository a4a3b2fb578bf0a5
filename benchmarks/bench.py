"""Performance ratios of machinecheck, each measured side by side in one run.

    python benchmarks/bench.py            # full run (10,000 and 100,000 machines)
    python benchmarks/bench.py --smoke    # quick check for CI (small sizes, no targets enforced)

Ratios, not seconds: the machines are noisy. See docs/performance.md for the method.
"""

from __future__ import annotations

import argparse
import os
import statistics
import subprocess
import sys
import tempfile
import time

sys.path.insert(0, os.path.dirname(__file__))
from generate import SITES, catalog

PY = sys.executable
CLI = [PY, "-m", "machinecheck"]


def _tree(pid):
    """The process and its descendants, from /proc (Linux)."""
    found, stack = [], [pid]
    while stack:
        current = stack.pop()
        found.append(current)
        try:
            with open(f"/proc/{current}/task/{current}/children") as handle:
                stack += [int(x) for x in handle.read().split()]
        except OSError:
            pass
    return found


def _pss_kb(pid):
    try:
        with open(f"/proc/{pid}/smaps_rollup") as handle:
            for line in handle:
                if line.startswith("Pss:"):
                    return int(line.split()[1])
    except OSError:
        pass
    return 0


def tree_peak(cmd, env=None):
    """Peak proportional set size (kB) of a command and all its worker processes together,
    sampled every 10 ms: shared pages are counted once, split between their sharers."""
    proc = subprocess.Popen(cmd, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, env=env)
    peak = 0
    while proc.poll() is None:
        peak = max(peak, sum(_pss_kb(p) for p in _tree(proc.pid)))
        time.sleep(0.01)
    return peak


def run_once(cmd, env=None, fresh=None):
    """Wall time of one run of a command, and its peak RSS (kB).

    ``fresh``: a file the command writes, removed before the run, so that every run writes a
    new report as the first does (replacing a large file costs the kernel more, see
    docs/performance.md)."""
    if fresh is not None and os.path.exists(fresh):
        os.remove(fresh)
    start = time.perf_counter()
    proc = subprocess.run(["/usr/bin/time", "-f", "%M", *cmd], capture_output=True, text=True,
                          env=env) if os.path.exists("/usr/bin/time") else subprocess.run(
                              cmd, capture_output=True, text=True, env=env)
    seconds = time.perf_counter() - start
    if proc.returncode not in (0, 1):
        raise SystemExit(f"command failed ({proc.returncode}): {' '.join(cmd)}\n{proc.stderr}")
    tail = proc.stderr.strip().splitlines()[-1:] if proc.stderr else []
    return seconds, int(tail[0]) if tail and tail[0].isdigit() else 0


def timed(cmd, repeat=3, env=None):
    """Median wall time of a command, and the peak RSS (kB) of its last run."""
    runs = [run_once(cmd, env) for _ in range(repeat)]
    return statistics.median(seconds for seconds, _ in runs), runs[-1][1]


def fleet(size, folder, repeat):
    """Parse and check runs taken in turn, so that both meet the same machine: the median of
    the per-turn ratios, their range, the median check time and the peak memory."""
    path = os.path.join(folder, f"fleet-{size}.toml")
    with open(path, "w", encoding="utf-8") as handle:
        handle.write(catalog(size))
    sites = os.path.join(folder, "sites.toml")
    with open(sites, "w", encoding="utf-8") as handle:
        handle.write(SITES)
    out = os.path.join(folder, f"out-{size}.json")
    parse = [PY, "-c", f"import tomllib; tomllib.load(open({path!r}, 'rb'))"]
    check = [*CLI, "check", path, "--sites", sites, "--format", "json", "--output", out]
    ratios, checks, peak = [], [], 0
    for _ in range(repeat):
        t_parse, _ = run_once(parse)
        t_check, peak = run_once(check, fresh=out)
        ratios.append(t_check / t_parse)
        checks.append(t_check)
    total = tree_peak(check) if os.path.exists("/proc/self/smaps_rollup") else 0
    return statistics.median(ratios), (min(ratios), max(ratios)), statistics.median(checks), \
        peak, total


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--smoke", action="store_true")
    args = parser.parse_args()
    sizes = (300, 3000) if args.smoke else (10_000, 100_000)
    repeats = {300: 1, 3000: 1} if args.smoke else {10_000: 5, 100_000: 3}
    with tempfile.TemporaryDirectory() as folder:
        # every command runs in the scratch folder: "python -m machinecheck" started in the
        # project's root would import the sources there (pure Python, compiled to bytecode
        # again on every run where PYTHONDONTWRITEBYTECODE is set), not the installed package
        os.chdir(folder)
        build = subprocess.run([*CLI, "--version"], capture_output=True, text=True).stdout
        print(f"measuring {build.strip()} ({sys.executable})")
        t_bare, _ = timed([PY, "-c", "pass"], 5)
        t_lookup, _ = timed([*CLI, "speed", "--poles", "4", "--frequency", "50"], 5)
        print(f"lookup: speed --poles 4 --frequency 50 = {t_lookup / t_bare:.1f} x bare python "
              f"(target <= 6x)")
        demo_env = {**os.environ, "NO_COLOR": "1"}
        t_demo, _ = timed([*CLI, "check"], 3, env=demo_env)
        print(f"demo table: {t_demo:.2f} s (target < 1 s)")
        results = []
        for size in sizes:
            ratio, (low, high), t_check, peak, total = fleet(size, folder, repeats[size])
            pairs = size * 3
            results.append((size, t_check))
            print(f"fleet {size} machines x 3 sites: check = {ratio:.2f} x tomllib parse alone "
                  f"(median of {repeats[size]} turns, {low:.2f}-{high:.2f}; target <= 2x); "
                  f"peak memory {peak / 1024:.0f} MB (largest process), "
                  f"{total / 1024:.0f} MB (all processes, PSS); "
                  f"{size / t_check:,.0f} machines/s ({pairs / t_check:,.0f} pairs/s)")
        (s0, t0), (s1, t1) = results
        print(f"scaling {s0} -> {s1}: time x{t1 / t0:.1f} for size x{s1 / s0:.0f}")


if __name__ == "__main__":
    main()
