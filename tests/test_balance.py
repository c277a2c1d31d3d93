"""The attic heat balance: conservation, trends, bounds, trade facts and field measurements."""

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from attic.units import BTUH, K_to_F
from helpers import solve_case


def F(K):
    return float(K_to_F(K))


def attic_balance_error(a):
    """Heat in minus heat out over the whole attic, W (from the reported flows)."""
    f = a.heat_flows_w
    out = sum(v for k, v in f.items() if k not in ("solar_absorbed", "through_deck"))
    return f["solar_absorbed"] - out


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    outdoor=st.floats(80, 110), wind=st.floats(0, 20), hour=st.floats(8, 18), reflect=st.floats(0.03, 0.85),
    ceiling_r=st.floats(0, 60), deck_r=st.floats(0, 40), rb=st.booleans(), unvented=st.booleans(),
    ducts=st.booleans(), pitch=st.sampled_from(["3/12", "6/12", "9/12", "12/12"]), az=st.floats(0, 180),
)
def test_every_node_closes_and_the_attic_conserves_energy(outdoor, wind, hour, reflect, ceiling_r, deck_r, rb,
                                                         unvented, ducts, pitch, az):
    # first law: each node's residual is below the 0.1 W limit, and what the sun puts into the attic
    # leaves it by the listed paths (exact to the residuals)
    r = solve_case({
        "cooling.outdoor_F": outdoor, "cooling.wind_mph": wind, "cooling.solar_hour": hour,
        "roof.solar_reflectance": reflect, "attic.ceiling_r": ceiling_r, "roof.deck_r": deck_r,
        "roof.radiant_barrier": rb, "attic.type": "unvented" if unvented else "vented",
        "roof.pitch": pitch, "roof.ridge_azimuth_deg": az,
    }, with_ducts=ducts)
    a = r.attic
    assert a.residual_w < 0.1
    assert abs(attic_balance_error(a)) < 0.5
    assert abs(sum(a.residuals_w)) < 0.5


@pytest.mark.parametrize("kind", ["cooling", "heating"])
def test_conservation_in_both_conditions_with_ducts(kind):
    r = solve_case(with_ducts=True, kind=kind)
    assert r.attic.residual_w < 0.1 and abs(attic_balance_error(r.attic)) < 0.5


def ceiling_gain(overrides, **kw):
    return solve_case(overrides, **kw).attic.ceiling_to_house_w


def test_lighter_roof_lowers_ceiling_gain():
    # fact of the trade: a more reflective roof runs cooler
    gains = [ceiling_gain({"roof.solar_reflectance": rho}) for rho in (0.05, 0.25, 0.5, 0.8)]
    assert np.all(np.diff(gains) < 0)


def test_radiant_barrier_lowers_ceiling_gain():
    assert ceiling_gain({"roof.radiant_barrier": True}) < ceiling_gain({"roof.radiant_barrier": False})


def test_more_vent_area_lowers_ceiling_gain():
    gains = [ceiling_gain({"vents.low_nfa_in2_per_ft": n, "vents.high_nfa_in2_per_ft": 2 * n}) for n in (2, 4, 8, 12)]
    assert np.all(np.diff(gains) < 0)


def test_more_ceiling_r_lowers_ceiling_gain():
    gains = [ceiling_gain({"attic.ceiling_r": r}) for r in (11, 19, 30, 49)]
    assert np.all(np.diff(gains) < 0)


def test_more_deck_r_cools_an_unvented_attic():
    temps = [solve_case({"attic.type": "unvented", "attic.ceiling_r": 0, "roof.deck_r": r}).attic.air_K
             for r in (5, 10, 20, 30)]
    assert np.all(np.diff(temps) < 0)


@pytest.mark.parametrize("overrides", [{}, {"roof.solar_reflectance": 0.7}, {"cooling.solar_hour": 9},
                                       {"attic.type": "unvented", "roof.deck_r": 20, "attic.ceiling_r": 0}])
def test_attic_between_sky_and_hottest_sol_air(overrides):
    # second law: with nothing warmer than the roof surface inside (cooling, cold ducts), the attic can be
    # neither hotter than the hottest sol-air temperature nor colder than the sky
    a = solve_case(overrides, with_ducts=True).attic
    assert a.sky_K < a.air_K < max(a.sol_air_K)


def test_dark_vented_attic_in_full_sun_runs_far_above_outdoors():
    # common practice, no source: dark roof, 92 °F, full summer sun -> vented attic far above outdoors,
    # up to about 140 °F
    a = solve_case({"cooling.outdoor_F": 92, "cooling.solar_hour": 13}).attic
    assert 92 + 15 < F(a.air_K) < 145


