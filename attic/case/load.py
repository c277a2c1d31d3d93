"""Case files: read TOML, validate every key against attic.schema, apply variants, build SI cases.

Errors are CaseError with the key path, the value and what is allowed; the CLI prints the
message on one line and exits with code 2.
"""

from __future__ import annotations

import copy
import difflib
import math
import tomllib
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import TYPE_CHECKING

from attic.case.declared import Declared, declared_from
from attic.case.schema import OPTIONAL_SECTIONS, REQUIRED, SECTIONS, TABLE_ARRAYS, VARIANT, Key
from attic.physics.convection import ROUGHNESS_MULTIPLIERS
from attic.physics.geometry import GableAttic, parse_pitch
from attic.physics.solar import DAYS_IN_MONTH
from attic.presets.coverings import COVERINGS, SHEATHING_HEAT_CAPACITY
from attic.units import BTUH, BTUH_FT2, CFM, FT, FT2, IN2, INCH, MPH, R_IP, F_to_K

if TYPE_CHECKING:
    from ducts import DuctSystem



class CaseError(ValueError):
    """A case file that cannot be used; the message names the key path, the value and what is allowed."""

    def __init__(self, path, message, source=None):
        self.path = path
        self.source = source
        super().__init__(message)

    def __str__(self):
        where = f"{self.source}: " if self.source else ""
        return f"{where}{self.path}: {self.args[0]}" if self.path else f"{where}{self.args[0]}"


def _all_paths():
    paths = []
    for sec, keys in SECTIONS.items():
        for k in keys:
            paths.append(f"{sec}.{k}" if sec else k)
    return paths


def _suggest(name, section):
    """'; did you mean X?' for an unknown key, looking in its section first, then everywhere."""
    local = list(SECTIONS.get(section, {}))
    if section == "":
        local += [s for s in SECTIONS if s] + list(TABLE_ARRAYS)
    hit = difflib.get_close_matches(name, local, n=1, cutoff=0.6)
    if hit:
        return f"; did you mean {section + '.' if section else ''}{hit[0]}?"
    everywhere = _all_paths() + list(TABLE_ARRAYS)
    hit = difflib.get_close_matches(name, [p.split(".")[-1] for p in everywhere], n=1, cutoff=0.75)
    if hit:
        full = [p for p in everywhere if p.split(".")[-1] == hit[0]][0]
        return f"; did you mean {full}?"
    return ""


def _fmt(v):
    if isinstance(v, str):
        return f'"{v}"'
    if isinstance(v, bool):
        return "true" if v else "false"
    return repr(v)


def _check_value(path, key: Key, v):
    """Validate and normalise one value; returns it (floats as float)."""
    def bad(extra=""):
        raise CaseError(path, f"{_fmt(v)} is not allowed: give {key.allowed()}{extra}")

    if key.kind == "bool":
        if not isinstance(v, bool):
            bad()
        return v
    if key.kind == "str":
        if not isinstance(v, str):
            bad()
        if key.choices and v not in key.choices:
            close = difflib.get_close_matches(v, key.choices, n=1)
            bad(f' (did you mean "{close[0]}"?)' if close else "")
        return v
    if key.kind == "pitch":
        if isinstance(v, bool) or not isinstance(v, str | int | float):
            bad()
        try:
            parse_pitch(v)
        except ValueError as e:
            raise CaseError(path, f"{_fmt(v)} is not allowed: {e}") from None
        return v
    if isinstance(v, bool) or not isinstance(v, int | float):
        bad()
    if key.kind == "int" and not (isinstance(v, int) or float(v).is_integer()):
        bad()
    x = float(v)
    if math.isnan(x) or math.isinf(x):
        bad()
    if key.lo is not None and (x < key.lo or (key.lo_open and x == key.lo)):
        bad()
    if key.hi is not None and x > key.hi:
        bad()
    return int(x) if key.kind == "int" else x


