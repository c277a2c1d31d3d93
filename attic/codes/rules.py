"""Code checks: plain-word verdicts on the case's vents, unvented assembly and ducts.

Each rule names the code, edition and section it paraphrases. Values recalled rather than read
are marked "from memory". The codes are paraphrased, not quoted: the adopted edition and local
amendments govern, and every rule's text ends by saying so.
"""

from __future__ import annotations

import math
from dataclasses import asdict, dataclass

from attic.case.load import vent_nfa_in2
from attic.physics.geometry import parse_pitch

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
    low = vent_nfa_in2(v, "low") / 144.0
    high = vent_nfa_in2(v, "high") / 144.0
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
    needs = ("the vent layout and, in zones 6-8, a Class I or II ceiling vapor retarder" if mode == "both"
             else "the vent layout or, in zones 6-8, a Class I or II ceiling vapor retarder")
    why = f"1/{ratio} applies: " + "; ".join(reasons) + f" (IRC {edition}: 1/300 needs {needs})"
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


def duct_min_r(location, diameter_in, edition=2021):
    """Minimum duct insulation R by location and size (IECC R403.3.1; 2018/2021, values from memory).

    Ducts in attics: R-8 at 3 in diameter and larger, R-6 below. Other unconditioned places:
    R-6 at 3 in and larger, R-4.2 below. 2012/2015: supply ducts in attics R-8, all others R-6.
    Ducts entirely inside the thermal envelope are exempt (returns None).
    """
    if location == "conditioned":
        return None
    big = diameter_in is None or diameter_in >= 3.0
    if int(edition) >= 2018:
        if location == "attic":
            return 8.0 if big else 6.0
        return 6.0 if big else 4.2
    return 8.0 if location == "attic" else 6.0


def duct_leakage_limit(all_inside, at_rough_in_without_handler, edition=2021):
    """Total duct leakage limit, CFM25 per 100 ft² of conditioned floor (IECC R403.3; from memory).

    4.0 in general; 3.0 at rough-in when the air handler is not yet installed; 8.0 (2021 and later)
    where every duct and the air handler are inside the thermal envelope.
    """
    if all_inside and int(edition) >= 2021:
        return 8.0
    return 3.0 if at_rough_in_without_handler else 4.0


def _rule_vents(c, edition):
    v = check_vents(c, edition)
    src = f"IRC {edition} R806.2"
    if not v.applies:
        return [RuleResult("Attic ventilation: net free area at least 1/150 (or 1/300) of the attic floor", src,
                           "unvented attic", "-", "n/a")]
    rules = [RuleResult(
        "Attic ventilation: net free area at least 1/150 of the attic floor, or 1/300 with the exception's "
        "conditions", src, f"{v.provided_nfa_ft2:.2f} ft² ({v.low_nfa_ft2:.2f} low + {v.high_nfa_ft2:.2f} high)",
        f"{v.required_nfa_ft2:.2f} ft² at 1/{v.ratio} of {v.floor_area_ft2:g} ft²; {v.why}",
        "pass" if v.complies else "fail", v.fix)]
    rules.append(RuleResult(
        "Intake (low) vent area at least the exhaust (high) vent area", "common practice, no source",
        f"{v.low_nfa_ft2:.2f} ft² low, {v.high_nfa_ft2:.2f} ft² high", "low >= high",
        "fail" if v.intake_below_exhaust else "pass",
        f"add {math.ceil((v.high_nfa_ft2 - v.low_nfa_ft2) * 144):g} in² of low vent" if v.intake_below_exhaust else "",
        "An exhaust larger than the intake can draw conditioned air through the ceiling. " + DEFER))
    return rules


def _rule_unvented(c, edition):
    roof, attic, zone = c["roof"], c["attic"], c["site"]["climate_zone"]
    src = f"IRC {edition} R806.5, Table R806.5"
    name = "Unvented attic: air-impermeable insulation at the deck for condensation control"
    if attic["type"] != "unvented":
        return [RuleResult(name, src, "vented attic", "-", "n/a")]
    kind = roof["deck_insulation"]
    if kind in ("spray-foam", "rigid-board"):
        imperm = roof["deck_r"]
    elif kind == "hybrid":
        imperm = roof["deck_air_impermeable_r"] or 0.0
    else:
        imperm = 0.0
    need = unvented_min_r(zone)
    covering = roof["covering"]
    if zone in UNVENTED_TILE_EXEMPT and "tile" in covering:
        need = 0
    provided = f"R-{imperm:g} air-impermeable ({kind}, R-{roof['deck_r']:g} in all), climate zone {zone}"
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


