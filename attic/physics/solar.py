"""Sun on the roof planes: solar position at a solar time, clear-sky irradiance, transposition.

pvlib does the published work here (NREL SPA, the Ineichen-Perez clear-sky model, the Hay-Davies
transposition); this module only converts a case's solar time into what pvlib expects. pvlib
(and the pandas it brings) is imported on first use.
"""

from __future__ import annotations

import numpy as np

REFERENCE_YEAR = 2025  # a non-leap year; design days are given as month and day


DAYS_IN_MONTH = (31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31)  # a non-leap year


def day_of_year(month, day):
    """Day of the year (1-365) of a month and day in a non-leap year.

    Parameters
    ----------
    month : int or array [-]
        1-12.
    day : int or array [-]
        Day of the month.

    Returns
    -------
    doy : int or array [-]

    References
    ----------
    Duffie & Beckman, Solar Engineering of Thermal Processes (4th ed.), Table 1.6.1: n = i for
    January, 181 + i for July, 334 + i for December (value from memory).

    Examples
    --------
    >>> day_of_year(7, 21)
    202
    >>> [int(n) for n in day_of_year([1, 12], [1, 31])]
    [1, 365]
    """
    month = np.asarray(month, dtype=int)
    day = np.asarray(day, dtype=int)
    starts = np.cumsum((0, *DAYS_IN_MONTH[:-1]))
    doy = starts[month - 1] + day
    return doy if doy.ndim else int(doy)


def solar_position_at_solar_time(latitude, doy, solar_hour, pressure=101325.0, temperature=20.0):
    """Apparent solar zenith and azimuth at an apparent (true) solar time.

    Parameters
    ----------
    latitude : float [deg]
        North positive.
    doy : int or array [-]
        Day of the year (1-365).
    solar_hour : float or array [h]
        Apparent solar time (12 = solar noon).
    pressure : float [Pa]
        For refraction.
    temperature : float [degC]
        For refraction.

    Returns
    -------
    apparent_zenith : array [deg]
    azimuth : array [deg]
        Clockwise from north.

    Notes
    -----
    Solar time is independent of longitude: the position is computed with the NREL SPA at
    longitude 0 for the universal time at which the apparent solar time there equals
    `solar_hour`, i.e. UT = AST - EoT, with the equation of time of Spencer (1971).

    References
    ----------
    Reda, I. and Andreas, A. (2004). Solar position algorithm for solar radiation applications.
    Solar Energy 76(5), 577-589 (via pvlib.solarposition.spa_python).
    Spencer, J. W. (1971). Fourier series representation of the position of the sun. Search 2(5).

    Examples
    --------
    At solar noon the sun is due south of a northern site and its zenith angle is the latitude
    less the declination; at the June solstice the declination is the obliquity of the
    ecliptic, 23.44 degrees, so at 40 degrees north the zenith is 40 - 23.44 = 16.56 degrees:

    >>> zen, az = solar_position_at_solar_time(40.0, 172, 12.0)
    >>> round(float(zen[0]), 1), round(float(az[0]))
    (16.6, 180)
    """
    import pandas as pd
    import pvlib

    doy = np.atleast_1d(np.asarray(doy, dtype=float))
    hour = np.atleast_1d(np.asarray(solar_hour, dtype=float))
    doy, hour = np.broadcast_arrays(doy, hour)
    eot_min = pvlib.solarposition.equation_of_time_spencer71(doy)
    ut_hours = hour - eot_min / 60.0
    start = pd.Timestamp(f"{REFERENCE_YEAR}-01-01", tz="UTC")
    times = pd.DatetimeIndex(start + pd.to_timedelta(doy - 1, unit="D") + pd.to_timedelta(ut_hours, unit="h"))
    pos = pvlib.solarposition.spa_python(
        times, latitude, 0.0, pressure=pressure, temperature=temperature, how="numpy", numthreads=1
    )
    return pos["apparent_zenith"].to_numpy(), pos["azimuth"].to_numpy()


