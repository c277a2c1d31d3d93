"""Many points of a study solved together: the points' one-hour networks stacked on the row axis (as the year
stacks hours) and solved by batched Newton methods: first each point's three states as one system
(attic.runs.joint); for the points left, at the case's airflow, then with each point's design airflow as one
more unknown (attic.runs.airflow_rows). Points where that does not converge take the steps of the one-point
search (attic.runs.condition.airflow_root_steps), each round solving all points still searching in one batch.

A point whose balance does not close in the batch is solved again alone by run_condition (with its fallbacks);
failing that it is reported as failed, with the reason, never as a number.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from attic.network.build import build_network
from attic.network.nodes import I_AIR
from attic.network.solve import SolveError, attic_states, newton_rows
from attic.network.stack import group_by_network, stack_networks
from attic.runs.airflow_rows import airflow_rows
from attic.runs.condition import (
    GAP_TOL,
    ConditionResult,
    airflow_root_steps,
    at_airflow,
    no_work_message,
    run_condition,
)
from attic.runs.deck import attic_air_mass_flow
from attic.runs.row_balance import balance_rows, base_loads, closed_rows, duct_results, house_rows, solved_ducts
from attic.runs.totals import house_totals

JOINT_MAX = 16  # more points go one state after the other: their evaluations cost by the row there, not by the call
CHUNK = 500  # points solved together; bounds the memory of the stacked Jacobian (8 rows a point)


def condition_of(case, kind):
    """The case's design condition of that kind; ValueError when it has none."""
    cond = case.cooling if kind == "cooling" else case.heating
    if cond is None:
        raise ValueError(f"case {case.name!r} has no {kind} condition")
    return cond


def run_conditions(cases, kind, progress=None):
    """Solve every case at its `kind` design condition, together where their networks can be stacked.

    Returns [(ConditionResult, None) or (None, the SolveError or ValueError that stopped it)] in the order of
    `cases`: the same results, to solver tolerance, as run_condition on each (tested).
    progress : optional callable(n_done, n_total).
    """
    from ducts.moist_air import tabulated

    with tabulated():  # every design condition takes its moist-air properties one way (see run_condition)
        return _run_conditions(cases, kind, progress)


def _run_conditions(cases, kind, progress):
    conds = [condition_of(c, kind) for c in cases]
    out: list = [None] * len(cases)
    done = 0
    for lo in range(0, len(cases), CHUNK):
        part = range(lo, min(lo + CHUNK, len(cases)))
        nets = {i: build_network(cases[i], conds[i]) for i in part}
        order = list(part)
        for group in group_by_network([nets[i] for i in order]):
            idx = [order[g] for g in group]
            solved = _solve_group([cases[i] for i in idx], [conds[i] for i in idx],
                                  stack_networks([nets[i] for i in idx]))
            for i, r in zip(idx, solved, strict=True):
                out[i] = r
        done += len(part)
        if progress:
            progress(done, len(cases))
    for i, r in enumerate(out):
        if r is None:  # did not close in the batch: alone, with the one-point solver's fallbacks
            try:
                out[i] = (run_condition(cases[i], conds[i]), None)
            except (SolveError, ValueError) as e:
                out[i] = (None, e)
    return out


def run_cases(cases, progress=None, partial=False):
    """Every design condition of every case, each condition's cases solved together.

    Returns ({name: [ConditionResult, ...] in the case's order of conditions}, {name: the first error}); a case
    with an error at any condition has no results (as run_case raises), or with partial=True the results of the
    conditions that solved (none: no entry).
    """
    kinds = {c.kind for case in cases for c in case.conditions}
    solved, errors = {}, {}
    total = sum(len(case.conditions) for case in cases)
    done = 0
    for kind in ("cooling", "heating"):
        if kind not in kinds:
            continue
        some = [c for c in cases if any(k.kind == kind for k in c.conditions)]

        def step(k, _n, base=done):
            if progress:
                progress(base + k, total)

        for case, (r, e) in zip(some, run_conditions(some, kind, step), strict=True):
            if e is not None:
                errors.setdefault(case.name, e)
            solved.setdefault(case.name, {})[kind] = r
        done += len(some)
    results = {c.name: [solved[c.name][k.kind] for k in c.conditions if solved[c.name][k.kind] is not None]
               for c in cases if partial or c.name not in errors}
    return {name: rs for name, rs in results.items() if rs}, errors


