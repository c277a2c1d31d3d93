"""CoolProp moist-air wrappers against psychrolib and ASHRAE table values."""

import numpy as np
import psychrolib
import pytest

from ducts import moist_air

psychrolib.SetUnitSystem(psychrolib.SI)
P = 101325.0

STATES = [(15.0, 0.3), (24.0, 0.5), (30.0, 0.6), (45.0, 0.25), (55.0, 0.15)]


@pytest.mark.parametrize("T_C, rh", STATES)
def test_humidity_ratio_vs_psychrolib(T_C, rh):
    # psychrolib implements ASHRAE Fundamentals 2017 ch. 1 (ideal gas, Hyland-Wexler saturation);
    # CoolProp's real-gas RP-1485 includes the enhancement factor (~1.004), so 0.6 % is their expected spread.
    ref = psychrolib.GetHumRatioFromRelHum(T_C, rh, P)
    assert moist_air.humidity_ratio_from_rh(T_C + 273.15, P, rh) == pytest.approx(ref, rel=6e-3)


@pytest.mark.parametrize("T_C, rh", STATES)
def test_enthalpy_dewpoint_volume_vs_psychrolib(T_C, rh):
    W = psychrolib.GetHumRatioFromRelHum(T_C, rh, P)
    T = T_C + 273.15
    # ASHRAE ch. 1 eq. (32) h = 1.006 t + W (2501 + 1.86 t) kJ/kg; same reference state as RP-1485
    assert moist_air.enthalpy(T, P, W) == pytest.approx(psychrolib.GetMoistAirEnthalpy(T_C, W), rel=3e-3,
                                                        abs=150.0)
    assert moist_air.dew_point(T, P, W) - 273.15 == pytest.approx(
        psychrolib.GetTDewPointFromHumRatio(T_C, W, P), abs=0.1)
    assert moist_air.specific_volume(T, P, W) == pytest.approx(psychrolib.GetMoistAirVolume(T_C, W, P), rel=2e-3)


def test_wetbulb_vs_psychrolib():
    ref = psychrolib.GetHumRatioFromTWetBulb(34.0, 25.0, P)
    assert moist_air.humidity_ratio_from_wetbulb(307.15, 298.15, P) == pytest.approx(ref, rel=6e-3)


def test_ashrae_table_saturated_air_at_20C():
    # ASHRAE Handbook-Fundamentals (2017) ch. 1, Table 2 at 20 °C: W_s = 0.014758 kg/kg,
    # h_s = 57.555 kJ/kg_da (values from memory); the table is RP-1485 itself, so 0.2 % is ample.
    Ws = moist_air.humidity_ratio_from_rh(293.15, P, 1.0)
    assert Ws == pytest.approx(0.014758, rel=2e-3)
    assert moist_air.enthalpy(293.15, P, Ws) / 1000 == pytest.approx(57.555, rel=2e-3)


def test_dewpoint_roundtrip_and_arrays():
    T = np.array([290.0, 300.0, 310.0])
    W = moist_air.humidity_ratio_from_rh(T, P, 0.5)
    assert W.shape == (3,)
    Tdp = moist_air.dew_point(T, P, W)
    assert np.allclose(moist_air.humidity_ratio_from_dewpoint(Tdp, P), W, rtol=1e-6)
    h = moist_air.enthalpy(T, P, W)
    assert np.allclose(moist_air.temperature_from_enthalpy(h, P, W), T, atol=1e-6)


def test_specific_heat_per_dry_air():
    # cp per kg dry air = cp_da + W cp_v, about 1006 + 1860 W J/(kg.K) (ASHRAE ch. 1 eq. (32) derivative)
    W = 0.012
    assert moist_air.specific_heat(300.0, P, W) == pytest.approx(1006 + 1860 * W, rel=5e-3)


