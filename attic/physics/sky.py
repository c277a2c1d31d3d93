"""Clear-sky long-wave radiation: effective sky emissivity and temperature."""

from __future__ import annotations

import numpy as np

from attic.physics.arrays import scalar_or_array

# dew points (°C) over which Berdahl & Martin fitted their correlation (range from memory)
DEWPOINT_RANGE_C = (-20.0, 30.0)


def sky_emissivity_berdahl_martin(T_dewpoint, solar_hour=None, pressure=None):
    """Clear-sky emissivity from the surface dew point (Berdahl & Martin).

    Parameters
    ----------
    T_dewpoint : float or array [K]
        Dew point of the air near the ground.
    solar_hour : float or array, optional [h]
        Hour of the day (0-24). Adds the small diurnal correction 0.013 cos(2 pi t / 24).
    pressure : float or array, optional [Pa]
        Station pressure. Adds the altitude correction 0.00012 (P - 1000 mbar).

    Returns
    -------
    emissivity : float or array [-]
        Between 0 and 1.

    Notes
    -----
    Fitted to US clear-sky measurements for dew points from about -20 °C to 30 °C (range from
    memory). The quadratic has its minimum at -38 °C and turns upward below it, so a colder dew
    point would read as a warmer sky; dew points outside the fitted range are therefore held at
    its edges (DEWPOINT_RANGE_C). Below -20 °C this errs toward a slightly warm sky (about 0.02
    in emissivity at -30 °C), i.e. a little less night cooling of the roof.

    References
    ----------
    Berdahl, P. and Martin, M. (1984). Emissivity of clear skies. Solar Energy 32(5), 663-664,
    eq. (1) and the corrections that follow it.

    Examples
    --------
    By hand from the published coefficients at a 20 °C dew point (t = 0.20):
    0.711 + 0.56 x 0.20 + 0.73 x 0.20^2 = 0.8522; at midnight add 0.013; at 900 mbar
    add 0.00012 x (900 - 1000) = -0.012:

    >>> round(sky_emissivity_berdahl_martin(293.15), 4)
    0.8522
    >>> round(sky_emissivity_berdahl_martin(293.15, solar_hour=0.0), 4)
    0.8652
    >>> round(sky_emissivity_berdahl_martin(293.15, pressure=90000.0), 4)
    0.8402
    """
    lo, hi = DEWPOINT_RANGE_C
    t = np.clip(np.asarray(T_dewpoint, dtype=float) - 273.15, lo, hi) / 100.0
    eps = 0.711 + 0.56 * t + 0.73 * t**2
    if solar_hour is not None:
        eps = eps + 0.013 * np.cos(2.0 * np.pi * np.asarray(solar_hour, dtype=float) / 24.0)
    if pressure is not None:
        eps = eps + 0.00012 * (np.asarray(pressure, dtype=float) / 100.0 - 1000.0)
    eps = np.clip(eps, 0.0, 1.0)
    return scalar_or_array(eps)


def sky_temperature_from_emissivity(emissivity, T_air):
    """Effective sky temperature of a sky with the given emissivity.

    Parameters
    ----------
    emissivity : float or array [-]
    T_air : float or array [K]
        Screen-level air temperature.

    Returns
    -------
    T_sky : float or array [K]

    References
    ----------
    Definition: sigma T_sky^4 = eps_sky sigma T_air^4, e.g. ASHRAE Handbook-Fundamentals (2017),
    ch. 4 (sky radiation), and Berdahl & Martin (1984).

    Examples
    --------
    A black sky is at the air temperature (limiting case); by hand, 0.8522^(1/4) x 303.15 K
    = 0.9608 x 303.15 = 291.27 K:

    >>> sky_temperature_from_emissivity(1.0, 303.15)
    303.15
    >>> round(sky_temperature_from_emissivity(0.8522, 303.15), 2)
    291.27
    """
    T = np.asarray(emissivity, dtype=float) ** 0.25 * np.asarray(T_air, dtype=float)
    return scalar_or_array(T)


def sky_temperature_swinbank(T_air):
    """Clear-sky temperature from the air temperature alone (Swinbank).

    Parameters
    ----------
    T_air : float or array [K]

    Returns
    -------
    T_sky : float or array [K]

    References
    ----------
    Swinbank, W. C. (1963). Long-wave radiation from clear skies. Quarterly Journal of the Royal
    Meteorological Society 89, 339-348: T_sky = 0.0552 T_air^1.5 (K), as quoted in Duffie &
    Beckman, Solar Engineering of Thermal Processes (4th ed.), eq. (3.9.1).

    Examples
    --------
    By hand: 0.0552 x 300^1.5 = 0.0552 x 5196.2 = 286.83 K:

    >>> round(sky_temperature_swinbank(300.0), 2)
    286.83
    """
    T = 0.0552 * np.asarray(T_air, dtype=float) ** 1.5
    return scalar_or_array(T)


def view_factor_to_sky(tilt):
    """View factor from a tilted plane to the sky dome.

    Parameters
    ----------
    tilt : float or array [rad]
        0 = horizontal facing up.

    Returns
    -------
    F_sky : float or array [-]
        The ground gets 1 - F_sky.

    References
    ----------
    Duffie & Beckman, Solar Engineering of Thermal Processes (4th ed.), eq. (2.15.1)-(2.15.2).

    Examples
    --------
    A horizontal roof sees only sky, a wall half sky (limiting cases); a 6/12 roof, by hand,
    (1 + cos 26.57 deg)/2 = (1 + 0.8944)/2 = 0.9472:

    >>> import math
    >>> view_factor_to_sky(0.0), view_factor_to_sky(math.pi / 2)
    (1.0, 0.5)
    >>> round(view_factor_to_sky(math.atan(0.5)), 4)
    0.9472
    """
    F = (1.0 + np.cos(np.asarray(tilt, dtype=float))) / 2.0
    return scalar_or_array(F)
