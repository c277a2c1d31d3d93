"""The attic heat balance: conservation, trends, bounds, trade facts and field measurements."""

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from attic.network.build import build_network, ceiling_u
from attic.network.nodes import COOLING, HEATING
from attic.physics.atmosphere import SIGMA
from attic.physics.convection import EXTERIOR_CONVECTION
from attic.physics.sky import view_factor_to_sky
from attic.runs.condition import at_airflow, run_condition
from attic.runs.coupling import duct_energy
from attic.units import BTUH, K_to_F
from ducts import moist_air
from helpers import make_case, solve_case


def F(K):
    return float(K_to_F(K))


def first_law_imbalance(overrides=None, with_ducts=False, kind="cooling"):
    """Heat into the whole attic minus heat out of it, W, and the heat in, W.

    The control volume is the whole attic: both roof planes (outer surface, deck, inner surface), the
    air and the top of the ceiling insulation. Its boundary flows are recomputed here from the solved
    temperatures and the case's inputs, each in its textbook form, and never from the solver's flows or
    residuals: what crosses between the attic's own nodes (the deck, interior convection and radiation)
    cancels and does not appear. Heat in: the sun absorbed on the planes. Heat out: convection and
    long-wave exchange at the outer surfaces (sky and ground; the model takes the ground at the outdoor
    air temperature), conduction to the house through the ceiling, the air that leaves (vents or leaks,
    replaced by outdoor air) and the air exchanged with the house, the heat the duct walls take, and
    the duct leaks (supply air entering, attic air drawn into the return and replaced).
    """
    case = make_case(overrides, with_ducts)
    cond = {c.kind: c for c in case.conditions}[kind]
    r = run_condition(case, cond)
    a = r.attic
    g, P = case.geometry, case.pressure
    T_o, T_i, T_a = cond.T_out, cond.T_in, a.air_K
    T_so = np.array(a.outer_K)
    cp = moist_air.specific_heat(T_o, P, cond.W_out)  # the model's one cp for every air stream
    rho_o = 1.0 / moist_air.specific_volume(T_o, P, cond.W_out)
    rho_i = 1.0 / moist_air.specific_volume(T_i, P, cond.W_in)
    heat_in = (1.0 - case.solar_reflectance) * g.plane_area * sum(a.irradiance_w_m2)
    # the case's outside-film model, called as its paper states it (Clear et al. 2003 by default);
    # Incropera (6th ed.) eq. (1.7) grey exchange with sky and ground
    F_sky = view_factor_to_sky(g.tilt)
    h_out = EXTERIOR_CONVECTION[case.exterior_convection](T_so, T_o, cond.wind, g.tilt,
                                                          2.0 * (g.slope_length + g.length), g.plane_area,
                                                          case.roughness_multiplier)
    out = g.plane_area * np.sum(h_out * (T_so - T_o)
                                + case.thermal_emittance * SIGMA * (F_sky * (T_so**4 - a.sky_K**4)
                                                                    + (1 - F_sky) * (T_so**4 - T_o**4)))
    mode = np.array([HEATING if kind == "heating" else COOLING])
    out += g.floor_area * ceiling_u(case.r_ceiling, mode)[0] * (a.floor_K - T_i)
    vented = case.attic_type == "vented"
    m_out = rho_o * (a.ventilation_m3_s if vented else case.outdoor_leakage_ach * g.volume / 3600.0)
    out += m_out * cp * (T_a - T_o) + rho_i * case.house_exchange * cp * (T_a - T_i)
    if case.ducts is not None and r.house.airflow_m3_s > 0:
        # the ducts at the design state's airflow, running the whole hour; their leaks open in the attic in
        # the attic's share of each side
        net = at_airflow(build_network(case, cond), r.house.airflow_m3_s)
        d = duct_energy(case, cond, net, a)
        out += sum(s.gain_w for s in d.segments if s.location == "attic")
        f_s = net.ducts.leak_split("supply").get("attic", 0.0)
        f_r = net.ducts.leak_split("return").get("attic", 0.0)
        out += f_s * net.ducts.supply_leak_fraction * d.mass_flow_kg_s * cp * (T_a - cond.T_supply)
        T_replacement = T_o if vented else T_i
        out += f_r * net.ducts.return_leak_fraction * d.mass_flow_kg_s * cp * (T_a - T_replacement)
    return float(heat_in - out), float(heat_in)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    outdoor=st.floats(80, 110), wind=st.floats(0, 20), hour=st.floats(8, 18), reflect=st.floats(0.03, 0.85),
    ceiling_r=st.floats(0, 60), deck_r=st.floats(0, 40), rb=st.booleans(), unvented=st.booleans(),
    ducts=st.booleans(), pitch=st.sampled_from(["3/12", "6/12", "9/12", "12/12"]), az=st.floats(0, 180),
)
def test_the_attic_conserves_energy(outdoor, wind, hour, reflect, ceiling_r, deck_r, rb, unvented, ducts, pitch,
                                    az):
    # first law over the whole attic, from its boundary flows (see first_law_imbalance). The solver
    # accepts a node off by up to 0.1 W, six nodes: 1 W bounds what it may leave; a term missing, doubled
    # or of the wrong sign would be hundreds of watts against ~10^5 W of sun.
    imbalance, heat_in = first_law_imbalance({
        "cooling.outdoor_F": outdoor, "cooling.wind_mph": wind, "cooling.solar_hour": hour,
        "roof.solar_reflectance": reflect, "attic.ceiling_r": ceiling_r, "roof.deck_r": deck_r,
        "roof.radiant_barrier": rb, "attic.type": "unvented" if unvented else "vented",
        "roof.pitch": pitch, "roof.ridge_azimuth_deg": az,
    }, with_ducts=ducts)
    assert heat_in > 0
    assert abs(imbalance) < 1.0


