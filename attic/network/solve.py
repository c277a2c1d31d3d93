"""Solve the attic network: one design condition (scipy.optimize.root), or many hours at once (a
batched Newton method on the block-diagonal system), and report the converged state."""

from __future__ import annotations

from dataclasses import asdict, dataclass

import numpy as np

from attic.network.newton import newton_batched, stacked_jacobian
from attic.network.nodes import HEATING, I_AIR, I_FLOOR, N_PLANES, NODE_NAMES, Network
from attic.physics.atmosphere import SIGMA

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
    nodes_K: tuple = ()  # every node's temperature in the network's order (a batten gap adds four)

    @property
    def residual_w(self):
        return float(np.max(np.abs(self.residuals_w)))

    def to_dict(self):
        return asdict(self)


@dataclass(frozen=True)
class HourlyState:
    """The converged attic hour by hour (SI arrays over hours; planes on the last axis)."""

    x: np.ndarray  # (n, n_nodes) node temperatures, K (6, or 10 with a gap under the covering)
    outer_K: np.ndarray
    inner_K: np.ndarray
    air_K: np.ndarray
    floor_K: np.ndarray
    sol_air_K: np.ndarray
    ventilation_m3_s: np.ndarray
    ceiling_to_house_w: np.ndarray
    attic_air_to_house_w: np.ndarray
    attic_air_to_house_latent_w: np.ndarray
    humidity_ratio: np.ndarray
    mean_radiant_K: np.ndarray
    heat_flows_w: dict
    residual_w: np.ndarray  # (n,) worst node per hour
    iterations: int


def adiabatic_surface_temperature(net: Network, plane=None):
    """Temperature of a roof plane's outer surface with no heat conducted inward, K.

    This is the sol-air temperature of ASHRAE Handbook-Fundamentals (2017) ch. 18 eq. (30)
    with this model's own convection and long-wave exchange (tested against that equation).
    Newton's method on all hours and planes at once; returns (n, 2), or (n,) for one plane.
    """
    a = net.absorbed
    eps = net.eps_out[:, None]
    T_o = net.T_out[:, None]
    lw_in = net.F_sky * net.T_sky[:, None] ** 4 + (1 - net.F_sky) * net.T_ground[:, None] ** 4

    def balance_and_slope(T):
        # the convection coefficient itself depends on T, so the slope is a difference quotient; T and T + 1e-4
        # go through the convection model as one array, which costs what one of them does
        T2 = np.stack([T, T + 1e-4])
        b = a + net.exterior_h(T2) * (T_o - T2) + eps * SIGMA * (lw_in - T2**4)
        return b[0], (b[1] - b[0]) / 1e-4

    T = T_o + a / (net.exterior_h(T_o + 0.02 * a) + 4 * eps * SIGMA * T_o**3)
    for _ in range(50):
        f, slope = balance_and_slope(T)
        step = -f / slope
        T = T + np.clip(step, -30.0, 30.0)
        if np.all(np.abs(step) < 1e-10):
            break
    return T if plane is None else T[:, plane]


def attic_air_state(net: Network, x, f):
    """Humidity of the attic air and what its air sends into the house (arrays over hours)."""
    from ducts import moist_air

    T_a = x[:, I_AIR]
    m_v, m_x, m_ol = f["m_vent"], net.m_exchange, net.m_leak_out
    m_sl, m_rl = f["m_supply_leak"], f["m_return_leak"]
    W_s = net.W_in
    if net.ducts is not None:
        from ducts import coil_leaving_humidity_ratio

        cooling = net.mode == 1
        if np.any(cooling):
            W_s = np.where(cooling, coil_leaving_humidity_ratio(net.T_supply, net.W_in, net.pressure), net.W_in)
    W_repl = net.W_out if net.vented else net.W_in
    m_tot = m_v + m_x + m_ol + m_sl + m_rl
    with np.errstate(invalid="ignore", divide="ignore"):
        W_a = np.where(m_tot > 0, ((m_v + m_ol) * net.W_out + m_x * net.W_in + m_sl * W_s + m_rl * W_repl)
                       / np.where(m_tot > 0, m_tot, 1.0), net.W_in)
    P = net.pressure
    h_a = moist_air.enthalpy(T_a, P, W_a)
    h_in = moist_air.enthalpy(net.T_in, P, net.W_in)
    h_sens = moist_air.enthalpy(net.T_in, P, W_a)
    m_h = f["m_to_house"]
    return W_a, m_h * (h_a - h_sens), m_h * (h_sens - h_in)


