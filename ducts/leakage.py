"""Duct leakage: flows at operating pressure from a 25 Pa test."""

from __future__ import annotations

import numpy as np

from ducts.arrays import scalar_or_array

LEAKAGE_FLOW_EXPONENT = 0.6  # common practice for duct leaks (orifice-like 0.5 to crack-like 0.65)


def cfm25_to_operating(Q25, operating_pressure, exponent=LEAKAGE_FLOW_EXPONENT):
    """Leakage flow at operating pressure from the flow measured at 25 Pa.

    Parameters
    ----------
    Q25 : float or array [m3/s]
        Measured at the 25 Pa test pressure.
    operating_pressure : float or array [Pa]
        The pressure across the leaks in operation.
    exponent : float [-]
        Flow exponent.

    Returns
    -------
    Q : float or array [m3/s]

    References
    ----------
    Power law Q = C dP^n (ASHRAE Handbook-Fundamentals (2017), ch. 16, eq. (47)); ASHRAE
    Standard 152 converts duct leakage from 25 Pa the same way (exponent 0.6: common practice).

    Examples
    --------
    At the test pressure the flow is the measured one (limiting case); at 50 Pa it is, by
    hand, 2^0.6 = 1.516 times as much:

    >>> cfm25_to_operating(0.05, 25.0)
    0.05
    >>> round(cfm25_to_operating(0.05, 50.0) / 0.05, 3)
    1.516
    """
    Q = np.asarray(Q25, float) * (np.asarray(operating_pressure, float) / 25.0) ** exponent
    return scalar_or_array(Q)

