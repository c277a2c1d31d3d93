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
    airflow: the design airflow that carries the equipment load (m3/s; None without ducts);
    air_handler: the case's air handler airflow; air_handler_delivers: what it delivers to the house at the
    supply temperature, running the whole hour; air_handler_short: it delivers less than the house load.
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
    airflow_m3_s: float | None = None
    air_handler_m3_s: float | None = None
    air_handler_delivers_w: float | None = None
    air_handler_short: bool = False

    def to_dict(self):
        return asdict(self)


def house_load(case, cond, state):
    """(base sensible, base latent, ceiling, attic air sensible, attic air latent), W, at a solved attic."""
    return house_load_parts(cond.kind, base_load(case, cond), state.ceiling_to_house_w, state.attic_air_to_house_w,
                            state.attic_air_to_house_latent_w)


def base_load(case, cond):
    """(sensible, latent) W of the user's own load calculation at that condition (no latent in heating)."""
    return (case.base_sensible, case.base_latent) if cond.kind == "cooling" else (case.base_heating, 0.0)


def house_load_parts(kind, base, ceiling_w, air_sensible_w, air_latent_w):
    """house_load's five parts, W, from the base load and what the attic sends into the house (floats, or arrays
    over the points of a batch): signed so that each adds to the equipment's work; no latent part in heating."""
    s = 1.0 if kind == "cooling" else -1.0
    return base[0], base[1], s * ceiling_w, s * air_sensible_w, air_latent_w if kind == "cooling" else 0.0


def house_totals(case, cond, state, duct=None, airflow=None, given=None):
    """Totals at one condition from one solved state.

    Parameters
    ----------
    case : attic.case.load.Case
    cond : attic.case.load.Condition
    state : attic.network.solve.AtticState
    duct : ducts.DuctResult of the same state (its delivered heat equals the house load), or None
    airflow : m3/s of that state; given : (air handler airflow m3/s, W it delivers), or None

    Returns
    -------
    HouseTotals
    """
    base_s, base_l, ceiling, air_s, air_l = house_load(case, cond, state)
    house = base_s + base_l + ceiling + air_s + air_l
    de = 1.0
    if duct is not None and house > 0:
        de = duct.delivery_effectiveness
    equipment = house / de if house > 0 else 0.0
    tons = equipment / TON
    per_ton = case.conditioned_area / tons if tons > 0 else math.inf
    g_q, g_w = given if given is not None else (None, None)
    short = bool(g_w is not None and house > 0 and g_w < house)
    ducts = equipment - house if house > 0 else 0.0
    return HouseTotals(cond.kind, base_s, base_l, ceiling, air_s, air_l, house, ducts, equipment,
                       de, tons, per_ton, airflow, g_q, g_w, short)


# Common practice, no source: an air handler's blower settings span well under a factor of two of its airflow;
# a design airflow beyond that is another system, and the supply temperature or the ducts are the fix.
BLOWER_RANGE = 2.0


def air_handler_advice(kind, airflow_ratio, delivers_w):
    """What to change when the case's air handler cannot carry the load, in words; "" when giving it the design
    airflow is the plain fix (a design airflow within BLOWER_RANGE times its own).

    kind : "cooling" or "heating"; airflow_ratio : design airflow / the air handler's [-]; delivers_w : what the
    air handler delivers to the house at its own airflow [W].

    Examples
    --------
    >>> air_handler_advice("heating", 1.3, 9000.0)
    ''
    >>> air_handler_advice("heating", 11.5, -800.0)[:60]
    'the ducts take more than its supply air brings, so more air '
    """
    other = ("a warmer supply (air_handler.heating_supply_F)" if kind == "heating"
             else "a colder supply (air_handler.supply_F)")
    if delivers_w <= 0:
        return (f"the ducts take more than its supply air brings, so more air at the same temperature is no fix: "
                f"give {other}, or insulate, seal or move the ducts")
    if airflow_ratio > BLOWER_RANGE:
        return (f"that is {airflow_ratio:.1f} times its airflow, beyond what a blower setting gives: give {other}, "
                "or insulate, seal or move the ducts")
    return ""


def case_checks(case, results):
    """Every check `check` and the report list for a case: the code's rules (attic.codes.rules.check_case), then
    those of its solved design states (the air handler, the roof deck's winter margin). results : the case's
    ConditionResult list (empty when it did not solve: those rules are then left out)."""
    from attic.codes.rules import check_case
    from attic.runs.deck import deck_moisture_rule

    return check_case(case) + air_handler_rule(results) + deck_moisture_rule(results)


def air_handler_rule(results):
    """The case's air handler against the design airflow, for `check` (attic.codes.rules.RuleResult list).

    results : the case's ConditionResult list (empty when it did not solve: the rule is then n/a).
    """
    from attic.codes.rules import DEFER, RuleResult
    from attic.units import BTUH, CFM

    rule = "Air handler airflow carries the design equipment load at the supply temperature"
    src = "design state"
    out = []
    for r in results:
        h = r.house
        if h.air_handler_m3_s is None:
            continue
        # what the case's air handler delivers to the house; what the house needs, and the airflow that carries it
        has = f"{h.air_handler_m3_s / CFM:,.0f} CFM: {h.air_handler_delivers_w / BTUH:,.0f} Btu/h"
        need = f"{h.house_w / BTUH:,.0f} Btu/h: {h.airflow_m3_s / CFM:,.0f} CFM"
        advice = air_handler_advice(r.kind, h.airflow_m3_s / h.air_handler_m3_s, h.air_handler_delivers_w)
        fix = "" if not h.air_handler_short else (
            advice or f"give the air handler {h.airflow_m3_s / CFM:,.0f} CFM, or change the supply temperature")
        out.append(RuleResult(f"{rule} ({r.kind})", src, has, need, "fail" if h.air_handler_short else "pass",
                              fix, "Equipment selection needs the manufacturer's data at the design conditions. "
                              + DEFER))
    return out
