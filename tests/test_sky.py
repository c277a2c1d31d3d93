import numpy as np
import pytest

from attic.physics.sky import (
    sky_emissivity_berdahl_martin,
    sky_temperature_from_emissivity,
    sky_temperature_swinbank,
    view_factor_to_sky,
)


@pytest.mark.parametrize("T_air_C, T_dp_C", [(10.0, 0.0), (25.0, 10.0), (25.0, 20.0), (32.0, 24.0), (30.0, 15.0)])
def test_berdahl_martin_agrees_with_brutsaert(T_air_C, T_dp_C):
    # an independent clear-sky model: Brutsaert, W. (1975). On a derivable formula for long-wave radiation
    # from clear skies. Water Resources Research 11(5), 742-744: eps = 1.24 (e/T)^(1/7), e in hPa (the
    # vapour pressure, from psychrolib's saturation pressure at the dew point), T in K. Both fit clear
    # skies within a few hundredths; 0.02 is that spread (common practice, no source).
    import psychrolib

    psychrolib.SetUnitSystem(psychrolib.SI)
    e_hpa = psychrolib.GetSatVapPres(T_dp_C) / 100.0
    brutsaert = 1.24 * (e_hpa / (T_air_C + 273.15)) ** (1.0 / 7.0)
    assert sky_emissivity_berdahl_martin(T_dp_C + 273.15) == pytest.approx(brutsaert, abs=0.02)


def test_berdahl_martin_limits():
    # drier air, clearer sky: the emissivity rises with the dew point and stays below a black body
    eps = sky_emissivity_berdahl_martin(np.array([253.15, 273.15, 293.15, 303.15]))
    assert np.all(np.diff(eps) > 0) and np.all((eps > 0.5) & (eps < 1.0))


def test_berdahl_martin_corrections():
    # Berdahl & Martin (1984): the corrections vanish at their reference points (6 a.m. and 6 p.m.; 1000 mbar);
    # the night sky emits more than the day sky, and a high site, with less air above it, less
    base = sky_emissivity_berdahl_martin(290.0)
    assert sky_emissivity_berdahl_martin(290.0, solar_hour=6.0) == pytest.approx(base, abs=1e-12)
    assert sky_emissivity_berdahl_martin(290.0, solar_hour=18.0) == pytest.approx(base, abs=1e-12)
    assert sky_emissivity_berdahl_martin(290.0, pressure=100000.0) == pytest.approx(base, abs=1e-12)
    assert sky_emissivity_berdahl_martin(290.0, solar_hour=0.0) > base > sky_emissivity_berdahl_martin(290.0,
                                                                                                   solar_hour=12.0)
    assert sky_emissivity_berdahl_martin(290.0, pressure=85000.0) < base


def test_swinbank_value():
    # Swinbank (1963): T_sky = 0.0552 T^1.5; at 300 K that is 286.8 K (hand calculation)
    assert sky_temperature_swinbank(300.0) == pytest.approx(286.83, abs=0.01)


@pytest.mark.parametrize("T_air, T_dp", [(300.0, 293.15), (305.0, 295.15), (295.0, 288.15)])
def test_berdahl_martin_and_swinbank_agree_for_humid_summer_air(T_air, T_dp):
    # Both are clear-sky fits to measurements; for humid summer air they agree within about 5 K
    # (Duffie & Beckman, 4th ed., sect. 3.9 compares such correlations; tolerance: common practice, no source)
    bm = sky_temperature_from_emissivity(sky_emissivity_berdahl_martin(T_dp), T_air)
    assert abs(bm - sky_temperature_swinbank(T_air)) < 5.0


def test_sky_view_factor():
    # Duffie & Beckman (4th ed.) eq. (2.15.1): horizontal sees all sky; vertical half
    assert view_factor_to_sky(0.0) == pytest.approx(1.0)
    assert view_factor_to_sky(np.pi / 2) == pytest.approx(0.5)


def test_berdahl_martin_held_at_the_edge_of_its_fitted_range():
    # Berdahl & Martin (1984) fitted dew points of about -20 to 30 °C (range from memory). Their quadratic
    # 0.711 + 0.56 t + 0.73 t^2 has its minimum at t = -0.56 / (2 x 0.73), i.e. -38.4 °C, and rises below it:
    # at -60 °C it would give 0.639, more than at -20 °C (0.6282, hand calculation). Colder dew points are
    # held at the edge, so the sky never warms as the air dries.
    edge = sky_emissivity_berdahl_martin(273.15 - 20.0)
    assert edge == pytest.approx(0.711 - 0.112 + 0.73 * 0.04, abs=1e-12)
    for T_dp_C in (-25.0, -38.4, -45.0, -60.0):
        assert sky_emissivity_berdahl_martin(273.15 + T_dp_C) == pytest.approx(edge, abs=1e-12)
    eps = sky_emissivity_berdahl_martin(273.15 + np.linspace(-70.0, 35.0, 300))
    assert np.all(np.diff(eps) >= 0.0)  # never decreasing with the dew point