def test_tables_for_long_arrays_match_direct_coolprop_calls():
    # Long arrays take HAPropsSI's own values from a 0.5 K grid, quadratic in W (ducts/moist_air.py). Bounds:
    # enthalpy within 1 J/kg (5e-5 of a typical duct enthalpy difference), cp within 3e-5, volume within
    # 5e-5, dew point within 0.01 K, humidity ratio from RH or dew point within 1e-4 (relative).
    from CoolProp.HumidAirProp import HAPropsSI

    rng = np.random.default_rng(7)
    n = moist_air.TABLE_MIN + 44
    T = rng.uniform(255.0, 345.0, n)
    Ws = np.array([HAPropsSI("W", "T", t, "P", P, "R", 1.0) for t in T])
    W = np.minimum(rng.uniform(0.0005, 0.03, n), 0.98 * Ws)
    RH = rng.uniform(0.05, 1.0, n)

    def direct(out, a, b, c, d):
        return np.array([HAPropsSI(out, a, x, "P", P, c, y) for x, y in zip(b, d, strict=True)])

    assert np.max(np.abs(moist_air.enthalpy(T, P, W) - direct("H", "T", T, "W", W))) < 1.0
    assert np.allclose(moist_air.specific_heat(T, P, W), direct("cp", "T", T, "W", W), rtol=3e-5)
    assert np.allclose(moist_air.specific_volume(T, P, W), direct("Vda", "T", T, "W", W), rtol=5e-5)
    assert np.max(np.abs(moist_air.dew_point(T, P, W) - direct("D", "T", T, "W", W))) < 0.01
    T2 = rng.uniform(255.0, 340.0, n)
    assert np.allclose(moist_air.humidity_ratio_from_rh(T2, P, RH), direct("W", "T", T2, "R", RH), rtol=1e-4)
    Tdp = rng.uniform(255.0, 300.0, n)
    assert np.allclose(moist_air.humidity_ratio_from_dewpoint(Tdp, P),
                       np.array([HAPropsSI("W", "T", t + 1, "P", P, "D", t) for t in Tdp]), rtol=1e-4)


def test_repeated_states_are_computed_once_and_come_back_in_place():
    T = np.array([300.0, 290.0, 300.0, 290.0])
    h = moist_air.enthalpy(T, P, 0.01)
    assert h[0] == h[2] and h[1] == h[3] and h[0] > h[1]


def test_a_table_filled_node_by_node_interpolates_as_the_whole_table_digit_for_digit():
    # the reference is the whole table of CoolProp's HAPropsSI values at every node (_quad_table)
    from ducts import _properties as props

    rng = np.random.default_rng(7)
    P = 97_123.0  # a pressure no other test asks for: the table starts empty
    for output in ("H", "C", "V"):
        whole = props._quad_table(output, P)
        for T in (rng.uniform(200.0, 380.0, 50), np.array([200.0, 273.5, 300.0, 380.0]), np.array(331.25)):
            part = props._quad_nodes(output, P, T)
            for k in range(3):
                assert np.array_equal(np.interp(T, props._TG, part[k]), np.interp(T, props._TG, whole[k]))
        assert np.isnan(props._quad_nodes(output, P, 300.0)[0]).any()  # only what was asked for was computed


def test_saturation_filled_node_by_node_gives_what_the_whole_table_gives_digit_for_digit():
    # the reference is the whole table of CoolProp's HAPropsSI saturated humidity ratios (_saturation_table)
    from ducts import _properties as props

    P = 95_321.0  # a pressure no other test asks for
    rng = np.random.default_rng(11)
    T = rng.uniform(250.0, 340.0, 40)
    W_few = np.array([0.004, 0.0113, 0.019])  # dew points inverted by bisection on the nodes
    W_many = rng.uniform(0.002, 0.025, 300)  # more than 64 states: the whole table

    def values():
        with moist_air.tabulated():
            return (moist_air.humidity_ratio_from_rh(T, P, 0.6), moist_air.humidity_ratio_from_dewpoint(T, P),
                    moist_air.dew_point(np.full(3, 300.0), P, W_few), moist_air.dew_point(np.full(300, 300.0), P,
                                                                                           W_many))

    props._SATURATION.pop(P, None)
    props._RECENT.clear()
    lazy = values()
    props._SATURATION[P] = props._saturation_table(P).copy()
    props._RECENT.clear()
    for a, b in zip(lazy, values(), strict=True):
        assert np.array_equal(a, b)
    props._SATURATION.pop(P, None)
    props._RECENT.clear()
    with moist_air.tabulated():
        moist_air.dew_point(np.full(3, 300.0), P, W_few)
    assert np.sum(~np.isnan(props._SATURATION[P])) < len(props._TGS) // 4  # the span of these W, not all
