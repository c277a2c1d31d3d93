"""How ducts.moist_air reaches HAPropsSI: one call per distinct state on broadcast arrays, small calls
remembered, and for long arrays (or inside `tabulated`) tables of HAPropsSI's own values.

Internal to ducts.moist_air, whose public functions are the ones to call.
"""

from __future__ import annotations

from contextlib import contextmanager
from functools import lru_cache

import numpy as np


@lru_cache(maxsize=1)
def _haprops():
    from CoolProp.HumidAirProp import HAPropsSI

    return HAPropsSI


_RECENT: dict = {}  # small calls already answered: a study asks for the same design states at every point
_RECENT_MAX = 4096


def _call(output, name1, v1, name2, v2, name3, v3):
    """HAPropsSI on broadcast arrays; each distinct input triple is computed once, and the answers to small
    calls are kept (the same states come back for every point of a study)."""
    a, b, c = np.broadcast_arrays(np.asarray(v1, float), np.asarray(v2, float), np.asarray(v3, float))
    return _remembered((output, name1, name2, name3), (a, b, c), lambda: _call_now(output, name1, a, name2, b,
                                                                                   name3, c))


def _remembered(tag, values, compute):
    """compute() for a small call (4 states or fewer in each of `values`), remembered under `tag` and the values:
    a study asks for the same design states at every point. A larger call is computed."""
    arrays = [np.asarray(v, float) for v in values]
    if max(a.size for a in arrays) > 4:
        return compute()
    key = (tag, *(a.shape for a in arrays), *(a.tobytes() for a in arrays))
    hit = _RECENT.get(key)
    if hit is None:
        if len(_RECENT) >= _RECENT_MAX:
            _RECENT.clear()
        hit = _RECENT[key] = compute()
    return hit.copy() if isinstance(hit, np.ndarray) else hit


def _call_now(output, name1, a, name2, b, name3, c):
    if a.ndim == 0:
        return float(_haprops()(output, name1, float(a), name2, float(b), name3, float(c)))
    triples = np.stack([a.ravel(), b.ravel(), c.ravel()], axis=1)
    uniq, inverse = np.unique(triples, axis=0, return_inverse=True)
    vals = np.asarray(_haprops()(output, name1, uniq[:, 0], name2, uniq[:, 1], name3, uniq[:, 2]), dtype=float)
    return vals[inverse.reshape(-1)].reshape(a.shape)


# ---- tables for long arrays -------------------------------------------------------------------------
# HAPropsSI costs 20-250 microseconds a state here, and an hourly year asks for tens of thousands of
# states. For arrays of TABLE_MIN states or more, properties that vary smoothly are taken from
# HAPropsSI's own values on a grid at the case's pressure: every 0.5 K from 200 K to 380 K, and
# quadratic in W through W = 0, 0.025, 0.05 (h, cp, v), or from the saturation curve (dew point,
# humidity ratio from RH). tests/test_moist_air.py bounds the difference from direct calls.

TABLE_MIN = 256
_TG = np.arange(200.0, 380.0001, 0.5)
_WK = np.array([0.0, 0.025, 0.05])
# saturation grid, below boiling at low pressures; 273.15 K is a node because saturation over ice and over
# water meet there with a kink
_TGS = np.union1d(np.arange(200.0, 350.0001, 0.25), [273.15])


@lru_cache(maxsize=32)
def _quad_table(output, P):
    """The whole table of `output` at P: (3, len(_TG)), rows W = _WK (for tests; lookups fill `_quad_nodes`)."""
    return np.array([[_haprops()(output, "T", t, "P", P, "W", w) for t in _TG] for w in _WK])


_NODES: dict = {}  # (output, P) -> (3, len(_TG)) table, NaN where a node has not been asked for yet
_NODES_MAX = 96


def _quad_nodes(output, P, T):
    """The table of `output` at pressure P with every node that interpolation at temperatures T reads filled in.

    Each node is HAPropsSI's value, computed once, so a lookup gives what the whole table (`_quad_table`) gives,
    digit for digit (tested); but a design condition reads a few dozen of its 361 temperatures, and every
    pressure (an uncertain elevation: each sample its own) would otherwise pay about 3,000 HAPropsSI calls.
    """
    tab = _NODES.get((output, P))
    if tab is None:
        if len(_NODES) >= _NODES_MAX:
            _NODES.clear()
        tab = _NODES[(output, P)] = np.full((len(_WK), len(_TG)), np.nan)
    j = np.searchsorted(_TG, np.ravel(T), side="right") - 1
    near = np.clip(np.concatenate([j - 1, j, j + 1]), 0, len(_TG) - 1)  # either side of each T
    missing = near[np.isnan(tab[0, near])]
    # sorted (np.unique) only when a node is new: the usual lookup finds every node already there
    for k in np.unique(missing) if missing.size else ():
        tab[:, k] = [_haprops()(output, "T", _TG[k], "P", P, "W", w) for w in _WK]
    return tab


