"""The design condition as one solved state: airflow, runtime, attic, duct gains and loads."""

import pytest

from attic.units import BTUH, CFM, F_to_K, K_to_F
from helpers import solve_case

UNVENTED = {"attic.type": "unvented", "roof.deck_r": 20, "attic.ceiling_r": 0}


def _supply_conduction_limit_btuh(r):
    """1.08 x CFM x (hottest surrounding - supply), Btu/h: all the sensible heat the air can take up.

    1.08 = 60 min/h x 0.075 lb/ft3 x 0.24 Btu/lb.F, the trade's sensible-heat factor for standard air
    (ASHRAE Handbook-Fundamentals, ch. 1, standard air; common practice). In heating the coldest surrounding.
    """
    cfm = r.house.airflow_m3_s / CFM
    T_s = float(K_to_F(r.ducts.supply_leaving_equipment_K))
    temps = [float(K_to_F(t)) for t in (r.attic.air_K, r.attic.floor_K, *r.attic.inner_K)]
    worst = max(temps) - T_s if r.kind == "cooling" else T_s - min(temps)
    return 1.08 * cfm * worst


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_the_equipment_delivers_the_house_load_running_the_whole_hour(kind):
    # one state: what the registers get at the solved airflow is the house load, with no factor applied after
    r = solve_case(with_ducts=True, kind=kind)
    assert r.ducts.delivered_w == pytest.approx(r.house.house_w, rel=2e-5)
    assert r.ducts.equipment_w == pytest.approx(r.house.equipment_w, rel=2e-5)
    assert r.ducts.mass_flow_kg_s > 0 and r.house.airflow_m3_s > 0


def test_uninsulated_ducts_never_gain_more_than_the_air_can_carry():
    # issue 9: bare ducts once reported about twice what their air could carry; physics bounds the supply
    # conduction by what the air warms up to the hottest thing around it
    for kind in ("cooling", "heating"):
        r = solve_case({"duct.*.r_value": 0}, with_ducts=True, kind=kind)
        assert r.ducts.supply_conduction_w / BTUH <= _supply_conduction_limit_btuh(r)
        assert r.ducts.supply_conduction_w > 0


def test_a_small_air_handler_is_flagged_and_not_extrapolated():
    small = solve_case({"air_handler.airflow_cfm": 400}, with_ducts=True)
    big = solve_case({"air_handler.airflow_cfm": 3000}, with_ducts=True)
    assert small.house.air_handler_short and not big.house.air_handler_short
    # the flag says what the given air handler delivers: less than the house needs
    assert small.house.air_handler_delivers_w < small.house.house_w < big.house.air_handler_delivers_w
    # and the design state does not depend on the air handler the case gives (it starts the iteration only)
    assert small.house.equipment_w == pytest.approx(big.house.equipment_w, rel=1e-4)
    assert small.house.airflow_m3_s == pytest.approx(big.house.airflow_m3_s, rel=1e-4)



def _air_handler_fix(r):
    from attic.runs.totals import air_handler_rule

    (rule,) = air_handler_rule([r])
    return rule


def test_supply_air_the_ducts_cool_below_the_room_gets_supply_or_duct_advice_not_more_airflow():
    # a fact of the trade: air that reaches the registers colder than the room heats nothing. 80 F supply to a
    # 70 F room at 200 CFM through bare, leaky ducts in a 35 F attic arrives below 70 F; only many times that
    # airflow outruns the ducts' loss, and no blower setting gives it.
    r = solve_case({"air_handler.heating_supply_F": 80, "air_handler.airflow_cfm": 200, "duct.*.r_value": 0,
                    "leakage.supply_fraction": 0.15}, with_ducts=True, kind="heating")
    assert r.house.air_handler_short and r.house.air_handler_delivers_w <= 0
    rule = _air_handler_fix(r)
    assert rule.verdict == "fail"
    assert "warmer supply (air_handler.heating_supply_F)" in rule.fix and "give the air handler" not in rule.fix


