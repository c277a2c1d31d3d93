"""Convection coefficients at the roof's outer surface and on surfaces inside the attic."""

from __future__ import annotations

import numpy as np

from attic.physics.arrays import scalar_or_array
from attic.physics.atmosphere import G

# Smallest |dT| used in the 1/3-power laws, K. Keeps the derivative finite at dT = 0 so that the
# Newton-type solver is well behaved; the flux h*dT there is below 1e-3 W/m2.
_DT_FLOOR = 1e-3


def exterior_convection_watmuff(wind_speed):
    """Wind-driven convection coefficient of an outdoor surface, radiation excluded.

    Parameters
    ----------
    wind_speed : float or array [m/s]

    Returns
    -------
    h_c : float or array [W/(m2.K)]

    Notes
    -----
    Fitted on solar collectors about a metre across, so its wind term carries a short length
    scale to whatever surface it is applied to; kept as a selectable alternative for roofs.
    h = 2.8 + 3.0 V, V in m/s, for 0-7 m/s. It is McAdams' flat-plate data with the radiation
    part removed, which is why it is used here: long-wave exchange is modelled separately.

    References
    ----------
    Watmuff, J. H., Charters, W. W. S. and Proctor, D. (1977). Solar and wind induced external
    coefficients for solar collectors. COMPLES 2, 56; as quoted in Duffie & Beckman, Solar
    Engineering of Thermal Processes (4th ed.), sect. 3.15 (equation number from memory: 3.15.2).

    Examples
    --------
    At 5 m/s: 2.8 + 3.0 x 5 = 17.8 W/(m2.K) (the equation as published).

    >>> round(exterior_convection_watmuff(5.0), 6)
    17.8
    """
    v = np.asarray(wind_speed, dtype=float)
    if np.any(v < 0):
        raise ValueError(f"wind speed {v} m/s must not be negative")
    h = 2.8 + 3.0 * v
    return scalar_or_array(h)


def natural_convection_walton(T_surface, T_air, normal_up):
    """Natural convection coefficient of a surface in still room air (Walton, TARP).

    Parameters
    ----------
    T_surface : float or array, K
    T_air : float or array, K
    normal_up : float or array, dimensionless
        Upward component of the surface's outward unit normal (the one pointing into the air):
        +1 a floor facing up, -1 a ceiling facing down, -cos(tilt) the underside of a roof deck
        of that tilt, 0 a wall.

    Returns
    -------
    h_c : float or array, W/(m2.K)

    Notes
    -----
    Unstable (buoyant air leaves the surface: a hot surface facing up or a cold one facing down):
    h = 9.482 |dT|^(1/3) / (7.238 - |cos S|). Stable (the reverse):
    h = 1.810 |dT|^(1/3) / (1.382 + |cos S|). Both give 1.31 |dT|^(1/3) for a vertical wall.

    References
    ----------
    Walton, G. N. (1983). Thermal Analysis Research Program reference manual. NBSIR 83-2655,
    National Bureau of Standards; the "TARP" natural-convection algorithm as restated in the
    building-simulation literature since (equations as given in the report).

    Examples
    --------
    A hot floor facing up, 8 K above the air: 9.482 x 2 / (7.238 - 1) = 3.040 W/(m2.K).

    >>> round(natural_convection_walton(308.0, 300.0, 1.0), 3)
    3.04
    """
    dT = np.asarray(T_surface, dtype=float) - np.asarray(T_air, dtype=float)
    n = np.asarray(normal_up, dtype=float)
    mag = np.sqrt(dT**2 + _DT_FLOOR**2) ** (1.0 / 3.0)
    cos_s = np.abs(n)
    unstable = dT * n > 0
    h = np.where(unstable, 9.482 * mag / (7.238 - cos_s), 1.810 * mag / (1.382 + cos_s))
    return scalar_or_array(h)


