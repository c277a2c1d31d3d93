"""The order in which the thermal chain can evaluate its segments, and one segment_transfer call for many runs.

A segment's entering air is known once the runs it depends on are done: a supply run needs its trunk's leaving
air (roots take the equipment's), a return trunk the leaving air of the runs that feed it (leaves take the
house's). So the supply side goes level by level down the fed_by tree and the return side level by level up
it, and the runs of one level (supply depth k together with return height k) go through segment_transfer in
one call, stacked on a leading axis. That call costs about what one run's does when the rows are few (its
cost is the Python and numpy overhead of some 50 operations, not the arithmetic).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ducts.insulation import SegmentGeometry
from ducts.segment import segment_transfer

CONDITIONED = "conditioned"  # ducts.layout's name (layout imports this module, not the other way round)
_GEOM = ("length", "inner_perimeter", "flow_area", "hydraulic_diameter", "insulation_resistance",
         "outer_perimeter")


@dataclass(frozen=True)
class ChainPlan:
    """The evaluation order of one duct layout (segment positions in ``segments``).

    Attributes
    ----------
    order : tuple of int
        The order in which the recursive chain filled its output: supply runs depth first from each root
        (a trunk before its branches), then return runs with the feeding runs before their trunk.
    waves : tuple of (tuple of int, tuple of tuple of int)
        Level by level: the runs in conditioned space (no exchange), and the others grouped by whether
        their R model holds its own films (one segment_transfer call per group).
    """

    order: tuple
    waves: tuple


def chain_plan(segments):
    """The ChainPlan of a layout (a DuctSystem's or a DuctStack's segments).

    Parameters
    ----------
    segments : sequence of DuctSegment or StackSegment

    Returns
    -------
    ChainPlan

    Examples
    --------
    A supply trunk with a branch and a return trunk fed by a grille: the trunk and the grille go first
    (their entering air is the equipment's and the house's), then the branch and the return trunk:

    >>> from ducts.layout import DuctSegment
    >>> segs = [DuctSegment("t", "supply", "attic", 5.0, 1.0, diameter=0.3),
    ...         DuctSegment("b", "supply", "attic", 5.0, 1.0, diameter=0.15, fed_by="t"),
    ...         DuctSegment("r", "return", "attic", 5.0, 1.0, diameter=0.3),
    ...         DuctSegment("g", "return", "conditioned", 1.0, 0.0, diameter=0.3, fed_by="r")]
    >>> p = chain_plan(segs)
    >>> p.order, p.waves
    ((0, 1, 3, 2), (((3,), ((0,),)), ((), ((1, 2),))))
    """
    pos = {s.name: i for i, s in enumerate(segments)}
    kids: dict[str, list] = {}
    for s in segments:
        if s.fed_by is not None:
            kids.setdefault(s.fed_by, []).append(s)
    order, level = [], {}

    def down(s, depth):
        order.append(pos[s.name])
        level[s.name] = depth
        for k in kids.get(s.name, []):
            down(k, depth + 1)

    def up(s):
        h = max((up(k) + 1 for k in kids.get(s.name, [])), default=0)
        order.append(pos[s.name])
        level[s.name] = h
        return h

    for s in segments:
        if s.side == "supply" and s.fed_by is None:
            down(s, 0)
    for s in segments:
        if s.side == "return" and s.fed_by is None:
            up(s)
    waves = []
    for lev in range(max(level.values(), default=-1) + 1):
        at = [pos[s.name] for s in segments if level[s.name] == lev]
        still = tuple(i for i in at if segments[i].location == CONDITIONED)
        groups: dict[bool, list] = {}
        for i in at:
            if segments[i].location != CONDITIONED:
                groups.setdefault(bool(segments[i].geometry().films_included), []).append(i)
        waves.append((still, tuple(tuple(g) for g in groups.values())))
    return ChainPlan(tuple(order), tuple(waves))


def _broadcast(shapes):
    shapes = set(shapes)
    if len(shapes) > 1:
        shapes.discard(())  # a single row broadcasts against anything
    return shapes.pop() if len(shapes) == 1 else np.broadcast_shapes(*shapes)


def _stacked(values, shapes, ndim):
    """The runs' values on a new leading axis, with singleton axes up to ``ndim`` row axes."""
    if len(set(shapes)) == 1:
        a, shape = np.array(values, dtype=float), shapes[0]
    else:
        shape = np.broadcast_shapes(*shapes)
        a = np.empty((len(values),) + shape)
        for j, v in enumerate(values):
            a[j] = v
    return a.reshape((len(values),) + (1,) * (ndim - len(shape)) + shape) if len(shape) < ndim else a


def _own(a, shape):
    """One run's slice of a stacked result (rows shape R) cut back to that run's own shape (broadcastable to R)."""
    if a.shape == shape:
        return a
    lead = a.ndim - len(shape)
    rows = a.shape[lead:]
    idx = (0,) * lead + tuple(slice(None) if s == r else slice(0, 1) for s, r in zip(shape, rows, strict=True))
    return a[idx].reshape(shape)


