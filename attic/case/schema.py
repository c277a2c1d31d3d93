"""The case file's keys: the one place that defines each key, its unit, range and default.

The case reference in README.md is generated from this table (`atticduct keys`), so the docs
cannot drift from what the loader accepts.
"""

from __future__ import annotations

from dataclasses import dataclass

from attic.physics.convection import DEFAULT_EXTERIOR_CONVECTION, EXTERIOR_CONVECTION, ROUGHNESS_MULTIPLIERS
from attic.presets.coverings import COVERINGS
from ducts.insulation import R_MODELS

REQUIRED = object()


@dataclass(frozen=True)
class Key:
    """One case-file key.

    kind : "float", "int", "str", "bool" or "pitch" (text "N/12" or degrees)
    unit : as shown to users ("" for none)
    default : a value, None (optional, no value), or REQUIRED
    lo, hi : inclusive bounds for numbers (None: unbounded); lo_open, hi_open: lo or hi itself not allowed
    choices : allowed values for text keys
    doc : one line for the reference
    """

    kind: str
    unit: str
    default: object
    doc: str
    lo: float | None = None
    hi: float | None = None
    lo_open: bool = False
    choices: tuple | None = None
    hi_open: bool = False

    def allowed(self):
        """Plain words for what the key accepts."""
        if self.choices:
            return "one of " + ", ".join(f'"{c}"' for c in self.choices)
        if self.kind == "bool":
            return "true or false"
        if self.kind == "str":
            return "text"
        if self.kind == "pitch":
            return 'a pitch like "6/12", or degrees from 1 to 60'
        word = "a whole number" if self.kind == "int" else "a number"
        unit = f" {self.unit}" if self.unit and self.unit != "0-1" else ""  # a fraction's range says "0-1" already
        if self.lo is not None and self.hi is not None:
            op = "above" if self.lo_open else "from"
            to = "to below" if self.hi_open else ("up to" if self.lo_open else "to")
            return f"{word} {op} {self.lo:g} {to} {self.hi:g}{unit}"
        if self.lo is not None:
            return f"{word} {'above' if self.lo_open else 'of at least'} {self.lo:g}{unit}"
        return f"{word}{unit}"


def _f(unit, default, doc, lo=None, hi=None, lo_open=False, hi_open=False):
    return Key("float", unit, default, doc, lo, hi, lo_open, hi_open=hi_open)


def _s(default, doc, choices=None):
    return Key("str", "", default, doc, choices=choices)


# IECC (2021) Figure R301.1 zones, zone 0 included
CLIMATE_ZONES = ("0A", "0B", "1A", "1B", "2A", "2B", "3A", "3B", "3C", "4A", "4B", "4C", "5A", "5B", "5C",
                 "6A", "6B", "7", "8")

