"""A year (or any span) of hours from a weather file, solved together: attic temperatures, hours above
thresholds, and the annual ceiling and duct energy at the coil."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from attic.units import BTU, KWH

COOLING_BALANCE_F = 65.0  # outdoor dry bulb above which the house needs cooling (common practice, no source)
HEATING_BALANCE_F = 60.0  # below which it needs heating (common practice, no source)
PARTS = ("base", "ceiling", "attic_air", "duct_conduction", "duct_leakage_sensible", "duct_leakage_latent", "ducts",
         "unmet", "coil")


@dataclass(frozen=True)
class YearResult:
    """Hourly results and their sums (SI inside: W per hour, J in the totals).

    hourly : dict of arrays over hours: attic_air_K, deck_surface_K, deck_dewpoint_K, deck_underside_K (the
             winter condensing surface, attic.runs.deck), mode (+1/0/-1), runtime (0-1), base_w, ceiling_w,
             attic_air_w, duct_conduction_w, duct_leakage_sensible_w, duct_leakage_latent_w, ducts_w, coil_w,
             short (the air handler running the whole hour delivers less than the house load)
    totals : {"cooling" | "heating": {part: J}} summed over the hours of that mode
    """

    case: str
    title: str
    times: tuple
    hourly: dict
    totals: dict
    hours_above: dict  # threshold in K -> hours with the attic air above it
    residual_w: float
    deck: dict | None = None  # attic.runs.deck.monthly_deck with the surface's words (SI)

    def energy(self, mode, part, unit="btu"):
        j = self.totals[mode][part]
        return j / BTU if unit == "btu" else j / KWH

    def electricity_kwh(self, mode, btu_per_wh):
        """kWh of electricity for the coil energy of one mode, at a seasonal rating (SEER or HSPF, Btu/Wh)."""
        from attic.runs.economics import electricity_kwh

        return electricity_kwh(self.energy(mode, "coil", "btu"), btu_per_wh)

    def to_dict(self):
        """SI, as held (arrays as lists); attic.present.hours.year_output gives the output contract in IP or SI."""
        from attic.runs.plain import si_dict

        return si_dict(self)

    def to_frame(self):
        """Every hour as a pandas DataFrame in SI (K, W; mode 1 cooling, -1 heating, 0 off), indexed by time."""
        import pandas as pd

        from attic.runs.plain import frame

        return frame(dict(self.hourly), index=pd.DatetimeIndex(self.times), index_name="time")


def _load_lines(case, T_out, cool_bal, heat_bal):
    """Hourly base load by the linear load lines of the bin method, W (cooling +, heating +)."""
    c = case.cooling
    base_c = (case.base_sensible + case.base_latent) * np.clip((T_out - cool_bal) / max(c.T_out - cool_bal, 0.1),
                                                               0.0, None)
    if case.heating is None:
        return base_c, np.zeros_like(T_out)
    h = case.heating
    base_h = case.base_heating * np.clip((heat_bal - T_out) / max(heat_bal - h.T_out, 0.1), 0.0, None)
    return base_c, base_h


def clock_hours(times):
    """Hour of the day of each time stamp (local standard time), h: what the sky's hourly correction
    takes (Berdahl & Martin count the hour from local midnight; solar time differs by under an hour)."""
    return np.array([t.hour + t.minute / 60.0 for t in times], dtype=float)


def year_network(case, weather, runtime_model="load", cooling_balance_K=None, heating_balance_K=None):
    """The hourly Network of a case over a weather span, and each hour's base load (W).

    runtime_model : "load" (the air handler runs the fraction of each hour its capacity needs to meet the
        base load; the ducts' pull on the attic scales with it) or "full" (it runs every cooling and heating
        hour at full airflow, as on a design day).

    References
    ----------
    Linear load lines against outdoor temperature: the bin method, ASHRAE Handbook-Fundamentals (2017),
    ch. 19 (energy estimating methods).
    """
    from attic.case.load import CaseError
    from attic.network.build import build_network_hours
    from attic.network.nodes import COOLING, HEATING, OFF, Hours
    from attic.physics.solar import weather_on_planes
    from attic.units import F_to_K
    from ducts import coil_leaving_humidity_ratio, moist_air

    site = case.inputs["site"]
    for key in ("longitude_deg", "utc_offset_h"):
        if site[key] is None:
            raise CaseError(f"site.{key}", "is missing: the year run needs it to place the sun at the weather "
                                           "file's clock times")
    P = case.pressure
    cool_bal = float(F_to_K(COOLING_BALANCE_F)) if cooling_balance_K is None else cooling_balance_K
    heat_bal = float(F_to_K(HEATING_BALANCE_F)) if heating_balance_K is None else heating_balance_K
    T_out = weather.T_dry
    W_out = (moist_air.humidity_ratio_from_dewpoint(np.minimum(weather.T_dew, T_out), P) if weather.T_dew is not None
             else moist_air.humidity_ratio_from_rh(T_out, P, np.clip(weather.rh, 0.01, 1.0)))
    W_out = np.atleast_1d(W_out)
    g = case.geometry
    poa = weather_on_planes(weather.times, site["utc_offset_h"], case.latitude, site["longitude_deg"], weather.ghi,
                            [np.degrees(g.tilt)] * 2, list(g.plane_azimuths), weather.dni, weather.dhi, P,
                            case.elevation, case.cooling.albedo).T
    c, h = case.cooling, case.heating
    heating_on = h is not None
    mode = np.where(T_out >= cool_bal, COOLING, np.where((T_out <= heat_bal) & heating_on, HEATING, OFF))
    warm = T_out >= 0.5 * (cool_bal + heat_bal)
    use_cool = (mode == COOLING) | ((mode == OFF) & (warm | (not heating_on)))
    T_in = np.where(use_cool, c.T_in, h.T_in if heating_on else c.T_in)
    W_in = np.where(use_cool, c.W_in, h.W_in if heating_on else c.W_in)
    T_sup = np.where(mode == HEATING, h.T_supply if heating_on else c.T_supply, c.T_supply)
    base_c, base_h = _load_lines(case, T_out, cool_bal, heat_bal)
    base = np.where(mode == COOLING, base_c, np.where(mode == HEATING, base_h, 0.0))
    on = mode != OFF
    if runtime_model == "full" or case.ducts is None:
        runtime = on.astype(float)
    else:
        m = case.ducts.airflow / moist_air.specific_volume(T_in, P, W_in)
        W_s = np.where(mode == COOLING, coil_leaving_humidity_ratio(T_sup, W_in, P), W_in)
        cap = np.abs(m * (moist_air.enthalpy(T_in, P, W_in) - moist_air.enthalpy(T_sup, P, W_s)))
        runtime = np.where(on, np.clip(base / np.maximum(cap, 1.0), 0.0, 1.0), 0.0)
    hours = Hours(mode=mode, T_out=T_out, W_out=W_out, T_in=T_in, W_in=W_in, wind=weather.wind * case.wind_factor,
                  poa=poa, T_supply=T_sup, runtime=runtime, solar_hour=clock_hours(weather.times))
    return build_network_hours(case, hours), base


RUNTIME_TOL = 1e-3  # change of every hour's runtime fraction at which the runtimes have settled
MAX_ROUNDS = 30


def _duct_parts(case, net, st, mode):
    """Energy parts of the ducts at full airflow, hour by hour (W): cooling hours by enthalpy, heating sensible."""
    from attic.network.nodes import HEATING
    from attic.runs.coupling import duct_energy_hours

    _, ec = duct_energy_hours(case, net, st, "cooling")
    _, eh = duct_energy_hours(case, net, st, "heating")
    return {k: np.where(mode == HEATING, eh[k], ec[k]) for k in ec}


def run_year(case, weather, thresholds_K=(), runtime_model="load", cooling_balance_K=None, heating_balance_K=None):
    """Solve every hour of `weather` for `case` at once (see year_network for the assumptions).

    With runtime_model "load" the runtime, the attic and the duct loads are one state: the attic is
    solved with the ducts running a fraction f of each hour, f is set to what delivers that hour's house
    load at the case's airflow (capped at 1: the hours where even the whole hour falls short are counted),
    and the two are repeated until no hour's f moves more than RUNTIME_TOL.
    """
    import dataclasses

    from attic.network.nodes import COOLING, HEATING, OFF
    from attic.network.solve import SolveError, solve_hours

    net, base = year_network(case, weather, runtime_model, cooling_balance_K, heating_balance_K)
    mode = net.mode
    label = f'case "{case.name}", year run'
    st = solve_hours(net, label=label)
    s = np.where(mode == HEATING, -1.0, 1.0)
    for _ in range(MAX_ROUNDS):
        on = mode != OFF
        ceiling = np.where(on, s * st.ceiling_to_house_w, 0.0)
        air = np.where(on, s * st.attic_air_to_house_w + np.where(mode == COOLING, st.attic_air_to_house_latent_w,
                                                                   0.0), 0.0)
        # an hour whose net load is not positive (a cool night in a cooling month) asks nothing of the equipment
        on = on & (base + ceiling + air > 0)
        house = np.where(on, base + ceiling + air, 0.0)
        if case.ducts is None:
            break
        e = _duct_parts(case, net, st, mode)
        with np.errstate(divide="ignore", invalid="ignore"):
            need = np.where(on & (e["delivered"] > 0), house / e["delivered"], 0.0)
        if runtime_model != "load":
            break
        f = np.clip(need, 0.0, 1.0)
        moved = float(np.max(np.abs(f - net.runtime)))
        if moved <= RUNTIME_TOL:
            break
        net = dataclasses.replace(net, runtime=f)
        st = solve_hours(net, x0=st.x, label=label)
    else:
        raise SolveError(f"{label}: the runtimes did not settle in {MAX_ROUNDS} rounds (last change {moved:.2g} "
                         "of an hour). No result is shown for it.")
    base, ceiling, air = (np.where(on, a, 0.0) for a in (base, ceiling, air))
    zero = np.zeros_like(net.T_out)
    cond_w, ls_w, ll_w, duct_w, coil = zero, zero, zero, zero, house
    short = np.zeros(len(zero), dtype=bool)
    if case.ducts is not None:
        # "load": the runtime of the solved state (within RUNTIME_TOL of the one the attic was solved at);
        # "full": the attic sees the air handler all hour and the loads are those that meet the house load
        scale = np.clip(need, 0.0, 1.0) if runtime_model == "load" else need
        short = on & (need > 1.0 + RUNTIME_TOL) if runtime_model == "load" else short
        cond_w = scale * (e["supply_conduction"] + e["return_conduction"])
        ls_w = scale * (e["supply_leak_sensible"] + e["return_leak_sensible"])
        ll_w = scale * (e["supply_leak_latent"] + e["return_leak_latent"])
        duct_w = scale * (e["equipment"] - e["delivered"])
        coil = scale * e["equipment"]
    unmet = np.maximum(house - (coil - duct_w), 0.0) * short  # what a short air handler leaves undelivered
    from attic.runs.deck import deck_moisture_hours, monthly_deck

    dm = deck_moisture_hours(case, net, st.x, st.humidity_ratio)
    deck = {"surface": dm["surface"], "reached_by": dm["reached_by"],
            **monthly_deck(weather.times, dm["surface_K"], dm["dewpoint_K"], dm["underside_K"], net.T_out,
                           case.attic_type == "unvented")}
    hourly = {"attic_air_K": st.air_K, "deck_surface_K": dm["surface_K"], "deck_dewpoint_K": dm["dewpoint_K"],
              "deck_underside_K": dm["underside_K"], "mode": mode, "runtime": net.runtime, "base_w": base,
              "ceiling_w": ceiling,
              "attic_air_w": air, "duct_conduction_w": cond_w, "duct_leakage_sensible_w": ls_w,
              "duct_leakage_latent_w": ll_w, "ducts_w": duct_w, "unmet_w": unmet, "coil_w": coil,
              "short": short}
    totals = {}
    for name, code in (("cooling", COOLING), ("heating", HEATING)):
        sel = mode == code
        totals[name] = {p: float(np.sum(hourly[p + "_w"][sel]) * 3600.0) for p in PARTS}
    above = {float(t): int(np.sum(st.air_K > t)) for t in thresholds_K}
    return YearResult(case.name, case.title, tuple(weather.times), hourly, totals, above, float(np.max(st.residual_w)),
                      deck)
