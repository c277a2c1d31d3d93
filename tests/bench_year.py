"""Benchmark: one year of the demo case vectorised, against looping the single-condition solve.

    .venv/bin/python tests/bench_year.py           # the loop over every 10th hour, scaled to the year
    .venv/bin/python tests/bench_year.py --full    # the loop over all 8,760 hours (about two minutes)

Both solve the same hourly network (attic.annual.year_network); the loop calls attic.network.solve.solve,
scipy.optimize.root on one hour at a time.
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
    ap.add_argument("--full", action="store_true")
    args = ap.parse_args()
    import numpy as np

    from attic.case.load import load_cases
    from attic.case.weather import read_weather
    from attic.network.solve import solve, solve_hours
    from attic.runs.year import run_year, year_network

    case = load_cases(ROOT / "cases" / "demo.toml", only="base")[0]
    weather = read_weather(ROOT / "cases" / "demo-weather.csv")
    t = time.perf_counter()
    run_year(case, weather)
    print(f"first year run, with imports and property tables: {time.perf_counter() - t:6.2f} s")
    t = time.perf_counter()
    run_year(case, weather)
    whole = time.perf_counter() - t
    net, _ = year_network(case, weather)
    t = time.perf_counter()
    batch = solve_hours(net)
    vec = time.perf_counter() - t
    step = 1 if args.full else 10
    idx = range(0, net.n, step)
    t = time.perf_counter()
    worst = 0.0
    for i in idx:
        one = solve(net.take(slice(i, i + 1)))
        worst = max(worst, abs(one.air_K - batch.air_K[i]))
    loop = (time.perf_counter() - t) * step
    print(f"year run (network, solve, duct energy, totals):   {whole:6.2f} s")
    print(f"vectorised solve of {net.n} hours:                 {vec:6.2f} s ({batch.iterations} Newton steps)")
    print(f"looped single solves{'' if args.full else ' (every 10th hour, x10)'}:      {loop:6.2f} s")
    print(f"ratio: {loop / vec:.0f}x; largest difference in attic air {worst * 1.8:.4f} °F")
    assert np.isfinite(worst)


if __name__ == "__main__":
    main()
