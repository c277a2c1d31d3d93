"""The ventilated air space under a covering laid on battens: an inclined channel heated from both sides.

Air enters at the eave at the outdoor temperature, is warmed by both faces (the covering's underside
and the deck's top) and leaves at the ridge; buoyancy drives it against the channel's friction and
its entry and exit losses. Pure functions; the network (attic.network.nodes) assembles them.
"""

from __future__ import annotations

import numpy as np

from attic.physics.arrays import scalar_or_array
from attic.physics.atmosphere import SIGMA, G

# Fully developed laminar flow between parallel plates, one wall at uniform heat flux and the other
# insulated, Nusselt number on the hydraulic diameter 2 x gap (Shah & London 1978, Table 86; value from
# memory).
NUSSELT_ONE_WALL_HEATED = 5.385
# Entry (sharp, 0.5) plus exit (full loss of the velocity head, 1.0), in velocity heads (common practice;
# ASHRAE Handbook-Fundamentals ch. 21 fitting losses, values from memory). Battens or tile lugs that
# narrow the channel are not counted: the flow errs high, the roof a little cool.
ENTRY_EXIT_LOSS = 1.5


def stack_pressure(rho_out, T_out, T_channel, rise):
    """Buoyancy pressure of a column of warm air in a channel open at both ends.

    Parameters
    ----------
    rho_out : float or array [kg/m3]
        Outdoor air density.
    T_out, T_channel : float or array [K]
        Outdoor air and the channel's mean air temperature.
    rise : float [m]
        Height from the channel's inlet to its outlet.

    Returns
    -------
    dp : float or array [Pa], positive when the channel is warmer than outdoors

    Notes
    -----
    dp = g H (rho_out - rho_ch), with rho_ch = rho_out T_out / T_ch (ideal gas at one pressure).

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 16, stack pressure (eq. from memory).

    Examples
    --------
    1.15 kg/m3 outdoors at 305 K, channel at 325 K, 2 m rise: 9.80665 x 2 x 1.15 x (1 - 305/325) = 1.388 Pa.

    >>> round(stack_pressure(1.15, 305.0, 325.0, 2.0), 3)
    1.388
    """
    dp = G * rise * np.asarray(rho_out, float) * (1.0 - np.asarray(T_out, float) / np.asarray(T_channel, float))
    return scalar_or_array(dp)


def channel_velocity(dp, length, gap, mu, rho, loss_coefficient=ENTRY_EXIT_LOSS):
    """Mean velocity in a parallel-plate channel that a pressure drives against friction and losses.

    Parameters
    ----------
    dp : float or array [Pa]
        Driving pressure (its magnitude is used; the flow runs down the channel when it is negative).
    length : float [m]
    gap : float [m]
        Distance between the plates.
    mu : float or array [Pa.s]
    rho : float or array [kg/m3]
    loss_coefficient : float [-]
        Entry, exit and fitting losses in velocity heads.

    Returns
    -------
    V : float or array [m/s], >= 0

    Notes
    -----
    |dp| = 12 mu L V / b^2 + K rho V^2 / 2: laminar friction between parallel plates (plane Poiseuille
    flow, f Re = 96 on D_h = 2 b) plus the losses; the positive root of the quadratic.

    References
    ----------
    White, F. M. (2006). Viscous Fluid Flow (3rd ed.), sect. 3-3 (plane Poiseuille flow); Shah & London
    (1978), f Re = 96 for parallel plates.

    Examples
    --------
    Without losses it is Poiseuille's V = b^2 dp / (12 mu L): b = 19 mm, L = 4 m, 1 Pa, mu = 1.9e-5
    gives 0.3958 m/s.

    >>> round(channel_velocity(1.0, 4.0, 0.019, 1.9e-5, 1.1, 0.0), 4)
    0.3958
    """
    p = np.abs(np.asarray(dp, dtype=float))
    b = 12.0 * np.asarray(mu, float) * length / gap**2
    a = 0.5 * loss_coefficient * np.asarray(rho, float)
    # the root written so that it stays exact as a -> 0
    V = 2.0 * p / (b + np.sqrt(b**2 + 4.0 * a * p))
    return scalar_or_array(V)