# Surface roughness multiplier R_f of the forced-convection term, by roughness class, with the
# example surface each class was measured on (Walton 1983, Table from the ASHRAE Handbook of
# Fundamentals 1981; values from memory).
ROUGHNESS_MULTIPLIERS = {
    "very-rough": 2.17,  # stucco
    "rough": 1.67,  # brick
    "medium-rough": 1.52,  # concrete
    "medium-smooth": 1.13,  # clear pine
    "smooth": 1.11,  # smooth plaster
    "very-smooth": 1.00,  # glass
}


def forced_convection_tarp(wind_speed, perimeter, area, roughness_multiplier, wind_factor=1.0):
    """Wind-forced convection coefficient of a building surface (Walton's TARP model).

    Parameters
    ----------
    wind_speed : float or array [m/s]
        Wind at the surface's height.
    perimeter : float [m]
        Perimeter of the surface.
    area : float [m2]
        Area of the surface.
    roughness_multiplier : float [-]
        R_f, 1.0 (glass) to 2.17 (stucco); see ROUGHNESS_MULTIPLIERS.
    wind_factor : float or array [-]
        W_f: 1.0 windward, 0.5 leeward.

    Returns
    -------
    h_f : float or array [W/(m2.K)]

    Notes
    -----
    h_f = 2.537 W_f R_f (P V / A)^(1/2). The perimeter-to-area ratio carries the surface's size:
    a larger roof has a thicker mean boundary layer and a smaller coefficient. The form comes from
    Sparrow, Ramsey & Mass (1979) on flat plates in a wind tunnel, with R_f from the ASHRAE
    Handbook's roughness table.

    References
    ----------
    Walton, G. N. (1983). Thermal Analysis Research Program reference manual. NBSIR 83-2655,
    National Bureau of Standards (exterior convection, forced part; equation from memory).

    Examples
    --------
    A 10 m x 10 m roof (P = 40 m, A = 100 m2), brick-rough (R_f = 1.67), 4 m/s, windward:
    2.537 x 1.67 x (40 x 4 / 100)^(1/2) = 5.359 W/(m2.K) (hand calculation from the equation).

    >>> round(forced_convection_tarp(4.0, 40.0, 100.0, 1.67), 3)
    5.359
    """
    v = np.asarray(wind_speed, dtype=float)
    if np.any(v < 0):
        raise ValueError(f"wind speed {v} m/s must not be negative")
    h = 2.537 * np.asarray(wind_factor, float) * roughness_multiplier * np.sqrt(perimeter * v / area)
    return scalar_or_array(h)


def exterior_convection_tarp(T_surface, T_air, normal_up, wind_speed, perimeter, area, roughness_multiplier,
                             wind_factor=1.0):
    """Convection coefficient of an outdoor surface, natural plus forced (Walton's TARP model).

    Parameters
    ----------
    T_surface, T_air : float or array [K]
    normal_up : float or array [-]
        Upward component of the outward normal (cos(tilt) for the top of a roof).
    wind_speed : float or array [m/s]
    perimeter : float [m]
    area : float [m2]
    roughness_multiplier : float [-]
    wind_factor : float or array [-]
        1.0 windward, 0.5 leeward.

    Returns
    -------
    h_c : float or array [W/(m2.K)]

    Notes
    -----
    h = h_n + h_f: Walton's natural convection (unstable or stable by the direction of heat flow)
    plus the TARP forced term. A hot roof in still air keeps its natural part (about 4.6 W/(m2.K)
    at 30 K on a 6/12 roof), which a wind-only fit does not.

    References
    ----------
    Walton, G. N. (1983). NBSIR 83-2655 (see natural_convection_walton, forced_convection_tarp).

    Examples
    --------
    A horizontal roof 27 K above the air in still air: natural only, 9.482 x 3 / 6.238 = 4.560.

    >>> round(exterior_convection_tarp(327.0, 300.0, 1.0, 0.0, 40.0, 100.0, 1.67), 3)
    4.56
    """
    h_n = natural_convection_walton(T_surface, T_air, normal_up)
    h = h_n + forced_convection_tarp(wind_speed, perimeter, area, roughness_multiplier, wind_factor)
    return scalar_or_array(h)