def _heat_flows(f):
    gap = {} if "gap_air_out" not in f else {"under_covering_air_out": np.sum(f["gap_air_out"], axis=1)}
    return {
        "solar_absorbed": np.sum(f["solar"], axis=1),
        "roof_convection_out": -np.sum(f["conv_out"], axis=1),
        "roof_longwave_out": -np.sum(f["lw_out"], axis=1),
        "through_deck": np.sum(f["deck"], axis=1),
        "ceiling_to_house": f["ceiling"],
        "ventilation_out": -f["vent"],
        "leakage_to_outdoors": -f["leak_out"],
        "exchange_with_house": -f["exchange"],
        "ducts_from_air": f["duct_conv"],
        "ducts_from_surfaces": np.sum(f["duct_rad"], axis=1),
        "supply_leak_into_attic": -f["supply_leak"],
        "return_leak_replacement": -f["return_leak"],
        **gap,
    }


def stacked(net: Network):
    """The network with each row repeated 7 times: a state and its six perturbed copies side by side,
    so that residuals and Jacobian come from ONE vectorised evaluation (see `stacked_jacobian`)."""
    idx = np.repeat(np.arange(net.n), net.n_nodes + 1)
    big = net.take(idx)
    if net.previous is not None:
        import dataclasses

        big = dataclasses.replace(big, previous=net.previous[idx])
    return big


def jacobian_rows(net: Network, x, r=None, h=1e-4):
    """The Jacobian (n, 6, 6) W/K of a network's residuals at x, from one vectorised evaluation."""
    return stacked_jacobian(stacked(net).residuals, np.asarray(x, dtype=float), h)[1]


def newton_rows(net: Network, x, tol_w=1e-7, max_iter=40):
    """Newton's method on every row of a network at once (`newton_batched` on its node temperatures, steps
    limited to 30 K per node). Returns (x, residuals, iterations)."""
    x = np.asarray(x, dtype=float)
    return newton_batched(stacked(net).residuals, x, tol_w, np.full(x.shape[1], 30.0), max_iter)


def solve(net: Network, label="", x0=None):
    """Solve a one-hour network (a design condition); AtticState, or SolveError if it does not close.

    Newton's method with the Jacobian from one vectorised evaluation of the residuals (`newton_rows`);
    should that not close the balance, scipy.optimize.root (hybr, then lm from a flat start).

    Parameters
    ----------
    net : attic.network.nodes.Network with one hour
    label : words naming the case and condition, for the error message
    x0 : optional starting temperatures, K (6,)
    """
    guess = net.initial_guess()[0] if x0 is None else np.asarray(x0, float)
    xs, rs, steps = newton_rows(net, guess[None, :])
    x, res, message = xs[0], rs[0], "Newton's method did not converge"
    if not np.all(np.isfinite(res)) or np.max(np.abs(res)) > RESIDUAL_LIMIT_W:
        x, res, message, steps = _solve_with_root(net, guess)
    worst = float(np.max(np.abs(res))) if np.all(np.isfinite(res)) else float("inf")
    if worst > RESIDUAL_LIMIT_W or not np.all(np.isfinite(x)):
        i = int(np.nanargmax(np.abs(res))) if np.any(np.isfinite(res)) else 0
        raise SolveError(f"{label}: the heat balance did not close (node '{NODE_NAMES[i]}' is off by "
                         f"{worst:.3g} W, limit {RESIDUAL_LIMIT_W} W; solver says: {message}). "
                         "No result is shown for it.")
    return attic_states(net, x[None, :], res[None, :], steps)[0]