def transfer_many(geoms, T_in, m_dot, cp, T_air, T_mrt, jacket_emittance, pressure=101325.0, cache=None, key=None):
    """segment_transfer of several runs in one call, each result as that run's own call gives it.

    Parameters
    ----------
    geoms : sequence of SegmentGeometry
        With equal films_included.
    T_in, m_dot, T_air, T_mrt, jacket_emittance : sequences, one float or array per run [K, kg/s, K, K, -]
        As segment_transfer takes them; each run's own shapes may differ as long as they broadcast together.
    cp : float or array [J/(kg.K)], or a sequence of them, one per run
        Shared by the runs, or each run's own (a supply run's air is drier than a return run's).
    pressure : float [Pa]
    cache : dict or None
        Where to keep the stacked geometry between calls: owned by the duct system the geometries belong to
        (they never change), with ``key`` naming the runs in it (their positions).
    key : hashable

    Returns
    -------
    list of dict
        Per run: T_out, Q, Q_conv, Q_rad, T_jacket_cold [K, W] and UA [W/K], of the shapes and types that
        segment_transfer returns for that run alone (a 0-d run: T_out a float, the others numpy floats).

    Notes
    -----
    The inputs are stacked on a new leading axis, so every elementwise operation of segment_transfer works
    on all runs at once; each run's numbers are those of its own call (equivalence, tests/test_duct_levels.py).

    Examples
    --------
    Two runs of two rows each in one call give what two calls give (an equivalence check; the physics is
    segment_transfer's):

    >>> from ducts.segment import round_geometry
    >>> g = [round_geometry(0.2, 10.0, 1.0), round_geometry(0.15, 5.0, 0.5)]
    >>> rows = np.array([1.0, 1.01])
    >>> two = transfer_many(g, [285.0 * rows, 290.0 * rows], [0.2 * rows, 0.05], 1006.0, [325.0, 320.0 * rows],
    ...                     [325.0, 330.0], [0.9, 0.9])
    >>> one = segment_transfer(g[1], 290.0 * rows, 0.05, 1006.0, 320.0 * rows, 330.0, 0.9)
    >>> bool(np.all(two[1]["T_out"] == one["T_out"])), bool(np.all(two[1]["Q"] == one["Q"])), two[1]["Q"].shape
    (True, True, (2,))
    """
    cps = list(cp) if isinstance(cp, list | tuple) else [cp] * len(geoms)  # each run's own
    if len(geoms) == 1:
        return [segment_transfer(geoms[0], T_in[0], m_dot[0], cps[0], T_air[0], T_mrt[0], jacket_emittance[0],
                                 pressure)]
    films = geoms[0].films_included
    inputs = (T_in, m_dot, T_air, T_mrt, jacket_emittance, cps)
    shapes = [[getattr(v, "shape", ()) for v in col] for col in inputs]
    g_shapes = [getattr(g.length, "shape", ()) for g in geoms]  # the geometry's fields share one shape
    own = [_broadcast((g_shapes[j],) + tuple(col[j] for col in shapes)) for j in range(len(geoms))]
    if not any(own):  # runs of single rows: numpy's scalar arithmetic beats a stacked call on so little
        return [segment_transfer(g, T_in[j], m_dot[j], cps[j], T_air[j], T_mrt[j], jacket_emittance[j], pressure)
                for j, g in enumerate(geoms)]
    ndim = len(_broadcast(own))
    key = (ndim, key)
    geom = None if cache is None else cache.get(key)
    if geom is None:
        geom = SegmentGeometry(*(_stacked([getattr(g, f) for g in geoms], g_shapes, ndim) for f in _GEOM),
                               films_included=films)
        if cache is not None:
            cache[key] = geom
    T_in, m_dot, T_air, T_mrt, eps, cp = (_stacked(col, sh, ndim) for col, sh in zip(inputs, shapes, strict=True))
    if len({id(c) for c in cps}) == 1 or all(np.array_equal(c, cps[0]) for c in cps):
        cp = cps[0]  # one cp for all: the call as before, digit for digit
    res = segment_transfer(geom, T_in, m_dot, cp, T_air, T_mrt, eps, pressure)
    out = []
    for j, (g, shape) in enumerate(zip(geoms, own, strict=True)):
        r = {k: _own(res[k][j], shape) for k in ("T_out", "Q", "Q_conv", "Q_rad", "T_jacket_cold", "UA")}
        if not shape:  # a single-row run among row arrays: T_out a float (leaving_temperature), the rest numpy floats
            r = {k: float(v) if k == "T_out" else v[()] for k, v in r.items()}
        if films:  # the whole wall is the model's R: UA is the geometry's alone, of its shape and type
            r["UA"] = g.length / g.insulation_resistance
        out.append(r)
    return out
