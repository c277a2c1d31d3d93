"""Benchmark: the median time of one design-condition solve (run as a script, not a test).

    .venv/bin/python tests/bench_solve.py

Prints, for the demo case: building the network (sun position and clear sky through pvlib, moist-air
properties through CoolProp), the coupled attic+duct solve at the case's airflow, and the whole condition
(the design airflow, duct energy balance, totals, the attic without duct leakage), as the commands solve it
and by the one-point search. Imports are paid once, before timing.
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))


def median_time(fn, repeat=50):
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return statistics.median(times)


def main():
    t0 = time.perf_counter()
    from attic.case.load import load_cases
    from attic.network.build import build_network
    from attic.network.solve import solve
    from attic.runs.condition import run_condition

    case = load_cases(Path(__file__).resolve().parent.parent / "cases" / "demo.toml", only="base")[0]
    run_condition(case, case.cooling)  # pays the imports (CoolProp, scipy, pvlib, pandas)
    print(f"first run with imports:           {1000 * (time.perf_counter() - t0):8.1f} ms")
    net = build_network(case, case.cooling)
    print(f"build network (sun, properties):  {1000 * median_time(lambda: build_network(case, case.cooling)):8.2f} ms")
    print(f"coupled attic + duct solve:       {1000 * median_time(lambda: solve(net)):8.2f} ms")
    from attic.runs.batch import run_conditions

    run_conditions([case], "cooling")
    print(f"whole cooling condition:          {1000 * median_time(lambda: run_conditions([case], 'cooling')):8.2f} ms"
          "  (as run and compare solve it: three states and the airflow as one Newton system)")
    print(f"whole heating condition:          {1000 * median_time(lambda: run_conditions([case], 'heating')):8.2f} ms")
    print(f"whole cooling condition, search:  {1000 * median_time(lambda: run_condition(case, case.cooling)):8.2f} ms"
          "  (run_condition: the airflow found by secant steps, the batch's fallback)")
    # load-independent: how many vectorised residual evaluations one solve takes, and what one costs
    from attic.network.nodes import Network
    from attic.network.solve import stacked

    calls = [0]
    plain = Network.residuals

    def counted(self, x):
        calls[0] += 1
        return plain(self, x)

    Network.residuals = counted
    st = solve(net)
    Network.residuals = plain
    flows, seen = Network.flows, [0]

    def counted_flows(self, x):
        seen[0] += 1
        return flows(self, x)

    Network.flows = counted_flows
    run_conditions([case], "cooling")
    Network.flows = flows
    print(f"network evaluations in the whole cooling condition: {seen[0]}")
    big = stacked(net)
    X = big.initial_guess()
    print(f"residual evaluations in one solve: {calls[0]} ({st.iterations} Newton steps), each of 7 stacked states: "
          f"{1000 * median_time(lambda: big.residuals(X), 200):.2f} ms")


if __name__ == "__main__":
    main()
