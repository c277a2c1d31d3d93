"""What a case declares for the code checks and nothing else: editions, labels and product ratings.

The physics reads the Case's SI fields. The code checks read those too (geometry, vent areas,
duct sizes) plus this record, which holds what only the codes need: the editions adopted, the
ceiling vapor retarder, the kind of deck insulation, the covering's name, the vent products'
ratings (in² per ft or in² each, as printed on the product) and the duct test result (CFM25).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np


@dataclass(frozen=True)
class VentProduct:
    """How one side's vents are sold: net free area per unit and the unit ("ft" of strip or "vents" each)."""

    nfa_in2_per_unit: float
    unit: str


@dataclass(frozen=True)
class Declared:
    """The case's declarations for the code checks (IP where the code or the label states them)."""

    irc_edition: int
    iecc_edition: int
    air_handler_installed_at_rough_in: bool
    ceiling_vapor_retarder: str
    deck_insulation: str
    deck_air_impermeable_r: float | None  # m2.K/W
    covering: str
    low_vent: VentProduct | None
    high_vent: VentProduct | None
    leakage_cfm25: float | None  # total duct leakage from a duct test, CFM25; None when given as fractions


def _given(value):
    """A number given and not zero (an uncertainty run's (m,) array: in any sample)."""
    return value is not None and bool(np.any(np.asarray(value) != 0))


def vent_product(vents, side):
    """The product a side's vents are given in; None when the side has no vents of that kind."""
    if not vents:
        return None
    if _given(vents.get(f"{side}_nfa_in2_per_ft")):
        return VentProduct(vents[f"{side}_nfa_in2_per_ft"], "ft")
    if _given(vents.get(f"{side}_nfa_in2_each")):
        return VentProduct(vents[f"{side}_nfa_in2_each"], "vents")
    return None


def leakage_cfm25(leak):
    """Total duct leakage at 25 Pa from the case's leakage section, or None when it gives fractions."""
    if leak is None:
        return None
    if leak["total_cfm25"] is not None:
        return leak["total_cfm25"]
    if leak["supply_cfm25"] is not None or leak["return_cfm25"] is not None:
        return (leak["supply_cfm25"] or 0.0) + (leak["return_cfm25"] or 0.0)
    return None


def declared_from(c):
    """The Declared record of a validated case dict (IP)."""
    from attic.units import R_IP

    codes, roof, attic = c["codes"], c["roof"], c["attic"]
    air_imp = roof["deck_air_impermeable_r"]
    return Declared(
        irc_edition=int(codes["irc_edition"]), iecc_edition=int(codes["iecc_edition"]),
        air_handler_installed_at_rough_in=bool(codes["air_handler_installed_at_rough_in"]),
        ceiling_vapor_retarder=attic["ceiling_vapor_retarder"], deck_insulation=roof["deck_insulation"],
        deck_air_impermeable_r=None if air_imp is None else air_imp * R_IP, covering=roof["covering"],
        low_vent=vent_product(c["vents"], "low"), high_vent=vent_product(c["vents"], "high"),
        leakage_cfm25=leakage_cfm25(c["leakage"]))
