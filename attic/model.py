"""The attic node network for one case at one condition: what the solver balances.

Nodes: the outer and inner surface of each roof plane, the attic air, and the top of the
ceiling insulation (the attic floor). The ducts in the attic are sinks on the air node
(convection) and on the surfaces (radiation), and their leaks are flows into and out of the
air node, solved together with the temperatures: no fixed regain factor.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from . import convection, radiation, sky, ventilation
from .atmosphere import SIGMA

N_PLANES = 2
I_AIR = 2 * N_PLANES
I_FLOOR = I_AIR + 1
N_NODES = I_FLOOR + 1
NODE_NAMES = ("plane 1 outer", "plane 2 outer", "plane 1 inner", "plane 2 inner", "attic air", "attic floor")

R_FILM_DOWN = 0.92  # h.ft2.F/Btu, still air, horizontal surface, heat flowing down; ASHRAE F (2017) ch. 26 Table 10
R_FILM_UP = 0.61  # same table, heat flowing up (values from memory)
R_DRYWALL = 0.45  # h.ft2.F/Btu, 1/2 in gypsum board; ASHRAE F (2017) ch. 26 Table 1 (value from memory)


@dataclass(frozen=True)
class Network:
    """Everything constant at one condition (SI), precomputed once before the solve."""

    kind: str
    areas: np.ndarray  # (3,) plane 1, plane 2, floor, m2
    F: np.ndarray  # (3, 3) interior view factors
    eps_in: np.ndarray  # (3,) interior emittances
    normal_up: np.ndarray  # (3,) upward component of each interior surface's normal
    absorbed: np.ndarray  # (2,) absorbed solar per plane, W/m2
    irradiance: np.ndarray  # (2,) solar irradiance per plane, W/m2
    eps_out: float
    F_sky: float
    T_sky: float
    T_ground: float
    h_out: float
    U_deck: float
    U_ceiling: float
    T_out: float
    T_in: float
    W_out: float
    W_in: float
    cp: float  # J/(kg_da.K) of outdoor air
    rho_out: float  # kg_da/m3
    rho_in: float
    vented: bool
    A_eff: float
    stack_height: float
    C_D: float
    wind_flow: float  # m3/s
    m_leak_out: float  # kg/s unvented leakage to outdoors
    m_exchange: float  # kg/s two-way exchange with the house
    volume: float
    ducts: object | None  # ducts.system.DuctSystem
    duct_m_dot: float
    duct_cp: float
    T_supply: float
    duct_ambients: dict
    pressure: float

    def ventilation_flow(self, T_a):
        """Vent airflow, m3/s at outdoor density: stack and wind in quadrature (0 unvented)."""
        if not self.vented:
            return 0.0 * T_a
        Qs = ventilation.stack_flow(self.A_eff, self.stack_height, T_a, self.T_out, self.C_D)
        return ventilation.combined_flow(Qs, self.wind_flow)

    def radiant_weights(self):
        """Share of a duct's radiant exchange with each interior surface: area times emittance."""
        w = self.areas * self.eps_in
        return w / w.sum()

    def duct_surroundings(self, T_a, T_interior):
        from ducts.system import Surroundings

        w = self.radiant_weights()
        T_mrt = float(np.dot(w, T_interior))
        sur = {"attic": Surroundings(float(T_a), T_mrt, self.W_out)}
        for loc, (Tc, Th) in self.duct_ambients.items():
            T = Tc if self.kind == "cooling" else Th
            sur[loc] = Surroundings(T, T, self.W_out)
        return sur

    def duct_chain(self, T_a, T_interior):
        from ducts.system import thermal_chain

        return thermal_chain(self.ducts, self.duct_m_dot, self.duct_cp, self.T_supply, self.T_in,
                             self.duct_surroundings(T_a, T_interior), self.pressure)

    def flows(self, x):
        """Every heat flow of the network at temperatures x (K), W; see `residuals`."""
        x = np.asarray(x, dtype=float)
        T_so = x[:N_PLANES]
        T_si = x[N_PLANES:I_AIR]
        T_a = x[I_AIR]
        T_f = x[I_FLOOR]
        A = self.areas
        Ap = A[:N_PLANES]
        F_g = 1.0 - self.F_sky
        solar = Ap * self.absorbed
        conv_out = Ap * self.h_out * (self.T_out - T_so)
        lw_out = Ap * self.eps_out * SIGMA * (self.F_sky * (self.T_sky**4 - T_so**4)
                                              + F_g * (self.T_ground**4 - T_so**4))
        deck = Ap * self.U_deck * (T_so - T_si)  # outer -> inner
        T_int = np.concatenate([T_si, [T_f]])
        h_int = convection.natural_convection_walton(T_int, T_a, self.normal_up)
        conv_in = A * h_int * (T_int - T_a)  # surface -> air
        q_rad = radiation.grey_enclosure_net_flux(T_int, self.eps_in, self.F) * A  # W leaving each surface
        ceiling = A[2] * self.U_ceiling * (T_f - self.T_in)  # floor -> house
        m_vent = self.rho_out * self.ventilation_flow(T_a)
        vent = m_vent * self.cp * (self.T_out - T_a)
        leak_out = self.m_leak_out * self.cp * (self.T_out - T_a)
        m_house = self.m_exchange
        duct_conv = 0.0
        duct_rad = np.zeros(3)
        sl = rl = 0.0
        m_sl = m_rl = 0.0
        if self.ducts is not None:
            chain = self.duct_chain(T_a, T_int)
            s = chain.sinks("attic")
            duct_conv = float(s["Q_conv"])
            duct_rad = float(s["Q_rad"]) * self.radiant_weights()
            m_sl, m_rl = s["m_in"], s["m_out"]
            sl = m_sl * self.cp * (self.T_supply - T_a)
            T_repl = self.T_out if self.vented else self.T_in
            rl = m_rl * self.cp * (T_repl - T_a)
        to_house = m_house + (0.0 if self.vented else m_sl)  # air the attic sends into the house
        exchange = m_house * self.cp * (self.T_in - T_a)
        return {
            "solar": solar, "conv_out": conv_out, "lw_out": lw_out, "deck": deck, "conv_in": conv_in,
            "q_rad": q_rad, "ceiling": ceiling, "vent": vent, "leak_out": leak_out, "exchange": exchange,
            "duct_conv": duct_conv, "duct_rad": duct_rad, "supply_leak": sl, "return_leak": rl,
            "m_vent": m_vent, "m_to_house": to_house, "m_supply_leak": m_sl, "m_return_leak": m_rl,
        }

    def residuals(self, x):
        """Energy balance of each node, W (zero at the solution)."""
        f = self.flows(x)
        r = np.empty(N_NODES)
        r[:N_PLANES] = f["solar"] + f["conv_out"] + f["lw_out"] - f["deck"]
        r[N_PLANES:I_AIR] = f["deck"] - f["conv_in"][:N_PLANES] - f["q_rad"][:N_PLANES] - f["duct_rad"][:N_PLANES]
        r[I_FLOOR] = -f["conv_in"][2] - f["q_rad"][2] - f["ceiling"] - f["duct_rad"][2]
        r[I_AIR] = (f["conv_in"].sum() + f["vent"] + f["leak_out"] + f["exchange"] - f["duct_conv"]
                    + f["supply_leak"] + f["return_leak"])
        return r

    def initial_guess(self):
        T_o = self.T_out
        h_tot = self.h_out + 4 * self.eps_out * SIGMA * T_o**3
        T_so = T_o + self.absorbed / h_tot
        if self.kind == "cooling":
            T_a = T_o + 0.3 * float(np.mean(T_so - T_o)) + 2.0
        else:
            T_a = 0.7 * T_o + 0.3 * self.T_in
        T_si = np.full(N_PLANES, T_a) + 0.5 * (T_so - T_a) * (1 if self.U_deck > 0.2 else 0.2)
        T_f = 0.5 * (T_a + self.T_in) if self.U_ceiling > 1.0 else T_a + 0.2 * (self.T_in - T_a)
        return np.concatenate([T_so, T_si, [T_a, T_f]])


