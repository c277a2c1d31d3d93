"""Benchmark: a 1,000-point sweep of the demo case at the cooling design condition (a script, not a test).

    .venv/bin/python tests/bench_sweep.py [--jobs N]
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
    ap.add_argument("--jobs", type=int, default=1)
    args = ap.parse_args()
    from attic.case.load import read_toml
    from attic.runs.study import parse_set, sweep

    demo = read_toml(ROOT / "cases" / "demo.toml")
    sweep(demo, [parse_set("roof.deck_r=0:1:1")])  # imports
    specs = [parse_set("roof.deck_r=0:39.9:0.4"), parse_set("duct.*.r_value=4.2,5,6,7,8,9,10,11,12,13")]
    t = time.perf_counter()
    res = sweep(demo, specs, jobs=args.jobs)
    dt = time.perf_counter() - t
    n = len(res.points)
    print(f"{n} points, jobs={args.jobs}: {dt:.2f} s ({1000 * dt / n:.1f} ms a point); "
          f"{sum(o is None for o in res.outputs)} did not close")


if __name__ == "__main__":
    main()
