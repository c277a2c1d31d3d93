"""Roof coverings: the one registry of presets (solar reflectance, thermal emittance, layer R).

Add a covering by adding a row here with its source; see DEVELOPERS.md. Values are new-product
values; coverings age (dark ones little, white ones a lot: CRRC reports three-year aged values).
"""

from __future__ import annotations

from dataclasses import dataclass

from attic.units import R_IP

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
    heat_capacity : J/(m2.K) of roof area, mass per area times specific heat (for `day --mass`)
    roughness : roughness class of the outer surface for the wind's convection (a key of
        attic.physics.convection.ROUGHNESS_MULTIPLIERS)
    batten_gap_in : in, typical depth of the ventilated air space between the covering and the deck
        (0: laid on the deck)
    """

    solar_reflectance: float
    thermal_emittance: float
    r_si: float
    source: str
    heat_capacity: float = 12600.0
    roughness: str = "medium-rough"
    batten_gap_in: float = 0.0


# Heat capacity per roof area (values from memory): asphalt shingles about 10 kg/m2 at 1,260 J/(kg.K);
# clay or concrete tile about 45 kg/m2 at 880 J/(kg.K); steel roofing about 5 kg/m2 at 500 J/(kg.K);
# a single-ply membrane on cover board about 8 kg/m2 at 1,000 J/(kg.K).
_SHINGLE_C, _TILE_C, _METAL_C, _MEMBRANE_C = 12600.0, 39600.0, 2500.0, 8000.0
# Roughness classes (common practice, no source): granule-surfaced shingles like brick ("rough"), tile like
# concrete ("medium-rough"), coated or bare sheet metal like glass ("very-smooth"), a membrane like
# smooth plaster ("smooth").
# Clay and concrete tile hang on battens nailed to the deck: a nominal 1x batten is 3/4 in thick, and the
# space it leaves between tile and deck ventilates from eave to ridge (value from memory; common practice).
_TILE_GAP_IN = 0.75
SHEATHING_HEAT_CAPACITY = 13000.0  # J/(m2.K): 1/2 in plywood, 6.9 kg/m2 at 1,880 J/(kg.K) (value from memory)

COVERINGS: dict[str, Covering] = {
    "asphalt-shingle-dark": Covering(0.08, 0.91, 0.44 * R_IP, _LBNL, _SHINGLE_C, "rough"),
    "asphalt-shingle-light": Covering(0.25, 0.91, 0.44 * R_IP, _LBNL, _SHINGLE_C, "rough"),
    "clay-tile-red": Covering(0.33, 0.90, 0.05 * R_IP, _LBNL, _TILE_C, "medium-rough", _TILE_GAP_IN),
    "concrete-tile-grey": Covering(0.25, 0.90, 0.05 * R_IP, _LBNL, _TILE_C, "medium-rough", _TILE_GAP_IN),
    "concrete-tile-white": Covering(0.70, 0.90, 0.05 * R_IP, _LBNL, _TILE_C, "medium-rough", _TILE_GAP_IN),
    "metal-bare-galvanized": Covering(0.61, 0.04, 0.0, _LBNL, _METAL_C, "very-smooth"),
    "metal-coated-dark": Covering(0.10, 0.85, 0.0, _LBNL, _METAL_C, "very-smooth"),
    "metal-coated-white": Covering(0.67, 0.85, 0.0, _LBNL, _METAL_C, "very-smooth"),
    "membrane-white": Covering(0.80, 0.90, 0.05 * R_IP, _LBNL, _MEMBRANE_C, "smooth"),
}
# Layer R of shingles (0.44 h.ft2.F/Btu): ASHRAE Handbook-Fundamentals (2017) ch. 26, Table 1,
# "asphalt shingles" (value from memory). Tile and metal layers barely resist; set near zero.
