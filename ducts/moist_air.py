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

from ducts._properties import (  # noqa: F401  (TABLE_MIN and tabulated are part of this module's face)
    _TGS,
    TABLE_MIN,
    _call,
    _saturation_nodes,
    _small_and_known,
    _smooth_property,
    _tabulable,
    tabulated,
)


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
        W_s = np.exp(np.interp(np.asarray(T, float), _TGS, np.log(_saturation_nodes(float(P), T)[0])))
        x = np.asarray(RH, float) * W_s / (0.621945 + W_s)  # mole fraction of water vapour
        return 0.621945 * x / (1.0 - x)
    return _call("W", "T", T, "P", P, "R", RH)


def humidity_ratio_from_wetbulb(T, T_wetbulb, P):
    """Humidity ratio from the thermodynamic (psychrometric) wet bulb.

    CoolProp iterates for this one (about 9 ms a state), so every state is remembered, arrays' states too: an
    uncertainty run asks for the same sampled states for the base and every variant.

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
    a, b, c = np.broadcast_arrays(np.asarray(T, float), np.asarray(T_wetbulb, float), np.asarray(P, float))
    return np.array([_wetbulb_scalar(float(x), float(y), float(z)) for x, y, z in zip(a.ravel(), b.ravel(),
                                                                                     c.ravel(), strict=True)],
                    dtype=float).reshape(a.shape)


@lru_cache(maxsize=65536)
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
        return np.exp(np.interp(np.asarray(T_dewpoint, float), _TGS,
                                np.log(_saturation_nodes(float(P), T_dewpoint)[0])))
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
            sat, (a, b) = _saturation_nodes(float(P), W=Wa)
            if np.all((Wa > sat[0]) & (Wa < sat[-1])):
                T_dp = np.interp(np.log(Wa), np.log(sat[a:b]), _TGS[a:b])  # the filled nodes that bracket Wa
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