def _check_table(path_prefix, section, table, keys: dict[str, Key]):
    if not isinstance(table, dict):
        raise CaseError(path_prefix or section, f"{_fmt(table)} must be a table of keys")
    out = {}
    for k, v in table.items():
        p = f"{path_prefix}.{k}" if path_prefix else k
        if k not in keys:
            raise CaseError(p, "unknown key" + _suggest(k, section))
        out[k] = _check_value(p, keys[k], v)
    for k, key in keys.items():
        if k not in out:
            p = f"{path_prefix}.{k}" if path_prefix else k
            if key.default is REQUIRED:
                raise CaseError(p, f"is missing: give {key.allowed()}")
            out[k] = key.default
    return out


def validate_raw(raw):
    """Check a parsed case (a dict as TOML gives it) and fill in defaults; IP units, no SI yet.

    Raises CaseError at the first problem.
    """
    if not isinstance(raw, dict):
        raise CaseError("", "a case file is a TOML table")
    out = {}
    for sec in raw:
        if sec in SECTIONS and sec != "" or sec in TABLE_ARRAYS or sec == "uncertainty":
            continue
        if sec in SECTIONS[""]:
            continue
        raise CaseError(sec, "unknown key" + _suggest(sec, ""))
    out.update(_check_table("", "", {k: v for k, v in raw.items() if k in SECTIONS[""]}, SECTIONS[""]))
    for sec, keys in SECTIONS.items():
        if sec in ("",) + TABLE_ARRAYS:
            continue
        if sec not in raw:
            if sec in OPTIONAL_SECTIONS:
                out[sec] = None
                continue
            if all(k.default is not REQUIRED for k in keys.values()):
                out[sec] = _check_table(sec, sec, {}, keys)
                continue
            raise CaseError(f"[{sec}]", "section is missing")
        out[sec] = _check_table(sec, sec, raw[sec], keys)
    ducts = raw.get("duct", [])
    if not isinstance(ducts, list):
        raise CaseError("duct", "write each duct as a [[duct]] table")
    out["duct"] = []
    for i, d in enumerate(ducts):
        label = f'duct[{i + 1}]' if not (isinstance(d, dict) and isinstance(d.get("name"), str)) \
            else f'duct "{d["name"]}"'
        out["duct"].append(_check_table(label, "duct", d, SECTIONS["duct"]))
    variants = raw.get("variant", [])
    if not isinstance(variants, list):
        raise CaseError("variant", "write each variant as a [[variant]] table")
    out["variant"] = []
    for i, v in enumerate(variants):
        p = f"variant[{i + 1}]"
        if not isinstance(v, dict):
            raise CaseError(p, "must be a table with name and set")
        for k in v:
            if k not in ("name", "set", *VARIANT):
                raise CaseError(f"{p}.{k}", "unknown key; a variant has name, set and cost")
        if not isinstance(v.get("name"), str) or not v["name"].strip():
            raise CaseError(f"{p}.name", "is missing: give the variant a name")
        if not isinstance(v.get("set"), dict) or not v["set"]:
            raise CaseError(f"{p}.set", 'is missing: give the keys it changes, e.g. set = { "roof.deck_r" = 20 }')
        for path in v["set"]:
            if isinstance(path, str) and path.split(".")[0] == "money":
                raise CaseError(f"{p}.set", f'"{path}": prices and terms belong to the whole case; a variant '
                                            "gives only its own cost")
        extra = {k: _check_value(f"{p}.{k}", VARIANT[k], v[k]) if k in v else VARIANT[k].default for k in VARIANT}
        if out.get("money") is not None and extra["cost"] is None:
            raise CaseError(f"{p}.cost", f'is missing: with [money], variant "{v["name"]}" needs its installed '
                                         "first cost in $ against the base (0 if it costs nothing)")
        out["variant"].append({"name": v["name"], "set": dict(v["set"]), **extra})
    names = [v["name"] for v in out["variant"]]
    if len(set(names)) != len(names):
        raise CaseError("variant", f"names must be unique, got {names}")
    _cross_checks(out)
    if "uncertainty" in raw:
        from attic.case.uncertainty import parse_section

        parse_section(raw["uncertainty"], out)
        out["uncertainty"] = copy.deepcopy(raw["uncertainty"])
    return out