def _label(case, cond):
    return f'case "{case.name}", {cond.kind} design condition'


def _solve_group(cases, conds, net):
    """[(ConditionResult, None), (None, error) or None (retry alone)] for the points of one stacked network:
    with ducts, first the three states of each point as one system (attic.runs.joint), then, for the points
    that do not settle there, one state after the other (`_step_by_step`)."""
    if net.ducts is None or net.n > JOINT_MAX:
        return _step_by_step(cases, conds, net)
    from attic.runs.joint import accepted, solve_joint

    kind = conds[0].kind
    base = base_loads(cases, conds)
    Z, ok, last, design = solve_joint(cases, net, range(net.n), base, kind)
    good = np.flatnonzero(accepted(ok, last))
    out: list = [None] * net.n
    if good.size:
        m = net.n_nodes
        _finish_at(cases, conds, net, np.arange(net.n), good, Z[good, 2 * m], Z[good, m:2 * m], base,
                   last[0][0], out, kind, without=Z[good, 2 * m + 1 + I_AIR], evaluated=design(good))
    rest = np.array([i for i in range(net.n) if out[i] is None], dtype=int)
    if rest.size:
        again = _step_by_step([cases[i] for i in rest], [conds[i] for i in rest], net.take(rest))
        for i, r in zip(rest, again, strict=True):
            out[i] = r
    return out


def _step_by_step(cases, conds, net):
    """_solve_group one state after the other: at the case's airflow, then the design airflow (a Newton
    unknown, then the search), then the attic without leaks."""
    kind = conds[0].kind
    x, res, _ = newton_rows(net, net.initial_guess())
    ok = closed_rows(res)
    out: list = [None] * net.n
    rows = np.flatnonzero(ok)
    if rows.size == 0:
        return out
    if net.ducts is None:
        sub = net.take(rows)
        for i, (j, st) in enumerate(zip(rows, attic_states(sub, x[rows], res[rows], 0), strict=True)):
            out[j] = (_result(cases[j], conds[j], (sub, i), st, None, None, None, st.air_K), None)
        return out
    return _design_airflow(cases, conds, net, x, rows, out, kind)


