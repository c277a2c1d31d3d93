"""Code checks: plain-word verdicts on the case's vents, unvented assembly and ducts.

The rules read a built Case (its geometry, vents, ducts and declarations), never the case file's
dict. One module per code: irc_vents (R806.2), irc_unvented (R806.5), iecc_ducts (R403.3);
common holds the verdict record and the deferral every rule ends with.
"""

from __future__ import annotations

from attic.codes.common import DEFER, RuleResult, check_lines
from attic.codes.iecc_ducts import duct_leakage_limit, duct_min_r, rule_ducts, rule_leakage
from attic.codes.irc_unvented import UNVENTED_MIN_R, UNVENTED_TILE_EXEMPT, rule_unvented, unvented_min_r
from attic.codes.irc_vents import VentCheck, check_vents, rule_vents, upper_fraction_qualifies, vent_ratio_rules

__all__ = [
    "DEFER", "UNVENTED_MIN_R", "UNVENTED_TILE_EXEMPT", "RuleResult", "VentCheck", "check_case", "check_lines",
    "check_vents", "duct_leakage_limit", "duct_min_r", "unvented_min_r", "upper_fraction_qualifies",
    "vent_ratio_rules",
]


def check_case(case):
    """Every rule for a built Case, in a fixed order (list of RuleResult)."""
    irc, iecc = case.declared.irc_edition, case.declared.iecc_edition
    return (rule_vents(case, irc) + rule_unvented(case, irc) + rule_ducts(case, iecc) + rule_leakage(case, iecc))
