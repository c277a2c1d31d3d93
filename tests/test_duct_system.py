"""Duct system energy balances: ASHRAE 152 delivery effectiveness, closure, trends, sweating."""

import math

import pytest
from trade_units import CFM, FT, INCH, R_IP, F_to_K

from ducts import (
    DuctSegment,
    DuctSystem,
    Surroundings,
    cfm25_to_operating,
    energy_balance,
    mass_flow,
    moist_air,
    thermal_chain,
)

P = 101325.0


def system(r=6.0, fs=0.05, fr=0.03, location="attic", length_s=40.0, length_r=10.0):
    return DuctSystem((
        DuctSegment("supply", "supply", location, length_s * FT, r * R_IP, diameter=14 * INCH),
        DuctSegment("return", "return", location, length_r * FT, r * R_IP, diameter=16 * INCH),
    ), 1000 * CFM, fs, fr)


T130, T75, T55 = (float(F_to_K(t)) for t in (130.0, 75.0, 55.0))


def solve(sys_, T_attic=T130, W_attic=0.018, W_house=0.0093, T_house=T75, T_supply=T55, mode="cooling", T_mrt=None):
    T_house, T_attic, T_supply = float(T_house), float(T_attic), float(T_supply)
    m = float(mass_flow(sys_, T_house, W_house, P))
    cp = float(moist_air.specific_heat(T_house, P, W_house))
    sur = {"attic": Surroundings(T_attic, T_attic if T_mrt is None else T_mrt, W_attic)}
    chain = thermal_chain(sys_, m, cp, T_supply, T_house, sur, P)
    return chain, energy_balance(sys_, chain, mode, W_house, sur, P)


@pytest.mark.parametrize("fs, fr, r", [(0.0, 0.0, 6.0), (0.05, 0.03, 6.0), (0.10, 0.10, 4.2), (0.15, 0.0, 8.0),
                                       (0.0, 0.12, 2.0)])
@pytest.mark.parametrize("mode, T_supply", [("cooling", 55.0), ("heating", 115.0)])
def test_delivery_effectiveness_matches_ashrae_152_for_dry_air(fs, fr, r, mode, T_supply):
    # ASHRAE Standard 152 (2004), design delivery effectiveness (sensible):
    # DE = a_s B_s - a_s B_s (1 - B_r a_r) dT_r/dT_e - a_s (1 - B_s) dT_s/dT_e,
    # dT_s = T_in - T_amb,s, dT_r = T_in - T_amb,r, dT_e the temperature change across the equipment.
    # Dry air (W = 0), ducts only exchanging with the attic: the two must agree to the small variation
    # of cp with temperature (0.2 %).
    sys_ = system(r, fs, fr)
    T_att = float(F_to_K(130.0 if mode == "cooling" else 30.0))
    chain, res = solve(sys_, T_attic=T_att, W_attic=0.0, W_house=0.0, T_supply=F_to_K(T_supply), mode=mode)
    T_h = chain.T_house
    sup, ret = chain.segments["supply"], chain.segments["return"]
    B_s = (T_att - sup["T_out"]) / (T_att - sup["T_in"])
    B_r = (T_att - ret["T_out"]) / (T_att - ret["T_in"])
    a_s, a_r = 1 - fs, 1 - fr
    dT_e = chain.T_supply - chain.T_equipment_in
    dT_s = T_h - T_att
    dT_r = T_h - T_att
    de_152 = a_s * B_s - a_s * B_s * (1 - B_r * a_r) * dT_r / dT_e - a_s * (1 - B_s) * dT_s / dT_e
    assert res.delivery_effectiveness == pytest.approx(de_152, rel=2e-3)


@pytest.mark.parametrize("mode", ["cooling", "heating"])
def test_parts_close_on_the_equipment_load(mode):
    # energy conservation: the coil's work from its entering state equals what is delivered plus every loss,
    # exactly, as mixing the return with its leaks keeps enthalpy (ASHRAE Handbook-Fundamentals (2017), ch. 1,
    # adiabatic mixing of moist airstreams)
    sys_ = system(6.0, 0.08, 0.06)
    T_att = F_to_K(128.0 if mode == "cooling" else 30.0)
    chain, res = solve(sys_, T_attic=T_att, T_supply=F_to_K(55.0 if mode == "cooling" else 115.0), mode=mode)
    assert res.delivered_w + res.parts_w == pytest.approx(res.equipment_w, rel=1e-9)
    # and the conduction parts equal the heat the segments took up (m cp dT along each run)
    seg_q = sum(s["Q"] for s in chain.segments.values())
    sign = 1 if mode == "cooling" else -1
    assert res.conduction_w == pytest.approx(sign * seg_q, rel=5e-3)