def test_an_air_handler_far_below_the_design_airflow_is_told_to_change_supply_or_ducts():
    # common practice, no source: a blower's settings span less than twice its airflow (BLOWER_RANGE)
    from attic.runs.totals import BLOWER_RANGE

    far = solve_case({"air_handler.airflow_cfm": 400}, with_ducts=True)
    ratio = far.house.airflow_m3_s / far.house.air_handler_m3_s
    assert far.house.air_handler_delivers_w > 0 and ratio > BLOWER_RANGE
    assert f"{ratio:.1f} times its airflow" in _air_handler_fix(far).fix
    near = far.house.airflow_m3_s / CFM / 1.2  # 20 % short: a blower setting away
    close = solve_case({"air_handler.airflow_cfm": near}, with_ducts=True)
    assert close.house.air_handler_short
    assert _air_handler_fix(close).fix.startswith("give the air handler")

def test_attic_without_the_duct_leakage_is_the_second_solve():
    tight = solve_case({"leakage.supply_fraction": 0.0, "leakage.return_fraction": 0.0}, with_ducts=True)
    assert tight.attic_air_without_leaks_K == tight.attic.air_K
    leaky = solve_case({"leakage.supply_fraction": 0.15}, with_ducts=True)
    # cold supply air dumped into a vented attic cools it: without the leaks it reads warmer
    assert leaky.attic_air_without_leaks_K > leaky.attic.air_K + 0.5


def test_unvented_heating_attic_sits_at_or_below_indoor_air():
    # Energy balance of the attic air at steady state: what the ducts put in plus what the house gives
    # (ceiling and exchange, both proportional to T_in - T_attic) equals what leaves to outdoors. When the
    # ducts at the solved runtime give less than the attic loses to outdoors, the house must give a positive
    # amount, so the attic sits at or below indoor air. Tight, R-8 ducts in an R-20 sealed attic.
    r = solve_case({**UNVENTED, "duct.*.r_value": 8, "leakage.supply_fraction": 0.02,
                    "leakage.return_fraction": 0.02}, with_ducts=True, kind="heating")
    f = r.attic.heat_flows_w
    from_ducts = -(f["ducts_from_air"] + f["ducts_from_surfaces"]) + f["supply_leak_into_attic"]
    to_outdoors = f["through_deck"] * -1 + f["leakage_to_outdoors"]
    assert 0 < from_ducts < to_outdoors
    assert r.attic.air_K <= float(F_to_K(70.0))  # tests/helpers.py BASE: heating indoor_F = 70


def test_each_sides_duct_runs_add_up_to_that_sides_conduction():
    # first law (ASHRAE Handbook-Fundamentals 2017, ch. 1: enthalpy per kg of dry air at the air's own humidity
    # ratio): the runs' m cp dT, with each side's air its own specific heat, is the enthalpy change the energy
    # balance gives that side. With the house air's cp on the coil-dried supply the runs had summed 0.1 % high
    # (5,199 against 5,193 Btu/h in the demo). Left: cp taken at the supply temperature, not along the run.
    from pathlib import Path

    from attic.api import design_conditions
    from attic.case.load import load_cases

    demo = Path(__file__).resolve().parent.parent / "cases" / "demo.toml"
    for case in load_cases(demo):
        for r in design_conditions(case):
            d, sign = r.ducts, (1.0 if r.kind == "cooling" else -1.0)
            if d is None or d.supply_conduction_w == 0.0:
                continue
            runs = {side: sign * sum(s.gain_w for s in d.segments if s.side == side) for side in ("supply", "return")}
            assert runs["supply"] == pytest.approx(d.supply_conduction_w, rel=2e-4), (case.name, r.kind)
            assert runs["return"] == pytest.approx(d.return_conduction_w, rel=2e-4, abs=1e-6), (case.name, r.kind)
