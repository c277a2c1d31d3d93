"""Winter moisture at the roof deck: the condensing surface's temperature against the dew point of what reaches it.

Which surface condenses depends on the assembly:

- vented attic: the deck underside, reached by attic air, which is outdoor air plus the house air that
  leaks up through the ceiling (the stack effect pushes it up in winter);
- unvented, air-permeable insulation only (or none): the sheathing's underside, reached by indoor air;
- unvented hybrid: the interface of the air-impermeable layer (against the sheathing) and the
  air-permeable layer below it, reached by indoor air through the air-permeable layer;
- unvented, air-impermeable insulation only: the sheathing face of the foam, which indoor air does not
  reach; its vapour diffuses through the foam, judged by the steady dew-point method from the foam's
  permeance (attic.presets.vapour) against what leaves outward through sheathing and roofing.

The surface temperature comes from the solved network (outer and inner surface of each plane) by the
series-resistance profile through the deck's layers; the colder plane is reported. Deck insulation is taken
to lie under the sheathing, the air-impermeable part against it.
"""

from __future__ import annotations

from dataclasses import asdict, dataclass

import numpy as np

from attic.physics.airleak import power_law_flow, stack_pressure
from attic.physics.assembly import (
    PERM,
    humidity_ratio_from_vapour_pressure,
    interface_temperatures,
    interface_vapour_pressure,
    mixed_humidity_ratio,
    vapour_pressure_from_humidity_ratio,
)
from attic.presets.vapour import EXTERIOR_PERMEANCE_PERM, foam_permeance_perm
from attic.units import CFM, FT, R_IP

CEILING_CFM50_PER_FT2 = 0.2  # common practice, no source: a 5 ACH50 house with about a third of its leaks overhead

CAUTION = ("Moisture at the roof deck rots sheathing and grows mould. This is a steady estimate at one condition, "
           "the coldest hour at the heating design condition; wood rides out short spells, and the code judges "
           "unvented decks by monthly means (see `year`). The adopted code (IRC R806) and licensed practice govern, "
           "and a negative margin needs a qualified person's look.")


@dataclass(frozen=True)
class DeckMoisture:
    """The condensing surface at one condition (SI: K, m3/s, kg/kg, perm).

    surface : which surface condenses; reached_by : "attic air", "indoor air" or "vapour diffusion";
    surface_K : its temperature (the colder plane); dewpoint_K : dew point of the air or vapour that reaches it;
    underside_K : the coldest deck underside (the attic side of the deck); outdoor_K : outdoor air;
    ceiling_leak_m3_s : house air leaking up into a vented attic; permeance_perm : the foam's, when judged by
    diffusion; accumulation_kg_m2_s : then also the vapour condensing there by the same method (zero when the
    margin is positive), which says how much a negative margin means.
    """

    surface: str
    reached_by: str
    surface_K: float
    dewpoint_K: float
    underside_K: float
    outdoor_K: float
    humidity_ratio: float
    ceiling_leak_m3_s: float
    permeance_perm: float | None
    accumulation_kg_m2_s: float | None = None

    @property
    def margin_K(self):
        return self.surface_K - self.dewpoint_K

    @property
    def at_risk(self):
        return bool(self.margin_K < 0.0)

    def to_dict(self):
        return {**asdict(self), "margin_K": self.margin_K, "at_risk": self.at_risk}


def assembly(case):
    """(surface, reached_by, layers outside-in m2.K/W, interface index, foam permeance perm or None)."""
    roof = case.inputs["roof"]
    kind = roof["deck_insulation"]
    r_deck = roof["deck_r"]
    imperm = {"spray-foam": r_deck, "rigid-board": r_deck, "air-permeable": 0.0,
              "hybrid": roof["deck_air_impermeable_r"] or 0.0}[kind]
    layers = [case.r_covering, case.r_sheathing, imperm * R_IP, (r_deck - imperm) * R_IP]
    if case.attic_type == "vented":
        return "deck underside", "attic air", layers, None, None
    if imperm <= 0.0:
        return "sheathing underside", "indoor air", layers, 1, None
    if imperm < r_deck:
        return "interface of air-impermeable and air-permeable layers", "indoor air", layers, 2, None
    foam = "rigid-board" if kind == "rigid-board" else roof["deck_foam"]
    perm = roof["deck_permeance_perm"] or foam_permeance_perm(foam, imperm)
    return "sheathing face of the foam", "vapour diffusion", layers, 1, perm


