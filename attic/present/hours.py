"""The design day and the year as output-contract dicts: the one place their SI results become IP or SI."""

from __future__ import annotations

import numpy as np

from attic.present.contract import CAUTION, Units, _facing, _round
from attic.units import K_to_C, K_to_F


def day_output(day, units="ip"):
    """The design day as the output contract's object, in IP or SI."""

    u = Units(units)
    faces = [_facing(az) for az in day.plane_azimuths]
    rows = []
    for i, h in enumerate(day.hours):
        r = {"hour": int(h)}
        u.put(r, "outdoor", "T", day.T_out_K[i])
        u.put(r, "attic_air", "T", day.attic_air_K[i])
        for j, face in enumerate(faces):  # planes named by facing, stems as in the contract's attic.planes[]
            u.put(r, f"planes.{face}.outer", "T", day.outer_K[i, j])
            u.put(r, f"planes.{face}.inner", "T", day.inner_K[i, j])
            u.put(r, f"planes.{face}.irradiance", "flux", day.irradiance_w_m2[i, j])
        u.put(r, "floor", "T", day.floor_K[i])
        u.put(r, "ceiling", "W", day.ceiling_w[i])
        u.put(r, "attic_air_to_house", "W", day.attic_air_w[i])  # house.attic_air_* of run, hour by hour
        u.put(r, "ducts", "W", day.duct_load_w[i])
        for name, T in day.duct_leaving_K.items():
            u.put(r, f"duct.{name}.leaving", "T", T[i])
        rows.append(r)
    head = {"case": day.case, "title": day.title, "units": units}
    if day.airflow_m3_s is not None:
        u.put(head, "air_handler", "Q", day.airflow_m3_s)  # the ducts run at the case's own airflow all day
    return {**head, "roof_heat_capacity": day.mass,
            "peak_hour": day.peak_hour, "peak_attic_hour": day.peak_attic_hour, "residual_w": day.residual_w,
            "planes": [{"facing": f, "azimuth_deg": _round(az)} for f, az in zip(faces, day.plane_azimuths,
                                                                                  strict=True)],
            "hours": rows, "caution": CAUTION}


def year_output(year, units="ip", seer=None, hspf=None):
    """A year run as the output contract's object, in IP or SI; electricity when SEER/HSPF are given."""
    from attic.runs.year import PARTS

    out = {"case": year.case, "title": year.title, "units": units, "hours": len(year.times),
           "start": str(year.times[0]),
           "end": str(year.times[-1]), "residual_w": year.residual_w}
    T = (lambda K: float(K_to_F(K))) if units == "ip" else (lambda K: float(K_to_C(K)))
    tk = "_F" if units == "ip" else "_C"
    out["hours_above"] = {f"{T(k):g}{tk}": int(v) for k, v in year.hours_above.items()}
    out["attic_air_max" + tk] = T(float(np.max(year.hourly["attic_air_K"])))
    for mode in ("cooling", "heating"):
        d = {}
        for p in PARTS:
            name = "total" if p == "coil" else p  # the equipment load's energy, named as house.total_* is
            if units == "ip":
                d[name + "_btu"] = round(year.energy(mode, p, "btu"), 1)
            d[name + "_kwh"] = round(year.energy(mode, p, "kwh"), 3)
        eff = seer if mode == "cooling" else hspf
        if eff:
            d["electricity_kwh"] = round(year.electricity_kwh(mode, eff), 3)
        sel = year.hourly["mode"] == (1 if mode == "cooling" else -1)
        d["hours"] = int(np.sum(sel))
        d["hours_air_handler_short"] = int(np.sum(year.hourly["short"][sel]))
        out[mode] = d
    if getattr(year, "deck", None) is not None:
        out["deck"] = _deck_dict(year.deck, T, tk)
    out["caution"] = CAUTION
    return out


def _deck_dict(dk, T, tk):
    """The roof deck's month-by-month summary (attic.runs.deck.monthly_deck, SI) in IP or SI."""
    from attic.codes.deck import CRITERION_SOURCE

    months = []
    for m in dk["months"]:
        months.append({"month": m["month"], "hours": m["hours"], "hours_at_risk": m["hours_at_risk"],
                       **{f"{n}_mean{tk}": round(T(m[f"{n}_mean_K"]), 2) for n in ("surface", "underside", "outdoor")},
                       "above_criterion": m["above_criterion"]})
    return {"condensing_surface": dk["surface"], "reached_by": dk["reached_by"],
            "hours_at_risk": dk["hours_at_risk"], "criterion": CRITERION_SOURCE,
            "criterion" + tk: round(T(dk["criterion_K"]), 2), "coldest_months": dk["coldest_months"],
            "meets_criterion": dk["meets_criterion"], "months": months}
