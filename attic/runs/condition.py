"""Orchestration: one case at one condition -> attic, ducts, house totals, code checks.

At a design condition the equipment runs the whole hour and delivers exactly the house load, so the
attic, the duct gains and the loads are one solved state: the airflow is the unknown. Starting from the
case's air handler airflow, the attic and ducts are solved at airflow Q, and Q is moved towards the
airflow that delivers the house load at the case's supply temperature until
it settles (a fixed point, found by secant steps). The case's air handler is then
compared with that airflow.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from attic.network.build import build_network
from attic.network.solve import AtticState, SolveError, solve
from attic.runs.coupling import duct_energy
from attic.runs.totals import HouseTotals, house_load, house_totals

GAP_TOL = 1e-5  # the design state delivers the house load to within this fraction of it
LN_STEP = math.log(4.0)  # the largest step of ln Q while the design airflow is searched
LN_LIMIT = math.log(1000.0)  # no design airflow beyond 1,000 times the air handler's
MAX_ROUNDS = 60

if TYPE_CHECKING:
    from attic.codes.rules import VentCheck
    from ducts import DuctResult


@dataclass(frozen=True)
class ConditionResult:
    """Everything atticduct says about one case at one condition (SI inside; see attic.present.contract).

    attic_air_without_leaks_K: the attic air of the same state with the duct leakage set to zero.
    """

    case: str
    title: str
    kind: str
    attic_type: str
    attic: AtticState
    ducts: DuctResult | None  # at the design airflow, running the whole hour
    house: HouseTotals
    vents: VentCheck | None
    plane_azimuths: tuple
    pressure_pa: float
    deck: object | None = None  # attic.runs.deck.DeckMoisture, at the heating condition
    attic_air_without_leaks_K: float | None = None

    def to_dict(self):
        return {
            "case": self.case, "title": self.title, "condition": self.kind, "attic_type": self.attic_type,
            "attic": self.attic.to_dict(), "ducts": None if self.ducts is None else self.ducts.to_dict(),
            "house": self.house.to_dict(), "vents": None if self.vents is None else self.vents.to_dict(),
            "plane_azimuths": list(self.plane_azimuths), "pressure_pa": self.pressure_pa,
            "deck": None if self.deck is None else self.deck.to_dict(),
            "attic_air_without_leaks_K": self.attic_air_without_leaks_K,
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


def at_airflow(net, airflow):
    """The network with its air handler at another airflow, m3/s (the same supply temperature)."""
    system = net.ducts.with_airflow(airflow)
    return dataclasses.replace(net, ducts=system, duct_m_dot=net.duct_m_dot * (airflow / net.ducts.airflow))


def design_state(case, cond, net, label, x0=None):
    """The design condition's one solved state: (network at the design airflow, AtticState, DuctResult,
    W the case's air handler delivers at its own airflow).

    The airflow Q solves delivered(Q) = house load(Q), each side of which comes from the attic and ducts
    solved together at Q, running the whole hour. delivered(Q) rises with Q (more air at the same supply
    temperature) and steeply so for bare ducts, where a plain Q <- Q x load / delivered overshoots; so the
    root is found by secant steps on ln Q (each at most a factor of 4) and, once bracketed, the Illinois method.

    Raises SolveError when the airflow does not settle, ValueError when no airflow delivers the load.
    """

    state = solve(net, label=label, x0=x0)
    if net.ducts is None:
        return net, state, None, None
    base_net, Q0 = net, net.ducts.airflow
    memo = {}

    def at(lnQ):
        """(network, state, duct result, house load) at airflow exp(lnQ), warm-started from the nearest."""
        if lnQ in memo:
            return memo[lnQ]
        n = at_airflow(base_net, math.exp(lnQ)) if memo else base_net
        if memo:
            near = min(memo, key=lambda k: abs(k - lnQ))
            s0 = memo[near][1]
            st = solve(n, label=label, x0=np.asarray(s0.nodes_K))
        else:
            st = state
        d = duct_energy(case, cond, n, st)
        memo[lnQ] = (n, st, d, sum(house_load(case, cond, st)))
        return memo[lnQ]

    def gap(lnQ):
        _, _, d, house = at(lnQ)
        return d.delivered_w / house - 1.0

    ln0 = math.log(Q0)
    _, st0, d0, house0 = at(ln0)
    given_w = d0.delivered_w
    if house0 <= 0:  # nothing to deliver: the equipment is off, and so are the ducts
        off = dataclasses.replace(net, runtime=np.zeros_like(net.runtime))
        st = solve(off, label=label, x0=np.asarray(st0.nodes_K))
        return off, st, d0.scaled(0.0), given_w
    if not d0.equipment_w > 0:
        raise ValueError(no_work_message(case.name, cond.kind))
    root = run_steps(airflow_root_steps(ln0, gap(ln0), label, case.name, cond.kind), gap)
    n, st, d, house = at(root)
    # the state at the root delivers the house load to within the tolerance; the last factor (1 +- 1e-5)
    # only makes the parts add up to the totals exactly
    return n, st, d.scaled(house / d.delivered_w), given_w


SUPPLY_KEY = {"cooling": "air_handler.supply_F", "heating": "air_handler.heating_supply_F"}


def no_work_message(name, kind):
    """Why a point whose equipment does no cooling (heating) at its supply temperature has no design state."""
    return (f"{name} ({kind}): the equipment does no {kind} with this supply temperature; check "
            f"{SUPPLY_KEY[kind]}")


def airflow_root_steps(p0, g0, label, name, kind):
    """The search for ln Q where gap(ln Q) = delivered / house load - 1 is zero (see design_state), as a
    generator: it yields the next ln Q to try and is sent the gap there; its return value is the root.
    name, kind : the point's case name and condition, for the message when no airflow serves it.

    Written as a generator so that one point (`run_steps`) and many points solved together
    (attic.runs.batch) take exactly the same steps.
    """
    big, limit = LN_STEP, p0 + LN_LIMIT
    if abs(g0) < GAP_TOL:
        return p0
    p1 = p0 + (min(max(-math.log1p(g0), -big), big) if g0 > -1 else big)
    for _ in range(MAX_ROUNDS):
        if p1 > limit:
            break
        g1 = yield p1
        if abs(g1) < GAP_TOL:
            return p1
        if g1 * g0 < 0:
            return (yield from _illinois_steps(p0, g0, p1, g1, label))
        slope = (g1 - g0) / (p1 - p0)
        p2 = p1 - g1 / slope if slope > 0 else p1 + (big if g1 < 0 else -big)
        p0, g0, p1 = p1, g1, min(max(p2, p1 - big), p1 + big)
    raise ValueError(f"{name} ({kind}): even at 1,000 times the air handler's airflow, the air reaching the rooms "
                     "falls short of the house load at this supply temperature (the ducts lose it on the way); "
                     f"insulate or seal the ducts, or check {SUPPLY_KEY[kind]}")


def _illinois_steps(a, ga, b, gb, label):
    """The root of gap inside [a, b] (opposite signs) by the Illinois variant of regula falsi
    (Dowell & Jarratt 1971, BIT 11), stopping when |gap| < GAP_TOL (a generator, as airflow_root_steps)."""
    for _ in range(MAX_ROUNDS):
        c = b - gb * (b - a) / (gb - ga)
        gc = yield c
        if abs(gc) < GAP_TOL:
            return c
        if gc * gb < 0:
            a, ga = b, gb
        else:
            ga = ga / 2.0
        b, gb = c, gc
    raise SolveError(f"{label}: the design airflow did not settle in {MAX_ROUNDS} rounds (the load is still "
                     f"off by {abs(gb):.2g} of itself). No result is shown for it.")


def run_steps(steps, f):
    """Drive a search generator (airflow_root_steps) with the function f; its result."""
    try:
        p = next(steps)
        while True:
            p = steps.send(f(p))
    except StopIteration as done:
        return done.value


def attic_without_leaks(net, state, label):
    """Attic air of the same state with the duct leakage set to zero, K (a second solve)."""
    d = net.ducts
    if d is None or (d.supply_leak_fraction == 0 and d.return_leak_fraction == 0):
        return state.air_K
    tight = dataclasses.replace(d, supply_leak_fraction=0.0, return_leak_fraction=0.0)
    x = np.asarray(state.nodes_K)
    return solve(dataclasses.replace(net, ducts=tight), label=label + " without duct leakage", x0=x).air_K


def run_condition(case, cond, x0=None):
    """Solve one case at one condition. Raises attic.network.solve.SolveError when it does not close.

    x0 : optional starting temperatures (K), e.g. the solution of a neighbouring sweep point.

    Moist-air properties come from ducts.moist_air's tables of HAPropsSI's own values (enthalpy within 1 J/kg,
    tested), as they do for a year or a study of many points: so one point gives the same numbers alone as in
    any batch, and the solver does not pay 20-250 microseconds a direct call on every step.
    """
    from ducts.moist_air import tabulated

    with tabulated():
        return _run_condition(case, cond, x0)


def _run_condition(case, cond, x0):
    from attic.codes.rules import check_vents

    label = f'case "{case.name}", {cond.kind} design condition'
    net, state, duct, given_w = design_state(case, cond, build_network(case, cond), label, x0)
    airflow = given = None
    if duct is not None:
        airflow = net.ducts.airflow if np.any(net.runtime > 0) else 0.0
        given = (case.ducts.airflow, given_w)
    totals = house_totals(case, cond, state, duct, airflow, given)
    vents = check_vents(case)
    deck = None
    if cond.kind == "heating":
        from attic.runs.deck import deck_moisture

        deck = deck_moisture(case, net, state)
    return ConditionResult(case.name, case.title, cond.kind, case.attic_type, state, duct, totals, vents,
                           case.geometry.plane_azimuths, case.pressure, deck, attic_without_leaks(net, state, label))


def run_case(case):
    """All design conditions of one case (list of ConditionResult)."""
    return [run_condition(case, cond) for cond in case.conditions]