def _design_airflow(cases, conds, net, x, rows, out, kind):
    """Every point's design airflow (the steps of airflow_root_steps), then its results."""
    sub = net.take(rows)
    xs = x[rows]
    Q0 = np.asarray(sub.ducts.airflow, float) + np.zeros(len(rows))
    base = base_loads([cases[j] for j in rows], [conds[j] for j in rows])
    delivered0, equipment0, house0, _ = balance_rows(sub, xs, kind, base)
    ln0 = np.log(Q0)
    memo = {k: [(ln0[k], xs[k])] for k in range(len(rows))}
    steps, pending, roots, off, search = {}, {}, {}, [], []
    for k, j in enumerate(rows):
        c, cond = cases[j], conds[j]
        if house0[k] <= 0:
            off.append(k)
        elif not equipment0[k] > 0:
            out[j] = (None, ValueError(no_work_message(c.name, cond.kind)))
        elif abs(delivered0[k] / house0[k] - 1.0) < GAP_TOL:
            roots[k] = ln0[k]
        else:
            search.append(k)
    found = _airflow_newton(sub, xs, base, ln0, house0, delivered0, search, kind) if search else {}
    start = {k: (ln0[k], delivered0[k] / house0[k] - 1.0) for k in search}
    if found:  # the Newton solve's root, checked with the properties the results are given with
        fk = np.array(sorted(found))
        net_f = at_airflow(sub.take(fk), np.exp([found[k][0] for k in fk]))
        x_f = np.array([found[k][1] for k in fk])
        d_f, _, h_f, _ = balance_rows(net_f, x_f, kind, base[:, fk])
        for i, k in enumerate(fk):
            memo[k].append(found[k])
            start[k] = (found[k][0], d_f[i] / h_f[i] - 1.0)
    for k in search:
        p0, g0 = start[k]
        if k in found and abs(g0) < GAP_TOL:
            roots[k] = p0
            continue
        # the search from the Newton solve's root (small arrays take their properties from direct calls, which
        # move the root by about 1e-5 of the load), or from the air handler's airflow where it did not converge
        c, cond = cases[rows[k]], conds[rows[k]]
        _start(k, airflow_root_steps(p0, g0, _label(c, cond), c.name, cond.kind), steps, pending, roots,
               out, rows[k])
    while pending:
        ks_ = np.array(sorted(pending))
        p = np.array([pending[k] for k in ks_])
        trial = at_airflow(sub.take(ks_), np.exp(p))
        start = np.array([min(memo[k], key=lambda m, q=q: abs(m[0] - q))[1] for k, q in zip(ks_, p, strict=True)])
        xt, rt, _ = newton_rows(trial, start)
        closed = closed_rows(rt)
        gaps = np.full(len(ks_), np.nan)
        if np.any(closed):
            c_idx = np.flatnonzero(closed)
            part = trial.take(c_idx)
            d, _, h, _ = balance_rows(part, xt[c_idx], kind, base[:, ks_[c_idx]])
            gaps[c_idx] = d / h - 1.0
        pending = {}
        for i, k in enumerate(ks_):
            if not closed[i]:
                steps.pop(k)  # left for the one-point solve
                continue
            memo[k].append((p[i], xt[i]))
            _send(k, gaps[i], steps, pending, roots, out, rows[k])
    done = sorted(roots)
    if done:
        _finish_searched(cases, conds, sub, rows, memo, roots, done, base, delivered0, out, kind)
    if off:
        _finish_off(cases, conds, sub, rows, xs, off, delivered0, out, kind)
    return out


def _airflow_newton(sub, xs, base, ln0, house0, delivered0, idx, kind):
    """The design airflow as one more unknown of the Newton solve: {row: (ln Q, node temperatures)} for the rows
    where it converges (airflow_rows)."""
    Z, ok = airflow_rows(sub, xs, base, ln0, house0, delivered0, idx, kind)
    m = Z.shape[1] - 1
    return {int(k): (float(Z[i, m]), Z[i, :m]) for i, k in enumerate(idx) if ok[i]}


def _start(k, gen, steps, pending, roots, out, j):
    try:
        pending[k] = next(gen)
        steps[k] = gen
    except StopIteration as stop:
        roots[k] = stop.value


def _send(k, gap, steps, pending, roots, out, j):
    try:
        pending[k] = steps[k].send(gap)
    except StopIteration as stop:
        roots[k] = stop.value
        steps.pop(k)
    except (SolveError, ValueError) as e:
        out[j] = (None, e)
        steps.pop(k)


def _finish_searched(cases, conds, sub, rows, memo, roots, done, base, delivered0, out, kind):
    """Results of the points whose design airflow the search found (_finish_at)."""
    ks_ = np.array(done)
    lnQ = np.array([roots[k] for k in ks_])
    x = np.array([next(m[1] for m in memo[k] if m[0] == roots[k]) for k in ks_])
    _finish_at(cases, conds, sub, rows, ks_, lnQ, x, base, delivered0, out, kind)


