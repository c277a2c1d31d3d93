"""An uncertainty run's samples of one case as the rows of one network, solved together for the numbers the
run reports (attic air, duct load, equipment load, tons, and in heating the roof deck's winter margin).

The case dict takes each uncertain key as an (m,) array of its drawn values; the cross-key checks,
attic.case.build and attic.network.build then work on the arrays element by element, so one network holds every
sample as a row, with no Case or network built per sample. Where that cannot be done (a key that changes the
attic's shape or the ducts' layout, a cross-key rule one of the samples breaks, anything that does not take
arrays), `sampled_network` answers None and the run builds and validates the samples one by one, which names
the sample a rule fails at.

`solve_sampled` starts every row from one solved sample (its node temperatures and design airflow) and solves
the design airflow and node balances as one system (attic.runs.airflow_rows, by the chord method, then
Newton's for the rows it leaves). A row that does not close there is left to the one-point path (the caller's
fallback), never given a number.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from attic.network.nodes import I_AIR
from attic.units import TON


def sampled_network(case_raw, arrays, kind, name="base"):
    """(Case holding the arrays, its network with one row per sample) or None where the samples cannot share one
    network (see the module's words). Every sample's values pass the checks validate_raw makes, or None.

    case_raw : the raw case dict (a variant's overrides applied); arrays : attic.case.uncertainty.sample_arrays'
    result, all (m,).
    """
    from attic.case.build import build_case
    from attic.case.errors import CaseError
    from attic.case.load import apply_overrides, validate_raw
    from attic.case.uncertainty import targets
    from attic.case.validate import _check_value, _cross_checks
    from attic.case.variants import _copy_case, _set_path
    from attic.network.build import build_network
    from attic.network.stack import shared_key
    from attic.runs.batch import condition_of
    from ducts.moist_air import tabulated
    from ducts.stack import layout_key

    m = {np.size(a) for a in arrays.values()}
    if len(m) != 1 or m == {1}:
        return None
    m = m.pop()
    first = {k: float(a[0]) for k, a in arrays.items()}
    try:
        template = validate_raw(apply_overrides(case_raw, first))  # one whole sample, validated as any case
        c = _copy_case(template)
        for path, a in arrays.items():
            key = targets(template, path)[0][1]
            _check_value(path, key, float(np.min(a)))  # ranges are intervals: the ends decide
            _check_value(path, key, float(np.max(a)))
            _set_path(c, path, a, path)
        _cross_checks(c)
        case, one = build_case(c, name), build_case(template, name)  # as the one-by-one path: outside the tables
        with tabulated():
            net, ref = build_network(case, condition_of(case, kind)), build_network(one, condition_of(one, kind))
    except (CaseError, ValueError, TypeError, ArithmeticError, IndexError):
        return None  # a sample breaks a rule, or the build does not take arrays there: one by one
    same_ducts = (case.ducts is None) == (one.ducts is None) and (
        case.ducts is None or layout_key(case.ducts) == layout_key(one.ducts))
    if net.n == 1:  # the samples change no row of the network (a house load, say): every row the same
        net = net.take(np.zeros(m, dtype=np.intp))
    if net.n != m or shared_key(net) != shared_key(ref) or not same_ducts:
        return None  # the samples change what rows cannot hold (the attic's shape, the ducts' layout...)
    if net.ducts is not None and not hasattr(net.ducts, "take"):
        from ducts.stack import stack_duct_rows

        net = dataclasses.replace(net, ducts=stack_duct_rows(net.ducts, m))
    return case, net


def sample_base_loads(case, kind, m):
    """(2, m) base load of every row, W (attic.runs.totals.base_load; the case may hold arrays)."""
    from attic.runs.batch import condition_of
    from attic.runs.totals import base_load

    s, lat = base_load(case, condition_of(case, kind))
    return np.stack([np.broadcast_to(np.asarray(s, float), (m,)), np.broadcast_to(np.asarray(lat, float), (m,))])


def solve_sampled(net, base, kind, x0, airflow0, progress=None, chunk=2000, case=None):
    """The numbers of every row (SI: attic air K, duct load W, equipment load W, tons, winter deck margin K) as
    an (m, 5) array, NaN in the rows left to the one-point path (the deck margin NaN in cooling).

    net : sampled_network's network (m rows, ducts stacked); base : (2, m) sample_base_loads; x0 : (n_nodes,) node
    temperatures and airflow0 : m3/s, the design state of one solved sample, where every row starts.
    progress : optional callable(rows done, m). case : sampled_network's Case, for the winter deck check (heating).
    """
    from attic.runs.airflow_rows import airflow_rows
    from attic.runs.condition import at_airflow
    from attic.runs.row_balance import balance_rows
    from ducts.moist_air import tabulated

    m = net.n
    out = np.full((m, 5), np.nan)
    at_design = (np.full((m, len(x0)), np.nan), np.full(m, np.nan), np.full(m, np.nan))  # x, attic W, kg/s
    with tabulated():
        for lo in range(0, m, chunk):
            rows = np.arange(lo, min(lo + chunk, m))
            part, b = net.take(rows), base[:, rows]
            xs = np.tile(np.asarray(x0, float), (len(rows), 1))
            ln0 = np.full(len(rows), math.log(airflow0))
            with np.errstate(all="ignore"):
                d0, e0, h0, _ = balance_rows(at_airflow(part, np.exp(ln0)), xs, kind, b)
            idx = np.flatnonzero((h0 > 0) & (e0 > 0) & np.isfinite(d0))  # the rest: equipment off, or no answer
            if idx.size:
                Z, ok = airflow_rows(part, xs, b, ln0, h0, d0, idx, kind, chord=True)
                k, Z = idx[ok], Z[ok]
                x = Z[:, :-1]
                solved = at_airflow(part.take(k), np.exp(Z[:, -1]))
                # airflow_rows accepted these rows on this very evaluation (balances and gap): its parts
                d, e, h, f = balance_rows(solved, x, kind, b[:, k])
                good = np.isfinite(e)
                equipment = h * e / d  # the duct parts scaled to deliver the house load exactly (house_totals)
                nums = np.column_stack([x[:, I_AIR], equipment - h, equipment, equipment / TON])
                out[rows[k[good]], :4] = nums[good]
                if kind == "heating" and case is not None:
                    _keep_design_state(at_design, rows[k[good]], solved.take(np.flatnonzero(good)), x[good],
                                       {key: v[good] if np.ndim(v) and np.shape(v)[0] == len(good) else v
                                        for key, v in f.items() if key != "chain"})
            if progress:
                progress(int(rows[-1]) + 1, m)
        if kind == "heating" and case is not None:
            _deck_margins(case, net, out, at_design)
    return out


def _keep_design_state(at_design, idx, net, x, f):
    """Store the solved rows' node temperatures, attic humidity and air through the attic for the deck check."""
    from attic.network.solve import attic_air_state
    from attic.runs.deck import attic_air_mass_flow

    X, W, M = at_design
    X[idx], W[idx], M[idx] = x, attic_air_state(net, x, f)[0], attic_air_mass_flow(net, f)


def _deck_margins(case, net, out, at_design):
    """The winter deck margin of every solved row (attic.runs.deck.deck_moisture_hours on all rows at once, as
    the one-point path checks each). Where the check cannot take the rows together (an uncertain key the deck's
    assembly branches on), the rows are left to the one-point path, which checks each sample as its own case."""
    from attic.runs.deck import deck_moisture_hours

    X, W, M = at_design
    done = np.isfinite(out[:, 2]) & np.all(np.isfinite(X), axis=1)
    fill = X[np.flatnonzero(done)[0]] if done.any() else None
    if fill is None:
        return
    try:  # unsolved rows get a solved row's state, so that every row has one; their margin is not kept
        dm = deck_moisture_hours(case, net, np.where(done[:, None], X, fill), np.where(done, W, W[done][0]),
                                 np.where(done, M, M[done][0]))
        margin = np.asarray(dm["surface_K"], float) - np.asarray(dm["dewpoint_K"], float)
    except (ValueError, TypeError):
        out[:] = np.nan  # every row to the one-point path
        return
    out[:, 4] = np.where(done, margin, np.nan)
    out[np.isfinite(out[:, 2]) & ~done] = np.nan
