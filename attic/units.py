"""Unit conversions at the boundary: IP (what the trade uses) to SI (what the physics uses).

Everything inside atticduct is SI; these functions are called only where a case file is read
or a result is shown. Factors are exact definitions or NIST SP 811 (2008) values.
"""

from __future__ import annotations

import numpy as np

FT = 0.3048  # m per ft (exact)
INCH = 0.0254  # m per in (exact)
FT2 = FT**2
IN2 = INCH**2
FT3 = FT**3
BTUH = 0.29307107  # W per Btu/h (NIST SP 811, International Table Btu)
CFM = FT3 / 60.0  # m3/s per ft3/min
MPH = 0.44704  # m/s per mph (exact)
R_IP = FT2 * (5.0 / 9.0) / BTUH  # m2.K/W per h.ft2.F/Btu  (= 0.17611)
BTUH_FT2 = BTUH / FT2  # W/m2 per Btu/h.ft2
TON = 12000.0 * BTUH  # W per ton of refrigeration (12,000 Btu/h, fact of the trade)
KWH = 3.6e6  # J per kWh
BTU = 1055.05585  # J per Btu (IT)


def F_to_K(T_F):
    """Temperature in °F to K."""
    return (np.asarray(T_F, dtype=float) - 32.0) * 5.0 / 9.0 + 273.15


def K_to_F(T_K):
    """Temperature in K to °F."""
    return (np.asarray(T_K, dtype=float) - 273.15) * 9.0 / 5.0 + 32.0


def K_to_C(T_K):
    """Temperature in K to °C."""
    return np.asarray(T_K, dtype=float) - 273.15


def dF_to_dK(dT_F):
    """Temperature difference in °F to K."""
    return np.asarray(dT_F, dtype=float) * 5.0 / 9.0


def dK_to_dF(dT_K):
    """Temperature difference in K to °F."""
    return np.asarray(dT_K, dtype=float) * 9.0 / 5.0


def C_to_K(T_C):
    """Temperature in °C to K."""
    return np.asarray(T_C, dtype=float) + 273.15
