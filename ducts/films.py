"""Film coefficients of a duct: forced convection inside, natural convection outside."""

from __future__ import annotations

import numpy as np
from scipy.constants import g as G  # m/s2, standard gravity

from ducts.arrays import scalar_or_array

from .air_transport import conductivity_sutherland, viscosity_sutherland

R_AIR = 287.055  # J/(kg.K), dry air


def friction_factor_petukhov(Re):
    """Darcy friction factor of a smooth tube in turbulent flow.

    Parameters
    ----------
    Re : float or array [-]
        Reynolds number, 3,000 <= Re <= 5e6.

    Returns
    -------
    f : float or array [-]

    References
    ----------
    Petukhov (1970); Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (8.21).
    Colebrook, C. F. (1939). Turbulent flow in pipes. J. Inst. Civil Engineers 11, 133-156: for a
    smooth pipe 1/sqrt(f) = -2 log10(2.51/(Re sqrt(f))), the Moody chart's smooth-pipe line.

    Examples
    --------
    At Re = 1e5 Colebrook's smooth-pipe equation, solved by repeated substitution, gives
    f = 0.01799 (the Moody chart reads 0.018):

    >>> round(friction_factor_petukhov(1e5), 4)
    0.018
    """
    Re = np.asarray(Re, dtype=float)
    f = (0.790 * np.log(Re) - 1.64) ** -2
    return scalar_or_array(f)


def nusselt_gnielinski(Re, Pr):
    """Nusselt number of fully developed turbulent flow in a tube (Gnielinski).

    Parameters
    ----------
    Re : float or array [-]
        Reynolds number, 3,000-5e6.
    Pr : float or array [-]
        Prandtl number, 0.5-2,000.

    Returns
    -------
    Nu : float or array [-]

    References
    ----------
    Gnielinski, V. (1976). Int. Chem. Eng. 16, 359-368; Incropera et al., Fundamentals of Heat and
    Mass Transfer (6th ed.), eq. (8.62).

    Examples
    --------
    Re = 1e5, Pr = 0.707 (air at 300 K, Incropera Table A.4). By hand: f = 0.01799 (Colebrook,
    smooth), f/8 = 0.002249, numerator 0.002249 x 99,000 x 0.707 = 157.4, denominator
    1 + 12.7 x 0.04742 x (0.707^(2/3) - 1) = 0.8757, Nu = 179.8. Dittus-Boelter, eq. (8.60),
    gives 200, inside the 25 % Incropera quotes for it:

    >>> round(nusselt_gnielinski(1e5, 0.707), 1)
    179.8
    """
    Re = np.asarray(Re, dtype=float)
    Pr = np.asarray(Pr, dtype=float)
    f = friction_factor_petukhov(Re)
    Nu = (f / 8.0) * (Re - 1000.0) * Pr / (1.0 + 12.7 * np.sqrt(f / 8.0) * (Pr ** (2.0 / 3.0) - 1.0))
    return scalar_or_array(Nu)


def nusselt_duct(Re, Pr):
    """Nusselt number of duct flow from laminar through turbulent.

    Laminar (Re < 2,300): 3.66, uniform wall temperature; turbulent (Re >= 3,000): Gnielinski;
    linear in Re between the two, so that the solver sees no jump.

    Parameters
    ----------
    Re : float or array [-]
    Pr : float or array [-]

    Returns
    -------
    Nu : float or array [-]

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (8.55) and (8.62).

    Examples
    --------
    Fully developed laminar flow with a uniform wall temperature: Nu = 3.66 (Incropera
    eq. (8.55)); from Re = 3,000 on, Gnielinski's value:

    >>> nusselt_duct(1000.0, 0.71)
    3.66
    >>> nusselt_duct(5000.0, 0.71) == nusselt_gnielinski(5000.0, 0.71)
    True
    """
    Re = np.asarray(Re, dtype=float)
    turb = nusselt_gnielinski(np.maximum(Re, 3000.0), Pr)
    w = np.minimum(np.maximum((Re - 2300.0) / 700.0, 0.0), 1.0)
    Nu = (1.0 - w) * 3.66 + w * turb
    return scalar_or_array(Nu)


