"""House totals: base load + ceiling + attic air + ducts -> equipment load and tons."""

from __future__ import annotations

import math
from dataclasses import asdict, dataclass

from attic.units import TON

RULE_OF_THUMB_FT2_PER_TON = (400.0, 500.0)  # common practice, no source: the rule the calculation replaces


@dataclass(frozen=True)
class HouseTotals:
    """Loads at one condition (SI, W; positive = what the equipment must remove in cooling or add in heating).

    base: the user's load calculation without ceiling and ducts; ceiling: through the attic floor;
    attic_air: air the attic sends into the house (unvented attics, ceiling bypasses);
    house = base + ceiling + attic_air (what the registers must deliver);
    ducts = equipment - house; equipment = house / delivery effectiveness.
    """

    kind: str
    base_sensible_w: float
    base_latent_w: float
    ceiling_w: float
    attic_air_sensible_w: float
    attic_air_latent_w: float
    house_w: float
    ducts_w: float
    equipment_w: float
    delivery_effectiveness: float
    tons: float
    area_per_ton_m2: float

    def to_dict(self):
        return asdict(self)


def house_totals(case, cond, state, duct_full):
    """Totals at one condition, and the duct result scaled to deliver exactly the house load.

    Parameters
    ----------
    case : attic.case.load.Case
    cond : attic.case.load.Condition
    state : attic.network.solve.AtticState
    duct_full : ducts.DuctResult at the full air-handler airflow, or None

    Returns
    -------
    (HouseTotals, DuctResult or None)
    """
    s = 1.0 if cond.kind == "cooling" else -1.0
    if cond.kind == "cooling":
        base_s, base_l = case.base_sensible, case.base_latent
        air_l = state.attic_air_to_house_latent_w
    else:
        base_s, base_l, air_l = case.base_heating, 0.0, 0.0
    ceiling = s * state.ceiling_to_house_w
    air_s = s * state.attic_air_to_house_w
    house = base_s + base_l + ceiling + air_s + air_l
    duct = None
    de = 1.0
    if duct_full is not None:
        if not duct_full.delivered_w > 0 or not duct_full.equipment_w > 0:
            raise ValueError(f"{case.name} {cond.kind}: the air handler delivers no {cond.kind} with these "
                             "supply temperatures; check air_handler.supply_F and heating_supply_F")
        de = duct_full.delivery_effectiveness
        duct = duct_full.scaled(house / duct_full.delivered_w)
    equipment = house / de
    tons = equipment / TON
    per_ton = case.conditioned_area / tons if tons > 0 else math.inf
    return HouseTotals(cond.kind, base_s, base_l, ceiling, air_s, air_l, house, equipment - house, equipment,
                       de, tons, per_ton), duct
