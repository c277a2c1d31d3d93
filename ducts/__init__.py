"""Ducts: heat gain and leakage of air ducts in a given surrounding, with moist-air properties.

This package imports nothing from ``attic``: it knows a duct, the air in it and the air and surfaces around it,
and can be used alone ("this duct in a 130 °F attic"). Its modules, from the bottom up:

``moist_air``, ``air_transport``  properties of the air (CoolProp; Sutherland)
``films``                        convection inside and outside a duct
``segment``                      one run: geometry, insulation shell, the exponential temperature law
``leakage``                      leak flow at operating pressure from a 25 Pa test
``layout``                       segments, sides, trunks and branches, the flow each run carries
``chain``                        temperatures along every run, cheap enough for a coupled solver
``energy``                       enthalpy balances at the solved state: delivery effectiveness, duct load parts
``stack``                        many duct systems of one layout as (n,) arrays, for one batched solve

The names below are the public face; everything else may change.
"""

from ducts.chain import ChainState, Surroundings, mass_flow, thermal_chain
from ducts.energy import (
    DuctResult,
    SegmentResult,
    coil_leaving_humidity_ratio,
    energy_balance,
    energy_balances,
    energy_parts,
)
from ducts.layout import CONDITIONED, DuctSegment, DuctSystem
from ducts.leakage import cfm25_to_operating
from ducts.stack import DuctStack, StackSegment, layout_key, stack_duct_systems

__all__ = [
    "CONDITIONED", "ChainState", "DuctResult", "DuctSegment", "DuctStack", "DuctSystem", "SegmentResult",
    "StackSegment", "Surroundings", "cfm25_to_operating", "coil_leaving_humidity_ratio", "energy_balance",
    "energy_balances", "energy_parts", "layout_key", "mass_flow", "stack_duct_systems", "thermal_chain",
]
