"""IP units for the ducts' own tests, from scipy.constants rather than attic.units, so that those tests
import nothing from attic (the ducts package stands alone) and check attic's factors independently."""

from scipy import constants

FT = constants.foot
INCH = constants.inch
FT2 = FT**2
CFM = FT**3 / 60.0
BTUH = constants.Btu_IT / 3600.0  # W per Btu/h (International Table Btu)
R_IP = FT2 * (5.0 / 9.0) / BTUH  # m2.K/W per h.ft2.°F/Btu


def F_to_K(T_F):
    return constants.convert_temperature(T_F, "Fahrenheit", "Kelvin")