def _finish_at(cases, conds, sub, rows, ks_, lnQ, x, base, delivered0, out, kind, without=None, evaluated=None):
    """Results of the rows ks_ of sub at their design airflows exp(lnQ) and node temperatures x: the state at
    that airflow, the ducts scaled so the parts add up to the totals exactly (as design_state does).
    without : their attic air with no duct leakage, K, when already solved; evaluated : (network at the design
    airflow, solved_ducts, residuals) at x, when the solver's last evaluation has them."""
    if evaluated is None:
        net = at_airflow(sub.take(ks_), np.exp(lnQ))
        solved = solved_ducts(net, x)  # one evaluation of the state for its residuals, attic, ducts and house load
        res = net.residuals(x, solved[0])
    else:
        net, solved, res = evaluated
    states = attic_states(net, x, res, 0, solved[0])
    ducts = duct_results(net, x, kind, solved)
    house = house_rows(kind, base[:, ks_], solved[0], solved[1], solved[2])
    if without is None:
        without = _air_without_leaks(cases, rows, ks_, net, x)
    m_attic = attic_air_mass_flow(net, solved[0])
    for i, k in enumerate(ks_):
        j = rows[k]
        if not np.isfinite(without[i]) or not abs(house[i] / ducts[i].delivered_w - 1.0) < GAP_TOL:
            continue  # left for the one-point solve
        d = ducts[i].scaled(house[i] / ducts[i].delivered_w)
        airflow = float(np.exp(lnQ[i]))
        out[j] = (_result(cases[j], conds[j], (net, i), states[i], d, airflow,
                          (cases[j].ducts.airflow, float(delivered0[k])), without[i], m_attic), None)


def _finish_off(cases, conds, sub, rows, xs, off, delivered0, out, kind):
    """Points with nothing to deliver: the equipment is off, and so are the ducts."""
    ks_ = np.array(off)
    part = sub.take(ks_)
    ducts = duct_results(part, xs[ks_], kind)
    net = dataclasses.replace(part, runtime=np.zeros_like(part.runtime))
    x, res, _ = newton_rows(net, xs[ks_])
    closed = closed_rows(res)
    states = attic_states(net, x, res, 0)
    for i, k in enumerate(ks_):
        if closed[i]:
            j = rows[k]
            out[j] = (_result(cases[j], conds[j], (net, i), states[i], ducts[i].scaled(0.0), 0.0,
                              (cases[j].ducts.airflow, float(delivered0[k])), states[i].air_K), None)


def _air_without_leaks(cases, rows, ks_, net, x):
    """Attic air with the duct leakage set to zero, K per row (attic.runs.condition.attic_without_leaks)."""
    from ducts.stack import stack_duct_systems

    out = x[:, I_AIR].copy()
    leaky = [i for i, k in enumerate(ks_) if np.any(np.asarray(net.ducts.supply_leak_fraction)[i] > 0)
             or np.any(np.asarray(net.ducts.return_leak_fraction)[i] > 0)]
    if not leaky:
        return out
    tight = []
    for i in leaky:
        d = cases[rows[ks_[i]]].ducts
        d = d.with_airflow(float(np.asarray(net.ducts.airflow)[i]))
        tight.append(dataclasses.replace(d, supply_leak_fraction=0.0, return_leak_fraction=0.0))
    part = net.take(np.array(leaky))
    part = dataclasses.replace(part, ducts=stack_duct_systems(tight))
    xt, rt, _ = newton_rows(part, x[leaky])
    closed = closed_rows(rt)
    for n_, i in enumerate(leaky):
        out[i] = xt[n_, I_AIR] if closed[n_] else math.nan
    return out


def _result(case, cond, row, state, duct, airflow, given, air_without_leaks, m_attic=None):
    """The ConditionResult of one point, as run_condition builds it; row: (stacked network, the point's row);
    m_attic : the row's air through the attic, kg/s (attic.runs.deck.attic_air_mass_flow), when at hand."""
    from attic.codes.rules import check_vents

    deck = None
    if cond.kind == "heating":
        from attic.runs.deck import deck_moisture

        net, i = row
        deck = deck_moisture(case, net.take([i]), state, None if m_attic is None else m_attic[i:i + 1])
    totals = house_totals(case, cond, state, duct, airflow, given)
    return ConditionResult(case.name, case.title, cond.kind, case.attic_type, state, duct, totals, check_vents(case),
                           case.geometry.plane_azimuths, case.pressure, deck, float(air_without_leaks))
