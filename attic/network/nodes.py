"""The attic node network of one case over one or many hours: what the solver balances.

Nodes: the outer and inner surface of each roof plane, the attic air, and the top of the
ceiling insulation (the attic floor). The ducts in the attic are sinks on the air node
(convection) and on the surfaces (radiation), and their leaks are flows into and out of the
air node, solved together with the temperatures: no fixed regain factor.

Every quantity that can change from hour to hour is an array over a leading axis of hours;
a design condition is the one-hour case. The residual is computed for all hours at once, and
the hours do not interact (quasi-steady), so the Jacobian is block-diagonal: the batched
solver in attic.network.solve uses that.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from attic.physics import convection, radiation, ventilation
from attic.physics.atmosphere import SIGMA
from attic.physics.convection import DEFAULT_EXTERIOR_CONVECTION

if TYPE_CHECKING:
    from ducts import DuctSystem

N_PLANES = 2
I_AIR = 2 * N_PLANES
I_FLOOR = I_AIR + 1
N_NODES = I_FLOOR + 1
# A covering on battens adds, per plane, the top of the deck and the mean air of the gap between them
I_DECK_TOP = N_NODES
I_GAP_AIR = I_DECK_TOP + N_PLANES
N_NODES_GAP = I_GAP_AIR + N_PLANES
NODE_NAMES = ("plane 1 outer", "plane 2 outer", "plane 1 inner", "plane 2 inner", "attic air", "attic floor",
              "plane 1 deck top", "plane 2 deck top", "plane 1 gap air", "plane 2 gap air")


COOLING, OFF, HEATING = 1, 0, -1

# Fields with a leading axis of rows: hours of a day or year, or the points of a study. Whatever may
# differ from row to row is here; every other field is shared by all rows (see attic.network.stack).
ROW_FIELDS = ("mode", "absorbed", "irradiance", "T_sky", "T_ground", "wind", "U_ceiling", "T_out", "T_in", "W_out",
              "W_in", "cp", "rho_out", "rho_in", "wind_flow", "m_leak_out", "m_exchange", "duct_m_dot", "duct_cp",
              "duct_cp_supply", "T_supply", "runtime", "eps_out", "U_deck", "A_eff", "stack_height", "C_D", "roughness",
              "eps_in")


@dataclass(frozen=True)
class Hours:
    """What drives the attic, hour by hour (SI arrays of shape (n,); poa is (n, 2)).

    mode : +1 cooling, -1 heating, 0 equipment off; T_out, T_in, T_supply : K; W_out, W_in : kg/kg;
    wind : m/s at roof height; poa : W/m2 on each roof plane; runtime : fraction of the hour the air
    handler runs (0-1); solar_hour : h (for the sky's hourly correction) or None.
    """

    mode: np.ndarray
    T_out: np.ndarray
    W_out: np.ndarray
    T_in: np.ndarray
    W_in: np.ndarray
    wind: np.ndarray
    poa: np.ndarray
    T_supply: np.ndarray
    runtime: np.ndarray
    solar_hour: np.ndarray | None = None

    @property
    def n(self):
        return len(self.T_out)


@dataclass(frozen=True)
class Network:
    """Everything fixed during the solve (SI). Row fields (ROW_FIELDS) have shape (n,), (n, 2) or (n, 3)."""

    mode: np.ndarray
    areas: np.ndarray  # (3,) plane 1, plane 2, floor, m2
    F: np.ndarray  # (3, 3) interior view factors
    eps_in: np.ndarray  # (n, 3) interior emittances
    normal_up: np.ndarray  # (3,) upward component of each interior surface's normal
    absorbed: np.ndarray  # (n, 2) absorbed solar per plane, W/m2
    irradiance: np.ndarray  # (n, 2) solar irradiance per plane, W/m2
    eps_out: np.ndarray  # thermal emittance of the outer surface
    F_sky: float
    T_sky: np.ndarray
    T_ground: np.ndarray
    wind: np.ndarray  # m/s at roof height
    U_deck: np.ndarray  # W/(m2.K), the deck's conductance below its outer node
    U_ceiling: np.ndarray
    T_out: np.ndarray
    T_in: np.ndarray
    W_out: np.ndarray
    W_in: np.ndarray
    cp: np.ndarray  # J/(kg_da.K) of outdoor air
    rho_out: np.ndarray  # kg_da/m3
    rho_in: np.ndarray
    vented: bool
    A_eff: np.ndarray  # m2, low and high vents in series
    stack_height: np.ndarray  # m
    C_D: np.ndarray
    wind_flow: np.ndarray  # m3/s
    m_leak_out: np.ndarray  # kg/s unvented leakage to outdoors
    m_exchange: np.ndarray  # kg/s two-way exchange with the house
    volume: float
    ducts: DuctSystem | None
    duct_m_dot: np.ndarray
    duct_cp: np.ndarray  # J/(kg_da.K) of the house air (the return side's)
    duct_cp_supply: np.ndarray  # J/(kg_da.K) of the supply air, at its temperature and humidity ratio
    T_supply: np.ndarray
    runtime: np.ndarray
    duct_ambients: dict
    pressure: float
    # roof heat capacity (J/(m2.K) per plane, outer and inner node) and the previous hour's temperatures
    # (n, n_nodes); with previous=None the hours are quasi-steady
    exterior_convection: str = DEFAULT_EXTERIOR_CONVECTION  # a key of convection.EXTERIOR_CONVECTION
    tilt: float = 0.0  # rad
    plane_perimeter: float = 1.0  # m, of one roof plane
    roughness: np.ndarray | None = None  # R_f of the outer surface (n,)
    gap: float = 0.0  # m, the ventilated space between covering and deck (0: covering on the deck)
    slope_length: float = 0.0  # m, eave to ridge
    C_outer: float = 0.0
    C_inner: float = 0.0
    C_deck_top: float = 0.0  # with a gap: the upper half of the sheathing
    previous: np.ndarray | None = None
    dt: float = 3600.0

    @property
    def n(self):
        return len(self.T_out)

    def take(self, idx):
        """The network of some of its rows (an index array, possibly with repeats, or a slice)."""
        import dataclasses

        rows = {f: getattr(self, f)[idx] for f in ROW_FIELDS}
        if hasattr(self.ducts, "take"):  # a stack of duct systems, one per row
            rows["ducts"] = self.ducts.take(idx)
        return dataclasses.replace(self, **rows)

    @property
    def n_nodes(self):
        """Unknown temperatures per hour: 6, or 10 with a ventilated gap under the covering."""
        return N_NODES_GAP if self.gap > 0 else N_NODES

    @property
    def kind(self):
        """'cooling' or 'heating' for a one-hour network (a design condition)."""
        return "heating" if self.mode[0] == HEATING else "cooling"

    def exterior_h(self, T_so):
        """Convection coefficient of each plane's outer surface at outer temperatures T_so (n, 2), W/(m2.K)."""
        model = convection.EXTERIOR_CONVECTION[self.exterior_convection]
        return model(T_so, self.T_out[:, None], self.wind[:, None], self.tilt, self.plane_perimeter,
                     self.areas[0], self.roughness[:, None])

    def ventilation_flow(self, T_a):
        """Vent airflow, m3/s at outdoor density: stack and wind in quadrature (0 unvented)."""
        if not self.vented:
            return 0.0 * T_a
        Qs = ventilation.stack_flow(self.A_eff, self.stack_height, T_a, self.T_out, self.C_D)
        return ventilation.combined_flow(Qs, self.wind_flow)

    def radiant_weights(self):
        """Share of a duct's radiant exchange with each interior surface: area times emittance, (n, 3)."""
        w = self.areas * self.eps_in
        return w / w.sum(axis=-1, keepdims=True)

    @staticmethod
    def interior_temperatures(x):
        """The interior surfaces' temperatures (n, 3), K: each plane's underside and the attic floor."""
        x = np.asarray(x, dtype=float)
        return np.concatenate([x[:, N_PLANES:I_AIR], x[:, I_FLOOR:I_FLOOR + 1]], axis=1)

    def mean_radiant(self, T_interior):
        """Mean radiant temperature the ducts see, K (n,), from the interior surfaces (n, 3)."""
        return np.sum(T_interior * self.radiant_weights(), axis=-1)

    def duct_surroundings(self, T_a, T_interior, W_attic=None):
        """Surroundings of the ducts by location (arrays over hours)."""
        from ducts import Surroundings

        T_mrt = self.mean_radiant(T_interior)
        sur = {"attic": Surroundings(T_a, T_mrt, self.W_out if W_attic is None else W_attic)}
        for loc, (Tc, Th) in self.duct_ambients.items():
            T = np.where(self.mode == HEATING, np.nan if Th is None else Th, Tc)
            sur[loc] = Surroundings(T, T, self.W_out)
        return sur

    def duct_chain(self, T_a, T_interior):
        from ducts import thermal_chain

        return thermal_chain(self.ducts, self.duct_m_dot, self.duct_cp, self.T_supply, self.T_in,
                             self.duct_surroundings(T_a, T_interior), self.pressure, self.duct_cp_supply)

    def flows(self, x):
        """Every heat flow of the network at temperatures x (K, shape (n, n_nodes)), W; see `residuals`."""
        x = np.asarray(x, dtype=float)
        T_so = x[:, :N_PLANES]
        T_si = x[:, N_PLANES:I_AIR]
        T_a = x[:, I_AIR]
        T_f = x[:, I_FLOOR]
        A = self.areas
        Ap = A[:N_PLANES]
        F_g = 1.0 - self.F_sky
        solar = Ap * self.absorbed
        conv_out = Ap * self.exterior_h(T_so) * (self.T_out[:, None] - T_so)
        lw_out = Ap * self.eps_out[:, None] * SIGMA * (self.F_sky * (self.T_sky[:, None] ** 4 - T_so**4)
                                              + F_g * (self.T_ground[:, None] ** 4 - T_so**4))
        gap = {}
        if self.gap > 0:
            gap = self.gap_flows(T_so, x[:, I_DECK_TOP:I_GAP_AIR], x[:, I_GAP_AIR:N_NODES_GAP])
            deck = Ap * self.U_deck[:, None] * (x[:, I_DECK_TOP:I_GAP_AIR] - T_si)  # deck top -> inner
        else:
            deck = Ap * self.U_deck[:, None] * (T_so - T_si)  # outer -> inner
        T_int = self.interior_temperatures(x)
        h_int = convection.natural_convection_walton(T_int, T_a[:, None], self.normal_up)
        conv_in = A * h_int * (T_int - T_a[:, None])  # surface -> air
        q_rad = radiation.grey_enclosure_net_flux(T_int, self.eps_in, self.F) * A  # W leaving each surface
        ceiling = A[2] * self.U_ceiling * (T_f - self.T_in)  # floor -> house
        m_vent = self.rho_out * self.ventilation_flow(T_a)
        vent = m_vent * self.cp * (self.T_out - T_a)
        leak_out = self.m_leak_out * self.cp * (self.T_out - T_a)
        zero = np.zeros_like(T_a)
        duct_conv, duct_rad, sl, rl, m_sl, m_rl = zero, np.zeros_like(T_int), zero, zero, zero, zero
        chain = None
        if self.ducts is not None:
            chain = self.duct_chain(T_a, T_int)
            s = chain.sinks("attic")
            f = self.runtime
            duct_conv = f * s["Q_conv"]
            duct_rad = (f * s["Q_rad"])[:, None] * self.radiant_weights()
            m_sl, m_rl = f * s["m_in"], f * s["m_out"]
            sl = m_sl * self.cp * (self.T_supply - T_a)
            T_repl = self.T_out if self.vented else self.T_in
            rl = m_rl * self.cp * (T_repl - T_a)
        to_house = self.m_exchange + (0.0 if self.vented else m_sl)  # air the attic sends into the house
        exchange = self.m_exchange * self.cp * (self.T_in - T_a)
        return {
            "solar": solar, "conv_out": conv_out, "lw_out": lw_out, "deck": deck, "conv_in": conv_in,
            "q_rad": q_rad, "ceiling": ceiling, "vent": vent, "leak_out": leak_out, "exchange": exchange,
            "duct_conv": duct_conv, "duct_rad": duct_rad, "supply_leak": sl, "return_leak": rl,
            "m_vent": m_vent, "m_to_house": to_house, "m_supply_leak": m_sl, "m_return_leak": m_rl, "chain": chain,
            **gap,
        }

    def gap_flows(self, T_cover, T_deck, T_gap):
        """Heat flows of the ventilated gap of each plane, W (attic.network.gap.gap_flows)."""
        from attic.network.gap import gap_flows

        return gap_flows(self, T_cover, T_deck, T_gap)

    def residuals(self, x, f=None):
        """Energy balance of each node, W, shape (n, n_nodes) (zero at the solution); f: flows(x) if known."""
        f = self.flows(x) if f is None else f
        r = np.empty((self.n, self.n_nodes))
        if self.gap > 0:
            r[:, :N_PLANES] = f["solar"] + f["conv_out"] + f["lw_out"] - f["gap_from_cover"] - f["gap_radiation"]
            r[:, I_DECK_TOP:I_GAP_AIR] = f["gap_radiation"] - f["gap_from_deck"] - f["deck"]
            r[:, I_GAP_AIR:N_NODES_GAP] = f["gap_from_cover"] + f["gap_from_deck"] - f["gap_air_out"]
        else:
            r[:, :N_PLANES] = f["solar"] + f["conv_out"] + f["lw_out"] - f["deck"]
        r[:, N_PLANES:I_AIR] = (f["deck"] - f["conv_in"][:, :N_PLANES] - f["q_rad"][:, :N_PLANES]
                                - f["duct_rad"][:, :N_PLANES])
        r[:, I_FLOOR] = -f["conv_in"][:, 2] - f["q_rad"][:, 2] - f["ceiling"] - f["duct_rad"][:, 2]
        r[:, I_AIR] = (f["conv_in"].sum(axis=1) + f["vent"] + f["leak_out"] + f["exchange"] - f["duct_conv"]
                       + f["supply_leak"] + f["return_leak"])
        if self.previous is not None:  # implicit Euler: heat stored in the roof deck since the hour before
            Ap = self.areas[:N_PLANES]
            dTdt = (np.asarray(x, dtype=float) - self.previous) / self.dt
            r[:, :N_PLANES] -= Ap * self.C_outer * dTdt[:, :N_PLANES]
            r[:, N_PLANES:I_AIR] -= Ap * self.C_inner * dTdt[:, N_PLANES:I_AIR]
            if self.gap > 0:
                r[:, I_DECK_TOP:I_GAP_AIR] -= Ap * self.C_deck_top * dTdt[:, I_DECK_TOP:I_GAP_AIR]
        return r

    def initial_guess(self):
        """Starting temperatures (n, n_nodes), K."""
        T_o = self.T_out
        h_tot = (self.exterior_h(T_o[:, None] + 0.02 * self.absorbed)
                 + 4 * self.eps_out[:, None] * SIGMA * T_o[:, None] ** 3)
        T_so = T_o[:, None] + self.absorbed / h_tot
        sunny = np.mean(T_so - T_o[:, None], axis=1)
        T_a = np.where(self.mode == HEATING, 0.7 * T_o + 0.3 * self.T_in, T_o + 0.3 * sunny + 2.0)
        T_si = T_a[:, None] + 0.5 * (T_so - T_a[:, None]) * np.where(self.U_deck > 0.2, 1.0, 0.2)[:, None]
        T_f = np.where(self.U_ceiling > 1.0, 0.5 * (T_a + self.T_in), T_a + 0.2 * (self.T_in - T_a))
        x = np.concatenate([T_so, T_si, T_a[:, None], T_f[:, None]], axis=1)
        if self.gap > 0:
            T_dt = 0.5 * (T_so + T_si)
            x = np.concatenate([x, T_dt, T_o[:, None] + 0.4 * (T_dt - T_o[:, None])], axis=1)
        return x