def test_unvented_foam_attic_stays_near_indoors():
    # common practice, no source: foam under the deck, ceiling uninsulated, air exchanging with the house ->
    # within about 10-20 °F of indoors
    r = solve_case({"attic.type": "unvented", "roof.deck_r": 20, "attic.ceiling_r": 0,
                    "cooling.solar_hour": 13})
    assert 0 < F(r.attic.air_K) - 75 < 20


# Parker, D. S. and Sherwin, J. R. (1998). Comparative summer attic thermal performance of six roof
# constructions. ASHRAE Transactions 104(2); FSEC-PF-337-98. Flexible Roof Facility, Cocoa FL
# (28.4° N), a typical mid-June day with a 92 °F peak: measured peak attic air, °F. The cells' R-19
# ceilings, 1/300 vents and 5/12 pitch follow the paper; the dew point, wind and hour are our assumptions.
FSEC = {
    "dark shingle, 1/300": ({}, 134.9),
    "dark shingle, 1/300, radiant barrier": ({"roof.radiant_barrier": True}, 128.1),
    "dark shingle, 1/150, radiant barrier": ({"roof.radiant_barrier": True, "vents.low_nfa_in2_per_ft": 9.6,
                                              "vents.high_nfa_in2_per_ft": 15.4}, 116.1),
    "white metal (0.68)": ({"roof.covering": "metal-coated-white", "roof.solar_reflectance": 0.68}, 102.2),
    "red tile": ({"roof.covering": "clay-tile-red"}, 115.7),
    "white tile (0.72)": ({"roof.covering": "concrete-tile-white", "roof.solar_reflectance": 0.72}, 91.5),
}
FSEC_CELL = {
    "site.latitude_deg": 28.4, "site.terrain": "open", "cooling.month": 6, "cooling.day": 15,
    "cooling.solar_hour": 13, "cooling.outdoor_F": 92, "cooling.outdoor_dewpoint_F": 72, "cooling.wind_mph": 5,
    "cooling.indoor_F": 77, "house.conditioned_area_ft2": 1152, "roof.pitch": "5/12", "attic.ceiling_r": 19,
    "vents.low_length_ft": 64, "vents.low_nfa_in2_per_ft": 4.8, "vents.high_length_ft": 32,
    "vents.high_nfa_in2_per_ft": 7.7,
}


def fsec_model(name):
    over, _ = FSEC[name]
    return F(solve_case({**FSEC_CELL, **over}).attic.air_K)


@pytest.mark.parametrize("name", ["dark shingle, 1/300", "dark shingle, 1/300, radiant barrier",
                                  "dark shingle, 1/150, radiant barrier", "white metal (0.68)"])
def test_light_roofs_against_fsec_measurements(name):
    # Light coverings store little heat, so the steady peak should sit at or a little above the measured
    # peak: the deck's heat capacity delays and trims the real one. Allowed: -4 °F (measurement and our
    # assumed wind/humidity) to +8 °F (the capacity effect, a few °F for sheathing and shingles).
    model, measured = fsec_model(name), FSEC[name][1]
    assert -4.0 <= model - measured <= 8.0


@pytest.mark.parametrize("name", ["red tile", "white tile (0.72)"])
def test_tile_roofs_sit_above_fsec_measurements(name):
    # Tile is heavy and ventilated underneath (air flows in the gap between tile and deck), neither of which
    # the steady model has: it must over-predict, by at most about 15 °F.
    model, measured = fsec_model(name), FSEC[name][1]
    assert 0.0 <= model - measured <= 15.0


def test_fsec_ranking_and_radiant_barrier_effect():
    # the measured order of the shingle and metal roofs holds, and the radiant barrier's measured 6.8 °F
    # drop is matched within 3 °F
    names = ["dark shingle, 1/300", "dark shingle, 1/300, radiant barrier", "dark shingle, 1/150, radiant barrier",
             "white metal (0.68)"]
    temps = [fsec_model(n) for n in names]
    assert temps == sorted(temps, reverse=True)
    assert (temps[0] - temps[1]) == pytest.approx(134.9 - 128.1, abs=3.0)


def test_solver_reports_residuals_and_refuses_bad_results(monkeypatch):
    from attic.network import solve as balance
    from attic.network.nodes import build_network
    from helpers import make_case

    case = make_case()
    net = build_network(case, case.cooling)
    monkeypatch.setattr(balance, "RESIDUAL_LIMIT_W", -1.0)  # nothing can meet a negative limit
    with pytest.raises(balance.SolveError, match="did not close"):
        balance.solve(net, "test")


def test_heating_ceiling_loses_heat_and_ducts_lose_heat():
    r = solve_case(with_ducts=True, kind="heating")
    assert r.attic.ceiling_to_house_w < 0
    assert all(s.gain_w < 0 for s in r.ducts.segments)
    assert 0 < r.house.delivery_effectiveness < 1
    assert r.house.equipment_w > r.house.house_w > 20000 * BTUH
