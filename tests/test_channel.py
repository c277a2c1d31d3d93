"""The ventilated gap under a covering on battens: closed forms, the network's use of it, and its limits."""

import numpy as np
import pytest
from scipy.integrate import solve_ivp

from attic.physics.channel import channel_heat_to_air, channel_velocity, radiation_between_plates, stack_pressure
from helpers import make_case, solve_case


def test_velocity_is_plane_poiseuille_without_losses_and_an_orifice_without_friction():
    # White, Viscous Fluid Flow (3rd ed.) sect. 3-3: plane Poiseuille flow, mean V = b^2 dp / (12 mu L)
    for dp, b in ((0.5, 0.01), (2.0, 0.019), (5.0, 0.04)):
        assert channel_velocity(dp, 4.0, b, 1.9e-5, 1.1, 0.0) == pytest.approx(b**2 * dp / (12 * 1.9e-5 * 4.0))
    # with friction negligible (a very short channel) the losses alone: V = (2 dp / (K rho))^(1/2)
    assert channel_velocity(1.0, 1e-9, 0.02, 1.9e-5, 1.1, 1.5) == pytest.approx(np.sqrt(2 / (1.5 * 1.1)), rel=1e-6)
    # and in between, the root balances the sum of both exactly
    V = channel_velocity(1.3, 5.0, 0.019, 1.9e-5, 1.1, 1.5)
    assert 12 * 1.9e-5 * 5.0 * V / 0.019**2 + 0.75 * 1.1 * V**2 == pytest.approx(1.3, rel=1e-12)


def test_heat_taken_up_matches_the_integrated_channel_with_one_heated_wall():
    # one wall at T_w, the other adiabatic: m cp dT/dx = h W (T_w - T) integrated numerically (scipy) against
    # Incropera et al. (6th ed.) eq. (8.41b)
    m_cp, h, W, L, T_w, T_in = 40.0, 3.5, 5.0, 6.0, 335.0, 305.0
    sol = solve_ivp(lambda x, T: h * W * (T_w - T) / m_cp, (0, L), [T_in], rtol=1e-11, atol=1e-11)
    assert channel_heat_to_air(m_cp, h * W * L, T_w, T_in) == pytest.approx(m_cp * (sol.y[0, -1] - T_in), rel=1e-7)


def test_stack_and_radiation_closed_forms():
    # ASHRAE Handbook-Fundamentals (2017) ch. 16: dp = g H (rho_o - rho_i), ideal gas at one pressure
    rho_o, T_o, T_i, H = 1.16, 303.0, 323.0, 2.2
    assert stack_pressure(rho_o, T_o, T_i, H) == pytest.approx(9.80665 * H * (rho_o - rho_o * T_o / T_i))
    # Incropera (6th ed.) Table 13.3, infinite parallel planes; black planes give sigma (T1^4 - T2^4)
    assert radiation_between_plates(340.0, 320.0, 1.0, 1.0) == pytest.approx(5.670374419e-8 * (340**4 - 320**4))


def test_solved_gap_satisfies_its_own_buoyancy_friction_balance_and_closes():
    from attic.network.build import build_network
    from attic.network.nodes import I_GAP_AIR
    from attic.network.solve import solve_hours
    from ducts.air_transport import viscosity_sutherland

    case = make_case({"roof.covering": "clay-tile-red"})
    net = build_network(case, case.cooling)
    assert net.n_nodes == 10
    st = solve_hours(net)
    assert np.all(st.residual_w < 0.1)
    f = net.flows(st.x)
    T_gap = st.x[0, I_GAP_AIR:]
    rho = net.rho_out[0] * net.T_out[0] / T_gap
    V = f["gap_m_dot"][0] / (rho * net.gap * net.areas[0] / net.slope_length)
    dp = 9.80665 * net.slope_length * np.sin(net.tilt) * (net.rho_out[0] - rho)
    loss = 12 * viscosity_sutherland(T_gap) * net.slope_length * V / net.gap**2 + 0.75 * rho * V**2
    assert loss == pytest.approx(dp, rel=1e-9)
    # the sun's heat leaves by the listed paths, the gap's air among them
    a = solve_case({"roof.covering": "clay-tile-red"}).attic
    out = sum(v for k, v in a.heat_flows_w.items() if k not in ("solar_absorbed", "through_deck"))
    assert a.heat_flows_w["under_covering_air_out"] > 0
    assert abs(a.heat_flows_w["solar_absorbed"] - out) < 0.5


def test_a_gap_of_zero_is_todays_roof_and_a_deeper_gap_runs_cooler():
    # the same tile with no gap is the six-node network of a covering on the deck, to the last digit
    base = solve_case({"roof.covering": "clay-tile-red", "roof.batten_gap_in": 0})
    again = solve_case({"roof.covering": "clay-tile-red", "roof.batten_gap_in": 0.0})
    assert base.attic.air_K == again.attic.air_K and len(base.attic.residuals_w) == 6
    # fact of the trade (above-sheathing ventilation): more air space under the tile, a cooler attic
    temps = [solve_case({"roof.covering": "clay-tile-red", "roof.batten_gap_in": g}).attic.air_K
             for g in (0, 0.5, 0.75, 1.5, 3.0)]
    assert np.all(np.diff(temps) < 0)


def test_gap_works_over_a_day_and_a_year():
    # the ten-node network runs through the periodic day (with the roof's mass) and the batched year
    from attic.case.weather import Weather, read_weather
    from attic.runs.day import run_design_day
    from attic.runs.year import run_year

    case = make_case({"roof.covering": "concrete-tile-grey", "site.longitude_deg": -90.0, "site.utc_offset_h": -6})
    steady, heavy = run_design_day(case), run_design_day(case, mass=True)
    assert np.all(np.isfinite(heavy.attic_air_K))
    assert heavy.attic_air_K.max() < steady.attic_air_K.max()  # the tile's mass trims the peak
    w = read_weather("cases/demo-weather.csv")
    a, b = 4000, 4100
    span = Weather(w.times[a:b], w.T_dry[a:b], w.T_dew[a:b], None, w.ghi[a:b], None, None, w.wind[a:b])
    y = run_year(case, span)
    assert np.all(np.isfinite(y.hourly["attic_air_K"]))
