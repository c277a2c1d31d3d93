"""IECC R403.3: duct insulation and duct leakage, read from the Case's ducts and declarations.

Ducts in an unvented attic sit inside the building thermal envelope (the insulation and air
barrier are at the roof deck), and IECC 2021 R403.3.1 exempts ducts "located completely inside
the building thermal envelope" from its insulation table (wording from memory). Their leakage is
still tested: R403.3.5 asks for a total-leakage test, and R403.3.6 allows 8.0 CFM25 per 100 ft²
where all ducts and the air handler are entirely within the building thermal envelope.
"""

from __future__ import annotations

from attic.codes.common import RuleResult, ip
from attic.units import FT2, INCH, R_IP
from ducts import CONDITIONED


def duct_min_r(location, diameter_in, edition=2021):
    """Minimum duct insulation R by location and size (IECC R403.3.1; 2018/2021, values from memory).

    Ducts in attics: R-8 at 3 in diameter and larger, R-6 below. Other unconditioned places:
    R-6 at 3 in and larger, R-4.2 below. 2012/2015: supply ducts in attics R-8, all others R-6.
    Ducts entirely inside the thermal envelope are exempt (returns None); pass location
    "conditioned" for them, including ducts in an unvented attic.
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


def envelope_at_deck(case):
    """Whether the building thermal envelope runs along the roof deck: an unvented attic whose deck carries the
    insulation (deck R above zero and at least the ceiling's). An unvented attic with a bare deck, or one insulated
    mostly at the ceiling, still has its envelope at the ceiling, and its ducts are outside it."""
    if case.attic_type != "unvented":
        return False
    return bool(case.r_deck > 0 and case.r_deck >= case.r_ceiling)  # the built case's R, m2.K/W


def inside_envelope(case, location):
    """Whether a duct location is inside the building thermal envelope: conditioned space, or an
    unvented attic whose envelope is the insulated, air-sealed roof deck (envelope_at_deck)."""
    return location == CONDITIONED or (location == "attic" and envelope_at_deck(case))


def _where(case, location):
    if location == CONDITIONED:
        return "inside conditioned space"
    if location == "attic":
        if envelope_at_deck(case):
            return "in the unvented attic, inside the thermal envelope"
        if case.attic_type == "unvented":
            return "in the unvented attic, outside the envelope (its insulation is at the ceiling)"
        return "in the attic"
    return "outside conditioned space"


def rule_ducts(case, edition):
    """One insulation verdict per duct (IECC R403.3.1)."""
    src = f"IECC {edition} R403.3.1"
    out = []
    segments = case.ducts.segments if case.ducts is not None else ()
    for d in segments:
        location = d.location.split(":")[0]
        diameter_in = None if d.diameter is None else ip(d.diameter, INCH)
        inside = inside_envelope(case, location)
        need = duct_min_r(CONDITIONED if inside else location, diameter_in, edition)
        rule = f'Duct insulation: "{d.name}" ({d.side}, {_where(case, location)})'
        size = f"{diameter_in:g} in" if diameter_in is not None else f"{ip(d.width, INCH):g}x{ip(d.height, INCH):g} in"
        r_label = ip(d.r_label, R_IP)
        if need is None:
            out.append(RuleResult(rule, src, f"R-{r_label:g}, {size}", "none inside the thermal envelope", "n/a"))
            continue
        ok = r_label >= need - 1e-9
        out.append(RuleResult(rule, src, f"R-{r_label:g}, {size}", f"at least R-{need:g}",
                              "pass" if ok else "fail", "" if ok else f"use R-{need:g} duct insulation or better"))
    return out


def rule_leakage(case, edition):
    """Total duct leakage against the IECC limit (R403.3; needs a CFM25 test result)."""
    src = f"IECC {edition} R403.3"
    rule = "Duct leakage: total leakage at 25 Pa per 100 ft² of conditioned floor"
    if case.ducts is None:
        return [RuleResult(rule, src, "no ducts", "-", "n/a")]
    dec = case.declared
    total = dec.leakage_cfm25
    all_inside = all(inside_envelope(case, d.location.split(":")[0]) for d in case.ducts.segments)
    limit = duct_leakage_limit(all_inside, not dec.air_handler_installed_at_rough_in, edition)
    area = ip(case.conditioned_area, FT2)
    if total is None:
        return [RuleResult(rule, src, "leak fractions, no CFM25 test result",
                           f"{limit:g} CFM25 per 100 ft²", "n/a", "give leakage.total_cfm25 from a duct test to check")]
    per100 = total / area * 100.0
    allowed = limit * area / 100.0
    ok = per100 <= limit + 1e-9
    return [RuleResult(rule, src, f"{total:g} CFM25 = {per100:.2f} per 100 ft² of {area:g} ft²",
                       f"at most {limit:g} per 100 ft² ({allowed:.0f} CFM25)", "pass" if ok else "fail",
                       "" if ok else f"seal the ducts to {allowed:.0f} CFM25 or less ({total - allowed:.0f} less)")]
