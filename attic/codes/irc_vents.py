"""IRC R806.2: the net free vent area of a vented attic, read from the Case and its geometry."""

from __future__ import annotations

import math
from dataclasses import asdict, dataclass

from attic.codes.common import DEFER, RuleResult, ip
from attic.units import FT, FT2

HIGH_WITHIN_FT = 3.0  # IRC R806.2 exception: upper vents not more than 3 ft below the ridge
TOL_FT = 1e-9  # lengths come back from SI; a vent placed exactly at a limit keeps its verdict


@dataclass(frozen=True)
class VentCheck:
    """Attic ventilation against IRC R806.2 (IP units, as the code states them).

    has_intake, has_exhaust : whether the attic has low and high vents (None when unvented). An attic
    with one kind only ventilates by wind alone and cannot use the 1/300 exception.
    """

    applies: bool
    floor_area_ft2: float
    provided_nfa_ft2: float
    low_nfa_ft2: float
    high_nfa_ft2: float
    upper_fraction: float
    ratio: int
    required_nfa_ft2: float
    complies: bool
    why: str
    fix: str
    intake_below_exhaust: bool
    has_intake: bool | None = None
    has_exhaust: bool | None = None

    def to_dict(self):
        return asdict(self)


def vent_ratio_rules(edition):
    """Whether the 1/300 exception needs both conditions (2018 and later) or either (2012, 2015).

    IRC R806.2 (from memory): 2012 and 2015 allow 1/300 where "one or more" of the conditions
    hold; 2018 and 2021 require "both" (the vapor retarder condition applying in zones 6-8 only).
    """
    return "both" if int(edition) >= 2018 else "either"


def upper_fraction_qualifies(fraction):
    """IRC R806.2 exception: 40 % to 50 % of the vent area in the upper attic (inclusive)."""
    # a small tolerance so that "exactly 40 %" written as lengths x NFA is not lost to rounding
    return 0.40 - 1e-9 <= fraction <= 0.50 + 1e-9


def _unit_of(product, side):
    """(in² per unit, unit word) to express a fix in the vents the case already uses."""
    if product is not None:
        return product.nfa_in2_per_unit, product.unit
    return (9.0, "ft") if side == "low" else (18.0, "ft")  # common practice, no source: typical products


def _one_kind_words(low, high):
    """Why an attic with one kind of vent cannot use the exception, and what ventilates it."""
    if high <= 0:
        return ("there are no high (exhaust) vents, so the exception's 40-50 % of the area near the ridge is "
                "missing; wind across the low vents alone ventilates this attic")
    return ("there are no low (intake) vents, so the exception's balance of the area in the bottom third is "
            "missing; wind across the high vents alone ventilates this attic")


def check_vents(case, edition=None):
    """Vented attic net free area against IRC R806.2.

    Parameters
    ----------
    case : attic.case.load.Case (its geometry, vents, climate zone and declarations)
    edition : IRC edition year (default: the case's codes.irc_edition)

    Returns
    -------
    VentCheck; `applies` is False for unvented attics.

    References
    ----------
    International Residential Code, R806.2 "Minimum vent area" (2012-2021 editions; paraphrased).
    R806.1 asks for cross ventilation, which low vents on both eaves (or gable vents at both ends) give,
    so an attic with one kind of vent is allowed at 1/150.
    """
    dec = case.declared
    edition = dec.irc_edition if edition is None else edition
    floor = ip(case.geometry.floor_area, FT2)
    v = case.vents
    if case.attic_type != "vented" or v is None:
        return VentCheck(False, floor, 0.0, 0.0, 0.0, 0.0, 0, 0.0, True,
                         "an unvented attic has no vent-area requirement (IRC R806.5 applies instead)", "", False)
    low = ip(v.A_low, FT2)
    high = ip(v.A_high, FT2)
    total = low + high
    frac = high / total if total > 0 else 0.0
    ridge = ip(case.geometry.ridge_height, FT)
    below_ridge = ip(v.high_below_ridge, FT)
    # a side without vents has no position to fail; a fix adds them where the exception wants them
    high_ok = high <= 0 or below_ridge <= HIGH_WITHIN_FT + TOL_FT
    low_ok = low <= 0 or ip(v.low_height, FT) <= ridge / 3.0 + TOL_FT
    layout = upper_fraction_qualifies(frac) and high_ok and low_ok
    cz = case.climate_zone
    cold = cz[0] in "678"
    retarder = dec.ceiling_vapor_retarder in ("class-I", "class-II")
    mode = vent_ratio_rules(edition)
    if mode == "both":
        eligible = layout and (retarder or not cold)
    else:
        eligible = layout or (cold and retarder)
    reasons = []
    if layout:
        reasons.append(f"{frac:.0%} of the area is high vents within 3 ft of the ridge, the rest low")
    elif low <= 0 or high <= 0:
        reasons.append(_one_kind_words(low, high))
    else:
        why_not = []
        if not upper_fraction_qualifies(frac):
            why_not.append(f"{frac:.0%} of the area is high vents (40-50 % needed)")
        if not high_ok:
            why_not.append(f"the high vents sit {below_ridge:g} ft below the ridge (3 ft at most)")
        if not low_ok:
            why_not.append("the low vents are not in the bottom third of the attic")
        reasons.append("; ".join(why_not))
    if cold:
        reasons.append(f"climate zone {cz}: ceiling vapor retarder {dec.ceiling_vapor_retarder}")
    ratio = 300 if eligible else 150
    required = floor / ratio
    complies = total >= required - 1e-9
    needs = ("the vent layout and, in zones 6-8, a Class I or II ceiling vapor retarder" if mode == "both"
             else "the vent layout or, in zones 6-8, a Class I or II ceiling vapor retarder")
    why = f"1/{ratio} applies: " + "; ".join(reasons) + f" (IRC {edition}: 1/300 needs {needs})"
    fix = "" if complies else _vent_fix(dec, low, high, floor, high_ok and low_ok,
                                        cold and not retarder and mode == "both")
    return VentCheck(True, floor, total, low, high, frac, ratio, required, complies, why, fix, low < high,
                     low > 0, high > 0)