def _need_pair(sec, d, a, b, what):
    if (d[a] is None) != (d[b] is None):
        missing = b if d[b] is None else a
        raise CaseError(f"{sec}.{missing}", f"is missing: {what} needs both {a} and {b}")


def vent_nfa_in2(vents, side):
    """Net free area of the low or high vents, in², from length x NFA per ft plus count x NFA each."""
    area = 0.0
    if vents.get(f"{side}_length_ft") is not None:
        area += vents[f"{side}_length_ft"] * vents[f"{side}_nfa_in2_per_ft"]
    if vents.get(f"{side}_count") is not None:
        area += vents[f"{side}_count"] * vents[f"{side}_nfa_in2_each"]
    return area


def _vent_area_in2(vents, side):
    """vent_nfa_in2, after checking that each way of giving the area is complete."""
    _need_pair("vents", vents, f"{side}_length_ft", f"{side}_nfa_in2_per_ft", f"a {side} vent given by length")
    _need_pair("vents", vents, f"{side}_count", f"{side}_nfa_in2_each", f"a {side} vent given by count")
    return vent_nfa_in2(vents, side)


def _cross_checks(c):
    cool = c["cooling"]
    if (cool["outdoor_wetbulb_F"] is None) == (cool["outdoor_dewpoint_F"] is None):
        raise CaseError("cooling.outdoor_wetbulb_F",
                        "give exactly one of outdoor_wetbulb_F and outdoor_dewpoint_F")
    for k in ("outdoor_wetbulb_F", "outdoor_dewpoint_F"):
        if cool[k] is not None and cool[k] > cool["outdoor_F"]:
            raise CaseError(f"cooling.{k}", f"{cool[k]:g} is not allowed: it cannot exceed "
                                            f"cooling.outdoor_F = {cool['outdoor_F']:g} °F")
    if cool["day"] > DAYS_IN_MONTH[cool["month"] - 1]:
        raise CaseError("cooling.day", f"{cool['day']} is not allowed: month {cool['month']} has "
                                       f"{DAYS_IN_MONTH[cool['month'] - 1]} days")
    roof, attic = c["roof"], c["attic"]
    if roof["deck_insulation"] == "hybrid" and roof["deck_air_impermeable_r"] is None:
        raise CaseError("roof.deck_air_impermeable_r", "is missing: a hybrid deck needs its air-impermeable R")
    if roof["deck_air_impermeable_r"] is not None and roof["deck_air_impermeable_r"] > roof["deck_r"]:
        raise CaseError("roof.deck_air_impermeable_r",
                        f"{roof['deck_air_impermeable_r']:g} is not allowed: it cannot exceed roof.deck_r = "
                        f"{roof['deck_r']:g}")
    floor_ft2 = attic["floor_area_ft2"] or c["house"]["conditioned_area_ft2"]
    tilt = parse_pitch(roof["pitch"])
    span = roof["span_ft"] or math.sqrt(floor_ft2 / 2.0)
    if span * span > floor_ft2 * 50 or span > floor_ft2 / 4.0:
        raise CaseError("roof.span_ft", f"{span:g} is not allowed: with a {floor_ft2:g} ft² floor the attic "
                                        "would be a strip under 4 ft long")
    ridge_ft = span / 2.0 * math.tan(tilt)
    vents = c["vents"]
    if attic["type"] == "vented":
        if vents is None:
            raise CaseError("[vents]", "section is missing: a vented attic needs its low and high vents")
        low = _vent_area_in2(vents, "low")
        high = _vent_area_in2(vents, "high")
        # low vents alone (soffit only) or high vents alone are real attics: the code check fails them
        # where the area falls short, and the physics ventilates them by wind alone
        if low <= 0 and high <= 0:
            raise CaseError("vents.low_length_ft", "a vented attic needs vents of some net free area: give "
                                                   "low_length_ft and low_nfa_in2_per_ft (or low_count and "
                                                   "low_nfa_in2_each), and the same for the high vents")
        if (low + high) / 144.0 > floor_ft2:
            raise CaseError("vents", f"{(low + high) / 144.0:.0f} ft² of net free area is more than the "
                                     f"{floor_ft2:g} ft² attic floor: check the units (in² per ft, in² each)")
        rise = ridge_ft - vents["high_below_ridge_ft"] - vents["low_height_ft"]
        if low > 0 and high > 0 and rise <= 0:
            raise CaseError("vents.high_below_ridge_ft",
                            f"{vents['high_below_ridge_ft']:g} is not allowed: the high vents must sit above the "
                            f"low ones, and the ridge is {ridge_ft:.1f} ft above the attic floor")
    names = [d["name"] for d in c["duct"]]
    for d in c["duct"]:
        label = f'duct "{d["name"]}"'
        if names.count(d["name"]) > 1:
            raise CaseError(f"{label}.name", "is used twice: duct names must be unique")
        round_ = d["diameter_in"] is not None
        rect = d["width_in"] is not None or d["height_in"] is not None
        if round_ == rect:
            raise CaseError(f"{label}.diameter_in", "give diameter_in (round) or width_in and height_in "
                                                    "(rectangular), not both and not neither")
        if rect and (d["width_in"] is None or d["height_in"] is None):
            raise CaseError(f"{label}.{'width_in' if d['width_in'] is None else 'height_in'}",
                            "is missing: a rectangular duct needs width_in and height_in")
        if d["fed_by"] is not None:
            if d["fed_by"] not in names:
                close = difflib.get_close_matches(d["fed_by"], names, n=1)
                hint = f' (did you mean "{close[0]}"?)' if close else ""
                raise CaseError(f"{label}.fed_by", f'"{d["fed_by"]}" names no duct{hint}')
            parent = c["duct"][names.index(d["fed_by"])]
            if parent["side"] != d["side"]:
                raise CaseError(f"{label}.fed_by", f'a {d["side"]} duct cannot hang on the {parent["side"]} duct '
                                                   f'"{parent["name"]}"')
        if d["location"] == "ambient":
            if d["ambient_cooling_F"] is None:
                raise CaseError(f"{label}.ambient_cooling_F", "is missing: an ambient duct needs the air "
                                                              "temperature around it")
            if c["heating"] is not None and d["ambient_heating_F"] is None:
                raise CaseError(f"{label}.ambient_heating_F", "is missing: an ambient duct needs the air "
                                                              "temperature around it in heating")
    if c["duct"] and c["air_handler"] is None:
        raise CaseError("[air_handler]", "section is missing: ducts need the air handler's airflow_cfm")
    money = c["money"]
    if money is not None:
        if c["heating"] is not None and money["heating_fuel"] is None:
            raise CaseError("money.heating_fuel", 'is missing: the case has [heating]; give "gas", "electric" '
                                                  'or "heat-pump"')
        if money["heating_fuel"] == "gas" and money["gas_per_therm"] is None:
            raise CaseError("money.gas_per_therm", 'is missing: heating_fuel is "gas"; give the price in $/therm')
    leak = c["leakage"]
    if leak is not None:
        for side in ("supply", "return"):
            if leak[f"{side}_fraction"] is not None and leak[f"{side}_cfm25"] is not None:
                raise CaseError(f"leakage.{side}_cfm25", f"give {side}_fraction or {side}_cfm25, not both")
        if leak["total_cfm25"] is not None and (leak["supply_cfm25"] is not None or leak["return_cfm25"] is not None):
            raise CaseError("leakage.total_cfm25", "give total_cfm25 or the sides' cfm25, not both")
        if c["air_handler"] is not None:
            for side in ("supply", "return"):
                f = _leak_fraction(leak, c["air_handler"]["airflow_cfm"], side)
                if f >= 0.5:
                    raise CaseError(f"leakage.{side}_cfm25", f"that is {f:.0%} of the airflow in operation; "
                                                             "leakage must stay below 50 %")


