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
    """HAPropsSI on broadcast arrays; each distinct input triple is computed once."""
    a, b, c = np.broadcast_arrays(np.asarray(v1, float), np.asarray(v2, float), np.asarray(v3, float))
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
    return np.array([[_haprops()(output, "T", t, "P", P, "W", w) for t in _TG] for w in _WK])


@lru_cache(maxsize=8)
def _saturation_table(P):
    """Humidity ratio of saturated air on the fine temperature grid."""
    return np.array([_haprops()("W", "T", t, "P", P, "R", 1.0) for t in _TGS])


def _tabulable(T, W, P, grid=_TG):
    T = np.asarray(T)
    return (T.size >= TABLE_MIN and np.ndim(P) == 0 and np.all((T >= grid[0]) & (T <= grid[-1]))
            and np.all((np.asarray(W) >= 0.0) & (np.asarray(W) <= _WK[-1])))


def _smooth_property(output, T, P, W):
    """A property smooth in T and W: from the table for long arrays, else straight from HAPropsSI."""
    if _tabulable(T, W, P):
        return _from_quad(output, T, P, W)
    return _call(output, "T", T, "P", P, "W", W)


def _from_quad(output, T, P, W):
    T, W = np.broadcast_arrays(np.asarray(T, float), np.asarray(W, float))
    tab = _quad_table(output, float(P))
    f0, f1, f2 = (np.interp(T, _TG, tab[k]) for k in range(3))
    w0, w1, w2 = _WK
    L0 = (W - w1) * (W - w2) / ((w0 - w1) * (w0 - w2))
    L1 = (W - w0) * (W - w2) / ((w1 - w0) * (w1 - w2))
    L2 = (W - w0) * (W - w1) / ((w2 - w0) * (w2 - w1))
    return f0 * L0 + f1 * L1 + f2 * L2


def humidity_ratio_from_rh(T, P, RH):
    """Humidity ratio. T : K, P : Pa, RH : 0-1 (ratio of water mole fractions, as in RP-1485).

    Returns W : kg water / kg dry air.
    """
    if _tabulable(T, 0.0, P, _TGS):
        W_s = np.exp(np.interp(np.asarray(T, float), _TGS, np.log(_saturation_table(float(P)))))
        x = np.asarray(RH, float) * W_s / (0.621945 + W_s)  # mole fraction of water vapour
        return 0.621945 * x / (1.0 - x)
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
    if _tabulable(T_dewpoint, 0.0, P, _TGS):
        return np.exp(np.interp(np.asarray(T_dewpoint, float), _TGS, np.log(_saturation_table(float(P)))))
    T = np.asarray(T_dewpoint, dtype=float) + 1.0
    return _call("W", "T", T, "P", P, "D", T_dewpoint)


def dew_point(T, P, W):
    """Dew point. T : K, P : Pa, W : kg/kg. Returns T_dp : K (it depends on W and P only)."""
    Wa = np.asarray(W, float)
    if _tabulable(T, W, P):
        sat = _saturation_table(float(P))
        if np.all((Wa > sat[0]) & (Wa < sat[-1])):
            T_dp = np.interp(np.log(Wa), np.log(sat), _TGS)
            return np.broadcast_to(T_dp, np.broadcast(np.asarray(T), Wa).shape).copy()
    return _call("D", "T", T, "P", P, "W", W)


def relative_humidity(T, P, W):
    """Relative humidity (0-1). T : K, P : Pa, W : kg/kg."""
    return _call("R", "T", T, "P", P, "W", W)


def enthalpy(T, P, W):
    """Specific enthalpy per kg of dry air. T : K, P : Pa, W : kg/kg. Returns h : J/kg_da."""
    return _smooth_property("H", T, P, W)


def temperature_from_enthalpy(h, P, W):
    """Dry bulb from enthalpy per kg dry air and humidity ratio. h : J/kg_da, P : Pa. Returns T : K."""
    return _call("T", "H", h, "P", P, "W", W)


def specific_volume(T, P, W):
    """Volume per kg of dry air. T : K, P : Pa, W : kg/kg. Returns v : m3/kg_da."""
    return _smooth_property("Vda", T, P, W)


def specific_heat(T, P, W):
    """Isobaric specific heat per kg of dry air. T : K, P : Pa, W : kg/kg. Returns cp : J/(kg_da.K)."""
    return _smooth_property("cp", T, P, W)