def exterior_convection_yazdanian_klems(T_surface, T_air, wind_speed, windward=True):
    """Convection coefficient of an outdoor surface from field data on a low-rise building (MoWiTT).

    Parameters
    ----------
    T_surface, T_air : float or array [K]
    wind_speed : float or array [m/s]
    windward : bool or array
        Surface facing the wind (True) or in its lee.

    Returns
    -------
    h_c : float or array [W/(m2.K)]

    Notes
    -----
    h = ((C_t |dT|^(1/3))^2 + (a V^b)^2)^(1/2), C_t = 0.84 W/(m2.K^(4/3)); windward a = 2.38,
    b = 0.89; leeward a = 2.86, b = 0.617. Measured on the glazing of a small test building, so the
    surface's size and roughness are not in it.

    References
    ----------
    Yazdanian, M. and Klems, J. H. (1994). Measurement of the exterior convective film coefficient
    for windows in low-rise buildings. ASHRAE Transactions 100(1), 1087-1096, eq. (5) and Table 2
    (coefficients from memory).

    Examples
    --------
    Windward, 8 K, 3 m/s: ((0.84 x 2)^2 + (2.38 x 3^0.89)^2)^(1/2) = 6.546 W/(m2.K) (hand calculation).

    >>> round(exterior_convection_yazdanian_klems(308.0, 300.0, 3.0), 3)
    6.546
    """
    v = np.asarray(wind_speed, dtype=float)
    if np.any(v < 0):
        raise ValueError(f"wind speed {v} m/s must not be negative")
    dT = np.asarray(T_surface, dtype=float) - np.asarray(T_air, dtype=float)
    nat = 0.84 * np.sqrt(dT**2 + _DT_FLOOR**2) ** (1.0 / 3.0)
    a = np.where(windward, 2.38, 2.86)
    b = np.where(windward, 0.89, 0.617)
    h = np.sqrt(nat**2 + (a * v**b) ** 2)
    return scalar_or_array(h)


