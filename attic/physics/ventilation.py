"""Natural ventilation of a vented attic from its vent areas: stack, wind and both together."""

from __future__ import annotations

import numpy as np

from attic.physics.arrays import scalar_or_array
from attic.physics.atmosphere import G

DISCHARGE_COEFFICIENT = 0.65  # sharp-edged opening; ASHRAE Handbook-Fundamentals (2017) ch. 16
WIND_EFFECTIVENESS = 0.25  # low end for diagonal winds, 0.25-0.35; ASHRAE Handbook-Fundamentals ch. 16


def openings_in_series(A_low, A_high):
    """Effective area of two openings that the same air passes in turn.

    Parameters
    ----------
    A_low : float or array [m2]
        Net free area of the low (inlet) openings.
    A_high : float or array [m2]
        Net free area of the high (outlet) openings.

    Returns
    -------
    A_eff : float or array [m2]
        With 1/A_eff^2 = 1/A_low^2 + 1/A_high^2; 0 when either area is 0.

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 16 (combining flow paths in series for orifice flow,
    Q proportional to A sqrt(dp)); Walker & Wilson (1993) use the same rule for attic vents.

    Examples
    --------
    Two equal openings in series act as one of 1/sqrt(2) the area (by hand: 0.2/1.4142 =
    0.1414 m2); a closed side stops the flow (limiting case):

    >>> round(openings_in_series(0.2, 0.2), 4)
    0.1414
    >>> openings_in_series(0.2, 0.0)
    0.0
    """
    a = np.asarray(A_low, dtype=float)
    b = np.asarray(A_high, dtype=float)
    with np.errstate(divide="ignore"):
        A = np.where((a > 0) & (b > 0), 1.0 / np.sqrt(1.0 / np.where(a > 0, a, 1) ** 2
                                                          + 1.0 / np.where(b > 0, b, 1) ** 2), 0.0)
    return scalar_or_array(A)


def wind_inlet_area(A_low, A_high):
    """Area through which wind drives air into the attic, from its low and high vents.

    Parameters
    ----------
    A_low, A_high : float or array [m2], net free areas of the low and high vents (either may be 0)

    Returns
    -------
    A_in : float or array [m2]

    Notes
    -----
    With both kinds of vent, the inlet area of a balanced pair that has the same series area:
    sqrt(2) A_eff. With one kind alone (soffit-only, gable-only) the vents sit on both sides of
    the attic, so the wind blows in through the windward half and out through the leeward half:
    the same rule applied to two halves of A gives A/2. Adding openings cannot block the flow the
    others already pass, so the area is never below half of either kind: the larger of the three,
    which keeps it continuous and never falling as either area grows (a soffit-only attic that gains
    a little ridge vent keeps its wind flow). Wind is the only ventilation of an attic with one kind
    of vent, since openings at one height drive no stack flow between them.

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 16, eq. (37) and the text beside it (A is the free
    area of the inlet openings; outlets of the same size).

    Examples
    --------
    Soffit vents alone, 2 m2 in all: 1 m2 faces the wind (half, by the reasoning above).

    >>> wind_inlet_area(2.0, 0.0)
    1.0

    Equal low and high areas of 1 m2: the low vents are the inlets.

    >>> round(wind_inlet_area(1.0, 1.0), 12)
    1.0

    2 m2 of soffit and a 0.1 m2 ridge vent: the series pair gives sqrt(2) x 0.0999 = 0.141 m2, less than
    the soffits' windward half, which stays.

    >>> wind_inlet_area(2.0, 0.1)
    1.0
    """
    a = np.asarray(A_low, dtype=float)
    b = np.asarray(A_high, dtype=float)
    pair = np.sqrt(2.0) * np.asarray(openings_in_series(a, b), dtype=float)
    A = np.maximum(pair, np.maximum(0.5 * a, 0.5 * b))
    return scalar_or_array(A)


def stack_flow(A_eff, height, T_inside, T_outside, discharge_coefficient=DISCHARGE_COEFFICIENT):
    """Volume flow driven by the stack effect through low and high openings.

    Parameters
    ----------
    A_eff : float or array [m2]
        Series-combined area of the low and high openings.
    height : float or array [m]
        Vertical distance between the centres of the openings.
    T_inside : float or array [K]
    T_outside : float or array [K]
    discharge_coefficient : float [-]

    Returns
    -------
    Q : float or array [m3/s]
        Always >= 0; the direction follows the sign of T_inside - T_outside.

    Notes
    -----
    Q = C_D A_eff sqrt(2 g H |T_i - T_o| / T_i). With equal low and high areas A this equals
    ASHRAE's form with the neutral plane at mid-height, C_D A sqrt(2 g (H/2) dT / T_i): the series
    rule gives A_eff = A/sqrt(2). A tiny floor under |dT| keeps the derivative finite.

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 16, eq. (38) (flow caused by thermal forces only).

    Examples
    --------
    0.2 m2 of soffit and 0.2 m2 of ridge vent 2 m apart, attic 330 K, outdoors 310 K. ASHRAE's
    eq. (38) with the inlet area and the neutral plane at mid-height, by hand:
    0.65 x 0.2 x sqrt(2 x 9.807 x 1.0 x 20 / 330) = 0.13 x 1.0903 = 0.1417 m3/s:

    >>> round(stack_flow(openings_in_series(0.2, 0.2), 2.0, 330.0, 310.0), 4)
    0.1417
    """
    dT = np.sqrt((np.asarray(T_inside, dtype=float) - np.asarray(T_outside, dtype=float)) ** 2 + 1e-6)
    Q = discharge_coefficient * np.asarray(A_eff, dtype=float) * np.sqrt(
        2.0 * G * np.asarray(height, dtype=float) * dT / np.asarray(T_inside, dtype=float))
    return scalar_or_array(Q)


def wind_flow(A, wind_speed, effectiveness=WIND_EFFECTIVENESS):
    """Volume flow driven by wind through an opening.

    Parameters
    ----------
    A : float or array [m2]
        Free area of the inlet openings.
    wind_speed : float or array [m/s]
    effectiveness : float [-]
        0.5-0.6 for perpendicular winds, 0.25-0.35 for diagonal ones.

    Returns
    -------
    Q : float or array [m3/s]

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 16, eq. (37): Q = C_v A U.

    Examples
    --------
    By hand: 0.25 x 0.5 m2 x 4 m/s = 0.5 m3/s:

    >>> wind_flow(0.5, 4.0)
    0.5
    """
    Q = effectiveness * np.asarray(A, dtype=float) * np.asarray(wind_speed, dtype=float)
    return scalar_or_array(Q)


def combined_flow(Q_stack, Q_wind):
    """Combined stack and wind flow (quadrature sum).

    Parameters
    ----------
    Q_stack : float or array [m3/s]
    Q_wind : float or array [m3/s]

    Returns
    -------
    Q : float or array [m3/s]

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 16, eq. (40).

    Examples
    --------
    By hand: sqrt(0.3^2 + 0.4^2) = 0.5 m3/s; with no wind the stack flow alone (limiting case):

    >>> round(combined_flow(0.3, 0.4), 12), combined_flow(0.3, 0.0)
    (0.5, 0.3)
    """
    Q = np.sqrt(np.asarray(Q_stack, dtype=float) ** 2 + np.asarray(Q_wind, dtype=float) ** 2)
    return scalar_or_array(Q)