def test_latent_parts_come_from_humid_attic_air():
    _, res = solve(system(6.0, 0.05, 0.05), W_attic=0.020, W_house=0.0093)
    assert res.return_leak_latent_w > 0  # humid attic air drawn into the return
    _, dry = solve(system(6.0, 0.05, 0.05), W_attic=0.0093, W_house=0.0093)
    assert abs(dry.return_leak_latent_w) < 1.0


def test_more_duct_r_less_gain_and_more_leakage_lower_de():
    gains = [solve(system(r))[1].supply_conduction_w for r in (2.0, 4.2, 6.0, 8.0, 11.0)]
    assert all(a > b for a, b in zip(gains, gains[1:], strict=False))
    des = [solve(system(6.0, f, f))[1].delivery_effectiveness for f in (0.0, 0.05, 0.10, 0.20)]
    assert all(a > b for a, b in zip(des, des[1:], strict=False))


def test_ducts_in_conditioned_space_gain_nothing():
    # ASHRAE 152 convention: ducts inside the envelope have B = 1 and leaks stay in the house
    chain, res = solve(system(6.0, 0.05, 0.05, location="conditioned"))
    assert all(s["Q"] == 0 for s in chain.segments.values())
    assert res.delivery_effectiveness == pytest.approx(1.0, abs=1e-9)
    assert chain.sinks("attic")["Q_conv"] == 0 and chain.sinks("attic")["m_in"] == 0


def test_branches_share_the_trunk():
    sys_ = DuctSystem((
        DuctSegment("trunk", "supply", "attic", 30 * FT, 6 * R_IP, diameter=14 * INCH),
        DuctSegment("runs", "supply", "attic", 15 * FT, 6 * R_IP, diameter=6 * INCH, count=8, fed_by="trunk"),
        DuctSegment("big", "supply", "attic", 15 * FT, 6 * R_IP, diameter=8 * INCH, fed_by="trunk",
                    airflow=200 * CFM),
    ), 1000 * CFM, 0.1, 0.0)
    f = sys_.run_flows()
    assert f["trunk"] == pytest.approx(900 * CFM)
    assert f["runs"] == pytest.approx(700 * CFM / 8)
    with pytest.raises(ValueError, match="more than the air"):
        DuctSystem((DuctSegment("a", "supply", "attic", 1.0, 1.0, diameter=0.2, airflow=2000 * CFM),),
                   1000 * CFM).run_flows()


def test_jacket_sweats_below_the_dew_point_only():
    # physics of condensation: a jacket colder than the surrounding air's dew point sweats
    humid = float(moist_air.humidity_ratio_from_dewpoint(float(F_to_K(80.0)), P))
    _, wet = solve(system(r=0.5), T_attic=F_to_K(84.0), W_attic=humid, T_supply=F_to_K(50.0))
    assert wet.segments[0].sweats and wet.segments[0].dewpoint_margin_K < 0
    _, dry = solve(system(r=8.0), T_attic=F_to_K(130.0), W_attic=0.018, T_supply=F_to_K(55.0))
    assert not dry.segments[0].sweats and dry.segments[0].dewpoint_margin_K > 0


def test_cfm25_conversion():
    # power law with exponent 0.6 (ASHRAE F ch. 16 eq. (47)); 25 Pa is unchanged
    assert cfm25_to_operating(100.0, 25.0) == pytest.approx(100.0)
    # between an orifice (n = 0.5) and a long crack (n = 0.65), ASHRAE F (2017) ch. 16: doubling the
    # pressure multiplies the flow by 2^0.5-2^0.65
    assert 2**0.5 < cfm25_to_operating(100.0, 50.0) / 100.0 < 2**0.65


def test_invalid_topology():
    with pytest.raises(ValueError, match="names no duct"):
        DuctSystem((DuctSegment("a", "supply", "attic", 1.0, 1.0, diameter=0.2, fed_by="zz"),), 0.5)
    with pytest.raises(ValueError, match="cannot hang"):
        DuctSystem((DuctSegment("a", "supply", "attic", 1.0, 1.0, diameter=0.2),
                    DuctSegment("b", "return", "attic", 1.0, 1.0, diameter=0.2, fed_by="a")), 0.5)
    assert math.isfinite(solve(system())[1].delivery_effectiveness)


def test_output_names_the_insulation_model_used():
    label = DuctSystem((DuctSegment("s", "supply", "attic", 10.0, 1.0, diameter=0.3, r_model="label"),), 0.5)
    assert solve(label)[1].r_model == "label"
    assert solve(system())[1].r_model == "cylinder"
    mixed = DuctSystem((DuctSegment("s", "supply", "attic", 10.0, 1.0, diameter=0.3, r_model="label"),
                        DuctSegment("r", "return", "attic", 3.0, 1.0, diameter=0.3)), 0.5)
    assert solve(mixed)[1].r_model == "mixed: cylinder, label"


# ---- where the leaks open ------------------------------------------------------------------------

