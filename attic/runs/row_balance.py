"""One evaluation of a stacked network's rows, as the batched solves use it: whether the balances closed, the
house's base load, and at given node temperatures the heat the ducts deliver, the equipment's load, the house
load and the duct results, each row a point (attic.runs.batch, attic.runs.joint, attic.runs.sampled).
"""

from __future__ import annotations

import dataclasses

import numpy as np

from attic.network import solve as balance
from attic.network.nodes import I_AIR
from attic.network.solve import attic_air_state
from attic.runs.totals import base_load, house_load_parts


def closed_rows(res):
    """Rows whose node balances all closed within RESIDUAL_LIMIT_W (res : (n, n_nodes) W)."""
    worst = np.max(np.abs(np.nan_to_num(res, nan=np.inf)), axis=1)
    return np.all(np.isfinite(res), axis=1) & (worst <= balance.RESIDUAL_LIMIT_W)


def base_loads(cases, conds):
    """The base load (sensible, latent) of each point, W, as two arrays over the points."""
    return np.array([base_load(c, k) for c, k in zip(cases, conds, strict=True)], dtype=float).T


def balance_rows(net, x, kind, base, solved=None):
    """(delivered, equipment, house load) per row, W, and the flows, at temperatures x: the attic, its air to the
    house and the ducts' energy parts from one evaluation of the network. base : base_loads of these rows;
    solved : solved_ducts(net, x) when already at hand."""
    from ducts import energy_parts

    f, sens, lat, sur = solved or solved_ducts(net, x)
    e = energy_parts(net.ducts, f["chain"], kind, net.W_in, sur, net.pressure)
    return np.asarray(e["delivered"], float), np.asarray(e["equipment"], float), house_rows(kind, base, f, sens, lat), f


def house_rows(kind, base, f, sens, lat):
    """The house load per row, W, from solved_ducts' flows and the attic air's sensible and latent parts."""
    return sum(house_load_parts(kind, base, f["ceiling"], sens, lat))


def duct_results(net, x, kind, solved=None):
    """DuctResult per row (ducts.energy_balances on the stack); solved : solved_ducts(net, x) when at hand."""
    from ducts import energy_balances

    f, _, _, sur = solved or solved_ducts(net, x)
    return energy_balances(net.ducts, f["chain"], kind, net.W_in, sur, net.pressure)


def solved_rows(solved, rows, n):
    """solved_ducts' result for some of its n rows: every array whose first axis runs over the rows is cut to
    `rows` (an index array), inside the flows' dicts and the duct chain's dataclasses too; whatever is the
    same for every row (a scalar, a name, a per-surface constant) is kept as it is."""
    def take(v):
        if isinstance(v, np.ndarray):
            return v[rows] if v.ndim >= 1 and v.shape[0] == n else v
        if isinstance(v, dict):
            return {k: take(w) for k, w in v.items()}
        if dataclasses.is_dataclass(v) and not isinstance(v, type):
            return dataclasses.replace(v, **{f.name: take(getattr(v, f.name)) for f in dataclasses.fields(v)})
        return v

    return tuple(take(v) for v in solved)


def solved_ducts(net, x):
    """(flows, sensible and latent air to the house, the ducts' surroundings) at temperatures x: the flows hold
    the ducts' thermal chain, the surroundings the attic air's solved humidity."""
    f = net.flows(x)
    W_a, sens, lat = attic_air_state(net, x, f)
    return f, sens, lat, net.duct_surroundings(x[:, I_AIR], net.interior_temperatures(x), W_a)
