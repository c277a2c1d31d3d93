"""Validation of a case dict against the key schema: types, ranges, choices, cross-key rules."""

from __future__ import annotations

import copy
import difflib
import math

import numpy as np

from attic.case.errors import CaseError, CombinationError
from attic.case.schema import OPTIONAL_SECTIONS, REQUIRED, SECTIONS, TABLE_ARRAYS, VARIANT, Key
from attic.physics.geometry import parse_pitch
from attic.physics.solar import DAYS_IN_MONTH


def _all_paths():
    paths = []
    for sec, keys in SECTIONS.items():
        for k in keys:
            paths.append(f"{sec}.{k}" if sec else k)
    return paths


def _suggest(name, section, prefix=None):
    """'; did you mean X?' for an unknown key, looking in its section first, then everywhere. prefix: what the
    user wrote before the key where it is not the section (duct.*), so the suggestion can be typed back."""
    local = list(SECTIONS.get(section, {}))
    if section == "":
        local += [s for s in SECTIONS if s] + list(TABLE_ARRAYS) + ["uncertainty"]
    hit = difflib.get_close_matches(name, local, n=1, cutoff=0.6)
    if hit:
        head = prefix or section
        return f"; did you mean {head + '.' if head else ''}{hit[0]}?"
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
            # choices that extend what was typed ("3" -> 3A, 3B, 3C) are all named: one alone would be a guess
            longer = [c for c in key.choices if c.lower().startswith(v.lower()) and v.strip()]
            if 1 < len(longer) <= 4:
                quoted = [f'"{c}"' for c in longer]
                bad(f" (did you mean {', '.join(quoted[:-1])} or {quoted[-1]}?)")
            close = longer or difflib.get_close_matches(v, key.choices, n=1)
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
    if key.hi is not None and (x > key.hi or (key.hi_open and x == key.hi)):
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
        if v["name"].strip().lower() == "base":  # the case itself: results are told apart by name
            raise CaseError(f"{p}.name", '"base" is the case itself; give the variant another name')
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
    try:
        _cross_checks(out)
    except CaseError as e:  # each value allowed, together not: a study lists the point as failed (CombinationError)
        raise CombinationError(e.path, e.args[0]) from None
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


def _any(condition):
    """A cross-key rule broken: for a case holding (m,) arrays of numbers (an uncertainty run's samples), in any
    row. The message then cannot name one value; the run checks those samples one by one to name it."""
    return bool(np.any(condition))


def _num(v):
    """A number as a message shows it; an uncertainty run's samples (an array) as a range."""
    return f"{v:g}" if np.ndim(v) == 0 else f"{np.min(v):g} to {np.max(v):g}"


# Common practice, no source: design supply air leaves the equipment 15-25 °F below the room in cooling and
# 20 °F or more above it in heating. Within 10 °F each CFM carries so little that ducts in an attic take most
# of it, and the airflow that carries the load runs to many times any air handler's (a 64 °F supply to a 65 °F
# room "needs" about 100 times the demo's airflow): a typing slip, not a design.
MIN_SUPPLY_DIFFERENCE_F = 10.0


def _supply_against_room(c):
    """Supply air too close to the room's temperature to carry a design load (MIN_SUPPLY_DIFFERENCE_F): an input
    mistake, said here rather than as an absurd airflow or a failed airflow search."""
    ah = c["air_handler"]
    if ah is None:
        return
    gap = MIN_SUPPLY_DIFFERENCE_F
    room = c["cooling"]["indoor_F"]
    if _any(ah["supply_F"] > room - gap):
        raise CaseError("air_handler.supply_F", f"{_num(ah['supply_F'])} is not allowed: cooling supply air must "
                                                f"leave the coil at least {gap:g} °F below the room's "
                                                f"cooling.indoor_F = {_num(room)} °F (55 °F is usual)")
    if c["heating"] is not None and _any(ah["heating_supply_F"] < c["heating"]["indoor_F"] + gap):
        room = c["heating"]["indoor_F"]
        raise CaseError("air_handler.heating_supply_F",
                        f"{_num(ah['heating_supply_F'])} is not allowed: heating supply air must leave the "
                        f"equipment at least {gap:g} °F above the room's heating.indoor_F = {_num(room)} °F")


def _cross_checks(c):
    if c["heating"] is not None and c["house"]["heating_btuh"] is None:  # a silent 0 would size nothing
        raise CaseError("house.heating_btuh", "is missing: a case with [heating] needs the heating load from your "
                                              "load calculation, without ceiling and ducts (0 if it is truly none)")
    cool = c["cooling"]
    if (cool["outdoor_wetbulb_F"] is None) == (cool["outdoor_dewpoint_F"] is None):
        raise CaseError("cooling.outdoor_wetbulb_F",
                        "give exactly one of outdoor_wetbulb_F and outdoor_dewpoint_F")
    for k in ("outdoor_wetbulb_F", "outdoor_dewpoint_F"):
        if cool[k] is not None and _any(cool[k] > cool["outdoor_F"]):
            raise CaseError(f"cooling.{k}", f"{cool[k]:g} is not allowed: it cannot exceed "
                                            f"cooling.outdoor_F = {cool['outdoor_F']:g} °F")
    if cool["day"] > DAYS_IN_MONTH[cool["month"] - 1]:
        raise CaseError("cooling.day", f"{cool['day']} is not allowed: month {cool['month']} has "
                                       f"{DAYS_IN_MONTH[cool['month'] - 1]} days")
    roof, attic = c["roof"], c["attic"]
    if roof["deck_insulation"] == "hybrid" and roof["deck_air_impermeable_r"] is None:
        raise CaseError("roof.deck_air_impermeable_r", "is missing: a hybrid deck needs its air-impermeable R")
    if roof["deck_air_impermeable_r"] is not None and _any(roof["deck_air_impermeable_r"] > roof["deck_r"]):
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
        if _any((low <= 0) & (high <= 0)):
            raise CaseError("vents.low_length_ft", "a vented attic needs vents of some net free area: give "
                                                   "low_length_ft and low_nfa_in2_per_ft (or low_count and "
                                                   "low_nfa_in2_each), and the same for the high vents")
        if _any((low + high) / 144.0 > floor_ft2):
            raise CaseError("vents", f"{(low + high) / 144.0:.0f} ft² of net free area is more than the "
                                     f"{floor_ft2:g} ft² attic floor: check the units (in² per ft, in² each)")
        rise = ridge_ft - vents["high_below_ridge_ft"] - vents["low_height_ft"]
        if _any((low > 0) & (high > 0) & (rise <= 0)):
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
    _supply_against_room(c)
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
                if _any(f >= 0.5):  # the key the case gives: a total is shared out to the sides by area
                    given = next((k for k in (f"{side}_cfm25", "total_cfm25") if leak[k] is not None),
                                 f"{side}_cfm25")
                    raise CaseError(f"leakage.{given}", f"that is {f:.0%} of the airflow in operation on the "
                                                        f"{side} side; leakage must stay below 50 %")


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


