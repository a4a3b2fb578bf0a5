"""Where a fleet check spends its time, per (machine, site) pair, in one process.

    python benchmarks/stages.py            # 3,000 generated machines x 3 sites, best of 7
    python benchmarks/stages.py 1000 3     # size and repeats

Each stage is timed on fresh caches (circuit estimates, site deratings, efficiency classes), as a
worker meets them; the best of the repeats is kept, the machines being
noisy. See docs/performance.md.
"""

from __future__ import annotations

import gc
import os
import sys
import time

sys.path.insert(0, os.path.dirname(__file__))
from generate import SITES, catalog

from machinecheck import fleet as runner
from machinecheck.engine.pipeline import assess_all
from machinecheck.inputs import units
from machinecheck.inputs.catalog import catalog_from_data, sites_from_data, tomllib
from machinecheck.physics import circuit, efficiency, environment
from machinecheck.report import renderer


def _fresh_caches() -> None:
    for cached in (circuit.estimate, environment.site_derating,
                   efficiency.efficiency_class_of, efficiency.minimum_efficiency):
        cached.cache_clear()


def main() -> None:
    size = int(sys.argv[1]) if len(sys.argv) > 1 else 3000
    repeats = int(sys.argv[2]) if len(sys.argv) > 2 else 7
    text = catalog(size)
    sites = sites_from_data(tomllib.loads(SITES), "sites")
    units.parse("1 hp", "power")  # the unit cache is warm in a worker too
    chunk = renderer("json").chunk_bytes
    gc.set_threshold(50_000, 20, 20)  # as the check command sets it
    best: dict[str, float] = {}
    pairs = size * len(sites)

    def keep(stage, seconds):
        best[stage] = min(best.get(stage, float("inf")), seconds / pairs * 1e6)

    for _ in range(repeats):
        _fresh_caches()
        start = time.process_time()
        tomllib.loads(text)
        keep("tomllib parse (the floor)", time.process_time() - start)
        start = time.process_time()
        parsed = runner.parse_piece(text)
        keep("piece parse (rtoml where it reads as tomllib)", time.process_time() - start)
        start = time.process_time()
        machines = catalog_from_data(parsed, "generated", text).machines
        keep("validation into the model", time.process_time() - start)
        start = time.process_time()
        results = assess_all(machines, sites)
        keep("engine", time.process_time() - start)
        start = time.process_time()
        chunk(results)
        keep("JSON result", time.process_time() - start)
        del results, machines, parsed
    work = sum(value for stage, value in best.items() if not stage.startswith("tomllib"))
    print(f"{size} machines x {len(sites)} sites, best of {repeats}, us per pair:")
    for stage, value in best.items():
        print(f"  {stage:48s} {value:6.1f}")
    print(f"  {'a worker in all':48s} {work:6.1f}")


if __name__ == "__main__":
    main()
