"""The one step that couples the ducts to a solved attic: what the ducts see, their thermal chain, and
their energy parts. The design condition, the design day, the year and the studies all go through here.
"""

from __future__ import annotations

import numpy as np


def duct_surroundings_hours(net, st):
    """What the ducts see hour by hour at a solved HourlyState (arrays), by location."""
    return net.duct_surroundings(st.air_K, net.interior_temperatures(st.x), st.humidity_ratio)


def duct_surroundings(net, state):
    """What the ducts see at a solved design condition (scalars), by location (Network.duct_surroundings)."""
    from ducts import Surroundings

    T_int = np.array([[*state.inner_K, state.floor_K]])
    sur = net.duct_surroundings(np.array([state.air_K]), T_int, np.array([state.humidity_ratio]))
    return {loc: Surroundings(float(s.T_air[0]), float(s.T_mrt[0]), float(np.asarray(s.W).reshape(-1)[0]))
            for loc, s in sur.items()}


def duct_chain(case, net, sur):
    """The ducts' thermal chain at the network's airflow and temperatures, in the given surroundings."""
    from ducts import thermal_chain

    return thermal_chain(net.ducts, net.duct_m_dot, net.duct_cp, net.T_supply, net.T_in, sur, case.pressure,
                         net.duct_cp_supply)


def duct_energy_hours(case, net, st, mode):
    """(chain, energy parts) of the ducts hour by hour at a solved HourlyState, for "cooling" or "heating"."""
    from ducts import energy_parts

    sur = duct_surroundings_hours(net, st)
    chain = duct_chain(case, net, sur)
    return chain, energy_parts(net.ducts, chain, mode, net.W_in, sur, case.pressure)


def duct_energy(case, cond, net, state):
    """The duct system's energy balance at a solved design condition (the network's airflow, running the whole
    hour), or None without ducts."""
    if net.ducts is None:
        return None
    from ducts import energy_balance, thermal_chain

    sur = duct_surroundings(net, state)
    chain = thermal_chain(net.ducts, float(net.duct_m_dot[0]), float(net.duct_cp[0]), cond.T_supply, cond.T_in,
                          sur, case.pressure, float(net.duct_cp_supply[0]))
    return energy_balance(net.ducts, chain, cond.kind, cond.W_in, sur, case.pressure)
