import math

import numpy as np
import pytest
from scipy.integrate import solve_ivp
from trade_units import CFM, FT, FT2, INCH, R_IP

from ducts.segment import leaving_temperature, round_geometry, segment_transfer


@pytest.mark.parametrize("label, actual", [(4.2, 3.41), (8.0, 5.62)])
def test_installed_flex_duct_r_matches_palmiter_kruse(label, actual):
    # Palmiter, L. and Kruse, E. (2006). True R-values of round residential ductwork. ACEEE Summer Study on
    # Energy Efficiency in Buildings: a 6-in core with performs at and with R-8 at
    # (core area, films excluded). They publish two decimals; 0.03 is their rounding plus ours.
    d = 6 * INCH
    g = round_geometry(d, 1.0, label * R_IP)
    r_core = g.insulation_resistance * math.pi * d / R_IP
    assert r_core == pytest.approx(actual, abs=0.03)


def test_label_model_takes_the_label_at_face_value():
    d = 6 * INCH
    g = round_geometry(d, 1.0, 8 * R_IP, r_model="label")
    assert g.insulation_resistance * math.pi * d == pytest.approx(8 * R_IP)


def test_exponential_law_matches_integrated_ode():
    # Incropera (6th ed.) eq. (8.46b) is the solution of m cp dT/dx = (T_env - T)/R'; integrate numerically
    T_in, T_env, UA, mcp, L = 285.0, 330.0, 12.0, 600.0, 10.0
    sol = solve_ivp(lambda x, T: (T_env - T) * (UA / L) / mcp, (0, L), [T_in], rtol=1e-10, atol=1e-10)
    assert leaving_temperature(T_in, T_env, UA, mcp) == pytest.approx(sol.y[0, -1], abs=1e-6)


def test_conduction_fraction_matches_ashrae_152():
    # ASHRAE Standard 152 conduction fraction B = exp(-A/(1.08 Q R)) (IP: ft2, cfm, h.ft2.F/Btu), where
    # 1.08 = 60 min/h x 0.075 lb/ft3 x 0.24 Btu/lb.F is standard air. Fold our films into R = A/UA and use
    # standard air for m cp: B must be the same number.
    g = round_geometry(14 * INCH, 40 * FT, 6 * R_IP)
    Q_cfm = 1000.0
    rho, cp = 0.075 * 16.018463, 0.24 * 4186.8  # standard air in SI
    m = Q_cfm * CFM * rho
    r = segment_transfer(g, 285.0, m, cp, 325.0, 325.0, 0.9)
    B_ours = (325.0 - r["T_out"]) / (325.0 - 285.0)
    A_ft2 = g.outer_area / FT2
    R_ip = g.outer_area / r["UA"] / R_IP
    B_152 = math.exp(-A_ft2 / (1.08 * Q_cfm * R_ip))
    assert B_ours == pytest.approx(B_152, rel=2e-3)  # 1.08 is rounded from 1.0796


def test_convective_and_radiant_parts_add_up():
    g = round_geometry(8 * INCH, 5.0, 6 * R_IP)
    r = segment_transfer(g, 286.0, 0.08, 1010.0, 325.0, 335.0, 0.9)
    assert r["Q_conv"] + r["Q_rad"] == pytest.approx(r["Q"], rel=1e-12)
    assert r["Q"] > 0  # cold air in a hot attic gains heat
    assert r["Q_rad"] > 0  # the hotter surfaces radiate to it


def test_more_insulation_less_gain_and_vectorised():
    gains = [segment_transfer(round_geometry(8 * INCH, 5.0, R * R_IP), 286.0, 0.08, 1010.0, 325.0, 325.0, 0.9)["Q"]
             for R in (2, 4.2, 6, 8, 11)]
    assert np.all(np.diff(gains) < 0)
    r = segment_transfer(round_geometry(8 * INCH, 5.0, 6 * R_IP), np.array([286.0, 290.0]), 0.08, 1010.0,
                         np.array([325.0, 330.0]), np.array([325.0, 330.0]), 0.9)
    assert r["T_out"].shape == (2,)


def test_inside_film_uses_the_duct_air_not_the_attic_air():
    # The inside film is a property of the air inside the duct (Incropera et al., 6th ed., sect. 8.4: bulk
    # mean temperature of the flow). With the same duct air, a hotter attic must not change the film's
    # property temperature; check h_inside against the film computed at the run's mean duct air.
    from ducts.films import inside_film_coefficient

    g = round_geometry(8 * INCH, 5.0, 6 * R_IP)
    for T_attic in (320.0, 345.0):
        r = segment_transfer(g, 286.0, 0.08, 1010.0, T_attic, T_attic, 0.9)
        h_mean = inside_film_coefficient(0.08, g.hydraulic_diameter, g.flow_area, 0.5 * (286.0 + r["T_out"]), 1010.0)
        assert r["h_inside"] == pytest.approx(h_mean, rel=1e-4)


def test_label_model_adds_the_computed_films_on_top_of_the_label():
    # README: "label" is the label R on the core area plus the inside and outside films; so the wall per unit
    # length is the label's share plus two positive film resistances
    d = 6 * INCH
    g = round_geometry(d, 1.0, 8 * R_IP, r_model="label")
    r = segment_transfer(g, 285.0, 0.05, 1006.0, 325.0, 325.0, 0.9)
    assert r["R_total_per_length"] > g.insulation_resistance * 1.05


@pytest.mark.parametrize("r_label, d_in", [(4.2, 6), (8.0, 6), (6.0, 14)])
def test_ashrae152_model_matches_the_standards_conduction_fraction(r_label, d_in):
    # ASHRAE Standard 152 (2004): B = exp(-A_s / (1.08 Q R_s)) (IP), A_s the outer surface, R_s the label R
    # plus the air films (0.7 h.ft2.F/Btu, value from memory). With standard air for m cp the run's leaving
    # temperature must give the same B, whatever the computed films would have been.
    L = 20 * FT
    g = round_geometry(d_in * INCH, L, r_label * R_IP, r_model="ashrae152")
    Q_cfm = 150.0
    rho, cp = 0.075 * 16.018463, 0.24 * 4186.8  # standard air in SI
    r = segment_transfer(g, 285.0, Q_cfm * CFM * rho, cp, 325.0, 325.0, 0.9)
    B_ours = (325.0 - r["T_out"]) / (325.0 - 285.0)
    t_in = r_label * 0.357  # the jacket sits label R x k out (k of flex fiberglass, Btu.in/h.ft2.F)
    A_s = math.pi * (d_in + 2 * t_in) / 12.0 * (L / FT)  # ft2, by hand
    B_152 = math.exp(-A_s / (1.08 * Q_cfm * (r_label + 0.7)))
    assert B_ours == pytest.approx(B_152, rel=2e-3)  # 1.08 is rounded from 1.0796


def test_r_models_are_one_registry():
    from ducts.insulation import R_MODELS

    assert set(R_MODELS) == {"cylinder", "label", "ashrae152"}
    with pytest.raises(ValueError, match="is not one of"):
        round_geometry(0.15, 1.0, 1.0, r_model="flat")