def _rule_ducts(c, edition):
    src = f"IECC {edition} R403.3.1"
    out = []
    for d in c["duct"]:
        need = duct_min_r(d["location"], d["diameter_in"], edition)
        where = {"attic": "in the attic", "conditioned": "inside conditioned space",
                 "ambient": "outside conditioned space"}[d["location"]]
        rule = f'Duct insulation: "{d["name"]}" ({d["side"]}, {where})'
        size = (f'{d["diameter_in"]:g} in' if d["diameter_in"] is not None
                else f'{d["width_in"]:g}x{d["height_in"]:g} in')
        if need is None:
            out.append(RuleResult(rule, src, f"R-{d['r_value']:g}, {size}", "none inside the thermal envelope",
                                  "n/a"))
            continue
        ok = d["r_value"] >= need - 1e-9
        out.append(RuleResult(rule, src, f"R-{d['r_value']:g}, {size}", f"at least R-{need:g}",
                              "pass" if ok else "fail", "" if ok else f"use R-{need:g} duct insulation or better"))
    return out


def _rule_leakage(c, edition):
    src = f"IECC {edition} R403.3"
    rule = "Duct leakage: total leakage at 25 Pa per 100 ft² of conditioned floor"
    leak = c["leakage"]
    if not c["duct"]:
        return [RuleResult(rule, src, "no ducts", "-", "n/a")]
    total = None
    if leak is not None:
        if leak["total_cfm25"] is not None:
            total = leak["total_cfm25"]
        elif leak["supply_cfm25"] is not None or leak["return_cfm25"] is not None:
            total = (leak["supply_cfm25"] or 0.0) + (leak["return_cfm25"] or 0.0)
    all_inside = all(d["location"] == "conditioned" for d in c["duct"])
    codes = c.get("codes") or {"air_handler_installed_at_rough_in": True}
    limit = duct_leakage_limit(all_inside, not codes["air_handler_installed_at_rough_in"], edition)
    area = c["house"]["conditioned_area_ft2"]
    if total is None:
        return [RuleResult(rule, src, "leakage given as fractions, not as a CFM25 test result",
                           f"{limit:g} CFM25 per 100 ft²", "n/a", "give leakage.total_cfm25 from a duct test to check")]
    per100 = total / area * 100.0
    allowed = limit * area / 100.0
    ok = per100 <= limit + 1e-9
    return [RuleResult(rule, src, f"{total:g} CFM25 = {per100:.2f} per 100 ft² of {area:g} ft²",
                       f"at most {limit:g} per 100 ft² ({allowed:.0f} CFM25)", "pass" if ok else "fail",
                       "" if ok else f"seal the ducts to {allowed:.0f} CFM25 or less ({total - allowed:.0f} less)")]


def check_case(c):
    """Every rule for a validated case dict (IP), in a fixed order (list of RuleResult)."""
    codes = c.get("codes") or {"irc_edition": 2021, "iecc_edition": 2021}
    irc, iecc = codes["irc_edition"], codes["iecc_edition"]
    return (_rule_vents(c, irc) + _rule_unvented(c, irc) + _rule_ducts(c, iecc) + _rule_leakage(c, iecc))


def check_lines(name, results):
    """One line of text (rich markup) per rule."""
    style = {"pass": "green", "fail": "bold red", "n/a": "dim"}
    lines = [f"[bold]Code checks — {name}[/bold]"]
    for r in results:
        line = (f"[{style[r.verdict]}]{r.verdict.upper():4s}[/] {r.rule} [dim]({r.source})[/dim]: "
                f"has {r.provided}; requires {r.required}.")
        if r.fix:
            line += f" [bold]Fix:[/bold] {r.fix}."
        if r.note != DEFER:
            line += f" {r.note.replace(DEFER, '').strip()}"
        lines.append(line + f" [dim]{DEFER}[/dim]")
    return lines
