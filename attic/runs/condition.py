"""Orchestration: one case at one condition -> attic, ducts, house totals, code checks."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from attic.network.nodes import build_network
from attic.network.solve import AtticState, solve
from attic.runs.totals import HouseTotals, house_totals


@dataclass(frozen=True)
class ConditionResult:
    """Everything atticduct says about one case at one condition (SI inside; see attic.output)."""

    case: str
    title: str
    kind: str
    attic_type: str
    attic: AtticState
    ducts: object | None  # ducts.DuctResult scaled to the house load
    house: HouseTotals
    vents: object | None  # attic.codes.VentCheck
    plane_azimuths: tuple
    pressure_pa: float

    def to_dict(self):
        return {
            "case": self.case, "title": self.title, "condition": self.kind, "attic_type": self.attic_type,
            "attic": self.attic.to_dict(), "ducts": None if self.ducts is None else self.ducts.to_dict(),
            "house": self.house.to_dict(), "vents": None if self.vents is None else self.vents.to_dict(),
            "plane_azimuths": list(self.plane_azimuths), "pressure_pa": self.pressure_pa,
        }


def duct_surroundings(net, state):
    """What the ducts see at a solved design condition (scalars), by location (Network.duct_surroundings)."""
    from ducts import Surroundings

    T_int = np.array([[*state.inner_K, state.floor_K]])
    sur = net.duct_surroundings(np.array([state.air_K]), T_int, np.array([state.humidity_ratio]))
    return {loc: Surroundings(float(s.T_air[0]), float(s.T_mrt[0]), float(np.asarray(s.W).reshape(-1)[0]))
            for loc, s in sur.items()}


def duct_surroundings_hours(net, st):
    """What the ducts see hour by hour at a solved HourlyState (arrays), by location."""
    T_int = np.concatenate([st.inner_K, st.floor_K[:, None]], axis=1)
    return net.duct_surroundings(st.air_K, T_int, st.humidity_ratio)


def duct_energy(case, cond, net, state):
    """The duct system's energy balance at a solved attic (full airflow), or None without ducts."""
    if case.ducts is None:
        return None
    from ducts import energy_balance, thermal_chain

    sur = duct_surroundings(net, state)
    chain = thermal_chain(case.ducts, float(net.duct_m_dot[0]), float(net.duct_cp[0]), cond.T_supply, cond.T_in,
                          sur, case.pressure)
    return energy_balance(case.ducts, chain, cond.kind, cond.W_in, sur, case.pressure)


def run_condition(case, cond, x0=None):
    """Solve one case at one condition. Raises attic.balance.SolveError when it does not close.

    x0 : optional starting temperatures (K), e.g. the solution of a neighbouring sweep point.
    """
    from attic.codes.rules import check_vents

    net = build_network(case, cond)
    state = solve(net, label=f'case "{case.name}", {cond.kind} design condition', x0=x0)
    duct_full = duct_energy(case, cond, net, state)
    totals, duct = house_totals(case, cond, state, duct_full)
    vents = check_vents(case.inputs, case.inputs["codes"]["irc_edition"])
    return ConditionResult(case.name, case.title, cond.kind, case.attic_type, state, duct, totals, vents,
                           case.geometry.plane_azimuths, case.pressure)


def run_case(case):
    """All design conditions of one case (list of ConditionResult)."""
    return [run_condition(case, cond) for cond in case.conditions]
