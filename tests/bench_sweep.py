"""Benchmark: a sweep of the demo case at the cooling design condition (a script, not a test).

    .venv/bin/python tests/bench_sweep.py [--jobs N] [--points 1000]

Prints the sweep looped in one process and spread over N processes, and the ratio. (Points are not yet
solved as one batched network: see issue 12.)
"""

from __future__ import annotations

import argparse
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--jobs", type=int, default=2)
    ap.add_argument("--points", type=int, default=1000, help="about this many points (100 deck R x 10 duct R)")
    args = ap.parse_args()
    from attic.case.load import read_toml
    from attic.runs.study import parse_set, sweep

    demo = read_toml(ROOT / "cases" / "demo.toml")
    sweep(demo, [parse_set("roof.deck_r=0:1:1")])  # imports
    n_deck = max(1, args.points // 10)
    specs = [parse_set(f"roof.deck_r=0:{0.4 * (n_deck - 1) + 0.01:g}:0.4"),
             parse_set("duct.*.r_value=4.2,5,6,7,8,9,10,11,12,13")]
    times = {}
    for jobs in (1, args.jobs):
        t = time.perf_counter()
        res = sweep(demo, specs, jobs=jobs)
        times[jobs] = dt = time.perf_counter() - t
        n = len(res.points)
        print(f"{n} points, jobs={jobs}: {dt:.2f} s ({1000 * dt / n:.1f} ms a point); "
              f"{sum(o is None for o in res.outputs)} did not close")
    print(f"ratio looped / {args.jobs} processes: {times[1] / times[args.jobs]:.2f}")


if __name__ == "__main__":
    main()