def clear_sky_on_planes(latitude, doy, solar_hour, tilts, azimuths, pressure=101325.0, elevation=0.0,
                        linke_turbidity=3.0, albedo=0.2):
    """Clear-sky irradiance on each roof plane.

    Parameters
    ----------
    latitude : float [deg]
        North positive.
    doy : int or array [-]
        Day of the year.
    solar_hour : float or array [h]
        Apparent solar time.
    tilts : sequence of float [deg]
        From horizontal, one per plane.
    azimuths : sequence of float [deg]
        Clockwise from north, the direction each plane faces.
    pressure : float [Pa]
    elevation : float [m]
    linke_turbidity : float [-]
        About 2 in clean dry air, 3-4 in humid summer air.
    albedo : float [-]
        Ground reflectance.

    Returns
    -------
    dict
        ``poa`` : array (n_planes, n_times) [W/m2], global irradiance on each plane;
        ``ghi``, ``dni``, ``dhi`` : arrays (n_times,) [W/m2];
        ``zenith``, ``azimuth`` : arrays (n_times,) [deg].

    References
    ----------
    Ineichen, P. and Perez, R. (2002). A new airmass independent formulation for the Linke
    turbidity coefficient. Solar Energy 73(3), 151-157 (pvlib.clearsky.ineichen).
    Hay, J. E. and Davies, J. A. (1980). Calculations of the solar radiation incident on an
    inclined surface. Proc. First Canadian Solar Radiation Data Workshop (pvlib.irradiance).
    Kasten, F. and Young, A. T. (1989). Revised optical air mass tables. Applied Optics 28(22).

    Examples
    --------
    Definitions that any correct result obeys (Duffie & Beckman, 4th ed., sect. 2.15): a
    horizontal plane receives the global horizontal irradiance, which is the beam on the
    horizontal plus the diffuse; and at an equinox noon a south plane tilted at the latitude
    faces the sun, so it receives at least the whole beam:

    >>> import numpy as np
    >>> r = clear_sky_on_planes(40.0, 80, [12.0], [0.0, 40.0], [180.0, 180.0])
    >>> bool(np.isclose(r["poa"][0, 0], r["ghi"][0]))
    True
    >>> bool(np.isclose(r["ghi"][0], r["dni"][0] * np.cos(np.radians(r["zenith"][0])) + r["dhi"][0]))
    True
    >>> bool(r["poa"][1, 0] > r["dni"][0] > r["ghi"][0])
    True

    No sun before sunrise:

    >>> float(clear_sky_on_planes(40.0, 80, [3.0], [0.0], [180.0])["poa"][0, 0])
    0.0
    """
    import pvlib

    zen, az = solar_position_at_solar_time(latitude, doy, solar_hour, pressure=pressure)
    doy_b = np.broadcast_to(np.atleast_1d(np.asarray(doy, dtype=float)), zen.shape)
    dni_extra = pvlib.irradiance.get_extra_radiation(doy_b)
    am_rel = pvlib.atmosphere.get_relative_airmass(zen)
    am_abs = pvlib.atmosphere.get_absolute_airmass(am_rel, pressure)
    with np.errstate(divide="ignore", invalid="ignore"):  # night hours give inf/NaN, zeroed below
        cs = pvlib.clearsky.ineichen(zen, am_abs, linke_turbidity, altitude=elevation, dni_extra=dni_extra)
    up = zen < 90.0
    ghi = np.where(up, np.nan_to_num(np.asarray(cs["ghi"], dtype=float)), 0.0)
    dni = np.where(up, np.nan_to_num(np.asarray(cs["dni"], dtype=float)), 0.0)
    dhi = np.where(up, np.nan_to_num(np.asarray(cs["dhi"], dtype=float)), 0.0)
    poa = []
    for tilt, surf_az in zip(tilts, azimuths, strict=True):
        tot = pvlib.irradiance.get_total_irradiance(
            tilt, surf_az, zen, az, dni, ghi, dhi, dni_extra=dni_extra, albedo=albedo, model="haydavies"
        )
        poa.append(np.where(up, np.nan_to_num(np.asarray(tot["poa_global"], dtype=float)), 0.0))
    return {"poa": np.array(poa), "ghi": ghi, "dni": dni, "dhi": dhi, "zenith": zen, "azimuth": az}


