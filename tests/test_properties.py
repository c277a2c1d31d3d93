"""Decisions move the way physics says they must: property tests over random valid cases (hypothesis).

Each draws a case from tests/helpers.py's invented house with random duct R, leakage, vents, roof
reflectance and weather, solves its cooling design condition, and compares it with the same case changed
in one direction. A small tolerance absorbs the solvers' own tolerances (residuals below 0.1 W, the
design airflow to 1e-5 of the load).
"""

import pytest
from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st

from attic.runs.condition import run_condition
from attic.units import BTUH, CFM, K_to_F
from helpers import make_case

SETTINGS = settings(max_examples=8, deadline=None, suppress_health_check=[HealthCheck.too_slow])
# the case hypothesis found where leaky bare ducts hold a vented attic below outdoor air (see below)
COLD_DUCTS = {"duct.*.r_value": 0.0, "leakage.supply_fraction": 0.125, "leakage.return_fraction": 0.0,
              "vents.low_length_ft": 20.0, "vents.high_length_ft": 10.0, "roof.solar_reflectance": 0.625,
              "cooling.outdoor_F": 85.0, "cooling.wind_mph": 14.0, "air_handler.airflow_cfm": 600.0}
TOL_W = 0.5  # W: well above the solvers' tolerances, far below any load a decision turns on
TOL_K = 1e-3

cases = st.fixed_dictionaries({
    "duct.*.r_value": st.sampled_from([0.0, 2.0, 4.2, 6.0, 8.0]),
    "leakage.supply_fraction": st.floats(0.0, 0.2),
    "leakage.return_fraction": st.floats(0.0, 0.2),
    "vents.low_length_ft": st.floats(20.0, 150.0),
    "vents.high_length_ft": st.floats(10.0, 60.0),
    "roof.solar_reflectance": st.floats(0.03, 0.7),
    "cooling.outdoor_F": st.floats(85.0, 110.0),
    "cooling.wind_mph": st.floats(0.0, 15.0),
    "air_handler.airflow_cfm": st.floats(600.0, 2000.0),
})


def cooling(overrides):
    case = make_case(overrides, with_ducts=True)
    return run_condition(case, case.cooling)


@SETTINGS
@given(cases, st.sampled_from([1.0, 2.0, 4.0]))
def test_more_duct_r_never_raises_conduction_or_duct_load(ov, more):
    # Fourier: a thicker insulation shell conducts less; nothing else about the ducts changes
    lo = cooling(ov)
    hi = cooling({**ov, "duct.*.r_value": ov["duct.*.r_value"] + more})
    assert hi.ducts.conduction_w <= lo.ducts.conduction_w + TOL_W
    assert hi.house.ducts_w <= lo.house.ducts_w + TOL_W


@SETTINGS
@example(COLD_DUCTS, 2.0)
@given(cases, st.floats(1.2, 3.0))
def test_more_vent_area_brings_a_vented_attic_towards_outdoor_air(ov, k):
    # more outdoor air through the attic (ASHRAE F ch. 16 flows) pulls its air towards the outdoor
    # temperature. A sunny attic sits above outdoor air, so more vent area never warms it; but bare, leaky
    # cold ducts can hold a vented attic below outdoor air (hypothesis found one: R-0 ducts, 12.5 % supply
    # leakage, 85 F, a white roof), and there more vent area warms it towards outdoor, as physics says
    lo = cooling(ov)
    hi = cooling({**ov, "vents.low_length_ft": ov["vents.low_length_ft"] * k,
                  "vents.high_length_ft": ov["vents.high_length_ft"] * k})
    T_o = make_case(ov, with_ducts=True).cooling.T_out
    assert abs(hi.attic.air_K - T_o) <= abs(lo.attic.air_K - T_o) + TOL_K
    if lo.attic.air_K > T_o + TOL_K:
        assert hi.attic.air_K <= lo.attic.air_K + TOL_K


@SETTINGS
@given(cases, st.floats(0.05, 0.3))
def test_higher_solar_reflectance_never_warms_the_attic(ov, more):
    # less absorbed sun, (1 - rho) G, on the roof: every node of the network is fed less heat
    lo = cooling(ov)
    hi = cooling({**ov, "roof.solar_reflectance": min(ov["roof.solar_reflectance"] + more, 1.0)})
    assert hi.attic.air_K <= lo.attic.air_K + TOL_K


@SETTINGS
@given(cases)
def test_ducts_moved_inside_gain_nothing(ov):
    # ASHRAE Standard 152's convention: ducts and leaks inside the envelope are no loss
    r = cooling({**ov, "duct.*.location": "conditioned"})
    assert r.house.ducts_w == pytest.approx(0.0, abs=1e-6)
    # zero to round-off of the enthalpy differences (1e-6 W against loads of 1e3-1e4 W)
    for part in (r.ducts.conduction_w, r.ducts.leakage_sensible_w, r.ducts.leakage_latent_w):
        assert part == pytest.approx(0.0, abs=1e-6)
    assert r.house.delivery_effectiveness == pytest.approx(1.0, abs=1e-9)


@SETTINGS
@given(cases)
def test_supply_conduction_never_exceeds_what_the_air_can_carry(ov):
    # 1.08 x CFM x (hottest surrounding - supply), IP: the sensible heat of all the supply air warmed to the
    # hottest thing around it (1.08 = 60 x 0.075 lb/ft3 x 0.24 Btu/lb.F, standard air; common practice)
    r = cooling(ov)
    cfm = r.house.airflow_m3_s / CFM
    hottest = float(K_to_F(max(r.attic.air_K, r.attic.floor_K, *r.attic.inner_K)))
    T_s = float(K_to_F(r.ducts.supply_leaving_equipment_K))
    assert r.ducts.supply_conduction_w / BTUH <= 1.08 * cfm * (hottest - T_s)
