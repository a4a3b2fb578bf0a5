"""Budgets and speed devices of machinecheck, measured side by side in one run.

    python benchmarks/bench.py            # 10,000 and 100,000 machines x 3 sites
    python benchmarks/bench.py --large    # and 1,000,000 machines (several GB, minutes)
    python benchmarks/bench.py --smoke    # small sizes, once: a quick check for CI

Every figure is a ratio or a budget measured in this run, beside what it is compared with: the
machines are shared and noisy, so a ratio taken in one run says more than seconds from two.
The method is in docs/performance.md.
"""

from __future__ import annotations

import argparse
import contextlib
import json
import os
import statistics
import subprocess
import sys
import tempfile
import time
from collections.abc import Iterator

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
sys.path.insert(0, HERE)
from generate import SITES, catalog  # noqa: E402

PY = sys.executable
CLI = [PY, "-m", "machinecheck"]

#: Budgets of the project (docs/performance.md).
FLEET_RATIO_BUDGET = 2.0   # 10k x 3 to JSON with -o, against tomllib parsing the same file
MEMORY_BUDGET_MB = 300     # peak at 100k machines
LOOKUP_BUDGET_S = 0.100    # machinecheck speed --poles 4 --frequency 50, wall
DEMO_BUDGET_S = 0.5        # machinecheck check (the demo table), wall
DEVICE_MIN_GAIN = 0.10     # a speed device gaining less than this is not worth its lines


def _env() -> dict[str, str]:
    """The environment of the measured commands: the package of this checkout unless installed."""
    env = {**os.environ, "NO_COLOR": "1"}
    # bytecode is cached as an installed package's is: without it every run compiles the sources
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    try:
        import machinecheck  # noqa: F401
    except ImportError:
        env["PYTHONPATH"] = ROOT + os.pathsep + env.get("PYTHONPATH", "")
    return env


ENV = _env()


def _tree(pid: int) -> list[int]:
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


def _kb(pid: int, field: str, name: str) -> int:
    try:
        with open(f"/proc/{pid}/{name}") as handle:
            for line in handle:
                if line.startswith(field):
                    return int(line.split()[1])
    except OSError:
        pass
    return 0


def run(cmd: list[str], fresh: str | None = None) -> tuple[float, int, int]:
    """Wall time [s] of one run, the peak RSS of its largest process and the peak sum of the
    proportional set sizes of all its processes [kB] (sampled every 10 ms; Linux only).

    ``fresh``: a file the command writes, removed first, so every run writes a new report."""
    if fresh is not None and os.path.exists(fresh):
        os.remove(fresh)
    start = time.perf_counter()
    proc = subprocess.Popen(cmd, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, env=ENV)
    largest = total = 0
    while proc.poll() is None:
        tree = _tree(proc.pid)
        largest = max([largest] + [_kb(p, "VmHWM:", "status") for p in tree])
        total = max(total, sum(_kb(p, "Pss:", "smaps_rollup") for p in tree))
        time.sleep(0.01)
    seconds = time.perf_counter() - start
    stderr = proc.stderr.read().decode() if proc.stderr else ""
    if proc.returncode not in (0, 1):
        raise SystemExit(f"command failed ({proc.returncode}): {' '.join(cmd)}\n{stderr}")
    return seconds, largest, total


def median_time(cmd: list[str], repeat: int) -> float:
    return statistics.median(run(cmd)[0] for _ in range(repeat))


def write_fleet(folder: str, size: int) -> tuple[str, str]:
    path = os.path.join(folder, f"fleet-{size}.toml")
    with open(path, "w", encoding="utf-8") as handle:
        handle.write(catalog(size))
    sites = os.path.join(folder, "sites.toml")
    with open(sites, "w", encoding="utf-8") as handle:
        handle.write(SITES)
    return path, sites


def fleet(folder: str, size: int, turns: int) -> dict[str, float]:
    """Parse alone and check to JSON with -o, taken in turn: the median of the turns' ratios."""
    path, sites = write_fleet(folder, size)
    out = os.path.join(folder, f"out-{size}.json")
    parse = [PY, "-c", f"import tomllib; tomllib.load(open({path!r}, 'rb'))"]
    check = [*CLI, "check", path, "--sites", sites, "--output", out]
    ratios, checks, largest, total = [], [], 0, 0
    for _ in range(turns):
        t_parse = run(parse)[0]
        t_check, big, pss = run(check, fresh=out)
        ratios.append(t_check / t_parse)
        checks.append(t_check)
        largest, total = max(largest, big), max(total, pss)
    os.remove(out)
    return {"ratio": statistics.median(ratios), "low": min(ratios), "high": max(ratios),
            "seconds": statistics.median(checks), "largest_mb": largest / 1024,
            "total_mb": total / 1024}


@contextlib.contextmanager
def _stdlib_json() -> Iterator[None]:
    """The JSON renderer with the standard library's encoder in place of orjson."""
    from machinecheck.report import json_

    class Standard:
        @staticmethod
        def dumps(value: object) -> bytes:
            return json.dumps(value, separators=(",", ":"), ensure_ascii=False).encode()

    saved = json_.orjson
    json_.orjson = Standard  # type: ignore[assignment]
    try:
        yield
    finally:
        json_.orjson = saved