def exterior_convection_clear(T_surface, T_air, wind_speed, perimeter, area, roughness_multiplier,
                              length_along_wind=None, pressure=101325.0, cp=1006.0):
    """Convection coefficient of a whole roof, natural and forced mixed (Clear, Gartland & Winkelmann).

    Parameters
    ----------
    T_surface, T_air : float or array [K]
    wind_speed : float or array [m/s]
        Wind at roof height.
    perimeter : float [m]
    area : float [m2]
    roughness_multiplier : float [-]
        R_f of the forced part, as in ROUGHNESS_MULTIPLIERS.
    length_along_wind : float, optional [m]
        Fetch of the wind over the roof; default sqrt(area) (wind direction not known).
    pressure : float [Pa]
    cp : float [J/(kg.K)]

    Returns
    -------
    h_c : float or array [W/(m2.K)]

    Notes
    -----
    h = eta h_n + R_f h_f with
    h_n = (k/L_n) 0.15 Ra^(1/3) when the roof is warmer than the air (unstable), (k/L_n) 0.27 Ra^(1/4)
    when colder (stable), on the length L_n = A/P;
    h_f = (k/L_f) 0.037 Re^(4/5) Pr^(1/3), the turbulent flat plate's mean over the fetch L_f;
    eta = ln(1 + Gr/Re^2) / (1 + ln(1 + Gr/Re^2)), which gives natural convection its full weight in
    still air and fades it as the wind takes over. Air properties at the film temperature, ideal gas,
    beta = 1/T_film. Fitted on the measured convection of whole low-slope roofs; applied to pitched
    roofs with the horizontal-surface natural part, which on a 6/12 roof errs a few per cent high
    in still air and not at all once the wind dominates.

    References
    ----------
    Clear, R. D., Gartland, L. and Winkelmann, F. C. (2003). An empirical correlation for the outside
    convective air-film coefficient for horizontal roofs. Energy and Buildings 35(8), 797-811
    (equations from memory).

    Examples
    --------
    Independent calculation from the equations (no worked example at hand): a 10 m x 10 m roof,
    R_f = 1.67, 30 K above 300 K air, 3 m/s: film 315 K, nu = 1.711e-5 m2/s, Re(10 m) = 1.75e6,
    h_f = 8.92, R_f h_f = 14.89; Ra(2.5 m) = 3.51e10, h_n = 5.38; Gr/Re^2 = 0.0162, eta = 0.016;
    h = 15.0 W/(m2.K). In still air h = h_n.

    >>> round(exterior_convection_clear(330.0, 300.0, 3.0, 40.0, 100.0, 1.67), 1)
    15.0
    >>> round(exterior_convection_clear(330.0, 300.0, 0.0, 40.0, 100.0, 1.67), 2)
    5.38
    """
    from ducts.air_transport import conductivity_sutherland, viscosity_sutherland

    Ts = np.asarray(T_surface, dtype=float)
    Ta = np.asarray(T_air, dtype=float)
    v = np.asarray(wind_speed, dtype=float)
    if np.any(v < 0):
        raise ValueError(f"wind speed {v} m/s must not be negative")
    Tf = 0.5 * (Ts + Ta)
    mu = viscosity_sutherland(Tf)
    k = conductivity_sutherland(Tf)
    rho = pressure / (287.055 * Tf)
    nu = mu / rho
    Pr = cp * mu / k
    dT = Ts - Ta
    mag = np.sqrt(dT**2 + _DT_FLOOR**2)
    L_n = area / perimeter
    Gr = G * mag * L_n**3 / (Tf * nu**2)
    Ra = Gr * Pr
    h_n = np.where(dT > 0, 0.15 * Ra ** (1.0 / 3.0), 0.27 * Ra**0.25) * k / L_n
    L_f = np.sqrt(area) if length_along_wind is None else length_along_wind
    Re = v * L_f / nu
    h_f = 0.037 * Re**0.8 * Pr ** (1.0 / 3.0) * k / L_f
    with np.errstate(divide="ignore", over="ignore"):
        ln = np.log1p(np.where(Re > 0, Gr / np.where(Re > 0, Re**2, 1.0), np.inf))
    eta = 1.0 - 1.0 / (1.0 + ln)  # ln/(1 + ln), written to give 1 in still air
    h = eta * h_n + roughness_multiplier * h_f
    return scalar_or_array(h)


# The registry through which a case selects its roof's exterior convection. Every adapter takes the
# same arguments: T_surface, T_air [K], wind [m/s at roof height], tilt [rad], perimeter [m], area [m2]
# of one roof plane, and its roughness multiplier R_f [-]. The wind's direction is not known at a
# design condition, so each plane is taken as windward half the time: the mean of the windward and
# leeward coefficients where a model distinguishes them.
def _clear(T_s, T_a, wind, tilt, perimeter, area, R_f):
    return exterior_convection_clear(T_s, T_a, wind, perimeter, area, R_f)


def _tarp(T_s, T_a, wind, tilt, perimeter, area, R_f):
    return exterior_convection_tarp(T_s, T_a, np.cos(tilt), wind, perimeter, area, R_f, wind_factor=0.75)


def _yazdanian_klems(T_s, T_a, wind, tilt, perimeter, area, R_f):
    return 0.5 * (exterior_convection_yazdanian_klems(T_s, T_a, wind, True)
                  + exterior_convection_yazdanian_klems(T_s, T_a, wind, False))


def _watmuff(T_s, T_a, wind, tilt, perimeter, area, R_f):
    return exterior_convection_watmuff(wind) + 0.0 * np.asarray(T_s, dtype=float)


EXTERIOR_CONVECTION = {
    "clear-gartland-winkelmann": _clear,
    "walton-tarp": _tarp,
    "yazdanian-klems": _yazdanian_klems,
    "watmuff": _watmuff,
}
# Clear et al. is the one of these fitted on measured whole roofs, and it carries a roof's size
# (boundary layer over its length), its roughness, and the mixing of natural and forced convection.
DEFAULT_EXTERIOR_CONVECTION = "clear-gartland-winkelmann"