def _leak_fraction(leak, airflow_cfm, side):
    """Leak flow in operation as a fraction of the air-handler airflow."""
    if leak is None:
        return 0.0
    if leak[f"{side}_fraction"] is not None:
        return leak[f"{side}_fraction"]
    q25 = leak[f"{side}_cfm25"]
    if q25 is None and leak["total_cfm25"] is not None:
        q25 = leak["total_cfm25"] / 2.0
    if q25 is None:
        return 0.0
    from ducts import cfm25_to_operating

    return cfm25_to_operating(q25, leak[f"{side}_pressure_pa"]) / airflow_cfm


def _set_path(raw, path, value, where):
    """Apply one variant override (dotted path) to a raw case dict, in place."""
    parts = path.split(".")
    if parts[0] == "duct":
        if len(parts) != 3:
            raise CaseError(where, f'"{path}": write duct.*.KEY, duct.NAME.KEY or duct.N.KEY')
        ducts = raw.get("duct", [])
        sel, key = parts[1], parts[2]
        if sel == "*":
            targets = ducts
        elif sel.isdigit() and 1 <= int(sel) <= len(ducts):
            targets = [ducts[int(sel) - 1]]
        else:
            targets = [d for d in ducts if d.get("name") == sel]
        if not targets:
            raise CaseError(where, f'"{path}" matches no duct')
        if key not in SECTIONS["duct"]:
            raise CaseError(where, f'"{path}": unknown duct key' + _suggest(key, "duct"))
        for d in targets:
            d[key] = value
        return
    if len(parts) == 1 and parts[0] in SECTIONS[""]:
        raw[parts[0]] = value
        return
    if len(parts) != 2 or parts[0] not in SECTIONS or parts[0] == "":
        raise CaseError(where, f'"{path}" is not a key path like roof.deck_r' + _suggest(parts[-1], ""))
    sec, key = parts
    if key not in SECTIONS[sec]:
        raise CaseError(where, f'"{path}": unknown key' + _suggest(key, sec))
    raw.setdefault(sec, {})[key] = value