def ceiling_u(r_ceiling, kind):
    """Conductance from the top of the ceiling insulation to the indoor air, W/(m2.K).

    Insulation + 1/2 in drywall + the indoor film (heat flowing down in cooling, up in heating).
    """
    from .units import R_IP

    film = R_FILM_DOWN if kind == "cooling" else R_FILM_UP
    return 1.0 / (r_ceiling + (R_DRYWALL + film) * R_IP)


def _sun_on_planes(latitude, doy, solar_hour, tilt_deg, azimuths, pressure, elevation, linke, albedo):
    from .solar import clear_sky_on_planes

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


def build_network(case, cond):
    """The Network of `case` at condition `cond` (an attic.case.Condition)."""
    from ducts import moist_air

    g = case.geometry
    P = case.pressure
    tilt_deg = np.degrees(g.tilt)
    if cond.irradiance is not None:
        G = np.full(N_PLANES, cond.irradiance)
    else:
        G = _sun_on_planes(case.latitude, cond.doy, cond.solar_hour, float(tilt_deg), g.plane_azimuths, P,
                           case.elevation, cond.linke_turbidity, cond.albedo)
    T_dp = moist_air.dew_point(cond.T_out, P, cond.W_out)
    eps_sky = sky.sky_emissivity_berdahl_martin(T_dp, cond.solar_hour, P)
    T_sky = sky.sky_temperature_from_emissivity(eps_sky, cond.T_out)
    cp = float(moist_air.specific_heat(cond.T_out, P, cond.W_out))
    rho_out = 1.0 / float(moist_air.specific_volume(cond.T_out, P, cond.W_out))
    rho_in = 1.0 / float(moist_air.specific_volume(cond.T_in, P, cond.W_in))
    vented = case.attic_type == "vented"
    v = case.vents
    if vented:
        A_eff = ventilation.openings_in_series(v.A_low, v.A_high)
        # wind: the inlet area of a balanced pair with the same series area (sqrt(2) A_eff)
        Qw = ventilation.wind_flow(np.sqrt(2.0) * A_eff, cond.wind, v.wind_effectiveness)
        H, C_D = v.height, v.discharge_coefficient
    else:
        A_eff, Qw, H, C_D = 0.0, 0.0, 0.0, 0.65
    U_deck = 1.0 / (case.r_covering + case.r_sheathing + case.r_deck)
    duct_m = duct_cp = 0.0
    if case.ducts is not None:
        from ducts.system import mass_flow

        duct_m = float(mass_flow(case.ducts, cond.T_in, cond.W_in, P))
        duct_cp = float(moist_air.specific_heat(cond.T_in, P, cond.W_in))
    return Network(
        kind=cond.kind, areas=g.areas(), F=g.view_factors(),
        eps_in=np.array([case.deck_underside_emittance] * N_PLANES + [case.floor_emittance]),
        normal_up=np.array([-np.cos(g.tilt)] * N_PLANES + [1.0]),
        absorbed=(1.0 - case.solar_reflectance) * G, irradiance=G, eps_out=case.thermal_emittance,
        F_sky=sky.view_factor_to_sky(g.tilt), T_sky=float(T_sky), T_ground=cond.T_out,
        h_out=convection.exterior_convection_watmuff(cond.wind), U_deck=U_deck,
        U_ceiling=ceiling_u(case.r_ceiling, cond.kind), T_out=cond.T_out, T_in=cond.T_in, W_out=cond.W_out,
        W_in=cond.W_in, cp=cp, rho_out=rho_out, rho_in=rho_in, vented=vented, A_eff=float(A_eff),
        stack_height=H, C_D=C_D, wind_flow=float(Qw),
        m_leak_out=0.0 if vented else rho_out * case.outdoor_leakage_ach * g.volume / 3600.0,
        m_exchange=rho_in * case.house_exchange, volume=g.volume, ducts=case.ducts, duct_m_dot=duct_m,
        duct_cp=duct_cp, T_supply=cond.T_supply, duct_ambients=case.duct_ambients, pressure=P)
