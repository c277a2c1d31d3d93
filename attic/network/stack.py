"""Many one-hour networks as one: the points of a study on the row axis, as the year puts hours there.

Points can share one network when everything outside its row fields (attic.network.nodes.ROW_FIELDS) is the
same: the geometry, vented or not, the gap under the covering, the exterior convection model, where the ducts
run. `network_key` says which points can be stacked; `stack_networks` stacks them, with the duct systems
stacked by ducts.stack (the same layout, numbers per row).
"""

from __future__ import annotations

import dataclasses

import numpy as np

from attic.network.nodes import ROW_FIELDS, Network

# every Network field that is not a row field is shared by a stack; these are compared by value
_SHARED = tuple(f.name for f in dataclasses.fields(Network) if f.name not in ROW_FIELDS and f.name != "ducts")


def _frozen(value):
    if isinstance(value, np.ndarray):
        return (value.shape, value.tobytes())
    if isinstance(value, dict):
        return tuple(sorted((k, _frozen(v)) for k, v in value.items()))
    if isinstance(value, (list, tuple)):
        return tuple(_frozen(v) for v in value)
    return value


def network_key(net: Network):
    """A hashable key: networks with equal keys can be stacked into one (`stack_networks`)."""
    from ducts.stack import layout_key

    return shared_key(net) + (None if net.ducts is None else layout_key(net.ducts),)


def shared_key(net: Network):
    """network_key without the ducts' layout: what every row of a network shares outside its duct system."""
    return tuple(_frozen(getattr(net, f)) for f in _SHARED)


def stack_networks(nets):
    """One Network whose rows are the rows of `nets` in order (all with equal `network_key`).

    Raises ValueError when they cannot share one network.
    """
    first = nets[0]
    key = network_key(first)
    for n in nets[1:]:
        if network_key(n) != key:
            raise ValueError("these networks differ outside their row fields and cannot be stacked")
    rows = {f: np.concatenate([getattr(n, f) for n in nets], axis=0) for f in ROW_FIELDS}
    if first.ducts is not None:
        from ducts.stack import stack_duct_systems

        rows["ducts"] = stack_duct_systems([n.ducts for n in nets for _ in range(n.n)])
    return dataclasses.replace(first, **rows)


def group_by_network(nets):
    """Indices of `nets` grouped by `network_key`, in the order each key first appears: [[i, ...], ...]."""
    groups: dict = {}
    for i, n in enumerate(nets):
        groups.setdefault(network_key(n), []).append(i)
    return list(groups.values())
