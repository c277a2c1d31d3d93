import numpy as np
import pytest

from attic.physics.atmosphere import TERRAIN, pressure_from_elevation, wind_speed_at_height


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


def test_wind_profile_limits():
    # ASHRAE Handbook-Fundamentals (2017) ch. 24 eq. (4), Table 1. At the station's own height and terrain
    # the speed is unchanged; at the top of each terrain's boundary layer every profile reaches the same
    # gradient wind; below it, rougher ground slows the wind more.
    assert wind_speed_at_height(4.0, 10.0, "open") == pytest.approx(4.0)
    tops = [wind_speed_at_height(4.0, TERRAIN[t][1], t) for t in ("city", "suburban", "open", "water")]
    assert np.allclose(tops, tops[0])
    at_5m = [wind_speed_at_height(4.0, 5.0, t) for t in ("city", "suburban", "open", "water")]
    assert np.all(np.diff(at_5m) > 0) and at_5m[2] < 4.0
