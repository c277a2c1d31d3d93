import numpy as np
import pytest

from attic.physics.convection import exterior_convection_watmuff, natural_convection_walton


def test_walton_vertical_limit():
    # Walton (1983) / EnergyPlus Engineering Reference: both branches give 1.31 |dT|^(1/3) on a wall
    for dT in (2.0, 10.0, -8.0):
        h = natural_convection_walton(300.0 + dT, 300.0, 0.0)
        assert h == pytest.approx(1.31 * abs(dT) ** (1 / 3), rel=2e-3)


def test_walton_floor_and_ceiling_branches():
    # Walton (1983): hot floor facing up (unstable) 9.482|dT|^(1/3)/(7.238-1); hot ceiling facing down
    # (stable) 1.810|dT|^(1/3)/(1.382+1)
    dT = 8.0
    assert natural_convection_walton(308.0, 300.0, 1.0) == pytest.approx(9.482 * 2 / 6.238, rel=1e-4)
    assert natural_convection_walton(308.0, 300.0, -1.0) == pytest.approx(1.810 * 2 / 2.382, rel=1e-4)
    # a cold surface facing down is unstable, like a hot one facing up
    assert natural_convection_walton(300.0 - dT, 300.0, -1.0) == pytest.approx(9.482 * 2 / 6.238, rel=1e-4)


def test_walton_vectorised():
    h = natural_convection_walton(np.array([310.0, 290.0]), 300.0, np.array([-0.9, 1.0]))
    assert h.shape == (2,) and np.all(h > 0)


def test_watmuff():
    # Watmuff et al. (1977) via Duffie & Beckman (4th ed.) sect. 3.15: h = 2.8 + 3.0 V
    assert exterior_convection_watmuff(0.0) == pytest.approx(2.8)
    assert exterior_convection_watmuff(5.0) == pytest.approx(17.8)
    with pytest.raises(ValueError, match="negative"):
        exterior_convection_watmuff(-1.0)
