"""Solve the attic network at one condition (scipy.optimize.root) and report the converged state."""

from __future__ import annotations

from dataclasses import asdict, dataclass

import numpy as np

from .atmosphere import SIGMA
from .model import I_AIR, I_FLOOR, N_PLANES, NODE_NAMES, Network

RESIDUAL_LIMIT_W = 0.1  # a node whose energy balance is off by more than this is not a result


class SolveError(RuntimeError):
    """The heat balance did not close; carries the condition and the worst node's residual."""


@dataclass(frozen=True)
class AtticState:
    """The converged attic at one condition (SI: K, W, m3/s; heat flows positive in the named direction)."""

    kind: str
    outer_K: tuple
    inner_K: tuple
    air_K: float
    floor_K: float
    sol_air_K: tuple
    irradiance_w_m2: tuple
    ventilation_m3_s: float
    air_changes_per_hour: float
    ceiling_to_house_w: float
    attic_air_to_house_w: float
    attic_air_to_house_latent_w: float
    humidity_ratio: float
    dewpoint_K: float
    mean_radiant_K: float
    sky_K: float
    heat_flows_w: dict
    residuals_w: tuple
    iterations: int

    @property
    def residual_w(self):
        return float(np.max(np.abs(self.residuals_w)))

    def to_dict(self):
        return asdict(self)


def adiabatic_surface_temperature(net: Network, plane):
    """Temperature of a roof plane's outer surface with no heat conducted inward, K.

    This is the sol-air temperature of ASHRAE Handbook-Fundamentals (2017) ch. 18 eq. (30)
    with this model's own convection and long-wave exchange (tested against that equation).
    """
    from scipy.optimize import brentq

    a = net.absorbed[plane]

    def f(T):
        return (a + net.h_out * (net.T_out - T) + net.eps_out * SIGMA * (
            net.F_sky * (net.T_sky**4 - T**4) + (1 - net.F_sky) * (net.T_ground**4 - T**4)))

    return brentq(f, 150.0, 500.0, xtol=1e-9)


def solve(net: Network, label="", x0=None):
    """Solve the network; AtticState, or SolveError if it does not converge or a node does not close.

    Parameters
    ----------
    net : attic.model.Network
    label : words naming the case and condition, for the error message
    x0 : optional starting temperatures, K
    """
    from scipy.optimize import root

    from ducts import moist_air

    guess = net.initial_guess() if x0 is None else np.asarray(x0, float)
    sol = root(net.residuals, guess, method="hybr", options={"xtol": 1e-12, "maxfev": 2000})
    x = sol.x
    res = net.residuals(x)
    if not np.all(np.isfinite(res)) or np.max(np.abs(res)) > RESIDUAL_LIMIT_W:
        # one more try from a flat start: hybr can stall on a poor first guess
        flat = np.full_like(guess, 0.5 * (net.T_out + net.T_in))
        sol = root(net.residuals, flat, method="lm", options={"xtol": 1e-14, "maxiter": 5000})
        x, res = sol.x, net.residuals(sol.x)
    worst = float(np.max(np.abs(res))) if np.all(np.isfinite(res)) else float("inf")
    if worst > RESIDUAL_LIMIT_W or not np.all(np.isfinite(x)):
        i = int(np.nanargmax(np.abs(res))) if np.any(np.isfinite(res)) else 0
        raise SolveError(f"{label}: the heat balance did not close (node '{NODE_NAMES[i]}' is off by "
                         f"{worst:.3g} W, limit {RESIDUAL_LIMIT_W} W; solver says: {sol.message}). "
                         "No result is shown for it.")
    f = net.flows(x)
    T_a = float(x[I_AIR])
    T_int = np.concatenate([x[N_PLANES:I_AIR], [x[I_FLOOR]]])
    Q = float(net.ventilation_flow(T_a))
    # humidity of the attic air: a mixing balance of what flows in
    m_v, m_x, m_ol = float(f["m_vent"]), net.m_exchange, net.m_leak_out
    m_sl, m_rl = float(f["m_supply_leak"]), float(f["m_return_leak"])
    W_s = net.W_in
    if net.ducts is not None and net.kind == "cooling":
        from ducts.system import coil_leaving_humidity_ratio

        W_s = coil_leaving_humidity_ratio(net.T_supply, net.W_in, net.pressure)
    W_repl = net.W_out if net.vented else net.W_in
    m_tot = m_v + m_x + m_ol + m_sl + m_rl
    W_a = ((m_v + m_ol) * net.W_out + m_x * net.W_in + m_sl * W_s + m_rl * W_repl) / m_tot if m_tot > 0 else net.W_in
    m_h = float(f["m_to_house"])
    P = net.pressure
    h_a, h_in, h_sens = moist_air.enthalpy(np.array([T_a, net.T_in, net.T_in]), P, np.array([W_a, net.W_in, W_a]))
    to_house_sens = m_h * (h_a - h_sens)
    to_house_lat = m_h * (h_sens - h_in)
    flows = {
        "solar_absorbed": float(np.sum(f["solar"])),
        "roof_convection_out": float(-np.sum(f["conv_out"])),
        "roof_longwave_out": float(-np.sum(f["lw_out"])),
        "through_deck": float(np.sum(f["deck"])),
        "ceiling_to_house": float(f["ceiling"]),
        "ventilation_out": float(-f["vent"]),
        "leakage_to_outdoors": float(-f["leak_out"]),
        "exchange_with_house": float(-f["exchange"]),
        "ducts_from_air": float(f["duct_conv"]),
        "ducts_from_surfaces": float(np.sum(f["duct_rad"])),
        "supply_leak_into_attic": float(-f["supply_leak"]),
        "return_leak_replacement": float(-f["return_leak"]),
    }
    return AtticState(
        net.kind, tuple(float(t) for t in x[:N_PLANES]), tuple(float(t) for t in x[N_PLANES:I_AIR]), T_a,
        float(x[I_FLOOR]), tuple(adiabatic_surface_temperature(net, i) for i in range(N_PLANES)),
        tuple(float(g) for g in net.irradiance), Q, Q * 3600.0 / net.volume if net.vented else
        net.m_leak_out / net.rho_out * 3600.0 / net.volume, float(f["ceiling"]), float(to_house_sens),
        float(to_house_lat), float(W_a), float(moist_air.dew_point(T_a, P, W_a)),
        float(np.dot(net.radiant_weights(), T_int)), net.T_sky, flows,
        tuple(float(r) for r in res), int(getattr(sol, "nfev", 0)))
