"""A case's attic network: its one-hour network at a design condition (`build_network`), or its network over
many hours (`build_network_hours`: a day, a year). The nodes and their balance are attic.network.nodes.

A case may hold (m,) arrays of numbers in place of floats (the samples of an uncertainty run, attic.runs.sampled):
its one-hour network then has m rows.
"""

from __future__ import annotations

import numpy as np

from attic.network.nodes import COOLING, HEATING, N_PLANES, ROW_FIELDS, Hours, Network
from attic.physics import sky, ventilation
from ducts.stack import stack_duct_rows, system_numbers


def ceiling_u(r_ceiling, mode):
    """Ceiling conductance, W/(m2.K), for an array of COOLING/OFF/HEATING (heat flows up only in heating)."""
    from attic.physics.assembly import ceiling_conductance

    return ceiling_conductance(r_ceiling, np.asarray(mode) == HEATING)


def _sun_on_planes(latitude, doy, solar_hour, tilt_deg, azimuths, pressure, elevation, linke, albedo):
    from attic.physics.solar import clear_sky_on_planes

    key = (latitude, doy, solar_hour, tilt_deg, tuple(azimuths), pressure, elevation, linke, albedo)
    hit = _SUN_CACHE.get(key)
    if hit is None:
        cs = clear_sky_on_planes(latitude, doy, solar_hour, [tilt_deg] * len(azimuths), list(azimuths),
                                 pressure=pressure, elevation=elevation, linke_turbidity=linke, albedo=albedo)
        hit = cs["poa"][:, 0].copy()
        if len(_SUN_CACHE) > 4096:  # sweeps over the sun itself should not grow without bound
            _SUN_CACHE.clear()
        _SUN_CACHE[key] = hit
    return hit.copy()


_SUN_CACHE: dict = {}  # the same sun is asked for by every variant and sweep point of a case


def hours_of_condition(case, cond):
    """The one-hour Hours of a design condition (the air handler running all the hour)."""
    if cond.irradiance is not None:  # the same on both planes: (1, planes), or (m, planes) for m samples
        G = np.multiply.outer(np.atleast_1d(np.asarray(cond.irradiance, float)), np.ones(N_PLANES))
    else:
        g = case.geometry
        G = _sun_on_planes(case.latitude, cond.doy, cond.solar_hour, float(np.degrees(g.tilt)), g.plane_azimuths,
                           case.pressure, case.elevation, cond.linke_turbidity, cond.albedo)[None, :]
    one = np.ones(1)
    return Hours(
        mode=np.array([HEATING if cond.kind == "heating" else COOLING]), T_out=cond.T_out * one,
        W_out=cond.W_out * one, T_in=cond.T_in * one, W_in=cond.W_in * one, wind=cond.wind * one, poa=G,
        T_supply=cond.T_supply * one, runtime=one,
        solar_hour=None if cond.solar_hour is None else cond.solar_hour * one)


def build_network(case, cond):
    """The one-hour Network of `case` at design condition `cond` (an attic.case.load.Condition)."""
    return build_network_hours(case, hours_of_condition(case, cond))


