"""The repeating design day with the roof's heat capacity: hours solved together, stepped by implicit Euler."""

from __future__ import annotations

import numpy as np

from attic.network.nodes import Network
from attic.network.solve import SolveError, solve_hours


def solve_periodic_day(net: Network, tol_K=1e-4, max_sweeps=200, label="design day"):
    """The 24 hours of a repeating day with the roof's heat capacity (implicit Euler, one-hour steps).

    Each hour's deck nodes store C (T_h - T_h-1)/dt; hour 1 follows hour 24 of the same day. The hours
    are solved together with the previous hour's temperatures taken from the last sweep (Jacobi),
    starting from the quasi-steady day, until no node moves more than tol_K. With C -> 0 this is the
    quasi-steady day (tested).
    """
    import dataclasses

    st = solve_hours(net, label=label)
    x = st.x
    for _ in range(max_sweeps):
        stepped = dataclasses.replace(net, previous=np.roll(x, 1, axis=0))
        st = solve_hours(stepped, x0=x, label=label)
        moved = float(np.max(np.abs(st.x - x)))
        x = st.x
        if moved < tol_K:
            return st
    raise SolveError(f"{label}: the periodic day did not settle in {max_sweeps} sweeps (last change {moved:.2g} K)")
