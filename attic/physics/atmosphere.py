"""Standard atmosphere: barometric pressure from elevation."""

from __future__ import annotations

import numpy as np
from scipy import constants

from attic.physics.arrays import scalar_or_array

G = constants.g  # m/s2, standard gravity (CODATA, exact by definition)
# CODATA 2018 prints 5.670374419e-8; scipy derives 5.6703744191844e-8 from the exact constants. The printed
# value is kept so results stay identical to the published constant.
SIGMA = 5.670374419e-8  # W/(m2.K4), Stefan-Boltzmann constant (CODATA 2018)


def pressure_from_elevation(elevation):
    """Standard-atmosphere barometric pressure at an elevation.

    Parameters
    ----------
    elevation : float or array [m]
        Height above sea level.

    Returns
    -------
    pressure : float or array [Pa]

    Raises
    ------
    ValueError
        Outside -5,000 m to 11,000 m (the troposphere, where the equation holds).

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 1, eq. (3):
    p = 101.325 (1 - 2.25577e-5 Z)^5.2559, p in kPa, Z in m; and its Table 1 (standard
    atmospheric data), which lists 101.325 kPa at sea level and 89.875 kPa at 1,000 m (values
    from memory).

    Examples
    --------
    ASHRAE Table 1 at 1,000 m: 89.875 kPa (the U.S. Standard Atmosphere 1976 gives 89.9 kPa):

    >>> round(pressure_from_elevation(1000.0) / 1000.0, 3)
    89.875
    >>> pressure_from_elevation(0.0)
    101325.0
    """
    z = np.asarray(elevation, dtype=float)
    if np.any(z < -5000.0) or np.any(z > 11000.0):
        raise ValueError(f"elevation {z} m is outside the troposphere (-5,000 to 11,000 m)")
    p = 101.325e3 * (1.0 - 2.25577e-5 * z) ** 5.2559
    return scalar_or_array(p)


# ASHRAE Handbook-Fundamentals (2017) ch. 24, Table 1: boundary-layer exponent a and thickness
# delta (m) by terrain category (values from memory).
TERRAIN = {
    "city": (0.33, 460.0),  # 1: large city centres
    "suburban": (0.22, 370.0),  # 2: urban and suburban areas, wooded areas
    "open": (0.14, 270.0),  # 3: open terrain with scattered obstructions (airports, met stations)
    "water": (0.10, 210.0),  # 4: flat, unobstructed, wind over water
}


def wind_speed_at_height(U_met, height, terrain="suburban", met_height=10.0, met_terrain="open"):
    """Wind speed at a building height from a weather station's reading.

    Parameters
    ----------
    U_met : float or array [m/s]
        Measured at `met_height` over `met_terrain`.
    height : float [m]
        Where the speed is wanted (for a roof: its mean height).
    terrain : str
        Key of TERRAIN around the building.
    met_height : float [m]
        Height of the station's anemometer.
    met_terrain : str
        Key of TERRAIN at the station.

    Returns
    -------
    U : float or array [m/s]

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 24, eq. (4): U_H = U_met (delta_met/H_met)^a_met
    (H/delta)^a, with Table 1 for a and delta.

    Examples
    --------
    At the station's own height and terrain the reading is unchanged (limiting case):

    >>> wind_speed_at_height(4.0, 10.0, terrain="open")
    4.0

    A 4 m/s station reading at a 5 m suburban roof, by hand with Table 1's exponents:
    4 x (270/10)^0.14 x (5/370)^0.22 = 4 x 1.586 x 0.388 = 2.46 m/s.

    >>> round(wind_speed_at_height(4.0, 5.0, terrain="suburban"), 2)
    2.46
    """
    a, d = TERRAIN[terrain]
    am, dm = TERRAIN[met_terrain]
    U = np.asarray(U_met, dtype=float) * (dm / met_height) ** am * (height / d) ** a
    return scalar_or_array(U)
