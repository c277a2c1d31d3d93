"""Air leaking through the ceiling into the attic in winter: the stack pressure and the leak's power law."""

from __future__ import annotations

import numpy as np

from attic.physics.atmosphere import G

PA_TEST = 50.0  # Pa, the pressure of a blower-door rating (CFM50); fact of the trade
FLOW_EXPONENT = 0.65  # typical of whole buildings and their leaks; ASHRAE Fundamentals (2017) ch. 16 (from memory)


def stack_pressure(height, T_in, T_out, rho_out):
    """Pressure difference the stack effect puts across a leak above the neutral pressure plane.

    Parameters
    ----------
    height : float or array [m]
        Height of the leak above the neutral pressure plane.
    T_in, T_out : float or array [K]
        Indoor and outdoor air temperature.
    rho_out : float or array [kg/m3]
        Density of the outdoor air.

    Returns
    -------
    dp : float or array [Pa]
        Indoor minus outdoor pressure at the leak: positive (outward, into a vented attic) when it is warmer
        indoors and the leak is above the neutral plane.

    References
    ----------
    .. [1] ASHRAE Handbook-Fundamentals (2017), ch. 16, the stack pressure difference,
       dp_s = rho_o g (H - H_NPL) (T_i - T_o) / T_i (sign as written here: indoor minus outdoor).

    Examples
    --------
    4 ft (1.219 m) above the neutral plane, 70 degF indoors, 0 degF outdoors (ΔT = 38.89 K), outdoor air at
    1.29 kg/m3: 1.29 (9.80665)(1.219)(38.89)/294.26 = 2.04 Pa (hand calculation):

    >>> round(float(stack_pressure(1.2192, 294.261, 255.372, 1.29)), 2)
    2.04
    """
    T_in = np.asarray(T_in, dtype=float)
    return np.asarray(rho_out, dtype=float) * G * np.asarray(height, dtype=float) * (T_in - T_out) / T_in


def power_law_flow(Q_test, dp, exponent=FLOW_EXPONENT, dp_test=PA_TEST):
    """Flow through a leak at pressure `dp` from its flow at a test pressure (Q = C dp^n).

    Parameters
    ----------
    Q_test : float or array [m3/s]
        Flow at the test pressure (e.g. the ceiling's CFM50 in SI).
    dp : float or array [Pa]
        Pressure across the leak; zero or negative gives no flow in the leak's direction.
    exponent : float [-]
        Flow exponent n.
    dp_test : float [Pa]

    Returns
    -------
    Q : float or array [m3/s]

    References
    ----------
    .. [1] ASHRAE Handbook-Fundamentals (2017), ch. 16, the power law Q = c (dp)^n for leakage.

    Examples
    --------
    A leak of 100 units at 50 Pa under 2 Pa with n = 0.65: 100 (2/50)^0.65 = 12.3 (hand calculation):

    >>> round(float(power_law_flow(100.0, 2.0)), 1)
    12.3
    """
    dp = np.maximum(np.asarray(dp, dtype=float), 0.0)
    return np.asarray(Q_test, dtype=float) * (dp / dp_test) ** exponent
