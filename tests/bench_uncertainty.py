"""Benchmark: the demo's uncertainty run, base and four variants over the same samples (a script, not a test).

    .venv/bin/python tests/bench_uncertainty.py [--samples 10000] [--one-by-one 1000] [--jobs N]

Prints the run as the command solves it (each case's samples as the rows of one network, attic.runs.sampled)
and, on --one-by-one samples, with every sample built and solved as its own case (the fallback), per point.
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
    ap.add_argument("--samples", type=int, default=10000)
    ap.add_argument("--jobs", type=int, default=1)
    ap.add_argument("--one-by-one", type=int, default=1000, help="samples for the one-by-one timing (0: skip)")
    args = ap.parse_args()
    from attic.case.load import read_toml
    from attic.runs.uncertainty import run_uncertainty

    demo = read_toml(ROOT / "cases" / "demo.toml")
    run_uncertainty(demo, n=2)  # imports
    t = time.perf_counter()
    res = run_uncertainty(demo, n=args.samples, jobs=args.jobs)
    dt = time.perf_counter() - t
    points = res.n * len(res.cases)
    failed = sum(len(e) for e in res.errors.values())
    print(f"{res.n} samples x {len(res.cases)} cases = {points} points, jobs={args.jobs}: {dt:.1f} s "
          f"({1000 * dt / points:.2f} ms a point); {failed} did not close")
    if args.one_by_one:
        import attic.runs.sampled as sampled

        rows = sampled.sampled_network
        sampled.sampled_network = lambda *a, **k: None
        t = time.perf_counter()
        slow = run_uncertainty(demo, n=args.one_by_one, jobs=args.jobs)
        dt_slow = time.perf_counter() - t
        sampled.sampled_network = rows
        per = dt_slow / (slow.n * len(slow.cases))
        print(f"one by one, {slow.n} samples: {dt_slow:.1f} s ({1000 * per:.2f} ms a point); "
              f"the rows are {per / (dt / points):.0f} times faster")


if __name__ == "__main__":
    main()