def ceiling_leak_flow(case, T_in, T_out, rho_out):
    """House air leaking up through the ceiling of a vented attic, m3/s (zero unvented or when not colder outdoors)."""
    if case.attic_type != "vented":
        return np.zeros_like(np.asarray(T_out, dtype=float))
    a = case.inputs["attic"]
    floor_ft2 = case.geometry.areas()[2] / FT**2
    cfm50 = a["ceiling_cfm50"] if a["ceiling_cfm50"] is not None else CEILING_CFM50_PER_FT2 * floor_ft2
    dp = stack_pressure(a["ceiling_above_neutral_ft"] * FT, T_in, T_out, rho_out)
    return power_law_flow(cfm50 * CFM, dp)


def attic_air_mass_flow(net, f):
    """Air through the attic, kg/s per hour: vents, exchange with the house, leaks out, duct leaks (f: net.flows)."""
    return f["m_vent"] + net.m_exchange + net.m_leak_out + f["m_supply_leak"] + f["m_return_leak"]


def deck_moisture_hours(case, net, x, W_attic, m_attic=None):
    """The condensing surface hour by hour: dict of arrays (surface_K, dewpoint_K, underside_K, humidity_ratio,
    ceiling_leak_m3_s) and the assembly's words, from a solved network.

    net : attic.network.nodes.Network; x : (n, 6) solved temperatures, K; W_attic : (n,) solved attic humidity;
    m_attic : attic_air_mass_flow at x, kg/s, when the caller has the flows already (else computed here).
    """
    from attic.network.nodes import I_AIR, I_DECK_TOP, N_PLANES
    from ducts import moist_air

    x = np.asarray(x, dtype=float)
    T_so, T_si = x[:, :N_PLANES], x[:, N_PLANES:2 * N_PLANES]
    surface, reached_by, layers, k, perm = assembly(case)
    if x.shape[1] > I_DECK_TOP:  # a ventilated gap under the covering: the deck's top is its own node
        T_so = x[:, I_DECK_TOP:I_DECK_TOP + N_PLANES]
        layers = [0.0, *layers[1:]]
    T_surf = T_si if k is None else interface_temperatures(T_so, T_si, layers)[..., k]
    T_surf = np.min(T_surf, axis=1)
    P = net.pressure
    Q_leak = ceiling_leak_flow(case, net.T_in, net.T_out, net.rho_out)
    accumulation = None
    if reached_by == "attic air":
        m_solved = attic_air_mass_flow(net, net.flows(x)) if m_attic is None else m_attic
        W = mixed_humidity_ratio(m_solved, W_attic, net.rho_in * Q_leak, net.W_in)
        W = np.where(m_solved + net.rho_in * Q_leak > 0, W, net.W_in)
    elif reached_by == "indoor air":
        W = net.W_in
    else:
        p_in = vapour_pressure_from_humidity_ratio(net.W_in, P)
        p_out = vapour_pressure_from_humidity_ratio(net.W_out, P)
        Z_in, Z_out = 1.0 / (perm * PERM), 1.0 / (EXTERIOR_PERMEANCE_PERM * PERM)
        p = interface_vapour_pressure(p_in, p_out, Z_in, Z_out)
        W = humidity_ratio_from_vapour_pressure(p, P)
        # where it condenses the interface is held at saturation: what arrives less what leaves (dew-point method)
        p_sat = vapour_pressure_from_humidity_ratio(moist_air.humidity_ratio_from_dewpoint(T_surf, P), P)
        accumulation = np.where(p > p_sat, (p_in - p_sat) / Z_in - (p_sat - p_out) / Z_out, 0.0)
    W = np.broadcast_to(np.asarray(W, dtype=float), T_surf.shape)
    T_dp = np.atleast_1d(moist_air.dew_point(x[:, I_AIR], P, W))
    return {"surface": surface, "reached_by": reached_by, "permeance_perm": perm, "surface_K": T_surf,
            "dewpoint_K": T_dp, "underside_K": np.min(T_si, axis=1), "humidity_ratio": W,
            "ceiling_leak_m3_s": np.broadcast_to(Q_leak, T_surf.shape), "accumulation_kg_m2_s": accumulation}


