"""Results to the output contract (README, "Output contract"): nested dicts with unit-suffixed keys, IP or SI.

Only unit conversion happens here; every number comes from the result objects.
"""

from __future__ import annotations

import math

from attic.units import BTUH, CFM, FT2, K_to_C, K_to_F, dK_to_dF

CAUTION = ("Design loads and equipment size need a full load calculation by a qualified person. Unvented "
           "attics, spray foam and combustion appliances in attics have code requirements. Local codes and "
           "licensed practice govern.")


LATENT_NOISE_W = 1e-6  # a latent part this close to zero is rounding, not a credit
HEAT_NOISE_W = 1e-6  # a heat flow this close to zero is rounding in the balances (a millionth of a watt)


def gives_tons(kind):
    """Whether outputs at a design condition carry tons (and per-ton figures): tons are the trade's measure of
    cooling, so in heating they stay empty (null) rather than read as an equipment size."""
    return kind == "cooling"


class Units:
    """Key suffixes and conversions for one unit system ("ip" or "si")."""

    def __init__(self, system="ip"):
        if system not in ("ip", "si"):
            raise ValueError(f"units {system!r}: use ip or si")
        self.system = system
        ip = system == "ip"
        self.T = ("_F", lambda K: float(K_to_F(K))) if ip else ("_C", lambda K: float(K_to_C(K)))
        self.dT = ("_F", lambda d: float(dK_to_dF(d))) if ip else ("_K", float)
        self.W = ("_btuh", lambda w: w / BTUH) if ip else ("_w", float)
        self.A = ("_ft2", lambda a: a / FT2) if ip else ("_m2", float)
        self.Q = ("_cfm", lambda q: q / CFM) if ip else ("_l_s", lambda q: q * 1000.0)
        self.flux = ("_btuh_ft2", lambda f: f * FT2 / BTUH) if ip else ("_w_m2", float)

    def put(self, d, name, kind, value):
        suffix, conv = getattr(self, kind)
        if kind == "W" and value is not None and abs(value) < HEAT_NOISE_W:
            value = 0.0  # a difference of equal loads (ducts inside: equipment - house) is 0, not 3e-12 or -0.0
        d[name + suffix] = None if value is None else _round(conv(value))


def _round(x, digits=4):
    if x is None or not math.isfinite(x):
        return x
    return float(f"{x:.{digits + 2}g}")