@pytest.mark.parametrize("kind", ["cooling", "heating"])
@pytest.mark.parametrize("attic_type", ["vented", "unvented"])
def test_conservation_in_both_conditions_with_ducts(kind, attic_type):
    imbalance, _ = first_law_imbalance({"attic.type": attic_type}, with_ducts=True, kind=kind)
    assert abs(imbalance) < 1.0


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


# Known deviations, left visible rather than hidden by a wider band: with whole-roof convection (Clear et al.)
# the glass-smooth white metal roof reads 8.1 °F above measured; the white tile, 9.8 °F (its mass and the
# tile's own ventilation paths, e.g. the gaps between tiles, are not in the steady model).
_OUTSIDE_BAND = {"white metal (0.68)", "white tile (0.72)"}


@pytest.mark.parametrize("name", [pytest.param(n, marks=pytest.mark.xfail(strict=True, reason="known deviation"))
                                  if n in _OUTSIDE_BAND else n for n in FSEC])
def test_roofs_against_fsec_measurements(name):
    # The steady peak should sit at or a little above the measured peak: the roof's heat capacity delays
    # and trims the real one. Allowed: -4 °F (measurement and our assumed wind/humidity) to +8 °F (the
    # capacity effect, a few °F for sheathing and shingles). Tile now has its ventilated batten gap.
    model, measured = fsec_model(name), FSEC[name][1]
    assert -4.0 <= model - measured <= 8.0


@pytest.mark.parametrize("name", ["white metal (0.68)", "white tile (0.72)"])
def test_roofs_outside_the_band_still_err_warm_and_by_little(name):
    # the two known deviations err on the warm (safe for sizing) side, within the 15 °F the tile roofs were
    # allowed before their gap was modelled
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
    from attic.network.build import build_network
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


def test_newton_with_the_stacked_jacobian_agrees_with_scipy_root():
    # scipy.optimize.root (MINPACK hybrd, its own finite differences) is the reference solver
    from pathlib import Path

    import numpy as np
    from scipy.optimize import root

    from attic.case.load import load_cases
    from attic.network.build import build_network
    from attic.network.solve import jacobian_rows, solve

    root_dir = Path(__file__).resolve().parent.parent / "cases"
    for path in sorted(root_dir.glob("*.toml")):
        for case in load_cases(path):
            for cond in case.conditions:
                net = build_network(case, cond)
                st = solve(net)
                x = np.array([*st.outer_K, *st.inner_K, st.air_K, st.floor_K])
                ref = root(lambda y, net=net: net.residuals(y[None, :])[0], net.initial_guess()[0], method="hybr",
                           options={"xtol": 1e-12})
                # the first six nodes are the ones every network has (a batten gap adds four after them)
                assert np.max(np.abs(ref.x[:6] - x)) < 1e-6, (path.name, case.name, cond.kind)
                x = ref.x
                # the stacked Jacobian against one built column by column
                J = jacobian_rows(net, x[None, :])[0]
                r0 = net.residuals(x[None, :])[0]
                for j in range(len(x)):
                    xp = x.copy()
                    xp[j] += 1e-4
                    assert np.allclose(J[:, j], (net.residuals(xp[None, :])[0] - r0) / 1e-4, rtol=1e-6, atol=1e-5)
