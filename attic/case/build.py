"""A validated case dict built into the frozen Case, in SI units."""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import TYPE_CHECKING

import numpy as np

from attic.case.declared import Declared, declared_from
from attic.physics.convection import ROUGHNESS_MULTIPLIERS
from attic.physics.geometry import GableAttic, parse_pitch
from attic.presets.coverings import COVERINGS, SHEATHING_HEAT_CAPACITY
from attic.units import BTUH, BTUH_FT2, CFM, FT, FT2, IN2, INCH, MPH, R_IP, F_to_K

if TYPE_CHECKING:
    from ducts import DuctSystem


from attic.case.errors import CaseError
from attic.case.validate import _leak_fraction, _vent_area_in2

HEATING_DESIGN_HOUR = 6.0


@dataclass(frozen=True)
class Condition:
    """One design condition (SI).

    kind : "cooling" or "heating"; T_out, T_in, T_supply : K; W_out, W_in : kg/kg;
    wind : m/s at the roof's mean height; doy : day of year (cooling) or None; solar_hour : apparent solar
    time (heating: HEATING_DESIGN_HOUR);
    irradiance : W/m2 on every plane when given, else None (clear-sky model); 0 for heating (night).
    """

    kind: str
    T_out: float
    W_out: float
    T_in: float
    W_in: float
    wind: float
    T_supply: float
    doy: int | None = None
    solar_hour: float | None = None
    irradiance: float | None = None
    linke_turbidity: float = 3.5
    albedo: float = 0.2
    daily_range: float = 10.0  # K


@dataclass(frozen=True)
class Vents:
    """Vent openings (SI): net free areas m2, heights m.

    height : between the centres of the low and high vents (0 when the attic has only one kind:
    its openings then sit at one height and drive no stack flow between them).
    low_height : of the low vents' centre above the attic floor.
    """

    A_low: float
    A_high: float
    height: float
    high_below_ridge: float
    discharge_coefficient: float
    wind_effectiveness: float
    low_height: float = 0.0

    @property
    def missing(self):
        """"high" (no exhaust), "low" (no intake) or None when the attic has both kinds of vent."""
        if self.A_high <= 0:
            return "high"
        if self.A_low <= 0:
            return "low"
        return None


@dataclass(frozen=True)
class Case:
    """A validated case in SI units; `inputs` keeps the validated IP values for reports."""

    name: str
    title: str
    latitude: float
    elevation: float
    pressure: float
    climate_zone: str
    conditioned_area: float
    base_sensible: float
    base_latent: float
    base_heating: float
    geometry: GableAttic
    solar_reflectance: float
    thermal_emittance: float
    r_covering: float
    r_sheathing: float
    r_deck: float
    deck_underside_emittance: float
    attic_type: str
    r_ceiling: float
    floor_emittance: float
    house_exchange: float
    outdoor_leakage_ach: float
    vents: Vents | None
    ducts: DuctSystem | None
    duct_ambients: dict
    cooling: Condition
    heating: Condition | None
    inputs: dict = field(repr=False, compare=False)
    declared: Declared | None = None  # what only the code checks need (attic.case.declared)
    wind_factor: float = 1.0  # wind at the roof's mean height / wind at the weather station
    heat_capacity_outer: float = 0.0  # J/(m2.K) of roof: covering and half the sheathing
    heat_capacity_inner: float = 0.0  # J/(m2.K): the other half of the sheathing
    exterior_convection: str = "clear-gartland-winkelmann"  # a key of convection.EXTERIOR_CONVECTION
    roughness_multiplier: float = 1.0  # R_f of the roof's outer surface
    batten_gap: float = 0.0  # m, ventilated space between covering and deck (0: none)
    heat_capacity_deck_top: float = 0.0  # J/(m2.K): with a gap, the upper half of the sheathing
    first_cost: float | None = None  # $, a variant's installed cost against the base (None: the base, or not given)

    @property
    def conditions(self):
        return tuple(c for c in (self.cooling, self.heating) if c is not None)


def _number(x):
    """A float, or a float array where the case holds (m,) arrays of numbers (an uncertainty run's samples)."""
    a = np.asarray(x, dtype=float)
    return float(a) if a.ndim == 0 else a