def _facing(az):
    names = ["north", "northeast", "east", "southeast", "south", "southwest", "west", "northwest"]
    return names[int(((az % 360) + 22.5) // 45) % 8]


def condition_output(r, units="ip"):
    """One ConditionResult as the output contract's object."""
    u = Units(units)
    a = r.attic
    attic = {"type": r.attic_type}
    u.put(attic, "air", "T", a.air_K)
    u.put(attic, "air_without_leaks", "T", r.attic_air_without_leaks_K)
    u.put(attic, "floor", "T", a.floor_K)
    u.put(attic, "ventilation", "Q", a.ventilation_m3_s)
    attic["air_changes_per_hour"] = _round(a.air_changes_per_hour)
    u.put(attic, "ceiling_gain", "W", a.ceiling_to_house_w)
    u.put(attic, "air_to_house", "W", a.attic_air_to_house_w + a.attic_air_to_house_latent_w)
    u.put(attic, "dewpoint", "T", a.dewpoint_K)
    u.put(attic, "sky", "T", a.sky_K)
    u.put(attic, "mean_radiant", "T", a.mean_radiant_K)
    planes = []
    for i, az in enumerate(r.plane_azimuths):
        p = {"facing": _facing(az), "azimuth_deg": _round(az)}
        u.put(p, "irradiance", "flux", a.irradiance_w_m2[i])
        u.put(p, "outer", "T", a.outer_K[i])
        u.put(p, "inner", "T", a.inner_K[i])
        u.put(p, "sol_air", "T", a.sol_air_K[i])
        planes.append(p)
    attic["planes"] = planes
    out = {"case": r.case, "title": r.title, "condition": r.kind, "units": units, "attic": attic}

    if r.ducts is not None:
        dr = r.ducts
        h = r.house
        d = {"r_model": dr.r_model}
        u.put(d, "airflow", "Q", h.airflow_m3_s)
        u.put(d, "capacity", "W", h.equipment_w)
        d["cfm_per_ton"] = _round(h.airflow_m3_s / CFM / h.tons) if h.tons > 0 and gives_tons(r.kind) else None
        u.put(d, "conduction", "W", dr.conduction_w)
        u.put(d, "supply_conduction", "W", dr.supply_conduction_w)
        u.put(d, "return_conduction", "W", dr.return_conduction_w)
        u.put(d, "leakage_sensible", "W", dr.leakage_sensible_w)
        u.put(d, "leakage_latent", "W", dr.leakage_latent_w)
        # below zero it is a credit: return leaks draw attic air drier than the house's, so the coil dries less
        d["leakage_latent_credit"] = bool(dr.leakage_latent_w < -LATENT_NOISE_W)
        u.put(d, "supply_leak_sensible", "W", dr.supply_leak_sensible_w)
        u.put(d, "supply_leak_latent", "W", dr.supply_leak_latent_w)
        u.put(d, "return_leak_sensible", "W", dr.return_leak_sensible_w)
        u.put(d, "return_leak_latent", "W", dr.return_leak_latent_w)
        u.put(d, "total", "W", dr.duct_load_w)
        d["delivery_effectiveness"] = _round(dr.delivery_effectiveness)
        u.put(d, "supply_leaving_equipment", "T", dr.supply_leaving_equipment_K)
        u.put(d, "delivered", "T", dr.delivered_K)
        segs = []
        for s in dr.segments:
            sd = {"name": s.name, "side": s.side, "location": s.location.split(":")[0], "count": s.count}
            u.put(sd, "entering", "T", s.entering_K)
            u.put(sd, "leaving", "T", s.leaving_K)
            u.put(sd, "gain", "W", s.gain_w)
            u.put(sd, "jacket", "T", s.jacket_K)
            u.put(sd, "dewpoint_margin", "dT", s.dewpoint_margin_K)
            sd["sweats"] = s.sweats
            segs.append(sd)
        d["segments"] = segs
        out["ducts"] = d
    else:
        out["ducts"] = None

    h = r.house
    house = {}
    u.put(house, "base_sensible", "W", h.base_sensible_w)
    u.put(house, "base_latent", "W", h.base_latent_w)
    u.put(house, "ceiling", "W", h.ceiling_w)
    u.put(house, "attic_air", "W", h.attic_air_sensible_w + h.attic_air_latent_w)
    u.put(house, "load", "W", h.house_w)
    u.put(house, "ducts", "W", h.ducts_w)
    u.put(house, "total", "W", h.equipment_w)
    cooling = gives_tons(r.kind)
    house["tons"] = _round(h.tons) if cooling else None
    house["delivery_effectiveness"] = _round(h.delivery_effectiveness)
    if h.air_handler_m3_s is not None:
        u.put(house, "air_handler", "Q", h.air_handler_m3_s)
        u.put(house, "air_handler_delivers", "W", h.air_handler_delivers_w)
        house["air_handler_short"] = h.air_handler_short
    if units == "ip":
        house["ft2_per_ton"] = _round(h.area_per_ton_m2 / FT2) if cooling else None
        house["rule_of_thumb_ft2_per_ton"] = [400, 500]
    else:
        house["m2_per_ton"] = _round(h.area_per_ton_m2) if cooling else None
        house["rule_of_thumb_m2_per_ton"] = [_round(400 * FT2), _round(500 * FT2)]
    out["house"] = house

    v = r.vents
    vents = {"applies": v.applies, "ratio": f"1/{v.ratio}" if v.applies else None, "complies": v.complies,
             "why": v.why, "fix": v.fix}
    u.put(vents, "required_nfa", "A", v.required_nfa_ft2 * FT2)
    u.put(vents, "provided_nfa", "A", v.provided_nfa_ft2 * FT2)
    u.put(vents, "low_nfa", "A", v.low_nfa_ft2 * FT2)
    u.put(vents, "high_nfa", "A", v.high_nfa_ft2 * FT2)
    vents["upper_fraction"] = _round(v.upper_fraction)
    # an attic with low vents alone has no exhaust (or, high alone, no intake): wind is its only ventilation
    vents["has_intake"] = v.has_intake
    vents["has_exhaust"] = v.has_exhaust
    out["vents"] = vents
    flows = {}
    for k, val in a.heat_flows_w.items():
        u.put(flows, k, "W", val)
    out["attic_heat_flows"] = flows
    out["deck"] = None if getattr(r, "deck", None) is None else deck_output(r.deck, u)
    out["residual_w"] = _round(a.residual_w, 2)
    out["caution"] = CAUTION
    return out


def deck_output(dm, u):
    """The winter condensing surface (attic.runs.deck.DeckMoisture) as the output contract's `deck` object."""
    from attic.runs.deck import CAUTION as DECK_CAUTION

    d = {"condensing_surface": dm.surface, "reached_by": dm.reached_by}
    u.put(d, "surface", "T", dm.surface_K)
    u.put(d, "dewpoint", "T", dm.dewpoint_K)
    u.put(d, "margin", "dT", dm.margin_K)
    d["at_risk"] = dm.at_risk
    u.put(d, "underside", "T", dm.underside_K)
    u.put(d, "outdoor", "T", dm.outdoor_K)
    u.put(d, "ceiling_leak", "Q", dm.ceiling_leak_m3_s)
    d["foam_permeance_perm"] = None if dm.permeance_perm is None else _round(dm.permeance_perm)
    d["accumulation_g_m2_day"] = (None if dm.accumulation_kg_m2_s is None
                                  else _round(dm.accumulation_kg_m2_s * 1000.0 * 86400.0))
    d["caution"] = DECK_CAUTION if dm.at_risk else None
    return d


def flatten(d, prefix=""):
    """A flat {dotted.key: scalar} view of a nested output object, for CSV."""
    flat = {}
    for k, v in d.items():
        key = f"{prefix}{k}"
        if isinstance(v, dict):
            flat.update(flatten(v, key + "."))
        elif isinstance(v, list) and v and isinstance(v[0], dict):
            for item in v:
                tag = item.get("name") or item.get("facing")
                flat.update(flatten({kk: vv for kk, vv in item.items() if kk not in ("name", "facing")},
                                    f"{key}.{tag}."))
        elif isinstance(v, list):
            flat[key] = " to ".join(str(x) for x in v)
        else:
            flat[key] = v
    return flat


def _convert_by_suffix(u, d):
    """A flat dict of SI values to the unit system by key suffix (_K, _w); other floats rounded."""
    out = {}
    for k, v in d.items():
        if isinstance(v, bool) or not (v is None or isinstance(v, int | float)):
            out[k] = v
        elif k.endswith("margin_K"):  # a difference of temperatures, not a temperature
            u.put(out, k[:-2], "dT", v)
        elif k.endswith("_K"):
            u.put(out, k[:-2], "T", v)
        elif k.endswith("_w"):
            u.put(out, k[:-2], "W", v)
        else:
            out[k] = _round(v)
    return out


# CompareRow field -> (section, stem) in the words of the output contract
_COMPARE_NAMES = {
    "attic_air_K": ("attic", "air_K"), "ceiling_w": ("house", "ceiling_w"), "attic_air_w": ("house", "attic_air_w"),
    "base_w": ("house", "base_w"), "duct_conduction_w": ("ducts", "conduction_w"),
    "duct_leak_sensible_w": ("ducts", "leakage_sensible_w"), "duct_leak_latent_w": ("ducts", "leakage_latent_w"),
    "ducts_w": ("house", "ducts_w"), "equipment_w": ("house", "total_w"), "tons": ("house", "tons"),
    "delta_w": ("vs_base", "total_w"), "delta_tons": ("vs_base", "tons"),
}


def comparison_output(cmp, units="ip"):
    """A Comparison in the output contract's words and units: one object per variant and condition.

    house.total_* is the equipment load, house.base_* the base load (sensible + latent), vs_base.* this row
    minus the base case's. Fields the contract does not name keep their own names, converted by suffix."""
    u = Units(units)
    rows = []
    for r in cmp.rows:
        d = r.to_dict()
        row = {"case": d.pop("case"), "condition": d.pop("kind"), "units": units}
        sections = {}
        for k in list(d):
            if k in _COMPARE_NAMES:
                sec, stem = _COMPARE_NAMES[k]
                sections.setdefault(sec, {})[stem] = d.pop(k)
        for sec in ("attic", "house", "ducts", "vs_base"):
            row[sec] = _convert_by_suffix(u, sections.get(sec, {}))
        row.update(_convert_by_suffix(u, d))
        if not gives_tons(row["condition"]):
            row["house"]["tons"] = row["vs_base"]["tons"] = None
        rows.append(row)
    inside = [_convert_by_suffix(u, {"variant": n, "saved_w": w, "saved_tons": t}) for n, w, t in cmp.ducts_inside]
    return {"title": cmp.title, "units": units, "rows": rows, "ducts_inside": inside, "caution": CAUTION}