SECTIONS: dict[str, dict[str, Key]] = {
    "": {"title": _s("untitled case", "a name for the case, shown on every output")},
    "site": {
        "latitude_deg": _f("° N", REQUIRED, "latitude (south is negative)", -66.5, 66.5),
        "elevation_ft": _f("ft", 0.0, "elevation above sea level (sets the air pressure)", -1000, 14000),
        "climate_zone": _s(REQUIRED, "IECC climate zone, e.g. \"2A\"", CLIMATE_ZONES),
        "longitude_deg": _f("° E", None, "longitude (west is negative); needed by `year` to place the sun",
                            -180, 180),
        "utc_offset_h": _f("h", None, "the weather file's standard time zone, e.g. -6 for US Central; for `year`",
                           -12, 14),
        "terrain": _s("suburban", "terrain around the house, for the wind at roof height",
                      ("city", "suburban", "open", "water")),
    },
    "cooling": {
        "outdoor_F": _f("°F", REQUIRED, "outdoor design dry bulb", 50, 130),
        "outdoor_wetbulb_F": _f("°F", None, "outdoor coincident wet bulb (or give outdoor_dewpoint_F)", 20, 100),
        "outdoor_dewpoint_F": _f("°F", None, "outdoor dew point (instead of the wet bulb)", -20, 90),
        "indoor_F": _f("°F", 75.0, "indoor design temperature", 60, 85),
        "indoor_rh": _f("0-1", 0.5, "indoor relative humidity", 0.05, 0.95),
        "wind_mph": _f("mph", 7.5, "wind speed at a weather station (10 m, open terrain)", 0, 50),
        "month": Key("int", "", REQUIRED, "month of the design day", 1, 12),
        "day": Key("int", "", REQUIRED, "day of the month", 1, 31),
        "daily_range_F": _f("°F", 18.0, "mean daily range of the design day's dry bulb (design climate tables), "
                            "for `day`", 0, 50),
        "solar_hour": _f("h", 15.0, "apparent solar time of the design hour (12 = solar noon)", 0, 24),
        "roof_irradiance_btuh_ft2": _f("Btu/h·ft²", None, "sun on every roof plane, instead of the clear-sky model",
                                       0, 400),
        "linke_turbidity": _f("", 3.5, "haze of the clear sky for the sun model (2 clean, 3-5 humid or hazy)", 1, 8),
        "ground_reflectance": _f("0-1", 0.2, "albedo of the ground the roof sees", 0, 1),
    },
    "heating": {
        "outdoor_F": _f("°F", REQUIRED, "outdoor design dry bulb (the section is optional)", -60, 70),
        "outdoor_rh": _f("0-1", 0.8, "outdoor relative humidity (sets the night sky)", 0.05, 1.0),
        "indoor_F": _f("°F", 70.0, "indoor design temperature", 55, 80),
        "indoor_rh": _f("0-1", 0.3, "indoor relative humidity", 0.05, 0.95),
        "wind_mph": _f("mph", 15.0, "wind speed at a weather station (10 m, open terrain)", 0, 60),
    },
    "house": {
        "conditioned_area_ft2": _f("ft²", REQUIRED, "conditioned floor area", 100, 50000),
        "cooling_sensible_btuh": _f("Btu/h", REQUIRED,
                                    "base load, sensible: the cooling load from your load calculation without "
                                    "ceiling and ducts (house.base_sensible_* in the output)",
                                    0, 1e6),
        "cooling_latent_btuh": _f("Btu/h", 0.0, "base load, latent (house.base_latent_* in the output)", 0, 1e6),
        "heating_btuh": _f("Btu/h", None, "base load in heating, without ceiling and ducts "
                                          "(house.base_sensible_* of the heating output); needed with [heating]",
                           0, 1e6),
    },
    "roof": {
        "pitch": Key("pitch", "", REQUIRED, "roof pitch, \"6/12\" or degrees"),
        "ridge_azimuth_deg": _f("°", 90.0, "direction the ridge runs, clockwise from north (90 = east-west)", 0, 360),
        "eave_height_ft": _f("ft", 10.0, "height of the eaves above the ground (one story about 10)", 4, 100),
        "span_ft": _f("ft", None, "width of the attic floor across the ridge (default: a 2:1 footprint)", 4, 200,
                      lo_open=False),
        "covering": _s("asphalt-shingle-dark", "roof covering preset", tuple(COVERINGS)),
        "solar_reflectance": _f("0-1", None, "overrides the covering's solar reflectance", 0, 1),
        "thermal_emittance": _f("0-1", None, "overrides the covering's thermal emittance", 0, 1),
        "sheathing_r": _f("h·ft²·°F/Btu", 0.62, "R of the roof sheathing (1/2 in plywood or 7/16 in OSB about 0.6)",
                          0, 10),
        "deck_r": _f("h·ft²·°F/Btu", 0.0, "insulation R at the roof deck (most often with an unvented attic; under "
                                           "a vented attic's deck it is solved as given)", 0, 80),
        "deck_insulation": _s("spray-foam", "kind of deck insulation, for the code check",
                              ("spray-foam", "rigid-board", "air-permeable", "hybrid")),
        "deck_air_impermeable_r": _f("h·ft²·°F/Btu", None,
                                     "for hybrid decks: the part of deck_r that is air-impermeable", 0, 80),
        "deck_foam": _s("closed-cell", "spray foam's cell type, for the vapour that diffuses to the sheathing",
                        ("closed-cell", "open-cell")),
        "deck_permeance_perm": _f("perm", None, "vapour permeance of the air-impermeable deck layer (default: "
                                  "typical for its kind and thickness)", 0.001, 100, lo_open=False),
        "radiant_barrier": Key("bool", "", False, "a low-emittance radiant barrier on the deck underside"),
        "radiant_barrier_emittance": _f("0-1", 0.05, "emittance of the radiant barrier", 0.01, 0.3),
        "deck_underside_emittance": _f("0-1", 0.9, "emittance of the bare deck underside (wood, foam)", 0.01, 1),
        "exterior_convection": _s(DEFAULT_EXTERIOR_CONVECTION, "model of the wind's and buoyancy's convection on the "
                                  "roof's outer surface (see Method)", tuple(EXTERIOR_CONVECTION)),
        "batten_gap_in": _f("in", None, "depth of the ventilated air space between covering and deck, eave to ridge "
                            "(default: the covering's; tile 0.75, others 0)", 0, 6),
        "surface_roughness": _s(None, "roughness class of the covering for that convection (default: the "
                                "covering's)", tuple(ROUGHNESS_MULTIPLIERS)),
    },
    "attic": {
        "type": _s(REQUIRED, "vented or unvented (sealed deck)", ("vented", "unvented")),
        "floor_area_ft2": _f("ft²", None, "attic floor area (default: the conditioned area)", 100, 50000),
        "ceiling_r": _f("h·ft²·°F/Btu", REQUIRED, "insulation R on the attic floor", 0, 100),
        "floor_emittance": _f("0-1", 0.9, "emittance of the top of the ceiling insulation", 0.01, 1),
        "house_exchange_cfm": _f("CFM", None, "air exchanged with the house (default: 0 vented; unvented "
                                 "50 CFM per 1,000 ft² of floor)", 0, 5000),
        "outdoor_leakage_ach": _f("1/h", None, "unvented only: leakage to outdoors (default 0.1)", 0, 5),
        "ceiling_cfm50": _f("CFM50", None, "vented only: air leakage of the ceiling into the attic at 50 Pa, for "
                            "winter moisture (default 0.2 per ft² of attic floor)", 0, 20000),
        "ceiling_above_neutral_ft": _f("ft", 4.0, "height of the ceiling above the house's neutral pressure plane "
                                       "(about half the conditioned height: 4 one storey, 8 two)", 0, 60),
        "ceiling_vapor_retarder": _s("none", "vapor retarder class at the ceiling, for the vent-ratio exception",
                                     ("none", "class-I", "class-II", "class-III")),
    },
    "vents": {
        "low_length_ft": _f("ft", None, "length of the low (soffit/eave) vents", 0, 2000),
        "low_nfa_in2_per_ft": _f("in²/ft", None, "net free area per foot of low vent", 0, 30),
        "low_count": Key("int", "", None, "number of low vents (instead of a length)", 0, 500),
        "low_nfa_in2_each": _f("in²", None, "net free area of each low vent", 0, 1000),
        "high_length_ft": _f("ft", None, "length of the high (ridge) vents", 0, 2000),
        "high_nfa_in2_per_ft": _f("in²/ft", None, "net free area per foot of high vent", 0, 30),
        "high_count": Key("int", "", None, "number of high vents (gable, roof cans)", 0, 500),
        "high_nfa_in2_each": _f("in²", None, "net free area of each high vent", 0, 1000),
        "low_height_ft": _f("ft", 0.0, "height of the low vents' centre above the attic floor", 0, 50),
        "high_below_ridge_ft": _f("ft", 0.0, "depth of the high vents' centre below the ridge (0 = ridge vent)", 0, 50),
        "discharge_coefficient": _f("", 0.65, "of the vent openings", 0.3, 1.0),
        "wind_effectiveness": _f("", 0.25, "C_v of the wind flow (0.25-0.35 diagonal, 0.5-0.6 perpendicular)", 0, 0.7),
    },
    "air_handler": {
        "airflow_cfm": _f("CFM", REQUIRED, "air handler airflow; the design airflow follows the load, and "
                          "a flag says when this is too little", 50, 10000),
        "supply_F": _f("°F", 55.0, "air leaving the coil in cooling; at least 10 °F below cooling.indoor_F", 40, 70),
        "heating_supply_F": _f("°F", 120.0, "air leaving the equipment in heating; at least 10 °F above "
                                                         "heating.indoor_F", 80, 180),
    },
    "duct": {
        "name": _s(REQUIRED, "a name, unique among the ducts"),
        "side": _s(REQUIRED, "supply or return", ("supply", "return")),
        "location": _s("attic", "where the duct runs", ("attic", "conditioned", "ambient")),
        "diameter_in": _f("in", None, "inner diameter of a round duct", 2, 40),
        "width_in": _f("in", None, "inner width of a rectangular duct", 2, 120),
        "height_in": _f("in", None, "inner height of a rectangular duct", 2, 60),
        "length_ft": _f("ft", REQUIRED, "length of one run", 0, 500, lo_open=True),
        "count": Key("int", "", 1, "identical parallel runs", 1, 200),
        "r_value": _f("h·ft²·°F/Btu", REQUIRED, "insulation R on the label", 0, 30),
        "r_model": _s("cylinder", "how the label R performs: cylinder (wrapped, installed R), label (label R on "
                                  "the core, plus computed films), ashrae152 (label R + 0.7 film allowance)",
                      tuple(R_MODELS)),
        "jacket_emittance": _f("0-1", 0.9, "emittance of the outer jacket", 0.01, 1),
        "fed_by": _s(None, "name of the trunk this run hangs on"),
        "airflow_cfm": _f("CFM", None, "airflow through one run (default: shared from the trunk)", 0, 10000),
        "leak_share": _f("", None, "this run's weight in its side's leakage (default: the side's leaks are spread "
                         "by bare duct surface area; give it on any duct of a side and the others without it get none)",
                         0, 1e6),
        "ambient_cooling_F": _f("°F", None, "location = ambient: air around the duct in cooling", -60, 160),
        "ambient_heating_F": _f("°F", None, "location = ambient: air around the duct in heating", -60, 160),
    },
    "leakage": {
        "supply_fraction": _f("0-1", None, "supply leakage as a fraction of airflow", 0, 0.5, hi_open=True),
        "return_fraction": _f("0-1", None, "return leakage as a fraction of airflow", 0, 0.5, hi_open=True),
        "supply_cfm25": _f("CFM25", None, "supply leakage measured at 25 Pa", 0, 5000),
        "return_cfm25": _f("CFM25", None, "return leakage measured at 25 Pa", 0, 5000),
        "total_cfm25": _f("CFM25", None, "total leakage at 25 Pa (split evenly if the sides are not given)", 0, 5000),
        "supply_pressure_pa": _f("Pa", 25.0, "pressure across supply leaks in operation", 1, 200),
        "return_pressure_pa": _f("Pa", 25.0, "pressure across return leaks in operation", 1, 200),
    },
    "codes": {
        "irc_edition": Key("int", "", 2021, "IRC edition your jurisdiction adopted, for the attic rules", 2012, 2024),
        "iecc_edition": Key("int", "", 2021, "IECC edition adopted, for the duct rules", 2012, 2024),
        "air_handler_installed_at_rough_in": Key("bool", "", True, "for the IECC rough-in duct leakage limit"),
    },
    # Prices have no default: a guessed price would turn into a confident-looking payback. The efficiencies and
    # terms do; each default's origin is noted beside it.
    "money": {
        "electricity_per_kwh": _f("$/kWh", REQUIRED, "price of electricity, all charges per kWh", 0, 2),
        "heating_fuel": _s(None, "what heats the house: \"gas\" (furnace), \"electric\" (resistance) or "
                           "\"heat-pump\"; needed when the case has [heating]", ("gas", "electric", "heat-pump")),
        "gas_per_therm": _f("$/therm", None, "price of gas; needed when heating_fuel is \"gas\"", 0, 20),
        # 0.80: the US minimum AFUE of a non-weatherized gas furnace (value from memory)
        "heating_efficiency": _f("0-1", 0.8, "AFUE of the gas furnace", 0.5, 1.0),
        # 14 and 8.2: the US minimums for split systems in 2015-2022 (values from memory)
        "seer": _f("Btu/Wh", 14.0, "seasonal cooling efficiency of the equipment (SEER)", 6, 40),
        "hspf": _f("Btu/Wh", 8.2, "seasonal heating efficiency of a heat pump (HSPF)", 3.5, 20),
        "equipment_per_ton": _f("$/ton", REQUIRED, "installed cost of cooling equipment per ton, for the credit "
                                "of a smaller unit (0 for none)", 0, 20000),
        # 15 years, about the service life of a residential air conditioner (common practice, no source)
        "life_years": Key("int", "years", 15, "years over which the savings count", 1, 50),
        "discount_rate": _f("1/year", 0.03, "real discount rate (0 allowed: savings are added without "
                            "discounting)", 0, 0.3),
    },
}

TABLE_ARRAYS = ("duct", "variant")
OPTIONAL_SECTIONS = ("heating", "vents", "air_handler", "leakage", "money")

# The keys of a [[variant]] besides `name` and `set` (a table of dotted key paths, checked key by key).
VARIANT = {
    "cost": _f("$", None, "installed first cost of the variant against the base (negative: cheaper); needed "
                          "when the case has [money]", -500000, 500000),
}