def _kelvin(deg_f):
    """Kelvin from °F (_number)."""
    return _number(F_to_K(deg_f))


def build_case(c, name="base"):
    """A Case (SI) from a validated IP dict. Where the dict holds (m,) arrays of numbers in place of floats (the
    samples of an uncertainty run), the Case holds the arrays those give; the numbers that depend on them only
    element by element (attic.runs.sampled says which cases build so, and checks)."""
    from attic.physics.atmosphere import pressure_from_elevation
    from ducts import DuctSegment, DuctSystem, moist_air

    site, cool, heat, house = c["site"], c["cooling"], c["heating"], c["house"]
    roof, attic, vents, ah = c["roof"], c["attic"], c["vents"], c["air_handler"]
    P = pressure_from_elevation(site["elevation_ft"] * FT)
    from attic.physics.atmosphere import wind_speed_at_height
    floor_ft2 = attic["floor_area_ft2"] or house["conditioned_area_ft2"]
    tilt = parse_pitch(roof["pitch"])
    span_ft = roof["span_ft"] or math.sqrt(floor_ft2 / 2.0)
    geom = GableAttic(floor_ft2 * FT2, span_ft * FT, tilt, roof["ridge_azimuth_deg"])
    roof_height = roof["eave_height_ft"] * FT + geom.ridge_height / 2.0

    def local_wind(mph):
        return wind_speed_at_height(mph * MPH, roof_height, site["terrain"])

    cov = COVERINGS[roof["covering"]]
    rho = cov.solar_reflectance if roof["solar_reflectance"] is None else roof["solar_reflectance"]
    eps = cov.thermal_emittance if roof["thermal_emittance"] is None else roof["thermal_emittance"]
    under = roof["radiant_barrier_emittance"] if roof["radiant_barrier"] else roof["deck_underside_emittance"]
    gap_in = cov.batten_gap_in if roof["batten_gap_in"] is None else roof["batten_gap_in"]

    T_o = _kelvin(cool["outdoor_F"])
    if cool["outdoor_wetbulb_F"] is not None:
        W_o = moist_air.humidity_ratio_from_wetbulb(T_o, _kelvin(cool["outdoor_wetbulb_F"]), P)
    else:
        W_o = moist_air.humidity_ratio_from_dewpoint(_kelvin(cool["outdoor_dewpoint_F"]), P)
    T_i = _kelvin(cool["indoor_F"])
    from attic.physics.solar import day_of_year

    cooling = Condition(
        "cooling", T_o, W_o, T_i, moist_air.humidity_ratio_from_rh(T_i, P, cool["indoor_rh"]),
        local_wind(cool["wind_mph"]),
        _kelvin(ah["supply_F"]) if ah else T_i, day_of_year(cool["month"], cool["day"]), cool["solar_hour"],
        None if cool["roof_irradiance_btuh_ft2"] is None else cool["roof_irradiance_btuh_ft2"] * BTUH_FT2,
        cool["linke_turbidity"], cool["ground_reflectance"], cool["daily_range_F"] * 5.0 / 9.0)
    heating = None
    if heat is not None:
        T_oh = _kelvin(heat["outdoor_F"])
        T_ih = _kelvin(heat["indoor_F"])
        heating = Condition(
            "heating", T_oh, moist_air.humidity_ratio_from_rh(T_oh, P, heat["outdoor_rh"]), T_ih,
            moist_air.humidity_ratio_from_rh(T_ih, P, heat["indoor_rh"]), local_wind(heat["wind_mph"]),
            _kelvin(ah["heating_supply_F"]) if ah else T_ih, solar_hour=HEATING_DESIGN_HOUR, irradiance=0.0)

    unvented = attic["type"] == "unvented"
    exch = attic["house_exchange_cfm"]
    if exch is None:
        # IRC R806.5 (2018/2021) lets conditioned air be supplied to an unvented attic at up to
        # 50 CFM per 1,000 ft² of ceiling (value from memory); used as the default exchange.
        exch = 50.0 * floor_ft2 / 1000.0 if unvented else 0.0
    leak_ach = attic["outdoor_leakage_ach"]
    if leak_ach is None:
        leak_ach = 0.1 if unvented else 0.0  # common practice, no source: a sealed deck leaks a little

    v = None
    if vents is not None and not unvented:
        low = _vent_area_in2(vents, "low") * IN2
        high = _vent_area_in2(vents, "high") * IN2
        H = geom.ridge_height - vents["high_below_ridge_ft"] * FT - vents["low_height_ft"] * FT
        v = Vents(A_low=low, A_high=high, height=_number(np.where((low > 0) & (high > 0), H, 0.0)),
                  high_below_ridge=vents["high_below_ridge_ft"] * FT,
                  discharge_coefficient=vents["discharge_coefficient"],
                  wind_effectiveness=vents["wind_effectiveness"], low_height=vents["low_height_ft"] * FT)

    ducts = None
    ambients = {}
    if c["duct"]:
        segs = []
        for d in c["duct"]:
            loc = d["location"]
            if loc == "ambient":
                loc = f"ambient:{d['name']}"
                ambients[loc] = (_kelvin(d["ambient_cooling_F"]),
                                 None if d["ambient_heating_F"] is None else _kelvin(d["ambient_heating_F"]))
            segs.append(DuctSegment(
                d["name"], d["side"], loc, d["length_ft"] * FT, d["r_value"] * R_IP,
                diameter=None if d["diameter_in"] is None else d["diameter_in"] * INCH,
                width=None if d["width_in"] is None else d["width_in"] * INCH,
                height=None if d["height_in"] is None else d["height_in"] * INCH,
                count=d["count"], fed_by=d["fed_by"],
                airflow=None if d["airflow_cfm"] is None else d["airflow_cfm"] * CFM,
                r_model=d["r_model"], jacket_emittance=d["jacket_emittance"], leak_share=d["leak_share"]))
        leak = c["leakage"]
        try:
            ducts = DuctSystem(tuple(segs), ah["airflow_cfm"] * CFM,
                               _leak_fraction(leak, ah["airflow_cfm"], "supply"),
                               _leak_fraction(leak, ah["airflow_cfm"], "return"))
            ducts.run_flows()
        except ValueError as e:
            raise CaseError("duct", str(e)) from None

    return Case(
        name=name,
        title=c["title"],
        latitude=site["latitude_deg"],
        elevation=site["elevation_ft"] * FT,
        pressure=P,
        climate_zone=site["climate_zone"],
        conditioned_area=house["conditioned_area_ft2"] * FT2,
        base_sensible=house["cooling_sensible_btuh"] * BTUH,
        base_latent=house["cooling_latent_btuh"] * BTUH,
        base_heating=(house["heating_btuh"] or 0.0) * BTUH,  # validated: given wherever there is [heating]
        geometry=geom,
        solar_reflectance=rho,
        thermal_emittance=eps,
        r_covering=cov.r_si,
        r_sheathing=roof["sheathing_r"] * R_IP,
        r_deck=roof["deck_r"] * R_IP,
        deck_underside_emittance=under,
        attic_type=attic["type"],
        r_ceiling=attic["ceiling_r"] * R_IP,
        floor_emittance=attic["floor_emittance"],
        house_exchange=exch * CFM,
        outdoor_leakage_ach=leak_ach,
        vents=v,
        ducts=ducts,
        duct_ambients=ambients,
        cooling=cooling,
        heating=heating,
        inputs=c,
        wind_factor=float(local_wind(1.0 / MPH)),
        heat_capacity_outer=cov.heat_capacity + (0.0 if gap_in > 0 else 0.5 * SHEATHING_HEAT_CAPACITY),
        heat_capacity_inner=0.5 * SHEATHING_HEAT_CAPACITY,
        batten_gap=gap_in * INCH, heat_capacity_deck_top=0.5 * SHEATHING_HEAT_CAPACITY if gap_in > 0 else 0.0,
        exterior_convection=roof["exterior_convection"],
        roughness_multiplier=ROUGHNESS_MULTIPLIERS[roof["surface_roughness"] or cov.roughness],
        declared=declared_from(c))


