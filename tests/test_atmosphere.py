import numpy as np
import pytest

from attic.physics.atmosphere import pressure_from_elevation, wind_speed_at_height


@pytest.mark.parametrize("z_m, p_kpa", [
    (0, 101.325), (500, 95.461), (1000, 89.875), (2000, 79.495), (-500, 107.478),
])
def test_pressure_matches_standard_atmosphere_table(z_m, p_kpa):
    # ASHRAE Handbook-Fundamentals (2017) ch. 1, Table 1 "Standard atmospheric data" (values from memory);
    # the table lists three decimals, so agreement to 5 Pa is the table's own precision plus rounding.
    assert pressure_from_elevation(z_m) == pytest.approx(p_kpa * 1000, abs=5)


def test_pressure_vectorised_and_range():
    p = pressure_from_elevation(np.array([0.0, 1000.0]))
    assert p.shape == (2,)
    with pytest.raises(ValueError, match="troposphere"):
        pressure_from_elevation(20000)


def test_wind_profile_reduces_station_wind_at_roof_height():
    # ASHRAE Handbook-Fundamentals (2017) ch. 24 eq. (4), Table 1: at the station's own height and
    # terrain the speed is unchanged; in suburban terrain at 5 m it is 0.615 x the station value
    # (hand calculation: (270/10)^0.14 (5/370)^0.22 = 1.586 x 0.388).
    assert wind_speed_at_height(4.0, 10.0, "open") == pytest.approx(4.0)
    assert wind_speed_at_height(1.0, 5.0, "suburban") == pytest.approx(0.615, abs=0.002)
