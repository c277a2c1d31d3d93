import pytest
from CoolProp.HumidAirProp import HAPropsSI

from ducts.air_transport import conductivity_sutherland, viscosity_sutherland
from ducts.films import nusselt_churchill_chu_cylinder, nusselt_duct, nusselt_gnielinski


@pytest.mark.parametrize("T", [250.0, 280.0, 300.0, 330.0, 360.0])
def test_sutherland_against_coolprop_dry_air(T):
    # White (2006) Tables 1-2 and 1-3 claim 2 %; CoolProp's humid-air transport properties are the reference
    assert viscosity_sutherland(T) == pytest.approx(HAPropsSI("M", "T", T, "P", 101325, "W", 0.0), rel=0.02)
    assert conductivity_sutherland(T) == pytest.approx(HAPropsSI("K", "T", T, "P", 101325, "W", 0.0), rel=0.02)


@pytest.mark.parametrize("Re", [1e4, 3e4, 1e5])
def test_gnielinski_close_to_dittus_boelter(Re):
    # Incropera (6th ed.) eqs. (8.60) and (8.62): the two agree within the ~15-25 % scatter
    # Incropera quotes for Dittus-Boelter
    db = 0.023 * Re**0.8 * 0.71**0.4
    assert nusselt_gnielinski(Re, 0.71) == pytest.approx(db, rel=0.15)


def test_duct_nusselt_laminar_and_blend():
    # Incropera (6th ed.) eq. (8.55): 3.66 laminar, uniform wall temperature
    assert nusselt_duct(1000.0, 0.71) == pytest.approx(3.66)
    assert 3.66 < nusselt_duct(2600.0, 0.71) < nusselt_gnielinski(3000.0, 0.71)


@pytest.mark.parametrize("Ra", [1e4, 1e5, 1e6, 1e7])
def test_churchill_chu_close_to_morgan(Ra):
    # Incropera (6th ed.) Table 9.1 (Morgan): Nu = 0.48 Ra^0.25 for 1e4 < Ra < 1e7; the two fits agree within 10 %
    assert nusselt_churchill_chu_cylinder(Ra, 0.71) == pytest.approx(0.48 * Ra**0.25, rel=0.10)
