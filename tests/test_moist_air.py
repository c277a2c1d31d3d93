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
