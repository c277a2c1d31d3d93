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
    if a.size <= 4:
        key = (output, name1, name2, name3, a.shape, a.tobytes(), b.tobytes(), c.tobytes())
        hit = _RECENT.get(key)
        if hit is None:
            if len(_RECENT) >= _RECENT_MAX:
                _RECENT.clear()
            hit = _RECENT[key] = _call_now(output, name1, a, name2, b, name3, c)
        return hit if a.ndim == 0 else hit.copy()
    return _call_now(output, name1, a, name2, b, name3, c)


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
    return np.array([[_haprops()(output, "T", t, "P", P, "W", w) for t in _TG] for w in _WK])


@lru_cache(maxsize=8)
def _saturation_table(P):
    """Humidity ratio of saturated air on the fine temperature grid."""
    return np.array([_haprops()("W", "T", t, "P", P, "R", 1.0) for t in _TGS])


_ANY_SIZE = [False]  # set by `tabulated`


@contextmanager
def tabulated():
    """Inside this block the smooth properties come from the tables whatever the size of the array.

    For a solver that asks for the same few states many times over (each Newton step of a design condition):
    direct HAPropsSI calls cost 20-250 microseconds a state. The tables' accuracy against direct calls is tested
    (tests/test_moist_air.py); a result is then evaluated again outside the block.

    Examples
    --------
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
    """compute() for a small call (4 states or fewer), remembered: a study asks for the same design states at
    every point, and with the tables on (`tabulated`) a table lookup costs more than remembering."""
    a, p, w = np.asarray(T, float), np.asarray(P, float), np.asarray(W, float)
    if max(a.size, p.size, w.size) > 4:
        return compute()
    key = (name, _ANY_SIZE[0], a.shape, w.shape, p.shape, a.tobytes(), p.tobytes(), w.tobytes())
    hit = _RECENT.get(key)
    if hit is None:
        if len(_RECENT) >= _RECENT_MAX:
            _RECENT.clear()
        hit = _RECENT[key] = compute()
    return hit.copy() if isinstance(hit, np.ndarray) else hit


def _smooth_property(output, T, P, W):
    """A property smooth in T and W: from the table for long arrays, else straight from HAPropsSI."""
    def compute():
        if _tabulable(T, W, P):
            return _from_quad(output, T, P, W)
        return _call(output, "T", T, "P", P, "W", W)

    return _small_and_known(output, T, P, W, compute)


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
    """Humidity ratio of moist air from its relative humidity.

    Parameters
    ----------
    T : float or array [K]
        Dry bulb.
    P : float or array [Pa]
    RH : float or array [-]
        0-1, the ratio of water mole fractions (as in RP-1485).

    Returns
    -------
    W : float or array [kg/kg]
        Water per kilogram of dry air.

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).
    ASHRAE Handbook-Fundamentals (2017), ch. 1, Table 2 (thermodynamic properties of moist air
    at 101.325 kPa).

    Examples
    --------
    ASHRAE Table 2 at 20 °C lists saturated air at W_s = 0.014758 kg/kg (value from memory):

    >>> round(humidity_ratio_from_rh(293.15, 101325.0, 1.0), 5)
    0.01476
    """
    if _tabulable(T, 0.0, P, _TGS):
        W_s = np.exp(np.interp(np.asarray(T, float), _TGS, np.log(_saturation_table(float(P)))))
        x = np.asarray(RH, float) * W_s / (0.621945 + W_s)  # mole fraction of water vapour
        return 0.621945 * x / (1.0 - x)
    return _call("W", "T", T, "P", P, "R", RH)


def humidity_ratio_from_wetbulb(T, T_wetbulb, P):
    """Humidity ratio from the thermodynamic (psychrometric) wet bulb.

    CoolProp iterates for this one (about 9 ms a call), so scalar calls are remembered.

    Parameters
    ----------
    T : float or array [K]
        Dry bulb.
    T_wetbulb : float or array [K]
        Thermodynamic wet bulb.
    P : float or array [Pa]

    Returns
    -------
    W : float or array [kg/kg]

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).
    ASHRAE Handbook-Fundamentals (2017), ch. 1, eq. (35) and Table 2.

    Examples
    --------
    40 °C dry bulb, 20 °C wet bulb. By hand with ASHRAE's eq. (35) and W_s* = 0.014758 at
    20 °C from Table 2: W = ((2501 - 2.326 x 20) x 0.014758 - 1.006 x 20) / (2501 + 1.86 x 40
    - 4.186 x 20) = 16.10 / 2491.7 = 0.00646 kg/kg:

    >>> round(humidity_ratio_from_wetbulb(313.15, 293.15, 101325.0), 4)
    0.0065
    """
    if np.ndim(T) == 0 and np.ndim(T_wetbulb) == 0 and np.ndim(P) == 0:
        return _wetbulb_scalar(float(T), float(T_wetbulb), float(P))
    return _call("W", "T", T, "P", P, "B", T_wetbulb)


@lru_cache(maxsize=256)
def _wetbulb_scalar(T, T_wetbulb, P):
    return _call("W", "T", T, "P", P, "B", T_wetbulb)


def humidity_ratio_from_dewpoint(T_dewpoint, P):
    """Humidity ratio of air with the given dew point.

    The humidity ratio depends on the dew point and pressure alone; CoolProp needs a third input,
    so the dry bulb is set a little above the dew point.

    Parameters
    ----------
    T_dewpoint : float or array [K]
    P : float or array [Pa]

    Returns
    -------
    W : float or array [kg/kg]

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).
    ASHRAE Handbook-Fundamentals (2017), ch. 1, Table 2.

    Examples
    --------
    Air with a 15 °C dew point holds what saturated air holds at 15 °C; ASHRAE Table 2 lists
    W_s = 0.010692 kg/kg there (value from memory):

    >>> round(humidity_ratio_from_dewpoint(288.15, 101325.0), 5)
    0.01069
    """
    if _tabulable(T_dewpoint, 0.0, P, _TGS):
        return np.exp(np.interp(np.asarray(T_dewpoint, float), _TGS, np.log(_saturation_table(float(P)))))
    T = np.asarray(T_dewpoint, dtype=float) + 1.0
    return _call("W", "T", T, "P", P, "D", T_dewpoint)


def dew_point(T, P, W):
    """Dew point of moist air (it depends on W and P only).

    Parameters
    ----------
    T : float or array [K]
        Dry bulb.
    P : float or array [Pa]
    W : float or array [kg/kg]

    Returns
    -------
    T_dp : float or array [K]

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).
    ASHRAE Handbook-Fundamentals (2017), ch. 1, Table 2.

    Examples
    --------
    ASHRAE Table 2's saturated humidity ratio at 15 °C, 0.010692 kg/kg (value from memory), has
    its dew point at 15 °C whatever the dry bulb:

    >>> round(dew_point(300.0, 101325.0, 0.010692) - 273.15, 2)
    15.0
    """
    def compute():
        Wa = np.asarray(W, float)
        if _tabulable(T, W, P):
            sat = _saturation_table(float(P))
            if np.all((Wa > sat[0]) & (Wa < sat[-1])):
                T_dp = np.interp(np.log(Wa), np.log(sat), _TGS)
                return np.broadcast_to(T_dp, np.broadcast(np.asarray(T), Wa).shape).copy()
        return _call("D", "T", T, "P", P, "W", W)

    return _small_and_known("D", T, P, W, compute)


def relative_humidity(T, P, W):
    """Relative humidity of moist air.

    Parameters
    ----------
    T : float or array [K]
        Dry bulb.
    P : float or array [Pa]
    W : float or array [kg/kg]

    Returns
    -------
    RH : float or array [-]
        0-1, the ratio of water mole fractions.

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).

    Examples
    --------
    Saturated air at 20 °C (W_s = 0.014758 kg/kg, ASHRAE Handbook-Fundamentals 2017, ch. 1,
    Table 2, value from memory) is at 100 %; psychrolib (ASHRAE's ideal-gas equations) puts
    30 °C air with W = 0.0107 at 40.4 %:

    >>> round(relative_humidity(293.15, 101325.0, 0.014758), 3)
    1.0
    >>> round(relative_humidity(303.15, 101325.0, 0.0107), 2)
    0.4
    """
    return _call("R", "T", T, "P", P, "W", W)


def enthalpy(T, P, W):
    """Specific enthalpy of moist air per kilogram of dry air.

    Parameters
    ----------
    T : float or array [K]
        Dry bulb.
    P : float or array [Pa]
    W : float or array [kg/kg]

    Returns
    -------
    h : float or array [J/kg]
        Per kilogram of dry air; zero for dry air at 0 °C (ASHRAE's reference state).

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).
    ASHRAE Handbook-Fundamentals (2017), ch. 1, Table 2.

    Examples
    --------
    ASHRAE Table 2 at 20 °C: saturated air (W_s = 0.014758) has h_s = 57.555 kJ/kg (values
    from memory); dry air at 0 °C is the zero:

    >>> round(enthalpy(293.15, 101325.0, 0.014758) / 1000.0, 2)
    57.55
    >>> abs(enthalpy(273.15, 101325.0, 0.0)) < 1e-3
    True
    """
    return _smooth_property("H", T, P, W)


def temperature_from_enthalpy(h, P, W):
    """Dry bulb of moist air from its enthalpy and humidity ratio.

    Parameters
    ----------
    h : float or array [J/kg]
        Per kilogram of dry air.
    P : float or array [Pa]
    W : float or array [kg/kg]

    Returns
    -------
    T : float or array [K]

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).
    ASHRAE Handbook-Fundamentals (2017), ch. 1, Table 2.

    Examples
    --------
    The inverse of Table 2's entry at 20 °C, h_s = 57.555 kJ/kg at W_s = 0.014758 (values from
    memory):

    >>> round(temperature_from_enthalpy(57555.0, 101325.0, 0.014758) - 273.15, 2)
    20.0
    """
    return _call("T", "H", h, "P", P, "W", W)


def specific_volume(T, P, W):
    """Volume of moist air per kilogram of dry air.

    Parameters
    ----------
    T : float or array [K]
        Dry bulb.
    P : float or array [Pa]
    W : float or array [kg/kg]

    Returns
    -------
    v : float or array [m3/kg]
        Per kilogram of dry air.

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).
    ASHRAE Handbook-Fundamentals (2017), ch. 1, Table 2.

    Examples
    --------
    ASHRAE Table 2 at 20 °C: dry air v_da = 0.8301 m3/kg, saturated air v_s = 0.8497 m3/kg
    (values from memory):

    >>> round(specific_volume(293.15, 101325.0, 0.0), 4), round(specific_volume(293.15, 101325.0, 0.014758), 3)
    (0.8301, 0.85)
    """
    return _smooth_property("Vda", T, P, W)


def specific_heat(T, P, W):
    """Isobaric specific heat of moist air per kilogram of dry air.

    Parameters
    ----------
    T : float or array [K]
        Dry bulb.
    P : float or array [Pa]
    W : float or array [kg/kg]

    Returns
    -------
    cp : float or array [J/(kg.K)]
        Per kilogram of dry air.

    References
    ----------
    Herrmann, Kretzschmar and Gatley (2009), ASHRAE RP-1485, via CoolProp's HAPropsSI (module docstring).
    ASHRAE Handbook-Fundamentals (2017), ch. 1, eq. (32), h = 1.006 t + W (2501 + 1.86 t) kJ/kg.

    Examples
    --------
    The temperature derivative of ASHRAE's eq. (32) is 1006 + 1860 W J/(kg.K); by hand, for
    W = 0.0107, 1006 + 19.9 = 1025.9. The real-gas value agrees within 0.1 %:

    >>> abs(specific_heat(303.15, 101325.0, 0.0107) / 1025.9 - 1.0) < 1e-3
    True
    """
    return _smooth_property("cp", T, P, W)
