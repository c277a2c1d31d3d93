"""The design airflow as one more unknown of the batched Newton solve, row by row (attic.runs.batch tries it
before the one-point search's steps; attic.runs.sampled by the chord method first)."""

from __future__ import annotations

import numpy as np

from attic.network import solve as balance
from attic.network.newton import chord_batched, newton_batched
from attic.runs.condition import GAP_TOL, LN_LIMIT, LN_STEP, at_airflow
from attic.runs.row_balance import balance_rows


def airflow_rows(sub, xs, base, ln0, house0, delivered0, idx, kind, chord=False):
    """The design airflow as one more unknown of the Newton solve, for the rows idx of sub: (Z, ok), Z holding
    each row's node temperatures and ln Q, ok where it converged.

    Each row's unknowns are its node temperatures and ln Q; its equations the node balances and
    delivered(Q) = house load, both from one evaluation of the attic and ducts at Q (as each round of
    airflow_root_steps evaluates them). It starts where the search takes its first step. A row that does not
    converge to a balance as close as run_condition's (RESIDUAL_LIMIT_W, GAP_TOL), or only beyond the search's
    limit of 1,000 times the air handler's airflow, is left to the search. With chord, the chord method
    (attic.network.newton.chord_batched) goes first, for starts near the root; Newton's method takes the rows it leaves.
    sub : the network at its air handler's airflow; xs : its rows' starting temperatures; ln0, house0,
    delivered0 : per row, ln of that airflow and the house load and delivered heat there (W); base : base_loads.
    """
    idx = np.asarray(idx)
    part = sub.take(idx)
    n, m = len(idx), part.n_nodes
    copies = m + 2  # a state and its m + 1 perturbed copies (stacked_jacobian)
    rows = np.repeat(np.arange(n), copies)
    evaluate = _airflow_residuals(part.take(rows), base[:, idx][:, rows], kind, m)
    gap0 = delivered0[idx] / house0[idx] - 1.0
    z0 = ln0[idx] + np.clip(-np.log1p(np.maximum(gap0, -0.999)), -LN_STEP, LN_STEP)
    tol = np.concatenate([np.full((n, m), 1e-7), 1e-9 * house0[idx][:, None]], axis=1)
    max_step = np.append(np.full(m, 30.0), LN_STEP)
    start = np.column_stack([xs[idx], z0])
    with np.errstate(all="ignore"):
        if chord:
            Z, R, done = chord_batched(_airflow_residuals(part, base[:, idx], kind, m), evaluate, start,
                                       tol, max_step)
            ok = done & _accepted(Z, R, m, ln0[idx], house0[idx])
            rest = np.flatnonzero(~ok)
            if rest.size:
                Z[rest], ok[rest] = airflow_rows(sub, xs, base, ln0, house0, delivered0, idx[rest], kind)
            return Z, ok
        Z, R, _ = newton_batched(evaluate, start, tol, max_step, max_iter=30)
    return Z, _accepted(Z, R, m, ln0[idx], house0[idx])


def _accepted(Z, R, m, ln0, house0):
    """Rows of airflow_rows closed as run_condition would have them, within the search's airflow limit."""
    return (np.all(np.isfinite(R), axis=1) & (np.max(np.abs(R[:, :m]), axis=1) <= balance.RESIDUAL_LIMIT_W)
            & (np.abs(R[:, m]) < GAP_TOL * house0) & (Z[:, m] <= ln0 + LN_LIMIT))


def _airflow_residuals(net, base, kind, m):
    """The residuals of airflow_rows' system on the rows of net (or those of them an index array names):
    node balances, then delivered - house (W)."""

    def evaluate(Z, rows=None):
        x = Z[:, :m]
        q = at_airflow(net if rows is None else net.take(rows), np.exp(Z[:, m]))
        delivered, _, house, f = balance_rows(q, x, kind, base if rows is None else base[:, rows])
        return np.concatenate([q.residuals(x, f), (delivered - house)[:, None]], axis=1)

    return evaluate
