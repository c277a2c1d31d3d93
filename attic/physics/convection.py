"""Convection coefficients at the roof's outer surface and on surfaces inside the attic."""

from __future__ import annotations

import numpy as np

from attic.physics.arrays import scalar_or_array

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

    Raises
    ------
    ValueError
        For a negative wind speed.

    Notes
    -----
    h = 2.8 + 3.0 V, V in m/s, for 0-7 m/s. It is McAdams' flat-plate data with the radiation
    part removed, which is why it is used here: long-wave exchange is modelled separately.

    References
    ----------
    Watmuff, J. H., Charters, W. W. S. and Proctor, D. (1977). Solar and wind induced external
    coefficients for solar collectors. COMPLES 2, 56; as quoted in Duffie & Beckman, Solar
    Engineering of Thermal Processes (4th ed.), sect. 3.15 (equation number from memory: 3.15.2).

    Examples
    --------
    By hand from the published coefficients: 2.8 + 3.0 x 3 m/s = 11.8 W/(m2.K).

    >>> round(exterior_convection_watmuff(3.0), 6)
    11.8
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
    T_surface : float or array [K]
    T_air : float or array [K]
    normal_up : float or array [-]
        Upward component of the surface's outward unit normal (the one pointing into the air):
        +1 a floor facing up, -1 a ceiling facing down, -cos(tilt) the underside of a roof deck
        of that tilt, 0 a wall.

    Returns
    -------
    h_c : float or array [W/(m2.K)]

    Notes
    -----
    Unstable (buoyant air leaves the surface: a hot surface facing up or a cold one facing down):
    h = 9.482 |dT|^(1/3) / (7.238 - |cos S|). Stable (the reverse):
    h = 1.810 |dT|^(1/3) / (1.382 + |cos S|). Both give 1.31 |dT|^(1/3) for a vertical wall.

    References
    ----------
    Walton, G. N. (1983). Thermal Analysis Research Program reference manual. NBSIR 83-2655,
    National Bureau of Standards; the "TARP" natural-convection algorithm as restated in the
    EnergyPlus Engineering Reference, "Detailed natural convection algorithm".
    Holman, J. P., Heat Transfer (10th ed.), Table 7-2, simplified free-convection equations for
    air: vertical plane, turbulent, h = 1.31 dT^(1/3); horizontal heated plate facing up,
    turbulent, h = 1.52 dT^(1/3) (coefficients from memory).

    Examples
    --------
    A wall 10 K warmer than the air; Holman's vertical-plane value is 1.31 x 10^(1/3) = 2.82:

    >>> round(natural_convection_walton(310.0, 300.0, 0.0), 2)
    2.82

    A floor 10 K warmer than the air, facing up; Holman's heated plate facing up is
    1.52 x 10^(1/3) = 3.27:

    >>> round(natural_convection_walton(310.0, 300.0, 1.0), 2)
    3.27

    The same floor colder than the air is stable; by hand from that branch,
    1.810 x 10^(1/3) / (1.382 + 1) = 1.64:

    >>> round(natural_convection_walton(290.0, 300.0, 1.0), 2)
    1.64
    """
    dT = np.asarray(T_surface, dtype=float) - np.asarray(T_air, dtype=float)
    n = np.asarray(normal_up, dtype=float)
    mag = np.sqrt(dT**2 + _DT_FLOOR**2) ** (1.0 / 3.0)
    cos_s = np.abs(n)
    unstable = dT * n > 0
    h = np.where(unstable, 9.482 * mag / (7.238 - cos_s), 1.810 * mag / (1.382 + cos_s))
    return scalar_or_array(h)