def inside_film_coefficient(mass_flow, hydraulic_diameter, flow_area, T_air, cp=1006.0):
    """Forced-convection film coefficient on the inside of a duct.

    Parameters
    ----------
    mass_flow : float or array [kg/s]
        Through one run.
    hydraulic_diameter : float or array [m]
    flow_area : float or array [m2]
    T_air : float or array [K]
    cp : float [J/(kg.K)]

    Returns
    -------
    h_i : float or array [W/(m2.K)]

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eqs. (8.6) and (8.62).

    Examples
    --------
    0.1 kg/s of air at 300 K in a 200 mm round duct. By hand with Incropera's Table A.4
    (mu = 184.6e-7 N.s/m2, k = 0.0263 W/(m.K), Pr = 0.707): Re = 4 m/(pi D mu) = 34,490,
    Gnielinski Nu = 78.6, h = 78.6 x 0.0263 / 0.2 = 10.3 W/(m2.K):

    >>> import math
    >>> round(inside_film_coefficient(0.1, 0.2, math.pi * 0.1**2, 300.0), 1)
    10.3
    """
    mu = viscosity_sutherland(T_air)
    k = conductivity_sutherland(T_air)
    Re = np.asarray(mass_flow, float) * np.asarray(hydraulic_diameter, float) / (np.asarray(flow_area, float) * mu)
    Pr = cp * mu / k
    h = nusselt_duct(Re, Pr) * k / np.asarray(hydraulic_diameter, float)
    return scalar_or_array(h)


def nusselt_churchill_chu_cylinder(Ra, Pr):
    """Average Nusselt number of natural convection from a long horizontal cylinder.

    Parameters
    ----------
    Ra : float or array [-]
        Rayleigh number on the diameter, up to 1e12.
    Pr : float or array [-]

    Returns
    -------
    Nu : float or array [-]

    References
    ----------
    Churchill, S. W. and Chu, H. H. S. (1975). Int. J. Heat Mass Transfer 18, 1049-1053;
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (9.34), and
    Table 9.1 (Morgan's Nu = C Ra^n, C = 0.48 and n = 1/4 for Ra from 1e4 to 1e7).

    Examples
    --------
    Ra = 1e6, Pr = 0.71. By hand: 1e6^(1/6) = 10, (0.559/0.71)^(9/16) = 0.874,
    1.874^(8/27) = 1.205, Nu = (0.60 + 0.387 x 10 / 1.205)^2 = 14.5. Morgan's fit gives
    0.48 x 1e6^(1/4) = 15.2, 5 % away:

    >>> round(nusselt_churchill_chu_cylinder(1e6, 0.71), 1)
    14.5
    """
    Ra = np.asarray(Ra, dtype=float)
    Pr = np.asarray(Pr, dtype=float)
    Nu = (0.60 + 0.387 * Ra ** (1.0 / 6.0) / (1.0 + (0.559 / Pr) ** (9.0 / 16.0)) ** (8.0 / 27.0)) ** 2
    return scalar_or_array(Nu)


def outside_film_coefficient(T_surface, T_air, diameter, pressure=101325.0, cp=1006.0):
    """Natural-convection film coefficient on the outside of a horizontal duct in still air.

    Parameters
    ----------
    T_surface : float or array [K]
    T_air : float or array [K]
    diameter : float or array [m]
        Outer; for a rectangular duct the perimeter over pi.
    pressure : float [Pa]
    cp : float [J/(kg.K)]

    Returns
    -------
    h_c : float or array [W/(m2.K)]

    Notes
    -----
    Properties at the film temperature; ideal-gas density; beta = 1/T_film.

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (9.34).
    Holman, J. P., Heat Transfer (10th ed.), Table 7-2: horizontal cylinder in air, laminar,
    h = 1.32 (dT/d)^(1/4) (coefficient from memory).

    Examples
    --------
    A 200 mm duct 20 K warmer than the air; Holman's simplified equation gives
    1.32 x (20/0.2)^(1/4) = 4.17 W/(m2.K):

    >>> round(outside_film_coefficient(320.0, 300.0, 0.2), 1)
    4.1
    """
    Ts = np.asarray(T_surface, dtype=float)
    Ta = np.asarray(T_air, dtype=float)
    Tf = 0.5 * (Ts + Ta)
    mu = viscosity_sutherland(Tf)
    k = conductivity_sutherland(Tf)
    rho = pressure / (R_AIR * Tf)
    nu = mu / rho
    alpha = k / (rho * cp)
    D = np.asarray(diameter, dtype=float)
    dT = np.sqrt((Ts - Ta) ** 2 + 1e-6)
    Ra = G * (1.0 / Tf) * dT * D**3 / (nu * alpha)
    h = nusselt_churchill_chu_cylinder(Ra, nu / alpha) * k / D
    return scalar_or_array(h)