def deck_moisture(case, net, state, m_attic=None):
    """DeckMoisture at a solved one-hour network (attic.network.solve.AtticState); m_attic as for
    deck_moisture_hours."""
    x = np.array([state.nodes_K or (*state.outer_K, *state.inner_K, state.air_K, state.floor_K)])
    d = deck_moisture_hours(case, net, x, np.array([state.humidity_ratio]), m_attic)
    return DeckMoisture(d["surface"], d["reached_by"], float(d["surface_K"][0]), float(d["dewpoint_K"][0]),
                        float(d["underside_K"][0]), float(net.T_out[0]), float(d["humidity_ratio"][0]),
                        float(d["ceiling_leak_m3_s"][0]), d["permeance_perm"],
                        None if d["accumulation_kg_m2_s"] is None else float(np.ravel(d["accumulation_kg_m2_s"])[0]))


def monthly_deck(times, surface_K, dewpoint_K, underside_K, outdoor_K, unvented):
    """Month by month: hours with a negative margin and mean temperatures, against the code's 45 °F criterion.

    times : datetimes of the hours; the K arrays are hourly. Returns a dict in SI (K) with one entry per month
    present, the three coldest months by mean outdoor air, and whether their condensing surface's monthly means
    meet the criterion (unvented attics only; the criterion is not the code's for vented ones).
    """
    from attic.codes.deck import COLDEST_MONTHS, CONDENSING_SURFACE_MIN_F
    from attic.units import F_to_K

    limit = float(F_to_K(CONDENSING_SURFACE_MIN_F))
    keys = np.array([t.year * 100 + t.month for t in times])
    months = []
    for k in dict.fromkeys(keys.tolist()):
        sel = keys == k
        s = surface_K[sel]
        months.append({"month": f"{k // 100}-{k % 100:02d}", "hours": int(sel.sum()),
                       "hours_at_risk": int(np.sum(s < dewpoint_K[sel])), "surface_mean_K": float(np.mean(s)),
                       "underside_mean_K": float(np.mean(underside_K[sel])),
                       "outdoor_mean_K": float(np.mean(outdoor_K[sel])),
                       "above_criterion": bool(np.mean(s) > limit) if unvented else None})
    coldest = sorted(months, key=lambda m: m["outdoor_mean_K"])[:COLDEST_MONTHS]
    return {"months": months, "coldest_months": [m["month"] for m in coldest],
            "meets_criterion": all(m["above_criterion"] for m in coldest) if unvented and coldest else None,
            "criterion_K": limit, "hours_at_risk": int(sum(m["hours_at_risk"] for m in months))}


ESTIMATE = "steady estimate at the heating design hour, not a code rule"  # the deck line's source in `check`


def deck_moisture_rule(results):
    """The roof deck's winter margin as a line of `check` and the report's checks (attic.codes.common.RuleResult),
    beside the code's own assembly rules: a steady estimate of this tool, not a code rule, so that a deck the
    code's table passes but the design hour puts below its dew point is said in the same list. results : the
    case's ConditionResult list; a line for the heating one that carries a deck check."""
    from attic.codes.common import DEFER, RuleResult
    from attic.units import K_to_F

    out = []
    for r in results:
        dm = getattr(r, "deck", None)
        if dm is None:
            continue
        surface, dew = float(K_to_F(dm.surface_K)), float(K_to_F(dm.dewpoint_K))
        has = f"{surface:.1f} °F at the {dm.surface}, dew point {dew:.1f} °F: margin {dm.margin_K * 1.8:+.1f} °F"
        out.append(RuleResult(f"Roof deck in winter: the {dm.surface} above the dew point reaching it "
                              f"({dm.reached_by})", ESTIMATE,
                              has, "a margin above 0 °F", "fail" if dm.at_risk else "pass",
                              "" if not dm.at_risk else "a qualified person's look at the assembly; `year` gives the "
                              "monthly means the code judges by", f"{CAUTION} {DEFER}"))
    return out
