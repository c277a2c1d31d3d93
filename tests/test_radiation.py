import numpy as np
import pytest

from attic.physics.atmosphere import SIGMA
from attic.physics.radiation import grey_enclosure_net_flux, linearised_radiation_coefficient, view_factors_triangle


def test_triangle_view_factors_equilateral_and_rules():
    # Hottel's crossed strings, e.g. Incropera (6th ed.) Table 13.1: equilateral triangle F_ij = 0.5
    F = view_factors_triangle([1.0, 1.0, 1.0])
    assert np.allclose(F[~np.eye(3, dtype=bool)], 0.5)
    F = view_factors_triangle([3.0, 4.0, 5.0])
    L = np.array([3.0, 4.0, 5.0])
    assert np.allclose(F.sum(axis=1), 1.0)  # summation rule
    assert np.allclose(L[:, None] * F, (L[:, None] * F).T)  # reciprocity
    # the legs of a right triangle are Incropera's (6th ed.) Table 13.1 perpendicular plates with a common
    # edge: F_ij = (1 + w_j/w_i - sqrt(1 + (w_j/w_i)^2)) / 2, a formula of its own (not crossed strings)
    r = 4.0 / 3.0
    assert F[0, 1] == pytest.approx((1 + r - np.sqrt(1 + r**2)) / 2)


def test_gable_view_factors_match_inclined_plates_with_a_common_edge():
    # Incropera (6th ed.) Table 13.1, inclined plates of equal width with a common edge at angle alpha:
    # F_ij = 1 - sin(alpha/2). The two planes of a gable roof of tilt t meet at alpha = 180 - 2t.
    for tilt in (15.0, 26.57, 45.0):
        t = np.radians(tilt)
        s = 5.0 / np.cos(t)  # slope length over a 10 m span
        F = view_factors_triangle([s, s, 10.0])
        assert F[0, 1] == pytest.approx(1 - np.sin(np.radians(180.0 - 2 * tilt) / 2))


def test_bad_triangle():
    with pytest.raises(ValueError, match="triangle"):
        view_factors_triangle([1.0, 1.0, 3.0])


def test_two_surface_enclosure_matches_closed_form():
    # Incropera (6th ed.) eq. (13.23): q = sigma (T1^4 - T2^4) / (1/e1 + (A1/A2)(1/e2 - 1)),
    # for a convex body 1 inside surface 2 (F11 = 0, F12 = 1), here long concentric cylinders.
    A1, A2, e1, e2, T1, T2 = 1.0, 3.0, 0.8, 0.3, 330.0, 300.0
    F = np.array([[0.0, 1.0], [A1 / A2, 1.0 - A1 / A2]])
    q = grey_enclosure_net_flux(np.array([T1, T2]), np.array([e1, e2]), F)
    expect = SIGMA * (T1**4 - T2**4) / (1 / e1 + (A1 / A2) * (1 / e2 - 1))
    assert q[0] == pytest.approx(expect, rel=1e-10)
    assert q[0] * A1 + q[1] * A2 == pytest.approx(0.0, abs=1e-9)


def test_enclosure_conserves_energy_and_batches():
    F = view_factors_triangle([5.0, 5.0, 8.0])
    L = np.array([5.0, 5.0, 8.0])
    T = np.array([[340.0, 335.0, 310.0], [300.0, 300.0, 300.0]])
    q = grey_enclosure_net_flux(T, np.array([0.05, 0.9, 0.9]), F)
    assert np.allclose((q * L).sum(axis=1), 0.0, atol=1e-9)
    assert np.allclose(q[1], 0.0, atol=1e-9)  # isothermal enclosure: no net exchange


def test_linearised_coefficient_is_exact():
    # Incropera (6th ed.) eq. (1.9): q = eps sigma (T1^4 - T2^4) = h_r (T1 - T2), by the function's contract
    h = linearised_radiation_coefficient(0.9, 320.0, 300.0)
    assert h * 20.0 == pytest.approx(0.9 * SIGMA * (320.0**4 - 300.0**4))
    # limiting case, Incropera sect. 1.2.3: for close temperatures h_r -> 4 eps sigma T^3 (5.51 W/(m2.K) for
    # eps = 0.9 at 300 K, the familiar ~6 W/(m2.K) of building surfaces)
    assert linearised_radiation_coefficient(0.9, 300.0, 300.0) == pytest.approx(5.51, abs=0.01)
