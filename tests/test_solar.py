import numpy as np
import pytest

from attic.physics.solar import clear_sky_on_planes, day_of_year, solar_position_at_solar_time


def spencer_declination(doy):
    # Spencer (1971), Duffie & Beckman (4th ed.) eq. (1.6.1b), degrees; error under 0.035°
    B = np.radians((doy - 1) * 360.0 / 365.0)
    return np.degrees(0.006918 - 0.399912 * np.cos(B) + 0.070257 * np.sin(B) - 0.006758 * np.cos(2 * B)
                      + 0.000907 * np.sin(2 * B) - 0.002697 * np.cos(3 * B) + 0.00148 * np.sin(3 * B))


@pytest.mark.parametrize("lat, month, day", [(30.0, 7, 21), (40.0, 12, 21), (25.0, 3, 21), (45.0, 6, 21)])
def test_solar_noon_zenith_is_latitude_minus_declination(lat, month, day):
    doy = day_of_year(month, day)
    zen, az = solar_position_at_solar_time(lat, doy, 12.0)
    # geometry of the sun at solar noon: zenith = |lat - decl|. Spencer's series fits an average year;
    # in one calendar year the leap cycle shifts the dates by up to a day, and near the equinoxes the
    # declination moves 0.4°/day, so 0.5° is the reference's own spread. Refraction is under 0.05° here.
    assert zen[0] == pytest.approx(abs(lat - spencer_declination(doy + 0.5)), abs=0.5)
    # at solar noon the sun is due south for a site north of it
    assert az[0] == pytest.approx(180.0, abs=0.5)


def test_sunrise_hour_angle():
    # sunrise hour angle cos(w) = -tan(lat) tan(decl) (ASHRAE F 2017 ch. 14); at that solar time the
    # geometric sun is on the horizon, so the apparent zenith is 90° less refraction (~0.5°)
    lat, doy = 35.0, day_of_year(6, 21)
    d = np.radians(spencer_declination(doy))
    w = np.degrees(np.arccos(-np.tan(np.radians(lat)) * np.tan(d)))
    zen, _ = solar_position_at_solar_time(lat, doy, 12.0 - w / 15.0)
    assert zen[0] == pytest.approx(89.5, abs=0.8)


def test_horizontal_plane_receives_global_horizontal():
    # definition: a horizontal surface's global irradiance is GHI (Duffie & Beckman 4th ed. sect. 2.15)
    r = clear_sky_on_planes(30.0, day_of_year(7, 21), [9.0, 12.0, 16.0], [0.0], [180.0])
    assert np.allclose(r["poa"][0], r["ghi"], rtol=1e-6)


def test_south_plane_beats_north_plane_at_noon_in_winter():
    # fact of the trade: a south-facing roof gets more winter sun than a north-facing one
    r = clear_sky_on_planes(35.0, day_of_year(12, 21), [12.0], [26.6, 26.6], [180.0, 0.0])
    assert r["poa"][0, 0] > 2.0 * r["poa"][1, 0]


def test_night_has_no_sun():
    r = clear_sky_on_planes(30.0, day_of_year(7, 21), [0.5, 23.5], [26.6], [180.0])
    assert np.all(r["poa"] == 0.0) and np.all(r["ghi"] == 0.0)


def test_clear_sky_noon_ghi_is_plausible():
    # a clear summer noon near 30° N delivers 900-1,050 W/m2 on the ground (common practice, no source)
    r = clear_sky_on_planes(30.0, day_of_year(6, 21), [12.0], [0.0], [180.0], linke_turbidity=3.0)
    assert 900 < r["ghi"][0] < 1050
