"""IRC R806.5: the unvented attic assembly (insulation for condensation control), read from the Case."""

from __future__ import annotations

from attic.codes.common import DEFER, RuleResult, ip
from attic.units import R_IP

# IRC R806.5, Table R806.5 "Insulation for condensation control": minimum R of rigid board or
# air-impermeable insulation at the deck, by climate zone (2018/2021 editions; values from memory).
UNVENTED_MIN_R = {
    "1": 5, "2": 5, "3": 5, "4C": 10, "4A": 15, "4B": 15, "5": 20, "6": 25, "7": 30, "8": 35,
}
UNVENTED_TILE_EXEMPT = ("2B", "3B")  # tile roofs in 2B and 3B need none (value from memory)


def unvented_min_r(zone):
    """Minimum air-impermeable R at the deck of an unvented attic in a climate zone (IRC Table R806.5)."""
    if zone in UNVENTED_MIN_R:
        return UNVENTED_MIN_R[zone]
    n = zone[0]
    if n == "0":
        return UNVENTED_MIN_R["1"]
    if n == "4":
        return UNVENTED_MIN_R[zone]
    return UNVENTED_MIN_R[n]


def rule_unvented(case, edition):
    """The unvented-attic rules (deck insulation, vapor retarder, combustion appliances) as RuleResults."""
    dec, zone = case.declared, case.climate_zone
    src = f"IRC {edition} R806.5, Table R806.5"
    name = "Unvented attic: air-impermeable insulation at the deck for condensation control"
    if case.attic_type != "unvented":
        return [RuleResult(name, src, "vented attic", "-", "n/a")]
    kind = dec.deck_insulation
    deck_r = ip(case.r_deck, R_IP)
    if kind in ("spray-foam", "rigid-board"):
        imperm = deck_r
    elif kind == "hybrid":
        imperm = ip(dec.deck_air_impermeable_r or 0.0, R_IP)
    else:
        imperm = 0.0
    need = unvented_min_r(zone)
    if zone in UNVENTED_TILE_EXEMPT and "tile" in dec.covering:
        need = 0
    provided = (f"R-{imperm:g} air-impermeable ({kind}, R-{deck_r:g} in all), climate zone {zone}" if deck_r > 0
                else f"no deck insulation, climate zone {zone}")  # not "R-0 air-impermeable"
    out = []
    if kind == "air-permeable":
        out.append(RuleResult(
            name, src, provided, f"R-{need:g} air-impermeable (air-permeable insulation alone is allowed only with "
                                 "a vapor diffusion port, 2018+ editions, zones 1-3)", "fail",
            f"add R-{need:g} of spray foam or rigid board in contact with the deck, or ventilate the attic",
            "Air-permeable insulation alone under a deck lets moist house air condense on the sheathing. " + DEFER))
    else:
        ok = imperm >= need - 1e-9
        out.append(RuleResult(name, src, provided, f"at least R-{need:g} in climate zone {zone}",
                              "pass" if ok else "fail",
                              "" if ok else f"raise the air-impermeable insulation by R-{need - imperm:g}"))
    if zone[0] in "5678" and kind in ("spray-foam", "hybrid"):
        out.append(RuleResult(
            "Unvented attic, zones 5-8: the air-impermeable insulation is or carries a Class II vapor retarder",
            src, "not described in the case", "Class II vapor retarder", "n/a",
            "confirm the foam's vapor permeance or add a Class II coating"))
    out.append(RuleResult(
        "Unvented attic: combustion appliances in the attic", "IRC M1701, G2407 (combustion air)",
        "not described in the case", "sealed-combustion or direct-vent appliances, or combustion air provided",
        "n/a", "", "A sealed attic with an atmospherically vented appliance can backdraft. " + DEFER))
    return out
