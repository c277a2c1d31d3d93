"""Benchmark: the demo's uncertainty run, base and four variants over the same samples (a script, not a test).

    .venv/bin/python tests/bench_uncertainty.py [--samples 10000] [--jobs N]
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
          f"({1000 * dt / points:.1f} ms a point); {failed} did not close")


if __name__ == "__main__":
    main()
