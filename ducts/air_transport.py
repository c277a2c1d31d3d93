"""Transport properties of air for film coefficients: viscosity and thermal conductivity.

Closed-form Sutherland laws, cheap enough to evaluate inside the solver's iterations; the tests
check them against CoolProp's humid-air transport properties.
"""

from __future__ import annotations

import numpy as np

from ducts.arrays import scalar_or_array


def viscosity_sutherland(T):
    """Dynamic viscosity of air (Sutherland's law).

    Parameters
    ----------
    T : float or array [K]

    Returns
    -------
    mu : float or array [Pa.s]

    Notes
    -----
    mu = mu0 (T/T0)^1.5 (T0 + S)/(T + S), mu0 = 1.716e-5 Pa.s, T0 = 273 K, S = 111 K;
    within 2 % from 170 K to 1,900 K.

    References
    ----------
    White, F. M. (2006). Viscous Fluid Flow (3rd ed.), eq. (1-36) and Table 1-2.
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), Table A.4 (air at 1 atm).

    Examples
    --------
    Incropera's Table A.4 lists 184.6e-7 N.s/m2 at 300 K (value from memory); the law is
    within 0.1 % of it:

    >>> abs(viscosity_sutherland(300.0) / 184.6e-7 - 1.0) < 0.001
    True
    """
    T = np.asarray(T, dtype=float)
    mu = 1.716e-5 * (T / 273.0) ** 1.5 * (273.0 + 111.0) / (T + 111.0)
    return scalar_or_array(mu)


def conductivity_sutherland(T):
    """Thermal conductivity of air (Sutherland form).

    Parameters
    ----------
    T : float or array [K]

    Returns
    -------
    k : float or array [W/(m.K)]

    Notes
    -----
    k = k0 (T/T0)^1.5 (T0 + S)/(T + S), k0 = 0.0241 W/(m.K), T0 = 273 K, S = 194 K;
    within 2 % from 160 K to 2,000 K.

    References
    ----------
    White, F. M. (2006). Viscous Fluid Flow (3rd ed.), eq. (1-44) and Table 1-3.
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), Table A.4 (air at 1 atm).

    Examples
    --------
    Incropera's Table A.4 lists 26.3e-3 W/(m.K) at 300 K (value from memory); the law is within
    0.5 % of it:

    >>> abs(conductivity_sutherland(300.0) / 26.3e-3 - 1.0) < 0.005
    True
    """
    T = np.asarray(T, dtype=float)
    k = 0.0241 * (T / 273.0) ** 1.5 * (273.0 + 194.0) / (T + 194.0)
    return scalar_or_array(k)