def attic_states(net: Network, x, res, iterations, f=None):
    """The AtticState of every row of a solved network (rows are design conditions, e.g. a study's points).

    x : (n, n_nodes) solved temperatures, K; res : (n, n_nodes) their residuals, W; iterations : int or (n,);
    f : net.flows(x) when already at hand. Every property is computed for all rows at once; the loop only packs
    the results.
    """
    from ducts import moist_air

    x = np.asarray(x, dtype=float)
    f = net.flows(x) if f is None else f
    W_a, to_house_sens, to_house_lat = attic_air_state(net, x, f)
    T_a = x[:, I_AIR]
    T_int = net.interior_temperatures(x)
    Q = net.ventilation_flow(T_a) + np.zeros(net.n)
    ach_flow = Q if net.vented else net.m_leak_out / net.rho_out
    ach = ach_flow * 3600.0 / net.volume
    dew = np.atleast_1d(moist_air.dew_point(T_a, net.pressure, W_a))
    mrt = net.mean_radiant(T_int)
    sol_air = adiabatic_surface_temperature(net)
    flows = {k: np.asarray(v) + np.zeros(net.n) for k, v in _heat_flows(f).items()}
    steps = np.broadcast_to(np.asarray(iterations), (net.n,))
    out = []
    for i in range(net.n):
        xi = x[i]
        out.append(AtticState(
            kind="heating" if net.mode[i] == HEATING else "cooling",
            outer_K=tuple(float(t) for t in xi[:N_PLANES]),
            inner_K=tuple(float(t) for t in xi[N_PLANES:I_AIR]),
            air_K=float(xi[I_AIR]),
            floor_K=float(xi[I_FLOOR]),
            sol_air_K=tuple(float(t) for t in sol_air[i]),
            irradiance_w_m2=tuple(float(g) for g in net.irradiance[i]),
            ventilation_m3_s=float(Q[i]),
            air_changes_per_hour=float(ach[i]),
            ceiling_to_house_w=float(f["ceiling"][i]),
            attic_air_to_house_w=float(to_house_sens[i]),
            attic_air_to_house_latent_w=float(to_house_lat[i]),
            humidity_ratio=float(W_a[i]),
            dewpoint_K=float(dew[i]),
            mean_radiant_K=float(mrt[i]),
            sky_K=float(net.T_sky[i]),
            heat_flows_w={k: float(v[i]) for k, v in flows.items()},
            residuals_w=tuple(float(r) for r in res[i]),
            iterations=int(steps[i]),
            nodes_K=tuple(float(t) for t in xi),
        ))
    return out


def _solve_with_root(net: Network, guess):
    """The fallback: scipy.optimize.root, hybr from the guess and then lm from a flat start."""
    from scipy.optimize import root

    def fun(x):
        return net.residuals(x[None, :])[0]

    def jac(x):
        return jacobian_rows(net, x[None, :])[0]

    sol = root(fun, guess, jac=jac, method="hybr", options={"xtol": 1e-12})
    x, res = sol.x, fun(sol.x)
    if not np.all(np.isfinite(res)) or np.max(np.abs(res)) > RESIDUAL_LIMIT_W:
        flat = np.full_like(guess, 0.5 * (net.T_out[0] + net.T_in[0]))
        sol = root(fun, flat, method="lm", options={"xtol": 1e-14, "maxiter": 5000})
        x, res = sol.x, fun(sol.x)
    return x, res, sol.message, int(getattr(sol, "nfev", 0))


def solve_hours(net: Network, x0=None, tol_w=1e-6, max_iter=60, label="hourly run"):
    """Solve every hour of a network at once: Newton's method with one Jacobian block per hour.

    The hours do not interact, so the Jacobian of the stacked system is block-diagonal: `newton_rows`
    forms each block by forward differences (all hours and their perturbed copies in one evaluation) and
    solves the blocks together with numpy, steps limited to 30 K per node and halved while they do not
    reduce an hour's residual.

    Returns HourlyState; raises SolveError naming the hours whose balance does not close.
    """
    x = net.initial_guess() if x0 is None else np.array(x0, dtype=float)
    x, r, steps = newton_rows(net, x, tol_w, max_iter)
    worst = np.max(np.abs(r), axis=1)
    failed = ~(worst <= RESIDUAL_LIMIT_W)
    if np.any(failed):
        idx = np.flatnonzero(failed)
        raise SolveError(f"{label}: the heat balance did not close in {len(idx)} of {net.n} hours (first: hour "
                         f"index {idx[0]}, off by {worst[idx[0]]:.3g} W, limit {RESIDUAL_LIMIT_W} W). "
                         "No result is shown for them.")
    f = net.flows(x)
    W_a, to_sens, to_lat = attic_air_state(net, x, f)
    T_int = net.interior_temperatures(x)
    return HourlyState(x, x[:, :N_PLANES], x[:, N_PLANES:I_AIR], x[:, I_AIR], x[:, I_FLOOR],
                       adiabatic_surface_temperature(net), net.ventilation_flow(x[:, I_AIR]), f["ceiling"],
                       to_sens, to_lat, W_a, net.mean_radiant(T_int), _heat_flows(f), worst, steps)