def raw_of(case):
    """A case dict as TOML gives it, without variants, from a Case or from such a dict (a copy either way).

    A Case keeps its validated inputs, where every key not given holds its default or None; dropping the
    Nones gives a dict that validates back to the same inputs.
    """
    if isinstance(case, Case):
        def strip(d):
            return {k: v for k, v in d.items() if v is not None}

        raw = {}
        for k, v in case.inputs.items():
            if k == "duct":
                raw[k] = [strip(d) for d in v]
            elif isinstance(v, dict) and k != "uncertainty":
                raw[k] = strip(v)
            elif v is not None and k not in ("variant", "uncertainty"):
                raw[k] = v
        return copy.deepcopy(raw)
    if not isinstance(case, dict):
        raise TypeError(f"expected a Case or a case dict, got {type(case).__name__}")
    new = copy.deepcopy(case)
    new.pop("variant", None)
    new.pop("uncertainty", None)
    return new


def apply_overrides(raw, overrides, where="set"):
    """A copy of a raw case with dotted-path overrides applied (validated when built)."""
    new = copy.deepcopy(raw)
    new.pop("variant", None)
    new.pop("uncertainty", None)  # it describes the file's base case; the uncertainty run applies it
    for path, value in overrides.items():
        _set_path(new, path, value, f"{where}.{path}")
    return new


# The heating design dry bulb is a night's minimum, which falls near sunrise: the hour (apparent solar
# time) at which the sky's hourly correction is taken for heating (common practice, no source).
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


