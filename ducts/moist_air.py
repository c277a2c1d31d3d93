"""Moist-air properties per kilogram of dry air, through CoolProp's HAPropsSI.

CoolProp implements the ASHRAE RP-1485 real-gas formulation (Herrmann, Kretzschmar and Gatley,
2009). It is imported on first use; every function takes numpy arrays and calls HAPropsSI once
on the broadcast arrays.

References
----------
Herrmann, S., Kretzschmar, H.-J. and Gatley, D. P. (2009). Thermodynamic properties of real
moist air, dry air, steam, water, and ice (RP-1485). HVAC&R Research 15(5), 961-986.
Bell, I. H. et al. (2014). Pure and pseudo-pure fluid thermophysical property evaluation and the
open-source thermophysical property library CoolProp. Ind. Eng. Chem. Res. 53(6), 2498-2508.
"""

from __future__ import annotations

from functools import lru_cache

import numpy as np


@lru_cache(maxsize=1)
def _haprops():
    from CoolProp.HumidAirProp import HAPropsSI

    return HAPropsSI


def _call(output, name1, v1, name2, v2, name3, v3):
    a, b, c = np.broadcast_arrays(np.asarray(v1, float), np.asarray(v2, float), np.asarray(v3, float))
    if a.ndim == 0:
        return float(_haprops()(output, name1, float(a), name2, float(b), name3, float(c)))
    flat = _haprops()(output, name1, a.ravel(), name2, b.ravel(), name3, c.ravel())
    return np.asarray(flat, dtype=float).reshape(a.shape)


def humidity_ratio_from_rh(T, P, RH):
    """Humidity ratio. T : K, P : Pa, RH : 0-1. Returns W : kg water / kg dry air."""
    return _call("W", "T", T, "P", P, "R", RH)


def humidity_ratio_from_wetbulb(T, T_wetbulb, P):
    """Humidity ratio from the (psychrometric) wet bulb. T, T_wetbulb : K, P : Pa. Returns W : kg/kg.

    CoolProp iterates for this one (about 9 ms a call), so scalar calls are remembered.
    """
    if np.ndim(T) == 0 and np.ndim(T_wetbulb) == 0 and np.ndim(P) == 0:
        return _wetbulb_scalar(float(T), float(T_wetbulb), float(P))
    return _call("W", "T", T, "P", P, "B", T_wetbulb)


@lru_cache(maxsize=256)
def _wetbulb_scalar(T, T_wetbulb, P):
    return _call("W", "T", T, "P", P, "B", T_wetbulb)


def humidity_ratio_from_dewpoint(T_dewpoint, P):
    """Humidity ratio of air with the given dew point. T_dewpoint : K, P : Pa. Returns W : kg/kg.

    The humidity ratio depends on the dew point and pressure alone; CoolProp needs a third input,
    so the dry bulb is set a little above the dew point.
    """
    T = np.asarray(T_dewpoint, dtype=float) + 1.0
    return _call("W", "T", T, "P", P, "D", T_dewpoint)


def dew_point(T, P, W):
    """Dew point. T : K, P : Pa, W : kg/kg. Returns T_dp : K."""
    return _call("D", "T", T, "P", P, "W", W)


def relative_humidity(T, P, W):
    """Relative humidity (0-1). T : K, P : Pa, W : kg/kg."""
    return _call("R", "T", T, "P", P, "W", W)


def enthalpy(T, P, W):
    """Specific enthalpy per kg of dry air. T : K, P : Pa, W : kg/kg. Returns h : J/kg_da."""
    return _call("H", "T", T, "P", P, "W", W)


def temperature_from_enthalpy(h, P, W):
    """Dry bulb from enthalpy per kg dry air and humidity ratio. h : J/kg_da, P : Pa. Returns T : K."""
    return _call("T", "H", h, "P", P, "W", W)


def specific_volume(T, P, W):
    """Volume per kg of dry air. T : K, P : Pa, W : kg/kg. Returns v : m3/kg_da."""
    return _call("Vda", "T", T, "P", P, "W", W)


def specific_heat(T, P, W):
    """Isobaric specific heat per kg of dry air. T : K, P : Pa, W : kg/kg. Returns cp : J/(kg_da.K)."""
    return _call("cp", "T", T, "P", P, "W", W)