def _vent_fix(dec, low, high, floor, positions_ok, blocked_by_retarder):
    """The smallest addition of low or high vent that makes the attic comply, in the case's own units."""
    options = []
    # plain 1/150 by adding one kind
    need150 = floor / 150.0 - (low + high)
    options.append((need150, "low", 150))
    options.append((need150, "high", 150))
    if positions_ok and not blocked_by_retarder:
        req300 = floor / 300.0
        # add low x: high/(low+x+high) in [0.4, 0.5], total >= req300
        lo_x = max(high / 0.5 - low - high, req300 - low - high, 0.0)
        hi_x = high / 0.4 - low - high
        if lo_x <= hi_x + 1e-12:
            options.append((lo_x, "low", 300))
        # add high y: (high+y)/(low+high+y) in [0.4, 0.5]
        lo_y = max((0.4 * (low + high) - high) / 0.6, req300 - low - high, 0.0)
        hi_y = (0.5 * (low + high) - high) / 0.5
        if lo_y <= hi_y + 1e-12:
            options.append((lo_y, "high", 300))
    area, side, ratio = min(options, key=lambda o: (o[0], o[1] != "low"))
    per, unit = _unit_of(dec.low_vent if side == "low" else dec.high_vent, side)
    # areas come back from SI: a hair above a whole tenth is rounding, not a tenth more to buy
    amount = (math.ceil(area * 144.0 / per * 10.0 - 1e-6) / 10.0 if unit == "ft"
              else math.ceil(area * 144.0 / per - 1e-6))
    name = "low (soffit/eave)" if side == "low" else "high (ridge/gable)"
    where = " within 3 ft of the ridge" if side == "high" and ratio == 300 and high <= 0 else ""
    return (f"add {amount:g} {unit} of {name} vent{where} at {per:g} in²{'/ft' if unit == 'ft' else ' each'} "
            f"({area:.2f} ft² more) to meet 1/{ratio}")


def rule_vents(case, edition):
    """The vent-area rule and the intake-at-least-exhaust practice, as RuleResults."""
    v = check_vents(case, edition)
    src = f"IRC {edition} R806.2"
    if not v.applies:
        return [RuleResult("Attic ventilation: net free area at least 1/150 (or 1/300) of the attic floor", src,
                           "unvented attic", "-", "n/a")]
    rules = [RuleResult(
        "Attic ventilation: net free area at least 1/150 of the attic floor, or 1/300 with the exception's "
        "conditions", src, f"{v.provided_nfa_ft2:.2f} ft² ({v.low_nfa_ft2:.2f} low + {v.high_nfa_ft2:.2f} high)",
        f"{v.required_nfa_ft2:.2f} ft² at 1/{v.ratio} of {v.floor_area_ft2:g} ft²; {v.why}",
        "pass" if v.complies else "fail", v.fix)]
    one_kind = v.high_nfa_ft2 <= 0  # no exhaust to weigh the intake against: n/a, not a pass (no intake fails)
    rules.append(RuleResult(
        "Intake (low) vent area at least the exhaust (high) vent area", "rule of thumb (no code section)",
        f"{v.low_nfa_ft2:.2f} ft² low, {v.high_nfa_ft2:.2f} ft² high", "low >= high",
        "n/a" if one_kind else "fail" if v.intake_below_exhaust else "pass",
        f"add {math.ceil((v.high_nfa_ft2 - v.low_nfa_ft2) * 144 - 1e-6):g} in² of low vent"
        if v.intake_below_exhaust else "",
        "An exhaust larger than the intake can draw conditioned air through the ceiling. " + DEFER))
    return rules
