"""Orchestration: one case at one condition -> attic, ducts, house totals, code checks."""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

from attic.network.nodes import build_network
from attic.network.solve import AtticState, solve
from attic.runs.coupling import duct_energy
from attic.runs.totals import HouseTotals, house_totals

if TYPE_CHECKING:
    from attic.codes.rules import VentCheck
    from ducts import DuctResult


@dataclass(frozen=True)
class ConditionResult:
    """Everything atticduct says about one case at one condition (SI inside; see attic.present.contract)."""

    case: str
    title: str
    kind: str
    attic_type: str
    attic: AtticState
    ducts: DuctResult | None  # scaled to the house load
    house: HouseTotals
    vents: VentCheck | None
    plane_azimuths: tuple
    pressure_pa: float
    deck: object | None = None  # attic.runs.deck.DeckMoisture, at the heating condition

    def to_dict(self):
        return {
            "case": self.case, "title": self.title, "condition": self.kind, "attic_type": self.attic_type,
            "attic": self.attic.to_dict(), "ducts": None if self.ducts is None else self.ducts.to_dict(),
            "house": self.house.to_dict(), "vents": None if self.vents is None else self.vents.to_dict(),
            "plane_azimuths": list(self.plane_azimuths), "pressure_pa": self.pressure_pa,
            "deck": None if self.deck is None else self.deck.to_dict(),
        }


def to_frame(results):
    """ConditionResults (e.g. from run_case) as a pandas DataFrame in SI: one row each, the main quantities."""
    from attic.runs.plain import frame

    rows = []
    for r in results:
        row = {"case": r.case, "condition": r.kind, "attic_type": r.attic_type, "attic_air_K": r.attic.air_K,
               "ceiling_w": r.house.ceiling_w, "ducts_w": r.house.ducts_w, "equipment_w": r.house.equipment_w,
               "tons": r.house.tons}
        if r.ducts is not None:
            row.update({"duct_conduction_w": r.ducts.conduction_w, "duct_leak_sensible_w": r.ducts.leakage_sensible_w,
                        "duct_leak_latent_w": r.ducts.leakage_latent_w,
                        "delivery_effectiveness": r.ducts.delivery_effectiveness})
        rows.append(row)
    return frame(rows)


def run_condition(case, cond, x0=None):
    """Solve one case at one condition. Raises attic.network.solve.SolveError when it does not close.

    x0 : optional starting temperatures (K), e.g. the solution of a neighbouring sweep point.
    """
    from attic.codes.rules import check_vents

    net = build_network(case, cond)
    state = solve(net, label=f'case "{case.name}", {cond.kind} design condition', x0=x0)
    duct_full = duct_energy(case, cond, net, state)
    totals, duct = house_totals(case, cond, state, duct_full)
    vents = check_vents(case)
    deck = None
    if cond.kind == "heating":
        from attic.runs.deck import deck_moisture

        deck = deck_moisture(case, net, state)
    return ConditionResult(case.name, case.title, cond.kind, case.attic_type, state, duct, totals, vents,
                           case.geometry.plane_azimuths, case.pressure, deck)


def run_case(case):
    """All design conditions of one case (list of ConditionResult)."""
    return [run_condition(case, cond) for cond in case.conditions]
