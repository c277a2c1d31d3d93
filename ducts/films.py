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
    Re : float or array, dimensionless, 3,000 <= Re <= 5e6

    Returns
    -------
    f : float or array, dimensionless

    References
    ----------
    Petukhov (1970); Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (8.21).
    """
    Re = np.asarray(Re, dtype=float)
    f = (0.790 * np.log(Re) - 1.64) ** -2
    return scalar_or_array(f)


def nusselt_gnielinski(Re, Pr):
    """Nusselt number of fully developed turbulent flow in a tube (Gnielinski).

    Parameters
    ----------
    Re : float or array, dimensionless, 3,000-5e6
    Pr : float or array, dimensionless, 0.5-2,000

    Returns
    -------
    Nu : float or array, dimensionless

    References
    ----------
    Gnielinski, V. (1976). Int. Chem. Eng. 16, 359-368; Incropera et al., Fundamentals of Heat and
    Mass Transfer (6th ed.), eq. (8.62).
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

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (8.55) and (8.62).
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
    mass_flow : float or array, kg/s through one run
    hydraulic_diameter : float or array, m
    flow_area : float or array, m2
    T_air : float or array, K
    cp : float, J/(kg.K)

    Returns
    -------
    h_i : float or array, W/(m2.K)

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eqs. (8.6) and (8.62).
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
    Ra : float or array, dimensionless Rayleigh number on the diameter, up to 1e12
    Pr : float or array, dimensionless

    Returns
    -------
    Nu : float or array, dimensionless

    References
    ----------
    Churchill, S. W. and Chu, H. H. S. (1975). Int. J. Heat Mass Transfer 18, 1049-1053;
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (9.34).
    """
    Ra = np.asarray(Ra, dtype=float)
    Pr = np.asarray(Pr, dtype=float)
    Nu = (0.60 + 0.387 * Ra ** (1.0 / 6.0) / (1.0 + (0.559 / Pr) ** (9.0 / 16.0)) ** (8.0 / 27.0)) ** 2
    return scalar_or_array(Nu)


def outside_film_coefficient(T_surface, T_air, diameter, pressure=101325.0, cp=1006.0):
    """Natural-convection film coefficient on the outside of a horizontal duct in still air.

    Parameters
    ----------
    T_surface, T_air : float or array, K
    diameter : float or array, m (outer; for a rectangular duct the perimeter over pi)
    pressure : float, Pa
    cp : float, J/(kg.K)

    Returns
    -------
    h_c : float or array, W/(m2.K)

    Notes
    -----
    Properties at the film temperature; ideal-gas density; beta = 1/T_film.
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