def devices(folder: str, size: int, turns: int) -> None:
    """Each kept speed device's gain on the whole in-process run (parse, check, render)."""
    sys.path.insert(0, ROOT)
    from machinecheck import fleet as runner
    from machinecheck.inputs.catalog import load_catalog, load_sites

    path, sites_path = write_fleet(folder, size)

    def whole(workers: int) -> float:
        start = time.perf_counter()
        machines = load_catalog(path).machines
        sites = load_sites(sites_path)
        for _ in runner.stream(machines, sites, "json", tally=runner.Tally(), workers=workers):
            pass
        return time.perf_counter() - start

    cores = runner.workers_available()
    runner.PARALLEL_PAIRS = 0  # workers for any size, so the small sizes of --smoke use them too
    whole(1)  # warm: imports and unit lookups paid once, as in every measured run below
    single, parallel, standard = [], [], []
    for _ in range(turns):
        single.append(whole(1))
        parallel.append(whole(cores))
        with _stdlib_json():
            standard.append(whole(1))
    t_one, t_many, t_std = (statistics.median(x) for x in (single, parallel, standard))
    gain_workers, gain_orjson = t_one / t_many - 1, t_std / t_one - 1
    print(f"device workers ({cores} forked, {size:,} machines x 3 sites to JSON): whole run "
          f"{t_one:.2f} s in one process, {t_many:.2f} s with workers: gain {gain_workers:+.0%}"
          f"{_verdict(gain_workers, cores)}")
    print(f"device orjson ({size:,} machines x 3 sites, one process): whole run {t_std:.2f} s "
          f"with the standard library's json, {t_one:.2f} s with orjson: gain "
          f"{gain_orjson:+.0%}{_verdict(gain_orjson)}")


def _verdict(gain: float, cores: int = 2) -> str:
    if cores < 2:
        return " (one core here: no gain possible; not judged)"
    return "" if gain >= DEVICE_MIN_GAIN else f" (below {DEVICE_MIN_GAIN:.0%}: not worth its lines)"


def _mark(ok: bool) -> str:
    return "within budget" if ok else "OVER BUDGET"


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--smoke", action="store_true", help="small sizes, once (CI)")
    parser.add_argument("--large", action="store_true", help="add 1,000,000 machines")
    args = parser.parse_args()
    small, large = (300, 3000) if args.smoke else (10_000, 100_000)
    turns = 1 if args.smoke else 3
    with tempfile.TemporaryDirectory() as folder:
        # every command runs in the scratch folder: started in a checkout, "python -m
        # machinecheck" would import the sources there, not the installed package
        os.chdir(folder)
        version = subprocess.run([*CLI, "--version"], capture_output=True, text=True, env=ENV)
        print(f"measuring {version.stdout.strip()} ({PY}, {os.cpu_count()} cores)")
        run([*CLI, "check", "--format", "json"])  # warm: bytecode written once, as at install

        t_lookup = median_time([*CLI, "speed", "--poles", "4", "--frequency", "50"], 5)
        t_bare = median_time([PY, "-c", "pass"], 5)
        print(f"lookup: speed --poles 4 --frequency 50: {t_lookup * 1000:.0f} ms wall "
              f"({t_lookup / t_bare:.1f} x a bare interpreter); budget "
              f"{LOOKUP_BUDGET_S * 1000:.0f} ms: {_mark(t_lookup < LOOKUP_BUDGET_S)}")
        t_demo = median_time([*CLI, "check"], 3)
        print(f"demo: check (table): {t_demo:.2f} s wall; budget {DEMO_BUDGET_S} s: "
              f"{_mark(t_demo < DEMO_BUDGET_S)}")

        first = fleet(folder, small, turns)
        judged = _mark(first["ratio"] <= FLEET_RATIO_BUDGET) if small == 10_000 else "not judged"
        print(f"fleet {small:,} machines x 3 sites to JSON with -o: {first['ratio']:.2f} x "
              f"tomllib parsing the same file (median of {turns} turns, {first['low']:.2f}-"
              f"{first['high']:.2f}); budget {FLEET_RATIO_BUDGET} x at 10,000: {judged}; "
              f"{first['seconds']:.2f} s")
        sizes = [(small, first)]
        for size in (large, 1_000_000) if args.large else (large,):
            result = fleet(folder, size, 1)
            sizes.append((size, result))
            print(f"fleet {size:,} machines x 3 sites: {result['seconds']:.1f} s "
                  f"({result['ratio']:.2f} x tomllib); peak memory {result['largest_mb']:.0f} MB "
                  f"(largest process), {result['total_mb']:.0f} MB (all processes, PSS); "
                  f"budget {MEMORY_BUDGET_MB} MB at 100,000: "
                  f"{_mark(result['largest_mb'] < MEMORY_BUDGET_MB) if size == 100_000 else 'not judged'}")
        for (s0, r0), (s1, r1) in zip(sizes, sizes[1:]):
            growth = (r1["seconds"] / r0["seconds"]) / (s1 / s0)
            print(f"scaling {s0:,} -> {s1:,}: time x{r1['seconds'] / r0['seconds']:.1f} for size "
                  f"x{s1 / s0:.0f} ({growth:.2f} of linear)")
        devices(folder, small, turns)


if __name__ == "__main__":
    main()