def build_case(c, name="base"):
    """A Case (SI) from a validated IP dict."""
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

    T_o = float(F_to_K(cool["outdoor_F"]))
    if cool["outdoor_wetbulb_F"] is not None:
        W_o = moist_air.humidity_ratio_from_wetbulb(T_o, float(F_to_K(cool["outdoor_wetbulb_F"])), P)
    else:
        W_o = moist_air.humidity_ratio_from_dewpoint(float(F_to_K(cool["outdoor_dewpoint_F"])), P)
    T_i = float(F_to_K(cool["indoor_F"]))
    from attic.physics.solar import day_of_year

    cooling = Condition(
        "cooling", T_o, W_o, T_i, moist_air.humidity_ratio_from_rh(T_i, P, cool["indoor_rh"]),
        local_wind(cool["wind_mph"]),
        float(F_to_K(ah["supply_F"])) if ah else T_i, day_of_year(cool["month"], cool["day"]), cool["solar_hour"],
        None if cool["roof_irradiance_btuh_ft2"] is None else cool["roof_irradiance_btuh_ft2"] * BTUH_FT2,
        cool["linke_turbidity"], cool["ground_reflectance"], cool["daily_range_F"] * 5.0 / 9.0)
    heating = None
    if heat is not None:
        T_oh = float(F_to_K(heat["outdoor_F"]))
        T_ih = float(F_to_K(heat["indoor_F"]))
        heating = Condition(
            "heating", T_oh, moist_air.humidity_ratio_from_rh(T_oh, P, heat["outdoor_rh"]), T_ih,
            moist_air.humidity_ratio_from_rh(T_ih, P, heat["indoor_rh"]), local_wind(heat["wind_mph"]),
            float(F_to_K(ah["heating_supply_F"])) if ah else T_ih, solar_hour=HEATING_DESIGN_HOUR, irradiance=0.0)

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
        v = Vents(A_low=low, A_high=high, height=H if low > 0 and high > 0 else 0.0,
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
                ambients[loc] = (float(F_to_K(d["ambient_cooling_F"])),
                                 None if d["ambient_heating_F"] is None else float(F_to_K(d["ambient_heating_F"])))
            segs.append(DuctSegment(
                d["name"], d["side"], loc, d["length_ft"] * FT, d["r_value"] * R_IP,
                diameter=None if d["diameter_in"] is None else d["diameter_in"] * INCH,
                width=None if d["width_in"] is None else d["width_in"] * INCH,
                height=None if d["height_in"] is None else d["height_in"] * INCH,
                count=d["count"], fed_by=d["fed_by"],
                airflow=None if d["airflow_cfm"] is None else d["airflow_cfm"] * CFM,
                r_model=d["r_model"], jacket_emittance=d["jacket_emittance"]))
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
        base_heating=house["heating_btuh"] * BTUH,
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


def read_toml(path):
    """Parse a TOML case file; a syntax error is a CaseError naming the line."""
    p = Path(path)
    try:
        text = p.read_text(encoding="utf-8")
    except FileNotFoundError:
        raise CaseError("", f"no case file at {p}") from None
    except (OSError, UnicodeDecodeError) as e:
        raise CaseError("", f"cannot read {p}: {e}") from None
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as e:
        raise CaseError("", f"not valid TOML: {e}", source=str(p)) from None


def load_cases(path, only=None):
    """The base case and each variant of a case file, validated and built (list of Case).

    only : a variant name (or "base") to build just that one.
    """
    return cases_from_dict(read_toml(path), only, source=str(path))


def cases_from_dict(raw, only=None, source=None):
    """The base case and each variant of a case given as a dict (the TOML's tables), validated and built.

    only : a variant name (or "base") to build just that one.
    source : what to name in error messages (a file name), if any.
    """
    try:
        checked = validate_raw(raw)
        cases = []
        if only in (None, "base"):
            cases.append(build_case(checked, "base"))
        for i, var in enumerate(checked["variant"]):
            if only not in (None, var["name"]):
                continue
            where = f"variant[{i + 1}].set"
            new = apply_overrides(raw, var["set"], where)
            try:
                cases.append(replace(build_case(validate_raw(new), var["name"]), first_cost=var["cost"]))
            except CaseError as e:
                raise CaseError(f'variant "{var["name"]}": {e.path}', e.args[0]) from None
        if only is not None and not cases:
            names = ", ".join(["base"] + [v["name"] for v in checked["variant"]])
            raise CaseError("variant", f'"{only}" is not in the case; it has: {names}')
        return cases
    except CaseError as e:
        if e.source is None and source is not None:
            e.source = source
        raise