def weather_on_planes(times, utc_offset_h, latitude, longitude, ghi, tilts, azimuths, dni=None, dhi=None,
                      pressure=101325.0, elevation=0.0, albedo=0.2):
    """Irradiance on each roof plane from measured global horizontal (and optionally beam and diffuse).

    Parameters
    ----------
    times : sequence of datetime
        Naive, in local standard time.
    utc_offset_h : float [h]
        The standard time zone.
    latitude : float [deg]
        North positive.
    longitude : float [deg]
        East positive.
    ghi : array [W/m2]
        Measured global horizontal irradiance.
    tilts : sequence of float [deg]
        One per plane.
    azimuths : sequence of float [deg]
        Clockwise from north, one per plane.
    dni : array [W/m2], optional
        Beam normal; None (with dhi) to split ghi with the Erbs model.
    dhi : array [W/m2], optional
        Diffuse horizontal.
    pressure : float [Pa]
    elevation : float [m]
    albedo : float [-]

    Returns
    -------
    poa : array (n_planes, n) [W/m2]

    References
    ----------
    Reda & Andreas (2004) SPA; Erbs, D. G., Klein, S. A. and Duffie, J. A. (1982). Estimation of the
    diffuse radiation fraction for hourly, daily and monthly-average global radiation. Solar Energy 28(4);
    Hay & Davies (1980). All through pvlib.

    Examples
    --------
    A horizontal plane gets back the measured global horizontal irradiance, however the model
    splits it into beam and diffuse (definition; Duffie & Beckman, 4th ed., sect. 2.15), and
    nothing reaches any plane at night. An invented site:

    >>> import datetime as dt
    >>> times = [dt.datetime(2025, 6, 21, 12), dt.datetime(2025, 6, 21, 23)]
    >>> poa = weather_on_planes(times, -6.0, 32.0, -90.0, [900.0, 0.0], [0.0, 90.0], [180.0, 180.0])
    >>> [round(float(x)) for x in poa[0]], float(poa[1, 1])
    ([900, 0], 0.0)
    """
    import datetime as dt

    import pandas as pd
    import pvlib

    tz = dt.timezone(dt.timedelta(hours=float(utc_offset_h)))
    idx = pd.DatetimeIndex(list(times)).tz_localize(tz)
    pos = pvlib.solarposition.get_solarposition(idx, latitude, longitude, altitude=elevation, pressure=pressure)
    zen = pos["apparent_zenith"].to_numpy()
    az = pos["azimuth"].to_numpy()
    ghi = np.asarray(ghi, dtype=float)
    up = zen < 90.0
    if dni is None or dhi is None:
        with np.errstate(divide="ignore", invalid="ignore"):
            split = pvlib.irradiance.erbs(ghi, pos["zenith"].to_numpy(), idx)
        dni = np.nan_to_num(np.asarray(split["dni"], dtype=float))
        dhi = np.nan_to_num(np.asarray(split["dhi"], dtype=float))
    dni_extra = pvlib.irradiance.get_extra_radiation(idx).to_numpy()
    poa = []
    for tilt, surf_az in zip(tilts, azimuths, strict=True):
        with np.errstate(divide="ignore", invalid="ignore"):
            tot = pvlib.irradiance.get_total_irradiance(tilt, surf_az, zen, az, np.asarray(dni), ghi, np.asarray(dhi),
                                                        dni_extra=dni_extra, albedo=albedo, model="haydavies")
        poa.append(np.where(up, np.nan_to_num(np.asarray(tot["poa_global"], dtype=float)), 0.0))
    return np.array(poa)
