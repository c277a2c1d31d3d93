"""Benchmark: a sweep of the demo case at the cooling design condition, batched against looped (a script, not a
test).

    .venv/bin/python tests/bench_sweep.py [--points 1000] [--jobs N] [--loop-every K]

Times, after imports, the same points three ways: `sweep` (every point's network stacked and solved together,
attic.runs.batch), the same with --jobs processes, and a plain loop of run_condition over the points (each
built the same way). Prints each and the ratios. --loop-every K loops over every K-th point only and scales its
time up (a quicker estimate; the default loops over all of them).
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
    ap.add_argument("--points", type=int, default=1000, help="about this many points (deck R x 10 duct R)")
    ap.add_argument("--loop-every", type=int, default=1)
    args = ap.parse_args()
    from attic.case.load import apply_overrides, build_case, raw_of, read_toml, validate_raw
    from attic.runs.condition import run_condition
    from attic.runs.study import grid, parse_set, sweep

    demo = read_toml(ROOT / "cases" / "demo.toml")
    sweep(demo, [parse_set("roof.deck_r=0:1:1")])  # imports
    n_deck = max(1, args.points // 10)
    specs = [parse_set(f"roof.deck_r=0:{0.4 * (n_deck - 1):g}:0.4"),
             parse_set("duct.*.r_value=4.2,5,6,7,8,9,10,11,12,13")]

    t = time.perf_counter()
    res = sweep(demo, specs)
    batched = time.perf_counter() - t
    n = len(res.points)
    print(f"{n} points batched:            {batched:6.2f} s ({1000 * batched / n:.2f} ms a point); "
          f"{sum(o is None for o in res.outputs)} did not close")

    t = time.perf_counter()
    sweep(demo, specs, jobs=args.jobs)
    spread = time.perf_counter() - t
    print(f"{n} points batched, {args.jobs} processes: {spread:6.2f} s")

    raw = raw_of(demo)
    looped_points = grid(specs)[::args.loop_every]
    t = time.perf_counter()
    for p in looped_points:
        case = build_case(validate_raw(apply_overrides(raw, p, "--set")), "point")
        run_condition(case, case.cooling)
    looped = (time.perf_counter() - t) * n / len(looped_points)
    est = "" if args.loop_every == 1 else f" (estimated from {len(looped_points)} of them)"
    print(f"{n} points looped:             {looped:6.2f} s{est}")
    print(f"batched is {looped / batched:.1f} times the loop; {args.jobs} processes {batched / spread:.2f} times "
          "one")


if __name__ == "__main__":
    main()
