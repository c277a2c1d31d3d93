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
    """Day of the year (1-365) of a month and day in a non-leap year."""
    month = np.asarray(month, dtype=int)
    day = np.asarray(day, dtype=int)
    starts = np.cumsum((0, *DAYS_IN_MONTH[:-1]))
    doy = starts[month - 1] + day
    return doy if doy.ndim else int(doy)


def solar_position_at_solar_time(latitude, doy, solar_hour, pressure=101325.0, temperature=20.0):
    """Apparent solar zenith and azimuth at an apparent (true) solar time.

    Parameters
    ----------
    latitude : float, degrees north
    doy : int or array, day of the year (1-365)
    solar_hour : float or array, h of apparent solar time (12 = solar noon)
    pressure : float, Pa (for refraction)
    temperature : float, °C (for refraction)

    Returns
    -------
    apparent_zenith, azimuth : arrays, degrees (azimuth clockwise from north)

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
    latitude : float, degrees north
    doy : int or array, day of the year
    solar_hour : float or array, h of apparent solar time
    tilts : sequence of float, degrees from horizontal, one per plane
    azimuths : sequence of float, degrees clockwise from north that each plane faces
    pressure : float, Pa
    elevation : float, m
    linke_turbidity : float, dimensionless (about 2 in clean dry air, 3-4 in humid summer air)
    albedo : float, dimensionless ground reflectance

    Returns
    -------
    dict with
        ``poa`` : array (n_planes, n_times), W/m2, global irradiance on each plane
        ``ghi``, ``dni``, ``dhi`` : arrays (n_times,), W/m2
        ``zenith``, ``azimuth`` : arrays (n_times,), degrees

    References
    ----------
    Ineichen, P. and Perez, R. (2002). A new airmass independent formulation for the Linke
    turbidity coefficient. Solar Energy 73(3), 151-157 (pvlib.clearsky.ineichen).
    Hay, J. E. and Davies, J. A. (1980). Calculations of the solar radiation incident on an
    inclined surface. Proc. First Canadian Solar Radiation Data Workshop (pvlib.irradiance).
    Kasten, F. and Young, A. T. (1989). Revised optical air mass tables. Applied Optics 28(22).
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
    times : sequence of naive datetimes in local standard time
    utc_offset_h : float, h, the standard time zone
    latitude, longitude : float, degrees (east positive)
    ghi : array, W/m2; dni, dhi : arrays, W/m2, or None to split ghi with the Erbs model
    tilts, azimuths : degrees, one per plane
    pressure : Pa; elevation : m; albedo : dimensionless

    Returns
    -------
    poa : array (n_planes, n), W/m2

    References
    ----------
    Reda & Andreas (2004) SPA; Erbs, D. G., Klein, S. A. and Duffie, J. A. (1982). Estimation of the
    diffuse radiation fraction for hourly, daily and monthly-average global radiation. Solar Energy 28(4);
    Hay & Davies (1980). All through pvlib.
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