@lru_cache(maxsize=8)
def _saturation_table(P):
    """Humidity ratio of saturated air on the whole fine temperature grid (for tests; lookups use
    `_saturation_nodes`)."""
    return np.array([_haprops()("W", "T", t, "P", P, "R", 1.0) for t in _TGS])


_SATURATION: dict = {}  # P -> (len(_TGS),) saturated humidity ratios, NaN where not asked for yet


def _saturation_nodes(P, T=None, W=None):
    """The saturation table at P, its nodes filled in where a lookup reads them: either side of temperatures T,
    or, for the inverse (a dew point), the two ends and every node from below the lowest to above the highest
    humidity ratio W (found by bisection on the nodes). Each node is HAPropsSI's value, computed once, so a
    lookup on the filled part gives what `_saturation_table` gives, digit for digit (tested).

    Returns (table, (first, stop)): the slice of filled nodes that brackets every W (the whole grid for T).
    """
    tab = _SATURATION.get(P)
    if tab is None:
        if len(_SATURATION) >= _NODES_MAX:
            _SATURATION.clear()
        tab = _SATURATION[P] = np.full(len(_TGS), np.nan)
    last = len(_TGS) - 1

    def fill(idx):
        idx = np.asarray(idx, dtype=int)
        missing = idx[np.isnan(tab[idx])]
        for k in np.unique(missing) if missing.size else ():
            tab[k] = _haprops()("W", "T", _TGS[k], "P", P, "R", 1.0)

    if T is not None:
        j = np.searchsorted(_TGS, np.ravel(T), side="right") - 1
        fill(np.clip(np.concatenate([j - 1, j, j + 1]), 0, last))
    if W is None:
        return tab, (0, last + 1)
    fill([0, last])
    w = np.ravel(W)
    if np.unique(w).size > 64:  # many states (a year of hours): the whole table
        fill(np.arange(last + 1))
        return tab, (0, last + 1)

    def below(x):  # the last node at or below x (bisection: about 10 nodes)
        lo, hi = 0, last
        while hi - lo > 1:
            mid = (lo + hi) // 2
            fill([mid])
            lo, hi = (mid, hi) if tab[mid] <= x else (lo, mid)
        return lo

    first, top = max(below(np.min(w)) - 1, 0), min(below(np.max(w)) + 2, last)
    fill(np.arange(first, top + 1))
    return tab, (first, top + 1)


_ANY_SIZE = [False]  # set by `tabulated`


@contextmanager
def tabulated():
    """Inside this block the smooth properties come from the tables whatever the size of the array.

    For a solver that asks for the same few states many times over (each Newton step of a design condition):
    direct HAPropsSI calls cost 20-250 microseconds a state. The tables' accuracy against direct calls is tested
    (tests/test_moist_air.py); a result is then evaluated again outside the block.

    Examples
    --------
    >>> from ducts.moist_air import enthalpy
    >>> with tabulated():
    ...     h = enthalpy(np.array([300.0]), 101325.0, 0.01)
    >>> bool(abs(h[0] - enthalpy(300.0, 101325.0, 0.01)) < 1.0)  # J/kg, the tables' tested bound
    True
    """
    before = _ANY_SIZE[0]
    _ANY_SIZE[0] = True
    try:
        yield
    finally:
        _ANY_SIZE[0] = before


def _tabulable(T, W, P, grid=_TG):
    T = np.asarray(T)
    return ((_ANY_SIZE[0] or T.size >= TABLE_MIN) and np.ndim(P) == 0 and np.all((T >= grid[0]) & (T <= grid[-1]))
            and np.all((np.asarray(W) >= 0.0) & (np.asarray(W) <= _WK[-1])))


def _small_and_known(name, T, P, W, compute):
    """_remembered for a property of (T, P, W) that may come from the tables: whether they are on (`tabulated`)
    is part of the key, as it changes the answer (and a lookup costs more than remembering)."""
    return _remembered((name, _ANY_SIZE[0]), (T, P, W), compute)


def _smooth_property(output, T, P, W):
    """A property smooth in T and W: from the table for long arrays, else straight from HAPropsSI."""
    def compute():
        if _tabulable(T, W, P):
            return _from_quad(output, T, P, W)
        return _call(output, "T", T, "P", P, "W", W)

    return _small_and_known(output, T, P, W, compute)


def _from_quad(output, T, P, W):
    T, W = np.broadcast_arrays(np.asarray(T, float), np.asarray(W, float))
    tab = _quad_nodes(output, float(P), T)
    f0, f1, f2 = (np.interp(T, _TG, tab[k]) for k in range(3))
    w0, w1, w2 = _WK
    L0 = (W - w1) * (W - w2) / ((w0 - w1) * (w0 - w2))
    L1 = (W - w0) * (W - w2) / ((w1 - w0) * (w1 - w2))
    L2 = (W - w0) * (W - w1) / ((w2 - w0) * (w2 - w1))
    return f0 * L0 + f1 * L1 + f2 * L2
