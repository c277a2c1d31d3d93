"""A design condition's three solves as one Newton system: the first way `attic.runs.batch` tries.

A condition needs three solved states of its attic and ducts: at the air handler's own airflow (what the case's
equipment delivers, for the air-handler check), at the design airflow (where the delivered heat equals the house
load) and at the design airflow with the duct leakage set to zero (the attic without leaks). Solved one after
the other they take about 16 evaluations of the network; as one system, whose unknowns are the three states'
node temperatures and ln Q, Newton's method takes about 5, and one evaluation of three states costs about what
one of a single state costs (numpy's work there is bound by the number of calls, not by the rows). The
results are read from Newton's last evaluation, at the solution, so they cost no further one.

Every point solved here is checked as the step-by-step path checks it (balances within RESIDUAL_LIMIT_W, the
delivered heat within GAP_TOL of the house load, the equipment doing the condition's work); a point that fails
any check is left to that path, which has the fallbacks and says what went wrong.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from attic.network import solve as balance
from attic.network.newton import newton_batched
from attic.runs.condition import GAP_TOL, LN_LIMIT, LN_STEP, at_airflow
from attic.runs.row_balance import balance_rows, solved_ducts, solved_rows


def solve_joint(cases, sub, rows, base, kind):
    """The three states of the points `rows` (indices into cases) of the stacked network sub (one row each).

    Returns (Z, ok, last, design): Z (n, 3 m + 1) the unknowns [case state, design state, ln Q, leak-free
    state]; ok where every balance closed within RESIDUAL_LIMIT_W and the airflow stayed within the search's
    limit of 1,000 times the air handler's; last the (delivered, equipment, house) W per row of each state, from
    the evaluation at Z, shape (3, 3, n) [quantity, state]; design(k) the design states of the rows k (an index
    array) as that evaluation left them: (network at the design airflow, solved_ducts, residuals), so the
    results need not evaluate them again.
    """
    n, m = sub.n, sub.n_nodes
    Q0 = np.asarray(sub.ducts.airflow, float) + np.zeros(n)
    ln0 = np.log(Q0)
    trio = _trio(cases, sub, rows)
    copies = 3 * m + 2  # a state and its perturbed copies (attic.network.newton.stacked_jacobian)
    point = np.repeat(np.arange(n), copies)
    net3 = trio.take(np.concatenate([point, n + point, 2 * n + point]))
    base3 = np.tile(base[:, point], 3)
    kept = {}

    def evaluate(Z):
        N = len(Z)
        Q = np.concatenate([Q0[point], np.exp(Z[:, 2 * m]), np.exp(Z[:, 2 * m])])
        q = at_airflow(net3, Q)
        X = np.concatenate([Z[:, :m], Z[:, m:2 * m], Z[:, 2 * m + 1:]])
        solved = solved_ducts(q, X)
        delivered, equipment, house, f = balance_rows(q, X, kind, base3, solved)
        res = q.residuals(X, f)
        kept.update(Z=Z, last=(delivered, equipment, house), q=q, solved=solved, res=res)
        gap = (delivered - house)[N:2 * N]
        return np.concatenate([res[:N], res[N:2 * N], gap[:, None], res[2 * N:]], axis=1)

    x0 = sub.initial_guess()
    start = np.column_stack([x0, x0, ln0, x0])
    scale = np.maximum(np.abs(base.sum(axis=0)), 1.0)
    tol = np.concatenate([np.full((n, 2 * m), 1e-7), 1e-9 * scale[:, None], np.full((n, m), 1e-7)], axis=1)
    max_step = np.concatenate([np.full(2 * m, 30.0), [LN_STEP], np.full(m, 30.0)])
    with np.errstate(all="ignore"):
        Z, R, _ = newton_batched(evaluate, start, tol, max_step, max_iter=30)
    nodes = np.concatenate([R[:, :2 * m], R[:, 2 * m + 1:]], axis=1)
    ok = (np.all(np.isfinite(R), axis=1) & (np.max(np.abs(nodes), axis=1) <= balance.RESIDUAL_LIMIT_W)
          & (Z[:, 2 * m] <= ln0 + LN_LIMIT))
    base_rows = np.arange(n) * copies  # each point's unperturbed row in the stacked evaluation
    if kept.get("Z") is None or not np.array_equal(kept["Z"][base_rows], Z):
        evaluate(np.repeat(Z, copies, axis=0))  # newton_batched's last evaluation is at Z; should that change
    N = n * copies
    last = np.array([[v[s * N + base_rows] for s in range(3)] for v in kept["last"]])

    def design(k):
        idx = N + base_rows[np.asarray(k, dtype=np.intp)]  # the design state's block, each point's own row
        return kept["q"].take(idx), solved_rows(kept["solved"], idx, 3 * N), kept["res"][idx]

    return Z, ok, last, design


def accepted(ok, last):
    """Rows of solve_joint to keep: solved, the house needing the condition's work, the equipment doing it at
    the air handler's airflow, and the design state delivering the house load within GAP_TOL."""
    delivered, equipment, house = last
    with np.errstate(all="ignore"):
        return (ok & (house[0] > 0) & (equipment[0] > 0)
                & (np.abs(delivered[1] / house[1] - 1.0) < GAP_TOL))


def _trio(cases, sub, rows):
    """The network of 3 n rows: the points as they are (the case's airflow, then the design airflow), then
    the same with no duct leakage."""
    from ducts.stack import stack_duct_systems

    n = sub.n
    tight = [dataclasses.replace(cases[j].ducts, supply_leak_fraction=0.0, return_leak_fraction=0.0) for j in rows]
    same = [cases[j].ducts for j in rows]
    trio = sub.take(np.tile(np.arange(n), 3))
    return dataclasses.replace(trio, ducts=stack_duct_systems(same + same + tight))