def _split_system(r_attic, **kw):
    """A bare trunk in a conditioned basement feeding insulated runs in the attic, and an attic return."""
    return DuctSystem((
        DuctSegment("trunk", "supply", "conditioned", 40 * FT, 0.0, diameter=16 * INCH),
        DuctSegment("runs", "supply", "attic", 20 * FT, r_attic * R_IP, diameter=6 * INCH, count=8, fed_by="trunk",
                    **kw.get("runs", {})),
        DuctSegment("return", "return", "attic", 15 * FT, r_attic * R_IP, diameter=16 * INCH),
        DuctSegment("return grille", "return", "conditioned", 5 * FT, 0.0, diameter=16 * INCH),
    ), 1000 * CFM, 0.10, 0.08)


def test_leaks_are_spread_by_bare_duct_area_not_by_the_jacket():
    # common practice, no source: leakage scales with the duct's own surface (seams and joints), so the
    # shares are the bare areas pi D L x count, whatever the insulation around them
    import math as m

    trunk, runs = m.pi * 16 * 40 * 1.0, m.pi * 6 * 20 * 8.0  # in.ft: the common factor cancels
    for r in (0.0, 6.0, 11.0):
        split = _split_system(r).leak_split("supply")
        assert split["conditioned"] == pytest.approx(trunk / (trunk + runs), rel=1e-9)
        assert split["attic"] == pytest.approx(runs / (trunk + runs), rel=1e-9)
        assert sum(split.values()) == pytest.approx(1.0)


def test_more_attic_duct_r_never_moves_leaks_into_the_attic_nor_raises_the_heating_duct_load():
    # the split system of issue 9: R-5 -> R-6 on the attic ducts once moved every supply leak into the attic
    # (its jacket area grew past the bare trunk's) and raised the heating duct load by half. Physics: more R
    # lowers conduction and changes nothing else, so the duct load must fall.
    T_att = F_to_K(30.0)
    loads = []
    for r in (4.2, 5.0, 6.0, 8.0):
        sys_ = _split_system(r)
        chain, res = solve(sys_, T_attic=T_att, W_attic=0.003, W_house=0.005, T_house=F_to_K(70.0),
                           T_supply=F_to_K(115.0), mode="heating")
        assert chain.supply_leaks["attic"] == pytest.approx(0.10 * chain.m_dot * sys_.leak_split("supply")["attic"])
        loads.append(res.duct_load_w)
    assert all(a > b for a, b in zip(loads, loads[1:], strict=False))


def test_a_given_leak_share_or_location_overrides_the_area_basis():
    shared = _split_system(6.0, runs={"leak_share": 1.0})  # only the runs carry a share: all supply leaks there
    assert shared.leak_split("supply") == {"attic": 1.0}
    import dataclasses

    placed = dataclasses.replace(_split_system(6.0), supply_leak_location="conditioned")
    assert placed.leak_split("supply") == {"conditioned": 1.0}
    with pytest.raises(ValueError, match="add up to 0"):
        _split_system(6.0, runs={"leak_share": 0.0})


@pytest.mark.parametrize("mode", ["cooling", "heating"])
def test_return_leaks_from_two_places_mix_and_the_parts_still_close(mode):
    # energy conservation with leaks in the house and in the attic: equipment = delivered + every part,
    # and the air entering the equipment is the flow-weighted mix of the return and both leak sources
    sys_ = _split_system(6.0)
    T_att = F_to_K(128.0 if mode == "cooling" else 30.0)
    chain, res = solve(sys_, T_attic=T_att, T_house=F_to_K(75.0), mode=mode,
                       T_supply=F_to_K(55.0 if mode == "cooling" else 115.0))
    sh = sys_.leak_split("return")
    assert set(sh) == {"attic", "conditioned"}
    T_mix = 0.92 * chain.T_return_end + 0.08 * (sh["attic"] * T_att + sh["conditioned"] * F_to_K(75.0))
    assert chain.T_equipment_in == pytest.approx(T_mix, rel=1e-12)
    assert res.delivered_w + res.parts_w == pytest.approx(res.equipment_w, rel=1e-9)
    # the share of the supply leaks that opens in the house is delivered, the rest is lost: against the same
    # system with every supply leak in the attic (the chain does not change, only where the leaked air goes)
    import dataclasses

    all_out = dataclasses.replace(sys_, supply_leak_location="attic")
    _, ref = solve(all_out, T_attic=T_att, T_house=F_to_K(75.0), mode=mode,
                   T_supply=F_to_K(55.0 if mode == "cooling" else 115.0))
    lost = res.supply_leak_sensible_w + res.supply_leak_latent_w
    assert lost == pytest.approx((1.0 - sys_.leak_split("supply")["conditioned"])
                                 * (ref.supply_leak_sensible_w + ref.supply_leak_latent_w), rel=1e-9)