def build_network_hours(case, hours: Hours):
    """The Network of `case` over `hours`; moist-air properties are one CoolProp call each on the arrays."""
    from ducts import coil_leaving_humidity_ratio, moist_air

    g = case.geometry
    P = case.pressure
    G = np.asarray(hours.poa, dtype=float)
    T_out, W_out, T_in, W_in = (np.asarray(a, dtype=float) for a in (hours.T_out, hours.W_out, hours.T_in,
                                                                       hours.W_in))
    T_dp = moist_air.dew_point(T_out, P, W_out)
    eps_sky = sky.sky_emissivity_berdahl_martin(T_dp, hours.solar_hour, P)
    T_sky = np.atleast_1d(sky.sky_temperature_from_emissivity(eps_sky, T_out))
    cp = np.atleast_1d(moist_air.specific_heat(T_out, P, W_out))
    rho_out = 1.0 / np.atleast_1d(moist_air.specific_volume(T_out, P, W_out))
    rho_in = 1.0 / np.atleast_1d(moist_air.specific_volume(T_in, P, W_in))
    vented = case.attic_type == "vented"
    v = case.vents
    wind = np.asarray(hours.wind, dtype=float)
    if vented:
        A_eff = ventilation.openings_in_series(v.A_low, v.A_high)
        # wind through the inlet openings: low vents facing it, or the windward half of one kind alone
        Qw = np.atleast_1d(ventilation.wind_flow(ventilation.wind_inlet_area(v.A_low, v.A_high), wind,
                                                 v.wind_effectiveness))
        H, C_D = v.height, v.discharge_coefficient
    else:
        A_eff, Qw, H, C_D = 0.0, np.zeros_like(wind), 0.0, 0.65
    # with a gap the covering is one node, isothermal through its thickness (tile: R 0.05); the deck
    # conducts from its top, under the gap, to its underside
    gap = case.batten_gap
    U_deck = 1.0 / ((0.0 if gap > 0 else case.r_covering) + case.r_sheathing + case.r_deck)
    # a case may hold (m,) arrays of numbers in place of floats (the samples of an uncertainty run): its rows
    n = _row_count(len(T_out), W_out, T_in, W_in, wind, hours.T_supply, hours.runtime, G, case.solar_reflectance,
                   case.thermal_emittance, case.roughness_multiplier, U_deck, case.r_ceiling, A_eff, H, C_D, Qw,
                   case.outdoor_leakage_ach, case.house_exchange,
                   case.deck_underside_emittance, case.floor_emittance,
                   None if case.ducts is None else case.ducts.airflow)
    ducts = case.ducts
    duct_m = duct_cp = duct_cp_supply = np.zeros(n)
    mode = np.asarray(hours.mode)
    if ducts is not None:
        duct_m = np.atleast_1d(ducts.airflow / moist_air.specific_volume(T_in, P, W_in))
        duct_cp = np.atleast_1d(moist_air.specific_heat(T_in, P, W_in))
        # the supply air's own: at its temperature, and in cooling at the coil's leaving humidity ratio (a wet
        # coil's; ducts.energy_parts gives the supply side's enthalpy change there)
        T_s = np.asarray(hours.T_supply, dtype=float)
        W_s = np.where(mode == COOLING, coil_leaving_humidity_ratio(T_s, W_in, P), W_in)
        duct_cp_supply = np.atleast_1d(moist_air.specific_heat(T_s, P, W_s)) + np.zeros(n)
        if n > 1 and any(np.ndim(v) > 0 for v in system_numbers(ducts)):
            ducts = stack_duct_rows(ducts, n)

    def row(value):  # one row, or a row per sample; every row field goes to n rows below
        return np.atleast_1d(np.asarray(value, dtype=float))

    eps_in = np.stack(np.broadcast_arrays(*(row(e) for e in [case.deck_underside_emittance] * N_PLANES
                                            + [case.floor_emittance])), axis=-1)
    m_leak = np.zeros(n) if vented else rho_out * case.outdoor_leakage_ach * g.volume / 3600.0
    net = Network(
        mode=mode, areas=g.areas(), F=g.view_factors(), eps_in=eps_in,
        normal_up=np.array([-np.cos(g.tilt)] * N_PLANES + [1.0]),
        absorbed=(1.0 - row(case.solar_reflectance)[:, None]) * G, irradiance=G, eps_out=row(case.thermal_emittance),
        F_sky=sky.view_factor_to_sky(g.tilt), T_sky=T_sky, T_ground=T_out,
        wind=np.atleast_1d(wind), exterior_convection=case.exterior_convection, tilt=g.tilt,
        plane_perimeter=2.0 * (g.slope_length + g.length), roughness=row(case.roughness_multiplier),
        U_deck=row(U_deck),
        U_ceiling=np.atleast_1d(ceiling_u(case.r_ceiling, mode)), T_out=T_out, T_in=T_in, W_out=W_out, W_in=W_in,
        cp=cp, rho_out=rho_out, rho_in=rho_in, vented=vented, A_eff=row(A_eff), stack_height=row(H), C_D=row(C_D),
        wind_flow=Qw, m_leak_out=m_leak, m_exchange=rho_in * case.house_exchange, volume=g.volume, ducts=ducts,
        duct_m_dot=duct_m, duct_cp=duct_cp, duct_cp_supply=duct_cp_supply,
        T_supply=np.asarray(hours.T_supply, dtype=float),
        runtime=np.asarray(hours.runtime, dtype=float), duct_ambients=case.duct_ambients, pressure=P,
        C_outer=case.heat_capacity_outer, C_inner=case.heat_capacity_inner, gap=gap, slope_length=g.slope_length,
        C_deck_top=case.heat_capacity_deck_top)
    short = {f: a for f in ROW_FIELDS if len(a := np.asarray(getattr(net, f))) != n}
    if not short:
        return net
    import dataclasses

    # a field of one row (a number of the case, or the one hour of m samples): to n rows
    return dataclasses.replace(net, **{f: np.array(np.broadcast_to(a, (n,) + a.shape[1:])) for f, a in short.items()})


def _row_count(n_hours, *values):
    """Rows of the network: the hours, or the length of the (m,) arrays a case holds in place of floats (with one
    hour); ValueError when both are above one and differ."""
    sizes = {len(v) for v in values if v is not None and np.ndim(v) > 0} - {1}
    if not sizes:
        return n_hours
    if len(sizes) > 1 or (n_hours != 1 and sizes != {n_hours}):
        raise ValueError(f"the case's arrays of numbers ({sorted(sizes)}) do not match its {n_hours} hours")
    return sizes.pop()
