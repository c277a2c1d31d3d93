"""Long-wave radiation: view factors and the grey diffuse enclosure."""

from __future__ import annotations

import numpy as np

from attic.physics.arrays import scalar_or_array
from attic.physics.atmosphere import SIGMA


def view_factors_triangle(lengths):
    """View factors among the three sides of a long triangular enclosure (crossed strings).

    Parameters
    ----------
    lengths : sequence of 3 floats [m]
        Side lengths of the cross-section (for a gable attic: the two roof slopes and the floor).

    Returns
    -------
    F : array (3, 3) [-]
        F[i, j] is the fraction of what leaves side i that reaches side j.

    Raises
    ------
    ValueError
        If the sides are not positive or do not close a triangle.

    Notes
    -----
    For a triangle every string between two sides is either a side or uncrossed, so Hottel's
    rule reduces to F_ij = (L_i + L_j - L_k) / (2 L_i). Each row sums to 1 and
    L_i F_ij = L_j F_ji. The ends of the attic (gable walls) are neglected: exact for a long attic.

    References
    ----------
    Hottel, H. C. and Sarofim, A. F. (1967). Radiative Transfer, McGraw-Hill (crossed-string
    method); Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), Table 13.1.

    Examples
    --------
    Incropera's Table 13.1 gives, for two inclined plates of equal width with a common edge at
    an angle alpha, F_12 = 1 - sin(alpha/2). The two planes of a 6/12 roof meet at the ridge at
    alpha = 180 - 2 x 26.57 degrees, so F_12 = 1 - cos(26.57 deg) = 0.1056; the rest of what
    leaves a plane (0.8944) reaches the floor, and the floor sees each plane half:

    >>> import math
    >>> s = 5.0 / math.cos(math.atan(0.5))  # eave-to-ridge length over a 10 m span
    >>> F = view_factors_triangle([s, s, 10.0])
    >>> round(float(F[0, 1]), 4), round(float(F[0, 2]), 4), round(float(F[2, 0]), 4)
    (0.1056, 0.8944, 0.5)
    """
    L = np.asarray(lengths, dtype=float)
    if L.shape != (3,) or np.any(L <= 0):
        raise ValueError(f"a triangle needs three positive side lengths, got {lengths}")
    a, b, c = L
    if a >= b + c or b >= a + c or c >= a + b:
        raise ValueError(f"side lengths {lengths} do not close a triangle")
    F = np.zeros((3, 3))
    for i in range(3):
        for j in range(3):
            if i != j:
                k = 3 - i - j
                F[i, j] = (L[i] + L[j] - L[k]) / (2.0 * L[i])
    return F


def grey_enclosure_net_flux(T, emissivity, F):
    """Net long-wave flux leaving each surface of a grey diffuse enclosure (radiosity method).

    Parameters
    ----------
    T : array (..., n) [K]
        Surface temperatures; leading axes are independent enclosures (e.g. hours).
    emissivity : array (n,) or (..., n) [-]
        Hemispherical emissivity of each surface, in (0, 1].
    F : array (n, n) [-]
        View factors, rows summing to 1.

    Returns
    -------
    q : array (..., n) [W/m2]
        Positive where the surface loses heat by radiation.

    Notes
    -----
    Solves sum_j [delta_ij - (1 - eps_i) F_ij] J_j = eps_i sigma T_i^4 for the radiosities J,
    then q_i = J_i - sum_j F_ij J_j, which also holds for black surfaces (eps = 1).
    Area-weighted fluxes sum to zero: what one surface loses the others gain.

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), sect. 13.3,
    eqs. (13.19)-(13.21).

    Examples
    --------
    Two large parallel plates at 400 K and 300 K, both of emissivity 0.8. Incropera's closed
    form for them (Table 13.3, large parallel planes; table number from memory) gives, by hand,
    q = sigma (400^4 - 300^4) / (1/0.8 + 1/0.8 - 1) = 5.6704e-8 x 1.75e10 / 1.5 = 661.5 W/m2:

    >>> import numpy as np
    >>> q = grey_enclosure_net_flux(np.array([400.0, 300.0]), np.array([0.8, 0.8]),
    ...                             np.array([[0.0, 1.0], [1.0, 0.0]]))
    >>> [round(float(x), 1) for x in q]
    [661.5, -661.5]
    """
    T = np.asarray(T, dtype=float)
    eps = np.broadcast_to(np.asarray(emissivity, dtype=float), T.shape)
    n = T.shape[-1]
    eye = np.eye(n)
    A = eye - (1.0 - eps)[..., :, None] * F
    Eb = SIGMA * T**4
    J = np.linalg.solve(A, (eps * Eb)[..., None])[..., 0]
    return J - np.einsum("ij,...j->...i", F, J)


def linearised_radiation_coefficient(emissivity, T1, T2):
    """Radiation coefficient of a small grey body in a large enclosure.

    Parameters
    ----------
    emissivity : float or array [-]
        Of the small body.
    T1 : float or array [K]
        The body's surface temperature.
    T2 : float or array [K]
        The enclosure's mean radiant temperature.

    Returns
    -------
    h_r : float or array [W/(m2.K)]
        Such that q = h_r (T1 - T2) exactly.

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (1.9).

    Examples
    --------
    By hand from the net exchange itself: 0.9 sigma (300^4 - 290^4) = 52.42 W/m2 across 10 K,
    so h_r = 5.242 W/(m2.K):

    >>> round(linearised_radiation_coefficient(0.9, 300.0, 290.0), 3)
    5.242
    """
    T1 = np.asarray(T1, dtype=float)
    T2 = np.asarray(T2, dtype=float)
    h = np.asarray(emissivity, dtype=float) * SIGMA * (T1**2 + T2**2) * (T1 + T2)
    return scalar_or_array(h)
