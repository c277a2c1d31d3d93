"""Roof coverings: the one registry of presets (solar reflectance, thermal emittance, layer R).

Add a covering by adding a row here with its source; see DEVELOPERS.md. Values are new-product
values; coverings age (dark ones little, white ones a lot: CRRC reports three-year aged values).
"""

from __future__ import annotations

from dataclasses import dataclass

from .units import R_IP

_LBNL = ("value from memory; typical of the LBNL Heat Island Group cool-roofing materials data "
         "and the Cool Roof Rating Council directory")


@dataclass(frozen=True)
class Covering:
    """A roof covering preset.

    Attributes
    ----------
    solar_reflectance : dimensionless (0-1)
    thermal_emittance : dimensionless (0-1)
    r_si : m2.K/W, thermal resistance of the covering layer itself
    source : where the numbers come from
    """

    solar_reflectance: float
    thermal_emittance: float
    r_si: float
    source: str


COVERINGS: dict[str, Covering] = {
    "asphalt-shingle-dark": Covering(0.08, 0.91, 0.44 * R_IP, _LBNL),
    "asphalt-shingle-light": Covering(0.25, 0.91, 0.44 * R_IP, _LBNL),
    "clay-tile-red": Covering(0.33, 0.90, 0.05 * R_IP, _LBNL),
    "concrete-tile-grey": Covering(0.25, 0.90, 0.05 * R_IP, _LBNL),
    "concrete-tile-white": Covering(0.70, 0.90, 0.05 * R_IP, _LBNL),
    "metal-bare-galvanized": Covering(0.61, 0.04, 0.0, _LBNL),
    "metal-coated-dark": Covering(0.10, 0.85, 0.0, _LBNL),
    "metal-coated-white": Covering(0.67, 0.85, 0.0, _LBNL),
    "membrane-white": Covering(0.80, 0.90, 0.05 * R_IP, _LBNL),
}
# Layer R of shingles (0.44 h.ft2.F/Btu): ASHRAE Handbook-Fundamentals (2017) ch. 26, Table 1,
# "asphalt shingles" (value from memory). Tile and metal layers barely resist; set near zero.