def channel_heat_to_air(m_cp, hA, T_wall, T_in):
    """Heat a stream takes up along a channel whose walls sit at one temperature.

    Parameters
    ----------
    m_cp : float or array [W/K]
        Capacity rate of the air.
    hA : float or array [W/K]
        Convective conductance of the walls to the air, summed over both faces.
    T_wall : float or array [K]
        The walls' conductance-weighted temperature.
    T_in : float or array [K]
        Air entering.

    Returns
    -------
    Q : float or array [W]

    Notes
    -----
    Q = m cp (T_w - T_in)(1 - exp(-hA / m cp)): the exponential approach of the air to the walls. The
    length-mean air temperature is T_w - Q / hA, so the faces' convection h A (T_face - T_mean) sums to
    Q exactly.

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (8.41b).

    Examples
    --------
    m cp = 50 W/K, hA = 50 W/K, walls 20 K above the inlet: 50 x 20 x (1 - e^-1) = 632.1 W.

    >>> round(channel_heat_to_air(50.0, 50.0, 320.0, 300.0), 1)
    632.1
    """
    m_cp = np.maximum(np.asarray(m_cp, dtype=float), 1e-9)
    Q = m_cp * (np.asarray(T_wall, float) - np.asarray(T_in, float)) * -np.expm1(-np.asarray(hA, float) / m_cp)
    return scalar_or_array(Q)


def radiation_between_plates(T_1, T_2, eps_1, eps_2):
    """Net long-wave flux between two large parallel grey plates, from plate 1 to plate 2.

    Parameters
    ----------
    T_1, T_2 : float or array [K]
    eps_1, eps_2 : float [-]

    Returns
    -------
    q : float or array [W/m2]

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), Table 13.3 (infinite parallel
    planes).

    Examples
    --------
    350 K to 320 K, both 0.9: 5.670e-8 (350^4 - 320^4) / (1/0.9 + 1/0.9 - 1) = 209.7 W/m2.

    >>> round(radiation_between_plates(350.0, 320.0, 0.9, 0.9), 1)
    209.7
    """
    q = SIGMA * (np.asarray(T_1, float) ** 4 - np.asarray(T_2, float) ** 4) / (1.0 / eps_1 + 1.0 / eps_2 - 1.0)
    return scalar_or_array(q)


def channel_nusselt(Re, Pr):
    """Nusselt number of each face of a parallel-plate channel heated on one side, laminar to turbulent.

    Parameters
    ----------
    Re : float or array [-], on the hydraulic diameter 2 x gap
    Pr : float or array [-]

    Returns
    -------
    Nu : float or array [-], on the hydraulic diameter

    Notes
    -----
    Laminar (Re < 2,300): 5.385, fully developed, one wall at uniform flux and the other insulated; turbulent
    (Re >= 3,000): Gnielinski's correlation on the hydraulic diameter; linear in Re between, so that the solver
    sees no jump. The laminar entry length (developing flow) is not credited: short or slow channels err low.

    References
    ----------
    Shah, R. K. and London, A. L. (1978). Laminar Flow Forced Convection in Ducts. Academic Press, ch. VI
    (parallel plates; value from memory); Gnielinski (1976) as in Incropera et al. (6th ed.), eq. (8.62).

    Examples
    --------
    >>> channel_nusselt(1000.0, 0.71)
    5.385
    """
    from ducts.films import nusselt_gnielinski

    Re = np.asarray(Re, dtype=float)
    turb = nusselt_gnielinski(np.maximum(Re, 3000.0), Pr)
    w = np.clip((Re - 2300.0) / 700.0, 0.0, 1.0)
    Nu = (1.0 - w) * NUSSELT_ONE_WALL_HEATED + w * turb
    return scalar_or_array(Nu)
