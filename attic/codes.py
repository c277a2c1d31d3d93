"""Code checks: plain-word verdicts on the case's vents, unvented assembly and ducts.

Each rule names the code, edition and section it paraphrases. Values recalled rather than read
are marked "from memory". The codes are paraphrased, not quoted: the adopted edition and local
amendments govern, and every rule's text ends by saying so.
"""

from __future__ import annotations

import math
from dataclasses import asdict, dataclass

from .geometry import parse_pitch

DEFER = "Check the edition your jurisdiction adopted; local amendments govern."


@dataclass(frozen=True)
class RuleResult:
    """One rule's verdict. verdict: "pass", "fail" or "n/a"."""

    rule: str
    source: str
    provided: str
    required: str
    verdict: str
    fix: str = ""
    note: str = DEFER

    def to_dict(self):
        return asdict(self)


@dataclass(frozen=True)
class VentCheck:
    """Attic ventilation against IRC R806.2 (IP units, as the code states them)."""

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

    def to_dict(self):
        return asdict(self)


def _area_in2(v, side):
    a = 0.0
    if v.get(f"{side}_length_ft") is not None:
        a += v[f"{side}_length_ft"] * v[f"{side}_nfa_in2_per_ft"]
    if v.get(f"{side}_count") is not None:
        a += v[f"{side}_count"] * v[f"{side}_nfa_in2_each"]
    return a


def _unit_of(v, side):
    """(in² per unit, unit word) to express a fix in the vents the case already uses."""
    if v.get(f"{side}_nfa_in2_per_ft"):
        return v[f"{side}_nfa_in2_per_ft"], "ft"
    if v.get(f"{side}_nfa_in2_each"):
        return v[f"{side}_nfa_in2_each"], "vents"
    return (9.0, "ft") if side == "low" else (18.0, "ft")  # common practice, no source: typical products


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


def check_vents(c, edition=2021):
    """Vented attic net free area against IRC R806.2.

    Parameters
    ----------
    c : validated case dict (IP), as attic.case.validate_raw returns
    edition : IRC edition year

    Returns
    -------
    VentCheck; `applies` is False for unvented attics.

    References
    ----------
    International Residential Code, R806.2 "Minimum vent area" (2012-2021 editions; paraphrased).
    """
    attic, v = c["attic"], c["vents"]
    floor = attic["floor_area_ft2"] or c["house"]["conditioned_area_ft2"]
    if attic["type"] != "vented" or v is None:
        return VentCheck(False, floor, 0.0, 0.0, 0.0, 0.0, 0, 0.0, True,
                         "an unvented attic has no vent-area requirement (IRC R806.5 applies instead)", "", False)
    low = _area_in2(v, "low") / 144.0
    high = _area_in2(v, "high") / 144.0
    total = low + high
    frac = high / total if total > 0 else 0.0
    tilt = parse_pitch(c["roof"]["pitch"])
    span = c["roof"]["span_ft"] or math.sqrt(floor / 2.0)
    ridge = span / 2.0 * math.tan(tilt)
    high_ok = v["high_below_ridge_ft"] <= 3.0
    low_ok = v["low_height_ft"] <= ridge / 3.0
    layout = upper_fraction_qualifies(frac) and high_ok and low_ok
    cz = c["site"]["climate_zone"]
    cold = cz[0] in "678"
    retarder = attic["ceiling_vapor_retarder"] in ("class-I", "class-II")
    mode = vent_ratio_rules(edition)
    if mode == "both":
        eligible = layout and (retarder or not cold)
    else:
        eligible = layout or (cold and retarder)
    reasons = []
    if layout:
        reasons.append(f"{frac:.0%} of the area is high vents within 3 ft of the ridge, the rest low")
    else:
        why_not = []
        if not upper_fraction_qualifies(frac):
            why_not.append(f"{frac:.0%} of the area is high vents (40-50 % needed)")
        if not high_ok:
            why_not.append(f"the high vents sit {v['high_below_ridge_ft']:g} ft below the ridge (3 ft at most)")
        if not low_ok:
            why_not.append("the low vents are not in the bottom third of the attic")
        reasons.append("; ".join(why_not))
    if cold:
        reasons.append(f"climate zone {cz}: ceiling vapor retarder {attic['ceiling_vapor_retarder']}")
    ratio = 300 if eligible else 150
    required = floor / ratio
    complies = total >= required - 1e-9
    why = (f"1/{ratio} applies ({mode} condition{'s' if mode == 'both' else ''} of the IRC {edition} "
           f"exception): " + "; ".join(reasons))
    fix = "" if complies else _vent_fix(v, low, high, floor, required, eligible, high_ok and low_ok,
                                        cold and not retarder and mode == "both")
    return VentCheck(True, floor, total, low, high, frac, ratio, required, complies, why, fix, low < high)


def _vent_fix(v, low, high, floor, required, eligible, positions_ok, blocked_by_retarder):
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
    per, unit = _unit_of(v, side)
    amount = math.ceil(area * 144.0 / per * 10.0) / 10.0 if unit == "ft" else math.ceil(area * 144.0 / per)
    name = "low (soffit/eave)" if side == "low" else "high (ridge/gable)"
    return (f"add {amount:g} {unit} of {name} vent at {per:g} in²{'/ft' if unit == 'ft' else ' each'} "
            f"({area:.2f} ft² more) to meet 1/{ratio}")
